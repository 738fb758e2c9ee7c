package qa

import (
	"cmp"
	"fmt"
	"math"
	"slices"
)

// unionFind is a disjoint-set forest over reading indexes.
type unionFind []int

func newUnionFind(n int) unionFind {
	u := make(unionFind, n)
	for i := range u {
		u[i] = i
	}
	return u
}

func (u unionFind) find(i int) int {
	for u[i] != i {
		u[i] = u[u[i]]
		i = u[i]
	}
	return i
}

// union joins the sets of i and j, keeping the smaller index as root so
// that roots are first members in input order.
func (u unionFind) union(i, j int) {
	a, b := u.find(i), u.find(j)
	if a == b {
		return
	}
	if a > b {
		a, b = b, a
	}
	u[b] = a
}

// group forms the repeat groups: readings sharing a non-empty id, or lying
// within RepeatDist of each other (unless RepeatDist is negative). Readings
// with no partner stay ungrouped (Group −1).
func (c *checker) group() {
	n := len(c.s.Readings)
	u := newUnionFind(n)
	if !c.set.IgnoreIDs {
		ids := 0
		for _, rd := range c.s.Readings {
			if rd.ID != "" {
				ids++
			}
		}
		first := make(map[string]int, ids)
		for i, rd := range c.s.Readings {
			if rd.ID == "" {
				continue
			}
			if j, ok := first[rd.ID]; ok {
				u.union(i, j)
			} else {
				first[rd.ID] = i
			}
		}
	}
	if d := c.set.RepeatDist; d > 0 {
		c.joinNear(u, d)
	}
	size := make([]int, n)
	for i := range n {
		size[u.find(i)]++
	}
	gi := make([]int, n) // group index of each root with partners
	for r := range n {
		gi[r] = -1
		if size[r] > 1 {
			gi[r] = len(c.res.Repeats)
			c.res.Repeats = append(c.res.Repeats, RepeatGroup{Members: make([]int, 0, size[r])})
		}
	}
	for i := range n {
		if g := gi[u.find(i)]; g >= 0 {
			c.res.Repeats[g].Members = append(c.res.Repeats[g].Members, i)
			c.res.Group[i] = g
		}
	}
	c.checkGroupPlaces()
}

// nearCell is a reading in its square cell of side RepeatDist, cells
// numbered by floor(x / d) and floor(y / d).
type nearCell struct {
	i, j int64
	r    int32 // the reading
}

// cmpCell orders cells by column, then row, then reading.
func cmpCell(a, b nearCell) int {
	switch {
	case a.i != b.i:
		return cmp.Compare(a.i, b.i)
	case a.j != b.j:
		return cmp.Compare(a.j, b.j)
	}
	return cmp.Compare(a.r, b.r)
}

// joinNear unions readings within d metres. Readings are put in square
// cells of side d, so that only readings in neighbouring cells need be
// compared: sorted by cell, each cell's readings are compared with one
// another and with those of the cells above it, and of the three cells of
// the next column beside and diagonal to it, each pair of neighbouring
// cells once. The groups do not depend on the order of the unions.
func (c *checker) joinNear(u unionFind, d float64) {
	cells := make([]nearCell, 0, len(c.s.Readings))
	for i, rd := range c.s.Readings {
		if math.IsNaN(rd.X) || math.IsNaN(rd.Y) || math.IsInf(rd.X, 0) || math.IsInf(rd.Y, 0) {
			continue
		}
		cells = append(cells, nearCell{int64(math.Floor(rd.X / d)), int64(math.Floor(rd.Y / d)), int32(i)})
	}
	slices.SortFunc(cells, cmpCell)
	d2 := d * d
	next := 0 // first entry of the next column at or after row j − 1
	for lo := 0; lo < len(cells); {
		a := cells[lo]
		hi := lo + 1
		for hi < len(cells) && cells[hi].i == a.i && cells[hi].j == a.j {
			hi++
		}
		c.joinWithin(u, d2, cells[lo:hi])
		if hi < len(cells) && cells[hi].i == a.i && cells[hi].j == up(a.j) {
			c.joinCells(u, d2, cells[lo:hi], cellRun(cells, hi))
		}
		if a.i == math.MaxInt64 {
			lo = hi
			continue
		}
		below := nearCell{i: a.i + 1, j: down(a.j), r: math.MinInt32}
		for next < len(cells) && cmpCell(cells[next], below) < 0 {
			next++
		}
		for k := next; k < len(cells) && cells[k].i == a.i+1 && cells[k].j <= up(a.j); {
			run := cellRun(cells, k)
			c.joinCells(u, d2, cells[lo:hi], run)
			k += len(run)
		}
		lo = hi
	}
}

// up and down are j + 1 and j − 1 within the int64 range: a position too
// far out for it has its cell at the range's end.
func up(j int64) int64 {
	if j == math.MaxInt64 {
		return j
	}
	return j + 1
}

func down(j int64) int64 {
	if j == math.MinInt64 {
		return j
	}
	return j - 1
}

// cellRun returns the entries of the cell of cells[k] from k on.
func cellRun(cells []nearCell, k int) []nearCell {
	e := k + 1
	for e < len(cells) && cells[e].i == cells[k].i && cells[e].j == cells[k].j {
		e++
	}
	return cells[k:e]
}

// joinWithin unions the readings of one cell's entries that lie within
// sqrt(d2) of each other.
func (c *checker) joinWithin(u unionFind, d2 float64, a []nearCell) {
	for p, e := range a {
		for _, f := range a[p+1:] {
			c.joinPair(u, d2, e, f)
		}
	}
}

// joinCells unions the readings of two cells' entries a and b that lie
// within sqrt(d2) of each other.
func (c *checker) joinCells(u unionFind, d2 float64, a, b []nearCell) {
	for _, e := range a {
		for _, f := range b {
			c.joinPair(u, d2, e, f)
		}
	}
}

// joinPair unions the readings of e and f if they lie within sqrt(d2).
func (c *checker) joinPair(u unionFind, d2 float64, e, f nearCell) {
	i, j := int(max(e.r, f.r)), int(min(e.r, f.r))
	ri, rj := &c.s.Readings[i], &c.s.Readings[j]
	if dx, dy := ri.X-rj.X, ri.Y-rj.Y; dx*dx+dy*dy <= d2 {
		u.union(i, j)
	}
}

// checkGroupPlaces notes groups whose members lie farther apart than the
// repeat distance: the same id used for different places.
func (c *checker) checkGroupPlaces() {
	far := 0
	for gi := range c.res.Repeats {
		g := &c.res.Repeats[gi]
		w := c.placeSpread(g.Members)
		if w <= math.Max(c.set.RepeatDist, 0)*2 {
			continue
		}
		far++
		text := fmt.Sprintf("same id read at places up to %.3g m apart", w)
		for _, m := range g.Members {
			c.note(m, text)
		}
	}
	if far > 0 {
		c.remark("%d repeat groups share an id across places farther apart than %.3g m; if ids restart in each file, group by position only (--repeat-by-position)",
			far, 2*math.Max(c.set.RepeatDist, 0))
	}
}

// placeSpread is the diagonal of the bounding box of the readings.
func (c *checker) placeSpread(idx []int) float64 {
	r0 := c.s.Readings[idx[0]]
	x0, x1, y0, y1 := r0.X, r0.X, r0.Y, r0.Y
	for _, i := range idx[1:] {
		r := c.s.Readings[i]
		x0, x1 = math.Min(x0, r.X), math.Max(x1, r.X)
		y0, y1 = math.Min(y0, r.Y), math.Max(y1, r.Y)
	}
	return math.Hypot(x1-x0, y1-y0)
}

// repeats averages agreeing groups and marks disagreeing ones suspect.
// Readings excluded by hand take no part.
func (c *checker) repeats() {
	tol := c.set.RepeatTol
	for gi := range c.res.Repeats {
		g := &c.res.Repeats[gi]
		live := c.live(g.Members)
		if len(live) == 0 {
			continue
		}
		lo, hi, sum := math.Inf(1), math.Inf(-1), 0.0
		for _, m := range live {
			v := c.res.Corrected[m]
			lo, hi, sum = math.Min(lo, v), math.Max(hi, v), sum+v
		}
		g.Mean, g.Spread = sum/float64(len(live)), hi-lo
		g.Agree = tol < 0 || g.Spread <= tol*(1+1e-9)
		if g.Agree {
			reason := fmt.Sprintf("repeat of %d readings, spread %.4g %s: group mean used", len(live), g.Spread, c.unit())
			for _, m := range live {
				c.setValue(m, g.Mean, KindRepeat, reason)
				if len(live) > 1 {
					c.note(m, reason)
				}
			}
			continue
		}
		reason := fmt.Sprintf("repeats disagree: spread %.4g %s > tolerance %.4g %s", g.Spread, c.unit(), tol, c.unit())
		for _, m := range live {
			c.setStatus(m, Suspect, KindDisagree, reason)
		}
	}
}

// live returns the members not excluded by hand.
func (c *checker) live(idx []int) []int {
	out := make([]int, 0, len(idx))
	for _, i := range idx {
		if !c.hand[i] {
			out = append(out, i)
		}
	}
	return out
}
