package qa

import (
	"bytes"
	"encoding/csv"
	"strings"
	"testing"

	"isofield/survey"
)

// TestNeutralise checks the spreadsheet formula guard (OWASP, "CSV
// Injection": cells starting with = + - @ tab or carriage return).
func TestNeutralise(t *testing.T) {
	tests := []struct{ in, want string }{
		{"", ""},
		{"plain", "plain"},
		{"-250", "-250"},
		{"-250.5", "-250.5"},
		{"-250,5", "-250,5"},
		{"+12", "+12"},
		{"-1e3", "-1e3"},
		{"=SUM(A1:A2)", "'=SUM(A1:A2)"},
		{"+ann", "'+ann"},
		{"-x", "'-x"},
		{"@cmd", "'@cmd"},
		{"\tx", "'\tx"},
		{"\r=1", "'\r=1"},
		{"-1,2,3", "'-1,2,3"},
		{"a=b", "a=b"},
	}
	for _, tt := range tests {
		if got := Neutralise(tt.in); got != tt.want {
			t.Errorf("Neutralise(%q) = %q, want %q", tt.in, got, tt.want)
		}
	}
}

// TestWriteCleanCSV writes two files with different headers: the union of
// the header names in first-seen order, empty cells where a file lacks a
// column, every reading in input order, the three QA columns last.
func TestWriteCleanCSV(t *testing.T) {
	s := &survey.Survey{Unit: survey.Volt, Files: []survey.FileInfo{
		{Path: "a.csv", Header: []string{"id", "x", "y", "V", "note"}},
		{Path: "b.csv", Header: []string{"id", "x", "y", "V", "crew", "note", "note"}},
	}, Readings: []survey.Reading{
		{ID: "A1", V: -0.25, File: 0, Line0: 2, Fields: []string{"A1", "0", "0", "-0,25", "=1+1"}},
		{ID: "B1", V: -0.3, File: 1, Line0: 2, Fields: []string{"B1", "1", "0", "-0.3", "kim", "n1", "n2"}},
		{ID: "B2", V: -0.3, File: 1, Line0: 3, Fields: []string{"B2", "2", "0", "-0.3", "kim", "", "", "extra"}},
	}}
	r := &Result{
		Corrected: []float64{-0.2500000001, -0.3, 1e-12},
		Status:    []Status{OK, Suspect, Excluded},
		Notes:     [][]string{nil, {"repeats disagree", "a; b"}, {"excluded by hand: wet"}},
	}
	var buf bytes.Buffer
	if err := WriteCleanCSV(&buf, s, r); err != nil {
		t.Fatal(err)
	}
	got, err := csv.NewReader(&buf).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	want := [][]string{
		{"id", "x", "y", "V", "note", "crew", "note", "column_8", "potential_corrected_V", "qa_status", "qa_notes"},
		{"A1", "0", "0", "-0,25", "'=1+1", "", "", "", "-0.25", "ok", ""},
		{"B1", "1", "0", "-0.3", "n1", "kim", "n2", "", "-0.3", "suspect", "repeats disagree; a, b"},
		{"B2", "2", "0", "-0.3", "", "kim", "", "extra", "0", "excluded", "excluded by hand: wet"},
	}
	if len(got) != len(want) {
		t.Fatalf("%d rows, want %d:\n%q", len(got), len(want), got)
	}
	for k := range want {
		if strings.Join(got[k], "|") != strings.Join(want[k], "|") {
			t.Errorf("row %d\n got %q\nwant %q", k, got[k], want[k])
		}
	}
}

func FuzzParseDriftMethod(f *testing.F) {
	for _, s := range []string{"linear", "cubic", "Monotone-Cubic", "", "x"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		m, err := ParseDriftMethod(s)
		if err != nil {
			return
		}
		back, err := ParseDriftMethod(m.String())
		if err != nil || back != m {
			t.Errorf("%q → %v → %v, %v", s, m, back, err)
		}
	})
}
