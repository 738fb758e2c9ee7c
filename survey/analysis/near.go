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
	if k > maxNearest {
		panic("analysis: nearest with k > maxNearest")
	}
	k = min(k, len(ix.xs))
	if k <= 0 {
		return nil, nil
	}
	var bi [maxNearest]int
	var bd [maxNearest]float64
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
		// bucket widths away from the query.
		if n == k && bd[k-1] <= float64(r)*ix.cs || r > ix.nx+ix.ny {
			break
		}
	}
	return append([]int(nil), bi[:n]...), append([]float64(nil), bd[:n]...)
}

// insertBest inserts (p, d) into the n sorted best entries, keeping at most
// k, and returns the new count.
func insertBest(bi []int, bd []float64, n, k, p int, d float64) int {
	if n == k && d >= bd[k-1] {
		return n
	}
	if n < k {
		n++
	}
	m := n - 1
	for m > 0 && bd[m-1] > d {
		bi[m], bd[m] = bi[m-1], bd[m-1]
		m--
	}
	bi[m], bd[m] = p, d
	return n
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
