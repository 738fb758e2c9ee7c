package interp

import "math"

// logPos returns the natural logarithm of x for finite x > 0 (normal or
// subnormal). It is the algorithm of math.Log (FreeBSD's e_log.c: reduce
// to f = m − 1 with m in [√2/2, √2), then a degree-14 minimax polynomial
// in s = f/(2+f)), written so that the compiler inlines the range
// reduction instead of calling Frexp; it agrees with math.Log to an ulp
// or so. The thin-plate kernel's logarithm is the hot spot of every
// evaluation.
func logPos(x float64) float64 {
	const (
		ln2Hi = 6.93147180369123816490e-01
		ln2Lo = 1.90821492927058770002e-10
		l1    = 6.666666666666735130e-01
		l2    = 3.999999999940941908e-01
		l3    = 2.857142874366239149e-01
		l4    = 2.222219843214978396e-01
		l5    = 1.818357216161805012e-01
		l6    = 1.531383769920937332e-01
		l7    = 1.479819860511658591e-01
	)
	bits := math.Float64bits(x)
	exp := int(bits>>52) - 1023
	if exp == -1023 { // subnormal: rare, leave it to the library
		return math.Log(x)
	}
	m := math.Float64frombits(bits&(1<<52-1) | 1023<<52) // in [1, 2)
	if m > math.Sqrt2 {
		m *= 0.5
		exp++
	}
	f := m - 1
	k := float64(exp)
	s := f / (2 + f)
	s2 := s * s
	s4 := s2 * s2
	t1 := s2 * (l1 + s4*(l3+s4*(l5+s4*l7)))
	t2 := s4 * (l2 + s4*(l4+s4*l6))
	r := t1 + t2
	hfsq := 0.5 * f * f
	return k*ln2Hi - ((hfsq - (s*(hfsq+r) + k*ln2Lo)) - f)
}
