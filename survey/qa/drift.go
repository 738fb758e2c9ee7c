package qa

import (
	"errors"
	"fmt"
	"math"
	"slices"
	"sort"
	"strings"

	gointerp "gonum.org/v1/gonum/interp"
)

// ErrNoBase is the cause of the error for a named base station that no
// reading has as its id.
var ErrNoBase = errors.New("base station not found among the readings' ids")

// minProposal is how often a spot must be read to be proposed as base
// station: a first reading and at least two returns (common practice).
const minProposal = 3

// drift proposes a base station and, if one is named (or AutoBase is set),
// corrects every reading by the base station's drift curve.
func (c *checker) drift() error {
	prop := c.proposeBase()
	members, name, err := c.baseMembers(prop)
	if err != nil || members == nil {
		return err
	}
	live := c.live(members)
	if len(live) < 2 {
		c.remark("base station %s read only %d time(s) (not counting exclusions): no drift correction", name, len(live))
		return nil
	}
	t, byTime, timeNote := c.timeAxis()
	xs, ys, order := basePoints(live, t, c.res.Corrected)
	if len(xs) < 2 {
		c.remark("base station %s read %d times but all at one time: no drift correction", name, len(live))
		return nil
	}
	var pred gointerp.Predictor
	switch c.set.Drift {
	case MonotoneCubic:
		var fb gointerp.FritschButland
		_ = fb.Fit(xs, ys) // cannot fail: xs strictly increasing, len ≥ 2
		pred = &fb
	default:
		var pl gointerp.PiecewiseLinear
		_ = pl.Fit(xs, ys)
		pred = pl
	}
	d := &DriftCurve{Base: name, Members: order, ByTime: byTime, TimeNote: timeNote, Method: c.set.Drift}
	for k := range xs {
		d.T = append(d.T, xs[k]-xs[0])
		d.B = append(d.B, ys[k])
		if k > 0 {
			d.MaxStep = math.Max(d.MaxStep, math.Abs(ys[k]-ys[k-1]))
		}
	}
	d.LoopClosure = ys[len(ys)-1] - ys[0]
	c.applyDrift(d, pred, t, xs[0], xs[len(xs)-1], ys[0])
	c.res.Drift = d
	return nil
}

// applyDrift corrects every reading by B(t) − B(t₁), holding the
// correction at its end values outside [lo, hi].
func (c *checker) applyDrift(d *DriftCurve, pred gointerp.Predictor, t []float64, lo, hi, b0 float64) {
	axis := "order of readings"
	if d.ByTime {
		axis = "time"
	}
	reason := fmt.Sprintf("drift correction from base station %s (%v in %s)", d.Base, d.Method, axis)
	n := len(c.s.Readings)
	corr, notes := make([]float64, n), make([]string, n)
	unit := c.unit()
	forChunks(n, 4096, func(first, end int) {
		for i := first; i < end; i++ {
			ti := t[i]
			if ti < lo || ti > hi {
				ti = math.Min(math.Max(ti, lo), hi)
			}
			corr[i] = pred.Predict(ti) - b0
			if corr[i] != 0 {
				notes[i] = fmt.Sprintf("drift %+.4g %s removed", corr[i], unit)
			}
		}
	})
	c.res.Log = slices.Grow(c.res.Log, n)
	for i := range n {
		if t[i] < lo || t[i] > hi {
			d.Outside++
		}
		if corr[i] == 0 {
			continue
		}
		c.setValue(i, c.res.Corrected[i]-corr[i], KindDrift, reason)
		c.note(i, notes[i])
	}
}

// basePoints returns the base readings' times (strictly increasing,
// readings at one time averaged) and values, and the members in time
// order.
func basePoints(live []int, t, v []float64) (xs, ys []float64, order []int) {
	order = append([]int(nil), live...)
	sort.SliceStable(order, func(a, b int) bool { return t[order[a]] < t[order[b]] })
	for k := 0; k < len(order); {
		j, sum := k, 0.0
		for ; j < len(order) && t[order[j]] == t[order[k]]; j++ {
			sum += v[order[j]]
		}
		xs = append(xs, t[order[k]])
		ys = append(ys, sum/float64(j-k))
		k = j
	}
	return xs, ys, order
}

// proposeBase finds the spot read most often (at least minProposal times),
// records it as Result.BaseProposal and returns its group (−1 if none).
func (c *checker) proposeBase() int {
	best, bestN := -1, minProposal-1
	for gi, g := range c.res.Repeats {
		if n := len(c.live(g.Members)); n > bestN {
			best, bestN = gi, n
		}
	}
	if best >= 0 {
		c.res.BaseProposal = c.spotName(c.res.Repeats[best].Members[0])
	}
	return best
}

// spotName is reading i's id, or its file and line when it has none.
func (c *checker) spotName(i int) string {
	if id := c.s.Readings[i].ID; id != "" {
		return id
	}
	return c.where(i)
}

// baseMembers returns the readings of the base station: those with the
// named id and every reading grouped with them, or the proposed group when
// AutoBase is set. It returns nil when no drift correction is asked for.
func (c *checker) baseMembers(prop int) ([]int, string, error) {
	if c.set.Base == "" {
		if !c.set.AutoBase || prop < 0 {
			if c.set.AutoBase {
				c.remark("no spot was read %d times or more: no base station to propose, no drift correction", minProposal)
			}
			return nil, "", nil
		}
		c.res.Repeats[prop].Base = true
		name := c.res.BaseProposal
		c.remark("drift corrected with the proposed base station %s (automatic)", name)
		return c.res.Repeats[prop].Members, name, nil
	}
	ids := c.idMatches(c.set.Base)
	if len(ids) == 0 {
		return nil, "", fmt.Errorf("--base %q: %w", c.set.Base, ErrNoBase)
	}
	seen := make([]bool, len(c.s.Readings))
	var members []int
	for _, i := range ids {
		g := c.res.Group[i]
		if g < 0 {
			seen[i] = true
			continue
		}
		c.res.Repeats[g].Base = true
		for _, m := range c.res.Repeats[g].Members {
			seen[m] = true
		}
	}
	for i := range c.s.Readings {
		if seen[i] {
			members = append(members, i)
		}
	}
	return members, c.set.Base, nil
}

// idMatches returns the readings whose id is id, or equal to it ignoring
// case when none matches exactly.
func (c *checker) idMatches(id string) []int {
	var exact, fold []int
	for i, rd := range c.s.Readings {
		switch {
		case rd.ID == id:
			exact = append(exact, i)
		case strings.EqualFold(rd.ID, id):
			fold = append(fold, i)
		}
	}
	if len(exact) > 0 {
		return exact
	}
	return fold
}
