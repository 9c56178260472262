package frame

import (
	"syscall"
	"unsafe"
)

// hugePage is the size of the system's transparent huge pages on the
// processors Go runs on under Linux.
const hugePage = 2 << 20

// madvHugePage is MADV_HUGEPAGE, the same number on every Linux
// architecture.
const madvHugePage = 14

// adviseHuge asks the system to map the whole 2 MiB pages inside x, which
// must not have been written yet, as huge pages: a large solution written
// for the first time then faults once every 2 MiB rather than every 4 KiB.
// The contents are not changed, and where the system declines (huge pages
// off, too little memory) nothing happens but the faults.
func adviseHuge(x []float64) {
	if len(x)*8 < 2*hugePage {
		return
	}
	p := uintptr(unsafe.Pointer(&x[0]))
	lo := (p + hugePage - 1) &^ (hugePage - 1)
	hi := (p + uintptr(len(x))*8) &^ (hugePage - 1)
	if hi <= lo {
		return
	}
	b := unsafe.Slice((*byte)(unsafe.Pointer(&x[(lo-p)/8])), hi-lo)
	_ = syscall.Madvise(b, madvHugePage) // advice only
}
