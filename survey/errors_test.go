package survey

import (
	"encoding/csv"
	"errors"
	"path/filepath"
	"testing"
)

// TestLoadBadInput checks that each malformed file of the list
// gives a *ParseError with the exact file, line, column and cause.
func TestLoadBadInput(t *testing.T) {
	tests := []struct {
		name       string
		file       string
		opt        LoadOptions
		line, col  int
		cause      error
		wholeFiles bool // the error concerns the survey, not one file
	}{
		{name: "empty file", file: "bad_empty.csv", cause: ErrEmpty},
		{name: "comments only", file: "bad_comments_only.csv", cause: ErrEmpty},
		{name: "header only", file: "bad_header_only.csv", cause: ErrNoReadings},
		{name: "missing y column", file: "bad_no_y.csv", line: 1, cause: ErrMissingColumn},
		{name: "missing potential column", file: "bad_no_potential.csv", line: 1, cause: ErrMissingColumn},
		{name: "text for a number", file: "bad_text.csv", line: 3, col: 3, cause: ErrNotNumber},
		{name: "NaN", file: "bad_nan.csv", line: 3, col: 3, cause: ErrNonFinite},
		{name: "Inf", file: "bad_inf.csv", line: 3, col: 2, cause: ErrNonFinite},
		{name: "ragged row", file: "bad_ragged.csv", line: 3, cause: ErrFieldCount},
		{name: "binary garbage", file: "bad_binary.csv", line: 3, cause: ErrBinary},
		{name: "single reading", file: "bad_single.csv", cause: ErrTooFew},
		{name: "two readings", file: "bad_two.csv", cause: ErrTooFew},
		{name: "collinear", file: "bad_collinear.csv", cause: ErrCollinear},
		{name: "latitude out of range", file: "bad_latitude.csv", line: 3, col: 1, cause: ErrOutOfRange},
		{name: "line and station without spacing", file: "bad_no_spacing.csv", line: 1, cause: ErrNoSpacing},
		{name: "station spacing missing", file: "bad_no_spacing.csv", opt: LoadOptions{LineSpacing: 5}, line: 1, cause: ErrNoSpacing},
		{name: "mixed time formats", file: "bad_mixed_times.csv", line: 3, col: 4, cause: ErrBadTime},
		{name: "unreadable time", file: "bad_time.csv", line: 3, col: 4, cause: ErrBadTime},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			path := filepath.Join("testdata", tt.file)
			s, err := Load([]string{path}, tt.opt)
			var pe *ParseError
			if !errors.As(err, &pe) {
				t.Fatalf("Load(%s) = %v, %v; want a *ParseError", tt.file, s, err)
			}
			want := ParseError{File: path, Line: tt.line, Column: tt.col}
			if pe.File != want.File || pe.Line != want.Line || pe.Column != want.Column {
				t.Errorf("Load(%s) error at %s:%d:%d, want %s:%d:%d (%v)", tt.file, pe.File, pe.Line, pe.Column, want.File, want.Line, want.Column, err)
			}
			if !errors.Is(err, tt.cause) {
				t.Errorf("Load(%s) = %v, want cause %v", tt.file, err, tt.cause)
			}
		})
	}
}

// TestParseBadInline covers bad input that is easier to read inline.
func TestParseBadInline(t *testing.T) {
	tests := []struct {
		name      string
		in        string
		opt       LoadOptions
		line, col int
		cause     error
	}{
		{"UTF-16", "\xff\xfex\x00", LoadOptions{}, 1, 0, ErrBinary},
		{"bare quote", "x,y,v\n0,0,1\n1,a\"b,2\n", LoadOptions{}, 3, 0, csv.ErrBareQuote},
		{"hex number", "x,y,v\n0,0,0x10\n", LoadOptions{}, 2, 3, ErrNotNumber},
		{"empty potential", "x,y,v\n0,0,\n", LoadOptions{}, 2, 3, ErrNotNumber},
		{"overflow", "x,y,v\n0,0,1e999\n", LoadOptions{}, 2, 3, ErrNonFinite},
		{"decimal comma with comma delimiter", "x,y,v\n0,0,\"1,5\"\n", LoadOptions{}, 2, 3, ErrNotNumber},
		{"longitude out of range", "lat,lon,v\n10,190,1\n", LoadOptions{}, 2, 2, ErrOutOfRange},
		{"bad unit in header", "x,y,potential (A)\n0,0,1\n", LoadOptions{}, 1, 3, ErrBadSetting},
		{"bad setting value", "# line_spacing=-3\nline,station,v\n1,1,1\n", LoadOptions{}, 1, 0, ErrBadSetting},
		{"bad line number", "# line_spacing=1 station_spacing=1\nline,station,v\nL1,S?,1\n", LoadOptions{}, 3, 2, ErrNotNumber},
		{"unix seconds too small", "x,y,v,time\n0,0,1,12345\n", LoadOptions{}, 2, 4, ErrBadTime},
		{"all at one point", "x,y,v\n3,3,1\n3,3,2\n3,3,1\n", LoadOptions{}, 0, 0, ErrCollinear},
		{"projected collinear", "x,y,v\n512345.25,6178901.5,1\n512355.25,6178911.5,2\n512375.25,6178931.5,1\n", LoadOptions{}, 0, 0, ErrCollinear},
		{"quote as delimiter", "sep=\"\nx\"y\"v\n", LoadOptions{}, 1, 1, ErrBadSetting},
		{"only latitude", "lat,v\n1,1\n", LoadOptions{}, 1, 0, ErrMissingColumn},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s, err := parseString(tt.in, tt.opt)
			var pe *ParseError
			if !errors.As(err, &pe) {
				t.Fatalf("Parse(%q) = %v, %v; want a *ParseError", tt.in, s, err)
			}
			if pe.File != "in.csv" || pe.Line != tt.line || pe.Column != tt.col {
				t.Errorf("Parse(%q) error at %s:%d:%d, want in.csv:%d:%d (%v)", tt.in, pe.File, pe.Line, pe.Column, tt.line, tt.col, err)
			}
			if tt.cause != nil && !errors.Is(err, tt.cause) {
				t.Errorf("Parse(%q) = %v, want cause %v", tt.in, err, tt.cause)
			}
		})
	}
}

// TestMixedCoordinates refuses metric and geographic files together.
func TestMixedCoordinates(t *testing.T) {
	_, err := Load([]string{"testdata/day1.csv", "testdata/geographic.csv"}, LoadOptions{})
	var pe *ParseError
	if !errors.As(err, &pe) || !errors.Is(err, ErrMixedFiles) || pe.File != "testdata/geographic.csv" {
		t.Fatalf("Load(day1, geographic) = %v; want a ParseError on geographic.csv with ErrMixedFiles", err)
	}
}

// TestBadOptions checks that bad options are errors, not panics.
func TestBadOptions(t *testing.T) {
	for _, opt := range []LoadOptions{{Units: "kV"}, {LineSpacing: -1}} {
		if _, err := parseString("x,y,v\n0,0,1\n1,0,1\n0,1,1\n", opt); err == nil {
			t.Errorf("Parse with %+v succeeded, want an error", opt)
		}
	}
	if _, err := Load(nil, LoadOptions{}); err == nil {
		t.Error("Load(nil) succeeded, want an error")
	}
	if _, err := Load([]string{"testdata/does-not-exist.csv"}, LoadOptions{}); err == nil {
		t.Error("Load(missing file) succeeded, want an error")
	}
}
