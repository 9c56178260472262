package main

import (
	"bytes"
	"fmt"
	"io"
	"path/filepath"
	"testing"

	"govern/cmd/govern/modelfile"
)

// BenchmarkRun measures the whole of 'govern run --json FILE': read the
// model, expand the ASCE/SEI 7-16 strength combinations, place the
// patterned live load ("exact"), solve, envelope at 11 stations, check the
// statics, write the JSON file and print the summary tables (discarded).
func BenchmarkRun(b *testing.B) {
	out := filepath.Join(b.TempDir(), "envelopes.json")
	for _, size := range []struct{ bays, storeys int }{{3, 3}, {10, 10}, {30, 20}, {30, 60}} {
		var src bytes.Buffer
		if err := generateModel(&src, regularSpec(size.bays, size.storeys)); err != nil {
			b.Fatal(err)
		}
		b.Run(fmt.Sprintf("%dx%d", size.bays, size.storeys), func(b *testing.B) {
			b.ReportAllocs()
			b.ResetTimer()
			for b.Loop() {
				job, err := modelfile.Read("bench.toml", src.Bytes())
				if err != nil {
					b.Fatal(err)
				}
				a, err := analyse(job)
				if err != nil {
					b.Fatal(err)
				}
				if err := a.report(io.Discard, "", &runFlags{json: out}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
