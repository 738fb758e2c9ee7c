package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"isofield/survey/export"
)

// padSurvey copies the export package's invented half-space survey (see
// survey/export/testdata/report_check.sh for its closed form) into dir.
func padSurvey(t *testing.T, dir string) string {
	t.Helper()
	b, err := os.ReadFile("../../survey/export/testdata/pad.csv")
	if err != nil {
		t.Fatal(err)
	}
	path := filepath.Join(dir, "pad.csv")
	if err := os.WriteFile(path, b, 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

func TestExportAndReportUsage(t *testing.T) {
	tests := []struct {
		name      string
		args      []string
		stderrHas string
	}{
		{"export without dir", []string{"export", "x.csv"}, "--dir is required"},
		{"export without files", []string{"export", "--dir", "out"}, "no input file"},
		{"export negative suggest", []string{"export", "--dir", "out", "--suggest", "-1", "x.csv"}, "--suggest"},
		{"export dpi too small", []string{"export", "--dir", "out", "--dpi", "5", "x.csv"}, "--dpi"},
		{"report without output", []string{"report", "x.csv"}, "-o is required"},
		{"report without files", []string{"report", "-o", "r.html"}, "no input file"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			code, _, stderr := runArgs(tt.args...)
			if code != exitUsage || !strings.Contains(stderr, tt.stderrHas) {
				t.Errorf("isofield %v: exit %d, stderr %q; want exit %d and %q", tt.args, code, stderr, exitUsage, tt.stderrHas)
			}
		})
	}
}

// TestExportCommand writes every export, refuses to write them again
// without --force, replaces them with it, and never touches the input.
func TestExportCommand(t *testing.T) {
	dir := t.TempDir()
	in := padSurvey(t, dir)
	before := digest(t, in)
	out := filepath.Join(dir, "out")
	args := []string{"export", "--dir", out, "--spacing", "1", "--threshold", "600", "--dpi", "30", in}
	code, stdout, stderr := runArgs(args...)
	if code != exitOK {
		t.Fatalf("isofield %v: exit %d: %s", args, code, stderr)
	}
	for _, name := range []string{export.FileCleanCSV, export.FileGridCSV, export.FileGeoref,
		export.FileZones, export.FileMapPNG, export.FileReport, export.FileInfo} {
		if !strings.Contains(stdout, filepath.Join(out, name)) {
			t.Errorf("export did not list %s:\n%s", name, stdout)
		}
	}
	if code, _, stderr := runArgs(args...); code != exitInput || !strings.Contains(stderr, "--force") {
		t.Errorf("second export: exit %d, stderr %q; want exit %d naming --force", code, stderr, exitInput)
	}
	if code, _, stderr := runArgs(append([]string{"export", "--force"}, args[1:]...)...); code != exitOK {
		t.Errorf("export --force: exit %d: %s", code, stderr)
	}
	if digest(t, in) != before {
		t.Error("export modified its input")
	}
}

// TestReportCommand writes the report and refuses an input as its target.
func TestReportCommand(t *testing.T) {
	dir := t.TempDir()
	in := padSurvey(t, dir)
	before := digest(t, in)
	if code, _, stderr := runArgs("report", "--spacing", "1", "-o", in, in); code != exitInput ||
		!strings.Contains(stderr, "input file") {
		t.Errorf("report over its input: exit %d, stderr %q", code, stderr)
	}
	if digest(t, in) != before {
		t.Fatal("report modified its input")
	}
	rep := filepath.Join(dir, "report.html")
	if code, _, stderr := runArgs("report", "--spacing", "1", "--title", "Pad <A>", "-o", rep, in); code != exitOK {
		t.Fatalf("report: exit %d: %s", code, stderr)
	}
	b, err := os.ReadFile(rep)
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"Pad &lt;A&gt;", "isofield " + version, "SHA-256", "data:image/svg"} {
		if !strings.Contains(string(b), want) {
			t.Errorf("report lacks %q", want)
		}
	}
}
