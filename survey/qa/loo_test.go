package qa

import (
	"context"
	"math"
	"math/rand/v2"
	"testing"

	"isofield/interp"
	"isofield/survey"
)

// franke is Franke's test function on [0,1]² (R. Franke, Math. Comp. 38
// (1982) 181–200).
func franke(x, y float64) float64 {
	return 0.75*math.Exp(-((9*x-2)*(9*x-2)+(9*y-2)*(9*y-2))/4) +
		0.75*math.Exp(-(9*x+1)*(9*x+1)/49-(9*y+1)/10) +
		0.5*math.Exp(-((9*x-7)*(9*x-7)+(9*y-3)*(9*y-3))/4) -
		0.2*math.Exp(-(9*x-4)*(9*x-4)-(9*y-7)*(9*y-7))
}

// TestFrankeValues checks the test function against the field facts' check
// values (computed there): f(0,0) = 0.766421, f(0.5,0.5) = 0.325762,
// f(1,1) = 0.035870.
func TestFrankeValues(t *testing.T) {
	for _, c := range []struct{ x, y, want float64 }{{0, 0, 0.766421}, {0.5, 0.5, 0.325762}, {1, 1, 0.035870}} {
		if got := franke(c.x, c.y); math.Abs(got-c.want) > 1e-6 {
			t.Errorf("franke(%g, %g) = %.6f, want %.6f", c.x, c.y, got, c.want)
		}
	}
}

// TestLeaveOneOutBruteForce checks the residuals the spike check uses
// against brute force: for each reading, fit without it and predict at its
// position. Rippa's closed form (Adv. Comput. Math. 11, 1999) must agree
// with the refits to round-off, a property of the method.
func TestLeaveOneOutBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(11, 2))
	b := newBuilder("franke.csv", survey.Volt)
	var xs, ys, vs []float64
	for k := range 40 {
		x, y := rng.Float64()*20, rng.Float64()*20
		v := franke(x/20, y/20)
		b.add("F"+string(rune('A'+k%26))+string(rune('a'+k/26)), x, y, v)
		xs, ys, vs = append(xs, x), append(ys, y), append(vs, v)
	}
	// A spike limit no residual reaches, so one fit serves every reading.
	r := mustRun(t, b.s, Settings{SpikeK: 1e12}, nil)
	if r.Fit == nil || r.Fit.Method != interp.Global {
		t.Fatalf("fit %+v, want a global fit", r.Fit)
	}
	for k := range xs {
		xk := append(append([]float64(nil), xs[:k]...), xs[k+1:]...)
		yk := append(append([]float64(nil), ys[:k]...), ys[k+1:]...)
		vk := append(append([]float64(nil), vs[:k]...), vs[k+1:]...)
		m, err := interp.Fit(context.Background(), xk, yk, vk, interp.Options{Method: interp.Global})
		if err != nil {
			t.Fatal(err)
		}
		want := vs[k] - m.Value(xs[k], ys[k])
		if got := r.Residual[k]; math.Abs(got-want) > 1e-7*(1+math.Abs(want)) {
			t.Errorf("reading %d: closed-form residual %.10g, brute force %.10g", k, got, want)
		}
	}
}
