package main

import (
	"context"
	"fmt"
	"io"
	"math"
	"path/filepath"
	"strconv"
	"strings"
	"text/tabwriter"

	"isofield/survey"
	"isofield/survey/analysis"
	"isofield/survey/criteria"
	"isofield/survey/pipeline"
)

const zonesSummary = `Grid the readings, apply the preset's criterion (--preset, --threshold and
the preset's parameters) and list the zones that break it, most severe
first: area, centroid, peak and where it lies, mean, and the readings
inside. With --json, print a JSON document instead. The criterion's
sources, warnings and cautions follow the table.`

func runZones(e *env, args []string) error {
	var sf surveyFlags
	var asJSON bool
	fs := newFlagSet("zones", "[flags] FILE.csv [FILE.csv...]", zonesSummary, e.stderr)
	sf.register(fs)
	fs.BoolVar(&asJSON, "json", false, "print a JSON document instead of the table")
	if err := sf.parse(fs, args); err != nil {
		return err
	}
	if len(sf.cfg.Files) == 0 {
		return usageError{fmt.Errorf("zones: no input file (see isofield zones --help)")}
	}
	res, err := sf.run(context.Background(), fs)
	if err != nil {
		return err
	}
	if asJSON {
		return writeZonesJSON(e.stdout, res)
	}
	return writeZonesTable(e.stdout, res)
}

// readingName names survey reading i by its id, else by file and line.
func readingName(s *survey.Survey, i int) string {
	r := s.Readings[i]
	if r.ID != "" {
		return r.ID
	}
	if r.File >= 0 && r.File < len(s.Files) {
		return fmt.Sprintf("%s:%d", filepath.Base(s.Files[r.File].Path), r.Line0)
	}
	return fmt.Sprintf("#%d", i+1)
}

// writeZonesTable prints the ranked zones and the criterion's texts.
func writeZonesTable(w io.Writer, res *pipeline.Result) error {
	a := res.Analysis
	c := a.Criterion
	fmt.Fprintf(w, "%s (preset %s, unit %s)\n", c.Title, c.Preset, a.Unit)
	writeRules(w, a)
	if len(a.Zones) == 0 {
		fmt.Fprintln(w, "\nno zone breaks the criterion")
	} else {
		fmt.Fprintln(w)
		tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
		fmt.Fprintln(tw, "rank\tquantity\tarea_m2\tcentroid_x\tcentroid_y\tpeak\tunit\tpeak_x\tpeak_y\tmean\treadings")
		for _, z := range a.Zones {
			fmt.Fprintf(tw, "%d\t%s\t%.2f\t%.2f\t%.2f\t%s\t%s\t%.2f\t%.2f\t%s\t%s\n",
				z.Rank, z.Quantity, z.AreaM2, z.CentroidX, z.CentroidY, tableNum(z.Peak), z.Unit, z.PeakX, z.PeakY, tableNum(z.Mean),
				readingList(res.Survey, z.Readings, 6))
		}
		if err := tw.Flush(); err != nil {
			return err
		}
	}
	writeClasses(w, a)
	writeDistribution(w, a)
	writeTexts(w, "notes", append(append([]string(nil), res.Notes...), a.Notes...))
	writeSources(w, c)
	writeTexts(w, "warnings", c.Warnings)
	writeTexts(w, "cautions", c.Cautions)
	return nil
}

// writeRules prints what flags a node.
func writeRules(w io.Writer, a *analysis.Result) {
	c := a.Criterion
	if a.FieldThreshold > 0 {
		fmt.Fprintf(w, "  field ≥ %.4g %s/m: %s\n", a.FieldThreshold, a.Unit, c.FieldLabel)
	}
	if c.HasBelow {
		fmt.Fprintf(w, "  %s\n", c.BelowLabel)
	}
	if c.HasAbove {
		fmt.Fprintf(w, "  %s\n", c.AboveLabel)
	}
	if t := c.Tolerable; t != nil {
		fmt.Fprintf(w, "  tolerable step %.1f V, touch %.1f V (%s; IEEE Std 80, from memory)\n", t.StepV, t.TouchV, t.Assumption)
	}
}

// readingList names up to max readings and counts the rest.
func readingList(s *survey.Survey, idx []int, max int) string {
	if len(idx) == 0 {
		return "-"
	}
	var names []string
	for n, i := range idx {
		if n == max {
			names = append(names, fmt.Sprintf("+%d more", len(idx)-max))
			break
		}
		names = append(names, readingName(s, i))
	}
	return fmt.Sprintf("%d: %s", len(idx), strings.Join(names, " "))
}

func writeClasses(w io.Writer, a *analysis.Result) {
	if len(a.Classes) == 0 {
		return
	}
	fmt.Fprintln(w, "\nshare of the surveyed area:")
	for _, c := range a.Classes {
		fmt.Fprintf(w, "  %5.1f %%  %10.2f m²  %s\n", 100*c.Share, c.AreaM2, c.Class.Name)
	}
}

// writeDistribution summarises the cumulative frequency of the readings
// for the concrete preset (RILEM TC 154-EMC's statistical view).
func writeDistribution(w io.Writer, a *analysis.Result) {
	if a.Criterion.Preset != criteria.Concrete || len(a.Cumulative) == 0 {
		return
	}
	fmt.Fprintf(w, "\nreadings (%d), cumulative frequency (RILEM TC 154-EMC):", len(a.Cumulative))
	for _, p := range []float64{10, 25, 50, 75, 90} {
		fmt.Fprintf(w, "  %g %% ≤ %s", p, tableNum(analysis.Quantile(a.Cumulative, p)))
	}
	fmt.Fprintf(w, " %s\n", a.Unit)
}

func writeSources(w io.Writer, c *criteria.Criterion) {
	if len(c.Sources) == 0 {
		return
	}
	fmt.Fprintln(w, "\nsources:")
	for _, s := range c.Sources {
		fmt.Fprintf(w, "  - %s: %s [%s]\n", s.What, s.Source, statusWord(s.Status))
	}
}

// statusWord spells a field-facts status for readers.
func statusWord(s string) string {
	switch s {
	case "C":
		return "read in the source"
	case "C2":
		return "secondary source"
	case "V":
		return "arithmetic checked"
	case "M":
		return "from memory, unconfirmed"
	}
	return s
}

func writeTexts(w io.Writer, title string, ts []string) {
	if len(ts) == 0 {
		return
	}
	fmt.Fprintf(w, "\n%s:\n", title)
	for _, t := range ts {
		fmt.Fprintf(w, "  - %s\n", t)
	}
}

// tableNum formats a value for the table: whole units from 1000 up, one decimal
// from 10, else three significant digits.
func tableNum(v float64) string {
	switch a := math.Abs(v); {
	case a >= 1000:
		return strconv.FormatFloat(v, 'f', 0, 64)
	case a >= 10:
		return strconv.FormatFloat(v, 'f', 1, 64)
	}
	return strconv.FormatFloat(v, 'g', 3, 64)
}
