package qa

import (
	"context"
	"errors"
	"math"
	"strings"
	"testing"
	"time"

	"isofield/survey"
	"isofield/survey/electrode"
)

// TestReferenceConversion converts readings between electrodes inside a
// run: the check values are the equivalents of the −850 mV CSE criterion
// in 49 CFR 192 App. D (rounded there; exact values from the electrode
// table: SCE −775, Ag/AgCl seawater −784).
func TestReferenceConversion(t *testing.T) {
	tests := []struct {
		name    string
		unit    survey.Unit
		v       float64
		own     string // reading's own reference
		from    electrode.Reference
		to      electrode.Reference
		want    float64
		tol     float64
		wantErr bool
	}{
		{"sce to cse, mV", survey.Millivolt, -780, "", electrode.SCE, electrode.CSE, -850, 6, false},
		{"cse to sce, V", survey.Volt, -0.850, "", electrode.CSE, electrode.SCE, -0.780, 0.006, false},
		{"own reference overrides from", survey.Millivolt, -800, "agcl-sw", electrode.SCE, electrode.CSE, -850, 20, false},
		{"cse to zinc", survey.Millivolt, -850, "", electrode.CSE, electrode.Zinc, 250, 1, false},
		{"no target: as read", survey.Millivolt, -850, "", electrode.SCE, electrode.None, -850, 0, false},
		{"no source: taken as target", survey.Millivolt, -850, "", electrode.None, electrode.CSE, -850, 0, false},
		{"unknown own reference", survey.Millivolt, -850, "platinum", electrode.None, electrode.CSE, 0, 0, true},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			b := newBuilder("ref.csv", tt.unit)
			b.add("A", 0, 0, tt.v).Reference = tt.own
			r, err := Run(b.s, Settings{From: tt.from, To: tt.to, SpikeK: -1}, nil)
			if tt.wantErr {
				var pe *survey.ParseError
				if !errors.As(err, &pe) || pe.Line != 2 || pe.File != "ref.csv" || !errors.Is(err, electrode.ErrUnknown) {
					t.Fatalf("err = %v, want a ParseError at ref.csv:2 wrapping ErrUnknown", err)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			if got := r.Corrected[0]; math.Abs(got-tt.want) > tt.tol {
				t.Errorf("corrected %g, want %g ± %g", got, tt.want, tt.tol)
			}
		})
	}
}

// TestMixedScalesRemark: readings on two scales and no target are not
// comparable; the run says so.
func TestMixedScalesRemark(t *testing.T) {
	b := newBuilder("mixed.csv", survey.Millivolt)
	b.add("A", 0, 0, -500).Reference = "cse"
	b.add("B", 1, 0, -450).Reference = "sce"
	r := mustRun(t, b.s, Settings{SpikeK: -1}, nil)
	if !hasRemark(r, "2 reference scales") {
		t.Errorf("remarks %q do not mention the mixed scales", r.Remarks)
	}
}

// TestCurrentScaling checks V × I_fault / I_test (IEEE Std 81 / 80
// practice, field facts §3).
func TestCurrentScaling(t *testing.T) {
	tests := []struct {
		name      string
		own, flag float64 // reading's test current, Settings.TestCurrent
		fault     float64
		v, want   float64
		wantErr   bool
	}{
		{"flag current", 0, 5, 2000, 2, 800, false},
		{"own current wins", 10, 5, 2000, 2, 400, false},
		{"no fault current: unscaled", 0, 5, 0, 2, 2, false},
		{"no test current", 0, 0, 2000, 2, 0, true},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			b := newBuilder("inj.csv", survey.Volt)
			b.add("A", 0, 0, tt.v).TestCurrent = tt.own
			r, err := Run(b.s, Settings{TestCurrent: tt.flag, FaultCurrent: tt.fault, SpikeK: -1}, nil)
			if tt.wantErr {
				if !errors.Is(err, ErrNoTestCurrent) || !strings.Contains(err.Error(), "inj.csv:2") {
					t.Fatalf("err = %v, want ErrNoTestCurrent at inj.csv:2", err)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			if math.Abs(r.Corrected[0]-tt.want) > 1e-12 {
				t.Errorf("corrected %g, want %g", r.Corrected[0], tt.want)
			}
		})
	}
}

// TestRepeats groups readings by id or position and compares their spread
// with the tolerance. The default tolerance is 10 mV, the repeatability of
// one half-cell reconnected at one spot (ASTM C876, from memory).
func TestRepeats(t *testing.T) {
	type rd struct {
		id   string
		x, y float64
		v    float64
	}
	tests := []struct {
		name       string
		unit       survey.Unit
		set        Settings
		readings   []rd
		wantGroups int
		wantStatus []Status
		wantValue  []float64
	}{
		{"same id agree", survey.Millivolt, Settings{},
			[]rd{{"A", 0, 0, -300}, {"A", 0, 0, -308}, {"B", 5, 5, -200}},
			1, []Status{OK, OK, OK}, []float64{-304, -304, -200}},
		{"same id disagree", survey.Millivolt, Settings{},
			[]rd{{"A", 0, 0, -300}, {"A", 0, 0, -311}, {"B", 5, 5, -200}},
			1, []Status{Suspect, Suspect, OK}, []float64{-300, -311, -200}},
		{"default tolerance in volts", survey.Volt, Settings{},
			[]rd{{"A", 0, 0, -0.300}, {"A", 0, 0, -0.309}},
			1, []Status{OK, OK}, []float64{-0.3045, -0.3045}},
		{"near positions, no ids", survey.Millivolt, Settings{},
			[]rd{{"", 0, 0, -300}, {"", 0.03, 0, -306}, {"", 0.2, 0, -200}},
			1, []Status{OK, OK, OK}, []float64{-303, -303, -200}},
		{"chain within distance", survey.Millivolt, Settings{RepeatDist: 0.1},
			[]rd{{"", 0, 0, -300}, {"", 0.08, 0, -302}, {"", 0.16, 0, -304}},
			1, []Status{OK, OK, OK}, []float64{-302, -302, -302}},
		{"ids only", survey.Millivolt, Settings{RepeatDist: -1},
			[]rd{{"a", 0, 0, -300}, {"b", 0, 0, -250}},
			0, []Status{OK, OK}, []float64{-300, -250}},
		{"ignore ids", survey.Millivolt, Settings{IgnoreIDs: true},
			[]rd{{"1", 0, 0, -300}, {"1", 9, 9, -250}},
			0, []Status{OK, OK}, []float64{-300, -250}},
		{"wider tolerance", survey.Millivolt, Settings{RepeatTol: 20},
			[]rd{{"A", 0, 0, -300}, {"A", 0, 0, -318}},
			1, []Status{OK, OK}, []float64{-309, -309}},
		{"tolerance off", survey.Millivolt, Settings{RepeatTol: -1},
			[]rd{{"A", 0, 0, -300}, {"A", 0, 0, -400}},
			1, []Status{OK, OK}, []float64{-350, -350}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			b := newBuilder("rep.csv", tt.unit)
			for _, x := range tt.readings {
				b.add(x.id, x.x, x.y, x.v)
			}
			set := tt.set
			set.SpikeK = -1
			r := mustRun(t, b.s, set, nil)
			if len(r.Repeats) != tt.wantGroups {
				t.Errorf("%d groups, want %d", len(r.Repeats), tt.wantGroups)
			}
			for i := range tt.readings {
				if r.Status[i] != tt.wantStatus[i] {
					t.Errorf("reading %d status %v, want %v (notes %q)", i, r.Status[i], tt.wantStatus[i], r.Notes[i])
				}
				if math.Abs(r.Corrected[i]-tt.wantValue[i]) > 1e-9 {
					t.Errorf("reading %d corrected %g, want %g", i, r.Corrected[i], tt.wantValue[i])
				}
			}
		})
	}
}

// TestEdits excludes and includes readings by hand.
func TestEdits(t *testing.T) {
	build := func() *survey.Survey {
		b := newBuilder("e.csv", survey.Millivolt)
		b.add("A", 0, 0, -300)
		b.add("A", 0, 0, -340) // disagrees with the first
		b.add("B", 5, 5, -200)
		return b.s
	}
	tests := []struct {
		name       string
		edits      []Edit
		wantStatus []Status
		wantRemark string
	}{
		{"none", nil, []Status{Suspect, Suspect, OK}, ""},
		{"exclude one repeat: the other is fine", []Edit{{File: "e.csv", Line: 3, ID: "A", Exclude: true, Reason: "probe dry"}},
			[]Status{OK, Excluded, OK}, ""},
		{"exclude then include", []Edit{
			{File: "e.csv", Line: 4, Exclude: true, Reason: "x"},
			{File: "e.csv", Line: 4, Reason: "checked"}},
			[]Status{Suspect, Suspect, OK}, ""},
		{"inclusion vouches for a suspect", []Edit{{File: "e.csv", Line: 3, Reason: "re-read by hand, same value"}},
			[]Status{Suspect, OK, OK}, ""},
		{"excluded wins over suspect", []Edit{{File: "e.csv", Line: 2, Exclude: true}},
			[]Status{Excluded, OK, OK}, ""},
		{"unknown line", []Edit{{File: "e.csv", Line: 40, Exclude: true}},
			[]Status{Suspect, Suspect, OK}, "matches no reading"},
		{"unknown file", []Edit{{File: "other.csv", Line: 2, Exclude: true}},
			[]Status{Suspect, Suspect, OK}, "matches no reading"},
		{"id changed", []Edit{{File: "e.csv", Line: 4, ID: "Z", Exclude: true}},
			[]Status{Suspect, Suspect, OK}, "names id"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s := build()
			r := mustRun(t, s, Settings{SpikeK: -1}, tt.edits)
			for i, want := range tt.wantStatus {
				if r.Status[i] != want {
					t.Errorf("reading %d status %v, want %v (notes %q)", i, r.Status[i], want, r.Notes[i])
				}
			}
			if tt.wantRemark != "" && !hasRemark(r, tt.wantRemark) {
				t.Errorf("remarks %q lack %q", r.Remarks, tt.wantRemark)
			}
			if s.Readings[1].V != -340 {
				t.Errorf("original value changed")
			}
		})
	}
}

// TestBadInput covers the bad inputs of the checking stage: each gets a
// clear error or a documented fallback stated in the remarks.
func TestBadInput(t *testing.T) {
	t0 := time.Date(2026, 5, 4, 9, 0, 0, 0, time.UTC)
	tests := []struct {
		name    string
		build   func(b *builder)
		set     Settings
		wantErr error
		remark  string
	}{
		{"base station never repeats", func(b *builder) {
			b.add("B1", 0, 0, -100)
			b.add("P1", 1, 0, -110)
		}, Settings{Base: "B1", SpikeK: -1}, nil, "read only 1 time"},
		{"base station unknown", func(b *builder) {
			b.add("P1", 1, 0, -110)
		}, Settings{Base: "B9", SpikeK: -1}, ErrNoBase, ""},
		{"no timestamps", func(b *builder) {
			b.add("B1", 0, 0, -100)
			b.add("B1", 0, 0, -104)
		}, Settings{Base: "B1", SpikeK: -1}, nil, "no timestamps: the order of the readings stands in for time"},
		{"timestamps on some readings", func(b *builder) {
			r := b.add("B1", 0, 0, -100)
			r.Time, r.HasTime = t0, true
			b.add("B1", 0, 0, -104)
		}, Settings{Base: "B1", SpikeK: -1}, nil, "only 1 of 2 readings have a timestamp (first without: t.csv:3)"},
		{"timestamps out of order", func(b *builder) {
			r := b.add("B1", 0, 0, -100)
			r.Time, r.HasTime = t0, true
			r = b.add("B1", 0, 0, -104)
			r.Time, r.HasTime = t0.Add(-time.Hour), true
		}, Settings{Base: "B1", SpikeK: -1}, nil, "times run backwards at t.csv:3"},
		{"base read at one time only", func(b *builder) {
			r := b.add("B1", 0, 0, -100)
			r.Time, r.HasTime = t0, true
			r = b.add("B1", 0, 0, -104)
			r.Time, r.HasTime = t0, true
		}, Settings{Base: "B1", SpikeK: -1}, nil, "all at one time"},
		{"too few readings for spikes", func(b *builder) {
			b.add("P1", 1, 0, -110)
		}, Settings{}, nil, "spike check skipped: 1 spots"},
		{"automatic base without repeats", func(b *builder) {
			b.add("P1", 1, 0, -110)
		}, Settings{AutoBase: true, SpikeK: -1}, nil, "no base station to propose"},
		{"unknown reference name", func(b *builder) {
			b.add("P1", 1, 0, -110).Reference = "copper"
		}, Settings{To: electrode.CSE}, electrode.ErrUnknown, ""},
		{"negative fault current", func(b *builder) {
			b.add("P1", 1, 0, -110)
		}, Settings{FaultCurrent: -3}, nil, ""},
		{"test current without fault current", func(b *builder) {
			b.add("P1", 1, 0, -110)
		}, Settings{TestCurrent: 3, SpikeK: -1}, nil, "no fault current"},
		{"empty survey", func(b *builder) {}, Settings{}, nil, "spike check skipped"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			b := newBuilder("t.csv", survey.Millivolt)
			tt.build(b)
			r, err := Run(b.s, tt.set, nil)
			switch {
			case tt.wantErr != nil:
				if !errors.Is(err, tt.wantErr) {
					t.Fatalf("err = %v, want %v", err, tt.wantErr)
				}
				return
			case tt.set.FaultCurrent < 0:
				if err == nil || !strings.Contains(err.Error(), "fault current") {
					t.Fatalf("err = %v, want a fault current error", err)
				}
				return
			case err != nil:
				t.Fatalf("err = %v", err)
			}
			if !hasRemark(r, tt.remark) {
				t.Errorf("remarks %q lack %q", r.Remarks, tt.remark)
			}
		})
	}
}

// TestAutoBase proposes the spot read most often and corrects with it
// only when asked.
func TestAutoBase(t *testing.T) {
	sy := synthetic{nx: 6, ny: 5, every: 10, driftPer: 0.5}
	s, truth := sy.build(3)
	r := mustRun(t, s, Settings{SpikeK: -1}, nil)
	if r.BaseProposal != "BASE" || r.Drift != nil {
		t.Fatalf("proposal %q, drift %v; want BASE proposed, no correction", r.BaseProposal, r.Drift)
	}
	r = mustRun(t, s, Settings{AutoBase: true, SpikeK: -1}, nil)
	if r.Drift == nil || r.Drift.Base != "BASE" {
		t.Fatalf("automatic base: drift %+v, remarks %q", r.Drift, r.Remarks)
	}
	for i := range s.Readings {
		if math.Abs(r.Corrected[i]-truth[i]) > 1e-9 {
			t.Fatalf("reading %d corrected %g, truth %g", i, r.Corrected[i], truth[i])
		}
	}
}

// TestLogComplete checks that every change of value or status is in the
// log and that replaying the value steps from the original values gives
// the corrected values.
func TestLogComplete(t *testing.T) {
	sy := synthetic{nx: 10, ny: 10, every: 20, driftPer: 0.2, sigma: 0.5, spikes: map[int]float64{44: 80}}
	s, _ := sy.build(5)
	s.Readings[3].Reference = "sce"
	r := mustRun(t, s, Settings{Base: "BASE", From: electrode.CSE, To: electrode.CSE},
		[]Edit{{File: "synthetic.csv", Line: 10, Exclude: true, Reason: "trampled"}})
	v := make([]float64, len(s.Readings))
	st := make([]Status, len(s.Readings))
	for i, rd := range s.Readings {
		v[i] = rd.V
	}
	for _, step := range r.Log {
		if step.Reading < 0 {
			continue
		}
		if step.Before != v[step.Reading] || step.Was != st[step.Reading] {
			t.Fatalf("step %+v does not start from the previous state (%g, %v)", step, v[step.Reading], st[step.Reading])
		}
		v[step.Reading], st[step.Reading] = step.After, step.Now
	}
	for i := range v {
		if v[i] != r.Corrected[i] || st[i] != r.Status[i] {
			t.Errorf("reading %d: log replays to %g %v, result %g %v", i, v[i], st[i], r.Corrected[i], r.Status[i])
		}
	}
}

func hasRemark(r *Result, sub string) bool {
	for _, m := range r.Remarks {
		if strings.Contains(m, sub) {
			return true
		}
	}
	return sub == ""
}

// TestExcludedBaseReadingLeftOut: a base reading excluded by hand takes no
// part in the drift curve.
func TestExcludedBaseReadingLeftOut(t *testing.T) {
	b := newBuilder("d.csv", survey.Millivolt)
	b.add("B", 0, 0, -100)
	b.add("P1", 1, 0, -200)
	b.add("B", 0, 0, -160) // a bad base reading (cable fault)
	b.add("P2", 2, 0, -210)
	b.add("B", 0, 0, -104)
	edits := []Edit{{File: "d.csv", Line: 4, ID: "B", Exclude: true, Reason: "cable fault"}}
	r := mustRun(t, b.s, Settings{Base: "B", SpikeK: -1}, edits)
	if r.Drift == nil || len(r.Drift.B) != 2 || r.Drift.LoopClosure != -4 {
		t.Fatalf("drift %+v, want a curve through the two good base readings", r.Drift)
	}
	// P2 is read at position 3 of 4 between the base readings at 0 and
	// 4: drift −3 mV, corrected −207.
	if math.Abs(r.Corrected[3]+207) > 1e-9 || r.Status[2] != Excluded {
		t.Errorf("P2 corrected %g (want -207), bad base status %v", r.Corrected[3], r.Status[2])
	}
}

// TestUse checks which readings go into the grid.
func TestUse(t *testing.T) {
	b := newBuilder("u.csv", survey.Millivolt)
	b.add("A", 0, 0, -300) // agreeing pair: gridded once
	b.add("A", 0, 0, -304)
	b.add("C", 5, 0, -300) // disagreeing pair: suspects
	b.add("C", 5, 0, -350)
	b.add("D", 9, 9, -200)
	tests := []struct {
		name        string
		edits       []Edit
		useSuspects bool
		want        []bool
	}{
		{"default", nil, false, []bool{true, false, false, false, true}},
		{"with suspects", nil, true, []bool{true, false, true, true, true}},
		{"first repeat excluded", []Edit{{File: "u.csv", Line: 2, Exclude: true}}, false, []bool{false, true, false, false, true}},
		{"excluded never", []Edit{{File: "u.csv", Line: 6, Exclude: true}}, true, []bool{true, false, true, true, false}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			r := mustRun(t, b.s, Settings{SpikeK: -1}, tt.edits)
			for i, want := range tt.want {
				if got := r.Use(i, tt.useSuspects); got != want {
					t.Errorf("Use(%d, %v) = %v, want %v", i, tt.useSuspects, got, want)
				}
			}
		})
	}
}

// TestRunProgress: the spike fit reports progress, and a cancelled context
// stops the run with its error.
func TestRunProgress(t *testing.T) {
	sy := synthetic{nx: 8, ny: 8}
	s, _ := sy.build(1)
	calls := 0
	if _, err := RunProgress(context.Background(), s, Settings{}, nil, func(done, total int) { calls++ }); err != nil {
		t.Fatal(err)
	}
	if calls == 0 {
		t.Errorf("no progress reported")
	}
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	if _, err := RunContext(ctx, s, Settings{}, nil); !errors.Is(err, context.Canceled) {
		t.Errorf("cancelled run: err = %v, want context.Canceled", err)
	}
}
