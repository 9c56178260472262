package analysis

import (
	"context"
	"fmt"
	"testing"
)

// BenchmarkRunSecondOrder measures Run on regular frames (regularJob)
// with every combination analysed in second order.
func BenchmarkRunSecondOrder(b *testing.B) {
	for _, size := range []struct{ bays, storeys int }{{10, 10}, {30, 20}} {
		job := regularJob(size.bays, size.storeys, false)
		job.Methods = make([]Method, len(job.Combinations))
		for k := range job.Methods {
			job.Methods[k] = Method{SecondOrder: true}
		}
		b.Run(fmt.Sprintf("%dx%d", size.bays, size.storeys), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Run(context.Background(), job, Options{}); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
