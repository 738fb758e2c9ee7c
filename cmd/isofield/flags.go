package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"slices"
	"strconv"
	"strings"
	"time"

	"isofield/interp"
	"isofield/survey/pipeline"
	"isofield/survey/session"
)

// surveyFlags are the flags shared by every command that reads and grids
// survey files. They fill a pipeline.Config.
type surveyFlags struct {
	cfg       pipeline.Config
	kernel    string
	smoothing string
	shape     string
	method    string
	session   bool // read and write the session file beside the first input
}

// newFlagSet returns a flag set that prints its usage to w and never exits.
func newFlagSet(name, args, summary string, w io.Writer) *flag.FlagSet {
	fs := flag.NewFlagSet(name, flag.ContinueOnError)
	fs.SetOutput(w)
	fs.Usage = func() {
		fmt.Fprintf(w, "usage: isofield %s %s\n\n%s\n\nflags:\n", name, args, summary)
		fs.PrintDefaults()
	}
	return fs
}

// register adds the shared flags to fs.
func (f *surveyFlags) register(fs *flag.FlagSet) {
	c := &f.cfg
	fs.StringVar(&c.Load.Units, "units", "", "potential unit of files whose header states none: `V|mV`")
	fs.Float64Var(&c.Load.LineSpacing, "line-spacing", 0, "`METRES` between survey lines, for files with line and station numbers")
	fs.Float64Var(&c.Load.StationSpacing, "station-spacing", 0, "`METRES` between stations along a line")
	fs.BoolVar(&c.Load.LinesAlongY, "lines-along-y", false, "survey lines run along y (stations count northwards)")
	fs.Float64Var(&c.Spacing, "spacing", 0, "grid spacing in `METRES` (default: about 150 nodes along the longer side)")
	fs.Float64Var(&c.MaskDistance, "mask", 0, "blank nodes farther than `METRES` from any reading (default: from the readings' spacing; negative: none)")
	fs.TextVar(&c.Outline, "outline", pipeline.OutlineHull, "blank nodes outside the readings' outline too: `hull|none`; hull keeps their convex hull grown by a grid cell's diagonal")
	fs.Float64Var(&c.Interval, "interval", 0, "contour `INTERVAL` in the potential unit (default: a round interval giving 8 to 15 bands)")
	fs.BoolVar(&c.UseSuspects, "use-suspects", false, "grid suspect readings too (excluded readings never)")
	fs.StringVar(&f.kernel, "kernel", "thin-plate", "radial basis `KERNEL`: thin-plate, cubic, multiquadric, inverse-multiquadric, gaussian, wendland-c2, wendland-c4")
	fs.StringVar(&f.smoothing, "smoothing", "0", "smoothing λ: auto or a `VALUE` ≥ 0")
	fs.StringVar(&f.shape, "shape", "auto", "shape parameter ε of kernels that have one: auto or a `VALUE` > 0")
	fs.StringVar(&f.method, "method", "auto", "fit `METHOD`: auto, global or local (partition of unity)")
	addQAFlags(fs, &c.QA)
	addCriteriaFlags(fs, &c.Criteria)
}

// parse parses args and completes the config. It returns errHelp after
// printing help, and usageError for bad flags.
func (f *surveyFlags) parse(fs *flag.FlagSet, args []string) error {
	files, err := parseInterspersed(fs, args)
	if err != nil {
		return err
	}
	f.cfg.Files = files
	if err := f.restoreSettings(fs, args); err != nil {
		return err
	}
	if err := f.fitOptions(); err != nil {
		return usageError{err}
	}
	if u := f.cfg.Load.Units; u != "" && u != "V" && u != "mV" {
		return usageError{fmt.Errorf("--units %q: want V or mV", u)}
	}
	if f.cfg.Spacing < 0 {
		return usageError{fmt.Errorf("--spacing %g: must be positive", f.cfg.Spacing)}
	}
	return nil
}

// fitOptions translates the kernel, smoothing, shape and method flags.
func (f *surveyFlags) fitOptions() error {
	o := &f.cfg.Fit
	k, err := interp.ParseKernel(f.kernel)
	if err != nil {
		return fmt.Errorf("--kernel: %w", err)
	}
	o.Kernel = k
	if o.AutoSmoothing, o.Smoothing, err = autoOrValue(f.smoothing, 0); err != nil {
		return fmt.Errorf("--smoothing: %w", err)
	}
	if o.AutoShape, o.Shape, err = autoOrValue(f.shape, 1e-300); err != nil {
		return fmt.Errorf("--shape: %w", err)
	}
	switch strings.ToLower(f.method) {
	case "auto", "":
		o.Method = interp.Auto
	case "global":
		o.Method = interp.Global
	case "local":
		o.Method = interp.Local
	default:
		return fmt.Errorf("--method %q: want auto, global or local", f.method)
	}
	return nil
}

// autoOrValue reads "auto" or a number no smaller than lo.
func autoOrValue(s string, lo float64) (auto bool, v float64, err error) {
	if strings.EqualFold(s, "auto") {
		return true, 0, nil
	}
	v, err = strconv.ParseFloat(s, 64)
	if err != nil || v < lo || v != v || v > 1e300 {
		return false, 0, fmt.Errorf("%q is neither auto nor a valid number", s)
	}
	return false, v, nil
}

// parseFlags parses args for commands without the shared survey flags.
// Positional arguments stay available through fs.Args.
func parseFlags(fs *flag.FlagSet, args []string) error {
	rest, err := parseInterspersed(fs, args)
	if err != nil {
		return err
	}
	// Leave the positional arguments where fs.Args finds them.
	return fs.Parse(append([]string{"--"}, rest...))
}

// parseInterspersed parses flags that may stand before, between or after
// the positional arguments (users write "grid a.csv -o g.csv" as often as
// "grid -o g.csv a.csv"), and returns the positional arguments in order.
// Everything after "--" is positional.
func parseInterspersed(fs *flag.FlagSet, args []string) ([]string, error) {
	var pos []string
	for {
		if err := fs.Parse(args); err != nil {
			if errors.Is(err, flag.ErrHelp) {
				return nil, errHelp
			}
			return nil, usageError{err}
		}
		rest := fs.Args()
		// fs.Parse stops at the first positional argument or after "--".
		dashdash := len(args) > len(rest) && args[len(args)-len(rest)-1] == "--"
		if len(rest) == 0 || dashdash {
			return append(pos, rest...), nil
		}
		pos = append(pos, rest[0])
		args = rest[1:]
	}
}

// restoreSettings starts the criteria, fit and grid settings from the
// session file beside the first input (as the terminal UI saved them), then
// lets every flag given on the command line win. The QA settings and hand
// edits of the session are applied by applySession.
//
// It parses args a second time into a fresh flag set whose fields hold the
// session's values: flags not given keep them, flags given overwrite them.
func (f *surveyFlags) restoreSettings(fs *flag.FlagSet, args []string) error {
	path, explicit := sessionPath(fs, f.cfg.Files)
	if path == "" {
		return nil
	}
	sess, err := session.Load(path)
	if err != nil {
		if !explicit && errors.Is(err, os.ErrNotExist) {
			return nil
		}
		return fmt.Errorf("session: %w", err)
	}
	var again surveyFlags
	fs2 := flag.NewFlagSet(fs.Name(), flag.ContinueOnError)
	fs2.SetOutput(io.Discard)
	again.register(fs2)
	// The command's own flags (-o, --force, ...) are parsed and dropped.
	fs.VisitAll(func(fl *flag.Flag) {
		if fs2.Lookup(fl.Name) == nil {
			fs2.Var(ignored{isBool: isBoolFlag(fl)}, fl.Name, "")
		}
	})
	if err := sess.Settings.Apply(&again.cfg); err != nil {
		return fmt.Errorf("session %s: %w", path, err)
	}
	fit := sess.Settings.Fit
	if fit.Kernel != "" {
		again.kernel = fit.Kernel
	}
	if fit.Method != "" {
		again.method = fit.Method
	}
	again.smoothing = autoText(fit.AutoSmoothing, fit.Smoothing, again.smoothing)
	again.shape = autoText(fit.AutoShape, fit.Shape, again.shape)
	if _, err := parseInterspersed(fs2, args); err != nil {
		return err
	}
	f.cfg.Criteria = again.cfg.Criteria
	f.cfg.Criteria.Conditions = slices.Compact(slices.Sorted(slices.Values(f.cfg.Criteria.Conditions)))
	f.cfg.Spacing, f.cfg.MaskDistance, f.cfg.Interval = again.cfg.Spacing, again.cfg.MaskDistance, again.cfg.Interval
	f.cfg.Outline = again.cfg.Outline
	f.cfg.MaxNodes, f.cfg.UseSuspects = again.cfg.MaxNodes, again.cfg.UseSuspects
	f.kernel, f.method, f.smoothing, f.shape = again.kernel, again.method, again.smoothing, again.shape
	return nil
}

// autoText writes a fit setting back as its flag text: "auto", the value,
// or def when the value is unset.
func autoText(auto bool, v float64, def string) string {
	switch {
	case auto:
		return "auto"
	case v > 0:
		return strconv.FormatFloat(v, 'g', -1, 64)
	}
	return def
}

// run applies the session's QA settings and hand edits and runs the
// pipeline, for the commands that grid and analyse.
func (f *surveyFlags) run(ctx context.Context, fs *flag.FlagSet) (*pipeline.Result, error) {
	if err := checkQAFlags(f.cfg.QA); err != nil {
		return nil, err
	}
	if _, _, err := applySession(fs, &f.cfg); err != nil {
		return nil, err
	}
	var trace pipeline.Progress
	if os.Getenv("ISOFIELD_TRACE") != "" {
		trace = stageTrace(os.Stderr)
	}
	return pipeline.Run(ctx, f.cfg, trace)
}

// stageTrace returns a progress function that prints to w the time at
// which each pipeline stage starts (for contributors: ISOFIELD_TRACE=1
// isofield grid ...; see DEVELOPERS.md).
func stageTrace(w io.Writer) pipeline.Progress {
	t0 := time.Now()
	last := ""
	return func(stage string, _ float64) {
		if stage != last {
			last = stage
			fmt.Fprintf(w, "isofield: %7.3f s  %s\n", time.Since(t0).Seconds(), stage)
		}
	}
}

// ignored is a flag value that accepts anything and keeps nothing.
type ignored struct{ isBool bool }

func (ignored) String() string     { return "" }
func (ignored) Set(string) error   { return nil }
func (i ignored) IsBoolFlag() bool { return i.isBool }

// isBoolFlag reports whether fl is a boolean flag (given without a value).
func isBoolFlag(fl *flag.Flag) bool {
	b, ok := fl.Value.(interface{ IsBoolFlag() bool })
	return ok && b.IsBoolFlag()
}
