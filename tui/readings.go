package tui

import (
	"cmp"
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	"github.com/charmbracelet/bubbles/table"
	tea "github.com/charmbracelet/bubbletea"

	"isofield/survey/pipeline"
	"isofield/survey/qa"
)

// readingsTable lists every reading with its QA outcome; it can be ordered
// by any column and the selected reading excluded or included.
type readingsTable struct {
	keys          KeyMap
	styles        Styles
	table         table.Model
	res           *pipeline.Result
	order         []int // reading index of each row
	sortCol       int
	desc          bool
	width, height int
}

// readingColumns returns the table's column titles.
func readingColumns() []string {
	return []string{"", "source", "line", "id", "x", "y", "original", "corrected", "status", "reason"}
}

func newReadingsTable(keys KeyMap, st Styles) readingsTable {
	t := table.New(table.WithKeyMap(keys.tableKeys()), table.WithStyles(st.Table), table.WithFocused(true))
	return readingsTable{keys: keys, styles: st, table: t, sortCol: 2}
}

// SetSize sets the outer size; columns share the width.
func (r readingsTable) SetSize(w, h int) readingsTable {
	r.width, r.height = w, h
	r.table.SetColumns(r.columns())
	r.table.SetWidth(w)
	r.table.SetHeight(max(h-2, 2))
	return r
}

// columns sizes the columns for the width: each but the last gets its
// share, never less than its least width; the reason column (last) takes
// what is left, and on a narrow terminal the source column gives way first.
func (r readingsTable) columns() []table.Column {
	titles := readingColumns()
	shares := []int{1, 12, 5, 8, 9, 9, 9, 10, 8}
	least := []int{1, 4, 5, 4, 6, 6, 8, 10, 7}
	room := r.width - 2*len(titles) // each cell has one space each side
	ws := make([]int, len(titles))
	used := 0
	for i := range shares {
		ws[i] = max(shares[i]*room/90, least[i])
		used += ws[i]
	}
	for used > room-4 && ws[1] > least[1] {
		ws[1]--
		used--
	}
	ws[len(ws)-1] = max(room-used-2, 4)
	cols := make([]table.Column, len(titles))
	for i, t := range titles {
		if i == r.sortCol && i > 0 {
			t += map[bool]string{false: "↑", true: "↓"}[r.desc]
		}
		cols[i] = table.Column{Title: t, Width: ws[i]}
	}
	return cols
}

// SetResult fills the table from res, keeping the order and the selected
// reading.
func (r readingsTable) SetResult(res *pipeline.Result) readingsTable {
	sel := r.Selected()
	r.res = res
	r = r.sort()
	if sel >= 0 {
		r = r.Select(sel)
	}
	return r
}

// Selected returns the selected reading's index, or -1.
func (r readingsTable) Selected() int {
	c := r.table.Cursor()
	if c < 0 || c >= len(r.order) {
		return -1
	}
	return r.order[c]
}

// Select moves the selection to reading i.
func (r readingsTable) Select(i int) readingsTable {
	if p := slices.Index(r.order, i); p >= 0 {
		old := r.table.Cursor()
		// Moving from the top (rather than SetCursor) scrolls the table's
		// viewport to the row.
		r.table.GotoTop()
		r.table.MoveDown(p)
		r = r.mark(old)
	}
	return r
}

// cell returns column c of reading i as text.
func (r readingsTable) cell(i, c int) string {
	res := r.res
	rd := res.Survey.Readings[i]
	switch c {
	case 0:
		return ""
	case 1:
		return sourceName(res, i)
	case 2:
		return strconv.Itoa(rd.Line0)
	case 3:
		return rd.ID
	case 4:
		return fixed(rd.X)
	case 5:
		return fixed(rd.Y)
	case 6:
		return num(rd.V)
	case 7:
		return num(r.corrected(i))
	case 8:
		return r.status(i).String()
	}
	if res.QA != nil && i < len(res.QA.Notes) {
		return strings.Join(res.QA.Notes[i], "; ")
	}
	return ""
}

func (r readingsTable) corrected(i int) float64 {
	if q := r.res.QA; q != nil && i < len(q.Corrected) {
		return q.Corrected[i]
	}
	return r.res.Survey.Readings[i].V
}

func (r readingsTable) status(i int) qa.Status {
	if q := r.res.QA; q != nil && i < len(q.Status) {
		return q.Status[i]
	}
	return qa.OK
}

// sortKey compares readings a and b by the sort column.
func (r readingsTable) compare(a, b int) int {
	rs := r.res.Survey.Readings
	var c int
	switch r.sortCol {
	case 2:
		c = cmp.Compare(rs[a].File, rs[b].File)*2 + cmp.Compare(rs[a].Line0, rs[b].Line0)
	case 4:
		c = cmp.Compare(rs[a].X, rs[b].X)
	case 5:
		c = cmp.Compare(rs[a].Y, rs[b].Y)
	case 6:
		c = cmp.Compare(rs[a].V, rs[b].V)
	case 7:
		c = cmp.Compare(r.corrected(a), r.corrected(b))
	case 8:
		c = cmp.Compare(r.status(a), r.status(b))
	default:
		c = strings.Compare(r.cell(a, r.sortCol), r.cell(b, r.sortCol))
	}
	if c == 0 {
		c = cmp.Compare(a, b)
	} else if r.desc {
		c = -c
	}
	return c
}

// sort orders the rows by the sort column and rebuilds them.
func (r readingsTable) sort() readingsTable {
	if r.res == nil {
		return r
	}
	n := len(r.res.Survey.Readings)
	r.order = make([]int, n)
	for i := range r.order {
		r.order[i] = i
	}
	slices.SortStableFunc(r.order, r.compare)
	rows := make([]table.Row, n)
	for p, i := range r.order {
		row := make(table.Row, len(readingColumns()))
		for c := range row {
			row[c] = r.cell(i, c)
		}
		rows[p] = row
	}
	r.table.SetColumns(r.columns())
	r.table.SetRows(rows)
	return r.mark(-1)
}

// mark moves the selection marker (the first column) from row old to the
// cursor's row, so the selection shows without colour too.
func (r readingsTable) mark(old int) readingsTable {
	rows := r.table.Rows()
	if old >= 0 && old < len(rows) {
		rows[old][0] = ""
	}
	if c := r.table.Cursor(); c >= 0 && c < len(rows) {
		rows[c][0] = "▶"
	}
	r.table.SetRows(rows)
	return r
}

// Update handles ordering and navigation; exclusion is the root's.
func (r readingsTable) Update(msg tea.Msg) (readingsTable, tea.Cmd) {
	if km, ok := msg.(tea.KeyMsg); ok {
		sel := r.Selected()
		switch {
		case key.Matches(km, r.keys.Order):
			r.sortCol = r.sortCol%(len(readingColumns())-1) + 1 // column 0 is the marker
			return r.sort().Select(sel), nil
		case key.Matches(km, r.keys.Reverse):
			r.desc = !r.desc
			return r.sort().Select(sel), nil
		}
	}
	old := r.table.Cursor()
	var cmd tea.Cmd
	r.table, cmd = r.table.Update(msg)
	if r.table.Cursor() != old {
		r = r.mark(old)
	}
	return r, cmd
}

// View draws the table with a title line.
func (r readingsTable) View() string {
	st := r.styles
	n, sus, exc := 0, 0, 0
	if r.res != nil {
		n = len(r.res.Survey.Readings)
		for i := range n {
			switch r.status(i) {
			case qa.Suspect:
				sus++
			case qa.Excluded:
				exc++
			}
		}
	}
	title := st.PanelTitle.Render("Readings") + st.Label.Render(fmt.Sprintf("  %d, %d suspect, %d excluded; ordered by %s", n, sus, exc, readingColumns()[r.sortCol]))
	return truncate(title, r.width) + "\n" + r.table.View()
}
