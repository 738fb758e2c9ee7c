package export

import (
	"time"

	"isofield/interp"
	"isofield/interp/contour"
	"isofield/survey"
	"isofield/survey/analysis"
	"isofield/survey/criteria"
	"isofield/survey/geo"
	"isofield/survey/qa"
)

// Bundle is everything the exports draw on, gathered once from a pipeline
// result (see FromResult) so that every output shows the same numbers.
// Tests and demos may fill one by hand; change no field after the first
// write. WriteMapSVG keeps its drawing in the bundle the first time, so
// the writers may run concurrently only once both SVG maps were drawn (All
// does so).
type Bundle struct {
	Title   string
	Unit    string // "V" or "mV"
	Version string // isofield version that made the outputs
	// Made is when the outputs were made; the zero time leaves it out
	// (golden tests).
	Made     time.Time
	Settings []Setting
	Survey   *survey.Survey
	Grid     *interp.Grid
	// Interval is the contour interval and Levels the contour levels, in
	// Unit.
	Interval float64
	Levels   []float64
	Lines    []contour.Line
	// Flagged marks the grid nodes that break a criterion (nil: none).
	Flagged []bool
	// Criterion is the preset resolved for the survey: thresholds, classes,
	// sources, warnings and cautions (nil: no analysis).
	Criterion *criteria.Criterion
	// FieldThreshold is the field threshold in effect, U/m (0: none).
	FieldThreshold float64
	Zones          []analysis.Zone
	Classes        []analysis.ClassArea
	Infill         []analysis.Suggestion
	// Cumulative is the cumulative frequency of the gridded readings.
	Cumulative []analysis.CumPoint
	Readings   []Mark
	Cautions   []string
	QA         QASummary
	Notes      []string
	// Plane converts local metres back to WGS 84 when the survey was read
	// from latitude and longitude; nil for local or projected metres.
	Plane *geo.Plane

	qa  *qa.Result // for the cleaned readings and the log (nil: not written)
	dpi int        // PNG resolution (0: MapDPI)
	svg map[MapKind][]byte
}

// Setting is one setting that made the outputs, as shown to the reader.
type Setting struct {
	Name, Value string
	// Source names the published origin of the value, or "practice" or
	// "from memory"; empty for plain choices such as the grid spacing.
	Source string
}

// Mark is one reading as the maps and exports show it.
type Mark struct {
	Index     int // index into the survey's readings
	ID        string
	X, Y      float64
	Original  float64 // as read, in Unit
	Corrected float64 // after the checks, in Unit
	Value     float64 // value gridded (NaN when not used)
	Status    string  // "ok", "suspect" or "excluded"
	Notes     string  // reasons, "; "-separated
}

// QASummary is the checks' log in brief.
type QASummary struct {
	Counts map[string]int // readings per status
	// Steps counts logged steps by kind, in the order kinds first appear.
	Steps []KindCount
	// Items are the suspect and excluded readings with their reasons.
	Items []Mark
	Lines []string // survey-wide findings: drift, loop closure, notes
}

// KindCount is the number of logged steps of one kind.
type KindCount struct {
	Kind  string
	Count int
}
