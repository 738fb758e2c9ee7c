package contour

import (
	"math"
	"testing"

	"isofield/interp"
)

// fill sets every node of g from f and leaves the mask as it is.
func fill(g *interp.Grid, f func(x, y float64) float64) {
	for j := range g.NY {
		for i := range g.NX {
			x, y := g.Node(i, j)
			g.V[g.Index(i, j)] = f(x, y)
		}
	}
}

func TestNiceInterval(t *testing.T) {
	tests := []struct {
		name   string
		lo, hi float64
		want   float64
	}{
		{"unit range", 0, 1, 0.1},
		{"concrete mV", -600, -100, 50},
		{"signed V", -3.2, 4.1, 1},
		{"sixteen", 0, 16, 2},
		{"tiny", 1e-6, 3e-6, 2e-7},
		{"empty", 5, 5, 1},
		{"inverted", 5, 4, 1},
		{"nan", math.NaN(), 1, 1},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			got := NiceInterval(tt.lo, tt.hi)
			if math.Abs(got-tt.want) > 1e-12*tt.want {
				t.Errorf("NiceInterval(%g, %g) = %g, want %g", tt.lo, tt.hi, got, tt.want)
			}
			if tt.hi > tt.lo {
				n := len(Levels(tt.lo, tt.hi, got)) + 1
				if n < MinBands || n > MaxBands {
					t.Errorf("NiceInterval(%g, %g) = %g gives %d bands, want %d..%d", tt.lo, tt.hi, got, n, MinBands, MaxBands)
				}
			}
		})
	}
}

func TestLevelsAndBand(t *testing.T) {
	ls := Levels(-1.5, 2.5, 1)
	want := []float64{-1, 0, 1, 2}
	if len(ls) != len(want) {
		t.Fatalf("Levels(-1.5, 2.5, 1) = %v, want %v", ls, want)
	}
	for i := range want {
		if ls[i] != want[i] {
			t.Fatalf("Levels(-1.5, 2.5, 1) = %v, want %v", ls, want)
		}
	}
	bands := []struct {
		name string
		v    float64
		want int
	}{
		{"below all", -1.2, 0},
		{"on first level counts above", -1, 1},
		{"between", 0.5, 2},
		{"on zero", 0, 2},
		{"above all", 2.4, 4},
		{"nan", math.NaN(), -1},
	}
	for _, tt := range bands {
		t.Run(tt.name, func(t *testing.T) {
			if got := Band(tt.v, ls); got != tt.want {
				t.Errorf("Band(%g, %v) = %d, want %d", tt.v, ls, got, tt.want)
			}
		})
	}
	if got := Levels(0, 1, 0); got != nil {
		t.Errorf("Levels with zero step = %v, want nil", got)
	}
	if got := len(Levels(0, 1, 1e-12)); got != maxLevels {
		t.Errorf("Levels with a tiny step gave %d levels, want the cap %d", got, maxLevels)
	}
}

func TestNodeAndCellBands(t *testing.T) {
	g := interp.NewGridN(0, 0, 1, 1, 3, 2)
	copy(g.V, []float64{0, 1, 2, 3, 4, math.NaN()})
	g.Mask[1] = true
	ls := []float64{1.5, 3.5}
	nb := NodeBands(g, ls)
	wantNodes := []int{0, -1, 1, 1, 2, -1}
	for k := range wantNodes {
		if nb[k] != wantNodes[k] {
			t.Fatalf("NodeBands = %v, want %v", nb, wantNodes)
		}
	}
	g.Mask[1] = false
	cb := CellBands(g, ls)
	// Cell 0: mean of 0, 1, 4, 3 = 2 → band 1; cell 1 touches the NaN node.
	wantCells := []int{1, -1}
	for k := range wantCells {
		if cb[k] != wantCells[k] {
			t.Fatalf("CellBands = %v, want %v", cb, wantCells)
		}
	}
}

// TestSpacingCircles checks ΔV/|∇V| against the distance between
// neighbouring circles of V = x² + y², whose level L lies at radius √L
// (closed form): to first order √(L+ΔL) − √L = ΔL/(2√L).
func TestSpacingCircles(t *testing.T) {
	for _, l := range []float64{1, 4, 9} {
		r := math.Sqrt(l)
		step := 0.01
		exact := math.Sqrt(l+step) - r
		got := Spacing(step, 2*r, 0)
		if rel := math.Abs(got-exact) / exact; rel > 0.01 {
			t.Errorf("Spacing at r=%g: %g, closed form %g (rel. error %.3g > 1%%)", r, got, exact, rel)
		}
	}
	if !math.IsInf(Spacing(1, 0, 0), 1) {
		t.Errorf("Spacing with zero gradient is not +Inf")
	}
	if !math.IsNaN(Spacing(1, math.NaN(), 0)) {
		t.Errorf("Spacing with NaN gradient is not NaN")
	}
}

// uniform is the potential of a uniform field between parallel plates:
// V = -E0·x, so E = (E0, 0) everywhere.
type uniform struct{ e0 float64 }

func (u uniform) Value(x, y float64) float64               { return -u.e0 * x }
func (u uniform) Gradient(x, y float64) (float64, float64) { return -u.e0, 0 }

func TestSpacingAtUniformField(t *testing.T) {
	// Between plates 0.5 m apart at 10 V, E0 = 20 V/m; 1 V equipotentials
	// are 0.05 m apart (electrostatics).
	got := SpacingAt(uniform{20}, 0.1, 0.3, 1)
	if math.Abs(got-0.05) > 1e-15 {
		t.Errorf("SpacingAt in a 20 V/m field at 1 V interval = %g m, want 0.05 m", got)
	}
}

func TestFloorNice(t *testing.T) {
	tests := []struct{ v, want float64 }{
		{0.42, 0.2}, {1, 1}, {1.99, 1}, {2, 2}, {4.999, 2}, {5, 5}, {9.9, 5},
		{10, 10}, {0.0173, 0.01}, {93.3, 50}, {0, 1}, {-3, 1}, {math.Inf(1), 1}, {math.NaN(), 1},
	}
	for _, tt := range tests {
		if got := FloorNice(tt.v); math.Abs(got-tt.want) > 1e-12*tt.want {
			t.Errorf("FloorNice(%g) = %g, want %g", tt.v, got, tt.want)
		}
	}
}
