package tui

import (
	"cmp"
	"slices"
	"strings"
	"testing"

	tea "github.com/charmbracelet/bubbletea"

	"isofield/survey/qa"
)

// tableFor returns a w × h readings table showing bigResult(n).
func tableFor(n, w, h int) readingsTable {
	res := bigResult(n)
	return newReadingsTable(DefaultKeyMap(), testStyles(false)).SetSize(w, h).SetResult(res, measureReadings(res))
}

// TestReadingsOrder checks every column's order against a plain sort of
// the readings' values (slices.SortStableFunc on a key per reading, the
// standard library as the reference), both ways.
func TestReadingsOrder(t *testing.T) {
	r := tableFor(2000, 120, 30)
	rs := r.res.Survey.Readings
	q := r.res.QA
	keys := map[int]func(i int) float64{
		colLine:      func(i int) float64 { return float64(rs[i].File*1e7 + rs[i].Line0) },
		colX:         func(i int) float64 { return rs[i].X },
		colY:         func(i int) float64 { return rs[i].Y },
		colOriginal:  func(i int) float64 { return rs[i].V },
		colCorrected: func(i int) float64 { return q.Corrected[i] },
		colStatus:    func(i int) float64 { return float64(q.Status[i]) },
	}
	for col, k := range keys {
		for _, desc := range []bool{false, true} {
			r.sortCol, r.desc = col, desc
			got := r.sortKeeping(-1).order
			want := make([]int, len(rs))
			for i := range want {
				want[i] = i
			}
			slices.SortStableFunc(want, func(a, b int) int {
				if desc {
					return cmp.Compare(k(b), k(a))
				}
				return cmp.Compare(k(a), k(b))
			})
			if !slices.Equal(got, want) {
				t.Errorf("column %s desc %v: order differs from the reference sort", readingColumns()[col], desc)
			}
		}
	}
	r.sortCol, r.desc = colID, false
	ids := r.sortKeeping(-1).order
	if !slices.IsSortedFunc(ids, func(a, b int) int { return strings.Compare(rs[a].ID, rs[b].ID) }) {
		t.Error("ids out of order")
	}
}

// TestReadingsNavigation walks the table with its keys: the selection and
// the window stay consistent and the Bubbles table only ever holds the
// rows on screen.
func TestReadingsNavigation(t *testing.T) {
	const n = 5000
	r := tableFor(n, 100, 20)
	vh := r.visibleRows()
	tests := []struct {
		keys []string
		row  int
	}{
		{[]string{"down"}, 1},
		{[]string{"down", "down", "up"}, 1},
		{[]string{"up"}, 0},
		{[]string{"pgdown"}, vh},
		{[]string{"pgdown", "pgdown", "pgup"}, vh},
		{[]string{"G"}, n - 1},
		{[]string{"end", "down"}, n - 1},
		{[]string{"G", "g"}, 0},
		{[]string{"G", "home"}, 0},
	}
	for _, tt := range tests {
		t.Run(strings.Join(tt.keys, " "), func(t *testing.T) {
			m := r
			for _, k := range tt.keys {
				m, _ = m.Update(tableKey(k))
			}
			if m.cursor != tt.row || m.Selected() != m.order[tt.row] {
				t.Errorf("row %d (reading %d), want row %d", m.cursor, m.Selected(), tt.row)
			}
			if rows := len(m.table.Rows()); rows > vh || m.cursor < m.top || m.cursor >= m.top+vh {
				t.Errorf("%d rows handed to the table, top %d cursor %d, %d on screen", rows, m.top, m.cursor, vh)
			}
			if got := m.table.SelectedRow(); got[0] != "▶" || !slices.Contains(got, m.res.Survey.Readings[m.Selected()].ID) {
				t.Errorf("highlighted row %v, want the selected reading marked", got)
			}
		})
	}
}

// TestReadingsKeepSelection reorders and takes a new result: the selected
// reading stays selected at the same height on screen.
func TestReadingsKeepSelection(t *testing.T) {
	r := tableFor(3000, 100, 20)
	for range 7 {
		r, _ = r.Update(tableKey("down"))
	}
	sel, off := r.Selected(), r.cursor-r.top
	for _, k := range []string{"o", "o", "r"} {
		r, _ = r.Update(tableKey(k))
		if r.Selected() != sel || r.cursor-r.top != off {
			t.Fatalf("after %s: reading %d at screen row %d, want %d at %d", k, r.Selected(), r.cursor-r.top, sel, off)
		}
	}
	r = r.SetResult(r.res, r.stats)
	if r.Selected() != sel {
		t.Errorf("a new result moved the selection to %d from %d", r.Selected(), sel)
	}
}

// TestReadingsColumns shows the source column only for several files and
// never cuts a coordinate of a projected survey.
func TestReadingsColumns(t *testing.T) {
	if v := tableFor(500, 120, 20).View(); !strings.Contains(v, "day-1.csv") || !strings.Contains(v, "source") {
		t.Errorf("two files but no source column:\n%s", v)
	}
	r := tableFor(500, 80, 20) // eastings 5e5, northings 6e6
	v := r.View()
	rd := r.res.Survey.Readings[r.Selected()]
	if !strings.Contains(v, fixed(rd.X)) || !strings.Contains(v, fixed(rd.Y)) {
		t.Errorf("selected reading's coordinates %s, %s not shown whole:\n%s", fixed(rd.X), fixed(rd.Y), v)
	}
	m := readyModel(t, 80, 24, false) // one file
	if strings.Contains(press(t, m, "t").View(), "source") {
		t.Error("one file, yet a source column")
	}
	if m.scene.stats.sus != 1 || m.scene.stats.exc != 1 || m.scene.stats.natural[colStatus] != len(qa.Excluded.String()) {
		t.Errorf("stats %+v, want 1 suspect, 1 excluded", m.scene.stats)
	}
}

// tableKey is keyMsg with the table's paging keys.
func tableKey(s string) tea.KeyMsg {
	switch s {
	case "pgdown":
		return tea.KeyMsg{Type: tea.KeyPgDown}
	case "pgup":
		return tea.KeyMsg{Type: tea.KeyPgUp}
	case "home":
		return tea.KeyMsg{Type: tea.KeyHome}
	case "end":
		return tea.KeyMsg{Type: tea.KeyEnd}
	}
	return keyMsg(s)
}
