package interp

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/mat"
)

// TestSmallSystemAgainstDense checks the patch solver (Lagrange-form null
// space and Cholesky) against gonum's LU solve of the whole saddle system
// [A+λI P; Pᵀ 0] and, for the diagonal of its inverse, against gonum's
// explicit inverse, for every kernel, with and without smoothing, and for
// patches of 4 to 90 readings, one of them nearly collinear.
func TestSmallSystemAgainstDense(t *testing.T) {
	r := rand.New(rand.NewPCG(3, 4))
	tests := []struct {
		name   string
		k      Kernel
		m      int
		lambda float64
		thin   float64 // y extent of the readings (1: a disk)
		shape  float64 // 0: 1
	}{
		{"tps 4", ThinPlate, 4, 0, 1, 0},
		{"tps 12", ThinPlate, 12, 0, 1, 0},
		{"tps 56", ThinPlate, 56, 0, 1, 0},
		{"tps 90 smoothed", ThinPlate, 90, 1e-3, 1, 0},
		{"tps 40 thin strip", ThinPlate, 40, 0, 0.05, 0},
		{"cubic 48", Cubic, 48, 0, 1, 0},
		{"multiquadric 30", Multiquadric, 30, 0, 1, 3},
		{"inverse multiquadric 30", InverseMultiquadric, 30, 1e-4, 1, 3},
		{"gaussian 20", Gaussian, 20, 1e-6, 1, 3},
		{"wendland C2 40", WendlandC2, 40, 0, 1, 0},
		{"wendland C4 40", WendlandC4, 40, 0, 1, 0},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			x, y, f := make([]float64, tc.m), make([]float64, tc.m), make([]float64, tc.m)
			for i := range x {
				for {
					x[i], y[i] = 2*r.Float64()-1, (2*r.Float64()-1)*tc.thin
					if x[i]*x[i]+y[i]*y[i] <= 1 {
						break
					}
				}
				f[i] = math.Sin(3*x[i]) + y[i]*y[i] + 0.1*r.NormFloat64()
			}
			// Shapes that keep the systems well conditioned (the flat
			// limit of the multiquadric is ill conditioned for any solver).
			b := newBasis(tc.k, max(tc.shape, 1))
			var s smallSystem
			s.build(x, y, f, b, tc.lambda)
			if c := s.factor(); !(c < maxCondition) {
				t.Fatalf("condition %g", c)
			}
			got := make([]float64, tc.m+3)
			copy(got, f)
			s.solve(got)

			n := tc.m + 3
			full := mat.NewDense(n, n, nil)
			for i := 0; i < tc.m; i++ {
				for j := 0; j < tc.m; j++ {
					du, dv := x[i]-x[j], y[i]-y[j]
					full.Set(i, j, b.phi(du*du+dv*dv))
				}
				full.Set(i, i, full.At(i, i)+tc.lambda)
				for k, p := range []float64{1, x[i], y[i]} {
					full.Set(i, tc.m+k, p)
					full.Set(tc.m+k, i, p)
				}
			}
			rhs := mat.NewVecDense(n, append(append([]float64(nil), f...), 0, 0, 0))
			var want mat.VecDense
			if err := want.SolveVec(full, rhs); err != nil {
				t.Fatal(err)
			}
			var inv mat.Dense
			if err := inv.Inverse(full); err != nil {
				t.Fatal(err)
			}
			var scale float64
			for i := 0; i < n; i++ {
				scale = max(scale, math.Abs(want.AtVec(i)))
			}
			for i := 0; i < n; i++ {
				if d := math.Abs(got[i] - want.AtVec(i)); d > 1e-8*scale {
					t.Errorf("coefficient %d: %.12g, dense LU %.12g", i, got[i], want.AtVec(i))
				}
			}
			diag := make([]float64, tc.m)
			s.inverseDiag(diag, nil)
			for k := range diag {
				w := inv.At(k, k)
				if d := math.Abs(diag[k] - w); d > 1e-8*math.Abs(w) {
					t.Errorf("inverse diagonal %d: %.12g, dense inverse %.12g", k, diag[k], w)
				}
			}
		})
	}
}
