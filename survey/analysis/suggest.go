package analysis

import (
	"fmt"
	"math"
	"sort"

	"isofield/interp"
)

// Suggestion is a point where a new reading would change the map most.
type Suggestion struct {
	ID    string  `json:"id"`
	X     float64 `json:"x"`
	Y     float64 `json:"y"`
	Score float64 `json:"score"`
	// Intensity is the field |E| (U/m) or, with step voltages, the step
	// voltage (U) at the point; Distance the distance to the nearest
	// reading (m); LOO the local leave-one-out error (U, NaN when the model
	// gives none).
	Intensity float64 `json:"intensity"`
	Distance  float64 `json:"distance_m"`
	LOO       float64 `json:"loo"`
	Why       string  `json:"why"`
}

// LeaveOneOuter is a fitted model that can report each reading's
// leave-one-out error (interp.Model does).
type LeaveOneOuter interface {
	LeaveOneOut() []float64
}

// maxCandidates bounds the nodes scored, by striding the grid.
const maxCandidates = 40000

// looNeighbours is how many nearby readings estimate the local
// leave-one-out error.
const looNeighbours = 4

// Suggest ranks usable grid nodes as infill points and returns the best n,
// kept at least twice the typical reading spacing apart.
//
// Score. With d the distance to the nearest reading and s the typical
// spacing (median nearest-neighbour distance), q the field magnitude (or
// the step voltage when step is not nil) scaled by its largest value, and
// l the local leave-one-out error (inverse-distance mean of |e| over the
// four nearest readings, Rippa's closed form in interp) scaled by its
// largest value:
//
//	score = (d/s) · (q + l)     (l = 0 when the model gives none)
//
// A steep field far from any reading, or readings that the others predict
// badly, make a point worth measuring. Nodes nearer than s/2 to a reading
// are skipped.
func Suggest(g *interp.Grid, in Input, step []float64, n int) []Suggestion {
	ix := newNearIndex(in.X, in.Y)
	s := typicalSpacing(ix)
	if n <= 0 || len(in.X) < 2 || !(s > 0) {
		return nil
	}
	q, qUnit := intensity(g, step, in.Unit)
	loo := looErrors(in.Model, len(in.X))
	cs := candidates(g, ix, q, loo, s)
	sort.SliceStable(cs, func(a, b int) bool { return cs[a].Score > cs[b].Score })
	var out []Suggestion
	for _, c := range cs {
		if len(out) == n {
			break
		}
		if tooClose(out, c, 2*s) {
			continue
		}
		c.ID = fmt.Sprintf("S%02d", len(out)+1)
		c.Why = why(c, qUnit, in.Unit, s, step != nil)
		out = append(out, c)
	}
	return out
}

// intensity returns the per-node quantity that calls for infill.
func intensity(g *interp.Grid, step []float64, unit string) ([]float64, string) {
	if step != nil {
		return step, unit
	}
	q := make([]float64, g.Len())
	for k := range q {
		q[k] = math.NaN()
		if usableNode(g, k) {
			q[k] = math.Hypot(g.GX[k], g.GY[k])
		}
	}
	return q, unit + "/m"
}

// looErrors returns |leave-one-out error| per reading, or nil.
func looErrors(m any, n int) []float64 {
	lo, ok := m.(LeaveOneOuter)
	if !ok {
		return nil
	}
	e := lo.LeaveOneOut()
	if len(e) != n {
		return nil
	}
	out := make([]float64, n)
	for i, v := range e {
		out[i] = math.Abs(v)
	}
	return out
}

// candidates scores usable nodes on a stride that keeps their number under
// maxCandidates.
func candidates(g *interp.Grid, ix *nearIndex, q, loo []float64, s float64) []Suggestion {
	stride := max(1, int(math.Ceil(math.Sqrt(float64(g.Len())/maxCandidates))))
	qMax, lMax := maxFinite(q), maxFinite(loo)
	var cs []Suggestion
	for j := 0; j < g.NY; j += stride {
		for i := 0; i < g.NX; i += stride {
			k := g.Index(i, j)
			if !usableNode(g, k) || !finite(q[k]) {
				continue
			}
			x, y := g.Node(i, j)
			idx, dist := ix.nearest(x, y, looNeighbours)
			if dist[0] < s/2 {
				continue
			}
			c := Suggestion{X: x, Y: y, Intensity: q[k], Distance: dist[0], LOO: math.NaN()}
			w := 0.0
			if qMax > 0 {
				w = q[k] / qMax
			}
			if loo != nil {
				c.LOO = idw(idx, dist, loo)
				if lMax > 0 {
					w += c.LOO / lMax
				}
			}
			c.Score = dist[0] / s * w
			cs = append(cs, c)
		}
	}
	return cs
}

// idw is the inverse-distance weighted mean of v over the given readings.
func idw(idx []int, dist, v []float64) float64 {
	var sw, sv float64
	for n, i := range idx {
		w := 1 / max(dist[n], 1e-9)
		sw += w
		sv += w * v[i]
	}
	return sv / sw
}

func maxFinite(v []float64) float64 {
	m := 0.0
	for _, x := range v {
		if finite(x) {
			m = max(m, x)
		}
	}
	return m
}

func tooClose(out []Suggestion, c Suggestion, d float64) bool {
	for _, o := range out {
		if math.Hypot(o.X-c.X, o.Y-c.Y) < d {
			return true
		}
	}
	return false
}

// why explains a suggestion in plain words.
func why(c Suggestion, qUnit, unit string, s float64, step bool) string {
	what := "field"
	if step {
		what = "step voltage"
	}
	w := fmt.Sprintf("%s %.3g %s, %.1f m from the nearest reading (typical spacing %.1f m)", what, c.Intensity, qUnit, c.Distance, s)
	if !math.IsNaN(c.LOO) {
		w += fmt.Sprintf("; readings nearby are predicted within about %.3g %s when left out", c.LOO, unit)
	}
	return w
}
