package analysis

import (
	"math"
	"sort"
)

// nearIndex finds the readings nearest to a point with a bucket grid over
// the readings' extent (about two readings per bucket).
type nearIndex struct {
	xs, ys     []float64
	x0, y0, cs float64
	nx, ny     int
	buckets    [][]int
}

func newNearIndex(xs, ys []float64) *nearIndex {
	ix := &nearIndex{xs: xs, ys: ys}
	if len(xs) == 0 {
		return ix
	}
	xmin, xmax, ymin, ymax := xs[0], xs[0], ys[0], ys[0]
	for i := range xs {
		xmin, xmax = min(xmin, xs[i]), max(xmax, xs[i])
		ymin, ymax = min(ymin, ys[i]), max(ymax, ys[i])
	}
	w, h := max(xmax-xmin, 1e-9), max(ymax-ymin, 1e-9)
	ix.cs = math.Sqrt(2 * w * h / float64(len(xs)))
	ix.cs = max(ix.cs, max(w, h)/1024)
	ix.x0, ix.y0 = xmin, ymin
	ix.nx, ix.ny = int(w/ix.cs)+1, int(h/ix.cs)+1
	ix.buckets = make([][]int, ix.nx*ix.ny)
	for i := range xs {
		b := ix.bucket(xs[i], ys[i])
		ix.buckets[b] = append(ix.buckets[b], i)
	}
	return ix
}

func (ix *nearIndex) cell(x, y float64) (int, int) {
	i := int(math.Floor((x - ix.x0) / ix.cs))
	j := int(math.Floor((y - ix.y0) / ix.cs))
	return min(max(i, 0), ix.nx-1), min(max(j, 0), ix.ny-1)
}

func (ix *nearIndex) bucket(x, y float64) int {
	i, j := ix.cell(x, y)
	return j*ix.nx + i
}

// maxNearest bounds k in nearest.
const maxNearest = 8

// nearest returns the k nearest readings to (x, y), nearest first, with
// their distances; fewer when there are fewer readings. It panics if k >
// maxNearest (a caller's bug).
func (ix *nearIndex) nearest(x, y float64, k int) (idx []int, dist []float64) {
	var bi [maxNearest]int
	var bd [maxNearest]float64
	n := ix.nearestInto(x, y, k, &bi, &bd)
	return append([]int(nil), bi[:n]...), append([]float64(nil), bd[:n]...)
}

// nearestInto is nearest writing into bi and bd; it returns the count.
func (ix *nearIndex) nearestInto(x, y float64, k int, bi *[maxNearest]int, bd *[maxNearest]float64) int {
	if k > maxNearest {
		panic("analysis: nearest with k > maxNearest")
	}
	k = min(k, len(ix.xs))
	if k <= 0 || math.IsNaN(x) || math.IsNaN(y) {
		return 0
	}
	n := 0
	ci, cj := ix.cell(x, y)
	for r := 0; ; r++ {
		for j := cj - r; j <= cj+r; j++ {
			for i := ci - r; i <= ci+r; i++ {
				if max(abs(i-ci), abs(j-cj)) != r || i < 0 || j < 0 || i >= ix.nx || j >= ix.ny {
					continue
				}
				for _, p := range ix.buckets[j*ix.nx+i] {
					n = insertBest(bi[:], bd[:], n, k, p, math.Hypot(ix.xs[p]-x, ix.ys[p]-y))
				}
			}
		}
		// Every reading outside the rings searched so far is at least r
		// bucket widths away from the query; strictly nearer ones settle
		// the order, ties by index included.
		if n == k && bd[k-1] < float64(r)*ix.cs || r > ix.nx+ix.ny {
			break
		}
	}
	return n
}

// NearIndex finds the reading nearest a point through a uniform bucket
// grid with about two readings per bucket; a query costs a few buckets
// whatever the survey's size, so the terminal UI's readout uses it on every
// frame.
type NearIndex struct{ ix *nearIndex }

// NewNearIndex indexes the points (xs[i], ys[i]). It keeps the slices.
func NewNearIndex(xs, ys []float64) *NearIndex { return &NearIndex{newNearIndex(xs, ys)} }

// Nearest returns the index of the point nearest (x, y) and its distance
// (of points at the same distance, the first); -1 and +Inf without points
// or for a NaN position.
func (n *NearIndex) Nearest(x, y float64) (int, float64) {
	var bi [maxNearest]int
	var bd [maxNearest]float64
	if n.ix.nearestInto(x, y, 1, &bi, &bd) == 0 {
		return -1, math.Inf(1)
	}
	return bi[0], bd[0]
}

// insertBest inserts (p, d) into the n best entries, sorted by distance
// and, at equal distance, by index, keeping at most k; it returns the new
// count.
func insertBest(bi []int, bd []float64, n, k, p int, d float64) int {
	if n == k && !before(d, p, bd[k-1], bi[k-1]) {
		return n
	}
	if n < k {
		n++
	}
	m := n - 1
	for m > 0 && before(d, p, bd[m-1], bi[m-1]) {
		bi[m], bd[m] = bi[m-1], bd[m-1]
		m--
	}
	bi[m], bd[m] = p, d
	return n
}

// before reports whether (d, p) sorts before (e, q): nearer, or as near
// with a smaller index.
func before(d float64, p int, e float64, q int) bool {
	return d < e || d == e && p < q
}

func abs(a int) int {
	if a < 0 {
		return -a
	}
	return a
}

// typicalSpacing returns the median distance from each reading to its
// nearest neighbour (0 with fewer than two readings).
func typicalSpacing(ix *nearIndex) float64 {
	if len(ix.xs) < 2 {
		return 0
	}
	ds := make([]float64, len(ix.xs))
	for i := range ix.xs {
		_, d := ix.nearest(ix.xs[i], ix.ys[i], 2)
		ds[i] = d[len(d)-1]
	}
	sort.Float64s(ds)
	return ds[len(ds)/2]
}
