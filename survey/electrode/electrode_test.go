package electrode

import (
	"encoding/json"
	"errors"
	"fmt"
	"math"
	"strings"
	"testing"
)

// TestOffsetsOntoCSE checks the offsets computed from the published
// potentials versus SHE against the offsets table of the project's field
// facts (§1, "offsets onto CSE", arithmetic from Int. J. Corrosion 2010,
// art. 756950, Table 2; zinc from NACE SP0176 quoted in a secondary source).
func TestOffsetsOntoCSE(t *testing.T) {
	tests := []struct {
		name string
		from Reference
		want float64 // mV to add to reach the CSE scale
		tol  float64 // mV
		src  string
	}{
		{"sce", SCE, -75, 0.5, "Int. J. Corrosion 2010 Table 2"},
		{"agcl saturated kcl", AgAgClSatKCl, -119, 0.5, "Int. J. Corrosion 2010 Table 2"},
		{"agcl 3.5 M kcl", AgAgCl35KCl, -111, 0.5, "electrochemistry tables"},
		{"agcl seawater", AgAgClSeawater, -66, 0.5, "field facts §1 (absolute value from memory)"},
		// NACE SP0176 gives zinc ≈ −1.10 V vs CSE; the field-facts row
		// "≈ −1096 mV" is the same number through an absolute value.
		{"zinc", Zinc, -1100, 5, "NACE SP0176 criteria table (secondary)"},
		{"she", SHE, -316, 0.5, "Int. J. Corrosion 2010 Table 2"},
		{"cse itself", CSE, 0, 0, "identity"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			off, err := Offset(tt.from, CSE)
			if err != nil {
				t.Fatal(err)
			}
			if got := 1000 * off; math.Abs(got-tt.want) > tt.tol {
				t.Errorf("Offset(%v, cse) = %.1f mV, want %.1f ± %g mV (%s)", tt.from, got, tt.want, tt.tol, tt.src)
			}
		})
	}
}

// TestCathodicCriterionEquivalents converts the steel protection criterion
// −850 mV vs CSE to the other scales and compares with the equivalents
// that regulations and standards print (rounded to 10 mV there).
func TestCathodicCriterionEquivalents(t *testing.T) {
	tests := []struct {
		name string
		to   Reference
		want float64 // mV
		tol  float64 // mV
		src  string
	}{
		// 49 CFR 192 App. D: −0.85 V CSE ≡ −0.78 V SCE. From the table
		// potentials the exact value is −775 mV; the regulation rounds.
		{"sce", SCE, -780, 6, "49 CFR 192 App. D"},
		// 49 CFR 192 App. D: −0.85 V CSE ≡ −0.80 V Ag/AgCl seawater; the
		// seawater electrode sits 50 to 70 mV negative of CSE depending on
		// salinity, so ±20 mV.
		{"agcl seawater", AgAgClSeawater, -800, 20, "49 CFR 192 App. D"},
		// NACE SP0176: −850 mV CSE ≈ +250 mV vs zinc.
		{"zinc", Zinc, 250, 1, "NACE SP0176 criteria table (secondary)"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			got, err := ConvertMilli(-850, CSE, tt.to)
			if err != nil {
				t.Fatal(err)
			}
			if math.Abs(got-tt.want) > tt.tol {
				t.Errorf("ConvertMilli(-850, cse, %v) = %.1f mV, want %.0f ± %g mV (%s)", tt.to, got, tt.want, tt.tol, tt.src)
			}
		})
	}
}

// TestSeawaterOffsetRange checks the seawater electrode against the range
// 49 CFR 192 App. D and the field facts give: 50 to 70 mV negative of CSE.
func TestSeawaterOffsetRange(t *testing.T) {
	off, err := Offset(CSE, AgAgClSeawater)
	if err != nil {
		t.Fatal(err)
	}
	if mv := 1000 * off; mv < 50 || mv > 70 {
		t.Errorf("CSE − Ag/AgCl(sw) = %.1f mV, want 50..70 mV (49 CFR 192 App. D)", mv)
	}
}

// TestConvertRoundTrip checks the conversion rule E(vs B) = E(vs A) +
// (E_A − E_B): converting A→B→C equals A→C, and A→B→A is the identity.
func TestConvertRoundTrip(t *testing.T) {
	refs := []Reference{CSE, AgAgClSatKCl, AgAgCl35KCl, AgAgClSeawater, SCE, Zinc, SHE}
	for _, a := range refs {
		for _, b := range refs {
			for _, c := range refs {
				ab, _ := Convert(-0.5, a, b)
				abc, _ := Convert(ab, b, c)
				ac, _ := Convert(-0.5, a, c)
				if math.Abs(abc-ac) > 1e-12 {
					t.Errorf("%v→%v→%v = %g, %v→%v = %g", a, b, c, abc, a, c, ac)
				}
			}
			ab, _ := Convert(-0.5, a, b)
			if aba, _ := Convert(ab, b, a); math.Abs(aba+0.5) > 1e-12 {
				t.Errorf("%v→%v→%v = %g, want -0.5", a, b, a, aba)
			}
		}
	}
}

func TestConvertNone(t *testing.T) {
	if _, err := Convert(1, None, CSE); !errors.Is(err, ErrNone) {
		t.Errorf("Convert from None: err = %v, want ErrNone", err)
	}
	if _, err := Convert(1, CSE, Reference(99)); !errors.Is(err, ErrNone) {
		t.Errorf("Convert to 99: err = %v, want ErrNone", err)
	}
}

func TestParseReference(t *testing.T) {
	tests := []struct {
		in      string
		want    Reference
		wantErr bool
	}{
		{"cse", CSE, false},
		{"CSE", CSE, false},
		{"Cu/CuSO4", CSE, false},
		{"cu-cuso4", CSE, false},
		{"copper/copper-sulphate", CSE, false},
		{"Ag/AgCl", AgAgClSatKCl, false},
		{"agcl-kcl-sat", AgAgClSatKCl, false},
		{"Ag/AgCl (sat. KCl)", AgAgClSatKCl, false},
		{"agcl-3.5m", AgAgCl35KCl, false},
		{"Ag/AgCl 3.5 M KCl", AgAgCl35KCl, false},
		{"agcl-sw", AgAgClSeawater, false},
		{"Ag/AgCl seawater", AgAgClSeawater, false},
		{"SCE", SCE, false},
		{"calomel", SCE, false},
		{"zn", Zinc, false},
		{"Zinc", Zinc, false},
		{"she", SHE, false},
		{"", None, false},
		{"  ", None, false},
		{"platinum", None, true},
		{"ag", None, true},
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			got, err := ParseReference(tt.in)
			if (err != nil) != tt.wantErr {
				t.Fatalf("ParseReference(%q) err = %v, wantErr %v", tt.in, err, tt.wantErr)
			}
			if got != tt.want {
				t.Errorf("ParseReference(%q) = %v, want %v", tt.in, got, tt.want)
			}
		})
	}
}

func TestParseReferenceUnknownListsNames(t *testing.T) {
	_, err := ParseReference("platinum")
	if !errors.Is(err, ErrUnknown) {
		t.Fatalf("err = %v, want ErrUnknown", err)
	}
	for _, n := range Names() {
		if !strings.Contains(err.Error(), n) {
			t.Errorf("message %q does not list %q", err, n)
		}
	}
}

// TestCanonicalNamesParse checks that every canonical name reads back as
// its own electrode, and that JSON round-trips.
func TestCanonicalNamesParse(t *testing.T) {
	for _, in := range All() {
		r, err := ParseReference(in.Name)
		if err != nil || r != in.Ref {
			t.Errorf("ParseReference(%q) = %v, %v; want %v", in.Name, r, err, in.Ref)
		}
		b, err := json.Marshal(in.Ref)
		if err != nil {
			t.Fatal(err)
		}
		var back Reference
		if err := json.Unmarshal(b, &back); err != nil || back != in.Ref {
			t.Errorf("JSON %s → %v, %v; want %v", b, back, err, in.Ref)
		}
		if in.Source == "" || in.Status == "" {
			t.Errorf("%s has no source or status", in.Name)
		}
	}
}

func FuzzParseReference(f *testing.F) {
	for _, s := range []string{"cse", "Cu/CuSO4", "Ag/AgCl 3.5 M KCl", "agcl-sw", "", "x", "\xff"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		r, err := ParseReference(s)
		if err != nil {
			return
		}
		if r == None {
			return
		}
		// The canonical name must read back as the same electrode.
		if back, err := ParseReference(r.String()); err != nil || back != r {
			t.Errorf("%q → %v → %v, %v", s, r, back, err)
		}
	})
}

func ExampleConvertMilli() {
	v, _ := ConvertMilli(-850, CSE, Zinc)
	fmt.Printf("%.0f mV vs zinc\n", v)
	// Output: 250 mV vs zinc
}
