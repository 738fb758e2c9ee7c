package mapview

import "math"

// Arrow sub-grid: one arrow every arrowCols columns and arrowRows rows,
// shown where |E| is at least arrowFloor of the largest field.
const (
	arrowCols  = 6
	arrowRows  = 3
	arrowFloor = 0.02
)

// overlays fills the overlay glyphs of the cached cells.
func (r *Renderer) overlays(d *Data, v View) {
	if v.Layers&LayerContours != 0 {
		r.contours(d, v)
	}
	if v.Layers&LayerZones != 0 && d.Flagged != nil {
		r.zoneEdges(d, v)
	}
	if v.Layers&LayerArrows != 0 {
		r.arrows(d, v)
	}
	flagged := v.Layers&(LayerReadings|LayerFlaggedReadings) != 0
	for _, p := range d.Points {
		var g rune
		switch {
		case p.Kind == KindSuggestion && v.Layers&LayerSuggestions != 0:
			g = glyphSuggestion
		case p.Kind == KindReading && v.Layers&LayerReadings != 0:
			g = glyphReading
		case p.Kind == KindSuspect && flagged:
			g = glyphSuspect
		case p.Kind == KindExcluded && flagged:
			g = glyphExcluded
		default:
			continue
		}
		if c, row, ok := v.Cell(p.X, p.Y); ok {
			if i := row*v.Width + c; pointRank(g) >= pointRank(r.cells[i].over) {
				r.cells[i].over = g
			}
		}
	}
}

// pointRank orders the marks that share a cell: a suspect shows over an
// exclusion, which shows over a suggestion, over a plain reading, over
// the line and arrow glyphs.
func pointRank(g rune) int {
	switch g {
	case glyphSuspect:
		return 4
	case glyphExcluded:
		return 3
	case glyphSuggestion:
		return 2
	case glyphReading:
		return 1
	}
	return 0
}

// potAt returns the potential band of the node under cell i, or -1.
func (r *Renderer) potAt(d *Data, i int) int16 {
	if k := r.node[i]; k >= 0 {
		return d.potBand[k]
	}
	return -1
}

// contours marks cells whose potential band differs from the cell to the
// east (a north-south line) or to the south (an east-west line). Where the
// change crosses zero in a signed survey the line is drawn with the zero
// glyph, so the zero line stands out on its own.
func (r *Renderer) contours(d *Data, v View) {
	zero := int16(-1)
	if d.Potential.Scale == Diverging {
		zero = int16(d.Potential.Index(0))
	}
	crosses := func(a, b int16) bool { return zero >= 0 && (a < zero) != (b < zero) }
	for row := range v.Height {
		for c := range v.Width {
			i := row*v.Width + c
			b := r.potAt(d, i)
			if b < 0 {
				continue
			}
			var g rune
			if c+1 < v.Width {
				if e := r.potAt(d, i+1); e >= 0 && e != b {
					g = glyphContourV
					if crosses(b, e) {
						g = glyphZeroLine
					}
				}
			}
			if g == 0 && row+1 < v.Height {
				if s := r.potAt(d, i+v.Width); s >= 0 && s != b {
					g = glyphContourH
					if crosses(b, s) {
						g = glyphZeroLine
					}
				}
			}
			if g != 0 {
				r.cells[i].over = g
			}
		}
	}
}

// zoneEdges marks flagged cells with an unflagged 4-neighbour.
func (r *Renderer) zoneEdges(d *Data, v View) {
	r.flag = grow(r.flag, len(r.node))
	for i, k := range r.node {
		r.flag[i] = k >= 0 && d.Flagged[k]
	}
	for row := range v.Height {
		for c := range v.Width {
			i := row*v.Width + c
			if !r.flag[i] {
				continue
			}
			edge := c == 0 || c == v.Width-1 || row == 0 || row == v.Height-1 ||
				!r.flag[i-1] || !r.flag[i+1] || !r.flag[i-v.Width] || !r.flag[i+v.Width]
			if edge {
				r.cells[i].over = glyphZoneEdge
			}
		}
	}
}

// arrows draws the direction of E = -∇V on a coarse sub-grid of cells.
func (r *Renderer) arrows(d *Data, v View) {
	g := d.Grid
	floor := arrowFloor * d.fieldMax
	for row := arrowRows / 2; row < v.Height; row += arrowRows {
		for c := arrowCols / 2; c < v.Width; c += arrowCols {
			k := r.node[row*v.Width+c]
			if k < 0 || int(k) >= len(g.GX) || int(k) >= len(g.GY) || int(k) < len(g.Mask) && g.Mask[k] {
				continue
			}
			ex, ey := -g.GX[k], -g.GY[k]
			if m := math.Hypot(ex, ey); !(m > floor) {
				continue
			}
			r.cells[row*v.Width+c].over = arrowGlyph(ex, ey)
		}
	}
}
