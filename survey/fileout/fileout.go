// Package fileout writes output files safely: into a temporary file in the
// target's directory, synced, then renamed over the target, so a reader (or
// a crash) never sees a half-written file. It refuses to overwrite an input
// file, and an existing file unless asked to.
package fileout

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
)

// ErrExists is returned when the target exists and overwriting was not
// allowed.
var ErrExists = errors.New("file exists (use --force to overwrite)")

// ErrIsInput is returned when the target is one of the inputs.
var ErrIsInput = errors.New("refusing to overwrite an input file")

// Options guard a write.
type Options struct {
	// Force allows replacing an existing file.
	Force bool
	// Inputs are paths that must never be written.
	Inputs []string
}

// Write creates path atomically with the bytes that write produces. On any
// error the target is left as it was and the temporary file is removed.
func Write(path string, opt Options, write func(w io.Writer) error) error {
	if err := check(path, opt); err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	ok := false
	defer func() {
		if !ok {
			tmp.Close()
			os.Remove(tmp.Name())
		}
	}()
	bw := bufio.NewWriterSize(tmp, 1<<16)
	if err := write(bw); err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	if err := bw.Flush(); err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	if err := tmp.Sync(); err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	if err := tmp.Close(); err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	if err := os.Chmod(tmp.Name(), 0o644); err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	if err := os.Rename(tmp.Name(), path); err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	ok = true
	return nil
}

// Check reports whether Write would refuse path under opt (ErrIsInput,
// ErrExists), without writing anything, so a caller writing several files
// can refuse them all before writing the first.
func Check(path string, opt Options) error { return check(path, opt) }

// check applies the guards of opt to path.
func check(path string, opt Options) error {
	for _, in := range opt.Inputs {
		if SameFile(in, path) {
			return ErrIsInput
		}
	}
	if !opt.Force {
		if _, err := os.Lstat(path); err == nil {
			return ErrExists
		}
	}
	return nil
}

// SameFile reports whether a and b name the same file: the same cleaned
// absolute path, or the same file on disk when both exist.
func SameFile(a, b string) bool {
	aa, err1 := filepath.Abs(a)
	bb, err2 := filepath.Abs(b)
	if err1 == nil && err2 == nil && aa == bb {
		return true
	}
	sa, err1 := os.Stat(a)
	sb, err2 := os.Stat(b)
	return err1 == nil && err2 == nil && os.SameFile(sa, sb)
}
