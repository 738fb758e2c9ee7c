package main

import (
	"bytes"
	"crypto/sha256"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// runArgs runs one command line in-process and returns its exit code and
// streams.
func runArgs(args ...string) (code int, stdout, stderr string) {
	var o, e bytes.Buffer
	code = run(&env{stdin: strings.NewReader(""), stdout: &o, stderr: &e}, args)
	return code, o.String(), e.String()
}

func TestUsage(t *testing.T) {
	tests := []struct {
		name       string
		args       []string
		code       int
		stdoutHas  string
		stderrHas  string
		emptyError bool
	}{
		{name: "help", args: []string{"help"}, code: 0, stdoutHas: "commands:", emptyError: true},
		{name: "version", args: []string{"version"}, code: 0, stdoutHas: "isofield " + version, emptyError: true},
		{name: "--version", args: []string{"--version"}, code: 0, stdoutHas: "isofield " + version, emptyError: true},
		{name: "unknown command", args: []string{"frobnicate"}, code: exitUsage, stderrHas: `unknown command "frobnicate"`},
		{name: "grid help", args: []string{"grid", "--help"}, code: 0, stderrHas: "x_m,y_m,potential_U"},
		{name: "help grid", args: []string{"help", "grid"}, code: 0, stderrHas: "usage: isofield grid"},
		{name: "grid bad flag", args: []string{"grid", "--no-such-flag", "a.csv"}, code: exitUsage, stderrHas: "no-such-flag"},
		{name: "grid no file", args: []string{"grid"}, code: exitUsage, stderrHas: "no input file"},
		{name: "grid bad units", args: []string{"grid", "--units", "kV", "a.csv"}, code: exitUsage, stderrHas: "--units"},
		{name: "grid bad method", args: []string{"grid", "--method", "best", "a.csv"}, code: exitUsage, stderrHas: "--method"},
		{name: "grid bad smoothing", args: []string{"grid", "--smoothing", "-1", "a.csv"}, code: exitUsage, stderrHas: "--smoothing"},
		{name: "demo extra arg", args: []string{"demo", "x"}, code: exitUsage, stderrHas: "unexpected argument"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			code, out, errs := runArgs(tt.args...)
			if code != tt.code {
				t.Errorf("isofield %v exit = %d, want %d (stderr %q)", tt.args, code, tt.code, errs)
			}
			if !strings.Contains(out, tt.stdoutHas) {
				t.Errorf("isofield %v stdout = %q, want it to contain %q", tt.args, out, tt.stdoutHas)
			}
			if !strings.Contains(errs, tt.stderrHas) {
				t.Errorf("isofield %v stderr = %q, want it to contain %q", tt.args, errs, tt.stderrHas)
			}
			if tt.emptyError && errs != "" {
				t.Errorf("isofield %v stderr = %q, want nothing", tt.args, errs)
			}
		})
	}
}

// TestBadInput checks that every malformed file of the walking-skeleton
// issue gets one line on stderr naming the file (and line where there is
// one), exit 1, no stack trace, and an untouched input.
func TestBadInput(t *testing.T) {
	tests := []struct {
		file string
		want string // substring of the one-line message after the path
	}{
		{"empty.csv", "empty.csv"},
		{"header_only.csv", "header_only.csv"},
		{"missing_y.csv", "missing_y.csv:1"},
		{"text_value.csv", "text_value.csv:3:3"},
		{"nan.csv", "nan.csv:3:3"},
		{"inf.csv", "inf.csv:4:3"},
		{"ragged.csv", "ragged.csv:3"},
		{"binary.csv", "binary.csv"},
		{"single.csv", "single.csv"},
		{"collinear.csv", "collinear.csv"},
	}
	for _, tt := range tests {
		t.Run(tt.file, func(t *testing.T) {
			path := filepath.Join("..", "..", "testdata", "bad", tt.file)
			before := digest(t, path)
			out := filepath.Join(t.TempDir(), "grid.csv")
			code, _, errs := runArgs("grid", "-o", out, path)
			if code != exitInput {
				t.Errorf("grid %s exit = %d, want %d (stderr %q)", tt.file, code, exitInput, errs)
			}
			if strings.Count(errs, "\n") != 1 || !strings.HasSuffix(errs, "\n") {
				t.Errorf("grid %s stderr is not one line: %q", tt.file, errs)
			}
			if !strings.Contains(errs, tt.want) {
				t.Errorf("grid %s stderr = %q, want it to name %q", tt.file, errs, tt.want)
			}
			if strings.Contains(errs, "goroutine") || strings.Contains(errs, "panic") {
				t.Errorf("grid %s printed a stack trace: %q", tt.file, errs)
			}
			if _, err := os.Stat(out); err == nil {
				t.Errorf("grid %s wrote %s despite the error", tt.file, out)
			}
			if after := digest(t, path); after != before {
				t.Errorf("grid %s modified its input", tt.file)
			}
			// view fails the same way before it takes over the screen.
			code, _, errs = runArgs("view", path)
			if code != exitInput || strings.Count(errs, "\n") != 1 || !strings.Contains(errs, tt.want) {
				t.Errorf("view %s: exit %d, stderr %q; want exit 1 and one line naming %q", tt.file, code, errs, tt.want)
			}
		})
	}
}

func digest(t *testing.T, path string) [32]byte {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	return sha256.Sum256(b)
}

// TestFlagsAnywhere checks that flags may follow the file names, as users
// type them, and that "--" ends the flags.
func TestFlagsAnywhere(t *testing.T) {
	dir := t.TempDir()
	demoCSV := filepath.Join(dir, "demo.csv")
	if code, _, errs := runArgs("demo", "-o", demoCSV); code != 0 {
		t.Fatalf("demo -o: exit %d: %s", code, errs)
	}
	tests := []struct {
		name string
		args []string
		out  string
	}{
		{"flags first", []string{"grid", "--spacing", "2", "-o", filepath.Join(dir, "a.csv"), demoCSV}, "a.csv"},
		{"flags last", []string{"grid", demoCSV, "--spacing", "2", "-o", filepath.Join(dir, "b.csv")}, "b.csv"},
		{"flags between", []string{"grid", "--spacing", "2", demoCSV, "-o", filepath.Join(dir, "c.csv")}, "c.csv"},
	}
	var first []byte
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if code, _, errs := runArgs(tt.args...); code != 0 {
				t.Fatalf("isofield %v: exit %d: %s", tt.args, code, errs)
			}
			got, err := os.ReadFile(filepath.Join(dir, tt.out))
			if err != nil {
				t.Fatal(err)
			}
			if first == nil {
				first = got
			} else if !bytes.Equal(got, first) {
				t.Errorf("isofield %v wrote a different grid than the flags-first form", tt.args)
			}
		})
	}
	if code, _, errs := runArgs("grid", "-o", filepath.Join(dir, "d.csv"), "--", "-not-a-flag.csv"); code != exitInput || !strings.Contains(errs, "-not-a-flag.csv") {
		t.Errorf("grid -- -not-a-flag.csv: exit %d, stderr %q; want exit 1 naming the file", code, errs)
	}
}

// TestDuplicatePositions checks the documented treatment of readings at
// one position with different values: they are kept, grouped as repeats
// (marked suspect when they disagree) and gridding goes on with the rest.
func TestDuplicatePositions(t *testing.T) {
	path := filepath.Join("..", "..", "testdata", "duplicates.csv")
	out := filepath.Join(t.TempDir(), "grid.csv")
	if code, _, errs := runArgs("grid", "--spacing", "0.5", "-o", out, path); code != 0 {
		t.Fatalf("grid duplicates.csv: exit %d: %s", code, errs)
	}
	code, report, errs := runArgs("check", path)
	if code != 0 || !strings.Contains(report, "DISAGREE") {
		t.Errorf("check duplicates.csv: exit %d, stderr %q; report lacks the disagreeing repeat:\n%s", code, errs, report)
	}
	if code, _, _ := runArgs("check", "--strict", path); code != exitStrict {
		t.Errorf("check --strict duplicates.csv: exit %d, want %d (suspects)", code, exitStrict)
	}
}

// TestPanicIsOneLine checks the last line of defence: a panic inside a
// command prints one line and exits 1 instead of a stack trace.
func TestPanicIsOneLine(t *testing.T) {
	t.Setenv("ISOFIELD_DEBUG", "")
	boom := []command{{name: "boom", run: func(*env, []string) error { panic("index out of range") }}}
	var o, e bytes.Buffer
	code := dispatch(&env{stdin: strings.NewReader(""), stdout: &o, stderr: &e}, []string{"boom"}, boom)
	if code != exitInput {
		t.Errorf("exit = %d, want %d", code, exitInput)
	}
	if got := e.String(); strings.Count(got, "\n") != 1 || strings.Contains(got, "goroutine") || !strings.Contains(got, "internal error: index out of range") {
		t.Errorf("stderr = %q, want one line naming the internal error, without a trace", got)
	}
}

// TestStageTrace: one line per stage, when the stage starts, in order.
func TestStageTrace(t *testing.T) {
	var buf bytes.Buffer
	p := stageTrace(&buf)
	for _, st := range []string{"load", "check", "check", "fit", "grid", "grid", "analyse"} {
		p(st, 0.5)
	}
	var got []string
	for _, line := range strings.Split(strings.TrimSpace(buf.String()), "\n") {
		f := strings.Fields(line)
		if len(f) != 4 || f[0] != "isofield:" || f[2] != "s" {
			t.Fatalf("line %q", line)
		}
		got = append(got, f[3])
	}
	if want := "load check fit grid analyse"; strings.Join(got, " ") != want {
		t.Errorf("stages %q, want %q", got, want)
	}
}

// TestStartProfile: a profile is written to the named file when the run
// stops; a path that cannot be created profiles nothing and does not fail.
func TestStartProfile(t *testing.T) {
	path := filepath.Join(t.TempDir(), "cpu.prof")
	stop := startProfile(path)
	x := 0.0
	for i := 0; i < 1e6; i++ {
		x += float64(i)
	}
	stop()
	if fi, err := os.Stat(path); err != nil || fi.Size() == 0 {
		t.Fatalf("profile %s: %v (%v)", path, fi, err)
	}
	startProfile(filepath.Join(t.TempDir(), "no", "such", "dir", "cpu.prof"))()
	startProfile("")()
	_ = x
}
