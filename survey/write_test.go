package survey

import (
	"bytes"
	"strings"
	"testing"
	"time"
)

// TestWriteCSVRoundTrip writes surveys and reads them back.
func TestWriteCSVRoundTrip(t *testing.T) {
	for _, name := range []string{"day1.csv", "tab_bom_crlf.csv", "line_station.csv", "geographic.csv"} {
		t.Run(name, func(t *testing.T) {
			s, err := Load([]string{"testdata/" + name}, LoadOptions{})
			if err != nil {
				t.Fatal(err)
			}
			roundTrip(t, s)
		})
	}
	t.Run("awkward text", func(t *testing.T) {
		s := &Survey{Unit: Volt, Readings: []Reading{
			{ID: "#1", X: 0.1, Y: 1e-7, V: -1.0 / 3, Note: `he said "wet", then left`},
			{ID: "a,b", X: 512345.123456789, Y: 6178901.987654321, V: 2, Line: "L 1", Station: "=3",
				Time: time.Date(2025, 3, 4, 9, 0, 0, 123456789, time.FixedZone("", 3600)), HasTime: true, Reference: "SCE"},
			{ID: "c", X: 500000.5, Y: -7, V: 1e-300, Note: "two\nlines", TestCurrent: 0.25},
		}}
		roundTrip(t, s)
	})
}

// roundTrip checks that WriteCSV then Parse gives back s's readings.
func roundTrip(t *testing.T, s *Survey) {
	t.Helper()
	var buf bytes.Buffer
	if err := WriteCSV(&buf, s); err != nil {
		t.Fatal(err)
	}
	if !strings.HasPrefix(buf.String(), "id,x_m,y_m,potential_"+s.Unit.String()+",time,line,station,note") {
		t.Fatalf("header %q", strings.SplitN(buf.String(), "\n", 2)[0])
	}
	back, err := Parse(&buf, "round.csv", LoadOptions{})
	if err != nil {
		t.Fatalf("Parse(WriteCSV(s)): %v", err)
	}
	if back.Unit != s.Unit || len(back.Readings) != len(s.Readings) {
		t.Fatalf("read back unit %v, %d readings; want %v, %d", back.Unit, len(back.Readings), s.Unit, len(s.Readings))
	}
	for i := range s.Readings {
		if !sameReading(s.Readings[i], back.Readings[i]) {
			t.Errorf("reading %d:\n wrote %+v\n read  %+v", i, s.Readings[i], back.Readings[i])
		}
	}
}

// sameReading compares the values WriteCSV carries.
func sameReading(a, b Reading) bool {
	return a.ID == b.ID && a.X == b.X && a.Y == b.Y && a.V == b.V &&
		a.HasTime == b.HasTime && a.Time.Equal(b.Time) && a.Line == b.Line &&
		a.Station == b.Station && a.Note == b.Note && a.TestCurrent == b.TestCurrent &&
		a.Reference == b.Reference
}

// TestShiftDecimal: unit conversion gives the decimal a person would
// write, not the product's rounding noise.
func TestShiftDecimal(t *testing.T) {
	tests := []struct {
		v     float64
		shift int
		want  float64
	}{
		{-0.3012, 3, -301.2},
		{-0.2875, 3, -287.5},
		{-301.2, -3, -0.3012},
		{0.1, 3, 100},
		{1e-300, 3, 1e-297},
		{0, 3, 0},
		{-850, -3, -0.85},
	}
	for _, tt := range tests {
		if got := shiftDecimal(tt.v, tt.shift); got != tt.want {
			t.Errorf("shiftDecimal(%v, %d) = %v, want %v", tt.v, tt.shift, got, tt.want)
		}
	}
}
