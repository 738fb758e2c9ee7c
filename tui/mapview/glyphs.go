package mapview

import "math"

// The glyph ramps (isofield's own design). Negative and positive bands use
// different characters so that sign survives without colour; density grows
// away from zero. The sequential ramp grows from sparse to dense. None of
// these characters is used by an overlay.
const (
	rampNegative   = ".~=%8#"     // near zero → most negative
	rampPositive   = ",;ioOM"     // near zero → most positive
	rampSequential = ".,;~=io%8#" // lowest → highest
)

// Overlay glyphs.
const (
	glyphReading    = '+'
	glyphSuspect    = '?'
	glyphExcluded   = 'x'
	glyphSuggestion = '^'
	glyphZoneEdge   = '!'
	glyphCursor     = '@'
	glyphContourV   = '|'
	glyphContourH   = '-'
	glyphZeroLine   = '0'
	glyphMarkA      = 'A'
	glyphMarkB      = 'B'
	glyphUpperHalf  = '▀'
	glyphLowerHalf  = '▄'
)

// rampGlyph returns the glyph for a band tone.
func rampGlyph(sc Scale, tone float64) rune {
	if math.IsNaN(tone) {
		return ' '
	}
	if sc == Sequential {
		return pick(rampSequential, tone)
	}
	if tone < 0 {
		return pick(rampNegative, -tone)
	}
	return pick(rampPositive, tone)
}

// pick returns ramp[⌈f·len⌉-1] for f in (0, 1], clamped. Ramps are ASCII.
func pick(ramp string, f float64) rune {
	i := int(math.Ceil(f*float64(len(ramp)))) - 1
	return rune(ramp[min(max(i, 0), len(ramp)-1)])
}

// arrowGlyph returns the arrow for direction (ex, ey), y north.
func arrowGlyph(ex, ey float64) rune {
	a := math.Atan2(ey, ex)
	o := int(math.Round(a/(math.Pi/4))) % 8
	if o < 0 {
		o += 8
	}
	// Octants counter-clockwise from east.
	arrows := [8]rune{'→', '↗', '↑', '↖', '←', '↙', '↓', '↘'}
	return arrows[o]
}

// Marks lists the overlay glyphs with what each marks, for a key.
func Marks() [][2]string {
	return [][2]string{
		{string(glyphCursor), "cursor"}, {string(glyphReading), "reading"},
		{string(glyphSuspect), "suspect"}, {string(glyphExcluded), "excluded"},
		{string(glyphSuggestion), "infill point"}, {string(glyphZoneEdge), "zone edge"},
		{string(glyphContourV) + " " + string(glyphContourH), "band edge"}, {string(glyphZeroLine), "zero line"},
		{string(glyphMarkA) + " " + string(glyphMarkB), "profile ends"}, {"→", "field direction"},
	}
}
