package tui

import (
	"math"
	"sort"

	"isofield/interp"
	"isofield/survey/analysis"
	"isofield/survey/criteria"
	"isofield/survey/pipeline"
	"isofield/survey/qa"
	"isofield/tui/mapview"
)

// scene is what the UI shows of one pipeline result, derived once when the
// result arrives: map data, zones, legend and the readings' marks.
type scene struct {
	res       *pipeline.Result
	data      *mapview.Data
	unit      string
	zones     []zoneInfo
	zoneOf    []int32 // per grid node: index into zones, -1 outside
	criterion string
	cautions  []string
	notes     []string
	threshold float64 // field threshold in unit per metre (0: none)
	near      *analysis.NearIndex
	stats     readingStats // for the status line and the readings table
	stepLimit float64      // tolerable step voltage in unit (0: none)

	// How the screen shows potentials (legend, readout, profile, the
	// table's corrected values), fields and step voltages: one unit
	// each, chosen from the scene's range (displayUnit).
	vUnit, eUnit, stepUnit dispUnit
}

// zoneInfo is one flagged zone, ranked by severity (rank 1 first).
type zoneInfo struct {
	Rank         int
	Label        string  // what the flag means (from the analysis)
	Unit         string  // unit of Peak
	Area         float64 // m²
	CX, CY       float64 // centroid
	PeakX, PeakY float64
	Peak         float64
	Nodes        int
	disp         dispUnit // how Peak is shown
}

// shownPeak is the zone's peak with its unit, as the screen shows it.
func (z zoneInfo) shownPeak() string {
	if z.disp.name == "" { // not chosen (zones made by hand)
		return num(z.Peak) + " " + z.Unit
	}
	return z.disp.with(z.Peak)
}

// newScene derives a scene from res. cfg is the configuration that made
// it. The analysis supplies bands, zones, suggestions and the criterion;
// without one (hand-made results in tests) the scene derives bands and
// field zones itself.
func newScene(res *pipeline.Result, cfg pipeline.Config) *scene {
	sc := &scene{res: res, unit: res.Survey.Unit.String(), threshold: cfg.Criteria.FieldThreshold, notes: res.Notes}
	g := res.Grid
	field := mapview.NiceBands(0, mapview.FieldMax(g), 0)
	field.Scale = mapview.Sequential
	pts := readingPoints(res)
	var pot mapview.Bands
	var flagged []bool
	if a := res.Analysis; a != nil {
		pot = mapview.NiceBands(a.Min, a.Max, a.Interval)
		flagged = a.Flagged
		sc.zones, sc.zoneOf = zonesFrom(a)
		sc.threshold = a.FieldThreshold
		for _, s := range a.Suggestions {
			pts = append(pts, mapview.Point{X: s.X, Y: s.Y, Kind: mapview.KindSuggestion})
		}
		if a.Criterion != nil {
			sc.cautions = a.Criterion.Cautions
			if a.Criterion.Step {
				sc.stepLimit = a.Criterion.StepLimit
			}
		}
		sc.notes = append(append([]string(nil), sc.notes...), a.Notes...)
	} else {
		lo, hi := mapview.Range(g)
		pot = mapview.NiceBands(lo, hi, cfg.Interval)
		flagged = fieldFlags(g, sc.threshold)
		sc.zones, sc.zoneOf = findZones(g, flagged)
	}
	if len(sc.cautions) == 0 {
		sc.cautions = criteria.Cautions(cfg.Criteria.Name())
	}
	sc.data = mapview.NewData(g, pot, field, flagged, pts)
	sc.near = readingIndex(res.Survey.Readings)
	sc.stats = measureReadings(res)
	sc.chooseUnits(pot, field)
	if a := res.Analysis; a != nil {
		sc.criterion = criterionOf(a.Criterion, sc.threshold, sc.unit, sc.eUnit)
	} else {
		sc.criterion = criterionText(cfg, sc.eUnit)
	}
	return sc
}

// chooseUnits picks the display units: potentials from the bands and the
// corrected readings (so that the readout, the legend and the table
// agree), fields from their bands and the threshold, step voltages from
// the tolerable one, and each zone's peak from the peaks of its kind.
func (sc *scene) chooseUnits(pot, field mapview.Bands) {
	lo, hi := sc.stats.corrLo, sc.stats.corrHi
	if n := len(pot.Edges); n > 0 {
		lo, hi = min(lo, pot.Edges[0]), max(hi, pot.Edges[n-1])
	}
	sc.vUnit = displayUnit(sc.unit, lo, hi)
	fmax := sc.threshold
	if n := len(field.Edges); n > 0 {
		fmax = max(fmax, field.Edges[n-1])
	}
	sc.eUnit = displayUnit(sc.unit+"/m", 0, fmax)
	sc.stepUnit = sc.vUnit
	if sc.stepLimit > 0 {
		sc.stepUnit = displayUnit(sc.unit, sc.stepLimit, sc.stepLimit)
	}
	sc.stats = sc.stats.withUnits(sc.stats.origUnit, sc.vUnit)
	peak := map[string]float64{}
	for i := range sc.zones {
		if sc.zones[i].Unit == "" {
			sc.zones[i].Unit = sc.unit + "/m"
		}
		u := sc.zones[i].Unit
		peak[u] = max(peak[u], math.Abs(sc.zones[i].Peak))
	}
	for i := range sc.zones {
		switch u := sc.zones[i].Unit; u {
		case sc.unit:
			sc.zones[i].disp = displayUnit(u, 0, max(peak[u], hi, -lo))
		case sc.unit + "/m":
			sc.zones[i].disp = displayUnit(u, 0, max(peak[u], fmax))
		default:
			sc.zones[i].disp = displayUnit(u, 0, peak[u])
		}
	}
}

// zonesFrom converts the analysis' ranked zones.
func zonesFrom(a *analysis.Result) ([]zoneInfo, []int32) {
	zs := make([]zoneInfo, len(a.Zones))
	for i, z := range a.Zones {
		zs[i] = zoneInfo{Rank: z.Rank, Label: z.Label, Unit: z.Unit, Area: z.AreaM2,
			CX: z.CentroidX, CY: z.CentroidY, PeakX: z.PeakX, PeakY: z.PeakY, Peak: z.Peak, Nodes: z.Nodes}
	}
	if a.NodeZone == nil {
		return zs, nil
	}
	of := make([]int32, len(a.NodeZone))
	for k, z := range a.NodeZone {
		of[k] = int32(z)
	}
	return zs, of
}

// readingPoints returns the map marks of the readings by QA status.
func readingPoints(res *pipeline.Result) []mapview.Point {
	s := res.Survey
	pts := make([]mapview.Point, 0, len(s.Readings))
	for i, r := range s.Readings {
		k := mapview.KindReading
		if res.QA != nil && i < len(res.QA.Status) {
			switch res.QA.Status[i] {
			case qa.Suspect:
				k = mapview.KindSuspect
			case qa.Excluded:
				k = mapview.KindExcluded
			}
		}
		pts = append(pts, mapview.Point{X: r.X, Y: r.Y, Kind: k})
	}
	return pts
}

// fieldFlags marks unmasked nodes whose |∇V| reaches t (none when t ≤ 0).
func fieldFlags(g *interp.Grid, t float64) []bool {
	if g == nil || !(t > 0) {
		return nil
	}
	f := make([]bool, g.Len())
	for k := range f {
		f[k] = !g.Mask[k] && math.Hypot(g.GX[k], g.GY[k]) >= t
	}
	return f
}

// findZones groups flagged nodes into 8-connected zones ranked by their
// peak field.
func findZones(g *interp.Grid, flagged []bool) ([]zoneInfo, []int32) {
	if g == nil || flagged == nil {
		return nil, nil
	}
	of := make([]int32, g.Len())
	for k := range of {
		of[k] = -1
	}
	var zones []zoneInfo
	stack := make([]int, 0, 64)
	for k0, f := range flagged {
		if !f || of[k0] >= 0 {
			continue
		}
		id := int32(len(zones))
		z := zoneInfo{}
		stack = append(stack[:0], k0)
		of[k0] = id
		for len(stack) > 0 {
			k := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			z.add(g, k)
			stack = pushNeighbours(g, flagged, of, id, k, stack)
		}
		z.CX /= float64(z.Nodes)
		z.CY /= float64(z.Nodes)
		zones = append(zones, z)
	}
	return rankZones(zones, of)
}

func (z *zoneInfo) add(g *interp.Grid, k int) {
	x, y := g.Node(k%g.NX, k/g.NX)
	z.Nodes++
	z.Area += g.DX * g.DY
	z.CX += x
	z.CY += y
	if m := math.Hypot(g.GX[k], g.GY[k]); m > z.Peak {
		z.Peak, z.PeakX, z.PeakY = m, x, y
	}
}

func pushNeighbours(g *interp.Grid, flagged []bool, of []int32, id int32, k int, stack []int) []int {
	i, j := k%g.NX, k/g.NX
	for dj := -1; dj <= 1; dj++ {
		for di := -1; di <= 1; di++ {
			ni, nj := i+di, j+dj
			if ni < 0 || nj < 0 || ni >= g.NX || nj >= g.NY {
				continue
			}
			if n := g.Index(ni, nj); flagged[n] && of[n] < 0 {
				of[n] = id
				stack = append(stack, n)
			}
		}
	}
	return stack
}

// rankZones orders zones by peak (largest first), renumbers the node map
// and sets ranks.
func rankZones(zones []zoneInfo, of []int32) ([]zoneInfo, []int32) {
	order := make([]int, len(zones))
	for i := range order {
		order[i] = i
	}
	sort.SliceStable(order, func(a, b int) bool { return zones[order[a]].Peak > zones[order[b]].Peak })
	newID := make([]int32, len(zones))
	out := make([]zoneInfo, len(zones))
	for r, old := range order {
		newID[old] = int32(r)
		out[r] = zones[old]
		out[r].Rank = r + 1
	}
	for k, z := range of {
		if z >= 0 {
			of[k] = newID[z]
		}
	}
	return out, of
}
