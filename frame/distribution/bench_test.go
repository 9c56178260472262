package distribution

import (
	"fmt"
	"testing"

	"govern/frame"
)

// BenchmarkContinuousBeam measures a uniformly loaded continuous beam of n
// equal spans; the sweeps needed grow with the number of joints.
func BenchmarkContinuousBeam(b *testing.B) {
	for _, n := range []int{4, 16, 64} {
		b.Run(fmt.Sprint(n, " spans"), func(b *testing.B) {
			spans := make([]float64, n)
			for i := range spans {
				spans[i] = 6
			}
			mo := beam(spans...)
			for m := range n {
				mo.Cases[0].MemberLoads = append(mo.Cases[0].MemberLoads, frame.MemberLoad{Member: m, To: 6, W: 10, WEnd: 10})
			}
			b.ReportAllocs()
			b.ResetTimer()
			var r *Result
			for b.Loop() {
				var err error
				if r, err = Solve(mo, nil); err != nil {
					b.Fatal(err)
				}
			}
			b.ReportMetric(float64(r.Sweeps), "sweeps")
		})
	}
}
