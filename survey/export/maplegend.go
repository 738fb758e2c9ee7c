package export

import (
	"image/color"
	"strconv"
	"strings"

	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
)

// drawLegend fills the panel right of the map: the bands with their
// values and unit, the symbols, and the criterion.
func (b *Bundle) drawLegend(c draw.Canvas, kind MapKind, ly *layer) {
	x := c.Min.X + 8
	y := c.Max.Y - 34
	head := textStyle(9, color.Black)
	body := textStyle(7, color.Black)
	head.YAlign, body.YAlign = draw.YCenter, draw.YCenter
	title := "potential (" + b.Unit + ")"
	if kind == FieldMap {
		title = "field |E| (" + b.Unit + "/m)"
	}
	c.FillText(head, vg.Point{X: x, Y: y}, title)
	y -= 14
	n := len(ly.colours)
	hgt := min(vg.Length(12), (y-c.Min.Y-150)/vg.Length(max(n, 1)))
	every := max(1, int(8/float64(max(hgt, 0.1))))
	for bnd := n - 1; bnd >= 0; bnd-- {
		c.FillPolygon(ly.colours[bnd], rect(x, y-hgt, 22, hgt))
		if (n-1-bnd)%every == 0 {
			c.FillText(body, vg.Point{X: x + 28, Y: y - hgt/2}, bandLabel(ly.levels, bnd))
		}
		y -= hgt
	}
	c.StrokeLines(draw.LineStyle{Color: color.Gray{0x80}, Width: 0.4}, []vg.Point{{X: x, Y: y}, {X: x + 22, Y: y}})
	y -= 14
	y = b.legendSymbols(c, x, y, kind, body)
	if rules := b.CriterionLines(); len(rules) > 0 {
		y -= 6
		c.FillText(head, vg.Point{X: x, Y: y}, "flagged where")
		y -= 12
		for _, r := range rules {
			for _, ln := range wrap("• "+r, 44) {
				c.FillText(body, vg.Point{X: x, Y: y}, ln)
				y -= 9
			}
		}
	}
	c.FillText(body, vg.Point{X: x, Y: y - 4}, "blank: too far from any reading")
}

// legendSymbols lists the map's symbols and returns the next free y.
func (b *Bundle) legendSymbols(c draw.Canvas, x, y vg.Length, kind MapKind, body draw.TextStyle) vg.Length {
	item := func(draw func(pt vg.Point), label string) {
		draw(vg.Point{X: x + 11, Y: y})
		c.FillText(body, vg.Point{X: x + 28, Y: y}, label)
		y -= 12
	}
	if kind == PotentialMap {
		item(func(pt vg.Point) {
			c.StrokeLine2(draw.LineStyle{Color: lineColour, Width: 0.45}, pt.X-10, pt.Y, pt.X+10, pt.Y)
		}, "equipotential, every "+fmtNum(b.Interval)+" "+b.Unit)
		item(func(pt vg.Point) {
			c.StrokeLine2(draw.LineStyle{Color: lineColour, Width: 1.3}, pt.X-10, pt.Y, pt.X+10, pt.Y)
		}, "zero line")
	}
	for _, st := range []string{"ok", "suspect", "excluded"} {
		item(func(pt vg.Point) { c.DrawGlyph(readingGlyph(st), pt) }, "reading, "+st)
	}
	if len(b.Zones) > 0 {
		item(func(pt vg.Point) {
			c.StrokeLine2(draw.LineStyle{Color: zoneColour, Width: 1.4, Dashes: []vg.Length{4, 2}}, pt.X-10, pt.Y, pt.X+10, pt.Y)
		}, "flagged zone Z1, Z2, … (by severity)")
	}
	if len(b.Infill) > 0 {
		item(func(pt vg.Point) { c.DrawGlyph(infillGlyph, pt) }, "suggested reading S1, S2, …")
	}
	return y
}

// bandLabel describes band b of the levels in words and numbers.
func bandLabel(levels []float64, b int) string {
	switch {
	case len(levels) == 0:
		return "all values"
	case b == 0:
		return "below " + fmtNum(levels[0])
	case b == len(levels):
		return fmtNum(levels[b-1]) + " and above"
	}
	return fmtNum(levels[b-1]) + " to " + fmtNum(levels[b])
}

// drawFooter writes the version, time and settings under the map.
func (b *Bundle) drawFooter(c draw.Canvas) {
	sty := textStyle(6, color.Gray{0x40})
	sty.YAlign = draw.YCenter
	first := "made by isofield " + b.Version
	if !b.Made.IsZero() {
		first += " on " + b.Made.UTC().Format("2006-01-02 15:04 UTC")
	}
	first += " · positions: " + b.positionSystem()
	lines := append([]string{first}, wrap("settings: "+settingsLine(b.Settings), 190)...)
	y := c.Max.Y - 8
	for _, ln := range lines[:min(len(lines), 3)] {
		c.FillText(sty, vg.Point{X: c.Min.X + 8, Y: y}, ln)
		y -= 8
	}
}

// wrap breaks s into lines of at most width runes at spaces.
func wrap(s string, width int) []string {
	var lines []string
	var cur strings.Builder
	for _, w := range strings.Fields(s) {
		if cur.Len() > 0 && len([]rune(cur.String()))+1+len([]rune(w)) > width {
			lines = append(lines, cur.String())
			cur.Reset()
		}
		if cur.Len() > 0 {
			cur.WriteByte(' ')
		}
		cur.WriteString(w)
	}
	if cur.Len() > 0 {
		lines = append(lines, cur.String())
	}
	return lines
}

func itoa(i int) string { return strconv.Itoa(i) }
