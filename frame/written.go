package frame

// written returns n zeros that have been written, not only allocated.
//
// Memory fresh from the system reads as zeros without being written, and
// make does not write it: its first read maps each page to the system's
// shared zero page, and the first write after that faults a second time
// to give the page a copy of its own, which flushes the address
// translations of every processor running the process (an interrupt to
// each, costly in a virtual machine). A vector that is added to before it
// is ever stored to (axpy into zeros, an append to a slice of slices) does
// exactly that, page by page; zeros written first fault each page once.
func written[T any](n int) []T {
	s := make([]T, n)
	clear(s)
	return s
}
