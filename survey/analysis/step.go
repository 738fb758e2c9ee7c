package analysis

import (
	"context"
	"math"
	"runtime"
	"sync"
	"sync/atomic"

	"isofield/interp"
	"isofield/survey/criteria"
)

// stepDirections is the number of directions sampled on each circle.
const stepDirections = 16

// stepSampler holds the unit vectors of the sampled directions.
type stepSampler struct {
	cos, sin [stepDirections]float64
	d        float64 // step distance, m
}

func newStepSampler(d float64) *stepSampler {
	s := &stepSampler{d: d}
	for n := range stepDirections {
		a := 2 * math.Pi * float64(n) / stepDirections
		s.sin[n], s.cos[n] = math.Sincos(a)
	}
	return s
}

// StepVoltage returns the step voltage at (x, y): the largest potential
// difference |V(p) − V(q)| between two points p, q one step (1 m, IEEE Std
// 80) apart around the point, from the interpolant f.
//
// Sampling. Two families of segments are tried: one foot on the point and
// the other on the 1 m circle around it (16 directions, 22.5° apart), and
// the point as the middle of the segment (16 points on the 0.5 m circle,
// so 8 orientations). For the best direction of each family a parabola
// through it and its two neighbours gives a refined direction, evaluated
// once more. That is 35 evaluations of f per point.
//
// Why not |E| × 1 m: near an electrode the field changes strongly within a
// metre, and along a radial line V is convex, so the difference over 1 m
// with one foot nearer the source exceeds the gradient at the point times
// 1 m (FIELD_FACTS §3); the first family catches that. In a uniform field
// the two agree: the coarse sampling alone would underestimate by at most
// 1 − cos 11.25° ≈ 1.9 %, and the refinement of a sinusoid's peak by a
// parabola brings that below 0.1 %.
func StepVoltage(f interp.Interpolant, x, y float64) float64 {
	return newStepSampler(criteria.StepDistance).at(f, x, y)
}

func (s *stepSampler) at(f interp.Interpolant, x, y float64) float64 {
	vc := f.Value(x, y)
	var ring, half [stepDirections]float64
	for n := range stepDirections {
		ring[n] = f.Value(x+s.d*s.cos[n], y+s.d*s.sin[n]) - vc
		half[n] = f.Value(x+s.d/2*s.cos[n], y+s.d/2*s.sin[n])
	}
	best := 0.0
	// One foot on the point.
	nb := argmaxAbs(ring[:], func(n int) float64 { return ring[n] })
	best = max(best, math.Abs(ring[nb]))
	if a, ok := refine(nb, func(n int) float64 { return ring[n] }); ok {
		ca, sa := math.Cos(a), math.Sin(a)
		best = max(best, math.Abs(f.Value(x+s.d*ca, y+s.d*sa)-vc))
	}
	// The point in the middle: pairs n and n + 8 are opposite.
	const h = stepDirections / 2
	pair := func(n int) float64 {
		n = ((n % stepDirections) + stepDirections) % stepDirections
		return half[n] - half[(n+h)%stepDirections]
	}
	mb := argmaxAbs(half[:h], pair)
	best = max(best, math.Abs(pair(mb)))
	if a, ok := refine(mb, pair); ok {
		ca, sa := math.Cos(a)*s.d/2, math.Sin(a)*s.d/2
		best = max(best, math.Abs(f.Value(x+ca, y+sa)-f.Value(x-ca, y-sa)))
	}
	return best
}

// argmaxAbs returns the index in [0, len(v)) where |g| is largest.
func argmaxAbs(v []float64, g func(int) float64) int {
	nb, vb := 0, -1.0
	for n := range v {
		if a := math.Abs(g(n)); a > vb {
			nb, vb = n, a
		}
	}
	return nb
}

// refine fits a parabola through g at directions nb-1, nb, nb+1 and returns
// the angle of its vertex, when that is an extremum within a step.
func refine(nb int, g func(int) float64) (float64, bool) {
	at := func(n int) float64 { return g(((n % stepDirections) + stepDirections) % stepDirections) }
	gm, g0, gp := at(nb-1), at(nb), at(nb+1)
	den := gm - 2*g0 + gp
	if den == 0 || math.IsNaN(den) {
		return 0, false
	}
	delta := 0.5 * (gm - gp) / den
	if math.Abs(delta) >= 1 {
		return 0, false
	}
	return 2 * math.Pi * (float64(nb) + delta) / stepDirections, true
}

// eachRow runs fn over the grid's rows on all cores, checking ctx between
// rows.
func eachRow(ctx context.Context, ny int, fn func(j int)) error {
	var next atomic.Int64
	var wg sync.WaitGroup
	for range min(runtime.GOMAXPROCS(0), ny) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for {
				j := int(next.Add(1) - 1)
				if j >= ny || ctx.Err() != nil {
					return
				}
				fn(j)
			}
		}()
	}
	wg.Wait()
	return ctx.Err()
}

// StepGrid returns the step voltage at every usable node of g from f, NaN
// at the others, computed in parallel by rows.
//
// The potential around the nodes is read from a bicubic Hermite surface
// through the interpolant's values and analytic gradients at grid nodes at
// most hermiteMaxSpacing apart: g itself when it is that fine, else a
// refined grid evaluated from f for the purpose, when that takes fewer
// evaluations than the 35 per node of sampling f directly (and stays under
// maxRefinedNodes); otherwise f is sampled directly. The surface makes the
// pass independent of the number of readings.
func StepGrid(ctx context.Context, f interp.Interpolant, g *interp.Grid) ([]float64, error) {
	return stepGrid(ctx, f, g, nil)
}

// stepGrid is StepGrid reporting the rows done through progress (if not
// nil), one call at a time.
func stepGrid(ctx context.Context, f interp.Interpolant, g *interp.Grid, progress func(done, total int)) ([]float64, error) {
	s := newStepSampler(criteria.StepDistance)
	f, err := stepSurface(ctx, f, g, s.d)
	if err != nil {
		return nil, err
	}
	out := make([]float64, g.Len())
	var mu sync.Mutex
	rows := 0
	err = eachRow(ctx, g.NY, func(j int) {
		for i := range g.NX {
			k := g.Index(i, j)
			out[k] = math.NaN()
			if usableNode(g, k) {
				x, y := g.Node(i, j)
				out[k] = s.at(f, x, y)
			}
		}
		if progress != nil {
			mu.Lock()
			rows++
			progress(rows, g.NY)
			mu.Unlock()
		}
	})
	if err != nil {
		return nil, err
	}
	return out, nil
}

// stepTouch computes step and touch voltages when the criterion asks.
func (r *Result) stepTouch(ctx context.Context, in Input, c *criteria.Criterion) error {
	if c.Step {
		if in.Model == nil {
			r.Notes = append(r.Notes, "no interpolant given: step voltages not computed")
		} else {
			var err error
			report := func(d, t int) { in.Progress(progressStep0+(progressStep1-progressStep0)*d/t, progressTotal) }
			if r.Step, err = stepGrid(ctx, in.Model, in.Grid, report); err != nil {
				return err
			}
		}
	}
	if c.Touch {
		r.Touch = TouchGrid(in.Grid, in.Criteria)
	}
	return nil
}

// TouchGrid returns |GPR − V| at every usable node within reach of the
// settings' structure (every usable node when no structure is given), NaN
// elsewhere. GPR and V are in the survey's unit, both at fault current.
func TouchGrid(g *interp.Grid, set criteria.Settings) []float64 {
	reach := set.Reach
	if reach <= 0 {
		reach = criteria.DefaultReach
	}
	out := make([]float64, g.Len())
	for j := range g.NY {
		for i := range g.NX {
			k := g.Index(i, j)
			out[k] = math.NaN()
			x, y := g.Node(i, j)
			if usableNode(g, k) && (len(set.Structure) == 0 || distToPolyline(x, y, set.Structure) <= reach) {
				out[k] = math.Abs(set.GPR - g.V[k])
			}
		}
	}
	return out
}

// distToPolyline returns the distance from (x, y) to the polyline through
// pts (a single point is a polyline too).
func distToPolyline(x, y float64, pts []criteria.Point) float64 {
	d := math.Hypot(x-pts[0].X, y-pts[0].Y)
	for n := 1; n < len(pts); n++ {
		a, b := pts[n-1], pts[n]
		dx, dy := b.X-a.X, b.Y-a.Y
		t := 0.0
		if l2 := dx*dx + dy*dy; l2 > 0 {
			t = min(1, max(0, ((x-a.X)*dx+(y-a.Y)*dy)/l2))
		}
		d = min(d, math.Hypot(x-a.X-t*dx, y-a.Y-t*dy))
	}
	return d
}
