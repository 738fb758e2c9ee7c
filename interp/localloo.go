package interp

import (
	"math"
	"sync/atomic"
)

// leaveOneOut returns the partition of unity's leave-one-out errors, per
// merged reading. With the patches held fixed, leaving reading k out
// changes only the local fits whose patches contain it, and patch j's fit
// without k predicts f_k − e_jk at the reading, where e_jk = c_jk/(A_j⁻¹)_kk
// is Rippa's closed form for that patch (Rippa, Adv. Comput. Math. 11
// (1999)). The blended prediction is then off by exactly
//
//	e_k = Σ_j w_j(x_k) e_jk / Σ_j w_j(x_k),
//
// the weights being those of the fit. A reading no disk covers gets NaN.
func (lf *localFit) leaveOneOut(ds *dataset, plan localPlan) ([]float64, error) {
	if lf.ej == nil {
		if err := lf.refitErrors(ds, plan); err != nil {
			return nil, err
		}
	}
	return lf.blendErrors(ds, lf.ej), nil
}

// storeErrors writes into ej the patch leave-one-out errors
// e_jk = c_jk/(A_j⁻¹)_kk of patch p, whose system sys was just factorised
// and solved (lf.coef holds its coefficients).
//
// Only the readings inside the patch's weight disk enter the blend
// (blendErrors), about a quarter of the patch's readings with the fit
// radius twice the weight radius; the others get NaN, and their entries of
// A_j⁻¹ are never computed.
func (lf *localFit) storeErrors(ej []float64, p *patch, sys *smallSystem) {
	m := int(p.hi - p.lo)
	sys.work = grow(sys.work, m)
	r := p.rad / p.frad // weight radius in patch coordinates
	for i := p.lo; i < p.hi; i++ {
		if lf.px[i]*lf.px[i]+lf.py[i]*lf.py[i] >= r*r {
			ej[i] = math.NaN()
			continue
		}
		ej[i] = lf.coef[i] / sys.inverseDiagAt(int(i-p.lo), sys.work)
	}
}

// refitErrors computes lf.ej for a fit made without Options.LeaveOneOut,
// by building and factorising every patch's system again.
func (lf *localFit) refitErrors(ds *dataset, plan localPlan) error {
	ej := make([]float64, len(lf.px))
	var next atomic.Int64
	var failed atomic.Bool
	parallelRange(2*len(lf.patches), func(_, _ int) {
		var sys smallSystem
		for {
			j := int(next.Add(1) - 1)
			if j >= len(lf.patches) || failed.Load() {
				return
			}
			p := &lf.patches[j]
			m := int(p.hi - p.lo)
			f := make([]float64, m)
			for i, k := range lf.member[p.lo:p.hi] {
				f[i] = ds.v[k]
			}
			sys.build(lf.px[p.lo:p.hi], lf.py[p.lo:p.hi], f, p.b, patchLambda(plan, p.frad))
			if c := sys.factor(); c > maxCondition || math.IsNaN(c) {
				failed.Store(true)
				return
			}
			lf.storeErrors(ej, p, &sys)
		}
	})
	if failed.Load() {
		return ErrIllConditioned
	}
	lf.ej = ej
	return nil
}

// blendErrors blends the patch errors ej with the fit's weights into one
// leave-one-out error per merged reading.
func (lf *localFit) blendErrors(ds *dataset, ej []float64) []float64 {
	num := make([]float64, len(ds.x))
	den := make([]float64, len(ds.x))
	for j := range lf.patches {
		p := &lf.patches[j]
		for i := p.lo; i < p.hi; i++ {
			q := math.Hypot(lf.px[i], lf.py[i]) * p.frad / p.rad
			if q >= 1 || math.IsNaN(ej[i]) {
				continue
			}
			t := 1 - q
			w := t * t * t * t * (4*q + 1)
			k := lf.member[i]
			num[k] += w * ej[i]
			den[k] += w
		}
	}
	for k := range num {
		num[k] /= den[k] // 0/0 = NaN for an uncovered reading
	}
	return num
}

// grow returns s resized to n, reallocating only when it must.
func grow(s []float64, n int) []float64 {
	if cap(s) < n {
		return make([]float64, n)
	}
	return s[:n]
}
