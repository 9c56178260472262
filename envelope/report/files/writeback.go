package files

import (
	"io"
	"os"
)

// writebackEvery is how many bytes of a temporary file are written before
// the system is asked to start writing them to disk (startWriteback).
const writebackEvery = 8 << 20

// writingBack passes its writes on to w, the temporary file f or a writer
// in its place, and every writebackEvery bytes asks the system to start
// writing what f holds so far to disk, without waiting for it: the disk
// works while the rest of the file is formed, and the sync that ends the
// file (writeTemp) has less left to wait for. It changes nothing in what
// is written or when the file counts as done.
type writingBack struct {
	w       io.Writer
	f       *os.File
	written int64 // bytes passed on
	started int64 // bytes asked to be written back
}

func (wb *writingBack) Write(p []byte) (int, error) {
	n, err := wb.w.Write(p)
	wb.written += int64(n)
	// Whole blocks only: the last, partly written, is left to be
	// completed first (a write into a page being written back waits).
	if end := wb.written &^ (writebackBlock - 1); end-wb.started >= writebackEvery {
		startWriteback(wb.f, wb.started, end-wb.started)
		wb.started = end
	}
	return n, err
}

// writebackBlock is the alignment of the ranges written back: a multiple
// of the pages of the systems the program runs on.
const writebackBlock = 1 << 16
