package analysis

import (
	"fmt"
	"math"
	"math/rand/v2"
	"sort"
	"testing"
)

// TestNearIndexBruteForce compares the bucket search with a brute-force
// search on seeded random points, clustered and spread, with queries inside
// and outside the points' extent.
func TestNearIndexBruteForce(t *testing.T) {
	rng := rand.New(rand.NewPCG(7, 8))
	for trial := range 30 {
		n := 1 + rng.IntN(300)
		xs, ys := make([]float64, n), make([]float64, n)
		for i := range xs {
			xs[i], ys[i] = rng.Float64()*100, rng.Float64()*float64(1+trial)
			if trial%3 == 0 {
				xs[i], ys[i] = math.Round(xs[i]/10)*10, math.Round(ys[i]) // lattice with ties
			}
		}
		ix := newNearIndex(xs, ys)
		for range 50 {
			qx, qy := rng.Float64()*140-20, rng.Float64()*40-20
			k := 1 + rng.IntN(5)
			_, got := ix.nearest(qx, qy, k)
			all := make([]float64, n)
			for i := range xs {
				all[i] = math.Hypot(xs[i]-qx, ys[i]-qy)
			}
			sort.Float64s(all)
			want := all[:min(k, n)]
			if fmt.Sprint(got) != fmt.Sprint(want) {
				t.Fatalf("trial %d: nearest %d to (%g, %g) = %v, brute force %v", trial, k, qx, qy, got, want)
			}
		}
	}
}

// TestNearestTies checks that of readings at the same distance the first
// is nearest, wherever the buckets put them.
func TestNearestTies(t *testing.T) {
	// A lattice 10 m apart: the query at a cell centre is 5√2 m from four.
	var xs, ys []float64
	for j := range 6 {
		for i := range 6 {
			xs, ys = append(xs, float64(10*i)), append(ys, float64(10*j))
		}
	}
	ix := NewNearIndex(xs, ys)
	for _, q := range [][2]float64{{15, 15}, {25, 35}, {45, 5}, {5, 45}} {
		got, d := ix.Nearest(q[0], q[1])
		want := -1
		for i := range xs {
			if math.Hypot(xs[i]-q[0], ys[i]-q[1]) == d {
				want = i
				break
			}
		}
		if got != want {
			t.Errorf("Nearest(%v) = %d, want %d, the first of the readings %g m away", q, got, want, d)
		}
	}
	if i, d := ix.Nearest(math.NaN(), 0); i != -1 || !math.IsInf(d, 1) {
		t.Errorf("Nearest(NaN, 0) = %d, %g; want -1, +Inf", i, d)
	}
}
