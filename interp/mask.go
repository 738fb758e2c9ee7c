package interp

import "math"

// Default masking distance factors: DefaultMaskDistance is maskNNFactor
// times the median nearest-neighbour distance, but at least
// maskSpacingFactor times the mean spacing sqrt(area/N) of the bounding
// box. Our choice: the first keeps holes in a regular survey visible, the
// second keeps line surveys (close stations on lines far apart) from being
// masked between their lines.
const (
	maskNNFactor      = 3
	maskSpacingFactor = 2
)

// DefaultMaskDistance returns the default masking distance for the points:
// 3 × the median distance from a reading to its nearest neighbour, but no
// less than 2 × sqrt(A/N), with A the area of the points' bounding box and
// N their number. On a regular survey with spacing h that is 3h; on lines
// 10 m apart with stations every metre it is about 6.3 m, so the ground
// between lines stays mapped. It returns 0 for fewer than two distinct
// points. It panics if len(xs) != len(ys).
func DefaultMaskDistance(xs, ys []float64) float64 {
	if len(xs) != len(ys) {
		panic("interp: DefaultMaskDistance with slices of different lengths")
	}
	if len(xs) < 2 {
		return 0
	}
	ix := newPointIndex(xs, ys, 2)
	nn := medianNN(ix)
	xmin, ymin, xmax, ymax := bounds(xs, ys)
	mean := math.Sqrt((xmax - xmin) * (ymax - ymin) / float64(len(xs)))
	return max(maskNNFactor*nn, maskSpacingFactor*mean)
}

// MaskFar sets g.Mask at every node farther than maxDist from the nearest
// point (xs[i], ys[i]); it never clears a mask entry. A grid index over the
// points keeps it linear in nodes plus points; rows run on all cores. With
// no points every node is masked. It panics if len(xs) != len(ys).
func MaskFar(g *Grid, xs, ys []float64, maxDist float64) {
	if len(xs) != len(ys) {
		panic("interp: MaskFar with slices of different lengths")
	}
	if g.Mask == nil {
		g.Mask = make([]bool, g.Len())
	}
	if len(xs) == 0 || !(maxDist >= 0) {
		for k := range g.Mask {
			g.Mask[k] = true
		}
		return
	}
	if math.IsInf(maxDist, 1) {
		return
	}
	ix := newPointIndexCell(xs, ys, maxDist)
	parallelRange(g.NY, func(lo, hi int) {
		for j := lo; j < hi; j++ {
			for i := 0; i < g.NX; i++ {
				x, y := g.Node(i, j)
				if !ix.anyWithin(x, y, maxDist) {
					g.Mask[g.Index(i, j)] = true
				}
			}
		}
	})
}
