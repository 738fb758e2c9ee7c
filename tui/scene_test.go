package tui

import (
	"context"
	"fmt"
	"math"
	"strings"
	"testing"

	"isofield/survey/criteria"
	"isofield/survey/pipeline"
	"isofield/tui/mapview"
)

// pipelineModel runs the real pipeline on the fixture's readings and
// returns a ready model showing the result.
func pipelineModel(t *testing.T, cfg pipeline.Config) Model {
	t.Helper()
	cfg.Survey = fixtureResult().Survey
	res, err := pipeline.Run(context.Background(), cfg, nil)
	if err != nil {
		t.Fatal(err)
	}
	m := New(cfg, Options{Title: "site-a.csv"}, DefaultKeyMap(), testStyles(false))
	m.gen = 1
	m = update1(t, m, resultMsg{gen: 1, res: res})
	return update1(t, m, resultMsg{gen: 1, res: res})
}

// TestSceneFromPipeline checks the wiring of a real result: the readout is
// exact at a reading (the thin-plate spline interpolates its data), the
// analysis' zones and suggestions reach the map, and the grounding preset
// shows step voltages and its cautions.
func TestSceneFromPipeline(t *testing.T) {
	cfg := pipeline.Config{Spacing: 0.5, Suggest: 3, Criteria: criteria.Settings{
		Preset: criteria.Grounding, FieldThreshold: 400, SoilRho: 100}}
	m := pipelineModel(t, cfg)
	sc := m.scene
	r := sc.res.Survey.Readings[14] // (4, 4), a clean reading
	pr := sc.probeAt(r.X, r.Y)
	if math.Abs(pr.V-sc.res.Values[14]) > 1e-6*math.Abs(r.V) {
		t.Errorf("V at reading %s = %g, want its value %g", r.ID, pr.V, sc.res.Values[14])
	}
	if !pr.HasStep || !(pr.StepValue > 0) {
		t.Errorf("step voltage %g (shown %v), want a positive value for the grounding preset", pr.StepValue, pr.HasStep)
	}
	if len(sc.zones) == 0 || sc.zones[0].Rank != 1 || sc.zones[0].Label == "" {
		t.Errorf("zones %+v, want ranked, labelled zones from the analysis", sc.zones)
	}
	n := 0
	for _, p := range sc.data.Points {
		if p.Kind == mapview.KindSuggestion {
			n++
		}
	}
	if n != len(sc.res.Analysis.Suggestions) || n == 0 {
		t.Errorf("%d suggestions on the map, analysis has %d", n, len(sc.res.Analysis.Suggestions))
	}
	if got := strings.Join(m.side.readout(sc, pr, 60), " "); sc.stepLimit <= 0 || !strings.Contains(got, "tolerable") {
		t.Errorf("step limit %g, readout %q: want the step voltage beside the tolerable one", sc.stepLimit, got)
	}
	if !strings.Contains(m.messageLine(), "energised") {
		t.Errorf("grounding message line %q lacks the caution", m.messageLine())
	}
	// At 80×24 the cautions have their own page, a ? or two further.
	if help := allHelp(t, m); !strings.Contains(help, "energised") {
		t.Errorf("help's cautions page lacks the grounding cautions:\n%s", help)
	}
}

// TestReadoutClosedForm compares the readout of the hand-made fixture
// (grid filled from the closed form) with V = ρI/(2π√(r²+d²)) and its
// field at grid nodes, where nearest-node reading is exact.
func TestReadoutClosedForm(t *testing.T) {
	m := readyModel(t, 80, 24, false)
	for _, pt := range [][2]float64{{5, 5}, {20, 10}, {33.5, 2}} {
		pr := m.scene.probeAt(pt[0], pt[1])
		v, gx, gy := fixPotential(pt[0], pt[1])
		if math.Abs(pr.V-v) > 1e-9 || math.Abs(pr.EX+gx) > 1e-9 || math.Abs(pr.EY+gy) > 1e-9 {
			t.Errorf("probe at %v: V %g E (%g, %g), want %g (%g, %g)", pt, pr.V, pr.EX, pr.EY, v, -gx, -gy)
		}
	}
	// E points away from the positive source: east of it, bearing 090°.
	pr := m.scene.probeAt(14, 10)
	if b, name := bearing(pr.EX, pr.EY); math.Abs(b-90) > 1e-6 || name != "E" {
		t.Errorf("bearing east of the positive source %g° %s, want 90° E", b, name)
	}
}

// allHelp opens the help and steps through its pages, returning them all.
func allHelp(t testing.TB, m Model) string {
	t.Helper()
	var sb strings.Builder
	for m = press(t, m, "?"); m.showHelp; m = press(t, m, "?") {
		sb.WriteString(m.View())
	}
	return sb.String()
}

// TestReadingLabelCorrected checks that the nearest-reading readout shows
// the value that was gridded (after drift, reference and current scaling)
// and the value as read when the two differ; a scaled value that reaches
// 10 000 mV goes in volts (1 V = 1000 mV), the value as read then names
// its unit.
func TestReadingLabelCorrected(t *testing.T) {
	v0 := fixtureResult().Survey.Readings[0].V
	tests := []struct {
		name      string
		corrected float64
		want      string
		wantRead  string // "" when the value as read is not shown
	}{
		{"unchanged", v0, fmt.Sprintf(" %s mV,", num(v0)), ""},
		{"scaled a little", 2 * v0, fmt.Sprintf(" %s mV,", num(2*v0)), "(read " + num(v0) + ")"},
		{"scaled to a fault", 4000 * v0, fmt.Sprintf(" %s V,", num(4*v0)), "(read " + num(v0) + " mV)"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			res := fixtureResult()
			res.QA.Corrected[0] = tt.corrected
			got := newScene(res, pipeline.Config{}).readingLabel(0, 1.5)
			if !strings.Contains(got, tt.want) {
				t.Errorf("readingLabel = %q, want it to contain %q", got, tt.want)
			}
			if has := strings.Contains(got, "(read"); has != (tt.wantRead != "") || !strings.Contains(got, tt.wantRead) {
				t.Errorf("readingLabel = %q, want the value as read %q", got, tt.wantRead)
			}
		})
	}
}

func TestNum(t *testing.T) {
	tests := []struct {
		v    float64
		want string
	}{
		{math.NaN(), "—"}, {0, "0"}, {-350.25, "-350.2"}, {0.0123456, "0.01235"}, {9999, "9999"},
		{10000, "10000"}, {956612.7, "956613"}, {-240100, "-240100"}, {999999, "999999"}, {7e6, "7e+06"},
		{1.2e7, "1.2e+07"}, {3e-6, "3e-06"},
	}
	for _, tt := range tests {
		if got := num(tt.v); got != tt.want {
			t.Errorf("num(%g) = %q, want %q", tt.v, got, tt.want)
		}
	}
}
