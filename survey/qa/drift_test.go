package qa

import (
	"math"
	"strconv"
	"testing"

	"isofield/interp"
)

// TestDriftRecoversTruth plants a linear drift on readings of a closed-form
// field (two buried point sources, image method, Telford et al. ch. 8) and
// checks that drift correction recovers the truth. Piecewise-linear and
// monotone cubic curves both reproduce a linear drift exactly through
// exact base readings (a property of both interpolants: Fritsch & Butland
// 1984 keep the common slope when successive slopes are equal), so the
// tolerance is float round-off.
func TestDriftRecoversTruth(t *testing.T) {
	tests := []struct {
		name     string
		method   DriftMethod
		withTime bool
	}{
		{"linear in order", Linear, false},
		{"cubic in order", MonotoneCubic, false},
		{"linear in time", Linear, true},
		{"cubic in time", MonotoneCubic, true},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			sy := synthetic{nx: 12, ny: 10, every: 25, driftPer: 0.08, withTime: tt.withTime}
			s, truth := sy.build(1)
			r := mustRun(t, s, Settings{Base: "BASE", Drift: tt.method, SpikeK: -1}, nil)
			if r.Drift == nil {
				t.Fatalf("no drift curve; remarks %q", r.Remarks)
			}
			if r.Drift.ByTime != tt.withTime {
				t.Errorf("ByTime = %v, want %v (note %q)", r.Drift.ByTime, tt.withTime, r.Drift.TimeNote)
			}
			// The base readings span the whole survey.
			if r.Drift.Outside != 0 {
				t.Errorf("Outside = %d, want 0", r.Drift.Outside)
			}
			// Loop closure: drift per reading × readings between the
			// first and last base readings.
			wantClosure := 0.08 * float64(len(s.Readings)-1)
			if math.Abs(r.Drift.LoopClosure-wantClosure) > 1e-9 {
				t.Errorf("LoopClosure = %g, want %g", r.Drift.LoopClosure, wantClosure)
			}
			for i := range s.Readings {
				if d := math.Abs(r.Corrected[i] - truth[i]); d > 1e-9 {
					t.Fatalf("reading %d: corrected %g, truth %g (off by %g)", i, r.Corrected[i], truth[i], d)
				}
			}
		})
	}
}

// TestDriftAndSpikes adds noise (σ = 1 mV) and planted spikes of ±25 to
// ±60 mV to the drifting survey of the closed-form field. Every spike must
// be caught, at most 2 % of clean readings flagged, and the corrected
// clean readings must match the truth to an RMS of 2 mV: each corrected
// reading carries its own noise (σ²), the noise of the curve between two
// base readings (on average 2σ²/3 for linear interpolation) and the noise
// of the first base reading, the curve's origin (σ²): √(8/3) σ ≈ 1.63 σ
// expected.
func TestDriftAndSpikes(t *testing.T) {
	spikes := map[int]float64{17: 40, 55: -35, 88: 60, 130: -25, 171: 30, 199: -45, 233: 50}
	sy := synthetic{nx: 16, ny: 16, every: 30, driftPer: 0.1, sigma: 1, spikes: spikes}
	s, truth := sy.build(7)
	r := mustRun(t, s, Settings{Base: "BASE"}, nil)

	planted := map[int]bool{}
	for i, rd := range s.Readings {
		for g := range spikes {
			if rd.ID == "P"+strconv.Itoa(g) {
				planted[i] = true
			}
		}
	}
	var falsePos, clean int
	var sq float64
	for i := range s.Readings {
		if planted[i] {
			if r.Status[i] != Suspect {
				t.Errorf("planted spike %s not caught: residual %g, z %g", ReadingName(s, i), r.Residual[i], r.Z[i])
			}
			continue
		}
		clean++
		if r.Status[i] != OK {
			falsePos++
		}
		sq += (r.Corrected[i] - truth[i]) * (r.Corrected[i] - truth[i])
	}
	if share := float64(falsePos) / float64(clean); share > 0.02 {
		t.Errorf("%d of %d clean readings flagged (%.1f%%), want ≤ 2%%", falsePos, clean, 100*share)
	}
	if rms := math.Sqrt(sq / float64(clean)); rms > 2 {
		t.Errorf("RMS error of corrected clean readings = %.3g mV, want ≤ 2 mV", rms)
	}
	// The base station counts once and is not a spike cluster.
	for i, rd := range s.Readings {
		if rd.ID == "BASE" && r.Status[i] != OK {
			t.Errorf("base reading %s has status %v (%q)", ReadingName(s, i), r.Status[i], r.Notes[i])
		}
	}
	used := 0
	for i, rd := range s.Readings {
		if rd.ID == "BASE" && r.Use(i, false) {
			used++
		}
	}
	if used != 1 {
		t.Errorf("base station gridded %d times, want once", used)
	}
}

// TestSpikesLocalFit runs the same check on a survey large enough for the
// partition-of-unity fit (2,600 readings on a 0.4 m grid of the
// closed-form field), whose leave-one-out residuals are the local
// equivalent of Rippa's. Every planted spike must be caught and at most
// 1 % of clean readings flagged.
func TestSpikesLocalFit(t *testing.T) {
	spikes := map[int]float64{101: 40, 777: -35, 1290: 60, 1800: -30, 2333: 45}
	sy := synthetic{nx: 52, ny: 50, every: 200, driftPer: 0.01, sigma: 1, spikes: spikes, step: 0.4}
	s, _ := sy.build(21)
	r := mustRun(t, s, Settings{Base: "BASE"}, nil)
	if r.Fit == nil || r.Fit.Method != interp.Local {
		t.Fatalf("fit %+v, want the local method", r.Fit)
	}
	caught, flagged := 0, 0
	for i, rd := range s.Readings {
		isSpike := false
		for g := range spikes {
			isSpike = isSpike || rd.ID == "P"+strconv.Itoa(g)
		}
		switch {
		case isSpike && r.Status[i] == Suspect:
			caught++
		case isSpike:
			t.Errorf("planted spike %s not caught: residual %g, z %g", ReadingName(s, i), r.Residual[i], r.Z[i])
		case r.Status[i] != OK:
			flagged++
		}
	}
	if share := float64(flagged) / float64(len(s.Readings)); share > 0.01 {
		t.Errorf("%d clean readings flagged (%.2f%%), want ≤ 1%%", flagged, 100*share)
	}
}
