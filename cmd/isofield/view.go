package main

import (
	"errors"
	"flag"
	"fmt"
	"path/filepath"
	"strings"
	"sync"
	"time"

	"isofield/survey"
	"isofield/survey/demo"
	"isofield/survey/pipeline"
	"isofield/survey/session"
	"isofield/tui"
)

const viewSummary = `Open the terminal UI on one or more survey files: the map of equipotential
bands with a cursor readout, flagged zones, the readings table (exclude or
include readings with a reason), a profile between two marks and the
settings. Press ? inside for every key.

Without files it opens the built-in demo survey (a fictional site).
With --watch it reloads the files when readings are appended and regrids,
keeping the cursor and your edits. Hand edits and settings changed in the
UI are saved at once to the session file beside the first input. The
export key writes every export (see isofield export --help) into a new
directory isofield-export-DATE-TIME beside the first input (the current
directory for the demo).`

// viewSuggest is how many infill points the UI asks for when the command
// line does not say.
const viewSuggest = 10

func runView(e *env, args []string) error {
	var sf surveyFlags
	var watch, noColor bool
	fs := newFlagSet("view", "[flags] [FILE.csv...]", viewSummary, e.stderr)
	sf.register(fs)
	fs.BoolVar(&watch, "watch", false, "reload the files when they change (readings appended during the survey)")
	fs.BoolVar(&noColor, "no-color", false, "draw without colour (glyphs only); NO_COLOR does the same")
	if err := sf.parse(fs, args); err != nil {
		return err
	}
	opt := tui.Options{Watch: watch, NoColor: noColor, Version: version, ExportDir: "."}
	cfg := sf.cfg
	if cfg.Suggest == 0 {
		cfg.Suggest = viewSuggest
	}
	if len(cfg.Files) == 0 {
		if watch {
			return usageError{errors.New("view: --watch needs a file to watch")}
		}
		cfg.Survey = demo.Survey()
		opt.Title = cfg.Survey.Name
	} else {
		// Bad input ends the command with its one-line message and exit 1
		// before the screen is taken over; the UI's first run grids the
		// survey read here (watch mode reads the files again on change).
		s, err := survey.Load(cfg.Files, cfg.Load)
		if err != nil {
			return err
		}
		opt.Loaded = s
		opt.Title = titleOf(cfg.Files)
		opt.ExportDir = filepath.Dir(cfg.Files[0])
		if err := viewSession(fs, &cfg, &opt); err != nil {
			return err
		}
	}
	if err := tui.Run(cfg, opt); err != nil {
		return fmt.Errorf("view: %w", err)
	}
	return nil
}

// viewSession reads the session of the files into cfg (hand edits and QA
// settings, flags winning) and sets opt to save edits and settings back to
// it, unless --no-session was given.
func viewSession(fs *flag.FlagSet, cfg *pipeline.Config, opt *tui.Options) error {
	if f := fs.Lookup(flagNoSession); f != nil && f.Value.String() == "true" {
		return nil
	}
	sess, _, err := applySession(fs, cfg)
	if err != nil {
		return err
	}
	if sess == nil {
		path := session.PathFor(cfg.Files)
		if f := fs.Lookup(flagSession); f != nil && f.Value.String() != "" {
			path = f.Value.String()
		}
		sess = session.New(path)
	}
	s := &sessionSaver{f: sess, known: len(cfg.Edits)}
	opt.SessionPath, opt.Save = sess.Path(), s.save
	return nil
}

// sessionSaver writes the UI's new hand edits and its settings to the
// session file. The UI calls save from background commands, so a mutex
// keeps saves in order.
type sessionSaver struct {
	mu    sync.Mutex
	f     *session.File
	known int // edits of the configuration already in the session
}

func (s *sessionSaver) save(c pipeline.Config) error {
	s.mu.Lock()
	defer s.mu.Unlock()
	now := time.Now()
	for ; s.known < len(c.Edits); s.known++ {
		e := c.Edits[s.known]
		add := s.f.Include
		if e.Exclude {
			add = s.f.Exclude
		}
		if err := add(e.File, e.Line, e.ID, e.Reason, now); err != nil {
			return err
		}
	}
	return s.f.SetSettings(session.FromConfig(c))
}

// titleOf names the survey by its files.
func titleOf(files []string) string {
	names := make([]string, len(files))
	for i, f := range files {
		names[i] = filepath.Base(f)
	}
	if len(names) > 3 {
		return strings.Join(names[:3], ", ") + fmt.Sprintf(" and %d more", len(names)-3)
	}
	return strings.Join(names, ", ")
}
