package interp

import (
	"context"
	"errors"
	"math"
	"sync/atomic"
	"testing"
)

// plane is an Interpolant without the row fast path.
type plane struct{}

func (plane) Value(x, y float64) float64             { return 2*x - 3*y }
func (plane) Gradient(x, y float64) (dx, dy float64) { return 2, -3 }

func TestEvaluateMatchesModel(t *testing.T) {
	for _, method := range []Method{Global, Local} {
		t.Run(methodName(method), func(t *testing.T) {
			xs, ys, vs := scattered(51, map[Method]int{Global: 600, Local: 2500}[method], 0, 0, 50, 40, halfSpaceV)
			m := mustFit(t, xs, ys, vs, Options{Method: method})
			g := NewGridN(-2, -1, 0.7, 0.6, 80, 70)
			MaskFar(g, xs, ys, 2.5)
			var calls, last atomic.Int64
			err := Evaluate(context.Background(), m, g, func(done, total int) {
				calls.Add(1)
				if total != g.NY {
					t.Errorf("progress total %d, want %d rows", total, g.NY)
				}
				if int64(done) > last.Load() {
					last.Store(int64(done))
				}
			})
			if err != nil {
				t.Fatal(err)
			}
			if calls.Load() != int64(g.NY) || last.Load() != int64(g.NY) {
				t.Errorf("progress called %d times, last %d; want %d rows", calls.Load(), last.Load(), g.NY)
			}
			masked := 0
			for j := 0; j < g.NY; j++ {
				for i := 0; i < g.NX; i++ {
					k := g.Index(i, j)
					if g.Mask[k] {
						masked++
						if !math.IsNaN(g.V[k]) || !math.IsNaN(g.GX[k]) || !math.IsNaN(g.GY[k]) {
							t.Fatalf("masked node (%d, %d) not NaN", i, j)
						}
						continue
					}
					x, y := g.Node(i, j)
					gx, gy := m.Gradient(x, y)
					if g.V[k] != m.Value(x, y) || g.GX[k] != gx || g.GY[k] != gy {
						t.Fatalf("node (%d, %d): grid (%g, %g, %g), model (%g, %g, %g)", i, j, g.V[k], g.GX[k], g.GY[k], m.Value(x, y), gx, gy)
					}
				}
			}
			if masked == 0 || masked == g.Len() {
				t.Errorf("%d of %d nodes masked; the grid reaches past the data on two sides", masked, g.Len())
			}
		})
	}
}

func TestEvaluatePlainInterpolant(t *testing.T) {
	g := NewGridN(0, 0, 1, 1, 7, 5)
	if err := Evaluate(context.Background(), plane{}, g, nil); err != nil {
		t.Fatal(err)
	}
	for k := range g.V {
		x, y := g.Node(k%g.NX, k/g.NX)
		if g.V[k] != 2*x-3*y || g.GX[k] != 2 || g.GY[k] != -3 {
			t.Fatalf("node %d: (%g, %g, %g)", k, g.V[k], g.GX[k], g.GY[k])
		}
	}
}

func TestEvaluateCancelled(t *testing.T) {
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	g := NewGridN(0, 0, 1, 1, 10, 10)
	if err := Evaluate(ctx, plane{}, g, nil); !errors.Is(err, context.Canceled) {
		t.Errorf("Evaluate with a cancelled context: %v", err)
	}
	xs, ys, vs := scattered(1, 50, 0, 0, 1, 1, franke)
	if _, err := Fit(ctx, xs, ys, vs, Options{}); !errors.Is(err, context.Canceled) {
		t.Errorf("Fit with a cancelled context: %v", err)
	}
}

// TestMaskFar compares the indexed mask with a brute-force distance check.
func TestMaskFar(t *testing.T) {
	xs, ys, _ := scattered(61, 300, 10, 20, 30, 25, franke)
	g := NewGridN(0, 10, 0.5, 0.5, 110, 90)
	MaskFar(g, xs, ys, 2.5)
	for j := 0; j < g.NY; j++ {
		for i := 0; i < g.NX; i++ {
			x, y := g.Node(i, j)
			near := math.Inf(1)
			for p := range xs {
				near = min(near, math.Hypot(xs[p]-x, ys[p]-y))
			}
			if g.Mask[g.Index(i, j)] != (near > 2.5) {
				t.Fatalf("node (%d, %d) at %g from the nearest reading: mask %v", i, j, near, g.Mask[g.Index(i, j)])
			}
		}
	}
}

func TestDefaultMaskDistance(t *testing.T) {
	lines := func() (xs, ys []float64) {
		for l := 0; l < 6; l++ {
			for s := 0; s <= 50; s++ {
				xs, ys = append(xs, float64(s)), append(ys, 10*float64(l))
			}
		}
		return xs, ys
	}
	lx, ly := lines()
	tests := []struct {
		name   string
		xs, ys []float64
		want   float64
	}{
		// A 2 m lattice: 3 × the 2 m spacing.
		{"lattice", scale(gridXs(20), 2), scale(gridYs(20), 2), 6},
		// Stations 1 m apart on lines 10 m apart: 2·sqrt(50·50/306).
		{"lines", lx, ly, 2 * math.Sqrt(50*50/306.0)},
		{"one reading", []float64{1}, []float64{2}, 0},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := DefaultMaskDistance(tt.xs, tt.ys); math.Abs(got-tt.want) > 1e-9 {
				t.Errorf("DefaultMaskDistance = %g, want %g", got, tt.want)
			}
		})
	}
}

func scale(s []float64, f float64) []float64 {
	for i := range s {
		s[i] *= f
	}
	return s
}

// TestNoAllocation: Value and Gradient allocate nothing, for both methods.
func TestNoAllocation(t *testing.T) {
	for _, method := range []Method{Global, Local} {
		xs, ys, vs := scattered(71, map[Method]int{Global: 300, Local: 3000}[method], 0, 0, 100, 100, halfSpaceV)
		m := mustFit(t, xs, ys, vs, Options{Method: method})
		a := testing.AllocsPerRun(100, func() {
			_ = m.Value(33.3, 44.4)
			_, _ = m.Gradient(55.5, 66.6)
		})
		if a != 0 {
			t.Errorf("%s: %g allocations per Value+Gradient", methodName(method), a)
		}
	}
}
