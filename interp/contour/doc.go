// Package contour draws equipotential lines and bands on an interp.Grid and
// finds connected regions of flagged nodes.
//
// It is pure numerics: it imports isofield/interp for the Grid type and
// nothing from the rest of isofield.
//
// Grid convention (the one of interp.Grid): node (i, j) lies at
// (X0 + i*DX, Y0 + j*DY) with its value at V[j*NX+i]; y grows with j. A
// cell (i, j), 0 <= i < NX-1, 0 <= j < NY-1, is the square whose corners are
// the nodes (i, j), (i+1, j), (i+1, j+1) and (i, j+1); its flat index is
// j*(NX-1)+i.
//
// Levels and bands. Levels are increasing values. A value v lies in band b
// when exactly b levels are <= v: band 0 holds values below the first level,
// band len(levels) values at or above the last. Lines and bands use the same
// rule, so a node exactly on a level counts as above it.
//
// Masks. A node is unusable when its mask is set or its value is NaN or
// infinite. Its band is -1, no line segment is drawn in a cell that has an
// unusable corner, and such a cell's band is -1. Lines therefore end where
// the mask begins; they are closed only when they return to their start
// without meeting a mask or the grid's edge.
//
// Saddles. A cell whose diagonal corners lie on the same side of a level and
// its other two corners on the other side is ambiguous. Lines resolves it
// by the mean of the four corner values (the value of the bilinear
// interpolant at the cell's centre), the "centre value" rule of the
// marching-cubes literature (Lorensen & Cline, Computer Graphics 21(4),
// 1987, in its two-dimensional form, marching squares; the asymptotic
// decider of Nielson & Hamann, IEEE Visualization 1991, is the costlier
// alternative): if the mean is on the high side (>= the level), the high
// corners are joined through the centre. The same mean gives the cell's
// band in CellBands, so filled bands and lines agree.
//
// Zones. Components groups flagged nodes into 8-connected regions. Outline
// traces each region as the union of node cells (DX × DY rectangles centred
// on the nodes), so a region's area is its node count times DX*DY. Outer
// rings run counter-clockwise, holes clockwise, each closed (the last point
// repeats the first).
//
// Functions panic only on a caller's bug (slices whose lengths do not match
// the grid) and say so; they never panic on values.
package contour
