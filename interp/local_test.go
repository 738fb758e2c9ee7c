package interp

import (
	"math"
	"testing"
)

// TestLocalSmoothWalk walks across many patch boundaries in steps of
// 0.1 mm and bounds the jump in potential and the change in field per
// step. A blend that is not continuous (such as per-point neighbour
// methods, measured to jump by up to 5e-4 V across such steps on this
// kind of survey) fails the first bound; one that is C⁰ but not C¹ fails
// the second. Bounds: |ΔV| ≤ 1.01 × max|E| × step + 1e-9 V (the mean
// value theorem) and |ΔE| ≤ 2e-4 V/m, a few times the largest change the
// smooth blend was measured to make.
func TestLocalSmoothWalk(t *testing.T) {
	xs, ys, vs := scattered(91, 3000, 0, 0, 100, 100, halfSpaceV)
	m := mustFit(t, xs, ys, vs, Options{Method: Local})
	lf := m.surf.(*localFit)
	const step = 1e-4                                                   // metres
	walks := [][4]float64{{25, 37.3, 37, 39.1}, {52.2, 45, 55.7, 56.5}} // about 12 m each
	for _, w := range walks {
		n := int(math.Hypot(w[2]-w[0], w[3]-w[1]) / step)
		ux, uy := (w[2]-w[0])/float64(n)/step, (w[3]-w[1])/float64(n)/step
		crossed := 0
		pv := m.Value(w[0], w[1])
		pgx, pgy := m.Gradient(w[0], w[1])
		pset := coverSet(lf, w[0], w[1])
		var worstV, worstE float64
		for i := 1; i <= n; i++ {
			x, y := w[0]+ux*step*float64(i), w[1]+uy*step*float64(i)
			v := m.Value(x, y)
			gx, gy := m.Gradient(x, y)
			e := math.Hypot(gx, gy)
			if dv := math.Abs(v - pv); dv > 1.01*max(e, math.Hypot(pgx, pgy))*step+1e-9 {
				t.Fatalf("at (%g, %g): potential jumps by %g over %g m with field %g", x, y, dv, step, e)
			}
			worstV = max(worstV, math.Abs(v-pv))
			de := math.Hypot(gx-pgx, gy-pgy)
			if de > 2e-4 {
				t.Fatalf("at (%g, %g): field changes by %g V/m over %g m", x, y, de, step)
			}
			worstE = max(worstE, de)
			if s := coverSet(lf, x, y); s != pset {
				crossed++
				pset = s
			}
			pv, pgx, pgy = v, gx, gy
		}
		if crossed < 5 {
			t.Errorf("walk %v crossed only %d patch boundaries", w, crossed)
		}
		t.Logf("walk %v: %d steps, %d patch boundaries, largest |ΔV| %.3g V, |ΔE| %.3g V/m", w, n, crossed, worstV, worstE)
	}
}

// coverSet returns a fingerprint of the patches whose disks cover (x, y).
func coverSet(lf *localFit, x, y float64) uint64 {
	u, v := (x-lf.cx)/lf.s, (y-lf.cy)/lf.s
	cand, _ := lf.cells.candidates(u, v)
	var h uint64 = 14695981039346656037
	for _, j := range cand {
		p := lf.patches[j]
		if (u-p.cx)*(u-p.cx)+(v-p.cy)*(v-p.cy) < p.rad*p.rad {
			h = (h ^ uint64(j)) * 1099511628211
		}
	}
	return h
}

// TestLocalLayout: every reading lies in some patch, patch sizes respect
// the documented limits, and an uneven survey (dense lines far apart)
// still fits.
func TestLocalLayout(t *testing.T) {
	var xs, ys, vs []float64
	for line := 0; line < 12; line++ {
		for st := 0; st <= 400; st++ {
			x, y := float64(st)*0.5, float64(line)*15
			xs, ys, vs = append(xs, x), append(ys, y), append(vs, halfSpaceV(x/2, y/2))
		}
	}
	m := mustFit(t, xs, ys, vs, Options{Method: Local})
	lf := m.surf.(*localFit)
	covered := make([]bool, len(m.ds.x))
	for _, p := range lf.patches {
		if n := p.hi - p.lo; n < localMin || n > localMax {
			t.Errorf("patch at (%g, %g) has %d readings", p.cx, p.cy, n)
		}
		for _, k := range lf.member[p.lo:p.hi] {
			covered[k] = true
		}
	}
	for k, c := range covered {
		if !c {
			t.Fatalf("reading %d is in no patch", k)
		}
	}
	for i := 0; i < len(xs); i += 37 {
		if got := m.Value(xs[i], ys[i]); math.Abs(got-vs[i]) > 1e-8 {
			t.Errorf("reading %d: V = %g, reading %g", i, got, vs[i])
		}
	}
}
