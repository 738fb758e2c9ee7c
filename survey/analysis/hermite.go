package analysis

import (
	"context"
	"math"

	"isofield/interp"
)

// hermiteMaxSpacing is the largest grid spacing (m) at which StepGrid reads
// the potential between nodes from the evaluated grid instead of the
// interpolant. At 0.25 m, four nodes per step length, step voltages from
// the bicubic Hermite surface agree with the interpolant's within 0.6 %
// around a point source only 0.5 m deep, and within 0.02 % at 0.1 m
// (TestHermiteSurface); it costs a few dozen operations per point instead
// of one kernel evaluation per reading.
const hermiteMaxSpacing = 0.25

// gridSurface is the bicubic Hermite interpolant of an evaluated grid: in
// each cell the cubic in x and y that matches V, ∂V/∂x, ∂V/∂y (the
// interpolant's analytic gradient) and ∂²V/∂x∂y (central differences of
// the gradient) at the four corners (bicubic Hermite patches; see e.g.
// Press et al., Numerical Recipes, 3rd ed., §3.6.3). Where a cell has an
// unusable corner, or outside the grid, it falls back to the interpolant.
type gridSurface struct {
	g   *interp.Grid
	fxy []float64
	ok  []bool // per cell (package contour's indexing): all corners usable
	f   interp.Interpolant
}

func newGridSurface(g *interp.Grid, f interp.Interpolant) *gridSurface {
	s := &gridSurface{g: g, f: f, fxy: make([]float64, g.Len())}
	for j := range g.NY {
		for i := range g.NX {
			s.fxy[g.Index(i, j)] = crossDerivative(g, i, j)
		}
	}
	cx, cy := max(g.NX-1, 0), max(g.NY-1, 0)
	s.ok = make([]bool, cx*cy)
	for j := range cy {
		for i := range cx {
			s.ok[j*cx+i] = usableNode(g, g.Index(i, j)) && usableNode(g, g.Index(i+1, j)) &&
				usableNode(g, g.Index(i, j+1)) && usableNode(g, g.Index(i+1, j+1))
		}
	}
	return s
}

// crossDerivative estimates ∂²V/∂x∂y at node (i, j) as the mean of the
// central differences of ∂V/∂x along y and of ∂V/∂y along x that its
// usable neighbours allow (one-sided at the edges), 0 when none does.
func crossDerivative(g *interp.Grid, i, j int) float64 {
	var sum float64
	var n int
	if d, ok := diff(g, g.GX, i, j-1, i, j+1, g.DY); ok {
		sum, n = sum+d, n+1
	}
	if d, ok := diff(g, g.GY, i-1, j, i+1, j, g.DX); ok {
		sum, n = sum+d, n+1
	}
	if n == 0 {
		return 0
	}
	return sum / float64(n)
}

// diff returns the difference quotient of a between the usable nodes among
// (i0, j0) and (i1, j1), falling back to the centre (the middle of the two)
// for a one-sided difference.
func diff(g *interp.Grid, a []float64, i0, j0, i1, j1 int, h float64) (float64, bool) {
	ok := func(i, j int) bool {
		return i >= 0 && j >= 0 && i < g.NX && j < g.NY && usableNode(g, g.Index(i, j))
	}
	ic, jc := (i0+i1)/2, (j0+j1)/2
	switch {
	case ok(i0, j0) && ok(i1, j1):
		return (a[g.Index(i1, j1)] - a[g.Index(i0, j0)]) / (2 * h), true
	case ok(ic, jc) && ok(i1, j1):
		return (a[g.Index(i1, j1)] - a[g.Index(ic, jc)]) / h, true
	case ok(i0, j0) && ok(ic, jc):
		return (a[g.Index(ic, jc)] - a[g.Index(i0, j0)]) / h, true
	}
	return 0, false
}

// Value returns the Hermite surface at (x, y), or the interpolant's value
// where the grid cannot give it.
func (s *gridSurface) Value(x, y float64) float64 {
	g := s.g
	u, v := (x-g.X0)/g.DX, (y-g.Y0)/g.DY
	i, j := int(math.Floor(u)), int(math.Floor(v))
	if i == g.NX-1 {
		i-- // the last column's own edge
	}
	if j == g.NY-1 {
		j--
	}
	if i < 0 || j < 0 || i >= g.NX-1 || j >= g.NY-1 || !s.ok[j*(g.NX-1)+i] {
		return s.f.Value(x, y)
	}
	k := [4]int{g.Index(i, j), g.Index(i+1, j), g.Index(i, j+1), g.Index(i+1, j+1)}
	a, b := u-float64(i), v-float64(j)
	ha := [2]float64{(2*a-3)*a*a + 1, (3 - 2*a) * a * a}
	hb := [2]float64{(2*b-3)*b*b + 1, (3 - 2*b) * b * b}
	da := [2]float64{((a-2)*a + 1) * a, (a - 1) * a * a}
	db := [2]float64{((b-2)*b + 1) * b, (b - 1) * b * b}
	var sum float64
	for n, kk := range k {
		ci, cj := n%2, n/2
		sum += g.V[kk]*ha[ci]*hb[cj] + g.DX*g.GX[kk]*da[ci]*hb[cj] +
			g.DY*g.GY[kk]*ha[ci]*db[cj] + g.DX*g.DY*s.fxy[kk]*da[ci]*db[cj]
	}
	return sum
}

// Gradient returns the interpolant's gradient (StepGrid needs values only).
func (s *gridSurface) Gradient(x, y float64) (float64, float64) { return s.f.Gradient(x, y) }

// Limits of the refined grid StepGrid may build on coarse grids.
const (
	// maxRefinedNodes bounds its size (about 50 MB).
	maxRefinedNodes = 2_000_000
	// stepEvaluations is the interpolant evaluations per node of the direct
	// pass (see StepVoltage), against which the refined grid must pay off.
	stepEvaluations = 35
)

// stepSurface returns what StepGrid samples: the grid's own Hermite surface
// when it is fine enough; else, when it costs fewer evaluations than the
// direct pass, the Hermite surface of a refined grid evaluated from f (at
// most hermiteMaxSpacing apart, reaching a step length beyond g); else f.
func stepSurface(ctx context.Context, f interp.Interpolant, g *interp.Grid, d float64) (interp.Interpolant, error) {
	if max(g.DX, g.DY) <= hermiteMaxSpacing {
		return newGridSurface(g, f), nil
	}
	rx := int(math.Ceil(g.DX / hermiteMaxSpacing))
	ry := int(math.Ceil(g.DY / hermiteMaxSpacing))
	dx, dy := g.DX/float64(rx), g.DY/float64(ry)
	px, py := int(math.Ceil(d/dx))+1, int(math.Ceil(d/dy))+1
	nx, ny := (g.NX-1)*rx+1+2*px, (g.NY-1)*ry+1+2*py
	usable := 0
	for k := range g.V {
		if usableNode(g, k) {
			usable++
		}
	}
	if nx*ny > maxRefinedNodes || nx*ny > stepEvaluations*usable/2 {
		return f, nil
	}
	fine := interp.NewGridN(g.X0-float64(px)*dx, g.Y0-float64(py)*dy, dx, dy, nx, ny)
	if err := interp.Evaluate(ctx, f, fine, nil); err != nil {
		return nil, err
	}
	return newGridSurface(fine, f), nil
}
