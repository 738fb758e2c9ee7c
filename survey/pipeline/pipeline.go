// Package pipeline runs isofield's whole path from CSV files to an analysed
// grid: load, check and clean, prepare values for the criteria preset, fit
// the interpolant, evaluate it on a grid with its gradient, mask nodes far
// from the readings or outside their outline, and analyse. The command
// line and the terminal UI both call Run, so they always agree.
package pipeline

import (
	"context"
	"fmt"
	"math"
	"slices"

	"isofield/interp"
	"isofield/interp/contour"
	"isofield/survey"
	"isofield/survey/analysis"
	"isofield/survey/criteria"
	"isofield/survey/qa"
)

// Config is everything a run needs. The zero value (with Files or Survey
// set) grids with automatic spacing and the default thin-plate spline.
type Config struct {
	Files []string
	// Survey, if not nil, is used instead of loading Files.
	Survey *survey.Survey
	Load   survey.LoadOptions
	QA     qa.Settings
	Edits  []qa.Edit
	// UseSuspects grids suspect readings too (excluded ones never).
	UseSuspects bool
	Criteria    criteria.Settings
	Fit         interp.Options
	// Spacing is the grid spacing in metres (0: automatic, about 1/150 of
	// the larger extent rounded to a nice number, never finer than needed).
	Spacing float64
	// MaxNodes bounds the grid size (0: DefaultMaxNodes).
	MaxNodes int
	// MaskDistance masks nodes farther than this from any reading (0:
	// interp.DefaultMaskDistance; negative: no mask).
	MaskDistance float64
	// Outline masks, besides, the nodes outside the readings' outline
	// (the zero value: OutlineHull).
	Outline Outline
	// Interval is the contour interval (0: automatic).
	Interval float64
	// Suggest is how many infill points to suggest.
	Suggest int
}

// DefaultMaxNodes bounds automatic and requested grids.
const DefaultMaxNodes = 4_000_000

// Stage names reported through Progress.
const (
	StageLoad    = "load"
	StageCheck   = "check"
	StageFit     = "fit"
	StageGrid    = "grid"
	StageAnalyse = "analyse"
)

// Progress is called with the stage and the fraction done in it (0..1).
type Progress func(stage string, frac float64)

// Result is the outcome of a run.
type Result struct {
	Survey *survey.Survey
	QA     *qa.Result
	// Values are the per-reading values after the preset's preparation
	// (NaN for readings not used).
	Values []float64
	// Used lists the indexes of readings that went into the fit.
	Used     []int
	Model    *interp.Model
	Grid     *interp.Grid
	Analysis *analysis.Result
	// MaskDistance is the masking distance used, in metres (0: none).
	MaskDistance float64
	// OutlineMargin is how far beyond the readings' convex hull nodes were
	// kept, in metres; negative when no outline mask was applied.
	OutlineMargin float64
	Notes         []string
}

// Run executes the pipeline. It honours ctx between and within stages.
func Run(ctx context.Context, cfg Config, progress Progress) (*Result, error) {
	if progress == nil {
		progress = func(string, float64) {}
	}
	res := &Result{}
	s := cfg.Survey
	if s == nil {
		progress(StageLoad, 0)
		var err error
		if s, err = survey.Load(cfg.Files, cfg.Load); err != nil {
			return nil, err
		}
	}
	res.Survey = s
	progress(StageCheck, 0)
	// The preset may ask the checks for a reference scale (concrete, cp)
	// and learns whether they scale to a fault current (grounding).
	res.Notes = append(res.Notes, criteria.Link(&cfg.Criteria, &cfg.QA)...)
	q, err := qa.RunProgress(ctx, s, cfg.QA, cfg.Edits, func(d, t int) { progress(StageCheck, frac(d, t)) })
	if err != nil {
		return nil, err
	}
	res.QA = q
	vals, notes, err := criteria.Prepare(s, q.Corrected, cfg.Criteria)
	if err != nil {
		return nil, err
	}
	res.Notes = append(res.Notes, notes...)
	xs, ys, vs, used := selectReadings(s, q, vals, cfg.UseSuspects)
	res.Used = used
	res.Values = make([]float64, len(vals))
	for i := range res.Values {
		res.Values[i] = math.NaN()
	}
	for _, k := range used {
		res.Values[k] = vals[k]
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	fitOpt := cfg.Fit
	fitOpt.Progress = func(d, t int) { progress(StageFit, frac(d, t)) }
	progress(StageFit, 0)
	m := reuseSpikeFit(q, xs, ys, vs, cfg.Fit)
	if m == nil {
		if m, err = interp.Fit(ctx, xs, ys, vs, fitOpt); err != nil {
			return nil, fmt.Errorf("fitting %d readings: %w", len(xs), err)
		}
	}
	res.Model = m
	g, err := newGrid(xs, ys, cfg)
	if err != nil {
		return nil, err
	}
	md := cfg.MaskDistance
	if md == 0 {
		md = interp.DefaultMaskDistance(xs, ys)
	}
	if md > 0 {
		interp.MaskFar(g, xs, ys, md)
		res.MaskDistance = md
	}
	res.OutlineMargin = -1
	if cfg.Outline == OutlineHull {
		res.OutlineMargin = OutlineMargin(g)
		interp.MaskOutsideHull(g, xs, ys, res.OutlineMargin)
	}
	progress(StageGrid, 0)
	if err := interp.Evaluate(ctx, m, g, func(d, t int) { progress(StageGrid, frac(d, t)) }); err != nil {
		return nil, err
	}
	res.Grid = g
	progress(StageAnalyse, 0)
	a, err := analysis.Analyze(ctx, analysis.Input{
		Grid: g, Model: m, X: xs, Y: ys, V: vs, Index: used,
		Unit: s.Unit.String(), Criteria: cfg.Criteria,
		Interval: cfg.Interval, Suggest: cfg.Suggest,
		Progress: func(d, t int) { progress(StageAnalyse, frac(d, t)) },
	})
	if err != nil {
		return nil, err
	}
	res.Analysis = a
	progress(StageAnalyse, 1)
	return res, nil
}

// reuseSpikeFit returns the checking stage's last spike-check fit when it
// was made over exactly the positions and values to grid with the options
// the grid would use (the default thin-plate spline), else nil. On large
// surveys this saves a whole fit.
func reuseSpikeFit(q *qa.Result, xs, ys, vs []float64, o interp.Options) *interp.Model {
	if q.SpikeModel == nil || !defaultFit(o) {
		return nil
	}
	if !slices.Equal(xs, q.SpikeX) || !slices.Equal(ys, q.SpikeY) || !slices.Equal(vs, q.SpikeV) {
		return nil
	}
	return q.SpikeModel
}

// defaultFit reports whether o fits as interp.Options{} does, which is
// what the spike check uses.
func defaultFit(o interp.Options) bool {
	shapeOK := !o.Kernel.HasShape() || (!o.AutoShape && o.Shape == 0)
	return o.Kernel == interp.ThinPlate && o.Method == interp.Auto && o.LocalAbove == 0 &&
		o.Smoothing == 0 && !o.AutoSmoothing && shapeOK
}

func frac(d, t int) float64 {
	if t <= 0 {
		return 0
	}
	return float64(d) / float64(t)
}

// selectReadings returns the positions and values of readings to grid.
func selectReadings(s *survey.Survey, q *qa.Result, vals []float64, useSuspects bool) (xs, ys, vs []float64, idx []int) {
	for i, r := range s.Readings {
		// Not excluded, not suspect unless asked, and agreeing repeats
		// once (see qa.Result.Use).
		if !q.Use(i, useSuspects) {
			continue
		}
		if math.IsNaN(vals[i]) {
			continue
		}
		xs = append(xs, r.X)
		ys = append(ys, r.Y)
		vs = append(vs, vals[i])
		idx = append(idx, i)
	}
	return xs, ys, vs, idx
}

// newGrid builds the grid over the readings' extent.
func newGrid(xs, ys []float64, cfg Config) (*interp.Grid, error) {
	if len(xs) == 0 {
		return nil, fmt.Errorf("no readings to grid")
	}
	xmin, xmax, ymin, ymax := xs[0], xs[0], ys[0], ys[0]
	for i := range xs {
		xmin, xmax = min(xmin, xs[i]), max(xmax, xs[i])
		ymin, ymax = min(ymin, ys[i]), max(ymax, ys[i])
	}
	maxNodes := cfg.MaxNodes
	if maxNodes <= 0 {
		maxNodes = DefaultMaxNodes
	}
	sp := cfg.Spacing
	if sp == 0 {
		sp = AutoSpacing(xmax-xmin, ymax-ymin)
	}
	g, err := interp.NewGrid(xmin, ymin, xmax, ymax, sp, maxNodes)
	if err != nil {
		return nil, fmt.Errorf("grid spacing %g m: %w", sp, err)
	}
	return g, nil
}

// AutoSpacing returns the nice grid spacing (1, 2 or 5 × 10ⁿ metres)
// nearest, on a log scale, to the one that puts 150 nodes along the larger
// side of a w × h extent; so the longer side gets between about 95 and 235
// nodes.
func AutoSpacing(w, h float64) float64 {
	l := max(w, h)
	if l <= 0 || math.IsNaN(l) || math.IsInf(l, 0) {
		return 1
	}
	want := l / 150
	lo := contour.FloorNice(want)
	hi := niceAbove(lo)
	if math.Log(hi/want) < math.Log(want/lo) {
		return hi
	}
	return lo
}

// niceAbove returns the next nice step above the nice step v.
func niceAbove(v float64) float64 {
	e := math.Pow(10, math.Floor(math.Log10(v)+1e-9))
	switch f := math.Round(v / e); f {
	case 1:
		return 2 * e
	case 2:
		return 5 * e
	}
	return 10 * e
}
