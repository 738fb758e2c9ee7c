package analysis

import (
	"context"
	"fmt"
	"math"

	"isofield/interp"
	"isofield/interp/contour"
	"isofield/survey/criteria"
)

// Input is what Analyze works on.
type Input struct {
	Grid  *interp.Grid       // evaluated grid (values, gradients, mask)
	Model interp.Interpolant // the fitted surface, for step voltage and profiles
	// X, Y, V are the readings used in the fit (corrected values).
	X, Y, V []float64
	// Index maps each used reading to its index in the survey.
	Index    []int
	Unit     string // "V" or "mV"
	Criteria criteria.Settings
	// Interval is the contour interval (0: automatic nice interval).
	Interval float64
	// Suggest is how many infill points to suggest (0: none).
	Suggest int
	// Progress, if not nil, is called with the work done out of a total
	// (arbitrary units), one call at a time but from any goroutine.
	Progress func(done, total int)
}

// Result is the analysis of one gridded survey. Per-node slices have one
// entry per grid node in the grid's index order (j*NX + i); per-cell ones
// (NX-1)*(NY-1) entries (see package contour). Masked nodes hold NaN (or -1
// for indexes). Potentials are in Unit (U), fields in U per metre, lengths
// and coordinates in metres, areas in m².
type Result struct {
	Unit      string
	Criterion *criteria.Criterion

	// Interval is the contour interval used; Levels the contour levels,
	// multiples of Interval inside (Min, Max), the usable value range.
	Interval float64
	Levels   []float64
	Min, Max float64
	// NodeBand and CellBand give each node's and cell's band: b means b
	// levels lie at or below the value (see contour.Band); -1 masked.
	NodeBand []int
	CellBand []int
	// Contours are the equipotential polylines; the zero line of a signed
	// survey has Zero set.
	Contours []contour.Line

	// Field is |E| = |∇V| per node. Azimuth is the direction E = −∇V
	// points, in degrees clockwise from grid north (+y), NaN where the
	// field vanishes.
	Field   []float64
	Azimuth []float64
	// Arrows sample the field on a coarse sub-grid for drawing.
	Arrows []Arrow
	// FieldThreshold is the field threshold in effect (U/m; 0: none);
	// for the automatic threshold of the cp and sp presets, the value
	// computed from the field.
	FieldThreshold float64

	// Step is the step voltage per node in U (grounding preset, else nil):
	// see StepVoltage for the sampling. Touch is the touch voltage |GPR −
	// V| in U at nodes within reach of the structure (NaN elsewhere; nil
	// without a GPR).
	Step  []float64
	Touch []float64

	// Flagged marks nodes that break any criterion; NodeZone gives the
	// index into Zones of the highest-ranked zone holding the node, or -1.
	Flagged  []bool
	NodeZone []int
	// Zones are the connected flagged regions, ranked (Zones[0] is the most
	// severe).
	Zones []Zone
	// Classes are the areas of the preset's potential classes (concrete
	// bands, cp criterion met or not), nil for presets without classes.
	Classes []ClassArea
	// Cumulative is the cumulative frequency of the gridded readings'
	// values (RILEM TC 154-EMC's statistical view).
	Cumulative []CumPoint
	// Suggestions are the infill points, best first.
	Suggestions []Suggestion
	// Notes are plain-language remarks made during the analysis.
	Notes []string
}

// Analyze computes bands, contours, field measures, zones, classes and
// suggestions. It returns an error for invalid criteria settings, a grid
// whose slices do not match its size, or a cancelled ctx.
func Analyze(ctx context.Context, in Input) (*Result, error) {
	g := in.Grid
	if g == nil || len(g.V) != g.Len() || len(g.GX) != g.Len() || len(g.GY) != g.Len() || len(g.Mask) != g.Len() {
		return nil, fmt.Errorf("analysis: grid missing or its slices do not match its size")
	}
	if len(in.X) != len(in.Y) || len(in.X) != len(in.V) || len(in.Index) != len(in.X) {
		return nil, fmt.Errorf("analysis: reading slices of different lengths")
	}
	crit, err := criteria.Resolve(in.Criteria, in.Unit)
	if err != nil {
		return nil, fmt.Errorf("analysis: %w", err)
	}
	if in.Progress == nil {
		in.Progress = func(int, int) {}
	}
	r := &Result{Unit: in.Unit, Criterion: crit}
	if err := r.bands(ctx, g, in.Interval); err != nil {
		return nil, err
	}
	r.field(g)
	in.Progress(progressStep0, progressTotal)
	if err := r.stepTouch(ctx, in, crit); err != nil {
		return nil, err
	}
	in.Progress(progressStep1, progressTotal)
	r.flag(g, in, crit)
	r.classes(g, crit)
	r.Cumulative = Cumulative(in.V)
	if in.Suggest > 0 {
		r.Suggestions = Suggest(g, in, r.Step, in.Suggest)
	}
	in.Progress(progressTotal, progressTotal)
	return r, nil
}

// Progress units of Analyze: bands and field up to progressStep0, the step
// pass (grounding) up to progressStep1, zones and suggestions the rest.
const (
	progressStep0 = 10
	progressStep1 = 85
	progressTotal = 100
)

// bands sets the interval, levels, bands and contour lines.
func (r *Result) bands(ctx context.Context, g *interp.Grid, interval float64) error {
	lo, hi, ok := contour.Range(g)
	r.Min, r.Max = math.NaN(), math.NaN()
	if !ok {
		r.Notes = append(r.Notes, "no usable grid node: nothing to contour")
		r.NodeBand = contour.NodeBands(g, nil)
		r.CellBand = contour.CellBands(g, nil)
		return nil
	}
	r.Min, r.Max = lo, hi
	r.Interval = interval
	if !(interval > 0) || math.IsInf(interval, 0) {
		r.Interval = contour.NiceInterval(lo, hi)
	}
	r.Levels = contour.Levels(lo, hi, r.Interval)
	if n := len(r.Levels) + 1; n > 4*contour.MaxBands {
		r.Notes = append(r.Notes, fmt.Sprintf("interval %g %s gives %d bands", r.Interval, r.Unit, n))
	}
	r.NodeBand = contour.NodeBands(g, r.Levels)
	r.CellBand = contour.CellBands(g, r.Levels)
	var err error
	r.Contours, err = contour.Lines(ctx, g, r.Levels)
	return err
}

// BandRange returns the value range of band b: from the level below it (or
// Min for band 0) to the level above it (or Max for the last band). It
// returns NaNs for a band that does not exist.
func (r *Result) BandRange(b int) (lo, hi float64) {
	if b < 0 || b > len(r.Levels) || math.IsNaN(r.Min) {
		return math.NaN(), math.NaN()
	}
	lo, hi = r.Min, r.Max
	if b > 0 {
		lo = r.Levels[b-1]
	}
	if b < len(r.Levels) {
		hi = r.Levels[b]
	}
	return lo, hi
}
