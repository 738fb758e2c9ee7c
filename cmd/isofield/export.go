package main

import (
	"context"
	"fmt"
	"os"
	"time"

	"isofield/survey/export"
)

const exportSummary = `Check, grid and analyse the survey files, then write every export into
the directory --dir (created if missing), under fixed names:

  readings_clean.csv   every reading with its corrected value and QA status
                       (as isofield clean writes it)
  qa_log.txt           every logged correction and change of status
  grid.csv             the grid CSV (see isofield grid --help), plus band,
                       step and touch (grounding preset) and, for surveys
                       read from latitude and longitude, lat_deg and lon_deg
  grid_potential.csv   the potential as a matrix: rows north to south, each
                       row west to east, NaN where masked, no header
  grid_field.csv       the field magnitude |E| as the same matrix
  grid_georef.txt      where the matrices' nodes lie (key = value lines:
                       node (column c, row r) at x_first + c*x_step,
                       y_first + r*y_step)
  contours.geojson     equipotential lines with their level
  zones.geojson        flagged zones as polygons with their statistics
  readings.geojson     readings as points with their QA status
  infill.geojson       suggested further readings
  map_potential.svg    potential map; .png the same at --dpi (300: 3150×2250)
  map_field.svg        field map; .png the same at --dpi
  report.html          the survey report (one file, opens offline)
  export_info.txt      version, settings, inputs and the SHA-256 of every
                       file above

GeoJSON positions are WGS 84 longitude and latitude when the survey was read
from latitude and longitude, otherwise the survey's own metres (stated in
each file). Existing files are kept unless --force; input files are never
written.`

func runExport(e *env, args []string) error {
	var sf surveyFlags
	var dir, title string
	var force bool
	var dpi int
	fs := newFlagSet("export", "--dir DIR [flags] FILE.csv [FILE.csv...]", exportSummary, e.stderr)
	sf.register(fs)
	fs.StringVar(&dir, "dir", "", "write the exports into `DIR`")
	fs.BoolVar(&force, "force", false, "overwrite existing files")
	fs.StringVar(&title, "title", "", "title of maps and report (default: the survey's name)")
	fs.IntVar(&sf.cfg.Suggest, "suggest", 5, "suggest `N` further readings (0: none)")
	fs.IntVar(&dpi, "dpi", export.MapDPI, "resolution of the PNG maps in `DPI` (10 to 1200)")
	if err := sf.parse(fs, args); err != nil {
		return err
	}
	if dpi < 10 || dpi > 1200 {
		return usageError{fmt.Errorf("--dpi %d: want 10 to 1200", dpi)}
	}
	if dir == "" {
		return usageError{fmt.Errorf("export: --dir is required (see isofield export --help)")}
	}
	if len(sf.cfg.Files) == 0 {
		return usageError{fmt.Errorf("export: no input file (see isofield export --help)")}
	}
	if sf.cfg.Suggest < 0 {
		return usageError{fmt.Errorf("--suggest %d: want 0 or more", sf.cfg.Suggest)}
	}
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return fmt.Errorf("export: %w", err)
	}
	ctx := context.Background()
	res, err := sf.run(ctx, fs)
	if err != nil {
		return err
	}
	opt := exportOptions(title, force, sf.cfg.Files)
	opt.DPI = dpi
	paths, err := export.All(ctx, dir, res, sf.cfg, opt)
	for _, p := range paths {
		fmt.Fprintln(e.stdout, p)
	}
	return err
}

// exportOptions are the options every export and report run shares.
func exportOptions(title string, force bool, inputs []string) export.Options {
	return export.Options{Version: version, Title: title, Made: time.Now(), Force: force, Inputs: inputs}
}
