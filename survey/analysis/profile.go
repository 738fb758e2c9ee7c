package analysis

import (
	"fmt"
	"math"

	gi "gonum.org/v1/gonum/interp"

	"isofield/interp"
)

// ProfileSample is the surface at one point of a profile: Along is the
// distance from the start (m), V the potential, EAlong the component of
// E = −∇V along the profile's direction and EMag its magnitude (U/m).
type ProfileSample struct {
	Along, X, Y     float64
	V, EAlong, EMag float64
}

// ProfileReading is a reading near the profile line: Along its projection's
// distance from the start, Offset its signed distance from the line (m,
// positive to the left looking from start to end).
type ProfileReading struct {
	Index         int // survey index
	Along, Offset float64
	V             float64
}

// Profile is the surface sampled along a straight line.
type Profile struct {
	X0, Y0, X1, Y1 float64
	Length         float64
	Samples        []ProfileSample
	Readings       []ProfileReading
}

// MakeProfile samples f at n ≥ 2 evenly spaced points from (x0, y0) to
// (x1, y1), both ends included. The interpolant extrapolates beyond the
// data; callers that know a mask may blank those stretches. It returns an
// error for n < 2, a zero-length or non-finite line.
func MakeProfile(f interp.Interpolant, x0, y0, x1, y1 float64, n int) (*Profile, error) {
	l := math.Hypot(x1-x0, y1-y0)
	if n < 2 || !(l > 0) || math.IsInf(l, 0) {
		return nil, fmt.Errorf("profile from (%g, %g) to (%g, %g) with %d samples: need two distinct finite ends and n ≥ 2", x0, y0, x1, y1, n)
	}
	p := &Profile{X0: x0, Y0: y0, X1: x1, Y1: y1, Length: l, Samples: make([]ProfileSample, n)}
	ux, uy := (x1-x0)/l, (y1-y0)/l
	for i := range p.Samples {
		t := float64(i) / float64(n-1)
		x, y := x0+t*(x1-x0), y0+t*(y1-y0)
		gx, gy := f.Gradient(x, y)
		p.Samples[i] = ProfileSample{Along: t * l, X: x, Y: y, V: f.Value(x, y),
			EAlong: -(gx*ux + gy*uy), EMag: math.Hypot(gx, gy)}
	}
	return p, nil
}

// MarkReadings records the readings within corridor metres of the line
// whose projection falls on it, in the order given; index maps them to the
// survey. It panics if the slices differ in length.
func (p *Profile) MarkReadings(xs, ys, vs []float64, index []int, corridor float64) {
	if len(xs) != len(ys) || len(xs) != len(vs) || len(xs) != len(index) {
		panic("analysis: MarkReadings with slices of different lengths")
	}
	ux, uy := (p.X1-p.X0)/p.Length, (p.Y1-p.Y0)/p.Length
	p.Readings = p.Readings[:0]
	for i := range xs {
		dx, dy := xs[i]-p.X0, ys[i]-p.Y0
		along, off := dx*ux+dy*uy, -dx*uy+dy*ux
		if along >= 0 && along <= p.Length && math.Abs(off) <= corridor {
			p.Readings = append(p.Readings, ProfileReading{index[i], along, off, vs[i]})
		}
	}
}

// Resample returns the profile's potential and field along it at m evenly
// spaced distances, for display at m columns: a monotone cubic (Fritsch &
// Butland, SIAM J. Sci. Stat. Comput. 5, 1984, as gonum/interp implements
// it) through the samples, so that no overshoot invents a peak; with two
// samples, a straight line.
func (p *Profile) Resample(m int) (along, v, e []float64, err error) {
	if m < 2 {
		return nil, nil, nil, fmt.Errorf("resampling a profile to %d points: need at least 2", m)
	}
	xs := make([]float64, len(p.Samples))
	vs, es := make([]float64, len(xs)), make([]float64, len(xs))
	for i, s := range p.Samples {
		xs[i], vs[i], es[i] = s.Along, s.V, s.EAlong
	}
	pv, err := fitter(xs, vs)
	if err != nil {
		return nil, nil, nil, err
	}
	pe, err := fitter(xs, es)
	if err != nil {
		return nil, nil, nil, err
	}
	along, v, e = make([]float64, m), make([]float64, m), make([]float64, m)
	for i := range along {
		along[i] = p.Length * float64(i) / float64(m-1)
		v[i], e[i] = pv.Predict(along[i]), pe.Predict(along[i])
	}
	return along, v, e, nil
}

// fitter fits a monotone cubic, or a line for two points.
func fitter(xs, ys []float64) (gi.Predictor, error) {
	if len(xs) < 3 {
		var pl gi.PiecewiseLinear
		return &pl, pl.Fit(xs, ys)
	}
	var fb gi.FritschButland
	if err := fb.Fit(xs, ys); err != nil {
		return nil, fmt.Errorf("resampling a profile: %w", err)
	}
	return &fb, nil
}
