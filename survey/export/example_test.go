package export_test

import (
	"os"

	"isofield/interp"
	"isofield/survey/export"
)

// A 2 × 2 grid of the plane V = 10 − 2x (uniform field E = (2, 0) V/m)
// with one masked node.
func ExampleWriteGridCSV() {
	g := interp.NewGridN(0, 0, 0.5, 0.5, 2, 2)
	for k := range g.Len() {
		x, _ := g.Node(k%2, k/2)
		g.V[k], g.GX[k], g.GY[k] = 10-2*x, -2, 0
	}
	g.Mask[3] = true
	flagged := []bool{true, true, false, false}
	if err := export.WriteGridCSV(os.Stdout, g, "V", flagged, nil); err != nil {
		panic(err)
	}
	// Output:
	// x_m,y_m,potential_V,ex_V_per_m,ey_V_per_m,field_V_per_m,flagged
	// 0,0,10,2,0,2,1
	// 0.5,0,9,2,0,2,1
	// 0,0.5,10,2,0,2,0
	// 0.5,0.5,,,,,0
}
