package contour

import (
	"math"
	"sort"

	"isofield/interp"
)

// Band counts that NiceInterval aims for.
const (
	MinBands    = 8
	MaxBands    = 15
	targetBands = 11 // preferred when several intervals fit
)

// maxLevels bounds Levels, so that a tiny interval on a wide range cannot
// exhaust memory.
const maxLevels = 10000

// usable reports whether node k has a finite, unmasked value.
func usable(g *interp.Grid, k int) bool {
	v := g.V[k]
	return !g.Mask[k] && !math.IsNaN(v) && !math.IsInf(v, 0)
}

// Range returns the smallest and largest usable value of g; ok is false
// when no node is usable.
func Range(g *interp.Grid) (lo, hi float64, ok bool) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for k := range g.V {
		if usable(g, k) {
			lo, hi = min(lo, g.V[k]), max(hi, g.V[k])
		}
	}
	return lo, hi, lo <= hi
}

// bandCount returns how many bands the levels of interval step make on
// [lo, hi].
func bandCount(lo, hi, step float64) int {
	return len(levelsOf(lo, hi, step, maxLevels+1)) + 1
}

// NiceInterval returns a round contour interval (1, 2 or 5 × 10ⁿ) that
// cuts [lo, hi] into MinBands to MaxBands bands, preferring about 11. When
// no round interval fits (only possible for tiny ranges), it returns the
// one whose count is nearest to the range. It returns 1 for an empty,
// inverted or non-finite range.
func NiceInterval(lo, hi float64) float64 {
	span := hi - lo
	if !(span > 0) || math.IsInf(span, 0) {
		return 1
	}
	e := math.Floor(math.Log10(span / targetBands))
	best, bestScore := 0.0, math.Inf(1)
	for n := e - 1; n <= e+1; n++ {
		for _, m := range []float64{1, 2, 5} {
			step := m * math.Pow(10, n)
			c := bandCount(lo, hi, step)
			score := math.Abs(float64(c - targetBands))
			if c < MinBands || c > MaxBands {
				score += 100 + float64(max(MinBands-c, c-MaxBands))
			}
			if score < bestScore {
				best, bestScore = step, score
			}
		}
	}
	return best
}

// Levels returns the multiples of step strictly inside (lo, hi), in
// increasing order, so that zero is a level of every signed range. It
// returns nil when step is not positive and finite or the range is empty,
// and at most 10000 levels (the lowest ones) when step is tiny.
func Levels(lo, hi, step float64) []float64 {
	return levelsOf(lo, hi, step, maxLevels)
}

func levelsOf(lo, hi, step float64, limit int) []float64 {
	if !(step > 0) || math.IsInf(step, 0) || !(hi > lo) || math.IsInf(hi-lo, 0) {
		return nil
	}
	k0 := math.Floor(lo/step) + 1
	var ls []float64
	for k := k0; len(ls) < limit; k++ {
		l := k * step
		if l >= hi {
			break
		}
		if l > lo {
			ls = append(ls, l)
		}
	}
	return ls
}

// Band returns the band of v for the increasing levels: the number of
// levels <= v, or -1 when v is NaN.
func Band(v float64, levels []float64) int {
	if math.IsNaN(v) {
		return -1
	}
	return sort.Search(len(levels), func(i int) bool { return levels[i] > v })
}

// NodeBands returns the band of every node of g (-1 where unusable).
func NodeBands(g *interp.Grid, levels []float64) []int {
	b := make([]int, g.Len())
	for k := range b {
		b[k] = -1
		if usable(g, k) {
			b[k] = Band(g.V[k], levels)
		}
	}
	return b
}

// CellBands returns the band of every cell's centre value (the mean of its
// four corners, the same value that resolves saddles in Lines), -1 where a
// corner is unusable. The result has (NX-1)*(NY-1) entries, empty when the
// grid has a single row or column.
func CellBands(g *interp.Grid, levels []float64) []int {
	cx, cy := max(g.NX-1, 0), max(g.NY-1, 0)
	b := make([]int, cx*cy)
	for j := 0; j < cy; j++ {
		for i := 0; i < cx; i++ {
			b[j*cx+i] = -1
			if c, ok := cellCorners(g, i, j); ok {
				b[j*cx+i] = Band((c[0]+c[1]+c[2]+c[3])/4, levels)
			}
		}
	}
	return b
}

// cellCorners returns the corner values of cell (i, j) counter-clockwise
// from its south-west corner, and whether all four are usable.
func cellCorners(g *interp.Grid, i, j int) (c [4]float64, ok bool) {
	k := [4]int{g.Index(i, j), g.Index(i+1, j), g.Index(i+1, j+1), g.Index(i, j+1)}
	for n, kk := range k {
		if !usable(g, kk) {
			return c, false
		}
		c[n] = g.V[kk]
	}
	return c, true
}

// Spacing returns the distance between neighbouring equipotentials of
// interval step where the gradient is (gx, gy): step/|∇V|, the crowding
// that shows a strong field (|E| ≈ ΔV/Δn). It is +Inf where the gradient
// vanishes and NaN for non-finite input.
func Spacing(step, gx, gy float64) float64 {
	m := math.Hypot(gx, gy)
	if math.IsNaN(m) || math.IsNaN(step) {
		return math.NaN()
	}
	if m == 0 {
		return math.Inf(1)
	}
	return math.Abs(step) / m
}

// SpacingAt returns Spacing at (x, y) from the interpolant's analytic
// gradient.
func SpacingAt(f interp.Interpolant, x, y, step float64) float64 {
	gx, gy := f.Gradient(x, y)
	return Spacing(step, gx, gy)
}

// FloorNice rounds v down to a round number, 1, 2 or 5 × 10ⁿ, as used for
// grid spacings and scale bars. It returns 1 for v that is not positive
// and finite.
func FloorNice(v float64) float64 {
	if !(v > 0) || math.IsInf(v, 0) {
		return 1
	}
	e := math.Pow(10, math.Floor(math.Log10(v)))
	switch f := v / e; {
	case f >= 5:
		return 5 * e
	case f >= 2:
		return 2 * e
	}
	return e
}
