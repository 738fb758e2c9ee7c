package qa

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"isofield/survey"
)

// column is one output column taken from the input files: a header name
// and its occurrence among equal names in one file (so that a file with
// two "note" columns keeps both).
type column struct {
	name string
	occ  int
}

// WriteCleanCSV writes every reading of s, none dropped, in input order,
// as comma-separated values: the input files' own columns, then
// potential_corrected_U (U is the survey's unit, V or mV),
// qa_status (ok, suspect or excluded) and qa_notes (the reasons,
// separated by "; ").
//
// The input columns are the union of the files' header names in
// first-seen order; a reading from a file without one of them leaves that
// cell empty. Cells are written as read (a decimal comma stays a comma, in
// a quoted cell). Fields beyond a file's header become columns named
// column_N, N being the field's 1-based position. Text cells starting
// with = + - @, a tab or a carriage return that are not numbers are
// prefixed with ' so that spreadsheets do not run them as formulas.
func WriteCleanCSV(w io.Writer, s *survey.Survey, r *Result) error {
	cols, where := cleanColumns(s)
	cw := csv.NewWriter(w)
	head := make([]string, 0, len(cols)+3)
	for _, c := range cols {
		head = append(head, Neutralise(c.name))
	}
	head = append(head, "potential_corrected_"+s.Unit.String(), "qa_status", "qa_notes")
	if err := cw.Write(head); err != nil {
		return err
	}
	dec := 6
	if s.Unit == survey.Volt {
		dec = 9
	}
	row := make([]string, len(head))
	for i, rd := range s.Readings {
		clear(row)
		for k, f := range rd.Fields {
			if m := where[fileKey(rd.File, k)]; m >= 0 {
				row[m] = Neutralise(f)
			}
		}
		n := len(cols)
		row[n] = formatValue(r.Corrected[i], dec)
		row[n+1] = r.Status[i].String()
		row[n+2] = Neutralise(joinNotes(r.Notes[i]))
		if err := cw.Write(row); err != nil {
			return fmt.Errorf("writing reading %d: %w", i+1, err)
		}
	}
	cw.Flush()
	return cw.Error()
}

// fileKey identifies field k of file f.
type fieldKey struct{ file, field int }

func fileKey(f, k int) fieldKey { return fieldKey{f, k} }

// cleanColumns returns the union of the input columns and, for each file
// field, its output column.
func cleanColumns(s *survey.Survey) ([]column, map[fieldKey]int) {
	var cols []column
	index := map[column]int{}
	where := map[fieldKey]int{}
	add := func(fi, k int, c column) {
		m, ok := index[c]
		if !ok {
			m = len(cols)
			index[c] = m
			cols = append(cols, c)
		}
		where[fieldKey{fi, k}] = m
	}
	width := map[int]int{} // widest record per file
	for _, rd := range s.Readings {
		width[rd.File] = max(width[rd.File], len(rd.Fields))
	}
	for fi, f := range s.Files {
		seen := map[string]int{}
		for k, h := range f.Header {
			add(fi, k, column{h, seen[h]})
			seen[h]++
		}
		for k := len(f.Header); k < width[fi]; k++ {
			add(fi, k, column{"column_" + strconv.Itoa(k+1), 0})
		}
	}
	return cols, where
}

// joinNotes joins a reading's notes with "; ", turning any ";" inside a
// note into ",".
func joinNotes(notes []string) string {
	clean := make([]string, len(notes))
	for k, n := range notes {
		clean[k] = strings.ReplaceAll(n, ";", ",")
	}
	return strings.Join(clean, "; ")
}

// formatValue writes v rounded to dec decimals, shortest form.
func formatValue(v float64, dec int) string {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return ""
	}
	p := math.Pow(10, float64(dec))
	r := math.Round(v*p) / p
	if r == 0 {
		r = 0 // no "-0"
	}
	return strconv.FormatFloat(r, 'f', -1, 64)
}

// Neutralise prefixes text that a spreadsheet would run as a formula
// (starting with = + - @, tab or carriage return) with a single quote,
// leaving numbers such as -250 or -250,5 alone (OWASP, CSV injection).
func Neutralise(cell string) string {
	if cell == "" || !strings.ContainsRune("=+-@\t\r", rune(cell[0])) || isNumber(cell) {
		return cell
	}
	return "'" + cell
}

// isNumber reports whether s reads as a number, with a decimal point or a
// decimal comma.
func isNumber(s string) bool {
	t := strings.TrimSpace(s)
	if _, err := strconv.ParseFloat(t, 64); err == nil {
		return true
	}
	if strings.Count(t, ",") == 1 && !strings.Contains(t, ".") {
		_, err := strconv.ParseFloat(strings.Replace(t, ",", ".", 1), 64)
		return err == nil
	}
	return false
}
