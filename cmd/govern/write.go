package main

import (
	"bytes"
	"fmt"
	"io"
	"os"
	"path/filepath"
)

// output is a file the run was asked to write, filled in memory first.
type output struct {
	path string // "-" for standard output
	buf  bytes.Buffer
}

// commitOutputs writes the outputs: each file first to a temporary file
// beside it, synced to disk, and only when every one is complete are they
// renamed into place, then standard output. A run that fails or is
// interrupted before the renames leaves every previous file as it was and
// removes its temporary files; a rename replaces a file whole, never in
// part. Paths that name the model, a directory, or the same file twice are
// refused before anything is written.
func commitOutputs(stdout io.Writer, model string, outs []*output) error {
	var files []*output
	for _, o := range outs {
		if o.path == "-" {
			continue
		}
		if sameFile(o.path, model) {
			return fmt.Errorf("refusing to write %s: it is the model file", o.path)
		}
		if st, err := os.Stat(o.path); err == nil && st.IsDir() {
			return fmt.Errorf("cannot write %s: it is a directory", o.path)
		}
		for _, p := range files {
			if sameFile(o.path, p.path) {
				return fmt.Errorf("refusing to write %s twice: --json and --csv name the same file", o.path)
			}
		}
		files = append(files, o)
	}
	temps := make([]string, len(files))
	defer func() { // on failure or panic: no temporary file stays behind
		for _, t := range temps {
			if t != "" {
				os.Remove(t)
			}
		}
	}()
	for i, o := range files {
		t, err := writeTemp(o.path, o.buf.Bytes())
		if err != nil {
			return err
		}
		temps[i] = t
	}
	for i, o := range files {
		if err := os.Rename(temps[i], o.path); err != nil {
			return fmt.Errorf("cannot write %s: %v", o.path, err)
		}
		temps[i] = ""
	}
	for _, o := range outs {
		if o.path == "-" {
			if _, err := stdout.Write(o.buf.Bytes()); err != nil {
				return fmt.Errorf("cannot write to standard output: %v", err)
			}
		}
	}
	return nil
}

// writeAtomic replaces path with data through a temporary file and a rename.
func writeAtomic(path string, data []byte) error {
	t, err := writeTemp(path, data)
	if err != nil {
		return err
	}
	if err := os.Rename(t, path); err != nil {
		os.Remove(t)
		return fmt.Errorf("cannot write %s: %v", path, err)
	}
	return nil
}

// fill writes data to f. Tests replace it to simulate a write that fails or
// is interrupted part way.
var fill = func(f *os.File, data []byte) error {
	_, err := f.Write(data)
	return err
}

// writeTemp writes data to a new temporary file in path's folder, named
// ".NAME.tmp…", with the permissions of the file it will replace (0644 for
// a new one), syncs it to disk and returns its name. On any failure, or a
// panic, it removes the temporary file.
func writeTemp(path string, data []byte) (tmp string, err error) {
	f, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return "", fmt.Errorf("cannot write %s: %v", path, err)
	}
	done := false
	defer func() {
		if !done {
			f.Close()
			os.Remove(f.Name())
		}
	}()
	mode := os.FileMode(0o644)
	if st, err := os.Stat(path); err == nil && st.Mode().IsRegular() {
		mode = st.Mode().Perm()
	}
	if err := f.Chmod(mode); err != nil {
		return "", fmt.Errorf("cannot write %s: %v", path, err)
	}
	if err := fill(f, data); err != nil {
		return "", fmt.Errorf("cannot write %s: %v", path, err)
	}
	if err := f.Sync(); err != nil {
		return "", fmt.Errorf("cannot write %s: %v", path, err)
	}
	if err := f.Close(); err != nil {
		return "", fmt.Errorf("cannot write %s: %v", path, err)
	}
	done = true
	return f.Name(), nil
}

// sameFile reports whether a and b name the same file: the same existing
// file, or the same path.
func sameFile(a, b string) bool {
	if b == "" {
		return false
	}
	fa, err1 := os.Stat(a)
	fb, err2 := os.Stat(b)
	if err1 != nil || err2 != nil {
		pa, errA := filepath.Abs(a)
		pb, errB := filepath.Abs(b)
		if errA != nil || errB != nil {
			return filepath.Clean(a) == filepath.Clean(b)
		}
		return pa == pb
	}
	return os.SameFile(fa, fb)
}

func fileExists(path string) bool {
	_, err := os.Stat(path)
	return err == nil
}
