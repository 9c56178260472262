package main

import (
	"bytes"
	"flag"
	"fmt"
	"strings"
	"testing"

	"govern/cmd/govern/modelfile"
	"govern/envelope/analysis"
)

// The estimate that refuses a model too large (frame.MaxMemory) is within
// 20 % of the peak memory measured for it (the target is 25 %): the peaks
// of 'govern run --quiet --json' (maximum resident set size from
// /usr/bin/time) on the frames docs/perf/model.sh writes, first- and
// second-order, and one with no case patterned (the band dominates), measured by
// docs/perf/memory.sh and listed in docs/errors.md, with their equations
// and half-bandwidths: the medians of three runs each, 2026-12-03 from
// 08:33 to 08:35 UTC on the project's 2-core development machine (load
// averages 1.7 to 3.0), the run setting its soft memory limit to the
// estimate for the analysis (setMemoryLimit), with GOGC=100 as
// docs/perf/memory.sh sets it: the collector's own target kept, so that
// the peak is what the run needs, not the limit it sets itself.
func TestMemoryEstimateAgainstMeasuredPeaks(t *testing.T) {
	const within = 0.20 // the issue asks 25 %; twelve band matrices put the 100 × 100 unpatterned frame at 1.40
	for _, m := range []struct {
		bays, storeys int
		second        bool
		equations     int
		band          int
		peakMiB       float64
		unpatterned   bool // no case patterned: four load columns, the band dominates
	}{
		{10, 10, false, 330, 32, 20, false},
		{20, 20, false, 1260, 62, 44, false},
		{40, 40, false, 4920, 122, 185, false},
		{30, 60, false, 5580, 98, 214, false},
		{60, 60, false, 10980, 182, 641, false},
		{20, 200, false, 12600, 68, 678, false},
		{10, 20, true, 660, 38, 52, false},
		{20, 30, true, 1890, 68, 148, false},
		{30, 30, true, 2790, 92, 252, false},
		{30, 60, true, 5580, 98, 655, false},
		{100, 100, false, 30300, 302, 821, true},
	} {
		name := fmt.Sprintf("%dx%d", m.bays, m.storeys)
		if m.second {
			name += "-second-order"
		}
		if m.unpatterned {
			name += "-unpatterned"
		}
		t.Run(name, func(t *testing.T) {
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
			text := src.String()
			if m.second {
				text = strings.Replace(text, "[analysis]\n", "[analysis]\nsecond_order = true\n", 1)
			}
			if m.unpatterned {
				text = strings.ReplaceAll(text, "\npattern = true", "\npattern = false") // as docs/perf/memory.sh's sed
			}
			job, err := modelfile.Read("memory.toml", []byte(text))
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

var memoryEstimates = flag.String("memory-estimates", "", "print the memory estimate of these model files (separated by spaces), as docs/perf/memory.sh asks")

// TestPrintMemoryEstimates prints, with -memory-estimates 'FILE...' (and
// -v), a line for each model file: "estimate FILE equations
// half-bandwidth load-columns bytes", the estimate of the peak memory of
// 'govern run' that frame.MaxMemory limits, for docs/perf/memory.sh.
func TestPrintMemoryEstimates(t *testing.T) {
	if *memoryEstimates == "" {
		t.Skip("a tool: give -memory-estimates 'FILE...' to print their estimates")
	}
	for _, path := range strings.Fields(*memoryEstimates) {
		job, err := loadModel(path)
		if err != nil {
			t.Fatal(err)
		}
		est, info, err := analysis.EstimateMemory(&job.Job)
		if err != nil {
			t.Fatal(err)
		}
		fmt.Printf("estimate %s %d %d %d %.0f\n", path, info.Equations, info.Bandwidth, info.Columns, est)
	}
}
