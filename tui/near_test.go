package tui

import (
	"math"
	"math/rand/v2"
	"testing"

	"isofield/survey"
)

// TestNearIndexBruteForce compares the readout's nearest-reading search
// with a scan of every reading on seeded random surveys, at points inside and outside.
func TestNearIndexBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(6, 2026))
	for _, n := range []int{1, 2, 17, 500, 3000} {
		rs := make([]survey.Reading, n)
		for i := range rs {
			rs[i].X, rs[i].Y = 1e5+rng.Float64()*300, 5e6+rng.Float64()*40
		}
		ix := readingIndex(rs)
		for range 300 {
			x, y := 1e5-100+rng.Float64()*500, 5e6-50+rng.Float64()*140
			got, gd := ix.Nearest(x, y)
			want, wd := -1, math.Inf(1)
			for i, r := range rs {
				if d := math.Hypot(r.X-x, r.Y-y); d < wd {
					want, wd = i, d
				}
			}
			if got != want || math.Abs(gd-wd) > 1e-9 {
				t.Fatalf("n=%d at (%g, %g): index %d at %g, brute force %d at %g", n, x, y, got, gd, want, wd)
			}
		}
	}
	if i, d := readingIndex(nil).Nearest(0, 0); i != -1 || !math.IsInf(d, 1) {
		t.Errorf("empty survey: %d %g", i, d)
	}
}

func BenchmarkNearest(b *testing.B) {
	rng := rand.New(rand.NewPCG(1, 2))
	for _, n := range []int{1000, 100_000, 1_000_000} {
		rs := make([]survey.Reading, n)
		for i := range rs {
			rs[i].X, rs[i].Y = rng.Float64()*1000, rng.Float64()*700
		}
		ix := readingIndex(rs)
		b.Run("n="+itoa(n), func(b *testing.B) {
			for b.Loop() {
				ix.Nearest(rng.Float64()*1000, rng.Float64()*700)
			}
		})
	}
}
