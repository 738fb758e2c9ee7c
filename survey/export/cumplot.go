package export

import (
	"bytes"
	"encoding/base64"
	"fmt"
	"html/template"
	"image/color"
	"math"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgsvg"
)

// Size of the cumulative-frequency chart in the report.
const (
	cumWidth  = 6.5 * vg.Inch
	cumHeight = 3.2 * vg.Inch
)

// cumulativeSVG draws the cumulative frequency of the gridded readings
// (the statistical view of RILEM TC 154-EMC, Materials and Structures 36,
// 2003) with the preset's class limits as vertical lines, as an SVG data
// URI; "" when there is nothing to draw.
func (b *Bundle) cumulativeSVG() (template.URL, error) {
	if len(b.Cumulative) < 2 {
		return "", nil
	}
	p := plot.New()
	p.X.Label.Text = "potential (" + b.Unit + ")"
	p.Y.Label.Text = "readings at or below (%)"
	p.Y.Min, p.Y.Max = 0, 100
	pts := make(plotter.XYs, len(b.Cumulative))
	for i, c := range b.Cumulative {
		pts[i].X, pts[i].Y = c.Value, c.Percent
	}
	line, marks, err := plotter.NewLinePoints(pts)
	if err != nil {
		return "", fmt.Errorf("cumulative chart: %w", err)
	}
	line.Color, marks.Radius = color.RGBA{0x1f, 0x3f, 0x73, 0xff}, 1.2
	p.Add(plotter.NewGrid(), line, marks)
	for _, x := range b.classLimits() {
		lim := plotter.XYs{{X: x, Y: 0}, {X: x, Y: 100}}
		l, err := plotter.NewLine(lim)
		if err != nil {
			return "", fmt.Errorf("cumulative chart: %w", err)
		}
		l.Color, l.Dashes = color.RGBA{0xa0, 0x52, 0x2d, 0xff}, []vg.Length{4, 3}
		p.Add(l)
	}
	c := vgsvg.New(cumWidth, cumHeight)
	p.Draw(draw.New(c))
	var buf bytes.Buffer
	if _, err := c.WriteTo(&buf); err != nil {
		return "", fmt.Errorf("cumulative chart: %w", err)
	}
	return template.URL("data:image/svg+xml;base64," + base64.StdEncoding.EncodeToString(buf.Bytes())), nil
}

// classLimits returns the finite edges between the preset's classes.
func (b *Bundle) classLimits() []float64 {
	if b.Criterion == nil {
		return nil
	}
	var xs []float64
	for _, c := range b.Criterion.Classes {
		for _, v := range []float64{c.Lo, c.Hi} {
			if !math.IsInf(v, 0) && !containsFloat(xs, v) {
				xs = append(xs, v)
			}
		}
	}
	return xs
}

func containsFloat(xs []float64, v float64) bool {
	for _, x := range xs {
		if x == v {
			return true
		}
	}
	return false
}
