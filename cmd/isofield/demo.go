package main

import (
	"fmt"
	"io"

	"isofield/survey"
	"isofield/survey/demo"
	"isofield/survey/fileout"
)

const demoSummary = `Write the built-in demo survey (a fictional current-injection test at
Fernhollow yard) as CSV, to show the input format isofield reads.`

func runDemo(e *env, args []string) error {
	var out string
	var force bool
	fs := newFlagSet("demo", "[-o FILE.csv]", demoSummary, e.stderr)
	fs.StringVar(&out, "o", "", "write to `FILE` (atomically) instead of standard output")
	fs.BoolVar(&force, "force", false, "overwrite an existing output file")
	if err := parseFlags(fs, args); err != nil {
		return err
	}
	if fs.NArg() > 0 {
		return usageError{fmt.Errorf("demo: unexpected argument %q", fs.Arg(0))}
	}
	s := demo.Survey()
	write := func(w io.Writer) error { return survey.WriteCSV(w, s) }
	if out == "" {
		return write(e.stdout)
	}
	return fileout.Write(out, fileout.Options{Force: force}, write)
}
