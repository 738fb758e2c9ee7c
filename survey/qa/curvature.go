package qa

import (
	"math"

	"gonum.org/v1/gonum/mat"
)

// The curvature allowance of the spike check: how large a leave-one-out
// residual the smooth bending of the surface alone explains at a spot.
//
// Why. Leave a reading out at a true extremum of the potential and the fit
// of the others cannot know how high the peak rises between them: its
// prediction there undershoots. For a function with Hessian H, an
// interpolant exact on linear functions that predicts at x from readings
// at offsets d_j with weights w_j (Σw_j = 1, Σw_j d_j = 0) errs by
//
//	f(x) − Σ w_j f(x + d_j) ≈ −½ Σ w_j d_jᵀ H d_j,  at most ½ max|λ(H)| ρ²
//
// in size, ρ² = Σ w_j |d_j|² being the squared distance to the readings
// around (the Taylor expansion behind the h² order of the error of linear
// interpolation; the error of radial basis interpolants on smooth data has
// the same order in the fill distance: Wendland, Scattered Data
// Approximation (2005), ch. 11, from memory). On a smooth stretch of a
// survey this is far below the noise; over an injection electrode sampled
// at spacings near its depth it is hundreds of millivolts, while the
// robust scale of all residuals stays at the noise. A residual must
// therefore be judged against what the local curvature explains, not
// against the global scale alone.
//
// How. The curvature at a candidate is estimated WITHOUT the candidate: a
// least-squares quadratic through its curvatureNeighbours nearest spots in
// the fit (local polynomial regression as in W. S. Cleveland and S. J.
// Devlin, J. Amer. Statist. Assoc. 83 (1988) 596–610, unweighted). Each
// eigenvalue of the quadratic's Hessian is shrunk towards zero by
// curvatureZ of its standard error (the robust scale taken as the noise of
// a reading and propagated through the least squares), so that curvature
// the noise alone could make excuses nothing: a spike on a flat or evenly
// sloping part of a survey keeps its full weight. The allowance is
//
//	a = F · ½ · max(|λ_min|, |λ_max|) · ρ²,
//
// ρ² the mean squared distance of the candidate's curvatureRing nearest
// spots, and F = curvatureFactor where the candidate's value is above or
// below all of its kNeighbours nearest (an extremum of the readings),
// curvatureFactorSlope elsewhere. A candidate is a spike only when its
// deviation exceeds a by more than SpikeK times the robust scale (after
// the gap factor, as before: see unexplained).
//
// The allowance is two-sided on purpose. The sign of the undershoot at an
// extremum follows its curvature, but next to an extremum too sharp for
// the spacing the spline rings (a reading beside the minimum over a return
// electrode stands above the fit), and on the ring where the curvature
// changes sign the quadratic's curvature in the residual's direction is
// near zero: a one-sided band needed a factor of about 60 there on the
// closed form below at h = 0.8 d (measured while calibrating).
//
// The factors. The quadratic through a ring of readings sees the average
// curvature of the ring, less than the curvature at a sharp peak inside
// it. For the surface potential of a point source at depth d, ρI/(2π
// √(r²+d²)) (Telford, Geldart & Sheriff, Applied Geophysics (1990),
// ch. 8), sampled on a square grid at spacing h, the largest ratio of the
// spline's leave-one-out residual to ½ max|λ| ρ² is at the peak, and
// grows with h/d: 0.31 at h = 0.4 d, 0.78 at 0.6 d, 1.42 at 0.8 d, 2.19 at
// d, 3.06 at 1.2 d, 4.49 at 1.5 d; over all readings that are not an
// extremum it is 0.18, 0.21, 0.31, 0.38, 0.63 and 0.99 (TestCurvatureFactor
// measures both). F = 4 at an extremum covers spacings up to about 1.35
// times the depth of the shallowest source, F = 1 elsewhere covers them
// with a margin for noise, and keeps the allowance small on slopes, where
// a spike is no extremum unless it is larger than the change of the
// potential across a spacing. Coarser than 1.35 d, a peak is not resolved
// by the survey and its reading cannot be told from a spike by any local
// test; the technician confirms such a reading by repeating it, which the
// check honours.
const (
	// curvatureNeighbours is the number of spots the quadratic is fitted
	// through: the two nearest rings of a square grid (4 + 4) and four
	// more, enough for six coefficients with some redundancy.
	curvatureNeighbours = 12
	// minCurvatureNeighbours is the fewest spots a quadratic is fitted
	// through (six coefficients and one degree of freedom).
	minCurvatureNeighbours = 7
	// curvatureRing is how many of the nearest spots give ρ²: the ring of
	// four that encloses a spot of a square grid.
	curvatureRing = 4
	// curvatureZ shrinks each curvature by this many standard errors (a
	// one-sided 97.7 % bound for normal errors).
	curvatureZ = 2.0
	// curvatureFactor is F above, at a reading that is an extremum of
	// its kNeighbours nearest; curvatureFactorSlope is F at other
	// readings.
	curvatureFactor      = 4.0
	curvatureFactorSlope = 1.0
	// maxCurvatureCond is the largest condition number of the normal
	// equations (in coordinates scaled by ρ) still taken to determine a
	// quadratic: beyond it the spots lie too nearly on one line (the
	// design matrix's own condition is about its square root, 10⁴).
	maxCurvatureCond = 1e8
	// curvatureReach bounds the distance of the spots the quadratic is
	// fitted through, in typical spacings: a spot set apart (a base
	// station) gets no allowance from readings far away.
	curvatureReach = 5.0
)

// curvatureAllowance returns the allowance a for spot k from the spots
// around it that are in the fit (not out), sigma being the noise of a
// reading. A neighbourhood through which no quadratic can be fitted (too
// few spots, or all on one line) gives no allowance.
func (n *neighbourIndex) curvatureAllowance(k int, out []bool, sigma float64) float64 {
	nb, d2 := n.nearestN(k, 2*curvatureNeighbours)
	dx := make([]float64, 0, curvatureNeighbours)
	dy := make([]float64, 0, curvatureNeighbours)
	vs := make([]float64, 0, curvatureNeighbours)
	var rho2 float64
	for m, j := range nb {
		if out[j] || d2[m] > curvatureReach*curvatureReach*n.h2 {
			continue
		}
		if len(dx) < curvatureRing {
			rho2 += d2[m] / curvatureRing
		}
		dx, dy = append(dx, n.spots[j].x-n.spots[k].x), append(dy, n.spots[j].y-n.spots[k].y)
		vs = append(vs, n.spots[j].v)
		if len(dx) == curvatureNeighbours {
			break
		}
	}
	if len(dx) < minCurvatureNeighbours {
		return 0
	}
	lam, ok := curvature(dx, dy, vs, math.Sqrt(rho2), sigma)
	if !ok {
		return 0
	}
	f := curvatureFactorSlope
	if isExtremum(n.spots[k].v, vs[:min(len(vs), kNeighbours)]) {
		f = curvatureFactor
	}
	return f * 0.5 * lam * rho2
}

// isExtremum reports whether v is above every value of vs or below every
// one: whether a reading stands at a local extremum of its nearest
// readings.
func isExtremum(v float64, vs []float64) bool {
	above, below := true, true
	for _, w := range vs {
		above = above && v > w
		below = below && v < w
	}
	return above || below
}

// curvature fits q(d) = c + g·d + ½ dᵀHd by least squares to values vs at
// offsets (dx, dy), in units of s for conditioning, and returns the larger
// magnitude of H's two eigenvalues after shrinking each towards zero by
// curvatureZ standard errors (noise sigma per value). ok is false when the
// offsets do not determine a quadratic.
func curvature(dx, dy, vs []float64, s, sigma float64) (lam float64, ok bool) {
	n := len(dx)
	x := mat.NewDense(n, 6, nil)
	for i := range n {
		u, v := dx[i]/s, dy[i]/s
		x.SetRow(i, []float64{1, u, v, u * u / 2, u * v, v * v / 2})
	}
	var xtx mat.SymDense
	xtx.SymOuterK(1, x.T())
	var ch mat.Cholesky
	if !ch.Factorize(&xtx) || ch.Cond() > maxCurvatureCond {
		return 0, false
	}
	var xtv, coef mat.VecDense
	xtv.MulVec(x.T(), mat.NewVecDense(n, vs))
	if err := ch.SolveVecTo(&coef, &xtv); err != nil {
		return 0, false
	}
	var cov mat.SymDense
	if err := ch.InverseTo(&cov); err != nil {
		return 0, false
	}
	hxx, hxy, hyy := coef.AtVec(3), coef.AtVec(4), coef.AtVec(5)
	eig, vec := eigenSym2(hxx, hxy, hyy)
	for e := range 2 {
		c, sn := vec[e][0], vec[e][1]
		// λ = c²hxx + 2cs hxy + s²hyy for the fixed eigenvector (c, s).
		u := []float64{0, 0, 0, c * c, 2 * c * sn, sn * sn}
		se := sigma * math.Sqrt(math.Max(0, mat.Inner(mat.NewVecDense(6, u), &cov, mat.NewVecDense(6, u))))
		lam = math.Max(lam, math.Abs(eig[e])-curvatureZ*se)
	}
	return lam / (s * s), true
}

// eigenSym2 returns the eigenvalues of [[a, b], [b, c]], smaller first,
// and their unit eigenvectors.
func eigenSym2(a, b, c float64) (lam [2]float64, vec [2][2]float64) {
	mid, rad := (a+c)/2, math.Hypot((a-c)/2, b)
	lam = [2]float64{mid - rad, mid + rad}
	// The eigenvector of mid + rad is at angle θ with tan 2θ = 2b/(a − c).
	th := 0.5 * math.Atan2(2*b, a-c)
	vec[1] = [2]float64{math.Cos(th), math.Sin(th)}
	vec[0] = [2]float64{-math.Sin(th), math.Cos(th)}
	return lam, vec
}
