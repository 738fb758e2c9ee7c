package tui

import (
	"flag"
	"fmt"
	"io"
	"math"
	"os"
	"path/filepath"
	"testing"

	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"
	"github.com/muesli/termenv"

	"isofield/interp"
	"isofield/survey"
	"isofield/survey/criteria"
	"isofield/survey/pipeline"
	"isofield/survey/qa"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata/")

// Fixture site: two point currents of ±0.5 A buried 1.5 m deep in ground of
// 100 Ω·m, V = ρI/(2π√(r²+d²)) (image method; Telford, Geldart & Sheriff,
// Applied Geophysics, 2nd ed., 1990, ch. 8), in millivolts. Invented data
// for tests only.
const (
	fixRho   = 100.0
	fixDepth = 1.5
	fixI     = 0.5
)

var fixSources = [2][3]float64{{12, 10, fixI}, {28, 10, -fixI}}

// fixPotential returns V in mV and ∇V in mV/m at (x, y).
func fixPotential(x, y float64) (v, gx, gy float64) {
	for _, s := range fixSources {
		dx, dy := x-s[0], y-s[1]
		r := math.Sqrt(dx*dx + dy*dy + fixDepth*fixDepth)
		c := 1000 * fixRho * s[2] / (2 * math.Pi)
		v += c / r
		gx -= c * dx / (r * r * r)
		gy -= c * dy / (r * r * r)
	}
	return v, gx, gy
}

// fixtureResult builds a pipeline result by hand: readings every 4 m on a
// 40 m × 20 m site, the closed-form grid at 0.5 m, one suspect and one
// excluded reading, no fitted model (the UI then reads the grid).
func fixtureResult() *pipeline.Result {
	s := &survey.Survey{Name: "test site", Unit: survey.Millivolt,
		Files: []survey.FileInfo{{Path: "/data/site-a.csv", Unit: survey.Millivolt}}}
	for j := 0; j <= 5; j++ {
		for i := 0; i <= 10; i++ {
			x, y := float64(4*i), float64(4*j)
			v, _, _ := fixPotential(x, y)
			s.Readings = append(s.Readings, survey.Reading{
				ID: fmt.Sprintf("P%d-%d", j, i), X: x, Y: y, V: math.Round(v*10) / 10,
				Line0: len(s.Readings) + 2,
			})
		}
	}
	n := len(s.Readings)
	q := &qa.Result{Corrected: make([]float64, n), Status: make([]qa.Status, n), Notes: make([][]string, n)}
	for i, r := range s.Readings {
		q.Corrected[i] = r.V
	}
	q.Status[7], q.Notes[7] = qa.Suspect, []string{"disagrees with neighbours"}
	q.Status[30], q.Notes[30] = qa.Excluded, []string{"probe on rebar chair"}
	g := interp.NewGridN(0, 0, 0.5, 0.5, 81, 41)
	for j := range g.NY {
		for i := range g.NX {
			x, y := g.Node(i, j)
			k := g.Index(i, j)
			g.V[k], g.GX[k], g.GY[k] = fixPotential(x, y)
		}
	}
	return &pipeline.Result{Survey: s, QA: q, Grid: g}
}

// fixtureConfig flags |E| ≥ 400 mV/m, which gives one zone round each
// source.
func fixtureConfig() pipeline.Config {
	return pipeline.Config{Criteria: criteria.Settings{FieldThreshold: 400}}
}

// testStyles returns styles with a fixed colour profile.
func testStyles(colour bool) Styles {
	r := lipgloss.NewRenderer(io.Discard)
	r.SetColorProfile(termenv.Ascii)
	if colour {
		r.SetColorProfile(termenv.TrueColor)
	}
	r.SetHasDarkBackground(true)
	return DefaultStyles(r)
}

// readyModel returns a w × h model showing the fixture.
func readyModel(t testing.TB, w, h int, colour bool) Model {
	t.Helper()
	m := New(fixtureConfig(), Options{Title: "site-a.csv"}, DefaultKeyMap(), testStyles(colour))
	m.gen = 1
	m = update1(t, m, tea.WindowSizeMsg{Width: w, Height: h})
	m = update1(t, m, resultMsg{gen: 1, res: fixtureResult()})
	if m.state != stateReady {
		t.Fatalf("state %d after the result, want ready", m.state)
	}
	return m
}

// update1 applies one message and returns the concrete model.
func update1(t testing.TB, m Model, msg tea.Msg) Model {
	t.Helper()
	next, _ := m.Update(msg)
	return next.(Model)
}

// golden compares got with testdata/name, rewriting it under -update.
func golden(t *testing.T, name, got string) {
	t.Helper()
	path := filepath.Join("testdata", name)
	if *update {
		if err := os.MkdirAll("testdata", 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test ./tui -update to create it)", err)
	}
	if got != string(want) {
		t.Errorf("%s differs from the golden file; run go test ./tui -run %s -update and review the diff\ngot:\n%s", path, t.Name(), got)
	}
}
