package qa

import (
	"math"
	"sort"

	"gonum.org/v1/gonum/spatial/kdtree"
)

// Neighbours of a spot when telling a lone spike from a feature: its
// kNeighbours nearest spots (the ring of nearest readings, 4 to 8 on a
// square grid), as long as they lie within neighbourReach times the
// survey's typical spacing (the median distance from a spot to its nearest
// one): a base station set apart from the grid has no neighbours. Both
// numbers are common practice, not published values.
const (
	kNeighbours    = 6
	neighbourReach = 2.5
)

// place is a spot's position in a k-d tree, remembering its index.
type place struct {
	x, y float64
	k    int
}

func (p place) Compare(c kdtree.Comparable, d kdtree.Dim) float64 {
	q := c.(place)
	if d == 0 {
		return p.x - q.x
	}
	return p.y - q.y
}

func (p place) Dims() int { return 2 }

func (p place) Distance(c kdtree.Comparable) float64 {
	q := c.(place)
	return dist2(p.x, p.y, q.x, q.y)
}

// places is a k-d tree's collection of spots.
type places []place

func (p places) Index(i int) kdtree.Comparable         { return p[i] }
func (p places) Len() int                              { return len(p) }
func (p places) Slice(start, end int) kdtree.Interface { return p[start:end] }
func (p places) Pivot(d kdtree.Dim) int {
	pl := plane{p, d}
	return kdtree.Partition(pl, kdtree.MedianOfRandoms(pl, 100))
}

// plane sorts places along one dimension.
type plane struct {
	places
	d kdtree.Dim
}

func (p plane) Less(i, j int) bool {
	if p.d == 0 {
		return p.places[i].x < p.places[j].x
	}
	return p.places[i].y < p.places[j].y
}
func (p plane) Swap(i, j int) { p.places[i], p.places[j] = p.places[j], p.places[i] }
func (p plane) Slice(start, end int) kdtree.SortSlicer {
	return plane{p.places[start:end], p.d}
}

// neighbourIndex finds the nearest spots of a spot, caching the answers
// of nearest. Its searches use a bucket grid (grid.go), or gonum's k-d
// tree for layouts no grid divides evenly; both give the same answers.
type neighbourIndex struct {
	spots []spot
	grid  *spotGrid     // nil when the tree is used
	tree  *kdtree.Tree  // nil when the grid is used
	memo  map[int][]int // the answers of nearest
	dist  map[int][]float64
	reach float64   // squared distance limit
	h2    float64   // squared typical spacing
	nn2   []float64 // squared distance of each spot to its nearest
}

func newNeighbourIndex(spots []spot) *neighbourIndex {
	return newNeighbourIndexWith(spots, newSpotGrid(spots))
}

// newNeighbourIndexWith is newNeighbourIndex searching with the given
// grid, or with a k-d tree when grid is nil.
func newNeighbourIndexWith(spots []spot, grid *spotGrid) *neighbourIndex {
	n := &neighbourIndex{spots: spots, grid: grid, memo: map[int][]int{}, dist: map[int][]float64{}}
	if grid == nil {
		ps := make(places, len(spots))
		for k, s := range spots {
			ps[k] = place{s.x, s.y, k}
		}
		n.tree = kdtree.New(ps, false)
	}
	n.nn2 = n.nearestDistances()
	if len(n.nn2) > 0 {
		n.h2 = median(append([]float64(nil), n.nn2...))
	}
	n.reach = neighbourReach * neighbourReach * n.h2
	return n
}

// nearestDistances returns each spot's squared distance to its nearest
// other spot (+Inf for a lone spot), using all cores.
func (n *neighbourIndex) nearestDistances() []float64 {
	d := make([]float64, len(n.spots))
	if n.grid != nil {
		forChunks(len(d), 2048, func(lo, hi int) {
			var b nearBuf
			for k := lo; k < hi; k++ {
				n.grid.nearest(&b, int32(k), n.spots[k].x, n.spots[k].y, 1)
				d[k] = math.Inf(1)
				if b.full() {
					d[k] = b.d2[0]
				}
			}
		})
		return d
	}
	forChunks(len(d), 2048, func(lo, hi int) {
		keep := kdtree.NewNKeeper(2)
		for k := lo; k < hi; k++ {
			keep.Heap = keep.Heap[:1]
			keep.Heap[0] = kdtree.ComparableDist{Dist: math.Inf(1)}
			n.tree.NearestSet(keep, place{n.spots[k].x, n.spots[k].y, k})
			d[k] = math.Inf(1)
			for _, c := range keep.Heap {
				if c.Comparable != nil && c.Comparable.(place).k != k {
					d[k] = math.Min(d[k], c.Dist)
				}
			}
		}
	})
	return d
}

// nearest returns the indexes of the kNeighbours spots nearest to spot k,
// not counting k itself, nearest first, and their squared distances. It
// caches its answers and is not safe for concurrent use.
func (n *neighbourIndex) nearest(k int) ([]int, []float64) {
	if nb, ok := n.memo[k]; ok {
		return nb, n.dist[k]
	}
	nb, d2 := n.nearestN(k, kNeighbours)
	n.memo[k], n.dist[k] = nb, d2
	return nb, d2
}

// of returns the nearest spots of spot k that lie within reach.
func (n *neighbourIndex) of(k int) []int {
	nb, d2 := n.nearest(k)
	m := 0
	for m < len(nb) && d2[m] <= n.reach {
		m++
	}
	return nb[:m]
}

// gapFactor is (d/h)², at least 1, for spot k whose nearest other spot
// lies at d, h being the typical spacing (the median of d over the spots):
// how much larger than usual an interpolation error is to be expected
// there, the error of a thin-plate spline on smooth data growing about
// with the square of the distance to the data (Wendland, Scattered Data
// Approximation (2005), ch. 11; from memory).
func (n *neighbourIndex) gapFactor(k int) float64 {
	if n.h2 <= 0 || math.IsInf(n.h2, 0) || math.IsInf(n.nn2[k], 0) {
		return 1
	}
	return max(1, n.nn2[k]/n.h2)
}

// nearestN returns the indexes of the m spots nearest to spot k, not
// counting k itself, nearest first, and their squared distances. Spots at
// equal distances come in index order, so that the answer is the same on
// every run and with either search. It is safe for concurrent use.
func (n *neighbourIndex) nearestN(k, m int) ([]int, []float64) {
	if n.grid == nil {
		return n.treeNearestN(k, m)
	}
	var b nearBuf
	n.grid.nearest(&b, int32(k), n.spots[k].x, n.spots[k].y, m)
	nb, d2 := make([]int, len(b.k)), make([]float64, len(b.k))
	for i, j := range b.k {
		nb[i], d2[i] = int(j), b.d2[i]
	}
	return nb, d2
}

// treeNearestN is nearestN with the k-d tree. gonum's tree picks its
// pivots at random, and which of several equally distant spots a bounded
// search keeps depends on the tree. The search therefore runs twice: once
// for the distance of the m-th nearest, once for every spot within that
// distance.
func (n *neighbourIndex) treeNearestN(k, m int) ([]int, []float64) {
	q := place{n.spots[k].x, n.spots[k].y, k}
	keep := kdtree.NewNKeeper(m + 1)
	n.tree.NearestSet(keep, q)
	r := 0.0
	for _, c := range keep.Heap {
		if c.Comparable != nil {
			r = math.Max(r, c.Dist)
		}
	}
	within := kdtree.NewDistKeeper(r)
	n.tree.NearestSet(within, q)
	var found []kdtree.ComparableDist
	for _, c := range within.Heap {
		if c.Comparable != nil && c.Comparable.(place).k != k {
			found = append(found, c)
		}
	}
	sort.Slice(found, func(a, b int) bool {
		if found[a].Dist != found[b].Dist {
			return found[a].Dist < found[b].Dist
		}
		return found[a].Comparable.(place).k < found[b].Comparable.(place).k
	})
	found = found[:min(m, len(found))]
	nb, d2 := make([]int, len(found)), make([]float64, len(found))
	for i, c := range found {
		nb[i], d2[i] = c.Comparable.(place).k, c.Dist
	}
	return nb, d2
}
