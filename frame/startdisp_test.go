package frame

import (
	"fmt"
	"math"
	"testing"
)

// One pass for the start forces and the displacements gives, to the last
// bit, what the per-case calls give: EndForces' start forces (its ends
// zero) and the member's local displacements, in first order and in
// second order (a released end, rigid end zones, a spring), and fills the
// buffers whatever they held before.
func TestStartForcesAndDisplacementsAgreeWithPerCaseCalls(t *testing.T) {
	for _, second := range []bool{false, true} {
		t.Run(fmt.Sprintf("second order %v", second), func(t *testing.T) {
			mo := columnsFrame()
			var opt Options
			if second {
				mo.Members[1].Release = ReleaseStart
				mo.Members[2].OffsetStart, mo.Members[2].OffsetEnd = 0.3, 0.2
				mo.Members[4].SpringEnd = 2e4
				opt.Axial = make([]float64, len(mo.Members))
				for m := range opt.Axial {
					opt.Axial[m] = -150 + 20*float64(m%5)
				}
			}
			sol, err := SolveWith(mo, opt)
			if err != nil {
				t.Fatal(err)
			}
			nc := len(mo.Cases)
			ends, disp := make([][6]float64, nc), make([][6]float64, nc)
			loaded := 0
			for m := range mo.Members {
				for c := range nc { // stale values, which must not leak
					ends[c], disp[c] = [6]float64{1, 2, 3, 4, 5, 6}, [6]float64{7, 8, 9, 10, 11, 12}
				}
				sol.StartForcesAndDisplacementsEach(ends, disp, m)
				loaded += len(sol.CasesOn(m))
				for c := range nc {
					f := sol.EndForces(c, m)
					if want := [6]float64{f[0], f[1], f[2]}; ends[c] != want {
						t.Fatalf("member %d case %d: start forces %v, EndForces %v", m, c, ends[c], f)
					}
					if u := sol.localU(c, m); disp[c] != u {
						t.Fatalf("member %d case %d: displacements %v, localU %v", m, c, disp[c], u)
					}
				}
			}
			if loaded == 0 {
				t.Fatal("no case loads a member: the fixed-end forces are not checked")
			}
		})
	}
}

// BenchmarkStartForcesAndDisplacements measures every member's start
// forces and displacements in every case of the second-order solution of
// a 30 × 20 frame with a load case per beam (600 columns), in one pass
// ("one pass") and by StartForcesEach then DisplacementsEach ("two
// passes").
func BenchmarkStartForcesAndDisplacements(b *testing.B) {
	mo := pieceFrame(30, 20)
	axial := make([]float64, len(mo.Members))
	for m := range axial {
		axial[m] = -50
	}
	sol, err := SolveWith(mo, Options{Axial: axial})
	if err != nil {
		b.Fatal(err)
	}
	nc := len(mo.Cases)
	ends, disp := make([][6]float64, nc), make([][6]float64, nc)
	b.Run("one pass", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			for m := range mo.Members {
				sol.StartForcesAndDisplacementsEach(ends, disp, m)
			}
		}
	})
	b.Run("two passes", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			for m := range mo.Members {
				sol.StartForcesEach(ends, m)
				sol.DisplacementsEach(disp, m)
			}
		}
	})
}

// A cantilever column with a lateral load H and a compression P at its
// top, in second order: the start forces give the base moment, the top's
// local displacements its sway Δ (across the member), read together. The
// base moment is H·L + P·Δ by the statics of the deflected column; in
// first order (beam tables, from memory) it would be H·L with a sway of
// H·L³/(3EI).
func ExampleSolution_StartForcesAndDisplacementsEach() {
	const ei, l, p, h = 250.0, 10.0, 4.0, 0.045
	mo := &Model{
		Sections: []Section{{Name: "C", E: 2e8, A: 1, I: ei / 2e8}},
		Nodes:    []Node{{Name: "base", Support: Fixed}, {Name: "top", Y: l}},
		Members:  []Member{{Name: "column", Start: 0, End: 1}},
		Cases:    []Case{{Name: "P+H", NodeLoads: []NodeLoad{{Node: 1, Fx: h, Fy: -p}}}},
	}
	sol, err := SolveWith(mo, Options{Axial: []float64{-p}})
	if err != nil {
		fmt.Println(err)
		return
	}
	ends, disp := make([][6]float64, 1), make([][6]float64, 1)
	sol.StartForcesAndDisplacementsEach(ends, disp, 0)
	sway := math.Abs(disp[0][4] - disp[0][1])
	fmt.Printf("sway Δ = %.4f m (first order %.4f m)\n", sway, h*l*l*l/(3*ei))
	fmt.Printf("base moment %.4f kN·m, H·L + P·Δ = %.4f kN·m\n", math.Abs(ends[0][2]), h*l+p*sway)
	// Output:
	// sway Δ = 0.1691 m (first order 0.0600 m)
	// base moment 1.1265 kN·m, H·L + P·Δ = 1.1265 kN·m
}
