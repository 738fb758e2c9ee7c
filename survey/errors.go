package survey

import (
	"errors"
	"fmt"
)

// Causes that a ParseError wraps; test with errors.Is.
var (
	ErrEmpty         = errors.New("file is empty")
	ErrNoReadings    = errors.New("no readings after the header")
	ErrMissingColumn = errors.New("missing column")
	ErrNotNumber     = errors.New("not a number")
	ErrNonFinite     = errors.New("value is not finite")
	ErrFieldCount    = errors.New("wrong number of fields")
	ErrBinary        = errors.New("file is not text")
	ErrTooFew        = errors.New("too few readings")
	ErrCollinear     = errors.New("all readings lie on one straight line")
	ErrBadTime       = errors.New("unreadable time")
	ErrOutOfRange    = errors.New("value out of range")
	ErrNoSpacing     = errors.New("line or station spacing not given")
	ErrMixedFiles    = errors.New("files do not agree")
	ErrBadSetting    = errors.New("bad setting")
)

// ParseError is an error in an input file. Line and Column are 1-based;
// zero means unknown (the error concerns the whole file or line).
type ParseError struct {
	File   string
	Line   int
	Column int
	Err    error
}

func (e *ParseError) Error() string {
	switch {
	case e.Line > 0 && e.Column > 0:
		return fmt.Sprintf("%s:%d:%d: %v", e.File, e.Line, e.Column, e.Err)
	case e.Line > 0:
		return fmt.Sprintf("%s:%d: %v", e.File, e.Line, e.Err)
	}
	return fmt.Sprintf("%s: %v", e.File, e.Err)
}

func (e *ParseError) Unwrap() error { return e.Err }
