package interp

import (
	"math"
	"math/rand/v2"
	"testing"
)

// TestLogPos compares logPos with the standard library's math.Log.
func TestLogPos(t *testing.T) {
	r := rand.New(rand.NewPCG(8, 8))
	check := func(x float64) {
		got, want := logPos(x), math.Log(x)
		if math.Abs(got-want) > 2e-16*max(1, math.Abs(want)) {
			t.Fatalf("logPos(%g) = %.17g, math.Log %.17g", x, got, want)
		}
	}
	for _, x := range []float64{1, 2, math.Sqrt2, math.Nextafter(math.Sqrt2, 3), 0.5, 1e-300, 5e-324, 1e300, math.E} {
		check(x)
	}
	for i := 0; i < 200000; i++ {
		check(math.Exp(r.Float64()*80 - 60))
	}
}

func BenchmarkLog(b *testing.B) {
	xs := make([]float64, 1024)
	for i := range xs {
		xs[i] = 0.001 + float64(i)/300
	}
	var s float64
	b.Run("math.Log", func(b *testing.B) {
		for b.Loop() {
			for _, x := range xs {
				s += math.Log(x)
			}
		}
	})
	b.Run("logPos", func(b *testing.B) {
		for b.Loop() {
			for _, x := range xs {
				s += logPos(x)
			}
		}
	})
	_ = s
}
