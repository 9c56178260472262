//go:build !unix

package analysis

// cpuTime returns 0: the processor time is read on Unix only.
func cpuTime() int64 { return 0 }
