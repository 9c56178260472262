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

// BenchmarkSwayFrame measures a regular frame of b bays and s storeys, every
// floor free to sway (one sway correction each), under gravity on every
// beam and a load along X at every floor, with and without the estimate of
// axial strain.
func BenchmarkSwayFrame(b *testing.B) {
	for _, size := range [][2]int{{3, 4}, {5, 20}, {10, 40}} {
		mo := swayFrame(size[0], size[1])
		for _, axial := range []bool{false, true} {
			b.Run(fmt.Sprintf("%dx%d axial=%v", size[0], size[1], axial), func(b *testing.B) {
				b.ReportAllocs()
				var r *Result
				for b.Loop() {
					var err error
					if r, err = Solve(mo, &Options{AxialStrain: axial}); err != nil {
						b.Fatal(err)
					}
				}
				b.ReportMetric(float64(r.Sweeps), "sweeps")
			})
		}
	}
}

// swayFrame returns a frame of the given bays (7 m) and storeys (3.6 m),
// fixed at the base, with a gravity case and a case along X.
func swayFrame(bays, storeys int) *frame.Model {
	mo := &frame.Model{Sections: []frame.Section{{Name: "col", E: 30e6, A: 0.25, I: 5.2e-3}, {Name: "beam", E: 30e6, A: 0.24, I: 7.2e-3}}}
	node := func(i, lv int) int { return lv*(bays+1) + i }
	for lv := 0; lv <= storeys; lv++ {
		for i := 0; i <= bays; i++ {
			sup := frame.Free
			if lv == 0 {
				sup = frame.Fixed
			}
			mo.Nodes = append(mo.Nodes, frame.Node{Name: fmt.Sprint(i, "-", lv), X: 7 * float64(i), Y: 3.6 * float64(lv), Support: sup})
		}
	}
	g, h := frame.Case{Name: "G"}, frame.Case{Name: "H"}
	for lv := 1; lv <= storeys; lv++ {
		for i := 0; i <= bays; i++ {
			mo.Members = append(mo.Members, frame.Member{Name: fmt.Sprint("c", i, "-", lv), Start: node(i, lv-1), End: node(i, lv)})
		}
		for i := range bays {
			g.MemberLoads = append(g.MemberLoads, frame.MemberLoad{Member: len(mo.Members), To: 7, W: 30, WEnd: 30})
			mo.Members = append(mo.Members, frame.Member{Name: fmt.Sprint("b", i, "-", lv), Start: node(i, lv), End: node(i+1, lv), Section: 1})
		}
		h.NodeLoads = append(h.NodeLoads, frame.NodeLoad{Node: node(0, lv), Fx: 20})
	}
	mo.Cases = []frame.Case{g, h}
	return mo
}
