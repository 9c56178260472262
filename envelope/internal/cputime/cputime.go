// Package cputime reads the processor time the process has used, for
// benchmarks that report it beside wall time: on a machine shared with
// other work, the time the processors spent on the benchmark, not the time
// it waited for them.
package cputime

import "time"

// Now returns the processor time (user and system) the process has used
// so far; 0 where it is not read.
func Now() time.Duration { return now() }
