package tui

import (
	"fmt"
	"strings"

	"github.com/charmbracelet/bubbles/help"
	"github.com/charmbracelet/bubbles/key"
	"github.com/charmbracelet/lipgloss"
	"github.com/charmbracelet/x/ansi"

	"isofield/survey/criteria"
	"isofield/tui/mapview"
)

// Rows taken by the status line, the message line and the help line.
const chromeRows = 3

// sideWidth returns the width of the right-hand column for a terminal w
// cells wide: a third, between 30 and 46 cells.
func sideWidth(w int) int { return min(max(w/3, 30), 46) }

// zonesBelowSide is the height from which the zones list sits under the
// readout instead of replacing it.
const zonesBelowSide = 36

// resize lays the children out for a w × h terminal.
func (m Model) resize(w, h int) Model {
	m.width, m.height = max(w, 20), max(h, 8)
	body := m.height - chromeRows
	sw := sideWidth(m.width)
	m.mapPane = m.mapPane.SetSize(m.width-sw, body)
	if m.height >= zonesBelowSide {
		zh := min(12, body/3)
		m.side = m.side.SetSize(sw, body-zh)
		m.zones = m.zones.SetSize(sw, zh)
	} else {
		m.side = m.side.SetSize(sw, body)
		m.zones = m.zones.SetSize(sw, body)
	}
	m.table = m.table.SetSize(m.width, body)
	m.profile = m.profile.SetSize(m.width, body)
	m.settings = m.settings.SetSize(m.width, body)
	m.reason = fitInput(m.reason, m.width)
	m.help.Width = m.width
	return m
}

// View draws the whole screen; a panic while drawing shows a short
// message instead.
func (m Model) View() (out string) {
	defer func() {
		if r := recover(); r != nil {
			out = fmt.Sprintf("isofield: internal error while drawing the screen: %v\npress q to quit", r)
		}
	}()
	var body string
	switch m.state {
	case stateLoading:
		body = m.centre(m.styles.PanelTitle.Render("isofield") + "\n\ngridding the survey…\n" + progressView(m.bar, max(m.width/3, 12), m.frac))
	case stateError:
		body = m.centre(m.styles.Error.Render("could not open the survey") + "\n\n" + wrapJoin(m.err.Error(), m.width-4) + "\n\nq quits")
	default:
		body = m.readyBody()
	}
	if m.showHelp {
		body = m.centre(m.helpOverlay())
	}
	body = fitHeight(body, m.height-chromeRows)
	out = m.statusLine() + "\n" + body + "\n" + m.messageLine() + "\n" + m.helpLine()
	if m.width < designWidth {
		out = clipLines(out, m.width)
	}
	return out
}

// designWidth is the narrowest terminal the layout is made for; on a
// narrower one each line is cut at the edge.
const designWidth = 80

// clipLines cuts every line of s to w cells.
func clipLines(s string, w int) string {
	ls := strings.Split(s, "\n")
	for i, l := range ls {
		ls[i] = ansi.Truncate(l, w, "")
	}
	return strings.Join(ls, "\n")
}

// helpLine is the short help of the focused screen, as many keys as fit
// the width, then "…" when some were left out (Bubbles' own cut can
// overrun the width by a whole item).
func (m Model) helpLine() string { return fitShortHelp(m.help, m.helpKeys(), m.width) }

// helpKeys are the keys of the short help, most useful first.
func (m Model) helpKeys() []key.Binding {
	typing := m.focus == focusSettings && m.settings.Editing()
	bs := m.keys.shortHelpFor(m.focus, m.prompting, typing)
	if m.running && !m.prompting && !typing {
		bs = append([]key.Binding{bs[0], m.keys.Cancel}, bs[1:]...)
	}
	return bs
}

// fitShortHelp renders the longest prefix of bs that fits w cells. The
// prefix is chosen from the plain widths of the items (the help styles
// add no padding), and the result measured once to be sure.
func fitShortHelp(h help.Model, bs []key.Binding, w int) string {
	h.Width = 0 // measure uncut
	tail := " " + h.Styles.Ellipsis.Render(h.Ellipsis)
	sep := lipgloss.Width(h.ShortSeparator)
	var enabled []key.Binding
	for _, b := range bs {
		if b.Enabled() {
			enabled = append(enabled, b)
		}
	}
	n, used := 0, 0
	for n < len(enabled) {
		iw := lipgloss.Width(enabled[n].Help().Key) + 1 + lipgloss.Width(enabled[n].Help().Desc)
		if n > 0 {
			iw += sep
		}
		room := w
		if n+1 < len(enabled) {
			room -= lipgloss.Width(tail) // the items after it need the "…"
		}
		if used+iw > room {
			break
		}
		used += iw
		n++
	}
	for ; n > 0; n-- {
		s := h.ShortHelpView(enabled[:n])
		if n < len(enabled) {
			s += tail
		}
		if lipgloss.Width(s) <= w {
			return s
		}
	}
	return truncate(h.ShortHelpView(enabled[:min(1, len(enabled))]), w)
}

func wrapJoin(s string, w int) string { return strings.Join(wrap(s, max(w, 10)), "\n") }

func (m Model) centre(s string) string {
	return lipgloss.Place(m.width, m.height-chromeRows, lipgloss.Center, lipgloss.Center, s)
}

// readyBody draws the focused screen.
func (m Model) readyBody() string {
	switch m.focus {
	case focusTable:
		return m.table.View()
	case focusSettings:
		return m.settings.View()
	case focusProfile:
		return m.profile.View()
	}
	x, y := m.mapPane.Cursor()
	pr := m.scene.probeAt(x, y)
	var right string
	switch {
	case m.height >= zonesBelowSide:
		right = lipgloss.JoinVertical(lipgloss.Left, m.side.View(m.scene, pr, m.mapPane), m.zones.View())
	case m.focus == focusZones:
		right = m.zones.View()
	default:
		right = m.side.View(m.scene, pr, m.mapPane)
	}
	return besideMap(m.mapPane.View(), m.mapPane.width, right)
}

// besideMap puts right to the right of the map's lines, which are all
// mapWidth cells wide but the last (the scale line), without measuring the
// escape-laden map lines again.
func besideMap(mapView string, mapWidth int, right string) string {
	ls := strings.Split(mapView, "\n")
	rs := strings.Split(right, "\n")
	if n := len(ls) - 1; n >= 0 {
		ls[n] += strings.Repeat(" ", max(mapWidth-lipgloss.Width(ls[n]), 0))
	}
	blank := strings.Repeat(" ", mapWidth)
	var sb strings.Builder
	for i := range max(len(ls), len(rs)) {
		if i > 0 {
			sb.WriteByte('\n')
		}
		if i < len(ls) {
			sb.WriteString(ls[i])
		} else {
			sb.WriteString(blank)
		}
		if i < len(rs) {
			sb.WriteString(rs[i])
		}
	}
	return sb.String()
}

// fitHeight cuts or pads s to exactly h lines.
func fitHeight(s string, h int) string {
	ls := strings.Split(s, "\n")
	if len(ls) > h {
		ls = ls[:h]
	}
	for len(ls) < h {
		ls = append(ls, "")
	}
	return strings.Join(ls, "\n")
}

// statusLine names the survey, counts the readings and says what runs.
func (m Model) statusLine() string {
	st := m.styles
	parts := nonEmpty([]string{"isofield", m.opt.Title})
	style := st.Status
	if m.running {
		parts = append(parts, "working: "+m.stage)
		style = st.StatusBusy
	}
	if sc := m.scene; sc != nil {
		parts = append(parts, fmt.Sprintf("%d readings, %d suspect, %d excluded", len(sc.res.Survey.Readings), sc.stats.sus, sc.stats.exc),
			fmt.Sprintf("%d zones", len(sc.zones)), m.cfg.Criteria.Name())
	}
	return style.Width(m.width).MaxWidth(m.width).Render(truncate(strings.Join(parts, " · "), m.width))
}

// messageLine shows the reason prompt, the progress bar, the last message
// or, for the grounding preset, a standing caution.
func (m Model) messageLine() string {
	st := m.styles
	switch {
	case m.prompting:
		return truncate(m.reason.View(), m.width)
	case m.running:
		return truncate(progressView(m.bar, max(m.width/3, 12), m.frac)+" "+m.stage+"  (c cancels)", m.width)
	case m.message != "":
		return truncate(st.Warn.Render(m.message), m.width)
	case m.cfg.Criteria.Name() == criteria.Grounding:
		return truncate(st.Caution.Render("⚠ energised systems: follow local codes and a licensed engineer; ? shows all cautions"), m.width)
	}
	return ""
}

// helpOverlay draws the help page on show.
func (m Model) helpOverlay() string {
	pages := m.helpPages()
	p := pages[min(m.helpPage, len(pages)-1)]
	return m.styles.Overlay.Render(strings.Join(p, "\n"))
}

// helpPages packs the help's parts (the keys, the marks on the map, the
// preset's cautions) into as few pages as the terminal's height allows,
// in that order; each page but the last ends with a line saying what ?
// shows next. A part taller than a page is cut with a note.
func (m Model) helpPages() [][]string {
	avail := max(m.height-chromeRows-2, 4) // the overlay's border takes 2
	w := min(m.width-4, 100)
	names := []string{"keys", "marks", "cautions"}
	parts := [][]string{m.keysLines(), m.markLines(w), m.cautionLines(w, avail)}
	var pages [][]string
	var first []int // index of each page's first part
	var cur []string
	for i, p := range parts {
		hint := 0
		if i < len(parts)-1 {
			hint = 2 // a blank line and "? next: …", should a page follow
		}
		if len(cur) > 0 && len(cur)+1+len(p)+hint > avail {
			pages, cur = append(pages, cur), nil
		}
		if len(cur) == 0 {
			first = append(first, i)
			if len(p)+hint > avail {
				p = append(p[:max(avail-hint-1, 1)], m.styles.Faint.Render("… (a taller terminal shows the rest)"))
			}
			cur = p
			continue
		}
		cur = append(append(cur, ""), p...)
	}
	pages = append(pages, cur)
	for k := range len(pages) - 1 {
		next := strings.Join(names[first[k+1]:min(len(names), nextFirst(first, k+2, len(names)))], " and ")
		pages[k] = append(pages[k], "", m.styles.Warn.Render("? next: "+next))
	}
	return pages
}

func nextFirst(first []int, k, n int) int {
	if k < len(first) {
		return first[k]
	}
	return n
}

func (m Model) keysLines() []string {
	h := m.help
	h.ShowAll = true
	h.Width = m.width - 6
	return append([]string{m.styles.PanelTitle.Render("Keys")}, strings.Split(packHelp(h, m.keys.FullHelp()), "\n")...)
}

// markLines explains the map's overlay glyphs in lines of w cells.
func (m Model) markLines(w int) []string {
	var ps []string
	for _, mk := range mapview.Marks() {
		// No-break spaces keep each glyph with its meaning on one line.
		ps = append(ps, strings.ReplaceAll(mk[0]+" "+mk[1], " ", "\u00a0"))
	}
	return append([]string{m.styles.PanelTitle.Render("Marks on the map")}, wrap(strings.Join(ps, "   "), w)...)
}

// cautionLines returns the cautions wrapped to w cells, at most n lines.
func (m Model) cautionLines(w, n int) []string {
	cs := criteria.Cautions(m.cfg.Criteria.Name())
	if m.scene != nil && len(m.scene.cautions) > 0 {
		cs = m.scene.cautions
	}
	lines := []string{m.styles.PanelTitle.Render("Cautions")}
	for _, c := range cs {
		lines = append(lines, wrap("• "+c, w)...)
	}
	if len(lines) > n && n > 1 {
		lines = append(lines[:n-1], m.styles.Faint.Render("… (a taller terminal shows the rest)"))
	}
	return lines
}

// packHelp renders the help groups side by side in as few blocks as fit
// h.Width.
func packHelp(h help.Model, groups [][]key.Binding) string {
	var blocks []string
	for start := 0; start < len(groups); {
		end := start + 1
		free := h
		free.Width = 0 // measure untruncated
		for end < len(groups) && lipgloss.Width(free.FullHelpView(groups[start:end+1])) <= h.Width {
			end++
		}
		blocks = append(blocks, h.FullHelpView(groups[start:end]))
		start = end
	}
	return strings.Join(blocks, "\n\n")
}
