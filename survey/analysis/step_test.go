package analysis

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"isofield/interp"
	"isofield/survey/criteria"
)

// TestStepVoltageClosedForm: around one buried source, V(R) =
// ρI/(2π√(R²+d²)) decreases and is convex in the horizontal distance R for
// R > d/√2, so at a node at distance r ≥ 1 + d/√2 the largest difference
// over 1 m is V(r − 1) − V(r): one foot on the node, the other 1 m towards
// the source (closed form, Telford et al. ch. 8 for V). The nodes lie on
// the +x axis, a sampled direction, so the result must match to rounding;
// it must also exceed |E|·1 m, which understates the step near a source.
func TestStepVoltageClosedForm(t *testing.T) {
	hs := halfSpace{rho: 300, src: []source{{0, 0, 0.5, 25}}}
	for _, r := range []float64{1.5, 3, 5, 8} {
		t.Run(fmt.Sprint("r=", r), func(t *testing.T) {
			got := StepVoltage(hs, r, 0)
			want := hs.vAt(r-1) - hs.vAt(r)
			if math.Abs(got-want) > 1e-9*want {
				t.Errorf("step at r = %g: %.9g V, closed form V(r−1) − V(r) = %.9g V", r, got, want)
			}
			if e1 := hs.fieldAt(r) * 1; !(got > e1) {
				t.Errorf("step %g V not above |E|·1 m = %g V", got, e1)
			}
		})
	}
}

// TestStepVoltageUniformField: in a uniform field the largest difference
// over 1 m is |E|·1 m in every direction of the field; the sampling and
// its parabolic refinement must find it within 0.1 % (see StepVoltage).
func TestStepVoltageUniformField(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for range 50 {
		phi := rng.Float64() * 2 * math.Pi
		e := 0.5 + rng.Float64()*10
		f := linear{rng.NormFloat64(), e * math.Cos(phi), e * math.Sin(phi)}
		got := StepVoltage(f, rng.NormFloat64(), rng.NormFloat64())
		if got > e*(1+1e-12) || got < e*(1-1e-3) {
			t.Fatalf("step in a uniform %g V/m field at %.1f°: %g V, want %g V within 0.1 %%", e, phi*180/math.Pi, got, e)
		}
	}
}

// TestStepGridMatchesPointwise checks the parallel grid pass against the
// single-point function: equal on a coarse grid, where the interpolant is
// sampled directly, and within 1 % (see hermiteMaxSpacing) on grids read
// through a Hermite surface, refined or their own; NaN at masked nodes.
func TestStepGridMatchesPointwise(t *testing.T) {
	hs := halfSpace{rho: 100, src: []source{{0.3, 0.2, 1, 10}, {-3, 2, 0.7, -5}}}
	tests := []struct {
		name string
		h    float64
		tol  float64
	}{
		{"direct", 2, 0},
		{"refined", 0.5, 0.01},
		{"own surface", 0.2, 0.01},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			g, _ := interp.NewGrid(-6, -6, 6, 6, tt.h, 0)
			g.Mask[7] = true
			evaluate(g, hs)
			st, err := StepGrid(context.Background(), hs, g)
			if err != nil {
				t.Fatal(err)
			}
			for j := range g.NY {
				for i := range g.NX {
					k := g.Index(i, j)
					x, y := g.Node(i, j)
					want := StepVoltage(hs, x, y)
					switch {
					case k == 7 && !math.IsNaN(st[k]):
						t.Errorf("masked node has step %g", st[k])
					case k != 7 && !(math.Abs(st[k]-want) <= tt.tol*want):
						t.Fatalf("node (%g, %g): grid %g, pointwise %g (tolerance %g)", x, y, st[k], want, tt.tol)
					}
				}
			}
		})
	}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	g := interp.NewGridN(0, 0, 2, 2, 5, 5)
	evaluate(g, hs)
	if _, err := StepGrid(ctx, hs, g); err == nil {
		t.Errorf("StepGrid with a cancelled context returned no error")
	}
}

// TestGroundingZones runs the grounding preset over one source scaled to
// a fault: step zones around the source where V(r−1) − V(r) exceeds the
// tolerable step voltage, touch within reach of a structure, and the
// cautions of FIELD_FACTS §7.
func TestGroundingZones(t *testing.T) {
	// 300 A into 100 Ω·m soil at 0.5 m depth; readings in volts at fault.
	hs := halfSpace{rho: 100, src: []source{{0, 0, 0.5, 300}}}
	set := criteria.Settings{Preset: criteria.Grounding, SoilRho: 100, FaultScaled: true,
		GPR: hs.vAt(0), Structure: []criteria.Point{{X: -1, Y: -3}, {X: 1, Y: -3}}}
	r, g := analyse(t, hs, 8, 0.1, set, "V")
	lim := r.Criterion.StepLimit
	// Closed form: the step voltage at distance r is V(r−1) − V(r) (for r
	// ≥ 1.4 here); the zone reaches out to where that equals the limit.
	rEdge := bisect(func(x float64) float64 { return hs.vAt(x-1) - hs.vAt(x) - lim }, 1.4, 8)
	var step *Zone
	for i := range r.Zones {
		if r.Zones[i].Quantity == QuantityStep {
			step = &r.Zones[i]
			break
		}
	}
	if step == nil || r.Zones[0].Quantity != QuantityTouch && r.Zones[0].Quantity != QuantityStep {
		t.Fatalf("no step zone ranked first among %d zones", len(r.Zones))
	}
	want := math.Pi * rEdge * rEdge
	t.Logf("step zone %.3f m², closed form %.3f m² (r = %.3f m)", step.AreaM2, want, rEdge)
	if rel := math.Abs(step.AreaM2-want) / want; rel > 0.01 {
		t.Errorf("step zone area %.2f m², closed-form disc of radius %.3f m: %.2f m² (rel. %.3f > 1 %%)", step.AreaM2, rEdge, want, rel)
	}
	for j := range g.NY {
		for i := range g.NX {
			x, y := g.Node(i, j)
			near := math.Abs(x) <= 1 && math.Abs(y+3) <= 1 || math.Hypot(math.Abs(x)-1, y+3) <= 1
			if got := !math.IsNaN(r.Touch[g.Index(i, j)]); got != near {
				t.Fatalf("node (%g, %g): touch computed %v, within reach %v", x, y, got, near)
			}
		}
	}
	if c := strings.Join(r.Criterion.Cautions, " "); !strings.Contains(c, "current injection") || !strings.Contains(c, "licensed engineer") {
		t.Errorf("grounding result lacks the cautions: %q", c)
	}
}

func BenchmarkStepGrid(b *testing.B) {
	hs := halfSpace{rho: 100, src: []source{{-20, 5, 2, 10}, {25, -10, 3, -10}}}
	for _, n := range []int{100, 500} {
		g := interp.NewGridN(-50, -50, 100/float64(n-1), 100/float64(n-1), n, n)
		evaluate(g, hs)
		b.Run(fmt.Sprintf("n=%dx%d", n, n), func(b *testing.B) {
			for b.Loop() {
				if _, err := StepGrid(context.Background(), hs, g); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkStepGridModel measures the step pass on a fitted thin-plate
// spline of 500 readings: at 1 m spacing it evaluates the model (35 values
// per node), at 0.25 m the grid's Hermite surface.
func BenchmarkStepGridModel(b *testing.B) {
	hs := halfSpace{rho: 100, src: []source{{-20, 5, 2, 10}, {25, -10, 3, -10}}}
	rng := rand.New(rand.NewPCG(11, 12))
	var xs, ys, vs []float64
	for range 500 {
		x, y := rng.Float64()*100-50, rng.Float64()*100-50
		xs, ys, vs = append(xs, x), append(ys, y), append(vs, hs.Value(x, y))
	}
	m, err := interp.Fit(context.Background(), xs, ys, vs, interp.Options{})
	if err != nil {
		b.Skipf("interp.Fit: %v", err)
	}
	for _, h := range []float64{1, 0.25} {
		g, _ := interp.NewGrid(-50, -50, 50, 50, h, 0)
		if err := interp.Evaluate(context.Background(), m, g, nil); err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprintf("N=500/h=%g/n=%dx%d", h, g.NX, g.NY), func(b *testing.B) {
			for b.Loop() {
				if _, err := StepGrid(context.Background(), m, g); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

func TestAnalyzeProgress(t *testing.T) {
	hs := halfSpace{rho: 100, src: []source{{0, 0, 0.5, 300}}}
	g := interp.NewGridN(-3, -3, 0.5, 0.5, 13, 13)
	evaluate(g, hs)
	var got []int
	in := Input{Grid: g, Model: hs, Unit: "V", Criteria: criteria.Settings{Preset: criteria.Grounding},
		Progress: func(d, total int) {
			if total != 100 {
				t.Errorf("progress total %d, want 100", total)
			}
			got = append(got, d)
		}}
	if _, err := Analyze(context.Background(), in); err != nil {
		t.Fatal(err)
	}
	if len(got) < 13 || got[len(got)-1] != 100 || !slices.IsSorted(got) {
		t.Errorf("progress %v, want a rising sequence through the 13 step rows to 100", got)
	}
}
