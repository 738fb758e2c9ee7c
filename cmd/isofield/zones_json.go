package main

import (
	"encoding/json"
	"io"
	"math"
	"path/filepath"

	"isofield/survey"
	"isofield/survey/analysis"
	"isofield/survey/criteria"
	"isofield/survey/pipeline"
)

// jsonReading is a reading as the zones document lists it.
type jsonReading struct {
	Index int     `json:"index"`
	ID    string  `json:"id"`
	File  string  `json:"file,omitempty"`
	Line  int     `json:"line,omitempty"`
	X     float64 `json:"x"`
	Y     float64 `json:"y"`
	Value float64 `json:"value"`
}

type jsonXY struct {
	X float64 `json:"x"`
	Y float64 `json:"y"`
}

type jsonPeak struct {
	Value float64 `json:"value"`
	X     float64 `json:"x"`
	Y     float64 `json:"y"`
}

// jsonZone is one zone of the zones document.
type jsonZone struct {
	Rank        int           `json:"rank"`
	Quantity    string        `json:"quantity"`
	Label       string        `json:"label"`
	Unit        string        `json:"unit"`
	Threshold   float64       `json:"threshold"`
	AreaM2      float64       `json:"area_m2"`
	Centroid    jsonXY        `json:"centroid"`
	BBox        [4]float64    `json:"bbox"`
	Peak        jsonPeak      `json:"peak"`
	Mean        float64       `json:"mean"`
	Severity    float64       `json:"severity"`
	Readings    []jsonReading `json:"readings"`
	Nearest     *jsonReading  `json:"nearest_reading"`
	NearestDist float64       `json:"nearest_dist_m"`
	Outline     [][2]float64  `json:"outline"`
}

// jsonZones is the document zones --json prints.
type jsonZones struct {
	Survey    string               `json:"survey"`
	Unit      string               `json:"unit"`
	Preset    string               `json:"preset"`
	Criterion string               `json:"criterion"`
	Field     float64              `json:"field_threshold"`
	Zones     []jsonZone           `json:"zones"`
	Classes   []analysis.ClassArea `json:"classes,omitempty"`
	Sources   []criteria.Source    `json:"sources"`
	Warnings  []string             `json:"warnings"`
	Cautions  []string             `json:"cautions"`
	Notes     []string             `json:"notes"`
}

// writeZonesJSON prints the zones document.
func writeZonesJSON(w io.Writer, res *pipeline.Result) error {
	a := res.Analysis
	c := a.Criterion
	doc := jsonZones{Survey: surveyName(res.Survey), Unit: a.Unit, Preset: c.Preset, Criterion: c.Title,
		Field: a.FieldThreshold, Zones: []jsonZone{}, Classes: a.Classes, Sources: c.Sources,
		Warnings: nonNil(c.Warnings), Cautions: nonNil(c.Cautions),
		Notes: nonNil(append(append([]string(nil), res.Notes...), a.Notes...))}
	for _, z := range a.Zones {
		doc.Zones = append(doc.Zones, zoneDoc(res, z))
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(doc)
}

func zoneDoc(res *pipeline.Result, z analysis.Zone) jsonZone {
	j := jsonZone{Rank: z.Rank, Quantity: z.Quantity, Label: z.Label, Unit: z.Unit, Threshold: z.Threshold,
		AreaM2: z.AreaM2, Centroid: jsonXY{z.CentroidX, z.CentroidY}, BBox: [4]float64{z.MinX, z.MinY, z.MaxX, z.MaxY},
		Peak: jsonPeak{z.Peak, z.PeakX, z.PeakY}, Mean: z.Mean, Severity: z.Severity,
		Readings: []jsonReading{}, NearestDist: z.NearestDist}
	for _, i := range z.Readings {
		j.Readings = append(j.Readings, readingDoc(res, i))
	}
	if z.NearestReading >= 0 {
		r := readingDoc(res, z.NearestReading)
		j.Nearest = &r
	}
	for _, p := range z.Outline {
		j.Outline = append(j.Outline, [2]float64{p.X, p.Y})
	}
	return j
}

// readingDoc describes survey reading i with the value that was gridded.
func readingDoc(res *pipeline.Result, i int) jsonReading {
	s := res.Survey
	r := s.Readings[i]
	d := jsonReading{Index: i, ID: readingName(s, i), Line: r.Line0, X: r.X, Y: r.Y, Value: r.V}
	if i < len(res.Values) && !math.IsNaN(res.Values[i]) {
		d.Value = res.Values[i]
	}
	if r.File >= 0 && r.File < len(s.Files) {
		d.File = filepath.Base(s.Files[r.File].Path)
	}
	return d
}

func surveyName(s *survey.Survey) string {
	if s.Name != "" || len(s.Files) == 0 {
		return s.Name
	}
	return filepath.Base(s.Files[0].Path)
}

func nonNil(s []string) []string {
	if s == nil {
		return []string{}
	}
	return s
}
