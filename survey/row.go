package survey

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
)

// fileReader holds one file's state while its records are read.
type fileReader struct {
	name    string
	index   int
	lineOff int // lines before the header row's first line, minus one
	set     fileSettings
	p       *parsed

	cols              columns
	mode              coordMode
	lineSp, stationSp float64
	alongY            bool
	commaOK           bool // the decimal comma is allowed (delimiter is not a comma)
	sawDecimalComma   bool
	times             timeReader
}

// reading turns one record into a Reading, which keeps rec as its Fields.
func (f *fileReader) reading(rec []string, line int) (Reading, error) {
	rd := Reading{File: f.index, Line0: line, Fields: rec}
	var err error
	if rd.X, rd.Y, err = f.position(rec, line); err != nil {
		return rd, err
	}
	if rd.V, err = f.number(rec, fV, line); err != nil {
		return rd, err
	}
	rd.ID = f.text(rec, fID)
	rd.Line = f.text(rec, fLine)
	rd.Station = f.text(rec, fStation)
	rd.Note = f.text(rec, fNote)
	rd.Reference = f.text(rec, fRef)
	if rd.Reference == "" {
		rd.Reference = f.set.reference
	}
	if f.cols.has(fCurrent) && strings.TrimSpace(rec[f.cols.at[fCurrent]]) != "" {
		if rd.TestCurrent, err = f.number(rec, fCurrent, line); err != nil {
			return rd, err
		}
		rd.TestCurrent *= f.cols.curScale
	}
	err = f.readTime(&rd, rec, line)
	return rd, err
}

// position returns the record's x and y; for geographic files, longitude
// and latitude in degrees (converted once the whole survey is read).
func (f *fileReader) position(rec []string, line int) (x, y float64, err error) {
	switch f.mode {
	case modeLineStation:
		l, err := f.lineNumber(rec, fLine, line)
		if err != nil {
			return 0, 0, err
		}
		s, err := f.lineNumber(rec, fStation, line)
		if err != nil {
			return 0, 0, err
		}
		if f.alongY {
			return l * f.lineSp, s * f.stationSp, nil
		}
		return s * f.stationSp, l * f.lineSp, nil
	case modeGeo:
		return f.latLon(rec, line)
	}
	if x, err = f.number(rec, fX, line); err != nil {
		return 0, 0, err
	}
	y, err = f.number(rec, fY, line)
	return x, y, err
}

// latLon reads and range-checks latitude and longitude.
func (f *fileReader) latLon(rec []string, line int) (lon, lat float64, err error) {
	if lat, err = f.number(rec, fLat, line); err != nil {
		return 0, 0, err
	}
	if math.Abs(lat) > 90 {
		return 0, 0, f.cellError(rec, fLat, line, fmt.Errorf("latitude outside ±90°: %w", ErrOutOfRange))
	}
	if lon, err = f.number(rec, fLon, line); err != nil {
		return 0, 0, err
	}
	if math.Abs(lon) > 180 {
		return 0, 0, f.cellError(rec, fLon, line, fmt.Errorf("longitude outside ±180°: %w", ErrOutOfRange))
	}
	return lon, lat, nil
}

// number reads the finite number in field fd's column.
func (f *fileReader) number(rec []string, fd field, line int) (float64, error) {
	v, err := f.parseNumber(rec[f.cols.at[fd]])
	if err != nil {
		return 0, f.cellError(rec, fd, line, err)
	}
	return v, nil
}

// lineNumber reads a line or station number, allowing a letter prefix
// such as "L12" or "S05".
func (f *fileReader) lineNumber(rec []string, fd field, line int) (float64, error) {
	s := strings.TrimLeft(strings.TrimSpace(rec[f.cols.at[fd]]), "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz")
	v, err := f.parseNumber(s)
	if err != nil {
		return 0, f.cellError(rec, fd, line, err)
	}
	return v, nil
}

// parseNumber reads a finite decimal number; with a tab or semicolon
// delimiter a single comma is taken as the decimal mark.
func (f *fileReader) parseNumber(s string) (float64, error) {
	s = strings.TrimSpace(s)
	if s == "" {
		return 0, fmt.Errorf("empty cell: %w", ErrNotNumber)
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil && f.commaOK && strings.Count(s, ",") == 1 && !strings.Contains(s, ".") {
		if v, err = strconv.ParseFloat(strings.Replace(s, ",", ".", 1), 64); err == nil {
			f.sawDecimalComma = true
		}
	}
	switch {
	case errors.Is(err, strconv.ErrRange) && math.IsInf(v, 0):
		return 0, ErrNonFinite
	case err != nil || hexPrefix(s):
		return 0, ErrNotNumber
	case math.IsNaN(v) || math.IsInf(v, 0):
		return 0, ErrNonFinite
	}
	return v, nil
}

// cellError is a ParseError at field fd's cell.
func (f *fileReader) cellError(rec []string, fd field, line int, err error) error {
	c := f.cols.at[fd]
	return &ParseError{File: f.name, Line: line, Column: c + 1,
		Err: fmt.Errorf("%s %q: %w", f.cols.names[c], rec[c], err)}
}

// text returns field fd's cell trimmed, or "" when the file has no such
// column.
func (f *fileReader) text(rec []string, fd field) string {
	if !f.cols.has(fd) {
		return ""
	}
	return strings.TrimSpace(rec[f.cols.at[fd]])
}

// readTime sets the reading's time from the time and date columns.
func (f *fileReader) readTime(rd *Reading, rec []string, line int) error {
	ts, ds := f.text(rec, fTime), f.text(rec, fDate)
	if ts == "" && ds == "" {
		return nil
	}
	fd := fTime
	if ts == "" {
		ts, ds, fd = ds, "", fDate
	}
	t, err := f.times.parse(ts, ds, line)
	if err != nil {
		return f.cellError(rec, fd, line, err)
	}
	rd.Time, rd.HasTime = t, true
	return nil
}

// hexPrefix reports whether s starts like a hexadecimal float ("0x",
// "-0X"), which strconv.ParseFloat accepts (with underscores) but a survey
// file never means.
func hexPrefix(s string) bool {
	if s != "" && (s[0] == '+' || s[0] == '-') {
		s = s[1:]
	}
	return len(s) > 1 && s[0] == '0' && (s[1] == 'x' || s[1] == 'X')
}
