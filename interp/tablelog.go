package interp

import "math"

// logBits is the number of leading mantissa bits that index the table.
const logBits = 10

// logTable holds log(c) and 1/c for c = 1 + i/2^logBits, i = 0 … 2^logBits,
// for tableLog. Each basis points to one (16 KiB), built by newLogTable.
type logTable struct {
	e [1<<logBits + 1]logEntry
}

// logEntry is one row of the table, 1/c and log c side by side so that a
// lookup touches one cache line.
type logEntry struct{ inv, lg float64 }

func newLogTable() *logTable {
	t := &logTable{}
	for i := range t.e {
		c := 1 + float64(i)/(1<<logBits)
		t.e[i] = logEntry{inv: 1 / c, lg: math.Log(c)}
	}
	return t
}

// log returns the natural logarithm of a finite x > 0: x = 2^k·m with m in
// [1, 2), m = c·(1 + t) with c = 1 + i/1024 from the top ten bits of m,
// log x = k·ln 2 + log c + log1p(t), and log1p(t) by its Taylor series to
// t⁵ (|t| < 1/1024, so the first term left out is below 2e-19), summed in
// Estrin's scheme, t − t²/2 + t³/3 + t⁴(−1/4 + t/5), whose chain of
// dependent operations is half as long as Horner's. The absolute error is
// a few 1e-16 (TestTableLog). Tang, ACM TOMS 16 (1990) describes this
// table-driven reduction.
func (lt *logTable) log(x float64) float64 {
	const (
		ln2Hi = 6.93147180369123816490e-01
		ln2Lo = 1.90821492927058770002e-10
	)
	bits := math.Float64bits(x)
	exp := int(bits>>52) - 1023
	if exp == -1023 {
		return logSubnormal(x)
	}
	i := int(bits>>(52-logBits)) & (1<<logBits - 1)
	m := math.Float64frombits(bits&(1<<52-1) | 1023<<52)
	e := lt.e[i]
	t := m*e.inv - 1
	t2 := t * t
	p := (t + t2*(-0.5+t*(1.0/3))) + t2*t2*(-0.25+t*0.2)
	k := float64(exp)
	return k*ln2Hi + (e.lg + (p + k*ln2Lo))
}

// logSubnormal is the logarithm of a subnormal x, which is rare enough to
// leave to the library; a separate function keeps tableLog.log small
// enough for the compiler to inline into the kernel loops.
//
//go:noinline
func logSubnormal(x float64) float64 { return math.Log(x) }
