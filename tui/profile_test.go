package tui

import (
	"math"
	"strings"
	"testing"

	"isofield/survey/pipeline"
)

// TestProfileClosedForm runs a profile along the readings' line y = 8 of
// the fixture, whose grid holds the closed form V = ρI/(2π√(r²+d²))
// (Telford et al. 1990, ch. 8) at its nodes: samples that fall on nodes
// must match it and its field along the line exactly, the chart's end
// columns must match the end samples, every reading of the line is marked
// with its gridded value, and the excluded one is left out (NaN).
func TestProfileClosedForm(t *testing.T) {
	m := readyModel(t, 80, 24, false)
	p := m.profile.Set(m.scene, &[2]float64{0, 8}, &[2]float64{40, 8})
	if p.prof == nil {
		t.Fatalf("no profile: %v", p.err)
	}
	onNode := 0
	for _, s := range p.prof.Samples {
		if math.Abs(s.Along*2-math.Round(s.Along*2)) > 1e-9 {
			continue // not on a node of the 0.5 m grid
		}
		onNode++
		v, gx, _ := fixPotential(s.X, s.Y)
		if math.Abs(s.V-v) > 1e-9*math.Abs(v) || math.Abs(s.EAlong+gx) > 1e-9*math.Max(math.Abs(gx), 1) {
			t.Errorf("at %g m: V %g E %g, want %g and %g", s.Along, s.V, s.EAlong, v, -gx)
		}
	}
	if onNode < 40 {
		t.Errorf("only %d samples on nodes", onNode)
	}
	first, last := p.prof.Samples[0], p.prof.Samples[len(p.prof.Samples)-1]
	if n := len(p.v); math.Abs(p.v[0]-first.V) > 1e-9 || math.Abs(p.v[n-1]-last.V) > 1e-9 {
		t.Errorf("chart ends %g, %g; samples %g, %g", p.v[0], p.v[n-1], first.V, last.V)
	}
	if len(p.prof.Readings) != 11 {
		t.Fatalf("%d readings marked, want the 11 of the line y = 8", len(p.prof.Readings))
	}
	for _, r := range p.prof.Readings {
		want := m.scene.res.QA.Corrected[r.Index]
		if r.Index == 30 { // excluded: not gridded
			want = math.NaN()
		}
		if !(r.V == want || math.IsNaN(r.V) && math.IsNaN(want)) {
			t.Errorf("reading %d marked at %g, want %g", r.Index, r.V, want)
		}
	}
	if row := p.tickRow(); strings.Count(row, "x") != 1 {
		t.Errorf("tick row %q, want the one excluded reading", row)
	}
}

// TestProfileMasked blanks the chart's columns over masked nodes.
func TestProfileMasked(t *testing.T) {
	m := readyModel(t, 80, 24, false)
	g := m.scene.res.Grid
	for j := range g.NY {
		for i := 60; i < g.NX; i++ { // x ≥ 30 m
			g.Mask[g.Index(i, j)] = true
		}
	}
	p := m.profile.Set(m.scene, &[2]float64{0, 10}, &[2]float64{40, 10})
	for c, s := range p.along {
		if masked := s >= 29.75; masked != math.IsNaN(p.v[c]) || masked != math.IsNaN(p.e[c]) {
			t.Errorf("column %d at %g m: V %g E %g, want blank iff nearest a masked node (x ≥ 29.75 m)", c, s, p.v[c], p.e[c])
		}
	}
}

// TestProfileFromModel checks that a real run's profile samples the fitted
// model and marks readings at the values they were gridded with.
func TestProfileFromModel(t *testing.T) {
	m := pipelineModel(t, pipeline.Config{Spacing: 0.5})
	m = m.resize(100, 30)
	p := m.profile.Set(m.scene, &[2]float64{0, 4}, &[2]float64{40, 4})
	if p.prof == nil {
		t.Fatalf("no profile: %v", p.err)
	}
	md := m.scene.res.Model
	for _, s := range p.prof.Samples {
		if v := md.Value(s.X, s.Y); s.V != v {
			t.Fatalf("sample at %g m: %g, model %g", s.Along, s.V, v)
		}
	}
	for _, r := range p.prof.Readings {
		if want := m.scene.res.Values[r.Index]; r.V != want && !math.IsNaN(want) {
			t.Errorf("reading %d marked at %g, gridded with %g", r.Index, r.V, want)
		}
	}
	if len(p.v) != p.chartWidth() {
		t.Errorf("%d columns resampled, chart has %d", len(p.v), p.chartWidth())
	}
}
