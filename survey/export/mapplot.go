package export

import (
	"bytes"
	"fmt"
	"image/color"
	"io"
	"math"
	"strconv"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgimg"
	"gonum.org/v1/plot/vg/vgsvg"
)

// MapKind selects what a map picture shows.
type MapKind int

// The map pictures.
const (
	PotentialMap MapKind = iota // potential bands, equipotential lines
	FieldMap                    // field magnitude |E| bands
)

// Map picture size: 10.5 × 7.5 inches (266.7 × 190.5 mm, inside an A4
// landscape page's margins). PNG pictures are drawn at MapDPI, giving
// 3150 × 2250 pixels.
const (
	MapWidth  = 10.5 * vg.Inch
	MapHeight = 7.5 * vg.Inch
	MapDPI    = 300
)

// Layout of a map picture.
const (
	legendWidth  = 2.7 * vg.Inch
	footerHeight = 0.45 * vg.Inch
	// svgRasterDPI is the resolution of the band image inside SVG maps;
	// PNG maps draw it at their own resolution.
	svgRasterDPI = 150
)

// WriteMapSVG draws the map picture of the given kind as SVG, MapWidth ×
// MapHeight points. The output depends only on the bundle (no time stamp
// unless Bundle.Made is set), so it can be compared with golden files.
// The drawing is kept, so the report reuses it; change no field of b after
// the first call.
func (b *Bundle) WriteMapSVG(w io.Writer, kind MapKind) error {
	if b.svg[kind] == nil {
		c := vgsvg.New(MapWidth, MapHeight)
		if err := b.drawMap(draw.New(c), kind, svgRasterDPI); err != nil {
			return err
		}
		var buf bytes.Buffer
		if _, err := c.WriteTo(&buf); err != nil {
			return fmt.Errorf("drawing svg map: %w", err)
		}
		if b.svg == nil {
			b.svg = map[MapKind][]byte{}
		}
		b.svg[kind] = buf.Bytes()
	}
	if _, err := w.Write(b.svg[kind]); err != nil {
		return fmt.Errorf("writing svg map: %w", err)
	}
	return nil
}

// WriteMapPNG draws the map picture as PNG at dpi dots per inch (0 means
// MapDPI), MapWidth × MapHeight inches.
func (b *Bundle) WriteMapPNG(w io.Writer, kind MapKind, dpi int) error {
	if dpi <= 0 {
		dpi = MapDPI
	}
	c := vgimg.NewWith(vgimg.UseWH(MapWidth, MapHeight), vgimg.UseDPI(dpi), vgimg.UseBackgroundColor(color.White))
	if err := b.drawMap(draw.New(c), kind, dpi); err != nil {
		return err
	}
	if _, err := (vgimg.PngCanvas{Canvas: c}).WriteTo(w); err != nil {
		return fmt.Errorf("writing png map: %w", err)
	}
	return nil
}

// MapPixels returns the pixel size of a PNG map at dpi (0: MapDPI), rounded
// to the nearest pixel as vgimg does.
func MapPixels(dpi int) (w, h int) {
	if dpi <= 0 {
		dpi = MapDPI
	}
	px := func(l vg.Length) int { return int(l.Points()/72*float64(dpi) + 0.5) }
	return px(MapWidth), px(MapHeight)
}

// drawMap lays out the plot, the legend panel and the footer on c.
func (b *Bundle) drawMap(c draw.Canvas, kind MapKind, dpi int) error {
	if b.Grid == nil || b.Grid.Len() == 0 {
		return fmt.Errorf("map: no grid to draw")
	}
	c.SetColor(color.White)
	c.Fill(c.Rectangle.Path())
	body := draw.Crop(c, 0, 0, footerHeight, 0)
	mapC := draw.Crop(body, 0, -legendWidth, 0, 0)
	legC := draw.Crop(body, body.Size().X-legendWidth, 0, 0, 0)
	footC := draw.Crop(c, 0, 0, 0, -(c.Size().Y - footerHeight))
	ly := b.layerFor(kind)
	p := b.newPlot(kind, ly, dpi)
	fitAspect(p, mapC)
	p.Draw(mapC)
	b.drawLegend(legC, kind, ly)
	b.drawFooter(footC)
	return nil
}

// newPlot makes the plot with its axes and the map layer.
func (b *Bundle) newPlot(kind MapKind, ly *layer, dpi int) *plot.Plot {
	p := plot.New()
	p.Title.Text = b.Title + " · " + map[MapKind]string{
		PotentialMap: "potential (" + b.Unit + ")",
		FieldMap:     "field |E| (" + b.Unit + "/m)",
	}[kind]
	p.Title.TextStyle.Font.Size = 13
	p.X.Label.Text, p.Y.Label.Text = "x, east (m)", "y, north (m)"
	if b.Plane != nil {
		p.X.Label.Text, p.Y.Label.Text = "east of origin (m)", "north of origin (m)"
	}
	p.X.Tick.Marker, p.Y.Tick.Marker = plainTicks{}, plainTicks{}
	p.Add(&mapLayer{b: b, kind: kind, ly: ly, dpi: dpi})
	return p
}

// plainTicks are the default ticks labelled in plain decimals, so that
// seven-digit northings read in full.
type plainTicks struct{}

func (plainTicks) Ticks(lo, hi float64) []plot.Tick {
	ts := plot.DefaultTicks{}.Ticks(lo, hi)
	for i := range ts {
		if ts[i].Label != "" {
			ts[i].Label = strconv.FormatFloat(ts[i].Value, 'f', -1, 64)
		}
	}
	return ts
}

// fitAspect widens one axis so that a metre is as long in x as in y.
func fitAspect(p *plot.Plot, c draw.Canvas) {
	pad := func(lo, hi *float64) {
		d := math.Max((*hi-*lo)*0.03, 1e-9)
		*lo, *hi = *lo-d, *hi+d
	}
	pad(&p.X.Min, &p.X.Max)
	pad(&p.Y.Min, &p.Y.Max)
	for range 3 {
		dc := p.DataCanvas(c)
		sx := float64(dc.Size().X) / (p.X.Max - p.X.Min)
		sy := float64(dc.Size().Y) / (p.Y.Max - p.Y.Min)
		if sx > sy {
			grow(&p.X.Min, &p.X.Max, float64(dc.Size().X)/sy)
		} else {
			grow(&p.Y.Min, &p.Y.Max, float64(dc.Size().Y)/sx)
		}
	}
}

// grow widens [lo, hi] about its centre to span width.
func grow(lo, hi *float64, width float64) {
	m := (*lo + *hi) / 2
	*lo, *hi = m-width/2, m+width/2
}

// textStyle returns the plain text style at size points.
func textStyle(size vg.Length, c color.Color) draw.TextStyle {
	return text.Style{Color: c, Font: font.From(plot.DefaultFont, size), Handler: plot.DefaultTextHandler}
}
