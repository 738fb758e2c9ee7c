package interp

import (
	"math"
	"runtime"
	"sync"
)

// nullSpace holds the Householder QR factorisation P = Q [R; 0] of the
// n×3 polynomial matrix P = [1 x y]. With Q = [Y Z], the columns of Z span
// the vectors c with Pᵀc = 0, so the saddle-point system
//
//	[A+λI  P] [c]   [f]
//	[Pᵀ    0] [d] = [0]
//
// becomes the symmetric positive definite system Zᵀ(A+λI)Z w = Zᵀf with
// c = Zw, and R d = Yᵀ(f − (A+λI)c). This is the null-space method of
// Beatson, Light & Billings, SIAM J. Sci. Comput. 22 (2000), and Wendland
// (2005) §8.5. It halves the work of an LU of the indefinite system, and
// the (1,1) block of the saddle matrix's inverse is Z (Zᵀ(A+λI)Z)⁻¹ Zᵀ,
// which Rippa's leave-one-out formula needs.
type nullSpace struct {
	n   int
	v   [3][]float64 // Householder vectors, v[k] supported on rows k..n-1
	tau [3]float64
	r   [3][3]float64 // upper triangular R
}

// newNullSpace factorises P = [1 x y].
func newNullSpace(x, y []float64) *nullSpace {
	n := len(x)
	ns := &nullSpace{n: n}
	p := make([][3]float64, n)
	for i := range p {
		p[i] = [3]float64{1, x[i], y[i]}
	}
	for k := 0; k < 3; k++ {
		var norm2 float64
		for i := k; i < n; i++ {
			norm2 += p[i][k] * p[i][k]
		}
		alpha := -sqrtSign(norm2, p[k][k])
		v := make([]float64, n)
		for i := k; i < n; i++ {
			v[i] = p[i][k]
		}
		v[k] -= alpha
		vv := norm2 - 2*alpha*p[k][k] + alpha*alpha
		tau := 0.0
		if vv > 0 {
			tau = 2 / vv
		}
		for j := k; j < 3; j++ {
			var dot float64
			for i := k; i < n; i++ {
				dot += v[i] * p[i][j]
			}
			for i := k; i < n; i++ {
				p[i][j] -= tau * dot * v[i]
			}
		}
		ns.v[k], ns.tau[k] = v, tau
	}
	for i := 0; i < 3; i++ {
		for j := i; j < 3; j++ {
			ns.r[i][j] = p[i][j]
		}
	}
	return ns
}

// sqrtSign returns sqrt(a) with the sign of b (+ for b = 0).
func sqrtSign(a, b float64) float64 {
	s := math.Sqrt(a)
	if b < 0 {
		return -s
	}
	return s
}

// applyQt overwrites f with Qᵀf.
func (ns *nullSpace) applyQt(f []float64) {
	for k := 0; k < 3; k++ {
		ns.reflect(k, f)
	}
}

// applyQ overwrites f with Qf.
func (ns *nullSpace) applyQ(f []float64) {
	for k := 2; k >= 0; k-- {
		ns.reflect(k, f)
	}
}

// reflect applies H_k = I − τ v vᵀ to f.
func (ns *nullSpace) reflect(k int, f []float64) {
	v, tau := ns.v[k], ns.tau[k]
	var dot float64
	for i := k; i < ns.n; i++ {
		dot += v[i] * f[i]
	}
	dot *= tau
	for i := k; i < ns.n; i++ {
		f[i] -= dot * v[i]
	}
}

// transform overwrites the symmetric n×n row-major matrix a with QᵀaQ
// (forward = true) or QaQᵀ (forward = false), in O(n²) per reflector:
// H a H = a − v wᵀ − w vᵀ with p = τ a v and w = p − (τ/2)(vᵀp) v.
func (ns *nullSpace) transform(a []float64, forward bool) {
	order := []int{0, 1, 2}
	if !forward {
		order = []int{2, 1, 0}
	}
	n := ns.n
	p := make([]float64, n)
	for _, k := range order {
		v, tau := ns.v[k], ns.tau[k]
		parallelRange(n, func(lo, hi int) {
			for i := lo; i < hi; i++ {
				row := a[i*n : i*n+n]
				var s float64
				for j := k; j < n; j++ {
					s += row[j] * v[j]
				}
				p[i] = tau * s
			}
		})
		var vp float64
		for i := k; i < n; i++ {
			vp += v[i] * p[i]
		}
		half := tau / 2 * vp
		for i := range p {
			p[i] -= half * v[i]
		}
		parallelRange(n, func(lo, hi int) {
			for i := lo; i < hi; i++ {
				row := a[i*n : i*n+n]
				vi, wi := v[i], p[i]
				for j := range row {
					row[j] -= vi*p[j] + wi*v[j]
				}
			}
		})
	}
}

// solveR solves R d = b for the 3×3 upper triangular R.
func (ns *nullSpace) solveR(b [3]float64) [3]float64 {
	var d [3]float64
	for i := 2; i >= 0; i-- {
		s := b[i]
		for j := i + 1; j < 3; j++ {
			s -= ns.r[i][j] * d[j]
		}
		d[i] = s / ns.r[i][i]
	}
	return d
}

// parallelRange splits [0, n) into one contiguous chunk per core and runs
// fn on each concurrently.
func parallelRange(n int, fn func(lo, hi int)) {
	w := min(runtime.GOMAXPROCS(0), n)
	if w <= 1 || n < 64 {
		fn(0, n)
		return
	}
	var wg sync.WaitGroup
	for t := 0; t < w; t++ {
		lo, hi := t*n/w, (t+1)*n/w
		wg.Add(1)
		go func() {
			defer wg.Done()
			fn(lo, hi)
		}()
	}
	wg.Wait()
}
