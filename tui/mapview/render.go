package mapview

import (
	"math"
	"strings"

	"github.com/muesli/termenv"
)

// Renderer turns Data and a View into text. It caches the sampled cells of
// the last view and the escape sequences of each style, so repeated frames
// that differ only by the cursor cost one pass over the cells. A Renderer
// is not safe for concurrent use; give each UI its own.
type Renderer struct {
	profile                termenv.Profile
	signed, oneSigned, fld Palette

	// cache of the last sampling
	data   *Data
	view   View
	cells  []cell
	colors []termenv.Color // per band of the base layer
	inks   []termenv.Color
	prefix map[styleKey]string
	flag   []bool
	node   []int32
}

// cell is one sampled text cell.
type cell struct {
	top, bot int16 // base-layer band of the upper (or only) and lower half; -1 blank
	glyph    rune  // base glyph (glyph mode)
	over     rune  // overlay glyph, 0 for none
}

// styleKey identifies the escape sequence of a cell.
type styleKey struct {
	top, bot int16
	class    uint8
}

// Style classes of a cell.
const (
	classBand uint8 = iota
	classOverlay
	classCursor
	classHalf
)

// NewRenderer returns a renderer writing colours for profile (termenv.Ascii
// for none) with the given palettes for signed potentials, one-signed
// potentials and field magnitude.
func NewRenderer(profile termenv.Profile, signed, oneSigned, field Palette) *Renderer {
	return &Renderer{profile: profile, signed: signed, oneSigned: oneSigned, fld: field}
}

// Colour reports whether the renderer writes colour.
func (r *Renderer) Colour() bool { return r.profile != termenv.Ascii }

// BaseBands returns the bands and palette the base layer of v uses.
func (r *Renderer) BaseBands(d *Data, v View) (Bands, Palette, bool) {
	switch {
	case v.Layers&LayerField != 0:
		return d.Field, r.fld, true
	case v.Layers&LayerBands != 0:
		if d.Potential.Scale == Diverging {
			return d.Potential, r.signed, true
		}
		return d.Potential, r.oneSigned, true
	}
	return Bands{}, Palette{}, false
}

// BandColour returns band k's colour of the base layer of v.
func (r *Renderer) BandColour(d *Data, v View, k int) RGB {
	b, p, ok := r.BaseBands(d, v)
	if !ok {
		return RGB{}
	}
	return p.At(b.Tone(k))
}

// BandGlyph returns the glyph of band k of the base layer of v.
func (r *Renderer) BandGlyph(d *Data, v View, k int) rune {
	b, _, ok := r.BaseBands(d, v)
	if !ok {
		return ' '
	}
	return rampGlyph(b.Scale, b.Tone(k))
}

// Render returns the map as v.Height lines of v.Width cells joined by
// newlines.
func (r *Renderer) Render(d *Data, v View) string {
	if v.Width < 1 || v.Height < 1 {
		return ""
	}
	if !r.Colour() {
		v.HalfBlock = false
	}
	if d == nil || d.Grid == nil || !(v.MPC > 0) {
		return blank(v.Width, v.Height)
	}
	key := v
	key.ShowCursor, key.CursorX, key.CursorY, key.MarkA, key.MarkB = false, 0, 0, nil, nil
	if d != r.data || key != r.view {
		r.sample(d, key)
	}
	return r.compose(v)
}

func blank(w, h int) string {
	line := strings.Repeat(" ", w)
	return strings.TrimSuffix(strings.Repeat(line+"\n", h), "\n")
}

// compose writes the cached cells with the cursor and marks on top.
func (r *Renderer) compose(v View) string {
	marks := make(map[int]rune, 3)
	put := func(x, y float64, g rune) {
		if c, row, ok := v.Cell(x, y); ok {
			marks[row*v.Width+c] = g
		}
	}
	if v.MarkA != nil {
		put(v.MarkA[0], v.MarkA[1], glyphMarkA)
	}
	if v.MarkB != nil {
		put(v.MarkB[0], v.MarkB[1], glyphMarkB)
	}
	if v.ShowCursor {
		put(v.CursorX, v.CursorY, glyphCursor)
	}
	var sb strings.Builder
	sb.Grow(v.Width * v.Height * 4)
	for row := range v.Height {
		if row > 0 {
			sb.WriteByte('\n')
		}
		r.composeRow(&sb, v, row, marks)
	}
	return sb.String()
}

func (r *Renderer) composeRow(sb *strings.Builder, v View, row int, marks map[int]rune) {
	open := false
	var last styleKey
	for c := range v.Width {
		i := row*v.Width + c
		k, g := r.cellStyle(r.cells[i], v.HalfBlock)
		if m, ok := marks[i]; ok {
			k.class, g = classCursor, m
		}
		if !open || k != last {
			if open {
				sb.WriteString("\x1b[0m")
			}
			p := r.stylePrefix(k)
			sb.WriteString(p)
			open, last = p != "", k
		}
		sb.WriteRune(g)
	}
	if open {
		sb.WriteString("\x1b[0m")
	}
}

// cellStyle returns the style key and glyph of a cached cell.
func (r *Renderer) cellStyle(c cell, half bool) (styleKey, rune) {
	switch {
	case c.over != 0:
		return styleKey{top: c.top, bot: -1, class: classOverlay}, c.over
	case !half:
		return styleKey{top: c.top, bot: -1, class: classBand}, c.glyph
	case c.top < 0 && c.bot < 0:
		return styleKey{top: -1, bot: -1, class: classBand}, ' '
	case c.top < 0:
		return styleKey{top: -1, bot: c.bot, class: classHalf}, glyphLowerHalf
	}
	return styleKey{top: c.top, bot: c.bot, class: classHalf}, glyphUpperHalf
}

// stylePrefix returns (and caches) the escape sequence opening style k.
func (r *Renderer) stylePrefix(k styleKey) string {
	if p, ok := r.prefix[k]; ok {
		return p
	}
	p := r.buildPrefix(k)
	r.prefix[k] = p
	return p
}

func (r *Renderer) buildPrefix(k styleKey) string {
	if !r.Colour() {
		return ""
	}
	var seq []string
	add := func(c termenv.Color, bg bool) {
		if c != nil {
			if s := c.Sequence(bg); s != "" {
				seq = append(seq, s)
			}
		}
	}
	band := func(b int16) termenv.Color {
		if b < 0 || int(b) >= len(r.colors) {
			return nil
		}
		return r.colors[b]
	}
	switch k.class {
	case classHalf:
		if k.top >= 0 {
			add(band(k.top), false)
			add(band(k.bot), true)
		} else {
			add(band(k.bot), false)
		}
	case classCursor:
		seq = append(seq, termenv.BoldSeq, termenv.ReverseSeq)
	default:
		if k.top >= 0 && int(k.top) < len(r.inks) {
			add(r.inks[k.top], false)
			add(band(k.top), true)
		}
		if k.class == classOverlay {
			seq = append(seq, termenv.BoldSeq)
		}
	}
	if len(seq) == 0 {
		return ""
	}
	return termenv.CSI + strings.Join(seq, ";") + "m"
}

// sample fills the cell cache for d and v (v without cursor and marks).
func (r *Renderer) sample(d *Data, v View) {
	r.data, r.view = d, v
	r.prefix = make(map[styleKey]string)
	bands, pal, ok := r.BaseBands(d, v)
	r.colors, r.inks = r.colors[:0], r.inks[:0]
	glyphs := make([]rune, bands.N())
	for k := range bands.N() {
		c := pal.At(bands.Tone(k))
		r.colors = append(r.colors, r.profile.Color(c.Hex()))
		r.inks = append(r.inks, r.profile.Color(Ink(c).Hex()))
		glyphs[k] = rampGlyph(bands.Scale, bands.Tone(k))
	}
	n := v.Width * v.Height
	r.cells = grow(r.cells, n)
	top := r.sampleRows(d, v, v.Height, false, ok)
	for i := range n {
		b := top[i]
		r.cells[i] = cell{top: b, bot: -1, glyph: ' '}
		if b >= 0 {
			r.cells[i].glyph = glyphs[b]
		}
	}
	if v.HalfBlock {
		sub := r.sampleRows(d, v, 2*v.Height, true, ok)
		for i := range n {
			row, c := i/v.Width, i%v.Width
			r.cells[i].top = sub[2*row*v.Width+c]
			r.cells[i].bot = sub[(2*row+1)*v.Width+c]
		}
	}
	r.overlays(d, v)
}

func grow[T any](s []T, n int) []T {
	if cap(s) < n {
		return make([]T, n)
	}
	return s[:n]
}

// sampleRows returns the base band of each of rows × v.Width samples and
// records the nearest node of each in r.node (text rows only).
func (r *Renderer) sampleRows(d *Data, v View, rows int, half, on bool) []int16 {
	g := d.Grid
	colI := make([]int, v.Width)
	for c := range v.Width {
		x, _ := v.CellCentre(c, 0)
		colI[c] = nearest((x-g.X0)/g.DX, g.NX)
	}
	out := make([]int16, rows*v.Width)
	if !half {
		r.node = grow(r.node, rows*v.Width)
	}
	src := d.potBand
	if v.Layers&LayerField != 0 {
		src = d.fieldBand
	}
	for row := range rows {
		var y float64
		if half {
			y = v.CY - (float64(row)-float64(v.Height)+0.5)*v.MPC
		} else {
			_, y = v.CellCentre(0, row)
		}
		j := nearest((y-g.Y0)/g.DY, g.NY)
		for c, i := range colI {
			k, b := int32(-1), int16(-1)
			if i >= 0 && j >= 0 {
				k = int32(g.Index(i, j))
				if on {
					b = src[k]
				}
			}
			out[row*v.Width+c] = b
			if !half {
				r.node[row*v.Width+c] = k
			}
		}
	}
	return out
}

// nearest returns round(f) when it is a valid index below n, else -1.
func nearest(f float64, n int) int {
	if math.IsNaN(f) {
		return -1
	}
	i := int(math.Floor(f + 0.5))
	if f < -0.5 || i >= n {
		return -1
	}
	return i
}
