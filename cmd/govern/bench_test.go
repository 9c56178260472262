package main

import (
	"bytes"
	"fmt"
	"io"
	"testing"

	"govern/cmd/govern/modelfile"
)

// BenchmarkRun measures the whole of 'govern run --json': read the model,
// place the patterned live load ("exact"), solve, envelope at 11 stations
// and write the JSON.
func BenchmarkRun(b *testing.B) {
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
				if err := a.writeJSON(io.Discard, a.balances()); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
