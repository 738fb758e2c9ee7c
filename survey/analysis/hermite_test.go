package analysis

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"

	"isofield/interp"
)

// TestHermiteSurface compares step voltages read from the grid's bicubic
// Hermite surface with those from the interpolant itself, around a point
// source 0.5 m deep (closed form, Telford et al. ch. 8), at the largest
// spacing that uses the surface and a finer one; and checks that the
// surface reproduces a cubic exactly where its cross derivative is exact.
func TestHermiteSurface(t *testing.T) {
	hs := halfSpace{rho: 100, src: []source{{0.13, 0.07, 0.5, 100}}}
	for _, h := range []float64{hermiteMaxSpacing, 0.1} {
		t.Run(fmt.Sprint("h=", h), func(t *testing.T) {
			g, _ := interp.NewGrid(-6, -6, 6, 6, h, 0)
			evaluate(g, hs)
			s := newGridSurface(g, hs)
			rng := rand.New(rand.NewPCG(9, 10))
			worst := 0.0
			for range 400 {
				r := 0.5 + rng.Float64()*4 // at least 0.5 m from the source
				a := rng.Float64() * 2 * math.Pi
				x, y := r*math.Cos(a), r*math.Sin(a)
				exact := StepVoltage(hs, x, y)
				worst = max(worst, math.Abs(newStepSampler(1).at(s, x, y)-exact)/exact)
			}
			t.Logf("worst relative difference of the step voltage: %.2g", worst)
			if worst > 1e-2 {
				t.Errorf("Hermite step voltages differ from the interpolant's by up to %.2g, want < 1 %%", worst)
			}
		})
	}
	// V = x³ − 2x²y + y³: bicubic (degree ≤ 3 in each variable), so the
	// Hermite patch with exact data reproduces it; ∂²V/∂x∂y = −4x is
	// linear, so central differences of the gradient are exact inside.
	cubic := poly{}
	g := interp.NewGridN(-1, -1, 0.5, 0.5, 5, 5)
	evaluate(g, cubic)
	s := newGridSurface(g, cubic)
	for _, p := range [][2]float64{{-0.3, -0.2}, {0.1, 0.4}, {0.2, -0.45}} {
		if got, want := s.Value(p[0], p[1]), cubic.Value(p[0], p[1]); math.Abs(got-want) > 1e-12 {
			t.Errorf("Hermite surface at %v = %g, cubic %g", p, got, want)
		}
	}
	g.Mask[g.Index(2, 2)] = true
	evaluate(g, cubic)
	s = newGridSurface(g, cubic)
	if got, want := s.Value(0.1, 0.1), cubic.Value(0.1, 0.1); got != want {
		t.Errorf("next to a masked node the surface gave %g, want the interpolant's %g", got, want)
	}
}

// poly is V = x³ − 2x²y + y³.
type poly struct{}

func (poly) Value(x, y float64) float64 { return x*x*x - 2*x*x*y + y*y*y }
func (poly) Gradient(x, y float64) (float64, float64) {
	return 3*x*x - 4*x*y, -2*x*x + 3*y*y
}
