// Package electrode knows the reference electrodes that probe surveys are
// read against and converts potentials from one reference scale to another.
//
// Every electrode's potential is stored versus the standard hydrogen
// electrode (SHE) at 25 °C, with the source of the number and how well that
// source was checked (see Status). A potential E read against electrode A
// reads against electrode B as
//
//	E(vs B) = E(vs A) + (E_A − E_B)
//
// with E_A and E_B the electrodes' own potentials versus SHE (the
// conversion rule of electrochemistry). Sign convention: reduction
// potentials, "more negative" is more active (ASTM G3).
//
// Temperature is not corrected: the copper/copper-sulfate electrode moves
// by about 0.9 mV/°C and Ag/AgCl in saturated KCl by about −1.0 mV/°C, and
// ASTM C876-22a asks for no correction within 22.2 ± 5.5 °C.
//
// The zero Reference is None: "not stated". Converting from or to None is
// an error, never a silent no-op.
package electrode

import (
	"errors"
	"fmt"
)

// Reference is a reference electrode. The zero value is None.
type Reference int

// The reference electrodes. The order is part of the session file format
// only through MarshalText, which writes names, so it may grow.
const (
	None           Reference = iota // not stated
	CSE                             // copper/copper-sulfate, saturated
	AgAgClSatKCl                    // silver/silver-chloride in saturated KCl
	AgAgCl35KCl                     // silver/silver-chloride in 3.5 M KCl
	AgAgClSeawater                  // silver/silver-chloride in seawater
	SCE                             // saturated calomel
	Zinc                            // zinc
	SHE                             // standard hydrogen
)

// Status says how well a published number was checked, as in the project's
// field-facts table.
type Status string

// The statuses.
const (
	Read      Status = "C"  // read in the source or a faithful copy
	Secondary Status = "C2" // read only in a secondary source quoting it
	Computed  Status = "V"  // arithmetic checked from other rows
	Memory    Status = "M"  // from memory, unconfirmed
)

// Info describes one reference electrode.
type Info struct {
	Ref   Reference
	Name  string // canonical short name, as written in files and flags
	Title string // plain-language name
	// VsSHE is the electrode's potential versus SHE in volts at 25 °C.
	VsSHE  float64
	Source string
	Status Status
	// Remark qualifies the number (range of published values, dependence
	// on salinity).
	Remark string
}

// zincVsCSE is the zinc reference's potential on the copper/copper-sulfate
// scale, ≈ −1.10 V (NACE SP0176 criteria table, quoted in a secondary
// source: −850 mV CSE ≈ +250 mV vs Zn).
const zincVsCSE = -1.100

// cseVsSHE is the saturated copper/copper-sulfate electrode versus SHE
// (Int. J. Corrosion 2010, art. 756950, Table 2).
const cseVsSHE = 0.316

// infos returns the electrode table. It is a function, not a package
// variable, so that nothing can modify it.
func infos() []Info {
	return []Info{
		{CSE, "cse", "copper/copper-sulfate, saturated", cseVsSHE,
			"Int. J. Corrosion 2010, art. 756950, Table 2", Read,
			"published values +0.300 to +0.318 V; ASTM C876-22a uses 0.30 V at 22.2 °C"},
		{AgAgClSatKCl, "agcl-kcl-sat", "silver/silver-chloride, saturated KCl", 0.197,
			"Int. J. Corrosion 2010, art. 756950, Table 2", Read, "about −1.0 mV/°C"},
		{AgAgCl35KCl, "agcl-3.5m", "silver/silver-chloride, 3.5 M KCl", 0.205,
			"electrochemistry tables", Read, ""},
		{AgAgClSeawater, "agcl-sw", "silver/silver-chloride in seawater", 0.250,
			"49 CFR 192 App. D (offset to CSE); absolute value from memory", Memory,
			"50 to 70 mV negative of CSE, depends on salinity"},
		{SCE, "sce", "saturated calomel", 0.241,
			"Int. J. Corrosion 2010, art. 756950, Table 2", Read, ""},
		{Zinc, "zn", "zinc", cseVsSHE + zincVsCSE,
			"NACE SP0176 criteria table (≈ −1.10 V vs CSE)", Secondary,
			"zinc is not a true reference; its potential depends on the electrolyte"},
		{SHE, "she", "standard hydrogen", 0, "definition", Read, ""},
	}
}

// All returns the known electrodes in a fixed order.
func All() []Info { return infos() }

// Lookup returns the description of r, and false for None or an unknown
// value.
func Lookup(r Reference) (Info, bool) {
	for _, in := range infos() {
		if in.Ref == r {
			return in, true
		}
	}
	return Info{}, false
}

// String returns the canonical short name ("cse", "sce"...), "none" for
// None and "reference(N)" for values outside the table.
func (r Reference) String() string {
	if r == None {
		return "none"
	}
	if in, ok := Lookup(r); ok {
		return in.Name
	}
	return fmt.Sprintf("reference(%d)", int(r))
}

// ErrUnknown is the cause ParseReference wraps for names it does not know.
var ErrUnknown = errors.New("unknown reference electrode")

// ErrNone is the cause Offset and Convert wrap when a reference is None or
// outside the table.
var ErrNone = errors.New("reference electrode not stated")

// Offset returns E_from − E_to in volts: what to add to a potential read
// against from to get the potential read against to.
func Offset(from, to Reference) (float64, error) {
	a, ok := Lookup(from)
	if !ok {
		return 0, fmt.Errorf("converting from %v: %w", from, ErrNone)
	}
	b, ok := Lookup(to)
	if !ok {
		return 0, fmt.Errorf("converting to %v: %w", to, ErrNone)
	}
	return a.VsSHE - b.VsSHE, nil
}

// Convert returns v, a potential in volts read against from, as read
// against to.
func Convert(v float64, from, to Reference) (float64, error) {
	off, err := Offset(from, to)
	return v + off, err
}

// ConvertMilli is Convert for potentials in millivolts.
func ConvertMilli(mv float64, from, to Reference) (float64, error) {
	off, err := Offset(from, to)
	return mv + 1000*off, err
}

// Names lists the canonical names, for messages and help.
func Names() []string {
	var ns []string
	for _, in := range infos() {
		ns = append(ns, in.Name)
	}
	return ns
}

// MarshalText writes the canonical name ("" for None).
func (r Reference) MarshalText() ([]byte, error) {
	if r == None {
		return []byte{}, nil
	}
	if _, ok := Lookup(r); !ok {
		return nil, fmt.Errorf("reference electrode %d: %w", int(r), ErrUnknown)
	}
	return []byte(r.String()), nil
}

// UnmarshalText reads any spelling ParseReference accepts; empty text is
// None.
func (r *Reference) UnmarshalText(b []byte) error {
	ref, err := ParseReference(string(b))
	if err != nil {
		return err
	}
	*r = ref
	return nil
}
