package mapview

import (
	"strings"
	"testing"

	"github.com/muesli/termenv"

	"isofield/interp"
)

// TestPointMarks checks which reading marks show in a cell for each
// readings setting: all readings, only suspect and excluded ones, none;
// where marks share a cell the suspect shows over the exclusion, over
// the plain reading.
func TestPointMarks(t *testing.T) {
	g := interp.NewGridN(0, 0, 1, 1, 5, 1)
	d := NewData(g, NiceBands(0, 1, 0), NiceBands(0, 1, 0), nil, []Point{
		{X: 0, Y: 0, Kind: KindReading},
		{X: 2, Y: 0, Kind: KindSuspect}, {X: 2, Y: 0, Kind: KindReading},
		{X: 4, Y: 0, Kind: KindReading}, {X: 4, Y: 0, Kind: KindExcluded}, {X: 4, Y: 0, Kind: KindReading},
	})
	tests := []struct {
		name   string
		layers Layers
		want   string
	}{
		{"all", LayerReadings | LayerFlaggedReadings, "+?x"},
		{"all without the flagged layer", LayerReadings, "+?x"},
		{"flagged only", LayerFlaggedReadings, "?x"},
		{"none", 0, ""},
	}
	r := NewRenderer(termenv.Ascii, DivergingPuOr(), SequentialViridis(), SequentialYlOrRd())
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			out := r.Render(d, View{Width: 5, Height: 1, MPC: 1, CX: 2, CY: 0, Layers: tt.layers})
			got := strings.Map(func(c rune) rune {
				if strings.ContainsRune("+?x", c) {
					return c
				}
				return -1
			}, out)
			if got != tt.want {
				t.Errorf("marks %q in %q, want %q", got, out, tt.want)
			}
		})
	}
}
