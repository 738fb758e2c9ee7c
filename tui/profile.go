package tui

import (
	"fmt"
	"math"
	"strings"

	"isofield/interp"
	"isofield/survey/analysis"
	"isofield/survey/qa"
)

// profileView draws the surface along the segment between the two marks:
// the potential, and under it the field along the segment (E·u, u the unit
// vector from A to B), both sampled from the fitted surface by
// analysis.MakeProfile and resampled to the chart's columns with a
// monotone cubic (analysis.Profile.Resample). Readings within the corridor
// are marked at their distance along the line: on the potential chart at
// their gridded value, on a tick row when they were not gridded (excluded,
// or suspect and left out). Stretches outside the surveyed area (masked
// grid nodes) are left blank.
type profileView struct {
	styles        Styles
	width, height int

	sc   *scene
	a, b *[2]float64
	prof *analysis.Profile
	err  error

	// resampled to the chart's columns; NaN where masked
	along, v, e []float64
}

func newProfileView(st Styles) profileView { return profileView{styles: st} }

// SetSize sets the outer size and resamples for the new width.
func (p profileView) SetSize(w, h int) profileView {
	p.width, p.height = w, h
	return p.resample()
}

// profileLeft is the width of the value labels left of the charts.
const profileLeft = 10

// profileMaxSamples bounds the surface evaluations of one profile.
const profileMaxSamples = 512

// chartWidth is the number of chart columns.
func (p profileView) chartWidth() int { return max(p.width-profileLeft-1, 4) }

// Set samples the scene's surface between marks a and b (nil: not yet
// marked) and marks the readings near the line.
func (p profileView) Set(sc *scene, a, b *[2]float64) profileView {
	p.sc, p.a, p.b, p.prof, p.err = sc, a, b, nil, nil
	if sc == nil || a == nil || b == nil {
		return p.resample()
	}
	f := sc.surface()
	if f == nil {
		return p.resample()
	}
	step := sc.spacing() / 2
	length := math.Hypot(b[0]-a[0], b[1]-a[1])
	n := min(max(int(length/step)+1, 8), profileMaxSamples)
	prof, err := analysis.MakeProfile(f, a[0], a[1], b[0], b[1], n)
	if err != nil {
		p.err = err
		return p.resample()
	}
	xs, ys, vs, idx := sc.readingsAround(a, b, sc.corridor())
	prof.MarkReadings(xs, ys, vs, idx, sc.corridor())
	p.prof = prof
	return p.resample()
}

// resample fits the profile to the chart's columns and blanks the columns
// over masked nodes.
func (p profileView) resample() profileView {
	p.along, p.v, p.e = nil, nil, nil
	if p.prof == nil {
		return p
	}
	along, v, e, err := p.prof.Resample(p.chartWidth())
	if err != nil {
		p.err = err
		return p
	}
	pr := p.prof
	for i, s := range along {
		t := s / pr.Length
		if !p.sc.inside(pr.X0+t*(pr.X1-pr.X0), pr.Y0+t*(pr.Y1-pr.Y0)) {
			v[i], e[i] = math.NaN(), math.NaN()
		}
	}
	p.along, p.v, p.e = along, v, e
	return p
}

// View draws the title, the two charts, the tick row and the axis.
func (p profileView) View() string {
	st := p.styles
	switch {
	case p.a == nil || p.b == nil:
		return st.Faint.Render(truncate("Mark two points with m on the map (A, then B), then press p.", p.width))
	case p.err != nil:
		return st.Error.Render(truncate("no profile: "+p.err.Error(), p.width))
	case p.prof == nil || p.v == nil:
		return st.Faint.Render("no profile: the survey has no surface yet")
	}
	pr := p.prof
	title := st.PanelTitle.Render("Profile") + st.Label.Render(fmt.Sprintf("  A %s, %s → B %s, %s · length %s m",
		fixed(pr.X0), fixed(pr.Y0), fixed(pr.X1), fixed(pr.Y1), num(pr.Length)))
	key := st.Faint.Render(truncate(fmt.Sprintf("* surface  + reading  ? suspect  x excluded · %d readings within %s m",
		len(pr.Readings), num(p.sc.corridor())), p.width))
	rows := max(p.height-5, 4) // title, key, field label, tick row, axis
	vRows, eRows := rows, 0
	if rows >= 10 {
		eRows = rows * 2 / 5
		vRows = rows - eRows
	}
	out := []string{truncate(title, p.width), key}
	out = append(out, p.chart(p.v, vRows, true, "potential", p.sc.vUnit)...)
	if eRows > 0 {
		out = append(out, p.chart(p.e, eRows-1, false, "field along A→B", p.sc.eUnit)...)
	}
	out = append(out, p.tickRow(), p.axis())
	return strings.Join(out, "\n")
}

// chart draws series ys (one value per column) in h rows under a label
// line naming the quantity and its display unit u, with the gridded
// readings when withReadings.
func (p profileView) chart(ys []float64, h int, withReadings bool, label string, u dispUnit) []string {
	lo, hi := finiteRange(ys)
	if withReadings {
		for _, r := range p.prof.Readings {
			if !math.IsNaN(r.V) {
				lo, hi = min(lo, r.V), max(hi, r.V)
			}
		}
	}
	head := p.styles.Label.Render(strings.Repeat(" ", profileLeft+1) + label + ", " + u.name)
	if math.IsNaN(lo) {
		return []string{head, p.styles.Faint.Render("the segment lies outside the surveyed area")}
	}
	if hi-lo < 1e-12 {
		lo, hi = lo-1, hi+1
	}
	c := newCanvas(len(ys), h)
	rowOf := func(v float64) int { return int(math.Round((hi - v) / (hi - lo) * float64(h-1))) }
	mid := h / 2
	midValue := hi - (hi-lo)*float64(mid)/float64(max(h-1, 1))
	if lo < 0 && hi > 0 {
		mid, midValue = rowOf(0), 0
		c.hline(mid, '·') // the zero line of a signed quantity
	}
	prev := -1
	for i, v := range ys {
		if math.IsNaN(v) {
			prev = -1
			continue
		}
		r := rowOf(v)
		c.line(i, prev, r)
		prev = r
	}
	if withReadings {
		for _, r := range p.prof.Readings {
			if !math.IsNaN(r.V) {
				c.set(p.column(r.Along), rowOf(r.V), p.sc.readingGlyph(r.Index))
			}
		}
	}
	return append([]string{head}, strings.Split(c.render(lo, hi, mid, midValue, u), "\n")...)
}

// column returns the chart column of a distance along the line.
func (p profileView) column(along float64) int {
	return int(math.Round(along / p.prof.Length * float64(p.chartWidth()-1)))
}

// tickRow marks the readings near the line that were not gridded.
func (p profileView) tickRow() string {
	row := []rune(strings.Repeat(" ", p.chartWidth()))
	for _, r := range p.prof.Readings {
		if c := p.column(r.Along); math.IsNaN(r.V) && c >= 0 && c < len(row) {
			row[c] = p.sc.readingGlyph(r.Index)
		}
	}
	return fmt.Sprintf("%*s │%s", profileLeft-1, "left out", string(row))
}

func (p profileView) axis() string {
	pw := p.chartWidth()
	right := num(p.prof.Length) + " m"
	gap := max(pw-len("0 m")-len(right), 1)
	return strings.Repeat(" ", profileLeft+1) + "0 m" + strings.Repeat(" ", gap) + right
}

func finiteRange(vs []float64) (lo, hi float64) {
	lo, hi = math.NaN(), math.NaN()
	for _, v := range vs {
		if math.IsNaN(v) {
			continue
		}
		if math.IsNaN(lo) {
			lo, hi = v, v
		}
		lo, hi = min(lo, v), max(hi, v)
	}
	return lo, hi
}

// surface returns the fitted model, or the grid read bilinearly when the
// result has no model.
func (sc *scene) surface() interp.Interpolant {
	if sc.res.Model != nil {
		return sc.res.Model
	}
	if g := sc.res.Grid; g != nil && g.NX >= 2 && g.NY >= 2 {
		return gridSurface{g}
	}
	return nil
}

// spacing returns the grid spacing (1 m without a grid).
func (sc *scene) spacing() float64 {
	if g := sc.res.Grid; g != nil && g.DX > 0 && g.DY > 0 {
		return min(g.DX, g.DY)
	}
	return 1
}

// corridor is how far from a profile line a reading may lie and still be
// marked on it: half the mean reading spacing √(area/n), at least one grid
// spacing, so that the stations of a survey line along the profile count
// and those of the neighbouring lines do not (isofield's own choice, not
// a rule of the trade).
func (sc *scene) corridor() float64 {
	s := sc.res.Survey
	n := len(s.Readings)
	if n == 0 {
		return sc.spacing()
	}
	xmin, ymin, xmax, ymax := s.Extent()
	area := max(xmax-xmin, sc.spacing()) * max(ymax-ymin, sc.spacing())
	return max(0.5*math.Sqrt(area/float64(n)), sc.spacing())
}

// inside reports whether (x, y) is on an unmasked grid node's cell.
func (sc *scene) inside(x, y float64) bool {
	g := sc.res.Grid
	if g == nil || g.DX <= 0 || g.DY <= 0 {
		return true
	}
	i := int(math.Floor((x-g.X0)/g.DX + 0.5))
	j := int(math.Floor((y-g.Y0)/g.DY + 0.5))
	return i >= 0 && j >= 0 && i < g.NX && j < g.NY && !g.Mask[g.Index(i, j)]
}

// readingsAround returns the readings in the box round segment a–b grown
// by reach: positions, the value they were gridded with (NaN if they were
// not) and their survey indexes.
func (sc *scene) readingsAround(a, b *[2]float64, reach float64) (xs, ys, vs []float64, idx []int) {
	x0, x1 := min(a[0], b[0])-reach, max(a[0], b[0])+reach
	y0, y1 := min(a[1], b[1])-reach, max(a[1], b[1])+reach
	for i, r := range sc.res.Survey.Readings {
		if r.X < x0 || r.X > x1 || r.Y < y0 || r.Y > y1 {
			continue
		}
		xs, ys, idx = append(xs, r.X), append(ys, r.Y), append(idx, i)
		vs = append(vs, sc.griddedValue(i))
	}
	return xs, ys, vs, idx
}

// griddedValue is the value reading i went into the fit with (after the
// preset's preparation), NaN if it was left out.
func (sc *scene) griddedValue(i int) float64 {
	res := sc.res
	if res.Values != nil {
		if i < len(res.Values) {
			return res.Values[i]
		}
		return math.NaN()
	}
	if q := res.QA; q != nil && i < len(q.Status) {
		if q.Status[i] != qa.OK {
			return math.NaN()
		}
		return q.Corrected[i]
	}
	return res.Survey.Readings[i].V
}

// readingGlyph is the map's mark for reading i's status.
func (sc *scene) readingGlyph(i int) rune {
	if q := sc.res.QA; q != nil && i < len(q.Status) {
		switch q.Status[i] {
		case qa.Suspect:
			return '?'
		case qa.Excluded:
			return 'x'
		}
	}
	return '+'
}
