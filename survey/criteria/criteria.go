// Package criteria holds each trade's criteria presets and the published
// numbers behind them, each with its source.
package criteria

import "isofield/survey"

// TEMPORARY contract: filled in by the analysis work.

// Settings selects a preset and its parameters. The zero value is the
// generic preset with no thresholds.
type Settings struct {
	Preset string
	// FieldThreshold flags nodes whose field magnitude |E| reaches it, in
	// potential units per metre (0: no field threshold).
	FieldThreshold float64
}

// Prepare returns the values to grid for the preset (for example readings
// scaled from test current to fault current, or converted to the copper/
// copper-sulfate scale), with plain-language notes of what it did.
// corrected holds the QA-corrected potentials in s.Unit, one per reading.
func Prepare(s *survey.Survey, corrected []float64, set Settings) (values []float64, notes []string, err error) {
	return append([]float64(nil), corrected...), nil, nil
}
