package survey

// TEMPORARY: signatures only, replaced by the real loader.

import (
	"errors"
	"io"
)

// LoadOptions configures reading files. The zero value detects everything.
type LoadOptions struct {
	// Units forces the potential unit of files whose header does not state
	// one ("" means detect from the header, defaulting to mV).
	Units string
	// LineSpacing and StationSpacing, in metres, turn line and station
	// numbers into coordinates for files without x and y.
	LineSpacing, StationSpacing float64
	// LinesAlongY makes survey lines run along y (station along y, line
	// number along x); by default lines run along x.
	LinesAlongY bool
}

// Load reads one or more files into one survey, in the order given.
func Load(paths []string, opt LoadOptions) (*Survey, error) {
	return nil, errors.New("survey: not implemented yet")
}

// Parse reads one file's content; name is used in errors.
func Parse(r io.Reader, name string, opt LoadOptions) (*Survey, error) {
	return nil, errors.New("survey: not implemented yet")
}
