//go:build linux && (amd64 || arm64)

package files

import (
	"os"
	"syscall"
)

// fadvDontNeed is POSIX_FADV_DONTNEED of posix_fadvise(2): the range's
// data is not needed soon.
const fadvDontNeed = 4

// dropCached drops the clean cached pages of the whole of f
// (fadvise64(fd, 0, 0, POSIX_FADV_DONTNEED): a length of 0 runs to the
// end). Dirty pages are left to be written first. On these processors the
// call takes its 64-bit arguments in single registers.
func dropCached(f *os.File) {
	syscall.Syscall6(syscall.SYS_FADVISE64, f.Fd(), 0, 0, fadvDontNeed, 0, 0)
}
