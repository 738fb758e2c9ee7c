package analysis

import (
	"math"
	"slices"
	"sort"

	"isofield/interp"
	"isofield/survey/criteria"
)

// ClassArea is the surveyed area in one potential class of the preset.
type ClassArea struct {
	Class  criteria.Class `json:"class"`
	Nodes  int            `json:"nodes"`
	AreaM2 float64        `json:"area_m2"`
	// Share is the fraction (0..1) of the usable (unmasked) area.
	Share float64 `json:"share"`
}

// classes counts usable nodes per class; each node stands for DX × DY.
func (r *Result) classes(g *interp.Grid, c *criteria.Criterion) {
	if len(c.Classes) == 0 {
		return
	}
	r.Classes = make([]ClassArea, len(c.Classes))
	for i, cl := range c.Classes {
		r.Classes[i].Class = cl
	}
	total := 0
	for k := range g.V {
		if !usableNode(g, k) {
			continue
		}
		total++
		if i := criteria.ClassOf(c.Classes, g.V[k]); i >= 0 {
			r.Classes[i].Nodes++
		}
	}
	for i := range r.Classes {
		r.Classes[i].AreaM2 = float64(r.Classes[i].Nodes) * g.DX * g.DY
		if total > 0 {
			r.Classes[i].Share = float64(r.Classes[i].Nodes) / float64(total)
		}
	}
}

// CumPoint is one point of a cumulative-frequency curve: Percent of the
// readings have a value at or below Value.
type CumPoint struct {
	Value   float64 `json:"value"`
	Percent float64 `json:"percent"`
}

// Cumulative returns the cumulative frequency of the finite values, in
// ascending order, with the plotting position 100·(i − ½)/n for the i-th
// smallest of n (Hazen's), the curve RILEM TC 154-EMC recommends for
// judging a structure from its own distribution of readings (Materials and
// Structures 36, 2003).
func Cumulative(vs []float64) []CumPoint {
	var s []float64
	for _, v := range vs {
		if finite(v) {
			s = append(s, v)
		}
	}
	slices.Sort(s)
	out := make([]CumPoint, len(s))
	for i, v := range s {
		out[i] = CumPoint{v, 100 * (float64(i) + 0.5) / float64(len(s))}
	}
	return out
}

// Quantile returns the value at percent p (0..100) of a cumulative curve by
// linear interpolation between its points (the end values beyond them), or
// NaN for an empty curve.
func Quantile(cum []CumPoint, p float64) float64 {
	switch {
	case len(cum) == 0:
		return math.NaN()
	case p <= cum[0].Percent:
		return cum[0].Value
	case p >= cum[len(cum)-1].Percent:
		return cum[len(cum)-1].Value
	}
	i := sort.Search(len(cum), func(i int) bool { return cum[i].Percent >= p })
	a, b := cum[i-1], cum[i]
	return a.Value + (p-a.Percent)/(b.Percent-a.Percent)*(b.Value-a.Value)
}
