// Package session keeps a survey's settings and hand edits in a session
// file beside the first input, so that the next run (command line or
// terminal UI) picks up where the last one stopped.
//
// The file is named after the first input file with ".isofield.json"
// appended: the session of "deck-east.csv" is "deck-east.csv.isofield.json"
// in the same directory (see PathFor). It is JSON with a version number;
// this release writes Version and reads any version from 1 to Version, and
// refuses a later one with ErrNewer rather than guess.
//
// Every change (Exclude, Include, SetSettings) saves the whole file at once
// through survey/fileout: written to a temporary file in the same
// directory, synced, then renamed over the old one, so a program killed
// while writing leaves the previous session intact and at most a stray
// temporary file (named ".NAME.tmp…"), which Load never reads.
//
// Hand edits name their reading by input file (stored relative to the
// session file's directory, with forward slashes, so a survey folder can
// be moved), line in that file and id. Edits are a log: later edits of a
// reading win, and the history stays.
package session

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"time"

	"isofield/survey/fileout"
)

// Version is the session format this release writes.
const Version = 1

// Suffix is appended to the first input's name to name its session file.
const Suffix = ".isofield.json"

// Causes that Load and Parse wrap.
var (
	ErrNewer      = errors.New("session file written by a newer isofield")
	ErrNotSession = errors.New("not an isofield session file")
)

// File is a session: settings and the log of hand edits.
type File struct {
	Version int       `json:"version"`
	Saved   time.Time `json:"saved"`
	// Inputs are the survey files with their SHA-256 digests when the
	// session was last saved, to tell when an input has changed.
	Inputs   []Input  `json:"inputs,omitempty"`
	Settings Settings `json:"settings"`
	Edits    []Edit   `json:"edits,omitempty"`

	path string // where the file lives; not stored
}

// Input is one survey file of the session.
type Input struct {
	Path   string `json:"path"` // relative to the session's directory, slash-separated
	SHA256 string `json:"sha256,omitempty"`
}

// Edit is one hand exclusion or inclusion.
type Edit struct {
	File    string    `json:"file"` // relative to the session's directory, slash-separated
	Line    int       `json:"line"`
	ID      string    `json:"id,omitempty"`
	Exclude bool      `json:"exclude"`
	Reason  string    `json:"reason,omitempty"`
	Time    time.Time `json:"time"`
}

// PathFor returns the session file of a survey read from inputs: the first
// input's path with Suffix appended. It returns "" for no inputs.
func PathFor(inputs []string) string {
	if len(inputs) == 0 {
		return ""
	}
	return inputs[0] + Suffix
}

// New returns an empty session that will be saved at path.
func New(path string) *File {
	return &File{Version: Version, path: path}
}

// Path returns where the session is saved.
func (f *File) Path() string { return f.path }

// Load reads the session file at path. A missing file is an error that
// wraps fs.ErrNotExist; see Open.
func Load(path string) (*File, error) {
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, err
	}
	f, err := Parse(data, path)
	if err != nil {
		return nil, err
	}
	f.path = path
	return f, nil
}

// Open loads the session at path, or returns a new empty one when there is
// no file yet.
func Open(path string) (*File, error) {
	f, err := Load(path)
	if errors.Is(err, os.ErrNotExist) {
		return New(path), nil
	}
	return f, err
}

// Save writes the session atomically, replacing the previous file.
func (f *File) Save() error {
	if f.path == "" {
		return errors.New("session has no path")
	}
	f.Version = Version
	f.Saved = time.Now().UTC().Truncate(time.Second)
	data, err := f.Marshal()
	if err != nil {
		return err
	}
	return fileout.Write(f.path, fileout.Options{Force: true, Inputs: f.inputPaths()}, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	})
}

// Marshal returns the session as indented JSON ending in a newline.
func (f *File) Marshal() ([]byte, error) {
	var buf bytes.Buffer
	enc := json.NewEncoder(&buf)
	enc.SetIndent("", "  ")
	if err := enc.Encode(f); err != nil {
		return nil, fmt.Errorf("encoding session: %w", err)
	}
	return buf.Bytes(), nil
}

// dir is the directory paths in the session are relative to.
func (f *File) dir() string { return filepath.Dir(f.path) }

// rel turns a path as given into one relative to the session's directory,
// with forward slashes; it keeps the absolute path when there is no
// relative one.
func (f *File) rel(path string) string {
	abs, err := filepath.Abs(path)
	if err != nil {
		return filepath.ToSlash(path)
	}
	dir, err := filepath.Abs(f.dir())
	if err != nil {
		return filepath.ToSlash(abs)
	}
	r, err := filepath.Rel(dir, abs)
	if err != nil {
		return filepath.ToSlash(abs)
	}
	return filepath.ToSlash(r)
}

// resolve turns a stored path back into one usable from the current
// directory.
func (f *File) resolve(p string) string {
	p = filepath.FromSlash(p)
	if filepath.IsAbs(p) {
		return p
	}
	return filepath.Join(f.dir(), p)
}

// inputPaths are the inputs, which Save must never overwrite.
func (f *File) inputPaths() []string {
	var ps []string
	for _, in := range f.Inputs {
		ps = append(ps, f.resolve(in.Path))
	}
	return ps
}
