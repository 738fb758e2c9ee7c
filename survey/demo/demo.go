// Package demo builds isofield's built-in demonstration survey: a fictional
// current-injection test at "Fernhollow yard", generated deterministically
// from the closed-form surface potential of point current sources buried in
// homogeneous ground.
//
// Each source of current I at depth d below the surface of a half-space of
// resistivity ρ adds V = ρI / (2π·√(r² + d²)) at horizontal distance r
// (the image method; Telford, Geldart & Sheriff, Applied Geophysics, 2nd ed.,
// 1990, ch. 8). The yard has one injection electrode (positive current) and
// two return paths (negative), so the map has both signs and a zero line.
//
// The readings carry what field data carries: a base station read again
// through the day with a slow linear drift, a repeated point, a mistyped
// reading (a spike) and a little measurement noise. Nothing here describes a
// real site.
package demo

import (
	"fmt"
	"math"
	"math/rand/v2"
	"time"

	"isofield/survey"
)

// Source is a buried point current source.
type Source struct {
	X, Y  float64 // metres
	Depth float64 // metres below the surface, > 0
	I     float64 // amperes, signed
}

// Potential returns the surface potential in volts at (x, y) of sources in
// ground of resistivity rho (Ω·m): the sum of ρI/(2π·√(r² + d²)).
func Potential(rho float64, src []Source, x, y float64) float64 {
	v := 0.0
	for _, s := range src {
		r := math.Sqrt((x-s.X)*(x-s.X) + (y-s.Y)*(y-s.Y) + s.Depth*s.Depth)
		v += rho * s.I / (2 * math.Pi * r)
	}
	return v
}

// Field returns E = −∇V in volts per metre at (x, y) for the same model.
func Field(rho float64, src []Source, x, y float64) (ex, ey float64) {
	for _, s := range src {
		dx, dy := x-s.X, y-s.Y
		r := math.Sqrt(dx*dx + dy*dy + s.Depth*s.Depth)
		k := rho * s.I / (2 * math.Pi * r * r * r)
		ex += k * dx
		ey += k * dy
	}
	return ex, ey
}

// Scenario parameters of the Fernhollow yard demo.
const (
	Resistivity = 80.0 // Ω·m, homogeneous ground
	Width       = 60.0 // metres, x extent of the surveyed yard
	Height      = 40.0 // metres, y extent
	LineStep    = 2.5  // metres between survey lines (lines run along x)
	StationStep = 2.5  // metres between stations on a line
	BaseID      = "BASE"
	driftPerDay = 12.0 // mV of reference drift over the working day
	noiseMV     = 0.8  // standard deviation of measurement noise, mV
)

// Sources returns the yard's buried current sources: the injection
// electrode, the return electrode and a buried pipe taking part of the
// return current.
func Sources() []Source {
	return []Source{
		{X: 18, Y: 22, Depth: 3.0, I: 0.5},
		{X: 48, Y: 10, Depth: 3.5, I: -0.35},
		{X: 44, Y: 33, Depth: 4.0, I: -0.15},
	}
}

// Survey returns the demo survey in millivolts: lines every LineStep metres
// with stations every StationStep metres, walked in boustrophedon order,
// the base station re-read at the start of every third line.
func Survey() *survey.Survey {
	rng := rand.New(rand.NewPCG(20260314, 7))
	src := Sources()
	start := time.Date(2026, 3, 14, 8, 0, 0, 0, time.UTC)
	s := &survey.Survey{Name: "Fernhollow yard (fictional demo)", Unit: survey.Millivolt}
	s.Files = []survey.FileInfo{{Path: "demo:fernhollow", Unit: survey.Millivolt}}
	t := start
	nLines := int(Height/LineStep) + 1
	nSt := int(Width/StationStep) + 1
	total := float64(nLines * nSt)
	add := func(id, line, station, note string, x, y, extra float64) {
		frac := float64(len(s.Readings)) / total
		v := 1000*Potential(Resistivity, src, x, y) + driftPerDay*frac + noiseMV*rng.NormFloat64() + extra
		s.Readings = append(s.Readings, survey.Reading{
			ID: id, X: math.Round(x*100) / 100, Y: math.Round(y*100) / 100, V: math.Round(v*10) / 10, Time: t, HasTime: true,
			Line: line, Station: station, Note: note, Line0: len(s.Readings) + 2,
		})
		t = t.Add(25 * time.Second)
	}
	for l := 0; l < nLines; l++ {
		y := float64(l) * LineStep
		if l%3 == 0 {
			add(BaseID, "", "", "base station", -3, -3, 0)
		}
		for k := 0; k < nSt; k++ {
			st := k
			if l%2 == 1 {
				st = nSt - 1 - k
			}
			x := float64(st) * StationStep
			// Positions as staked: a few centimetres off the nominal grid.
			jx, jy := 0.05*rng.NormFloat64(), 0.05*rng.NormFloat64()
			id := fmt.Sprintf("L%02d-S%02d", l, st)
			extra, note := 0.0, ""
			if l == 14 && st == 3 {
				extra, note = 60, "" // a slip of the pen: 60 mV too high
			}
			add(id, fmt.Sprint(l), fmt.Sprint(st), note, x+jx, y+jy, extra)
		}
		if l == 6 {
			// Re-measured point after a cable check.
			add("L06-S12", "6", "12", "re-read after cable check", 30.02, 15.01, 0)
		}
	}
	add(BaseID, "", "", "base station, close of day", -3, -3, 0)
	s.Files[0].Readings = len(s.Readings)
	s.Files[0].Header = []string{"id", "x_m", "y_m", "potential_mV", "time", "line", "station", "note"}
	return s
}
