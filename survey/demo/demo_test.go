package demo

import (
	"math"
	"testing"
)

// TestPotentialClosedForm checks the model against hand-worked values of
// V = ρI/(2π·√(r²+d²)) (Telford, Geldart & Sheriff, Applied Geophysics,
// ch. 8): ρ = 100 Ω·m, I = 1 A, d = 0 gives 100/(2π·r).
func TestPotentialClosedForm(t *testing.T) {
	src := []Source{{X: 0, Y: 0, Depth: 1e-12, I: 1}}
	tests := []struct {
		name string
		x, y float64
		want float64
	}{
		{"r=1", 1, 0, 15.915494309189533},   // 100/(2π)
		{"r=2", 0, 2, 7.957747154594767},    // 100/(4π)
		{"r=5", 3, 4, 3.183098861837907},    // 100/(10π)
		{"r=10", -6, 8, 1.5915494309189535}, // 100/(20π)
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := Potential(100, src, tt.x, tt.y); math.Abs(got-tt.want) > 1e-9 {
				t.Errorf("Potential(100, 1 A, %g, %g) = %.12g, want %.12g", tt.x, tt.y, got, tt.want)
			}
		})
	}
}

// TestFieldIsMinusGradient checks Field against central differences of
// Potential.
func TestFieldIsMinusGradient(t *testing.T) {
	src := Sources()
	const h = 1e-5
	for _, p := range [][2]float64{{5, 5}, {30, 20}, {47, 12}, {60, 40}} {
		ex, ey := Field(Resistivity, src, p[0], p[1])
		fx := -(Potential(Resistivity, src, p[0]+h, p[1]) - Potential(Resistivity, src, p[0]-h, p[1])) / (2 * h)
		fy := -(Potential(Resistivity, src, p[0], p[1]+h) - Potential(Resistivity, src, p[0], p[1]-h)) / (2 * h)
		if math.Abs(ex-fx) > 1e-6*(1+math.Abs(fx)) || math.Abs(ey-fy) > 1e-6*(1+math.Abs(fy)) {
			t.Errorf("Field at %v = (%g, %g), finite differences give (%g, %g)", p, ex, ey, fx, fy)
		}
	}
}

func TestSurveyDeterministicAndSigned(t *testing.T) {
	a, b := Survey(), Survey()
	if len(a.Readings) != len(b.Readings) {
		t.Fatalf("two calls gave %d and %d readings", len(a.Readings), len(b.Readings))
	}
	neg, pos, base := 0, 0, 0
	for i := range a.Readings {
		ra, rb := a.Readings[i], b.Readings[i]
		if ra.ID != rb.ID || ra.X != rb.X || ra.Y != rb.Y || ra.V != rb.V || !ra.Time.Equal(rb.Time) {
			t.Fatalf("reading %d differs between calls: %+v and %+v", i, ra, rb)
		}
		switch r := a.Readings[i]; {
		case r.ID == BaseID:
			base++
		case r.V < 0:
			neg++
		case r.V > 0:
			pos++
		}
	}
	if neg == 0 || pos == 0 {
		t.Errorf("demo has %d negative and %d positive readings, want both signs", neg, pos)
	}
	if base < 3 {
		t.Errorf("base station read %d times, want at least 3 for a drift curve", base)
	}
}
