package tui

import (
	"fmt"
	"math"
	"strings"
)

// profileView draws the potential along the segment between the two
// marks as a line chart, with readings near the segment marked.
type profileView struct {
	styles        Styles
	width, height int
}

func newProfileView(st Styles) profileView { return profileView{styles: st} }

func (p profileView) SetSize(w, h int) profileView {
	p.width, p.height = w, h
	return p
}

// profileLeft is the width of the value labels left of the chart.
const profileLeft = 10

// sample returns n potentials evenly spaced from a to b (NaN outside the
// surveyed area).
func (sc *scene) sample(a, b [2]float64, n int) []float64 {
	out := make([]float64, n)
	for i := range out {
		t := float64(i) / float64(max(n-1, 1))
		pr := sc.probeAt(a[0]+t*(b[0]-a[0]), a[1]+t*(b[1]-a[1]))
		out[i] = pr.V
	}
	return out
}

// View draws the chart for marks a and b.
func (p profileView) View(sc *scene, a, b *[2]float64) string {
	st := p.styles
	if a == nil || b == nil {
		return st.Faint.Render("Mark two points with m on the map, then press p.")
	}
	length := math.Hypot(b[0]-a[0], b[1]-a[1])
	title := st.PanelTitle.Render("Profile") + st.Label.Render(fmt.Sprintf("  A %s, %s → B %s, %s   %s m   potential in %s; o: readings within reach",
		fixed(a[0]), fixed(a[1]), fixed(b[0]), fixed(b[1]), num(length), sc.unit))
	pw, ph := max(p.width-profileLeft-1, 4), max(p.height-3, 3)
	vs := sc.sample(*a, *b, pw)
	lo, hi := finiteRange(vs)
	if math.IsNaN(lo) {
		return truncate(title, p.width) + "\n" + st.Faint.Render("the segment lies outside the surveyed area")
	}
	if hi-lo < 1e-12 {
		lo, hi = lo-1, hi+1
	}
	canvas := newCanvas(pw, ph)
	rowOf := func(v float64) int { return int(math.Round((hi - v) / (hi - lo) * float64(ph-1))) }
	prev := -1
	for i, v := range vs {
		if math.IsNaN(v) {
			prev = -1
			continue
		}
		r := rowOf(v)
		canvas.line(i, prev, r)
		prev = r
	}
	p.readingsNear(sc, *a, *b, length, canvas, rowOf)
	return truncate(title, p.width) + "\n" + canvas.render(lo, hi) + "\n" + p.axis(pw, length)
}

// readingsNear marks readings within reach of the segment at their
// projected position and corrected value.
func (p profileView) readingsNear(sc *scene, a, b [2]float64, length float64, c *canvas, rowOf func(float64) int) {
	if length == 0 {
		return
	}
	reach := max(length/40, sc.res.Grid.DX)
	ux, uy := (b[0]-a[0])/length, (b[1]-a[1])/length
	for i, r := range sc.res.Survey.Readings {
		dx, dy := r.X-a[0], r.Y-a[1]
		t := dx*ux + dy*uy
		if t < 0 || t > length || math.Abs(dx*uy-dy*ux) > reach {
			continue
		}
		v := r.V
		if q := sc.res.QA; q != nil && i < len(q.Corrected) {
			v = q.Corrected[i]
		}
		col := int(math.Round(t / length * float64(c.w-1)))
		c.set(col, rowOf(v), 'o')
	}
}

func (p profileView) axis(pw int, length float64) string {
	right := num(length) + " m"
	gap := max(pw-len("0 m")-len(right), 1)
	return strings.Repeat(" ", profileLeft+1) + "0 m" + strings.Repeat(" ", gap) + right
}

func finiteRange(vs []float64) (lo, hi float64) {
	lo, hi = math.NaN(), math.NaN()
	for _, v := range vs {
		if math.IsNaN(v) {
			continue
		}
		if math.IsNaN(lo) {
			lo, hi = v, v
		}
		lo, hi = min(lo, v), max(hi, v)
	}
	return lo, hi
}

// canvas is a character grid for the chart.
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

// render writes the canvas with value labels at the top, middle and
// bottom rows.
func (c *canvas) render(lo, hi float64) string {
	var sb strings.Builder
	for r, row := range c.cells {
		label := ""
		switch r {
		case 0:
			label = num(hi)
		case c.h / 2:
			label = num((lo + hi) / 2)
		case c.h - 1:
			label = num(lo)
		}
		fmt.Fprintf(&sb, "%*s │%s", profileLeft-1, label, string(row))
		if r < c.h-1 {
			sb.WriteByte('\n')
		}
	}
	return sb.String()
}
