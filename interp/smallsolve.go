package interp

import "math"

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

// factor computes the LU factors in place. It returns a crude condition
// estimate, the ratio of the largest to the smallest pivot magnitude
// times the matrix's largest entry over the largest pivot, or +Inf when a
// pivot vanishes.
func (s *smallSystem) factor() float64 {
	n, a := s.n, s.a
	var amax float64
	for _, v := range a {
		amax = max(amax, math.Abs(v))
	}
	pmin, pmax := math.Inf(1), 0.0
	for k := 0; k < n; k++ {
		p := k
		for i := k + 1; i < n; i++ {
			if math.Abs(a[i*n+k]) > math.Abs(a[p*n+k]) {
				p = i
			}
		}
		s.piv[k] = p
		if p != k {
			for j := 0; j < n; j++ {
				a[k*n+j], a[p*n+j] = a[p*n+j], a[k*n+j]
			}
		}
		d := a[k*n+k]
		if d == 0 {
			return math.Inf(1)
		}
		pmin, pmax = min(pmin, math.Abs(d)), max(pmax, math.Abs(d))
		inv := 1 / d
		rowK := a[k*n+k+1 : k*n+n]
		for i := k + 1; i < n; i++ {
			l := a[i*n+k] * inv
			a[i*n+k] = l
			if l == 0 {
				continue
			}
			rowI := a[i*n+k+1 : i*n+n]
			for j, v := range rowK {
				rowI[j] -= l * v
			}
		}
	}
	return amax / pmin * max(1, pmax/amax)
}

// solve overwrites b with the solution of the factorised system.
func (s *smallSystem) solve(b []float64) {
	n, a := s.n, s.a
	for k := 0; k < n; k++ {
		if p := s.piv[k]; p != k {
			b[k], b[p] = b[p], b[k]
		}
	}
	for i := 1; i < n; i++ {
		row := a[i*n : i*n+i]
		v := b[i]
		for j, l := range row {
			v -= l * b[j]
		}
		b[i] = v
	}
	for i := n - 1; i >= 0; i-- {
		v := b[i]
		for j := i + 1; j < n; j++ {
			v -= a[i*n+j] * b[j]
		}
		b[i] = v / a[i*n+i]
	}
}

// inverseDiag writes into dst the first len(dst) diagonal entries of the
// inverse of the factorised matrix, one unit-vector solve each; e is a
// scratch vector of length n.
func (s *smallSystem) inverseDiag(dst, e []float64) {
	for k := range dst {
		for i := range e[:s.n] {
			e[i] = 0
		}
		e[k] = 1
		s.solve(e[:s.n])
		dst[k] = e[k]
	}
}
