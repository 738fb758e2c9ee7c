package mapview

import (
	"math"

	"isofield/interp"
)

// Layers is a set of map layers.
type Layers uint16

// The layers, each toggled by its own key in the UI.
const (
	LayerBands           Layers = 1 << iota // potential bands
	LayerField                              // field magnitude bands (replaces the potential bands)
	LayerZones                              // outlines of flagged zones
	LayerReadings                           // readings, suspects and exclusions
	LayerArrows                             // field arrows on a coarse sub-grid
	LayerSuggestions                        // infill suggestions
	LayerContours                           // lines at band edges
	LayerFlaggedReadings                    // suspect and excluded readings, also without LayerReadings
)

// DefaultLayers are on when a map opens.
const DefaultLayers = LayerBands | LayerZones | LayerReadings | LayerFlaggedReadings | LayerSuggestions

// View places the map on the screen. See the package doc for the geometry.
type View struct {
	Width, Height int     // text cells
	CX, CY        float64 // world point at the centre of the view
	MPC           float64 // metres per text column (> 0)
	HalfBlock     bool    // two map rows per text row
	Layers        Layers
	// Cursor, when ShowCursor is set, is drawn at (CursorX, CursorY).
	ShowCursor       bool
	CursorX, CursorY float64
	// Marks are the ends of a profile, drawn when set.
	MarkA, MarkB *[2]float64
}

// Fit returns a view of width × height cells showing the whole grid,
// centred, with square metres on screen (a row is two columns tall).
func Fit(g *interp.Grid, width, height int) View {
	v := View{Width: max(width, 1), Height: max(height, 1), MPC: 1, Layers: DefaultLayers}
	if g == nil {
		return v
	}
	w := float64(g.NX-1) * g.DX
	h := float64(g.NY-1) * g.DY
	v.CX, v.CY = g.X0+w/2, g.Y0+h/2
	v.MPC = max(w/float64(v.Width), h/(2*float64(v.Height)))
	if !(v.MPC > 0) || math.IsInf(v.MPC, 0) {
		v.MPC = max(g.DX, 1e-9)
	}
	return v
}

// RowHeight returns the metres one text row covers.
func (v View) RowHeight() float64 { return 2 * v.MPC }

// CellCentre returns the world point at the centre of cell (col, row).
func (v View) CellCentre(col, row int) (x, y float64) {
	x = v.CX + (float64(col)-float64(v.Width)/2+0.5)*v.MPC
	y = v.CY - (float64(row)-float64(v.Height)/2+0.5)*v.RowHeight()
	return x, y
}

// Cell returns the cell holding world point (x, y) and whether it is on
// screen.
func (v View) Cell(x, y float64) (col, row int, ok bool) {
	fc := (x-v.CX)/v.MPC + float64(v.Width)/2
	fr := (v.CY-y)/v.RowHeight() + float64(v.Height)/2
	if math.IsNaN(fc) || math.IsNaN(fr) {
		return 0, 0, false
	}
	col, row = int(math.Floor(fc)), int(math.Floor(fr))
	return col, row, col >= 0 && col < v.Width && row >= 0 && row < v.Height
}

// Zoom returns v with its scale divided by f about its centre.
func (v View) Zoom(f float64) View {
	if f > 0 {
		v.MPC /= f
	}
	return v
}

// Pan returns v moved by (dc, dr) text cells (east and south positive).
func (v View) Pan(dc, dr float64) View {
	v.CX += dc * v.MPC
	v.CY -= dr * v.RowHeight()
	return v
}

// Follow returns v panned as little as needed, by whole quarter views, to
// keep the cursor on screen.
func (v View) Follow() View {
	for range 64 {
		col, row, ok := v.Cell(v.CursorX, v.CursorY)
		if ok {
			return v
		}
		dc, dr := 0.0, 0.0
		switch {
		case col < 0:
			dc = -float64(v.Width) / 4
		case col >= v.Width:
			dc = float64(v.Width) / 4
		}
		switch {
		case row < 0:
			dr = -float64(v.Height) / 4
		case row >= v.Height:
			dr = float64(v.Height) / 4
		}
		if dc == 0 && dr == 0 {
			return v
		}
		v = v.Pan(max(math.Abs(dc), 1)*sign(dc), max(math.Abs(dr), 1)*sign(dr))
	}
	v.CX, v.CY = v.CursorX, v.CursorY
	return v
}

func sign(f float64) float64 {
	switch {
	case f < 0:
		return -1
	case f > 0:
		return 1
	}
	return 0
}
