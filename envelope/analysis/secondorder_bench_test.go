package analysis

import (
	"context"
	"fmt"
	"testing"
)

// BenchmarkRunSecondOrder measures Run on regular frames (regularJob)
// with every combination analysed in second order; on the larger frame
// also with the combinations' critical load factors found each alone
// (criticalTogether off, "alone"), as they were before they were found
// side by side. cpu-ns/op is the process's processor time (user and
// system, every thread) per operation: on a machine shared with other
// work it is the steadier figure.
func BenchmarkRunSecondOrder(b *testing.B) {
	for _, size := range []struct {
		bays, storeys int
		alone         bool
	}{{10, 10, false}, {30, 20, false}, {30, 20, true}} {
		job := secondOrderJob(size.bays, size.storeys, false)
		name := fmt.Sprintf("%dx%d", size.bays, size.storeys)
		if size.alone {
			name += "-alone"
		}
		b.Run(name, func(b *testing.B) {
			criticalTogether = !size.alone
			defer func() { criticalTogether = true }()
			b.ReportAllocs()
			start := cpuTime()
			for b.Loop() {
				if _, err := Run(context.Background(), job, Options{}); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(cpuTime()-start)/float64(b.N), "cpu-ns/op")
		})
	}
}
