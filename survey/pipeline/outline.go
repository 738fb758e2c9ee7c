package pipeline

import (
	"fmt"
	"math"
	"strings"

	"isofield/interp"
)

// Outline says which nodes outside the surveyed area are masked on top of
// the distance mask (Config.MaskDistance).
type Outline int

const (
	// OutlineHull masks the nodes farther than OutlineMargin from the
	// convex hull of the gridded readings (interp.MaskOutsideHull): the map
	// stops at the surveyed area's outline instead of extrapolating into
	// the corners of the grid's rectangle. The hull bridges concave
	// notches of the outline; the distance mask still blanks a notch wider
	// than its distance.
	OutlineHull Outline = iota
	// OutlineNone masks by distance only.
	OutlineNone
)

// String returns the outline's flag name: "hull" or "none".
func (o Outline) String() string {
	switch o {
	case OutlineHull:
		return "hull"
	case OutlineNone:
		return "none"
	}
	return fmt.Sprintf("Outline(%d)", int(o))
}

// ParseOutline reads an outline name, "hull" or "none" in any case; ""
// is the default, OutlineHull.
func ParseOutline(s string) (Outline, error) {
	switch strings.ToLower(s) {
	case "", "hull":
		return OutlineHull, nil
	case "none":
		return OutlineNone, nil
	}
	return OutlineHull, fmt.Errorf("outline %q: want hull or none", s)
}

// MarshalText returns the outline's name, for flags and session files.
func (o Outline) MarshalText() ([]byte, error) {
	if o != OutlineHull && o != OutlineNone {
		return nil, fmt.Errorf("outline %d: unknown", int(o))
	}
	return []byte(o.String()), nil
}

// UnmarshalText reads an outline's name as ParseOutline does.
func (o *Outline) UnmarshalText(b []byte) error {
	v, err := ParseOutline(string(b))
	if err != nil {
		return err
	}
	*o = v
	return nil
}

// OutlineMargin returns how far beyond the readings' hull OutlineHull keeps
// nodes on g: one cell diagonal, √2 × the larger spacing. Our choice: every
// grid cell that the hull touches keeps its four corners, so the map and
// its contours reach the outline, and no node lies more than a cell beyond
// it (the extrapolation there is small: on the five-reading deck of
// TestOutlineDeck, 0.3 mV against 7.3 mV without the outline).
func OutlineMargin(g *interp.Grid) float64 {
	return math.Sqrt2 * max(g.DX, g.DY)
}
