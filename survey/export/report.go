package export

import (
	"bytes"
	_ "embed"
	"encoding/base64"
	"fmt"
	"html/template"
	"io"
	"strconv"
	"strings"
	"time"

	"isofield/survey"
)

//go:embed tmpl/report.html
var reportHTML string

// WriteReport writes the survey report: one self-contained HTML file (the
// maps are embedded as data URIs, no script, no external resource) that
// opens in any browser offline and prints to clean A4 pages. Every text
// that comes from the input is escaped by html/template.
func (b *Bundle) WriteReport(w io.Writer) error {
	t, err := template.New("report").Funcs(template.FuncMap{"statusText": statusText}).Parse(reportHTML)
	if err != nil {
		return fmt.Errorf("report template: %w", err) // a bug in the embedded template
	}
	v, err := b.reportView()
	if err != nil {
		return err
	}
	if err := t.Execute(w, v); err != nil {
		return fmt.Errorf("writing report: %w", err)
	}
	return nil
}

// reportView is what the template shows, formatted.
type reportView struct {
	B                      *Bundle
	Preset, Made           string
	Files                  []reportFile
	Count, Used            int
	Extent, Positions      string
	Dates, Interval        string
	Rules                  []string
	Items                  []reportItem
	PotentialMap, FieldMap template.URL
	Cumulative             template.URL
	Zones                  []reportZone
	Classes                []reportClass
	Infill                 []reportInfill
}

type reportFile struct {
	Path, Unit, SHA256 string
	Readings           int
}

type reportItem struct {
	ID, Source, X, Y, Original, Corrected, Status, Notes string
}

type reportZone struct {
	Rank                                      int
	Label, Area, Centroid, Peak, PeakAt, Mean string
	Readings, Nearest                         string
}

type reportClass struct{ Name, Area, Share string }

type reportInfill struct {
	Rank          int
	ID, X, Y, Why string
}

// reportView formats the bundle for the template.
func (b *Bundle) reportView() (*reportView, error) {
	v := &reportView{B: b, Preset: b.presetTitle(), Count: len(b.Readings), Rules: b.CriterionLines(),
		Positions: b.positionSystem(), Interval: fmtNum(b.Interval)}
	if !b.Made.IsZero() {
		v.Made = b.Made.UTC().Format("2006-01-02 15:04 UTC")
	}
	for _, m := range b.Readings {
		if m.Value == m.Value {
			v.Used++
		}
	}
	b.describeSurvey(v)
	for _, m := range b.QA.Items {
		v.Items = append(v.Items, reportItem{ID: m.ID, Source: b.source(m.Index), X: f3(m.X), Y: f3(m.Y),
			Original: sig6(m.Original), Corrected: sig6(m.Corrected), Status: m.Status, Notes: m.Notes})
	}
	var err error
	if v.PotentialMap, err = b.svgURI(PotentialMap); err != nil {
		return nil, err
	}
	if v.FieldMap, err = b.svgURI(FieldMap); err != nil {
		return nil, err
	}
	if len(b.Classes) > 0 {
		if v.Cumulative, err = b.cumulativeSVG(); err != nil {
			return nil, err
		}
	}
	b.describeResults(v)
	return v, nil
}

// describeSurvey fills the files, extent and dates.
func (b *Bundle) describeSurvey(v *reportView) {
	if s := b.Survey; s != nil {
		for _, f := range s.Files {
			v.Files = append(v.Files, reportFile{Path: f.Path, Unit: f.Unit.String(), SHA256: f.SHA256, Readings: f.Readings})
		}
		x0, y0, x1, y1 := s.Extent()
		v.Extent = fmt.Sprintf("x %s to %s m, y %s to %s m (%s m × %s m)", f3(x0), f3(x1), f3(y0), f3(y1), f3(x1-x0), f3(y1-y0))
		v.Dates = dateRange(s.Readings)
	}
}

// describeResults fills the zones, classes and suggestions.
func (b *Bundle) describeResults(v *reportView) {
	for _, z := range b.Zones {
		rz := reportZone{Rank: z.Rank, Label: z.Label, Area: f1(z.AreaM2),
			Centroid: f3(z.CentroidX) + ", " + f3(z.CentroidY), Peak: sig6(z.Peak) + " " + z.Unit,
			PeakAt: f3(z.PeakX) + ", " + f3(z.PeakY), Mean: sig6(z.Mean) + " " + z.Unit}
		var names []string
		for _, i := range z.Readings {
			names = append(names, b.readingName(i))
		}
		rz.Readings = strings.Join(names, ", ")
		if z.NearestReading >= 0 {
			rz.Nearest = fmt.Sprintf("%s, %s m away", b.readingName(z.NearestReading), f1(z.NearestDist))
		}
		v.Zones = append(v.Zones, rz)
	}
	for _, c := range b.Classes {
		v.Classes = append(v.Classes, reportClass{Name: c.Class.Name, Area: f1(c.AreaM2),
			Share: strconv.FormatFloat(100*c.Share, 'f', 1, 64) + " %"})
	}
	for i, s := range b.Infill {
		v.Infill = append(v.Infill, reportInfill{Rank: i + 1, ID: s.ID, X: f3(s.X), Y: f3(s.Y), Why: s.Why})
	}
}

// svgURI renders a map as an SVG data URI.
func (b *Bundle) svgURI(kind MapKind) (template.URL, error) {
	var buf bytes.Buffer
	if err := b.WriteMapSVG(&buf, kind); err != nil {
		return "", err
	}
	// The URI is made here from our own SVG, so it is safe to mark.
	return template.URL("data:image/svg+xml;base64," + base64.StdEncoding.EncodeToString(buf.Bytes())), nil
}

// source names a reading's file and line.
func (b *Bundle) source(i int) string {
	s := b.Survey
	if s == nil || i < 0 || i >= len(s.Readings) {
		return ""
	}
	r := s.Readings[i]
	if r.File >= 0 && r.File < len(s.Files) {
		return fmt.Sprintf("%s:%d", s.Files[r.File].Path, r.Line0)
	}
	return fmt.Sprintf("line %d", r.Line0)
}

// dateRange describes the readings' first and last times.
func dateRange(rs []survey.Reading) string {
	var lo, hi time.Time
	for _, r := range rs {
		if !r.HasTime {
			continue
		}
		if lo.IsZero() || r.Time.Before(lo) {
			lo = r.Time
		}
		if hi.IsZero() || r.Time.After(hi) {
			hi = r.Time
		}
	}
	if lo.IsZero() {
		return "the files give no times"
	}
	const f = "2006-01-02 15:04"
	return lo.Format(f) + " to " + hi.Format(f) + " (as written in the files)"
}

// statusText spells out a source's status code.
func statusText(s string) string {
	switch s {
	case "C":
		return "read in the source"
	case "C2":
		return "read in a secondary source"
	case "V":
		return "arithmetic checked"
	case "M":
		return "from memory, unconfirmed"
	}
	return s
}

func f1(v float64) string   { return strconv.FormatFloat(v, 'f', 1, 64) }
func f3(v float64) string   { return strconv.FormatFloat(v, 'f', 3, 64) }
func sig6(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }
