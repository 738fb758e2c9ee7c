package interp

// This file fixes the package's public contract, which the rest of
// isofield codes against. Bodies live in model.go, kernel.go, global.go and
// local*.go.

import "errors"

// Kernel names a radial basis function.
type Kernel int

// The kernels. kernel.go cites each one's source; every kernel is fitted
// with the linear polynomial 1, x, y appended (more than the multiquadric
// and the positive definite kernels need), so linear fields are exact.
const (
	ThinPlate           Kernel = iota // r² log r, linear polynomial (default)
	Cubic                             // r³, linear polynomial
	Multiquadric                      // −sqrt(1 + (εr)²), sign flipped for smoothing
	InverseMultiquadric               // 1/sqrt(1 + (εr)²)
	Gaussian                          // exp(-(εr)²)
	WendlandC2                        // (1-r/δ)₊⁴ (4r/δ + 1)
	WendlandC4                        // (1-r/δ)₊⁶ (35(r/δ)² + 18r/δ + 3)
)

// Method chooses between one global fit and the partition-of-unity local
// fit.
type Method int

// The methods.
const (
	Auto   Method = iota // global up to Options.LocalAbove readings, local above
	Global               // one dense fit over all readings
	Local                // partition of unity over overlapping patches
)

// Options configures Fit. The zero value is a thin-plate spline with no
// smoothing, chosen method by size, no progress reporting.
type Options struct {
	Kernel Kernel
	Method Method
	// Smoothing is λ ≥ 0 added to the kernel matrix's diagonal (in the
	// scaled coordinates). AutoSmoothing picks it by Rippa's
	// leave-one-out cross-validation instead.
	Smoothing     float64
	AutoSmoothing bool
	// Shape is ε for kernels that have one (in scaled coordinates; 0 means
	// the kernel's default). AutoShape picks it by leave-one-out.
	Shape     float64
	AutoShape bool
	// LeaveOneOut asks the fit to compute the leave-one-out errors as it
	// goes, for a caller that will call Model.LeaveOneOut: the local method
	// then reuses each patch's factorisation instead of building and
	// factorising every patch again. It changes no result.
	LeaveOneOut bool
	// LocalAbove is the reading count above which Auto uses the local
	// method; 0 means DefaultLocalAbove.
	LocalAbove int
	// Progress, if not nil, is called from any goroutine with the work done
	// so far and the total, both in arbitrary units.
	Progress func(done, total int)
}

// DefaultLocalAbove is the reading count above which Method Auto switches
// from the global fit to the partition-of-unity fit. Readings are counted
// after near-coincident ones are merged. The global fit costs O(N³) to
// solve and N kernel evaluations per grid node: at 2,000 readings about
// 1-2 s to fit and 7 s to evaluate onto 500×500 on two cores
// (interp/BENCHMARKS.md), where the local fit needs about 110 evaluations
// per node and stays within 0.5 % (RMS) of the data range of the global
// surface (local_test.go). At 1,000 readings the global fit takes about
// 0.2 s and keeps regrids in the terminal UI interactive.
const DefaultLocalAbove = 1000

// Interpolant is a fitted surface: its value and its analytic gradient at
// any point. Implementations must be safe for concurrent use and must not
// allocate per call.
type Interpolant interface {
	Value(x, y float64) float64
	Gradient(x, y float64) (dx, dy float64)
}

// FitInfo reports how a fit was made.
type FitInfo struct {
	Kernel    Kernel
	Method    Method // Global or Local, never Auto
	Smoothing float64
	Shape     float64
	// LOORMS is the root-mean-square leave-one-out error (NaN if not
	// computed).
	LOORMS float64
	// Condition is the estimated condition number of the (largest) system
	// solved.
	Condition float64
	Patches   int      // number of patches of a local fit, 0 for global
	Merged    int      // readings merged as near-coincident
	Warnings  []string // plain-language warnings, e.g. near-coincident readings
}

// ErrTooFew, ErrCollinear and ErrIllConditioned are the causes Fit wraps.
var (
	ErrTooFew         = errors.New("too few readings to fit")
	ErrCollinear      = errors.New("all readings lie on one straight line")
	ErrIllConditioned = errors.New("system too ill-conditioned to solve")
	ErrNonFinite      = errors.New("non-finite coordinate or value")
)
