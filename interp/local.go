package interp

import (
	"context"
	"fmt"
	"math"
	"runtime"
	"sort"
	"sync"
	"sync/atomic"
)

// Patch sizes of the partition of unity, in merged readings. Our choice,
// within the range of Cavoretto, De Rossi & Perracchione (2016–2017), who
// use patches of a few dozen points: about localTarget readings within
// the fit radius (fitMargin × the base weight radius) at the survey's mean
// density; patches with fewer than localMin grow until they have
// localMin (and are not collinear); patches with more than localMax
// shrink to their localMax nearest readings. localTarget, fitMargin,
// coverRatio and the extender's thinning were chosen together by a sweep
// on 100,000 readings of the half-space potential (interp/BENCHMARKS.md):
// 52 readings, a margin of 2, a cover of 1.15 and thinning at the mean
// spacing give an RMS error of 0.032 mV where the layout before them (48
// readings, cover 1.41, no thinning) gave 0.063 mV, for less work.
const localTarget = 52

const (
	localMin = 12
	localMax = 160
)

// patch is one local fit: centre and radii in the model's scaled
// coordinates, its readings in patch coordinates (u − centre)/frad at
// flat[lo:hi], and the polynomial part.
type patch struct {
	cx, cy, rad float64 // centre and weight radius ρ
	frad        float64 // fit radius fitMargin·ρ: readings and coordinates
	lo, hi      int32
	d           [3]float64
	b           basis // shape rescaled to patch coordinates
}

// localFit is a partition-of-unity interpolant:
//
//	s(u) = Σ_j w_j(u) s_j(u) / Σ_j w_j(u),  w_j(u) = ψ(|u − c_j| / ρ_j),
//
// with ψ Wendland's C² function (1 − q)₊⁴(4q + 1) (Wendland, Adv. Comput.
// Math. 4 (1995); the construction is Wendland, "Fast evaluation of
// radial basis functions: methods based on partition of unity" (2002),
// and Cavoretto, De Rossi & Perracchione, "Efficient computation of
// partition of unity interpolants through a block-based searching
// technique", Comput. Math. Appl. 71 (2016)). Patch centres lie on a
// regular lattice; each s_j is a radial basis fit to the readings within
// fitMargin·ρ_j of c_j (see fitMargin). The blend is as smooth as its weights and local fits: C¹
// for the thin-plate spline, whose second derivatives have a log
// singularity at the readings.
type localFit struct {
	cx, cy, s float64 // caller → scaled coordinates
	patches   []patch
	px, py    []float64 // patch-local reading coordinates
	coef      []float64
	member    []int32 // merged reading index of each flat entry
	cells     cellMap
	// ej, when not nil, receives each flat entry's patch leave-one-out
	// error during the fit (Options.LeaveOneOut); see leaveOneOut.
	ej []float64
}

// localPlan holds what building a local fit needs besides the data.
type localPlan struct {
	b      basis // kernel with shape in global scaled coordinates
	lambda float64
}

// localLOOBelow is the merged reading count up to which an automatic
// local fit also computes its full leave-one-out RMS error (about the cost
// of a second fit).
const localLOOBelow = 20000

// fitLocalModel fits the partition of unity to ds, whose readings ix
// indexes (dataset.spatialOrder makes both).
func fitLocalModel(ctx context.Context, ds *dataset, ix *pointIndex, opt Options, progress func(int, int)) (*Model, error) {
	shape := opt.Shape
	if shape == 0 {
		shape = defaultShape(opt.Kernel, ds.h)
	}
	lf, lat, err := layoutLocal(ds, ix, opt.Kernel)
	if err != nil {
		return nil, err
	}
	plan := localPlan{b: newBasis(opt.Kernel, shape), lambda: opt.Smoothing}
	var note string
	auto := opt.AutoSmoothing || (opt.AutoShape && opt.Kernel.HasShape())
	if auto {
		ch, err := chooseLocal(ctx, ds, lf, opt, shape)
		if err != nil {
			return nil, err
		}
		plan = localPlan{b: newBasis(opt.Kernel, ch.shape), lambda: ch.lambda}
		note = ch.note
	}
	if opt.LeaveOneOut || (auto && len(ds.x) <= localLOOBelow) {
		lf.ej = make([]float64, len(lf.px))
	}
	cond, err := lf.fitPatches(ctx, ds, plan, progress)
	if err != nil {
		return nil, err
	}
	lf.cells = newCellMap(lat, lf.patches)
	m := &Model{surf: lf, info: FitInfo{
		Method: Local, Smoothing: plan.lambda, Shape: plan.b.eps,
		LOORMS: math.NaN(), Condition: cond, Patches: len(lf.patches),
	}}
	if note != "" {
		m.info.Warnings = append(m.info.Warnings, note)
	}
	m.looFn = func() ([]float64, error) { return lf.leaveOneOut(ds, plan) }
	if auto && len(ds.x) <= localLOOBelow {
		m.looOnce.Do(func() { m.loo, m.looErr = m.looFn() })
		if m.looErr == nil {
			m.info.LOORMS = rmsFinite(m.loo)
		}
	}
	return m, nil
}

// rmsFinite is the RMS of the finite entries of e.
func rmsFinite(e []float64) float64 {
	var s float64
	var n int
	for _, v := range e {
		if finite(v) {
			s += v * v
			n++
		}
	}
	return math.Sqrt(s / float64(n))
}

// layoutLocal lays out the patches over the readings of ds, indexed by ix,
// for kernel k. The
// polyharmonic kernels (thin-plate, cubic), which have no shape and no
// scale, reach past crowded readings (extender); the others keep the
// plain patches, whose shape was chosen for the readings' own spacing
// (on Franke's function the thinning halved the thin-plate error at some
// sizes but doubled the Gaussian's).
func layoutLocal(ds *dataset, ix *pointIndex, k Kernel) (*localFit, lattice, error) {
	lat := newLattice(ds)
	lf := &localFit{cx: ds.cx, cy: ds.cy, s: ds.s}
	delta := 0.0
	if k == ThinPlate || k == Cubic {
		delta = thinFraction * ds.h
	}
	lat.assign(ds, ix, lf, delta)
	if len(lf.patches) == 0 {
		return nil, lat, fmt.Errorf("local fit: no patch has enough readings: %w", ErrTooFew)
	}
	return lf, lat, nil
}

// fitPatches fits every patch, on all cores, and returns the largest
// condition estimate.
func (lf *localFit) fitPatches(ctx context.Context, ds *dataset, plan localPlan, progress func(int, int)) (float64, error) {
	var next, done atomic.Int64
	var worst atomic.Uint64 // float64 bits of the largest condition
	var firstErr error
	var errOnce sync.Once
	var wg sync.WaitGroup
	np := len(lf.patches)
	for w := 0; w < runtime.GOMAXPROCS(0); w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			var sys smallSystem
			for ctx.Err() == nil {
				j := int(next.Add(1) - 1)
				if j >= np {
					return
				}
				c, err := lf.fitPatch(j, ds, plan, &sys)
				if err != nil {
					errOnce.Do(func() { firstErr = err })
					return
				}
				for old := worst.Load(); c > math.Float64frombits(old); old = worst.Load() {
					if worst.CompareAndSwap(old, math.Float64bits(c)) {
						break
					}
				}
				if d := int(done.Add(1)); d%256 == 0 || d == np {
					progress(d, np)
				}
			}
		}()
	}
	wg.Wait()
	if err := ctx.Err(); err != nil {
		return 0, err
	}
	return math.Float64frombits(worst.Load()), firstErr
}

// fitPatch solves patch j's system; the patch's readings are already in
// lf.px, lf.py (patch coordinates) and their values are ds.v[member].
func (lf *localFit) fitPatch(j int, ds *dataset, plan localPlan, sys *smallSystem) (float64, error) {
	p := &lf.patches[j]
	p.b = plan.b.scaled(p.frad)
	x, y := lf.px[p.lo:p.hi], lf.py[p.lo:p.hi]
	sys.f = grow(sys.f, len(x))
	f := sys.f
	for i, k := range lf.member[p.lo:p.hi] {
		f[i] = ds.v[k]
	}
	sys.build(x, y, f, p.b, patchLambda(plan, p.frad))
	cond := sys.factor()
	if cond > maxCondition || math.IsNaN(cond) {
		return cond, fmt.Errorf("local fit, patch at (%.6g, %.6g) with %d readings: condition %.2g: %w",
			p.cx*ds.s+ds.cx, p.cy*ds.s+ds.cy, len(x), cond, ErrIllConditioned)
	}
	sol := sys.rhs
	sys.solve(sol)
	copy(lf.coef[p.lo:p.hi], sol[:len(x)])
	copy(p.d[:], sol[len(x):])
	if lf.ej != nil {
		lf.storeErrors(lf.ej, p, sys)
	}
	return cond, nil
}

// patchLambda converts the smoothing λ (global scaled coordinates) to a
// patch's coordinates, which are the scaled ones divided by its radius ρ:
// the thin-plate kernel then scales by 1/ρ² (plus a polynomial the side
// conditions absorb), the cubic by 1/ρ³, and kernels with a shape not at
// all (the shape is rescaled instead).
func patchLambda(plan localPlan, rad float64) float64 {
	switch plan.b.k {
	case ThinPlate:
		return plan.lambda / (rad * rad)
	case Cubic:
		return plan.lambda / (rad * rad * rad)
	}
	return plan.lambda
}

// sortByDistance orders idx by distance from (x, y).
func sortByDistance(idx []int32, xs, ys []float64, x, y float64) {
	sort.Slice(idx, func(a, b int) bool {
		ia, ib := idx[a], idx[b]
		da := (xs[ia]-x)*(xs[ia]-x) + (ys[ia]-y)*(ys[ia]-y)
		db := (xs[ib]-x)*(xs[ib]-x) + (ys[ib]-y)*(ys[ib]-y)
		return da < db
	})
}
