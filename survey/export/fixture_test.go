package export

import (
	"context"
	"fmt"
	"math"
	"testing"
	"time"

	"isofield/survey"
	"isofield/survey/analysis"
	"isofield/survey/criteria"
	"isofield/survey/pipeline"
	"isofield/survey/qa"
)

// closedForm is the surface potential of testSources in mV, as an
// interp.Interpolant (the analysis samples it for step voltages).
type closedForm struct{}

func (closedForm) Value(x, y float64) float64 {
	var v float64
	for _, s := range testSources {
		v += 1000 * s.value(x, y)
	}
	return v
}

func (closedForm) Gradient(x, y float64) (dx, dy float64) {
	for _, s := range testSources {
		gx, gy := s.gradient(x, y)
		dx, dy = dx+1000*gx, dy+1000*gy
	}
	return dx, dy
}

// fixtureThreshold flags both sources' rings of strong field: the peak
// field is about 3060 mV/m over the first source and 1020 mV/m over the
// second (closed form, see pointSource).
const fixtureThreshold = 600

// fixtureSurvey is a small invented survey over testSources: 30 readings
// on an 8 m lattice, one suspect and one excluded, a 41 × 33 node grid at
// 1 m with its south-west corner masked.
func fixtureSurvey(geographic bool) (*pipeline.Result, pipeline.Config) {
	s := &survey.Survey{Name: "Harrow Lane test pad (fictional)", Unit: survey.Millivolt,
		Files: []survey.FileInfo{{Path: "testdata/pad.csv", Readings: 30,
			SHA256: "4f1c0c9a5d1b1e0f6a1c2b3d4e5f60718293a4b5c6d7e8f90123456789abcdef"}}}
	if geographic {
		s.Geo = &survey.GeoRef{Lat0: 47.3712, Lon0: 8.5426}
	}
	t0 := time.Date(2026, 5, 4, 8, 30, 0, 0, time.UTC)
	cf := closedForm{}
	for j := range 5 {
		for i := range 6 {
			n := len(s.Readings)
			x, y := float64(i)*8, float64(j)*8
			s.Readings = append(s.Readings, survey.Reading{ID: fmt.Sprintf("P%02d", n+1), X: x, Y: y,
				V: math.Round(cf.Value(x, y)*10) / 10, Time: t0.Add(time.Duration(n) * 3 * time.Minute),
				HasTime: true, Line0: n + 2})
		}
	}
	q := &qa.Result{Corrected: make([]float64, 30), Status: make([]qa.Status, 30), Notes: make([][]string, 30)}
	for i, r := range s.Readings {
		q.Corrected[i] = r.V
	}
	q.Status[7], q.Notes[7] = qa.Suspect, []string{"disagrees with its neighbours (z = 4.1)"}
	q.Status[12], q.Notes[12] = qa.Excluded, []string{"=probe slipped; re-read"}
	q.Log = []qa.Step{
		{Reading: 7, Kind: qa.KindSpike, Reason: "disagrees with its neighbours (z = 4.1)"},
		{Reading: 12, Kind: qa.KindExclude, Reason: "=probe slipped; re-read"},
		{Reading: -1, Kind: qa.KindNote, Reason: "no base station named; drift not corrected"},
	}
	res := &pipeline.Result{Survey: s, QA: q, Values: make([]float64, 30)}
	var xs, ys, vs []float64
	for i, r := range s.Readings {
		res.Values[i] = math.NaN()
		if q.Status[i] == qa.OK {
			res.Values[i] = r.V
			xs, ys, vs = append(xs, r.X), append(ys, r.Y), append(vs, r.V)
			res.Used = append(res.Used, i)
		}
	}
	res.Grid = closedFormGrid(0, 0, 1, 41, 33, 1000, func(i, j int) bool { return i+j < 4 })
	cfg := pipeline.Config{Criteria: criteria.Settings{FieldThreshold: fixtureThreshold}, Suggest: 3}
	a, err := analysis.Analyze(context.Background(), analysis.Input{
		Grid: res.Grid, Model: cf, X: xs, Y: ys, V: vs, Index: res.Used, Unit: "mV",
		Criteria: cfg.Criteria, Suggest: cfg.Suggest,
	})
	if err != nil {
		panic(err) // the fixture is fixed: a failure here is a bug in the test
	}
	res.Analysis = a
	return res, cfg
}

// fixtureBundle gathers the fixture into a Bundle with a fixed version.
func fixtureBundle(t testing.TB, geographic bool) *Bundle {
	t.Helper()
	res, cfg := fixtureSurvey(geographic)
	b, err := FromResult(context.Background(), res, cfg, Options{Version: "test"})
	if err != nil {
		t.Fatal(err)
	}
	return b
}
