package survey

import (
	"bytes"
	"crypto/sha256"
	"encoding/csv"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"strings"
)

// coordMode says where a file's positions come from.
type coordMode int

const (
	modeXY coordMode = iota
	modeLineStation
	modeGeo
)

// parsed is one file read on its own, before merging.
type parsed struct {
	info     FileInfo
	readings []Reading
	notes    []string
}

// readFile parses one source. It reads with encoding/csv rather than
// gocsv: gocsv binds columns to struct fields by fixed header names, while
// survey files name their columns in many ways (aliases, units inside the
// names) and need per-cell positions for errors, decimal commas and
// records kept as written.
func readFile(src source, index int, opt LoadOptions) (*parsed, error) {
	sum := sha256.Sum256(src.data)
	data, notes, perr := checkText(src.data)
	if perr != nil {
		perr.File = src.name
		return nil, perr
	}
	pre, perr := scanPreamble(data)
	if perr != nil {
		perr.File = src.name
		return nil, perr
	}
	r := csv.NewReader(bytes.NewReader(data[pre.headerOffset:]))
	r.Comma, r.Comment = pre.delim, '#'
	r.FieldsPerRecord, r.ReuseRecord, r.TrimLeadingSpace = -1, true, true
	fr := &fileReader{name: src.name, index: index, lineOff: pre.headerLine - 1, set: pre.set}
	header, err := r.Read()
	if err != nil {
		return nil, fr.csvError(err, pre.headerLine)
	}
	header = append([]string(nil), header...)
	for len(header) > 1 && strings.TrimSpace(header[len(header)-1]) == "" {
		header = header[:len(header)-1] // trailing delimiters
	}
	fr.p = &parsed{notes: append(notes, pre.notes...)}
	fr.p.info = FileInfo{Path: src.name, SHA256: hex.EncodeToString(sum[:]),
		Header: header, Delimiter: pre.delim}
	if err := fr.setup(header, pre.headerLine, opt); err != nil {
		return nil, err
	}
	fr.p.readings = make([]Reading, 0, bytes.Count(data, []byte{'\n'}))
	if err := fr.readAll(r, len(header)); err != nil {
		return nil, err
	}
	return fr.p, nil
}

// readAll reads the records after the header: readRows splits them on
// one goroutine while this one converts them, in file order, so the first
// error reported is the first in the file.
func (f *fileReader) readAll(r *csv.Reader, width int) error {
	done := make(chan struct{})
	defer close(done)
	for b := range readRows(r, f.lineOff, done) {
		for _, rw := range b.rows {
			if len(rw.fields) > width && blankRecord(rw.fields[width:]) {
				rw.fields = rw.fields[:width:width] // trailing delimiters, as spreadsheets write
			}
			if len(rw.fields) != width {
				return &ParseError{File: f.name, Line: rw.line, Err: fmt.Errorf("%d fields where the header has %d: %w", len(rw.fields), width, ErrFieldCount)}
			}
			rd, err := f.reading(rw.fields, rw.line)
			if err != nil {
				return err
			}
			f.p.readings = append(f.p.readings, rd)
		}
		if b.err != nil {
			return f.csvError(b.err, 0)
		}
	}
	if len(f.p.readings) == 0 {
		return &ParseError{File: f.name, Err: ErrNoReadings}
	}
	f.p.info.Readings = len(f.p.readings)
	f.p.info.DecimalComma = f.sawDecimalComma
	f.p.notes = append(f.p.notes, f.times.notes()...)
	return nil
}

// csvError turns an encoding/csv error into a ParseError at our line.
func (f *fileReader) csvError(err error, line int) error {
	var ce *csv.ParseError
	if errors.As(err, &ce) {
		return &ParseError{File: f.name, Line: ce.Line + f.lineOff, Err: ce.Err}
	}
	return &ParseError{File: f.name, Line: line, Err: err}
}

// blankRecord reports whether every field is empty or white space.
func blankRecord(rec []string) bool {
	for _, s := range rec {
		if !isBlank(s) {
			return false
		}
	}
	return true
}

// row is one record as written and its 1-based line.
type row struct {
	fields []string
	line   int
}

// batch is a run of rows in file order, then possibly the error that
// ended the reading.
type batch struct {
	rows []row
	err  error
}

// batchRows is the number of rows sent at a time; large enough that the
// channel costs nothing per row, small enough to start converting early.
const batchRows = 2048

// The record arena allocates strings in chunks that grow from
// arenaFirst to arenaMax, so small files stay small.
const arenaFirst, arenaMax = 256, 1 << 15

// readRows reads records on a goroutine of its own and sends them in
// batches; blank records are skipped. Each record is copied into a shared
// arena, since the csv.Reader reuses its slice and Reading.Fields keeps
// the copy. The goroutine ends at the end of input, at an error, or when
// done is closed.
func readRows(r *csv.Reader, lineOff int, done <-chan struct{}) <-chan batch {
	out := make(chan batch, 4)
	go func() {
		defer close(out)
		var keep arena
		rows := make([]row, 0, batchRows)
		for {
			rec, err := r.Read()
			if err == io.EOF {
				break
			}
			if err != nil {
				send(out, done, batch{rows, err})
				return
			}
			if blankRecord(rec) {
				continue
			}
			line, _ := r.FieldPos(0)
			rows = append(rows, row{keep.copy(rec), line + lineOff})
			if len(rows) == batchRows {
				if !send(out, done, batch{rows: rows}) {
					return
				}
				rows = make([]row, 0, batchRows)
			}
		}
		if len(rows) > 0 {
			send(out, done, batch{rows: rows})
		}
	}()
	return out
}

// send sends b unless done is closed; it reports whether it sent.
func send(out chan<- batch, done <-chan struct{}, b batch) bool {
	select {
	case <-done:
		return false
	default:
	}
	select {
	case out <- b:
		return true
	case <-done:
		return false
	}
}

// arena copies records into shared chunks of strings.
type arena struct {
	free  []string
	chunk int
}

// copy returns a copy of rec that stays valid after the csv.Reader reuses
// rec.
func (a *arena) copy(rec []string) []string {
	if len(a.free) < len(rec) {
		a.chunk = min(max(2*a.chunk, arenaFirst), arenaMax)
		a.free = make([]string, max(a.chunk, len(rec)))
	}
	out := a.free[:len(rec):len(rec)]
	copy(out, rec)
	a.free = a.free[len(rec):]
	return out
}

// isBlank reports whether s is empty or ASCII white space.
func isBlank(s string) bool {
	for i := 0; i < len(s); i++ {
		if s[i] != ' ' && s[i] != '\t' && s[i] != '\r' && s[i] != '\n' && s[i] != '\f' && s[i] != '\v' {
			return false
		}
	}
	return true
}
