package tui

import (
	"cmp"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"

	"isofield/survey"
	"isofield/survey/pipeline"
	"isofield/survey/qa"
)

// compareOracle is the table's former order, a comparison that reads the
// readings in each call: by the column's value (cmp.Compare, so NaN
// first), then by index, the index rising either way. The keyed radix
// order must reproduce it exactly.
func compareOracle(s sortSpec) func(a, b int) int {
	rs := s.rs
	name := func(i int) string { return at(s.names, rs[i].File, "") }
	return func(a, b int) int {
		var c int
		switch s.col {
		case colSource:
			c = strings.Compare(name(a), name(b))*2 + cmp.Compare(rs[a].Line0, rs[b].Line0)
		case colLine:
			c = cmp.Compare(rs[a].File, rs[b].File)*2 + cmp.Compare(rs[a].Line0, rs[b].Line0)
		case colID:
			c = strings.Compare(rs[a].ID, rs[b].ID)
		case colX:
			c = cmp.Compare(rs[a].X, rs[b].X)
		case colY:
			c = cmp.Compare(rs[a].Y, rs[b].Y)
		case colOriginal:
			c = cmp.Compare(rs[a].V, rs[b].V)
		case colCorrected:
			c = cmp.Compare(at(s.corr, a, rs[a].V), at(s.corr, b, rs[b].V))
		case colStatus:
			c = cmp.Compare(at(s.status, a, qa.OK), at(s.status, b, qa.OK))
		default:
			c = slices.Compare(at(s.notes, a, nil), at(s.notes, b, nil))
		}
		if c == 0 {
			return cmp.Compare(a, b)
		}
		if s.desc {
			return -c
		}
		return c
	}
}

// oracleOrder sorts the readings with compareOracle.
func oracleOrder(s sortSpec) []int {
	order := make([]int, len(s.rs))
	for i := range order {
		order[i] = i
	}
	slices.SortFunc(order, compareOracle(s))
	return order
}

// tiedResult returns n seeded readings whose every column repeats a few
// values (ties everywhere), with NaN, ±0 and ±Inf among the values, a
// reading out of its file range, two files of the same base name, ids that
// share their first eight or 24 bytes, and QA arrays shorter than the readings
// (the missing corrected values fall back to the value as read).
func tiedResult(n int, withQA bool) *pipeline.Result {
	rng := rand.New(rand.NewPCG(7, uint64(n)))
	vals := []float64{math.NaN(), math.Copysign(0, -1), 0, -1.5, 2.25, math.Inf(1), math.Inf(-1), -600, -600.0000000001}
	ids := []string{"", "A", "A\x00", "L12-S345", "L12-S3456", "L12-S3457", "L12-S34", "Z", "station-7b", "station-7a",
		"a-very-long-station-name-1", "a-very-long-station-name-0", "a-very-long-station-name"}
	notes := [][]string{nil, {}, {""}, {"by hand"}, {"by hand", "b"}, {"by hand", "a"}, {"disagrees with neighbours"}, {"disagrees with neighbourz"}}
	s := &survey.Survey{Unit: survey.Millivolt, Files: []survey.FileInfo{
		{Path: "/a/day.csv"}, {Path: "/b/day.csv"}, {Path: "/a/alpha.csv"}}}
	s.Readings = make([]survey.Reading, n)
	m := n - n/10 // QA arrays cover only the first m readings
	q := &qa.Result{Corrected: make([]float64, m), Status: make([]qa.Status, m), Notes: make([][]string, m)}
	pick := func(v []float64) float64 { return v[rng.IntN(len(v))] }
	for i := range s.Readings {
		s.Readings[i] = survey.Reading{ID: ids[rng.IntN(len(ids))], File: rng.IntN(5) - 1, Line0: rng.IntN(6),
			X: pick(vals), Y: pick(vals), V: pick(vals)}
		if i < m {
			q.Corrected[i], q.Status[i], q.Notes[i] = pick(vals), qa.Status(rng.IntN(3)), notes[rng.IntN(len(notes))]
		}
	}
	if !withQA {
		q = nil
	}
	return &pipeline.Result{Survey: s, QA: q}
}

// extremeLines gives some of res's readings the extreme line numbers, so
// that file and line no longer pack into one key.
func extremeLines(res *pipeline.Result) *pipeline.Result {
	for i := range res.Survey.Readings {
		switch i % 7 {
		case 0:
			res.Survey.Readings[i].Line0 = math.MaxInt
		case 3:
			res.Survey.Readings[i].Line0 = math.MinInt
		}
	}
	return res
}

// TestReadingsSortMatchesComparison checks the keyed radix order of every
// column, both ways, against the former comparison order (compareOracle
// with slices.SortFunc as the reference), on readings full of ties and
// NaNs and on the benchmark's survey.
func TestReadingsSortMatchesComparison(t *testing.T) {
	names := func(res *pipeline.Result) []string { return measureReadings(res).names }
	tests := []struct {
		name string
		res  *pipeline.Result
	}{
		{"empty", tiedResult(0, true)},
		{"one", tiedResult(1, true)},
		{"ties, NaN, short QA", tiedResult(3000, true)},
		{"no QA", tiedResult(500, false)},
		{"lines too far apart to pack", extremeLines(tiedResult(1000, true))},
		{"survey", bigResult(5000)},
	}
	for _, tt := range tests {
		for col := colSource; col <= colReason; col++ {
			for _, desc := range []bool{false, true} {
				s := newSortSpec(tt.res, names(tt.res), col, desc)
				t.Run(fmt.Sprintf("%s/%s/desc=%v", tt.name, readingColumns()[col], desc), func(t *testing.T) {
					got, rowOf := s.order()
					want := oracleOrder(s)
					if !slices.Equal(got, want) {
						p := 0
						for p < len(got) && got[p] == want[p] {
							p++
						}
						t.Fatalf("order differs from the comparison order first at row %d: reading %d, want %d", p, got[p], want[p])
					}
					for p, i := range got {
						if int(rowOf[i]) != p {
							t.Fatalf("rowOf[%d] = %d, want %d", i, rowOf[i], p)
						}
					}
				})
			}
		}
	}
}

// TestFloatKey checks the float keys' order against cmp.Compare on pairs of
// awkward values.
func TestFloatKey(t *testing.T) {
	vals := []float64{math.NaN(), math.Inf(-1), -math.MaxFloat64, -1, -math.SmallestNonzeroFloat64,
		math.Copysign(0, -1), 0, math.SmallestNonzeroFloat64, 1, math.MaxFloat64, math.Inf(1)}
	for _, a := range vals {
		for _, b := range vals {
			if got, want := cmp.Compare(floatKey(a), floatKey(b)), cmp.Compare(a, b); got != want {
				t.Errorf("keys of %v and %v compare %d, cmp.Compare says %d", a, b, got, want)
			}
		}
	}
}

// BenchmarkReadingsSort orders 10⁶ readings by each column: the keyed
// radix sort the table uses, and the former comparison sort for contrast.
func BenchmarkReadingsSort(b *testing.B) {
	res := bigResult(1_000_000)
	names := measureReadings(res).names
	for _, col := range []int{colSource, colID, colX, colCorrected, colStatus, colReason} {
		s := newSortSpec(res, names, col, true)
		b.Run(fmt.Sprintf("keyed/%s", readingColumns()[col]), func(b *testing.B) {
			for b.Loop() {
				s.order()
			}
		})
		b.Run(fmt.Sprintf("compare/%s", readingColumns()[col]), func(b *testing.B) {
			for b.Loop() {
				oracleOrder(s)
			}
		})
	}
}

// sortedBy runs the command of an order asked for off the UI loop.
func sortedBy(t *testing.T, cmd tea.Cmd) readingsSortedMsg {
	t.Helper()
	if cmd == nil {
		t.Fatal("no command for an order off the UI loop")
	}
	msg, ok := cmd().(readingsSortedMsg)
	if !ok {
		t.Fatalf("command returned %T, want readingsSortedMsg", msg)
	}
	return msg
}

// TestReadingsSortAsync orders a table off the UI loop (every size is
// large here): the old order stays on screen with a note until the latest
// request's result arrives; older results, and results for a table that
// took a new result since, are dropped.
func TestReadingsSortAsync(t *testing.T) {
	r := tableFor(3000, 120, 20)
	r.asyncMin = 0
	for range 7 {
		r, _ = r.Update(tableKey("down"))
	}
	before, sel, off := r.order, r.Selected(), r.cursor-r.top

	r, first := r.Update(tableKey("o"))  // by id
	r, second := r.Update(tableKey("r")) // by id, descending: supersedes the first
	stale, latest := sortedBy(t, first), sortedBy(t, second)
	if !slices.Equal(r.order, before) || r.sortCol != colLine || !strings.Contains(r.View(), "sorting by id…") {
		t.Fatalf("while sorting: column %d, order changed %v, view:\n%s", r.sortCol, !slices.Equal(r.order, before), r.View())
	}
	if r = r.onSorted(stale); !slices.Equal(r.order, before) || r.pending == nil {
		t.Fatal("a superseded order was taken")
	}
	r = r.onSorted(latest)
	want := oracleOrder(newSortSpec(r.res, r.stats.names, colID, true))
	if !slices.Equal(r.order, want) || r.sortCol != colID || !r.desc || r.pending != nil {
		t.Fatalf("after the latest result: column %d desc %v pending %v, order equal %v", r.sortCol, r.desc, r.pending, slices.Equal(r.order, want))
	}
	if r.Selected() != sel || r.cursor-r.top != off {
		t.Errorf("reading %d at screen row %d, want %d at %d", r.Selected(), r.cursor-r.top, sel, off)
	}
	if strings.Contains(r.View(), "sorting") {
		t.Errorf("sorting note left after the result:\n%s", r.View())
	}
	if r2 := r.onSorted(stale); !slices.Equal(r2.order, want) {
		t.Error("a stale order arriving after the latest one was taken")
	}

	// A new result while an order is under way orders at once, as asked,
	// and the order computed for the old result is dropped.
	r, third := r.Update(tableKey("o")) // by x
	r = r.SetResult(bigResult(3000), r.stats)
	if r.sortCol != colX || r.pending != nil {
		t.Fatalf("after a new result: column %d, pending %v; want x, none", r.sortCol, r.pending)
	}
	want = oracleOrder(newSortSpec(r.res, r.stats.names, colX, true))
	if r = r.onSorted(sortedBy(t, third)); !slices.Equal(r.order, want) {
		t.Error("the order asked for before the new result was taken")
	}
}

// TestModelRoutesSortedReadings checks that the root hands an order
// computed off the UI loop to the table whatever has the focus.
func TestModelRoutesSortedReadings(t *testing.T) {
	m := readyModel(t, 100, 30, false)
	m.table.asyncMin = 0
	m = press(t, m, "t")
	next, cmd := m.Update(keyMsg("o"))
	m = next.(Model)
	msg := sortedBy(t, cmd)
	m = press(t, m, "esc") // the map has the focus when the order arrives
	if m = update1(t, m, msg); m.table.pending != nil || m.table.sortCol != msg.col {
		t.Errorf("table column %d pending %v after the order arrived", m.table.sortCol, m.table.pending)
	}
}
