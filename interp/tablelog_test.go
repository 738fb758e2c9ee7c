package interp

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestTableLog compares the table-driven logarithm with math.Log: absolute
// error at most 4e-16 for |log x| ≤ 1, relative 4e-16 beyond.
func TestTableLog(t *testing.T) {
	lt := newLogTable()
	r := rand.New(rand.NewPCG(9, 9))
	check := func(x float64) {
		got, want := lt.log(x), math.Log(x)
		if math.Abs(got-want) > 4e-16*max(1, math.Abs(want)) {
			t.Fatalf("log(%g) = %.17g, math.Log %.17g", x, got, want)
		}
	}
	for _, x := range []float64{1, 2, 0.5, math.Nextafter(1, 2), math.Nextafter(1, 0), 1.99999999, 1e-300, 5e-324, 1e300, math.E} {
		check(x)
	}
	for i := 0; i < 300000; i++ {
		check(math.Exp(r.Float64()*80 - 60))
		check(1 + (r.Float64()-0.5)*0.01)
	}
}

func BenchmarkTableLog(b *testing.B) {
	lt := newLogTable()
	xs := make([]float64, 1024)
	for i := range xs {
		xs[i] = 0.001 + float64(i)/300
	}
	var s float64
	b.Run("table", func(b *testing.B) {
		for b.Loop() {
			for _, x := range xs {
				s += lt.log(x)
			}
		}
	})
	b.Run("math.Log", func(b *testing.B) {
		for b.Loop() {
			for _, x := range xs {
				s += math.Log(x)
			}
		}
	})
	_ = s
}
