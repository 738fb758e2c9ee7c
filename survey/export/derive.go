package export

import (
	"context"
	"fmt"
	"math"
	"path/filepath"
	"strconv"
	"strings"

	"isofield/interp/contour"
	"isofield/survey"
	"isofield/survey/analysis"
	"isofield/survey/criteria"
	"isofield/survey/geo"
	"isofield/survey/pipeline"
)

// FromResult gathers a Bundle from a pipeline result and the configuration
// that made it: contours, flags, zones, classes and suggestions from the
// analysis, statuses and the log summary from the checks, the settings from
// cfg and the fit.
func FromResult(ctx context.Context, res *pipeline.Result, cfg pipeline.Config, opt Options) (*Bundle, error) {
	if res == nil || res.Survey == nil || res.Grid == nil {
		return nil, fmt.Errorf("export: no gridded survey to export")
	}
	s, g := res.Survey, res.Grid
	b := &Bundle{
		Title: opt.Title, Unit: s.Unit.String(), Version: opt.Version, Made: opt.Made,
		Survey: s, Grid: g, qa: res.QA, dpi: opt.DPI, Notes: append(append([]string(nil), s.Notes...), res.Notes...),
	}
	if b.Title == "" {
		b.Title = surveyTitle(s)
	}
	if s.Geo != nil {
		p, err := geo.NewPlane(s.Geo.Lat0, s.Geo.Lon0)
		if err != nil {
			return nil, fmt.Errorf("export: survey origin: %w", err)
		}
		b.Plane = &p
	}
	b.Readings = marks(s, res)
	if err := b.takeAnalysis(ctx, res.Analysis, cfg); err != nil {
		return nil, err
	}
	b.QA = summariseQA(s, res.QA, b.Readings)
	b.Settings = append(SettingsOf(cfg, res), opt.Settings...)
	b.Cautions = criteria.Cautions(cfg.Criteria.Name())
	if b.Criterion != nil && len(b.Criterion.Cautions) > 0 {
		b.Cautions = b.Criterion.Cautions
	}
	return b, nil
}

// takeAnalysis copies the analysis's contours, flags and zones; without an
// analysis it draws the contours from the grid alone.
func (b *Bundle) takeAnalysis(ctx context.Context, a *analysis.Result, cfg pipeline.Config) error {
	if a != nil {
		b.Interval, b.Levels, b.Lines = a.Interval, a.Levels, a.Contours
		b.Flagged, b.Criterion, b.FieldThreshold = a.Flagged, a.Criterion, a.FieldThreshold
		b.Zones, b.Classes, b.Infill = a.Zones, a.Classes, a.Suggestions
		b.Cumulative = a.Cumulative
		b.Notes = append(b.Notes, a.Notes...)
		return nil
	}
	g := b.Grid
	b.Interval = cfg.Interval
	if lo, hi, ok := contour.Range(g); ok {
		if b.Interval <= 0 {
			b.Interval = contour.NiceInterval(lo, hi)
		}
		b.Levels = contour.Levels(lo, hi, b.Interval)
	}
	lines, err := contour.Lines(ctx, g, b.Levels)
	if err != nil {
		return fmt.Errorf("export: contours: %w", err)
	}
	b.Lines = lines
	return nil
}

// surveyTitle names the survey: its name, else its first file's base name.
func surveyTitle(s *survey.Survey) string {
	switch {
	case s.Name != "":
		return s.Name
	case len(s.Files) > 0:
		return strings.TrimSuffix(filepath.Base(s.Files[0].Path), filepath.Ext(s.Files[0].Path))
	}
	return "survey"
}

// marks lists every reading with its QA status and gridded value.
func marks(s *survey.Survey, res *pipeline.Result) []Mark {
	out := make([]Mark, len(s.Readings))
	for i, r := range s.Readings {
		m := Mark{Index: i, ID: r.ID, X: r.X, Y: r.Y, Original: r.V, Corrected: r.V, Value: math.NaN(), Status: "ok"}
		if q := res.QA; q != nil && i < len(q.Status) {
			m.Corrected, m.Status = q.Corrected[i], q.Status[i].String()
			if i < len(q.Notes) {
				m.Notes = strings.Join(q.Notes[i], "; ")
			}
		}
		if i < len(res.Values) {
			m.Value = res.Values[i]
		}
		out[i] = m
	}
	return out
}

// fmtNum writes v as a plain decimal (no exponent) in the shortest form
// that reads back exactly.
func fmtNum(v float64) string { return strconv.FormatFloat(v, 'f', -1, 64) }
