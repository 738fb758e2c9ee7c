package criteria

import (
	"errors"
	"fmt"
	"math"
	"slices"
)

// Plane is a regional trend V = A + B·(x − X0) + C·(y − Y0), with B and C
// in the potential unit per metre.
type Plane struct {
	X0, Y0  float64
	A, B, C float64
	// Used is the number of readings that took part.
	Used int
}

// At returns the plane's value at (x, y).
func (p Plane) At(x, y float64) float64 { return p.A + p.B*(x-p.X0) + p.C*(y-p.Y0) }

// Describe writes the plane's gradient in the given unit.
func (p Plane) Describe(unit string) string {
	g := math.Hypot(p.B, p.C)
	az := math.Mod(math.Atan2(p.B, p.C)*180/math.Pi+360, 360)
	return fmt.Sprintf("rising %.4g %s/m towards azimuth %.0f°, from %d readings", g, unit, az, p.Used)
}

// Robust-fit constants: Huber's tuning constant for 95 % efficiency under
// normal errors (P. J. Huber, Ann. Math. Statist. 35, 1964; Holland &
// Welsch, Commun. Statist. A6, 1977), the normal-consistency factor of the
// median absolute deviation, and the iteration limits.
const (
	huberC     = 1.345
	madNormal  = 1.4826
	maxIRLS    = 50
	irlsRelTol = 1e-10
)

// ErrPlane is the cause FitPlane wraps when no plane can be fitted.
var ErrPlane = errors.New("no plane fits the readings")

// FitPlane fits a plane to the finite values vs at (xs[i], ys[i]) robustly,
// by iteratively reweighted least squares with Huber weights and a scale
// from the median absolute deviation of the residuals, so that a few
// strong anomalies do not tilt the regional trend. It returns an error
// wrapping ErrPlane with fewer than three usable readings or when they lie
// on one line. It panics if the slices differ in length.
func FitPlane(xs, ys, vs []float64) (Plane, error) {
	if len(xs) != len(ys) || len(xs) != len(vs) {
		panic("criteria: FitPlane with slices of different lengths")
	}
	var idx []int
	for i := range vs {
		if finite(xs[i]) && finite(ys[i]) && finite(vs[i]) {
			idx = append(idx, i)
		}
	}
	if len(idx) < 3 {
		return Plane{}, fmt.Errorf("%d usable readings: %w", len(idx), ErrPlane)
	}
	p := Plane{Used: len(idx)}
	for _, i := range idx {
		p.X0 += xs[i] / float64(len(idx))
		p.Y0 += ys[i] / float64(len(idx))
	}
	w := make([]float64, len(vs))
	for _, i := range idx {
		w[i] = 1
	}
	for range maxIRLS {
		q, ok := weightedPlane(p, xs, ys, vs, w, idx)
		if !ok {
			return Plane{}, fmt.Errorf("readings on one line: %w", ErrPlane)
		}
		change := math.Abs(q.A-p.A) + math.Abs(q.B-p.B) + math.Abs(q.C-p.C)
		p = q
		if !huberWeights(p, xs, ys, vs, w, idx) {
			break // most readings lie on the plane exactly
		}
		if change <= irlsRelTol*(math.Abs(p.A)+math.Abs(p.B)+math.Abs(p.C)+1e-300) {
			break
		}
	}
	return p, nil
}

// huberWeights sets w to Huber's weights min(1, c/|r/s|) of the residuals
// r from plane p, with s the normal-consistent median absolute residual. It
// returns false when s is zero (no reweighting possible or needed).
func huberWeights(p Plane, xs, ys, vs, w []float64, idx []int) bool {
	res := make([]float64, 0, len(idx))
	for _, i := range idx {
		res = append(res, math.Abs(vs[i]-p.At(xs[i], ys[i])))
	}
	s := madNormal * median(res)
	if s == 0 {
		return false
	}
	for _, i := range idx {
		w[i] = min(1, huberC*s/math.Abs(vs[i]-p.At(xs[i], ys[i])))
	}
	return true
}

// weightedPlane solves the 3×3 weighted normal equations about (X0, Y0) by
// Cramer's rule.
func weightedPlane(p Plane, xs, ys, vs, w []float64, idx []int) (Plane, bool) {
	var s, sx, sy, sxx, sxy, syy, sv, sxv, syv float64
	for _, i := range idx {
		x, y, v, wi := xs[i]-p.X0, ys[i]-p.Y0, vs[i], w[i]
		s += wi
		sx, sy = sx+wi*x, sy+wi*y
		sxx, sxy, syy = sxx+wi*x*x, sxy+wi*x*y, syy+wi*y*y
		sv, sxv, syv = sv+wi*v, sxv+wi*x*v, syv+wi*y*v
	}
	det := func(a, b, c, d, e, f, g, h, k float64) float64 {
		return a*(e*k-f*h) - b*(d*k-f*g) + c*(d*h-e*g)
	}
	d := det(s, sx, sy, sx, sxx, sxy, sy, sxy, syy)
	scale := s * (sxx + syy) * (sxx + syy)
	if scale == 0 || math.Abs(d) <= 1e-12*scale {
		return p, false
	}
	q := p
	q.A = det(sv, sx, sy, sxv, sxx, sxy, syv, sxy, syy) / d
	q.B = det(s, sv, sy, sx, sxv, sxy, sy, syv, syy) / d
	q.C = det(s, sx, sv, sx, sxx, sxv, sy, sxy, syv) / d
	return q, true
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// median returns the median of v, reordering it.
func median(v []float64) float64 {
	slices.Sort(v)
	n := len(v)
	if n%2 == 1 {
		return v[n/2]
	}
	return (v[n/2-1] + v[n/2]) / 2
}
