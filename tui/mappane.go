package tui

import (
	"math"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"

	"isofield/tui/mapview"
)

// mapPane is the map: its view (centre, scale, layers), the cursor and the
// renderer's caches.
type mapPane struct {
	keys     KeyMap
	styles   Styles
	renderer *mapview.Renderer
	data     *mapview.Data
	view     mapview.View
	zoom     float64 // 1: whole survey
	fitted   bool    // the view has been fitted to data once
	width    int
	height   int // map rows, the scale line excluded
}

func newMapPane(keys KeyMap, st Styles) mapPane {
	v := mapview.View{Layers: mapview.DefaultLayers, ShowCursor: true, MPC: 1}
	return mapPane{keys: keys, styles: st, renderer: st.mapRenderer(), view: v, zoom: 1}
}

// SetSize sets the pane's size in cells, including its scale line.
func (p mapPane) SetSize(w, h int) mapPane {
	p.width, p.height = max(w, 1), max(h-1, 1)
	return p.refit()
}

// SetData shows new map data, keeping cursor, zoom, centre and layers; the
// first data fits the view and puts the cursor at its centre.
func (p mapPane) SetData(d *mapview.Data) mapPane {
	p.data = d
	if !p.fitted && d != nil && d.Grid != nil {
		f := mapview.Fit(d.Grid, p.width, p.height)
		p.view.CX, p.view.CY = f.CX, f.CY
		p.view.CursorX, p.view.CursorY = f.CX, f.CY
		p.fitted = true
		if p.Crowded() {
			p.view.Layers &^= mapview.LayerReadings // suspects and exclusions stay
		}
	}
	return p.refit()
}

// crowdedShare is the share of the map's cells above which readings
// hide the bands: the map then opens with only suspect and excluded
// readings marked.
const crowdedShare = 1.0 / 8

// Crowded reports whether the readings would mark more than crowdedShare
// of the map's cells.
func (p mapPane) Crowded() bool {
	if p.data == nil {
		return false
	}
	n := 0
	for _, pt := range p.data.Points {
		if pt.Kind != mapview.KindSuggestion {
			n++
		}
	}
	return float64(n) > crowdedShare*float64(p.width*p.height)
}

// refit recomputes the scale from the size and zoom.
func (p mapPane) refit() mapPane {
	p.view.Width, p.view.Height = p.width, p.height
	if p.data != nil && p.data.Grid != nil {
		p.view.MPC = mapview.Fit(p.data.Grid, p.width, p.height).MPC / p.zoom
	}
	return p
}

// Cursor returns the cursor's world position.
func (p mapPane) Cursor() (x, y float64) { return p.view.CursorX, p.view.CursorY }

// MoveTo puts the cursor at (x, y) and pans to show it.
func (p mapPane) MoveTo(x, y float64) mapPane {
	p.view.CursorX, p.view.CursorY = x, y
	p.view = p.view.Follow()
	return p
}

// Update handles the map's keys.
func (p mapPane) Update(msg tea.Msg) (mapPane, tea.Cmd) {
	km, ok := msg.(tea.KeyMsg)
	if !ok {
		return p, nil
	}
	k := p.keys
	v := &p.view
	switch {
	case key.Matches(km, k.Up):
		return p.MoveTo(v.CursorX, v.CursorY+v.RowHeight()), nil
	case key.Matches(km, k.Down):
		return p.MoveTo(v.CursorX, v.CursorY-v.RowHeight()), nil
	case key.Matches(km, k.Left):
		return p.MoveTo(v.CursorX-v.MPC, v.CursorY), nil
	case key.Matches(km, k.Right):
		return p.MoveTo(v.CursorX+v.MPC, v.CursorY), nil
	case key.Matches(km, k.PanUp):
		p.view = v.Pan(0, -float64(v.Height)/4)
	case key.Matches(km, k.PanDown):
		p.view = v.Pan(0, float64(v.Height)/4)
	case key.Matches(km, k.PanLeft):
		p.view = v.Pan(-float64(v.Width)/4, 0)
	case key.Matches(km, k.PanRight):
		p.view = v.Pan(float64(v.Width)/4, 0)
	case key.Matches(km, k.ZoomIn):
		return p.zoomBy(math.Sqrt2), nil
	case key.Matches(km, k.ZoomOut):
		return p.zoomBy(1 / math.Sqrt2), nil
	case key.Matches(km, k.ResetView):
		p.zoom, p.fitted = 1, false
		cx, cy := p.Cursor()
		p = p.SetData(p.data)
		return p.MoveTo(cx, cy), nil
	case key.Matches(km, k.Fine):
		v.HalfBlock = !v.HalfBlock
	default:
		return p.toggleLayer(km), nil
	}
	return p, nil
}

// zoomBy zooms about the cursor, between the whole survey / 4 and 256×.
func (p mapPane) zoomBy(f float64) mapPane {
	z := min(max(p.zoom*f, 0.25), 256)
	p.zoom = z
	p.view.CX, p.view.CY = p.view.CursorX, p.view.CursorY
	return p.refit()
}

// toggleLayer flips the layer bound to km, if any. The readings key
// steps through all readings, only suspect and excluded ones, and none.
func (p mapPane) toggleLayer(km tea.KeyMsg) mapPane {
	k := p.keys
	if key.Matches(km, k.Readings) {
		const all, flagged = mapview.LayerReadings | mapview.LayerFlaggedReadings, mapview.LayerFlaggedReadings
		switch p.view.Layers & all {
		case all:
			p.view.Layers = p.view.Layers&^all | flagged
		case flagged:
			p.view.Layers &^= all
		default:
			p.view.Layers |= all
		}
		return p
	}
	for _, l := range []struct {
		b key.Binding
		l mapview.Layers
	}{
		{k.Bands, mapview.LayerBands}, {k.Field, mapview.LayerField},
		{k.Zones, mapview.LayerZones},
		{k.Arrows, mapview.LayerArrows}, {k.Suggestions, mapview.LayerSuggestions},
		{k.Contours, mapview.LayerContours},
	} {
		if key.Matches(km, l.b) {
			p.view.Layers ^= l.l
		}
	}
	return p
}

// View draws the map and, under it, the north arrow, scale bar and zoom.
func (p mapPane) View() string {
	m := p.renderer.Render(p.data, p.view)
	foot := mapview.ScaleBar(p.view, p.width)
	if p.zoom != 1 {
		foot += "  ×" + num(p.zoom)
	}
	if p.view.HalfBlock && !p.renderer.Colour() {
		foot += "  (fine map needs colour)"
	}
	return m + "\n" + truncate(p.styles.Label.Render(foot), p.width)
}
