package main

import (
	"os"
	"runtime/debug"

	"govern/envelope/analysis"
)

// limitMemory is called with the job about to be analysed, and what it
// returns once the analysis is done. The command (main) sets it to
// setMemoryLimit; tests, which run many models in one process, leave it
// doing nothing.
var limitMemory = func(*analysis.Job) (restore func()) { return func() {} }

// setMemoryLimit sets the Go runtime's soft memory limit to the estimate
// of job's peak memory (analysis.EstimateMemory, the one frame.MaxMemory
// refuses a model by), unless GOMEMLIMIT is set, and returns what puts
// the limit back. The collector then runs before the heap's growth past
// what is live takes the process past the estimate, where its default
// target (twice the live heap) would let it run further (docs/errors.md,
// Limits). The limit is for the analysis only: the estimate does not
// count writing the report and the CSV files, which with the limit kept
// would be collected over and over. A job the estimate refuses is left to
// the analysis to report.
//
// With the limit, unless GOGC is set, the collector's own target is
// turned off for the analysis (debug.SetGCPercent(-1)): the limit alone
// starts a cycle, as the process nears the estimate, not each doubling of
// the heap on the way there, whose cycles mark the model, the factor and
// the pencils again and again while the run's memory is still far below
// what it is allowed (docs/performance.md, "The collector's target";
// the 30 × 60 frame: from five cycles in the analysis to one).
func setMemoryLimit(job *analysis.Job) (restore func()) {
	if os.Getenv("GOMEMLIMIT") != "" {
		return func() {}
	}
	est, _, err := analysis.EstimateMemory(job)
	if err != nil || est <= 0 {
		return func() {}
	}
	old := debug.SetMemoryLimit(int64(est))
	if os.Getenv("GOGC") != "" {
		return func() { debug.SetMemoryLimit(old) }
	}
	percent := debug.SetGCPercent(-1)
	return func() {
		debug.SetGCPercent(percent)
		debug.SetMemoryLimit(old)
	}
}
