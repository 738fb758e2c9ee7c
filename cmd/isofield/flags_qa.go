package main

import (
	"errors"
	"flag"
	"fmt"
	"os"
	"strconv"
	"strings"
	"time"

	"isofield/survey"
	"isofield/survey/electrode"
	"isofield/survey/fileout"
	"isofield/survey/pipeline"
	"isofield/survey/qa"
	"isofield/survey/session"
)

// Names of the session flags, read back with fs.Lookup after parsing.
const (
	flagNoSession = "no-session"
	flagSession   = "session"
	flagExclude   = "exclude"
	flagInclude   = "include"
	flagReason    = "reason"
)

// addQAFlags registers the checking and cleaning flags shared by every
// command that reads surveys, and the session flags.
func addQAFlags(fs *flag.FlagSet, s *qa.Settings) {
	refs := strings.Join(electrode.Names(), ", ")
	fs.TextVar(&s.From, "from-ref", electrode.None, "reference electrode `NAME` the readings were taken against, one of: "+refs+" (a reference column overrides it)")
	fs.TextVar(&s.To, "to-ref", electrode.None, "convert every reading to this reference electrode `NAME` (default: no conversion)")
	fs.StringVar(&s.Base, "base", "", "correct drift with the repeated readings of base station `ID`")
	fs.BoolVar(&s.AutoBase, "auto-base", false, "correct drift with the proposed base station (the spot read most often)")
	fs.TextVar(&s.Drift, "drift", qa.Linear, "drift curve between base readings: `linear` or cubic (monotone)")
	fs.Float64Var(&s.RepeatTol, "repeat-tol", 0, fmt.Sprintf("largest spread `VALUE` of agreeing repeats, in the potential unit (default %g mV, ASTM C876 repeatability, from memory; negative: never suspect)", qa.DefaultRepeatTolMV))
	fs.Float64Var(&s.RepeatDist, "repeat-dist", 0, fmt.Sprintf("readings within `METRES` are repeats of one spot (default %g; negative: same id only)", qa.DefaultRepeatDist))
	fs.BoolVar(&s.IgnoreIDs, "repeat-by-position", false, "group repeats by position only (ids restart in each file)")
	fs.Float64Var(&s.SpikeK, "spike-k", 0, fmt.Sprintf("mark readings whose leave-one-out robust z, beyond the local curvature allowance, exceeds `K` (default %g; negative: no spike check)", qa.DefaultSpikeK))
	fs.Float64Var(&s.TestCurrent, "test-current", 0, "injected test current in `AMPERES` for readings without a test current column")
	fs.Float64Var(&s.FaultCurrent, "fault-current", 0, "scale readings to this current into the grid, in `AMPERES` (V × fault / test current)")
	fs.Bool(flagNoSession, false, "ignore the session file (settings and hand edits kept beside the first input)")
	fs.String(flagSession, "", "read the session from `FILE` instead of FIRST_INPUT"+session.Suffix)
	fs.Var(&editSpecs{}, flagExclude, "exclude the reading at `FILE:LINE` by hand, recorded in the session file (repeatable)")
	fs.Var(&editSpecs{}, flagInclude, "include the reading at `FILE:LINE` by hand (ok whatever the checks said), recorded in the session file (repeatable)")
	fs.String(flagReason, "", "`TEXT` recorded as the reason of --exclude and --include")
}

// qaFlagFields copies, for each QA flag, its field from src to dst.
func qaFlagFields() map[string]func(dst, src *qa.Settings) {
	return map[string]func(dst, src *qa.Settings){
		"from-ref":           func(d, s *qa.Settings) { d.From = s.From },
		"to-ref":             func(d, s *qa.Settings) { d.To = s.To },
		"base":               func(d, s *qa.Settings) { d.Base = s.Base },
		"auto-base":          func(d, s *qa.Settings) { d.AutoBase = s.AutoBase },
		"drift":              func(d, s *qa.Settings) { d.Drift = s.Drift },
		"repeat-tol":         func(d, s *qa.Settings) { d.RepeatTol = s.RepeatTol },
		"repeat-dist":        func(d, s *qa.Settings) { d.RepeatDist = s.RepeatDist },
		"repeat-by-position": func(d, s *qa.Settings) { d.IgnoreIDs = s.IgnoreIDs },
		"spike-k":            func(d, s *qa.Settings) { d.SpikeK = s.SpikeK },
		"test-current":       func(d, s *qa.Settings) { d.TestCurrent = s.TestCurrent },
		"fault-current":      func(d, s *qa.Settings) { d.FaultCurrent = s.FaultCurrent },
	}
}

// checkQAFlags rejects QA flag values no run can use.
func checkQAFlags(s qa.Settings) error {
	if err := s.Validate(); err != nil {
		return usageError{err}
	}
	return nil
}

// applySession reads the session of a parsed command line into cfg: its
// hand edits, and its QA settings except those given as flags, which win.
// With --no-session, or when no session file exists, cfg is unchanged. It
// returns the session (nil when none was read) and notes to show.
func applySession(fs *flag.FlagSet, cfg *pipeline.Config) (*session.File, []string, error) {
	path, explicit := sessionPath(fs, cfg.Files)
	if path == "" {
		return nil, nil, nil
	}
	sf, err := session.Load(path)
	if err != nil {
		if !explicit && errors.Is(err, os.ErrNotExist) {
			return nil, nil, nil
		}
		return nil, nil, fmt.Errorf("session: %w", err)
	}
	set := sf.Settings.QA
	fields := qaFlagFields()
	fs.Visit(func(f *flag.Flag) {
		if copyField, ok := fields[f.Name]; ok {
			copyField(&set, &cfg.QA)
		}
	})
	cfg.QA = set
	cfg.Edits = append(cfg.Edits, sf.QAEdits()...)
	notes := []string{fmt.Sprintf("session %s: %d hand edit(s) applied", path, len(sf.Edits))}
	return sf, notes, nil
}

// sessionPath returns the session file of a parsed command line ("" with
// --no-session) and whether --session named it.
func sessionPath(fs *flag.FlagSet, files []string) (string, bool) {
	if f := fs.Lookup(flagNoSession); f != nil && f.Value.String() == "true" {
		return "", false
	}
	if f := fs.Lookup(flagSession); f != nil && f.Value.String() != "" {
		return f.Value.String(), true
	}
	return session.PathFor(files), false
}

// editSpecs collects FILE:LINE arguments of --exclude and --include.
type editSpecs []string

func (e *editSpecs) String() string     { return strings.Join(*e, " ") }
func (e *editSpecs) Set(s string) error { *e = append(*e, s); return nil }

// editSpec is one parsed FILE:LINE.
type editSpec struct {
	file    string
	line    int
	exclude bool
}

// handEdits returns the --exclude and --include arguments of a parsed
// command line, in that order.
func handEdits(fs *flag.FlagSet) ([]editSpec, error) {
	var out []editSpec
	for _, name := range []string{flagExclude, flagInclude} {
		f := fs.Lookup(name)
		if f == nil {
			continue
		}
		for _, spec := range *f.Value.(*editSpecs) {
			k := strings.LastIndexByte(spec, ':')
			line, err := strconv.Atoi(spec[k+1:])
			if k <= 0 || err != nil || line < 1 {
				return nil, usageError{fmt.Errorf("--%s %q: want FILE:LINE", name, spec)}
			}
			out = append(out, editSpec{spec[:k], line, name == flagExclude})
		}
	}
	return out, nil
}

// recordEdits writes the hand edits of the command line into the session
// (saving it at once) and adds them to cfg.Edits. Each must name a reading
// of the loaded survey.
func recordEdits(fs *flag.FlagSet, cfg *pipeline.Config, sess *session.File, s *survey.Survey) (*session.File, error) {
	specs, err := handEdits(fs)
	if err != nil || len(specs) == 0 {
		return sess, err
	}
	if sess == nil {
		path, _ := sessionPath(fs, cfg.Files)
		if path == "" {
			return nil, usageError{errors.New("--exclude and --include are kept in the session file: drop --no-session")}
		}
		sess = session.New(path)
	}
	sess.SetInputs(s.Files)
	reason := fs.Lookup(flagReason).Value.String()
	for _, sp := range specs {
		i, err := findReading(s, sp.file, sp.line)
		if err != nil {
			return nil, usageError{err}
		}
		id := s.Readings[i].ID
		edit := sess.Include
		if sp.exclude {
			edit = sess.Exclude
		}
		if err := edit(s.Files[s.Readings[i].File].Path, sp.line, id, reason, time.Now()); err != nil {
			return nil, err
		}
		cfg.Edits = append(cfg.Edits, qa.Edit{File: s.Files[s.Readings[i].File].Path, Line: sp.line, ID: id, Exclude: sp.exclude, Reason: reason})
	}
	return sess, nil
}

// findReading returns the index of the reading on line of file.
func findReading(s *survey.Survey, file string, line int) (int, error) {
	fi := -1
	for k, f := range s.Files {
		if fileout.SameFile(f.Path, file) {
			fi = k
			break
		}
	}
	for i, rd := range s.Readings {
		if fi >= 0 && rd.File == fi && rd.Line0 == line {
			return i, nil
		}
	}
	return 0, fmt.Errorf("%s:%d: no reading on that line of the inputs", file, line)
}
