package qa

import (
	"math"

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
	spacingSample  = 1000 // spots sampled to estimate the typical spacing
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
	dx, dy := p.x-q.x, p.y-q.y
	return dx*dx + dy*dy
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

// neighbourIndex finds the nearest spots of a spot, caching the answers.
type neighbourIndex struct {
	tree  *kdtree.Tree
	spots []spot
	memo  map[int][]int
	reach float64 // squared distance limit
}

func newNeighbourIndex(spots []spot) *neighbourIndex {
	ps := make(places, len(spots))
	for k, s := range spots {
		ps[k] = place{s.x, s.y, k}
	}
	n := &neighbourIndex{tree: kdtree.New(ps, false), spots: spots, memo: map[int][]int{}}
	h := n.typicalSpacing()
	n.reach = neighbourReach * neighbourReach * h * h
	return n
}

// typicalSpacing is the median distance from a spot to its nearest other
// spot, over an evenly strided sample of the spots.
func (n *neighbourIndex) typicalSpacing() float64 {
	stride := max(1, len(n.spots)/spacingSample)
	var d []float64
	for k := 0; k < len(n.spots); k += stride {
		keep := kdtree.NewNKeeper(2)
		n.tree.NearestSet(keep, place{n.spots[k].x, n.spots[k].y, k})
		for _, c := range keep.Heap {
			if c.Comparable != nil && c.Comparable.(place).k != k {
				d = append(d, math.Sqrt(c.Dist))
			}
		}
	}
	if len(d) == 0 {
		return math.Inf(1)
	}
	return median(d)
}

// of returns the indexes of the kNeighbours spots nearest to spot k, not
// counting k itself.
func (n *neighbourIndex) of(k int) []int {
	if nb, ok := n.memo[k]; ok {
		return nb
	}
	keep := kdtree.NewNKeeper(kNeighbours + 1)
	n.tree.NearestSet(keep, place{n.spots[k].x, n.spots[k].y, k})
	var nb []int
	for _, c := range keep.Heap {
		if c.Comparable == nil {
			continue
		}
		if j := c.Comparable.(place).k; j != k && c.Dist <= n.reach {
			nb = append(nb, j)
		}
	}
	n.memo[k] = nb
	return nb
}
