package qa

import (
	"fmt"
	"strings"

	"isofield/survey"
	"isofield/survey/electrode"
)

// Settings configures the checks. Every field's zero value is meaningful and
// stated; the zero Settings converts nothing, scales nothing, corrects no
// drift (but proposes a base station when one is evident), groups repeats
// with the default tolerances and flags spikes at DefaultSpikeK.
type Settings struct {
	// From is the reference electrode the readings were taken against.
	// A reading whose own Reference names an electrode uses that one
	// instead. None (the zero value): readings without their own
	// reference are taken to be on the To scale already.
	From electrode.Reference `json:"from,omitempty"`
	// To is the reference electrode to report on. None (the zero value):
	// no conversion at all, even for readings that name their own
	// reference (the report lists them).
	To electrode.Reference `json:"to,omitempty"`

	// RepeatTol is the largest spread (max − min) of a group of repeated
	// readings that still counts as agreement, in the survey's unit.
	// 0: DefaultRepeatTolMV converted to the survey's unit. Negative:
	// repeats are grouped and reported but never marked suspect.
	RepeatTol float64 `json:"repeat_tol,omitempty"`
	// RepeatDist joins readings whose positions lie within this many
	// metres into one repeat group, besides readings sharing an id.
	// 0: DefaultRepeatDist. Negative: group by id only.
	RepeatDist float64 `json:"repeat_dist,omitempty"`
	// IgnoreIDs groups repeats by position only, for files whose ids
	// restart (false: a shared id makes a repeat group wherever it is).
	IgnoreIDs bool `json:"ignore_ids,omitempty"`

	// Base is the id of the base station whose repeated readings give the
	// drift curve. "" (the zero value): no drift correction unless
	// AutoBase is set; the report proposes a candidate.
	Base string `json:"base,omitempty"`
	// AutoBase corrects drift with the proposed base station when Base is
	// empty (false: only propose).
	AutoBase bool `json:"auto_base,omitempty"`
	// Drift is how the drift curve passes between base readings
	// (zero value: Linear).
	Drift DriftMethod `json:"drift,omitempty"`

	// SpikeK is the robust z above which a reading's leave-one-out
	// residual marks it suspect. 0: DefaultSpikeK. Negative: no spike
	// check.
	SpikeK float64 `json:"spike_k,omitempty"`

	// TestCurrent is the injected test current in amperes for readings
	// that state none of their own (0: none stated).
	TestCurrent float64 `json:"test_current,omitempty"`
	// FaultCurrent, in amperes, scales readings of a current-injection
	// test to the fault: V × FaultCurrent / test current. It should be the
	// part of the fault current that flows into the soil through the grid
	// (fault current × split factor). 0: no scaling.
	FaultCurrent float64 `json:"fault_current,omitempty"`
}

// Defaults of Settings, with their sources.
const (
	// DefaultRepeatTolMV is the repeatability of one half-cell
	// reconnected at one spot, 10 mV (ASTM C876; from memory in the
	// project's field facts, status M). Two cells at one spot may differ
	// by up to 20 mV (same source, same status).
	DefaultRepeatTolMV = 10.0
	// DefaultRepeatDist is 0.05 m: readings this close are taken as the
	// same spot (common practice: about the size of a probe's contact
	// sponge).
	DefaultRepeatDist = 0.05
	// DefaultSpikeK is 3.5, the modified z-score limit for outliers of
	// B. Iglewicz and D. C. Hoaglin, How to Detect and Handle Outliers,
	// ASQC (1993) (from memory).
	DefaultSpikeK = 3.5
)

// DriftMethod chooses the curve through the base readings.
type DriftMethod int

// The drift methods.
const (
	// Linear joins base readings by straight lines (gonum
	// interp.PiecewiseLinear), the usual field practice.
	Linear DriftMethod = iota
	// MonotoneCubic is the monotone piecewise cubic of Fritsch and
	// Butland, SIAM J. Sci. Stat. Comput. 5(2) (1984) (gonum
	// interp.FritschButland): smooth, and it never overshoots the base
	// readings.
	MonotoneCubic
)

// String returns "linear" or "cubic".
func (m DriftMethod) String() string {
	if m == MonotoneCubic {
		return "cubic"
	}
	return "linear"
}

// ParseDriftMethod reads "linear" or "cubic" ("monotone-cubic" too).
func ParseDriftMethod(s string) (DriftMethod, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "linear", "":
		return Linear, nil
	case "cubic", "monotone-cubic", "monotone":
		return MonotoneCubic, nil
	}
	return Linear, fmt.Errorf("drift method %q: want linear or cubic", s)
}

// MarshalText writes the method's name.
func (m DriftMethod) MarshalText() ([]byte, error) { return []byte(m.String()), nil }

// UnmarshalText reads a name ParseDriftMethod accepts.
func (m *DriftMethod) UnmarshalText(b []byte) error {
	v, err := ParseDriftMethod(string(b))
	*m = v
	return err
}

// Validate reports settings no run can use.
func (s Settings) Validate() error {
	switch {
	case s.FaultCurrent < 0 || s.FaultCurrent != s.FaultCurrent:
		return fmt.Errorf("fault current %g A: must be positive", s.FaultCurrent)
	case s.TestCurrent < 0 || s.TestCurrent != s.TestCurrent:
		return fmt.Errorf("test current %g A: must be positive", s.TestCurrent)
	case s.RepeatTol != s.RepeatTol, s.RepeatDist != s.RepeatDist, s.SpikeK != s.SpikeK:
		return fmt.Errorf("tolerances must be numbers")
	case s.Drift != Linear && s.Drift != MonotoneCubic:
		return fmt.Errorf("drift method %d unknown", int(s.Drift))
	}
	for _, r := range []electrode.Reference{s.From, s.To} {
		if _, ok := electrode.Lookup(r); !ok && r != electrode.None {
			return fmt.Errorf("reference electrode %d unknown", int(r))
		}
	}
	return nil
}

// effective returns s with every zero default filled in for a survey in
// unit u.
func (s Settings) effective(u survey.Unit) Settings {
	if s.RepeatTol == 0 {
		s.RepeatTol = DefaultRepeatTolMV / 1000 * u.PerVolt()
	}
	if s.RepeatDist == 0 {
		s.RepeatDist = DefaultRepeatDist
	}
	if s.SpikeK == 0 {
		s.SpikeK = DefaultSpikeK
	}
	return s
}
