package mapview

import (
	"fmt"
	"math"
	"strings"
	"testing"

	"github.com/muesli/termenv"

	"isofield/interp"
)

// fill sets V, GX, GY at every node of g from f and its gradient.
func fill(g *interp.Grid, f func(x, y float64) (v, gx, gy float64)) {
	for j := range g.NY {
		for i := range g.NX {
			x, y := g.Node(i, j)
			k := g.Index(i, j)
			g.V[k], g.GX[k], g.GY[k] = f(x, y)
		}
	}
}

// halfSpace is the surface potential of point currents I (amperes) buried
// at depth d in ground of resistivity rho: V = ρI/(2π√(r²+d²)), image
// method (Telford, Geldart & Sheriff, Applied Geophysics, 2nd ed., ch. 8),
// with its analytic gradient.
func halfSpace(rho, d float64, src [][3]float64) func(x, y float64) (float64, float64, float64) {
	return func(x, y float64) (v, gx, gy float64) {
		for _, s := range src {
			dx, dy := x-s[0], y-s[1]
			R := math.Sqrt(dx*dx + dy*dy + d*d)
			c := rho * s[2] / (2 * math.Pi)
			v += c / R
			gx -= c * dx / (R * R * R)
			gy -= c * dy / (R * R * R)
		}
		return v, gx, gy
	}
}

func demoData(nx, ny int) *Data {
	g := interp.NewGridN(0, 0, 1, 1, nx, ny)
	fill(g, halfSpace(100, 2, [][3]float64{{float64(nx) / 3, float64(ny) / 2, 1}, {2 * float64(nx) / 3, float64(ny) / 2, -1}}))
	lo, hi := Range(g)
	return NewData(g, NiceBands(lo, hi, 0), NiceBands(0, FieldMax(g), 0), nil, nil)
}

func TestPaletteAnchorsAndNeutral(t *testing.T) {
	for _, p := range []Palette{DivergingPuOr(), SequentialViridis(), SequentialYlOrRd()} {
		t.Run(p.Name, func(t *testing.T) {
			lo, hi := 0.0, 1.0
			if p.Diverges {
				lo = -1
			}
			if got, want := p.At(lo), p.Anchors[0]; got != want {
				t.Errorf("At(%g) = %v, want first anchor %v", lo, got, want)
			}
			if got, want := p.At(hi), p.Anchors[len(p.Anchors)-1]; got != want {
				t.Errorf("At(%g) = %v, want last anchor %v", hi, got, want)
			}
			if p.Diverges {
				// ColorBrewer's diverging schemes have a light neutral
				// middle class (#f7f7f7 in PuOr).
				if got := p.At(0).Hex(); got != "#f7f7f7" {
					t.Errorf("At(0) = %s, want the neutral #f7f7f7", got)
				}
			}
		})
	}
}

func TestContrastWCAG(t *testing.T) {
	// Check values from the WCAG 2.1 definitions (W3C): white has relative
	// luminance 1, black 0, and their contrast ratio is 21:1.
	white, black := RGB{255, 255, 255}, RGB{0, 0, 0}
	if got := Luminance(white); math.Abs(got-1) > 1e-12 {
		t.Errorf("Luminance(white) = %g, want 1", got)
	}
	if got := Contrast(black, white); math.Abs(got-21) > 1e-12 {
		t.Errorf("Contrast(black, white) = %g, want 21", got)
	}
	// Every band colour gets ink that meets WCAG 2.1 SC 1.4.3 (4.5:1).
	for _, p := range []Palette{DivergingPuOr(), SequentialViridis(), SequentialYlOrRd()} {
		for i := range 101 {
			bg := p.At(float64(i)/50 - 1)
			if c := Contrast(Ink(bg), bg); c < 4.5 {
				t.Errorf("%s: ink on %s has contrast %.2f < 4.5", p.Name, bg.Hex(), c)
			}
		}
	}
}

func TestNiceBands(t *testing.T) {
	tests := []struct {
		name         string
		lo, hi, step float64
		want         []float64
		scale        Scale
	}{
		{"signed auto", -430, 120, 0, []float64{-450, -400, -350, -300, -250, -200, -150, -100, -50, 0, 50, 100, 150}, Diverging},
		{"one-signed user", 2, 9, 2, []float64{2, 4, 6, 8, 10}, Sequential},
		{"too fine widened", 0, 100, 0.001, []float64{0, 10, 20, 30, 40, 50, 60, 70, 80, 90, 100}, Sequential},
		{"flat", 5, 5, 1, []float64{5, 6}, Sequential},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			b := NiceBands(tt.lo, tt.hi, tt.step)
			if !equal(b.Edges, tt.want) || b.Scale != tt.scale {
				t.Errorf("NiceBands(%g, %g, %g) = %v scale %d, want %v scale %d", tt.lo, tt.hi, tt.step, b.Edges, b.Scale, tt.want, tt.scale)
			}
		})
	}
}

func equal(a, b []float64) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if math.Abs(a[i]-b[i]) > 1e-9*max(1, math.Abs(b[i])) {
			return false
		}
	}
	return true
}

func TestBandIndexAndTone(t *testing.T) {
	b := Bands{Edges: []float64{-300, -200, -100, 0, 100}, Scale: Diverging}
	tests := []struct {
		v    float64
		want int
	}{{-350, 0}, {-300, 0}, {-200, 1}, {-0.1, 2}, {0, 3}, {99, 3}, {1e9, 3}, {math.NaN(), -1}}
	for _, tt := range tests {
		if got := b.Index(tt.v); got != tt.want {
			t.Errorf("Index(%g) = %d, want %d", tt.v, got, tt.want)
		}
	}
	if got := b.Tone(0); math.Abs(got+250.0/300) > 1e-12 {
		t.Errorf("Tone(0) = %g, want -250/300", got)
	}
	if got := b.Tone(3); math.Abs(got-50.0/300) > 1e-12 {
		t.Errorf("Tone(3) = %g, want 50/300", got)
	}
}

// TestRenderLinearField renders V = x, the potential between parallel
// plates (a uniform field; standard electrostatics), and checks each cell's
// glyph against the band of the exact value at the cell's centre, allowing a
// different band only within half a grid spacing of a band edge (nearest-
// node sampling).
func TestRenderLinearField(t *testing.T) {
	g := interp.NewGridN(-50, 0, 1, 1, 101, 41)
	fill(g, func(x, y float64) (float64, float64, float64) { return x, 1, 0 })
	d := NewData(g, NiceBands(-50, 50, 10), NiceBands(0, 1, 0), nil, nil)
	r := NewRenderer(termenv.Ascii, DivergingPuOr(), SequentialViridis(), SequentialYlOrRd())
	v := Fit(g, 101, 21)
	v.Layers = LayerBands
	lines := strings.Split(r.Render(d, v), "\n")
	if len(lines) != v.Height {
		t.Fatalf("got %d lines, want %d", len(lines), v.Height)
	}
	for row, line := range lines {
		for c, got := range []rune(line) {
			x, _ := v.CellCentre(c, row)
			want := r.BandGlyph(d, v, d.Potential.Index(x))
			nearEdge := math.Abs(x-10*math.Round(x/10)) <= g.DX/2+1e-9
			if got != want && !nearEdge {
				t.Fatalf("cell (%d,%d) x=%.2f: glyph %q, want %q", c, row, x, got, want)
			}
		}
	}
}

// TestRenderHalfSpaceSigns checks that cells where the closed-form
// potential of a positive and a negative buried source is clearly negative
// (or positive) carry a glyph of the negative (or positive) ramp.
func TestRenderHalfSpaceSigns(t *testing.T) {
	d := demoData(120, 60)
	f := halfSpace(100, 2, [][3]float64{{40, 30, 1}, {80, 30, -1}})
	r := NewRenderer(termenv.Ascii, DivergingPuOr(), SequentialViridis(), SequentialYlOrRd())
	v := Fit(d.Grid, 200, 60)
	v.Layers = LayerBands
	for row, line := range strings.Split(r.Render(d, v), "\n") {
		for c, got := range []rune(line) {
			x, y := v.CellCentre(c, row)
			want, _, _ := f(x, y)
			if got == ' ' || math.Abs(want) < 0.3 {
				continue
			}
			neg := strings.ContainsRune(rampNegative, got)
			if (want < 0) != neg {
				t.Fatalf("cell (%d,%d) V=%.3f: glyph %q on the wrong side of zero", c, row, want, got)
			}
		}
	}
}

// TestZeroLine draws band edges on V = x (a uniform field): the line at
// x = 0 is drawn with the zero glyph in the column where the sign changes,
// other edges with the ordinary line glyph.
func TestZeroLine(t *testing.T) {
	g := interp.NewGridN(-50, 0, 1, 1, 101, 41)
	fill(g, func(x, y float64) (float64, float64, float64) { return x, 1, 0 })
	d := NewData(g, NiceBands(-50, 50, 10), NiceBands(0, 1, 0), nil, nil)
	r := NewRenderer(termenv.Ascii, DivergingPuOr(), SequentialViridis(), SequentialYlOrRd())
	v := Fit(g, 101, 21)
	v.Layers = LayerBands | LayerContours
	for row, line := range strings.Split(r.Render(d, v), "\n") {
		cells := []rune(line)
		for c, got := range cells {
			x, _ := v.CellCentre(c, row)
			switch {
			case got == '0' && math.Abs(x) > 1.5:
				t.Fatalf("zero glyph at x = %g", x)
			case got == '|' && math.Abs(x) < 0.5:
				t.Fatalf("ordinary line glyph on the zero line at x = %g", x)
			}
		}
		if !strings.ContainsRune(line, '0') || strings.Count(line, "|") != 8 {
			t.Fatalf("row %d: want one zero line and eight other edges: %q", row, line)
		}
	}
}

func TestFitKeepsAspect(t *testing.T) {
	g := interp.NewGridN(0, 0, 1, 1, 101, 101) // 100 m × 100 m
	v := Fit(g, 80, 24)
	// Rows are two columns tall: 24 rows hold 48 columns' worth of metres,
	// so the square fills 48 columns and all 24 rows.
	c0, r0, _ := v.Cell(0, 100)
	c1, r1, _ := v.Cell(100, 0)
	if w, h := c1-c0, r1-r0; w < 46 || w > 49 || h < 22 || h > 24 {
		t.Errorf("100 m square spans %d columns × %d rows, want about 48 × 24", w, h)
	}
}

func TestArrowsPointDownhill(t *testing.T) {
	// V = -x: E = -∇V = (1, 0) points east everywhere.
	g := interp.NewGridN(0, 0, 1, 1, 61, 31)
	fill(g, func(x, y float64) (float64, float64, float64) { return -x, -1, 0 })
	d := NewData(g, NiceBands(-60, 0, 0), NiceBands(0, 1, 0), nil, nil)
	r := NewRenderer(termenv.Ascii, DivergingPuOr(), SequentialViridis(), SequentialYlOrRd())
	v := Fit(g, 60, 15)
	v.Layers = LayerArrows
	out := r.Render(d, v)
	if n := strings.Count(out, "→"); n == 0 {
		t.Errorf("no east arrows in\n%s", out)
	}
	if strings.ContainsAny(out, "↗↑↖←↙↓↘") {
		t.Errorf("arrows other than east in a uniform eastward field:\n%s", out)
	}
}

func TestOverlaysAndColour(t *testing.T) {
	d := demoData(60, 30)
	d.Points = []Point{{10, 10, KindReading}, {20, 10, KindSuspect}, {30, 10, KindExcluded}, {40, 20, KindSuggestion}}
	tests := []struct {
		name    string
		profile termenv.Profile
		half    bool
		want    []string
		notWant []string
	}{
		{"mono", termenv.Ascii, false, []string{"+", "?", "x", "^", "@"}, []string{"\x1b[", "▀"}},
		{"mono ignores half-block", termenv.Ascii, true, []string{"+"}, []string{"▀", "\x1b["}},
		{"true colour", termenv.TrueColor, false, []string{"\x1b[", "48;2;"}, []string{"▀"}},
		{"half-block", termenv.TrueColor, true, []string{"▀", "48;2;"}, nil},
		{"256 colours", termenv.ANSI256, false, []string{"48;5;"}, []string{"48;2;"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			r := NewRenderer(tt.profile, DivergingPuOr(), SequentialViridis(), SequentialYlOrRd())
			v := Fit(d.Grid, 60, 15)
			v.Layers = DefaultLayers
			v.HalfBlock = tt.half
			v.ShowCursor, v.CursorX, v.CursorY = true, 30, 25
			out := r.Render(d, v)
			for _, w := range tt.want {
				if !strings.Contains(out, w) {
					t.Errorf("output lacks %q", w)
				}
			}
			for _, w := range tt.notWant {
				if strings.Contains(out, w) {
					t.Errorf("output has %q", w)
				}
			}
		})
	}
}

func TestScaleBar(t *testing.T) {
	v := View{Width: 80, Height: 24, MPC: 0.5}
	// A quarter of 80 columns at 0.5 m is 10 m: the bar is 10 m, 20 cells.
	if got, want := ScaleBar(v, 80), "N↑  |"+strings.Repeat("-", 18)+"| 10 m"; got != want {
		t.Errorf("ScaleBar = %q, want %q", got, want)
	}
	for _, tt := range []struct {
		m    float64
		want string
	}{{0.5, "500 mm"}, {20, "20 m"}, {2000, "2 km"}} {
		if got := Distance(tt.m); got != tt.want {
			t.Errorf("Distance(%g) = %q, want %q", tt.m, got, tt.want)
		}
	}
}

func TestRenderDegenerate(t *testing.T) {
	r := NewRenderer(termenv.TrueColor, DivergingPuOr(), SequentialViridis(), SequentialYlOrRd())
	g := interp.NewGridN(0, 0, 1, 1, 1, 1)
	g.V[0] = math.NaN()
	for name, d := range map[string]*Data{"nil": nil, "one NaN node": NewData(g, Bands{}, Bands{}, nil, nil)} {
		out := r.Render(d, View{Width: 5, Height: 2, MPC: 1, Layers: DefaultLayers | LayerContours | LayerArrows})
		if strings.Count(out, "\n") != 1 {
			t.Errorf("%s: got %q, want two lines", name, out)
		}
	}
}

func BenchmarkRender(b *testing.B) {
	d := demoData(300, 200)
	for _, sz := range [][2]int{{80, 24}, {200, 60}, {400, 120}} {
		for _, mode := range []string{"resample", "cursor"} {
			b.Run(fmt.Sprintf("size=%dx%d/%s", sz[0], sz[1], mode), func(b *testing.B) {
				r := NewRenderer(termenv.TrueColor, DivergingPuOr(), SequentialViridis(), SequentialYlOrRd())
				v := Fit(d.Grid, sz[0], sz[1])
				v.Layers = DefaultLayers | LayerContours | LayerArrows
				v.ShowCursor = true
				b.ReportAllocs()
				for i := 0; b.Loop(); i++ {
					if mode == "resample" {
						v.CX += 1e-6 // a new view: sample again
					}
					v.CursorX = float64(i % 100)
					_ = r.Render(d, v)
				}
			})
		}
	}
}
