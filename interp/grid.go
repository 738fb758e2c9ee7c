package interp

import (
	"fmt"
	"math"
)

// Grid is a regular, node-centred grid of values and gradients.
//
// Node (i, j), 0 <= i < NX, 0 <= j < NY, lies at (X0 + i*DX, Y0 + j*DY)
// and its entries live at index j*NX + i of V, GX, GY and Mask. Row j = 0 is
// the southern (smallest y) edge.
//
// V holds the interpolated value, GX and GY the analytic partial
// derivatives dV/dx and dV/dy. Mask[k] is true where node k is too far from
// the data to be trusted; V, GX and GY at a masked node are NaN.
type Grid struct {
	X0, Y0 float64
	DX, DY float64
	NX, NY int
	V      []float64
	GX, GY []float64
	Mask   []bool
}

// NewGrid returns a grid covering the rectangle [xmin, xmax] × [ymin, ymax]
// with nodes spacing apart in both directions, the first node at
// (xmin, ymin). The last row and column reach or just pass xmax and ymax.
// It returns an error when the rectangle is empty or inverted, when spacing
// is not positive and finite, or when the grid would exceed maxNodes nodes
// (maxNodes <= 0 means no limit).
func NewGrid(xmin, ymin, xmax, ymax, spacing float64, maxNodes int) (*Grid, error) {
	for _, v := range []float64{xmin, ymin, xmax, ymax, spacing} {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return nil, fmt.Errorf("grid: non-finite bound or spacing")
		}
	}
	if spacing <= 0 {
		return nil, fmt.Errorf("grid: spacing %g is not positive", spacing)
	}
	if xmax < xmin || ymax < ymin {
		return nil, fmt.Errorf("grid: empty extent")
	}
	fx := math.Ceil((xmax-xmin)/spacing-1e-9) + 1
	fy := math.Ceil((ymax-ymin)/spacing-1e-9) + 1
	if maxNodes > 0 && fx*fy > float64(maxNodes) {
		return nil, fmt.Errorf("grid: %.0f×%.0f nodes at spacing %g exceed the limit of %d", fx, fy, spacing, maxNodes)
	}
	return NewGridN(xmin, ymin, spacing, spacing, int(fx), int(fy)), nil
}

// NewGridN returns an nx × ny grid with its first node at (x0, y0) and the
// given spacings. It panics if nx or ny is less than 1 (a caller's bug).
func NewGridN(x0, y0, dx, dy float64, nx, ny int) *Grid {
	if nx < 1 || ny < 1 {
		panic("interp: NewGridN with nx or ny < 1")
	}
	n := nx * ny
	return &Grid{
		X0: x0, Y0: y0, DX: dx, DY: dy, NX: nx, NY: ny,
		V: make([]float64, n), GX: make([]float64, n), GY: make([]float64, n),
		Mask: make([]bool, n),
	}
}

// Index returns the flat index of node (i, j).
func (g *Grid) Index(i, j int) int { return j*g.NX + i }

// Node returns the coordinates of node (i, j).
func (g *Grid) Node(i, j int) (x, y float64) {
	return g.X0 + float64(i)*g.DX, g.Y0 + float64(j)*g.DY
}

// Len returns the number of nodes.
func (g *Grid) Len() int { return g.NX * g.NY }
