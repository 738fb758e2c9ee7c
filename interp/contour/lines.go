package contour

import (
	"context"
	"runtime"
	"sync"

	"isofield/interp"
)

// Point is a position in the grid's coordinates.
type Point struct{ X, Y float64 }

// Line is one equipotential polyline.
type Line struct {
	Level float64
	// Zero is true for the zero line of a signed survey (Level == 0).
	Zero bool
	// Closed is true when the line returns to its start; then the last
	// point repeats the first. Open lines end at the grid's edge or at a
	// masked node.
	Closed bool
	Points []Point
}

// seg is one marching-squares segment between two crossed grid edges,
// named by edge ids: 2*node for the edge from node (i, j) to (i+1, j), and
// 2*node+1 for the edge from (i, j) to (i, j+1).
type seg struct{ a, b int }

// cellEdges returns the ids of cell (i, j)'s bottom, right, top and left
// edges, in the order the segment table uses.
func cellEdges(g *interp.Grid, i, j int) [4]int {
	n := g.Index(i, j)
	return [4]int{2 * n, 2*(n+1) + 1, 2 * (n + g.NX), 2*n + 1}
}

// caseSegs lists, for each marching-squares case (bit n set when corner n,
// counted counter-clockwise from the south-west, is >= the level), the
// pairs of cell edges (0 bottom, 1 right, 2 top, 3 left) joined. Saddle
// cases 5 and 10 are handled apart.
var caseSegs = [16][][2]int{
	{}, {{3, 0}}, {{0, 1}}, {{3, 1}}, {{1, 2}}, nil, {{0, 2}}, {{3, 2}},
	{{2, 3}}, {{0, 2}}, nil, {{1, 2}}, {{1, 3}}, {{0, 1}}, {{3, 0}}, {},
}

// cellSegs appends the segments of one cell for one level.
func cellSegs(dst []seg, c [4]float64, e [4]int, level float64) []seg {
	idx := 0
	for n := range c {
		if c[n] >= level {
			idx |= 1 << n
		}
	}
	pairs := caseSegs[idx]
	if idx == 5 || idx == 10 {
		highCentre := (c[0]+c[1]+c[2]+c[3])/4 >= level
		// Cut off the corners that the centre does not join: the low ones
		// when the centre is high, else the high ones.
		cutSW := (idx == 5) != highCentre // corners 0 and 2 are cut off
		if cutSW {
			pairs = [][2]int{{3, 0}, {1, 2}}
		} else {
			pairs = [][2]int{{0, 1}, {2, 3}}
		}
	}
	for _, p := range pairs {
		dst = append(dst, seg{e[p[0]], e[p[1]]})
	}
	return dst
}

// Lines returns the equipotential polylines of g at the given increasing
// levels, by marching squares with the centre-value saddle rule (see the
// package doc). Segments are joined across cells into polylines; lines of
// one level come in a deterministic order. Work is spread over all cores;
// ctx is checked between rows.
func Lines(ctx context.Context, g *interp.Grid, levels []float64) ([]Line, error) {
	perLevel, err := collect(ctx, g, levels)
	if err != nil {
		return nil, err
	}
	out := make([][]Line, len(levels))
	var wg sync.WaitGroup
	sem := make(chan struct{}, runtime.GOMAXPROCS(0))
	for li := range levels {
		wg.Add(1)
		sem <- struct{}{}
		go func() {
			defer wg.Done()
			out[li] = chain(g, levels[li], perLevel[li])
			<-sem
		}()
	}
	wg.Wait()
	var all []Line
	for _, ls := range out {
		all = append(all, ls...)
	}
	return all, nil
}

// collect runs marching squares over all cells, rows split among workers,
// and returns the segments of each level in row order.
func collect(ctx context.Context, g *interp.Grid, levels []float64) ([][]seg, error) {
	rows := g.NY - 1
	if rows < 1 || g.NX < 2 || len(levels) == 0 {
		return make([][]seg, len(levels)), nil
	}
	w := min(runtime.GOMAXPROCS(0), rows)
	parts := make([][][]seg, w)
	errs := make([]error, w)
	var wg sync.WaitGroup
	for p := range w {
		wg.Add(1)
		go func() {
			defer wg.Done()
			parts[p], errs[p] = collectRows(ctx, g, levels, p*rows/w, (p+1)*rows/w)
		}()
	}
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return nil, err
		}
	}
	merged := make([][]seg, len(levels))
	for li := range levels {
		for _, part := range parts {
			merged[li] = append(merged[li], part[li]...)
		}
	}
	return merged, nil
}

// collectRows runs marching squares over cell rows [j0, j1).
func collectRows(ctx context.Context, g *interp.Grid, levels []float64, j0, j1 int) ([][]seg, error) {
	segs := make([][]seg, len(levels))
	for j := j0; j < j1; j++ {
		if err := ctx.Err(); err != nil {
			return nil, err
		}
		for i := 0; i < g.NX-1; i++ {
			c, ok := cellCorners(g, i, j)
			if !ok {
				continue
			}
			lo := min(c[0], c[1], c[2], c[3])
			hi := max(c[0], c[1], c[2], c[3])
			// Levels in (lo, hi] cross the cell: some corner is below,
			// some at or above.
			b0, b1 := Band(lo, levels), Band(hi, levels)
			if b0 == b1 {
				continue
			}
			e := cellEdges(g, i, j)
			for li := b0; li < b1; li++ {
				segs[li] = cellSegs(segs[li], c, e, levels[li])
			}
		}
	}
	return segs, nil
}
