package mapview

import (
	"math"
	"sort"

	"isofield/interp/contour"
)

// Scale says how band tones are spread over a palette.
type Scale int

// The scales.
const (
	Sequential Scale = iota // one-signed values: tone 0 at the lowest band
	Diverging               // signed values: tone 0 at zero, ±1 at the largest |value|
)

// Bands are contiguous value intervals [Edges[k], Edges[k+1]).
type Bands struct {
	Edges []float64 // ascending; len = number of bands + 1
	Scale Scale
}

// N returns the number of bands.
func (b Bands) N() int { return max(len(b.Edges)-1, 0) }

// maxBands bounds the number of bands a user interval can produce.
const maxBands = 400

// NiceBands returns bands of width interval covering [lo, hi], with edges
// on multiples of the interval (so zero is an edge when lo < 0 < hi). An
// interval ≤ 0 picks the widest nice one (1, 2 or 5 × 10ⁿ) giving at least
// eight bands; an interval that
// would give more than 400 bands is widened. The scale is Diverging when the
// values change sign.
func NiceBands(lo, hi, interval float64) Bands {
	if math.IsNaN(lo) || math.IsNaN(hi) || math.IsInf(lo, 0) || math.IsInf(hi, 0) {
		return Bands{}
	}
	if hi <= lo {
		hi = lo + max(math.Abs(lo)*1e-3, 1e-9)
	}
	if !(interval > 0) || (hi-lo)/interval > maxBands {
		interval = contour.FloorNice((hi - lo) / 8)
	}
	k0 := math.Floor(lo / interval)
	k1 := math.Ceil(hi / interval)
	if k1 <= k0 {
		k1 = k0 + 1
	}
	edges := make([]float64, 0, int(k1-k0)+1)
	for k := k0; k <= k1; k++ {
		edges = append(edges, k*interval)
	}
	sc := Sequential
	if lo < 0 && hi > 0 {
		sc = Diverging
	}
	return Bands{Edges: edges, Scale: sc}
}

// Index returns the band holding v (clamped to the first and last band), or
// -1 for NaN or when there are no bands.
func (b Bands) Index(v float64) int {
	n := b.N()
	if n == 0 || math.IsNaN(v) {
		return -1
	}
	k := sort.SearchFloat64s(b.Edges, v)
	// SearchFloat64s gives the first edge >= v; band k-1 holds v unless v
	// sits on edge k exactly.
	if k < len(b.Edges) && b.Edges[k] == v {
		k++
	}
	return min(max(k-1, 0), n-1)
}

// Tone returns where band k sits on its palette: for Sequential from 0
// (first band) to 1 (last), for Diverging the band's centre over the
// largest absolute edge, in [-1, 1].
func (b Bands) Tone(k int) float64 {
	n := b.N()
	if n == 0 || k < 0 || k >= n {
		return math.NaN()
	}
	if b.Scale == Diverging {
		m := max(math.Abs(b.Edges[0]), math.Abs(b.Edges[n]))
		return (b.Edges[k] + b.Edges[k+1]) / 2 / m
	}
	if n == 1 {
		return 0.5
	}
	return float64(k) / float64(n-1)
}
