package export

import (
	"bytes"
	"encoding/json"
	"math"
	"strings"
	"testing"

	"isofield/survey/geo"
)

// writers lists the GeoJSON layers with their golden file names.
func geoLayers(b *Bundle) []struct {
	name  string
	write func(*bytes.Buffer) error
} {
	return []struct {
		name  string
		write func(*bytes.Buffer) error
	}{
		{"contours.geojson", func(w *bytes.Buffer) error { return b.WriteContoursGeoJSON(w) }},
		{"zones.geojson", func(w *bytes.Buffer) error { return b.WriteZonesGeoJSON(w) }},
		{"readings.geojson", func(w *bytes.Buffer) error { return b.WriteReadingsGeoJSON(w) }},
		{"infill.geojson", func(w *bytes.Buffer) error { return b.WriteInfillGeoJSON(w) }},
	}
}

func TestGeoJSONGoldenAndValid(t *testing.T) {
	for _, geographic := range []bool{false, true} {
		b := fixtureBundle(t, geographic)
		for _, l := range geoLayers(b) {
			name := l.name
			if geographic {
				name = "wgs84_" + name
			}
			t.Run(name, func(t *testing.T) {
				var buf bytes.Buffer
				if err := l.write(&buf); err != nil {
					t.Fatal(err)
				}
				if ps := ValidateGeoJSON(buf.Bytes(), geographic); len(ps) > 0 {
					t.Fatalf("RFC 7946 problems: %v", ps)
				}
				var doc struct {
					Type     string
					Features []json.RawMessage
				}
				if err := json.Unmarshal(buf.Bytes(), &doc); err != nil || doc.Type != "FeatureCollection" {
					t.Fatalf("encoding/json: %v (type %q)", err, doc.Type)
				}
				if len(doc.Features) == 0 {
					t.Errorf("no features: the fixture should give some")
				}
				golden(t, name, buf.Bytes())
			})
		}
	}
}

// TestGeoJSONZonesHaveHoles checks that the annulus of strong field around
// the first source (|E| vanishes right above it, closed form) is written
// as a polygon with a hole, and that the field-zone count matches the two
// sources.
func TestGeoJSONZonesHaveHoles(t *testing.T) {
	b := fixtureBundle(t, false)
	var buf bytes.Buffer
	if err := b.WriteZonesGeoJSON(&buf); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Features []struct {
			Geometry struct {
				Coordinates [][][]float64
			}
			Properties struct {
				Quantity string
				Peak     float64
			}
		}
	}
	if err := json.Unmarshal(buf.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	if len(doc.Features) != 2 {
		t.Fatalf("%d zones, want 2 (one ring of strong field per source)", len(doc.Features))
	}
	if got := len(doc.Features[0].Geometry.Coordinates); got < 2 {
		t.Errorf("strongest zone has %d rings, want an outer ring and the hole above the source", got)
	}
	// The peak on the 1 m grid lies within 10 % below the closed form's
	// largest field near the first source (searched on a 1 cm lattice).
	want := 0.0
	for dy := -300; dy <= 300; dy++ {
		for dx := -300; dx <= 300; dx++ {
			gx, gy := closedForm{}.Gradient(12+float64(dx)/100, 9+float64(dy)/100)
			want = max(want, math.Hypot(gx, gy))
		}
	}
	if p := doc.Features[0].Properties.Peak; p > want || p < 0.9*want {
		t.Errorf("strongest zone peak %g mV/m, want within [%g, %g]", p, 0.9*want, want)
	}
}

// TestGeoJSONGeographicRoundTrip checks that positions written as WGS 84
// come back to the local metres within 2 mm through the forward transform
// (rounding to 1e-8° is at most 0.6 mm in latitude, less in longitude).
func TestGeoJSONGeographicRoundTrip(t *testing.T) {
	b := fixtureBundle(t, true)
	var buf bytes.Buffer
	if err := b.WriteReadingsGeoJSON(&buf); err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Features []struct {
			Geometry struct{ Coordinates []float64 }
		}
	}
	if err := json.Unmarshal(buf.Bytes(), &doc); err != nil {
		t.Fatal(err)
	}
	p, err := geo.NewPlane(47.3712, 8.5426)
	if err != nil {
		t.Fatal(err)
	}
	for i, f := range doc.Features {
		c := f.Geometry.Coordinates
		e, n := p.Forward(c[1], c[0])
		r := b.Readings[i]
		if math.Hypot(e-r.X, n-r.Y) > 0.002 {
			t.Errorf("reading %d at (%v, %v) m comes back at (%v, %v)", i, r.X, r.Y, e, n)
		}
	}
	if !strings.Contains(buf.String(), PositionsWGS84) {
		t.Errorf("file does not state its positions are WGS 84")
	}
}
