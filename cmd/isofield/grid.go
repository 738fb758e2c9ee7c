package main

import (
	"context"
	"fmt"
	"io"
	"math"

	"isofield/survey/export"
	"isofield/survey/fileout"
	"isofield/survey/pipeline"
)

const gridSummary = `Interpolate the readings of one or more survey files with radial basis
functions and write the grid as CSV, one row per node:

  x_m,y_m,potential_U,ex_U_per_m,ey_U_per_m,field_U_per_m,flagged

U is the potential unit of the input (V or mV). Coordinates are in the
input's own system. (ex, ey) = E = −∇V comes from the analytic gradient of
the interpolant. Masked nodes (too far from any reading) keep x and y and
leave the other cells empty. flagged is 1 where the field reaches
--threshold (or the preset's criterion), else 0. Columns after flagged may
be added by presets; the first seven never change.`

func runGrid(e *env, args []string) error {
	var sf surveyFlags
	var out string
	var force bool
	fs := newFlagSet("grid", "[flags] FILE.csv [FILE.csv...]", gridSummary, e.stderr)
	sf.register(fs)
	fs.StringVar(&out, "o", "", "write the grid to `FILE` (atomically) instead of standard output")
	fs.BoolVar(&force, "force", false, "overwrite an existing output file")
	if err := sf.parse(fs, args); err != nil {
		return err
	}
	if len(sf.cfg.Files) == 0 {
		return usageError{fmt.Errorf("grid: no input file (see isofield grid --help)")}
	}
	res, err := pipeline.Run(context.Background(), sf.cfg, nil)
	if err != nil {
		return err
	}
	write := func(w io.Writer) error { return writeGrid(w, res, sf.cfg) }
	if out == "" {
		return write(e.stdout)
	}
	return fileout.Write(out, fileout.Options{Force: force, Inputs: sf.cfg.Files}, write)
}

// writeGrid writes the grid CSV of a pipeline result.
func writeGrid(w io.Writer, res *pipeline.Result, cfg pipeline.Config) error {
	g := res.Grid
	flagged := make([]bool, g.Len())
	if a := res.Analysis; a != nil && len(a.Flagged) == g.Len() {
		// The preset's criterion: field, potential limits, step and touch.
		flagged = a.Flagged
	} else if t := cfg.Criteria.FieldThreshold; t > 0 {
		for k := range flagged {
			if !g.Mask[k] && math.Hypot(g.GX[k], g.GY[k]) >= t {
				flagged[k] = true
			}
		}
	}
	return export.WriteGridCSV(w, g, res.Survey.Unit.String(), flagged, gridColumns(res))
}

// gridColumns returns the columns appended after the fixed ones: band (the
// equipotential band of the node, see contour.Band; empty where masked),
// and with the grounding preset step_U (step voltage) and, when a GPR is
// given, touch_U (touch voltage, empty beyond reach of the structure).
func gridColumns(res *pipeline.Result) []export.Column {
	a := res.Analysis
	if a == nil || len(a.NodeBand) != res.Grid.Len() {
		return nil
	}
	band := make([]float64, len(a.NodeBand))
	for k, b := range a.NodeBand {
		band[k] = float64(b)
		if b < 0 {
			band[k] = math.NaN()
		}
	}
	cols := []export.Column{{Name: "band", Values: band}}
	if a.Step != nil {
		cols = append(cols, export.Column{Name: "step_" + a.Unit, Values: a.Step})
	}
	if a.Touch != nil {
		cols = append(cols, export.Column{Name: "touch_" + a.Unit, Values: a.Touch})
	}
	return cols
}
