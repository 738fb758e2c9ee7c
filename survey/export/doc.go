// Package export writes isofield's outputs: the grid CSV of the fixed
// contract, the grid as plain matrices with a georeference sidecar, GeoJSON
// contours, zones, readings and suggestions, SVG and PNG maps, and the
// self-contained HTML survey report. All writes every one of them into a
// directory; the command line (isofield export, isofield report) and the
// terminal UI call it, so they always agree.
//
// # Grid CSV
//
// WriteGridCSV writes the contract
//
//	x_m,y_m,potential_U,ex_U_per_m,ey_U_per_m,field_U_per_m,flagged
//
// with U the survey's unit (V or mV), then any extra columns (GridColumns:
// band; step_U and touch_U for the grounding preset; lat_deg and lon_deg
// for surveys read from latitude and longitude). One row per node
// of the interp.Grid in index order: row j = 0 (the southern edge) first,
// x growing fastest. Numbers are written in the shortest form that reads
// back to the same float64, so seven-digit northings keep every digit.
// (ex, ey) = E = −∇V and field = |E|, from the grid's analytic gradient.
// A masked node keeps x and y, leaves the four value cells empty and has
// flagged 0. ReadGridCSV reads the file back into a Grid.
//
// # Matrices and the georeference sidecar
//
// WriteMatrix writes one number per node as CSV without a header: NY rows,
// the first being the northern edge, each running west to east; masked
// nodes are NaN. The sidecar (WriteGeoref, ReadGeoref) is plain text of
// "key = value" lines, "#" starting a comment, keys in lower case:
//
//	format    = isofield-georef 1
//	file      = QUANTITY (UNIT): NAME     one line per matrix file
//	columns   = NX
//	rows      = NY
//	x_first   = x of the first column, metres
//	y_first   = y of the first row (the northern edge), metres
//	x_step    = metres from a column to the next (positive: east)
//	y_step    = metres from a row to the next (negative: south)
//	row_order = north_first
//	sampling  = node        values are samples at the nodes, not cell means
//	nodata    = NaN
//	unit      = V or mV
//	positions = what x and y are
//	origin_lat, origin_lon = WGS 84 origin of the local plane (geographic surveys only)
//	made_by, setting = version and settings
//
// Node (column c, row r), counted from 0, lies at (x_first + c·x_step,
// y_first + r·y_step). Readers ignore keys they do not know.
//
// # GeoJSON
//
// Each layer is one RFC 7946 FeatureCollection: contours (LineString, with
// level), zones (Polygon: exterior ring counter-clockwise, holes
// clockwise, with the zone's statistics), readings (Point, with QA status
// and values) and suggested readings (Point). A foreign member "isofield"
// names the version, settings, unit and position system. When the survey
// was read from latitude and longitude, positions are WGS 84 longitude and
// latitude rounded to 1e-8° (about 1 mm); otherwise they are the survey's
// own x and y in metres, which RFC 7946 does not define, and every
// feature's "positions" property says so. ValidateGeoJSON checks a text
// against the RFC's structural rules, citing the section of each.
//
// # Maps and report
//
// WriteMapSVG and WriteMapPNG draw the potential or the field map on a
// MapWidth × MapHeight page (10.5 × 7.5 inches); PNG at MapDPI (300 dpi)
// is 3150 × 2250 pixels. The drawing depends only on the Bundle, so SVG
// output is deterministic. WriteReport writes one HTML file with the maps
// embedded as data URIs, no script and no external resource.
//
// # Safety of what is written
//
// All writes each file through fileout (temporary file, then rename),
// refuses before writing anything when a target exists (unless
// Options.Force) or is an input, and ends with export_info.txt: version,
// settings, inputs and the SHA-256 of every file written, for outputs whose
// format has no room for them. Text cells of CSV outputs that a
// spreadsheet would run as formulas are neutralised (qa.Neutralise).
package export
