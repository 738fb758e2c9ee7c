package survey

import "testing"

// TestSplitHeader checks names and units read from header cells.
func TestSplitHeader(t *testing.T) {
	tests := []struct {
		in, name, unit string
		f              field
		qual           string
	}{
		{"potential_mV", "potential", "mv", fV, ""},
		{"Potential (mV)", "potential", "mv", fV, ""},
		{"potential [V]", "potential", "v", fV, ""},
		{"V_mV", "v", "mv", fV, ""},
		{"Reading_V", "reading", "v", fV, ""},
		{"mV", "v", "mv", fV, ""},
		{"Half-cell potential (mV)", "half_cell_potential", "mv", fV, ""},
		{" Easting ", "easting", "", fX, ""},
		{"x_m", "x", "m", fX, ""},
		{"E [m]", "e", "m", fX, ""},
		{"Northing (m)", "northing", "m", fY, ""},
		{"Station ID", "station_id", "", fID, ""},
		{"station", "station", "", fStation, ""},
		{"Test current, A", "test_current", "a", fCurrent, ""},
		{"current_mA", "current", "ma", fCurrent, ""},
		{"lat_deg", "lat", "deg", fLat, ""},
		{"Longitude", "longitude", "", fLon, ""},
		{"Ref. electrode", "ref_electrode", "", fRef, ""},
		{"reference electrode", "reference_electrode", "", fRef, ""},
		{"\ufeffid", "id", "", fID, ""},
		{"temp_C", "temp_c", "", fNone, ""},
		{"date", "date", "", fDate, ""},
		{"Date/Time", "date_time", "", fTime, ""},
		{"Potential (mV vs CSE)", "potential", "mv", fV, "CSE"},
		{"E [mV, Ag/AgCl sat. KCl]", "e", "mv", fX, "Ag/AgCl sat. KCl"},
		{"x (m, local grid)", "x", "m", fX, "local grid"},
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			name, unit, qual := splitHeader(tt.in)
			if name != tt.name || unit != tt.unit || lookupField(name) != tt.f || qual != tt.qual {
				t.Errorf("splitHeader(%q) = %q, %q, %q (field %d); want %q, %q, %q (field %d)", tt.in, name, unit, qual, lookupField(name), tt.name, tt.unit, tt.qual, tt.f)
			}
		})
	}
}

// TestMapHeader: the first column of a kind wins, the rest are unused.
func TestMapHeader(t *testing.T) {
	c, _, err := mapHeader([]string{"id", "x", "easting", "y", "potential_V", "value", "comment"})
	if err != nil {
		t.Fatal(err)
	}
	if c.at[fX] != 1 || c.at[fY] != 3 || c.at[fV] != 4 || c.at[fNote] != 6 || c.vUnit != "v" {
		t.Errorf("columns %v, unit %q", c.at, c.vUnit)
	}
	if len(c.unused) != 2 || c.unused[0] != 2 || c.unused[1] != 5 {
		t.Errorf("unused %v, want [2 5]", c.unused)
	}
}

// TestReferenceInHeader: "E (mV vs SCE)" is the potential, read against
// SCE, beside easting and northing columns.
func TestReferenceInHeader(t *testing.T) {
	s, err := parseString("Easting,Northing,E (mV vs SCE)\n0,0,-700\n1,0,-710\n0,1,-690\n", LoadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if r := s.Readings[1]; r.V != -710 || r.Reference != "SCE" || s.Unit != Millivolt {
		t.Errorf("reading %+v unit %v; want -710 mV against SCE", r, s.Unit)
	}
}
