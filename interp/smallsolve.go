package interp

import (
	"math"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack/lapack64"
)

// smallSystem is a workspace for the dense saddle-point systems of the
// partition-of-unity patches (a few dozen unknowns): build, factorise by
// Gaussian elimination with partial pivoting (Golub & Van Loan, Matrix
// Computations, 4th ed., §3.4), solve. One workspace per goroutine; it
// grows to the largest patch and is then reused without allocating.
type smallSystem struct {
	n   int       // order: readings + 3
	a   []float64 // n×n row-major, LU factors after factor
	piv []int
	rhs []float64
	f   []float64 // scratch for the caller's right-hand side
}

// build fills the saddle matrix [A+λI P; Pᵀ 0] for points (x, y) and
// right-hand side [f; 0].
func (s *smallSystem) build(x, y, f []float64, b basis, lambda float64) {
	m := len(x)
	n := m + 3
	s.n = n
	if cap(s.a) < n*n {
		s.a = make([]float64, n*n)
		s.piv = make([]int, n)
		s.rhs = make([]float64, n)
	}
	s.a, s.piv, s.rhs = s.a[:n*n], s.piv[:n], s.rhs[:n]
	for i := 0; i < m; i++ {
		row := s.a[i*n : i*n+n]
		for j := 0; j < i; j++ { // symmetric: copy the upper triangle
			row[j] = s.a[j*n+i]
		}
		row[i] = b.phi(0) + lambda
		for j := i + 1; j < m; j++ {
			du, dv := x[i]-x[j], y[i]-y[j]
			row[j] = b.phi(du*du + dv*dv)
		}
		row[m], row[m+1], row[m+2] = 1, x[i], y[i]
		s.rhs[i] = f[i]
	}
	for k := 0; k < 3; k++ {
		row := s.a[(m+k)*n : (m+k)*n+n]
		for j := 0; j < m; j++ {
			row[j] = [3]float64{1, x[j], y[j]}[k]
		}
		row[m], row[m+1], row[m+2] = 0, 0, 0
		s.rhs[m+k] = 0
	}
}

// factor computes the LU factors in place with LAPACK's dgetrf as gonum
// implements it (its row updates run on gonum's assembly kernels). It
// returns a crude condition estimate, the largest entry of the matrix
// over the smallest pivot magnitude, or +Inf when a pivot vanishes.
func (s *smallSystem) factor() float64 {
	var amax float64
	for _, v := range s.a {
		amax = max(amax, math.Abs(v))
	}
	if !lapack64.Getrf(s.general(), s.piv) {
		return math.Inf(1)
	}
	pmin := math.Inf(1)
	for k := 0; k < s.n; k++ {
		pmin = min(pmin, math.Abs(s.a[k*s.n+k]))
	}
	return amax / pmin
}

func (s *smallSystem) general() blas64.General {
	return blas64.General{Rows: s.n, Cols: s.n, Stride: s.n, Data: s.a}
}

// solve overwrites b with the solution of the factorised system.
func (s *smallSystem) solve(b []float64) {
	lapack64.Getrs(blas.NoTrans, s.general(), blas64.General{Rows: s.n, Cols: 1, Stride: 1, Data: b[:s.n]}, s.piv)
}

// inverseDiag writes into dst the first len(dst) diagonal entries of the
// inverse of the factorised matrix, computed whole by LAPACK's dgetri
// (gonum's implementation). It destroys the factors; work is scratch,
// grown as needed and returned for reuse.
func (s *smallSystem) inverseDiag(dst, work []float64) []float64 {
	var q [1]float64
	lapack64.Getri(s.general(), s.piv, q[:], -1)
	work = grow(work, max(int(q[0]), s.n))
	lapack64.Getri(s.general(), s.piv, work, len(work))
	for k := range dst {
		dst[k] = s.a[k*s.n+k]
	}
	return work
}
