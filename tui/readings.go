package tui

import (
	"fmt"
	"math"
	"path/filepath"
	"strconv"
	"strings"

	"github.com/charmbracelet/bubbles/key"
	"github.com/charmbracelet/bubbles/table"
	tea "github.com/charmbracelet/bubbletea"
	"github.com/charmbracelet/lipgloss"

	"isofield/survey/pipeline"
	"isofield/survey/qa"
)

// readingsTable lists every reading with its QA outcome; it can be ordered
// by any column and the selected reading excluded or included.
//
// Speed. Surveys reach 10⁶ readings, so the table never formats them all:
// ordering sorts an index slice by keys computed once per order
// (readings_sort.go), and the Bubbles table is handed only the rows on screen,
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
	sortGen       int          // generation of the latest order asked for
	pending       *sortRequest // the order being computed off the UI loop
	asyncMin      int          // readings from which orders are computed off the UI loop
	stats         readingStats
	width, height int
}

// readingColumns returns the table's column titles.
func readingColumns() []string {
	return []string{"", "source", "line", "id", "x", "y", "original", "corrected", "status", "reason"}
}

func newReadingsTable(keys KeyMap, st Styles) readingsTable {
	t := table.New(table.WithStyles(st.Table), table.WithFocused(true))
	return readingsTable{keys: keys, styles: st, table: t, sortCol: colLine, asyncMin: asyncSortMin}
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
//
// The order is computed here, on the UI loop (after a regrid the old order
// does not fit the new readings); an order still being computed for the old
// result is taken over and its outcome dropped.
func (r readingsTable) SetResult(res *pipeline.Result, st readingStats) readingsTable {
	sel := r.Selected()
	r.res, r.stats = res, st
	if p := r.pending; p != nil {
		r.sortCol, r.desc, r.pending = p.col, p.desc, nil
	}
	r.sortGen++
	return r.sortKeeping(sel)
}

// sortKeeping orders the rows and selects reading sel (if any) at the
// same height on screen as before, so the eye does not lose it.
func (r readingsTable) sortKeeping(sel int) readingsTable {
	off := r.cursor - r.top
	return r.sort().reselect(sel, off)
}

// reselect selects reading sel (if any) at screen row off, after the rows
// were ordered anew.
func (r readingsTable) reselect(sel, off int) readingsTable {
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

// at returns s[i], or def when i is out of range.
func at[T any](s []T, i int, def T) T {
	if i >= 0 && i < len(s) {
		return s[i]
	}
	return def
}

// sort orders the rows by the sort column (readings_sort.go); the caller
// moves the selection.
func (r readingsTable) sort() readingsTable {
	if r.res == nil {
		return r
	}
	r.order, r.rowOf = newSortSpec(r.res, r.stats.names, r.sortCol, r.desc).order()
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
	k, page := r.keys, r.visibleRows()
	switch {
	case key.Matches(km, k.Order):
		col, desc := r.wantedOrder()
		return r.reorder(r.nextSortColumn(col), desc)
	case key.Matches(km, k.Reverse):
		col, desc := r.wantedOrder()
		return r.reorder(col, !desc)
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

// nextSortColumn returns the shown column after column c (the marker
// column excepted).
func (r readingsTable) nextSortColumn(c int) int {
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
	if p := r.pending; p != nil {
		title += st.Label.Render(fmt.Sprintf(" · sorting by %s…", readingColumns()[p.col]))
	}
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

// wantedOrder returns the order last asked for: the one being computed,
// if any, else the one on screen.
func (r readingsTable) wantedOrder() (col int, desc bool) {
	if p := r.pending; p != nil {
		return p.col, p.desc
	}
	return r.sortCol, r.desc
}

// reorder orders the rows by column col. A large survey is ordered off the
// UI loop: the table keeps its order on screen, noting the order under way
// in its title, until the readingsSortedMsg of the latest request arrives
// (onSorted).
func (r readingsTable) reorder(col int, desc bool) (readingsTable, tea.Cmd) {
	r.sortGen++
	if r.res == nil || len(r.res.Survey.Readings) < r.asyncMin {
		r.sortCol, r.desc, r.pending = col, desc, nil
		return r.sortKeeping(r.Selected()), nil
	}
	r.pending = &sortRequest{gen: r.sortGen, col: col, desc: desc}
	return r, sortReadings(newSortSpec(r.res, r.stats.names, col, desc), r.sortGen)
}

// onSorted takes an order computed off the UI loop, unless a newer one was
// asked for since (or a new result arrived), keeping the selected reading
// at its height on screen.
func (r readingsTable) onSorted(msg readingsSortedMsg) readingsTable {
	if r.pending == nil || msg.gen != r.sortGen {
		return r // stale: dropped
	}
	sel, off := r.Selected(), r.cursor-r.top
	r.sortCol, r.desc, r.pending = msg.col, msg.desc, nil
	r.order, r.rowOf = msg.order, msg.rowOf
	r.table.SetRows(nil)
	r.table.SetColumns(r.columns())
	return r.reselect(sel, off)
}
