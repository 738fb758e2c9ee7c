package main

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// writeDeck writes an invented survey of a concrete deck (fictional, for
// tests): a 6 × 5 grid at 1 m of a plane potential in mV, a base station B
// read four times with a drift of 2 mV per reading, one spike of +80 mV at
// A17 and a formula-looking note. It returns the file's path.
func writeDeck(t *testing.T, dir, name string) string {
	t.Helper()
	var b strings.Builder
	b.WriteString("id,x,y,potential_mV,note\n")
	k := 0
	add := func(id string, x, y, v float64, note string) {
		fmt.Fprintf(&b, "%s,%g,%g,%.1f,%s\n", id, x, y, v+2*float64(k), note)
		k++
	}
	plane := func(x, y float64) float64 { return -200 - 12*x - 7*y }
	add("B", -2, -2, plane(-2, -2), "base")
	n := 0
	for j := range 5 {
		for i := range 6 {
			n++
			v, note := plane(float64(i), float64(j)), ""
			if n == 17 {
				v += 80
			}
			if n == 5 {
				note = "=SUM(A1:A9)"
			}
			add(fmt.Sprintf("A%d", n), float64(i), float64(j), v, note)
		}
		if j%2 == 1 {
			add("B", -2, -2, plane(-2, -2), "base")
		}
	}
	add("B", -2, -2, plane(-2, -2), "base")
	path := filepath.Join(dir, name)
	if err := os.WriteFile(path, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

func TestCheckCommand(t *testing.T) {
	dir := t.TempDir()
	deck := writeDeck(t, dir, "deck.csv")
	tests := []struct {
		name    string
		args    []string
		code    int
		outHas  []string
		errHas  string
		outLack string
	}{
		{"plain", []string{"check", deck}, 0, []string{"readings: 34", "proposed base station: B", "A17"}, "", ""},
		{"base", []string{"check", "--base", "B", deck}, 0,
			[]string{"base station B: 4 readings, linear in order of readings", "loop closure +66 mV", "A17"}, "", ""},
		{"strict finds the spike", []string{"check", "--strict", "--base", "B", deck}, exitStrict, []string{"A17"}, "", ""},
		{"flags after files", []string{"check", deck, "--base", "B", "--drift", "cubic"}, 0, []string{"cubic in order of readings"}, "", ""},
		{"strict with no suspects", []string{"check", "--strict", "--base", "B", "--spike-k", "-1", deck}, 0, []string{"spike check off"}, "", ""},
		{"log", []string{"check", "--log", "--base", "B", deck}, 0, []string{"log (", "drift correction from base station B"}, "", ""},
		{"reference conversion", []string{"check", "--from-ref", "sce", "--to-ref", "cse", deck}, 0, []string{"sce → cse: -75 mV added to 34 readings"}, "", ""},
		{"unknown reference", []string{"check", "--from-ref", "platinum", deck}, exitUsage, nil, "known: cse", ""},
		{"unknown drift", []string{"check", "--drift", "quadratic", deck}, exitUsage, nil, "quadratic", ""},
		{"base not found", []string{"check", "--base", "Q9", deck}, exitInput, nil, "base station not found", ""},
		{"negative fault current", []string{"check", "--fault-current", "-5", deck}, exitUsage, nil, "fault current", ""},
		{"no test current", []string{"check", "--fault-current", "2000", deck}, exitInput, nil, "deck.csv:2: no test current", ""},
		{"scaled", []string{"check", "--test-current", "4", "--fault-current", "2000", "--spike-k", "-1", deck}, 0,
			[]string{"× 500 on 34 readings", "no safety authority"}, "", ""},
		{"no file", []string{"check"}, exitUsage, nil, "no input file", ""},
		{"missing file", []string{"check", filepath.Join(dir, "none.csv")}, exitInput, nil, "none.csv", ""},
		{"explicit session missing", []string{"check", "--session", filepath.Join(dir, "no.json"), deck}, exitInput, nil, "no.json", ""},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			code, out, errs := runArgs(tt.args...)
			if code != tt.code {
				t.Fatalf("isofield %v exit = %d, want %d (stderr %q)", tt.args, code, tt.code, errs)
			}
			for _, s := range tt.outHas {
				if !strings.Contains(out, s) {
					t.Errorf("stdout lacks %q:\n%s", s, out)
				}
			}
			if !strings.Contains(errs, tt.errHas) {
				t.Errorf("stderr = %q, want %q", errs, tt.errHas)
			}
		})
	}
}

// TestCheckReportGolden fixes the report of the test deck with its drift
// corrected (testdata/check_deck.golden; -update rewrites it).
func TestCheckReportGolden(t *testing.T) {
	dir := t.TempDir()
	deck := writeDeck(t, dir, "deck.csv")
	code, out, errs := runArgs("check", "--base", "B", deck)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	golden(t, "check_deck.golden", strings.ReplaceAll(out, dir, "TMP"))
}

func TestCleanCommand(t *testing.T) {
	dir := t.TempDir()
	deck := writeDeck(t, dir, "deck.csv")
	other := filepath.Join(dir, "extra.csv")
	if err := os.WriteFile(other, []byte("id,x,y,potential_mV,operator\nC1,9,9,-400,+ann\nC2,10,9,-410,bo\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	before := digest(t, deck)
	out := filepath.Join(dir, "clean.csv")
	code, _, errs := runArgs("clean", "--base", "B", deck, other, "-o", out)
	if code != 0 {
		t.Fatalf("exit %d: %s", code, errs)
	}
	if digest(t, deck) != before {
		t.Errorf("input modified")
	}
	rows := readCSV(t, out)
	wantHead := "id,x,y,potential_mV,note,operator,potential_corrected_mV,qa_status,qa_notes"
	if got := strings.Join(rows[0], ","); got != wantHead {
		t.Errorf("header %q, want %q", got, wantHead)
	}
	if len(rows) != 1+34+2 {
		t.Fatalf("%d rows, want every reading (36) and the header", len(rows))
	}
	byID := map[string][]string{}
	for _, r := range rows[1:] {
		byID[r[0]] = r
	}
	if r := byID["A17"]; r[7] != "suspect" || !strings.Contains(r[8], "disagrees with neighbours") {
		t.Errorf("A17 row %q, want suspect with its reason", r)
	}
	// A1 at (0,0): plane −200 plus drift 2 mV × 1 reading, corrected back.
	if r := byID["A1"]; r[7] != "ok" || math.Abs(num(t, r[6])+200) > 1e-6 {
		t.Errorf("A1 row %q, want ok at -200", r)
	}
	if r := byID["A5"]; r[4] != "'=SUM(A1:A9)" {
		t.Errorf("formula note written as %q, want it neutralised", r[4])
	}
	if r := byID["C1"]; r[4] != "" || r[5] != "'+ann" {
		t.Errorf("C1 row %q, want empty note and a neutralised operator", r)
	}
	if rows[1][0] != "B" || rows[len(rows)-1][0] != "C2" {
		t.Errorf("rows not in input order")
	}
	// Refusals: existing output without --force, an input as output.
	if code, _, errs := runArgs("clean", deck, "-o", out); code != exitInput || !strings.Contains(errs, "exists") {
		t.Errorf("existing output: exit %d, %q", code, errs)
	}
	if code, _, errs := runArgs("clean", "--force", deck, "-o", deck); code != exitInput || !strings.Contains(errs, "input") {
		t.Errorf("input as output: exit %d, %q", code, errs)
	}
	if digest(t, deck) != before {
		t.Errorf("input modified by a refused write")
	}
	if code, _, _ := runArgs("clean", "--force", deck, "-o", out); code != 0 {
		t.Errorf("--force: exit %d", code)
	}
}

// TestSessionEdits runs clean with a session file beside the input that
// excludes one reading and sets the base station; flags win over the
// session's settings and --no-session ignores it.
func TestSessionEdits(t *testing.T) {
	dir := t.TempDir()
	deck := writeDeck(t, dir, "deck.csv")
	sess := `{"version": 1, "settings": {"qa": {"base": "B", "drift": "cubic"}},
  "edits": [{"file": "deck.csv", "line": 3, "id": "A1", "exclude": true, "reason": "trodden on", "time": "2026-05-04T10:00:00Z"}]}`
	if err := os.WriteFile(deck+".isofield.json", []byte(sess), 0o644); err != nil {
		t.Fatal(err)
	}
	status := func(args ...string) (string, string) {
		code, out, errs := runArgs(append([]string{"clean"}, args...)...)
		if code != 0 {
			t.Fatalf("exit %d: %s", code, errs)
		}
		for _, line := range strings.Split(out, "\n") {
			if strings.HasPrefix(line, "A1,") {
				return line, out
			}
		}
		t.Fatalf("no A1 row in\n%s", out)
		return "", ""
	}
	if row, _ := status(deck); !strings.Contains(row, "excluded") || !strings.Contains(row, "trodden on") {
		t.Errorf("with session: A1 row %q, want excluded with the reason", row)
	}
	if row, _ := status("--no-session", deck); strings.Contains(row, "excluded") {
		t.Errorf("--no-session: A1 row %q, want not excluded", row)
	}
	code, out, _ := runArgs("check", deck)
	if code != 0 || !strings.Contains(out, "base station B: 4 readings, cubic") || !strings.Contains(out, "1 hand edit") {
		t.Errorf("check with session settings:\n%s", out)
	}
	code, out, _ = runArgs("check", "--drift", "linear", deck)
	if code != 0 || !strings.Contains(out, "base station B: 4 readings, linear") {
		t.Errorf("flag over session setting:\n%s", out)
	}
	if err := os.WriteFile(deck+".isofield.json", []byte(`{"version": 7}`), 0o644); err != nil {
		t.Fatal(err)
	}
	if code, _, errs := runArgs("check", deck); code != exitInput || !strings.Contains(errs, "newer isofield") {
		t.Errorf("newer session: exit %d, %q", code, errs)
	}
}

// TestCommandLineEdits records hand edits from the command line in the
// session file and finds them there on the next run.
func TestCommandLineEdits(t *testing.T) {
	dir := t.TempDir()
	deck := writeDeck(t, dir, "deck.csv")
	before := digest(t, deck)
	row := func(args ...string) string {
		t.Helper()
		code, out, errs := runArgs(append([]string{"clean"}, args...)...)
		if code != 0 {
			t.Fatalf("isofield clean %v: exit %d: %s", args, code, errs)
		}
		for _, line := range strings.Split(out, "\n") {
			if strings.HasPrefix(line, "A2,") {
				return line
			}
		}
		t.Fatalf("no A2 row")
		return ""
	}
	if r := row("--exclude", deck+":4", "--reason", "probe on rebar", deck); !strings.Contains(r, "excluded by hand: probe on rebar") {
		t.Errorf("after --exclude: %q", r)
	}
	if _, err := os.Stat(deck + ".isofield.json"); err != nil {
		t.Fatalf("no session file written: %v", err)
	}
	if r := row(deck); !strings.Contains(r, ",excluded,") {
		t.Errorf("next run: %q, want still excluded", r)
	}
	if r := row("--include", deck+":4", "--reason", "checked", deck); !strings.Contains(r, ",ok,") {
		t.Errorf("after --include: %q, want ok", r)
	}
	if digest(t, deck) != before {
		t.Errorf("input modified")
	}
	for _, bad := range [][]string{
		{"check", "--exclude", deck + ":99", deck},
		{"check", "--exclude", "nocolon", deck},
		{"check", "--no-session", "--exclude", deck + ":4", deck},
	} {
		if code, _, errs := runArgs(bad...); code != exitUsage {
			t.Errorf("isofield %v: exit %d (%s), want %d", bad, code, errs, exitUsage)
		}
	}
}
