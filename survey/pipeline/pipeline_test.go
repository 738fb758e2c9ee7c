package pipeline

import (
	"context"
	"math"
	"testing"

	"isofield/interp"
	"isofield/survey/demo"
)

func TestAutoSpacing(t *testing.T) {
	tests := []struct {
		name string
		w, h float64
		want float64
	}{
		{"demo yard 63 m", 63, 43, 0.5},            // 0.42 → 0.5
		{"deck 30 m", 30, 12, 0.2},                 // 0.2 exactly
		{"long line 1 km", 1000, 20, 5},            // 6.7 → 5
		{"pipeline 14 km", 20, 14000, 100},         // 93 → 100
		{"small wall 2.6 m", 2.6, 1.8, 0.02},       // 0.0173 → 0.02
		{"3 m: between 0.01 and 0.05", 3, 3, 0.02}, // 0.02 exactly
		{"empty", 0, 0, 1},
		{"NaN", math.NaN(), 1, 1},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := AutoSpacing(tt.w, tt.h); math.Abs(got-tt.want) > 1e-12*tt.want {
				t.Errorf("AutoSpacing(%g, %g) = %g, want %g", tt.w, tt.h, got, tt.want)
			}
		})
	}
}

// TestRunDemo runs the whole pipeline on the built-in demo and checks the
// grid against the closed form it was generated from (the half-space
// potential, Telford et al., Applied Geophysics, ch. 8) away from the
// sources; the demo's drift, noise and one planted spike bound how close.
func TestRunDemo(t *testing.T) {
	res, err := Run(context.Background(), Config{Survey: demo.Survey()}, nil)
	if err != nil {
		t.Fatal(err)
	}
	g := res.Grid
	src := demo.Sources()
	var n int
	var sum2 float64
	for j := range g.NY {
		for i := range g.NX {
			k := g.Index(i, j)
			x, y := g.Node(i, j)
			if g.Mask[k] || x < 3 || x > 57 || y < 3 || y > 37 {
				continue
			}
			d := g.V[k] - 1000*demo.Potential(demo.Resistivity, src, x, y)
			sum2 += d * d
			n++
		}
	}
	if n == 0 {
		t.Fatal("no interior node compared")
	}
	// The demo adds up to 12 mV of drift and 0.8 mV of noise; without drift
	// correction the RMS difference must stay within that and the
	// interpolation error between 2.5 m stations. The source peaks stay in
	// the fit (the spike check allows for their curvature): 7.7 mV measured;
	// without them it was 15.8 mV.
	rms := math.Sqrt(sum2 / float64(n))
	t.Logf("RMS difference %.2f mV over %d nodes", rms, n)
	if rms > 10 {
		t.Errorf("demo grid RMS difference from the closed form = %.2f mV over %d nodes, want ≤ 10", rms, n)
	}
	if res.Analysis == nil || len(res.Analysis.Contours) == 0 {
		t.Errorf("demo run gave no contours")
	}
	var xs, ys []float64
	for _, i := range res.Used {
		xs, ys = append(xs, res.Survey.Readings[i].X), append(ys, res.Survey.Readings[i].Y)
	}
	if want := interp.DefaultMaskDistance(xs, ys); res.MaskDistance != want || want <= 0 {
		t.Errorf("MaskDistance = %g, want the default %g", res.MaskDistance, want)
	}
}

// TestReuseSpikeFit checks that the grid reuses the checking stage's fit
// only when it was made over the same values with the same options, and
// that the reused surface is the one a fresh fit gives.
func TestReuseSpikeFit(t *testing.T) {
	ctx := context.Background()
	res, err := Run(ctx, Config{Survey: demo.Survey()}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if res.Model != res.QA.SpikeModel {
		t.Errorf("default options: grid fit not reused from the spike check")
	}
	var xs, ys, vs []float64
	for _, i := range res.Used {
		xs, ys, vs = append(xs, res.Survey.Readings[i].X), append(ys, res.Survey.Readings[i].Y), append(vs, res.Values[i])
	}
	fresh, err := interp.Fit(ctx, xs, ys, vs, interp.Options{})
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range [][2]float64{{5, 5}, {18, 22}, {31.3, 17.7}, {59, 39}} {
		if a, b := res.Model.Value(p[0], p[1]), fresh.Value(p[0], p[1]); math.Abs(a-b) > 1e-9*(1+math.Abs(b)) {
			t.Errorf("reused fit at %v = %g, fresh fit = %g", p, a, b)
		}
	}
	cubic, err := Run(ctx, Config{Survey: demo.Survey(), Fit: interp.Options{Kernel: interp.Cubic}}, nil)
	if err != nil {
		t.Fatal(err)
	}
	if cubic.Model == cubic.QA.SpikeModel {
		t.Errorf("cubic kernel: the spike check's thin-plate fit was reused")
	}
}
