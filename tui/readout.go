package tui

import (
	"fmt"
	"math"
	"strconv"
	"strings"

	"isofield/survey"
	"isofield/survey/analysis"
	"isofield/survey/criteria"
	"isofield/survey/pipeline"
)

// probe is everything the readout shows about one point.
type probe struct {
	X, Y      float64
	Inside    bool    // on an unmasked grid node
	V         float64 // potential (NaN outside)
	EX, EY    float64 // E = -∇V
	Band      int     // potential band, -1 outside
	Nearest   int     // nearest reading, -1 if none
	NearDist  float64
	Zone      int // zone index, -1 if none
	StepValue float64
	HasStep   bool
}

// probeAt evaluates the scene at (x, y).
func (sc *scene) probeAt(x, y float64) probe {
	p := probe{X: x, Y: y, V: math.NaN(), Band: -1, Nearest: -1, Zone: -1}
	g := sc.res.Grid
	if g != nil && g.DX > 0 && g.DY > 0 {
		i := int(math.Floor((x-g.X0)/g.DX + 0.5))
		j := int(math.Floor((y-g.Y0)/g.DY + 0.5))
		if i >= 0 && j >= 0 && i < g.NX && j < g.NY {
			k := g.Index(i, j)
			p.Inside = !g.Mask[k]
			if sc.zoneOf != nil {
				p.Zone = int(sc.zoneOf[k])
			}
		}
	}
	if p.Inside {
		p.V, p.EX, p.EY = sc.valueAt(x, y)
		p.Band = sc.data.Potential.Index(p.V)
		if a := sc.res.Analysis; a != nil && a.Step != nil && sc.res.Model != nil {
			p.StepValue, p.HasStep = analysis.StepVoltage(sc.res.Model, x, y), true
		}
	}
	p.Nearest, p.NearDist = sc.nearestReading(x, y)
	return p
}

// valueAt returns V and E at (x, y): from the fitted model when there is
// one (exact between nodes), else from the nearest node.
func (sc *scene) valueAt(x, y float64) (v, ex, ey float64) {
	if m := sc.res.Model; m != nil {
		gx, gy := m.Gradient(x, y)
		return m.Value(x, y), -gx, -gy
	}
	g := sc.res.Grid
	i := min(max(int(math.Round((x-g.X0)/g.DX)), 0), g.NX-1)
	j := min(max(int(math.Round((y-g.Y0)/g.DY)), 0), g.NY-1)
	k := g.Index(i, j)
	return g.V[k], -g.GX[k], -g.GY[k]
}

// nearestReading returns the reading closest to (x, y) and its distance.
func (sc *scene) nearestReading(x, y float64) (int, float64) {
	if sc.near == nil {
		sc.near = readingIndex(sc.res.Survey.Readings)
	}
	return sc.near.Nearest(x, y)
}

// readingIndex indexes the readings' positions for nearestReading.
func readingIndex(rs []survey.Reading) *analysis.NearIndex {
	xs, ys := make([]float64, len(rs)), make([]float64, len(rs))
	for i, r := range rs {
		xs[i], ys[i] = r.X, r.Y
	}
	return analysis.NewNearIndex(xs, ys)
}

// bearing returns the compass bearing (degrees clockwise from north) of
// (ex, ey) and its eight-point name.
func bearing(ex, ey float64) (float64, string) {
	b := math.Mod(math.Atan2(ex, ey)*180/math.Pi+360, 360)
	names := [8]string{"N", "NE", "E", "SE", "S", "SW", "W", "NW"}
	return b, names[int(math.Round(b/45))%8]
}

// num formats a value with up to 4 significant digits, or as a whole
// number from 10⁴ up to 10⁶.
func num(v float64) string {
	if math.IsNaN(v) {
		return "—"
	}
	// Whole numbers up to seven digits read better than exponents
	// (potentials at fault current reach 10⁵ mV and more).
	if a := math.Abs(v); a >= 1e4 && a < 1e6 {
		return strconv.FormatFloat(v, 'f', 0, 64)
	}
	return strconv.FormatFloat(v, 'g', 4, 64)
}

// fixed formats a coordinate with the decimals its magnitude needs.
func fixed(v float64) string {
	switch a := math.Abs(v); {
	case a >= 1e5:
		return strconv.FormatFloat(v, 'f', 1, 64)
	case a >= 100:
		return strconv.FormatFloat(v, 'f', 2, 64)
	}
	return strconv.FormatFloat(v, 'f', 3, 64)
}

// bandLabel returns "lo … hi U" for band k.
func (sc *scene) bandLabel(k int) string {
	e := sc.data.Potential.Edges
	if k < 0 || k+1 >= len(e) {
		return "—"
	}
	return fmt.Sprintf("%s … %s %s", sc.vUnit.num(e[k]), sc.vUnit.num(e[k+1]), sc.vUnit.name)
}

// criterionText describes the preset's criterion in one or two lines;
// field is the display unit of fields.
func criterionText(cfg pipeline.Config, field dispUnit) string {
	c := cfg.Criteria
	th := "no field threshold"
	if c.FieldThreshold > 0 {
		th = "flag |E| ≥ " + field.with(c.FieldThreshold)
	}
	switch c.Name() {
	case criteria.Concrete:
		return "ASTM C876 bands vs CSE: > −200 mV low, −200…−350 uncertain, < −350 high probability; " + th
	case criteria.Grounding:
		return "IEEE Std 80 tolerable step and touch voltages; " + th
	case criteria.CP:
		return "−850 mV CSE criterion (IR drop considered: SP0169); " + th
	case criteria.SP:
		return "regional trend removed; " + th
	}
	return "generic: " + th
}

func hypot(a, b float64) float64 { return math.Hypot(a, b) }

// criterionOf describes an analysis criterion: its title, the field
// threshold in effect (shown in fu, the display unit of fields) and, for
// grounding, the tolerable voltages stored in unit (each shown in the
// unit that suits it).
func criterionOf(c *criteria.Criterion, field float64, unit string, fu dispUnit) string {
	if c == nil {
		return ""
	}
	parts := []string{c.Title}
	if field > 0 {
		t := "flag |E| ≥ " + fu.with(field)
		if c.FieldLabel != "" {
			t += " (" + c.FieldLabel + ")"
		}
		parts = append(parts, t)
	}
	if c.Step {
		parts = append(parts, "tolerable step "+withUnit(c.StepLimit, unit))
	}
	if c.Touch {
		parts = append(parts, "touch "+withUnit(c.TouchLimit, unit))
	}
	parts = append(parts, c.Warnings...)
	return strings.Join(nonEmpty(parts), "; ")
}

func nonEmpty(ss []string) []string {
	out := ss[:0:0]
	for _, s := range ss {
		if s != "" {
			out = append(out, s)
		}
	}
	return out
}
