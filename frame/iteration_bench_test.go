package frame

import (
	"fmt"
	"testing"
)

// secondOrderWork is the work of one second-order combination of a
// regular frame with one load column per beam (pieceFrame): the
// combination as one case (every beam loaded, and a lateral load at each
// level), its first-order axial forces, and the pieces.
func secondOrderWork(b *testing.B, bays, storeys int) (combined *Model, axial []float64, pieces []Case) {
	mo := pieceFrame(bays, storeys)
	pieces = mo.Cases
	all := Case{Name: "combination"}
	for _, c := range pieces {
		all.MemberLoads = append(all.MemberLoads, c.MemberLoads...)
	}
	for v := range mo.Nodes {
		if mo.Nodes[v].Support == Free {
			all.NodeLoads = append(all.NodeLoads, NodeLoad{Node: v, Fx: 5})
		}
	}
	c := *mo
	c.Cases = []Case{all}
	sol, err := Solve(&c)
	if err != nil {
		b.Fatal(err)
	}
	axial = make([]float64, len(mo.Members))
	for m := range axial {
		f := sol.EndForces(0, m)
		axial[m] = (-f[0] + f[3]) / 2
	}
	return &c, axial, pieces
}

// BenchmarkSecondOrderCombination measures the solves of one second-order
// combination as the analysis makes them (envelope/analysis, iterate and
// envelopes): a step of the iteration (the combination's one column with
// a geometric stiffness, no condition estimate), the last solve (with
// the estimate), and the pieces solved on that factor; and the whole
// combination, two steps, the last solve and the pieces, the pieces'
// memory taken from the combination before (SolveCasesReusing).
func BenchmarkSecondOrderCombination(b *testing.B) {
	for _, size := range []struct{ bays, storeys int }{{10, 10}, {30, 20}, {30, 60}} {
		mo, axial, pieces := secondOrderWork(b, size.bays, size.storeys)
		name := fmt.Sprintf("%dx%d", size.bays, size.storeys)
		b.Run(name+"/step", func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := SolveWith(mo, Options{Axial: axial, SkipCondition: true}); err != nil {
					b.Fatal(err)
				}
			}
		})
		b.Run(name+"/last", func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := SolveWith(mo, Options{Axial: axial}); err != nil {
					b.Fatal(err)
				}
			}
		})
		last, err := SolveWith(mo, Options{Axial: axial})
		if err != nil {
			b.Fatal(err)
		}
		b.Run(name+"/pieces", func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := last.SolveCases(pieces); err != nil {
					b.Fatal(err)
				}
			}
		})
		b.Run(name+"/combination", func(b *testing.B) {
			b.ReportAllocs()
			var spent *Solution
			for b.Loop() {
				for range 2 {
					if _, err := SolveWith(mo, Options{Axial: axial, SkipCondition: true}); err != nil {
						b.Fatal(err)
					}
				}
				last, err := SolveWith(mo, Options{Axial: axial})
				if err != nil {
					b.Fatal(err)
				}
				if spent, err = solvePieces(last, pieces, spent); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// solvePieces solves pieces on last's factor, in spent's memory.
func solvePieces(last *Solution, pieces []Case, spent *Solution) (*Solution, error) {
	return last.SolveCasesReusing(pieces, spent)
}
