package qa

import (
	"fmt"
	"math"
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

// cell is a square of side RepeatDist used to find near positions.
type cell struct{ i, j int64 }

// group forms the repeat groups: readings sharing a non-empty id, or lying
// within RepeatDist of each other (unless RepeatDist is negative). Readings
// with no partner stay ungrouped (Group −1).
func (c *checker) group() {
	n := len(c.s.Readings)
	u := newUnionFind(n)
	if !c.set.IgnoreIDs {
		first := map[string]int{}
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

// joinNear unions readings within d metres, hashing positions into cells
// of side d so that only the 3 × 3 neighbouring cells are searched.
func (c *checker) joinNear(u unionFind, d float64) {
	head := make(map[cell]int32, len(c.s.Readings)) // last reading in each cell
	next := make([]int32, len(c.s.Readings))        // previous reading in the same cell
	d2 := d * d
	for i, rd := range c.s.Readings {
		if math.IsNaN(rd.X) || math.IsNaN(rd.Y) || math.IsInf(rd.X, 0) || math.IsInf(rd.Y, 0) {
			continue
		}
		k := cell{int64(math.Floor(rd.X / d)), int64(math.Floor(rd.Y / d))}
		for di := int64(-1); di <= 1; di++ {
			for dj := int64(-1); dj <= 1; dj++ {
				j, ok := head[cell{k.i + di, k.j + dj}]
				for ok && j >= 0 {
					o := c.s.Readings[j]
					if dx, dy := rd.X-o.X, rd.Y-o.Y; dx*dx+dy*dy <= d2 {
						u.union(i, int(j))
					}
					j = next[j]
				}
			}
		}
		prev, ok := head[k]
		if !ok {
			prev = -1
		}
		next[i], head[k] = prev, int32(i)
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
