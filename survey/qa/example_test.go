package qa_test

import (
	"fmt"

	"isofield/survey"
	"isofield/survey/electrode"
	"isofield/survey/qa"
)

// A base station read three times with a drift of 4 mV per reading, one
// point read twice, all against a saturated calomel electrode and reported
// on the copper/copper-sulfate scale.
func ExampleRun() {
	s := &survey.Survey{Unit: survey.Millivolt, Files: []survey.FileInfo{{Path: "line7.csv"}}}
	for k, r := range []struct {
		id   string
		x, v float64
	}{{"B", 0, -100}, {"P1", 5, -216}, {"P2", 10, -228}, {"B", 0, -88}, {"P2", 10, -222}, {"B", 0, -80}} {
		s.Readings = append(s.Readings, survey.Reading{ID: r.id, X: r.x, V: r.v, Line0: k + 2})
	}
	res, err := qa.Run(s, qa.Settings{Base: "B", From: electrode.SCE, To: electrode.CSE, SpikeK: -1}, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	for i, rd := range s.Readings {
		fmt.Printf("%-2s %5.0f → %6.1f %s\n", rd.ID, rd.V, res.Corrected[i], res.Status[i])
	}
	fmt.Printf("loop closure %+.0f mV\n", res.Drift.LoopClosure)
	// Output:
	// B   -100 → -175.0 ok
	// P1  -216 → -295.0 ok
	// P2  -228 → -312.0 ok
	// B    -88 → -175.0 ok
	// P2  -222 → -312.0 ok
	// B    -80 → -175.0 ok
	// loop closure +20 mV
}
