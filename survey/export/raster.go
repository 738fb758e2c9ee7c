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
	value    func(k int) float64 // node value, NaN where unusable
	levels   []float64
	interval float64
	colours  []color.RGBA
}

// rasterize draws the layer's bands into a w × h image covering the nodes'
// extent [X0, X0+(NX-1)DX] × [Y0, Y0+(NY-1)DY], row 0 at the north. Each
// pixel takes the band of the bilinear interpolation of its cell's corners
// (the surface marching squares contours), or of the nearest node when a
// corner is unusable; pixels with no usable value are transparent.
// Rows are shared out among all cores.
func (l *layer) rasterize(w, h int) *image.RGBA {
	img := image.NewRGBA(image.Rect(0, 0, w, h))
	workers := max(1, min(runtime.GOMAXPROCS(0), h))
	var wg sync.WaitGroup
	for p := range workers {
		wg.Go(func() {
			for py := p; py < h; py += workers {
				l.rasterRow(img, py, w, h)
			}
		})
	}
	wg.Wait()
	return img
}

// rasterRow fills image row py.
func (l *layer) rasterRow(img *image.RGBA, py, w, h int) {
	g := l.grid
	fy := (1 - (float64(py)+0.5)/float64(h)) * float64(g.NY-1)
	for px := range w {
		fx := (float64(px) + 0.5) / float64(w) * float64(g.NX-1)
		v := l.sample(fx, fy)
		if math.IsNaN(v) {
			continue
		}
		img.SetRGBA(px, py, l.colours[contour.Band(v, l.levels)])
	}
}

// sample returns the value at fractional node position (fx, fy).
func (l *layer) sample(fx, fy float64) float64 {
	g := l.grid
	i, j := min(int(fx), max(g.NX-2, 0)), min(int(fy), max(g.NY-2, 0))
	u, v := fx-float64(i), fy-float64(j)
	if g.NX < 2 || g.NY < 2 {
		return l.value(g.Index(int(math.Round(fx)), int(math.Round(fy))))
	}
	c00, c10 := l.value(g.Index(i, j)), l.value(g.Index(i+1, j))
	c01, c11 := l.value(g.Index(i, j+1)), l.value(g.Index(i+1, j+1))
	s := (1-u)*(1-v)*c00 + u*(1-v)*c10 + (1-u)*v*c01 + u*v*c11
	if !math.IsNaN(s) {
		return s
	}
	return l.value(g.Index(i+int(math.Round(u)), j+int(math.Round(v))))
}
