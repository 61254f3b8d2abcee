// Package atomicfile writes output files so that a reader never sees a
// half-written one: the content goes to a temporary file in the destination
// directory, which is synced and renamed over the destination only when the
// writer function succeeds.
package atomicfile

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
)

// Write creates path by calling fill with a writer on a temporary file in the
// same directory, then renaming it into place. If fill or any file operation
// fails, the temporary file is removed and path is left untouched.
// The path "-" writes to stdout directly.
//
// A path that exists and is not a regular file (/dev/null, /dev/stdout, a
// named pipe) is written in place: renaming a temporary file over it would
// replace the device or pipe with a plain file.
func Write(path string, fill func(w io.Writer) error) (err error) {
	if path == "-" {
		return fill(os.Stdout)
	}
	if st, serr := os.Stat(path); serr == nil && !st.Mode().IsRegular() {
		if st.IsDir() {
			return fmt.Errorf("cannot write %s: it is a directory", path)
		}
		return writeInPlace(path, fill)
	}
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".*.tmp")
	if err != nil {
		return createError(path, dir, err)
	}
	defer func() {
		if err != nil {
			tmp.Close()
			os.Remove(tmp.Name())
		}
	}()
	if err = fill(tmp); err != nil {
		return err
	}
	if err = tmp.Sync(); err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	if err = tmp.Close(); err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	if err = os.Chmod(tmp.Name(), 0o644); err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	if err = os.Rename(tmp.Name(), path); err != nil {
		return fmt.Errorf("%s: %w", path, err)
	}
	return nil
}

// createError explains why path cannot be created, naming the path the
// caller gave rather than the temporary file.
func createError(path, dir string, err error) error {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		err = pe.Err
	}
	if st, serr := os.Stat(dir); serr != nil {
		return fmt.Errorf("cannot write %s: directory %s does not exist", path, dir)
	} else if !st.IsDir() {
		return fmt.Errorf("cannot write %s: %s is not a directory", path, dir)
	}
	return fmt.Errorf("cannot write %s: %w", path, err)
}

// writeInPlace writes to a path that is not a regular file (a device or a
// named pipe), which has no half-written state to avoid.
func writeInPlace(path string, fill func(w io.Writer) error) error {
	f, err := os.OpenFile(path, os.O_WRONLY, 0)
	if err != nil {
		return fmt.Errorf("cannot write %s: %w", path, err)
	}
	if err := fill(f); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}

// IsSpecial reports whether path exists and is neither a regular file nor a
// directory (a device, a named pipe), which Write writes in place.
func IsSpecial(path string) bool {
	st, err := os.Stat(path)
	return err == nil && !st.Mode().IsRegular() && !st.IsDir()
}
