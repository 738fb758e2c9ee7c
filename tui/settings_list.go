package tui

import (
	"strconv"
	"strings"

	"isofield/interp"
	"isofield/survey/criteria"
	"isofield/survey/pipeline"
)

// allSettings lists every setting the form can show.
func allSettings() []setting {
	f := func(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }
	out := []setting{
		{label: "preset", choices: criteria.Presets(),
			get: func(c *pipeline.Config) string { return c.Criteria.Name() },
			set: func(c *pipeline.Config, s string) error { c.Criteria.Preset = s; return nil }},
		{label: "field threshold ({U}/m; 0 = preset)",
			get: func(c *pipeline.Config) string { return f(c.Criteria.FieldThreshold) },
			set: func(c *pipeline.Config, s string) (err error) { c.Criteria.FieldThreshold, err = number(s); return }},
		{label: "contour interval ({U}; 0 = auto)",
			get: func(c *pipeline.Config) string { return f(c.Interval) },
			set: func(c *pipeline.Config, s string) (err error) { c.Interval, err = nonNegative(s); return }},
		{label: "kernel", choices: kernelNames(),
			get: func(c *pipeline.Config) string { return c.Fit.Kernel.String() },
			set: func(c *pipeline.Config, s string) (err error) { c.Fit.Kernel, err = interp.ParseKernel(s); return }},
		{label: "smoothing (auto or λ)",
			get: func(c *pipeline.Config) string {
				if c.Fit.AutoSmoothing {
					return "auto"
				}
				return f(c.Fit.Smoothing)
			},
			set: setSmoothing},
		{label: "grid spacing (m; 0 = auto)",
			get: func(c *pipeline.Config) string { return f(c.Spacing) },
			set: func(c *pipeline.Config, s string) (err error) { c.Spacing, err = nonNegative(s); return }},
		{label: "grid suspects too", choices: []string{"no", "yes"},
			get: func(c *pipeline.Config) string { return yesNo(c.UseSuspects) },
			set: func(c *pipeline.Config, s string) error { c.UseSuspects = s == "yes"; return nil }},
	}
	return append(out, presetSettings()...)
}

func yesNo(b bool) string {
	if b {
		return "yes"
	}
	return "no"
}

func setSmoothing(c *pipeline.Config, s string) error {
	if strings.EqualFold(s, "auto") {
		c.Fit.AutoSmoothing, c.Fit.Smoothing = true, 0
		return nil
	}
	v, err := nonNegative(s)
	if err != nil {
		return err
	}
	c.Fit.AutoSmoothing, c.Fit.Smoothing = false, v
	return nil
}

// presetSettings are the parameters of each preset.
func presetSettings() []setting {
	num := func(label, preset string, p func(c *pipeline.Config) *float64) setting {
		return setting{label: label, preset: preset,
			get: func(c *pipeline.Config) string { return strconv.FormatFloat(*p(c), 'g', -1, 64) },
			set: func(c *pipeline.Config, s string) (err error) { *p(c), err = nonNegative(s); return }}
	}
	opt := func(label string, p func(c *pipeline.Config) **float64) setting {
		return setting{label: label, preset: criteria.Generic,
			get: func(c *pipeline.Config) string { return optional(*p(c)) },
			set: func(c *pipeline.Config, s string) (err error) { *p(c), err = setOptional(s); return }}
	}
	return []setting{
		opt("flag potential ≤ ({U}; empty: none)", func(c *pipeline.Config) **float64 { return &c.Criteria.Below }),
		opt("flag potential ≥ ({U}; empty: none)", func(c *pipeline.Config) **float64 { return &c.Criteria.Above }),
		num("concrete cover (mm; 0 = unknown)", criteria.Concrete, func(c *pipeline.Config) *float64 { return &c.Criteria.CoverMM }),
		{label: "body weight (kg)", preset: criteria.Grounding, choices: []string{"50", "70"},
			get: func(c *pipeline.Config) string {
				if c.Criteria.BodyKg == 70 {
					return "70"
				}
				return "50"
			},
			set: func(c *pipeline.Config, s string) (err error) { c.Criteria.BodyKg, err = number(s); return }},
		num("clearing time (s; 0 = 0.5)", criteria.Grounding, func(c *pipeline.Config) *float64 { return &c.Criteria.ClearingTime }),
		num("soil resistivity (Ω·m)", criteria.Grounding, func(c *pipeline.Config) *float64 { return &c.Criteria.SoilRho }),
		num("surface layer (Ω·m; 0 = none)", criteria.Grounding, func(c *pipeline.Config) *float64 { return &c.Criteria.SurfaceRho }),
		num("surface layer depth (m)", criteria.Grounding, func(c *pipeline.Config) *float64 { return &c.Criteria.SurfaceDepth }),
		num("grid potential rise ({U})", criteria.Grounding, func(c *pipeline.Config) *float64 { return &c.Criteria.GPR }),
		{label: "criterion (mV CSE; 0 = −850)", preset: criteria.CP,
			get: func(c *pipeline.Config) string { return strconv.FormatFloat(c.Criteria.CPLimitMV, 'g', -1, 64) },
			set: func(c *pipeline.Config, s string) (err error) { c.Criteria.CPLimitMV, err = number(s); return }},
		{label: "keep regional trend", preset: criteria.SP, choices: []string{"no", "yes"},
			get: func(c *pipeline.Config) string { return yesNo(c.Criteria.KeepTrend) },
			set: func(c *pipeline.Config, s string) error { c.Criteria.KeepTrend = s == "yes"; return nil }},
	}
}
