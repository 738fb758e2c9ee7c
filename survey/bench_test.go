package survey

import (
	"bytes"
	"fmt"
	"math/rand/v2"
	"strconv"
	"testing"
	"time"
)

// benchCSV returns n seeded readings in the canonical format with
// projected coordinates, times and notes.
func benchCSV(n int) []byte {
	rng := rand.New(rand.NewPCG(7, uint64(n)))
	var b bytes.Buffer
	b.WriteString("id,x_m,y_m,potential_mV,time,line,station,note\n")
	t0 := time.Date(2025, 3, 4, 8, 0, 0, 0, time.UTC)
	for i := range n {
		fmt.Fprintf(&b, "P%d,%s,%s,%s,%s,%d,%d,\n", i,
			strconv.FormatFloat(512000+rng.Float64()*1000, 'f', 3, 64),
			strconv.FormatFloat(6178000+rng.Float64()*1000, 'f', 3, 64),
			strconv.FormatFloat(-500+rng.Float64()*400, 'f', 1, 64),
			t0.Add(time.Duration(i)*time.Second).Format(time.RFC3339), i/1000, i%1000)
	}
	return b.Bytes()
}

// BenchmarkParse reads n readings from memory. The target is about a
// second for a million readings.
func BenchmarkParse(b *testing.B) {
	for _, n := range []int{1_000, 100_000, 1_000_000} {
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			data := benchCSV(n)
			b.SetBytes(int64(len(data)))
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Parse(bytes.NewReader(data), "bench.csv", LoadOptions{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkWriteCSV writes n readings.
func BenchmarkWriteCSV(b *testing.B) {
	for _, n := range []int{1_000, 100_000} {
		s, err := Parse(bytes.NewReader(benchCSV(n)), "bench.csv", LoadOptions{})
		if err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprintf("n=%d", n), func(b *testing.B) {
			var buf bytes.Buffer
			for b.Loop() {
				buf.Reset()
				if err := WriteCSV(&buf, s); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
