package survey

import (
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
)

// LoadOptions configures reading files. The zero value detects everything.
type LoadOptions struct {
	// Units forces the potential unit of files whose header does not state
	// one ("" means detect from the header and the file's units= setting,
	// defaulting to mV with a note).
	Units string
	// LineSpacing and StationSpacing, in metres, turn line and station
	// numbers into coordinates for files without x and y. A file's own
	// line_spacing= and station_spacing= settings take precedence for that
	// file. Zero means not given.
	LineSpacing, StationSpacing float64
	// LinesAlongY makes survey lines run along y (station along y, line
	// number along x); by default lines run along x. A file's own
	// lines_along= setting takes precedence for that file.
	LinesAlongY bool
}

// check validates the options themselves (a caller's or user's error).
func (o LoadOptions) check() error {
	if o.Units != "" {
		if _, err := ParseUnit(o.Units); err != nil {
			return fmt.Errorf("load options: %w", err)
		}
	}
	if o.LineSpacing < 0 || o.StationSpacing < 0 || o.LineSpacing != o.LineSpacing || o.StationSpacing != o.StationSpacing {
		return fmt.Errorf("load options: spacings must be positive, got line %g, station %g", o.LineSpacing, o.StationSpacing)
	}
	return nil
}

// source is one input's name and bytes.
type source struct {
	name string
	data []byte
}

// Load reads one or more files into one survey, in the order given. The
// files are only read, never written.
func Load(paths []string, opt LoadOptions) (*Survey, error) {
	if len(paths) == 0 {
		return nil, fmt.Errorf("no survey files given")
	}
	srcs := make([]source, len(paths))
	for i, p := range paths {
		data, err := os.ReadFile(p)
		if err != nil {
			return nil, fmt.Errorf("reading survey: %w", err)
		}
		srcs[i] = source{p, data}
	}
	return build(srcs, opt)
}

// Parse reads one file's content; name is used in errors.
func Parse(r io.Reader, name string, opt LoadOptions) (*Survey, error) {
	data, err := io.ReadAll(r)
	if err != nil {
		return nil, &ParseError{File: name, Err: fmt.Errorf("reading: %w", err)}
	}
	return build([]source{{name, data}}, opt)
}

// build parses every source, merges them and checks the whole survey.
func build(srcs []source, opt LoadOptions) (*Survey, error) {
	if err := opt.check(); err != nil {
		return nil, err
	}
	s := &Survey{Name: surveyName(srcs)}
	names := make([]string, len(srcs))
	for i, src := range srcs {
		names[i] = src.name
		f, err := readFile(src, i, opt)
		if err != nil {
			return nil, err
		}
		if err := s.merge(f, len(srcs) > 1); err != nil {
			return nil, err
		}
	}
	if err := s.finish(); err != nil {
		return nil, &ParseError{File: strings.Join(names, ", "), Err: err}
	}
	return s, nil
}

// surveyName is the first file's base name without extension, with the
// number of further files.
func surveyName(srcs []source) string {
	base := filepath.Base(srcs[0].name)
	name := strings.TrimSuffix(base, filepath.Ext(base))
	if len(srcs) > 1 {
		name += fmt.Sprintf(" +%d", len(srcs)-1)
	}
	return name
}
