package main

import (
	"os"
	"runtime/debug"

	"govern/envelope/analysis"
)

// limitMemory is called with the job about to be analysed. The command
// (main) sets it to setMemoryLimit; tests, which run many models in one
// process, leave it doing nothing.
var limitMemory = func(*analysis.Job) {}

// setMemoryLimit sets the Go runtime's soft memory limit to the estimate
// of job's peak memory (analysis.EstimateMemory, the one frame.MaxMemory
// refuses a model by), unless GOMEMLIMIT is set. The collector then runs
// before the heap's growth past what is live takes the process past the
// estimate, where its default target (twice the live heap) would let it
// run further (docs/errors.md, Limits). A job the estimate refuses is
// left to the analysis to report.
func setMemoryLimit(job *analysis.Job) {
	if os.Getenv("GOMEMLIMIT") != "" {
		return
	}
	est, _, err := analysis.EstimateMemory(job)
	if err != nil || est <= 0 {
		return
	}
	debug.SetMemoryLimit(int64(est))
}
