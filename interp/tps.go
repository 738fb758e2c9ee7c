package interp

import "math"

// The two hottest loops of the partition of unity, specialised to the
// thin-plate spline φ(r) = r² log r = ½ r² log r², the default kernel:
// filling a row of a patch matrix and evaluating a patch with its
// gradient. They compute exactly what basis.phi and basis.phiD compute,
// with the table logarithm (logTable.log) written out inline, which the
// compiler will not do for a function of its size; at 10⁶ readings this
// saves about a fifth of the run (interp/BENCHMARKS.md).

// Keep the written-out logarithm in step with logTable.log;
// TestTPSLoopsMatchBasis checks both loops against basis.phi and phiD.

// tpsRow sets row[j] = φ(|(xi, yi) − (xs[j], ys[j])|) for every j.
func tpsRow(row, xs, ys []float64, xi, yi float64, lt *logTable) {
	const (
		ln2Hi = 6.93147180369123816490e-01
		ln2Lo = 1.90821492927058770002e-10
	)
	xs, ys = xs[:len(row)], ys[:len(row)]
	for j := range row {
		du, dv := xi-xs[j], yi-ys[j]
		r2 := du*du + dv*dv
		bits := math.Float64bits(r2)
		exp := int(bits>>52) - 1023
		var l float64
		if exp == -1023 {
			if r2 == 0 {
				row[j] = 0
				continue
			}
			l = logSubnormal(r2)
		} else {
			i := int(bits>>(52-logBits)) & (1<<logBits - 1)
			m := math.Float64frombits(bits&(1<<52-1) | 1023<<52)
			e := lt.e[i]
			t := m*e.inv - 1
			t2 := t * t
			p := (t + t2*(-0.5+t*(1.0/3))) + t2*t2*(-0.25+t*0.2)
			k := float64(exp)
			l = k*ln2Hi + (e.lg + (p + k*ln2Lo))
		}
		row[j] = 0.5 * r2 * l
	}
}

// tpsValueGrad returns Σ c_j φ(|(u, v) − (xs[j], ys[j])|) and its
// gradient.
func tpsValueGrad(c, xs, ys []float64, u, v float64, lt *logTable) (s, su, sv float64) {
	const (
		ln2Hi = 6.93147180369123816490e-01
		ln2Lo = 1.90821492927058770002e-10
	)
	xs, ys = xs[:len(c)], ys[:len(c)]
	for j, cj := range c {
		du, dv := u-xs[j], v-ys[j]
		r2 := du*du + dv*dv
		bits := math.Float64bits(r2)
		exp := int(bits>>52) - 1023
		var l float64
		if exp == -1023 {
			if r2 == 0 {
				continue // φ and its gradient vanish at r = 0
			}
			l = logSubnormal(r2)
		} else {
			i := int(bits>>(52-logBits)) & (1<<logBits - 1)
			m := math.Float64frombits(bits&(1<<52-1) | 1023<<52)
			e := lt.e[i]
			t := m*e.inv - 1
			t2 := t * t
			p := (t + t2*(-0.5+t*(1.0/3))) + t2*t2*(-0.25+t*0.2)
			k := float64(exp)
			l = k*ln2Hi + (e.lg + (p + k*ln2Lo))
		}
		s += cj * 0.5 * r2 * l
		g := cj * (l + 1)
		su += g * du
		sv += g * dv
	}
	return s, su, sv
}
