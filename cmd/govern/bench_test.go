package main

import (
	"bytes"
	"fmt"
	"io"
	"path/filepath"
	"strings"
	"testing"

	"govern/cmd/govern/modelfile"
	"govern/envelope/report"
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
		second        bool
	}{{3, 3, false, false}, {10, 10, false, false}, {30, 20, false, false}, {30, 60, false, false}, {30, 60, true, false},
		{10, 10, false, true}, {30, 20, false, true}, {30, 60, false, true}} {
		spec := regularSpec(size.bays, size.storeys)
		name := fmt.Sprintf("%dx%d", size.bays, size.storeys)
		if size.starter {
			spec.Faces, spec.Service = true, true
			name += "-starter"
		}
		var src bytes.Buffer
		if err := modelfile.WriteStarter(&src, spec); err != nil {
			b.Fatal(err)
		}
		if size.second {
			// The same frame with every combination second-order.
			s := strings.Replace(src.String(), "[analysis]\n", "[analysis]\nsecond_order = true\n", 1)
			src.Reset()
			src.WriteString(s)
			name += "-second-order"
		}
		b.Run(name, func(b *testing.B) {
			b.ReportAllocs()
			b.ResetTimer()
			for b.Loop() {
				job, err := modelfile.Read("bench.toml", src.Bytes())
				if err != nil {
					b.Fatal(err)
				}
				a, err := analyseJob(job)
				if err != nil {
					b.Fatal(err)
				}
				if err := writeResults(io.Discard, "", &runFlags{json: out}, report.New(a)); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// regularSpec is a frame of n bays alternating 7.5 m and 6.0 m and m storeys
// of 4.2 m then 3.6 m: the shape the benchmarks grow.
func regularSpec(bays, storeys int) modelfile.Starter {
	s := modelfile.Starter{Title: fmt.Sprintf("regular frame, %d bays x %d storeys", bays, storeys), Spacing: 6}
	for i := range bays {
		s.Bays = append(s.Bays, []float64{7.5, 6.0}[i%2])
	}
	for i := range storeys {
		h := 3.6
		if i == 0 {
			h = 4.2
		}
		s.Storeys = append(s.Storeys, h)
	}
	return s
}
