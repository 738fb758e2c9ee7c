package export

import (
	"bytes"
	"strings"
	"testing"
)

// FuzzReadGridCSV reads arbitrary input; whatever reads without error must
// write and read again to the same grid (as encoding/csv's fuzz test does).
func FuzzReadGridCSV(f *testing.F) {
	head := "x_m,y_m,potential_V,ex_V_per_m,ey_V_per_m,field_V_per_m,flagged"
	f.Add(head + "\n0,0,1,2,3,3.605551275463989,0\n1,0,,,,,0\n")
	f.Add(head + ",class\n0,0,1,2,3,4,1,7\n0,1,-1,-2,-3,4,0,\n")
	f.Add(strings.ReplaceAll(head, "_V", "_mV") + "\n5e5,6e6,-350.2,1e-3,0,1e-3,0\n")
	f.Add("x,y\n1,2\n")
	f.Add("")
	f.Fuzz(func(t *testing.T, in string) {
		gf, err := ReadGridCSV(strings.NewReader(in), "fuzz.csv")
		if err != nil {
			return
		}
		var b bytes.Buffer
		if err := WriteGridCSV(&b, gf.Grid, gf.Unit, gf.Flagged, gf.Extra); err != nil {
			t.Fatal(err)
		}
		again, err := ReadGridCSV(bytes.NewReader(b.Bytes()), "again.csv")
		if err != nil {
			t.Fatalf("re-reading written grid: %v\n%s", err, b.String())
		}
		var b2 bytes.Buffer
		if err := WriteGridCSV(&b2, again.Grid, again.Unit, again.Flagged, again.Extra); err != nil {
			t.Fatal(err)
		}
		if !bytes.Equal(b.Bytes(), b2.Bytes()) {
			t.Fatalf("second write differs:\n%s\n---\n%s", b.String(), b2.String())
		}
	})
}
