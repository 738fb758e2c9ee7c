package survey

import (
	"math"
	"testing"

	"isofield/survey/geo"
)

// TestGeographic reads latitude and longitude, converts them about the
// centre and gives them back.
func TestGeographic(t *testing.T) {
	s, err := Load([]string{"testdata/geographic.csv"}, LoadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if s.Geo == nil || !s.Files[0].Geographic || s.Unit != Volt {
		t.Fatalf("Geo %v, geographic %v, unit %v", s.Geo, s.Files[0].Geographic, s.Unit)
	}
	if math.Abs(s.Geo.Lat0-51.50045) > 1e-12 || math.Abs(s.Geo.Lon0+0.1193) > 1e-12 {
		t.Errorf("centre %v, want 51.50045, -0.1193", *s.Geo)
	}
	// North-south spacing: 0.0009° of latitude is M·Δφ metres, M the
	// meridian radius of curvature (closed form, NGA TR8350.2).
	m, n := geo.Radii(s.Geo.Lat0)
	wantDy := m * 0.0009 * math.Pi / 180
	if dy := s.Readings[1].Y - s.Readings[0].Y; math.Abs(dy-wantDy) > 0.01 {
		t.Errorf("north spacing %.4f m, want %.4f", dy, wantDy)
	}
	wantDx := n * math.Cos(51.5*math.Pi/180) * 0.0014 * math.Pi / 180
	if dx := s.Readings[2].X - s.Readings[0].X; math.Abs(dx-wantDx) > 0.01 {
		t.Errorf("east spacing %.4f m, want %.4f", dx, wantDx)
	}
	for i, r := range s.Readings {
		lat, lon := s.Geo.ToLatLon(r.X, r.Y)
		wl, wo := []float64{51.5, 51.5009, 51.5, 51.5009}[i], []float64{-0.12, -0.12, -0.1186, -0.1186}[i]
		if math.Abs(lat-wl) > 1e-11 || math.Abs(lon-wo) > 1e-11 {
			t.Errorf("reading %d back to %.12f, %.12f; want %g, %g", i, lat, lon, wl, wo)
		}
		if x, y := s.Geo.FromLatLon(wl, wo); math.Abs(x-r.X) > 1e-9 || math.Abs(y-r.Y) > 1e-9 {
			t.Errorf("FromLatLon(%g, %g) = %g, %g; want %g, %g", wl, wo, x, y, r.X, r.Y)
		}
		if r.TestCurrent != 20 {
			t.Errorf("test current %g, want 20 A", r.TestCurrent)
		}
	}
	if !hasNote(s, "WGS 84 local tangent plane") {
		t.Errorf("notes %q lack the conversion", s.Notes)
	}
}

// TestGeoNearPole refuses a survey centred within 1° of a pole.
func TestGeoNearPole(t *testing.T) {
	_, err := parseString("lat,lon,v\n89.5,0,1\n89.6,0,2\n89.5,1,3\n", LoadOptions{})
	if err == nil {
		t.Fatal("survey at 89.5° accepted, want an error")
	}
}

// TestAntimeridian centres a survey that crosses 180° between its points.
func TestAntimeridian(t *testing.T) {
	s, err := parseString("lat,lon,v\n-17,179.9995,1\n-17,-179.9995,2\n-16.999,179.9995,3\n", LoadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(math.Abs(s.Geo.Lon0)-180) > 1e-9 {
		t.Errorf("centre longitude %g, want ±180", s.Geo.Lon0)
	}
	_, n := geo.Radii(-17)
	want := n * math.Cos(17*math.Pi/180) * 0.001 * math.Pi / 180
	if dx := s.Readings[1].X - s.Readings[0].X; math.Abs(dx-want) > 0.01 {
		t.Errorf("east spacing across 180° = %g m, want %g", dx, want)
	}
	if lat, lon := s.Geo.ToLatLon(s.Readings[1].X, s.Readings[1].Y); math.Abs(lat+17) > 1e-11 || math.Abs(lon+179.9995) > 1e-11 {
		t.Errorf("back to %g, %g; want -17, -179.9995", lat, lon)
	}
}
