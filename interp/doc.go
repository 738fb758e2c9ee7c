// Package interp fits radial basis function interpolants to scattered
// values in the plane and evaluates them, with their analytic gradients,
// on regular grids.
//
// It is pure numerics: it knows nothing of surveys, units or files, and
// imports nothing from the rest of isofield.
//
// # Units and scaling
//
// Coordinates are plain float64 pairs in any consistent length unit (the
// callers use metres) and values are in any unit U; a gradient is in U
// per length unit. Before solving, Fit centres the coordinates on the
// data's mean and divides them by the data's largest half-extent, so that
// projected coordinates with seven-digit northings condition as well as
// local site metres. All inputs and outputs are in the caller's unscaled
// coordinates, except Options.Smoothing and Options.Shape, which are in
// the scaled ones (the data span about [−1, 1]), so that the same values
// mean the same on any site.
//
// # The interpolant
//
// Every kernel (see Kernel and kernel.go for formulas and sources) is
// fitted with the linear polynomial 1, x, y appended, so linear fields are
// reproduced exactly. Without smoothing the surface passes through every
// reading; with smoothing λ > 0 it is the regularised fit whose kernel
// matrix has λ added to its diagonal (the thin-plate spline then equals
// scipy's RBFInterpolator with smoothing λ·scale²).
//
// Method Global solves one dense system over all readings: O(N³) time and
// O(N²) memory to fit, O(N) per evaluation. Method Local is a partition of
// unity: overlapping circular patches centred on a regular lattice (cells
// crowded with readings split into four), one small fit per patch,
// blended with Shepard-normalised Wendland C² weights. A patch fits about
// 52 readings: every reading of its weight disk, and readings out to
// twice its weight radius or further (for the polyharmonic kernels at
// most one per square of the mean spacing, so that a patch on closely
// spaced lines reaches the lines beyond). The blend is at least C¹ (C¹
// for the thin-plate spline, smoother for smoother kernels), linear in
// memory, and costs about 110 kernel evaluations per point whatever N
// is. Method Auto uses the
// global fit up to Options.LocalAbove (default DefaultLocalAbove) readings
// and the local one above. Where both run, the local surface stays within
// 0.5 % (RMS) of the data range of the global one on smooth data (see
// TestLocalNearGlobal).
//
// Readings closer together than 1 % of the median nearest-neighbour
// spacing are merged into their mean before fitting (FitInfo.Merged and a
// warning say so): an exact interpolant forced through two such readings
// would overshoot wildly between them.
//
// Leave-one-out errors come from Rippa's closed form (global) or its exact
// partition-of-unity equivalent (local); AutoSmoothing and AutoShape pick
// λ and ε from documented candidate sets by the least RMS leave-one-out
// error and report the choice in FitInfo.
//
// # Grids
//
// A Grid is node-centred and row-major: node (i, j) lies at
// (X0 + i*DX, Y0 + j*DY) and its value is V[j*NX+i]; GX and GY hold ∂V/∂x
// and ∂V/∂y at the same index. Row j = 0 is the southern edge; y grows
// with j (north up in map terms). Evaluate fills the rows on all cores;
// masked nodes get NaN.
//
// # Outside the data
//
// An interpolant still returns values outside the convex hull of the data:
// the global fit extrapolates its kernel sum and plane; the local fit uses
// the patches nearest the edge and, beyond every patch, the nearest
// patch's fit alone (continuous up to the edge of the last patch, not
// beyond). Neither is to be trusted far from the readings: callers mask
// nodes that are too far from any reading (MaskFar, DefaultMaskDistance)
// and those outside the readings' convex hull grown by a margin
// (MaskOutsideHull).
//
// # Errors, panics and concurrency
//
// Fit returns an error for bad data, wrapping ErrTooFew (fewer than three
// distinct positions), ErrCollinear (all on one line), ErrNonFinite (NaN
// or infinite input, naming the reading) or ErrIllConditioned (condition
// number above 1e14, naming it), and for invalid options. It panics only
// on a caller's bug, and says so: slices of different lengths, a grid
// whose slices are shorter than NX*NY, NewGridN with nx or ny below 1.
// Nothing read from a file reaches a panicking path.
//
// A Model is safe for concurrent use once Fit returns. Value and Gradient
// allocate nothing. Progress callbacks may be called from any goroutine.
// Fit and Evaluate honour their context: Fit between stages and patches,
// Evaluate between rows.
package interp
