package interp

import (
	"fmt"
	"math"
)

// mergeFraction sets the distance under which readings are merged before a
// fit: this fraction of the median nearest-neighbour spacing. Two readings
// that close differ only by measurement noise as far as any map at the
// survey's resolution can tell, while an interpolant forced through both
// must bend steeply between them and overshoots far beyond the data (an
// exact interpolant's gradient between them is their difference over
// their distance). Our choice; one per cent keeps every reading of a
// regular or line survey apart.
const mergeFraction = 0.01

// collinearTol bounds the ratio of the smaller to the larger principal
// variance of the scaled points below which they count as one line.
const collinearTol = 1e-12

// dataset is the readings ready for fitting: merged, centred and scaled.
type dataset struct {
	x, y, v  []float64 // merged readings, scaled coordinates
	cx, cy   float64   // centre subtracted before scaling
	s        float64   // scale: the largest half-extent
	group    []int32   // input reading index → merged reading index
	orig     []float64 // input values, in input order
	merged   int       // input readings absorbed into another
	h        float64   // mean spacing sqrt(area/N) in scaled coordinates
	warnings []string
}

// prepare validates, merges and scales the readings. It panics if the
// slices differ in length.
func prepare(xs, ys, vs []float64) (*dataset, error) {
	if len(xs) != len(ys) || len(xs) != len(vs) {
		panic(fmt.Sprintf("interp: Fit with %d x, %d y and %d values", len(xs), len(ys), len(vs)))
	}
	for i := range xs {
		if !finite(xs[i]) || !finite(ys[i]) || !finite(vs[i]) {
			return nil, fmt.Errorf("reading %d (%g, %g, %g): %w", i, xs[i], ys[i], vs[i], ErrNonFinite)
		}
	}
	if len(xs) < 3 {
		return nil, fmt.Errorf("%d readings, need at least 3: %w", len(xs), ErrTooFew)
	}
	d := &dataset{orig: append([]float64(nil), vs...)}
	d.merge(xs, ys, vs)
	if n := len(d.x); n < 3 {
		return nil, fmt.Errorf("%d distinct positions, need at least 3: %w", n, ErrTooFew)
	}
	d.scale()
	if err := d.checkCollinear(); err != nil {
		return nil, err
	}
	return d, nil
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// merge groups readings closer than mergeFraction of the median
// nearest-neighbour spacing and replaces each group by its mean position
// and mean value, recording the mapping in d.group. Merged readings keep
// input order of each group's leading reading.
func (d *dataset) merge(xs, ys, vs []float64) {
	n := len(xs)
	ix := newPointIndex(xs, ys, 2)
	tol := mergeFraction * medianNN(ix)
	leader := make([]int32, n)
	for i := range leader {
		leader[i] = -1
	}
	// Most readings have no other within tol; finding them is independent
	// per reading and runs on all cores. Only the others need the ordered
	// pass below, whose outcome depends on the order of visits.
	alone := make([]bool, n)
	parallelRange(n, func(lo, hi int) {
		var buf []int32
		for i := lo; i < hi; i++ {
			buf = ix.within(buf[:0], xs[i], ys[i], tol)
			alone[i] = len(buf) <= 1
		}
	})
	var buf []int32
	for _, i := range ix.idx { // cell order, for memory locality
		if leader[i] >= 0 {
			continue
		}
		leader[i] = i
		if alone[i] {
			continue // no reading within tol, so none to claim
		}
		buf = ix.within(buf[:0], xs[i], ys[i], tol)
		for _, j := range buf {
			if leader[j] < 0 {
				leader[j] = i
			}
		}
	}
	d.group = make([]int32, n)
	var cnt []int
	for i := range leader {
		if leader[i] == int32(i) {
			d.group[i] = int32(len(d.x))
			d.x, d.y, d.v = append(d.x, 0), append(d.y, 0), append(d.v, 0)
			cnt = append(cnt, 0)
		}
	}
	lo := make([]float64, len(d.x))
	hi := make([]float64, len(d.x))
	for i := range leader {
		g := d.group[leader[i]]
		d.group[i] = g
		if cnt[g] == 0 {
			lo[g], hi[g] = vs[i], vs[i]
		}
		d.x[g], d.y[g], d.v[g] = d.x[g]+xs[i], d.y[g]+ys[i], d.v[g]+vs[i]
		lo[g], hi[g] = min(lo[g], vs[i]), max(hi[g], vs[i])
		cnt[g]++
	}
	var worst float64
	for g, c := range cnt {
		f := float64(c)
		d.x[g], d.y[g], d.v[g] = d.x[g]/f, d.y[g]/f, d.v[g]/f
		worst = max(worst, hi[g]-lo[g])
	}
	d.merged = n - len(d.x)
	if d.merged > 0 {
		d.warnings = append(d.warnings, fmt.Sprintf(
			"%d readings lay within %.3g of another (1%% of the median spacing) and were merged with it into their mean; the largest difference inside a merged group was %.4g",
			d.merged, tol, worst))
	}
}

// scale centres the merged coordinates on their mean and divides them by
// the largest half-extent, so that they lie in [-1, 1]² roughly.
func (d *dataset) scale() {
	n := float64(len(d.x))
	for i := range d.x {
		d.cx += d.x[i] / n
		d.cy += d.y[i] / n
	}
	xmin, ymin, xmax, ymax := bounds(d.x, d.y)
	d.s = max(xmax-xmin, ymax-ymin) / 2
	for i := range d.x {
		d.x[i] = (d.x[i] - d.cx) / d.s
		d.y[i] = (d.y[i] - d.cy) / d.s
	}
	area := max((xmax-xmin)*(ymax-ymin), 1e-6*d.s*d.s) / (d.s * d.s)
	d.h = math.Sqrt(area / n)
}

// checkCollinear returns ErrCollinear when the points' covariance is
// (numerically) of rank one: the linear polynomial is then undetermined.
func (d *dataset) checkCollinear() error {
	var mx, my float64
	n := float64(len(d.x))
	for i := range d.x {
		mx += d.x[i] / n
		my += d.y[i] / n
	}
	var sxx, syy, sxy float64
	for i := range d.x {
		dx, dy := d.x[i]-mx, d.y[i]-my
		sxx, syy, sxy = sxx+dx*dx, syy+dy*dy, sxy+dx*dy
	}
	tr, det := sxx+syy, sxx*syy-sxy*sxy
	disc := math.Sqrt(max(tr*tr/4-det, 0))
	big, small := tr/2+disc, tr/2-disc
	if big <= 0 || small <= collinearTol*big {
		return fmt.Errorf("%d distinct positions: %w", len(d.x), ErrCollinear)
	}
	return nil
}

// spatialOrder returns a copy of d with the merged readings in the cell
// order of a bucket grid (rows of cells, south to north), the group
// mapping renumbered to match, and that grid as an index of the reordered
// readings (about four per cell, as the partition of unity's layout
// wants). The partition of unity reads the readings of each patch many
// times over; in input order they lie scattered over memory (a million
// readings take 24 MB), in cell order a patch's readings lie in a few
// short runs. The fit is the same up to rounding.
func (d *dataset) spatialOrder() (*dataset, *pointIndex) {
	ix := newPointIndex(d.x, d.y, 4)
	nd := *d
	n := len(d.x)
	nd.x, nd.y = ix.sx, ix.sy
	nd.v = make([]float64, n)
	inv := make([]int32, n)
	for k, i := range ix.idx {
		nd.v[k] = d.v[i]
		inv[i] = int32(k)
	}
	nd.group = make([]int32, len(d.group))
	for i, g := range d.group {
		nd.group[i] = inv[g]
	}
	// The index now describes the reordered readings: reading k is the
	// k-th in cell order.
	ix.xs, ix.ys = nd.x, nd.y
	for k := range ix.idx {
		ix.idx[k] = int32(k)
	}
	return &nd, ix
}
