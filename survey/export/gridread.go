package export

import (
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"isofield/interp"
	"isofield/survey"
)

// GridFile is a grid CSV read back: the grid (values, gradients and mask
// rebuilt from the potential and field columns), the flags and the extra
// columns.
type GridFile struct {
	Unit    string // "V" or "mV", from the header
	Grid    *interp.Grid
	Flagged []bool
	Extra   []Column
}

// Causes that ReadGridCSV wraps in a survey.ParseError.
var (
	ErrGridHeader = errors.New("not a grid csv header")
	ErrGridShape  = errors.New("rows do not form a regular grid in index order")
)

// ReadGridCSV reads a file written by WriteGridCSV. name is used in error
// messages, which are survey.ParseError values with line and column. The
// grid's origin and spacing are taken from the first and last nodes of the
// first row and column; a grid of one column or one row has spacing 0 in
// that direction.
func ReadGridCSV(r io.Reader, name string) (*GridFile, error) {
	cr := csv.NewReader(r)
	cr.ReuseRecord = true
	cr.FieldsPerRecord = -1 // counted against the header by gridRows.add
	head, err := cr.Read()
	if err != nil {
		return nil, csvError(name, err)
	}
	unit, err := gridUnit(head)
	if err != nil {
		return nil, &survey.ParseError{File: name, Line: 1, Err: err}
	}
	gf := &GridFile{Unit: unit}
	for _, h := range head[7:] {
		gf.Extra = append(gf.Extra, Column{Name: h})
	}
	var rows gridRows
	for {
		rec, err := cr.Read()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			return nil, csvError(name, err)
		}
		line, _ := cr.FieldPos(0)
		if err := rows.add(rec, gf); err != nil {
			err.File, err.Line = name, line
			return nil, err
		}
	}
	g, err := rows.grid()
	if err != nil {
		return nil, &survey.ParseError{File: name, Err: err}
	}
	gf.Grid = g
	gf.Flagged = rows.flagged
	return gf, nil
}

// gridUnit checks the fixed header and returns its unit.
func gridUnit(head []string) (string, error) {
	if len(head) < 7 || !strings.HasPrefix(head[2], "potential_") {
		return "", ErrGridHeader
	}
	unit := strings.TrimPrefix(head[2], "potential_")
	if unit != "V" && unit != "mV" {
		return "", fmt.Errorf("%w: unit %q", ErrGridHeader, unit)
	}
	for k, want := range GridHeader(unit) {
		if head[k] != want {
			return "", fmt.Errorf("%w: column %d is %q, want %q", ErrGridHeader, k+1, head[k], want)
		}
	}
	return unit, nil
}

// gridRows collects the columns of a grid CSV.
type gridRows struct {
	x, y, v, ex, ey []float64
	flagged         []bool
}

// add parses one record; the returned error lacks file and line.
func (g *gridRows) add(rec []string, gf *GridFile) *survey.ParseError {
	if len(rec) != 7+len(gf.Extra) {
		return &survey.ParseError{Err: survey.ErrFieldCount}
	}
	var nums [6]float64
	for k := range 6 {
		v, err := parseCell(rec[k], k < 2)
		if err != nil {
			return &survey.ParseError{Column: k + 1, Err: err}
		}
		nums[k] = v
	}
	for c := range gf.Extra {
		v, err := parseCell(rec[7+c], false)
		if err != nil {
			return &survey.ParseError{Column: 8 + c, Err: err}
		}
		gf.Extra[c].Values = append(gf.Extra[c].Values, v)
	}
	switch rec[6] {
	case "0", "1":
	default:
		return &survey.ParseError{Column: 7, Err: fmt.Errorf("flagged %q: %w", rec[6], survey.ErrOutOfRange)}
	}
	g.x, g.y = append(g.x, nums[0]), append(g.y, nums[1])
	g.v, g.ex, g.ey = append(g.v, nums[2]), append(g.ex, nums[3]), append(g.ey, nums[4])
	g.flagged = append(g.flagged, rec[6] == "1")
	return nil
}

// parseCell reads a number; an empty cell is NaN unless required.
func parseCell(s string, required bool) (float64, error) {
	if s == "" {
		if required {
			return 0, fmt.Errorf("empty cell: %w", survey.ErrNotNumber)
		}
		return math.NaN(), nil
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return 0, fmt.Errorf("%q: %w", s, survey.ErrNotNumber)
	}
	if math.IsInf(v, 0) || (math.IsNaN(v) && required) {
		return 0, fmt.Errorf("%q: %w", s, survey.ErrNonFinite)
	}
	return v, nil
}

// grid rebuilds the interp.Grid from the collected rows.
func (g *gridRows) grid() (*interp.Grid, error) {
	n := len(g.x)
	if n == 0 {
		return nil, survey.ErrNoReadings
	}
	nx := 1
	for nx < n && g.y[nx] == g.y[0] {
		nx++
	}
	if n%nx != 0 {
		return nil, fmt.Errorf("%w: %d rows are not a multiple of %d columns", ErrGridShape, n, nx)
	}
	ny := n / nx
	var dx, dy float64
	if nx > 1 {
		dx = (g.x[nx-1] - g.x[0]) / float64(nx-1)
	}
	if ny > 1 {
		dy = (g.y[n-1] - g.y[0]) / float64(ny-1)
	}
	out := interp.NewGridN(g.x[0], g.y[0], dx, dy, nx, ny)
	for k := range n {
		if !g.onLattice(out, k) {
			return nil, fmt.Errorf("%w: row %d at (%g, %g)", ErrGridShape, k+2, g.x[k], g.y[k])
		}
		out.V[k], out.GX[k], out.GY[k] = g.v[k], -g.ex[k], -g.ey[k]
		out.Mask[k] = math.IsNaN(g.v[k])
	}
	return out, nil
}

// latticeTol is the relative tolerance, in units of the spacing, for a
// row's coordinates to sit on the rebuilt lattice (the writer's shortest
// round-trip output makes the true error a few ulps).
const latticeTol = 1e-6

// onLattice reports whether row k lies at node k of out.
func (g *gridRows) onLattice(out *interp.Grid, k int) bool {
	x, y := out.Node(k%out.NX, k/out.NX)
	sx, sy := max(out.DX, 1e-300), max(out.DY, 1e-300)
	return math.Abs(g.x[k]-x) <= latticeTol*sx && math.Abs(g.y[k]-y) <= latticeTol*sy
}

// csvError turns an encoding/csv error into a survey.ParseError.
func csvError(name string, err error) error {
	if errors.Is(err, io.EOF) {
		return &survey.ParseError{File: name, Err: survey.ErrEmpty}
	}
	var pe *csv.ParseError
	if errors.As(err, &pe) {
		return &survey.ParseError{File: name, Line: pe.Line, Column: pe.Column, Err: pe.Err}
	}
	return fmt.Errorf("%s: %w", name, err)
}
