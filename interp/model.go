package interp

import (
	"context"
	"fmt"
	"math"
	"sync"
)

// looAlwaysBelow is the merged reading count up to which a global fit also
// computes its leave-one-out RMS error (an extra O(N³) inverse, about a
// tenth of a second at this size on a laptop core).
const looAlwaysBelow = 600

// localFewest is the fewest merged readings the local method takes; with
// fewer, patches of localMin readings would overlap almost entirely and
// Method Local falls back on the global fit (with a warning).
const localFewest = 3 * localMin

// surface is what a fitted model evaluates: a global fit or a partition of
// unity. Both also implement rowEvaluator.
type surface interface {
	Interpolant
	rowEvaluator
}

// Model is a fitted interpolant (global or partition of unity). It is safe
// for concurrent use; Value and Gradient do not allocate.
type Model struct {
	info FitInfo
	surf surface
	ds   *dataset

	looOnce sync.Once
	loo     []float64 // per merged reading, once computed
	looErr  error
	looFn   func() ([]float64, error)
}

// Fit fits an interpolant to values vs at points (xs[i], ys[i]) as opt
// says. It copies its inputs. Readings closer together than 1 % of the
// median spacing are merged first (see FitInfo.Merged and Warnings).
//
// It returns an error wrapping ErrNonFinite, ErrTooFew, ErrCollinear or
// ErrIllConditioned for bad data, an error for invalid options, and
// ctx.Err() when cancelled. It panics if the slices differ in length.
func Fit(ctx context.Context, xs, ys, vs []float64, opt Options) (*Model, error) {
	if err := checkOptions(opt); err != nil {
		return nil, err
	}
	ds, err := prepare(xs, ys, vs)
	if err != nil {
		return nil, err
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	progress := opt.Progress
	if progress == nil {
		progress = func(int, int) {}
	}
	var m *Model
	method := chooseMethod(opt, len(ds.x))
	var note string
	if method == Local && len(ds.x) < localFewest {
		method = Global
		note = fmt.Sprintf("%d readings are too few for the local method; the global fit was used", len(ds.x))
	}
	if method == Local {
		var ix *pointIndex
		ds, ix = ds.spatialOrder()
		m, err = fitLocalModel(ctx, ds, ix, opt, progress)
	} else {
		m, err = fitGlobalModel(ctx, ds, opt, progress)
	}
	if err != nil {
		return nil, err
	}
	if note != "" {
		m.info.Warnings = append(m.info.Warnings, note)
	}
	m.ds = ds
	m.info.Kernel = opt.Kernel
	m.info.Merged = ds.merged
	m.info.Warnings = append(append([]string(nil), ds.warnings...), m.info.Warnings...)
	return m, nil
}

// checkOptions rejects options no fit can honour.
func checkOptions(opt Options) error {
	if opt.Kernel < ThinPlate || opt.Kernel > WendlandC4 {
		return fmt.Errorf("unknown kernel %d", int(opt.Kernel))
	}
	if opt.Method < Auto || opt.Method > Local {
		return fmt.Errorf("unknown method %d", int(opt.Method))
	}
	if !finite(opt.Smoothing) || opt.Smoothing < 0 {
		return fmt.Errorf("smoothing %g: want a finite value ≥ 0", opt.Smoothing)
	}
	if !finite(opt.Shape) || opt.Shape < 0 {
		return fmt.Errorf("shape %g: want a finite value ≥ 0", opt.Shape)
	}
	if opt.LocalAbove < 0 {
		return fmt.Errorf("local threshold %d: want ≥ 0", opt.LocalAbove)
	}
	return nil
}

// chooseMethod resolves Auto: the global fit up to LocalAbove (default
// DefaultLocalAbove) merged readings, the partition of unity above.
func chooseMethod(opt Options, n int) Method {
	if opt.Method != Auto {
		return opt.Method
	}
	limit := opt.LocalAbove
	if limit == 0 {
		limit = DefaultLocalAbove
	}
	if n > limit {
		return Local
	}
	return Global
}

// fitGlobalModel makes the global fit, choosing smoothing and shape by
// leave-one-out when asked.
func fitGlobalModel(ctx context.Context, ds *dataset, opt Options, progress func(int, int)) (*Model, error) {
	shape := opt.Shape
	if shape == 0 {
		shape = defaultShape(opt.Kernel, ds.h)
	}
	lambda := opt.Smoothing
	m := &Model{info: FitInfo{Method: Global, LOORMS: math.NaN()}}
	progress(0, 1)
	if opt.AutoSmoothing || (opt.AutoShape && opt.Kernel.HasShape()) {
		ch, err := chooseGlobal(ctx, ds, opt, shape, progress)
		if err != nil {
			return nil, err
		}
		shape, lambda = ch.shape, ch.lambda
		m.info.Warnings = append(m.info.Warnings, ch.note)
		m.info.LOORMS = ch.rms
	}
	if err := ctx.Err(); err != nil {
		return nil, err
	}
	b := newBasis(opt.Kernel, shape)
	g, cond, e, err := fitGlobal(ds, b, lambda, len(ds.x) <= looAlwaysBelow)
	if err != nil {
		return nil, fmt.Errorf("global %s fit: %w", opt.Kernel, err)
	}
	m.surf = g
	m.info.Smoothing, m.info.Shape, m.info.Condition = lambda, shape, cond
	m.looFn = func() ([]float64, error) {
		_, _, e, err := fitGlobal(ds, b, lambda, true)
		return e, err
	}
	if e != nil {
		m.looOnce.Do(func() { m.loo = e })
		m.info.LOORMS = rms(e)
	}
	progress(1, 1)
	return m, nil
}

func rms(e []float64) float64 {
	var s float64
	for _, v := range e {
		s += v * v
	}
	return math.Sqrt(s / float64(len(e)))
}

// Info reports how the model was fitted.
func (m *Model) Info() FitInfo {
	info := m.info
	info.Warnings = append([]string(nil), m.info.Warnings...)
	return info
}

// Value returns the interpolated value at (x, y).
func (m *Model) Value(x, y float64) float64 { return m.surf.Value(x, y) }

// Gradient returns the analytic gradient (∂V/∂x, ∂V/∂y) at (x, y).
func (m *Model) Gradient(x, y float64) (dx, dy float64) { return m.surf.Gradient(x, y) }

func (m *Model) evalRow(y, x0, dx float64, v, gx, gy []float64, mask []bool) {
	m.surf.evalRow(y, x0, dx, v, gx, gy, mask)
}

// LeaveOneOut returns, for each reading in input order, the reading's value
// minus the value predicted at its position by the fit made without it
// (Rippa's closed form for the global fit, the exact partition-of-unity
// equivalent for the local one; see looLocal). Readings merged into one
// are left out together: each gets its own value minus the prediction
// made without its group. It returns nil when the computation fails (an
// ill-conditioned system). The first call may cost a refit.
func (m *Model) LeaveOneOut() []float64 {
	m.looOnce.Do(func() { m.loo, m.looErr = m.looFn() })
	if m.looErr != nil || m.loo == nil {
		return nil
	}
	out := make([]float64, len(m.ds.group))
	for k, g := range m.ds.group {
		pred := m.ds.v[g] - m.loo[g]
		out[k] = m.ds.orig[k] - pred
	}
	return out
}
