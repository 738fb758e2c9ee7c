package analysis

import (
	"math"

	"isofield/interp"
)

// Arrow is the field E = −∇V at one node of the coarse sub-grid, in U/m.
type Arrow struct {
	X, Y      float64
	EX, EY    float64
	Magnitude float64
}

// ArrowsAlong is about how many arrows Arrows places along the grid's
// longer side.
const ArrowsAlong = 24

// usableNode reports whether node k has a finite value and gradient and is
// not masked.
func usableNode(g *interp.Grid, k int) bool {
	return !g.Mask[k] && finite(g.V[k]) && finite(g.GX[k]) && finite(g.GY[k])
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// field sets the field magnitude, azimuth and arrows from the grid's
// analytic gradient.
func (r *Result) field(g *interp.Grid) {
	n := g.Len()
	r.Field, r.Azimuth = make([]float64, n), make([]float64, n)
	for k := range n {
		r.Field[k], r.Azimuth[k] = math.NaN(), math.NaN()
		if !usableNode(g, k) {
			continue
		}
		ex, ey := -g.GX[k], -g.GY[k]
		r.Field[k] = math.Hypot(ex, ey)
		if r.Field[k] > 0 {
			r.Azimuth[k] = Azimuth(ex, ey)
		}
	}
	r.Arrows = Arrows(g)
}

// Azimuth returns the direction of the vector (ex, ey) in degrees clockwise
// from +y (grid north), in [0, 360).
func Azimuth(ex, ey float64) float64 {
	a := math.Atan2(ex, ey) * 180 / math.Pi
	if a < 0 {
		a += 360
	}
	return a
}

// Arrows samples E = −∇V at every s-th node in both directions, s chosen so
// that about ArrowsAlong arrows fit along the longer side, starting half a
// stride in from the south-west corner; masked nodes get no arrow.
func Arrows(g *interp.Grid) []Arrow {
	s := max(1, max(g.NX, g.NY)/ArrowsAlong)
	var as []Arrow
	for j := s / 2; j < g.NY; j += s {
		for i := s / 2; i < g.NX; i += s {
			k := g.Index(i, j)
			if !usableNode(g, k) {
				continue
			}
			x, y := g.Node(i, j)
			ex, ey := -g.GX[k], -g.GY[k]
			as = append(as, Arrow{x, y, ex, ey, math.Hypot(ex, ey)})
		}
	}
	return as
}
