package main

import (
	"fmt"
	"io"

	"isofield/survey/fileout"
	"isofield/survey/qa"
)

const cleanSummary = `Check the readings of one or more survey files and write every reading,
none dropped, in input order, as CSV: the input's own columns (the union of
the files' header names, in first-seen order, cells left empty where a file
lacks a column), then

  potential_corrected_U,qa_status,qa_notes

U is the potential unit (V or mV); qa_status is ok, suspect or excluded;
qa_notes are the reasons, separated by "; ". Text cells that a spreadsheet
would run as formulas get a leading '. -o writes atomically and never over
an input file, nor over an existing file without --force. Hand edits and
settings come from the session file as for check.`

func runClean(e *env, args []string) error {
	var sf surveyFlags
	var out string
	var force bool
	fs := newFlagSet("clean", "[flags] FILE.csv [FILE.csv...] [-o OUT.csv]", cleanSummary, e.stderr)
	sf.register(fs)
	fs.StringVar(&out, "o", "", "write to `FILE` (atomically) instead of standard output")
	fs.BoolVar(&force, "force", false, "overwrite an existing output file")
	if err := sf.parse(fs, args); err != nil {
		return err
	}
	s, q, _, err := checkSurvey(fs, &sf)
	if err != nil {
		return err
	}
	write := func(w io.Writer) error { return qa.WriteCleanCSV(w, s, q) }
	if out == "" {
		return write(e.stdout)
	}
	if err := fileout.Write(out, fileout.Options{Force: force, Inputs: sf.cfg.Files}, write); err != nil {
		return err
	}
	ok, sus, exc := q.Counts()
	fmt.Fprintf(e.stderr, "wrote %d readings to %s (%d ok, %d suspect, %d excluded)\n", len(s.Readings), out, ok, sus, exc)
	return nil
}
