package session

import (
	"encoding/json"
	"fmt"
	"strings"

	"isofield/interp"
	"isofield/survey/criteria"
	"isofield/survey/pipeline"
	"isofield/survey/qa"
)

// Settings are the run settings a session keeps. Each section is the
// settings type of the package that owns it, so a field added there is
// kept here without change. A later package can keep its own section in
// Extra under its name until it earns a typed field.
type Settings struct {
	QA       qa.Settings       `json:"qa"`
	Criteria criteria.Settings `json:"criteria"`
	Fit      FitSettings       `json:"fit"`
	Grid     GridSettings      `json:"grid"`
	// Extra holds sections of other packages, by name, as raw JSON.
	Extra map[string]json.RawMessage `json:"extra,omitempty"`
}

// FitSettings are the interpolation options, with names instead of
// numbers so that the file reads plainly and survives reordering.
type FitSettings struct {
	Kernel        string  `json:"kernel,omitempty"` // interp.ParseKernel name; "": thin-plate
	Method        string  `json:"method,omitempty"` // auto, global or local; "": auto
	Smoothing     float64 `json:"smoothing,omitempty"`
	AutoSmoothing bool    `json:"auto_smoothing,omitempty"`
	Shape         float64 `json:"shape,omitempty"`
	AutoShape     bool    `json:"auto_shape,omitempty"`
	LocalAbove    int     `json:"local_above,omitempty"`
}

// GridSettings are the grid and map options of pipeline.Config.
type GridSettings struct {
	Spacing      float64 `json:"spacing_m,omitempty"`
	MaxNodes     int     `json:"max_nodes,omitempty"`
	MaskDistance float64 `json:"mask_m,omitempty"`
	// Outline is "none" or, left out (files written before it existed
	// too), the default "hull".
	Outline     pipeline.Outline `json:"outline,omitempty"`
	Interval    float64          `json:"interval,omitempty"`
	Suggest     int              `json:"suggest,omitempty"`
	UseSuspects bool             `json:"use_suspects,omitempty"`
}

// FromConfig takes the settings of a pipeline configuration.
func FromConfig(cfg pipeline.Config) Settings {
	o := cfg.Fit
	return Settings{
		QA:       cfg.QA,
		Criteria: cfg.Criteria,
		Fit: FitSettings{
			Kernel: o.Kernel.String(), Method: methodName(o.Method),
			Smoothing: o.Smoothing, AutoSmoothing: o.AutoSmoothing,
			Shape: o.Shape, AutoShape: o.AutoShape, LocalAbove: o.LocalAbove,
		},
		Grid: GridSettings{
			Spacing: cfg.Spacing, MaxNodes: cfg.MaxNodes, MaskDistance: cfg.MaskDistance, Outline: cfg.Outline,
			Interval: cfg.Interval, Suggest: cfg.Suggest, UseSuspects: cfg.UseSuspects,
		},
	}
}

// Apply puts the settings into cfg, keeping its files, survey, load
// options, progress callback and edits.
func (s Settings) Apply(cfg *pipeline.Config) error {
	fit := cfg.Fit
	if s.Fit.Kernel != "" {
		k, err := interp.ParseKernel(s.Fit.Kernel)
		if err != nil {
			return fmt.Errorf("session fit kernel: %w", err)
		}
		fit.Kernel = k
	} else {
		fit.Kernel = interp.ThinPlate
	}
	m, err := parseMethod(s.Fit.Method)
	if err != nil {
		return err
	}
	fit.Method, fit.LocalAbove = m, s.Fit.LocalAbove
	fit.Smoothing, fit.AutoSmoothing = s.Fit.Smoothing, s.Fit.AutoSmoothing
	fit.Shape, fit.AutoShape = s.Fit.Shape, s.Fit.AutoShape
	cfg.Fit = fit
	cfg.QA, cfg.Criteria = s.QA, s.Criteria
	g := s.Grid
	cfg.Spacing, cfg.MaxNodes, cfg.MaskDistance, cfg.Outline = g.Spacing, g.MaxNodes, g.MaskDistance, g.Outline
	cfg.Interval, cfg.Suggest, cfg.UseSuspects = g.Interval, g.Suggest, g.UseSuspects
	return nil
}

func methodName(m interp.Method) string {
	switch m {
	case interp.Global:
		return "global"
	case interp.Local:
		return "local"
	}
	return "auto"
}

func parseMethod(s string) (interp.Method, error) {
	switch strings.ToLower(s) {
	case "", "auto":
		return interp.Auto, nil
	case "global":
		return interp.Global, nil
	case "local":
		return interp.Local, nil
	}
	return interp.Auto, fmt.Errorf("session fit method %q: want auto, global or local", s)
}
