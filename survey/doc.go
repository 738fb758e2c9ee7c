// Package survey holds the readings of an electric-potential survey and
// reads them from CSV files.
//
// A Reading is one potential measured at one surveyed point against a
// reference electrode. Coordinates are metres in the survey's own system:
// local site metres, projected eastings and northings, or, for files given in
// latitude and longitude, local east/north metres about the survey's centre
// (see Survey.Geo). Potentials are in the survey's Unit, volts or millivolts.
//
// The loader never modifies an input file. Every reading remembers its
// source file, its line in that file and its original fields, so that
// cleaned exports can reproduce the input columns. Bad input is reported as
// a *ParseError naming file, line and column; Column is the 1-based field
// number (the spreadsheet column), and the message names the header cell.
//
// # Input format
//
// A file is a table with a header row. Before the header may come blank
// lines, comment lines starting with '#', and a first line "sep=X" naming
// the delimiter. Otherwise the delimiter is the one of tab, semicolon and
// comma that occurs most often in the header row (ties in that order).
// A UTF-8 byte-order mark, CRLF line ends, quoted fields (RFC 4180), blank
// rows and trailing empty fields are accepted; lines that start with '#'
// are comments anywhere (quote a first cell that begins with '#'). Files
// that are not text (NUL or other control bytes, UTF-16) are refused;
// text that is not valid UTF-8 is read as ISO 8859-1 with a note.
//
// Header cells are matched without regard to case, spaces, hyphens or a
// unit: "potential_mV", "Potential (mV)", "V [V]" and "V_mV" all name the
// potential column. The names recognised are
//
//	x          x, easting, east, e
//	y          y, northing, north, n
//	potential  potential, voltage, reading, value, v, pot, u, half_cell, half_cell_potential
//	id         id, point, point_id, station_id, name, pt
//	time       time, timestamp, datetime, date_time; date (a separate date column)
//	line       line, line_no, line_number
//	station    station, station_no, station_number, stn
//	note       note, notes, comment, comments, remark, remarks
//	current    test_current, current, i_test (amperes; _mA is converted)
//	latitude   lat, latitude; longitude: lon, long, longitude, lng (decimal degrees)
//	reference  reference, ref, electrode, reference_electrode, ref_electrode
//
// The first column for each name wins; other columns are noted as unused
// and kept in Reading.Fields. Positions come from x and y; else from
// latitude and longitude; else from line and station numbers. A file
// needs a potential column and one of these pairs.
//
// The potential unit is the header's (V or mV), else the file's units=
// setting, else LoadOptions.Units, else millivolts with a note. Coordinates
// are metres; a header stating another unit for them is an error. Words
// after the potential's unit name the reference electrode of the file:
// "Potential (mV vs CSE)", "E [mV, SCE]" (a column named E with a volt
// unit is the potential, not an easting). A reading's reference is its
// reference cell, else the file's reference= setting, else the header's.
//
// Numbers are decimal; NaN, infinities and hexadecimal forms are refused.
// When the delimiter is a tab or semicolon, a number with one comma and no
// point takes the comma as its decimal mark ("-350,2"); with a comma
// delimiter, commas in numbers are refused as ambiguous.
//
// # File settings
//
// A comment line before the header made only of key=value words states
// settings for that file, for example
//
//	# line_spacing=10 station_spacing=5 lines_along=y
//	# units=mV reference=CSE date=2025-03-04
//
// line_spacing and station_spacing (metres) and lines_along (x or y) turn
// line and station numbers into positions; they take precedence over the
// LoadOptions for that file. units is V or mV; reference names the
// reference electrode of readings whose row names none; date is the day of
// times that give only the time of day. Unknown keys are noted and
// ignored; a bad value of a known key is an error. Other comments are
// ignored.
//
// Line and station numbers may carry a letter prefix ("L12", "S05"). By
// default lines run along x: x = station × station spacing, y = line ×
// line spacing; with lines along y the roles swap.
//
// # Times
//
// A time cell may hold RFC 3339 ("2025-03-04T09:00:00Z"), year-first
// forms with a space or T and with or without seconds or zone
// ("2025-03-04 09:00"), day-first forms ("04/03/2025 09:00",
// "04.03.2025"), unix seconds (between 1e8 and 1e10), or only the time of
// day ("09:00:05", the day from a date column or the date= setting). A
// date column is joined to the time column. Times without a zone are UTC,
// with a note. All cells of a file belong to one family (year-first,
// day-first, unix seconds or time of day): the first time fixes the
// family and a cell of another family is an error (ErrBadTime), since
// "03/04/2025" and "2025-04-03" may well be two conventions of two
// loggers. Times out of order are not an error; a note counts them (the
// checking stage reports them in full).
//
// # Several files
//
// Load merges files in order. The first file fixes the survey's unit;
// potentials of other files are converted to it, with a note. All files
// must give metric positions or all geographic ones (ErrMixedFiles).
// Geographic positions are converted about the centre of the merged
// extent by the local tangent plane of package survey/geo (error under
// 1 mm within 5 km of the centre); GeoRef.ToLatLon gives them back.
//
// # Whole-survey checks
//
// A survey needs MinReadings readings (ErrTooFew), and not all of them on
// one straight line or at one point (ErrCollinear, within 1e-6 of the
// extent's diagonal). Readings at one position with different values are
// not an error: they are kept, grouped as repeats by the checking stage
// and merged by the interpolator.
package survey
