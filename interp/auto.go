package interp

import (
	"context"
	"fmt"
	"math"

	"gonum.org/v1/gonum/mat"
)

// The candidates automatic smoothing and shape choose from. Smoothing λ is
// in scaled coordinates, where the thin-plate kernel's entries are of
// order one: 0 and the decades 1e-9 … 100. The shape ε runs over factors of
// the kernel's default (defaultShape) from 1/8 to 4, so that both flat
// and peaked kernels are tried. Our choice, in the spirit of Rippa (1999),
// who scans ε over a range and keeps the leave-one-out minimum.
func smoothingCandidates() []float64 {
	return []float64{0, 1e-9, 1e-8, 1e-7, 1e-6, 1e-5, 1e-4, 1e-3, 1e-2, 1e-1, 1, 10, 100}
}

func shapeFactors() []float64 { return []float64{0.125, 0.25, 0.5, 1, 2, 4} }

// choice is the outcome of a leave-one-out search.
type choice struct {
	shape, lambda, rms float64
	note               string
}

// chooseGlobal picks the smoothing and/or shape with the least RMS
// leave-one-out error over the candidates, by Rippa's closed form
// (Rippa, Adv. Comput. Math. 11 (1999) 193–210). For each shape it
// diagonalises the reduced matrix ZᵀAZ = V D Vᵀ once; then for every λ the
// coefficients are c = G (D+λ)⁻¹ Gᵀf with G = ZV, and the diagonal of the
// inverse is Σ_k G_ik²/(d_k+λ), so all smoothing candidates cost O(N²)
// each after one O(N³) decomposition. Candidates whose condition
// (d_max+λ)/(d_min+λ) exceeds maxCondition are skipped.
func chooseGlobal(ctx context.Context, ds *dataset, opt Options, shape float64, progress func(int, int)) (choice, error) {
	shapes := []float64{shape}
	if opt.AutoShape && opt.Kernel.HasShape() {
		base := defaultShape(opt.Kernel, ds.h)
		shapes = shapes[:0]
		for _, f := range shapeFactors() {
			shapes = append(shapes, base*f)
		}
	}
	lambdas := []float64{opt.Smoothing}
	if opt.AutoSmoothing {
		lambdas = smoothingCandidates()
	}
	best := choice{rms: math.Inf(1)}
	for i, eps := range shapes {
		if err := ctx.Err(); err != nil {
			return best, err
		}
		progress(i, len(shapes)+1)
		scan, err := newLOOScan(ds, newBasis(opt.Kernel, eps))
		if err != nil {
			continue // this shape cannot be decomposed; try the others
		}
		for _, lam := range lambdas {
			if r, ok := scan.rms(lam); ok && r < best.rms {
				best = choice{shape: eps, lambda: lam, rms: r}
			}
		}
	}
	if math.IsInf(best.rms, 1) {
		return best, fmt.Errorf("automatic choice: every candidate smoothing and shape is too ill-conditioned: %w", ErrIllConditioned)
	}
	best.note = fmt.Sprintf("leave-one-out chose smoothing %g and shape %g (RMS leave-one-out error %.4g, %d smoothing × %d shape candidates)",
		best.lambda, best.shape, best.rms, len(lambdas), len(shapes))
	return best, nil
}

// looScan holds one shape's eigen-decomposition for scanning smoothing.
type looScan struct {
	n, m int
	d    []float64 // eigenvalues of ZᵀAZ
	gt   []float64 // Gᵀ = (ZV)ᵀ, m×n row-major
	gf   []float64 // Gᵀ f
}

func newLOOScan(ds *dataset, b basis) (*looScan, error) {
	r := newReduced(ds.x, ds.y, ds.v, b)
	n, m := r.n, r.n-3
	var eig mat.EigenSym
	if !eig.Factorize(r.block(), true) {
		return nil, fmt.Errorf("eigen-decomposition failed: %w", ErrIllConditioned)
	}
	s := &looScan{n: n, m: m, d: eig.Values(nil), gt: make([]float64, m*n), gf: make([]float64, m)}
	var v mat.Dense
	eig.VectorsTo(&v)
	parallelRange(m, func(lo, hi int) {
		for k := lo; k < hi; k++ {
			row := s.gt[k*n : k*n+n]
			for i := 0; i < m; i++ {
				row[i+3] = v.At(i, k)
			}
			r.ns.applyQ(row)
			var dot float64
			for i, g := range row {
				dot += g * ds.v[i]
			}
			s.gf[k] = dot
		}
	})
	return s, nil
}

// rms returns the RMS leave-one-out error for smoothing lam, and false
// when that system is too ill-conditioned.
func (s *looScan) rms(lam float64) (float64, bool) {
	dmin, dmax := math.Inf(1), math.Inf(-1)
	for _, d := range s.d {
		dmin, dmax = min(dmin, d+lam), max(dmax, d+lam)
	}
	if dmin <= 0 || dmax/dmin > maxCondition {
		return 0, false
	}
	c := make([]float64, s.n)
	diag := make([]float64, s.n)
	for k := 0; k < s.m; k++ {
		inv := 1 / (s.d[k] + lam)
		t := s.gf[k] * inv
		row := s.gt[k*s.n : k*s.n+s.n]
		for i, g := range row {
			c[i] += g * t
			diag[i] += g * g * inv
		}
	}
	var sum float64
	for i := range c {
		e := c[i] / diag[i]
		sum += e * e
	}
	return math.Sqrt(sum / float64(s.n)), true
}
