package main

import (
	"os"
	"path/filepath"
	"testing"

	"isofield/survey/pipeline"
	"isofield/survey/session"
)

// deckCSV is an invented five-reading half-cell survey of a small deck,
// irregular enough that its outline leaves corners of the grid's
// rectangle unsurveyed (see survey/pipeline TestOutlineDeck).
const deckCSV = "id,x_m,y_m,potential_mV\nA,0,0,-215\nB,6,0.5,-330\nC,8,5,-410\nD,3,7,-300\nE,-1,4,-240\n"

// TestOutlineFlag checks --outline, its default, the session's setting and
// that the flag wins over the session.
func TestOutlineFlag(t *testing.T) {
	dir := t.TempDir()
	in := filepath.Join(dir, "deck.csv")
	if err := os.WriteFile(in, []byte(deckCSV), 0o644); err != nil {
		t.Fatal(err)
	}
	masked := func(t *testing.T, args ...string) int {
		t.Helper()
		out := filepath.Join(t.TempDir(), "grid.csv")
		if code, _, errs := runArgs(append(append([]string{"grid", "-o", out}, args...), in)...); code != 0 {
			t.Fatalf("grid %v: exit %d: %s", args, code, errs)
		}
		n := 0
		for _, row := range readCSV(t, out)[1:] {
			if row[2] == "" {
				n++
			}
		}
		return n
	}
	hull, none := masked(t), masked(t, "--outline", "none")
	if none != 0 || hull < 1000 {
		t.Fatalf("masked nodes: %d by default, %d with --outline none; want many and none", hull, none)
	}
	if n := masked(t, "--outline", "hull"); n != hull {
		t.Errorf("--outline hull masked %d nodes, the default %d", n, hull)
	}
	var cfg pipeline.Config
	cfg.Outline = pipeline.OutlineNone
	if err := session.New(session.PathFor([]string{in})).SetSettings(session.FromConfig(cfg)); err != nil {
		t.Fatal(err)
	}
	if n := masked(t); n != none {
		t.Errorf("session with outline none: %d nodes masked, want %d", n, none)
	}
	if n := masked(t, "--outline", "hull"); n != hull {
		t.Errorf("--outline hull over a session with none: %d nodes masked, want %d", n, hull)
	}
	if code, _, errs := runArgs("grid", "--outline", "rim", in); code != exitUsage {
		t.Errorf("--outline rim: exit %d (%q), want %d", code, errs, exitUsage)
	}
}
