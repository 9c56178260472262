//go:build !unix

package envelope

import "time"

// cpuTime is 0 where the process's processor time is not read: the
// benchmarks' cpu-ns/op is then 0.
func cpuTime() time.Duration { return 0 }
