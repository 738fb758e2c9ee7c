package interp

import (
	"math"
	"sort"
)

// pointIndex is a uniform bucket grid over a set of points: the points of
// cell (a, b) are idx[start[c]:start[c+1]] with c = b*nx + a. Building it
// is O(N); a query near the points looks at a few cells only.
type pointIndex struct {
	xs, ys     []float64
	sx, sy     []float64 // coordinates in cell order: sx[k] = xs[idx[k]]
	x0, y0     float64
	cell       float64
	nx, ny     int
	start, idx []int32
}

// maxIndexCells bounds the bucket grid so that it stays linear in N.
const maxIndexCells = 1 << 24

// newPointIndex builds an index with about perCell points per cell.
func newPointIndex(xs, ys []float64, perCell float64) *pointIndex {
	xmin, ymin, xmax, ymax := bounds(xs, ys)
	w, h := xmax-xmin, ymax-ymin
	n := float64(len(xs))
	cell := math.Sqrt(max(w*h, 1e-300) * perCell / n)
	// Degenerate extents (a line) or a tiny area: fall back on the length.
	cell = max(cell, max(w, h)*perCell/n, 1e-300)
	return newPointIndexCell(xs, ys, cell)
}

// newPointIndexCell builds an index with cells of about the given size,
// enlarged if needed to keep the cell count under maxIndexCells.
func newPointIndexCell(xs, ys []float64, cell float64) *pointIndex {
	xmin, ymin, xmax, ymax := bounds(xs, ys)
	w, h := xmax-xmin, ymax-ymin
	cell = max(cell, 1e-300, max(w, h)*1e-7)
	for (w/cell+1)*(h/cell+1) > maxIndexCells {
		cell *= 2
	}
	ix := &pointIndex{xs: xs, ys: ys, x0: xmin, y0: ymin, cell: cell}
	ix.nx = int(w/cell) + 1
	ix.ny = int(h/cell) + 1
	ix.fill()
	return ix
}

func (ix *pointIndex) fill() {
	nc := ix.nx * ix.ny
	ix.start = make([]int32, nc+1)
	cells := make([]int32, len(ix.xs))
	parallelRange(len(ix.xs), func(lo, hi int) {
		for i := lo; i < hi; i++ {
			a, b := ix.cellOf(ix.xs[i], ix.ys[i])
			cells[i] = int32(b*ix.nx + a)
		}
	})
	for _, c := range cells {
		ix.start[c+1]++
	}
	for c := 0; c < nc; c++ {
		ix.start[c+1] += ix.start[c]
	}
	fillAt := append([]int32(nil), ix.start[:nc]...)
	ix.idx = make([]int32, len(ix.xs))
	for i, c := range cells {
		ix.idx[fillAt[c]] = int32(i)
		fillAt[c]++
	}
	ix.sx, ix.sy = make([]float64, len(ix.xs)), make([]float64, len(ix.xs))
	parallelRange(len(ix.idx), func(lo, hi int) {
		for k := lo; k < hi; k++ {
			i := ix.idx[k]
			ix.sx[k], ix.sy[k] = ix.xs[i], ix.ys[i]
		}
	})
}

// cellOf returns the cell holding (x, y), clamped to the grid.
func (ix *pointIndex) cellOf(x, y float64) (a, b int) {
	return cellCoord((x-ix.x0)/ix.cell, ix.nx), cellCoord((y-ix.y0)/ix.cell, ix.ny)
}

// cellCoord converts a coordinate in cell units to a cell number in
// [0, n), clamping before the conversion so that huge or infinite values
// stay defined.
func cellCoord(f float64, n int) int {
	switch {
	case !(f > 0): // also NaN
		return 0
	case f >= float64(n):
		return n - 1
	}
	return int(f)
}

// nearest returns the index of the point nearest to (x, y) other than
// skip (use -1 to skip none) and its squared distance. It searches rings
// of cells outward until no closer point can exist.
func (ix *pointIndex) nearest(x, y float64, skip int) (int, float64) {
	best, bestD := -1, math.Inf(1)
	a0, b0 := ix.cellOf(x, y)
	// Distance from (x, y) to the clamped cell's box, for points outside.
	ox := max(ix.x0-x, x-(ix.x0+float64(ix.nx)*ix.cell), 0)
	oy := max(ix.y0-y, y-(ix.y0+float64(ix.ny)*ix.cell), 0)
	off := math.Hypot(ox, oy)
	for ring := 0; ; ring++ {
		if ring > ix.nx && ring > ix.ny {
			return best, bestD
		}
		if best >= 0 {
			reach := max(off, float64(ring-1)*ix.cell)
			if reach > 0 && reach*reach > bestD {
				return best, bestD
			}
		}
		ix.visitRing(a0, b0, ring, func(i int) {
			if i == skip {
				return
			}
			dx, dy := ix.xs[i]-x, ix.ys[i]-y
			if d := dx*dx + dy*dy; d < bestD {
				best, bestD = i, d
			}
		})
	}
}

// visitRing calls fn for every point in the cells at Chebyshev distance
// ring from cell (a0, b0).
func (ix *pointIndex) visitRing(a0, b0, ring int, fn func(i int)) {
	for b := b0 - ring; b <= b0+ring; b++ {
		if b < 0 || b >= ix.ny {
			continue
		}
		step := 1
		if b != b0-ring && b != b0+ring {
			step = 2 * ring // only the left and right edges of the ring
		}
		for a := a0 - ring; a <= a0+ring; a += max(step, 1) {
			if a < 0 || a >= ix.nx {
				continue
			}
			c := b*ix.nx + a
			for _, i := range ix.idx[ix.start[c]:ix.start[c+1]] {
				fn(int(i))
			}
		}
	}
}

// within appends to dst the indexes of the points within radius of (x, y)
// and returns it.
func (ix *pointIndex) within(dst []int32, x, y, radius float64) []int32 {
	a0, b0 := ix.cellOf(x-radius, y-radius)
	a1, b1 := ix.cellOf(x+radius, y+radius)
	r2 := radius * radius
	for b := b0; b <= b1; b++ {
		for a := a0; a <= a1; a++ {
			c := b*ix.nx + a
			for k := ix.start[c]; k < ix.start[c+1]; k++ {
				dx, dy := ix.sx[k]-x, ix.sy[k]-y
				if dx*dx+dy*dy <= r2 {
					dst = append(dst, ix.idx[k])
				}
			}
		}
	}
	return dst
}

// anyWithin reports whether some point lies within radius of (x, y).
func (ix *pointIndex) anyWithin(x, y, radius float64) bool {
	a0, b0 := ix.cellOf(x-radius, y-radius)
	a1, b1 := ix.cellOf(x+radius, y+radius)
	r2 := radius * radius
	for b := b0; b <= b1; b++ {
		for a := a0; a <= a1; a++ {
			c := b*ix.nx + a
			for k := ix.start[c]; k < ix.start[c+1]; k++ {
				dx, dy := ix.sx[k]-x, ix.sy[k]-y
				if dx*dx+dy*dy <= r2 {
					return true
				}
			}
		}
	}
	return false
}

// bounds returns the bounding box of the points.
func bounds(xs, ys []float64) (xmin, ymin, xmax, ymax float64) {
	xmin, ymin = math.Inf(1), math.Inf(1)
	xmax, ymax = math.Inf(-1), math.Inf(-1)
	for i := range xs {
		xmin, xmax = min(xmin, xs[i]), max(xmax, xs[i])
		ymin, ymax = min(ymin, ys[i]), max(ymax, ys[i])
	}
	return xmin, ymin, xmax, ymax
}

// nnSample is the number of points whose nearest-neighbour distance
// medianNN measures; the median of a sample this size is within a few per
// cent of the full one.
const nnSample = 20000

// medianNN returns the median distance from a point to its nearest other
// point, ignoring exact duplicates, measured on an evenly strided sample
// of at most nnSample points. It returns 0 when every point coincides.
func medianNN(ix *pointIndex) float64 {
	n := len(ix.xs)
	stride := max(1, n/nnSample)
	d := make([]float64, 0, n/stride+1)
	for i := 0; i < n; i += stride {
		_, d2 := ix.nearestDistinct(i)
		if d2 > 0 && !math.IsInf(d2, 0) {
			d = append(d, math.Sqrt(d2))
		}
	}
	if len(d) == 0 {
		return 0
	}
	sort.Float64s(d)
	return d[len(d)/2]
}

// nearestDistinct returns the nearest point to point i at a positive
// distance, and its squared distance (+Inf if there is none).
func (ix *pointIndex) nearestDistinct(i int) (int, float64) {
	x, y := ix.xs[i], ix.ys[i]
	best, bestD := -1, math.Inf(1)
	a0, b0 := ix.cellOf(x, y)
	for ring := 0; ring <= max(ix.nx, ix.ny); ring++ {
		if best >= 0 {
			reach := float64(ring-1) * ix.cell
			if reach > 0 && reach*reach > bestD {
				break
			}
		}
		ix.visitRing(a0, b0, ring, func(j int) {
			dx, dy := ix.xs[j]-x, ix.ys[j]-y
			if d := dx*dx + dy*dy; d > 0 && d < bestD {
				best, bestD = j, d
			}
		})
	}
	return best, bestD
}
