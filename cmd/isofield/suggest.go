package main

import (
	"context"
	"fmt"
	"io"
	"strconv"
	"text/tabwriter"

	"github.com/gocarina/gocsv"

	"isofield/survey/analysis"
	"isofield/survey/fileout"
)

const suggestSummary = `Grid the readings and suggest where to take more: points where the field
(or, with the grounding preset, the step voltage) is high far from any
reading, and where readings nearby are predicted badly when left out of the
fit. Suggestions are kept at least twice the typical reading spacing apart.
With -o, write them as CSV for stake-out: id,x_m,y_m,score,why.`

func runSuggest(e *env, args []string) error {
	var sf surveyFlags
	var out string
	var force bool
	fs := newFlagSet("suggest", "[flags] FILE.csv [FILE.csv...]", suggestSummary, e.stderr)
	sf.register(fs)
	fs.IntVar(&sf.cfg.Suggest, "n", 10, "suggest `N` points")
	fs.StringVar(&out, "o", "", "write the suggestions as CSV to `FILE` (atomically)")
	fs.BoolVar(&force, "force", false, "overwrite an existing output file")
	if err := sf.parse(fs, args); err != nil {
		return err
	}
	if len(sf.cfg.Files) == 0 {
		return usageError{fmt.Errorf("suggest: no input file (see isofield suggest --help)")}
	}
	if sf.cfg.Suggest < 1 {
		return usageError{fmt.Errorf("-n %d: want at least 1", sf.cfg.Suggest)}
	}
	res, err := sf.run(context.Background(), fs)
	if err != nil {
		return err
	}
	sg := res.Analysis.Suggestions
	if err := writeSuggestTable(e.stdout, sg); err != nil {
		return err
	}
	if out == "" {
		return nil
	}
	err = fileout.Write(out, fileout.Options{Force: force, Inputs: sf.cfg.Files}, func(w io.Writer) error {
		return writeSuggestCSV(w, sg)
	})
	if err == nil {
		fmt.Fprintf(e.stderr, "wrote %d suggestions to %s\n", len(sg), out)
	}
	return err
}

// writeSuggestTable prints the suggestions for the screen.
func writeSuggestTable(w io.Writer, sg []analysis.Suggestion) error {
	if len(sg) == 0 {
		_, err := fmt.Fprintln(w, "no infill point to suggest")
		return err
	}
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "id\tx\ty\tscore\twhy")
	for _, s := range sg {
		fmt.Fprintf(tw, "%s\t%.2f\t%.2f\t%.3g\t%s\n", s.ID, s.X, s.Y, s.Score, s.Why)
	}
	return tw.Flush()
}

// stakeOutRow is one line of the stake-out CSV. Its columns are fixed, so
// a tagged struct written by gocsv expresses them; the numbers are
// formatted here to keep millimetres and four significant digits.
type stakeOutRow struct {
	ID    string `csv:"id"`
	X     string `csv:"x_m"`
	Y     string `csv:"y_m"`
	Score string `csv:"score"`
	Why   string `csv:"why"`
}

// writeSuggestCSV writes the stake-out file: id,x_m,y_m,score,why.
func writeSuggestCSV(w io.Writer, sg []analysis.Suggestion) error {
	rows := make([]stakeOutRow, len(sg))
	for i, s := range sg {
		rows[i] = stakeOutRow{s.ID, ff(s.X), ff(s.Y), strconv.FormatFloat(s.Score, 'g', 4, 64), s.Why}
	}
	return gocsv.Marshal(rows, w)
}

// ff formats a coordinate with millimetre resolution.
func ff(v float64) string { return strconv.FormatFloat(v, 'f', 3, 64) }
