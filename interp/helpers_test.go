package interp

import (
	"context"
	"math"
	"math/rand/v2"
	"testing"
)

// franke is Franke's test function on [0,1]² (R. Franke, "Scattered data
// interpolation: tests of some methods", Math. Comp. 38 (1982) 181–200;
// formula as in FIELD_FACTS.md §6).
func franke(x, y float64) float64 {
	return 0.75*math.Exp(-((9*x-2)*(9*x-2)+(9*y-2)*(9*y-2))/4) +
		0.75*math.Exp(-(9*x+1)*(9*x+1)/49-(9*y+1)/10) +
		0.5*math.Exp(-((9*x-7)*(9*x-7)+(9*y-3)*(9*y-3))/4) -
		0.2*math.Exp(-(9*x-4)*(9*x-4)-(9*y-7)*(9*y-7))
}

// source is a point current source buried in a homogeneous half-space.
type source struct{ x, y, depth, current float64 }

// halfSpace returns the surface potential and its gradient of point
// current sources in ground of resistivity rho: V = ρI/(2π sqrt(r² + d²))
// for each source (image method; Telford, Geldart & Sheriff, Applied
// Geophysics, 2nd ed. (1990), ch. 8).
func halfSpace(rho float64, srcs []source, x, y float64) (v, gx, gy float64) {
	for _, s := range srcs {
		dx, dy := x-s.x, y-s.y
		R := math.Sqrt(dx*dx + dy*dy + s.depth*s.depth)
		k := rho * s.current / (2 * math.Pi)
		v += k / R
		gx -= k * dx / (R * R * R)
		gy -= k * dy / (R * R * R)
	}
	return v, gx, gy
}

// scattered returns n seeded uniform points in [x0, x0+w] × [y0, y0+h] and
// f at each.
func scattered(seed uint64, n int, x0, y0, w, h float64, f func(x, y float64) float64) (xs, ys, vs []float64) {
	r := rand.New(rand.NewPCG(seed, 7))
	xs, ys, vs = make([]float64, n), make([]float64, n), make([]float64, n)
	for i := range xs {
		xs[i], ys[i] = x0+w*r.Float64(), y0+h*r.Float64()
		vs[i] = f(xs[i], ys[i])
	}
	return xs, ys, vs
}

// mustFit fits or fails the test.
func mustFit(t testing.TB, xs, ys, vs []float64, opt Options) *Model {
	t.Helper()
	m, err := Fit(context.Background(), xs, ys, vs, opt)
	if err != nil {
		t.Fatalf("Fit(%d readings, %+v): %v", len(xs), opt, err)
	}
	return m
}

// errorStats returns the RMS and maximum of |got − want| over an n×n
// lattice of points in [x0, x0+w] × [y0, y0+h].
func errorStats(n int, x0, y0, w, h float64, got, want func(x, y float64) float64) (rmsErr, maxErr float64) {
	var s float64
	for j := 0; j < n; j++ {
		for i := 0; i < n; i++ {
			x, y := x0+w*float64(i)/float64(n-1), y0+h*float64(j)/float64(n-1)
			e := math.Abs(got(x, y) - want(x, y))
			s += e * e
			maxErr = max(maxErr, e)
		}
	}
	return math.Sqrt(s / float64(n*n)), maxErr
}

var allKernels = []Kernel{ThinPlate, Cubic, Multiquadric, InverseMultiquadric, Gaussian, WendlandC2, WendlandC4}
