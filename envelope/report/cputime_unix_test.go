//go:build unix

package report

import (
	"syscall"
	"time"
)

// cpuTime returns the processor time (user and system) the process has
// used so far, for the benchmarks' cpu-ns/op: on a machine shared with
// other work, the time the processors spent on the benchmark, not the
// time it waited for them.
func cpuTime() time.Duration {
	var ru syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &ru) != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}
