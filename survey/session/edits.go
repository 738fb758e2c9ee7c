package session

import (
	"errors"
	"fmt"
	"path/filepath"
	"time"

	"isofield/survey"
	"isofield/survey/qa"
)

// Exclude records that the reading on line of file (with id, which may be
// empty) is excluded by hand for reason, at time at, and saves the session
// at once. On a save error the edit is not kept.
func (f *File) Exclude(file string, line int, id, reason string, at time.Time) error {
	return f.addEdit(file, line, id, true, reason, at)
}

// Include records that the reading is included again and saves at once.
func (f *File) Include(file string, line int, id, reason string, at time.Time) error {
	return f.addEdit(file, line, id, false, reason, at)
}

func (f *File) addEdit(file string, line int, id string, exclude bool, reason string, at time.Time) error {
	if file == "" || line < 1 {
		return errors.New("hand edit needs a file and a line ≥ 1")
	}
	f.Edits = append(f.Edits, Edit{
		File: f.rel(file), Line: line, ID: id, Exclude: exclude, Reason: reason,
		Time: at.UTC().Truncate(time.Second),
	})
	if err := f.Save(); err != nil {
		f.Edits = f.Edits[:len(f.Edits)-1]
		return fmt.Errorf("saving hand edit: %w", err)
	}
	return nil
}

// Excluded reports whether the last edit of the reading excludes it.
func (f *File) Excluded(file string, line int, id string) bool {
	r := f.rel(file)
	out := false
	for _, e := range f.Edits {
		if e.File == r && e.Line == line && (e.ID == "" || id == "" || e.ID == id) {
			out = e.Exclude
		}
	}
	return out
}

// SetSettings replaces the settings and saves at once. On a save error the
// previous settings are kept.
func (f *File) SetSettings(s Settings) error {
	old := f.Settings
	f.Settings = s
	if err := f.Save(); err != nil {
		f.Settings = old
		return fmt.Errorf("saving settings: %w", err)
	}
	return nil
}

// QAEdits returns the hand edits for qa.Run (and pipeline.Config.Edits),
// with file paths usable from the current directory.
func (f *File) QAEdits() []qa.Edit {
	out := make([]qa.Edit, 0, len(f.Edits))
	for _, e := range f.Edits {
		out = append(out, qa.Edit{File: f.resolve(e.File), Line: e.Line, ID: e.ID, Exclude: e.Exclude, Reason: e.Reason})
	}
	return out
}

// SetInputs records the survey's files and their digests (saved with the
// next change).
func (f *File) SetInputs(files []survey.FileInfo) {
	f.Inputs = f.Inputs[:0]
	for _, fi := range files {
		f.Inputs = append(f.Inputs, Input{Path: f.rel(fi.Path), SHA256: fi.SHA256})
	}
}

// Changed returns plain-language notes on inputs whose content differs
// from when the session was saved: their hand edits may now name the wrong
// lines.
func (f *File) Changed(files []survey.FileInfo) []string {
	var notes []string
	for _, in := range f.Inputs {
		for _, fi := range files {
			if f.rel(fi.Path) != in.Path || in.SHA256 == "" || fi.SHA256 == "" {
				continue
			}
			if fi.SHA256 != in.SHA256 {
				notes = append(notes, fmt.Sprintf("%s changed since the session %s was saved: check its hand edits",
					fi.Path, filepath.Base(f.path)))
			}
		}
	}
	return notes
}
