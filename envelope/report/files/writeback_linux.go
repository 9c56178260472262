//go:build linux

package files

import (
	"os"

	"golang.org/x/sys/unix"
)

// startWriteback asks the system to start writing n bytes of f from off
// to disk (sync_file_range with SYNC_FILE_RANGE_WRITE: it does not wait,
// and promises nothing; the file's sync does). An error is ignored: the
// sync reports what matters.
func startWriteback(f *os.File, off, n int64) {
	unix.SyncFileRange(int(f.Fd()), off, n, unix.SYNC_FILE_RANGE_WRITE)
}
