package qa

import (
	"context"
	"errors"
	"fmt"
	"math"
	"slices"
	"sort"

	"isofield/interp"
)

// Constants of the spike check.
const (
	// minSpikeSpots is the fewest spots the spike check runs on: fewer
	// give no meaningful median absolute deviation (common practice).
	minSpikeSpots = 10
	// spikeRounds bounds the refits without the suspects.
	spikeRounds = 3
	// madToSigma turns a median absolute deviation into a standard
	// deviation for normally distributed residuals (1/Φ⁻¹(3/4)).
	madToSigma = 1.4826
	// supportRatio is how large, relative to a candidate's, a neighbour's
	// deviation of the same sign must be for the two to count as one
	// feature rather than a spike and its echo (common practice).
	supportRatio = 0.5
)

// spot is one value per place in the spike fit: a reading, or the first
// member of an agreeing repeat group standing for the group.
type spot struct {
	reading int
	x, y, v float64
}

// spikes fits the interpolant to one value per spot and marks readings
// whose leave-one-out residual is far out as suspect.
func (c *checker) spikes(ctx context.Context) error {
	if c.set.SpikeK < 0 {
		return nil
	}
	spots := c.spots()
	if len(spots) < minSpikeSpots {
		c.remark("spike check skipped: %d spots to compare, at least %d needed", len(spots), minSpikeSpots)
		return nil
	}
	var nb *neighbourIndex
	if c.treeOnly {
		nb = newNeighbourIndexWith(spots, nil)
	} else {
		nb = newNeighbourIndex(spots)
	}
	out := make([]bool, len(spots))
	var resid []float64
	var steep []bool
	for round := 0; round < spikeRounds; round++ {
		r, info, err := c.residuals(ctx, spots, out)
		if err != nil {
			if ctx.Err() != nil {
				return ctx.Err()
			}
			c.remark("spike check skipped: %v", err)
			return nil
		}
		resid, c.res.Fit = r, info
		var next []bool
		next, steep = c.flag(spots, out, resid, nb)
		if slices.Equal(next, out) {
			break
		}
		out = next
	}
	c.markSpikes(spots, out, resid, nb)
	c.markSteep(spots, steep, resid)
	return nil
}

// spots returns the places the spike fit uses: readings not suspect and
// not excluded by hand, one per agreeing repeat group.
func (c *checker) spots() []spot {
	sp := make([]spot, 0, len(c.s.Readings))
	done := make([]bool, len(c.res.Repeats))
	for i, rd := range c.s.Readings {
		if c.hand[i] || c.res.Status[i] != OK {
			continue
		}
		if g := c.res.Group[i]; g >= 0 {
			if done[g] {
				continue
			}
			done[g] = true
		}
		sp = append(sp, spot{i, rd.X, rd.Y, c.res.Corrected[i]})
	}
	return sp
}

// residuals fits the spots not marked out and returns every spot's
// residual: the leave-one-out residual for spots in the fit, the
// out-of-sample residual for the others.
func (c *checker) residuals(ctx context.Context, spots []spot, out []bool) ([]float64, *interp.FitInfo, error) {
	xs, ys, vs := make([]float64, 0, len(spots)), make([]float64, 0, len(spots)), make([]float64, 0, len(spots))
	for k, p := range spots {
		if !out[k] {
			xs, ys, vs = append(xs, p.x), append(ys, p.y), append(vs, p.v)
		}
	}
	m, err := interp.Fit(ctx, xs, ys, vs, interp.Options{Progress: c.progress, LeaveOneOut: true})
	if err != nil {
		return nil, nil, fmt.Errorf("fitting %d spots: %w", len(xs), err)
	}
	c.res.SpikeModel, c.res.SpikeX, c.res.SpikeY, c.res.SpikeV = m, xs, ys, vs
	loo := m.LeaveOneOut()
	if len(loo) != len(xs) {
		return nil, nil, errors.New("the fit gave no leave-one-out residuals")
	}
	r := make([]float64, len(spots))
	j := 0
	for k, p := range spots {
		if out[k] {
			r[k] = p.v - m.Value(p.x, p.y)
			continue
		}
		r[k] = loo[j]
		j++
	}
	info := m.Info()
	return r, &info, nil
}

// robust returns the median and the scale 1.4826 MAD of the residuals of
// spots in the fit.
func robust(resid []float64, out []bool) (med, scale float64) {
	in := make([]float64, 0, len(resid))
	for k, r := range resid {
		if !out[k] && !math.IsNaN(r) {
			in = append(in, r)
		}
	}
	if len(in) == 0 {
		return 0, 0
	}
	med = median(in)
	for k := range in {
		in[k] = math.Abs(in[k] - med)
	}
	return med, madToSigma * median(in)
}

// flag returns which spots are spikes given the residuals: candidates
// whose deviation beyond the curvature allowance (see unexplained) is beyond
// both limits, unless one of their neighbours is a candidate of the same
// sign deviating at least supportRatio as much (a lone spike's neighbours
// pick up only a part of it, of either sign, through the fit). Readings
// that disagree with the fit together are a feature finer than the
// spacing (a real anomaly, or too coarse a grid), not a lone bad reading;
// they are returned in steep.
func (c *checker) flag(spots []spot, out []bool, resid []float64, nb *neighbourIndex) (next, steep []bool) {
	med, scale := robust(resid, out)
	c.res.SpikeScale = scale
	dev, _ := c.unexplained(out, resid, nb, med, scale)
	for k, d := range dev {
		if a := math.Abs(d); a <= c.set.SpikeK*scale || a <= c.set.RepeatTol {
			dev[k] = 0 // not a candidate
		}
	}
	next, steep = make([]bool, len(spots)), make([]bool, len(spots))
	for k := range spots {
		if dev[k] == 0 {
			continue
		}
		for _, j := range nb.of(k) {
			if dev[j]*dev[k] > 0 && math.Abs(dev[j]) >= supportRatio*math.Abs(dev[k]) {
				steep[k] = true
				break
			}
		}
		next[k] = !steep[k]
	}
	return next, steep
}

// unexplained returns each spot's deviation from the median residual that
// neither the local curvature nor a gap explains: the part of |resid − med|
// beyond the spot's curvature allowance (see curvatureAllowance), with its
// sign, divided by the gap factor. The allowance is worked out only where
// the deviation over the gap factor is beyond both limits of the spike
// check (below them the allowance could only shrink it further), which
// keeps the check local and cheap: one least-squares fit through 12 spots
// per candidate.
func (c *checker) unexplained(out []bool, resid []float64, nb *neighbourIndex, med, scale float64) (dev, allow []float64) {
	dev, allow = make([]float64, len(resid)), make([]float64, len(resid))
	forChunks(len(resid), 4096, func(lo, hi int) {
		for k := lo; k < hi; k++ {
			g := nb.gapFactor(k)
			d := resid[k] - med
			if a := math.Abs(d) / g; a > c.set.SpikeK*scale && a > c.set.RepeatTol {
				allow[k] = nb.curvatureAllowance(k, out, scale)
				d = math.Copysign(math.Max(0, math.Abs(d)-allow[k]), d)
			}
			dev[k] = d / g
		}
	})
	return dev, allow
}

// markSpikes records residuals and z for every spot's readings and marks
// the spikes suspect, largest |z| first in Result.Suspects; a suspect's
// note states the curvature allowance where there was one.
func (c *checker) markSpikes(spots []spot, out []bool, resid []float64, nb *neighbourIndex) {
	med, scale := robust(resid, out)
	c.res.SpikeScale = scale
	dev, allow := c.unexplained(out, resid, nb, med, scale)
	var one [1]int
	for k, p := range spots {
		z := robustZ(dev[k], scale)
		members := c.spotReadings(p.reading, one[:0])
		var reason string // only spikes have one
		if out[k] {
			reason = spikeReason(resid[k], allow[k], z, c.unit())
		}
		for _, i := range members {
			c.res.Residual[i], c.res.Z[i] = resid[k], z
			switch {
			case !out[k]:
			case len(members) > 1:
				c.note(i, reason+", but confirmed by its agreeing repeats: not marked")
			default:
				c.res.Suspects = append(c.res.Suspects, SpikeInfo{Reading: i, Residual: resid[k], Z: z})
				c.setStatus(i, Suspect, KindSpike, reason)
			}
		}
	}
	sort.SliceStable(c.res.Suspects, func(a, b int) bool {
		return math.Abs(c.res.Suspects[a].Z) > math.Abs(c.res.Suspects[b].Z)
	})
}

// spikeReason is the note of a spike: its residual r, the curvature
// allowance a if there is one, and its robust z, in unit u.
func spikeReason(r, a, z float64, u string) string {
	if a > 0 {
		return fmt.Sprintf("disagrees with neighbours: leave-one-out residual %+.4g %s, of which local curvature explains up to %.3g %s, robust z %+.1f", r, u, a, u, z)
	}
	return fmt.Sprintf("disagrees with neighbours: leave-one-out residual %+.4g %s, robust z %+.1f", r, u, z)
}

// robustZ is d/scale, ±Inf for a zero scale (0 when d is 0 too).
func robustZ(d, scale float64) float64 {
	switch {
	case scale > 0:
		return d / scale
	case d == 0:
		return 0
	}
	return math.Copysign(math.Inf(1), d)
}

// spotReadings returns the readings a spot stands for: the live members of
// its repeat group, or the reading alone, in buf if it has room.
func (c *checker) spotReadings(i int, buf []int) []int {
	if g := c.res.Group[i]; g >= 0 {
		return c.live(c.res.Repeats[g].Members)
	}
	return append(buf[:0], i)
}

// markSteep notes the readings of spots that disagree with the fit
// together with a neighbour, and lists them in Result.Steep.
func (c *checker) markSteep(spots []spot, steep []bool, resid []float64) {
	for k, p := range spots {
		if !steep[k] {
			continue
		}
		reason := fmt.Sprintf("disagrees with the fit together with a neighbour (residual %+.4g %s): a feature finer than the reading spacing, not marked; consider readings in between", resid[k], c.unit())
		for _, i := range c.spotReadings(p.reading, nil) {
			c.res.Steep = append(c.res.Steep, i)
			c.note(i, reason)
		}
	}
}
