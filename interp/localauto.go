package interp

import (
	"context"
	"fmt"
	"math"
	"sync"
)

// autoPatchSample is the number of patches, spread evenly over the
// lattice, whose leave-one-out errors judge each candidate of an
// automatic local fit.
const autoPatchSample = 128

// chooseLocal picks the smoothing and/or shape of a local fit with the
// least RMS leave-one-out error. Each candidate is judged by Rippa's
// closed form inside a sample of patches (every reading of a sampled patch
// left out of that patch's fit), the local counterpart of chooseGlobal;
// candidates are those of chooseGlobal.
func chooseLocal(ctx context.Context, ds *dataset, lf *localFit, opt Options, shape float64) (choice, error) {
	shapes := []float64{shape}
	if opt.AutoShape && opt.Kernel.HasShape() {
		shapes = shapes[:0]
		for _, f := range shapeFactors() {
			shapes = append(shapes, defaultShape(opt.Kernel, ds.h)*f)
		}
	}
	lambdas := []float64{opt.Smoothing}
	if opt.AutoSmoothing {
		lambdas = smoothingCandidates()
	}
	stride := max(1, len(lf.patches)/autoPatchSample)
	var sample []int
	for j := 0; j < len(lf.patches); j += stride {
		sample = append(sample, j)
	}
	best := choice{rms: math.Inf(1)}
	for _, eps := range shapes {
		for _, lam := range lambdas {
			if err := ctx.Err(); err != nil {
				return best, err
			}
			plan := localPlan{b: newBasis(opt.Kernel, eps), lambda: lam}
			if r, ok := lf.sampleLOO(ds, plan, sample); ok && r < best.rms {
				best = choice{shape: eps, lambda: lam, rms: r}
			}
		}
	}
	if math.IsInf(best.rms, 1) {
		return best, fmt.Errorf("automatic choice: every candidate smoothing and shape is too ill-conditioned: %w", ErrIllConditioned)
	}
	best.note = fmt.Sprintf("leave-one-out over %d patches chose smoothing %g and shape %g (RMS patch leave-one-out error %.4g, %d smoothing × %d shape candidates)",
		len(sample), best.lambda, best.shape, best.rms, len(lambdas), len(shapes))
	return best, nil
}

// sampleLOO returns the RMS of Rippa's leave-one-out errors within the
// sampled patches under plan, and false if a patch is ill-conditioned.
func (lf *localFit) sampleLOO(ds *dataset, plan localPlan, sample []int) (float64, bool) {
	var mu sync.Mutex
	var sum float64
	var count int
	ok := true
	parallelRange(len(sample), func(lo, hi int) {
		var sys smallSystem
		var f, diag, scratch, coefBuf []float64
		var s float64
		var c int
		good := true
		for _, j := range sample[lo:hi] {
			p := &lf.patches[j]
			m := int(p.hi - p.lo)
			f, diag = grow(f, m), grow(diag, m)
			for i, k := range lf.member[p.lo:p.hi] {
				f[i] = ds.v[k]
			}
			b := plan.b.scaled(p.frad)
			sys.build(lf.px[p.lo:p.hi], lf.py[p.lo:p.hi], f, b, patchLambda(plan, p.frad))
			if cond := sys.factor(); cond > maxCondition || math.IsNaN(cond) {
				good = false
				break
			}
			coef := append(coefBuf[:0], sys.rhs...)
			coefBuf = coef
			sys.solve(coef)
			scratch = sys.inverseDiag(diag, scratch)
			for i := 0; i < m; i++ {
				e := coef[i] / diag[i]
				s += e * e
			}
			c += m
		}
		mu.Lock()
		sum, count, ok = sum+s, count+c, ok && good
		mu.Unlock()
	})
	if !ok || count == 0 {
		return 0, false
	}
	return math.Sqrt(sum / float64(count)), true
}
