package export

import (
	"image"
	"image/color"
	imgdraw "image/draw"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"

	"isofield/interp/contour"
)

// Colours of the map's symbols.
var (
	lineColour     = color.RGBA{0x30, 0x30, 0x30, 0xff}
	zoneColour     = color.RGBA{0xc2, 0x00, 0x7b, 0xff}
	suspectColour  = color.RGBA{0xe0, 0x8a, 0x00, 0xff}
	excludedColour = color.RGBA{0xd0, 0x10, 0x10, 0xff}
	infillColour   = color.RGBA{0x00, 0x6d, 0x77, 0xff}
)

// layerFor returns the banded quantity of a map.
func (b *Bundle) layerFor(kind MapKind) *layer {
	g := b.Grid
	if kind == PotentialMap {
		return newLayer(g, b.usable(func(k int) float64 { return g.V[k] }),
			b.Levels, b.Interval, bandColours(b.Levels, b.Interval, false))
	}
	f := b.usable(func(k int) float64 { return math.Hypot(g.GX[k], g.GY[k]) })
	ly := newLayer(g, f, nil, 0, nil)
	hi := 0.0
	for _, v := range ly.vals {
		if v > hi {
			hi = v
		}
	}
	ly.interval = contour.NiceInterval(0, hi)
	ly.levels = contour.Levels(0, hi, ly.interval)
	ly.colours = bandColours(ly.levels, ly.interval, true)
	return ly
}

// usable wraps a node value so that masked and non-finite nodes are NaN.
func (b *Bundle) usable(f func(k int) float64) func(k int) float64 {
	g := b.Grid
	return func(k int) float64 {
		v := f(k)
		if g.Mask[k] || math.IsInf(v, 0) {
			return math.NaN()
		}
		return v
	}
}

// mapLayer draws everything inside the plot's data area.
type mapLayer struct {
	b    *Bundle
	kind MapKind
	ly   *layer
	dpi  int // resolution of the band image
}

// DataRange is the grid's node extent joined with the readings'.
func (m *mapLayer) DataRange() (xmin, xmax, ymin, ymax float64) {
	g := m.b.Grid
	xmin, ymin = g.Node(0, 0)
	xmax, ymax = g.Node(g.NX-1, g.NY-1)
	for _, r := range m.b.Readings {
		xmin, xmax = min(xmin, r.X), max(xmax, r.X)
		ymin, ymax = min(ymin, r.Y), max(ymax, r.Y)
	}
	return xmin, xmax, ymin, ymax
}

// Plot draws bands, lines, zones, readings, suggestions, scale and north.
func (m *mapLayer) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	tr := func(x, y float64) vg.Point { return vg.Point{X: trX(x), Y: trY(y)} }
	g := m.b.Grid
	x0, y0 := g.Node(0, 0)
	x1, y1 := g.Node(g.NX-1, g.NY-1)
	m.drawBands(c, vg.Rectangle{Min: tr(x0, y0), Max: tr(x1, y1)})
	if m.kind == PotentialMap {
		m.drawLines(c, tr)
	}
	m.drawZones(c, tr)
	m.drawInfill(c, tr) // under the readings: a suggestion may sit on a suspect one
	m.drawReadings(c, tr)
	drawScaleBar(c, p)
	drawNorthArrow(c)
}

// drawBands draws the band image into r. On a raster canvas it is drawn
// pixel for pixel straight into the picture (no resampling); elsewhere it
// is rasterised at m.dpi and placed by the canvas.
func (m *mapLayer) drawBands(c draw.Canvas, r vg.Rectangle) {
	if vc, ok := c.Canvas.(*vgimg.Canvas); ok {
		img := vc.Image()
		k := vc.DPI() / 72
		hgt := img.Bounds().Dy()
		x0, x1 := int(math.Round(r.Min.X.Points()*k)), int(math.Round(r.Max.X.Points()*k))
		y0, y1 := hgt-int(math.Round(r.Max.Y.Points()*k)), hgt-int(math.Round(r.Min.Y.Points()*k))
		if x1 > x0 && y1 > y0 {
			band := m.ly.rasterize(x1-x0, y1-y0)
			imgdraw.Draw(img, image.Rect(x0, y0, x1, y1), band, image.Point{}, imgdraw.Over)
			return
		}
	}
	px := func(l vg.Length) int { return max(1, int(math.Ceil(l.Points()/72*float64(m.dpi)))) }
	c.DrawImage(r, m.ly.rasterize(px(r.Size().X), px(r.Size().Y)))
}

// drawLines strokes the equipotential lines and labels the longer ones.
func (m *mapLayer) drawLines(c draw.Canvas, tr func(x, y float64) vg.Point) {
	label := textStyle(6, lineColour)
	label.XAlign, label.YAlign = draw.XCenter, draw.YCenter
	for _, l := range m.b.Lines {
		pts := make([]vg.Point, len(l.Points))
		for i, q := range l.Points {
			pts[i] = tr(q.X, q.Y)
		}
		sty := draw.LineStyle{Color: lineColour, Width: 0.45}
		if l.Zero {
			sty.Width = 1.3
		}
		c.StrokeLines(sty, pts)
		if len(pts) >= 12 {
			mid := pts[len(pts)/2]
			txt := fmtNum(l.Level)
			wd := label.Width(txt)
			box := []vg.Point{{X: mid.X - wd/2 - 1, Y: mid.Y - 3.5}, {X: mid.X + wd/2 + 1, Y: mid.Y - 3.5},
				{X: mid.X + wd/2 + 1, Y: mid.Y + 3.5}, {X: mid.X - wd/2 - 1, Y: mid.Y + 3.5}}
			c.FillPolygon(color.White, box)
			c.FillText(label, mid, txt)
		}
	}
}

// drawZones outlines the flagged zones and names them Z1, Z2, ….
func (m *mapLayer) drawZones(c draw.Canvas, tr func(x, y float64) vg.Point) {
	sty := draw.LineStyle{Color: zoneColour, Width: 1.4, Dashes: []vg.Length{4, 2}}
	label := textStyle(8, zoneColour)
	label.XAlign, label.YAlign = draw.XCenter, draw.YCenter
	for _, z := range m.b.Zones {
		for _, ring := range append([][]contour.Point{z.Outline}, z.Holes...) {
			pts := make([]vg.Point, len(ring))
			for i, q := range ring {
				pts[i] = tr(q.X, q.Y)
			}
			c.StrokeLines(sty, pts)
		}
		c.FillText(label, tr(z.CentroidX, z.CentroidY), "Z"+itoa(z.Rank))
	}
}

// drawReadings marks each reading by its QA status, the ok ones first so
// that no suspect or excluded mark hides under them.
func (m *mapLayer) drawReadings(c draw.Canvas, tr func(x, y float64) vg.Point) {
	for _, okPass := range []bool{true, false} {
		for _, r := range m.b.Readings {
			if (r.Status == "ok") == okPass {
				c.DrawGlyph(readingGlyph(r.Status), tr(r.X, r.Y))
			}
		}
	}
}

// readingGlyph is the map symbol of a reading with the given status.
func readingGlyph(status string) draw.GlyphStyle {
	switch status {
	case "suspect":
		return draw.GlyphStyle{Color: suspectColour, Radius: 2.6, Shape: draw.TriangleGlyph{}}
	case "excluded":
		return draw.GlyphStyle{Color: excludedColour, Radius: 2.4, Shape: draw.CrossGlyph{}}
	}
	return draw.GlyphStyle{Color: color.Black, Radius: 1.1, Shape: draw.CircleGlyph{}}
}

// infillGlyph is the map symbol of a suggested reading.
var infillGlyph = draw.GlyphStyle{Color: infillColour, Radius: 3, Shape: draw.BoxGlyph{}}

// drawInfill marks the suggested points S1, S2, ….
func (m *mapLayer) drawInfill(c draw.Canvas, tr func(x, y float64) vg.Point) {
	label := textStyle(7, infillColour)
	label.YAlign = draw.YCenter
	for i, s := range m.b.Infill {
		pt := tr(s.X, s.Y)
		c.DrawGlyph(infillGlyph, pt)
		c.FillText(label, vg.Point{X: pt.X + 4, Y: pt.Y}, "S"+itoa(i+1))
	}
}

// drawScaleBar draws a bar of a round length in metres, about a fifth of
// the data area's width, at its lower left.
func drawScaleBar(c draw.Canvas, p *plot.Plot) {
	span := p.X.Max - p.X.Min
	if !(span > 0) {
		return
	}
	length := contour.FloorNice(span / 5)
	w := vg.Length(float64(c.Size().X) * length / span)
	x, y := c.Min.X+12, c.Min.Y+14
	half := w / 2
	c.FillPolygon(color.Black, rect(x, y, half, 4))
	c.FillPolygon(color.White, rect(x+half, y, half, 4))
	c.StrokeLines(draw.LineStyle{Color: color.Black, Width: 0.6}, []vg.Point{{X: x, Y: y}, {X: x + w, Y: y}, {X: x + w, Y: y + 4}, {X: x, Y: y + 4}, {X: x, Y: y}})
	sty := textStyle(7, color.Black)
	sty.XAlign = draw.XCenter
	c.FillText(sty, vg.Point{X: x, Y: y + 6}, "0")
	c.FillText(sty, vg.Point{X: x + w, Y: y + 6}, fmtNum(length)+" m")
}

// drawNorthArrow draws an arrow pointing up (y grows northwards) at the
// data area's upper right.
func drawNorthArrow(c draw.Canvas) {
	x, y := c.Max.X-16, c.Max.Y-34
	c.FillPolygon(color.Black, []vg.Point{{X: x, Y: y + 20}, {X: x - 6, Y: y}, {X: x, Y: y + 5}})
	c.FillPolygon(color.White, []vg.Point{{X: x, Y: y + 20}, {X: x, Y: y + 5}, {X: x + 6, Y: y}})
	c.StrokeLines(draw.LineStyle{Color: color.Black, Width: 0.6},
		[]vg.Point{{X: x, Y: y + 20}, {X: x - 6, Y: y}, {X: x, Y: y + 5}, {X: x + 6, Y: y}, {X: x, Y: y + 20}})
	sty := textStyle(9, color.Black)
	sty.XAlign = draw.XCenter
	c.FillText(sty, vg.Point{X: x, Y: y + 22}, "N")
}

// rect returns the corners of a w × h rectangle with its lower left at
// (x, y).
func rect(x, y, w, h vg.Length) []vg.Point {
	return []vg.Point{{X: x, Y: y}, {X: x + w, Y: y}, {X: x + w, Y: y + h}, {X: x, Y: y + h}}
}
