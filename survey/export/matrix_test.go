package export

import (
	"bytes"
	"context"
	"encoding/csv"
	"math"
	"strconv"
	"testing"

	"isofield/interp"
)

// TestMatrixRoundTrip rebuilds every node's position and value from the
// matrix file and its sidecar alone, with the sidecar's formula, and
// compares them with the grid.
func TestMatrixRoundTrip(t *testing.T) {
	tests := []struct {
		name       string
		geographic bool
	}{
		{"local metres", false},
		{"from latitude and longitude", true},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			b := fixtureBundle(t, tt.geographic)
			g := b.Grid
			var mat, side bytes.Buffer
			if err := WriteMatrix(&mat, g, func(k int) float64 { return g.V[k] }); err != nil {
				t.Fatal(err)
			}
			if err := WriteGeoref(&side, b.georefOf([]string{"potential: grid_potential.csv"})); err != nil {
				t.Fatal(err)
			}
			ref, err := ReadGeoref(&side)
			if err != nil {
				t.Fatal(err)
			}
			if tt.geographic != !math.IsNaN(ref.Lat0) {
				t.Errorf("origin_lat %v for geographic=%v", ref.Lat0, tt.geographic)
			}
			rows, err := csv.NewReader(&mat).ReadAll()
			if err != nil {
				t.Fatal(err)
			}
			if len(rows) != ref.Rows || len(rows[0]) != ref.Columns {
				t.Fatalf("matrix %d×%d, sidecar says %d×%d", len(rows), len(rows[0]), ref.Rows, ref.Columns)
			}
			for r, row := range rows {
				for c, cell := range row {
					checkMatrixCell(t, g, ref, r, c, cell)
				}
			}
		})
	}
}

// checkMatrixCell finds the grid node at the sidecar's position of cell
// (r, c) and compares values bit for bit (NaN where masked).
func checkMatrixCell(t *testing.T, g *interp.Grid, ref Georef, r, c int, cell string) {
	t.Helper()
	x := ref.XFirst + float64(c)*ref.XStep
	y := ref.YFirst + float64(r)*ref.YStep
	i := int(math.Round((x - g.X0) / g.DX))
	j := int(math.Round((y - g.Y0) / g.DY))
	gx, gy := g.Node(i, j)
	if math.Abs(gx-x) > 1e-9 || math.Abs(gy-y) > 1e-9 {
		t.Fatalf("cell (%d,%d) at (%v, %v) is no node (nearest (%v, %v))", r, c, x, y, gx, gy)
	}
	v, err := strconv.ParseFloat(cell, 64)
	if err != nil {
		t.Fatalf("cell (%d,%d) %q: %v", r, c, cell, err)
	}
	if want := g.V[g.Index(i, j)]; !sameFloat(v, want) {
		t.Fatalf("cell (%d,%d) = %v, node (%d,%d) = %v", r, c, v, i, j, want)
	}
}

// TestGridFilesGolden pins the grid CSV (with the analysis's extra
// columns), the potential matrix and the sidecar of the fixed survey.
func TestGridFilesGolden(t *testing.T) {
	res, cfg := fixtureSurvey(false)
	b, err := FromResult(context.Background(), res, cfg, Options{Version: "test"})
	if err != nil {
		t.Fatal(err)
	}
	flagged, extra := GridColumns(res)
	g := b.Grid
	files := []struct {
		name  string
		write func(*bytes.Buffer) error
	}{
		{"grid.csv", func(w *bytes.Buffer) error { return WriteGridCSV(w, g, b.Unit, flagged, extra) }},
		{"grid_potential.csv", func(w *bytes.Buffer) error { return WriteMatrix(w, g, func(k int) float64 { return g.V[k] }) }},
		{"grid_georef.txt", func(w *bytes.Buffer) error {
			return WriteGeoref(w, b.georefOf([]string{"potential (mV): grid_potential.csv"}))
		}},
	}
	for _, f := range files {
		t.Run(f.name, func(t *testing.T) {
			var buf bytes.Buffer
			if err := f.write(&buf); err != nil {
				t.Fatal(err)
			}
			golden(t, f.name, buf.Bytes())
		})
	}
}
