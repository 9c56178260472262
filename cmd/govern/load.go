package main

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"runtime/debug"

	"govern/cmd/govern/modelfile"
	"govern/frame"
)

// loadModel reads and validates the model file at path. A file past
// modelfile.MaxFileSize is refused before it is read.
func loadModel(path string) (*modelfile.Job, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("cannot read model: %v", err)
	}
	defer f.Close()
	st, err := f.Stat()
	if err != nil {
		return nil, fmt.Errorf("cannot read model: %v", err)
	}
	if st.IsDir() {
		return nil, fmt.Errorf("cannot read model: %s is a directory", path)
	}
	if st.Size() > modelfile.MaxFileSize {
		return nil, fmt.Errorf("%s: the file is %d bytes; the limit for a model is %d (%d MiB)", path, st.Size(), modelfile.MaxFileSize, modelfile.MaxFileSize>>20)
	}
	// Read into a buffer of the file's size, so that it is not grown and
	// copied on the way (a large file costs its size once, not twice).
	buf := bytes.NewBuffer(make([]byte, 0, st.Size()+bytes.MinRead))
	if _, err := buf.ReadFrom(io.LimitReader(f, modelfile.MaxFileSize+1)); err != nil {
		return nil, fmt.Errorf("cannot read model: %v", err)
	}
	src := buf.Bytes()
	// Decoding takes about 270 bytes an entry of the file at its peak
	// (docs/errors.md); with the collector's default target the heap may
	// grow to twice what is live, so it is held closer while reading a
	// large file.
	if holdsReading(int64(len(src)), src) {
		defer debug.SetGCPercent(debug.SetGCPercent(readGCPercent))
	}
	return modelfile.ReadAt(filepath.Dir(path), filepath.Base(path), src)
}

// readGCPercent is the garbage collector's target while a large model
// file is read: the heap may grow to 1.25 times what is live, not twice.
const readGCPercent = 25

// A file of readHeldSize bytes or more, or of readHeldEntries entries or
// more (modelfile.Entries: about 270 bytes each at the decoder's peak,
// some 11 MB for these), is read with the collector's target held at
// readGCPercent. Below both the decoder's peak is some megabytes, and the
// target's floor (a quarter of the runtime's 4 MB minimum heap) would
// start a collection every megabyte: nine of them in the 25 ms the 7 KB
// file of a 30 × 60 frame (a few hundred entries) takes to read
// (docs/errors.md, Memory of reading a model). A small file of many
// entries is held: 1 MB of one-key inline tables holds some 670,000
// (docs/errors.md: 9 MB of them, 6 million entries, peak at 1.68 GB).
const (
	readHeldSize    = 1 << 20
	readHeldEntries = 40_000
)

// holdsReading reports whether the collector's target is held at
// readGCPercent while src, of size bytes, is read; its entries are
// counted only below readHeldSize.
func holdsReading(size int64, src []byte) bool {
	return size >= readHeldSize || modelfile.Entries(src) >= readHeldEntries
}

// located returns an analysis error of the model file name: at the line
// of the load at fault for a moment applied where nothing resists it,
// else at the file, with the flag that overrides a refusal for
// ill-conditioning.
func located(job *modelfile.Job, name string, err error) error {
	if line, where, ok := job.MomentLoad(err); ok {
		return fmt.Errorf("%s:%d: %s: %w", name, line, where, err)
	}
	return fmt.Errorf("%s: %w", name, acceptHint(err))
}

// acceptHint adds to a refusal for ill-conditioning the flag that
// overrides it.
func acceptHint(err error) error {
	var ice *frame.IllConditionedError
	if errors.As(err, &ice) && ice.Acceptable {
		return fmt.Errorf("%w (govern run --accept-ill-conditioned solves it anyway, and every output then carries the estimate)", err)
	}
	return err
}
