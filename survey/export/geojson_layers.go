package export

import (
	"fmt"
	"io"
)

type contourProps struct {
	Level     num    `json:"level"`
	Unit      string `json:"unit"`
	Zero      bool   `json:"zero"`
	Closed    bool   `json:"closed"`
	Positions string `json:"positions"`
}

// WriteContoursGeoJSON writes the equipotential lines as LineString
// features with their level (RFC 7946 §3.1.4). Lines of fewer than two
// points are left out.
func (b *Bundle) WriteContoursGeoJSON(w io.Writer) error {
	fc := b.collection("equipotential lines")
	for i, l := range b.Lines {
		if len(l.Points) < 2 {
			continue
		}
		fc.Features = append(fc.Features, feature{
			Type: "Feature", ID: fmt.Sprintf("line-%d", i+1),
			Geometry: geometry{Type: "LineString", Coordinates: b.positions(l.Points)},
			Properties: contourProps{Level: num(l.Level), Unit: b.Unit, Zero: l.Zero, Closed: l.Closed,
				Positions: b.positionSystem()},
		})
	}
	return fc.write(w)
}

type zoneProps struct {
	Rank           int       `json:"rank"`
	Quantity       string    `json:"quantity"`
	Label          string    `json:"label"`
	Unit           string    `json:"unit"`
	Threshold      num       `json:"threshold"`
	Peak           num       `json:"peak"`
	PeakAt         []float64 `json:"peak_position"`
	Mean           num       `json:"mean"`
	AreaM2         num       `json:"area_m2"`
	Nodes          int       `json:"nodes"`
	Centroid       []float64 `json:"centroid"`
	Severity       num       `json:"severity"`
	Readings       []string  `json:"readings"`
	NearestReading string    `json:"nearest_reading"`
	NearestDist    num       `json:"nearest_reading_m"`
	Positions      string    `json:"positions"`
}

// WriteZonesGeoJSON writes the flagged zones as Polygon features (RFC 7946
// §3.1.6: exterior ring counter-clockwise, holes clockwise) with their
// statistics; "unit" is the unit of threshold, peak and mean. Centroid and
// peak position are positions in the file's system.
func (b *Bundle) WriteZonesGeoJSON(w io.Writer) error {
	fc := b.collection("flagged zones")
	for _, z := range b.Zones {
		if len(z.Outline) < 4 {
			continue
		}
		rings := [][][]float64{b.positions(z.Outline)}
		for _, h := range z.Holes {
			rings = append(rings, b.positions(h))
		}
		p := zoneProps{
			Rank: z.Rank, Quantity: z.Quantity, Label: z.Label, Unit: z.Unit,
			Threshold: num(z.Threshold), Peak: num(z.Peak), PeakAt: b.position(z.PeakX, z.PeakY),
			Mean: num(z.Mean), AreaM2: num(z.AreaM2), Nodes: z.Nodes,
			Centroid: b.position(z.CentroidX, z.CentroidY), Severity: num(z.Severity),
			Readings: []string{}, NearestDist: num(z.NearestDist), Positions: b.positionSystem(),
		}
		for _, i := range z.Readings {
			p.Readings = append(p.Readings, b.readingName(i))
		}
		if z.NearestReading >= 0 {
			p.NearestReading = b.readingName(z.NearestReading)
		}
		fc.Features = append(fc.Features, feature{
			Type: "Feature", ID: fmt.Sprintf("zone-%d", z.Rank),
			Geometry: geometry{Type: "Polygon", Coordinates: rings}, Properties: p,
		})
	}
	return fc.write(w)
}

// readingName returns a reading's id, or "#n" (1-based) when it has none.
func (b *Bundle) readingName(i int) string {
	if i >= 0 && i < len(b.Readings) && b.Readings[i].ID != "" {
		return b.Readings[i].ID
	}
	return fmt.Sprintf("#%d", i+1)
}

type readingProps struct {
	ID        string `json:"id"`
	Status    string `json:"qa_status"`
	Notes     string `json:"qa_notes"`
	Original  num    `json:"potential"`
	Corrected num    `json:"potential_corrected"`
	Gridded   num    `json:"potential_gridded"`
	Unit      string `json:"unit"`
	File      string `json:"file"`
	Line      int    `json:"line"`
	Positions string `json:"positions"`
}

// WriteReadingsGeoJSON writes every reading as a Point feature (RFC 7946
// §3.1.2) with its QA status, original, corrected and gridded values.
func (b *Bundle) WriteReadingsGeoJSON(w io.Writer) error {
	fc := b.collection("readings")
	for _, m := range b.Readings {
		p := readingProps{ID: m.ID, Status: m.Status, Notes: m.Notes, Original: num(m.Original),
			Corrected: num(m.Corrected), Gridded: num(m.Value), Unit: b.Unit, Positions: b.positionSystem()}
		if s := b.Survey; s != nil && m.Index < len(s.Readings) {
			r := s.Readings[m.Index]
			p.Line = r.Line0
			if r.File >= 0 && r.File < len(s.Files) {
				p.File = s.Files[r.File].Path
			}
		}
		fc.Features = append(fc.Features, feature{
			Type: "Feature", ID: fmt.Sprintf("reading-%d", m.Index+1),
			Geometry: geometry{Type: "Point", Coordinates: b.position(m.X, m.Y)}, Properties: p,
		})
	}
	return fc.write(w)
}

type infillProps struct {
	ID        string `json:"id"`
	Rank      int    `json:"rank"`
	Score     num    `json:"score"`
	Why       string `json:"why"`
	Positions string `json:"positions"`
}

// WriteInfillGeoJSON writes the suggested infill points as Point features.
func (b *Bundle) WriteInfillGeoJSON(w io.Writer) error {
	fc := b.collection("infill suggestions")
	for i, p := range b.Infill {
		fc.Features = append(fc.Features, feature{
			Type: "Feature", ID: fmt.Sprintf("infill-%d", i+1),
			Geometry:   geometry{Type: "Point", Coordinates: b.position(p.X, p.Y)},
			Properties: infillProps{ID: p.ID, Rank: i + 1, Score: num(p.Score), Why: p.Why, Positions: b.positionSystem()},
		})
	}
	return fc.write(w)
}
