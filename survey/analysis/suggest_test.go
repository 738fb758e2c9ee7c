package analysis

import (
	"math"
	"testing"

	"isofield/interp"
)

// gapSurvey returns readings on a 1 m lattice over [0, 20]² with the
// square (12, 16)² left out, and a grid over the same area.
func gapSurvey(f interp.Interpolant) (Input, *interp.Grid) {
	var in Input
	for j := 0; j <= 20; j++ {
		for i := 0; i <= 20; i++ {
			x, y := float64(i), float64(j)
			if x > 12 && x < 16 && y > 12 && y < 16 {
				continue
			}
			in.X, in.Y, in.V = append(in.X, x), append(in.Y, y), append(in.V, f.Value(x, y))
			in.Index = append(in.Index, 100+len(in.Index))
		}
	}
	g := interp.NewGridN(0, 0, 0.25, 0.25, 81, 81)
	evaluate(g, f)
	in.Grid, in.Model, in.Unit = g, f, "mV"
	return in, g
}

func TestSuggestGap(t *testing.T) {
	in, g := gapSurvey(linear{0, 20, 0})
	got := Suggest(g, in, nil, 3)
	if len(got) == 0 {
		t.Fatal("no suggestions")
	}
	// In a uniform field the score is the distance to the nearest reading:
	// the centre of the gap, (14, 14), 2 m from the readings around it.
	if s := got[0]; math.Hypot(s.X-14, s.Y-14) > 1e-9 || s.ID != "S01" || math.Abs(s.Distance-2) > 1e-9 {
		t.Errorf("best suggestion %+v, want S01 at (14, 14), 2 m from a reading", s)
	}
	for a := range got {
		for b := range a {
			if d := math.Hypot(got[a].X-got[b].X, got[a].Y-got[b].Y); d < 2 {
				t.Errorf("suggestions %s and %s only %g m apart, want ≥ 2 × spacing", got[a].ID, got[b].ID, d)
			}
		}
		if got[a].Why == "" || !math.IsNaN(got[a].LOO) {
			t.Errorf("suggestion %+v: want a reason and no leave-one-out error", got[a])
		}
	}
}

// TestSuggestLeaveOneOut: a reading whose leave-one-out error is large
// draws a suggestion to its neighbourhood in a uniform field, where the
// distance alone would only pick points in the gap.
func TestSuggestLeaveOneOut(t *testing.T) {
	in, g := gapSurvey(linear{0, 20, 0})
	loo := make([]float64, len(in.X))
	far := -1
	for i := range in.X {
		loo[i] = 0.1
		if in.X[i] == 3 && in.Y[i] == 4 {
			far, loo[i] = i, -50
		}
	}
	in.Model = withLOO{in.Model, loo}
	got := Suggest(g, in, nil, 2)
	if len(got) != 2 || math.Hypot(got[1].X-3, got[1].Y-4) > 1 || math.IsNaN(got[1].LOO) {
		t.Errorf("suggestions %+v, want the second next to reading %d at (3, 4) with its leave-one-out error", got, far)
	}
	in.Model = linear{0, 20, 0}
	if got := Suggest(g, in, nil, 2); math.Hypot(got[1].X-3, got[1].Y-4) < 3 {
		t.Errorf("without leave-one-out errors the second suggestion %+v is still near (3, 4)", got[1])
	}
}

func TestSuggestFew(t *testing.T) {
	g := interp.NewGridN(0, 0, 1, 1, 3, 3)
	evaluate(g, linear{0, 1, 0})
	in := Input{Grid: g, Model: linear{0, 1, 0}, X: []float64{1}, Y: []float64{1}, V: []float64{1}, Index: []int{0}}
	if got := Suggest(g, in, nil, 5); got != nil {
		t.Errorf("one reading gave suggestions %v, want none", got)
	}
}
