package tui

import (
	"math"
	"strings"
)

// dispUnit is the unit a quantity is shown in on screen and the factor
// from the stored unit to it: shown = stored / scale. Only the text on
// screen uses it; stored values, files and command output keep the
// survey's own unit.
type dispUnit struct {
	name  string  // "mV", "V", "kV", "V/m" ...
	scale float64 // stored units per shown unit (0 reads as 1)
	// tiny is the magnitude (stored unit) below which a value prints as
	// 0: rounding noise of the interpolant, such as 1e-12 V midway between
	// two equal and opposite sources, is not a reading.
	tiny float64
}

// noiseFraction is the fraction of a range's largest magnitude below
// which a value of that range is shown as 0 (double precision carries
// about 16 digits; the interpolant's sums lose a few).
const noiseFraction = 1e-9

// promoteAt is the magnitude from which a value is shown in the next
// larger unit (mV → V → kV): below it num prints at most four digits
// before the point, so the numbers of a range stay short and keep three
// or four significant digits.
const promoteAt = 1e4

// voltPrefixes are the potential units in increasing size with their
// size in millivolts (SI prefixes m = 10⁻³, k = 10³: BIPM, The
// International System of Units, 9th ed., 2019, table 7).
var voltPrefixes = [...]struct {
	name string
	mV   float64
}{{"mV", 1}, {"V", 1e3}, {"kV", 1e6}}

// displayUnit chooses the unit to show the values lo … hi of a quantity
// stored in unit: a potential unit ("mV", "V", "kV"), optionally per
// something ("mV/m"). The unit grows by factors of 1000 while the
// largest magnitude of the range would show as promoteAt or more, up to
// kilovolts; it never shrinks. NaN and infinite bounds are ignored; a
// unit that is not a potential unit is kept as it is.
func displayUnit(unit string, lo, hi float64) dispUnit {
	base, per, _ := strings.Cut(unit, "/")
	if per != "" {
		per = "/" + per
	}
	k := -1
	for i, p := range voltPrefixes {
		if p.name == base {
			k = i
		}
	}
	if k < 0 {
		return dispUnit{name: unit, scale: 1}
	}
	m := 0.0
	for _, v := range []float64{lo, hi} {
		if !math.IsNaN(v) && !math.IsInf(v, 0) {
			m = max(m, math.Abs(v))
		}
	}
	scale := 1.0
	for i := k + 1; i < len(voltPrefixes) && m/scale >= promoteAt; i++ {
		scale = voltPrefixes[i].mV / voltPrefixes[k].mV
		base = voltPrefixes[i].name
	}
	return dispUnit{name: base + per, scale: scale, tiny: noiseFraction * m}
}

// num formats v (in the stored unit) as a number in d.
func (d dispUnit) num(v float64) string {
	if math.Abs(v) < d.tiny {
		v = 0
	}
	if d.scale == 0 {
		return num(v)
	}
	return num(v / d.scale)
}

// with formats v (in the stored unit) as a number in d followed by d's
// name.
func (d dispUnit) with(v float64) string { return d.num(v) + " " + d.name }

// withUnit formats one value stored in unit, in the unit that suits it
// alone.
func withUnit(v float64, unit string) string { return displayUnit(unit, v, v).with(v) }
