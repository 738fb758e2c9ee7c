package tui

import (
	"cmp"
	"math"
	"math/bits"
	"slices"
	"strings"

	tea "github.com/charmbracelet/bubbletea"

	"isofield/survey"
	"isofield/survey/pipeline"
	"isofield/survey/qa"
)

// The readings table's order. A column's order is: by the column's value,
// then by reading index, the index rising in either direction (ties keep
// the input order). Values compare as cmp.Compare does: NaN before every
// number and equal to NaN, -0 equal to 0. The source column compares the
// file's base name, then the line; the line column the file's number, then
// the line; the reason column the QA notes as slices.Compare does.
//
// Speed. Each order computes its keys once, uint64s whose unsigned order
// is the column's order: a float's bits made sortable, file and line
// packed into one key, a text's bytes eight to a key (texts that agree on
// their first maxTextKey bytes are then compared whole). It sorts the
// reading indices by the first key with a radix sort (bucketSort), which is
// stable and so keeps the index order of ties, then each run of equal keys
// by the next. At 10⁶ readings an order takes about 0.1 s of one core
// against 0.3-2.2 s for the former comparison sort, which read the
// readings in every comparison (BenchmarkReadingsSort); the table still
// runs it off the UI loop for large surveys (asyncSortMin).

// sortSpec is what an order of the readings needs, captured by value so
// that it can run off the UI loop.
type sortSpec struct {
	rs     []survey.Reading
	names  []string // base name of each file
	corr   []float64
	status []qa.Status
	notes  [][]string
	col    int
	desc   bool
}

func newSortSpec(res *pipeline.Result, names []string, col int, desc bool) sortSpec {
	s := sortSpec{rs: res.Survey.Readings, names: names, col: col, desc: desc}
	if q := res.QA; q != nil {
		s.corr, s.status, s.notes = q.Corrected, q.Status, q.Notes
	}
	return s
}

// order returns the reading index of each row and each reading's row.
func (s sortSpec) order() (order []int, rowOf []int32) {
	keys, tie := s.keys()
	if s.desc {
		for i := range keys {
			for j := range keys[i] {
				keys[i][j] = ^keys[i][j]
			}
		}
		if tie != nil {
			asc := tie
			tie = func(a, b int) int { return asc(b, a) }
		}
	}
	order = sortByKeys(len(s.rs), keys, tie)
	rowOf = make([]int32, len(order))
	for p, i := range order {
		rowOf[i] = int32(p)
	}
	return order, rowOf
}

// keys returns the sort keys of every reading, most significant first, and
// for texts the comparison that orders readings whose keys are equal.
func (s sortSpec) keys() ([][]uint64, func(a, b int) int) {
	rs := s.rs
	key := func(f func(i int) uint64) []uint64 {
		k := make([]uint64, len(rs))
		for i := range k {
			k[i] = f(i)
		}
		return k
	}
	line := func(i int) uint64 { return intKey(rs[i].Line0) }
	switch s.col {
	case colSource:
		rank := s.nameRanks()
		return packKeys(key(func(i int) uint64 { return rank(rs[i].File) }), key(line)), nil
	case colLine:
		return packKeys(key(func(i int) uint64 { return intKey(rs[i].File) }), key(line)), nil
	case colID:
		long := 0
		for i := range rs {
			long = max(long, len(rs[i].ID))
		}
		var ks [][]uint64
		for off := 0; off < min(long, maxTextKey); off += 8 {
			ks = append(ks, key(func(i int) uint64 { return prefixKey(rs[i].ID[min(off, len(rs[i].ID)):]) }))
		}
		return ks, func(a, b int) int { return strings.Compare(rs[a].ID, rs[b].ID) }
	case colX:
		return [][]uint64{key(func(i int) uint64 { return floatKey(rs[i].X) })}, nil
	case colY:
		return [][]uint64{key(func(i int) uint64 { return floatKey(rs[i].Y) })}, nil
	case colOriginal:
		return [][]uint64{key(func(i int) uint64 { return floatKey(rs[i].V) })}, nil
	case colCorrected:
		return [][]uint64{key(func(i int) uint64 { return floatKey(at(s.corr, i, rs[i].V)) })}, nil
	case colStatus:
		return [][]uint64{key(func(i int) uint64 { return intKey(int(at(s.status, i, qa.OK))) })}, nil
	}
	notes := s.notes
	first := func(i int) uint64 {
		if n := at(notes, i, nil); len(n) > 0 {
			return prefixKey(n[0])
		}
		return 0
	}
	return [][]uint64{key(first)}, func(a, b int) int { return slices.Compare(at(notes, a, nil), at(notes, b, nil)) }
}

// nameRanks returns each file's rank among the files' base names (equal
// names share a rank; a file number out of range has the empty name).
func (s sortSpec) nameRanks() func(f int) uint64 {
	sorted := slices.Compact(slices.Sorted(slices.Values(append([]string{""}, s.names...))))
	ranks := make([]uint64, len(s.names))
	for f, n := range s.names {
		r, _ := slices.BinarySearch(sorted, n)
		ranks[f] = uint64(r)
	}
	return func(f int) uint64 { return at(ranks, f, 0) } // "" ranks first
}

// floatKey maps x to a key whose unsigned order is cmp.Compare's: NaN
// first, -0 and 0 alike.
func floatKey(x float64) uint64 {
	if math.IsNaN(x) {
		return 0
	}
	if x == 0 {
		x = 0 // -0 as 0
	}
	b := math.Float64bits(x)
	if b>>63 != 0 {
		return ^b // negative: larger magnitudes first; never 0, that is a NaN
	}
	return b | 1<<63
}

// intKey maps v to a key in v's order.
func intKey(v int) uint64 { return uint64(int64(v)) ^ 1<<63 }

// maxTextKey is how many bytes of an id make its keys (eight a key);
// ids that agree on them are compared whole.
const maxTextKey = 24

// prefixKey returns the first eight bytes of s, big-endian, zero-padded:
// if prefixKey(a) < prefixKey(b) then a < b, and texts with equal keys need
// comparing whole.
func prefixKey(s string) uint64 {
	var k uint64
	for j := range 8 {
		k <<= 8
		if j < len(s) {
			k |= uint64(s[j])
		}
	}
	return k
}

// sortByKeys returns 0..n-1 ordered by keys (most significant first),
// then, where all keys are equal, by tie (if not nil), then by index.
func sortByKeys(n int, keys [][]uint64, tie func(a, b int) int) []int {
	order := make([]int, n)
	if inKeyOrder(n, keys, tie) { // readings as they come from the files
		for i := range order {
			order[i] = i
		}
		return order
	}
	idx := make([]int32, n)
	for i := range idx {
		idx[i] = int32(i)
	}
	refine(idx, keys, tie)
	for p, i := range idx {
		order[p] = int(i)
	}
	return order
}

// inKeyOrder reports whether the readings are already in order.
func inKeyOrder(n int, keys [][]uint64, tie func(a, b int) int) bool {
	for i := 1; i < n; i++ {
		switch c := compareKeys(keys, i-1, i); {
		case c > 0:
			return false
		case c == 0 && tie != nil && tie(i-1, i) > 0:
			return false
		}
	}
	return true
}

func compareKeys(keys [][]uint64, a, b int) int {
	for _, k := range keys {
		if c := cmp.Compare(k[a], k[b]); c != 0 {
			return c
		}
	}
	return 0
}

// smallRun is the length up to which refine sorts by comparison.
const smallRun = 64

// refine orders idx, whose ties are in index order, by keys then tie,
// keeping the index order of ties: a radix sort by the first key, then
// each run of equal first keys by the other keys the same way.
func refine(idx []int32, keys [][]uint64, tie func(a, b int) int) {
	if len(idx) < 2 || len(keys) == 0 && tie == nil {
		return
	}
	if len(keys) == 0 || len(idx) <= smallRun {
		by := func(a, b int32) int {
			if c := compareKeys(keys, int(a), int(b)); c != 0 || tie == nil {
				return c
			}
			return tie(int(a), int(b))
		}
		if !slices.IsSortedFunc(idx, by) {
			slices.SortStableFunc(idx, by)
		}
		return
	}
	k := keys[0]
	radixSort(idx, k)
	if len(keys) == 1 && tie == nil {
		return
	}
	for lo := 0; lo < len(idx); {
		hi := lo + 1
		for hi < len(idx) && k[idx[hi]] == k[idx[lo]] {
			hi++
		}
		refine(idx[lo:hi], keys[1:], tie)
		lo = hi
	}
}

// packKeys returns the keys hi then lo as one key when their ranges fit in
// 64 bits together (file and line numbers do), else both.
func packKeys(hi, lo []uint64) [][]uint64 {
	if len(hi) == 0 {
		return [][]uint64{hi, lo}
	}
	minH, maxH := slices.Min(hi), slices.Max(hi)
	minL, maxL := slices.Min(lo), slices.Max(lo)
	bl := bits.Len64(maxL - minL)
	if bits.Len64(maxH-minH)+bl > 64 {
		return [][]uint64{hi, lo}
	}
	for i := range hi {
		hi[i] = (hi[i]-minH)<<bl | (lo[i] - minL)
	}
	return [][]uint64{hi}
}

// keyed is a reading index with its key, kept together so that each pass
// reads and writes one array.
type keyed struct {
	key uint64
	i   int32
}

// radixSort returns idx stably ordered by key[idx[p]] (bucketSort).
func radixSort(idx []int32, key []uint64) []int32 {
	if len(idx) < 2 {
		return idx
	}
	a := make([]keyed, len(idx))
	for p, i := range idx {
		a[p] = keyed{key[i], i}
	}
	bucketSort(a, make([]keyed, len(a)))
	for p, e := range a {
		idx[p] = e.i
	}
	return idx
}

// smallBucket is the size up to which a bucket is insertion sorted.
const smallBucket = 48

// bucketSort orders a stably by key, using buf (as long as a) for scratch:
// a most-significant-digit radix sort whose digit is the highest bits in
// which a's keys differ, up to 2¹⁶ buckets, so that keys crowded into a
// small range still spread; each bucket is then ordered the same way.
// Buckets of equal keys cost nothing, small ones an insertion sort.
func bucketSort(a, buf []keyed) {
	if len(a) <= smallBucket {
		insertionSort(a)
		return
	}
	lo, hi := a[0].key, a[0].key
	for _, e := range a[1:] {
		lo, hi = min(lo, e.key), max(hi, e.key)
	}
	if lo == hi {
		return
	}
	width := min(16, max(8, bits.Len(uint(len(a)))-2))
	shift := max(bits.Len64(hi-lo)-width, 0)
	nb := int((hi-lo)>>shift) + 1
	next := make([]int, nb+1) // next[b]: where bucket b's next key goes
	for _, e := range a {
		next[(e.key-lo)>>shift+1]++
	}
	for b := 1; b <= nb; b++ {
		next[b] += next[b-1]
	}
	for _, e := range a {
		b := (e.key - lo) >> shift
		buf[next[b]] = e
		next[b]++
	}
	copy(a, buf)
	start := 0
	for _, end := range next[:nb] { // each bucket's end, now
		if end-start > 1 {
			bucketSort(a[start:end], buf[start:end])
		}
		start = end
	}
}

// insertionSort orders a stably by key.
func insertionSort(a []keyed) {
	for i := 1; i < len(a); i++ {
		e, j := a[i], i
		for ; j > 0 && a[j-1].key > e.key; j-- {
			a[j] = a[j-1]
		}
		a[j] = e
	}
}

// asyncSortMin is the number of readings from which the table orders them
// off the UI loop: an order of 10⁵ readings takes about 10 ms, of 10⁶ about
// 0.1 s (BenchmarkReadingsSort), which would freeze the screen.
const asyncSortMin = 200_000

// sortRequest is an order being computed off the UI loop.
type sortRequest struct {
	gen  int
	col  int
	desc bool
}

// readingsSortedMsg is an order of the readings computed off the UI loop,
// for the table's request of generation gen.
type readingsSortedMsg struct {
	gen   int
	col   int
	desc  bool
	order []int
	rowOf []int32
}

// sortReadings returns a command that orders the readings as s says. It
// captures s only (the result's slices, which are never changed after the
// run), never the table.
func sortReadings(s sortSpec, gen int) tea.Cmd {
	return safe(func() tea.Msg {
		order, rowOf := s.order()
		return readingsSortedMsg{gen: gen, col: s.col, desc: s.desc, order: order, rowOf: rowOf}
	})
}
