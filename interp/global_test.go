package interp

import (
	"bufio"
	"context"
	"errors"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"
)

// TestLinearReproduced: every kernel carries the linear polynomial, so a
// linear field is reproduced exactly (a property of the method, Wendland
// (2005) §8.5), with its constant gradient: the uniform field between
// parallel plates, V = V0·(x − x0)/d, E = −V0/d (electrostatics), in site
// metres and in seven-digit projected coordinates.
func TestLinearReproduced(t *testing.T) {
	const v0, d = 230.0, 40.0 // volts across plates 40 m apart
	for _, origin := range []struct {
		name   string
		x0, y0 float64
	}{{"site", 0, 0}, {"projected", 512_345, 5_412_678}} {
		plate := func(x, y float64) float64 { return v0 * (x - origin.x0) / d }
		for _, method := range []Method{Global, Local} {
			for _, k := range allKernels {
				name := origin.name + "/" + methodName(method) + "/" + k.String()
				t.Run(name, func(t *testing.T) {
					n := 150
					if method == Local {
						n = 600
					}
					xs, ys, vs := scattered(3, n, origin.x0, origin.y0, d, 30, plate)
					m := mustFit(t, xs, ys, vs, Options{Kernel: k, Method: method})
					for _, p := range [][2]float64{{0.1, 0.2}, {20, 15}, {39.5, 29}, {13.3, 7.7}} {
						x, y := origin.x0+p[0], origin.y0+p[1]
						if got, want := m.Value(x, y), plate(x, y); math.Abs(got-want) > 1e-8*v0 {
							t.Errorf("V(%g, %g) = %.12g, want %.12g", p[0], p[1], got, want)
						}
						gx, gy := m.Gradient(x, y)
						if math.Abs(gx-v0/d) > 1e-8*v0/d || math.Abs(gy) > 1e-8*v0/d {
							t.Errorf("∇V(%g, %g) = (%g, %g), want (%g, 0): E = V0/d", p[0], p[1], gx, gy, v0/d)
						}
					}
				})
			}
		}
	}
}

func methodName(m Method) string {
	return [...]string{"auto", "global", "local"}[m]
}

// TestInterpolatesReadings: without smoothing the fit passes through every
// reading (the defining property of interpolation).
func TestInterpolatesReadings(t *testing.T) {
	f := func(x, y float64) float64 { return math.Sin(x/7) * math.Cos(y/11) }
	for _, method := range []Method{Global, Local} {
		for _, k := range allKernels {
			t.Run(methodName(method)+"/"+k.String(), func(t *testing.T) {
				xs, ys, vs := scattered(5, 300, 0, 0, 100, 80, f)
				m := mustFit(t, xs, ys, vs, Options{Kernel: k, Method: method})
				for i := range xs {
					if got := m.Value(xs[i], ys[i]); math.Abs(got-vs[i]) > 1e-7 {
						t.Fatalf("reading %d: V = %.12g, reading %.12g", i, got, vs[i])
					}
				}
			})
		}
	}
}

// TestGradientFiniteDifference checks the analytic gradient against a
// central difference of Value, for every kernel and both methods,
// including points across patch boundaries.
func TestGradientFiniteDifference(t *testing.T) {
	f := func(x, y float64) float64 { return math.Exp(-((x-40)*(x-40)+(y-30)*(y-30))/400) + 0.01*x }
	for _, method := range []Method{Global, Local} {
		for _, k := range allKernels {
			t.Run(methodName(method)+"/"+k.String(), func(t *testing.T) {
				xs, ys, vs := scattered(9, 400, 0, 0, 100, 80, f)
				m := mustFit(t, xs, ys, vs, Options{Kernel: k, Method: method})
				for i := 0; i < 40; i++ {
					x, y := 3+2.37*float64(i), 5+1.83*float64(i)
					gx, gy := m.Gradient(x, y)
					const h = 1e-5
					fx := (m.Value(x+h, y) - m.Value(x-h, y)) / (2 * h)
					fy := (m.Value(x, y+h) - m.Value(x, y-h)) / (2 * h)
					scale := math.Hypot(fx, fy) + 1e-3
					if math.Hypot(gx-fx, gy-fy) > 1e-5*scale {
						t.Errorf("at (%g, %g): ∇V = (%.9g, %.9g), finite difference (%.9g, %.9g)", x, y, gx, gy, fx, fy)
					}
				}
			})
		}
	}
}

// TestScipyFixture compares the global thin-plate spline with scipy's
// RBFInterpolator(kernel="thin_plate_spline", degree=1), values written by
// testdata/scipy_fixture.py (Debian python3-scipy; the version is on the
// fixture's first line). scipy adds its smoothing to the diagonal in the
// caller's coordinates; ours is in scaled coordinates, so λ = s/scale².
func TestScipyFixture(t *testing.T) {
	xs, ys, vs, evals := readScipyFixture(t, "testdata/scipy_tps.csv")
	ds, err := prepare(xs, ys, vs)
	if err != nil {
		t.Fatal(err)
	}
	models := map[float64]*Model{}
	for _, e := range evals {
		m, ok := models[e.smoothing]
		if !ok {
			lam := e.smoothing / (ds.s * ds.s)
			m = mustFit(t, xs, ys, vs, Options{Method: Global, Smoothing: lam})
			models[e.smoothing] = m
		}
		got := m.Value(e.x, e.y)
		if math.Abs(got-e.v) > 1e-8*max(math.Abs(e.v), 1) {
			t.Errorf("smoothing %g at (%g, %g): %.15g, scipy %.15g (rel %.2g)", e.smoothing, e.x, e.y, got, e.v, math.Abs(got-e.v)/math.Abs(e.v))
		}
	}
	if len(models) != 2 || len(evals) != 80 {
		t.Fatalf("fixture has %d smoothing values and %d evaluations, want 2 and 80", len(models), len(evals))
	}
}

type fixtureEval struct{ x, y, smoothing, v float64 }

func readScipyFixture(t *testing.T, path string) (xs, ys, vs []float64, evals []fixtureEval) {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line := sc.Text()
		if strings.HasPrefix(line, "#") || strings.HasPrefix(line, "kind,") {
			continue
		}
		c := strings.Split(line, ",")
		num := func(s string) float64 {
			if s == "" {
				return 0
			}
			v, err := strconv.ParseFloat(s, 64)
			if err != nil {
				t.Fatalf("%s: %q: %v", path, line, err)
			}
			return v
		}
		switch c[0] {
		case "reading":
			xs, ys, vs = append(xs, num(c[1])), append(ys, num(c[2])), append(vs, num(c[4]))
		case "eval":
			evals = append(evals, fixtureEval{num(c[1]), num(c[2]), num(c[3]), num(c[4])})
		}
	}
	return xs, ys, vs, evals
}

// TestFitErrors: bad data gives the documented error causes.
func TestFitErrors(t *testing.T) {
	nan := math.NaN()
	tests := []struct {
		name       string
		xs, ys, vs []float64
		opt        Options
		want       error
	}{
		{"none", nil, nil, nil, Options{}, ErrTooFew},
		{"two", []float64{0, 1}, []float64{0, 1}, []float64{1, 2}, Options{}, ErrTooFew},
		{"three at one spot", []float64{5, 5, 5}, []float64{2, 2, 2}, []float64{1, 2, 3}, Options{}, ErrTooFew},
		{"collinear", []float64{0, 1, 2, 3, 4}, []float64{0, 2, 4, 6, 8}, []float64{1, 2, 3, 4, 5}, Options{}, ErrCollinear},
		{"collinear projected", []float64{512000, 512001, 512002, 512003}, []float64{5.4e6, 5.4e6, 5.4e6, 5.4e6}, []float64{1, 2, 3, 4}, Options{}, ErrCollinear},
		{"NaN value", []float64{0, 1, 0}, []float64{0, 0, 1}, []float64{1, nan, 3}, Options{}, ErrNonFinite},
		{"Inf coordinate", []float64{0, math.Inf(1), 0}, []float64{0, 0, 1}, []float64{1, 2, 3}, Options{}, ErrNonFinite},
		{"flat gaussian", gridXs(20), gridYs(20), gridXs(20), Options{Kernel: Gaussian, Shape: 1e-3}, ErrIllConditioned},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := Fit(context.Background(), tt.xs, tt.ys, tt.vs, tt.opt)
			if !errors.Is(err, tt.want) {
				t.Errorf("Fit: error %v, want %v", err, tt.want)
			}
		})
	}
}

func TestFitBadOptions(t *testing.T) {
	xs, ys, vs := scattered(1, 10, 0, 0, 1, 1, franke)
	for _, opt := range []Options{{Kernel: 99}, {Method: 7}, {Smoothing: -1}, {Shape: math.NaN()}, {LocalAbove: -2}} {
		if _, err := Fit(context.Background(), xs, ys, vs, opt); err == nil {
			t.Errorf("Fit with %+v: no error", opt)
		}
	}
}

// gridXs and gridYs give an n×n unit lattice.
func gridXs(n int) []float64 {
	out := make([]float64, 0, n*n)
	for j := 0; j < n; j++ {
		for i := 0; i < n; i++ {
			out = append(out, float64(i))
		}
	}
	return out
}

func gridYs(n int) []float64 {
	out := make([]float64, 0, n*n)
	for j := 0; j < n; j++ {
		for i := 0; i < n; i++ {
			out = append(out, float64(j))
		}
	}
	return out
}

// TestNearCoincident reproduces the case of the engine issue: data
// spanning 0 to 1.2 with two readings 1 mm apart that differ by 0.1. They
// are merged with a warning and the surface stays within the data's range
// plus a small margin; duplicates at one position are merged likewise.
func TestNearCoincident(t *testing.T) {
	xs, ys := gridXs(8), gridYs(8)
	vs := make([]float64, len(xs))
	for i := range vs {
		vs[i] = 1.2 * (xs[i] + ys[i]) / 14 // 0 … 1.2 over the lattice
	}
	xs = append(xs, 3.001, 3)
	ys = append(ys, 3, 3)
	vs = append(vs, vs[3*8+3]+0.1, vs[3*8+3]) // a second copy at (3, 3) too
	m := mustFit(t, xs, ys, vs, Options{Method: Global})
	info := m.Info()
	if info.Merged != 2 || len(info.Warnings) == 0 {
		t.Errorf("Merged = %d, warnings %q; want 2 merged and a warning", info.Merged, info.Warnings)
	}
	lo, hi := math.Inf(1), math.Inf(-1)
	for j := 0; j <= 700; j++ {
		for i := 0; i <= 700; i++ {
			v := m.Value(float64(i)/100, float64(j)/100)
			lo, hi = min(lo, v), max(hi, v)
		}
	}
	if lo < -0.1 || hi > 1.3 {
		t.Errorf("surface spans [%g, %g], want within [-0.1, 1.3] for data in [0, 1.2]", lo, hi)
	}
	loo := m.LeaveOneOut()
	if len(loo) != len(xs) {
		t.Fatalf("LeaveOneOut has %d entries, want %d", len(loo), len(xs))
	}
}

// TestTranslationInvariant: the fit does not depend on where the origin is
// (centring and scaling), so projected coordinates give the site-metre
// answer to rounding.
func TestTranslationInvariant(t *testing.T) {
	f := func(x, y float64) float64 { return math.Sin(x/9) + math.Cos(y/13) }
	xs, ys, vs := scattered(11, 200, 0, 0, 120, 90, f)
	m0 := mustFit(t, xs, ys, vs, Options{Method: Global})
	px, py := make([]float64, len(xs)), make([]float64, len(ys))
	for i := range xs {
		px[i], py[i] = xs[i]+687_123, ys[i]+5_312_456
	}
	m1 := mustFit(t, px, py, vs, Options{Method: Global})
	for i := 0; i < 50; i++ {
		x, y := 1.7*float64(i)+10, 1.3*float64(i)+12
		if a, b := m0.Value(x, y), m1.Value(x+687_123, y+5_312_456); math.Abs(a-b) > 1e-8 {
			t.Errorf("at (%g, %g): site %.12g, projected %.12g", x, y, a, b)
		}
	}
}

// TestLocalFallsBack: forcing the local method on a handful of readings
// uses the global fit and says so.
func TestLocalFallsBack(t *testing.T) {
	xs, ys, vs := scattered(2, 10, 0, 0, 10, 10, franke)
	m := mustFit(t, xs, ys, vs, Options{Method: Local})
	if info := m.Info(); info.Method != Global || len(info.Warnings) == 0 {
		t.Errorf("Info = %+v, want the global method and a warning", info)
	}
}

// TestThreeReadings checks the smallest survey that can be fitted: three
// readings not on one line give the plane through them (the linear
// polynomial alone), for every kernel, also when a fourth reading merges
// with one of them.
func TestThreeReadings(t *testing.T) {
	plane := func(x, y float64) float64 { return -200 + 3*x - 5*y }
	tests := []struct {
		name       string
		xs, ys, vs []float64
	}{
		{"three", []float64{0, 1, 0}, []float64{0, 0, 1}, []float64{plane(0, 0), plane(1, 0), plane(0, 1)}},
		{"projected", []float64{512340, 512344, 512340}, []float64{6843120, 6843120, 6843125},
			[]float64{plane(0, 0), plane(4, 0), plane(0, 5)}},
		{"four merging to three", []float64{0, 1, 0, 1e-9}, []float64{0, 0, 1, 0}, []float64{plane(0, 0), plane(1, 0), plane(0, 1), plane(0, 0)}},
	}
	for _, tt := range tests {
		for _, k := range []Kernel{ThinPlate, Cubic, Gaussian, WendlandC2} {
			t.Run(tt.name+"/"+k.String(), func(t *testing.T) {
				m, err := Fit(context.Background(), tt.xs, tt.ys, tt.vs, Options{Kernel: k})
				if err != nil {
					t.Fatalf("Fit: %v", err)
				}
				x, y := tt.xs[0]+0.3, tt.ys[0]+0.2
				want := plane(x-tt.xs[0], y-tt.ys[0])
				if got := m.Value(x, y); math.Abs(got-want) > 1e-6 {
					t.Errorf("Value = %.9g, want %.9g (the plane)", got, want)
				}
				gx, gy := m.Gradient(x, y)
				if math.Abs(gx-3) > 1e-6 || math.Abs(gy+5) > 1e-6 {
					t.Errorf("Gradient = (%g, %g), want (3, -5)", gx, gy)
				}
				for _, e := range m.LeaveOneOut() {
					if !math.IsNaN(e) {
						t.Errorf("LeaveOneOut = %v, want NaN (two readings fix no plane)", m.LeaveOneOut())
						break
					}
				}
			})
		}
	}
}
