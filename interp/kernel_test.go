package interp

import (
	"math"
	"math/rand/v2"
	"testing"
)

func TestParseKernel(t *testing.T) {
	tests := []struct {
		in      string
		want    Kernel
		wantErr bool
	}{
		{"", ThinPlate, false},
		{"thin-plate", ThinPlate, false},
		{"TPS", ThinPlate, false},
		{"thin_plate_spline", ThinPlate, false},
		{"cubic", Cubic, false},
		{"multiquadric", Multiquadric, false},
		{" imq ", InverseMultiquadric, false},
		{"inverse-multiquadric", InverseMultiquadric, false},
		{"Gaussian", Gaussian, false},
		{"wendland-c2", WendlandC2, false},
		{"wendland_c4", WendlandC4, false},
		{"spline", ThinPlate, true},
		{"wendland", ThinPlate, true},
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			got, err := ParseKernel(tt.in)
			if (err != nil) != tt.wantErr || got != tt.want {
				t.Errorf("ParseKernel(%q) = %v, %v; want %v, error %v", tt.in, got, err, tt.want, tt.wantErr)
			}
		})
	}
	for _, k := range allKernels {
		if got, err := ParseKernel(k.String()); err != nil || got != k {
			t.Errorf("ParseKernel(%v.String()) = %v, %v", k, got, err)
		}
	}
}

// TestWendlandClosedForms checks the compactly supported functions against
// Wendland's closed forms φ₃,₁ = (1−r)₊⁴(4r+1) and φ₃,₂ = (1−r)₊⁶(35r²+18r+3)
// (H. Wendland, Adv. Comput. Math. 4 (1995) 389–396) written out as
// polynomials (expansion checked with numpy.poly1d), plus values worked by
// hand: φ₃,₁(½) = 3/16, φ₃,₂(½) = 83/256.
func TestWendlandClosedForms(t *testing.T) {
	c2 := func(r float64) float64 { return 1 - 10*r*r + 20*r*r*r - 15*math.Pow(r, 4) + 4*math.Pow(r, 5) }
	c4 := func(r float64) float64 {
		return 3 - 28*r*r + 210*math.Pow(r, 4) - 448*math.Pow(r, 5) + 420*math.Pow(r, 6) - 192*math.Pow(r, 7) + 35*math.Pow(r, 8)
	}
	const eps = 2.5 // support radius 0.4
	tests := []struct {
		name string
		k    Kernel
		ref  func(float64) float64
		half float64
	}{
		{"C2", WendlandC2, c2, 3.0 / 16},
		{"C4", WendlandC4, c4, 83.0 / 256},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			b := newBasis(tt.k, eps)
			for _, r := range []float64{0, 0.01, 0.1, 0.2, 0.3, 0.39} {
				got, want := b.phi(r*r), tt.ref(eps*r)
				if math.Abs(got-want) > 1e-13 {
					t.Errorf("φ(%g) = %.15g, closed form %.15g", r, got, want)
				}
			}
			for _, r := range []float64{0.4, 0.41, 1, 10} {
				if v, d := b.phiD(r * r); b.phi(r*r) != 0 || v != 0 || d != 0 {
					t.Errorf("φ(%g) outside the support = %g (%g, %g), want 0", r, b.phi(r*r), v, d)
				}
			}
			if got := b.phi(0.2 * 0.2); math.Abs(got-tt.half) > 1e-15 {
				t.Errorf("φ at half the support = %.17g, want %.17g", got, tt.half)
			}
		})
	}
}

// TestKernelDerivatives checks φ'(r)/r from phiD against a central
// difference of phi, for every kernel.
func TestKernelDerivatives(t *testing.T) {
	for _, k := range allKernels {
		t.Run(k.String(), func(t *testing.T) {
			b := newBasis(k, 1.7)
			for _, r := range []float64{0.05, 0.2, 0.45, 0.9, 1.6} {
				f, dr := b.phiD(r * r)
				if math.Abs(f-b.phi(r*r)) > 1e-15*max(1, math.Abs(f)) {
					t.Errorf("phiD value %g != phi %g at r=%g", f, b.phi(r*r), r)
				}
				h := 1e-6
				fd := (b.phi((r+h)*(r+h)) - b.phi((r-h)*(r-h))) / (2 * h)
				if got := dr * r; math.Abs(got-fd) > 1e-7*max(1, math.Abs(fd)) {
					t.Errorf("φ'(%g) = %.10g, finite difference %.10g", r, got, fd)
				}
			}
			if _, d := b.phiD(0); math.IsNaN(d) || math.IsInf(d, 0) {
				t.Errorf("φ'(r)/r at r=0 reported as %g, want a finite value (the gradient there is 0·that)", d)
			}
		})
	}
}

// FuzzParseKernel: any input gives a kernel or an error, never a panic,
// and an accepted name's String form parses back to the same kernel.
func FuzzParseKernel(f *testing.F) {
	for _, s := range []string{"", "thin-plate", "TPS", "mq", "wendland_c4", "Kernel(3)", "\x00", "gaussian "} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		k, err := ParseKernel(s)
		if err != nil {
			return
		}
		if k2, err := ParseKernel(k.String()); err != nil || k2 != k {
			t.Errorf("ParseKernel(%q) = %v, but ParseKernel(%q) = %v, %v", s, k, k.String(), k2, err)
		}
	})
}

// TestTPSLoopsMatchBasis checks the thin-plate loops with the logarithm
// written out (tps.go) against basis.phi and basis.phiD, including
// coincident and subnormally close points, to 1e-15 relative to the sum
// of the magnitudes.
func TestTPSLoopsMatchBasis(t *testing.T) {
	b := newBasis(ThinPlate, 0)
	r := rand.New(rand.NewPCG(5, 6))
	for trial := 0; trial < 200; trial++ {
		n := 1 + r.IntN(60)
		xs, ys, c := make([]float64, n), make([]float64, n), make([]float64, n)
		for j := range xs {
			xs[j], ys[j], c[j] = r.Float64()*2-1, r.Float64()*2-1, r.NormFloat64()
		}
		u, v := xs[0], ys[0] // coincident with the first point
		switch trial % 3 {
		case 1:
			u, v = r.Float64()*3-1.5, r.Float64()*3-1.5
		case 2:
			u = xs[0] + 1e-160 // r² subnormal
		}
		row := make([]float64, n)
		tpsRow(row, xs, ys, u, v, b.lt)
		s, su, sv := tpsValueGrad(c, xs, ys, u, v, b.lt)
		var ws, wu, wv, scale float64
		for j := range xs {
			du, dv := u-xs[j], v-ys[j]
			want := b.phi(du*du + dv*dv)
			if row[j] != want && math.Abs(row[j]-want) > 1e-15*max(1, math.Abs(want)) {
				t.Fatalf("trial %d: tpsRow[%d] = %.17g, phi %.17g", trial, j, row[j], want)
			}
			f, dr := b.phiD(du*du + dv*dv)
			ws, wu, wv = ws+c[j]*f, wu+c[j]*dr*du, wv+c[j]*dr*dv
			scale += math.Abs(c[j]) * (math.Abs(f) + math.Abs(dr))
		}
		for _, d := range [][2]float64{{s, ws}, {su, wu}, {sv, wv}} {
			if math.Abs(d[0]-d[1]) > 1e-15*max(1, scale) {
				t.Fatalf("trial %d: tpsValueGrad %.17g, phiD %.17g", trial, d[0], d[1])
			}
		}
	}
}
