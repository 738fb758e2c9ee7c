package interp

import "math"

// smallSystem is a workspace for the saddle-point systems
//
//	[A+λI  P] [c]   [f]
//	[Pᵀ    0] [d] = [0],   P = [1 x y],
//
// of the partition-of-unity patches (a few dozen readings each). It uses
// a null-space method with a basis of Lagrange form (Beatson, Light &
// Billings, "Fast solution of the radial basis function interpolation
// equations: domain decomposition methods", SIAM J. Sci. Comput. 22
// (2000), §3): three readings that span a large triangle are the pivots;
// every other reading j has barycentric coordinates ℓⱼ with respect to
// them, so the columns of Z = [−L; I] (L = [ℓ₁ … ℓₙ], 3 × n) span the
// vectors c with Pᵀc = 0, and ZᵀAZ = A₂₂ − LᵀA₁₂ − A₂₁L + LᵀA₁₁L is
// positive definite (for conditionally positive definite kernels; Wendland,
// Scattered Data Approximation (2005), §8.5). It is formed by one
// symmetric rank-six update, half the work of the three Householder
// reflections of the global fit (nullSpace), and solved by Cholesky. One
// workspace per goroutine; it grows to the largest patch and is then
// reused without allocating.
type smallSystem struct {
	m    int       // readings
	a    []float64 // m×m row-major in pivot order: A+λI, then ZᵀAZ and its factor
	rhs  []float64 // m+3: the values, then after solve c (m) and d (3)
	f    []float64 // scratch for the caller's right-hand side
	perm []int     // pivot order: perm[i] is the reading at position i
	pos  []int     // inverse of perm
	xs   []float64 // coordinates in pivot order
	ys   []float64
	l    [3][]float64  // L: barycentric coordinates of the non-pivots
	mk   [3][]float64  // A₁₂ − ½A₁₁L
	p1   [3][3]float64 // inverse of P₁ = [1 x y] at the pivots
	flat bool          // the pivots (hence all readings) are nearly collinear
	g    []float64     // scratch vector
	work []float64     // the caller's scratch for inverseDiagAt
	invd []float64     // reciprocals of the Cholesky factor's diagonal
}

// build fills A+λI for points (x, y) in pivot order and keeps the
// right-hand side f. It computes the lower triangle of the non-pivot
// block and the pivot rows, which is all that factor reads.
func (s *smallSystem) build(x, y, f []float64, b basis, lambda float64) {
	m := len(x)
	s.m = m
	s.a, s.rhs, s.g = grow(s.a, m*m), grow(s.rhs, m+3), grow(s.g, m)
	s.xs, s.ys = grow(s.xs, m), grow(s.ys, m)
	s.pivot(x, y)
	xs, ys := s.xs, s.ys
	d0 := b.phi(0) + lambda
	for i := 0; i < m; i++ {
		// Row i: pivot rows in full (from column i on, mirrored below),
		// other rows from column 3 to the diagonal.
		lo, hi := 3, i
		if i < 3 {
			lo, hi = i+1, m
		}
		row := s.a[i*m : i*m+m]
		row[i] = d0
		if lo >= hi {
			continue
		}
		if b.k == ThinPlate {
			tpsRow(row[lo:hi], xs[lo:hi], ys[lo:hi], xs[i], ys[i], b.lt)
			continue
		}
		for j := lo; j < hi; j++ {
			du, dv := xs[i]-xs[j], ys[i]-ys[j]
			row[j] = b.phi(du*du + dv*dv)
		}
	}
	for i := 1; i < min(3, m); i++ {
		for j := 0; j < i; j++ {
			s.a[i*m+j] = s.a[j*m+i]
		}
	}
	copy(s.rhs, f)
}

// pivot chooses three readings spanning a large triangle (the one
// farthest from the centroid, the one farthest from it, and the one
// farthest from the line through both), orders the readings with them
// first, and computes the barycentric coordinates L of the others.
func (s *smallSystem) pivot(x, y []float64) {
	m := s.m
	s.perm, s.pos = growInt(s.perm, m), growInt(s.pos, m)
	var cx, cy float64
	for i := range x {
		cx += x[i]
		cy += y[i]
	}
	cx, cy = cx/float64(m), cy/float64(m)
	farthest := func(score func(i int) float64) int {
		best, bs := 0, -1.0
		for i := range x {
			if v := score(i); v > bs {
				best, bs = i, v
			}
		}
		return best
	}
	p0 := farthest(func(i int) float64 { return (x[i]-cx)*(x[i]-cx) + (y[i]-cy)*(y[i]-cy) })
	p1 := farthest(func(i int) float64 { return (x[i]-x[p0])*(x[i]-x[p0]) + (y[i]-y[p0])*(y[i]-y[p0]) })
	ux, uy := x[p1]-x[p0], y[p1]-y[p0]
	p2 := farthest(func(i int) float64 { return math.Abs(ux*(y[i]-y[p0]) - uy*(x[i]-x[p0])) })
	area2 := math.Abs(ux*(y[p2]-y[p0]) - uy*(x[p2]-x[p0]))
	s.flat = m < 3 || !(area2 > 1e-10*(ux*ux+uy*uy)) || p0 == p1
	if s.flat {
		for i := range s.perm {
			s.perm[i], s.pos[i] = i, i
		}
		copy(s.xs, x)
		copy(s.ys, y)
		return
	}
	k := 3
	s.perm[0], s.perm[1], s.perm[2] = p0, p1, p2
	for i := range x {
		if i != p0 && i != p1 && i != p2 {
			s.perm[k] = i
			k++
		}
	}
	for i, r := range s.perm {
		s.pos[r] = i
		s.xs[i], s.ys[i] = x[r], y[r]
	}
	// P₁⁻¹ for P₁ rows (1, xₖ, yₖ), by the adjugate.
	var p [3][3]float64
	for r := 0; r < 3; r++ {
		p[r] = [3]float64{1, s.xs[r], s.ys[r]}
	}
	det := p[0][0]*(p[1][1]*p[2][2]-p[1][2]*p[2][1]) -
		p[0][1]*(p[1][0]*p[2][2]-p[1][2]*p[2][0]) +
		p[0][2]*(p[1][0]*p[2][1]-p[1][1]*p[2][0])
	for r := 0; r < 3; r++ {
		for c := 0; c < 3; c++ {
			r1, r2 := (c+1)%3, (c+2)%3
			c1, c2 := (r+1)%3, (r+2)%3
			s.p1[r][c] = (p[r1][c1]*p[r2][c2] - p[r1][c2]*p[r2][c1]) / det
		}
	}
	// ℓⱼ = P₁⁻ᵀ (1, xⱼ, yⱼ): the weights with Σₖ ℓⱼₖ (1, xₖ, yₖ) = (1, xⱼ, yⱼ).
	n := m - 3
	for t := range s.l {
		s.l[t], s.mk[t] = grow(s.l[t], n), grow(s.mk[t], n)
	}
	for j := 0; j < n; j++ {
		xj, yj := s.xs[3+j], s.ys[3+j]
		for t := 0; t < 3; t++ {
			s.l[t][j] = s.p1[0][t] + s.p1[1][t]*xj + s.p1[2][t]*yj
		}
	}
}

// factor reduces the system to ZᵀAZ and factorises it. It returns a crude
// condition estimate, the largest diagonal entry of ZᵀAZ over the
// smallest squared Cholesky pivot, or +Inf when the factorisation fails or
// the points leave the polynomial undetermined.
func (s *smallSystem) factor() float64 {
	m := s.m
	if m <= 3 || s.flat {
		return math.Inf(1)
	}
	n := m - 3
	a := s.a
	// M = A₁₂ − ½A₁₁L, so that ZᵀAZ = A₂₂ − (LᵀM + MᵀL).
	for t := 0; t < 3; t++ {
		mt, a1 := s.mk[t][:n], a[t*m+3:t*m+m]
		a0, b0, c0 := a[t*m]/2, a[t*m+1]/2, a[t*m+2]/2
		l0, l1, l2 := s.l[0][:n], s.l[1][:n], s.l[2][:n]
		for j := range mt {
			mt[j] = a1[j] - (a0*l0[j] + b0*l1[j] + c0*l2[j])
		}
	}
	l0, l1, l2 := s.l[0][:n], s.l[1][:n], s.l[2][:n]
	m0, m1, m2 := s.mk[0][:n], s.mk[1][:n], s.mk[2][:n]
	var dmax float64
	for i := 0; i < n; i++ {
		row := a[(3+i)*m+3 : (3+i)*m+3+i+1]
		li0, li1, li2 := l0[i], l1[i], l2[i]
		mi0, mi1, mi2 := m0[i], m1[i], m2[i]
		r0, r1, r2 := l0[:len(row)], l1[:len(row)], l2[:len(row)]
		q0, q1, q2 := m0[:len(row)], m1[:len(row)], m2[:len(row)]
		for j := range row {
			row[j] -= (li0*q0[j] + mi0*r0[j]) + (li1*q1[j] + mi1*r1[j]) + (li2*q2[j] + mi2*r2[j])
		}
		dmax = max(dmax, math.Abs(row[i]))
	}
	if !s.cholesky() {
		return math.Inf(1)
	}
	pmin := math.Inf(1)
	for _, v := range s.invd[:n] {
		pmin = min(pmin, 1/(v*v))
	}
	return dmax / pmin
}

// cholesky factorises the lower-right block ZᵀAZ = LLᵀ in place, reading
// and writing its lower triangle, and reports whether the block is
// positive definite. It is the Cholesky–Banachiewicz order (Golub & Van
// Loan, Matrix Computations, 4th ed., §4.2.5): entry (i, j) of L needs the
// inner product of rows i and j of L, which lie along rows of the
// row-major block, summed four ways at once (dot4). At a few dozen
// unknowns this is faster than gonum's unblocked dpotf2.
func (s *smallSystem) cholesky() bool {
	m := s.m
	n := m - 3
	l := s.a[3*m+3:]
	s.invd = grow(s.invd, n)
	invd := s.invd
	i := 0
	// Two rows by two columns at a time: entries (i, j), (i, j+1),
	// (i+1, j) and (i+1, j+1) share rows i, i+1, j and j+1 of L, so each
	// element loaded serves two products.
	for ; i+1 < n; i += 2 {
		ri := l[i*m : i*m+i+1]
		rn := l[(i+1)*m : (i+1)*m+i+2]
		j := 0
		for ; j+1 < i; j += 2 {
			lj := l[j*m : j*m+j]
			lk := l[(j+1)*m : (j+1)*m+j+1]
			a, b, c := ri[:len(lj)], rn[:len(lj)], lk[:len(lj)]
			var s0, s1, t0, t1 float64
			for k, u := range lj {
				x, y, v := a[k], b[k], c[k]
				s0 += x * u
				s1 += x * v
				t0 += y * u
				t1 += y * v
			}
			ri[j] = (ri[j] - s0) * invd[j]
			rn[j] = (rn[j] - t0) * invd[j]
			ri[j+1] = (ri[j+1] - s1 - ri[j]*lk[j]) * invd[j+1]
			rn[j+1] = (rn[j+1] - t1 - rn[j]*lk[j]) * invd[j+1]
		}
		for ; j < i; j++ {
			lj := l[j*m : j*m+j]
			ri[j] = (ri[j] - dot4(ri[:j], lj)) * invd[j]
			rn[j] = (rn[j] - dot4(rn[:j], lj)) * invd[j]
		}
		d := ri[i] - dot4(ri[:i], ri[:i])
		if !(d > 0) {
			return false
		}
		d = math.Sqrt(d)
		ri[i], invd[i] = d, 1/d
		rn[i] = (rn[i] - dot4(rn[:i], ri[:i])) * invd[i]
		d = rn[i+1] - dot4(rn[:i+1], rn[:i+1])
		if !(d > 0) {
			return false
		}
		d = math.Sqrt(d)
		rn[i+1], invd[i+1] = d, 1/d
	}
	for ; i < n; i++ {
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

// solve overwrites b (length m+3, the values first, in the caller's
// order) with the coefficients c (m) and the polynomial part d (3): with
// c = Zw, (ZᵀAZ)w = Zᵀf = f₂ − Lᵀf₁, then c₁ = −Lw, c₂ = w, and d from
// the pivot rows, P₁d = f₁ − A₁₁c₁ − A₁₂c₂.
func (s *smallSystem) solve(b []float64) {
	m, n := s.m, s.m-3
	g := s.g[:m]
	for i, r := range s.perm[:m] {
		g[i] = b[r]
	}
	f1 := [3]float64{g[0], g[1], g[2]}
	w := g[3:]
	l0, l1, l2 := s.l[0][:n], s.l[1][:n], s.l[2][:n]
	for j := range w {
		w[j] -= l0[j]*f1[0] + l1[j]*f1[1] + l2[j]*f1[2]
	}
	s.cholSolve(w)
	c1 := [3]float64{-dot4(l0, w), -dot4(l1, w), -dot4(l2, w)}
	var r [3]float64
	for t := 0; t < 3; t++ {
		row := s.a[t*m : t*m+m]
		r[t] = f1[t] - (row[0]*c1[0] + row[1]*c1[1] + row[2]*c1[2]) - dot4(row[3:], w)
	}
	g[0], g[1], g[2] = c1[0], c1[1], c1[2]
	for i, v := range g {
		b[s.perm[i]] = v
	}
	for t := 0; t < 3; t++ {
		b[m+t] = s.p1[t][0]*r[0] + s.p1[t][1]*r[1] + s.p1[t][2]*r[2]
	}
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

// inverseDiagAt returns entry (k, k), k in the caller's order, of the
// inverse of the saddle matrix: (Z (ZᵀAZ)⁻¹ Zᵀ)_kk = ‖L⁻¹zₖ‖² with zₖ the
// k-th row of Z, from the Cholesky factor L (which it leaves intact); w
// is scratch of length ≥ m. For a non-pivot reading zₖ is a unit vector
// and the solve starts at its position; for a pivot it is minus that
// pivot's row of barycentric coordinates. At most (m−3)² flops, so a
// caller that needs a few entries of the diagonal pays far less than a
// whole inverse.
func (s *smallSystem) inverseDiagAt(k int, w []float64) float64 {
	m, n := s.m, s.m-3
	y := w[:n]
	from := 0
	if pk := s.pos[k]; pk >= 3 {
		from = pk - 3
		for i := range y {
			y[i] = 0
		}
		y[from] = 1
	} else {
		for j, v := range s.l[pk][:n] {
			y[j] = -v
		}
	}
	l := s.a[3*m+3:]
	var sum float64
	for i := from; i < n; i++ { // L x = y, x overwriting y
		xi := (y[i] - dot4(l[i*m+from:i*m+i], y[from:i])) * s.invd[i]
		y[i] = xi
		sum += xi * xi
	}
	return sum
}

// inverseDiag writes into dst the first len(dst) ≤ m diagonal entries of
// the inverse of the saddle matrix, diag(Z (ZᵀAZ)⁻¹ Zᵀ), in the caller's
// order (see inverseDiagAt); work is scratch, returned for reuse.
func (s *smallSystem) inverseDiag(dst, work []float64) []float64 {
	work = grow(work, s.m)
	for k := range dst {
		dst[k] = s.inverseDiagAt(k, work)
	}
	return work
}

// growInt returns s resized to n, reallocating only when it must.
func growInt(s []int, n int) []int {
	if cap(s) < n {
		return make([]int, n)
	}
	return s[:n]
}
