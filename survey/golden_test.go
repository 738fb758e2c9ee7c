package survey

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata/")

// golden compares got with testdata/name, or rewrites it with -update.
func golden(t *testing.T, name string, got []byte) {
	t.Helper()
	path := filepath.Join("testdata", name)
	if *update {
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run go test -update to create it)", err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("output differs from %s (go test -update rewrites it):\n got:\n%s\nwant:\n%s", path, got, want)
	}
}

// TestGoldenMerged writes the merged two-day survey in the canonical
// format, with its notes, and compares with the golden file.
func TestGoldenMerged(t *testing.T) {
	s, err := Load([]string{"testdata/day1.csv", "testdata/day2_volts.csv"}, LoadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := WriteCSV(&buf, s); err != nil {
		t.Fatal(err)
	}
	golden(t, "merged.golden.csv", buf.Bytes())
	golden(t, "merged.notes.golden", []byte(strings.Join(s.Notes, "\n")+"\n"))
}

// TestGoldenLineStation writes the line and station example with its
// derived positions.
func TestGoldenLineStation(t *testing.T) {
	s, err := Load([]string{"testdata/line_station.csv"}, LoadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	var buf bytes.Buffer
	if err := WriteCSV(&buf, s); err != nil {
		t.Fatal(err)
	}
	golden(t, "line_station.golden.csv", buf.Bytes())
}
