package main

import (
	"fmt"
	"strconv"
	"strings"
	"testing"

	"isofield/survey/criteria"
)

func TestParsePoints(t *testing.T) {
	tests := []struct {
		name, in string
		want     []criteria.Point
		err      string
	}{
		{"one point", "1,2", []criteria.Point{{X: 1, Y: 2}}, ""},
		{"polyline with spaces", " 1.5, -2 ; 3,4;", []criteria.Point{{X: 1.5, Y: -2}, {X: 3, Y: 4}}, ""},
		{"projected", "512345.25,5401234.5", []criteria.Point{{X: 512345.25, Y: 5401234.5}}, ""},
		{"missing y", "1,2;3", nil, `point 2 "3": want X,Y`},
		{"not a number", "a,2", nil, "two finite numbers"},
		{"infinite", "1,Inf", nil, "two finite numbers"},
		{"empty", " ; ", nil, "no points"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			got, err := parsePoints(tt.in)
			if tt.err != "" {
				if err == nil || !strings.Contains(err.Error(), tt.err) {
					t.Fatalf("parsePoints(%q) error %v, want %q", tt.in, err, tt.err)
				}
				return
			}
			if err != nil || fmt.Sprint(got) != fmt.Sprint(tt.want) {
				t.Errorf("parsePoints(%q) = %v, %v; want %v", tt.in, got, err, tt.want)
			}
		})
	}
}

// FuzzParsePoints parses, writes the points back and parses again: the two
// parses must agree, and nothing may panic.
func FuzzParsePoints(f *testing.F) {
	for _, s := range []string{"1,2", "1,2;3,4", " -1e3 , 2.5 ;", "x", ";;", "1,2,3", "NaN,1", "0x1p3,4"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		pts, err := parsePoints(s)
		if err != nil {
			return
		}
		var parts []string
		for _, p := range pts {
			parts = append(parts, strconv.FormatFloat(p.X, 'g', -1, 64)+","+strconv.FormatFloat(p.Y, 'g', -1, 64))
		}
		again, err := parsePoints(strings.Join(parts, ";"))
		if err != nil || fmt.Sprint(again) != fmt.Sprint(pts) {
			t.Errorf("parsePoints(%q) = %v, written back and parsed: %v, %v", s, pts, again, err)
		}
	})
}
