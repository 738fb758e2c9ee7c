// Package analysis turns a gridded survey into what a technician acts on:
// equipotential bands and lines, the field, step and touch voltages, flagged
// zones, class areas and infill suggestions.
package analysis

import (
	"context"

	"isofield/interp"
	"isofield/survey/criteria"
)

// TEMPORARY contract: filled in by the analysis work.

// Result is the analysis of one gridded survey.
type Result struct{}

// Input is what Analyze works on.
type Input struct {
	Grid  *interp.Grid       // evaluated grid (values, gradients, mask)
	Model interp.Interpolant // the fitted surface, for step voltage and profiles
	// X, Y, V are the readings used in the fit (corrected values).
	X, Y, V []float64
	// Index maps each used reading to its index in the survey.
	Index    []int
	Unit     string // "V" or "mV"
	Criteria criteria.Settings
	// Interval is the contour interval (0: automatic nice interval).
	Interval float64
	// Suggest is how many infill points to suggest (0: none).
	Suggest  int
	Progress func(done, total int)
}

// Analyze computes bands, contours, field measures, zones and suggestions.
func Analyze(ctx context.Context, in Input) (*Result, error) { return &Result{}, nil }
