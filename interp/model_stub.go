package interp

// TEMPORARY: signatures only, replaced by the real implementation.

import (
	"context"
	"errors"
)

var errUnimplemented = errors.New("interp: not implemented yet")

// Model is a fitted interpolant (global or partition of unity).
type Model struct{ info FitInfo }

// Fit fits an interpolant to values vs at points (xs[i], ys[i]).
// It panics if the slices differ in length.
func Fit(ctx context.Context, xs, ys, vs []float64, opt Options) (*Model, error) {
	return nil, errUnimplemented
}

// Info reports how the model was fitted.
func (m *Model) Info() FitInfo { return m.info }

// Value returns the interpolated value at (x, y).
func (m *Model) Value(x, y float64) float64 { return 0 }

// Gradient returns the analytic gradient at (x, y).
func (m *Model) Gradient(x, y float64) (dx, dy float64) { return 0, 0 }

// LeaveOneOut returns, for each reading in input order, the reading's value
// minus the value predicted at its position by the fit made without it
// (Rippa's closed form for the global fit, a local equivalent for the
// partition of unity).
func (m *Model) LeaveOneOut() []float64 { return nil }

// Evaluate fills g.V, g.GX and g.GY from f at every node not masked, using
// all cores, row by row. It honours ctx between rows and reports progress in
// rows. Masked nodes get NaN.
func Evaluate(ctx context.Context, f Interpolant, g *Grid, progress func(done, total int)) error {
	return errUnimplemented
}

// MaskFar masks every node farther than maxDist from the nearest point.
func MaskFar(g *Grid, xs, ys []float64, maxDist float64) {}

// DefaultMaskDistance returns the default masking distance for the points:
// documented in its implementation.
func DefaultMaskDistance(xs, ys []float64) float64 { return 0 }

// ParseKernel reads a kernel name as written on the command line.
func ParseKernel(s string) (Kernel, error) { return ThinPlate, nil }
