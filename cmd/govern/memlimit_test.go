package main

import (
	"bytes"
	"math"
	"runtime/debug"
	"testing"

	"govern/cmd/govern/modelfile"
)

// setMemoryLimit sets the runtime's soft memory limit to the estimate of
// the run's peak, which for the 10 × 10 frame is within 25 % of the
// 20 MiB measured for it (docs/errors.md, Limits: maximum resident set
// size of 'govern run', docs/perf/memory.sh); and leaves a limit given by
// GOMEMLIMIT alone; and that what it returns puts the limit back.
// While the limit holds, the collector's own target is off unless GOGC
// is set.
func TestSetMemoryLimit(t *testing.T) {
	const (
		measuredMiB = 20
		within      = 0.25
	)
	s := modelfile.Starter{Title: "memory", Spacing: 6}
	for i := range 10 {
		s.Bays = append(s.Bays, []float64{7.5, 6.0}[min(i, 1)])
		s.Storeys = append(s.Storeys, []float64{4.2, 3.6}[min(i, 1)])
	}
	var src bytes.Buffer
	if err := modelfile.WriteStarter(&src, s); err != nil {
		t.Fatal(err)
	}
	job, err := modelfile.Read("memory.toml", src.Bytes())
	if err != nil {
		t.Fatal(err)
	}
	old := debug.SetMemoryLimit(-1)
	defer debug.SetMemoryLimit(old)
	t.Run("from the estimate", func(t *testing.T) {
		t.Setenv("GOMEMLIMIT", "")
		debug.SetMemoryLimit(math.MaxInt64)
		restore := setMemoryLimit(&job.Job)
		got := float64(debug.SetMemoryLimit(-1))
		if r := got / (measuredMiB << 20); r < 1-within || r > 1+within {
			t.Errorf("limit %.1f MiB, %.2f of the %d MiB measured", got/(1<<20), r, measuredMiB)
		}
		restore()
		if got := debug.SetMemoryLimit(-1); got != math.MaxInt64 {
			t.Errorf("limit %d bytes after the analysis, want none, as before it", got)
		}
	})
	// The collector's own target is off while the limit holds (the limit
	// alone starts a cycle), and back as it was after; GOGC given keeps it.
	t.Run("collector's target", func(t *testing.T) {
		t.Setenv("GOMEMLIMIT", "")
		t.Setenv("GOGC", "")
		debug.SetMemoryLimit(math.MaxInt64)
		const before = 100
		defer debug.SetGCPercent(debug.SetGCPercent(before))
		restore := setMemoryLimit(&job.Job)
		if got := debug.SetGCPercent(-1); got != -1 {
			t.Errorf("target %d%% during the analysis, want off (-1)", got)
		}
		restore()
		if got := debug.SetGCPercent(before); got != before {
			t.Errorf("target %d%% after the analysis, want %d%%, as before it", got, before)
		}
		t.Setenv("GOGC", "150")
		restore = setMemoryLimit(&job.Job)
		if got := debug.SetGCPercent(before); got != before {
			t.Errorf("target %d%% with GOGC given, want it left at %d%%", got, before)
		}
		restore()
	})
	t.Run("GOMEMLIMIT given", func(t *testing.T) {
		t.Setenv("GOMEMLIMIT", "off")
		debug.SetMemoryLimit(math.MaxInt64)
		setMemoryLimit(&job.Job)()
		if got := debug.SetMemoryLimit(-1); got != math.MaxInt64 {
			t.Errorf("limit %d bytes, want none (GOMEMLIMIT=off)", got)
		}
	})
	t.Run("not in tests", func(t *testing.T) {
		t.Setenv("GOMEMLIMIT", "")
		debug.SetMemoryLimit(math.MaxInt64)
		limitMemory(&job.Job)()
		if got := debug.SetMemoryLimit(-1); got != math.MaxInt64 {
			t.Errorf("limit %d bytes set where main did not ask for one", got)
		}
	})
}
