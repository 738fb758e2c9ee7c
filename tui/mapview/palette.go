package mapview

import (
	"fmt"
	"math"
	"strconv"
)

// RGB is a colour with 8-bit sRGB channels.
type RGB struct{ R, G, B uint8 }

// Hex returns the colour as #rrggbb.
func (c RGB) Hex() string { return fmt.Sprintf("#%02x%02x%02x", c.R, c.G, c.B) }

// ParseHex reads #rrggbb. It returns an error for anything else.
func ParseHex(s string) (RGB, error) {
	if len(s) != 7 || s[0] != '#' {
		return RGB{}, fmt.Errorf("colour %q: want #rrggbb", s)
	}
	v, err := strconv.ParseUint(s[1:], 16, 32)
	if err != nil {
		return RGB{}, fmt.Errorf("colour %q: %w", s, err)
	}
	return RGB{uint8(v >> 16), uint8(v >> 8), uint8(v)}, nil
}

// Palette is a colour ramp given by evenly spaced anchor colours. For a
// diverging palette the anchors run from the most negative to the most
// positive end with the neutral colour in the middle.
type Palette struct {
	Name     string
	Source   string
	Anchors  []RGB
	Diverges bool
}

// mustHex parses the compile-time anchor tables below; a bad literal is a
// programming error caught by the tests.
func mustHex(hs ...string) []RGB {
	out := make([]RGB, len(hs))
	for i, h := range hs {
		c, err := ParseHex(h)
		if err != nil {
			panic("mapview: bad palette literal " + h)
		}
		out[i] = c
	}
	return out
}

// DivergingPuOr returns ColorBrewer's 11-class purple-orange scheme, listed
// by its authors as safe for colour-blind readers (C. A. Brewer,
// colorbrewer2.org; Harrower & Brewer, The Cartographic Journal 40 (2003)
// 27-37). Negative potentials take the orange-brown arm, positive the purple
// arm. Anchor values from memory of the published table.
func DivergingPuOr() Palette {
	return Palette{
		Name:   "purple-orange (ColorBrewer PuOr)",
		Source: "Brewer, colorbrewer2.org; Harrower & Brewer 2003",
		Anchors: mustHex("#7f3b08", "#b35806", "#e08214", "#fdb863", "#fee0b6",
			"#f7f7f7", "#d8daeb", "#b2abd2", "#8073ac", "#542788", "#2d004b"),
		Diverges: true,
	}
}

// SequentialViridis returns nine evenly spaced samples of viridis, designed
// to be perceptually uniform and readable with the common colour-vision
// deficiencies (van der Walt & Smith, matplotlib 2.0 default colormap,
// 2015). Anchor values from memory of matplotlib's table.
func SequentialViridis() Palette {
	return Palette{
		Name:   "viridis",
		Source: "van der Walt & Smith, matplotlib (2015)",
		Anchors: mustHex("#440154", "#472c7a", "#3b518b", "#2c718e", "#21908d",
			"#27ad81", "#5cc863", "#aadc32", "#fde725"),
	}
}

// SequentialYlOrRd returns ColorBrewer's 9-class yellow-orange-red scheme
// (colour-blind safe per colorbrewer2.org), used for field magnitude so that
// it never looks like a potential map. Anchor values from memory.
func SequentialYlOrRd() Palette {
	return Palette{
		Name:   "yellow-orange-red (ColorBrewer YlOrRd)",
		Source: "Brewer, colorbrewer2.org",
		Anchors: mustHex("#ffffcc", "#ffeda0", "#fed976", "#feb24c", "#fd8d3c",
			"#fc4e2a", "#e31a1c", "#bd0026", "#800026"),
	}
}

// At returns the colour at tone t. For a sequential palette t runs from 0
// (first anchor) to 1 (last); for a diverging one from -1 (most negative)
// through 0 (neutral) to 1. t is clamped; NaN gives the neutral or first
// colour.
func (p Palette) At(t float64) RGB {
	if len(p.Anchors) == 0 {
		return RGB{}
	}
	if math.IsNaN(t) {
		t = 0
	}
	if p.Diverges {
		t = (t + 1) / 2
	}
	t = min(max(t, 0), 1)
	f := t * float64(len(p.Anchors)-1)
	i := int(f)
	if i >= len(p.Anchors)-1 {
		return p.Anchors[len(p.Anchors)-1]
	}
	return lerp(p.Anchors[i], p.Anchors[i+1], f-float64(i))
}

func lerp(a, b RGB, f float64) RGB {
	m := func(x, y uint8) uint8 { return uint8(math.Round(float64(x) + f*(float64(y)-float64(x)))) }
	return RGB{m(a.R, b.R), m(a.G, b.G), m(a.B, b.B)}
}

// Luminance returns the relative luminance of c as WCAG 2.1 defines it
// (W3C, Web Content Accessibility Guidelines 2.1, "relative luminance").
func Luminance(c RGB) float64 {
	lin := func(v uint8) float64 {
		s := float64(v) / 255
		if s <= 0.03928 {
			return s / 12.92
		}
		return math.Pow((s+0.055)/1.055, 2.4)
	}
	return 0.2126*lin(c.R) + 0.7152*lin(c.G) + 0.0722*lin(c.B)
}

// Contrast returns the WCAG 2.1 contrast ratio of two colours, from 1 to 21.
func Contrast(a, b RGB) float64 {
	la, lb := Luminance(a), Luminance(b)
	if la < lb {
		la, lb = lb, la
	}
	return (la + 0.05) / (lb + 0.05)
}

// Ink returns black or white, whichever contrasts more with bg: the colour
// for a glyph drawn on a band.
func Ink(bg RGB) RGB {
	black, white := RGB{0, 0, 0}, RGB{255, 255, 255}
	if Contrast(bg, black) >= Contrast(bg, white) {
		return black
	}
	return white
}
