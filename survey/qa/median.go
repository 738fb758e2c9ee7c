package qa

import (
	"math"
	"math/bits"
	"slices"
	"sort"
)

// selectMin is the length below which median sorts instead of selecting.
const selectMin = 64

// median returns the median of v, reordering v: its middle value in the
// order of sort.Float64s, or the mean of its two middle values. It picks
// them by selection, in linear expected time (C. A. R. Hoare, Algorithm 65:
// FIND, Commun. ACM 4 (1961) 321–322), with a three-way partition for
// repeated values. Values equal to the sort are the same value, except −0
// and +0 and NaNs of different payloads: when v holds both zeros or a NaN,
// which of them lands in the middle is the sort's choice, which a
// selection need not repeat (the median's sign could turn a z of zero
// from +0 to −0 in a note), so median sorts as it always did.
func median(v []float64) float64 {
	if len(v) < selectMin || ambiguous(v) {
		return sortedMedian(v)
	}
	n := len(v)
	k := n / 2
	selectNth(v, k)
	if n%2 == 1 {
		return v[k]
	}
	lo := v[0]
	for _, x := range v[1:k] {
		lo = math.Max(lo, x)
	}
	return (lo + v[k]) / 2
}

// sortedMedian is median by sorting.
func sortedMedian(v []float64) float64 {
	sort.Float64s(v)
	n := len(v)
	if n%2 == 1 {
		return v[n/2]
	}
	return (v[n/2-1] + v[n/2]) / 2
}

// ambiguous reports whether v holds a NaN, or zeros of both signs: values
// the sort takes as equal that are not the same.
func ambiguous(v []float64) bool {
	pos, neg := false, false
	for _, x := range v {
		switch {
		case x != x:
			return true
		case x == 0 && math.Signbit(x):
			neg = true
		case x == 0:
			pos = true
		}
	}
	return pos && neg
}

// selectNth reorders v, which holds no NaN, so that v[k] is the value
// sorting would put there, no value before it is greater and none after
// it is less. Partitions that make too little progress (more than twice
// log₂ n of them) give way to sorting what is left.
func selectNth(v []float64, k int) {
	lo, hi := 0, len(v) // v[k]'s value lies in v[lo:hi]
	for budget := 2 * bits.Len(uint(len(v))); hi-lo > 16 && budget > 0; budget-- {
		m := lo + (hi-lo)/2
		p := max(min(v[lo], v[m]), min(max(v[lo], v[m]), v[hi-1])) // median of three
		// v[lo:lt] < p, v[lt:i] == p, v[gt:hi] > p.
		lt, i, gt := lo, lo, hi
		for i < gt {
			switch x := v[i]; {
			case x < p:
				v[lt], v[i] = x, v[lt]
				lt++
				i++
			case x > p:
				gt--
				v[i], v[gt] = v[gt], x
			default:
				i++
			}
		}
		switch {
		case k < lt:
			hi = lt
		case k >= gt:
			lo = gt
		default:
			return
		}
	}
	slices.Sort(v[lo:hi])
}
