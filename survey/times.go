package survey

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"time"
)

// timeFamily groups layouts that may be mixed within one column.
type timeFamily int

const (
	famNone  timeFamily = iota
	famISO              // year first: RFC 3339 and its relatives
	famDMY              // day first: 02/01/2006 15:04, 02.01.2006 15:04
	famUnix             // seconds since 1970-01-01 UTC
	famClock            // time of day only
)

func (f timeFamily) String() string {
	switch f {
	case famISO:
		return "year-first date"
	case famDMY:
		return "day-first date"
	case famUnix:
		return "unix seconds"
	case famClock:
		return "time of day"
	}
	return "unknown form"
}

// layout is one accepted time form.
type layout struct {
	fam    timeFamily
	layout string
}

// timeLayouts are tried in order; the first that parses wins. The table
// is read only.
var timeLayouts = [...]layout{
	{famISO, time.RFC3339Nano},
	{famISO, "2006-01-02T15:04:05.999999999"},
	{famISO, "2006-01-02 15:04:05.999999999Z07:00"},
	{famISO, "2006-01-02 15:04:05.999999999"},
	{famISO, "2006-01-02T15:04Z07:00"},
	{famISO, "2006-01-02T15:04"},
	{famISO, "2006-01-02 15:04"},
	{famISO, "2006/01/02 15:04:05"},
	{famISO, "2006/01/02 15:04"},
	{famISO, time.DateOnly},
	{famDMY, "2/1/2006 15:04:05"},
	{famDMY, "2/1/2006 15:04"},
	{famDMY, "2.1.2006 15:04:05"},
	{famDMY, "2.1.2006 15:04"},
	{famDMY, "2/1/2006"},
	{famDMY, "2.1.2006"},
	{famClock, "15:04:05.999999999"},
	{famClock, "15:04"},
}

// Unix seconds are accepted from 1973 to 2286, so that small numbers (an
// elapsed count, a station number) are not taken for dates.
const minUnix, maxUnix = 1e8, 1e10

// timeReader parses one file's time values. All values of a column must
// belong to one family of forms (see the package doc); the first value
// fixes it.
type timeReader struct {
	fam      timeFamily
	famLine  int
	day      time.Time // day of clock-only times
	hasDay   bool
	prev     time.Time
	disorder int // count of times earlier than the one before
	disLine  int // first line out of order
	noZone   bool
}

// parse reads a time value; a time of day is joined to date, the cell of
// the file's date column, when there is one. Values without a zone are
// UTC.
func (t *timeReader) parse(s, date string, line int) (time.Time, error) {
	v, fam, zoned, err := parseTime(s)
	if err == nil && fam == famClock && date != "" {
		s = strings.TrimSpace(date) + " " + s
		v, fam, zoned, err = parseTime(s)
	}
	if err != nil {
		return v, err
	}
	t.noZone = t.noZone || !zoned
	if t.fam == famNone {
		t.fam, t.famLine = fam, line
	} else if fam != t.fam {
		return v, fmt.Errorf("a %s, but line %d gave a %s: %w", fam, t.famLine, t.fam, ErrBadTime)
	}
	if fam == famClock {
		v = t.day.Add(v.Sub(time.Date(0, 1, 1, 0, 0, 0, 0, time.UTC)))
	}
	if !t.prev.IsZero() && v.Before(t.prev) {
		if t.disorder == 0 {
			t.disLine = line
		}
		t.disorder++
	}
	t.prev = v
	return v, nil
}

// parseTime reads s in one of the accepted forms. zoned reports whether
// the value fixed its zone (an offset, Z, or unix seconds).
func parseTime(s string) (v time.Time, fam timeFamily, zoned bool, err error) {
	s = strings.TrimSpace(s)
	if looksNumeric(s) {
		u, err := strconv.ParseFloat(s, 64)
		if err == nil && !(u >= minUnix && u <= maxUnix) {
			return time.Time{}, famNone, false, fmt.Errorf("unix seconds must lie between %g and %g: %w", float64(minUnix), float64(maxUnix), ErrBadTime)
		}
		if err == nil {
			sec, frac := math.Modf(u)
			return time.Unix(int64(sec), int64(math.Round(frac*1e9))).UTC(), famUnix, true, nil
		}
	}
	for _, l := range timeLayouts {
		if v, err := time.Parse(l.layout, s); err == nil {
			return v, l.fam, strings.Contains(l.layout, "Z07"), nil
		}
	}
	return time.Time{}, famNone, false, fmt.Errorf("want e.g. 2006-01-02T15:04:05Z, 2006-01-02 15:04, 02/01/2006 15:04, 15:04:05 or unix seconds: %w", ErrBadTime)
}

// notes returns the remarks on the file's times.
func (t *timeReader) notes() []string {
	var out []string
	if t.disorder > 0 {
		out = append(out, fmt.Sprintf("%d times are earlier than the time before them (first at line %d); the readings are kept in file order", t.disorder, t.disLine))
	}
	if t.fam == famClock && !t.hasDay {
		out = append(out, "times carry no date (no date column or date= setting); they are taken as on one day, 1 January of year 1")
	}
	if t.noZone && (t.fam != famClock || t.hasDay) {
		out = append(out, "times without a zone are taken as UTC")
	}
	return out
}

// looksNumeric reports whether s holds only digits and at most one dot.
func looksNumeric(s string) bool {
	dots := 0
	for i := 0; i < len(s); i++ {
		switch c := s[i]; {
		case c == '.':
			dots++
		case c < '0' || c > '9':
			return false
		}
	}
	return s != "" && dots <= 1
}
