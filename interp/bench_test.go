package interp

import (
	"context"
	"flag"
	"fmt"
	"strings"
	"testing"
)

// benchSurvey is n seeded scattered readings of the two-source half-space
// potential over a 100 m × 100 m site.
func benchSurvey(n int) (xs, ys, vs []float64) {
	return scattered(uint64(n)+17, n, 0, 0, 100, 100, halfSpaceV)
}

// BenchmarkFit times Fit with the automatic method (global up to
// DefaultLocalAbove readings, local above) and with each method forced.
func BenchmarkFit(b *testing.B) {
	for _, n := range []int{500, 2000, 5000} {
		xs, ys, vs := benchSurvey(n)
		for _, method := range []Method{Auto, Global, Local} {
			if method == Global && n > 2000 && testing.Short() {
				continue
			}
			b.Run(fmt.Sprintf("n=%d/%s", n, methodName(method)), func(b *testing.B) {
				for b.Loop() {
					if _, err := Fit(context.Background(), xs, ys, vs, Options{Method: method}); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}

// BenchmarkEvaluate times Evaluate (value and field at every node) of an
// automatic-method model on 200×200 and 500×500 grids.
func BenchmarkEvaluate(b *testing.B) {
	for _, n := range []int{500, 2000, 5000} {
		xs, ys, vs := benchSurvey(n)
		m, err := Fit(context.Background(), xs, ys, vs, Options{})
		if err != nil {
			b.Fatal(err)
		}
		for _, side := range []int{200, 500} {
			g := NewGridN(0, 0, 100/float64(side-1), 100/float64(side-1), side, side)
			b.Run(fmt.Sprintf("n=%d/%s/grid=%dx%d", n, methodName(m.Info().Method), side, side), func(b *testing.B) {
				for b.Loop() {
					if err := Evaluate(context.Background(), m, g, nil); err != nil {
						b.Fatal(err)
					}
				}
			})
		}
	}
}

// BenchmarkFitGrid times the whole engine step the targets name:
// fit, default mask and Evaluate with the field, automatic method.
func BenchmarkFitGrid(b *testing.B) {
	cases := []struct{ n, nx, ny int }{{5000, 500, 500}, {5000, 200, 60}}
	for _, c := range cases {
		xs, ys, vs := benchSurvey(c.n)
		b.Run(fmt.Sprintf("n=%d/grid=%dx%d", c.n, c.nx, c.ny), func(b *testing.B) {
			for b.Loop() {
				fitGrid(b, xs, ys, vs, c.nx, c.ny)
			}
		})
	}
}

// BenchmarkLarge times the large partition-of-unity cases: 100,000
// readings onto 1000×750 and 1,000,000 onto 1000×1000. They take many
// seconds and run only when the -bench pattern names Large explicitly
// (go test -run '^$' -bench Large ./interp).
func BenchmarkLarge(b *testing.B) {
	if f := flag.Lookup("test.bench"); f == nil || !strings.Contains(f.Value.String(), "Large") {
		b.Skip("run with -bench Large")
	}
	cases := []struct{ n, nx, ny int }{{100_000, 1000, 750}, {1_000_000, 1000, 1000}}
	for _, c := range cases {
		xs, ys, vs := benchSurvey(c.n)
		b.Run(fmt.Sprintf("n=%d/grid=%dx%d", c.n, c.nx, c.ny), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				fitGrid(b, xs, ys, vs, c.nx, c.ny)
			}
		})
	}
}

func fitGrid(b *testing.B, xs, ys, vs []float64, nx, ny int) {
	m, err := Fit(context.Background(), xs, ys, vs, Options{})
	if err != nil {
		b.Fatal(err)
	}
	g := NewGridN(0, 0, 100/float64(nx-1), 100/float64(ny-1), nx, ny)
	MaskFar(g, xs, ys, DefaultMaskDistance(xs, ys))
	if err := Evaluate(context.Background(), m, g, nil); err != nil {
		b.Fatal(err)
	}
}

// BenchmarkValue times single-point queries, as the terminal UI's cursor
// readout makes them.
func BenchmarkValue(b *testing.B) {
	for _, n := range []int{500, 5000} {
		xs, ys, vs := benchSurvey(n)
		m, err := Fit(context.Background(), xs, ys, vs, Options{})
		if err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprintf("n=%d/%s", n, methodName(m.Info().Method)), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				_ = m.Value(41.3, 57.9)
				_, _ = m.Gradient(41.3, 57.9)
			}
		})
	}
}

// BenchmarkPatchSystem times one partition-of-unity patch: building its
// thin-plate matrix, reducing and factorising it (factor) and solving
// (solve), at the default and the largest patch sizes.
func BenchmarkPatchSystem(b *testing.B) {
	for _, n := range []int{localTarget, localMax} {
		xs, ys, vs := benchSurvey(n)
		ds, err := prepare(xs, ys, vs)
		if err != nil {
			b.Fatal(err)
		}
		bs := newBasis(ThinPlate, 0)
		var sys smallSystem
		sol := make([]float64, len(ds.x)+3)
		b.Run(fmt.Sprintf("n=%d", len(ds.x)), func(b *testing.B) {
			for b.Loop() {
				sys.build(ds.x, ds.y, ds.v, bs, 0)
				if c := sys.factor(); !(c < maxCondition) {
					b.Fatalf("condition %g", c)
				}
				copy(sol, ds.v)
				sys.solve(sol)
			}
		})
	}
}
