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
// target and, once every one has been written whole, renames them into
// place, so that a failed run leaves the previous files untouched and never
// a partial one. Standard output is written last. Paths that name the model
// are refused before anything is written.
func commitOutputs(stdout io.Writer, model string, outs []output) error {
	for _, o := range outs {
		if o.path != "-" && sameFile(o.path, model) {
			return fmt.Errorf("refusing to write %s: it is the model file", o.path)
		}
	}
	nfiles := 0
	for _, o := range outs {
		if o.path != "-" {
			nfiles++
		}
	}
	if nfiles == 0 {
		// Nothing to keep whole: stream straight out.
		for _, o := range outs {
			if err := o.write(stdout); err != nil {
				return err
			}
		}
		return nil
	}
	// Standard output is rendered into memory alongside the files (the two
	// only read the results), and written once the files are in place.
	var screen bytes.Buffer
	var screenErr error
	done := make(chan struct{})
	go func() {
		defer close(done)
		for _, o := range outs {
			if o.path == "-" && screenErr == nil {
				screenErr = o.write(&screen)
			}
		}
	}()
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

// writeTemp writes a temporary file beside path with write and returns its name.
func writeTemp(path string, write func(io.Writer) error) (string, error) {
	f, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".tmp*")
	if err != nil {
		return "", fmt.Errorf("cannot write %s: %v", path, err)
	}
	tmp := f.Name()
	bw := bufio.NewWriterSize(f, 1<<16)
	err = write(bw)
	if err == nil {
		err = bw.Flush()
	}
	if cerr := f.Close(); err == nil {
		err = cerr
	}
	if err != nil {
		os.Remove(tmp)
		return "", fmt.Errorf("cannot write %s: %v", path, err)
	}
	return tmp, nil
}

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
