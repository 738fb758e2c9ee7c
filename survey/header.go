package survey

import (
	"fmt"
	"slices"
	"strings"
)

// field names the quantities a column can hold.
type field int

const (
	fNone field = iota
	fX
	fY
	fV
	fID
	fTime
	fDate
	fLine
	fStation
	fNote
	fCurrent
	fLat
	fLon
	fRef
	nFields
)

// fieldNames are the names used in messages, indexed by field.
var fieldNames = [nFields]string{"", "x", "y", "potential", "id", "time", "date",
	"line", "station", "note", "test current", "latitude", "longitude", "reference"}

// lookupField returns the field a normalised header name (lower case,
// unit removed, spaces and hyphens as underscores) names, or fNone.
func lookupField(name string) field {
	switch name {
	case "x", "easting", "east", "e", "x_coord", "x_coordinate":
		return fX
	case "y", "northing", "north", "n", "y_coord", "y_coordinate":
		return fY
	case "potential", "voltage", "reading", "value", "v", "pot", "half_cell",
		"half_cell_potential", "halfcell", "u", "potential_difference", "surface_potential":
		return fV
	case "id", "point", "point_id", "station_id", "name", "pt":
		return fID
	case "time", "timestamp", "datetime", "date_time":
		return fTime
	case "date":
		return fDate
	case "line", "line_no", "line_number":
		return fLine
	case "station", "station_no", "station_number", "stn":
		return fStation
	case "note", "notes", "comment", "comments", "remark", "remarks":
		return fNote
	case "test_current", "current", "i_test":
		return fCurrent
	case "lat", "latitude":
		return fLat
	case "lon", "long", "longitude", "lng":
		return fLon
	case "reference", "ref", "electrode", "reference_electrode", "ref_electrode":
		return fRef
	}
	return fNone
}

// unitSuffix reports whether s is a unit recognised after the last
// underscore of a header name.
func unitSuffix(s string) bool {
	switch s {
	case "v", "mv", "m", "a", "ma", "deg":
		return true
	}
	return false
}

// splitHeader returns the normalised name and the lower-case unit of a
// header cell such as "potential_mV", "potential (mV)", "V [V]" or
// "Test current, A" ("" when it states none), and what follows the unit
// inside the brackets or after the comma, as written: the reference
// electrode in "Potential (mV vs CSE)" or "E [mV, SCE]".
func splitHeader(h string) (name, unit, qual string) {
	h = strings.TrimSpace(strings.TrimPrefix(h, "\ufeff"))
	var ut string
	if i := strings.IndexAny(h, "(["); i >= 0 {
		if j := strings.IndexAny(h[i:], ")]"); j > 0 {
			ut = h[i+1 : i+j]
			h = strings.TrimSpace(h[:i] + h[i+j+1:])
		}
	}
	if i := strings.LastIndexByte(h, ','); i >= 0 && ut == "" {
		ut, h = h[i+1:], strings.TrimSpace(h[:i])
	}
	unit, qual = splitUnit(ut)
	name = normalName(h)
	if name == "mv" { // a column titled by its unit alone
		return "v", "mv", qual
	}
	if unit == "" {
		if i := strings.LastIndexByte(name, '_'); i > 0 && unitSuffix(name[i+1:]) && lookupField(name) == fNone {
			unit, name = name[i+1:], name[:i]
		}
	}
	return name, unit, qual
}

// splitUnit splits "mV vs CSE" into "mv" and "CSE".
func splitUnit(ut string) (unit, qual string) {
	words := strings.FieldsFunc(ut, func(r rune) bool { return r == ' ' || r == ',' || r == ';' })
	if len(words) == 0 {
		return "", ""
	}
	unit, words = strings.ToLower(words[0]), words[1:]
	if len(words) > 0 {
		switch strings.ToLower(words[0]) {
		case "vs", "vs.", "versus", "against", "ref", "ref.":
			words = words[1:]
		}
	}
	return unit, strings.Join(words, " ")
}

// normalName lower-cases a header name and turns spaces, hyphens, dots
// and slashes into single underscores.
func normalName(h string) string {
	h = strings.Map(func(r rune) rune {
		if r == ' ' || r == '-' || r == '.' || r == '/' {
			return '_'
		}
		return r
	}, strings.ToLower(h))
	for strings.Contains(h, "__") {
		h = strings.ReplaceAll(h, "__", "_")
	}
	return strings.Trim(h, "_")
}

// columns says which column holds each field (-1 when none) and the units
// the header states.
type columns struct {
	at       [nFields]int
	names    []string // header cells as written
	vUnit    string   // "v", "mv" or "" from the potential header
	vRef     string   // reference electrode named in the potential header
	curScale float64  // multiplier to amperes for the test current
	unused   []int    // columns not recognised or duplicated
}

// mapHeader recognises the header cells. Unrecognised and duplicate
// columns are listed in unused; the first column for a field wins. The
// error concerns a unit that cannot apply to its column; col is its 1-based
// index.
func mapHeader(header []string) (c columns, col int, err error) {
	for i := range c.at {
		c.at[i] = -1
	}
	c.names = header
	c.curScale = 1
	for i, h := range header {
		name, unit, qual := splitHeader(h)
		f := lookupField(name)
		if name == "e" && (unit == "v" || unit == "mv") {
			f = fV // E in volts is a potential, not an easting
		}
		if f == fNone || c.at[f] >= 0 {
			c.unused = append(c.unused, i)
			continue
		}
		if err := c.setUnit(f, unit); err != nil {
			return c, i + 1, fmt.Errorf("header %q: %w", h, err)
		}
		c.at[f] = i
		if f == fV {
			c.vRef = qual
		}
	}
	return c, 0, nil
}

// setUnit records the unit a header states for field f.
func (c *columns) setUnit(f field, unit string) error {
	if unit == "" {
		return nil
	}
	ok := true
	switch f {
	case fV:
		ok = unit == "v" || unit == "mv"
		c.vUnit = unit
	case fX, fY:
		ok = unit == "m"
	case fCurrent:
		ok = unit == "a" || unit == "ma"
		if unit == "ma" {
			c.curScale = 1e-3
		}
	case fLat, fLon:
		ok = unit == "deg" || unit == "°" || unit == "degrees"
	}
	if !ok {
		return fmt.Errorf("unit %q does not fit the %s column: %w", unit, fieldNames[f], ErrBadSetting)
	}
	return nil
}

// has reports whether the header has a column for f.
func (c *columns) has(f field) bool { return c.at[f] >= 0 }

// setup maps the header and decides coordinates, unit and spacings.
func (f *fileReader) setup(header []string, line int, opt LoadOptions) error {
	cols, col, err := mapHeader(header)
	if err != nil {
		return &ParseError{File: f.name, Line: line, Column: col, Err: err}
	}
	f.cols = cols
	f.commaOK = f.p.info.Delimiter != ','
	if f.set.reference == "" && cols.vRef != "" {
		f.set.reference = cols.vRef
		f.p.notes = append(f.p.notes, fmt.Sprintf("reference electrode %s taken from the potential column's header", cols.vRef))
	}
	f.times.day, f.times.hasDay = f.set.date, f.set.hasDate
	if err := f.chooseMode(opt); err != nil {
		return &ParseError{File: f.name, Line: line, Err: err}
	}
	if !cols.has(fV) {
		return &ParseError{File: f.name, Line: line, Err: fmt.Errorf("%w: potential (looked for potential, voltage, reading, value, v, pot, half_cell, with or without a unit)", ErrMissingColumn)}
	}
	if err := f.chooseUnit(opt); err != nil {
		return &ParseError{File: f.name, Line: line, Err: err}
	}
	f.p.info.Roles = make([]string, len(header))
	for fd, c := range f.cols.at {
		if c >= 0 {
			f.p.info.Roles[c] = fieldNames[fd]
		}
	}
	slices.Sort(f.cols.unused)
	for _, c := range f.cols.unused {
		f.p.notes = append(f.p.notes, fmt.Sprintf("column %d %q is not used (kept with each reading)", c+1, header[c]))
	}
	return nil
}

// chooseMode decides where positions come from.
func (f *fileReader) chooseMode(opt LoadOptions) error {
	c := &f.cols
	switch {
	case c.has(fX) && c.has(fY):
		f.mode = modeXY
		for _, g := range []field{fLat, fLon} {
			if c.has(g) {
				c.unused = append(c.unused, c.at[g])
				c.at[g] = -1
			}
		}
	case c.has(fX) != c.has(fY):
		missing := "y (looked for y, northing, north, n)"
		if !c.has(fX) {
			missing = "x (looked for x, easting, east, e)"
		}
		return fmt.Errorf("%w: %s", ErrMissingColumn, missing)
	case c.has(fLat) && c.has(fLon):
		f.mode = modeGeo
		f.p.info.Geographic = true
	case c.has(fLat) != c.has(fLon):
		missing := "longitude (looked for lon, long, longitude)"
		if !c.has(fLat) {
			missing = "latitude (looked for lat, latitude)"
		}
		return fmt.Errorf("%w: %s", ErrMissingColumn, missing)
	case c.has(fLine) && c.has(fStation):
		f.mode = modeLineStation
		f.p.info.FromLineStation = true
		return f.chooseSpacing(opt)
	default:
		return fmt.Errorf("%w: x and y (looked for x/easting/east/e and y/northing/north/n; or lat and lon; or line and station with spacings)", ErrMissingColumn)
	}
	return nil
}

// chooseSpacing takes the line and station spacings and the direction of
// the lines from the file's settings, else from the options.
func (f *fileReader) chooseSpacing(opt LoadOptions) error {
	f.lineSp, f.stationSp, f.alongY = opt.LineSpacing, opt.StationSpacing, opt.LinesAlongY
	if f.set.lineSpacing > 0 {
		f.lineSp = f.set.lineSpacing
	}
	if f.set.stationSpacing > 0 {
		f.stationSp = f.set.stationSpacing
	}
	if f.set.linesAlong != "" {
		f.alongY = f.set.linesAlong == "y"
	}
	var missing []string
	if f.lineSp <= 0 {
		missing = append(missing, "line spacing (--line-spacing or # line_spacing=METRES in the header block)")
	}
	if f.stationSp <= 0 {
		missing = append(missing, "station spacing (--station-spacing or # station_spacing=METRES)")
	}
	if len(missing) > 0 {
		return fmt.Errorf("no x and y columns, and positions from line and station numbers need the %s: %w", strings.Join(missing, " and the "), ErrNoSpacing)
	}
	dir := "x"
	if f.alongY {
		dir = "y"
	}
	f.p.notes = append(f.p.notes, fmt.Sprintf("positions from line and station numbers: lines %g m apart, stations %g m apart, lines along %s", f.lineSp, f.stationSp, dir))
	return nil
}

// chooseUnit takes the potential unit from the header, else the file's
// units= setting, else the options, else mV with a note.
func (f *fileReader) chooseUnit(opt LoadOptions) error {
	var from, u string
	switch {
	case f.cols.vUnit != "":
		from, u = "header", f.cols.vUnit
	case f.set.units != "":
		from, u = "units= setting", f.set.units
	case opt.Units != "":
		from, u = "--units", opt.Units
	default:
		f.p.info.Unit = Millivolt
		f.p.notes = append(f.p.notes, "the potential column states no unit; millivolts assumed (set --units V or mV, or name the column e.g. potential_mV)")
		return nil
	}
	unit, err := ParseUnit(u)
	if err != nil {
		return fmt.Errorf("unit from the %s: %v: %w", from, err, ErrBadSetting)
	}
	f.p.info.Unit = unit
	return nil
}
