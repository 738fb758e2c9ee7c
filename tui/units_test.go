package tui

import (
	"fmt"
	"math"
	"regexp"
	"strconv"
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"

	"isofield/survey/criteria"
	"isofield/survey/pipeline"
	"isofield/survey/qa"
)

// TestDisplayUnit checks the choice of unit and the text it gives. The
// factors are the SI prefixes m = 10⁻³ and k = 10³ (BIPM, The
// International System of Units, 9th ed., 2019, table 7): 1234567 mV is
// 1234.567 V.
func TestDisplayUnit(t *testing.T) {
	nan, inf := math.NaN(), math.Inf(1)
	tests := []struct {
		name     string
		unit     string
		lo, hi   float64
		v        float64 // a value to show
		wantUnit string
		want     string // d.with(v)
	}{
		{"small millivolts", "mV", -350, 120, -350.25, "mV", "-350.2 mV"},
		{"just under the step", "mV", 0, 9999, 9999, "mV", "9999 mV"},
		{"at the step", "mV", 0, 10000, 10000, "V", "10 V"},
		{"fault-scaled", "mV", 0, 1234567, 1234567, "V", "1235 V"},
		{"negative range", "mV", -1234567, -5, -1234567, "V", "-1235 V"},
		{"small value in a large range", "mV", -2e5, 3e5, 42, "V", "0.042 V"},
		{"to kilovolts", "mV", 0, 2.5e7, 2.5e7, "kV", "25 kV"},
		{"kilovolts is the largest", "mV", 0, 3e10, 3e10, "kV", "30000 kV"},
		{"volts stay", "V", -12, 9999, 500, "V", "500 V"},
		{"volts to kilovolts", "V", 0, 12000, 12000, "kV", "12 kV"},
		{"kilovolts stay", "kV", 0, 5e4, 5e4, "kV", "50000 kV"},
		{"zero", "mV", 0, 0, 0, "mV", "0 mV"},
		{"NaN range", "mV", nan, nan, nan, "mV", "— mV"},
		{"NaN bound ignored", "mV", nan, 2e5, 2e5, "V", "200 V"},
		{"infinite bound ignored", "mV", -inf, 50, 50, "mV", "50 mV"},
		{"field mV/m", "mV/m", 0, 25000, 25000, "V/m", "25 V/m"},
		{"field mV/m small", "mV/m", 0, 400, 400, "mV/m", "400 mV/m"},
		{"field V/m", "V/m", 0, 3e4, 3e4, "kV/m", "30 kV/m"},
		{"not a potential", "%", 0, 5e6, 5e6, "%", "5e+06 %"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			d := displayUnit(tt.unit, tt.lo, tt.hi)
			if d.name != tt.wantUnit {
				t.Errorf("displayUnit(%q, %g, %g) = %q, want %q", tt.unit, tt.lo, tt.hi, d.name, tt.wantUnit)
			}
			if got := d.with(tt.v); got != tt.want {
				t.Errorf("displayUnit(%q, %g, %g).with(%g) = %q, want %q", tt.unit, tt.lo, tt.hi, tt.v, got, tt.want)
			}
		})
	}
}

// faultFactor scales the fixture as a grounding survey measured at 10 A
// and scaled to a 4 kA fault (V × I_fault / I_test, IEEE Std 81 practice).
const faultFactor = 4000.0 / 10

// faultResult is the fixture scaled to the fault current: the grid and
// the corrected values grow by faultFactor, the values as read do not.
func faultResult() *pipeline.Result {
	res := fixtureResult()
	for i := range res.QA.Corrected {
		res.QA.Corrected[i] *= faultFactor
	}
	g := res.Grid
	for k := range g.V {
		g.V[k] *= faultFactor
		g.GX[k] *= faultFactor
		g.GY[k] *= faultFactor
	}
	return res
}

// faultModel returns a w × h mono model showing faultResult, flagging
// the fixture's threshold scaled alike.
func faultModel(t testing.TB, w, h int) Model {
	t.Helper()
	cfg := fixtureConfig()
	cfg.Criteria.FieldThreshold *= faultFactor
	m := New(cfg, Options{Title: "site-a.csv"}, DefaultKeyMap(), testStyles(false))
	m.gen = 1
	m = update1(t, m, tea.WindowSizeMsg{Width: w, Height: h})
	return update1(t, m, resultMsg{gen: 1, res: faultResult()})
}

// faultScreens are the screens that show potentials and fields.
var faultScreens = []struct {
	name string
	prep func(testing.TB, Model) Model
	keys []string
}{
	{"map", nil, nil},
	{"field", nil, []string{"2"}},
	{"zones", nil, []string{"z", "down", "enter"}},
	{"table", nil, []string{"t"}},
	{"profile", withMarks([2]float64{8, 11}, [2]float64{36, 7.5}), []string{"p"}},
}

// TestFaultScaledGolden renders the screens of a fault-scaled survey:
// potentials in volts, fields in V/m, the values as read still in mV.
func TestFaultScaledGolden(t *testing.T) {
	for _, size := range [][2]int{{80, 24}, {120, 40}} {
		for _, sc := range faultScreens {
			name := fmt.Sprintf("fault_%s_%dx%d_mono", sc.name, size[0], size[1])
			t.Run(name, func(t *testing.T) {
				m := faultModel(t, size[0], size[1])
				if sc.prep != nil {
					m = sc.prep(t, m)
				}
				out := press(t, m, sc.keys...).View()
				checkFits(t, out, size[0], size[1])
				golden(t, name+".golden", out)
			})
		}
	}
}

// shownNumber finds the numbers on a screen.
var shownNumber = regexp.MustCompile(`-?[0-9]+(\.[0-9]+)?(e[+-][0-9]+)?`)

// TestFaultScaledShort checks the rule itself on every screen of the
// fault-scaled survey: every number shown (values, band edges, axis
// labels, table cells; the fixture's other numbers are all small) is
// under 10 000, potentials and fields are in volts (the fixture peaks
// near 2 kV and 560 V/m), and the nearest-reading readout gives the
// scaled value in volts beside the value as read in millivolts.
func TestFaultScaledShort(t *testing.T) {
	for _, sc := range faultScreens {
		m := faultModel(t, 120, 40)
		if sc.prep != nil {
			m = sc.prep(t, m)
		}
		out := press(t, m, sc.keys...).View()
		for _, f := range shownNumber.FindAllString(out, -1) {
			v, err := strconv.ParseFloat(f, 64)
			if err != nil || math.Abs(v) >= promoteAt {
				t.Errorf("%s: %q shown, want fewer than five digits", sc.name, f)
			}
		}
		if !strings.Contains(out, " V") || strings.Contains(out, "potential, mV") || strings.Contains(out, "mV/m") {
			t.Errorf("%s: want potentials and fields in volts:\n%s", sc.name, out)
		}
	}
	m := faultModel(t, 120, 40)
	r := m.scene.res.Survey.Readings[0]
	got := m.scene.readingLabel(0, 1.5)
	want := fmt.Sprintf("%s %s V, 1.5 m (read %s mV)", r.ID, num(r.V*faultFactor/1000), num(r.V))
	if got != want {
		t.Errorf("readingLabel = %q, want %q", got, want)
	}
}

var (
	asRead    = regexp.MustCompile(`\(read [^)]*\)`)
	zoneLabel = regexp.MustCompile(`field ≥ \S+ mV/m`)
)

// TestFaultScaledPipeline runs the grounding preset scaled to a fault
// current through the real pipeline and checks that the readout (step
// voltage and its tolerable share included), the legend, the zones and
// the criterion show short numbers in volts.
func TestFaultScaledPipeline(t *testing.T) {
	cfg := pipeline.Config{Spacing: 0.5, QA: qa.Settings{FaultCurrent: 4000, TestCurrent: 10},
		Criteria: criteria.Settings{Preset: criteria.Grounding, FieldThreshold: 400 * faultFactor, SoilRho: 100}}
	m := pipelineModel(t, cfg)
	m = update1(t, m, tea.WindowSizeMsg{Width: 120, Height: 40})
	sc := m.scene
	if !sc.res.Analysis.Criterion.Step {
		t.Fatal("the grounding preset gave no step voltages")
	}
	pr := sc.probeAt(14, 10)
	screens := map[string]string{
		"readout": strings.Join(m.side.readout(sc, pr, 200), "\n"),
		"map":     m.View(),
		"zones":   press(t, m, "z").View(),
	}
	for name, out := range screens {
		// The value as read keeps the file's unit, and the zones' labels
		// are the analysis' own text (as the command line prints them).
		out = asRead.ReplaceAllString(out, "")
		out = zoneLabel.ReplaceAllString(out, "")
		for _, f := range shownNumber.FindAllString(out, -1) {
			if v, err := strconv.ParseFloat(f, 64); err != nil || math.Abs(v) >= promoteAt {
				t.Errorf("%s: %q shown, want fewer than five digits:\n%s", name, f, out)
			}
		}
		if strings.Contains(out, "mV") {
			t.Errorf("%s: want volts, not millivolts:\n%s", name, out)
		}
	}
	if r := screens["readout"]; !strings.Contains(r, " V over 1 m") || !strings.Contains(r, "of the tolerable") {
		t.Errorf("readout lacks the step voltage in volts:\n%s", r)
	}
}

// TestDispUnitNoise: within a range, values below 1e-9 of its largest
// magnitude are rounding noise and print as 0; a lone value never does.
func TestDispUnitNoise(t *testing.T) {
	tests := []struct {
		unit   string
		lo, hi float64
		v      float64
		want   string
	}{
		{"mV", -2e6, 2e6, 1.145e-9, "0 V"},
		{"mV", -2e6, 2e6, -3e-5, "0 V"},
		{"mV", -2e6, 2e6, 0.5, "0.0005 V"},
		{"mV", -400, -200, -1e-8, "0 mV"},
		{"mV", -400, -200, -1e-6, "-1e-06 mV"},
		{"mV", 0, 0, 1e-12, "1e-12 mV"},
	}
	for _, tt := range tests {
		if got := displayUnit(tt.unit, tt.lo, tt.hi).with(tt.v); got != tt.want {
			t.Errorf("displayUnit(%q, %g, %g).with(%g) = %q, want %q", tt.unit, tt.lo, tt.hi, tt.v, got, tt.want)
		}
	}
	if got := withUnit(1e-12, "V"); got != "1e-12 V" {
		t.Errorf("withUnit(1e-12, V) = %q", got)
	}
}
