package mapview

import (
	"math"

	"isofield/interp"
)

// Kind is what a point on the map is.
type Kind uint8

// The point kinds.
const (
	KindReading Kind = iota
	KindSuspect
	KindExcluded
	KindSuggestion
)

// Point is a reading or a suggestion at world position (X, Y).
type Point struct {
	X, Y float64
	Kind Kind
}

// Data is everything the map draws that changes only when the survey is
// gridded again. Build it with NewData and do not change it afterwards: a
// Renderer caches what it derives from it.
type Data struct {
	Grid      *interp.Grid
	Potential Bands // bands of V
	Field     Bands // bands of |E| = |∇V|
	// Flagged marks nodes inside flagged zones (nil: none).
	Flagged []bool
	Points  []Point

	potBand, fieldBand []int16 // per node, -1 where masked or NaN
	fieldMax           float64
}

// NewData derives per-node bands from g. flagged, when not nil, must have
// one entry per node; otherwise it is ignored.
func NewData(g *interp.Grid, pot, field Bands, flagged []bool, pts []Point) *Data {
	d := &Data{Grid: g, Potential: pot, Field: field, Points: pts}
	if g == nil {
		return d
	}
	n := g.Len()
	if len(flagged) == n {
		d.Flagged = flagged
	}
	d.potBand = make([]int16, n)
	d.fieldBand = make([]int16, n)
	for k := range n {
		d.potBand[k], d.fieldBand[k] = -1, -1
		if k < len(g.Mask) && g.Mask[k] || k >= len(g.V) {
			continue
		}
		d.potBand[k] = int16(pot.Index(g.V[k]))
		if k < len(g.GX) && k < len(g.GY) {
			m := math.Hypot(g.GX[k], g.GY[k])
			d.fieldBand[k] = int16(field.Index(m))
			if m > d.fieldMax {
				d.fieldMax = m
			}
		}
	}
	return d
}

// Range returns the smallest and largest unmasked finite value of g (NaN,
// NaN when there is none).
func Range(g *interp.Grid) (lo, hi float64) {
	lo, hi = math.NaN(), math.NaN()
	if g == nil {
		return lo, hi
	}
	for k, v := range g.V {
		if k < len(g.Mask) && g.Mask[k] || math.IsNaN(v) || math.IsInf(v, 0) {
			continue
		}
		if math.IsNaN(lo) {
			lo, hi = v, v
		}
		lo, hi = min(lo, v), max(hi, v)
	}
	return lo, hi
}

// FieldMax returns the largest unmasked |∇V| of g (0 when there is none).
func FieldMax(g *interp.Grid) float64 {
	m := 0.0
	if g == nil {
		return m
	}
	for k := range g.GX {
		if k < len(g.Mask) && g.Mask[k] || k >= len(g.GY) {
			continue
		}
		if f := math.Hypot(g.GX[k], g.GY[k]); f > m {
			m = f
		}
	}
	return m
}
