package qa

import (
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

// BenchmarkRun times the whole check, and the check without the spike
// fit (whose cost is the interpolation engine's leave-one-out).
func BenchmarkRun(b *testing.B) {
	for _, n := range []int{5_000, 100_000} {
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
