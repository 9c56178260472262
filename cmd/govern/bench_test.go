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
// The sizes named "-starter" are the model 'govern new' writes: also
// stations at the column faces and deflections under a service combination.
func BenchmarkRun(b *testing.B) {
	out := filepath.Join(b.TempDir(), "envelopes.json")
	for _, size := range []struct {
		bays, storeys int
		starter       bool
	}{{3, 3, false}, {10, 10, false}, {30, 20, false}, {30, 60, false}, {30, 60, true}} {
		spec := regularSpec(size.bays, size.storeys)
		name := fmt.Sprintf("%dx%d", size.bays, size.storeys)
		if size.starter {
			spec.Faces, spec.Service = true, true
			name += "-starter"
		}
		var src bytes.Buffer
		if err := generateModel(&src, spec); err != nil {
			b.Fatal(err)
		}
		b.Run(name, func(b *testing.B) {
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
