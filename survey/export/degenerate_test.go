package export

import (
	"bytes"
	"io"
	"math"
	"testing"

	"isofield/interp"
	"isofield/survey"
)

// TestDegenerateBundles draws, reports and writes GeoJSON for bundles at
// the edges: every node masked, one row of nodes, a constant surface, no
// readings. None may fail or panic, and the GeoJSON must stay valid.
func TestDegenerateBundles(t *testing.T) {
	if testing.Short() {
		t.Skip("renders several maps; run without -short")
	}
	allMasked := closedFormGrid(0, 0, 1, 5, 4, 1, func(int, int) bool { return true })
	oneRow := closedFormGrid(0, 0, 1, 7, 1, 1, nil)
	constant := interp.NewGridN(10, 20, 2, 2, 4, 3)
	for k := range constant.V {
		constant.V[k] = -350
	}
	tests := []struct {
		name string
		g    *interp.Grid
	}{
		{"all masked", allMasked},
		{"one row", oneRow},
		{"constant", constant},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			b := &Bundle{Title: tt.name, Unit: "mV", Version: "test", Grid: tt.g,
				Survey: &survey.Survey{Unit: survey.Millivolt}, Interval: 1}
			if err := b.WriteMapSVG(io.Discard, PotentialMap); err != nil {
				t.Errorf("potential map: %v", err)
			}
			if err := b.WriteMapPNG(io.Discard, FieldMap, 20); err != nil {
				t.Errorf("field map: %v", err)
			}
			if err := b.WriteReport(io.Discard); err != nil {
				t.Errorf("report: %v", err)
			}
			for _, w := range []func(io.Writer) error{b.WriteContoursGeoJSON, b.WriteZonesGeoJSON, b.WriteReadingsGeoJSON} {
				var buf bytes.Buffer
				if err := w(&buf); err != nil {
					t.Fatal(err)
				}
				if ps := ValidateGeoJSON(buf.Bytes(), false); len(ps) > 0 {
					t.Errorf("%s: %v", buf.String(), ps)
				}
			}
			if err := WriteMatrix(io.Discard, tt.g, func(k int) float64 { return math.NaN() }); err != nil {
				t.Error(err)
			}
		})
	}
}
