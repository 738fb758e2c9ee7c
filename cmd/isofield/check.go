package main

import (
	"context"
	"flag"
	"fmt"
	"io"

	"isofield/survey"
	"isofield/survey/criteria"
	"isofield/survey/qa"
)

const checkSummary = `Check the readings of one or more survey files and print the quality
report: counts, reference conversions, current scaling, the drift curve of
the base station and its loop closure, repeats and their spread, suspects
with their leave-one-out residuals, hand edits, remarks and the settings
used. Hand edits and settings come from the session file beside the first
input (FIRST_INPUT.isofield.json) unless --no-session; flags given on the
command line win over the session's settings. --exclude FILE:LINE and
--include FILE:LINE (with --reason) record hand edits in the session file,
which is written at once.

Exit status 0 when the check ran, even if it found problems; with --strict,
3 when any reading is suspect.`

func runCheck(e *env, args []string) error {
	var sf surveyFlags
	var strict, showLog bool
	fs := newFlagSet("check", "[flags] FILE.csv [FILE.csv...]", checkSummary, e.stderr)
	sf.register(fs)
	fs.BoolVar(&strict, "strict", false, "exit with status 3 when any reading is suspect")
	fs.BoolVar(&showLog, "log", false, "print every correction and status change after the report")
	if err := sf.parse(fs, args); err != nil {
		return err
	}
	s, q, notes, err := checkSurvey(fs, &sf)
	if err != nil {
		return err
	}
	if err := writeCheck(e.stdout, s, q, notes, showLog); err != nil {
		return err
	}
	if _, sus, _ := q.Counts(); strict && sus > 0 {
		return exitError{exitStrict}
	}
	return nil
}

// checkSurvey loads the files of a parsed command line and runs the
// checks with the session's edits and settings (flags win). It returns
// plain-language notes from loading and from the session.
func checkSurvey(fs *flag.FlagSet, sf *surveyFlags) (*survey.Survey, *qa.Result, []string, error) {
	cfg := &sf.cfg
	if len(cfg.Files) == 0 {
		return nil, nil, nil, usageError{fmt.Errorf("%s: no input file (see isofield %s --help)", fs.Name(), fs.Name())}
	}
	if err := checkQAFlags(cfg.QA); err != nil {
		return nil, nil, nil, err
	}
	sess, notes, err := applySession(fs, cfg)
	if err != nil {
		return nil, nil, nil, err
	}
	sf.session = sess != nil
	s, err := survey.Load(cfg.Files, cfg.Load)
	if err != nil {
		return nil, nil, nil, err
	}
	if sess != nil {
		notes = append(notes, sess.Changed(s.Files)...)
	}
	if _, err := recordEdits(fs, cfg, sess, s); err != nil {
		return nil, nil, nil, err
	}
	// The preset may fix the reference scale, as it does for grid.
	notes = append(notes, criteria.Link(&cfg.Criteria, &cfg.QA)...)
	q, err := qa.RunContext(context.Background(), s, cfg.QA, cfg.Edits)
	if err != nil {
		return nil, nil, nil, err
	}
	return s, q, append(notes, s.Notes...), nil
}

// writeCheck prints the report, preceded by the notes.
func writeCheck(w io.Writer, s *survey.Survey, q *qa.Result, notes []string, showLog bool) error {
	for _, n := range notes {
		if _, err := fmt.Fprintf(w, "note: %s\n", n); err != nil {
			return err
		}
	}
	if len(notes) > 0 {
		fmt.Fprintln(w)
	}
	if err := qa.WriteReport(w, s, q); err != nil {
		return err
	}
	if !showLog {
		return nil
	}
	if _, err := fmt.Fprintf(w, "\nlog (%d steps)\n", len(q.Log)); err != nil {
		return err
	}
	return qa.WriteLog(w, s, q)
}
