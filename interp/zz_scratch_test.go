package interp

import (
	"testing"
)

func TestScratchCompare(t *testing.T) {
	srcs := []source{{250, 300, 30, 20}, {700, 450, 40, -20}, {500, 150, 25, 10}, {820, 640, 35, -10}}
	f := func(x, y float64) float64 { v, _, _ := halfSpace(100, srcs, x, y); return 1000 * v }
	xs, ys, vs := scattered(42, 20000, 0, 0, 999, 749, f)
	for _, o := range []Options{{Method: Local}, {Method: Local, Kernel: Cubic}} {
		m := mustFit(t, xs, ys, vs, o)
		r, mx := errorStats(300, 0, 0, 999, 749, m.Value, f)
		t.Logf("%+v: rms %.4g max %.4g patches %d", o.Kernel, r, mx, m.Info().Patches)
	}
}
