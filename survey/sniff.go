package survey

import (
	"bytes"
	"fmt"
	"strconv"
	"strings"
	"time"
	"unicode/utf8"
)

// fileSettings are the settings a file states in its header block, in
// comment lines made only of key=value words (see the package doc).
type fileSettings struct {
	lineSpacing, stationSpacing float64
	linesAlong                  string // "", "x" or "y"
	units                       string // "", "V" or "mV"
	reference                   string
	date                        time.Time // day of clock-only times
	hasDate                     bool
}

// preamble is what precedes the header row.
type preamble struct {
	headerLine   int // 1-based line of the header row
	headerOffset int // byte offset of the header row
	delim        rune
	set          fileSettings
	notes        []string
}

// checkText rejects content that is not text: UTF-16, NUL bytes or other
// control characters. Text that is not valid UTF-8 is read as ISO 8859-1
// (Latin-1, which older loggers write) and a note says so.
func checkText(data []byte) ([]byte, []string, *ParseError) {
	if bytes.HasPrefix(data, []byte{0xFF, 0xFE}) || bytes.HasPrefix(data, []byte{0xFE, 0xFF}) {
		return nil, nil, &ParseError{Line: 1, Err: fmt.Errorf("UTF-16 text (save the file as UTF-8): %w", ErrBinary)}
	}
	for i, b := range data {
		if b < 0x20 && b != '\n' && b != '\r' && b != '\t' && b != '\f' || b == 0x7F {
			line := 1 + bytes.Count(data[:i], []byte{'\n'})
			return nil, nil, &ParseError{Line: line, Err: fmt.Errorf("control byte 0x%02x: %w", b, ErrBinary)}
		}
	}
	data = bytes.TrimPrefix(data, []byte("\ufeff"))
	if utf8.Valid(data) {
		return data, nil, nil
	}
	out := make([]byte, 0, len(data)+len(data)/8)
	for _, b := range data {
		out = utf8.AppendRune(out, rune(b))
	}
	return out, []string{"the file is not UTF-8; it was read as ISO 8859-1 (Latin-1)"}, nil
}

// scanPreamble finds the header row: the first line that is neither blank
// nor a comment. A first line "sep=X" names the delimiter; comment lines
// made only of key=value words state file settings.
func scanPreamble(data []byte) (preamble, *ParseError) {
	var p preamble
	off := 0
	for line := 1; off < len(data); line++ {
		end := bytes.IndexByte(data[off:], '\n')
		if end < 0 {
			end = len(data) - off
		}
		raw := strings.TrimRight(string(data[off:off+end]), "\r")
		text := strings.TrimSpace(raw)
		switch {
		case text == "":
		case line == 1 && len(raw) > 4 && strings.EqualFold(raw[:4], "sep=") && utf8.RuneCountInString(raw) == 5:
			p.delim, _ = utf8.DecodeLastRuneInString(raw)
			if !validDelim(p.delim) {
				return p, &ParseError{Line: line, Column: 1, Err: fmt.Errorf("%q cannot be the delimiter: %w", p.delim, ErrBadSetting)}
			}
		case text[0] == '#':
			notes, err := p.set.parse(strings.TrimSpace(text[1:]))
			if err != nil {
				return p, &ParseError{Line: line, Err: err}
			}
			p.notes = append(p.notes, notes...)
		default:
			p.headerLine, p.headerOffset = line, off
			if p.delim == 0 {
				p.delim = detectDelimiter(text)
			}
			return p, nil
		}
		off += end + 1
	}
	return p, &ParseError{Err: ErrEmpty}
}

// validDelim reports whether r can separate fields: encoding/csv refuses
// quotes, line breaks and invalid runes, and '#' starts comments.
func validDelim(r rune) bool {
	return r != '"' && r != '#' && r != '\r' && r != '\n' && r != utf8.RuneError && utf8.ValidRune(r)
}

// detectDelimiter picks the delimiter that occurs most often in the header
// row outside quotes; ties go to tab, then semicolon, then comma.
func detectDelimiter(header string) rune {
	var n [3]int
	cands := [3]rune{'\t', ';', ','}
	quoted := false
	for _, r := range header {
		if r == '"' {
			quoted = !quoted
		}
		for i, c := range cands {
			if r == c && !quoted {
				n[i]++
			}
		}
	}
	best := -1
	for i := range n {
		if n[i] > 0 && (best < 0 || n[i] > n[best]) {
			best = i
		}
	}
	if best < 0 {
		return ','
	}
	return cands[best]
}

// parse reads a comment line. When every word is key=value it is a
// settings line: known keys are applied, unknown ones noted. Any other
// comment is ignored.
func (s *fileSettings) parse(text string) (notes []string, err error) {
	words := strings.Fields(text)
	if len(words) == 0 {
		return nil, nil
	}
	for _, w := range words {
		if k, _, ok := strings.Cut(w, "="); !ok || k == "" {
			return nil, nil
		}
	}
	for _, w := range words {
		k, v, _ := strings.Cut(w, "=")
		known, err := s.apply(strings.ToLower(k), v)
		if err != nil {
			return nil, fmt.Errorf("setting %s: %w", w, err)
		}
		if !known {
			notes = append(notes, fmt.Sprintf("setting %q in the header block is not known and was ignored", w))
		}
	}
	return notes, nil
}

// apply sets one key; it reports whether the key is known.
func (s *fileSettings) apply(k, v string) (bool, error) {
	var err error
	switch k {
	case "line_spacing":
		s.lineSpacing, err = positive(v)
	case "station_spacing":
		s.stationSpacing, err = positive(v)
	case "lines_along":
		if v = strings.ToLower(v); v != "x" && v != "y" {
			err = fmt.Errorf("want x or y: %w", ErrBadSetting)
		}
		s.linesAlong = v
	case "units", "unit":
		var u Unit
		if u, err = ParseUnit(v); err == nil {
			s.units = u.String()
		} else {
			err = fmt.Errorf("%v: %w", err, ErrBadSetting)
		}
	case "reference", "ref":
		s.reference = v
	case "date":
		s.date, err = time.Parse(time.DateOnly, v)
		if err != nil {
			err = fmt.Errorf("want YYYY-MM-DD: %w", ErrBadTime)
		}
		s.hasDate = err == nil
	default:
		return false, nil
	}
	return true, err
}

// positive reads a finite number greater than zero.
func positive(v string) (float64, error) {
	f, err := strconv.ParseFloat(strings.Replace(v, ",", ".", 1), 64)
	if err != nil || !(f > 0) || f > 1e12 {
		return 0, fmt.Errorf("want a positive number of metres: %w", ErrBadSetting)
	}
	return f, nil
}
