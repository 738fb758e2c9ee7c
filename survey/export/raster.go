package export

import (
	"image"
	"image/color"
	"math"
	"runtime"
	"sync"

	"isofield/interp"
	"isofield/interp/contour"
)

// layer is one quantity drawn as bands on a map.
type layer struct {
	grid     *interp.Grid
	vals     []float64 // node values, NaN where unusable
	levels   []float64
	interval float64
	colours  []color.RGBA
}

// newLayer evaluates value at every node once.
func newLayer(g *interp.Grid, value func(k int) float64, levels []float64, interval float64, colours []color.RGBA) *layer {
	vals := make([]float64, g.Len())
	for k := range vals {
		vals[k] = value(k)
	}
	return &layer{grid: g, vals: vals, levels: levels, interval: interval, colours: colours}
}

// rasterize draws the layer's bands into a w × h image covering the nodes'
// extent [X0, X0+(NX-1)DX] × [Y0, Y0+(NY-1)DY], row 0 at the north. Each
// pixel takes the band of the bilinear interpolation of its cell's corners
// (the surface marching squares contours), or of the nearest node when a
// corner is unusable; pixels with no usable value are transparent. The
// image is paletted (index 0 transparent, band b at b+1), which keeps the
// PNG inside an SVG small and quick to encode; with more than 255 bands it
// is RGBA. Rows are shared out among all cores.
func (l *layer) rasterize(w, h int) image.Image {
	var img interface {
		image.Image
		Set(x, y int, c color.Color)
	}
	var set func(x, y, band int)
	if len(l.colours) < 256 {
		pal := color.Palette{color.RGBA{}}
		for _, c := range l.colours {
			pal = append(pal, c)
		}
		p := image.NewPaletted(image.Rect(0, 0, w, h), pal)
		img, set = p, func(x, y, b int) { p.SetColorIndex(x, y, uint8(b+1)) }
	} else {
		r := image.NewRGBA(image.Rect(0, 0, w, h))
		img, set = r, func(x, y, b int) { r.SetRGBA(x, y, l.colours[b]) }
	}
	workers := max(1, min(runtime.GOMAXPROCS(0), h))
	var wg sync.WaitGroup
	for p := range workers {
		wg.Go(func() {
			for py := p; py < h; py += workers {
				l.rasterRow(set, py, w, h)
			}
		})
	}
	wg.Wait()
	return img
}

// rasterRow fills image row py through set.
func (l *layer) rasterRow(set func(x, y, band int), py, w, h int) {
	g := l.grid
	fy := (1 - (float64(py)+0.5)/float64(h)) * float64(g.NY-1)
	for px := range w {
		fx := (float64(px) + 0.5) / float64(w) * float64(g.NX-1)
		v := l.sample(fx, fy)
		if math.IsNaN(v) {
			continue
		}
		set(px, py, contour.Band(v, l.levels))
	}
}

// sample returns the value at fractional node position (fx, fy).
func (l *layer) sample(fx, fy float64) float64 {
	g := l.grid
	if g.NX < 2 || g.NY < 2 {
		return l.vals[g.Index(int(math.Round(fx)), int(math.Round(fy)))]
	}
	i, j := min(int(fx), g.NX-2), min(int(fy), g.NY-2)
	u, v := fx-float64(i), fy-float64(j)
	k := g.Index(i, j)
	c00, c10 := l.vals[k], l.vals[k+1]
	c01, c11 := l.vals[k+g.NX], l.vals[k+g.NX+1]
	s := (1-u)*(1-v)*c00 + u*(1-v)*c10 + (1-u)*v*c01 + u*v*c11
	if !math.IsNaN(s) {
		return s
	}
	return l.vals[g.Index(i+int(math.Round(u)), j+int(math.Round(v)))]
}
