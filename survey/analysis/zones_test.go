package analysis

import (
	"fmt"
	"testing"
)

func TestRankZones(t *testing.T) {
	zs := []Zone{
		{Quantity: QuantityField, Severity: 50, nodes: []int{1}},
		{Quantity: QuantityPotential, Severity: 80, nodes: []int{2}},
		{Quantity: QuantityStep, Severity: 1, nodes: []int{3}},
		{Quantity: QuantityTouch, Severity: 0.5, nodes: []int{4}},
		{Quantity: QuantityField, Severity: 50, nodes: []int{0}},
	}
	rankZones(zs)
	var got []string
	for _, z := range zs {
		got = append(got, fmt.Sprintf("%d:%s/%d", z.Rank, z.Quantity, z.nodes[0]))
	}
	// Touch and step first (safety), then by severity, ties by position.
	want := "[1:touch/4 2:step/3 3:potential/2 4:field/0 5:field/1]"
	if fmt.Sprint(got) != want {
		t.Errorf("ranked %v, want %s", got, want)
	}
}

func TestExceedance(t *testing.T) {
	tests := []struct {
		name string
		rule flagRule
		peak float64
		want float64
	}{
		{"field twice the threshold", flagRule{quantity: QuantityField, threshold: 50}, 100, 2},
		{"potential 70 mV beyond −350", flagRule{quantity: QuantityPotential, threshold: -350, below: true}, -420, 1.2},
		{"potential limit zero uses the range", flagRule{quantity: QuantityPotential, threshold: 0}, 10, 1.5},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if got := exceedance(tt.rule, tt.peak, 20); fmt.Sprintf("%.9f", got) != fmt.Sprintf("%.9f", tt.want) {
				t.Errorf("exceedance = %g, want %g", got, tt.want)
			}
		})
	}
}
