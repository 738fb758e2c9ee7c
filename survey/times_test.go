package survey

import (
	"errors"
	"testing"
	"time"
)

// TestParseTime checks each accepted form against the instant it names.
// Unix seconds are checked against the value `date -u -d @1741078800`
// (GNU coreutils) prints: Tue Mar  4 09:00:00 UTC 2025.
func TestParseTime(t *testing.T) {
	utc := func(y int, mo time.Month, d, h, mi, s, ns int) time.Time {
		return time.Date(y, mo, d, h, mi, s, ns, time.UTC)
	}
	tests := []struct {
		in    string
		want  time.Time
		fam   timeFamily
		zoned bool
	}{
		{"2025-03-04T09:00:00Z", utc(2025, 3, 4, 9, 0, 0, 0), famISO, true},
		{"2025-03-04T10:00:00+01:00", utc(2025, 3, 4, 9, 0, 0, 0), famISO, true},
		{"2025-03-04T09:00:00.25Z", utc(2025, 3, 4, 9, 0, 0, 25e7), famISO, true},
		{"2025-03-04T09:00:00", utc(2025, 3, 4, 9, 0, 0, 0), famISO, false},
		{"2025-03-04 09:00:00", utc(2025, 3, 4, 9, 0, 0, 0), famISO, false},
		{"2025-03-04 09:00:00+00:00", utc(2025, 3, 4, 9, 0, 0, 0), famISO, true},
		{"2025-03-04T09:00", utc(2025, 3, 4, 9, 0, 0, 0), famISO, false},
		{"2025-03-04 09:00", utc(2025, 3, 4, 9, 0, 0, 0), famISO, false},
		{"2025/03/04 09:00:00", utc(2025, 3, 4, 9, 0, 0, 0), famISO, false},
		{"2025-03-04", utc(2025, 3, 4, 0, 0, 0, 0), famISO, false},
		{"04/03/2025 09:00", utc(2025, 3, 4, 9, 0, 0, 0), famDMY, false},
		{"4/3/2025 09:00:00", utc(2025, 3, 4, 9, 0, 0, 0), famDMY, false},
		{"04.03.2025 09:00", utc(2025, 3, 4, 9, 0, 0, 0), famDMY, false},
		{"04/03/2025", utc(2025, 3, 4, 0, 0, 0, 0), famDMY, false},
		{"1741078800", utc(2025, 3, 4, 9, 0, 0, 0), famUnix, true},
		{"1741078800.5", utc(2025, 3, 4, 9, 0, 0, 5e8), famUnix, true},
		{"09:00:00", utc(0, 1, 1, 9, 0, 0, 0), famClock, false},
		{"9:00", utc(0, 1, 1, 9, 0, 0, 0), famClock, false},
	}
	for _, tt := range tests {
		t.Run(tt.in, func(t *testing.T) {
			got, fam, zoned, err := parseTime(tt.in)
			if err != nil || !got.Equal(tt.want) || fam != tt.fam || zoned != tt.zoned {
				t.Errorf("parseTime(%q) = %v, %v, %v, %v; want %v, %v, %v", tt.in, got, fam, zoned, err, tt.want, tt.fam, tt.zoned)
			}
		})
	}
	for _, bad := range []string{"", "yesterday", "31/02/2025", "2025-13-01", "12/31/2025 10:00", "25:00", "99", "1e20"} {
		if _, _, _, err := parseTime(bad); !errors.Is(err, ErrBadTime) {
			t.Errorf("parseTime(%q) error = %v, want ErrBadTime", bad, err)
		}
	}
}

// TestTimeColumns checks date and time columns, the date= setting, and
// the notes on order and zones.
func TestTimeColumns(t *testing.T) {
	tests := []struct {
		name  string
		in    string
		want  time.Time // time of the second reading
		notes []string
	}{
		{"date and time columns", "x,y,v,date,time\n0,0,1,2025-03-04,09:00\n1,0,2,2025-03-04,09:05:30\n0,1,3,2025-03-04,09:10\n",
			time.Date(2025, 3, 4, 9, 5, 30, 0, time.UTC), []string{"taken as UTC"}},
		{"full time beside a date column", "x,y,v,date,time\n0,0,1,2025-03-04,2025-03-04T09:00Z\n1,0,2,,2025-03-04T09:05:30Z\n0,1,3,2025-03-04,2025-03-04T09:10Z\n",
			time.Date(2025, 3, 4, 9, 5, 30, 0, time.UTC), nil},
		{"date setting", "# date=2025-03-04\nx,y,v,time\n0,0,1,09:00\n1,0,2,09:05\n0,1,3,09:10\n",
			time.Date(2025, 3, 4, 9, 5, 0, 0, time.UTC), []string{"taken as UTC"}},
		{"clock only", "x,y,v,time\n0,0,1,09:00\n1,0,2,09:05\n0,1,3,09:10\n",
			time.Date(1, 1, 1, 9, 5, 0, 0, time.UTC), []string{"carry no date"}},
		{"out of order", "x,y,v,time\n0,0,1,2025-03-04T09:00Z\n1,0,2,2025-03-04T08:00Z\n0,1,3,2025-03-04T09:10Z\n",
			time.Date(2025, 3, 4, 8, 0, 0, 0, time.UTC), []string{"1 times are earlier than the time before them (first at line 3)"}},
		{"date only column", "x,y,v,date\n0,0,1,04/03/2025\n1,0,2,05/03/2025\n0,1,3,\n",
			time.Date(2025, 3, 5, 0, 0, 0, 0, time.UTC), []string{"taken as UTC"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s, err := parseString(tt.in, LoadOptions{Units: "mV"})
			if err != nil {
				t.Fatalf("Parse: %v", err)
			}
			if r := s.Readings[1]; !r.HasTime || !r.Time.Equal(tt.want) {
				t.Errorf("time = %v (has %v), want %v", r.Time, r.HasTime, tt.want)
			}
			for _, n := range tt.notes {
				if !hasNote(s, n) {
					t.Errorf("notes %q lack %q", s.Notes, n)
				}
			}
		})
	}
}
