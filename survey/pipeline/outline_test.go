package pipeline

import (
	"context"
	"math"
	"testing"

	"isofield/survey"
)

// deckSurvey is an invented half-cell survey of a small concrete deck: five
// readings on an irregular outline, the most negative at the east corner.
func deckSurvey() *survey.Survey {
	s := &survey.Survey{Name: "five-reading deck (invented)", Unit: survey.Millivolt}
	for k, r := range []struct{ x, y, v float64 }{
		{0, 0, -215}, {6, 0.5, -330}, {8, 5, -410}, {3, 7, -300}, {-1, 4, -240},
	} {
		s.Readings = append(s.Readings, survey.Reading{
			ID: string(rune('A' + k)), X: r.x, Y: r.y, V: r.v, Line0: k + 2,
		})
	}
	s.Files = []survey.FileInfo{{Path: "deck.csv", Unit: survey.Millivolt, Readings: len(s.Readings)}}
	return s
}

// TestOutlineDeck grids the deck with and without the outline mask: the
// thin-plate spline overshoots the readings' range in the corners of the
// grid's rectangle outside the deck, and the outline mask removes them.
// Measured: without it -417.3 .. -200.2 mV, with it -410.3 .. -214.2 mV,
// against readings from -410 to -215 mV.
func TestOutlineDeck(t *testing.T) {
	const lowest, highest = -410.0, -215.0
	tol := 0.01 * (highest - lowest) // 1 % of the readings' range
	tests := []struct {
		outline   Outline
		within    bool // the gridded extremes stay within the range ± tol
		maskedMin int  // at least this many nodes masked
	}{
		{OutlineNone, false, 0},
		{OutlineHull, true, 5000},
	}
	for _, tt := range tests {
		t.Run(tt.outline.String(), func(t *testing.T) {
			res, err := Run(context.Background(), Config{Survey: deckSurvey(), Outline: tt.outline}, nil)
			if err != nil {
				t.Fatal(err)
			}
			lo, hi, masked := math.Inf(1), math.Inf(-1), 0
			for k, v := range res.Grid.V {
				if res.Grid.Mask[k] {
					masked++
					continue
				}
				lo, hi = min(lo, v), max(hi, v)
			}
			t.Logf("outline %v (margin %.3g m): %d of %d nodes masked, values %.1f .. %.1f mV",
				tt.outline, res.OutlineMargin, masked, res.Grid.Len(), lo, hi)
			within := lo >= lowest-tol && hi <= highest+tol
			if within != tt.within || masked < tt.maskedMin {
				t.Errorf("outline %v: gridded %.1f .. %.1f mV with %d nodes masked; readings %g .. %g, tolerance %g: within = %v, want %v (and at least %d masked)",
					tt.outline, lo, hi, masked, lowest, highest, tol, within, tt.within, tt.maskedMin)
			}
			wantMargin := -1.0
			if tt.outline == OutlineHull {
				wantMargin = math.Sqrt2 * res.Grid.DX
			}
			if res.OutlineMargin != wantMargin {
				t.Errorf("OutlineMargin = %g, want %g", res.OutlineMargin, wantMargin)
			}
		})
	}
}

func TestParseOutline(t *testing.T) {
	tests := []struct {
		in      string
		want    Outline
		wantErr bool
	}{
		{"", OutlineHull, false},
		{"hull", OutlineHull, false},
		{"HULL", OutlineHull, false},
		{"none", OutlineNone, false},
		{"rim", OutlineHull, true},
	}
	for _, tt := range tests {
		got, err := ParseOutline(tt.in)
		if got != tt.want || (err != nil) != tt.wantErr {
			t.Errorf("ParseOutline(%q) = %v, %v; want %v, error %v", tt.in, got, err, tt.want, tt.wantErr)
		}
		if err != nil {
			continue
		}
		b, err := got.MarshalText()
		var back Outline
		if err != nil || back.UnmarshalText(b) != nil || back != got {
			t.Errorf("%v: MarshalText %q, %v; read back as %v", got, b, err, back)
		}
	}
	if b, err := Outline(7).MarshalText(); err == nil {
		t.Errorf("Outline(7).MarshalText() = %q, want an error", b)
	}
}
