package qa

import (
	"math"
	"math/rand/v2"
	"reflect"
	"strconv"
	"testing"
	"time"

	"isofield/survey"
)

// halfSpace is the surface potential in mV of a point current source of
// current amps at depth d in ground of resistivity rho, placed under
// (x0, y0): V = ρI/(2π√(r² + d²)) (image method; Telford, Geldart &
// Sheriff, Applied Geophysics (1990), ch. 8).
func halfSpace(x, y, x0, y0, d, rho, amps float64) float64 {
	r2 := (x-x0)*(x-x0) + (y-y0)*(y-y0)
	return 1000 * rho * amps / (2 * math.Pi * math.Sqrt(r2+d*d))
}

// truthField is the invented field the synthetic surveys sample: one
// positive and one negative buried source.
func truthField(x, y float64) float64 {
	return halfSpace(x, y, 6, 7, 4, 100, 0.08) - halfSpace(x, y, 14, 12, 5, 100, 0.06)
}

// survey builder: readings in one file named name.
type builder struct {
	s *survey.Survey
}

func newBuilder(name string, u survey.Unit) *builder {
	return &builder{s: &survey.Survey{Name: name, Unit: u, Files: []survey.FileInfo{{Path: name, Unit: u}}}}
}

// add appends a reading with the next line number (header on line 1).
func (b *builder) add(id string, x, y, v float64) *survey.Reading {
	n := len(b.s.Readings)
	b.s.Readings = append(b.s.Readings, survey.Reading{
		ID: id, X: x, Y: y, V: v, File: 0, Line0: n + 2,
		Fields: []string{id, strconv.FormatFloat(x, 'g', -1, 64), strconv.FormatFloat(y, 'g', -1, 64), strconv.FormatFloat(v, 'g', -1, 64)},
	})
	b.s.Files[0].Readings = len(b.s.Readings)
	b.s.Files[0].Header = []string{"id", "x", "y", "potential_mV"}
	return &b.s.Readings[n]
}

// synthetic is a survey of the truth field on an nx × ny grid at step
// metres, walked line by line, with a base station BASE at (−3, −3) read
// at the start, every `every` readings and at the end. Drift adds
// driftPer mV per reading in order; noise is Gaussian with sigma mV;
// spikes lists reading numbers (in grid order) that get spike mV added.
type synthetic struct {
	nx, ny   int
	every    int
	driftPer float64
	sigma    float64
	spikes   map[int]float64
	withTime bool
	step     float64 // grid spacing in metres (0: 1 m)
}

// build returns the survey and the true (drift-free, noise-free,
// spike-free) value of each reading.
func (sy synthetic) build(seed uint64) (*survey.Survey, []float64) {
	rng := rand.New(rand.NewPCG(seed, 1))
	b := newBuilder("synthetic.csv", survey.Millivolt)
	var truth []float64
	t0 := time.Date(2026, 5, 4, 8, 0, 0, 0, time.UTC)
	read := func(id string, x, y, extra float64) {
		k := len(b.s.Readings)
		v := truthField(x, y)
		rd := b.add(id, x, y, v+sy.driftPer*float64(k)+sy.sigma*rng.NormFloat64()+extra)
		if sy.withTime {
			rd.Time, rd.HasTime = t0.Add(time.Duration(k)*30*time.Second), true
		}
		truth = append(truth, v)
	}
	read("BASE", -3, -3, 0)
	step := sy.step
	if step == 0 {
		step = 1
	}
	g := 0
	for j := range sy.ny {
		for i := range sy.nx {
			read("P"+strconv.Itoa(g), step*float64(i), step*float64(j), sy.spikes[g])
			g++
			if sy.every > 0 && g%sy.every == 0 {
				read("BASE", -3, -3, 0)
			}
		}
	}
	if sy.every > 0 && g%sy.every != 0 {
		read("BASE", -3, -3, 0)
	}
	return b.s, truth
}

// mustRun runs the checks and fails the test on error; it also checks
// that the survey was not modified.
func mustRun(t testing.TB, s *survey.Survey, set Settings, edits []Edit) *Result {
	t.Helper()
	before := cloneSurvey(s)
	r, err := Run(s, set, edits)
	if err != nil {
		t.Fatalf("Run: %v", err)
	}
	if !reflect.DeepEqual(before, s) {
		t.Fatalf("Run modified the survey")
	}
	if len(r.Corrected) != len(s.Readings) || len(r.Status) != len(s.Readings) || len(r.Notes) != len(s.Readings) {
		t.Fatalf("result sizes %d/%d/%d, want %d", len(r.Corrected), len(r.Status), len(r.Notes), len(s.Readings))
	}
	return r
}

func cloneSurvey(s *survey.Survey) *survey.Survey {
	c := *s
	c.Readings = make([]survey.Reading, len(s.Readings))
	for i, rd := range s.Readings {
		rd.Fields = append([]string(nil), rd.Fields...)
		c.Readings[i] = rd
	}
	c.Files = append([]survey.FileInfo(nil), s.Files...)
	return &c
}
