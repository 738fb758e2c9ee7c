package export

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"isofield/interp"
)

// The matrix form of a grid is a CSV file of NY rows of NX numbers, with no
// header: the first row is the northern edge (largest y), each row runs
// from west to east, masked nodes are written NaN. The georeference sidecar
// says where the nodes are:
//
//	# isofield grid georeference
//	format = isofield-georef 1
//	columns = NX
//	rows = NY
//	x_first = x of the first column (west), metres
//	y_first = y of the first row (north), metres
//	x_step = metres from one column to the next (positive, eastwards)
//	y_step = metres from one row to the next (negative, southwards)
//	sampling = node
//	...
//
// Node (column c, row r), both counted from 0, lies at
// (x_first + c·x_step, y_first + r·y_step): values are samples at points, not
// averages over cells. Lines starting with # are comments; every other line
// is "key = value" with the key in lower case; readers ignore keys they do
// not know.

// WriteMatrix writes one value per node of g in the matrix form. value(k)
// returns the value of node k (NaN for none).
func WriteMatrix(w io.Writer, g *interp.Grid, value func(k int) float64) error {
	bw := bufio.NewWriterSize(w, 1<<16)
	buf := make([]byte, 0, 32*g.NX)
	for j := g.NY - 1; j >= 0; j-- {
		buf = buf[:0]
		for i := range g.NX {
			if i > 0 {
				buf = append(buf, ',')
			}
			v := value(g.Index(i, j))
			if math.IsNaN(v) {
				buf = append(buf, "NaN"...)
			} else {
				buf = appendShortest(buf, v)
			}
		}
		buf = append(buf, '\n')
		if _, err := bw.Write(buf); err != nil {
			return fmt.Errorf("writing grid matrix: %w", err)
		}
	}
	if err := bw.Flush(); err != nil {
		return fmt.Errorf("writing grid matrix: %w", err)
	}
	return nil
}

// Georef is the content of a georeference sidecar.
type Georef struct {
	Columns, Rows  int
	XFirst, YFirst float64
	XStep, YStep   float64
	Files          []string // matrix files it describes, with their quantity
	Unit           string
	Positions      string // what x and y are
	// Lat0, Lon0 are the WGS 84 origin of the local tangent plane when the
	// survey was read from latitude and longitude (NaN otherwise).
	Lat0, Lon0 float64
	Version    string
	Settings   []Setting
}

// georefOf describes g's nodes in the matrix form's order.
func (b *Bundle) georefOf(files []string) Georef {
	g := b.Grid
	r := Georef{
		Columns: g.NX, Rows: g.NY, XFirst: g.X0, YFirst: g.Y0 + float64(g.NY-1)*g.DY,
		XStep: g.DX, YStep: -g.DY, Files: files, Unit: b.Unit, Version: b.Version,
		Settings: b.Settings, Lat0: math.NaN(), Lon0: math.NaN(),
		Positions: "local or projected metres, x east and y north, in the survey's own system",
	}
	if b.Plane != nil {
		r.Lat0, r.Lon0 = b.Plane.Origin()
		r.Positions = "local tangent-plane metres (x east, y north) about the WGS 84 origin below"
	}
	return r
}

// WriteGeoref writes the sidecar.
func WriteGeoref(w io.Writer, r Georef) error {
	var sb strings.Builder
	p := func(k string, v any) { fmt.Fprintf(&sb, "%s = %v\n", k, v) }
	sb.WriteString("# isofield grid georeference: where the nodes of the matrix files lie\n")
	sb.WriteString("# node (column c, row r), from 0: x = x_first + c*x_step, y = y_first + r*y_step\n")
	p("format", "isofield-georef 1")
	for _, f := range r.Files {
		p("file", f)
	}
	p("columns", r.Columns)
	p("rows", r.Rows)
	p("x_first", fmtNum(r.XFirst))
	p("y_first", fmtNum(r.YFirst))
	p("x_step", fmtNum(r.XStep))
	p("y_step", fmtNum(r.YStep))
	p("row_order", "north_first")
	p("sampling", "node")
	p("nodata", "NaN")
	p("unit", r.Unit)
	p("positions", r.Positions)
	if !math.IsNaN(r.Lat0) {
		p("origin_lat", fmtNum(r.Lat0))
		p("origin_lon", fmtNum(r.Lon0))
	}
	p("made_by", "isofield "+r.Version)
	for _, s := range r.Settings {
		p("setting", s.Name+": "+s.Value)
	}
	if _, err := io.WriteString(w, sb.String()); err != nil {
		return fmt.Errorf("writing georeference: %w", err)
	}
	return nil
}

// ReadGeoref reads a sidecar's node geometry, unit and files. Unknown keys
// are ignored; columns, rows and the four numbers of the node formula are
// required.
func ReadGeoref(r io.Reader) (Georef, error) {
	out := Georef{Lat0: math.NaN(), Lon0: math.NaN()}
	need := map[string]bool{"columns": false, "rows": false, "x_first": false, "y_first": false, "x_step": false, "y_step": false}
	sc := bufio.NewScanner(r)
	for n := 1; sc.Scan(); n++ {
		line := strings.TrimSpace(sc.Text())
		if line == "" || line[0] == '#' {
			continue
		}
		k, v, ok := strings.Cut(line, "=")
		if !ok {
			return out, fmt.Errorf("georeference line %d: want key = value", n)
		}
		k, v = strings.TrimSpace(k), strings.TrimSpace(v)
		if err := out.set(k, v); err != nil {
			return out, fmt.Errorf("georeference line %d: %s: %w", n, k, err)
		}
		if _, ok := need[k]; ok {
			need[k] = true
		}
	}
	if err := sc.Err(); err != nil {
		return out, fmt.Errorf("reading georeference: %w", err)
	}
	for _, k := range []string{"columns", "rows", "x_first", "y_first", "x_step", "y_step"} {
		if !need[k] {
			return out, fmt.Errorf("georeference: missing %s", k)
		}
	}
	return out, nil
}

// set stores one key's value.
func (r *Georef) set(k, v string) error {
	var err error
	switch k {
	case "columns":
		r.Columns, err = strconv.Atoi(v)
	case "rows":
		r.Rows, err = strconv.Atoi(v)
	case "x_first", "y_first", "x_step", "y_step", "origin_lat", "origin_lon":
		var f float64
		f, err = strconv.ParseFloat(v, 64)
		*map[string]*float64{"x_first": &r.XFirst, "y_first": &r.YFirst, "x_step": &r.XStep,
			"y_step": &r.YStep, "origin_lat": &r.Lat0, "origin_lon": &r.Lon0}[k] = f
	case "unit":
		r.Unit = v
	case "file":
		r.Files = append(r.Files, v)
	case "positions":
		r.Positions = v
	}
	return err
}
