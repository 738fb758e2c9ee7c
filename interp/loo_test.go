package interp

import (
	"context"
	"math"
	"math/rand/v2"
	"testing"
)

// TestLeaveOneOutGlobal: Rippa's closed form (Adv. Comput. Math. 11
// (1999)) equals refitting without each reading, to 1e-10.
func TestLeaveOneOutGlobal(t *testing.T) {
	f := func(x, y float64) float64 { return math.Sin(x/5) * math.Exp(-y/30) }
	for _, tt := range []struct {
		name string
		opt  Options
	}{
		{"thin-plate", Options{Method: Global}},
		{"thin-plate smoothed", Options{Method: Global, Smoothing: 1e-3}},
		{"multiquadric", Options{Method: Global, Kernel: Multiquadric}},
		{"wendland-c2", Options{Method: Global, Kernel: WendlandC2}},
	} {
		t.Run(tt.name, func(t *testing.T) {
			xs, ys, vs := scattered(21, 40, 0, 0, 50, 40, f)
			m := mustFit(t, xs, ys, vs, tt.opt)
			info := m.Info()
			b := newBasis(tt.opt.Kernel, info.Shape)
			loo := m.LeaveOneOut()
			for k := range xs {
				// Refit without reading k in the same scaled frame, so
				// that smoothing and shape mean the same.
				ds := *m.ds
				ds.x, ds.y, ds.v = without(ds.x, k), without(ds.y, k), without(ds.v, k)
				g, _, _, err := fitGlobal(&ds, b, info.Smoothing, false)
				if err != nil {
					t.Fatal(err)
				}
				want := vs[k] - g.Value(xs[k], ys[k])
				if math.Abs(loo[k]-want) > 1e-10*max(1, math.Abs(want)) {
					t.Errorf("reading %d: Rippa %.15g, refit %.15g", k, loo[k], want)
				}
			}
			if info := m.Info(); math.Abs(info.LOORMS-rms(loo)) > 1e-12 {
				t.Errorf("LOORMS %g, RMS of LeaveOneOut %g", info.LOORMS, rms(loo))
			}
		})
	}
}

func without(s []float64, k int) []float64 {
	return append(append([]float64(nil), s[:k]...), s[k+1:]...)
}

// TestLeaveOneOutLocal: the partition-of-unity equivalent equals leaving
// the reading out of every patch that holds it and blending again with
// the same weights (patches held fixed), to 1e-10.
func TestLeaveOneOutLocal(t *testing.T) {
	f := func(x, y float64) float64 { return math.Cos(x/9) + y*y/2000 }
	xs, ys, vs := scattered(23, 500, 0, 0, 100, 80, f)
	m := mustFit(t, xs, ys, vs, Options{Method: Local})
	lf := m.surf.(*localFit)
	loo := m.LeaveOneOut()
	plan := localPlan{b: newBasis(ThinPlate, 0)}
	var sys smallSystem
	for _, k := range []int{0, 17, 123, 250, 499} {
		g := m.ds.group[k] // the fit's own numbering (spatial order)
		var num, den float64
		for j := range lf.patches {
			p := &lf.patches[j]
			var px, py, pv []float64
			held := -1
			for i := p.lo; i < p.hi; i++ {
				if lf.member[i] == g {
					held = int(i)
					continue
				}
				px, py, pv = append(px, lf.px[i]), append(py, lf.py[i]), append(pv, m.ds.v[lf.member[i]])
			}
			if held < 0 {
				continue
			}
			sys.build(px, py, pv, p.b, patchLambda(plan, p.frad))
			sys.factor()
			sys.solve(sys.rhs)
			refit := patch{d: [3]float64{sys.rhs[len(px)], sys.rhs[len(px)+1], sys.rhs[len(px)+2]}, b: p.b}
			tmp := localFit{px: px, py: py, coef: sys.rhs[:len(px)]}
			refit.hi = int32(len(px))
			s, _, _ := tmp.patchValueGrad(&refit, lf.px[held], lf.py[held])
			q := math.Hypot(lf.px[held], lf.py[held]) * p.frad / p.rad
			if q >= 1 {
				continue
			}
			w := math.Pow(1-q, 4) * (4*q + 1)
			num += w * (vs[k] - s)
			den += w
		}
		if want := num / den; math.Abs(loo[k]-want) > 1e-10*max(1, math.Abs(want)) {
			t.Errorf("reading %d: closed form %.15g, refits %.15g", k, loo[k], want)
		}
	}
}

// TestAutoSmoothing: on noisy readings leave-one-out picks a positive
// smoothing and reports its RMS error, which is no worse than that of the
// unsmoothed fit.
func TestAutoSmoothing(t *testing.T) {
	r := rand.New(rand.NewPCG(4, 4))
	f := func(x, y float64) float64 { return math.Sin(x/15) + math.Cos(y/20) }
	xs, ys, vs := scattered(31, 300, 0, 0, 100, 100, f)
	for i := range vs {
		vs[i] += 0.2 * r.NormFloat64()
	}
	plain := mustFit(t, xs, ys, vs, Options{Method: Global})
	auto := mustFit(t, xs, ys, vs, Options{Method: Global, AutoSmoothing: true})
	pi, ai := plain.Info(), auto.Info()
	if ai.Smoothing <= 0 || !(ai.LOORMS <= pi.LOORMS) {
		t.Errorf("auto smoothing %g with LOO RMS %g; unsmoothed LOO RMS %g", ai.Smoothing, ai.LOORMS, pi.LOORMS)
	}
	// The smoothed surface is closer to the noise-free function.
	ep, _ := errorStats(30, 5, 5, 90, 90, plain.Value, f)
	ea, _ := errorStats(30, 5, 5, 90, 90, auto.Value, f)
	if ea >= ep {
		t.Errorf("RMS error vs noise-free: auto %g, unsmoothed %g", ea, ep)
	}
}

// TestAutoShape: the automatic shape is one of the candidates and its
// leave-one-out RMS is no worse than the default shape's.
func TestAutoShape(t *testing.T) {
	xs, ys, vs := scattered(41, 200, 0, 0, 1, 1, franke)
	for _, k := range []Kernel{Multiquadric, Gaussian, WendlandC4} {
		t.Run(k.String(), func(t *testing.T) {
			def := mustFit(t, xs, ys, vs, Options{Method: Global, Kernel: k})
			auto, err := Fit(context.Background(), xs, ys, vs, Options{Method: Global, Kernel: k, AutoShape: true})
			if err != nil {
				t.Fatal(err)
			}
			if d, a := def.Info(), auto.Info(); !(a.LOORMS <= d.LOORMS*(1+1e-9)) {
				t.Errorf("auto shape %g LOO %g; default shape %g LOO %g", a.Shape, a.LOORMS, d.Shape, d.LOORMS)
			}
		})
	}
}

// TestAutoSmoothingLocal: the local fit's automatic smoothing also picks a
// positive λ on noisy readings, reports its leave-one-out RMS, and brings
// the surface closer to the noise-free function.
func TestAutoSmoothingLocal(t *testing.T) {
	r := rand.New(rand.NewPCG(5, 5))
	f := func(x, y float64) float64 { return math.Sin(x/15) + math.Cos(y/20) }
	xs, ys, vs := scattered(32, 3000, 0, 0, 100, 100, f)
	for i := range vs {
		vs[i] += 0.2 * r.NormFloat64()
	}
	plain := mustFit(t, xs, ys, vs, Options{Method: Local})
	auto := mustFit(t, xs, ys, vs, Options{Method: Local, AutoSmoothing: true})
	ai := auto.Info()
	plainLOO := rmsFinite(plain.LeaveOneOut())
	if ai.Smoothing <= 0 || !(ai.LOORMS < plainLOO) {
		t.Errorf("auto smoothing %g with LOO RMS %g; unsmoothed LOO RMS %g", ai.Smoothing, ai.LOORMS, plainLOO)
	}
	ep, _ := errorStats(30, 5, 5, 90, 90, plain.Value, f)
	ea, _ := errorStats(30, 5, 5, 90, 90, auto.Value, f)
	if ea >= ep {
		t.Errorf("RMS error vs noise-free: auto %g, unsmoothed %g", ea, ep)
	}
	t.Logf("λ %g, LOO RMS %g (unsmoothed %g), error vs truth %g (unsmoothed %g)", ai.Smoothing, ai.LOORMS, plainLOO, ea, ep)
}

// TestLeaveOneOutDuringFit checks that computing the local leave-one-out
// errors during the fit (Options.LeaveOneOut) gives the same errors as
// the later pass that refactorises every patch, and the same surface.
func TestLeaveOneOutDuringFit(t *testing.T) {
	xs, ys, vs := scattered(11, 3000, 0, 0, 100, 60, franke01(100, 60))
	tests := []struct {
		name string
		opt  Options
	}{
		{"thin-plate", Options{Method: Local}},
		{"thin-plate smoothed", Options{Method: Local, Smoothing: 1e-4}},
		{"wendland-c2", Options{Method: Local, Kernel: WendlandC2}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			later := mustFit(t, xs, ys, vs, tt.opt)
			o := tt.opt
			o.LeaveOneOut = true
			during := mustFit(t, xs, ys, vs, o)
			a, b := later.LeaveOneOut(), during.LeaveOneOut()
			if len(a) != len(xs) || len(b) != len(xs) {
				t.Fatalf("LeaveOneOut lengths %d and %d, want %d", len(a), len(b), len(xs))
			}
			for k := range a {
				if math.Abs(a[k]-b[k]) > 1e-12*(1+math.Abs(a[k])) {
					t.Fatalf("reading %d: error %g after the fit, %g during it", k, a[k], b[k])
				}
			}
			if va, vb := later.Value(37, 21), during.Value(37, 21); va != vb {
				t.Errorf("surface differs: %g and %g", va, vb)
			}
		})
	}
}

// franke01 returns Franke's function (Franke 1982) mapped from [0,1]² onto
// a w × h rectangle.
func franke01(w, h float64) func(x, y float64) float64 {
	return func(x, y float64) float64 { return franke(x/w, y/h) }
}
