package export

import (
	"math"
	"math/rand/v2"
	"strconv"
	"testing"
)

// The oracle for every test here is strconv.AppendFloat(v, 'g', -1, 64),
// the Go standard library's shortest round-trip formatting: appendShortest
// must write the same bytes for every float64.

func checkShortest(t *testing.T, v float64) {
	t.Helper()
	got := string(appendShortest([]byte("x="), v))
	want := "x=" + strconv.FormatFloat(v, 'g', -1, 64)
	if got != want {
		t.Fatalf("appendShortest(%#016x = %v) = %q, want %q", math.Float64bits(v), v, got, want)
	}
}

func TestAppendShortestTable(t *testing.T) {
	tenth := 0.1 // a variable, so that tenth+0.2 is float64 arithmetic, not an exact constant
	tests := []struct {
		name string
		v    float64
		want string // strconv's output, spelled out
	}{
		{"zero", 0, "0"},
		{"negative zero", math.Copysign(0, -1), "-0"},
		{"NaN", math.NaN(), "NaN"},
		{"plus infinity", math.Inf(1), "+Inf"},
		{"minus infinity", math.Inf(-1), "-Inf"},
		{"one", 1, "1"},
		{"small negative integer", -5, "-5"},
		{"largest plain integer", 999999, "999999"},
		{"integer with zeros", 120000, "120000"},
		{"million goes to e", 1e6, "1e+06"},
		{"integer above a million", 12345678, "1.2345678e+07"},
		{"northing", 5987654.25, "5.98765425e+06"},
		{"easting", 654321.6, "654321.6"},
		{"half (a power of two)", 0.5, "0.5"},
		{"minus half", -0.5, "-0.5"},
		{"two point six seven five", 2.675, "2.675"},
		{"tenth", 0.1, "0.1"},
		{"tenth plus fifth", tenth + 0.2, "0.30000000000000004"},
		{"third", 1.0 / 3, "0.3333333333333333"},
		{"two thirds negative", -2.0 / 3, "-0.6666666666666666"},
		{"tie to even, 1+2^-17", 1 + 0x1p-17, "1.0000076293945312"},
		{"tie to even, 1+3·2^-17", 1 + 3*0x1p-17, "1.0000228881835938"},
		{"smallest plain", 1e-4, "0.0001"},
		{"just under smallest plain", math.Nextafter(1e-4, 0), "9.999999999999999e-05"},
		{"tiny negative", -1e-7, "-1e-07"},
		{"tiny negative, long", -1.2345678901234567e-9, "-1.2345678901234566e-09"},
		{"below fast range", 3e-11, "3e-11"},
		{"fast range low end", 1e-10, "1e-10"},
		{"just under a million", math.Nextafter(1e6, 0), "999999.9999999999"},
		{"fast range high end", 1e15, "1e+15"},
		{"just under fast range high end", math.Nextafter(1e15, 0), "9.999999999999999e+14"},
		{"two to the 53", 0x1p53, "9.007199254740992e+15"},
		{"potential", 582.2645900000005, "582.2645900000005"},
		{"field", 2.0025614747158, "2.0025614747158"},
		{"smallest subnormal", 5e-324, "5e-324"},
		{"largest float", math.MaxFloat64, "1.7976931348623157e+308"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := string(appendShortest(nil, tt.v)); got != tt.want {
				t.Errorf("appendShortest(%v) = %q, want %q", tt.v, got, tt.want)
			}
			checkShortest(t, tt.v)
		})
	}
}

// TestAppendDecimal covers every layout, including integers, which
// appendShortest itself hands to strconv.AppendInt.
func TestAppendDecimal(t *testing.T) {
	tests := []struct {
		c    uint64
		exp  int
		want string // strconv.FormatFloat(c·10^exp, 'g', -1, 64)
	}{
		{1, 0, "1"},
		{12, 3, "12000"},
		{999999, 0, "999999"},
		{1, 6, "1e+06"},
		{12345678, 0, "1.2345678e+07"},
		{1, 14, "1e+14"},
		{25, -1, "2.5"},
		{123456789, -4, "12345.6789"},
		{1, -1, "0.1"},
		{1, -4, "0.0001"},
		{12, -5, "0.00012"},
		{9999999999999999, -20, "9.999999999999999e-05"},
		{1, -5, "1e-05"},
		{17, -12, "1.7e-11"},
	}
	for _, tt := range tests {
		got := string(appendDecimal([]byte("x="), tt.c, tt.exp))
		if got != "x="+tt.want {
			t.Errorf("appendDecimal(%d, %d) = %q, want %q", tt.c, tt.exp, got, "x="+tt.want)
		}
		v, _ := strconv.ParseFloat(tt.want, 64)
		if oracle := strconv.FormatFloat(v, 'g', -1, 64); oracle != tt.want {
			t.Errorf("table row %d·10^%d: strconv writes %q, the row says %q", tt.c, tt.exp, oracle, tt.want)
		}
	}
}

// TestAppendShortestNearPowersOfTen checks the values a few ulps either
// side of every power of ten and of every power of two the fast path can
// meet, where the length and the exponent of the output change.
func TestAppendShortestNearPowersOfTen(t *testing.T) {
	var edges []float64
	for p := -12; p <= 16; p++ {
		edges = append(edges, math.Pow(10, float64(p)))
	}
	for p := -40; p <= 55; p++ {
		edges = append(edges, math.Ldexp(1, p))
	}
	for _, e := range edges {
		for _, sign := range []float64{1, -1} {
			v := sign * e
			checkShortest(t, v)
			up, down := v, v
			for range 4 {
				up, down = math.Nextafter(up, math.Inf(1)), math.Nextafter(down, math.Inf(-1))
				checkShortest(t, up)
				checkShortest(t, down)
			}
		}
	}
}

// TestAppendShortestRandom compares with the oracle on seeded random
// values of the kinds a grid holds.
func TestAppendShortestRandom(t *testing.T) {
	n := 200000
	if testing.Short() {
		n = 20000
	}
	r := rand.New(rand.NewPCG(1, 2))
	kinds := []struct {
		name string
		gen  func() float64
	}{
		{"any bits", func() float64 { return math.Float64frombits(r.Uint64()) }},
		{"log-uniform 1e-12…1e17", func() float64 {
			return math.Copysign(math.Pow(10, -12+29*r.Float64()), r.Float64()-0.5)
		}},
		{"decimals m/10^k", func() float64 {
			return float64(r.Int64N(2e9)-1e9) / math.Pow(10, float64(r.IntN(12)))
		}},
		{"dyadic ties odd·2^-n", func() float64 {
			return float64(2*r.Int64N(1<<40)+1) * math.Ldexp(1, -r.IntN(60))
		}},
		{"projected coordinates x0+i·d", func() float64 {
			return 512345.25 + float64(r.IntN(5000))*[]float64{0.1, 0.25, 0.3, 1.5}[r.IntN(4)]
		}},
	}
	for _, k := range kinds {
		t.Run(k.name, func(t *testing.T) {
			for range n {
				checkShortest(t, k.gen())
			}
		})
	}
}

// FuzzAppendShortest compares with the oracle on the fuzzed value and on
// the same significand moved into the range the fast path formats.
// Run locally: go test -run '^$' -fuzz FuzzAppendShortest -fuzztime 1m ./survey/export
func FuzzAppendShortest(f *testing.F) {
	for _, v := range []float64{0, 0.5, 2.675, 1e15, -1e-4, 0.30000000000000004, 1 + 0x1p-17, 582.2645900000005, 5987654.25} {
		f.Add(v)
	}
	f.Fuzz(func(t *testing.T, v float64) {
		checkShortest(t, v)
		frac, exp := math.Frexp(v)
		if frac != 0 && !math.IsInf(frac, 0) && !math.IsNaN(frac) {
			exp = (exp%90+90)%90 - 36 // 2^-36 … 2^53
			checkShortest(t, math.Ldexp(frac, exp))
		}
	})
}

func BenchmarkAppendShortest(b *testing.B) {
	r := rand.New(rand.NewPCG(3, 4))
	kinds := []struct {
		name string
		gen  func() float64
	}{
		{"integer", func() float64 { return float64(r.IntN(2000) - 1000) }},
		{"short decimal", func() float64 { return 512345.25 + 0.5*float64(r.IntN(1000)) }},
		{"full precision", func() float64 { return (r.Float64() - 0.5) * 2000 }},
		{"e notation", func() float64 { return 5e6 + r.Float64()*1e6 }},
	}
	for _, k := range kinds {
		vs := make([]float64, 1024)
		for i := range vs {
			vs[i] = k.gen()
		}
		buf := make([]byte, 0, 32)
		b.Run(k.name+"/strconv", func(b *testing.B) {
			for b.Loop() {
				for _, v := range vs {
					buf = strconv.AppendFloat(buf[:0], v, 'g', -1, 64)
				}
			}
		})
		b.Run(k.name+"/shortest", func(b *testing.B) {
			for b.Loop() {
				for _, v := range vs {
					buf = appendShortest(buf[:0], v)
				}
			}
		})
	}
}
