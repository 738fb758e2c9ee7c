package export

import (
	"bytes"
	"errors"
	"io"
	"math"
	"strconv"
	"strings"
	"testing"

	"isofield/interp"
	"isofield/survey"
)

func TestWriteGridCSVHeader(t *testing.T) {
	tests := []struct {
		name, unit string
		extra      []Column
		want       string
	}{
		{"volts", "V", nil, "x_m,y_m,potential_V,ex_V_per_m,ey_V_per_m,field_V_per_m,flagged"},
		{"millivolts", "mV", nil, "x_m,y_m,potential_mV,ex_mV_per_m,ey_mV_per_m,field_mV_per_m,flagged"},
		{"extra column", "mV", []Column{{Name: "class", Values: []float64{1}}},
			"x_m,y_m,potential_mV,ex_mV_per_m,ey_mV_per_m,field_mV_per_m,flagged,class"},
		{"formula-like extra name neutralised", "V", []Column{{Name: "=SUM(A1)", Values: []float64{1}}},
			"x_m,y_m,potential_V,ex_V_per_m,ey_V_per_m,field_V_per_m,flagged,'=SUM(A1)"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			g := closedFormGrid(0, 0, 1, 1, 1, 1, nil)
			var b bytes.Buffer
			if err := WriteGridCSV(&b, g, tt.unit, nil, tt.extra); err != nil {
				t.Fatal(err)
			}
			head, _, _ := strings.Cut(b.String(), "\n")
			if head != tt.want {
				t.Errorf("header = %q, want %q", head, tt.want)
			}
		})
	}
}

// TestWriteGridCSVField checks the field columns against the closed form of
// a buried point source (Telford et al., Applied Geophysics, 1990, ch. 8):
// ex = -dV/dx, ey = -dV/dy, field = |E|, and masked rows per the contract.
func TestWriteGridCSVField(t *testing.T) {
	const x0, y0, d = 512345.25, 5412345.75, 0.5 // projected metres
	mask := func(i, j int) bool { return i == 0 && j == 1 }
	g := closedFormGrid(x0, y0, d, 80, 60, 1000, mask)
	flags := make([]bool, g.Len())
	flags[3] = true
	var b bytes.Buffer
	if err := WriteGridCSV(&b, g, "mV", flags, nil); err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(strings.TrimSuffix(b.String(), "\n"), "\n")
	if got, want := len(lines), 1+g.Len(); got != want {
		t.Fatalf("%d lines, want %d", got, want)
	}
	for k, line := range lines[1:] {
		i, j := k%g.NX, k/g.NX
		checkGridRow(t, line, i, j, x0, y0, d, mask(i, j), k == 3)
	}
}

// checkGridRow compares one written row with the closed form.
func checkGridRow(t *testing.T, line string, i, j int, x0, y0, d float64, masked, flag bool) {
	t.Helper()
	c := strings.Split(line, ",")
	x, _ := strconv.ParseFloat(c[0], 64)
	y, _ := strconv.ParseFloat(c[1], 64)
	if x != x0+float64(i)*d || y != y0+float64(j)*d {
		t.Fatalf("node (%d,%d) at (%s, %s), want (%v, %v)", i, j, c[0], c[1], x0+float64(i)*d, y0+float64(j)*d)
	}
	if masked {
		if got := strings.Join(c[2:], ","); got != ",,,,0" {
			t.Fatalf("masked node (%d,%d) cells %q, want \",,,,0\"", i, j, got)
		}
		return
	}
	lx, ly := float64(i)*d, float64(j)*d
	var v, ex, ey float64
	for _, s := range testSources {
		dx, dy := s.gradient(lx, ly)
		v, ex, ey = v+1000*s.value(lx, ly), ex-1000*dx, ey-1000*dy
	}
	want := []float64{v, ex, ey, math.Hypot(ex, ey)}
	for k, w := range want {
		got, err := strconv.ParseFloat(c[2+k], 64)
		if err != nil || math.Abs(got-w) > 1e-12*math.Max(1, math.Abs(w)) {
			t.Fatalf("node (%d,%d) column %d = %q, want %v", i, j, 3+k, c[2+k], w)
		}
	}
	if wantFlag := map[bool]string{true: "1", false: "0"}[flag]; c[6] != wantFlag {
		t.Fatalf("node (%d,%d) flagged %q, want %q", i, j, c[6], wantFlag)
	}
}

func TestGridCSVRoundTrip(t *testing.T) {
	tests := []struct {
		name   string
		x0, y0 float64
		d      float64
		nx, ny int
		unit   string
	}{
		{"local metres", 0, 0, 0.25, 33, 21, "mV"},
		{"projected seven-digit northing", 654321.125, 5987654.5, 0.1, 17, 40, "V"},
		{"single row", -3, 7, 2, 9, 1, "V"},
		{"single column", 5, -2, 1, 1, 6, "mV"},
		{"several chunks written in parallel", 1000.5, 2000.25, 0.5, 250, 100, "mV"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			mask := func(i, j int) bool { return (i+2*j)%7 == 0 }
			g := closedFormGrid(tt.x0, tt.y0, tt.d, tt.nx, tt.ny, 1, mask)
			flags := make([]bool, g.Len())
			extra := Column{Name: "class", Values: make([]float64, g.Len())}
			for k := range flags {
				flags[k] = !g.Mask[k] && k%3 == 0
				extra.Values[k] = float64(k % 4)
				if k%5 == 0 {
					extra.Values[k] = math.NaN()
				}
			}
			var b bytes.Buffer
			if err := WriteGridCSV(&b, g, tt.unit, flags, []Column{extra}); err != nil {
				t.Fatal(err)
			}
			gf, err := ReadGridCSV(&b, "grid.csv")
			if err != nil {
				t.Fatal(err)
			}
			if gf.Unit != tt.unit {
				t.Errorf("unit %q, want %q", gf.Unit, tt.unit)
			}
			compareGrids(t, gf, g, flags, extra)
		})
	}
}

// compareGrids demands the same shape, node coordinates within a micrometre
// (the spacing is rebuilt from the end nodes, so the last bits may differ), bit-equal values and gradients, and equal flags and extras.
func compareGrids(t *testing.T, gf *GridFile, g *interp.Grid, flags []bool, extra Column) {
	t.Helper()
	h := gf.Grid
	if h.NX != g.NX || h.NY != g.NY {
		t.Fatalf("read %dx%d nodes, wrote %dx%d", h.NX, h.NY, g.NX, g.NY)
	}
	for k := range g.Len() {
		i, j := k%g.NX, k/g.NX
		hx, hy := h.Node(i, j)
		x, y := g.Node(i, j)
		if math.Abs(hx-x) > 1e-6 || math.Abs(hy-y) > 1e-6 {
			t.Fatalf("node %d read at (%v, %v), written at (%v, %v)", k, hx, hy, x, y)
		}
		if h.Mask[k] != g.Mask[k] || !sameFloat(h.V[k], g.V[k]) ||
			!sameFloat(h.GX[k], g.GX[k]) || !sameFloat(h.GY[k], g.GY[k]) {
			t.Fatalf("node %d read (%v %v %v %v), written (%v %v %v %v)", k,
				h.Mask[k], h.V[k], h.GX[k], h.GY[k], g.Mask[k], g.V[k], g.GX[k], g.GY[k])
		}
		if gf.Flagged[k] != flags[k] || !sameFloat(gf.Extra[0].Values[k], extra.Values[k]) {
			t.Fatalf("node %d flag/extra read (%v, %v), written (%v, %v)", k,
				gf.Flagged[k], gf.Extra[0].Values[k], flags[k], extra.Values[k])
		}
	}
}

// sameFloat reports a == b, counting two NaNs as equal.
func sameFloat(a, b float64) bool { return a == b || (math.IsNaN(a) && math.IsNaN(b)) }

func TestReadGridCSVErrors(t *testing.T) {
	head := "x_m,y_m,potential_V,ex_V_per_m,ey_V_per_m,field_V_per_m,flagged\n"
	tests := []struct {
		name, in  string
		line, col int
		cause     error
	}{
		{"empty", "", 0, 0, survey.ErrEmpty},
		{"wrong header", "x,y,v\n", 1, 0, ErrGridHeader},
		{"bad unit", "x_m,y_m,potential_kV,ex_kV_per_m,ey_kV_per_m,field_kV_per_m,flagged\n", 1, 0, ErrGridHeader},
		{"header only", head, 0, 0, survey.ErrNoReadings},
		{"text value", head + "0,0,abc,1,1,1,0\n", 2, 3, survey.ErrNotNumber},
		{"empty x", head + ",0,1,1,1,1,0\n", 2, 1, survey.ErrNotNumber},
		{"infinite", head + "0,0,Inf,1,1,1,0\n", 2, 3, survey.ErrNonFinite},
		{"bad flag", head + "0,0,1,1,1,1,2\n", 2, 7, survey.ErrOutOfRange},
		{"ragged", head + "0,0,1,1,1,1\n", 2, 0, survey.ErrFieldCount},
		{"not a lattice", head + "0,0,1,1,1,1,0\n1,0,1,1,1,1,0\n5,0,1,1,1,1,0\n", 0, 0, ErrGridShape},
		{"rows not a multiple", head + "0,0,1,1,1,1,0\n1,0,1,1,1,1,0\n0,1,1,1,1,1,0\n", 0, 0, ErrGridShape},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := ReadGridCSV(strings.NewReader(tt.in), "g.csv")
			var pe *survey.ParseError
			if !errors.As(err, &pe) {
				t.Fatalf("ReadGridCSV(%q) error %v, want a *survey.ParseError", tt.in, err)
			}
			if pe.File != "g.csv" || pe.Line != tt.line || pe.Column != tt.col || !errors.Is(err, tt.cause) {
				t.Errorf("ReadGridCSV(%q) = %v (line %d col %d), want line %d col %d cause %v",
					tt.in, err, pe.Line, pe.Column, tt.line, tt.col, tt.cause)
			}
		})
	}
}

// BenchmarkWriteGridCSV writes square grids at a projected origin and
// 0.1 m spacing (short-decimal coordinates, a northing in e notation), and
// the shape of `isofield grid --spacing 1` over a 1000 m × 750 m site:
// integer coordinates and an integer band column.
func BenchmarkWriteGridCSV(b *testing.B) {
	type benchCase struct {
		name  string
		g     *interp.Grid
		extra []Column
	}
	var cases []benchCase
	for _, n := range []int{100, 1000} {
		g := closedFormGrid(654321.5, 5987654.25, 0.1, n, n, 1000, func(i, j int) bool { return i < n/10 })
		cases = append(cases, benchCase{"nodes=" + strconv.Itoa(n*n), g, nil})
	}
	g := closedFormGrid(0, 0, 1, 1000, 750, 1000, nil)
	band := make([]float64, g.Len())
	for k, v := range g.V {
		band[k] = math.Floor(v / 200)
	}
	cases = append(cases, benchCase{"1000x750,unit-spacing,band", g, []Column{{Name: "band", Values: band}}})
	for _, c := range cases {
		flags := make([]bool, c.g.Len())
		for k := range flags {
			flags[k] = k%11 == 0
		}
		b.Run(c.name, func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if err := WriteGridCSV(io.Discard, c.g, "mV", flags, c.extra); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
