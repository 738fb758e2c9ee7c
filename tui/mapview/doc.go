// Package mapview draws a gridded potential survey as a block of terminal
// text: equipotential bands as glyphs and colour, the field magnitude,
// flagged zones, readings, field arrows, infill suggestions, band-edge lines
// and a cursor.
//
// Geometry. A View maps world metres to text cells. Column c of a
// Width-wide view covers x from CX + (c - Width/2)·MPC to one MPC further
// east; row r covers y from CY - (r - Height/2)·2·MPC down to 2·MPC further
// south, because a terminal cell is about twice as tall as it is wide
// (a common property of terminal fonts). Row 0 is the northern edge, so north
// is up. In half-block mode each text row holds two map rows of MPC each
// (the upper and lower half of the cell), so the picture keeps the same
// extent with twice the vertical detail.
//
// Sampling. Each cell (or half cell) takes the value of the grid node
// nearest to its centre; cells outside the grid or on a masked node are
// blank. Band indexes per node are computed once per Data; the sampled cells
// are cached per View, so moving the cursor only recomposes text.
//
// Colour. A Palette gives one colour per band; colours are written for the
// terminal's profile (true colour, 256, 16) and omitted entirely for a
// monochrome or NO_COLOR profile, where the glyph ramp alone carries the
// bands. Half-block mode needs colour and falls back to glyphs without it.
//
// Nothing here panics on data: NaN values and empty grids draw as blanks.
package mapview
