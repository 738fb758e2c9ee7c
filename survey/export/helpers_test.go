package export

import (
	"flag"
	"math"
	"os"
	"path/filepath"
	"testing"

	"isofield/interp"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata/")

// pointSource is a point current source buried in a homogeneous half-space.
// Its surface potential is V = rho*I / (2*pi*sqrt(r^2 + d^2)) by the image
// method (Telford, Geldart & Sheriff, Applied Geophysics, 1990, ch. 8).
type pointSource struct {
	x, y, depth float64
	rhoI        float64 // rho (ohm m) times I (A), signed
}

// value returns the surface potential in volts at (x, y).
func (s pointSource) value(x, y float64) float64 {
	r := math.Sqrt((x-s.x)*(x-s.x) + (y-s.y)*(y-s.y) + s.depth*s.depth)
	return s.rhoI / (2 * math.Pi * r)
}

// gradient returns dV/dx and dV/dy, the derivative of the closed form.
func (s pointSource) gradient(x, y float64) (dx, dy float64) {
	r2 := (x-s.x)*(x-s.x) + (y-s.y)*(y-s.y) + s.depth*s.depth
	f := -s.rhoI / (2 * math.Pi * r2 * math.Sqrt(r2))
	return f * (x - s.x), f * (y - s.y)
}

// sources are two sources of opposite sign (invented for the tests).
var testSources = []pointSource{
	{x: 12, y: 9, depth: 2, rhoI: 100 * 2},
	{x: 28, y: 21, depth: 3, rhoI: -100 * 1.5},
}

// closedFormGrid fills an nx x ny grid at the given origin and spacing with
// the surface potential of testSources (scaled by scale, e.g. 1000 for mV)
// and masks the nodes for which mask returns true.
func closedFormGrid(x0, y0, d float64, nx, ny int, scale float64, mask func(i, j int) bool) *interp.Grid {
	g := interp.NewGridN(x0, y0, d, d, nx, ny)
	for j := range ny {
		for i := range nx {
			k := g.Index(i, j)
			if mask != nil && mask(i, j) {
				g.Mask[k] = true
				g.V[k], g.GX[k], g.GY[k] = math.NaN(), math.NaN(), math.NaN()
				continue
			}
			// Local coordinates: the sources sit relative to the origin,
			// so projected origins give the same field.
			lx, ly := float64(i)*d, float64(j)*d
			for _, s := range testSources {
				v := s.value(lx, ly)
				dx, dy := s.gradient(lx, ly)
				g.V[k] += scale * v
				g.GX[k] += scale * dx
				g.GY[k] += scale * dy
			}
		}
	}
	return g
}

// golden compares got with testdata/name, rewriting it under -update.
func golden(t *testing.T, name string, got []byte) {
	t.Helper()
	path := filepath.Join("testdata", name)
	if *update {
		if err := os.WriteFile(path, got, 0o644); err != nil {
			t.Fatal(err)
		}
		return
	}
	want, err := os.ReadFile(path)
	if err != nil {
		t.Fatalf("reading golden file (run with -update to create): %v", err)
	}
	if string(got) != string(want) {
		t.Errorf("%s differs from the golden file; run go test -update and review the diff", name)
	}
}
