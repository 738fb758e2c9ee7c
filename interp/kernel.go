package interp

import (
	"fmt"
	"math"
	"strings"
)

// Every kernel is fitted with the linear polynomial 1, x, y appended and the
// matching side conditions. The thin-plate spline and the cubic need at
// least that (they are conditionally positive definite of order 2); the
// multiquadric needs a constant and the others none, but the linear part
// costs little and makes every kernel reproduce linear fields exactly.
//
// The kernels, φ as a function of the distance r in scaled coordinates:
//
//   - ThinPlate: φ(r) = r² log r, φ(0) = 0. Duchon, "Splines minimizing
//     rotation-invariant semi-norms in Sobolev spaces" (1976); Wendland,
//     Scattered Data Approximation (2005), §8.3. No shape parameter.
//   - Cubic: φ(r) = r³, the polyharmonic spline of odd degree 3; Wendland
//     (2005), §8.3. No shape parameter.
//   - Multiquadric: φ(r) = −sqrt(1 + (εr)²). Hardy, J. Geophys. Res. 76
//     (1971) 1905–1915. The sign is flipped from Hardy's so that the
//     kernel is conditionally positive definite and smoothing λ ≥ 0 acts
//     as regularisation; the interpolant itself does not change.
//   - InverseMultiquadric: φ(r) = 1/sqrt(1 + (εr)²). Hardy (1971);
//     positive definite (Micchelli, Constr. Approx. 2 (1986)).
//   - Gaussian: φ(r) = exp(−(εr)²). Positive definite; Wendland (2005),
//     §6.1.
//   - WendlandC2: φ(r) = (1 − s)₊⁴ (4s + 1) with s = εr, support radius
//     1/ε. Wendland, Adv. Comput. Math. 4 (1995) 389–396, φ₃,₁.
//   - WendlandC4: φ(r) = (1 − s)₊⁶ (35s² + 18s + 3), s = εr. Wendland
//     (1995), φ₃,₂.
//
// Default shapes are set from the mean spacing h = sqrt(area/N) of the
// points in scaled coordinates (see defaultShape).

// kernelNames maps each kernel to its command-line name and aliases. The
// first name is the one String returns.
func kernelNames(k Kernel) []string {
	switch k {
	case ThinPlate:
		return []string{"thin-plate", "tps", "thin_plate_spline", "thinplate"}
	case Cubic:
		return []string{"cubic", "r3"}
	case Multiquadric:
		return []string{"multiquadric", "mq"}
	case InverseMultiquadric:
		return []string{"inverse-multiquadric", "imq", "inverse_multiquadric"}
	case Gaussian:
		return []string{"gaussian"}
	case WendlandC2:
		return []string{"wendland-c2", "wendland_c2"}
	case WendlandC4:
		return []string{"wendland-c4", "wendland_c4"}
	}
	return nil
}

// String returns the kernel's command-line name, for example "thin-plate".
func (k Kernel) String() string {
	if names := kernelNames(k); names != nil {
		return names[0]
	}
	return fmt.Sprintf("Kernel(%d)", int(k))
}

// HasShape reports whether the kernel has a shape parameter ε.
func (k Kernel) HasShape() bool { return k != ThinPlate && k != Cubic }

// ParseKernel reads a kernel name as written on the command line: the
// names String returns (thin-plate, cubic, multiquadric,
// inverse-multiquadric, gaussian, wendland-c2, wendland-c4), a few aliases
// (tps, thin_plate_spline, mq, imq), in any case. An empty string is the
// default thin-plate spline.
func ParseKernel(s string) (Kernel, error) {
	t := strings.ToLower(strings.TrimSpace(s))
	if t == "" {
		return ThinPlate, nil
	}
	for k := ThinPlate; k <= WendlandC4; k++ {
		for _, n := range kernelNames(k) {
			if t == n {
				return k, nil
			}
		}
	}
	return ThinPlate, fmt.Errorf("unknown kernel %q (want one of thin-plate, cubic, multiquadric, inverse-multiquadric, gaussian, wendland-c2, wendland-c4)", s)
}

// basis is a kernel with its shape fixed, ready to evaluate. It is a small
// value type so the hot loops can copy it onto the stack.
type basis struct {
	k    Kernel
	eps  float64   // shape ε (scaled coordinates)
	eps2 float64   // ε²
	lt   *logTable // for the thin-plate spline's logarithm
}

func newBasis(k Kernel, eps float64) basis {
	b := basis{k: k, eps: eps, eps2: eps * eps}
	if k == ThinPlate {
		b.lt = newLogTable()
	}
	return b
}

// scaled returns the basis for coordinates divided by f (a patch's
// radius): the shape becomes ε·f; the log table is shared.
func (b basis) scaled(f float64) basis {
	e := b.eps * f
	return basis{k: b.k, eps: e, eps2: e * e, lt: b.lt}
}

// phi returns φ at squared distance r2.
func (b basis) phi(r2 float64) float64 {
	switch b.k {
	case ThinPlate:
		if r2 == 0 {
			return 0
		}
		return 0.5 * r2 * b.lt.log(r2)
	case Cubic:
		return r2 * math.Sqrt(r2)
	case Multiquadric:
		return -math.Sqrt(1 + b.eps2*r2)
	case InverseMultiquadric:
		return 1 / math.Sqrt(1+b.eps2*r2)
	case Gaussian:
		return math.Exp(-b.eps2 * r2)
	case WendlandC2:
		s := b.eps * math.Sqrt(r2)
		if s >= 1 {
			return 0
		}
		t := 1 - s
		t2 := t * t
		return t2 * t2 * (4*s + 1)
	case WendlandC4:
		s := b.eps * math.Sqrt(r2)
		if s >= 1 {
			return 0
		}
		t := 1 - s
		t2 := t * t
		return t2 * t2 * t2 * (35*s*s + 18*s + 3)
	}
	panic("interp: unknown kernel") // unreachable: Fit validates the kernel
}

// phiD returns φ and φ'(r)/r at squared distance r2. The gradient of
// φ(|p − c|) with respect to p is (φ'(r)/r)·(p − c). The second value is
// finite everywhere (for the thin-plate spline, whose φ'(r)/r = 2 log r + 1
// diverges, phiD returns 0 at r = 0, where the gradient (r·O(log r)) is 0).
func (b basis) phiD(r2 float64) (f, dr float64) {
	switch b.k {
	case ThinPlate:
		if r2 == 0 {
			return 0, 0
		}
		l := b.lt.log(r2)
		return 0.5 * r2 * l, l + 1
	case Cubic:
		r := math.Sqrt(r2)
		return r2 * r, 3 * r
	case Multiquadric:
		q := math.Sqrt(1 + b.eps2*r2)
		return -q, -b.eps2 / q
	case InverseMultiquadric:
		q := 1 / math.Sqrt(1+b.eps2*r2)
		return q, -b.eps2 * q * q * q
	case Gaussian:
		e := math.Exp(-b.eps2 * r2)
		return e, -2 * b.eps2 * e
	case WendlandC2:
		s := b.eps * math.Sqrt(r2)
		if s >= 1 {
			return 0, 0
		}
		t := 1 - s
		t3 := t * t * t
		return t3 * t * (4*s + 1), -20 * b.eps2 * t3
	case WendlandC4:
		s := b.eps * math.Sqrt(r2)
		if s >= 1 {
			return 0, 0
		}
		t := 1 - s
		t5 := t * t * t * t * t
		return t5 * t * (35*s*s + 18*s + 3), -56 * b.eps2 * t5 * (5*s + 1)
	}
	panic("interp: unknown kernel")
}

// defaultShape returns ε for kernel k when the points have mean spacing h
// in scaled coordinates: 1/h for the multiquadric, 1/(3h) for the inverse
// multiquadric, 1/(2h) for the Gaussian, and a support radius of 12h for
// Wendland's functions. These were chosen on Franke's test function at 100
// to 1,600 points (interp's tests) as the flattest values whose condition
// stays well under maxCondition at 2,000 readings; flat kernels are the
// more accurate ones (Fornberg & Zuev, Comput. Math. Appl. 54 (2007)).
// Kernels without a shape get 0.
func defaultShape(k Kernel, h float64) float64 {
	switch k {
	case Multiquadric:
		return 1 / h
	case InverseMultiquadric:
		return 1 / (3 * h)
	case Gaussian:
		return 1 / (2 * h)
	case WendlandC2, WendlandC4:
		return 1 / (12 * h)
	}
	return 0
}
