//go:build unix

package main

import (
	"bytes"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"syscall"
	"testing"

	"govern/cmd/govern/modelfile"
	"govern/envelope/report"
)

// BenchmarkWriteJSON measures what 'govern run --quiet --json FILE' does
// once the analysis is done: the load cases' results formed (afresh, a
// new report each time), the JSON formatted and written to a file,
// synced and renamed into place; on the frames of BenchmarkRun,
// analysed once. cpu-ns/op is the processor time of the whole process
// per write.
func BenchmarkWriteJSON(b *testing.B) {
	out := filepath.Join(b.TempDir(), "envelopes.json")
	for _, size := range []struct{ bays, storeys int }{{10, 10}, {30, 60}} {
		var src bytes.Buffer
		if err := modelfile.WriteStarter(&src, regularSpec(size.bays, size.storeys)); err != nil {
			b.Fatal(err)
		}
		job, err := modelfile.Read("bench.toml", src.Bytes())
		if err != nil {
			b.Fatal(err)
		}
		a, err := analyseJob(job)
		if err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprintf("%dx%d", size.bays, size.storeys), func(b *testing.B) {
			b.ReportAllocs()
			start := processCPU()
			for b.Loop() {
				if err := writeResults(io.Discard, "", &runFlags{json: out, quiet: true}, report.New(a)); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(processCPU()-start)/float64(b.N), "cpu-ns/op")
			if st, err := os.Stat(out); err == nil {
				b.SetBytes(st.Size())
			}
		})
	}
}

// processCPU returns the processor time, user and system, the process
// has used, in nanoseconds.
func processCPU() int64 {
	var ru syscall.Rusage
	if err := syscall.Getrusage(syscall.RUSAGE_SELF, &ru); err != nil {
		return 0
	}
	return ru.Utime.Nano() + ru.Stime.Nano()
}
