package qa

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strconv"
	"testing"

	"isofield/survey"
)

// layoutCase is a layout of spots for the neighbour searches, and whether
// the grid is expected to take it (false: too crowded, the tree serves).
type layoutCase struct {
	name  string
	spots []spot
	grid  bool
}

// layouts returns seeded random layouts full of ties: positions on an
// integer lattice (many spots at equal distances), repeated positions,
// spots on one line, all at one place, a site with far spots, and one
// with spots far enough out to leave the grid to the tree.
func layouts(n int, seed uint64) []layoutCase {
	rng := rand.New(rand.NewPCG(seed, 5))
	side := int(math.Sqrt(float64(n)))
	build := func(f func(k int) (float64, float64)) []spot {
		sp := make([]spot, n)
		for k := range sp {
			x, y := f(k)
			sp[k] = spot{reading: k, x: x, y: y, v: rng.NormFloat64()}
		}
		return sp
	}
	lattice := func(int) (float64, float64) {
		return float64(rng.IntN(side)), float64(rng.IntN(side))
	}
	withFar := func(far float64, count int) func(int) (float64, float64) {
		return func(k int) (float64, float64) {
			if k < count {
				return far * float64(k+1), -far / 2 * float64(k)
			}
			return lattice(k)
		}
	}
	return []layoutCase{
		{"lattice", build(lattice), true},
		{"uniform", build(func(int) (float64, float64) { return 100 * rng.Float64(), 60 * rng.Float64() }), true},
		{"offset lattice", build(func(int) (float64, float64) {
			return 5e5 + 0.5*float64(rng.IntN(side)), 4e6 + 0.5*float64(rng.IntN(side))
		}), true},
		{"line", build(func(k int) (float64, float64) { return 3, float64(rng.IntN(n/2 + 1)) }), true},
		{"one place", build(func(int) (float64, float64) { return 1.5, -2 }), false},
		{"far base", build(withFar(3*float64(side), 1)), true},
		{"far away", build(withFar(1e7, 3)), false},
	}
}

// bruteNearest returns the m spots nearest to spot k, not counting k,
// ordered by squared distance then index, by looking at every spot.
func bruteNearest(spots []spot, k, m int) ([]int, []float64) {
	type cand struct {
		j  int
		d2 float64
	}
	var all []cand
	for j, s := range spots {
		if j != k {
			all = append(all, cand{j, dist2(spots[k].x, spots[k].y, s.x, s.y)})
		}
	}
	slices.SortFunc(all, func(a, b cand) int {
		if a.d2 != b.d2 {
			return cmpFloat(a.d2, b.d2)
		}
		return a.j - b.j
	})
	all = all[:min(m, len(all))]
	nb, d2 := make([]int, len(all)), make([]float64, len(all))
	for i, c := range all {
		nb[i], d2[i] = c.j, c.d2
	}
	return nb, d2
}

func cmpFloat(a, b float64) int {
	if a < b {
		return -1
	}
	return 1
}

// TestNeighbourSearchBruteForce compares the grid's and the k-d tree's
// answers with a search through every spot, bit for bit, on layouts with
// ties and repeated positions (the oracle of gonum's spatial/kdtree tests).
func TestNeighbourSearchBruteForce(t *testing.T) {
	sizes := []int{1, 2, 13, 90, 600}
	if testing.Short() {
		sizes[len(sizes)-1] = 250
	}
	for _, n := range sizes {
		for _, lc := range layouts(n, uint64(n)) {
			t.Run(fmt.Sprintf("n=%d/%s", n, lc.name), func(t *testing.T) {
				g := newSpotGrid(lc.spots)
				if n >= 100 && (g != nil) != lc.grid {
					t.Fatalf("newSpotGrid: grid %v, want %v", g != nil, lc.grid)
				}
				indexes := []*neighbourIndex{newNeighbourIndexWith(lc.spots, nil)}
				if g != nil {
					indexes = append(indexes, newNeighbourIndexWith(lc.spots, g))
				}
				for _, ix := range indexes {
					checkIndex(t, ix, lc.spots)
				}
			})
		}
	}
}

// checkIndex compares every spot's nearest distance and its nearest m
// spots, for several m, with the brute-force answers.
func checkIndex(t *testing.T, ix *neighbourIndex, spots []spot) {
	t.Helper()
	kind := "tree"
	if ix.grid != nil {
		kind = "grid"
	}
	for k := range spots {
		all, alld2 := bruteNearest(spots, k, len(spots))
		want := math.Inf(1)
		if len(alld2) > 0 {
			want = alld2[0]
		}
		if got := ix.nn2[k]; got != want {
			t.Fatalf("%s: nn2[%d] = %v, want %v", kind, k, got, want)
		}
		ms := []int{1, kNeighbours, 2 * curvatureNeighbours}
		if len(spots) <= 100 {
			ms = append(ms, len(spots)+2) // every spot, and more than there are
		}
		for _, m := range ms {
			nb, d2 := ix.nearestN(k, m)
			wnb, wd2 := all[:min(m, len(all))], alld2[:min(m, len(all))]
			if !slices.Equal(nb, wnb) || !slices.Equal(d2, wd2) {
				t.Fatalf("%s: nearestN(%d, %d) = %v %v, want %v %v", kind, k, m, nb, d2, wnb, wd2)
			}
		}
	}
}

// TestJoinNearBruteForce compares the repeat groups by position with the
// groups of every pair of readings within the repeat distance, on
// positions at multiples of the distance (pairs exactly at it, and cell
// edges) with repeated positions.
func TestJoinNearBruteForce(t *testing.T) {
	for _, c := range []struct {
		n    int
		d    float64
		step float64 // lattice spacing; 0: anywhere in a square of side 2 m
	}{{500, 0.05, 0.05}, {2000, 0.05, 0.025}, {800, 1, 0.7}, {300, 10, 3}, {1, 0.05, 1}, {3000, 0.05, 0}} {
		t.Run(fmt.Sprintf("n=%d/d=%g/step=%g", c.n, c.d, c.step), func(t *testing.T) {
			rng := rand.New(rand.NewPCG(uint64(c.n), 7))
			b := newBuilder("near.csv", survey.Millivolt)
			side := int(math.Sqrt(float64(c.n)))
			for range c.n {
				x, y := c.step*float64(rng.IntN(side)-side/2), c.step*float64(rng.IntN(side))
				if c.step == 0 {
					x, y = 2*rng.Float64()-1, 2*rng.Float64()
				}
				b.add("", x, y, rng.NormFloat64())
			}
			set := Settings{IgnoreIDs: true, RepeatDist: c.d, SpikeK: -1}.effective(survey.Millivolt)
			ck := newChecker(b.s, set)
			ck.group()
			want := bruteGroups(b.s, c.d)
			if !slices.Equal(ck.res.Group, want) {
				t.Fatalf("groups %v\nwant   %v", ck.res.Group, want)
			}
		})
	}
}

// bruteGroups numbers the groups of readings joined by pairs within d,
// as group does: groups with partners in the order of their first
// reading, −1 for readings alone.
func bruteGroups(s *survey.Survey, d float64) []int {
	u := newUnionFind(len(s.Readings))
	for i, a := range s.Readings {
		for j, b := range s.Readings[:i] {
			if dx, dy := a.X-b.X, a.Y-b.Y; dx*dx+dy*dy <= d*d {
				u.union(i, j)
			}
		}
	}
	size := make([]int, len(s.Readings))
	for i := range s.Readings {
		size[u.find(i)]++
	}
	num := map[int]int{}
	g := make([]int, len(s.Readings))
	for i := range s.Readings {
		r := u.find(i)
		g[i] = -1
		if size[r] < 2 {
			continue
		}
		if _, ok := num[r]; !ok {
			num[r] = len(num)
		}
		g[i] = num[r]
	}
	return g
}

// TestMedianSelection compares the selecting median with the sorting one
// bit for bit, on values with repeats, zeros of both signs and NaNs.
func TestMedianSelection(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 3))
	for _, n := range []int{1, 2, 63, 64, 65, 1000, 1001, 20_000} {
		for _, kind := range []string{"spread", "repeats", "zeros", "negative zeros", "both zeros", "nan", "sorted"} {
			v := make([]float64, n)
			for k := range v {
				switch kind {
				case "repeats", "sorted":
					v[k] = float64(rng.IntN(7)) - 3.5
				case "zeros", "negative zeros", "both zeros":
					v[k] = float64(rng.IntN(3)) * 0.5
				default:
					v[k] = rng.NormFloat64()
				}
				if v[k] == 0 && (kind == "negative zeros" || kind == "both zeros" && k%2 == 0) {
					v[k] = math.Copysign(0, -1)
				}
				if kind == "nan" && k%5 == 0 {
					v[k] = math.NaN()
				}
			}
			if kind == "sorted" {
				slices.Sort(v)
			}
			got, want := median(slices.Clone(v)), sortedMedian(slices.Clone(v))
			if math.Float64bits(got) != math.Float64bits(want) && !(math.IsNaN(got) && math.IsNaN(want)) {
				t.Errorf("n=%d %s: median = %v, want %v", n, kind, got, want)
			}
		}
	}
}

// TestRunGridAgreesWithTree runs the whole check on random surveys with
// ties, repeated positions, agreeing and disagreeing repeats and spikes,
// once with the grid and once with the k-d tree the package used before
// it, and demands the same result to the last bit and character.
func TestRunGridAgreesWithTree(t *testing.T) {
	seeds, n := uint64(3), 900
	if testing.Short() {
		seeds, n = 1, 500
	}
	for seed := range seeds {
		s := tieSurvey(n, seed)
		for i, set := range []Settings{{}, {RepeatDist: -1, SpikeK: 2.5}, {IgnoreIDs: true, RepeatDist: 0.5, RepeatTol: 2}} {
			t.Run(fmt.Sprintf("seed=%d/settings=%d", seed, i), func(t *testing.T) {
				var text [2]string
				var r *Result
				for k, treeOnly := range []bool{false, true} {
					c := newChecker(s, set.effective(s.Unit))
					c.treeOnly = treeOnly
					var err error
					if r, err = c.run(t.Context(), nil); err != nil {
						t.Fatal(err)
					}
					text[k] = resultText(r)
				}
				if text[0] != text[1] {
					t.Fatalf("grid and tree differ:\n%s\n%s", text[0], text[1])
				}
				c := newChecker(s, set.effective(s.Unit))
				if err := c.corrections(); err != nil {
					t.Fatal(err)
				}
				if newSpotGrid(c.spots()) == nil {
					t.Fatalf("the grid is not used: the comparison proves nothing")
				}
				if len(r.Suspects) == 0 || len(r.Repeats) == 0 {
					t.Fatalf("%d spikes, %d repeat groups: the comparison proves little", len(r.Suspects), len(r.Repeats))
				}
			})
		}
	}
}

// tieSurvey is a survey of about n readings of the closed-form field at
// integer positions (many equal distances), with ids shared by chance,
// repeats at the same and at nearby places, and spikes of either sign.
func tieSurvey(n int, seed uint64) *survey.Survey {
	rng := rand.New(rand.NewPCG(seed, 3))
	b := newBuilder("ties.csv", survey.Millivolt)
	side := int(math.Sqrt(float64(n))) + 1
	for range n {
		x, y := float64(rng.IntN(side)), float64(rng.IntN(side))
		v := truthField(x*20/float64(side), y*20/float64(side)) + rng.NormFloat64()
		if rng.IntN(100) == 0 {
			v += 60 * float64(1-2*rng.IntN(2))
		}
		id := ""
		if rng.IntN(3) == 0 {
			id = "P" + strconv.Itoa(rng.IntN(n))
		}
		b.add(id, x, y, v)
		if rng.IntN(20) == 0 {
			b.add(id, x, y, v+8*rng.NormFloat64())
		}
		if rng.IntN(40) == 0 {
			b.add("", x+0.01, y-0.02, v+3*rng.NormFloat64())
		}
	}
	return b.s
}

// resultText prints a result whole, pointers followed, floats exactly.
func resultText(r *Result) string {
	rr := *r
	rr.SpikeModel, rr.Fit, rr.Drift = nil, nil, nil
	text := fmt.Sprintf("%+v", rr)
	if r.Fit != nil {
		text += fmt.Sprintf("\nfit %+v", *r.Fit)
	}
	if r.Drift != nil {
		text += fmt.Sprintf("\ndrift %+v", *r.Drift)
	}
	return text
}
