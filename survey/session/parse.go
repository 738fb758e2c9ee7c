package session

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"

	"isofield/survey"
)

// Parse reads a session from its JSON; name is used in errors, which are
// *survey.ParseError values naming the line and column of a syntax error,
// and wrapping ErrNotSession for a file without a version, ErrNewer for a
// later version.
func Parse(data []byte, name string) (*File, error) {
	var probe struct {
		Version *int `json:"version"`
	}
	if err := json.Unmarshal(data, &probe); err != nil {
		return nil, jsonError(name, data, err)
	}
	switch {
	case probe.Version == nil || *probe.Version < 1:
		return nil, &survey.ParseError{File: name, Err: fmt.Errorf("%w (no version)", ErrNotSession)}
	case *probe.Version > Version:
		return nil, &survey.ParseError{File: name,
			Err: fmt.Errorf("%w (version %d; this release reads up to %d)", ErrNewer, *probe.Version, Version)}
	}
	f := &File{}
	if err := json.Unmarshal(data, f); err != nil {
		return nil, jsonError(name, data, err)
	}
	if err := f.validate(); err != nil {
		return nil, &survey.ParseError{File: name, Err: err}
	}
	return f, nil
}

// validate checks what JSON types cannot.
func (f *File) validate() error {
	for k, e := range f.Edits {
		if e.File == "" || e.Line < 1 {
			return fmt.Errorf("edit %d: needs a file and a line ≥ 1", k+1)
		}
	}
	for k, in := range f.Inputs {
		if in.Path == "" {
			return fmt.Errorf("input %d: no path", k+1)
		}
	}
	if err := f.Settings.QA.Validate(); err != nil {
		return fmt.Errorf("settings: %w", err)
	}
	return nil
}

// jsonError places a JSON error at its line and column when it carries an
// offset.
func jsonError(name string, data []byte, err error) error {
	var off int64 = -1
	var se *json.SyntaxError
	var te *json.UnmarshalTypeError
	switch {
	case errors.As(err, &se):
		off = se.Offset
	case errors.As(err, &te):
		off = te.Offset
	}
	if off < 0 {
		return &survey.ParseError{File: name, Err: err}
	}
	off = min(max(off, 0), int64(len(data)))
	line := 1 + bytes.Count(data[:off], []byte("\n"))
	col := int(off) - bytes.LastIndexByte(data[:off], '\n')
	return &survey.ParseError{File: name, Line: line, Column: col, Err: err}
}
