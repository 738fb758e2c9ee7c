package tui

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"isofield/survey"
	"isofield/survey/pipeline"
	"isofield/survey/qa"
)

// bigResult returns a result of n seeded random readings in two files,
// one in fifty suspect and one in two hundred excluded (invented data).
func bigResult(n int) *pipeline.Result {
	rng := rand.New(rand.NewPCG(3, uint64(n)))
	s := &survey.Survey{Unit: survey.Millivolt,
		Files: []survey.FileInfo{{Path: "/data/day-1.csv"}, {Path: "/data/day-2.csv"}}}
	s.Readings = make([]survey.Reading, n)
	q := &qa.Result{Corrected: make([]float64, n), Status: make([]qa.Status, n), Notes: make([][]string, n)}
	for i := range s.Readings {
		f := i * 2 / n
		s.Readings[i] = survey.Reading{ID: fmt.Sprintf("L%d-S%d", i/500, i%500), File: f, Line0: i + 2,
			X: 5e5 + rng.Float64()*1000, Y: 6e6 + rng.Float64()*700, V: -600 + rng.Float64()*400}
		q.Corrected[i] = s.Readings[i].V + 3
		switch {
		case i%200 == 0:
			q.Status[i], q.Notes[i] = qa.Excluded, []string{"by hand"}
		case i%50 == 0:
			q.Status[i], q.Notes[i] = qa.Suspect, []string{"disagrees with neighbours"}
		}
	}
	return &pipeline.Result{Survey: s, QA: q}
}

// BenchmarkReadingsTable measures the readings table at survey sizes:
// scanning a new result's readings (done in the background with the
// scene), taking the result into the table (on the UI loop, after every
// regrid), ordering by the next column (o), moving the selection (↓/↑),
// and drawing it.
func BenchmarkReadingsTable(b *testing.B) {
	for _, n := range []int{1000, 100_000, 1_000_000} {
		res := bigResult(n)
		base := newReadingsTable(DefaultKeyMap(), testStyles(true)).SetSize(120, 37)
		b.Run(fmt.Sprintf("measure/n=%d", n), func(b *testing.B) {
			for b.Loop() {
				measureReadings(res)
			}
		})
		st := measureReadings(res)
		b.Run(fmt.Sprintf("set/n=%d", n), func(b *testing.B) {
			for b.Loop() {
				base.SetResult(res, st)
			}
		})
		r := base.SetResult(res, st)
		b.Run(fmt.Sprintf("order/n=%d", n), func(b *testing.B) {
			t := r
			for b.Loop() {
				t, _ = t.Update(keyMsg("o"))
			}
		})
		b.Run(fmt.Sprintf("move/n=%d", n), func(b *testing.B) {
			t := r
			for i := 0; b.Loop(); i++ {
				k := "down"
				if i%100 >= 50 {
					k = "up"
				}
				t, _ = t.Update(keyMsg(k))
			}
		})
		b.Run(fmt.Sprintf("view/n=%d", n), func(b *testing.B) {
			for b.Loop() {
				_ = r.View()
			}
		})
	}
}
