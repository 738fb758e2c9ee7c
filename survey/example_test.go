package survey_test

import (
	"errors"
	"fmt"
	"os"
	"strings"

	"isofield/survey"
)

// A semicolon file with decimal commas, a unit in the header and a
// comment line, as a field logger might write it (invented values).
func ExampleParse() {
	in := "# Fictional deck, Quarrymoor footbridge\n" +
		"point;x;y;potential (mV)\n" +
		"P1;0;0;-182,5\n" +
		"P2;0,6;0;-240\n" +
		"P3;0;0,6;-355,25\n"
	s, err := survey.Parse(strings.NewReader(in), "deck.csv", survey.LoadOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, r := range s.Readings {
		fmt.Printf("%s line %d: (%g, %g) %g %v\n", r.ID, r.Line0, r.X, r.Y, r.V, s.Unit)
	}
	// Output:
	// P1 line 3: (0, 0) -182.5 mV
	// P2 line 4: (0.6, 0) -240 mV
	// P3 line 5: (0, 0.6) -355.25 mV
}

// Errors name the file, line and column, and wrap a cause to test with
// errors.Is.
func ExampleParseError() {
	in := "x,y,potential_mV\n0,0,-100\n1,0,n/a\n"
	_, err := survey.Parse(strings.NewReader(in), "site.csv", survey.LoadOptions{})
	fmt.Println(err)
	fmt.Println(errors.Is(err, survey.ErrNotNumber))
	// Output:
	// site.csv:3:3: potential_mV "n/a": not a number
	// true
}

// WriteCSV writes the canonical input format.
func ExampleWriteCSV() {
	in := "# line_spacing=2 station_spacing=1\nline,station,V_mV\nL0,0,-10\nL0,1,-12\nL1,0,-15\n"
	s, err := survey.Parse(strings.NewReader(in), "grid.csv", survey.LoadOptions{})
	if err != nil {
		fmt.Println(err)
		return
	}
	if err := survey.WriteCSV(os.Stdout, s); err != nil {
		fmt.Println(err)
	}
	// Output:
	// id,x_m,y_m,potential_mV,time,line,station,note
	// ,0,0,-10,,L0,0,
	// ,1,0,-12,,L0,1,
	// ,0,2,-15,,L1,0,
}
