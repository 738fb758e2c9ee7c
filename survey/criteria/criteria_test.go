package criteria

import (
	"encoding/json"
	"errors"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"isofield/survey"
	"isofield/survey/electrode"
	"isofield/survey/qa"
)

// TestIEEE80WorkedValues checks the tolerable voltages against the worked
// values of the IEEE Std 80 design example as FIELD_FACTS §3 gives them:
// ρ = 400 Ω·m, ρ_s = 2500 Ω·m, h_s = 0.102 m, t_s = 0.5 s. The arithmetic
// is checked (status V); the formulas and the example's place in the
// standard are from memory (status M).
func TestIEEE80WorkedValues(t *testing.T) {
	cs, err := SurfaceDerating(400, 2500, 0.102)
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(cs-0.7429) > 5e-5 {
		t.Errorf("C_s = %.5f, want 0.7429 (IEEE Std 80 example, from memory)", cs)
	}
	// The example rounds C_s to 0.74 before using it.
	tests := []struct {
		name string
		kg   float64
		step bool
		want float64 // volts, given to 0.1 V
	}{
		{"touch 70 kg", 70, false, 838.2},
		{"step 70 kg", 70, true, 2686.6},
		{"touch 50 kg", 50, false, 619.3},
		{"step 50 kg", 50, true, 1985.0},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			k, err := BodyConstant(tt.kg)
			if err != nil {
				t.Fatal(err)
			}
			got := TouchLimit(0.74, 2500, k, 0.5)
			if tt.step {
				got = StepLimit(0.74, 2500, k, 0.5)
			}
			if math.Abs(got-tt.want) > 0.05 {
				t.Errorf("%s = %.2f V, want %.1f V (IEEE Std 80 example via FIELD_FACTS §3, from memory)", tt.name, got, tt.want)
			}
		})
	}
}

func TestIEEE80Settings(t *testing.T) {
	tests := []struct {
		name    string
		set     Settings
		wantCs  float64
		wantErr string
	}{
		{"example", Settings{BodyKg: 70, ClearingTime: 0.5, SoilRho: 400, SurfaceRho: 2500, SurfaceDepth: 0.102}, 0.7429, ""},
		{"no surface layer", Settings{SoilRho: 100}, 1, ""},
		{"bad weight", Settings{BodyKg: 60}, 0, "want 50 or 70"},
		{"long clearing", Settings{ClearingTime: 5}, 0, "holds for"},
		{"layer without soil", Settings{SurfaceRho: 3000, SurfaceDepth: 0.1}, 0, "soil resistivity"},
		{"negative", Settings{SoilRho: -1}, 0, "not negative"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			tol, err := IEEE80(tt.set)
			if tt.wantErr != "" {
				if err == nil || !strings.Contains(err.Error(), tt.wantErr) {
					t.Fatalf("IEEE80(%+v) error %v, want one containing %q", tt.set, err, tt.wantErr)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			if math.Abs(tol.Cs-tt.wantCs) > 5e-5 {
				t.Errorf("C_s = %.5f, want %g", tol.Cs, tt.wantCs)
			}
			if tol.StepV != StepLimit(tol.Cs, tol.RhoS, tol.K, tol.Clearing) || tol.TouchV <= 0 {
				t.Errorf("inconsistent limits %+v", tol)
			}
		})
	}
	// Without a surface layer the person stands on the soil:
	// E_step = (1000 + 6·100)·0.116/√0.5 with the defaults (50 kg, 0.5 s).
	tol, _ := IEEE80(Settings{SoilRho: 100})
	if want := 1600 * 0.116 / math.Sqrt(0.5); math.Abs(tol.StepV-want) > 1e-9 {
		t.Errorf("step without layer %g V, want %g V", tol.StepV, want)
	}
}

// TestC876Bands checks the band edges of ASTM C876 (App. X1, quoted in a
// secondary source): above −200 mV CSE low, −200 to −350 uncertain (both
// edges), below −350 high, in mV and in V.
func TestC876Bands(t *testing.T) {
	for _, unit := range []string{"mV", "V"} {
		c, err := Resolve(Settings{Preset: Concrete, Scale: electrode.CSE}, unit)
		if err != nil {
			t.Fatal(err)
		}
		f := 1.0
		if unit == "V" {
			f = 1e-3
		}
		tests := []struct {
			mv   float64
			want int
		}{{-100, 0}, {-199.9, 0}, {-200, 1}, {-275, 1}, {-350, 1}, {-350.1, 2}, {-600, 2}}
		for _, tt := range tests {
			if got := ClassOf(c.Classes, tt.mv*f); got != tt.want {
				t.Errorf("%s: %g mV CSE in class %d, want %d", unit, tt.mv, got, tt.want)
			}
		}
		if !c.HasBelow || math.Abs(c.Below-(-350*f)) > 1e-12 {
			t.Errorf("%s: flag below %g, want −350 mV", unit, c.Below)
		}
		if want := DefaultConcreteGradientMV * f; c.Field != want || !strings.Contains(c.FieldLabel, "practice") {
			t.Errorf("%s: gradient threshold %g (%q), want %g labelled practice", unit, c.Field, c.FieldLabel, want)
		}
	}
}

// TestCPReferenceConversion converts the −850 mV CSE criterion to other
// scales and compares with the equivalences of 49 CFR 192 App. D:
// −780 mV SCE and −800 mV Ag/AgCl in seawater. The tolerances are the
// spread of the electrode tables: published CSE values span 0.300 to 0.318 V
// (so ±10 mV for SCE), and the seawater electrode sits 50 to 70 mV from CSE
// with salinity (±20 mV).
func TestCPReferenceConversion(t *testing.T) {
	tests := []struct {
		name  string
		scale electrode.Reference
		want  float64
		tol   float64
	}{
		{"CSE", electrode.CSE, -850, 0},
		{"not stated is CSE", electrode.None, -850, 0},
		{"SCE", electrode.SCE, -780, 10},
		{"Ag/AgCl seawater", electrode.AgAgClSeawater, -800, 20},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			c, err := Resolve(Settings{Preset: CP, Scale: tt.scale}, "mV")
			if err != nil {
				t.Fatal(err)
			}
			if !c.HasAbove || math.Abs(c.Above-tt.want) > tt.tol {
				t.Errorf("−850 mV CSE on %v = %g mV, want %g ± %g (49 CFR 192 App. D)", tt.scale, c.Above, tt.want, tt.tol)
			}
			if !c.FieldAuto {
				t.Errorf("cp without a threshold should use the automatic field threshold")
			}
			if !strings.Contains(strings.Join(c.Warnings, " "), "IR drop") {
				t.Errorf("cp criterion lacks the IR-drop caveat")
			}
		})
	}
}

func TestGroundingCriterion(t *testing.T) {
	set := Settings{Preset: Grounding, BodyKg: 70, SoilRho: 400, SurfaceRho: 2500, SurfaceDepth: 0.102, GPR: 3000, FaultScaled: true}
	c, err := Resolve(set, "mV")
	if err != nil {
		t.Fatal(err)
	}
	if !c.Step || !c.Touch || math.Abs(c.StepLimit-1000*c.Tolerable.StepV) > 1e-9 {
		t.Errorf("grounding in mV: step %v touch %v, limit %g for %g V", c.Step, c.Touch, c.StepLimit, c.Tolerable.StepV)
	}
	if len(c.Cautions) < 5 {
		t.Errorf("grounding shows %d cautions, want the energised-work ones too", len(c.Cautions))
	}
	if !strings.Contains(strings.Join(c.Warnings, " "), "no structure given") {
		t.Errorf("missing the caveat for touch voltage without a structure: %q", c.Warnings)
	}
}

func TestConcreteWarnings(t *testing.T) {
	c, err := Resolve(Settings{Preset: Concrete, CoverMM: 90, Conditions: []string{"coated"}}, "mV")
	if err != nil {
		t.Fatal(err)
	}
	w := strings.Join(c.Warnings, "\n")
	for _, want := range []string{"coated", "90 mm", "§4.8"} {
		if !strings.Contains(w, want) {
			t.Errorf("warnings %q lack %q", w, want)
		}
	}
	if _, err := Resolve(Settings{Preset: Concrete, Conditions: []string{"rusty"}}, "mV"); err == nil {
		t.Errorf("unknown condition accepted")
	}
	if _, err := Resolve(Settings{Preset: "bridge"}, "mV"); err == nil {
		t.Errorf("unknown preset accepted")
	}
}

func TestLink(t *testing.T) {
	c, q := Settings{Preset: Concrete}, qa.Settings{}
	if notes := Link(&c, &q); q.To != electrode.CSE || c.Scale != electrode.CSE || len(notes) != 1 {
		t.Errorf("Link(concrete) set To=%v Scale=%v notes %q, want CSE and a note", q.To, c.Scale, notes)
	}
	c, q = Settings{Preset: CP}, qa.Settings{To: electrode.SCE}
	Link(&c, &q)
	if q.To != electrode.SCE || c.Scale != electrode.SCE {
		t.Errorf("Link(cp) changed a stated scale: To=%v Scale=%v", q.To, c.Scale)
	}
	c, q = Settings{Preset: Grounding}, qa.Settings{FaultCurrent: 2000, TestCurrent: 10}
	Link(&c, &q)
	if !c.FaultScaled {
		t.Errorf("Link(grounding) did not record the fault scaling")
	}
}

func TestFitPlane(t *testing.T) {
	plane := func(x, y float64) float64 { return 5 + 0.02*x - 0.01*y }
	rng := rand.New(rand.NewPCG(3, 4))
	var xs, ys, vs []float64
	for range 100 {
		x, y := rng.Float64()*500, 1e6+rng.Float64()*300
		xs, ys, vs = append(xs, x), append(ys, y), append(vs, plane(x, y)+rng.NormFloat64()*0.1)
	}
	exact := append([]float64(nil), vs...)
	for i := range 5 { // strong anomalies, as over a sulfide body
		vs[i] -= 300
	}
	tests := []struct {
		name string
		vs   []float64
		tol  float64 // on B and C, U/m
	}{
		{"noisy plane", exact, 1e-3},
		{"plane with 5 % anomalies", vs, 2e-3},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p, err := FitPlane(xs, ys, tt.vs)
			if err != nil {
				t.Fatal(err)
			}
			if math.Abs(p.B-0.02) > tt.tol || math.Abs(p.C+0.01) > tt.tol {
				t.Errorf("gradient (%g, %g), want (0.02, −0.01) ± %g", p.B, p.C, tt.tol)
			}
		})
	}
	if _, err := FitPlane([]float64{0, 1, 2}, []float64{0, 1, 2}, []float64{1, 2, 3}); !errors.Is(err, ErrPlane) {
		t.Errorf("collinear readings: error %v, want ErrPlane", err)
	}
	if _, err := FitPlane([]float64{0, 1}, []float64{0, 1}, []float64{1, math.NaN()}); !errors.Is(err, ErrPlane) {
		t.Errorf("too few readings: error %v, want ErrPlane", err)
	}
}

func TestPrepareSP(t *testing.T) {
	s := &survey.Survey{Unit: survey.Millivolt}
	var vals []float64
	for j := range 6 {
		for i := range 6 {
			x, y := float64(i*10), float64(j*10)
			s.Readings = append(s.Readings, survey.Reading{X: x, Y: y})
			v := 20 + 0.5*x + 0.25*y
			if i == 3 && j == 3 {
				v -= 80
			}
			vals = append(vals, v)
		}
	}
	orig := append([]float64(nil), vals...)
	got, notes, err := Prepare(s, vals, Settings{Preset: SP})
	if err != nil {
		t.Fatal(err)
	}
	for i := range vals {
		if vals[i] != orig[i] {
			t.Fatalf("Prepare modified its input")
		}
	}
	if math.Abs(got[3*6+3]+80) > 1 || math.Abs(got[0]) > 1 {
		t.Errorf("after detrending: anomaly %g (want ≈ −80), background %g (want ≈ 0)", got[21], got[0])
	}
	if len(notes) != 1 || !strings.Contains(notes[0], "trend removed") {
		t.Errorf("notes %q", notes)
	}
}

func TestClassJSON(t *testing.T) {
	c, err := Resolve(Settings{Preset: Concrete}, "mV")
	if err != nil {
		t.Fatal(err)
	}
	b, err := json.Marshal(c.Classes)
	if err != nil {
		t.Fatal(err)
	}
	var back []Class
	if err := json.Unmarshal(b, &back); err != nil {
		t.Fatal(err)
	}
	for i := range back {
		if back[i] != c.Classes[i] {
			t.Errorf("class %d after JSON: %+v, want %+v", i, back[i], c.Classes[i])
		}
	}
}
