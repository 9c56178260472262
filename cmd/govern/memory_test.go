package main

import (
	"bytes"
	"fmt"
	"testing"

	"govern/cmd/govern/modelfile"
	"govern/envelope/analysis"
)

// The estimate that refuses a model too large (frame.MaxMemory) is within
// 25 % of the peak memory measured for it: the peaks of 'govern run
// --quiet --json' (maximum resident set size from /usr/bin/time) on the
// frames docs/perf/model.sh writes, measured 2026-12-02 and listed in
// docs/errors.md, with their equations and half-bandwidths.
func TestMemoryEstimateAgainstMeasuredPeaks(t *testing.T) {
	const within = 0.25
	for _, m := range []struct {
		bays, storeys int
		equations     int
		band          int
		peakMiB       float64
	}{
		{20, 20, 1260, 62, 28},
		{40, 40, 4920, 122, 143},
		{30, 60, 5580, 98, 169},
		{60, 60, 10980, 182, 492},
		{20, 200, 12600, 68, 595},
	} {
		t.Run(fmt.Sprintf("%dx%d", m.bays, m.storeys), func(t *testing.T) {
			s := modelfile.Starter{Title: "memory", Spacing: 6}
			for i := range m.bays {
				s.Bays = append(s.Bays, []float64{7.5, 6.0}[min(i, 1)])
			}
			for i := range m.storeys {
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
			est, info, err := analysis.EstimateMemory(&job.Job)
			if err != nil {
				t.Fatal(err)
			}
			if info.Equations != m.equations || info.Bandwidth != m.band {
				t.Fatalf("%d equations, half-bandwidth %d; the frame measured had %d and %d", info.Equations, info.Bandwidth, m.equations, m.band)
			}
			peak := m.peakMiB * (1 << 20)
			t.Logf("estimate %.0f MiB, measured %.0f MiB", est/(1<<20), m.peakMiB)
			if r := est / peak; r < 1-within || r > 1+within {
				t.Errorf("estimate %.0f MiB, measured peak %.0f MiB: %.2f of it", est/(1<<20), m.peakMiB, r)
			}
		})
	}
}
