package tui

import (
	"errors"
	"fmt"
	"io"
	"os"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
	"github.com/muesli/termenv"

	"isofield/survey"
	"isofield/survey/pipeline"
)

// Options configure a UI session.
type Options struct {
	// Title names the survey in the status line.
	Title string
	// Watch reloads the input files when they grow.
	Watch bool
	// SessionPath is where hand edits and settings are saved ("" : none,
	// e.g. for the built-in demo).
	SessionPath string
	// Save, if not nil, writes the configuration's edits and settings to
	// SessionPath; the UI calls it in the background after every edit.
	Save func(pipeline.Config) error
	// ExportDir is where the export key writes (each export in a new
	// time-stamped directory); "" leaves the key out.
	ExportDir string
	// ExportDPI is the resolution of exported PNG maps (0: the export
	// package's default print resolution).
	ExportDPI int
	// Version is the isofield version written into exports.
	Version string
	// NoColor forces monochrome (NO_COLOR is honoured regardless).
	NoColor bool
	// Loaded, if not nil, is the survey just read from cfg.Files; the first
	// run uses it instead of reading the files again (later runs, such as
	// those of watch mode, read them afresh).
	Loaded *survey.Survey
	// Input and Output default to the terminal (tests set them).
	Input  io.Reader
	Output io.Writer
}

// ErrPanic wraps a panic caught in the UI after the terminal was restored.
var ErrPanic = errors.New("the terminal UI failed")

// Run opens the UI on the survey described by cfg and returns when the user
// quits. The terminal is restored on every exit path, panics included: a
// panic becomes an error wrapping ErrPanic with a one-line cause.
func Run(cfg pipeline.Config, opt Options) (err error) {
	out := opt.Output
	if out == nil {
		out = os.Stdout
	}
	r := lipgloss.NewRenderer(out)
	if opt.NoColor || os.Getenv("NO_COLOR") != "" {
		r.SetColorProfile(termenv.Ascii)
	}
	m, _ := New(cfg, opt, DefaultKeyMap(), DefaultStyles(r)).Start()
	popts := []tea.ProgramOption{tea.WithAltScreen(), tea.WithOutput(out)}
	if opt.Input != nil {
		popts = append(popts, tea.WithInput(opt.Input))
	}
	p := tea.NewProgram(m, popts...)
	defer func() {
		// Bubble Tea restores the terminal on panics in Update and View
		// and returns ErrProgramPanic; this catches anything else.
		if v := recover(); v != nil {
			_ = p.ReleaseTerminal()
			err = fmt.Errorf("%w: %v", ErrPanic, v)
		}
	}()
	final, err := p.Run()
	if errors.Is(err, tea.ErrProgramPanic) {
		return fmt.Errorf("%w: %w", ErrPanic, err)
	}
	if fm, ok := final.(Model); ok {
		if fm.cancel != nil {
			fm.cancel()
		}
		if fm.panicked != "" {
			return fmt.Errorf("%w: %s (please report this)", ErrPanic, fm.panicked)
		}
	}
	return err
}
