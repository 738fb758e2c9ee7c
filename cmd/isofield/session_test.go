package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"isofield/survey/pipeline"
	"isofield/survey/session"
)

// TestSessionSettingsRestored checks that settings saved in the session
// file (as the terminal UI saves them) are used by the commands next time,
// and that flags given on the command line win over them.
func TestSessionSettingsRestored(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "yard.csv")
	if code, _, errs := runArgs("demo", "-o", in); code != 0 {
		t.Fatalf("demo: %s", errs)
	}
	var cfg pipeline.Config
	cfg.Interval = 250
	cfg.Spacing = 2
	cfg.Criteria.Preset = "grounding"
	sess := session.New(session.PathFor([]string{in}))
	if err := sess.SetSettings(session.FromConfig(cfg)); err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name      string
		args      []string
		spacing   float64
		header    string // substring of the grid header
		notHeader string
	}{
		{"session settings", []string{"grid", in}, 2, ",step_mV", ""},
		{"flag wins", []string{"grid", "--spacing", "5", "--preset", "generic", in}, 5, ",band", "step_mV"},
		{"no session", []string{"grid", "--no-session", in}, 0.5, ",band", "step_mV"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			out := filepath.Join(dir, strings.ReplaceAll(tt.name, " ", "_")+".csv")
			if code, _, errs := runArgs(append(tt.args, "-o", out)...); code != 0 {
				t.Fatalf("isofield %v: exit %d: %s", tt.args, code, errs)
			}
			rows := readCSV(t, out)
			if !strings.Contains(strings.Join(rows[0], ","), tt.header) {
				t.Errorf("header %v lacks %q", rows[0], tt.header)
			}
			if tt.notHeader != "" && strings.Contains(strings.Join(rows[0], ","), tt.notHeader) {
				t.Errorf("header %v has %q", rows[0], tt.notHeader)
			}
			if d := num(t, rows[2][0]) - num(t, rows[1][0]); d < tt.spacing*0.999 || d > tt.spacing*1.001 {
				t.Errorf("node spacing %g, want %g", d, tt.spacing)
			}
		})
	}
	if _, err := os.Stat(in); err != nil {
		t.Fatal(err)
	}
}
