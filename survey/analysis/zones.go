package analysis

import (
	"fmt"
	"math"
	"slices"
	"sort"

	"isofield/interp"
	"isofield/interp/contour"
	"isofield/survey/criteria"
)

// Quantities a zone can be flagged on.
const (
	QuantityField     = "field"     // |E| at or above the field threshold
	QuantityStep      = "step"      // step voltage above the tolerable one
	QuantityTouch     = "touch"     // touch voltage above the tolerable one
	QuantityPotential = "potential" // potential beyond a class limit
)

// Zone is one 8-connected region of nodes flagged on one quantity. Each
// node stands for the DX × DY cell centred on it.
type Zone struct {
	// Rank is 1 for the most severe zone.
	Rank     int    `json:"rank"`
	Quantity string `json:"quantity"`
	// Label says what the flag means and where its threshold comes from.
	Label string `json:"label"`
	// Unit is the unit of Threshold, Peak and Mean ("mV/m", "V"...).
	Unit      string  `json:"unit"`
	Threshold float64 `json:"threshold"`
	Nodes     int     `json:"nodes"`
	AreaM2    float64 `json:"area_m2"`
	CentroidX float64 `json:"centroid_x"`
	CentroidY float64 `json:"centroid_y"`
	MinX      float64 `json:"min_x"`
	MinY      float64 `json:"min_y"`
	MaxX      float64 `json:"max_x"`
	MaxY      float64 `json:"max_y"`
	// Peak is the most extreme value (the largest, or the most negative for
	// a potential flagged below a limit) and where it lies; Mean the mean.
	Peak  float64 `json:"peak"`
	PeakX float64 `json:"peak_x"`
	PeakY float64 `json:"peak_y"`
	Mean  float64 `json:"mean"`
	// Readings are the survey indexes of the readings whose nearest node
	// lies in the zone. NearestReading is the survey index of the reading
	// nearest the peak (-1 without readings) and NearestDist its distance.
	Readings       []int   `json:"readings"`
	NearestReading int     `json:"nearest_reading"`
	NearestDist    float64 `json:"nearest_dist_m"`
	// Severity is the exceedance at the peak (Peak/Threshold for field,
	// step and touch; 1 + |Peak − Threshold| / scale for potentials, scale
	// being |Threshold| or else the value range) times AreaM2. Zones are
	// ranked touch, step, then the others, each by Severity.
	Severity float64 `json:"severity"`
	// Outline is the zone's outer ring (counter-clockwise, closed), Holes
	// its holes (clockwise).
	Outline []contour.Point   `json:"outline"`
	Holes   [][]contour.Point `json:"holes,omitempty"`

	nodes []int // grid indexes of the zone's nodes
}

// NodeIndexes returns the grid indexes of the zone's nodes, ascending.
func (z *Zone) NodeIndexes() []int { return z.nodes }

// flagRule is one criterion applied to per-node values.
type flagRule struct {
	quantity, label, unit string
	values                []float64
	threshold             float64
	below                 bool // flag values below the threshold, else at or above
	strict                bool
}

func (f flagRule) hit(v float64) bool {
	switch {
	case math.IsNaN(v):
		return false
	case f.below:
		return v < f.threshold
	case f.strict:
		return v > f.threshold
	}
	return v >= f.threshold
}

// rules lists the criterion's flag rules for this grid.
func (r *Result) rules(g *interp.Grid, c *criteria.Criterion) []flagRule {
	var rs []flagRule
	fu := r.Unit + "/m"
	r.FieldThreshold = c.Field
	if c.FieldAuto {
		r.FieldThreshold = percentile(r.Field, criteria.AutoFieldPercentile)
	}
	if t := r.FieldThreshold; t > 0 && !math.IsNaN(t) {
		rs = append(rs, flagRule{QuantityField, fmt.Sprintf("field ≥ %.4g %s (%s)", t, fu, c.FieldLabel), fu, r.Field, t, false, false})
	}
	pot := nodeValues(g)
	if c.HasBelow {
		rs = append(rs, flagRule{QuantityPotential, c.BelowLabel, r.Unit, pot, c.Below, true, true})
	}
	if c.HasAbove {
		rs = append(rs, flagRule{QuantityPotential, c.AboveLabel, r.Unit, pot, c.Above, false, true})
	}
	if r.Step != nil {
		rs = append(rs, flagRule{QuantityStep, fmt.Sprintf("step voltage above the tolerable %.4g V (IEEE Std 80, from memory)", c.Tolerable.StepV), r.Unit, r.Step, c.StepLimit, false, true})
	}
	if r.Touch != nil {
		rs = append(rs, flagRule{QuantityTouch, fmt.Sprintf("touch voltage above the tolerable %.4g V (IEEE Std 80, from memory)", c.Tolerable.TouchV), r.Unit, r.Touch, c.TouchLimit, false, true})
	}
	return rs
}

// nodeValues returns the grid's values with NaN at unusable nodes.
func nodeValues(g *interp.Grid) []float64 {
	v := make([]float64, g.Len())
	for k := range v {
		v[k] = math.NaN()
		if usableNode(g, k) {
			v[k] = g.V[k]
		}
	}
	return v
}

// percentile returns the p-th percentile (0..100) of the finite values by
// linear interpolation between order statistics, NaN when there are none.
func percentile(vs []float64, p float64) float64 {
	var s []float64
	for _, v := range vs {
		if finite(v) {
			s = append(s, v)
		}
	}
	if len(s) == 0 {
		return math.NaN()
	}
	slices.Sort(s)
	pos := p / 100 * float64(len(s)-1)
	i := int(pos)
	if i+1 >= len(s) {
		return s[len(s)-1]
	}
	return s[i] + (pos-float64(i))*(s[i+1]-s[i])
}

// flag applies every rule, builds and ranks the zones.
func (r *Result) flag(g *interp.Grid, in Input, c *criteria.Criterion) {
	r.Flagged = make([]bool, g.Len())
	ix := newNearIndex(in.X, in.Y)
	for _, rule := range r.rules(g, c) {
		f := make([]bool, g.Len())
		for k, v := range rule.values {
			f[k] = rule.hit(v)
			r.Flagged[k] = r.Flagged[k] || f[k]
		}
		labels, n := contour.Components(g.NX, g.NY, f)
		nodes := make([][]int, n)
		for k, l := range labels {
			if l >= 0 {
				nodes[l] = append(nodes[l], k)
			}
		}
		for _, ns := range nodes {
			r.Zones = append(r.Zones, makeZone(g, rule, ns, in, ix, r.Max-r.Min))
		}
	}
	rankZones(r.Zones)
	r.NodeZone = make([]int, g.Len())
	for k := range r.NodeZone {
		r.NodeZone[k] = -1
	}
	// Walk zones from the least severe so the most severe wins.
	for z := len(r.Zones) - 1; z >= 0; z-- {
		r.markZone(g, z)
	}
}

// markZone sets NodeZone to z for zone z's nodes.
func (r *Result) markZone(g *interp.Grid, z int) {
	for _, k := range r.Zones[z].nodes {
		r.NodeZone[k] = z
	}
}

// makeZone measures one region of flagged nodes.
func makeZone(g *interp.Grid, rule flagRule, ns []int, in Input, ix *nearIndex, span float64) Zone {
	z := Zone{Quantity: rule.quantity, Label: rule.label, Unit: rule.unit, Threshold: rule.threshold,
		Nodes: len(ns), AreaM2: float64(len(ns)) * g.DX * g.DY, nodes: ns,
		MinX: math.Inf(1), MinY: math.Inf(1), MaxX: math.Inf(-1), MaxY: math.Inf(-1), NearestReading: -1}
	peakK := ns[0]
	for _, k := range ns {
		x, y := g.Node(k%g.NX, k/g.NX)
		v := rule.values[k]
		z.CentroidX += x / float64(len(ns))
		z.CentroidY += y / float64(len(ns))
		z.Mean += v / float64(len(ns))
		z.MinX, z.MinY = min(z.MinX, x), min(z.MinY, y)
		z.MaxX, z.MaxY = max(z.MaxX, x), max(z.MaxY, y)
		if (rule.below && v < rule.values[peakK]) || (!rule.below && v > rule.values[peakK]) {
			peakK = k
		}
	}
	z.Peak = rule.values[peakK]
	z.PeakX, z.PeakY = g.Node(peakK%g.NX, peakK/g.NX)
	z.Outline, z.Holes = contour.Outline(g, ns)
	z.Readings = readingsIn(g, ns, in)
	if idx, d := ix.nearest(z.PeakX, z.PeakY, 1); len(idx) == 1 {
		z.NearestReading, z.NearestDist = in.Index[idx[0]], d[0]
	}
	z.Severity = exceedance(rule, z.Peak, span) * z.AreaM2
	return z
}

// exceedance is how far the peak goes beyond the threshold, 1 at the
// threshold.
func exceedance(rule flagRule, peak, span float64) float64 {
	if rule.quantity != QuantityPotential {
		if rule.threshold > 0 {
			return peak / rule.threshold
		}
		return 1
	}
	scale := math.Abs(rule.threshold)
	if scale == 0 {
		scale = span
	}
	if !(scale > 0) {
		return 1
	}
	return 1 + math.Abs(peak-rule.threshold)/scale
}

// readingsIn returns the survey indexes of readings whose nearest node is
// one of ns (sorted ascending).
func readingsIn(g *interp.Grid, ns []int, in Input) []int {
	var out []int
	for i := range in.X {
		ci := int(math.Round((in.X[i] - g.X0) / g.DX))
		cj := int(math.Round((in.Y[i] - g.Y0) / g.DY))
		if ci < 0 || cj < 0 || ci >= g.NX || cj >= g.NY {
			continue
		}
		if _, found := slices.BinarySearch(ns, g.Index(ci, cj)); found {
			out = append(out, in.Index[i])
		}
	}
	slices.Sort(out)
	return out
}

// quantityOrder ranks quantities: touch and step first (safety).
func quantityOrder(q string) int {
	switch q {
	case QuantityTouch:
		return 0
	case QuantityStep:
		return 1
	}
	return 2
}

// rankZones sorts zones by quantity order, then severity, then position,
// and numbers their ranks from 1.
func rankZones(zs []Zone) {
	sort.SliceStable(zs, func(a, b int) bool {
		qa, qb := quantityOrder(zs[a].Quantity), quantityOrder(zs[b].Quantity)
		if qa != qb {
			return qa < qb
		}
		if zs[a].Severity != zs[b].Severity {
			return zs[a].Severity > zs[b].Severity
		}
		return zs[a].nodes[0] < zs[b].nodes[0]
	})
	for i := range zs {
		zs[i].Rank = i + 1
	}
}
