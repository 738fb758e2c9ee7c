package qa

import (
	"math"
	"slices"
)

// The bucket grid of the neighbour index. Its cells are sized from the
// area the spots cover, so that a cell holds gridPerCell spots on average
// and the nearest spots of a spot lie in the few rings of cells around
// its own. A layout the grid cannot divide evenly (the spots crowd into a
// few cells, as a site with a base station far away may, or the cells
// would be too many) gets no grid: the k-d tree serves it instead. The
// numbers are engineering choices, not published values and not tuned
// finely: with two spots per cell the nearest spot is found in the 3 × 3
// cells around a spot's own, the nearest 24 within two or three rings.
const (
	// gridPerCell is the mean number of spots per cell aimed at.
	gridPerCell = 2.0
	// gridMaxCrowd bounds the mean number of spots that share a spot's
	// cell, Σ count² / n: about 1 + gridPerCell for spots spread evenly.
	gridMaxCrowd = 16.0
	// gridMaxCells bounds the number of cells per spot.
	gridMaxCells = 32
	// gridRounding is the relative rounding error allowed for when a
	// distance is bounded by whole cells: far above the error of a
	// floating-point subtraction and division, far below a cell.
	gridRounding = 1e-12
)

// gridPoint is a spot in the grid: its position and index.
type gridPoint struct {
	x, y float64
	k    int32
}

// spotGrid buckets spots into square cells. Cell (i, j), its lower left
// corner at (x0 + i·size, y0 + j·size), has index j·nx + i and holds
// pts[start[c]:start[c+1]], in the order of the spots' indexes.
type spotGrid struct {
	x0, y0, size float64
	nx, ny       int
	start        []int32
	pts          []gridPoint
	// slack is how far, allowing for rounding, a position may lie outside
	// the cell it was put in.
	slack float64
}

// newSpotGrid returns the grid of the spots, or nil when their layout
// suits no grid (see the constants) or a position is not finite.
func newSpotGrid(spots []spot) *spotGrid {
	n := len(spots)
	if n == 0 || n > math.MaxInt32 {
		return nil
	}
	x0, x1, y0, y1 := spots[0].x, spots[0].x, spots[0].y, spots[0].y
	for _, s := range spots {
		x0, x1 = math.Min(x0, s.x), math.Max(x1, s.x)
		y0, y1 = math.Min(y0, s.y), math.Max(y1, s.y)
	}
	w, h := x1-x0, y1-y0
	if math.IsNaN(w) || math.IsNaN(h) || math.IsInf(w, 0) || math.IsInf(h, 0) {
		return nil
	}
	area := w * h
	// A second try sizes the cells from the area the spots fill, the
	// cells the first try found occupied.
	for range 2 {
		g := layoutGrid(x0, y0, w, h, cellSide(w, h, area, n), n)
		if g == nil {
			return nil
		}
		count := g.count(spots)
		crowd, filled := 0.0, 0
		for _, m := range count {
			crowd += float64(m) * float64(m)
			if m > 0 {
				filled++
			}
		}
		if crowd <= gridMaxCrowd*float64(n) {
			g.fill(spots, count)
			maxAbs := math.Max(math.Max(math.Abs(x0), math.Abs(x1)), math.Max(math.Abs(y0), math.Abs(y1)))
			g.slack = gridRounding * (maxAbs + g.size)
			return g
		}
		area = float64(filled) * g.size * g.size
	}
	return nil
}

// cellSide is the side of a cell for n spots over a w × h box filling
// the given area: gridPerCell spots per cell, or per stretch of a line
// when the spots lie on one.
func cellSide(w, h, area float64, n int) float64 {
	s := math.Max(math.Sqrt(area*gridPerCell/float64(n)), math.Max(w, h)*gridPerCell/float64(n))
	if s <= 0 || math.IsNaN(s) || math.IsInf(s, 0) {
		return 1 // every spot at one place: one cell
	}
	return s
}

// layoutGrid returns an empty grid with cells of the given side over the
// box, or nil when it would have too many cells.
func layoutGrid(x0, y0, w, h, size float64, n int) *spotGrid {
	fx, fy := math.Floor(w/size)+1, math.Floor(h/size)+1
	if fx*fy > float64(gridMaxCells)*float64(n)+1024 {
		return nil
	}
	return &spotGrid{x0: x0, y0: y0, size: size, nx: int(fx), ny: int(fy)}
}

// cell returns the column and row of the cell holding (x, y), a position
// inside the grid's box.
func (g *spotGrid) cell(x, y float64) (i, j int) {
	i = min(max(int((x-g.x0)/g.size), 0), g.nx-1)
	j = min(max(int((y-g.y0)/g.size), 0), g.ny-1)
	return i, j
}

// count returns the number of spots in each cell.
func (g *spotGrid) count(spots []spot) []int32 {
	count := make([]int32, g.nx*g.ny)
	for _, s := range spots {
		i, j := g.cell(s.x, s.y)
		count[j*g.nx+i]++
	}
	return count
}

// fill puts the spots in their cells, in index order within each cell.
func (g *spotGrid) fill(spots []spot, count []int32) {
	g.start = make([]int32, len(count)+1)
	for c, m := range count {
		g.start[c+1] = g.start[c] + m
	}
	next := slices.Clone(g.start[:len(count)])
	g.pts = make([]gridPoint, len(spots))
	for k, s := range spots {
		i, j := g.cell(s.x, s.y)
		c := j*g.nx + i
		g.pts[next[c]] = gridPoint{s.x, s.y, int32(k)}
		next[c]++
	}
}

// nearBuf holds the m nearest spots found so far, nearest first, spots
// at equal distances in index order.
type nearBuf struct {
	m  int
	k  []int32
	d2 []float64
}

// reset empties the buffer for a search of the m nearest.
func (b *nearBuf) reset(m int) {
	b.m, b.k, b.d2 = m, b.k[:0], b.d2[:0]
}

// full reports whether the buffer holds m spots.
func (b *nearBuf) full() bool { return len(b.k) == b.m }

// offer keeps spot k at squared distance d2 if it is among the m nearest
// so far.
func (b *nearBuf) offer(k int32, d2 float64) {
	n := len(b.k)
	if n == b.m && !nearer(d2, k, b.d2[n-1], b.k[n-1]) {
		return
	}
	if n < b.m {
		b.k, b.d2 = append(b.k, 0), append(b.d2, 0)
		n++
	}
	p := n - 1
	for p > 0 && nearer(d2, k, b.d2[p-1], b.k[p-1]) {
		b.k[p], b.d2[p] = b.k[p-1], b.d2[p-1]
		p--
	}
	b.k[p], b.d2[p] = k, d2
}

// nearer orders spots by distance, then index.
func nearer(d2 float64, k int32, e2 float64, e int32) bool {
	return d2 < e2 || d2 == e2 && k < e
}

// nearest fills b with the m spots nearest to spot k at (x, y), not
// counting k itself. It searches the rings of cells around the spot's
// own, outwards, until every spot not yet seen lies farther than the
// m-th nearest found (strictly, so that a spot tying with it in distance
// but earlier in index order cannot be missed) or every cell was seen.
func (g *spotGrid) nearest(b *nearBuf, k int32, x, y float64, m int) {
	b.reset(m)
	qi, qj := g.cell(x, y)
	for r := 0; ; r++ {
		g.ring(b, k, x, y, qi, qj, r)
		if qi-r <= 0 && qj-r <= 0 && qi+r >= g.nx-1 && qj+r >= g.ny-1 {
			return // every cell seen
		}
		// A spot in no cell seen yet lies more than r cells away.
		if bound := float64(r)*g.size - 2*g.slack; b.full() && bound > 0 &&
			b.d2[m-1] < bound*bound*(1-gridRounding) {
			return
		}
	}
}

// ring offers b the spots in the cells at Chebyshev distance r from cell
// (qi, qj) that lie in the grid.
func (g *spotGrid) ring(b *nearBuf, k int32, x, y float64, qi, qj, r int) {
	i0, i1 := max(qi-r, 0), min(qi+r, g.nx-1)
	for j := max(qj-r, 0); j <= min(qj+r, g.ny-1); j++ {
		if j == qj-r || j == qj+r {
			g.offerCells(b, k, x, y, j*g.nx+i0, j*g.nx+i1+1)
			continue
		}
		if qi-r >= 0 {
			g.offerCells(b, k, x, y, j*g.nx+qi-r, j*g.nx+qi-r+1)
		}
		if qi+r < g.nx {
			g.offerCells(b, k, x, y, j*g.nx+qi+r, j*g.nx+qi+r+1)
		}
	}
}

// offerCells offers b the spots of cells c0 to c1−1 (consecutive in a
// row, so their spots are too), other than spot k.
func (g *spotGrid) offerCells(b *nearBuf, k int32, x, y float64, c0, c1 int) {
	for _, p := range g.pts[g.start[c0]:g.start[c1]] {
		if p.k != k {
			b.offer(p.k, dist2(x, y, p.x, p.y))
		}
	}
}

// dist2 is the squared distance from (x, y) to (u, v), the one formula
// of the neighbour searches (the k-d tree's too), so that they agree to
// the last bit.
func dist2(x, y, u, v float64) float64 {
	dx, dy := x-u, y-v
	return dx*dx + dy*dy
}
