package main

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"os"
	"path/filepath"
)

// output is something the run was asked to write: a file, or standard
// output for path "-".
type output struct {
	path  string
	write func(io.Writer) error
}

// commitOutputs writes each file output to a temporary file beside its
// target, synced to disk, and, once every one has been written whole,
// renames them into place, so that a failed or interrupted run leaves the
// previous files untouched and never a partial one; no temporary file stays
// behind, even after a panic. Standard output is written last. Paths that
// name the model, a directory, or the same file twice are refused before
// anything is written. Every output is capped at maxOutput bytes.
func commitOutputs(stdout io.Writer, model string, outs []output) error {
	var named []string
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
		for _, p := range named {
			if sameFile(o.path, p) {
				return fmt.Errorf("refusing to write %s twice: two outputs name the same file", o.path)
			}
		}
		named = append(named, o.path)
	}
	if len(named) == 0 {
		// Nothing to keep whole: stream straight out.
		for _, o := range outs {
			if err := o.write(&capped{w: stdout, what: "standard output"}); err != nil {
				return err
			}
		}
		return nil
	}
	// Standard output is rendered into memory alongside the files (the two
	// only read the results), and written once the files are in place. A
	// panic there becomes an error: it cannot be recovered in another
	// goroutine.
	var screen bytes.Buffer
	var screenErr error
	done := make(chan struct{})
	go func() {
		defer close(done)
		defer func() {
			if p := recover(); p != nil {
				screenErr = fmt.Errorf("internal error: %v", p)
			}
		}()
		for _, o := range outs {
			if o.path == "-" && screenErr == nil {
				screenErr = o.write(&capped{w: &screen, what: "summary"})
			}
		}
	}()
	defer func() { <-done }() // even on a panic below, do not leave it running
	var temps []string
	defer func() {
		for _, t := range temps {
			os.Remove(t) // left only on failure; renamed ones are gone
		}
	}()
	var files []output
	var err error
	for _, o := range outs {
		if o.path == "-" {
			continue
		}
		var tmp string
		if tmp, err = writeTemp(o.path, o.write); err != nil {
			break
		}
		temps = append(temps, tmp)
		files = append(files, o)
	}
	<-done
	if err != nil {
		return err
	}
	if screenErr != nil {
		return screenErr
	}
	for i, o := range files {
		if err := os.Rename(temps[i], o.path); err != nil {
			return fmt.Errorf("cannot write %s: %v", o.path, err)
		}
	}
	temps = nil
	_, err = stdout.Write(screen.Bytes())
	return err
}

// writeTemp writes a temporary file beside path with write, named
// ".NAME.tmp…", with the permissions of the file it will replace (0644 for
// a new one), syncs it to disk and returns its name. On any failure, or a
// panic, it removes the temporary file.
func writeTemp(path string, write func(io.Writer) error) (string, error) {
	f, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return "", fmt.Errorf("cannot write %s: %v", path, err)
	}
	tmp := f.Name()
	kept := false
	defer func() {
		if !kept {
			f.Close()
			os.Remove(tmp)
		}
	}()
	mode := os.FileMode(0o644)
	if st, err := os.Stat(path); err == nil && st.Mode().IsRegular() {
		mode = st.Mode().Perm()
	}
	if err := f.Chmod(mode); err != nil {
		return "", fmt.Errorf("cannot write %s: %v", path, err)
	}
	bw := bufio.NewWriterSize(tempWriter(f), 1<<16)
	err = write(&capped{w: bw, what: filepath.Base(path)})
	if err == nil {
		err = bw.Flush()
	}
	if err == nil {
		err = f.Sync()
	}
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	if err != nil {
		return "", fmt.Errorf("cannot write %s: %v", path, err)
	}
	kept = true
	return tmp, nil
}

// tempWriter is what a temporary output file is written through. Tests
// replace it to simulate a write that fails or is interrupted part way.
var tempWriter = func(f *os.File) io.Writer { return f }

// writeAtomic replaces path with data through a temporary file and a rename.
func writeAtomic(path string, data []byte) error {
	tmp, err := writeTemp(path, func(w io.Writer) error {
		_, err := w.Write(data)
		return err
	})
	if err != nil {
		return err
	}
	if err := os.Rename(tmp, path); err != nil {
		os.Remove(tmp)
		return fmt.Errorf("cannot write %s: %v", path, err)
	}
	return nil
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
