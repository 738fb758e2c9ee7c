package analysis_test

import (
	"fmt"

	"isofield/survey/analysis"
)

// plate is the potential between parallel plates: V = 100 − 40x volts, a
// uniform field of 40 V/m along +x.
type plate struct{}

func (plate) Value(x, y float64) float64               { return 100 - 40*x }
func (plate) Gradient(x, y float64) (float64, float64) { return -40, 0 }

// In a uniform field the step voltage is the field times the 1 m step.
func ExampleStepVoltage() {
	fmt.Printf("%.3f V\n", analysis.StepVoltage(plate{}, 2, 3))
	// Output: 40.000 V
}
