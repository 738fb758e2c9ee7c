package interp

import (
	"context"
	"math"
	"runtime"
	"sync"
	"sync/atomic"
)

// rowEvaluator is the fast path Evaluate uses when the interpolant offers
// it: fill one grid row at height y, nodes x0 + i*dx, skipping nodes whose
// mask entry is true (mask may be nil). Implementations may reuse lookups
// along the row and must not allocate per node.
type rowEvaluator interface {
	evalRow(y, x0, dx float64, v, gx, gy []float64, mask []bool)
}

// Evaluate fills g.V, g.GX and g.GY from f at every node not masked, using
// all cores, row by row. It honours ctx between rows (returning ctx.Err()
// with the grid partly filled) and reports progress in rows done out of
// g.NY, from any goroutine; progress may be nil. Masked nodes get NaN. It
// panics if the grid's slices are shorter than NX*NY (a caller's bug).
func Evaluate(ctx context.Context, f Interpolant, g *Grid, progress func(done, total int)) error {
	n := g.Len()
	if len(g.V) < n || len(g.GX) < n || len(g.GY) < n || (g.Mask != nil && len(g.Mask) < n) {
		panic("interp: Evaluate on a grid with slices shorter than NX*NY")
	}
	row := rowFunc(f)
	var next, done atomic.Int64
	var wg sync.WaitGroup
	workers := min(runtime.GOMAXPROCS(0), g.NY)
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for ctx.Err() == nil {
				j := int(next.Add(1) - 1)
				if j >= g.NY {
					return
				}
				evalGridRow(g, j, row)
				d := int(done.Add(1))
				if progress != nil {
					progress(d, g.NY)
				}
			}
		}()
	}
	wg.Wait()
	return ctx.Err()
}

// rowFunc returns f's row fast path, or a plain loop over Value and
// Gradient.
func rowFunc(f Interpolant) func(y, x0, dx float64, v, gx, gy []float64, mask []bool) {
	if r, ok := f.(rowEvaluator); ok {
		return r.evalRow
	}
	return func(y, x0, dx float64, v, gx, gy []float64, mask []bool) {
		for i := range v {
			if mask != nil && mask[i] {
				continue
			}
			x := x0 + float64(i)*dx
			v[i] = f.Value(x, y)
			gx[i], gy[i] = f.Gradient(x, y)
		}
	}
}

// evalGridRow fills row j of g and sets NaN at its masked nodes.
func evalGridRow(g *Grid, j int, row func(y, x0, dx float64, v, gx, gy []float64, mask []bool)) {
	lo, hi := j*g.NX, (j+1)*g.NX
	var mask []bool
	if g.Mask != nil {
		mask = g.Mask[lo:hi]
	}
	_, y := g.Node(0, j)
	row(y, g.X0, g.DX, g.V[lo:hi], g.GX[lo:hi], g.GY[lo:hi], mask)
	nan := math.NaN()
	for i, m := range mask {
		if m {
			g.V[lo+i], g.GX[lo+i], g.GY[lo+i] = nan, nan, nan
		}
	}
}

// evalRow is the global fit's row loop: one pass over the centres per node
// for value and gradient together.
func (gf *globalFit) evalRow(y, x0, dx float64, v, gx, gy []float64, mask []bool) {
	for i := range v {
		if mask != nil && mask[i] {
			continue
		}
		v[i], gx[i], gy[i] = gf.valueGrad(x0+float64(i)*dx, y)
	}
}
