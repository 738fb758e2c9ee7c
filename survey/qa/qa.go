// Package qa checks and cleans survey readings: reference-electrode
// conversion, repeats, drift, spikes, current scaling and exclusions by
// hand. Nothing is deleted: every reading keeps its original value, and every
// correction or change of status is a logged step with its reason.
package qa

import "isofield/survey"

// TEMPORARY contract: the types below are filled in by the qa work.

// Status is a reading's QA status.
type Status int

// The statuses, spelled in exports as "ok", "suspect" and "excluded".
const (
	OK Status = iota
	Suspect
	Excluded
)

// String returns the status as written in exports.
func (s Status) String() string {
	switch s {
	case Suspect:
		return "suspect"
	case Excluded:
		return "excluded"
	}
	return "ok"
}

// Settings configures the checks. The zero value runs the checks that need
// no information from the user with their documented defaults.
type Settings struct{}

// Edit is a hand exclusion or inclusion of one reading, with its reason.
type Edit struct {
	File    string // source file path as given
	Line    int    // line of the record in that file
	ID      string
	Exclude bool
	Reason  string
}

// Step is one logged correction or status change.
type Step struct {
	Reading int // index into the survey's readings, -1 for survey-wide steps
	Kind    string
	Reason  string
	Before  float64
	After   float64
}

// Result is the outcome of the checks for a survey of N readings.
type Result struct {
	Corrected []float64 // N corrected potentials, in the survey's unit
	Status    []Status  // N statuses
	Notes     [][]string
	Log       []Step
}

// Run checks and corrects the survey's readings with the given settings
// and hand edits. It never modifies s.
func Run(s *survey.Survey, set Settings, edits []Edit) (*Result, error) {
	n := len(s.Readings)
	r := &Result{Corrected: make([]float64, n), Status: make([]Status, n), Notes: make([][]string, n)}
	for i, rd := range s.Readings {
		r.Corrected[i] = rd.V
	}
	return r, nil
}
