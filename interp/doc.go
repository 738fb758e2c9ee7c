// Package interp fits radial basis function interpolants to scattered
// values in the plane and evaluates them, with their analytic gradients,
// on regular grids.
//
// It is pure numerics: it knows nothing of surveys, units or files, and
// imports nothing from the rest of isofield.
//
// Coordinates are plain float64 pairs in any consistent length unit (the
// callers use metres). Before solving, the fitters centre the coordinates
// on the data's mean and scale them by the data's largest half-extent, so
// that projected coordinates with seven-digit northings condition as well as
// local site metres; all inputs and outputs are in the caller's unscaled
// coordinates.
//
// A Grid is node-centred and row-major: node (i, j) lies at
// (X0 + i*DX, Y0 + j*DY) and its value is V[j*NX+i]. Row j = 0 is the
// southern edge; y grows with j (north up in map terms).
//
// Outside the convex hull of the data an interpolant still returns values
// (it extrapolates); callers decide what to show by masking nodes that are
// too far from any reading (see MaskFar).
//
// Fit returns an error for bad data (too few points, all points on one
// line, non-finite values, an ill-conditioned system); it panics only on a
// caller's bug, such as slices of different lengths, and says so.
package interp
