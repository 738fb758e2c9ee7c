package tui

import (
	"fmt"
	"strings"

	"github.com/charmbracelet/lipgloss"

	"isofield/survey/qa"
	"isofield/tui/mapview"
)

// sidePane shows the readout at the cursor and the legend. It has no keys
// of its own.
type sidePane struct {
	styles        Styles
	width, height int
}

func newSidePane(st Styles) sidePane { return sidePane{styles: st} }

// SetSize sets the outer size, borders included.
func (p sidePane) SetSize(w, h int) sidePane {
	p.width, p.height = w, h
	return p
}

// View renders the pane for the scene at probe pr.
func (p sidePane) View(sc *scene, pr probe, mp mapPane) string {
	st := p.styles
	fw, fh := st.Panel.GetFrameSize()
	inner := max(p.width-fw, 8)
	lines := p.readout(sc, pr, inner)
	room := max(p.height-fh-len(lines), 0)
	legend, whole := p.legend(sc, mp, inner, room)
	if whole && len(legend) < room { // a blank line between, when there is room
		lines = append(lines, "")
	}
	lines = append(lines, legend...)
	if len(lines) > p.height-fh {
		lines = lines[:max(p.height-fh, 0)]
	}
	body := strings.Join(lines, "\n")
	return st.Panel.Width(p.width - fw + st.Panel.GetHorizontalPadding()).
		Height(max(p.height-fh, 0)).MaxHeight(p.height).Render(body)
}

// row shows a labelled value, continued on further lines under the value
// when it is too long for one.
func (p sidePane) row(label, value string, w int) []string {
	st := p.styles
	parts := []string{value}
	if lipgloss.Width(value) > w-6 {
		parts = wrap(value, max(w-6, 8))
	}
	out := make([]string, len(parts))
	for i, v := range parts {
		l := ""
		if i == 0 {
			l = label
		}
		out[i] = truncate(st.Label.Render(fmt.Sprintf("%-5s", l))+" "+st.Value.Render(strings.TrimRight(v, " ")), w)
	}
	return out
}

// truncate cuts s to w cells.
func truncate(s string, w int) string {
	if lipgloss.Width(s) <= w {
		return s
	}
	return lipgloss.NewStyle().MaxWidth(w).Render(s)
}

// readout lists the values at the cursor.
func (p sidePane) readout(sc *scene, pr probe, w int) []string {
	st := p.styles
	out := append([]string{st.PanelTitle.Render("At cursor")}, p.row("x,y", fixed(pr.X)+", "+fixed(pr.Y)+" m", w)...)
	if !pr.Inside {
		out = append(out, p.row("V", "outside the surveyed area", w)...)
	} else {
		out = append(out, p.row("V", sc.vUnit.with(pr.V), w)...)
		e := hypot(pr.EX, pr.EY)
		b, name := bearing(pr.EX, pr.EY)
		out = append(out, p.row("|E|", fmt.Sprintf("%s → %03.0f° %s", sc.eUnit.with(e), b, name), w)...)
		if pr.HasStep {
			step := sc.stepUnit.with(pr.StepValue) + " over 1 m"
			if sc.stepLimit > 0 {
				share := fmt.Sprintf("%.0f%%", 100*pr.StepValue/sc.stepLimit)
				if pr.StepValue < 0.01*sc.stepLimit {
					share = "under 1%"
				}
				step += fmt.Sprintf(" (%s of the tolerable %s)", share, sc.stepUnit.with(sc.stepLimit))
			}
			out = append(out, p.row("step", step, w)...)
		}
		out = append(out, p.row("band", sc.bandLabel(pr.Band), w)...)
	}
	if pr.Nearest >= 0 {
		out = append(out, p.row("near", sc.readingLabel(pr.Nearest, pr.NearDist), w)...)
	}
	if pr.Zone >= 0 && pr.Zone < len(sc.zones) {
		z := sc.zones[pr.Zone]
		out = append(out, p.row("zone", fmt.Sprintf("#%d of %d, %s m²", z.Rank, len(sc.zones), num(z.Area)), w)...)
	}
	return out
}

// readingLabel names reading i with its distance, value and status.
func (sc *scene) readingLabel(i int, dist float64) string {
	r := sc.res.Survey.Readings[i]
	id := r.ID
	if id == "" {
		id = fmt.Sprintf("line %d", r.Line0)
	}
	status, v := qa.OK, r.V
	if q := sc.res.QA; q != nil && i < len(q.Status) && i < len(q.Corrected) {
		status, v = q.Status[i], q.Corrected[i]
	}
	// The corrected value is the one gridded (drift, reference and current
	// scaling applied); the value as read follows when they differ.
	out := fmt.Sprintf("%s %s, %.1f m", id, sc.vUnit.with(v), dist)
	if v != r.V {
		read := sc.vUnit.num(r.V) // the same unit goes without saying
		if ou := sc.stats.origUnit; ou.name != sc.vUnit.name || ou.scale != sc.vUnit.scale {
			read = ou.with(r.V)
		}
		out += " (read " + read + ")"
	}
	if status != qa.OK {
		out += " " + status.String()
	}
	return out
}

// legend lists the bands of the base layer, highest first, in at most room
// lines, followed by the criterion (at most three lines). Bands that do
// not fit one a line go two a line; if even that is too long, an evenly
// spread choice is shown and the title says so; whole reports that every
// band is listed.
func (p sidePane) legend(sc *scene, mp mapPane, w, room int) (lines []string, whole bool) {
	st := p.styles
	b, _, ok := mp.renderer.BaseBands(sc.data, mp.view)
	if !ok || room < 2 {
		return nil, false
	}
	unit, what := sc.vUnit, "potential"
	if mp.view.Layers&mapview.LayerField != 0 {
		unit, what = sc.eUnit, "field |E|"
	}
	n := b.N()
	crit := wrap(sc.criterion, w)
	// The criterion gets the lines the bands leave, at least three.
	crit = crit[:min(len(crit), max(room-1-n, 3), max(room-3, 0))]
	show := max(room-1-len(crit), 1)
	entries := make([]string, 0, n)
	widest := 0
	for k := n - 1; k >= 0; k-- {
		e := p.swatch(sc, mp, k) + " " + unit.num(b.Edges[k]) + " … " + unit.num(b.Edges[k+1])
		entries = append(entries, e)
		widest = max(widest, lipgloss.Width(e))
	}
	title := st.PanelTitle.Render("Legend ") + st.Label.Render(what+", "+unit.name)
	var body []string
	whole = true
	switch {
	case n <= show:
		body = entries
	case (n+1)/2 <= show && 2*widest+2 <= w:
		for i := 0; i < n; i += 2 {
			l := pad(entries[i], widest+2)
			if i+1 < n {
				l += entries[i+1]
			}
			body = append(body, l)
		}
	default:
		title += st.Label.Render(fmt.Sprintf(" %d/%d", show, n))
		whole = false
		for i := range show {
			body = append(body, entries[i*(n-1)/max(show-1, 1)])
		}
	}
	out := []string{truncate(title, w)}
	for _, l := range body {
		out = append(out, truncate(l, w))
	}
	for _, l := range crit {
		out = append(out, st.Faint.Render(l))
	}
	return out, whole
}

// swatch returns two cells in band k's colour and glyph.
func (p sidePane) swatch(sc *scene, mp mapPane, k int) string {
	g := string(mp.renderer.BandGlyph(sc.data, mp.view, k))
	cells := g + g
	if !p.styles.Colour {
		return cells
	}
	c := mp.renderer.BandColour(sc.data, mp.view, k)
	return p.styles.Renderer.NewStyle().Background(lipgloss.Color(c.Hex())).
		Foreground(lipgloss.Color(mapview.Ink(c).Hex())).Render(cells)
}

// wrap breaks s into lines of at most w cells at spaces.
func wrap(s string, w int) []string {
	if s == "" {
		return nil
	}
	return strings.Split(lipgloss.NewStyle().Width(w).Render(s), "\n")
}
