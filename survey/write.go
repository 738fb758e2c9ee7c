package survey

import (
	"bufio"
	"fmt"
	"io"
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
// that reads back to the same float64, and time is RFC 3339 (UTC or the
// reading's own offset, with fractional seconds only when present; empty
// when the reading has none). Two columns follow when any reading uses
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
	writeRow(bw, head)
	row := make([]string, 0, len(head))
	for i := range s.Readings {
		r := &s.Readings[i]
		row = append(row[:0], r.ID, formatFloat(r.X), formatFloat(r.Y), formatFloat(r.V),
			formatTime(r), r.Line, r.Station, r.Note)
		if cur {
			row = append(row, formatFloat(r.TestCurrent))
		}
		if ref {
			row = append(row, r.Reference)
		}
		writeRow(bw, row)
	}
	if err := bw.Flush(); err != nil {
		return fmt.Errorf("writing survey csv: %w", err)
	}
	return nil
}

func formatFloat(v float64) string { return strconv.FormatFloat(v, 'g', -1, 64) }

func formatTime(r *Reading) string {
	if !r.HasTime {
		return ""
	}
	return r.Time.Format(time.RFC3339Nano)
}

// writeRow writes cells separated by commas, quoting those that need it.
// Errors are left to the final Flush.
func writeRow(w *bufio.Writer, cells []string) {
	for i, c := range cells {
		if i > 0 {
			w.WriteByte(',')
		}
		if !needsQuotes(c, i == 0) {
			w.WriteString(c)
			continue
		}
		w.WriteByte('"')
		w.WriteString(strings.ReplaceAll(c, `"`, `""`))
		w.WriteByte('"')
	}
	w.WriteByte('\n')
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
