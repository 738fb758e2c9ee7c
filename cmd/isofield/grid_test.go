package main

import (
	"encoding/csv"
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"isofield/survey/demo"
)

// TestGridHalfSpace grids scattered readings of the closed-form surface
// potential of buried point current sources, V = ρI/(2π·√(r²+d²))
// (Telford, Geldart & Sheriff, Applied Geophysics, 2nd ed., ch. 8), through
// the whole command (CSV in, CSV out), and compares potential and field with
// the closed form at nodes away from the sources and the edges.
func TestGridHalfSpace(t *testing.T) {
	src := []demo.Source{{X: 20, Y: 20, Depth: 4, I: 0.2}, {X: 45, Y: 25, Depth: 5, I: -0.1}}
	const rho = 100.0
	dir := t.TempDir()
	in := filepath.Join(dir, "halfspace.csv")
	rng := rand.New(rand.NewPCG(1, 2))
	var b strings.Builder
	b.WriteString("id,x,y,potential_mV\n")
	for k := 0; k < 900; k++ {
		x, y := 60*rng.Float64(), 40*rng.Float64()
		fmt.Fprintf(&b, "P%d,%.4f,%.4f,%.6f\n", k, x, y, 1000*demo.Potential(rho, src, x, y))
	}
	if err := os.WriteFile(in, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	out := filepath.Join(dir, "grid.csv")
	if code, _, errs := runArgs("grid", "--spacing", "1", "--threshold", "50", "-o", out, in); code != 0 {
		t.Fatalf("grid exit %d: %s", code, errs)
	}
	rows := readCSV(t, out)
	wantHeader := "x_m,y_m,potential_mV,ex_mV_per_m,ey_mV_per_m,field_mV_per_m,flagged"
	if got := strings.Join(rows[0][:7], ","); got != wantHeader {
		t.Fatalf("header = %q, want %q", got, wantHeader)
	}
	var n int
	var maxErrV, maxErrE float64
	for _, r := range rows[1:] {
		x, y := num(t, r[0]), num(t, r[1])
		if x < 5 || x > 55 || y < 5 || y > 35 || r[2] == "" {
			continue
		}
		want := 1000 * demo.Potential(rho, src, x, y)
		ex, ey := demo.Field(rho, src, x, y)
		maxErrV = max(maxErrV, math.Abs(num(t, r[2])-want))
		maxErrE = max(maxErrE, math.Hypot(num(t, r[3])-1000*ex, num(t, r[4])-1000*ey))
		f := num(t, r[5])
		if flagged := r[6] == "1"; flagged != (f >= 50) {
			t.Errorf("node (%g, %g): field %g with threshold 50 but flagged = %s", x, y, f, r[6])
		}
		n++
	}
	if n < 1000 {
		t.Fatalf("only %d interior nodes compared", n)
	}
	// Tolerances: over the compared area the potential spans about 930 mV
	// and the field reaches about 77 mV/m (closed form). We demand 1 % of
	// the span and 5 % of the peak field from 900 scattered readings (mean
	// spacing ≈ 1.6 m, sources 4-5 m deep).
	if maxErrV > 9 {
		t.Errorf("max potential error %.3g mV over %d interior nodes, want ≤ 9", maxErrV, n)
	}
	if maxErrE > 3.8 {
		t.Errorf("max field error %.3g mV/m over %d interior nodes, want ≤ 3.8", maxErrE, n)
	}
}

func readCSV(t *testing.T, path string) [][]string {
	t.Helper()
	f, err := os.Open(path)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	rows, err := csv.NewReader(f).ReadAll()
	if err != nil {
		t.Fatal(err)
	}
	return rows
}

func num(t *testing.T, s string) float64 {
	t.Helper()
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		t.Fatalf("cell %q: %v", s, err)
	}
	return v
}
