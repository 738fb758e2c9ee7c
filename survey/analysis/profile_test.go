package analysis

import (
	"math"
	"testing"
)

// TestProfileUniformField: along a line at angle θ to a uniform field
// E = (E0, 0) the potential falls linearly by E0·cos θ per metre and the
// field's component along the line is E0·cos θ (electrostatics); the
// monotone cubic reproduces a straight line exactly.
func TestProfileUniformField(t *testing.T) {
	f := linear{10, -4, 0} // E = (4, 0)
	p, err := MakeProfile(f, 0, 0, 3, 4, 11)
	if err != nil {
		t.Fatal(err)
	}
	cos := 3.0 / 5
	for _, s := range p.Samples {
		if math.Abs(s.V-(10-4*cos*s.Along)) > 1e-12 || math.Abs(s.EAlong-4*cos) > 1e-12 || s.EMag != 4 {
			t.Fatalf("sample %+v, want V = 10 − 2.4·along, E along 2.4, |E| 4", s)
		}
	}
	along, v, e, err := p.Resample(7)
	if err != nil {
		t.Fatal(err)
	}
	for i := range along {
		if math.Abs(v[i]-(10-4*cos*along[i])) > 1e-12 || math.Abs(e[i]-4*cos) > 1e-12 {
			t.Errorf("resampled at %g: V %g, E %g", along[i], v[i], e[i])
		}
	}
	if along[len(along)-1] != 5 {
		t.Errorf("resampled profile ends at %g, want its length 5", along[len(along)-1])
	}
}

func TestProfileReadingsAndErrors(t *testing.T) {
	hs := halfSpace{rho: 100, src: []source{{0, 0, 1, 1}}}
	p, err := MakeProfile(hs, -5, 0, 5, 0, 101)
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range p.Samples {
		if math.Abs(s.V-hs.vAt(math.Abs(s.X))) > 1e-12 {
			t.Fatalf("profile V(%g) = %g, closed form %g", s.X, s.V, hs.vAt(math.Abs(s.X)))
		}
	}
	p.MarkReadings([]float64{0, 1, 2, 6}, []float64{0.4, -0.6, 3, 0}, []float64{1, 2, 3, 4}, []int{7, 8, 9, 10}, 0.5)
	if len(p.Readings) != 1 || p.Readings[0].Index != 7 || p.Readings[0].Along != 5 || p.Readings[0].Offset != 0.4 {
		t.Errorf("readings in a 0.5 m corridor: %+v, want only index 7 at 5 m along, 0.4 m left", p.Readings)
	}
	if _, err := MakeProfile(hs, 1, 1, 1, 1, 10); err == nil {
		t.Errorf("zero-length profile accepted")
	}
	if _, err := MakeProfile(hs, 0, 0, 1, 1, 1); err == nil {
		t.Errorf("profile of one sample accepted")
	}
	if _, _, _, err := p.Resample(1); err == nil {
		t.Errorf("resampling to one point accepted")
	}
}
