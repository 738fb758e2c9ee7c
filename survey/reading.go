package survey

import (
	"fmt"
	"time"
)

// Unit is the unit of the survey's potentials.
type Unit int

// The potential units.
const (
	Volt Unit = iota
	Millivolt
)

// String returns "V" or "mV", the spelling used in column names.
func (u Unit) String() string {
	if u == Millivolt {
		return "mV"
	}
	return "V"
}

// PerVolt returns how many of u make one volt (1 or 1000).
func (u Unit) PerVolt() float64 {
	if u == Millivolt {
		return 1000
	}
	return 1
}

// ParseUnit reads "V" or "mV" (case-insensitive for the m/M prefix only as
// written in field notes: "v", "mv").
func ParseUnit(s string) (Unit, error) {
	switch s {
	case "V", "v":
		return Volt, nil
	case "mV", "mv", "MV":
		return Millivolt, nil
	}
	return Volt, fmt.Errorf("unknown potential unit %q (want V or mV)", s)
}

// Reading is one potential measured at one surveyed point.
type Reading struct {
	ID      string  // point, station or reading id as written; may be empty
	X, Y    float64 // metres in the survey's coordinate system
	V       float64 // potential as read, in the survey's Unit
	Time    time.Time
	HasTime bool
	Line    string // survey line, if the file has one
	Station string // station along the line, if the file has one
	Note    string
	// TestCurrent is the injected test current in amperes stated for this
	// reading (0 when none).
	TestCurrent float64
	// Reference names the reference electrode the potential was read
	// against, as written in the file (a reference column or the file's
	// reference= setting); empty when the file does not say.
	Reference string

	File   int // index into Survey.Files
	Line0  int // 1-based line number of the record in its file
	Fields []string
}

// FileInfo describes one input file.
type FileInfo struct {
	Path   string
	SHA256 string // hex digest of the file's bytes as read
	Header []string
	// Roles says what the loader read from each header column: "x", "y",
	// "potential", "id", "time", "date", "line", "station", "note",
	// "test current", "latitude", "longitude" or "reference"; "" for a
	// column it did not use.
	Roles        []string
	Delimiter    rune
	DecimalComma bool
	Unit         Unit // unit the file's potentials were written in
	Readings     int
	// Geographic is true when the file gave latitude and longitude.
	Geographic bool
	// FromLineStation is true when x and y were derived from line and
	// station numbers and spacings.
	FromLineStation bool
}

// GeoRef relates local metres to WGS 84 latitude and longitude for surveys
// read from geographic coordinates.
type GeoRef struct {
	Lat0, Lon0 float64 // origin (degrees) that maps to local (0, 0)
}

// Survey is the set of readings from one or more files, in input order.
type Survey struct {
	Name     string
	Unit     Unit
	Readings []Reading
	Files    []FileInfo
	// Geo is non-nil when coordinates were converted from latitude and
	// longitude.
	Geo *GeoRef
	// Notes are plain-language remarks made while loading (fallbacks taken,
	// columns ignored).
	Notes []string
}

// Extent returns the bounding box of the readings' positions.
func (s *Survey) Extent() (xmin, ymin, xmax, ymax float64) {
	if len(s.Readings) == 0 {
		return 0, 0, 0, 0
	}
	r0 := s.Readings[0]
	xmin, xmax, ymin, ymax = r0.X, r0.X, r0.Y, r0.Y
	for _, r := range s.Readings[1:] {
		xmin, xmax = min(xmin, r.X), max(xmax, r.X)
		ymin, ymax = min(ymin, r.Y), max(ymax, r.Y)
	}
	return xmin, ymin, xmax, ymax
}
