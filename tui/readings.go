package tui

import (
	"cmp"
	"fmt"
	"math"
	"path/filepath"
	"slices"
	"strconv"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	"github.com/charmbracelet/bubbles/table"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"

	"isofield/survey"
	"isofield/survey/pipeline"
	"isofield/survey/qa"
)

// readingsTable lists every reading with its QA outcome; it can be ordered
// by any column and the selected reading excluded or included.
//
// Speed. Surveys reach 10⁶ readings, so the table never formats them all:
// ordering sorts an index slice with comparisons on the readings' values
// (no text), and the Bubbles table is handed only the rows on screen,
// rebuilt on each move (a few dozen rows of ten cells). The table keeps
// its own selection and scroll position; the Bubbles table draws the
// visible window with the selected row highlighted.
type readingsTable struct {
	keys          KeyMap
	styles        Styles
	table         table.Model
	res           *pipeline.Result
	order         []int   // reading index of each row
	rowOf         []int32 // row of each reading (order's inverse)
	cursor, top   int     // selected row, first row on screen
	sortCol       int
	desc          bool
	stats         readingStats
	width, height int
}

// readingColumns returns the table's column titles.
func readingColumns() []string {
	return []string{"", "source", "line", "id", "x", "y", "original", "corrected", "status", "reason"}
}

func newReadingsTable(keys KeyMap, st Styles) readingsTable {
	t := table.New(table.WithStyles(st.Table), table.WithFocused(true))
	return readingsTable{keys: keys, styles: st, table: t, sortCol: 2}
}

// SetSize sets the outer size; columns share the width.
func (r readingsTable) SetSize(w, h int) readingsTable {
	r.width, r.height = w, h
	r.table.SetRows(nil) // each setter below redraws the rows it holds
	r.table.SetColumns(r.columns())
	r.table.SetWidth(w)
	r.table.SetHeight(max(h-2, 3)) // between the title and the detail line; the header takes one
	return r.moveTo(r.cursor)
}

// visibleRows is the number of rows on screen.
func (r readingsTable) visibleRows() int { return max(r.height-3, 2) }

// Column numbers of readingColumns.
const (
	colMark = iota
	colSource
	colLine
	colID
	colX
	colY
	colOriginal
	colCorrected
	colStatus
	colReason
)

// shown returns the columns on screen: the source only when the readings
// come from more than one file.
func (r readingsTable) shown() []int {
	out := make([]int, 0, colReason+1)
	for c := range colReason + 1 {
		if c != colSource || len(r.stats.names) > 1 {
			out = append(out, c)
		}
	}
	return out
}

// columns sizes the shown columns for the width: each gets the width its
// widest value needs (measured when the result arrived) and the reason
// takes the rest; on a narrow terminal the source, then the id, then the
// reason give way, never the numbers.
func (r readingsTable) columns() []table.Column {
	titles := r.stats.titles()
	shown := r.shown()
	ws := make([]int, len(shown))
	used := 0
	for k, c := range shown {
		ws[k] = max(r.stats.natural[c], len(titles[c]))
		if c == r.sortCol {
			ws[k] = max(ws[k], len(titles[c])+1) // the order arrow
		}
		if c == colMark {
			ws[k] = 1
		}
		used += ws[k]
	}
	room := r.width - len(shown) // each cell has a space on its left
	last := len(shown) - 1
	used -= ws[last]
	for _, c := range []int{colSource, colID} {
		for k := range shown {
			for shown[k] == c && used > room-8 && ws[k] > 6 {
				ws[k]--
				used--
			}
		}
	}
	ws[last] = max(room-used, 4)
	cols := make([]table.Column, len(shown))
	for k, c := range shown {
		t := titles[c]
		if c == r.sortCol {
			t += map[bool]string{false: "↑", true: "↓"}[r.desc]
		}
		cols[k] = table.Column{Title: alignCell(t, c, ws[k]), Width: ws[k]}
	}
	return cols
}

// alignCell right-aligns the numbers of column c in w cells, so that
// their digits line up.
func alignCell(s string, c, w int) string {
	switch c {
	case colLine, colX, colY, colOriginal, colCorrected:
		return strings.Repeat(" ", max(w-lipgloss.Width(s), 0)) + s
	}
	return s
}

// readingStats are what the table needs to know of all the readings of a
// result: file names, the width of each column's widest value, the
// counts, and the ranges and display units of the two value columns.
// newScene finds them once per result, off the UI loop.
type readingStats struct {
	names    []string // base name of each input file
	natural  [colReason + 1]int
	sus, exc int // readings suspect and excluded

	unit               string   // the survey's unit
	origLo, origHi     float64  // range of the values as read
	corrLo, corrHi     float64  // range of the corrected values
	origUnit, corrUnit dispUnit // how the two columns show them
}

// measureReadings scans the readings of res once.
func measureReadings(res *pipeline.Result) readingStats {
	var st readingStats
	st.names = make([]string, len(res.Survey.Files))
	n := &st.natural
	for f, fi := range res.Survey.Files {
		st.names[f] = filepath.Base(fi.Path)
		n[colSource] = max(n[colSource], lipgloss.Width(st.names[f]))
	}
	n[colSource] = min(n[colSource], 20)
	rs := res.Survey.Readings
	xmin, ymin, xmax, ymax := res.Survey.Extent()
	n[colX] = max(len(fixed(xmin)), len(fixed(xmax)))
	n[colY] = max(len(fixed(ymin)), len(fixed(ymax)))
	var corr []float64
	var status []qa.Status
	if res.QA != nil {
		corr, status = res.QA.Corrected, res.QA.Status
	}
	st.origLo, st.origHi, st.corrLo, st.corrHi = math.Inf(1), math.Inf(-1), math.Inf(1), math.Inf(-1)
	line := 0
	for i := range rs {
		r := &rs[i]
		n[colID] = max(n[colID], len(r.ID))
		line = max(line, r.Line0)
		c := at(corr, i, r.V)
		st.origLo, st.origHi = min(st.origLo, r.V), max(st.origHi, r.V)
		st.corrLo, st.corrHi = min(st.corrLo, c), max(st.corrHi, c)
		switch at(status, i, qa.OK) {
		case qa.Suspect:
			st.sus++
		case qa.Excluded:
			st.exc++
		}
	}
	n[colID] = min(n[colID], 16)
	n[colLine] = len(strconv.Itoa(line))
	n[colStatus] = len("excluded")
	st.unit = res.Survey.Unit.String()
	return st.withUnits(displayUnit(st.unit, st.origLo, st.origHi), displayUnit(st.unit, st.corrLo, st.corrHi))
}

// withUnits shows the values as read in orig and the corrected values in
// corr, and sizes the two columns for them (both alike, so that their
// digits line up).
func (st readingStats) withUnits(orig, corr dispUnit) readingStats {
	st.origUnit, st.corrUnit = orig, corr
	w := 5
	if st.origLo <= st.origHi { // some readings
		w = max(len(orig.num(st.origLo)), len(orig.num(st.origHi)), len(corr.num(st.corrLo)), len(corr.num(st.corrHi)), w)
	}
	st.natural[colOriginal], st.natural[colCorrected] = w, w
	return st
}

// titles returns the column titles; the value columns name their units
// when either is not the survey's own.
func (st readingStats) titles() []string {
	t := readingColumns()
	if st.origUnit.name != st.unit || st.corrUnit.name != st.unit {
		t[colOriginal] += " " + st.origUnit.name
		t[colCorrected] += " " + st.corrUnit.name
	}
	return t
}

// SetResult fills the table from res, whose readings st describes
// (measureReadings), keeping the order and the selected reading.
func (r readingsTable) SetResult(res *pipeline.Result, st readingStats) readingsTable {
	sel := r.Selected()
	r.res, r.stats = res, st
	return r.sortKeeping(sel)
}

// sortKeeping orders the rows and selects reading sel (if any) at the
// same height on screen as before, so the eye does not lose it.
func (r readingsTable) sortKeeping(sel int) readingsTable {
	off := r.cursor - r.top
	r = r.sort()
	if sel >= 0 && sel < len(r.rowOf) {
		c := int(r.rowOf[sel])
		r.top = c - off
		return r.moveTo(c)
	}
	return r.moveTo(r.cursor)
}

// Selected returns the selected reading's index, or -1.
func (r readingsTable) Selected() int {
	if r.cursor < 0 || r.cursor >= len(r.order) {
		return -1
	}
	return r.order[r.cursor]
}

// Select moves the selection to reading i.
func (r readingsTable) Select(i int) readingsTable {
	if i >= 0 && i < len(r.rowOf) {
		return r.moveTo(int(r.rowOf[i]))
	}
	return r
}

// moveTo selects row c (clamped), scrolls as little as needed to show it
// and rebuilds the visible rows.
func (r readingsTable) moveTo(c int) readingsTable {
	n, vh := len(r.order), r.visibleRows()
	r.cursor = min(max(c, 0), max(n-1, 0))
	r.top = min(max(r.top, r.cursor-vh+1), r.cursor)
	r.top = max(min(r.top, n-vh), 0)
	return r.window()
}

// window hands the Bubbles table the rows on screen.
func (r readingsTable) window() readingsTable {
	if r.res == nil {
		return r
	}
	end := min(r.top+r.visibleRows(), len(r.order))
	shown, cols := r.shown(), r.table.Columns()
	rows := make([]table.Row, 0, end-r.top)
	for p := r.top; p < end; p++ {
		i := r.order[p]
		row := make(table.Row, len(shown))
		for k, c := range shown {
			row[k] = alignCell(r.cell(i, c), c, cols[k].Width)
		}
		if p == r.cursor {
			row[0] = "▶" // the selection shows without colour too
		}
		rows = append(rows, row)
	}
	r.table.SetRows(rows)
	r.table.SetCursor(r.cursor - r.top)
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
		return at(r.stats.names, rd.File, "")
	case 2:
		return strconv.Itoa(rd.Line0)
	case 3:
		return rd.ID
	case 4:
		return fixed(rd.X)
	case 5:
		return fixed(rd.Y)
	case 6:
		return r.stats.origUnit.num(rd.V)
	case 7:
		return r.stats.corrUnit.num(r.corrected(i))
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

// rowOrder compares readings by one column, then by index, on their
// values (never their text), so that ordering 10⁶ rows stays fast. It
// holds only what it compares: a pointer receiver keeps each comparison
// from copying the table.
type rowOrder struct {
	rs     []survey.Reading
	names  []string
	corr   []float64
	status []qa.Status
	notes  [][]string
	col    int
	desc   bool
}

func (r readingsTable) rowOrder() *rowOrder {
	o := &rowOrder{rs: r.res.Survey.Readings, names: r.stats.names, col: r.sortCol, desc: r.desc}
	if q := r.res.QA; q != nil {
		o.corr, o.status, o.notes = q.Corrected, q.Status, q.Notes
	}
	return o
}

func (o *rowOrder) compare(a, b int) int {
	rs := o.rs
	var c int
	switch o.col {
	case colSource:
		c = strings.Compare(o.name(a), o.name(b))*2 + cmp.Compare(rs[a].Line0, rs[b].Line0)
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
		c = cmp.Compare(at(o.corr, a, rs[a].V), at(o.corr, b, rs[b].V))
	case colStatus:
		c = cmp.Compare(at(o.status, a, qa.OK), at(o.status, b, qa.OK))
	default:
		c = slices.Compare(at(o.notes, a, nil), at(o.notes, b, nil))
	}
	if c == 0 {
		return cmp.Compare(a, b)
	}
	if o.desc {
		return -c
	}
	return c
}

func (o *rowOrder) name(i int) string { return at(o.names, o.rs[i].File, "") }

// at returns s[i], or def when i is out of range.
func at[T any](s []T, i int, def T) T {
	if i >= 0 && i < len(s) {
		return s[i]
	}
	return def
}

// sort orders the rows by the sort column (readings already in order, as
// they come from the files, cost one pass); the caller moves the
// selection.
func (r readingsTable) sort() readingsTable {
	if r.res == nil {
		return r
	}
	n := len(r.res.Survey.Readings)
	r.order = make([]int, n)
	for i := range r.order {
		r.order[i] = i
	}
	o := r.rowOrder()
	if !slices.IsSortedFunc(r.order, o.compare) {
		slices.SortFunc(r.order, o.compare)
	}
	r.rowOf = make([]int32, n)
	for p, i := range r.order {
		r.rowOf[i] = int32(p)
	}
	r.table.SetRows(nil)
	r.table.SetColumns(r.columns())
	return r
}

// Update handles ordering and navigation; exclusion is the root's.
func (r readingsTable) Update(msg tea.Msg) (readingsTable, tea.Cmd) {
	km, ok := msg.(tea.KeyMsg)
	if !ok {
		return r, nil
	}
	k, sel, page := r.keys, r.Selected(), r.visibleRows()
	switch {
	case key.Matches(km, k.Order):
		r.sortCol = r.nextSortColumn()
		return r.sortKeeping(sel), nil
	case key.Matches(km, k.Reverse):
		r.desc = !r.desc
		return r.sortKeeping(sel), nil
	case key.Matches(km, k.Up):
		return r.moveTo(r.cursor - 1), nil
	case key.Matches(km, k.Down):
		return r.moveTo(r.cursor + 1), nil
	case key.Matches(km, k.PageUp):
		r.top = max(r.top-page, 0)
		return r.moveTo(r.cursor - page), nil
	case key.Matches(km, k.PageDown):
		r.top += page
		return r.moveTo(r.cursor + page), nil
	case key.Matches(km, k.Top):
		return r.moveTo(0), nil
	case key.Matches(km, k.Bottom):
		return r.moveTo(len(r.order) - 1), nil
	}
	return r, nil
}

// nextSortColumn returns the shown column after the sort column (the
// marker column excepted).
func (r readingsTable) nextSortColumn() int {
	c := r.sortCol
	for {
		c = c%colReason + 1
		if c != colSource || len(r.stats.names) > 1 {
			return c
		}
	}
}

// View draws the table under a title line with the counts, the order and
// the position.
func (r readingsTable) View() string {
	st := r.styles
	n := len(r.order)
	dir := map[bool]string{false: "ascending", true: "descending"}[r.desc]
	title := st.PanelTitle.Render("Readings") + st.Label.Render(fmt.Sprintf("  %d, %d suspect, %d excluded · by %s, %s · row %d of %d",
		n, r.stats.sus, r.stats.exc, readingColumns()[r.sortCol], dir, min(r.cursor+1, n), n))
	return truncate(title, r.width) + "\n" + r.table.View() + "\n" + r.detail()
}

// detail is the line under the table: the selected reading's whole QA
// note, which the reason column may cut.
func (r readingsTable) detail() string {
	i := r.Selected()
	if i < 0 {
		return ""
	}
	note := r.cell(i, colReason)
	if note == "" {
		note = "no QA note"
	}
	rd := r.res.Survey.Readings[i]
	return truncate(r.styles.Label.Render(fmt.Sprintf("%s (line %d): %s", rd.ID, rd.Line0, note)), r.width)
}
