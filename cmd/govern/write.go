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

// commitOutputs writes each output to a temporary file beside its target
// and renames it into place, so that a failed run leaves the previous file
// untouched and never a partial one. Paths that name the model are refused.
func commitOutputs(stdout io.Writer, model string, outs []*output) error {
	for _, o := range outs {
		if o.path != "-" && sameFile(o.path, model) {
			return fmt.Errorf("refusing to write %s: it is the model file", o.path)
		}
	}
	for _, o := range outs {
		if o.path == "-" {
			if _, err := stdout.Write(o.buf.Bytes()); err != nil {
				return err
			}
			continue
		}
		if err := writeAtomic(o.path, o.buf.Bytes()); err != nil {
			return err
		}
	}
	return nil
}

// writeAtomic replaces path with data through a temporary file and a rename.
func writeAtomic(path string, data []byte) error {
	dir := filepath.Dir(path)
	f, err := os.CreateTemp(dir, "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return fmt.Errorf("cannot write %s: %v", path, err)
	}
	tmp := f.Name()
	if _, err := f.Write(data); err != nil {
		f.Close()
		os.Remove(tmp)
		return fmt.Errorf("cannot write %s: %v", path, err)
	}
	if err := f.Close(); err != nil {
		os.Remove(tmp)
		return fmt.Errorf("cannot write %s: %v", path, err)
	}
	if err := os.Rename(tmp, path); err != nil {
		os.Remove(tmp)
		return fmt.Errorf("cannot write %s: %v", path, err)
	}
	return nil
}

// sameFile reports whether a and b name the same existing file.
func sameFile(a, b string) bool {
	if b == "" {
		return false
	}
	fa, err1 := os.Stat(a)
	fb, err2 := os.Stat(b)
	if err1 != nil || err2 != nil {
		return filepath.Clean(a) == filepath.Clean(b)
	}
	return os.SameFile(fa, fb)
}

func fileExists(path string) bool {
	_, err := os.Stat(path)
	return err == nil
}
