package qa

import (
	"math"
	"testing"
	"time"

	"isofield/survey"
	"isofield/survey/electrode"
)

// FuzzRun builds small surveys and settings from arbitrary bytes: Run must
// never panic, never modify the survey, and return one corrected value and
// status per reading, keeping excluded readings excluded.
func FuzzRun(f *testing.F) {
	f.Add([]byte("\x01\x02\x03\x04\x05\x06\x07\x08\x09\x0a\x0b\x0c\x0d\x0e\x0f\x10"), uint8(0))
	f.Add([]byte("AAAABBBBCCCCDDDDEEEEFFFFGGGGHHHHIIIIJJJJKKKKLLLL"), uint8(7))
	f.Add([]byte{0, 0, 0, 0, 0, 0, 0, 0, 255, 255, 255, 255}, uint8(200))
	f.Fuzz(func(t *testing.T, data []byte, mode uint8) {
		if len(data) > 4*40 {
			data = data[:4*40]
		}
		b := newBuilder("f.csv", survey.Millivolt)
		t0 := time.Date(2026, 1, 1, 0, 0, 0, 0, time.UTC)
		for k := 0; k+3 < len(data); k += 4 {
			id := string(rune('A' + data[k]%5))
			r := b.add(id, float64(data[k+1]%8), float64(data[k+2]%8), float64(int(data[k+3])-128))
			if mode&1 != 0 {
				r.Time, r.HasTime = t0.Add(time.Duration(data[k+3])*time.Minute), true
			}
			if mode&2 != 0 && data[k]%3 == 0 {
				r.Reference = "sce"
			}
		}
		set := Settings{Drift: DriftMethod(mode >> 7), AutoBase: mode&4 != 0, RepeatDist: float64(mode%3) - 1}
		if mode&8 != 0 {
			set.Base = "A"
		}
		if mode&16 != 0 {
			set.To = electrode.CSE
		}
		if mode&32 != 0 {
			set.SpikeK = -1
		}
		edits := []Edit{{File: "f.csv", Line: 2 + int(mode)%5, Exclude: true}}
		before := cloneSurvey(b.s)
		r, err := Run(b.s, set, edits)
		if err != nil {
			return
		}
		if n := len(b.s.Readings); len(r.Corrected) != n || len(r.Status) != n {
			t.Fatalf("sizes %d/%d for %d readings", len(r.Corrected), len(r.Status), n)
		}
		for i := range b.s.Readings {
			if b.s.Readings[i].V != before.Readings[i].V {
				t.Fatalf("reading %d modified", i)
			}
			if math.IsNaN(r.Corrected[i]) {
				t.Fatalf("reading %d corrected to NaN", i)
			}
		}
		if line := 2 + int(mode)%5; line-2 < len(b.s.Readings) && r.Status[line-2] != Excluded {
			t.Fatalf("hand exclusion lost: status %v", r.Status[line-2])
		}
	})
}
