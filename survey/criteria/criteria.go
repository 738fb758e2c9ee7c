package criteria

import (
	"fmt"
	"math"
	"strings"

	"isofield/survey"
	"isofield/survey/electrode"
	"isofield/survey/qa"
)

// The preset names accepted by Settings.Preset ("" is Generic).
const (
	Generic   = "generic"
	Concrete  = "concrete"
	Grounding = "grounding"
	CP        = "cp"
	SP        = "sp"
)

// Presets lists the preset names in the order help shows them.
func Presets() []string { return []string{Generic, Concrete, Grounding, CP, SP} }

// Defaults of the settings, each with its source in the field's comment.
const (
	// DefaultBodyKg is the 50 kg body of IEEE Std 80, the lower (more
	// cautious) of its two weights.
	DefaultBodyKg = 50
	// DefaultClearing is a clearing time of 0.5 s, the one of the IEEE Std
	// 80 design example in FIELD_FACTS §3.
	DefaultClearing = 0.5
	// DefaultReach is the horizontal reach of a touching person, about 1 m
	// (IEEE Std 80, from memory).
	DefaultReach = 1.0
	// StepDistance is the distance between the feet, 1 m (IEEE Std 80).
	StepDistance = 1.0
	// DefaultConcreteGradientMV is 150 mV per metre, the upper end of what
	// practitioners flag (≈100–150 mV over 0.5–1 m). No published number
	// exists: labelled "practice", low confidence (FIELD_FACTS §2).
	DefaultConcreteGradientMV = 150.0
	// DefaultCPLimitMV is −850 mV versus CSE (AMPP/NACE SP0169; 49 CFR
	// 192 App. D).
	DefaultCPLimitMV = -850.0
	// DefaultCoverLimitMM is the cover above which ASTM C876-15 §4.2 says
	// local differences blur, 75 mm.
	DefaultCoverLimitMM = 75.0
	// AutoFieldPercentile is the share of usable nodes below the automatic
	// field threshold of the cp and sp presets: the top 5 % of the field is
	// flagged (a statistical choice, common practice for anomaly maps).
	AutoFieldPercentile = 95.0
)

// OverprotectionMV is the polarised potential, in mV versus CSE, more
// negative than which cathodic protection may overprotect (practice, from
// memory: FIELD_FACTS §4).
const OverprotectionMV = -1200.0

// C876 band edges in mV versus CSE (ASTM C876, numeric technique,
// App. X1; band values quoted in a secondary source).
const (
	C876LowMV  = -200.0 // above: low probability of corrosion
	C876HighMV = -350.0 // below: high probability
)

// Point is a position in metres in the survey's coordinates.
type Point struct {
	X float64 `json:"x"`
	Y float64 `json:"y"`
}

// Settings selects a preset and its parameters; the session file stores
// it as JSON. Every zero value is meaningful and stated. Potentials are in
// the survey's unit U ("V" or "mV"), fields in U per metre.
type Settings struct {
	// Preset is one of Presets(); "" is the generic preset.
	Preset string `json:"preset,omitempty"`
	// FieldThreshold flags nodes whose field magnitude |E| reaches it, in
	// U per metre. 0: the preset's default (none for generic and
	// grounding, DefaultConcreteGradientMV for concrete, the automatic
	// AutoFieldPercentile threshold for cp and sp). Negative: no field
	// threshold.
	FieldThreshold float64 `json:"field_threshold,omitempty"`

	// Below and Above (generic preset) flag potentials below or above the
	// value, in U; nil: no such threshold.
	Below *float64 `json:"below,omitempty"`
	Above *float64 `json:"above,omitempty"`

	// CoverMM is the concrete cover over the bars in millimetres (0: not
	// stated). Over DefaultCoverLimitMM the report warns.
	CoverMM float64 `json:"cover_mm,omitempty"`
	// Conditions (concrete) lists what voids the C876 bands, any of
	// ConditionNames(): coated or galvanised bars, cathodic protection,
	// very wet, dry or carbonated concrete.
	Conditions []string `json:"conditions,omitempty"`

	// BodyKg (grounding) is 50 or 70 (0: DefaultBodyKg).
	BodyKg float64 `json:"body_kg,omitempty"`
	// ClearingTime (grounding) is the fault clearing time in seconds
	// (0: DefaultClearing).
	ClearingTime float64 `json:"clearing_s,omitempty"`
	// SoilRho is the soil resistivity ρ in Ω·m; SurfaceRho and SurfaceDepth
	// describe a surface layer (ρ_s in Ω·m, h_s in m; either 0: none).
	SoilRho      float64 `json:"soil_ohm_m,omitempty"`
	SurfaceRho   float64 `json:"surface_ohm_m,omitempty"`
	SurfaceDepth float64 `json:"surface_m,omitempty"`
	// GPR is the grid's potential rise at the fault current, in U on the
	// readings' reference (0: no touch voltages).
	GPR float64 `json:"gpr,omitempty"`
	// Structure lists points, joined in order into a polyline, of grounded
	// metal a person could touch; touch voltages are computed within Reach
	// of it. Empty: at every node, with a caveat.
	Structure []Point `json:"structure,omitempty"`
	// Reach is the horizontal reach in metres (0: DefaultReach).
	Reach float64 `json:"reach_m,omitempty"`

	// CPLimitMV (cp) is the potential criterion in mV versus CSE
	// (0: DefaultCPLimitMV).
	CPLimitMV float64 `json:"cp_limit_mv,omitempty"`

	// KeepTrend (sp) skips the regional trend removal.
	KeepTrend bool `json:"keep_trend,omitempty"`

	// Scale is the reference electrode the gridded values are read
	// against; Link sets it from the checks' settings. None: not stated
	// (taken as CSE by the concrete and cp presets, with a note).
	Scale electrode.Reference `json:"scale,omitempty"`
	// FaultScaled records that the checks scaled the readings to a fault
	// current; Link sets it.
	FaultScaled bool `json:"fault_scaled,omitempty"`
}

// Name returns the preset's canonical name ("generic" for "").
func (s Settings) Name() string {
	if s.Preset == "" {
		return Generic
	}
	return strings.ToLower(s.Preset)
}

// Validate checks the preset name and the ranges of the parameters.
func (s Settings) Validate() error {
	ok := false
	for _, p := range Presets() {
		ok = ok || s.Name() == p
	}
	if !ok {
		return fmt.Errorf("unknown preset %q (want %s)", s.Preset, strings.Join(Presets(), ", "))
	}
	for _, c := range s.Conditions {
		if _, known := conditionText(c); !known {
			return fmt.Errorf("unknown concrete condition %q (want %s)", c, strings.Join(ConditionNames(), ", "))
		}
	}
	for _, v := range []float64{s.FieldThreshold, s.CoverMM, s.GPR, s.Reach, s.CPLimitMV} {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("criteria settings: non-finite value")
		}
	}
	if s.Name() == Grounding {
		if _, err := IEEE80(s); err != nil {
			return fmt.Errorf("grounding preset: %w", err)
		}
	}
	return nil
}

// Link adjusts the checks' settings for the preset before they run, and
// records in c what the checks will do: the concrete and cp presets need
// potentials on the CSE scale, so when q.To is not stated it becomes CSE
// (the checks convert; package electrode holds the offsets); c.Scale
// becomes q.To. For the grounding preset c.FaultScaled records whether the
// checks scale readings to a fault current (q.FaultCurrent). It returns
// plain-language notes of what it changed. The checks, not this package,
// convert and scale, so that nothing is done twice.
func Link(c *Settings, q *qa.Settings) []string {
	var notes []string
	switch c.Name() {
	case Concrete, CP:
		if q.To == electrode.None {
			q.To = electrode.CSE
			if q.From == electrode.None {
				notes = append(notes, "the "+c.Name()+" preset reports potentials versus CSE: readings that state no reference electrode are taken to be versus CSE")
			} else {
				notes = append(notes, "the "+c.Name()+" preset reports potentials versus CSE: readings are converted from "+q.From.String())
			}
		}
	case Grounding:
		c.FaultScaled = q.FaultCurrent > 0
	}
	c.Scale = q.To
	return notes
}

// Prepare returns the values to grid for the preset, with plain-language
// notes of what it did. corrected holds the checked potentials in s.Unit,
// one per reading (NaN for readings the checks dropped); it is not
// modified. Reference conversion and current scaling are the checks' work
// (see Link); Prepare removes the regional trend of a self-potential survey
// (a robust plane fit, see FitPlane) and passes the other presets' values
// through.
func Prepare(s *survey.Survey, corrected []float64, set Settings) (values []float64, notes []string, err error) {
	if err := set.Validate(); err != nil {
		return nil, nil, err
	}
	values = append([]float64(nil), corrected...)
	switch set.Name() {
	case SP:
		if set.KeepTrend {
			return values, []string{"regional trend kept (as asked)"}, nil
		}
		xs, ys := make([]float64, len(s.Readings)), make([]float64, len(s.Readings))
		for i, r := range s.Readings {
			xs[i], ys[i] = r.X, r.Y
		}
		p, err := FitPlane(xs, ys, values)
		if err != nil {
			return values, []string{"regional trend not removed: " + err.Error()}, nil
		}
		for i := range values {
			values[i] -= p.At(xs[i], ys[i])
		}
		notes = append(notes, fmt.Sprintf("regional trend removed: %s (robust plane fit)", p.Describe(s.Unit.String())))
	case Concrete, CP:
		if set.Scale == electrode.None {
			notes = append(notes, "reference electrode not stated: readings are taken to be versus CSE")
		}
	}
	return values, notes, nil
}
