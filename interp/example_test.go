package interp_test

import (
	"context"
	"fmt"
	"math"

	"isofield/interp"
)

// Readings of a uniform field (V = 2x − y + 5) are reproduced exactly,
// with the field E = −∇V from the analytic gradient.
func ExampleFit() {
	xs := []float64{0, 10, 0, 10, 4, 7}
	ys := []float64{0, 0, 10, 10, 3, 8}
	vs := make([]float64, len(xs))
	for i := range xs {
		vs[i] = 2*xs[i] - ys[i] + 5
	}
	m, err := interp.Fit(context.Background(), xs, ys, vs, interp.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	gx, gy := m.Gradient(5, 5)
	info := m.Info()
	fmt.Printf("V(5, 5) = %.6f\n", m.Value(5, 5))
	fmt.Printf("E = (%.6f, %.6f)\n", -gx, -gy)
	fmt.Println(info.Kernel, info.Method == interp.Global)
	// Output:
	// V(5, 5) = 10.000000
	// E = (-2.000000, 1.000000)
	// thin-plate true
}

// Evaluate fills a grid; nodes farther than the masking distance from any
// reading are NaN.
func ExampleEvaluate() {
	xs := []float64{0, 1, 2, 0, 1, 2, 0, 1, 2}
	ys := []float64{0, 0, 0, 1, 1, 1, 2, 2, 2}
	vs := []float64{0, 1, 4, 1, 2, 5, 4, 5, 8} // x² + y²
	m, err := interp.Fit(context.Background(), xs, ys, vs, interp.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	g := interp.NewGridN(0, 1, 1, 1, 5, 1) // x = 0 … 4 along y = 1
	interp.MaskFar(g, xs, ys, 1.5)
	if err := interp.Evaluate(context.Background(), m, g, nil); err != nil {
		fmt.Println(err)
		return
	}
	for i, v := range g.V {
		if math.IsNaN(v) {
			fmt.Printf("x=%d masked\n", i)
			continue
		}
		fmt.Printf("x=%d V=%.3f\n", i, v)
	}
	// Output:
	// x=0 V=1.000
	// x=1 V=2.000
	// x=2 V=5.000
	// x=3 V=8.486
	// x=4 masked
}

func ExampleParseKernel() {
	for _, s := range []string{"thin-plate", "TPS", "wendland-c4", "spline"} {
		k, err := interp.ParseKernel(s)
		fmt.Println(k, err)
	}
	// Output:
	// thin-plate <nil>
	// thin-plate <nil>
	// wendland-c4 <nil>
	// thin-plate unknown kernel "spline" (want one of thin-plate, cubic, multiquadric, inverse-multiquadric, gaussian, wendland-c2, wendland-c4)
}

// LeaveOneOut gives each reading's error when it is predicted from all
// the others: a reading that disagrees with its neighbours stands out.
func ExampleModel_LeaveOneOut() {
	xs := []float64{0, 1, 2, 0, 1, 2, 0, 1, 2}
	ys := []float64{0, 0, 0, 1, 1, 1, 2, 2, 2}
	vs := []float64{1, 1, 1, 1, 9, 1, 1, 1, 1} // a spike at (1, 1)
	m, err := interp.Fit(context.Background(), xs, ys, vs, interp.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for k, e := range m.LeaveOneOut() {
		if math.Abs(e) > 4 {
			fmt.Printf("reading %d at (%g, %g): %.1f\n", k, xs[k], ys[k], e)
		}
	}
	// Output:
	// reading 4 at (1, 1): 8.0
}
