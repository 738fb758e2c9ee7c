package contour

import "isofield/interp"

// edgePoint returns where level crosses edge e, by linear interpolation
// between the edge's two nodes (which lie on opposite sides of the level).
func edgePoint(g *interp.Grid, e int, level float64) Point {
	n := e / 2
	i, j := n%g.NX, n/g.NX
	x, y := g.Node(i, j)
	m := n + 1
	if e%2 == 1 {
		m = n + g.NX
	}
	va, vb := g.V[n], g.V[m]
	t := 0.5
	if vb != va {
		t = (level - va) / (vb - va)
	}
	if e%2 == 0 {
		return Point{x + t*g.DX, y}
	}
	return Point{x, y + t*g.DY}
}

// chain joins one level's segments into polylines. Each crossed edge is
// shared by at most two cells, so every edge has at most two segments and
// the segments form simple paths and cycles. Paths (open lines) are walked
// from their free ends first, then the remaining cycles (closed lines).
func chain(g *interp.Grid, level float64, segs []seg) []Line {
	if len(segs) == 0 {
		return nil
	}
	at := make(map[int][2]int32, 2*len(segs))
	for s, sg := range segs {
		for _, e := range [2]int{sg.a, sg.b} {
			p, ok := at[e]
			if !ok {
				p = [2]int32{-1, -1}
			}
			if p[0] < 0 {
				p[0] = int32(s)
			} else {
				p[1] = int32(s)
			}
			at[e] = p
		}
	}
	used := make([]bool, len(segs))
	var lines []Line
	for s, sg := range segs {
		for _, e := range [2]int{sg.a, sg.b} {
			if !used[s] && at[e][1] < 0 {
				lines = append(lines, walk(g, level, segs, at, used, s, e))
			}
		}
	}
	for s, sg := range segs {
		if !used[s] {
			lines = append(lines, walk(g, level, segs, at, used, s, sg.a))
		}
	}
	return lines
}

// walk follows segments from segment s, entering at edge e, until the path
// ends or returns to its start.
func walk(g *interp.Grid, level float64, segs []seg, at map[int][2]int32, used []bool, s, e int) Line {
	ln := Line{Level: level, Zero: level == 0}
	start := e
	ln.Points = append(ln.Points, edgePoint(g, e, level))
	for {
		used[s] = true
		if segs[s].a == e {
			e = segs[s].b
		} else {
			e = segs[s].a
		}
		ln.Points = append(ln.Points, edgePoint(g, e, level))
		if e == start {
			ln.Closed = true
			return ln
		}
		p := at[e]
		next := int(p[0])
		if next == s {
			next = int(p[1])
		}
		if next < 0 || used[next] {
			return ln
		}
		s = next
	}
}
