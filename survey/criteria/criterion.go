package criteria

import (
	"encoding/json"
	"fmt"
	"math"

	"isofield/survey/electrode"
)

// Source is one number of a criterion and where it comes from. Status is
// the project's field-facts status: "C" read in the source, "C2" read in a
// secondary source, "V" arithmetic checked, "M" from memory (unconfirmed),
// or "practice" for common practice without a published number.
type Source struct {
	What   string `json:"what"`
	Source string `json:"source"`
	Status string `json:"status"`
}

// Class is a potential class: values between Lo and Hi in the survey's
// unit (±Inf at the open ends), each end included when its Closed flag is
// set.
type Class struct {
	Name     string  `json:"name"`
	Lo       float64 `json:"lo"`
	Hi       float64 `json:"hi"`
	LoClosed bool    `json:"lo_closed"`
	HiClosed bool    `json:"hi_closed"`
	// Severity orders classes: 0 harmless, 1 uncertain, 2 of concern.
	Severity int `json:"severity"`
}

// Contains reports whether v lies in the class.
func (c Class) Contains(v float64) bool {
	switch {
	case v > c.Lo && v < c.Hi:
		return true
	case v == c.Lo:
		return c.LoClosed
	case v == c.Hi:
		return c.HiClosed
	}
	return false
}

// ClassOf returns the index of the first class containing v, or -1.
func ClassOf(cs []Class, v float64) int {
	for i, c := range cs {
		if c.Contains(v) {
			return i
		}
	}
	return -1
}

// Criterion is a preset resolved for one survey: thresholds in the
// survey's unit U and scale, what they mean, where they come from, and the
// warnings and cautions to show with every result.
type Criterion struct {
	Preset string
	Title  string
	Unit   string
	// Field is the field threshold in U/m (0: none). FieldAuto means the
	// threshold is to be taken at AutoFieldPercentile of the usable field
	// values; the analysis does that and reports the value.
	Field      float64
	FieldAuto  bool
	FieldLabel string
	// Below flags potentials strictly below it, Above strictly above it,
	// when their Has flag is set; the labels say what a flagged zone means.
	Below, Above          float64
	HasBelow, HasAbove    bool
	BelowLabel            string
	AboveLabel            string
	Classes               []Class
	Step                  bool       // compute step voltages
	Touch                 bool       // compute touch voltages (GPR given)
	Tolerable             *Tolerable // grounding only
	StepLimit, TouchLimit float64    // U, grounding only
	Sources               []Source
	Warnings              []string
	Cautions              []string
}

// Resolve turns settings into the criterion for a survey in unit ("V" or
// "mV"). It returns the settings' validation error, if any.
func Resolve(set Settings, unit string) (*Criterion, error) {
	if err := set.Validate(); err != nil {
		return nil, err
	}
	c := &Criterion{Preset: set.Name(), Unit: unit, Cautions: Cautions(set.Name())}
	if set.FieldThreshold > 0 {
		c.Field = set.FieldThreshold
		c.FieldLabel = "set by the user"
	}
	var err error
	switch c.Preset {
	case Generic:
		resolveGeneric(c, set)
	case Concrete:
		err = resolveConcrete(c, set)
	case Grounding:
		err = resolveGrounding(c, set)
	case CP:
		err = resolveCP(c, set)
	case SP:
		resolveSP(c, set)
	}
	return c, err
}

// perMilli returns how many of unit make one millivolt.
func perMilli(unit string) float64 {
	if unit == "V" {
		return 1e-3
	}
	return 1
}

// fromCSE converts a CSE potential in mV to the settings' scale in unit.
func fromCSE(mv float64, set Settings, unit string) (float64, error) {
	to := set.Scale
	if to != electrode.None && to != electrode.CSE {
		var err error
		if mv, err = electrode.ConvertMilli(mv, electrode.CSE, to); err != nil {
			return 0, err
		}
	}
	return mv * perMilli(unit), nil
}

// onScale shows a threshold v on the survey's scale and unit when that is
// not plain mV versus CSE.
func onScale(v float64, unit string, set Settings) string {
	switch {
	case set.Scale != electrode.None && set.Scale != electrode.CSE:
		return fmt.Sprintf(" (%.4g %s versus %s)", v, unit, set.Scale)
	case unit != "mV":
		return fmt.Sprintf(" (%.4g %s)", v, unit)
	}
	return ""
}

func resolveGeneric(c *Criterion, set Settings) {
	c.Title = "Generic: thresholds set by the user"
	if set.Below != nil {
		c.Below, c.HasBelow = *set.Below, true
		c.BelowLabel = fmt.Sprintf("potential below %g %s", c.Below, c.Unit)
	}
	if set.Above != nil {
		c.Above, c.HasAbove = *set.Above, true
		c.AboveLabel = fmt.Sprintf("potential above %g %s", c.Above, c.Unit)
	}
	c.Sources = []Source{{"all thresholds", "set by the user", "user"}}
}

func resolveConcrete(c *Criterion, set Settings) error {
	c.Title = "Half-cell potential mapping of reinforced concrete"
	lo, err1 := fromCSE(C876LowMV, set, c.Unit)
	hi, err2 := fromCSE(C876HighMV, set, c.Unit)
	if err := firstErr(err1, err2); err != nil {
		return err
	}
	c.Classes = []Class{
		{fmt.Sprintf("above %g mV CSE: low probability of corrosion", C876LowMV), lo, math.Inf(1), false, false, 0},
		{fmt.Sprintf("%g to %g mV CSE: uncertain", C876LowMV, C876HighMV), hi, lo, true, true, 1},
		{fmt.Sprintf("below %g mV CSE: high probability of corrosion", C876HighMV), math.Inf(-1), hi, false, false, 2},
	}
	c.Below, c.HasBelow = hi, true
	c.BelowLabel = fmt.Sprintf("below %g mV CSE%s: high probability of corrosion", C876HighMV, onScale(hi, c.Unit, set))
	if set.FieldThreshold == 0 {
		c.Field = DefaultConcreteGradientMV * perMilli(c.Unit)
		c.FieldLabel = "practice, low confidence: practitioners flag ≈100–150 mV over 0.5–1 m"
	}
	c.Sources = []Source{
		{"probability bands above −200, −200 to −350, below −350 mV CSE", "ASTM C876, numeric technique, App. X1", "C2"},
		{"CSE scale", "ASTM C876-22a §5.1.1.2; offsets of other electrodes: package electrode", "C"},
		{"gradient threshold", "no published number; practice (≈100–150 mV over 0.5–1 m)", "practice"},
		{"statistical view: cumulative frequency of readings", "RILEM TC 154-EMC, Materials and Structures 36 (2003) 461–471", "C"},
		{"active corrosion at steep negative gradients", "Clemeña, Jackson & Crawford, Transportation Research Record (1992)", "C"},
	}
	c.Warnings = concreteWarnings(set)
	return nil
}

func resolveGrounding(c *Criterion, set Settings) error {
	c.Title = "Grounding system: step and touch voltages (IEEE Std 80)"
	t, err := IEEE80(set)
	if err != nil {
		return err
	}
	perVolt := 1000 * perMilli(c.Unit)
	c.Tolerable = &t
	c.Step = true
	c.StepLimit = t.StepV * perVolt
	c.Touch = set.GPR != 0
	c.TouchLimit = t.TouchV * perVolt
	c.Sources = []Source{
		{fmt.Sprintf("tolerable step %.1f V, touch %.1f V (%s)", t.StepV, t.TouchV, t.Assumption), "IEEE Std 80 formulas", "M"},
		{"body current I_B = k/√t_s, k = 0.116 (50 kg)", "Dalziel & Lee, IEEE Trans. IGA-4 (1968)", "C"},
		{"k = 0.157 (70 kg), C_s formula, touch reach 1 m", "IEEE Std 80", "M"},
		{"step distance 1 m; step voltage as the largest difference over 1 m", "IEEE Std 80 definition; physics", "C2"},
		{"scaling to fault: V × I_grid / I_test", "IEEE Std 81 / 80 practice", "C2"},
		{"other regions use other body models", "IEC 60479-1, EN 50522", "C"},
	}
	if set.SoilRho == 0 {
		c.Warnings = append(c.Warnings, "soil resistivity not given: tolerable voltages assume ρ_s = 0 Ω·m (the most cautious)")
	}
	if !set.FaultScaled {
		c.Warnings = append(c.Warnings, "readings not scaled to a fault current: compare with tolerable voltages only after scaling")
	}
	if c.Touch && len(set.Structure) == 0 {
		c.Warnings = append(c.Warnings, "no structure given: touch voltage is shown at every node as if grounded metal were within reach")
	}
	return nil
}

func resolveCP(c *Criterion, set Settings) error {
	c.Title = "Cathodic protection potential survey"
	lim := set.CPLimitMV
	if lim == 0 {
		lim = DefaultCPLimitMV
	}
	v, err1 := fromCSE(lim, set, c.Unit)
	over, err2 := fromCSE(OverprotectionMV, set, c.Unit)
	if err := firstErr(err1, err2); err != nil {
		return err
	}
	c.Above, c.HasAbove = v, true
	c.AboveLabel = fmt.Sprintf("less negative than %g mV CSE%s: criterion not met", lim, onScale(v, c.Unit, set))
	c.Classes = []Class{
		{fmt.Sprintf("less negative than %g mV CSE: not met", lim), v, math.Inf(1), false, false, 2},
		{fmt.Sprintf("%g to %g mV CSE: met", lim, OverprotectionMV), over, v, true, true, 0},
		{fmt.Sprintf("more negative than %g mV CSE: possible overprotection (practice, from memory)", OverprotectionMV), math.Inf(-1), over, false, false, 1},
	}
	autoField(c, set, "possible coating defects")
	c.Sources = []Source{
		{"−850 mV CSE or more negative, IR drops considered", "AMPP/NACE SP0169; 49 CFR 192 App. D", "C"},
		{"100 mV polarisation criterion (not evaluated here)", "AMPP/NACE SP0169", "C2"},
		{"avoid polarised potentials more negative than ≈ −1200 mV CSE", "practice", "M"},
		{"gradient anomalies at coating defects", "practice", "C2"},
	}
	c.Warnings = append(c.Warnings, "on-potentials include the IR drop in the soil; the criterion applies to potentials with IR drops considered (instant-off or corrected)")
	return nil
}

func resolveSP(c *Criterion, set Settings) {
	c.Title = "Self-potential survey"
	autoField(c, set, "self-potential anomaly")
	c.Sources = []Source{
		{"regional trend removed by a robust plane fit", "Huber (1964) weights, IRLS (Holland & Welsch 1977)", "C2"},
		{"natural background usually < 100 mV; regional gradients ≈ 30 mV/km", "Telford, Geldart & Sheriff, Applied Geophysics (1990)", "C"},
		{"seepage signals seldom above 100 mV", "Milsom, Field Geophysics", "C"},
	}
	if set.KeepTrend {
		c.Warnings = append(c.Warnings, "regional trend kept: gradients include it")
	}
}

// autoField sets the automatic field threshold unless the user gave one.
func autoField(c *Criterion, set Settings, meaning string) {
	if set.FieldThreshold == 0 {
		c.FieldAuto = true
		c.FieldLabel = fmt.Sprintf("automatic: the top %g %% of field values (%s)", 100-AutoFieldPercentile, meaning)
	} else if c.Field > 0 {
		c.FieldLabel = "set by the user (" + meaning + ")"
	}
}

func firstErr(errs ...error) error {
	for _, e := range errs {
		if e != nil {
			return e
		}
	}
	return nil
}

// classJSON is Class with open ends written as null (JSON has no infinity).
type classJSON struct {
	Name     string   `json:"name"`
	Lo       *float64 `json:"lo"`
	Hi       *float64 `json:"hi"`
	LoClosed bool     `json:"lo_closed"`
	HiClosed bool     `json:"hi_closed"`
	Severity int      `json:"severity"`
}

// MarshalJSON writes an infinite end as null.
func (c Class) MarshalJSON() ([]byte, error) {
	j := classJSON{Name: c.Name, LoClosed: c.LoClosed, HiClosed: c.HiClosed, Severity: c.Severity}
	if !math.IsInf(c.Lo, 0) {
		j.Lo = &c.Lo
	}
	if !math.IsInf(c.Hi, 0) {
		j.Hi = &c.Hi
	}
	return json.Marshal(j)
}

// UnmarshalJSON reads null ends as −Inf (lo) and +Inf (hi).
func (c *Class) UnmarshalJSON(b []byte) error {
	var j classJSON
	if err := json.Unmarshal(b, &j); err != nil {
		return err
	}
	*c = Class{Name: j.Name, Lo: math.Inf(-1), Hi: math.Inf(1), LoClosed: j.LoClosed, HiClosed: j.HiClosed, Severity: j.Severity}
	if j.Lo != nil {
		c.Lo = *j.Lo
	}
	if j.Hi != nil {
		c.Hi = *j.Hi
	}
	return nil
}
