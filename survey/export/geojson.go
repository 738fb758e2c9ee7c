package export

import (
	"encoding/json"
	"fmt"
	"io"
	"math"

	"isofield/interp/contour"
)

// The GeoJSON files follow RFC 7946. When the survey was read from latitude
// and longitude (Bundle.Plane set), positions are WGS 84 longitude and
// latitude in degrees rounded to 1e-8° (about 1 mm); otherwise they are the
// survey's own x (east) and y (north) in metres, which RFC 7946 §4 does not
// define, and the file says so in its "isofield" member and in every
// feature's "positions" property. Readers that assume longitude and
// latitude must then be told the survey's coordinate system.

// Position systems named in the GeoJSON files.
const (
	PositionsWGS84 = "WGS 84 longitude, latitude (degrees)"
	PositionsLocal = "survey x (east), y (north) in metres; not WGS 84"
)

// geoDegreesScale rounds degrees to 1e-8 (about 1 mm on the ground); RFC
// 7946 §11.2 notes that 6 decimals (about 10 cm) often suffice.
const geoDegreesScale = 1e8

// featureCollection is a GeoJSON FeatureCollection (RFC 7946 §3.3) with
// one foreign member, "isofield" (§6.1).
type featureCollection struct {
	Type     string    `json:"type"`
	Meta     fileMeta  `json:"isofield"`
	BBox     []float64 `json:"bbox,omitempty"`
	Features []feature `json:"features"`
}

// fileMeta says what made the file and how to read its positions.
type fileMeta struct {
	Version   string            `json:"version"`
	Content   string            `json:"content"`
	Positions string            `json:"positions"`
	Unit      string            `json:"unit"`
	Settings  map[string]string `json:"settings"`
}

type feature struct {
	Type       string   `json:"type"`
	ID         string   `json:"id,omitempty"`
	Geometry   geometry `json:"geometry"`
	Properties any      `json:"properties"`
}

type geometry struct {
	Type        string `json:"type"`
	Coordinates any    `json:"coordinates"`
}

// num is a float64 that encodes NaN and infinities as JSON null.
type num float64

func (n num) MarshalJSON() ([]byte, error) {
	f := float64(n)
	if math.IsNaN(f) || math.IsInf(f, 0) {
		return []byte("null"), nil
	}
	return json.Marshal(f)
}

// position returns the GeoJSON position of local point (x, y).
func (b *Bundle) position(x, y float64) []float64 {
	if b.Plane == nil {
		return []float64{x, y}
	}
	lat, lon := b.Plane.Inverse(x, y)
	return []float64{math.Round(lon*geoDegreesScale) / geoDegreesScale, math.Round(lat*geoDegreesScale) / geoDegreesScale}
}

func (b *Bundle) positions(pts []contour.Point) [][]float64 {
	out := make([][]float64, len(pts))
	for i, p := range pts {
		out[i] = b.position(p.X, p.Y)
	}
	return out
}

func (b *Bundle) positionSystem() string {
	if b.Plane != nil {
		return PositionsWGS84
	}
	return PositionsLocal
}

// collection starts a FeatureCollection about content.
func (b *Bundle) collection(content string) *featureCollection {
	set := make(map[string]string, len(b.Settings))
	for _, s := range b.Settings {
		set[s.Name] = s.Value
	}
	return &featureCollection{
		Type: "FeatureCollection",
		Meta: fileMeta{Version: b.Version, Content: content, Positions: b.positionSystem(),
			Unit: b.Unit, Settings: set},
		Features: []feature{},
	}
}

// write sets the collection's bbox (RFC 7946 §5) and encodes it.
func (fc *featureCollection) write(w io.Writer) error {
	fc.BBox = collectionBBox(fc.Features)
	enc := json.NewEncoder(w)
	enc.SetEscapeHTML(false)
	if err := enc.Encode(fc); err != nil {
		return fmt.Errorf("writing geojson: %w", err)
	}
	return nil
}

// collectionBBox returns [west, south, east, north] over every position,
// or nil when there is none.
func collectionBBox(fs []feature) []float64 {
	bb := []float64{math.Inf(1), math.Inf(1), math.Inf(-1), math.Inf(-1)}
	var visit func(c any)
	visit = func(c any) {
		switch c := c.(type) {
		case []float64:
			bb[0], bb[1] = min(bb[0], c[0]), min(bb[1], c[1])
			bb[2], bb[3] = max(bb[2], c[0]), max(bb[3], c[1])
		case [][]float64:
			for _, p := range c {
				visit(p)
			}
		case [][][]float64:
			for _, r := range c {
				visit(r)
			}
		}
	}
	for _, f := range fs {
		visit(f.Geometry.Coordinates)
	}
	if bb[0] > bb[2] {
		return nil
	}
	return bb
}
