package contour

import (
	"math"

	"isofield/interp"
)

// Components labels the 8-connected regions of flagged nodes on an nx × ny
// grid (flag k for node (k%nx, k/nx)). labels[k] is the region of node k,
// numbered from 0 in order of each region's first node, or -1 for nodes not
// flagged; n is the number of regions. It panics if len(flagged) != nx*ny.
func Components(nx, ny int, flagged []bool) (labels []int, n int) {
	if len(flagged) != nx*ny {
		panic("contour: Components with len(flagged) != nx*ny")
	}
	labels = make([]int, len(flagged))
	for k := range labels {
		labels[k] = -1
	}
	var stack []int
	for k, f := range flagged {
		if !f || labels[k] >= 0 {
			continue
		}
		labels[k] = n
		stack = append(stack[:0], k)
		for len(stack) > 0 {
			c := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			ci, cj := c%nx, c/nx
			for dj := -1; dj <= 1; dj++ {
				for di := -1; di <= 1; di++ {
					i, j := ci+di, cj+dj
					if i < 0 || j < 0 || i >= nx || j >= ny {
						continue
					}
					if m := j*nx + i; flagged[m] && labels[m] < 0 {
						labels[m] = n
						stack = append(stack, m)
					}
				}
			}
		}
		n++
	}
	return labels, n
}

// boundary edge directions, counter-clockwise from east.
const (
	east = iota
	north
	west
	south
)

// bedge is a directed boundary edge between cell-corner vertices, with the
// region on its left.
type bedge struct{ from, to, dir int }

// Outline returns the boundary of the region made of the given nodes of g,
// each node standing for the DX × DY cell centred on it: the outer ring
// counter-clockwise and any holes clockwise, each closed and without
// collinear middle points. Where two nodes of the region touch only at a
// corner, the outer ring passes through that corner once in each direction
// (a weakly simple polygon), which keeps an 8-connected region one polygon.
// It returns nil for no nodes. It panics if a node index is outside g.
func Outline(g *interp.Grid, nodes []int) (outer []Point, holes [][]Point) {
	in := make(map[int]bool, len(nodes))
	for _, k := range nodes {
		if k < 0 || k >= g.Len() {
			panic("contour: Outline with a node outside the grid")
		}
		in[k] = true
	}
	edges, from := boundaryEdges(g, nodes, in)
	used := make([]bool, len(edges))
	bestArea := math.Inf(-1)
	for s := range edges {
		if used[s] {
			continue
		}
		ring := traceRing(g, edges, from, used, s)
		a := RingArea(ring)
		switch {
		case a < 0:
			holes = append(holes, ring)
		case a > bestArea:
			if outer != nil {
				holes = append(holes, outer)
			}
			outer, bestArea = ring, a
		default:
			holes = append(holes, ring)
		}
	}
	return outer, holes
}

// boundaryEdges lists the directed edges of the region's node cells that
// border a cell outside it, and indexes them by start vertex. Vertex (a, b)
// is the corner at (X0 + (a-½)DX, Y0 + (b-½)DY), keyed b*(NX+1)+a.
func boundaryEdges(g *interp.Grid, nodes []int, in map[int]bool) ([]bedge, map[int][]int) {
	nx, ny := g.NX, g.NY
	vk := func(a, b int) int { return b*(nx+1) + a }
	has := func(i, j int) bool { return i >= 0 && j >= 0 && i < nx && j < ny && in[j*nx+i] }
	var edges []bedge
	from := make(map[int][]int)
	add := func(fa, fb, ta, tb, dir int) {
		from[vk(fa, fb)] = append(from[vk(fa, fb)], len(edges))
		edges = append(edges, bedge{vk(fa, fb), vk(ta, tb), dir})
	}
	for _, k := range nodes {
		i, j := k%nx, k/nx
		if !has(i, j-1) {
			add(i, j, i+1, j, east)
		}
		if !has(i+1, j) {
			add(i+1, j, i+1, j+1, north)
		}
		if !has(i, j+1) {
			add(i+1, j+1, i, j+1, west)
		}
		if !has(i-1, j) {
			add(i, j+1, i, j, south)
		}
	}
	return edges, from
}

// traceRing follows unused boundary edges from edge s back to its start,
// turning right first at a pinch vertex, and returns the closed ring of its
// corner points.
func traceRing(g *interp.Grid, edges []bedge, from map[int][]int, used []bool, s int) []Point {
	var verts []int
	var dirs []int
	e := s
	for !used[e] {
		used[e] = true
		verts = append(verts, edges[e].from)
		dirs = append(dirs, edges[e].dir)
		next := -1
		for _, turn := range [3]int{3, 0, 1} { // right, straight, left
			want := (edges[e].dir + turn) % 4
			for _, c := range from[edges[e].to] {
				if !used[c] && edges[c].dir == want {
					next = c
					break
				}
			}
			if next >= 0 {
				break
			}
		}
		if next < 0 {
			break
		}
		e = next
	}
	ring := make([]Point, 0, len(verts)+1)
	for n, v := range verts {
		if n > 0 && dirs[n] == dirs[n-1] {
			continue // collinear middle point
		}
		if n == 0 && dirs[0] == dirs[len(dirs)-1] && len(dirs) > 1 {
			continue
		}
		ring = append(ring, vertexPoint(g, v))
	}
	return append(ring, ring[0])
}

func vertexPoint(g *interp.Grid, v int) Point {
	a, b := v%(g.NX+1), v/(g.NX+1)
	return Point{g.X0 + (float64(a)-0.5)*g.DX, g.Y0 + (float64(b)-0.5)*g.DY}
}

// RingArea returns the signed area of a closed ring (positive when
// counter-clockwise), by the shoelace formula.
func RingArea(r []Point) float64 {
	var s float64
	for n := 0; n+1 < len(r); n++ {
		s += r[n].X*r[n+1].Y - r[n+1].X*r[n].Y
	}
	return s / 2
}
