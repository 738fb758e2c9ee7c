package analysis

import (
	"context"
	"fmt"
	"math"
	"strings"
	"testing"

	"isofield/interp"
	"isofield/interp/contour"
	"isofield/survey/criteria"
)

// analyse runs Analyze on f over [-l, l]² at spacing h, with readings on a
// lattice of spacing 1 m.
func analyse(t testing.TB, f interp.Interpolant, l, h float64, set criteria.Settings, unit string) (*Result, *interp.Grid) {
	t.Helper()
	g, err := interp.NewGrid(-l, -l, l, l, h, 0)
	if err != nil {
		t.Fatal(err)
	}
	evaluate(g, f)
	xs, ys, vs, idx := square(f, -l, -l, 1, int(2*l)+1)
	r, err := Analyze(context.Background(), Input{Grid: g, Model: f, X: xs, Y: ys, V: vs, Index: idx, Unit: unit, Criteria: set})
	if err != nil {
		t.Fatal(err)
	}
	return r, g
}

// TestFieldZoneAnnulus: around one buried source the field |E| =
// ρI/(2π)·r/(r²+d²)^{3/2} rises to a maximum at r = d/√2 and falls again,
// so |E| ≥ T holds on the annulus r1 ≤ r ≤ r2 (closed form, Telford et al.
// ch. 8). The zone must be one ring with a hole, of area π(r2² − r1²)
// within 1 % at a spacing of 0.05 m (the count of node cells misses at most
// a band of half a cell along the two circles).
func TestFieldZoneAnnulus(t *testing.T) {
	hs := halfSpace{rho: 100, src: []source{{0, 0, 2, 10}}}
	const T = 5.0
	rPeak := 2 / math.Sqrt2
	r1 := bisect(func(r float64) float64 { return hs.fieldAt(r) - T }, 0, rPeak)
	r2 := bisect(func(r float64) float64 { return hs.fieldAt(r) - T }, rPeak, 20)
	want := math.Pi * (r2*r2 - r1*r1)
	r, _ := analyse(t, hs, 6, 0.05, criteria.Settings{FieldThreshold: T}, "V")
	if len(r.Zones) != 1 {
		t.Fatalf("%d zones, want 1", len(r.Zones))
	}
	z := r.Zones[0]
	t.Logf("annulus area %.4f m², closed form %.4f m²", z.AreaM2, want)
	if rel := math.Abs(z.AreaM2-want) / want; rel > 0.01 {
		t.Errorf("annulus area %.3f m², closed form %.3f m² (r1 %.3f, r2 %.3f): rel. error %.4f > 1 %%", z.AreaM2, want, r1, r2, rel)
	}
	if len(z.Holes) != 1 {
		t.Errorf("annulus has %d holes, want 1", len(z.Holes))
	}
	if a := contour.RingArea(z.Outline); math.Abs(a-math.Pi*r2*r2)/(math.Pi*r2*r2) > 0.02 {
		t.Errorf("outer ring area %.3f, want ≈ π r2² = %.3f (counter-clockwise)", a, math.Pi*r2*r2)
	}
	if math.Hypot(z.CentroidX, z.CentroidY) > 0.05 {
		t.Errorf("centroid (%g, %g), want the source at (0, 0)", z.CentroidX, z.CentroidY)
	}
	peak := hs.fieldAt(rPeak)
	if math.Abs(z.Peak-peak)/peak > 1e-3 || math.Abs(math.Hypot(z.PeakX, z.PeakY)-rPeak) > 0.05 {
		t.Errorf("peak %g at r = %g, want %g at r = d/√2 = %g", z.Peak, math.Hypot(z.PeakX, z.PeakY), peak, rPeak)
	}
	if z.Quantity != QuantityField || z.Rank != 1 || r.FieldThreshold != T {
		t.Errorf("zone %q rank %d threshold %g", z.Quantity, z.Rank, r.FieldThreshold)
	}
	if len(z.Readings) == 0 || z.NearestReading < 0 {
		t.Errorf("zone lists no readings inside (%v) or nearest reading %d", z.Readings, z.NearestReading)
	}
}

// TestFieldAndAzimuth: in a uniform field E = (3, 4) V/m (V = −3x − 4y)
// every node has |E| = 5 V/m pointing at azimuth atan2(3, 4) = 36.87°.
func TestFieldAndAzimuth(t *testing.T) {
	r, g := analyse(t, linear{0, -3, -4}, 3, 0.5, criteria.Settings{}, "V")
	want := math.Atan2(3, 4) * 180 / math.Pi
	for k := range g.V {
		if math.Abs(r.Field[k]-5) > 1e-12 || math.Abs(r.Azimuth[k]-want) > 1e-9 {
			t.Fatalf("node %d: |E| %g azimuth %g, want 5 and %g", k, r.Field[k], r.Azimuth[k], want)
		}
	}
	if len(r.Arrows) == 0 || r.Arrows[0].EX != 3 || r.Arrows[0].EY != 4 {
		t.Errorf("arrows %v, want E = (3, 4)", r.Arrows[:min(1, len(r.Arrows))])
	}
	if len(r.Zones) != 0 || len(r.Contours) == 0 {
		t.Errorf("generic preset without thresholds: %d zones, %d contours", len(r.Zones), len(r.Contours))
	}
	if n := len(r.Levels) + 1; n < contour.MinBands || n > contour.MaxBands {
		t.Errorf("automatic interval %g gives %d bands", r.Interval, n)
	}
	// V = −3x − 4y over [−3, 3]² spans ±21 V; bands of 5 V from −21.
	lo, hi := r.BandRange(0)
	if r.Interval != 5 || lo != -21 || hi != -20 {
		t.Errorf("interval %g, band 0 from %g to %g; want 5 V, −21 to −20", r.Interval, lo, hi)
	}
	if lo, hi := r.BandRange(len(r.Levels)); lo != 20 || hi != 21 {
		t.Errorf("last band from %g to %g, want 20 to 21", lo, hi)
	}
	if lo, _ := r.BandRange(-1); !math.IsNaN(lo) {
		t.Errorf("band -1 has a range")
	}
}

// TestConcreteClasses: V falls linearly from −100 to −500 mV CSE across
// x, so the C876 classes take x-shares of 25 % (above −200), 37.5 %
// (−200 to −350) and 37.5 % (below −350), within one column of nodes.
func TestConcreteClasses(t *testing.T) {
	r, g := analyse(t, linear{-300, -50, 0}, 4, 0.05, criteria.Settings{Preset: criteria.Concrete}, "mV")
	want := []float64{0.25, 0.375, 0.375}
	tol := 1.0 / float64(g.NX)
	if len(r.Classes) != 3 {
		t.Fatalf("%d classes, want 3", len(r.Classes))
	}
	for i, c := range r.Classes {
		if math.Abs(c.Share-want[i]) > tol {
			t.Errorf("class %q share %.4f, want %.4f ± %.4f", c.Class.Name, c.Share, want[i], tol)
		}
	}
	// The gradient is 50 mV/m, under the 150 mV/m practice threshold: the
	// only zone is the potential one below −350 mV.
	if len(r.Zones) != 1 || r.Zones[0].Quantity != QuantityPotential || r.Zones[0].Peak > -499 {
		t.Fatalf("zones %+v, want one potential zone peaking near −500 mV", r.Zones)
	}
	if !strings.Contains(r.Zones[0].Label, "-350 mV CSE") {
		t.Errorf("zone label %q lacks its limit", r.Zones[0].Label)
	}
}

func TestCumulative(t *testing.T) {
	got := Cumulative([]float64{-300, math.NaN(), -100, -200})
	want := []CumPoint{{-300, 100.0 / 6}, {-200, 50}, {-100, 500.0 / 6}}
	if len(got) != len(want) {
		t.Fatalf("Cumulative = %v, want %v", got, want)
	}
	for i := range want {
		if got[i].Value != want[i].Value || math.Abs(got[i].Percent-want[i].Percent) > 1e-12 {
			t.Errorf("Cumulative[%d] = %v, want %v (Hazen plotting position)", i, got[i], want[i])
		}
	}
}

func TestQuantile(t *testing.T) {
	cum := Cumulative([]float64{-400, -300, -200, -100}) // at 12.5, 37.5, 62.5, 87.5 %
	tests := []struct {
		p, want float64
	}{{0, -400}, {12.5, -400}, {25, -350}, {50, -250}, {87.5, -100}, {100, -100}}
	for _, tt := range tests {
		if got := Quantile(cum, tt.p); got != tt.want {
			t.Errorf("Quantile(%g %%) = %g, want %g", tt.p, got, tt.want)
		}
	}
	if !math.IsNaN(Quantile(nil, 50)) {
		t.Errorf("Quantile of no readings is not NaN")
	}
}

func TestAnalyzeBadInput(t *testing.T) {
	g := interp.NewGridN(0, 0, 1, 1, 3, 3)
	tests := []struct {
		name string
		in   Input
	}{
		{"no grid", Input{}},
		{"short slices", Input{Grid: &interp.Grid{NX: 2, NY: 2}}},
		{"reading lengths", Input{Grid: g, X: []float64{1}}},
		{"bad preset", Input{Grid: g, Criteria: criteria.Settings{Preset: "bridge"}}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if _, err := Analyze(context.Background(), tt.in); err == nil {
				t.Errorf("Analyze(%s) returned no error", tt.name)
			}
		})
	}
}

func TestAnalyzeMasked(t *testing.T) {
	g := interp.NewGridN(0, 0, 1, 1, 4, 4)
	for k := range g.Mask {
		g.Mask[k] = true
	}
	evaluate(g, linear{0, 1, 0})
	r, err := Analyze(context.Background(), Input{Grid: g, Unit: "V", Criteria: criteria.Settings{FieldThreshold: 0.5}, Suggest: 3})
	if err != nil {
		t.Fatal(err)
	}
	if len(r.Zones) != 0 || len(r.Contours) != 0 || r.NodeBand[0] != -1 || !math.IsNaN(r.Field[0]) {
		t.Errorf("fully masked grid gave zones %d, contours %d, band %d, field %g", len(r.Zones), len(r.Contours), r.NodeBand[0], r.Field[0])
	}
}

func BenchmarkAnalyze(b *testing.B) {
	hs := halfSpace{rho: 100, src: []source{{-20, 5, 2, 10}, {25, -10, 3, -10}}}
	for _, n := range []int{200, 1000} {
		g := interp.NewGridN(-50, -50, 100/float64(n-1), 100/float64(n-1), n, n)
		evaluate(g, hs)
		xs, ys, vs, idx := square(hs, -50, -50, 5, 21)
		in := Input{Grid: g, Model: hs, X: xs, Y: ys, V: vs, Index: idx, Unit: "V",
			Criteria: criteria.Settings{FieldThreshold: 0.5}, Suggest: 10}
		b.Run(fmt.Sprintf("n=%dx%d", n, n), func(b *testing.B) {
			for b.Loop() {
				if _, err := Analyze(context.Background(), in); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// TestAutoFieldThreshold: the cp and sp presets without --threshold flag
// the top 5 % of the field. On V = x² over [−4, 4]² the field is 2|x|, so
// the threshold is 2·0.95·4 = 7.6 V/m to within one column of nodes, and
// about 5 % of the nodes are flagged.
func TestAutoFieldThreshold(t *testing.T) {
	sq := quadratic{}
	for _, preset := range []string{criteria.CP, criteria.SP} {
		t.Run(preset, func(t *testing.T) {
			r, g := analyse(t, sq, 4, 0.05, criteria.Settings{Preset: preset}, "V")
			if math.Abs(r.FieldThreshold-7.6) > 2*0.05*2 {
				t.Errorf("automatic threshold %g V/m, want 7.6 (95th percentile of 2|x|)", r.FieldThreshold)
			}
			n := 0
			for _, z := range r.Zones {
				if z.Quantity == QuantityField {
					n += z.Nodes
				}
			}
			if share := float64(n) / float64(g.Len()); math.Abs(share-0.05) > 0.01 {
				t.Errorf("%.3f of the nodes flagged on the field, want about 0.05", share)
			}
		})
	}
}

// quadratic is V = x².
type quadratic struct{}

func (quadratic) Value(x, y float64) float64               { return x * x }
func (quadratic) Gradient(x, y float64) (float64, float64) { return 2 * x, 0 }
