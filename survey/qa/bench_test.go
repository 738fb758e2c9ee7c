package qa

import (
	"context"
	"math/rand/v2"
	"strconv"
	"testing"

	"isofield/survey"
)

// benchSurvey is a survey of n readings of the closed-form field on a
// jittered square grid at 0.5 m, with noise, drift, a base station read
// every 100 readings and one spike in 500.
func benchSurvey(n int) *survey.Survey {
	rng := rand.New(rand.NewPCG(uint64(n), 9))
	b := newBuilder("bench.csv", survey.Millivolt)
	side := 1
	for side*side < n {
		side++
	}
	scale := 20 / float64(side) // keep the field's features across the site
	for k := 0; len(b.s.Readings) < n; k++ {
		if k%100 == 0 {
			b.add("BASE", -1, -1, truthField(-1, -1)+0.01*float64(k))
			continue
		}
		i, j := k%side, (k/side)%side
		x, y := (float64(i)+0.3*rng.Float64())*scale, (float64(j)+0.3*rng.Float64())*scale
		v := truthField(x, y) + 0.01*float64(k) + rng.NormFloat64()
		if rng.IntN(500) == 0 {
			v += 80
		}
		b.add("P"+strconv.Itoa(k), x*25, y*25, v)
	}
	return b.s
}

// scatteredBench is a survey of n readings without ids at uniformly random
// places over a site of 1000 × 750 m, the field stretched over it, with
// noise and one spike in 500: the layout of a large scattered survey.
func scatteredBench(n int) *survey.Survey {
	rng := rand.New(rand.NewPCG(uint64(n), 11))
	b := newBuilder("scattered.csv", survey.Millivolt)
	for range n {
		x, y := 1000*rng.Float64(), 750*rng.Float64()
		v := truthField(x/50, y/50) + rng.NormFloat64()
		if rng.IntN(500) == 0 {
			v += 80
		}
		b.add("", x, y, v)
	}
	return b.s
}

// benchSizes are the survey sizes of the benchmarks; the largest is left
// out with -short.
func benchSizes() []int {
	if testing.Short() {
		return []int{5_000}
	}
	return []int{5_000, 100_000}
}

// BenchmarkRun times the whole check, and the check without the spike
// fit (whose cost is the interpolation engine's leave-one-out).
func BenchmarkRun(b *testing.B) {
	for _, n := range benchSizes() {
		s := benchSurvey(n)
		for _, c := range []struct {
			name string
			set  Settings
		}{{"all", Settings{Base: "BASE"}}, {"no-spikes", Settings{Base: "BASE", SpikeK: -1}}} {
			b.Run("n="+strconv.Itoa(n)+"/"+c.name, func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					if _, err := Run(s, c.set, nil); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}

// BenchmarkOwn times the package's own work: every check as Run makes
// it, with the spike check's residuals worked out once beforehand, so
// that the interpolation engine's fit (timed by BenchmarkRun and by
// package interp) is left out. Two rounds of flagging, as a run with one
// refit makes.
func BenchmarkOwn(b *testing.B) {
	for _, n := range benchSizes() {
		for _, c := range []struct {
			name string
			s    *survey.Survey
			set  Settings
		}{
			{"jittered", benchSurvey(n), Settings{Base: "BASE"}},
			{"scattered", scatteredBench(n), Settings{}},
		} {
			set := c.set.effective(c.s.Unit)
			resid := benchResiduals(b, c.s, set)
			b.Run("n="+strconv.Itoa(n)+"/"+c.name, func(b *testing.B) {
				b.ReportAllocs()
				for b.Loop() {
					ownChecks(b, c.s, set, resid)
				}
			})
		}
	}
}

// benchResiduals returns the residuals of the first spike fit of s.
func benchResiduals(b *testing.B, s *survey.Survey, set Settings) []float64 {
	c := newChecker(s, set)
	if err := c.corrections(); err != nil {
		b.Fatal(err)
	}
	spots := c.spots()
	r, _, err := c.residuals(context.Background(), spots, make([]bool, len(spots)))
	if err != nil {
		b.Fatal(err)
	}
	return r
}

// ownChecks is Run with the given spike residuals in place of the fits.
func ownChecks(b *testing.B, s *survey.Survey, set Settings, resid []float64) {
	c := newChecker(s, set)
	plan := c.resolveEdits(nil)
	if err := c.corrections(); err != nil {
		b.Fatal(err)
	}
	spots := c.spots()
	if len(spots) != len(resid) {
		b.Fatalf("%d spots, %d residuals", len(spots), len(resid))
	}
	nb := newNeighbourIndex(spots)
	out, _ := c.flag(spots, make([]bool, len(spots)), resid, nb)
	out, steep := c.flag(spots, out, resid, nb)
	c.markSpikes(spots, out, resid, nb)
	c.markSteep(spots, steep, resid)
	c.applyEdits(plan)
}
