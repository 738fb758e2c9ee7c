package tui

import (
	"math"

	"isofield/survey"
)

// nearIndex finds the reading nearest a point through a uniform bucket
// grid with about two readings per bucket, so that the readout stays cheap
// on surveys of a million readings (it runs on every frame).
type nearIndex struct {
	x0, y0, cell float64
	nx, ny       int
	start        []int32 // bucket b holds order[start[b]:start[b+1]]
	order        []int32
	rs           []survey.Reading
}

func newNearIndex(rs []survey.Reading) *nearIndex {
	ix := &nearIndex{rs: rs}
	if len(rs) == 0 {
		return ix
	}
	s := survey.Survey{Readings: rs}
	xmin, ymin, xmax, ymax := s.Extent()
	w, h := max(xmax-xmin, 1e-9), max(ymax-ymin, 1e-9)
	ix.cell = max(math.Sqrt(w*h*2/float64(len(rs))), max(w, h)/4096)
	ix.x0, ix.y0 = xmin, ymin
	ix.nx, ix.ny = int(w/ix.cell)+1, int(h/ix.cell)+1
	ix.start = make([]int32, ix.nx*ix.ny+1)
	for _, r := range rs {
		ix.start[ix.bucket(r.X, r.Y)+1]++
	}
	for b := 1; b < len(ix.start); b++ {
		ix.start[b] += ix.start[b-1]
	}
	fill := append([]int32(nil), ix.start[:len(ix.start)-1]...)
	ix.order = make([]int32, len(rs))
	for i, r := range rs {
		b := ix.bucket(r.X, r.Y)
		ix.order[fill[b]] = int32(i)
		fill[b]++
	}
	return ix
}

func (ix *nearIndex) coords(x, y float64) (int, int) {
	i := min(max(int((x-ix.x0)/ix.cell), 0), ix.nx-1)
	j := min(max(int((y-ix.y0)/ix.cell), 0), ix.ny-1)
	return i, j
}

func (ix *nearIndex) bucket(x, y float64) int {
	i, j := ix.coords(x, y)
	return j*ix.nx + i
}

// nearest returns the reading nearest (x, y) and its distance (-1, +Inf
// without readings); of readings at the same distance, the first. It searches rings of buckets outwards until the ring
// lies farther than the best reading found.
func (ix *nearIndex) nearest(x, y float64) (int, float64) {
	best, bd := -1, math.Inf(1)
	if len(ix.rs) == 0 || math.IsNaN(x) || math.IsNaN(y) {
		return best, bd
	}
	ci, cj := ix.coords(x, y)
	// A bucket of ring k (Chebyshev index distance k from the point's
	// clamped bucket) lies at least (k-1) cells from the point along one
	// axis, also when the point is outside the grid.
	for k := 0; k <= max(ix.nx, ix.ny); k++ {
		if best >= 0 && float64(k-1)*ix.cell > math.Sqrt(bd) {
			break
		}
		for j := cj - k; j <= cj+k; j++ {
			for i := ci - k; i <= ci+k; i++ {
				if i < 0 || j < 0 || i >= ix.nx || j >= ix.ny || (max(abs(i-ci), abs(j-cj)) != k) {
					continue
				}
				b := j*ix.nx + i
				for _, r := range ix.order[ix.start[b]:ix.start[b+1]] {
					p := ix.rs[r]
					if d := (p.X-x)*(p.X-x) + (p.Y-y)*(p.Y-y); d < bd || d == bd && int(r) < best {
						best, bd = int(r), d
					}
				}
			}
		}
	}
	return best, math.Sqrt(bd)
}

func abs(a int) int {
	if a < 0 {
		return -a
	}
	return a
}
