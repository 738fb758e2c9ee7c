package session

import (
	"bytes"
	"encoding/json"
	"errors"
	"os"
	"path/filepath"
	"reflect"
	"strings"
	"testing"
	"time"

	"isofield/interp"
	"isofield/survey"
	"isofield/survey/electrode"
	"isofield/survey/pipeline"
	"isofield/survey/qa"
)

var t0 = time.Date(2026, 5, 4, 10, 30, 0, 0, time.UTC)

func TestPathFor(t *testing.T) {
	tests := []struct {
		in   []string
		want string
	}{
		{nil, ""},
		{[]string{"deck-east.csv"}, "deck-east.csv.isofield.json"},
		{[]string{"data/day1.csv", "data/day2.csv"}, "data/day1.csv.isofield.json"},
	}
	for _, tt := range tests {
		if got := PathFor(tt.in); got != tt.want {
			t.Errorf("PathFor(%q) = %q, want %q", tt.in, got, tt.want)
		}
	}
}

// TestRoundTrip saves a session with every section filled and loads it
// back unchanged.
func TestRoundTrip(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "deck.csv")
	f := New(PathFor([]string{in}))
	below := -350.0
	set := Settings{
		QA: qa.Settings{From: electrode.SCE, To: electrode.CSE, Base: "B1", Drift: qa.MonotoneCubic,
			RepeatTol: 15, SpikeK: 4, TestCurrent: 5, FaultCurrent: 1200},
		Fit:   FitSettings{Kernel: interp.Multiquadric.String(), Method: "local", AutoShape: true},
		Grid:  GridSettings{Spacing: 0.25, Interval: 20, UseSuspects: true},
		Extra: map[string]json.RawMessage{"tui": json.RawMessage(`{"theme":"plain"}`)},
	}
	set.Criteria.Preset = "concrete"
	set.Criteria.Below = &below
	if err := f.SetSettings(set); err != nil {
		t.Fatal(err)
	}
	if err := f.Exclude(in, 12, "A7", "probe on steel", t0); err != nil {
		t.Fatal(err)
	}
	g, err := Load(f.Path())
	if err != nil {
		t.Fatal(err)
	}
	var compact bytes.Buffer
	if err := json.Compact(&compact, g.Settings.Extra["tui"]); err != nil || compact.String() != `{"theme":"plain"}` {
		t.Errorf("extra section after load %s, %v", compact.Bytes(), err)
	}
	g.Settings.Extra, set.Extra = nil, nil
	if !reflect.DeepEqual(g.Settings, set) {
		t.Errorf("settings after load\n%+v\nwant\n%+v", g.Settings, set)
	}
	want := []Edit{{File: "deck.csv", Line: 12, ID: "A7", Exclude: true, Reason: "probe on steel", Time: t0}}
	if !reflect.DeepEqual(g.Edits, want) {
		t.Errorf("edits after load %+v, want %+v", g.Edits, want)
	}
	data, _ := os.ReadFile(f.Path())
	for _, s := range []string{`"version": 1`, `"from": "sce"`, `"drift": "cubic"`, `"file": "deck.csv"`} {
		if !bytes.Contains(data, []byte(s)) {
			t.Errorf("session file lacks %s:\n%s", s, data)
		}
	}
}

// TestEditsReachQA checks that hand edits stored in a session exclude the
// reading in a run, from whatever directory the paths were given.
func TestEditsReachQA(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "deck.csv")
	f := New(PathFor([]string{in}))
	if err := f.Exclude(in, 3, "A2", "cracked", t0); err != nil {
		t.Fatal(err)
	}
	g, err := Load(f.Path())
	if err != nil {
		t.Fatal(err)
	}
	s := &survey.Survey{Unit: survey.Millivolt, Files: []survey.FileInfo{{Path: in}}, Readings: []survey.Reading{
		{ID: "A1", V: -100, Line0: 2}, {ID: "A2", X: 1, V: -120, Line0: 3},
	}}
	r, err := qa.Run(s, qa.Settings{SpikeK: -1}, g.QAEdits())
	if err != nil {
		t.Fatal(err)
	}
	if r.Status[1] != qa.Excluded || r.Status[0] != qa.OK {
		t.Errorf("statuses %v, want [ok excluded]", r.Status)
	}
	if !g.Excluded(in, 3, "A2") {
		t.Errorf("Excluded = false after an exclusion")
	}
	if err := g.Include(in, 3, "A2", "checked again", t0.Add(time.Minute)); err != nil {
		t.Fatal(err)
	}
	if g.Excluded(in, 3, "A2") {
		t.Errorf("Excluded = true after an inclusion")
	}
	if len(g.Edits) != 2 {
		t.Errorf("%d edits, want the history of 2", len(g.Edits))
	}
}

// TestStrayTempIgnored: a writer killed mid-write leaves at most a
// temporary file beside the session (fileout writes there and renames);
// loading reads the last complete session and ignores the stray file.
func TestStrayTempIgnored(t *testing.T) {
	dir := t.TempDir()
	f := New(filepath.Join(dir, "a.csv"+Suffix))
	if err := f.Exclude(filepath.Join(dir, "a.csv"), 5, "", "wet", t0); err != nil {
		t.Fatal(err)
	}
	good, _ := os.ReadFile(f.Path())
	stray := filepath.Join(dir, ".a.csv"+Suffix+".tmp123456")
	if err := os.WriteFile(stray, good[:len(good)/2], 0o644); err != nil {
		t.Fatal(err)
	}
	g, err := Load(f.Path())
	if err != nil {
		t.Fatalf("Load with a stray temporary file: %v", err)
	}
	if len(g.Edits) != 1 || g.Edits[0].Line != 5 {
		t.Errorf("edits %+v, want the saved one", g.Edits)
	}
	// A failed save leaves the file as it was and forgets the edit.
	if err := os.Chmod(dir, 0o500); err != nil {
		t.Fatal(err)
	}
	defer os.Chmod(dir, 0o755)
	if os.Geteuid() != 0 { // root ignores directory permissions
		if err := g.Exclude(filepath.Join(dir, "a.csv"), 6, "", "x", t0); err == nil {
			t.Errorf("Exclude in a read-only directory: no error")
		}
		if len(g.Edits) != 1 {
			t.Errorf("failed edit kept: %+v", g.Edits)
		}
		if now, _ := os.ReadFile(f.Path()); !bytes.Equal(now, good) {
			t.Errorf("session changed by a failed save")
		}
	}
}

func TestParseErrors(t *testing.T) {
	tests := []struct {
		name     string
		data     string
		wantErr  error
		wantText string
	}{
		{"newer version", `{"version": 9}`, ErrNewer, "version 9; this release reads up to 1"},
		{"no version", `{"edits": []}`, ErrNotSession, "no version"},
		{"version zero", `{"version": 0}`, ErrNotSession, ""},
		{"syntax error", "{\n  \"version\": 1,\n  \"edits\": [}\n", nil, "s.json:3:"},
		{"truncated", `{"version": 1, "edits": [{"file": "a.csv", "li`, nil, "s.json"},
		{"wrong type", "{\"version\": 1,\n \"edits\": 3}", nil, "s.json:2:"},
		{"edit without line", `{"version": 1, "edits": [{"file": "a.csv"}]}`, nil, "edit 1"},
		{"unknown reference", `{"version": 1, "settings": {"qa": {"from": "platinum"}}}`, electrode.ErrUnknown, ""},
		{"bad drift", `{"version": 1, "settings": {"qa": {"drift": "quadratic"}}}`, nil, "quadratic"},
		{"empty", ``, nil, "s.json"},
		{"bad outline", `{"version": 1, "settings": {"grid": {"outline": "rim"}}}`, nil, "rim"},
		{"not json", "\x00\x01binary", nil, "s.json:1:"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := Parse([]byte(tt.data), "s.json")
			if err == nil {
				t.Fatal("no error")
			}
			if tt.wantErr != nil && !errors.Is(err, tt.wantErr) {
				t.Errorf("err = %v, want %v", err, tt.wantErr)
			}
			if !strings.Contains(err.Error(), tt.wantText) || !strings.HasPrefix(err.Error(), "s.json") {
				t.Errorf("err = %q, want it to start with the name and contain %q", err, tt.wantText)
			}
		})
	}
}

func TestOpenMissing(t *testing.T) {
	p := filepath.Join(t.TempDir(), "none.csv"+Suffix)
	f, err := Open(p)
	if err != nil || f.Path() != p || len(f.Edits) != 0 {
		t.Fatalf("Open(missing) = %+v, %v; want an empty session", f, err)
	}
	if _, err := Load(p); !errors.Is(err, os.ErrNotExist) {
		t.Errorf("Load(missing) err = %v, want ErrNotExist", err)
	}
}

// TestSettingsConfig round-trips settings through a pipeline.Config.
func TestSettingsConfig(t *testing.T) {
	cfg := pipeline.Config{Files: []string{"a.csv"}, Spacing: 0.5, Interval: 10, UseSuspects: true,
		Outline: pipeline.OutlineNone}
	cfg.Fit = interp.Options{Kernel: interp.WendlandC2, Method: interp.Local, Shape: 2, Smoothing: 0.1}
	cfg.QA = qa.Settings{Base: "B", AutoBase: true}
	s := FromConfig(cfg)
	var back pipeline.Config
	back.Files = cfg.Files
	if err := s.Apply(&back); err != nil {
		t.Fatal(err)
	}
	if !reflect.DeepEqual(back, cfg) {
		t.Errorf("config after round trip\n%+v\nwant\n%+v", back, cfg)
	}
	if err := (Settings{Fit: FitSettings{Method: "sideways"}}).Apply(&back); err == nil {
		t.Errorf("Apply accepted method sideways")
	}
}

// TestOutlineSetting reads the outline from files with and without it:
// files written before the setting existed keep loading, with the default.
func TestOutlineSetting(t *testing.T) {
	tests := []struct {
		name string
		data string
		want pipeline.Outline
	}{
		{"before the setting", `{"version": 1, "settings": {"grid": {"mask_m": 4}}}`, pipeline.OutlineHull},
		{"hull", `{"version": 1, "settings": {"grid": {"outline": "hull"}}}`, pipeline.OutlineHull},
		{"none", `{"version": 1, "settings": {"grid": {"outline": "none"}}}`, pipeline.OutlineNone},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			f, err := Parse([]byte(tt.data), "s.json")
			if err != nil {
				t.Fatal(err)
			}
			var cfg pipeline.Config
			if err := f.Settings.Apply(&cfg); err != nil || cfg.Outline != tt.want {
				t.Errorf("Outline = %v (%v), want %v", cfg.Outline, err, tt.want)
			}
		})
	}
	b, err := json.Marshal(GridSettings{Outline: pipeline.OutlineNone})
	if err != nil || !strings.Contains(string(b), `"outline":"none"`) {
		t.Errorf("GridSettings with no outline marshals as %s (%v), want \"outline\":\"none\"", b, err)
	}
	if b, _ := json.Marshal(GridSettings{}); strings.Contains(string(b), "outline") {
		t.Errorf("default GridSettings marshals as %s, want the default left out", b)
	}
}

func TestChanged(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "a.csv")
	f := New(PathFor([]string{in}))
	f.SetInputs([]survey.FileInfo{{Path: in, SHA256: "aa"}})
	if n := f.Changed([]survey.FileInfo{{Path: in, SHA256: "aa"}}); len(n) != 0 {
		t.Errorf("unchanged input reported: %q", n)
	}
	if n := f.Changed([]survey.FileInfo{{Path: in, SHA256: "bb"}}); len(n) != 1 {
		t.Errorf("changed input not reported: %q", n)
	}
}

// FuzzParse reads arbitrary bytes as a session; whatever parses must
// write and read back to the same bytes.
func FuzzParse(f *testing.F) {
	f.Add([]byte(`{"version": 1}`))
	f.Add([]byte(`{"version": 1, "edits": [{"file": "a.csv", "line": 3, "id": "A1", "exclude": true, "reason": "wet", "time": "2026-05-04T10:30:00Z"}]}`))
	f.Add([]byte(`{"version": 1, "settings": {"qa": {"from": "sce", "to": "cse", "drift": "cubic", "spike_k": 4}, "grid": {"spacing_m": 0.5}}}`))
	f.Add([]byte(`{"version": 2}`))
	f.Add([]byte(`{"version": 1, "settings": {"extra": {"x": [1, 2]}}}`))
	f.Add([]byte(`[`))
	f.Fuzz(func(t *testing.T, data []byte) {
		s, err := Parse(data, "fuzz.json")
		if err != nil {
			return
		}
		out, err := s.Marshal()
		if err != nil {
			t.Fatalf("Marshal of a parsed session: %v", err)
		}
		s2, err := Parse(out, "again.json")
		if err != nil {
			t.Fatalf("re-parse: %v\n%s", err, out)
		}
		out2, err := s2.Marshal()
		if err != nil || !bytes.Equal(out, out2) {
			t.Fatalf("round trip differs:\n%s\n%s", out, out2)
		}
	})
}
