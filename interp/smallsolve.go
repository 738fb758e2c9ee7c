package interp

import (
	"math"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/lapack/lapack64"
)

// smallSystem is a workspace for the saddle-point systems of the
// partition-of-unity patches (a few dozen readings each), solved by the
// same null-space method as the global fit (see nullSpace): three
// Householder reflectors turn [A+λI P; Pᵀ 0] into the positive definite
// Zᵀ(A+λI)Z, which a Cholesky factorisation (smallSystem.cholesky)
// solves at a third of the cost of an LU of the whole system. One
// workspace per goroutine; it grows to the largest patch and is then
// reused without allocating.
type smallSystem struct {
	m   int       // readings
	a   []float64 // m×m row-major: A+λI, then QᵀAQ with its Cholesky block
	rhs []float64 // m+3: the values, then after solve c (m) and d (3)
	f   []float64 // scratch for the caller's right-hand side
	v   [3][]float64
	tau [3]float64
	r   [3][3]float64
	p   []float64 // scratch vector
	// diag and work are the caller's buffers for inverseDiag.
	diag, work []float64
	invd       []float64 // reciprocals of the Cholesky factor's diagonal
}

// build fills A+λI for points (x, y) and the right-hand side f.
func (s *smallSystem) build(x, y, f []float64, b basis, lambda float64) {
	m := len(x)
	s.m = m
	s.a, s.rhs, s.p = grow(s.a, m*m), grow(s.rhs, m+3), grow(s.p, m)
	for i := 0; i < m; i++ {
		row := s.a[i*m : i*m+m]
		for j := 0; j < i; j++ { // symmetric: copy the upper triangle
			row[j] = s.a[j*m+i]
		}
		row[i] = b.phi(0) + lambda
		if b.k == ThinPlate {
			tpsRow(row[i+1:], x[i+1:], y[i+1:], x[i], y[i], b.lt)
			continue
		}
		for j := i + 1; j < m; j++ {
			du, dv := x[i]-x[j], y[i]-y[j]
			row[j] = b.phi(du*du + dv*dv)
		}
	}
	copy(s.rhs, f)
	s.reflectors(x, y)
}

// reflectors computes the Householder QR of P = [1 x y].
func (s *smallSystem) reflectors(x, y []float64) {
	m := s.m
	for k := range s.v {
		s.v[k] = grow(s.v[k], m)
	}
	// Columns of P, reduced in place in s.v[0..2] before each becomes a
	// reflector: column j lives in cols[j].
	cols := [3][]float64{s.v[0], s.v[1], s.v[2]}
	for i := 0; i < m; i++ {
		cols[0][i], cols[1][i], cols[2][i] = 1, x[i], y[i]
	}
	for k := 0; k < 3; k++ {
		c := cols[k]
		var norm2 float64
		for i := k; i < m; i++ {
			norm2 += c[i] * c[i]
		}
		alpha := -sqrtSign(norm2, c[k])
		vv := norm2 - 2*alpha*c[k] + alpha*alpha
		tau := 0.0
		if vv > 0 {
			tau = 2 / vv
		}
		c[k] -= alpha // c[k:] is now the reflector v_k
		for j := k + 1; j < 3; j++ {
			var dot float64
			for i := k; i < m; i++ {
				dot += c[i] * cols[j][i]
			}
			s.r[k][j] = cols[j][k] - tau*dot*c[k]
			for i := k; i < m; i++ {
				cols[j][i] -= tau * dot * c[i]
			}
		}
		for i := 0; i < k; i++ {
			c[i] = 0
		}
		s.r[k][k] = alpha
		s.tau[k] = tau
	}
}

// factor reduces the system to ZᵀAZ and factorises it. It returns a crude
// condition estimate, the largest diagonal entry of ZᵀAZ over the
// smallest squared Cholesky pivot, or +Inf when the factorisation fails or
// the points leave the polynomial undetermined.
func (s *smallSystem) factor() float64 {
	m := s.m
	s.transform(s.a, true)
	var dmax float64
	for i := 3; i < m; i++ {
		dmax = max(dmax, math.Abs(s.a[i*m+i]))
	}
	if m <= 3 || math.Abs(s.r[2][2]) <= 1e-12*math.Abs(s.r[0][0]) {
		return math.Inf(1)
	}
	if !s.cholesky() {
		return math.Inf(1)
	}
	pmin := math.Inf(1)
	for i := 3; i < m; i++ {
		pmin = min(pmin, s.a[i*m+i]*s.a[i*m+i])
	}
	return dmax / pmin
}

// cholesky factorises the lower-right block ZᵀAZ = LLᵀ in place, L in
// its lower triangle (the upper triangle keeps ZᵀAZ), and reports
// whether the block is positive definite. It is the Cholesky–Banachiewicz
// order (Golub & Van Loan, Matrix Computations, 4th ed., §4.2.5): entry
// (i, j) of L needs the inner product of rows i and j of L, which lie
// along rows of the row-major block, summed four ways at once (dot4).
// At a few dozen unknowns this is faster than gonum's unblocked dpotf2.
func (s *smallSystem) cholesky() bool {
	m := s.m
	n := m - 3
	l := s.a[3*m+3:]
	s.invd = grow(s.invd, n)
	invd := s.invd
	for i := 0; i < n; i++ {
		ri := l[i*m : i*m+i+1]
		for j := 0; j < i; j++ {
			ri[j] = (ri[j] - dot4(ri[:j], l[j*m:j*m+j])) * invd[j]
		}
		d := ri[i] - dot4(ri[:i], ri[:i])
		if !(d > 0) {
			return false
		}
		d = math.Sqrt(d)
		ri[i], invd[i] = d, 1/d
	}
	return true
}

// dot4 returns Σ a[i]·b[i] over len(a), with four partial sums so that
// the additions do not wait on one another.
func dot4(a, b []float64) float64 {
	b = b[:len(a)]
	var s0, s1, s2, s3 float64
	for len(a) >= 4 {
		x, y := a[:4:4], b[:4:4]
		s0 += x[0] * y[0]
		s1 += x[1] * y[1]
		s2 += x[2] * y[2]
		s3 += x[3] * y[3]
		a, b = a[4:], b[4:]
	}
	for i, v := range a {
		s0 += v * b[i]
	}
	return (s0 + s1) + (s2 + s3)
}

// inverseDiagAt returns entry (k, k) of the inverse of the saddle matrix,
// (Z (ZᵀAZ)⁻¹ Zᵀ)_kk = ‖L⁻¹ zₖ‖² with zₖ = Zᵀeₖ, the last m−3 entries of
// Qᵀeₖ, from the Cholesky factor L (which it leaves intact); w is scratch
// of length ≥ m. It costs one pass of the reflectors and one triangular
// solve, (m−3)² flops, so a caller that needs a few entries of the
// diagonal pays far less than a whole inverse.
func (s *smallSystem) inverseDiagAt(k int, w []float64) float64 {
	m := s.m
	w = w[:m]
	for i := range w {
		w[i] = 0
	}
	w[k] = 1
	s.reflect(w, true)
	y := w[3:]
	l := s.a[3*m+3:]
	var sum float64
	for i := range y { // L x = y, x overwriting y
		xi := (y[i] - dot4(l[i*m:i*m+i], y[:i])) * s.invd[i]
		y[i] = xi
		sum += xi * xi
	}
	return sum
}

// block is the (m−3)×(m−3) lower-right block of s.a, lower triangle.
func (s *smallSystem) block() blas64.Triangular {
	return blas64.Triangular{N: s.m - 3, Stride: s.m, Data: s.a[3*s.m+3:], Uplo: blas.Lower, Diag: blas.NonUnit}
}

// transform overwrites the symmetric m×m matrix a with QᵀaQ (forward) or
// QaQᵀ, one rank-two update per reflector (see nullSpace.transform).
func (s *smallSystem) transform(a []float64, forward bool) {
	m := s.m
	p := s.p[:m]
	for t := 0; t < 3; t++ {
		k := t
		if !forward {
			k = 2 - t
		}
		v, tau := s.v[k][:m], s.tau[k]
		// p = τ·A·v from the upper triangle alone: each entry above the
		// diagonal serves row i and, by symmetry, row j.
		for i := range p {
			p[i] = 0
		}
		for i := range p {
			row := a[i*m+i : i*m+m]
			vr, pr := v[i:i+len(row)], p[i:i+len(row)]
			vi := v[i]
			acc := row[0] * vi
			for j := 1; j < len(row); j++ {
				acc += row[j] * vr[j]
				pr[j] += row[j] * vi
			}
			p[i] += acc
		}
		var vp float64
		for i := range p {
			p[i] *= tau
			vp += v[i] * p[i]
		}
		half := tau / 2 * vp
		for i := range p {
			p[i] -= half * v[i]
		}
		// A −= v·pᵀ + p·vᵀ, upper triangle only.
		for i := range p {
			row := a[i*m+i : i*m+m]
			pr, vr := p[i:i+len(row)], v[i:i+len(row)]
			vi, wi := v[i], p[i]
			for j := range row {
				row[j] -= vi*pr[j] + wi*vr[j]
			}
		}
	}
	// Mirror the upper triangle so the whole matrix is symmetric again.
	for i := 1; i < m; i++ {
		for j := 0; j < i; j++ {
			a[i*m+j] = a[j*m+i]
		}
	}
}

// reflect applies the reflectors to a vector: Qᵀf (forward) or Qf.
func (s *smallSystem) reflect(f []float64, forward bool) {
	for t := 0; t < 3; t++ {
		k := t
		if !forward {
			k = 2 - t
		}
		v := s.v[k]
		var dot float64
		for i := k; i < s.m; i++ {
			dot += v[i] * f[i]
		}
		dot *= s.tau[k]
		for i := k; i < s.m; i++ {
			f[i] -= dot * v[i]
		}
	}
}

// solve overwrites b (length m+3, the values first) with the
// coefficients c (m) and the polynomial part d (3).
func (s *smallSystem) solve(b []float64) {
	m := s.m
	g := b[:m]
	s.reflect(g, true)
	w := g[3:]
	s.cholSolve(w)
	var rhs [3]float64
	for i := 0; i < 3; i++ {
		sum := g[i]
		row := s.a[i*m+3 : i*m+m]
		for j, wj := range w {
			sum -= row[j] * wj
		}
		rhs[i] = sum
	}
	var d [3]float64
	for i := 2; i >= 0; i-- {
		sum := rhs[i]
		for j := i + 1; j < 3; j++ {
			sum -= s.r[i][j] * d[j]
		}
		d[i] = sum / s.r[i][i]
	}
	g[0], g[1], g[2] = 0, 0, 0
	s.reflect(g, false)
	copy(b[m:m+3], d[:])
}

// cholSolve overwrites w with (LLᵀ)⁻¹w for the Cholesky factor L in the
// lower triangle of the lower-right block of s.a: a forward substitution
// by inner products along the rows of L, and a back substitution that
// subtracts each solved unknown times its row of L (the column of Lᵀ) from
// the entries still to solve, so both run along rows.
func (s *smallSystem) cholSolve(w []float64) {
	m, n := s.m, len(w)
	l := s.a[3*m+3:]
	invd := s.invd[:n]
	for i := 0; i < n; i++ { // L y = w
		w[i] = (w[i] - dot4(l[i*m:i*m+i], w[:i])) * invd[i]
	}
	for i := n - 1; i >= 0; i-- { // Lᵀ x = y
		xi := w[i] * invd[i]
		w[i] = xi
		row := l[i*m : i*m+i]
		head := w[:i]
		for k, v := range row {
			head[k] -= xi * v
		}
	}
}

// inverseDiag writes into dst the first len(dst) ≤ m diagonal entries of
// the inverse of the saddle matrix, diag(Z (ZᵀAZ)⁻¹ Zᵀ), from the
// Cholesky factor (gonum's dtrtri). It destroys the factor; work is
// scratch, returned for reuse.
func (s *smallSystem) inverseDiag(dst, work []float64) []float64 {
	// With ZᵀAZ = LLᵀ (factor), the inverse's block in the reflected basis
	// is L⁻ᵀL⁻¹, so entry k of the diagonal of Q[0 0; 0 L⁻ᵀL⁻¹]Qᵀ is the
	// squared norm of row k of W = Q[0; L⁻ᵀ]. One triangular inverse
	// ((m−3)³/3 flops) and one pass of the reflectors per column suffice,
	// where forming the whole inverse would take twice the flops.
	m := s.m
	if ok := lapack64.Trtri(s.block()); !ok {
		for k := range dst {
			dst[k] = math.NaN()
		}
		return work
	}
	for k := range dst {
		dst[k] = 0
	}
	work = grow(work, m)
	for j := 3; j < m; j++ {
		col := work[:m]
		for i := range col {
			col[i] = 0
		}
		for i := 3; i <= j; i++ {
			col[i] = s.a[j*m+i] // (L⁻ᵀ)_ij = (L⁻¹)_ji, L⁻¹ lower triangular
		}
		s.reflect(col, false)
		for k := range dst {
			dst[k] += col[k] * col[k]
		}
	}
	return work
}
