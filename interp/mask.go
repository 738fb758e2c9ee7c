package interp

import (
	"cmp"
	"math"
	"slices"
)

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

// hullTol is the rounding allowance of MaskOutsideHull, relative to the
// points' extent: a node on the outline stays unmasked with margin 0 even
// when the edge intersections round it a few ulps outside. Our choice:
// far above float64 rounding (1e-16) and far below any survey's precision.
const hullTol = 1e-9

// MaskOutsideHull sets g.Mask at every node farther than margin from the
// convex hull of the points (xs[i], ys[i]), that is outside the hull grown
// by margin; it never clears a mask entry. Nodes inside the hull are never
// masked by it, and so a concave survey outline (an L-shaped deck) keeps
// its notch: the hull bridges it. MaskFar, run as well, still blanks the
// nodes of a notch wider than its distance.
//
// The hull is built by Andrew's monotone chain (A. M. Andrew, "Another
// efficient algorithm for convex hulls in two dimensions", Inf. Process.
// Lett. 9 (1979) 216-219) in O(N log N), after Akl and Toussaint's
// throw-away of points that cannot be vertices. Each row then costs O(H)
// for its crossing with the hull of H vertices, plus, for each node tested
// outside the hull, the edges that come within margin of the row: the
// distance to a convex set is convex along a row, so the walk outwards
// from the hull stops at the first node beyond margin and masks the rest
// untested. Rows run on all cores and nothing is allocated per node.
//
// Duplicate points count once; one distinct point or collinear points give
// a hull that is a point or a segment, grown by margin like any other.
// Non-finite points are ignored. With no finite points, or margin negative
// or NaN, every node is masked; with margin +Inf none. It panics if
// len(xs) != len(ys).
func MaskOutsideHull(g *Grid, xs, ys []float64, margin float64) {
	if len(xs) != len(ys) {
		panic("interp: MaskOutsideHull with slices of different lengths")
	}
	if g.Mask == nil {
		g.Mask = make([]bool, g.Len())
	}
	if math.IsInf(margin, 1) {
		return
	}
	h := convexHull(xs, ys)
	if len(h) == 0 || !(margin >= 0) {
		for k := range g.Mask {
			g.Mask[k] = true
		}
		return
	}
	lim := margin + hullTol*h.extent()
	parallelRange(g.NY, func(lo, hi int) {
		near := make([]int, 0, len(h)) // one buffer per worker
		for j := lo; j < hi; j++ {
			maskRowOutside(g, h, j, lim, near)
		}
	})
}

// maskRowOutside masks the nodes of row j farther than lim from the hull.
// The nodes between the row's crossings with the hull are inside; from
// there it walks outwards both ways, measuring distances to the edges that
// come within lim of the row (listed in near, a buffer).
func maskRowOutside(g *Grid, h hull, j int, lim float64, near []int) {
	_, y := g.Node(0, j)
	a, b, cut := h.rowSpan(y)
	near = h.edgesNear(y, lim, near[:0])
	lim2 := lim * lim
	row := g.Mask[j*g.NX : (j+1)*g.NX]
	if !(g.DX > 0) {
		// Not a grid NewGrid makes: test every node.
		for i := range row {
			x := g.X0 + float64(i)*g.DX
			if !(cut && x >= a && x <= b) && h.dist2(x, y, near) > lim2 {
				row[i] = true
			}
		}
		return
	}
	// Nodes ia..ib lie within [a, b], clamped to -1..NX.
	nx := float64(g.NX)
	ia := int(min(max(math.Ceil((a-g.X0)/g.DX), -1), nx))
	ib := int(min(max(math.Floor((b-g.X0)/g.DX), -1), nx))
	if !cut {
		ib = ia - 1 // no node is inside: both walks test from x = a on
	}
	i := min(ia-1, g.NX-1)
	for ; i >= 0 && h.dist2(g.X0+float64(i)*g.DX, y, near) <= lim2; i-- {
	}
	for ; i >= 0; i-- {
		row[i] = true
	}
	i = max(ib+1, 0)
	for ; i < g.NX && h.dist2(g.X0+float64(i)*g.DX, y, near) <= lim2; i++ {
	}
	for ; i < g.NX; i++ {
		row[i] = true
	}
}

// hull is a convex polygon, counter-clockwise, without repeating its first
// vertex; one vertex is a point and two a segment.
type hull []point

type point struct{ x, y float64 }

// convexHull returns the convex hull of the finite points by Andrew's
// monotone chain, dropping duplicates and vertices on straight edges.
// Points strictly inside the polygon of the extreme points in the eight
// compass directions cannot be vertices and are dropped before sorting
// (the throw-away step of S. G. Akl and G. T. Toussaint, "A fast convex
// hull algorithm", Inf. Process. Lett. 7 (1978) 219-222, with eight
// directions instead of four): on scattered readings that is most of them.
func convexHull(xs, ys []float64) hull {
	oct, n := extremes(xs, ys)
	ps := make([]point, 0, n)
	for i := range xs {
		p := point{xs[i], ys[i]}
		if p.finite() && !strictlyInside(oct, p) {
			ps = append(ps, p)
		}
	}
	slices.SortFunc(ps, func(p, q point) int {
		if c := cmp.Compare(p.x, q.x); c != 0 {
			return c
		}
		return cmp.Compare(p.y, q.y)
	})
	ps = slices.Compact(ps)
	if len(ps) <= 2 {
		return hull(ps)
	}
	h := make(hull, 0, 2*len(ps))
	// Lower chain left to right, then upper chain right to left; a vertex
	// that does not turn left is popped.
	for _, p := range ps {
		for len(h) >= 2 && cross(h[len(h)-2], h[len(h)-1], p) <= 0 {
			h = h[:len(h)-1]
		}
		h = append(h, p)
	}
	lower := len(h) + 1
	for k := len(ps) - 2; k >= 0; k-- {
		p := ps[k]
		for len(h) >= lower && cross(h[len(h)-2], h[len(h)-1], p) <= 0 {
			h = h[:len(h)-1]
		}
		h = append(h, p)
	}
	return slices.Clip(h[:len(h)-1]) // the last is the first again
}

// extremes returns the finite points extreme towards the west, south-west,
// south, south-east, east, north-east, north and north-west, in that
// (counter-clockwise) order without repeats, and the number of finite
// points.
func extremes(xs, ys []float64) (oct []point, n int) {
	// The directions' unit-free vectors; a point is extreme when its dot
	// product with the direction is largest.
	dirs := [8]point{{-1, 0}, {-1, -1}, {0, -1}, {1, -1}, {1, 0}, {1, 1}, {0, 1}, {-1, 1}}
	var ext [8]point
	for i := range xs {
		p := point{xs[i], ys[i]}
		if !p.finite() {
			continue
		}
		for k, d := range dirs {
			if n == 0 || p.x*d.x+p.y*d.y > ext[k].x*d.x+ext[k].y*d.y {
				ext[k] = p
			}
		}
		n++
	}
	if n == 0 {
		return nil, 0
	}
	for _, p := range ext {
		if len(oct) == 0 || p != oct[len(oct)-1] {
			oct = append(oct, p)
		}
	}
	for len(oct) > 1 && oct[len(oct)-1] == oct[0] {
		oct = oct[:len(oct)-1]
	}
	return oct, n
}

// strictlyInside reports whether p lies strictly left of every edge of the
// closed polygon poly; such a point has winding number at least one, so it
// is inside the convex hull of poly's vertices, never on its boundary. It
// is false for polygons of fewer than three vertices.
func strictlyInside(poly []point, p point) bool {
	if len(poly) < 3 {
		return false
	}
	for k, a := range poly {
		if cross(a, poly[(k+1)%len(poly)], p) <= 0 {
			return false
		}
	}
	return true
}

func (p point) finite() bool { return finite(p.x) && finite(p.y) }

// cross is the z component of (b-a) × (c-a): positive when a, b, c turn
// left.
func cross(a, b, c point) float64 {
	return (b.x-a.x)*(c.y-a.y) - (b.y-a.y)*(c.x-a.x)
}

// extent returns the larger side of the hull's bounding box, at least 1.
func (h hull) extent() float64 {
	xmin, xmax, ymin, ymax := h[0].x, h[0].x, h[0].y, h[0].y
	for _, p := range h {
		xmin, xmax = min(xmin, p.x), max(xmax, p.x)
		ymin, ymax = min(ymin, p.y), max(ymax, p.y)
	}
	return max(xmax-xmin, ymax-ymin, 1)
}

// rowSpan returns where the line at height y crosses the hull, a <= b,
// and cut true. A line passing above or below it gets a = b = the x of
// the nearest vertex, where the distance along the line is least, and cut
// false.
func (h hull) rowSpan(y float64) (a, b float64, cut bool) {
	a, b = math.Inf(1), math.Inf(-1)
	lo, hi := h[0], h[0]
	for k, p := range h {
		q := h[(k+1)%len(h)]
		if p.y < lo.y {
			lo = p
		}
		if p.y > hi.y {
			hi = p
		}
		if min(p.y, q.y) > y || max(p.y, q.y) < y {
			continue
		}
		if p.y == q.y {
			a, b = min(a, p.x, q.x), max(b, p.x, q.x)
			continue
		}
		x := p.x + (y-p.y)*(q.x-p.x)/(q.y-p.y)
		a, b = min(a, x), max(b, x)
	}
	switch {
	case a <= b:
		return a, b, true
	case y > hi.y:
		return hi.x, hi.x, false
	}
	return lo.x, lo.x, false
}

// edgesNear appends to near the edges k (from vertex k to k+1) whose y
// range comes within lim of y, and returns it; a one-vertex hull has the
// edge 0 from its vertex to itself.
func (h hull) edgesNear(y, lim float64, near []int) []int {
	for k, p := range h {
		q := h[(k+1)%len(h)]
		if min(p.y, q.y) <= y+lim && max(p.y, q.y) >= y-lim {
			near = append(near, k)
		}
	}
	return near
}

// dist2 returns the squared distance from (x, y) to the nearest of the
// hull's edges listed in near (+Inf for none): the squared distance to the
// hull for a point outside it when near holds every edge within reach.
func (h hull) dist2(x, y float64, near []int) float64 {
	d := math.Inf(1)
	for _, k := range near {
		d = min(d, segDist2(h[k], h[(k+1)%len(h)], x, y))
	}
	return d
}

// segDist2 returns the squared distance from (x, y) to the segment pq.
func segDist2(p, q point, x, y float64) float64 {
	ex, ey := q.x-p.x, q.y-p.y
	wx, wy := x-p.x, y-p.y
	t := 0.0
	if l2 := ex*ex + ey*ey; l2 > 0 {
		t = min(max((wx*ex+wy*ey)/l2, 0), 1)
	}
	dx, dy := wx-t*ex, wy-t*ey
	return dx*dx + dy*dy
}
