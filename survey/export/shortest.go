package export

import (
	"math"
	"math/bits"
	"slices"
	"strconv"
)

// Bounds of the range appendShortest formats itself; values outside it
// (and NaN, ±Inf, exact powers of two) go to strconv.
//
//   - shortestMin = 1e-10: with v ≥ 2^-34, K ≤ 26 and s ≤ 60 (see
//     appendShortest), so 5^K fits the table and every shift is below 64.
//   - shortestMax = 1e15 < 2^50: with v < 2^50, s ≥ 2; shortestDigits needs
//     s ≥ 1.
//   - smallIntMax = 1e6: integers below it are written in plain notation by
//     the 'g' rule (exponent < 6), so strconv.AppendInt writes them.
const (
	shortestMin = 1e-10
	shortestMax = 1e15
	smallIntMax = 1e6
)

// pow5 holds 5^0 … 5^26, the powers appendShortest multiplies by.
var pow5 = func() (p [27]uint64) {
	p[0] = 1
	for i := 1; i < len(p); i++ {
		p[i] = 5 * p[i-1]
	}
	return p
}()

// pow10 holds 10^0 … 10^19.
var pow10 = func() (p [20]uint64) {
	p[0] = 1
	for i := 1; i < len(p); i++ {
		p[i] = 10 * p[i-1]
	}
	return p
}()

// appendShortest appends v exactly as strconv.AppendFloat(dst, v, 'g', -1,
// 64) does, only faster for the values a grid holds: the fewest significant
// digits that read back to v, the nearest such decimal when several have
// that length (ties to the even one), plain notation for decimal exponents
// -4 … 5 and d.ddde±XX otherwise.
//
// Method: the free-format criterion of Steele and White ("How to print
// floating-point numbers accurately", PLDI 1990) evaluated exactly in
// 128-bit fixed point; it picks the digits that Ryū (Adams, PLDI 2018) and
// Dragonbox (Jeon, 2020; strconv's algorithm) pick. Write v = m·2^e (m the
// 53-bit significand), K = ⌊−e·log10 2⌋+1 and s = −e−K ≥ 2. In units of
// 10^-K, v is V = m·5^K/2^s and the decimals that read back as v fill the
// interval V ± 5^K/2^(s+1), whose half-width lies in (0.5, 5]. Its bounds
// are odd multiples of 1/2^(s+1), so never integers: no candidate ever
// sits on a bound, and whether the bounds belong to the interval (they do
// when m is even) never matters. The largest d for which a multiple of
// 10^d lies inside gives the shortest length; of those multiples the one
// nearest V wins. Exact powers of two have a narrower lower half-interval
// and are left to strconv.
func appendShortest(dst []byte, v float64) []byte {
	a := math.Abs(v)
	if a == 0 {
		if math.Signbit(v) {
			return append(dst, "-0"...)
		}
		return append(dst, '0')
	}
	if !(a >= shortestMin && a < shortestMax) { // also NaN and ±Inf
		return strconv.AppendFloat(dst, v, 'g', -1, 64)
	}
	if a < smallIntMax && a == math.Trunc(a) {
		return strconv.AppendInt(dst, int64(v), 10)
	}
	b := math.Float64bits(a)
	mant := b&(1<<52-1) | 1<<52
	if mant == 1<<52 {
		return strconv.AppendFloat(dst, v, 'g', -1, 64)
	}
	e := int(b>>52) - 1075 // v = mant·2^e, e in [-86, -3] here
	k := (-e*78913)>>18 + 1
	s := uint(-e - k)
	c, d := shortestDigits(mant, pow5[k], s)
	if v < 0 {
		dst = append(dst, '-')
	}
	return appendDecimal(dst, c, d-k)
}

// shortestDigits returns the decimal c·10^d nearest V = mant·p/2^s among
// those with the fewest significant digits inside the open interval
// V ± p/2^(s+1) (p = 5^K), c not a multiple of 10. The caller guarantees a
// half-width in (0.5, 5], so the interval holds an integer, and V has no
// tie at d ≥ 1 (a tie would be 5·10^(d-1) ≥ 5 away).
func shortestDigits(mant, p uint64, s uint) (c uint64, d int) {
	xh, xl := bits.Mul64(mant, p) // X = mant·p, V = X/2^s
	vi := xh<<(64-s) | xl>>s      // ⌊V⌋
	vf := xl & (1<<s - 1)         // V's fraction, in units of 2^-s
	// 2X ± p over 2^(s+1): the bounds, floored.
	th, tl := xh<<1|xl>>63, xl<<1
	ul, carry := bits.Add64(tl, p, 0)
	uh := th + carry
	ll, borrow := bits.Sub64(tl, p, 0)
	lh := th - borrow
	hi := uh<<(63-s) | ul>>(s+1)     // largest integer inside
	lo := lh<<(63-s) | ll>>(s+1) + 1 // smallest; the bound is never an integer
	// Drop digits while a multiple of the next power of ten is inside.
	// Whether one of 10^d is inside only fails from some d on, so after
	// two single steps (where full-precision values stop) jumps of 8, 4,
	// 2 and 1 find the last d that holds; d ≤ 16 as V < 10^17.
	q := vi
	for range 2 {
		if hi/10 < (lo+9)/10 {
			goto round
		}
		hi, lo, q, d = hi/10, (lo+9)/10, q/10, d+1
	}
	if hi/1e8 >= (lo+1e8-1)/1e8 {
		hi, lo, q, d = hi/1e8, (lo+1e8-1)/1e8, q/1e8, d+8
	}
	if hi/1e4 >= (lo+1e4-1)/1e4 {
		hi, lo, q, d = hi/1e4, (lo+1e4-1)/1e4, q/1e4, d+4
	}
	if hi/100 >= (lo+99)/100 {
		hi, lo, q, d = hi/100, (lo+99)/100, q/100, d+2
	}
	if hi/10 >= (lo+9)/10 {
		q, d = q/10, d+1
	}
round:
	// Round V/10^d to nearest, ties to even. The interval being symmetric
	// about V and holding a multiple of 10^d, the nearest one is inside too.
	c = q
	if d == 0 {
		half := uint64(1) << (s - 1)
		if vf > half || vf == half && c&1 == 1 {
			c++
		}
	} else if r := vi - c*pow10[d]; r >= pow10[d]/2 {
		c++ // r == half means V is above the midpoint: vf > 0
	}
	return c, d
}

// appendDecimal appends c·10^exp (c > 0, not a multiple of 10) in the
// layout of strconv's 'g' format at shortest precision: plain for decimal
// exponents -4 … 5, d.ddde±XX otherwise. It needs |exponent| < 100.
func appendDecimal(dst []byte, c uint64, exp int) []byte {
	t := bits.Len64(c) * 1233 >> 12 // ⌊log10 c⌋ or one more
	n := t + 1
	if c < pow10[t] {
		n--
	}
	dp := n + exp // position of the decimal point within the digits
	l := len(dst)
	if x := dp - 1; x < -4 || x >= 6 { // d.ddde±XX
		size := n + 4
		if n > 1 {
			size++
		}
		dst = slices.Grow(dst, size)[:l+size]
		b := dst[l:]
		if n > 1 {
			putDigits(b[1:n+1], c)
			b[0], b[1] = b[1], '.'
		} else {
			b[0] = byte('0' + c)
		}
		sign := byte('+')
		if x < 0 {
			sign, x = '-', -x
		}
		e := b[size-4 : size]
		e[0], e[1], e[2], e[3] = 'e', sign, byte('0'+x/10), byte('0'+x%10)
		return dst
	}
	switch {
	case dp <= 0: // 0.000ddd
		z := 2 - dp
		dst = slices.Grow(dst, z+n)[:l+z+n]
		copy(dst[l:l+z], "0.0000")
		putDigits(dst[l+z:], c)
	case dp >= n: // ddd000
		dst = slices.Grow(dst, dp)[:l+dp]
		putDigits(dst[l:l+n], c)
		copy(dst[l+n:], "00000")
	default: // dd.ddd: the integer digits move one place left
		dst = slices.Grow(dst, n+1)[:l+n+1]
		b := dst[l:]
		putDigits(b[1:], c)
		for j := range dp {
			b[j] = b[j+1]
		}
		b[dp] = '.'
	}
	return dst
}

// digitPairs holds "00" … "99".
const digitPairs = "00010203040506070809101112131415161718192021222324252627282930313233343536373839" +
	"40414243444546474849505152535455565758596061626364656667686970717273747576777879" +
	"8081828384858687888990919293949596979899"

// putDigits writes the decimal digits of c, exactly len(b) of them, to b.
// Blocks of eight digits are split off first and each is cut in halves
// and quarters, so that the divisions run side by side, not in one chain.
func putDigits(b []byte, c uint64) {
	i := len(b)
	for c >= 1e8 {
		q := c / 1e8
		put8(b[i-8:i], uint32(c-q*1e8))
		i -= 8
		c = q
	}
	r := uint32(c)
	for r >= 100 {
		rq := r / 100
		k := 2 * (r - 100*rq)
		i -= 2
		b[i], b[i+1] = digitPairs[k], digitPairs[k+1]
		r = rq
	}
	if r >= 10 {
		b[i-2], b[i-1] = digitPairs[2*r], digitPairs[2*r+1]
		return
	}
	b[i-1] = byte('0' + r)
}

// put8 writes r < 10^8 as eight digits, with leading zeros, to b[:8].
func put8(b []byte, r uint32) {
	b = b[:8]
	hi, lo := r/1e4, r%1e4
	a, c := 2*(hi/100), 2*(hi%100)
	d, e := 2*(lo/100), 2*(lo%100)
	b[0], b[1] = digitPairs[a], digitPairs[a+1]
	b[2], b[3] = digitPairs[c], digitPairs[c+1]
	b[4], b[5] = digitPairs[d], digitPairs[d+1]
	b[6], b[7] = digitPairs[e], digitPairs[e+1]
}
