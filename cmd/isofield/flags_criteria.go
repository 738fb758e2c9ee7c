package main

import (
	"flag"
	"fmt"
	"strconv"
	"strings"

	"isofield/survey/criteria"
)

// addCriteriaFlags registers the preset and its parameters, shared by grid,
// zones, suggest, export, report and view. Each flag fills a field of
// criteria.Settings (the session file stores the same struct).
func addCriteriaFlags(fs *flag.FlagSet, s *criteria.Settings) {
	fs.Func("preset", "criteria `PRESET`: "+strings.Join(criteria.Presets(), ", ")+" (default generic)", func(v string) error {
		s.Preset = strings.ToLower(v)
		return criteria.Settings{Preset: s.Preset}.Validate()
	})
	fs.Float64Var(&s.FieldThreshold, "threshold", 0, "flag nodes whose field reaches `FIELD` (potential unit per metre; default: the preset's; negative: none)")
	addGenericFlags(fs, s)
	addConcreteFlags(fs, s)
	addGroundingFlags(fs, s)
	fs.Float64Var(&s.CPLimitMV, "cp-limit", 0, "cp: potential criterion in `MV` versus CSE (default −850, AMPP/NACE SP0169, 49 CFR 192 App. D)")
	fs.BoolVar(&s.KeepTrend, "keep-trend", false, "sp: keep the regional trend (default: remove a robust plane)")
}

func addGenericFlags(fs *flag.FlagSet, s *criteria.Settings) {
	fs.Func("below", "generic: flag potentials below `VALUE` (potential unit)", func(v string) error {
		f, err := finiteFloat(v)
		s.Below = &f
		return err
	})
	fs.Func("above", "generic: flag potentials above `VALUE` (potential unit)", func(v string) error {
		f, err := finiteFloat(v)
		s.Above = &f
		return err
	})
}

func addConcreteFlags(fs *flag.FlagSet, s *criteria.Settings) {
	fs.Float64Var(&s.CoverMM, "cover", 0, "concrete: cover over the bars in `MM` (over 75 mm blurs local differences)")
	fs.Func("condition", "concrete: a `CONDITION` that voids the ASTM C876 bands, repeatable: "+strings.Join(criteria.ConditionNames(), ", "), func(v string) error {
		s.Conditions = append(s.Conditions, strings.ToLower(v))
		return criteria.Settings{Conditions: []string{v}}.Validate()
	})
}

func addGroundingFlags(fs *flag.FlagSet, s *criteria.Settings) {
	fs.Float64Var(&s.BodyKg, "body", 0, "grounding: body weight in `KG`, 50 or 70 (default 50)")
	fs.Float64Var(&s.ClearingTime, "clearing", 0, "grounding: fault clearing time in `SECONDS`, 0.03 to 3 (default 0.5)")
	fs.Float64Var(&s.SoilRho, "soil-rho", 0, "grounding: soil resistivity in `OHM_M`")
	fs.Float64Var(&s.SurfaceRho, "surface-rho", 0, "grounding: surface layer resistivity in `OHM_M` (0: no layer)")
	fs.Float64Var(&s.SurfaceDepth, "surface-depth", 0, "grounding: surface layer thickness in `METRES`")
	fs.Float64Var(&s.GPR, "gpr", 0, "grounding: potential rise `GPR` of the grid at fault current, in the potential unit (0: no touch voltages)")
	fs.Float64Var(&s.Reach, "reach", 0, "grounding: horizontal reach to the structure in `METRES` (default 1)")
	fs.Func("structure", "grounding: grounded metal within reach, as `X,Y;X,Y;...` in metres (default: everywhere, with a caveat)", func(v string) error {
		pts, err := parsePoints(v)
		s.Structure = pts
		return err
	})
}

// finiteFloat parses a finite number.
func finiteFloat(v string) (float64, error) {
	f, err := strconv.ParseFloat(strings.TrimSpace(v), 64)
	if err != nil || f != f || f > 1e300 || f < -1e300 {
		return 0, fmt.Errorf("%q is not a finite number", v)
	}
	return f, nil
}

// parsePoints reads "x,y;x,y;...".
func parsePoints(v string) ([]criteria.Point, error) {
	var pts []criteria.Point
	for n, p := range strings.Split(v, ";") {
		if strings.TrimSpace(p) == "" {
			continue
		}
		xy := strings.Split(p, ",")
		if len(xy) != 2 {
			return nil, fmt.Errorf("point %d %q: want X,Y", n+1, p)
		}
		x, err1 := finiteFloat(xy[0])
		y, err2 := finiteFloat(xy[1])
		if err1 != nil || err2 != nil {
			return nil, fmt.Errorf("point %d %q: want two finite numbers", n+1, p)
		}
		pts = append(pts, criteria.Point{X: x, Y: y})
	}
	if len(pts) == 0 {
		return nil, fmt.Errorf("no points in %q", v)
	}
	return pts, nil
}
