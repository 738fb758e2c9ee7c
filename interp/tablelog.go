package interp

import "math"

// logTable holds log(c) and 1/c for c = 1 + i/256, i = 0 … 256, for
// tableLog. Each basis points to one (4 KiB), built by newLogTable.
type logTable struct {
	inv [257]float64
	lg  [257]float64
}

func newLogTable() *logTable {
	t := &logTable{}
	for i := range t.inv {
		c := 1 + float64(i)/256
		t.inv[i], t.lg[i] = 1/c, math.Log(c)
	}
	return t
}

// log returns the natural logarithm of a finite x > 0: x = 2^k·m with m in
// [1, 2), m = c·(1 + t) with c = 1 + i/256 from the top eight bits of m,
// log x = k·ln 2 + log c + log1p(t), and log1p(t) by its Taylor series to
// t⁶ (|t| < 1/256, so the first term left out is below 2e-18). The
// absolute error is a few 1e-16 (TestTableLog). Tang, ACM TOMS 16 (1990)
// describes this table-driven reduction.
func (lt *logTable) log(x float64) float64 {
	const (
		ln2Hi = 6.93147180369123816490e-01
		ln2Lo = 1.90821492927058770002e-10
	)
	bits := math.Float64bits(x)
	exp := int(bits>>52) - 1023
	if exp == -1023 {
		return math.Log(x) // subnormal: rare, leave it to the library
	}
	i := int(bits>>44) & 0xff
	m := math.Float64frombits(bits&(1<<52-1) | 1023<<52)
	t := m*lt.inv[i] - 1
	p := t * (1 + t*(-0.5+t*(1.0/3+t*(-0.25+t*(0.2-t*(1.0/6))))))
	k := float64(exp)
	return k*ln2Hi + (lt.lg[i] + (p + k*ln2Lo))
}
