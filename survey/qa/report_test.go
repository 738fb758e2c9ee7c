package qa

import (
	"bytes"
	"flag"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"testing"

	"isofield/survey"
	"isofield/survey/electrode"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata")

// smallSurvey is a fixed invented survey of 24 readings on a 6 × 4 grid at
// 1.5 m, with a base station B read four times, a drift of 1 mV per
// reading, one point read twice with disagreeing values, one spike and one
// reading taken against a calomel electrode.
func smallSurvey() *survey.Survey {
	b := newBuilder("deck-east.csv", survey.Millivolt)
	k := 0
	read := func(id string, x, y, v float64) *survey.Reading {
		r := b.add(id, x, y, math.Round(10*(v+float64(k)))/10)
		k++
		return r
	}
	field := func(x, y float64) float64 { return -220 - 9*x - 6*y + 4*math.Sin(x)*math.Cos(y) }
	read("B", -2, -2, field(-2, -2))
	for j := range 4 {
		for i := range 6 {
			x, y := 1.5*float64(i), 1.5*float64(j)
			id := "A" + strconv.Itoa(j*6+i+1)
			v := field(x, y)
			switch id {
			case "A9":
				v += 70 // spike
			case "A14":
				// Taken against SCE: E(vs SCE) = E(vs CSE) + (E_CSE − E_SCE),
				// 75 mV less negative.
				read(id, x, y, v+75).Reference = "sce"
				continue
			}
			read(id, x, y, v)
		}
		read("B", -2, -2, field(-2, -2))
	}
	read("A20", 1.5, 4.5, field(1.5, 4.5)-25) // a second, disagreeing reading
	read("B", -2, -2, field(-2, -2))
	return b.s
}

func smallRun(t *testing.T) (*survey.Survey, *Result) {
	s := smallSurvey()
	r := mustRun(t, s, Settings{Base: "B", From: electrode.CSE, To: electrode.CSE},
		[]Edit{{File: "deck-east.csv", Line: 5, ID: "A3", Exclude: true, Reason: "standing water"}})
	return s, r
}

// TestReportGolden compares the report of the small survey with
// testdata/report.golden (go test -run TestReportGolden -update rewrites
// it).
func TestReportGolden(t *testing.T) {
	s, r := smallRun(t)
	var buf bytes.Buffer
	if err := WriteReport(&buf, s, r); err != nil {
		t.Fatal(err)
	}
	golden(t, "report.golden", buf.Bytes())
}

// TestLogGolden compares the printed log of the small survey with
// testdata/log.golden.
func TestLogGolden(t *testing.T) {
	s, r := smallRun(t)
	var buf bytes.Buffer
	if err := WriteLog(&buf, s, r); err != nil {
		t.Fatal(err)
	}
	golden(t, "log.golden", buf.Bytes())
}

// TestSmallSurveyVerdicts states what the report must show, independent
// of its layout.
func TestSmallSurveyVerdicts(t *testing.T) {
	s, r := smallRun(t)
	want := map[string]Status{"A9": Suspect, "A20": Suspect, "A3": Excluded, "A1": OK, "B": OK, "A14": OK}
	for i, rd := range s.Readings {
		if w, ok := want[rd.ID]; ok && r.Status[i] != w {
			t.Errorf("%s: status %v, want %v (notes %q)", ReadingName(s, i), r.Status[i], w, r.Notes[i])
		}
	}
	if r.Drift == nil || math.Abs(r.Drift.LoopClosure-float64(len(s.Readings)-1)) > 0.2 {
		t.Errorf("drift %+v, want a loop closure of about %d mV", r.Drift, len(s.Readings)-1)
	}
	if len(r.Conversions) != 1 || r.Conversions[0].From != electrode.SCE || r.Conversions[0].Count != 1 {
		t.Errorf("conversions %+v, want one SCE reading converted", r.Conversions)
	}
}

func golden(t *testing.T, name string, got []byte) {
	t.Helper()
	path := filepath.Join("testdata", name)
	if *update {
		if err := os.MkdirAll("testdata", 0o755); err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("%v (run with -update to create it)", err)
	}
	if !bytes.Equal(got, want) {
		t.Errorf("output differs from %s (run with -update after checking):\n--- got\n%s\n--- want\n%s", path, got, want)
	}
}
