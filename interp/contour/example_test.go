package contour_test

import (
	"context"
	"fmt"

	"isofield/interp"
	"isofield/interp/contour"
)

// A round interval for readings from −480 to −120 mV, and its levels.
func ExampleNiceInterval() {
	step := contour.NiceInterval(-480, -120)
	fmt.Println(step, contour.Levels(-480, -120, step))
	// Output: 50 [-450 -400 -350 -300 -250 -200 -150]
}

// The level-0.5 line of a 3 × 3 grid with one high node in the middle is a
// closed diamond through the edge midpoints.
func ExampleLines() {
	g := interp.NewGridN(0, 0, 1, 1, 3, 3)
	g.V[g.Index(1, 1)] = 1
	ls, _ := contour.Lines(context.Background(), g, []float64{0.5})
	fmt.Println(len(ls), ls[0].Closed, len(ls[0].Points))
	// Output: 1 true 5
}
