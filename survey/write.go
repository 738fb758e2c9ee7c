package survey

import (
	"bufio"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"time"
)

// WriteCSV writes s in the canonical input format, comma-separated with a
// header row:
//
//	id,x_m,y_m,potential_<U>,time,line,station,note
//
// where U is the survey's unit, numbers are written in the shortest form
// that reads back to the same float64 (without an exponent between 1e-4
// and 1e15), and time is RFC 3339 (UTC or the reading's own offset, with
// fractional seconds only when present; empty when the reading has none). Two columns follow when any reading uses
// them: test_current_A and reference. Parse reads the output back to the
// same readings. Cells that begin with '#' are quoted so that they are not
// taken for comments.
func WriteCSV(w io.Writer, s *Survey) error {
	bw := bufio.NewWriterSize(w, 64<<10)
	cur, ref := false, false
	for i := range s.Readings {
		cur = cur || s.Readings[i].TestCurrent != 0
		ref = ref || s.Readings[i].Reference != ""
	}
	head := []string{"id", "x_m", "y_m", "potential_" + s.Unit.String(), "time", "line", "station", "note"}
	if cur {
		head = append(head, "test_current_A")
	}
	if ref {
		head = append(head, "reference")
	}
	cw := cellWriter{w: bw}
	for _, h := range head {
		cw.text(h)
	}
	cw.end()
	for i := range s.Readings {
		cw.reading(&s.Readings[i], cur, ref)
	}
	if err := bw.Flush(); err != nil {
		return fmt.Errorf("writing survey csv: %w", err)
	}
	return nil
}

// reading writes one reading's row.
func (c *cellWriter) reading(r *Reading, cur, ref bool) {
	c.text(r.ID)
	c.float(r.X)
	c.float(r.Y)
	c.float(r.V)
	if r.HasTime {
		c.cell(r.Time.AppendFormat(c.buf[:0], time.RFC3339Nano))
	} else {
		c.text("")
	}
	c.text(r.Line)
	c.text(r.Station)
	c.text(r.Note)
	if cur {
		c.float(r.TestCurrent)
	}
	if ref {
		c.text(r.Reference)
	}
	c.end()
}

// cellWriter writes comma-separated cells without allocating per cell.
// Errors are left to the final Flush.
type cellWriter struct {
	w     *bufio.Writer
	buf   []byte
	cells int // cells written in the current row
}

func (c *cellWriter) sep() {
	if c.cells > 0 {
		c.w.WriteByte(',')
	}
	c.cells++
}

// text writes a text cell, quoting it when it needs quotes.
func (c *cellWriter) text(s string) {
	c.sep()
	if !needsQuotes(s, c.cells == 1) {
		c.w.WriteString(s)
		return
	}
	c.w.WriteByte('"')
	c.w.WriteString(strings.ReplaceAll(s, `"`, `""`))
	c.w.WriteByte('"')
}

// float writes v in the shortest form that reads back exactly, without
// an exponent for the magnitudes of coordinates and potentials.
func (c *cellWriter) float(v float64) {
	format := byte('f')
	if a := math.Abs(v); a != 0 && (a < 1e-4 || a >= 1e15) {
		format = 'g'
	}
	c.buf = strconv.AppendFloat(c.buf[:0], v, format, -1, 64)
	c.cell(c.buf)
}

// cell writes bytes that need no quotes.
func (c *cellWriter) cell(b []byte) {
	c.sep()
	c.w.Write(b)
	c.buf = b[:0]
}

func (c *cellWriter) end() {
	c.w.WriteByte('\n')
	c.cells = 0
}

// needsQuotes reports whether a cell must be quoted: it holds a comma,
// quote or line break, begins or ends with white space (which the reader
// trims), or is the first cell and begins with '#'.
func needsQuotes(c string, first bool) bool {
	if c == "" {
		return false
	}
	if strings.ContainsAny(c, ",\"\r\n") || c != strings.TrimSpace(c) {
		return true
	}
	return first && c[0] == '#'
}
