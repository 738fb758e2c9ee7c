package export

import (
	"bytes"
	"math"
	"strings"
	"testing"
)

// FuzzReadGeoref reads arbitrary sidecars; whatever reads must write and
// read again to the same node geometry.
func FuzzReadGeoref(f *testing.F) {
	var buf bytes.Buffer
	if err := WriteGeoref(&buf, Georef{Columns: 3, Rows: 2, XFirst: 512345.5, YFirst: 5412345.5,
		XStep: 0.5, YStep: -0.5, Unit: "mV", Files: []string{"potential (mV): grid_potential.csv"},
		Lat0: math.NaN(), Lon0: math.NaN()}); err != nil {
		f.Fatal(err)
	}
	f.Add(buf.String())
	f.Add("columns = 1\nrows = 1\nx_first = 0\ny_first = 0\nx_step = 1\ny_step = -1\n")
	f.Add("# only a comment\n")
	f.Add("columns = x\n")
	f.Add("no equals sign\n")
	f.Fuzz(func(t *testing.T, in string) {
		r, err := ReadGeoref(strings.NewReader(in))
		if err != nil {
			return
		}
		var out bytes.Buffer
		if err := WriteGeoref(&out, r); err != nil {
			t.Fatal(err)
		}
		again, err := ReadGeoref(&out)
		if err != nil {
			t.Fatalf("re-reading written sidecar: %v\n%s", err, out.String())
		}
		same := again.Columns == r.Columns && again.Rows == r.Rows &&
			sameFloat(again.XFirst, r.XFirst) && sameFloat(again.YFirst, r.YFirst) &&
			sameFloat(again.XStep, r.XStep) && sameFloat(again.YStep, r.YStep)
		if !same {
			t.Fatalf("geometry changed: %+v -> %+v", r, again)
		}
	})
}

// FuzzValidateGeoJSON: the validator never panics, and the RFC's own
// examples stay valid (seeds).
func FuzzValidateGeoJSON(f *testing.F) {
	f.Add([]byte(`{"type":"FeatureCollection","features":[{"type":"Feature","geometry":{"type":"Point","coordinates":[102.0,0.5]},"properties":{"prop0":"value0"}}]}`))
	f.Add([]byte(`{"type":"Polygon","coordinates":[[[0,0],[1,0],[1,1],[0,1],[0,0]]]}`))
	f.Add([]byte(`{"type":"GeometryCollection","geometries":[{"type":"Point","coordinates":[1,2]}]}`))
	f.Add([]byte(`{"type":"MultiPolygon","coordinates":[[[[0,0],[1,0],[1,1],[0,0]]]],"bbox":[0,0,1,1]}`))
	f.Add([]byte(`[]`))
	f.Fuzz(func(t *testing.T, in []byte) {
		for _, p := range ValidateGeoJSON(in, true) {
			if p.Section == "" || p.Msg == "" {
				t.Fatalf("problem without section or message: %+v", p)
			}
		}
	})
}
