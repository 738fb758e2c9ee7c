package tui

import (
	"errors"
	"math"
	"path/filepath"
	"strings"
	"testing"
	"time"

	tea "github.com/charmbracelet/bubbletea"

	"isofield/survey/pipeline"
	"isofield/survey/qa"
	"isofield/tui/mapview"
)

// TestMapKeys checks each map key's effect on the state.
func TestMapKeys(t *testing.T) {
	base := readyModel(t, 80, 24, false)
	v0 := base.mapPane.view
	tests := []struct {
		keys  []string
		check func(t *testing.T, m Model)
	}{
		{[]string{"k"}, cursorMoved(0, v0.RowHeight())},
		{[]string{"up"}, cursorMoved(0, v0.RowHeight())},
		{[]string{"j"}, cursorMoved(0, -v0.RowHeight())},
		{[]string{"down"}, cursorMoved(0, -v0.RowHeight())},
		{[]string{"h"}, cursorMoved(-v0.MPC, 0)},
		{[]string{"left"}, cursorMoved(-v0.MPC, 0)},
		{[]string{"l"}, cursorMoved(v0.MPC, 0)},
		{[]string{"right"}, cursorMoved(v0.MPC, 0)},
		{[]string{"K"}, centreMoved(0, float64(v0.Height)/4*v0.RowHeight())},
		{[]string{"J"}, centreMoved(0, -float64(v0.Height)/4*v0.RowHeight())},
		{[]string{"H"}, centreMoved(-float64(v0.Width)/4*v0.MPC, 0)},
		{[]string{"L"}, centreMoved(float64(v0.Width)/4*v0.MPC, 0)},
		{[]string{"+"}, scaleIs(v0.MPC / math.Sqrt2)},
		{[]string{"-"}, scaleIs(v0.MPC * math.Sqrt2)},
		{[]string{"+", "+", "0"}, scaleIs(v0.MPC)},
		{[]string{"lll"}, cursorMoved(3*v0.MPC, 0)}, // keys typed faster than read arrive together
		{[]string{"1"}, layerOff(mapview.LayerBands)},
		{[]string{"2"}, layerOn(mapview.LayerField)},
		{[]string{"3"}, layerOff(mapview.LayerZones)},
		{[]string{"4"}, layerOff(mapview.LayerReadings)},
		{[]string{"4"}, layerOn(mapview.LayerFlaggedReadings)},
		{[]string{"4", "4"}, layerOff(mapview.LayerFlaggedReadings)},
		{[]string{"4", "4", "4"}, layerOn(mapview.LayerReadings | mapview.LayerFlaggedReadings)},
		{[]string{"5"}, layerOn(mapview.LayerArrows)},
		{[]string{"6"}, layerOff(mapview.LayerSuggestions)},
		{[]string{"7"}, layerOn(mapview.LayerContours)},
		{[]string{"7", "7"}, layerOff(mapview.LayerContours)},
		{[]string{"f"}, func(t *testing.T, m Model) {
			if !m.mapPane.view.HalfBlock {
				t.Error("f did not turn the fine map on")
			}
		}},
	}
	for _, tt := range tests {
		t.Run(join(tt.keys), func(t *testing.T) { tt.check(t, press(t, base, tt.keys...)) })
	}
}

func join(ks []string) string {
	s := ""
	for _, k := range ks {
		s += k + " "
	}
	return s
}

func cursorMoved(dx, dy float64) func(*testing.T, Model) {
	return func(t *testing.T, m Model) {
		x, y := m.mapPane.Cursor()
		if math.Abs(x-20-dx) > 1e-9 || math.Abs(y-10-dy) > 1e-9 {
			t.Errorf("cursor at (%g, %g), want (%g, %g)", x, y, 20+dx, 10+dy)
		}
	}
}

func centreMoved(dx, dy float64) func(*testing.T, Model) {
	return func(t *testing.T, m Model) {
		v := m.mapPane.view
		if math.Abs(v.CX-20-dx) > 1e-9 || math.Abs(v.CY-10-dy) > 1e-9 {
			t.Errorf("centre at (%g, %g), want (%g, %g)", v.CX, v.CY, 20+dx, 10+dy)
		}
	}
}

func scaleIs(mpc float64) func(*testing.T, Model) {
	return func(t *testing.T, m Model) {
		if got := m.mapPane.view.MPC; math.Abs(got-mpc) > 1e-9*mpc {
			t.Errorf("scale %g m per column, want %g", got, mpc)
		}
	}
}

func layerOn(l mapview.Layers) func(*testing.T, Model) {
	return func(t *testing.T, m Model) {
		if m.mapPane.view.Layers&l == 0 {
			t.Errorf("layer %b off, want on", l)
		}
	}
}

func layerOff(l mapview.Layers) func(*testing.T, Model) {
	return func(t *testing.T, m Model) {
		if m.mapPane.view.Layers&l != 0 {
			t.Errorf("layer %b on, want off", l)
		}
	}
}

// TestScreenKeys checks the keys that switch screens or act on readings.
func TestScreenKeys(t *testing.T) {
	base := readyModel(t, 80, 24, false)
	tests := []struct {
		name  string
		keys  []string
		check func(t *testing.T, m Model)
	}{
		{"z opens the zones", []string{"z"}, focusIs(focusZones)},
		{"z twice closes", []string{"z", "z"}, focusIs(focusMap)},
		{"n jumps to zone 1", []string{"n"}, cursorAtZone(0)},
		{"n n goes to zone 2", []string{"n", "n"}, cursorAtZone(1)},
		{"n n n wraps to zone 1", []string{"n", "n", "n"}, cursorAtZone(0)},
		{"N goes to the last zone", []string{"N"}, cursorAtZone(1)},
		{"enter jumps to the selected zone", []string{"z", "enter"}, cursorAtZone(0)},
		{"t opens the table", []string{"t"}, focusIs(focusTable)},
		{"o orders by the next column", []string{"t", "o"}, func(t *testing.T, m Model) {
			if m.table.sortCol != 3 || m.table.order[0] != 0 {
				t.Errorf("sort column %d first row %d, want 3 (id) and reading 0", m.table.sortCol, m.table.order[0])
			}
		}},
		{"r reverses", []string{"t", "r"}, func(t *testing.T, m Model) {
			if !m.table.desc || m.table.order[0] != 65 {
				t.Errorf("desc %v first row %d, want true and the last reading", m.table.desc, m.table.order[0])
			}
		}},
		{"s opens the settings", []string{"s"}, focusIs(focusSettings)},
		{"p opens the profile", []string{"p"}, focusIs(focusProfile)},
		{"esc returns to the map", []string{"t", "esc"}, focusIs(focusMap)},
		{"? toggles help", []string{"?"}, func(t *testing.T, m Model) {
			if !m.showHelp {
				t.Error("help not shown")
			}
		}},
		{"? twice shows the marks and cautions (they do not fit beside the keys at 80×24)", []string{"?", "?"}, func(t *testing.T, m Model) {
			if v := m.View(); !m.showHelp || m.helpPage != 1 || !strings.Contains(v, "Cautions") || !strings.Contains(v, "Marks") {
				t.Errorf("help %v page %d, want the second page with marks and cautions:\n%s", m.showHelp, m.helpPage, v)
			}
		}},
		{"? thrice closes", []string{"?", "?", "?"}, func(t *testing.T, m Model) {
			if m.showHelp {
				t.Error("help still shown")
			}
		}},
		{"m m marks A and B", []string{"m", "l", "l", "m"}, func(t *testing.T, m Model) {
			a, b := m.marks[0], m.marks[1]
			if a == nil || b == nil || b[0] <= a[0] {
				t.Errorf("marks %v %v, want A west of B", a, b)
			}
		}},
		{"x away from readings says so", []string{"l", "l", "x"}, func(t *testing.T, m Model) {
			if m.prompting || m.message == "" {
				t.Errorf("prompting %v message %q, want a message and no prompt", m.prompting, m.message)
			}
		}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) { tt.check(t, press(t, base, tt.keys...)) })
	}
}

func focusIs(f focus) func(*testing.T, Model) {
	return func(t *testing.T, m Model) {
		if m.focus != f {
			t.Errorf("focus %d, want %d", m.focus, f)
		}
	}
}

func cursorAtZone(i int) func(*testing.T, Model) {
	return func(t *testing.T, m Model) {
		z := m.scene.zones[i]
		if x, y := m.mapPane.Cursor(); x != z.PeakX || y != z.PeakY {
			t.Errorf("cursor at (%g, %g), want zone %d's peak (%g, %g)", x, y, i+1, z.PeakX, z.PeakY)
		}
	}
}

// TestExcludeAndInclude walks the exclusion prompt: the edit is recorded
// with its reason, saved and a regrid started.
func TestExcludeAndInclude(t *testing.T) {
	var saved [][]qa.Edit
	m := readyModel(t, 80, 24, false)
	m.opt.Save = func(c pipeline.Config) error { saved = append(saved, c.Edits); return nil }
	m.opt.SessionPath = "site-a.isofield.json"
	// Reading 0 is at (0, 0); the cursor goes there through the table.
	m = press(t, m, "t", "x")
	if !m.prompting || m.target != 0 {
		t.Fatalf("prompting %v target %d, want the prompt for reading 0", m.prompting, m.target)
	}
	gen := m.gen
	m = press(t, m, "w", "e", "t", " ", "g", "r", "o", "u", "n", "d")
	next, cmd := m.Update(keyMsg("enter"))
	m = next.(Model)
	if len(m.cfg.Edits) != 1 {
		t.Fatalf("edits %v, want one", m.cfg.Edits)
	}
	e := m.cfg.Edits[0]
	want := qa.Edit{File: "/data/site-a.csv", Line: 2, ID: "P0-0", Exclude: true, Reason: "wet ground"}
	if e != want {
		t.Errorf("edit %+v, want %+v", e, want)
	}
	if !m.running || m.gen != gen+1 || cmd == nil {
		t.Errorf("running %v gen %d, want a new run of generation %d", m.running, m.gen, gen+1)
	}
	// Run the save (and not the pipeline) from the batch.
	if s, ok := waitFor[savedMsg](cmd, 2*time.Second); ok {
		m = update1(t, m, s)
	}
	if len(saved) != 1 || len(saved[0]) != 1 {
		t.Errorf("saved %v, want one save of one edit", saved)
	}
	m.cancel()
}

// TestMessages checks the background messages.
func TestMessages(t *testing.T) {
	t.Run("stale result dropped", func(t *testing.T) {
		m := readyModel(t, 80, 24, false)
		m.gen = 5
		before := m.scene
		m = update1(t, m, resultMsg{gen: 4, res: fixtureResult()})
		if m.scene != before {
			t.Error("a stale result replaced the scene")
		}
	})
	t.Run("progress of the current run", func(t *testing.T) {
		m := readyModel(t, 80, 24, false)
		m.running = true
		m = update1(t, m, progressMsg{gen: m.gen, stage: "fit", frac: 0.4})
		if m.frac != 0.4 || m.stage != "fit" {
			t.Errorf("progress %g %q, want 0.4 fit", m.frac, m.stage)
		}
		m = update1(t, m, progressMsg{gen: m.gen - 1, stage: "grid", frac: 0.9})
		if m.frac != 0.4 {
			t.Errorf("stale progress applied: %g", m.frac)
		}
	})
	t.Run("first run fails", func(t *testing.T) {
		m := New(fixtureConfig(), Options{}, DefaultKeyMap(), testStyles(false))
		m.gen = 1
		m = update1(t, m, resultMsg{gen: 1, err: errors.New("site.csv:3:2: not a number")})
		if m.state != stateError {
			t.Errorf("state %d, want error", m.state)
		}
		golden(t, "error_80x24_mono.golden", m.View())
	})
	t.Run("a preview shows and starts the full run", func(t *testing.T) {
		m := New(fixtureConfig(), Options{}, DefaultKeyMap(), testStyles(false))
		m.gen = 1
		m = update1(t, m, resultMsg{gen: 1, res: fixtureResult(), preview: true})
		if m.state != stateReady || !m.running || m.gen != 2 {
			t.Errorf("state %d running %v gen %d, want ready, running generation 2", m.state, m.running, m.gen)
		}
		m.cancel()
	})
	t.Run("a failed preview falls back to the full run", func(t *testing.T) {
		m := New(fixtureConfig(), Options{}, DefaultKeyMap(), testStyles(false))
		m.gen = 1
		m = update1(t, m, resultMsg{gen: 1, err: errors.New("no"), preview: true})
		if m.state != stateLoading || !m.running || m.gen != 2 {
			t.Errorf("state %d running %v gen %d, want loading, running generation 2", m.state, m.running, m.gen)
		}
		m.cancel()
	})
	t.Run("later run fails keeps the map", func(t *testing.T) {
		m := readyModel(t, 80, 24, false)
		m = update1(t, m, resultMsg{gen: m.gen, err: errors.New("boom")})
		if m.state != stateReady || m.message == "" {
			t.Errorf("state %d message %q, want ready with a message", m.state, m.message)
		}
	})
	t.Run("cancel", func(t *testing.T) {
		m := readyModel(t, 80, 24, false)
		m, _ = m.regrid("test")
		gen := m.gen
		m = press(t, m, "c")
		if m.running || m.gen == gen {
			t.Errorf("running %v gen %d, want stopped with a new generation", m.running, m.gen)
		}
	})
	t.Run("watch: unchanged files poll again", func(t *testing.T) {
		m := readyModel(t, 80, 24, false)
		next, cmd := m.Update(statMsg{stamp: m.watch})
		if next.(Model).running || cmd == nil {
			t.Error("an unchanged stamp regridded or stopped polling")
		}
	})
	t.Run("watch: grown file regrids keeping cursor", func(t *testing.T) {
		m := press(t, readyModel(t, 80, 24, false), "l", "l")
		x, y := m.mapPane.Cursor()
		m = update1(t, m, statMsg{stamp: watchStamp{size: []int64{10}, mtime: []time.Time{time.Unix(1, 0)}}})
		if !m.running {
			t.Error("a grown file did not regrid")
		}
		m = update1(t, m, resultMsg{gen: m.gen, res: fixtureResult()})
		if cx, cy := m.mapPane.Cursor(); cx != x || cy != y {
			t.Errorf("cursor moved to (%g, %g) from (%g, %g)", cx, cy, x, y)
		}
	})
	t.Run("a message clears after its time, not an older one's", func(t *testing.T) {
		m := press(t, readyModel(t, 80, 24, false), "l", "l", "x")
		if m.message == "" || m.msgSeq == 0 {
			t.Fatalf("message %q seq %d, want a message", m.message, m.msgSeq)
		}
		if m = update1(t, m, clearMsg{m.msgSeq - 1}); m.message == "" {
			t.Error("an older message's timer cleared the newer one")
		}
		if m = update1(t, m, clearMsg{m.msgSeq}); m.message != "" {
			t.Errorf("message %q still shown after its time", m.message)
		}
	})
	t.Run("save error shown", func(t *testing.T) {
		m := update1(t, readyModel(t, 80, 24, false), savedMsg{err: errors.New("disk full")})
		if m.message == "" {
			t.Error("no message for a failed save")
		}
	})
	t.Run("resize", func(t *testing.T) {
		m := update1(t, readyModel(t, 80, 24, false), tea.WindowSizeMsg{Width: 200, Height: 60})
		if m.width != 200 || m.mapPane.view.Width != 200-sideWidth(200) {
			t.Errorf("width %d map %d after resize", m.width, m.mapPane.view.Width)
		}
	})
	t.Run("q quits", func(t *testing.T) {
		_, cmd := readyModel(t, 80, 24, false).Update(keyMsg("q"))
		if cmd == nil || cmd() != tea.Quit() {
			t.Error("q did not quit")
		}
	})
}

// TestSettingsApply changes the preset and a typed value; each change
// produces a regrid with the new configuration.
func TestSettingsApply(t *testing.T) {
	m := press(t, readyModel(t, 80, 24, false), "s", "right")
	if got := m.cfg.Criteria.Name(); got != "concrete" || !m.running {
		t.Errorf("preset %q running %v, want concrete and a regrid", got, m.running)
	}
	m.cancel()
	m = press(t, m, "down", "down", "enter")
	m = update1(t, m, tea.KeyMsg{Type: tea.KeyCtrlU})
	m = press(t, m, "2", "5", "enter")
	if m.cfg.Interval != 25 {
		t.Errorf("interval %g, want 25", m.cfg.Interval)
	}
	m.cancel()
	m = press(t, m, "enter")
	m = update1(t, m, tea.KeyMsg{Type: tea.KeyCtrlU})
	m = press(t, m, "x", "enter")
	if m.settings.err == "" || m.cfg.Interval != 25 {
		t.Errorf("bad value accepted: err %q interval %g", m.settings.err, m.cfg.Interval)
	}
	if m.cancel != nil {
		m.cancel()
	}
}

// TestPanicQuitsCleanly feeds a result without a survey, which panics
// inside Update: the UI must record the cause and quit, not crash.
func TestPanicQuitsCleanly(t *testing.T) {
	m := readyModel(t, 80, 24, false)
	next, cmd := m.Update(resultMsg{gen: m.gen, res: &pipeline.Result{}})
	if got := next.(Model).panicked; got == "" {
		t.Fatal("panic not recorded")
	}
	if cmd == nil || cmd() != tea.Quit() {
		t.Error("a caught panic did not quit")
	}
	// A panic in a background command arrives as a message and ends the
	// UI the same way.
	msg := safe(func() tea.Msg { panic("disk on fire") })()
	next, _ = m.Update(msg)
	if got := next.(Model).panicked; got != "disk on fire" {
		t.Errorf("panicked %q, want the command's panic", got)
	}
}

// TestExportKey writes every export of the fixture into a new directory.
func TestExportKey(t *testing.T) {
	dir := t.TempDir()
	m := New(fixtureConfig(), Options{Title: "site-a.csv", ExportDir: dir, ExportDPI: 20, Version: "test"}, DefaultKeyMap(), testStyles(false))
	m.gen = 1
	m = update1(t, m, tea.WindowSizeMsg{Width: 80, Height: 24})
	m = update1(t, m, resultMsg{gen: 1, res: fixtureResult()})
	next, cmd := m.Update(keyMsg("e"))
	if cmd == nil {
		t.Fatal("e gave no command")
	}
	msg, ok := waitFor[exportedMsg](cmd, 30*time.Second)
	if !ok {
		t.Fatal("e's command gave no exportedMsg")
	}
	m = update1(t, next.(Model), msg)
	if msg.err != nil || msg.files == 0 {
		t.Fatalf("export: %d files, %v (message %q)", msg.files, msg.err, m.message)
	}
	t.Log(m.message)
}

// TestLoadedSurveyServesFirstRuns checks that the survey the command line
// already read serves the first look and the full grid after it: the
// configured file does not exist, so any run that read it would fail.
func TestLoadedSurveyServesFirstRuns(t *testing.T) {
	cfg := fixtureConfig()
	loaded := fixtureResult().Survey
	cfg.Survey, cfg.Files = nil, []string{filepath.Join(t.TempDir(), "gone.csv")}
	m := New(cfg, Options{Loaded: loaded}, DefaultKeyMap(), testStyles(false))
	m, cmd := m.Start()
	first := resultOf(t, cmd)
	if first.err != nil || !first.preview {
		t.Fatalf("first look: preview %v, error %v; want a preview without error", first.preview, first.err)
	}
	next, cmd := m.Update(first)
	m = next.(Model)
	full := resultOf(t, cmd)
	if full.err != nil || full.preview {
		t.Fatalf("full grid: preview %v, error %v; want the full run without error", full.preview, full.err)
	}
	if full.res.Survey != loaded {
		t.Errorf("full grid ran on another survey than the one loaded")
	}
	if _, cmd := m.regrid("again"); resultOf(t, cmd).err == nil {
		t.Errorf("a later regrid did not read the files again")
	}
}

// resultOf runs cmd, batches included, and returns the first resultMsg.
func resultOf(t *testing.T, cmd tea.Cmd) resultMsg {
	t.Helper()
	var find func(tea.Cmd) (resultMsg, bool)
	find = func(c tea.Cmd) (resultMsg, bool) {
		if c == nil {
			return resultMsg{}, false
		}
		switch msg := c().(type) {
		case resultMsg:
			return msg, true
		case tea.BatchMsg:
			for _, sub := range msg {
				if r, ok := find(sub); ok {
					return r, true
				}
			}
		}
		return resultMsg{}, false
	}
	r, ok := find(cmd)
	if !ok {
		t.Fatal("no pipeline result from the command")
	}
	return r
}
