package criteria

import (
	"fmt"
	"math"
)

// Body-current constants k of I_B = k/√t_s, in A·√s (IEEE Std 80, after
// Dalziel & Lee, IEEE Trans. IGA-4, 1968). The 50 kg value is read in
// Dalziel & Lee; the 70 kg value is from memory (FIELD_FACTS §3, status M).
const (
	K50 = 0.116
	K70 = 0.157
)

// BodyResistance is the body resistance R_B of IEEE Std 80, in ohms
// (quoted in a secondary source).
const BodyResistance = 1000.0

// Clearing-time range over which the body-current formula holds (IEEE Std
// 80, after Dalziel).
const (
	MinClearing = 0.03
	MaxClearing = 3.0
)

// BodyConstant returns k for a body weight of 50 or 70 kg.
func BodyConstant(kg float64) (float64, error) {
	switch kg {
	case 50:
		return K50, nil
	case 70:
		return K70, nil
	}
	return 0, fmt.Errorf("body weight %g kg: want 50 or 70", kg)
}

// SurfaceDerating returns the surface-layer derating factor of IEEE Std 80,
//
//	C_s = 1 − 0.09 (1 − ρ/ρ_s) / (2 h_s + 0.09),
//
// with ρ the soil resistivity and ρ_s the surface layer's (Ω·m) and h_s its
// thickness (m). Without a surface layer (ρ_s or h_s zero) C_s = 1. The
// formula is from memory (FIELD_FACTS §3, status M).
func SurfaceDerating(rho, rhoS, hs float64) (float64, error) {
	switch {
	case bad(rho) || bad(rhoS) || bad(hs):
		return 0, fmt.Errorf("resistivities and layer thickness must be finite and not negative")
	case rhoS == 0 || hs == 0:
		return 1, nil
	case rho == 0:
		return 0, fmt.Errorf("soil resistivity is needed with a surface layer")
	}
	return 1 - 0.09*(1-rho/rhoS)/(2*hs+0.09), nil
}

func bad(v float64) bool { return v < 0 || math.IsNaN(v) || math.IsInf(v, 0) }

// TouchLimit returns the tolerable touch voltage of IEEE Std 80 in volts,
// E_touch = (R_B + 1.5·C_s·ρ_s)·k/√t_s (from memory, FIELD_FACTS §3).
func TouchLimit(cs, rhoS, k, ts float64) float64 {
	return (BodyResistance + 1.5*cs*rhoS) * k / math.Sqrt(ts)
}

// StepLimit returns the tolerable step voltage of IEEE Std 80 in volts,
// E_step = (R_B + 6·C_s·ρ_s)·k/√t_s (from memory, FIELD_FACTS §3).
func StepLimit(cs, rhoS, k, ts float64) float64 {
	return (BodyResistance + 6*cs*rhoS) * k / math.Sqrt(ts)
}

// Tolerable holds the tolerable step and touch voltages for one set of
// assumptions.
type Tolerable struct {
	BodyKg, Clearing   float64 // kg, s
	Rho, RhoS, Hs      float64 // Ω·m, Ω·m, m (RhoS = Rho without a layer)
	Cs, K              float64
	StepV, TouchV      float64 // volts
	SurfaceLayer       bool
	Source, Assumption string
}

// IEEE80 computes the tolerable voltages from the grounding settings: body
// weight (0: 50 kg), clearing time (0: 0.5 s), soil and surface-layer
// resistivity and layer thickness. Without a surface layer the person
// stands on the soil itself (ρ_s = ρ, C_s = 1).
func IEEE80(set Settings) (Tolerable, error) {
	t := Tolerable{BodyKg: orDefault(set.BodyKg, DefaultBodyKg), Clearing: orDefault(set.ClearingTime, DefaultClearing),
		Rho: set.SoilRho, RhoS: set.SurfaceRho, Hs: set.SurfaceDepth,
		Source: "IEEE Std 80 (body model after Dalziel & Lee 1968); formulas from memory, unconfirmed"}
	var err error
	if t.K, err = BodyConstant(t.BodyKg); err != nil {
		return t, err
	}
	if t.Clearing < MinClearing || t.Clearing > MaxClearing || math.IsNaN(t.Clearing) {
		return t, fmt.Errorf("clearing time %g s: the body-current formula holds for %g to %g s", t.Clearing, MinClearing, MaxClearing)
	}
	if t.Cs, err = SurfaceDerating(t.Rho, t.RhoS, t.Hs); err != nil {
		return t, err
	}
	t.SurfaceLayer = t.RhoS > 0 && t.Hs > 0
	if !t.SurfaceLayer {
		t.RhoS = t.Rho
	}
	t.StepV = StepLimit(t.Cs, t.RhoS, t.K, t.Clearing)
	t.TouchV = TouchLimit(t.Cs, t.RhoS, t.K, t.Clearing)
	t.Assumption = fmt.Sprintf("%g kg body, clearing %g s, soil %g Ω·m", t.BodyKg, t.Clearing, t.Rho)
	if t.SurfaceLayer {
		t.Assumption += fmt.Sprintf(", surface layer %g Ω·m × %g m (C_s = %.4f)", t.RhoS, t.Hs, t.Cs)
	} else {
		t.Assumption += ", no surface layer (C_s = 1)"
	}
	return t, nil
}

func orDefault(v, d float64) float64 {
	if v == 0 {
		return d
	}
	return v
}
