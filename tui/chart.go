package tui

import (
	"fmt"
	"math"
	"strings"

	"isofield/interp"
)

// canvas is a character grid for the profile's charts.
type canvas struct {
	w, h  int
	cells [][]rune
}

func newCanvas(w, h int) *canvas {
	c := &canvas{w: w, h: h, cells: make([][]rune, h)}
	for r := range c.cells {
		c.cells[r] = []rune(strings.Repeat(" ", w))
	}
	return c
}

func (c *canvas) set(col, row int, g rune) {
	if col >= 0 && col < c.w && row >= 0 && row < c.h {
		c.cells[row][col] = g
	}
}

// hline draws a dotted line across row r under what is drawn later.
func (c *canvas) hline(r int, g rune) {
	for col := 0; col < c.w; col += 2 {
		c.set(col, r, g)
	}
}

// line draws the sample at column col and row r, joined vertically to the
// previous sample's row prev (-1: none).
func (c *canvas) line(col, prev, r int) {
	if prev >= 0 {
		for k := min(prev, r) + 1; k < max(prev, r); k++ {
			c.set(col, k, '|')
		}
	}
	c.set(col, r, '*')
}

// render writes the canvas with value labels at the top and bottom rows
// and midValue at row mid (the zero line, or the middle), all shown in u.
func (c *canvas) render(lo, hi float64, mid int, midValue float64, u dispUnit) string {
	var sb strings.Builder
	for r, row := range c.cells {
		label := ""
		switch r {
		case 0:
			label = u.num(hi)
		case c.h - 1:
			label = u.num(lo)
		case mid:
			label = u.num(midValue)
		}
		fmt.Fprintf(&sb, "%*s │%s", profileLeft-1, label, string(row))
		if r < c.h-1 {
			sb.WriteByte('\n')
		}
	}
	return sb.String()
}

// gridSurface reads a grid as a surface: V and its gradient bilinear
// between nodes. It stands in for the fitted model when a result has none
// (results made by hand); masked corners are skipped, and a cell with
// every corner masked reads 0 (the profile blanks it).
type gridSurface struct{ g *interp.Grid }

var _ interp.Interpolant = gridSurface{}

// Value returns V at (x, y).
func (s gridSurface) Value(x, y float64) float64 { return s.blend(s.g.V, x, y) }

// Gradient returns (dV/dx, dV/dy) at (x, y).
func (s gridSurface) Gradient(x, y float64) (float64, float64) {
	return s.blend(s.g.GX, x, y), s.blend(s.g.GY, x, y)
}

// blend interpolates field f bilinearly in the cell holding (x, y),
// clamped to the grid.
func (s gridSurface) blend(f []float64, x, y float64) float64 {
	g := s.g
	fx := min(max((x-g.X0)/g.DX, 0), float64(g.NX-1))
	fy := min(max((y-g.Y0)/g.DY, 0), float64(g.NY-1))
	i, j := min(int(fx), g.NX-2), min(int(fy), g.NY-2)
	tx, ty := fx-float64(i), fy-float64(j)
	var sum, wsum float64
	for _, c := range [4][3]float64{{0, 0, (1 - tx) * (1 - ty)}, {1, 0, tx * (1 - ty)}, {0, 1, (1 - tx) * ty}, {1, 1, tx * ty}} {
		k := g.Index(i+int(c[0]), j+int(c[1]))
		if !g.Mask[k] && !math.IsNaN(f[k]) {
			sum += c[2] * f[k]
			wsum += c[2]
		}
	}
	if wsum == 0 {
		return 0
	}
	return sum / wsum
}
