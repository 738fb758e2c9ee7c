package main

import (
	"context"
	"fmt"
	"io"

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
	res, err := sf.run(context.Background(), fs)
	if err != nil {
		return err
	}
	write := func(w io.Writer) error { return writeGrid(w, res) }
	if out == "" {
		return write(e.stdout)
	}
	return fileout.Write(out, fileout.Options{Force: force, Inputs: sf.cfg.Files}, write)
}

// writeGrid writes the grid CSV of a pipeline result: the fixed columns,
// flagged by the preset's criterion (field, potential limits, step, touch),
// then band, step_U and touch_U (grounding) and lat_deg, lon_deg (surveys
// read from latitude and longitude).
func writeGrid(w io.Writer, res *pipeline.Result) error {
	flagged, extra := export.GridColumns(res)
	return export.WriteGridCSV(w, res.Grid, res.Survey.Unit.String(), flagged, extra)
}
