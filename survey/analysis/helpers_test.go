package analysis

import (
	"math"

	"isofield/interp"
)

// halfSpace is the surface potential of point currents buried in a
// homogeneous half-space, by the image method: V = ρI/(2π·√(r² + d²)) for
// each source (Telford, Geldart & Sheriff, Applied Geophysics, 1990,
// ch. 8), with its exact gradient.
type halfSpace struct {
	rho float64
	src []source
}

type source struct{ x, y, depth, current float64 }

func (h halfSpace) Value(x, y float64) float64 {
	v := 0.0
	for _, s := range h.src {
		r2 := (x-s.x)*(x-s.x) + (y-s.y)*(y-s.y) + s.depth*s.depth
		v += h.rho * s.current / (2 * math.Pi * math.Sqrt(r2))
	}
	return v
}

func (h halfSpace) Gradient(x, y float64) (gx, gy float64) {
	for _, s := range h.src {
		r2 := (x-s.x)*(x-s.x) + (y-s.y)*(y-s.y) + s.depth*s.depth
		c := -h.rho * s.current / (2 * math.Pi * r2 * math.Sqrt(r2))
		gx += c * (x - s.x)
		gy += c * (y - s.y)
	}
	return gx, gy
}

// fieldAt is |E| at horizontal distance r from a single source, closed form:
// ρI/(2π) · r/(r² + d²)^{3/2}.
func (h halfSpace) fieldAt(r float64) float64 {
	s := h.src[0]
	return h.rho * s.current / (2 * math.Pi) * r / math.Pow(r*r+s.depth*s.depth, 1.5)
}

// vAt is V at horizontal distance r from a single source.
func (h halfSpace) vAt(r float64) float64 {
	s := h.src[0]
	return h.rho * s.current / (2 * math.Pi * math.Sqrt(r*r+s.depth*s.depth))
}

// linear is V = a + bx·x + by·y, a uniform field E = (−bx, −by).
type linear struct{ a, bx, by float64 }

func (l linear) Value(x, y float64) float64               { return l.a + l.bx*x + l.by*y }
func (l linear) Gradient(x, y float64) (float64, float64) { return l.bx, l.by }

// withLOO adds fixed leave-one-out errors to an interpolant.
type withLOO struct {
	interp.Interpolant
	loo []float64
}

func (w withLOO) LeaveOneOut() []float64 { return w.loo }

// evaluate fills g from f at every unmasked node (NaN at masked ones), as
// interp.Evaluate does.
func evaluate(g *interp.Grid, f interp.Interpolant) {
	for j := range g.NY {
		for i := range g.NX {
			k := g.Index(i, j)
			if g.Mask[k] {
				g.V[k], g.GX[k], g.GY[k] = math.NaN(), math.NaN(), math.NaN()
				continue
			}
			x, y := g.Node(i, j)
			g.V[k] = f.Value(x, y)
			g.GX[k], g.GY[k] = f.Gradient(x, y)
		}
	}
}

// square returns readings on a regular n × n lattice of spacing s from
// (x0, y0), with values from f and survey indexes 0, 1, ...
func square(f interp.Interpolant, x0, y0, s float64, n int) (xs, ys, vs []float64, idx []int) {
	for j := range n {
		for i := range n {
			x, y := x0+float64(i)*s, y0+float64(j)*s
			xs, ys, vs = append(xs, x), append(ys, y), append(vs, f.Value(x, y))
			idx = append(idx, len(idx))
		}
	}
	return xs, ys, vs, idx
}

// bisect finds a root of f in [a, b] where f changes sign.
func bisect(f func(float64) float64, a, b float64) float64 {
	fa := f(a)
	for range 200 {
		m := (a + b) / 2
		if fm := f(m); (fm > 0) == (fa > 0) {
			a, fa = m, fm
		} else {
			b = m
		}
	}
	return (a + b) / 2
}
