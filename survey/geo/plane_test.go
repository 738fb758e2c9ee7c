package geo

import (
	"math"
	"math/rand/v2"
	"testing"
)

// meridianArc is the distance in metres along the meridian from the
// equator to latitude lat (degrees), by the series of J. P. Snyder, Map
// Projections: A Working Manual, USGS Professional Paper 1395 (1987),
// eq. 3-21 (truncated after e⁶, good to well under a millimetre over the
// short arcs used here).
func meridianArc(lat float64) float64 {
	e4, e6 := e2*e2, e2*e2*e2
	p := rad(lat)
	return SemiMajor * ((1-e2/4-3*e4/64-5*e6/256)*p -
		(3*e2/8+3*e4/32+45*e6/1024)*math.Sin(2*p) +
		(15*e4/256+45*e6/1024)*math.Sin(4*p) -
		(35*e6/3072)*math.Sin(6*p))
}

// TestEquator: along the equator, a geodesic, the distance is a·Δλ
// exactly; the plane gives a·sin Δλ, short by at most ErrorBound.
func TestEquator(t *testing.T) {
	p, err := NewPlane(0, 0)
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range []float64{1, 100, 1000, 5000, 10000} {
		e, n := p.Forward(0, deg(s/SemiMajor))
		short := s - e
		if short < -1e-9 || short > ErrorBound(s) || math.Abs(n) > 1e-9 {
			t.Errorf("s = %g m: east %.9f north %.3g; shortfall %.3g outside [0, %.3g]", s, e, n, short, ErrorBound(s))
		}
	}
}

// TestMeridian: due north of the origin, the plane's north coordinate
// against the meridian arc length (Snyder 1987).
func TestMeridian(t *testing.T) {
	for _, lat0 := range []float64{0, 30, 45, 51.5, 60, 80, -33.9} {
		p, err := NewPlane(lat0, 12.5)
		if err != nil {
			t.Fatal(err)
		}
		for _, s := range []float64{10, 1000, 5000, 10000} {
			m, _ := Radii(lat0)
			lat := lat0 + deg(s/m)
			arc := meridianArc(lat) - meridianArc(lat0)
			e, n := p.Forward(lat, 12.5)
			if short := arc - n; math.Abs(short) > ErrorBound(arc)*1.01+1e-6 || math.Abs(e) > 1e-9 {
				t.Errorf("lat0 %g, arc %.6f m: north %.6f east %.3g; shortfall %.3g, bound %.3g", lat0, arc, n, e, short, ErrorBound(arc))
			}
		}
	}
}

// TestPublishedLengths checks the radii and the arc series against the
// series for the length of one degree on WGS 84 quoted in common
// references (from memory): latitude 111132.954 − 559.822 cos 2φ +
// 1.175 cos 4φ m, longitude 111412.84 cos φ − 93.5 cos 3φ + 0.118 cos 5φ m.
func TestPublishedLengths(t *testing.T) {
	for _, lat := range []float64{0, 15, 30, 45, 60, 75} {
		c := func(k float64) float64 { return math.Cos(k * rad(lat)) }
		wantLat := 111132.954 - 559.822*c(2) + 1.175*c(4)
		wantLon := 111412.84*c(1) - 93.5*c(3) + 0.118*c(5)
		gotLat := meridianArc(lat+0.5) - meridianArc(lat-0.5)
		_, n := Radii(lat)
		gotLon := rad(1) * n * c(1)
		if math.Abs(gotLat-wantLat) > 0.1 || math.Abs(gotLon-wantLon) > 0.1 {
			t.Errorf("one degree at %g°: latitude %.3f m (want %.3f), longitude %.3f m (want %.3f)", lat, gotLat, wantLat, gotLon, wantLon)
		}
	}
}

// TestRoundTrip: Inverse undoes Forward on seeded random points up to
// 20 km from origins across the globe.
func TestRoundTrip(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	origins := [][2]float64{{0, 0}, {51.5, -0.12}, {-33.9, 151.2}, {80, 20}, {-88.9, -70}, {10, 179.99}, {10, -179.99}}
	for _, o := range origins {
		p, err := NewPlane(o[0], o[1])
		if err != nil {
			t.Fatal(err)
		}
		for range 200 {
			x, y := (rng.Float64()-0.5)*40000, (rng.Float64()-0.5)*40000
			lat, lon := p.Inverse(x, y)
			x2, y2 := p.Forward(lat, lon)
			if math.Hypot(x2-x, y2-y) > 1e-8 || lon < -180 || lon >= 180 {
				t.Fatalf("origin %v: Inverse(%g, %g) = %g, %g; Forward gives %g, %g", o, x, y, lat, lon, x2, y2)
			}
		}
	}
	p, _ := NewPlane(45, 7)
	if e, n := p.Forward(45, 7); e != 0 || n != 0 {
		t.Errorf("origin maps to (%g, %g), want (0, 0)", e, n)
	}
	if lat, _ := p.Inverse(1e8, 0); !math.IsNaN(lat) {
		t.Errorf("Inverse far beyond the earth = %g, want NaN", lat)
	}
}

func TestNewPlaneRejects(t *testing.T) {
	for _, o := range [][2]float64{{89.5, 0}, {-90, 0}, {math.NaN(), 0}, {0, 180.5}, {0, math.Inf(1)}} {
		if _, err := NewPlane(o[0], o[1]); err == nil {
			t.Errorf("NewPlane(%v) succeeded, want an error", o)
		}
	}
}

// TestDistance: one degree along the equator on the mean sphere is
// R·π/180 = 111,195.08 m.
func TestDistance(t *testing.T) {
	if d := Distance(0, 0, 0, 1); math.Abs(d-meanRadius*math.Pi/180) > 1e-6 {
		t.Errorf("Distance over 1° = %g", d)
	}
}

func BenchmarkForwardInverse(b *testing.B) {
	p, _ := NewPlane(51.5, -0.12)
	var sink float64
	for b.Loop() {
		lat, lon := p.Inverse(1234.5, -678.9)
		x, y := p.Forward(lat, lon)
		sink += x + y
	}
	_ = sink
}
