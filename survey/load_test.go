package survey

import (
	"errors"
	"math"
	"slices"
	"strings"
	"testing"
	"time"
)

// TestLoadMerge reads two days of one survey, the second in volts with
// semicolons and decimal commas, and checks the merge.
func TestLoadMerge(t *testing.T) {
	s, err := Load([]string{"testdata/day1.csv", "testdata/day2_volts.csv"}, LoadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if s.Unit != Millivolt || len(s.Readings) != 6 || len(s.Files) != 2 {
		t.Fatalf("unit %v, %d readings, %d files; want mV, 6, 2", s.Unit, len(s.Readings), len(s.Files))
	}
	// Digests computed with GNU coreutils sha256sum over the committed files.
	wantSum := []string{
		"0d0261474dac04cd22ec8f159dbdf5ff02ad48e762930908fdf786fd25f3a1dc",
		"5665e9303e20b927ef83bad2c1817037ba415f2752bd0f34f52331a0da28620b",
	}
	for i, f := range s.Files {
		if f.SHA256 != wantSum[i] {
			t.Errorf("file %d SHA256 = %s, want %s (sha256sum)", i, f.SHA256, wantSum[i])
		}
	}
	f1 := s.Files[1]
	if f1.Delimiter != ';' || !f1.DecimalComma || f1.Unit != Volt || f1.Readings != 2 {
		t.Errorf("day2 info = %+v; want ';', decimal comma, V, 2 readings", f1)
	}
	want := []struct {
		id    string
		file  int
		line  int
		x, y  float64
		v     float64
		field string // the potential cell as written
	}{
		{"A1", 0, 3, 512345.25, 6178901.50, -210.4, "-210.4"},
		{"A3", 0, 5, 512345.25, 6178911.50, -198.7, "-198.7"},
		{"B1", 1, 2, 512365.25, 6178911.5, -301.2, "-0,3012"},
		{"B2", 1, 3, 512375.25, 6178921.5, -287.5, "-0,2875"},
	}
	for _, w := range want {
		i := slices.IndexFunc(s.Readings, func(r Reading) bool { return r.ID == w.id })
		r := s.Readings[i]
		if r.File != w.file || r.Line0 != w.line || r.X != w.x || r.Y != w.y || r.V != w.v || r.Fields[3] != w.field {
			t.Errorf("reading %s = file %d line %d (%v, %v) V %v field %q; want file %d line %d (%v, %v) V %v field %q",
				w.id, r.File, r.Line0, r.X, r.Y, r.V, r.Fields[3], w.file, w.line, w.x, w.y, w.v, w.field)
		}
	}
	if want := []string{"id", "x", "y", "potential", "time"}; !slices.Equal(f1.Roles, want) {
		t.Errorf("day2 roles %q, want %q", f1.Roles, want)
	}
	if got := s.Readings[2].Note; got != "wet, near drain" {
		t.Errorf("quoted note = %q", got)
	}
	if got, want := s.Readings[4].Time, time.Date(2025, 3, 5, 10, 0, 0, 0, time.UTC); !got.Equal(want) {
		t.Errorf("day2 time = %v, want %v", got, want)
	}
	if !hasNote(s, "day2_volts.csv: potentials converted from V to mV") {
		t.Errorf("notes %q lack the unit conversion", s.Notes)
	}
	if s.Name != "day1 +1" {
		t.Errorf("name = %q", s.Name)
	}
}

// TestParseForms reads one small survey written in many forms.
func TestParseForms(t *testing.T) {
	const plain = "x,y,potential_mV\n0,0,-100\n10,0,-150.5\n0,10,-120\n"
	tests := []struct {
		name   string
		in     string
		opt    LoadOptions
		unit   Unit
		scale  float64 // potential multiplier to reach the plain values
		note   string  // a note that must be present
		delim  rune
		fields []string // fields of the second reading
	}{
		{name: "plain", in: plain, unit: Millivolt, scale: 1, delim: ','},
		{name: "tab, byte-order mark, CRLF, comment and blank line",
			in:   "\ufeffpoint\tx_m\ty_m\tvalue_mV\r\n# c\r\n\r\nP1\t0\t0\t-100\r\n\"P 2\"\t\"10\"\t0\t-150.5\r\nP3\t0\t10\t-120\r\n",
			unit: Millivolt, scale: 1, delim: '\t', fields: []string{"P 2", "10", "0", "-150.5"}},
		{name: "semicolon decimal comma", in: "x;y;V (mV)\n0;0;-100\n10;0;-150,5\n0;10;-120\n", unit: Millivolt, scale: 1, delim: ';'},
		{name: "sep line", in: "sep=;\nx;y;V_mV\n0;0;-100\n10;0;-150,5\n0;10;-120\n", unit: Millivolt, scale: 1, delim: ';'},
		{name: "sep line with tab", in: "sep=\t\nx\ty\tV_mV\n0\t0\t-100\n10\t0\t-150,5\n0\t10\t-120\n", unit: Millivolt, scale: 1, delim: '\t'},
		{name: "sep line with pipe", in: "SEP=|\r\nx|y|V_mV\r\n0|0|-100\r\n10|0|-150,5\r\n0|10|-120\r\n", unit: Millivolt, scale: 1, delim: '|'},
		{name: "volts in brackets", in: "x,y,potential [V]\n0,0,-0.1\n10,0,-0.1505\n0,10,-0.12\n", unit: Volt, scale: 1000, delim: ','},
		{name: "volts suffix", in: "East,North,Reading_V\n0,0,-0.1\n10,0,-0.1505\n0,10,-0.12\n", unit: Volt, scale: 1000, delim: ','},
		{name: "column named by unit", in: "x,y,mV\n0,0,-100\n10,0,-150.5\n0,10,-120\n", unit: Millivolt, scale: 1, delim: ','},
		{name: "units option", in: "x,y,v\n0,0,-0.1\n10,0,-0.1505\n0,10,-0.12\n", opt: LoadOptions{Units: "V"}, unit: Volt, scale: 1000, delim: ','},
		{name: "units setting", in: "# units=V\nx,y,v\n0,0,-0.1\n10,0,-0.1505\n0,10,-0.12\n", unit: Volt, scale: 1000, delim: ','},
		{name: "default unit noted", in: "x,y,v\n0,0,-100\n10,0,-150.5\n0,10,-120\n", unit: Millivolt, scale: 1, delim: ',', note: "millivolts assumed"},
		{name: "trailing delimiters and blank rows", in: "x,y,v_mV,\n0,0,-100,\n,,,\n10,0,-150.5,,\n0,10,-120\n", unit: Millivolt, scale: 1, delim: ','},
		{name: "spaces and quotes", in: " x , y , \"potential (mV)\"\n 0, 0, -100\n\"10\", 0 ,\" -150.5 \"\n0,10,-120\n", unit: Millivolt, scale: 1, delim: ','},
		{name: "unused column noted", in: "x,y,v_mV,temp_C\n0,0,-100,5\n10,0,-150.5,5\n0,10,-120,5\n", unit: Millivolt, scale: 1, delim: ',', note: `column 4 "temp_C" is not used`},
		{name: "latin-1 note", in: "x,y,v_mV,note\n0,0,-100,\n10,0,-150.5,5 \xb0C\n0,10,-120,\n", unit: Millivolt, scale: 1, delim: ',', note: "ISO 8859-1"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s, err := parseString(tt.in, tt.opt)
			if err != nil {
				t.Fatalf("Parse: %v", err)
			}
			want := [][3]float64{{0, 0, -100}, {10, 0, -150.5}, {0, 10, -120}}
			if len(s.Readings) != len(want) {
				t.Fatalf("%d readings, want %d", len(s.Readings), len(want))
			}
			for i, r := range s.Readings {
				if r.X != want[i][0] || r.Y != want[i][1] || math.Abs(r.V*tt.scale-want[i][2]) > 1e-9 {
					t.Errorf("reading %d = (%v, %v, %v), want %v", i, r.X, r.Y, r.V*tt.scale, want[i])
				}
			}
			if s.Unit != tt.unit || s.Files[0].Delimiter != tt.delim {
				t.Errorf("unit %v delimiter %q, want %v %q", s.Unit, s.Files[0].Delimiter, tt.unit, tt.delim)
			}
			if tt.note != "" && !hasNote(s, tt.note) {
				t.Errorf("notes %q lack %q", s.Notes, tt.note)
			}
			if tt.fields != nil && !slices.Equal(s.Readings[1].Fields, tt.fields) {
				t.Errorf("fields %q, want %q", s.Readings[1].Fields, tt.fields)
			}
		})
	}
}

// TestLatin1 checks the fallback decoding of a byte that is not UTF-8.
func TestLatin1(t *testing.T) {
	s, err := parseString("x,y,v_mV,note\n0,0,-100,\n10,0,-150.5,5 \xb0C\n0,10,-120,\n", LoadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if got := s.Readings[1].Note; got != "5 °C" {
		t.Errorf("note = %q, want %q (0xB0 is the degree sign in ISO 8859-1)", got, "5 °C")
	}
}

// TestDuplicatePositions keeps readings at one position with different
// values; QA groups them and interp merges them.
func TestDuplicatePositions(t *testing.T) {
	s, err := parseString("x,y,v\n0,0,-100\n0,0,-140\n10,0,-150\n0,10,-120\n", LoadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if len(s.Readings) != 4 || s.Readings[0].V != -100 || s.Readings[1].V != -140 {
		t.Errorf("readings = %+v; want both duplicates kept with their values", s.Readings)
	}
}

// TestLineStation derives positions from line and station numbers.
func TestLineStation(t *testing.T) {
	const body = "line,station,v\nL0,0,1\nL0,2,2\nL3,0,3\n"
	tests := []struct {
		name string
		in   string
		opt  LoadOptions
		want [][2]float64
	}{
		{"flags, lines along x", body, LoadOptions{LineSpacing: 10, StationSpacing: 5}, [][2]float64{{0, 0}, {10, 0}, {0, 30}}},
		{"flags, lines along y", body, LoadOptions{LineSpacing: 10, StationSpacing: 5, LinesAlongY: true}, [][2]float64{{0, 0}, {0, 10}, {30, 0}}},
		{"file settings", "# line_spacing=10 station_spacing=5\n" + body, LoadOptions{}, [][2]float64{{0, 0}, {10, 0}, {0, 30}}},
		{"file settings win", "# line_spacing=10 station_spacing=5 lines_along=y\n" + body, LoadOptions{LineSpacing: 1, StationSpacing: 1}, [][2]float64{{0, 0}, {0, 10}, {30, 0}}},
		{"decimal spacing, semicolons", "# line_spacing=1,2 station_spacing=0,6\nline;station;v\n0;0;1\n0;1,5;2\n2;0;3\n", LoadOptions{}, [][2]float64{{0, 0}, {0.8999999999999999, 0}, {0, 2.4}}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s, err := parseString(tt.in, tt.opt)
			if err != nil {
				t.Fatalf("Parse: %v", err)
			}
			for i, r := range s.Readings {
				if math.Abs(r.X-tt.want[i][0]) > 1e-12 || math.Abs(r.Y-tt.want[i][1]) > 1e-12 {
					t.Errorf("reading %d at (%v, %v), want %v", i, r.X, r.Y, tt.want[i])
				}
			}
			if !s.Files[0].FromLineStation {
				t.Error("FromLineStation not set")
			}
		})
	}
}

// TestLineStationFile reads the committed line/station example.
func TestLineStationFile(t *testing.T) {
	s, err := Load([]string{"testdata/line_station.csv"}, LoadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	r := s.Readings[3]
	if math.Abs(r.X-0.6) > 1e-12 || math.Abs(r.Y-1.2) > 1e-12 || r.V != -355 || r.Reference != "CSE" || r.Line != "L1" || r.Station != "1" {
		t.Errorf("last reading = %+v", r)
	}
}

// TestReferenceSetting applies a file's reference= to its readings.
func TestReferenceSetting(t *testing.T) {
	s, err := parseString("# reference=SCE\nx,y,v,ref\n0,0,1,\n1,0,2,CSE\n0,1,3,\n", LoadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	got := []string{s.Readings[0].Reference, s.Readings[1].Reference, s.Readings[2].Reference}
	if !slices.Equal(got, []string{"SCE", "CSE", "SCE"}) {
		t.Errorf("references = %q", got)
	}
}

// TestSettingsNotes notes unknown settings and ignores plain comments.
func TestSettingsNotes(t *testing.T) {
	s, err := parseString("# surveyed by A. N. Other, dry day\n# colour=red\nx,y,v\n0,0,1\n1,0,2\n0,1,3\n", LoadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	if !hasNote(s, `setting "colour=red"`) || len(s.Notes) != 2 {
		t.Errorf("notes = %q; want the unknown setting and the default unit", s.Notes)
	}
}

func hasNote(s *Survey, part string) bool {
	return slices.ContainsFunc(s.Notes, func(n string) bool { return strings.Contains(n, part) })
}

// parseString parses in as a file named in.csv.
func parseString(in string, opt LoadOptions) (*Survey, error) {
	return Parse(strings.NewReader(in), "in.csv", opt)
}

// TestLineNumbers: Line0 is the first line of each record, counting
// comment lines, blank lines and quoted line breaks.
func TestLineNumbers(t *testing.T) {
	in := "# note\n\nx,y,v,note\n0,0,1,\"two\nlines\"\n# inside\n\n1,0,2,\n0,1,3,\"a\r\nb\"\n5,5,x,\n"
	_, err := parseString(in, LoadOptions{})
	var pe *ParseError
	if !errors.As(err, &pe) || pe.Line != 11 || pe.Column != 3 {
		t.Fatalf("error %v, want in.csv:11:3", err)
	}
	s, err := parseString(strings.TrimSuffix(in, "5,5,x,\n"), LoadOptions{})
	if err != nil {
		t.Fatal(err)
	}
	var got []int
	for _, r := range s.Readings {
		got = append(got, r.Line0)
	}
	if want := []int{4, 8, 9}; !slices.Equal(got, want) {
		t.Errorf("lines %v, want %v", got, want)
	}
	if s.Readings[0].Note != "two\nlines" || s.Readings[2].Note != "a\nb" {
		t.Errorf("notes %q, %q", s.Readings[0].Note, s.Readings[2].Note)
	}
}
