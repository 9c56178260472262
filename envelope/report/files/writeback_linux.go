//go:build linux && (amd64 || arm64)

package files

import (
	"os"
	"syscall"
)

// syncFileRangeWrite is SYNC_FILE_RANGE_WRITE of sync_file_range(2):
// start writing the dirty pages of the range, without waiting.
const syncFileRangeWrite = 2

// startWriteback asks the system to start writing n bytes of f from off
// to disk (sync_file_range with SYNC_FILE_RANGE_WRITE: it does not wait,
// and promises nothing; the file's sync does). An error is ignored: the
// sync reports what matters. On these processors the call takes its
// 64-bit arguments in single registers.
func startWriteback(f *os.File, off, n int64) {
	syscall.Syscall6(syscall.SYS_SYNC_FILE_RANGE, f.Fd(), uintptr(off), uintptr(n), syncFileRangeWrite, 0, 0)
}
