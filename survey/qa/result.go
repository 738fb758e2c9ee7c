package qa

import (
	"isofield/interp"
	"isofield/survey/electrode"
)

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

// Edit is a hand exclusion or inclusion of one reading, with its reason.
// A reading is identified by its source file (the path as given to the
// loader, or any path naming the same file), its line in that file and,
// when not empty, its id. Later edits of the same reading win.
type Edit struct {
	File    string // source file path
	Line    int    // line of the record in that file
	ID      string
	Exclude bool
	Reason  string
}

// The kinds of Step.
const (
	KindReference = "reference" // converted to another reference electrode
	KindCurrent   = "current"   // scaled from test current to fault current
	KindDrift     = "drift"     // corrected by the base station's drift curve
	KindRepeat    = "repeat"    // replaced by its repeat group's mean
	KindDisagree  = "disagree"  // marked suspect: repeats disagree
	KindSpike     = "spike"     // marked suspect: disagrees with neighbours
	KindExclude   = "exclude"   // excluded by hand
	KindInclude   = "include"   // included (vouched for) by hand: ok
	KindNote      = "note"      // survey-wide remark, no value changed
)

// Step is one logged correction or status change. Value steps change the
// corrected potential from Before to After; status steps change the status
// from Was to Now (Before and After then hold the corrected value).
type Step struct {
	Reading int // index into the survey's readings, -1 for survey-wide steps
	Kind    string
	Reason  string
	Before  float64
	After   float64
	Was     Status
	Now     Status
}

// RepeatGroup is a set of readings of one spot: the same id, or positions
// within Settings.RepeatDist of each other.
type RepeatGroup struct {
	Members []int // reading indexes in input order
	// Mean and Spread (max − min) of the members' values after reference,
	// current and drift corrections, in the survey's unit.
	Mean, Spread float64
	// Agree is true when Spread is within the repeat tolerance; the members
	// then all carry Mean as their corrected value.
	Agree bool
	// Base is true for the group used as the drift base station.
	Base bool
}

// DriftCurve is the drift of the base station through the survey.
type DriftCurve struct {
	Base    string // base station id (or the first member's id)
	Members []int  // the base readings in time order
	// ByTime is true when readings' timestamps give time; false when the
	// order of the readings stands in for it (TimeNote says why).
	ByTime   bool
	TimeNote string
	// T are the base readings' times: seconds since the first base
	// reading, or 0-based positions in input order.
	T []float64
	// B are the base readings' values (after reference and current
	// corrections); the correction at time t is B(t) − B[0].
	B      []float64
	Method DriftMethod
	// LoopClosure is B[last] − B[0], the misclosure of the base loop;
	// MaxStep is the largest change between successive base readings.
	LoopClosure, MaxStep float64
	// Outside counts readings before the first or after the last base
	// reading; their correction is held at the end value.
	Outside int
}

// SpikeInfo is one reading's leave-one-out check.
type SpikeInfo struct {
	Reading  int
	Residual float64 // value minus the prediction without the reading
	Z        float64 // robust z of the deviation beyond the curvature allowance: e / (1.4826 MAD × gap factor), see the package doc
}

// Conversion is a reference-electrode conversion applied to some readings.
type Conversion struct {
	From, To electrode.Reference
	Offset   float64 // added, in the survey's unit
	Count    int     // readings converted
	Source   string  // sources of the two electrodes' potentials
}

// Scaling is a current scaling applied to some readings.
type Scaling struct {
	TestCurrent, FaultCurrent float64 // amperes
	Factor                    float64 // FaultCurrent / TestCurrent
	Count                     int
}

// Result is the outcome of the checks for a survey of N readings. It holds
// no reference to the survey.
type Result struct {
	Corrected []float64 // N corrected potentials, in the survey's unit
	Status    []Status  // N statuses
	Notes     [][]string
	Log       []Step

	// Group is each reading's index into Repeats, or -1.
	Group   []int
	Repeats []RepeatGroup
	// Drift is nil when no drift correction was made.
	Drift *DriftCurve
	// BaseProposal is the id (or "file:line" of the first reading) of the
	// spot read most often, proposed as base station; "" when none was
	// read three times or more.
	BaseProposal string
	// Residual and Z are each reading's leave-one-out residual and robust
	// z (NaN where the spike check did not run). Suspects lists readings
	// marked as spikes, largest |Z| first.
	Residual, Z []float64
	Suspects    []SpikeInfo
	// Steep lists readings that disagree with the fit together with a
	// neighbour: a feature finer than the reading spacing, noted but not
	// marked.
	Steep []int
	// SpikeScale is the robust scale 1.4826 MAD of the residuals.
	SpikeScale float64
	Fit        *interp.FitInfo
	// SpikeModel is the spike check's last fit (thin-plate spline, default
	// options) over the positions and values SpikeX, SpikeY, SpikeV: one
	// value per spot not marked out. A caller that grids exactly these
	// values with the same options may use it instead of fitting again.
	// nil when the spike check did not run.
	SpikeModel             *interp.Model
	SpikeX, SpikeY, SpikeV []float64
	// Conversions lists reference conversions and Scalings the current
	// scalings applied, one entry per distinct test current.
	Conversions []Conversion
	Scalings    []Scaling
	// Settings are the settings used, defaults filled in.
	Settings Settings
	// Remarks are survey-wide notes: fallbacks taken, checks skipped.
	Remarks []string
}

// Use reports whether reading i should be gridded: it is not excluded, it
// is not suspect (unless useSuspects), and it is the first member of its
// repeat group when the group agrees (agreeing repeats count once, with the
// group mean). It panics if i is not a reading's index.
func (r *Result) Use(i int, useSuspects bool) bool {
	switch r.Status[i] {
	case Excluded:
		return false
	case Suspect:
		if !useSuspects {
			return false
		}
	}
	if i >= len(r.Group) {
		return true
	}
	if g := r.Group[i]; g >= 0 && g < len(r.Repeats) && r.Repeats[g].Agree {
		for _, m := range r.Repeats[g].Members {
			if r.Status[m] == Excluded {
				continue
			}
			return m == i
		}
	}
	return true
}

// Counts returns how many readings have each status.
func (r *Result) Counts() (ok, suspect, excluded int) {
	for _, s := range r.Status {
		switch s {
		case Suspect:
			suspect++
		case Excluded:
			excluded++
		default:
			ok++
		}
	}
	return ok, suspect, excluded
}
