package interp

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	"gonum.org/v1/gonum/mat"
)

// maxCondition is the largest condition number (1-norm estimate of the
// reduced system) a fit accepts. Beyond it the solution's relative error
// may reach 1e14 × 2.2e-16 ≈ 2 %; see Higham, Accuracy and Stability of
// Numerical Algorithms (2002), §7.
const maxCondition = 1e14

// globalFit is one interpolant over all readings:
// s(u) = Σ c_i φ(|u − u_i|) + d0 + d1 u + d2 v in scaled coordinates
// u = (x − cx)/scale, v = (y − cy)/scale.
type globalFit struct {
	b      basis
	cx, cy float64
	s      float64
	x, y   []float64 // centres, scaled
	c      []float64
	d      [3]float64
}

func (g *globalFit) Value(x, y float64) float64 {
	if g.b.k == ThinPlate {
		// The same sums as Evaluate and Gradient, to the last bit.
		v, _, _ := g.valueGrad(x, y)
		return v
	}
	u, v := (x-g.cx)/g.s, (y-g.cy)/g.s
	s := g.d[0] + g.d[1]*u + g.d[2]*v
	b := g.b
	for i, ci := range g.c {
		du, dv := u-g.x[i], v-g.y[i]
		s += ci * b.phi(du*du+dv*dv)
	}
	return s
}

func (g *globalFit) Gradient(x, y float64) (dx, dy float64) {
	_, dx, dy = g.valueGrad(x, y)
	return dx, dy
}

// valueGrad returns the value and gradient in one pass.
func (g *globalFit) valueGrad(x, y float64) (val, dx, dy float64) {
	u, v := (x-g.cx)/g.s, (y-g.cy)/g.s
	val = g.d[0] + g.d[1]*u + g.d[2]*v
	gu, gv := g.d[1], g.d[2]
	b := g.b
	if b.k == ThinPlate {
		ks, ku, kv := tpsValueGrad(g.c, g.x, g.y, u, v, b.lt)
		return val + ks, (gu + ku) / g.s, (gv + kv) / g.s
	}
	for i, ci := range g.c {
		du, dv := u-g.x[i], v-g.y[i]
		f, dr := b.phiD(du*du + dv*dv)
		val += ci * f
		gu += ci * dr * du
		gv += ci * dr * dv
	}
	return val, gu / g.s, gv / g.s
}

// kernelMatrix returns the n×n row-major matrix φ(|u_i − u_j|).
func kernelMatrix(x, y []float64, b basis) []float64 {
	n := len(x)
	a := make([]float64, n*n)
	parallelRange(n, func(lo, hi int) {
		for i := lo; i < hi; i++ {
			row := a[i*n : i*n+n]
			if b.k == ThinPlate {
				tpsRow(row, x, y, x[i], y[i], b.lt)
				continue
			}
			for j := range row {
				du, dv := x[i]-x[j], y[i]-y[j]
				row[j] = b.phi(du*du + dv*dv)
			}
		}
	})
	return a
}

// reduced is the null-space form of one global system: a = QᵀAQ (n×n,
// row-major), g = Qᵀf, and the factorisation of Q.
type reduced struct {
	n  int
	a  []float64
	g  []float64
	ns *nullSpace
}

func newReduced(x, y, f []float64, b basis) *reduced {
	n := len(x)
	r := &reduced{n: n, a: kernelMatrix(x, y, b), ns: newNullSpace(x, y)}
	r.ns.transform(r.a, true)
	r.g = append([]float64(nil), f...)
	r.ns.applyQt(r.g)
	return r
}

// block returns the (n−3)×(n−3) block ZᵀAZ as a symmetric view of r.a.
func (r *reduced) block() *mat.SymDense {
	var s mat.SymDense
	s.SetRawSymmetric(blas64.Symmetric{
		N: r.n - 3, Stride: r.n, Data: r.a[3*r.n+3:], Uplo: blas.Upper,
	})
	return &s
}

// cholesky factorises ZᵀAZ + λI, restoring r.a afterwards.
func (r *reduced) cholesky(lambda float64) (*mat.Cholesky, error) {
	r.shift(lambda)
	var ch mat.Cholesky
	ok := ch.Factorize(r.block())
	r.shift(-lambda)
	if !ok {
		return nil, fmt.Errorf("%d readings, smoothing %g: reduced kernel matrix not positive definite: %w", r.n, lambda, ErrIllConditioned)
	}
	if c := ch.Cond(); c > maxCondition || math.IsNaN(c) {
		return nil, fmt.Errorf("%d readings, smoothing %g: condition number %.2g above %.0g (try smoothing or another shape): %w", r.n, lambda, c, maxCondition, ErrIllConditioned)
	}
	return &ch, nil
}

func (r *reduced) shift(lambda float64) {
	for i := 3; i < r.n; i++ {
		r.a[i*r.n+i] += lambda
	}
}

// solve returns c and d for the factorised ZᵀAZ + λI.
func (r *reduced) solve(ch *mat.Cholesky) (c []float64, d [3]float64, err error) {
	n, m := r.n, r.n-3
	w := mat.NewVecDense(m, nil)
	if err := ch.SolveVecTo(w, mat.NewVecDense(m, append([]float64(nil), r.g[3:]...))); err != nil {
		return nil, d, fmt.Errorf("solving the reduced system: %w", ErrIllConditioned)
	}
	var rhs [3]float64
	for i := 0; i < 3; i++ {
		s := r.g[i]
		row := r.a[i*n+3 : i*n+n]
		for j, wj := range w.RawVector().Data {
			s -= row[j] * wj
		}
		rhs[i] = s
	}
	d = r.ns.solveR(rhs)
	c = make([]float64, n)
	copy(c[3:], w.RawVector().Data)
	r.ns.applyQ(c)
	return c, d, nil
}

// looDiag returns the first n diagonal entries of the inverse of the
// saddle-point matrix, diag(Z (ZᵀAZ + λI)⁻¹ Zᵀ), from the factorisation.
func (r *reduced) looDiag(ch *mat.Cholesky) ([]float64, error) {
	n, m := r.n, r.n-3
	var inv mat.SymDense
	if err := ch.InverseTo(&inv); err != nil {
		return nil, fmt.Errorf("inverting the reduced system: %w", ErrIllConditioned)
	}
	p := make([]float64, n*n)
	for i := 0; i < m; i++ {
		for j := 0; j < m; j++ {
			p[(i+3)*n+j+3] = inv.At(i, j)
		}
	}
	r.ns.transform(p, false)
	diag := make([]float64, n)
	for i := range diag {
		diag[i] = p[i*n+i]
	}
	return diag, nil
}

// fitGlobal fits one interpolant with the given basis and smoothing. With
// wantLOO it also returns Rippa's leave-one-out errors
// e_k = c_k / (A⁻¹)_kk (Rippa, Adv. Comput. Math. 11 (1999) 193–210).
func fitGlobal(ds *dataset, b basis, lambda float64, wantLOO bool) (*globalFit, float64, []float64, error) {
	r := newReduced(ds.x, ds.y, ds.v, b)
	if r.n == 3 {
		// Three readings not on one line fix the linear polynomial alone:
		// the kernel part vanishes (c = 0) and no reading can be left out.
		d := r.ns.solveR([3]float64{r.g[0], r.g[1], r.g[2]})
		g := &globalFit{b: b, cx: ds.cx, cy: ds.cy, s: ds.s, x: ds.x, y: ds.y, c: make([]float64, 3), d: d}
		var e []float64
		if wantLOO {
			e = []float64{math.NaN(), math.NaN(), math.NaN()}
		}
		return g, 1, e, nil
	}
	ch, err := r.cholesky(lambda)
	if err != nil {
		return nil, 0, nil, err
	}
	c, d, err := r.solve(ch)
	if err != nil {
		return nil, 0, nil, err
	}
	g := &globalFit{b: b, cx: ds.cx, cy: ds.cy, s: ds.s, x: ds.x, y: ds.y, c: c, d: d}
	if !wantLOO {
		return g, ch.Cond(), nil, nil
	}
	diag, err := r.looDiag(ch)
	if err != nil {
		return nil, 0, nil, err
	}
	e := make([]float64, len(c))
	for k := range e {
		e[k] = c[k] / diag[k]
	}
	return g, ch.Cond(), e, nil
}
