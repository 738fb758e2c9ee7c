package main

import (
	"context"
	"fmt"
	"io"

	"isofield/survey/export"
	"isofield/survey/fileout"
)

const reportSummary = `Check, grid and analyse the survey files and write the survey report: one
self-contained HTML file (maps embedded, no script, nothing fetched) that
opens in any browser offline and prints to clean A4 pages. It shows the
files with their SHA-256 checksums, counts, extent and dates; the settings
and the preset with the sources of its numbers; the checks of the readings;
the potential and field maps; the flagged zones; areas by class; suggested
further readings; the cautions; and the isofield version.`

func runReport(e *env, args []string) error {
	var sf surveyFlags
	var out, title string
	var force bool
	fs := newFlagSet("report", "[flags] -o REPORT.html FILE.csv [FILE.csv...]", reportSummary, e.stderr)
	sf.register(fs)
	fs.StringVar(&out, "o", "", "write the report to `FILE` (atomically); required")
	fs.BoolVar(&force, "force", false, "overwrite an existing report")
	fs.StringVar(&title, "title", "", "title of the report (default: the survey's name)")
	fs.IntVar(&sf.cfg.Suggest, "suggest", 5, "suggest `N` further readings (0: none)")
	if err := sf.parse(fs, args); err != nil {
		return err
	}
	if out == "" {
		return usageError{fmt.Errorf("report: -o is required (see isofield report --help)")}
	}
	if len(sf.cfg.Files) == 0 {
		return usageError{fmt.Errorf("report: no input file (see isofield report --help)")}
	}
	if sf.cfg.Suggest < 0 {
		return usageError{fmt.Errorf("--suggest %d: want 0 or more", sf.cfg.Suggest)}
	}
	fo := fileout.Options{Force: force, Inputs: sf.cfg.Files}
	if err := fileout.Check(out, fo); err != nil {
		return fmt.Errorf("%s: %w", out, err)
	}
	ctx := context.Background()
	res, err := sf.run(ctx, fs)
	if err != nil {
		return err
	}
	b, err := export.FromResult(ctx, res, sf.cfg, exportOptions(title, force, sf.cfg.Files))
	if err != nil {
		return err
	}
	return fileout.Write(out, fo, func(w io.Writer) error { return b.WriteReport(w) })
}
