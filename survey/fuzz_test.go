package survey

import (
	"bytes"
	"errors"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// FuzzParse: the loader never panics; a survey it accepts has finite
// values and positions in its lines, and WriteCSV then Parse gives the
// same readings back.
func FuzzParse(f *testing.F) {
	files, _ := filepath.Glob("testdata/*.csv")
	for _, name := range files {
		data, err := os.ReadFile(name)
		if err != nil {
			f.Fatal(err)
		}
		f.Add(data)
	}
	for _, s := range []string{
		"x,y,v\n0,0,1\n1,0,2\n0,1,3\n",
		"x;y;v\n0,5;0;1\n1;0;2,5\n0;1;3\n",
		"# line_spacing=2 station_spacing=1\nline,station,v\n1,1,1\n1,2,2\n2,1,3\n",
		"x,y,v,time\n0,0,1,09:00\n1,0,2,09:05\n0,1,3,08:00\n",
		"lat,lon,v\n10,20,1\n10.1,20,2\n10,20.1,3\n",
	} {
		f.Add([]byte(s))
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		s, err := Parse(bytes.NewReader(data), "fuzz.csv", LoadOptions{})
		lines := bytes.Count(data, []byte{'\n'}) + 1
		if err != nil {
			pe, ok := err.(*ParseError)
			if !ok || pe.Line < 0 || pe.Line > lines || pe.Column < 0 {
				t.Fatalf("error %v (%T) is not a *ParseError within the %d lines", err, err, lines)
			}
			return
		}
		for i, r := range s.Readings {
			if !finite(r.X) || !finite(r.Y) || !finite(r.V) || !finite(r.TestCurrent) {
				t.Fatalf("reading %d not finite: %+v", i, r)
			}
			if r.Line0 < 1 || r.Line0 > lines || r.File != 0 {
				t.Fatalf("reading %d at file %d line %d of %d", i, r.File, r.Line0, lines)
			}
		}
		var buf bytes.Buffer
		if err := WriteCSV(&buf, s); err != nil {
			t.Fatal(err)
		}
		back, err := Parse(&buf, "again.csv", LoadOptions{Units: s.Unit.String()})
		if err != nil {
			t.Fatalf("reading back %q: %v", buf.String(), err)
		}
		if len(back.Readings) != len(s.Readings) {
			t.Fatalf("read back %d readings, want %d", len(back.Readings), len(s.Readings))
		}
		for i := range s.Readings {
			if !sameReading(s.Readings[i], back.Readings[i]) {
				t.Fatalf("reading %d:\n wrote %+v\n read  %+v\n csv %q", i, s.Readings[i], back.Readings[i], strings.SplitN(buf.String(), "\n", 3))
			}
		}
	})
}

func finite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// FuzzParseTime: the time parser never panics, errors wrap ErrBadTime,
// and an accepted time written as RFC 3339 reads back as the same
// instant.
func FuzzParseTime(f *testing.F) {
	for _, s := range []string{"2025-03-04T09:00:00Z", "2025-03-04 09:00", "04/03/2025 09:00",
		"04.03.2025", "1741078800.5", "09:00:05", "2025-03-04T10:00:00.123+01:00", "31/02/2025"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		v, _, _, err := parseTime(s)
		if err != nil {
			if !errors.Is(err, ErrBadTime) {
				t.Fatalf("parseTime(%q) error %v does not wrap ErrBadTime", s, err)
			}
			return
		}
		text := v.Format(time.RFC3339Nano)
		back, fam, _, err := parseTime(text)
		if err != nil || !back.Equal(v) || fam != famISO {
			t.Fatalf("parseTime(%q) = %v; its RFC 3339 form %q reads back as %v, %v, %v", s, v, text, back, fam, err)
		}
	})
}
