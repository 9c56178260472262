package frame

import (
	"fmt"
	"math"
	"math/rand/v2"
	"testing"
)

// DisplacementsTo gives, case by case, what Displacement gives: solved,
// imposed (a settlement), held (zero) and free rotations (NaN); and
// DisplacementTo gives each direction of it alone, leaving the other two
// of dst as they were.
func TestDisplacementsToMatchesDisplacement(t *testing.T) {
	hinge := &Model{Sections: []Section{{Name: "S", E: 2e8, A: 1e-2, I: 1e-4}},
		Nodes: []Node{{Name: "a", Support: Fixed}, {Name: "b", X: 4}, {Name: "c", X: 8, Support: Fixed}},
		Members: []Member{{Name: "ab", Start: 0, End: 1, Release: ReleaseEnd},
			{Name: "bc", Start: 1, End: 2, Release: ReleaseStart}},
		Cases: []Case{{Name: "P", NodeLoads: []NodeLoad{{Node: 1, Fy: -10}}},
			{Name: "settlement", Displacements: []NodeDisplacement{{Node: 2, Uy: -0.01}}}}}
	for _, tc := range []struct {
		name string
		mo   *Model
	}{{"every load", columnsFrame()}, {"hinge", hinge}, {"sloping, drawn right to left, released", oddFrame(rand.New(rand.NewPCG(4, 4)), 9)}} {
		t.Run(tc.name, func(t *testing.T) {
			sol, err := Solve(tc.mo)
			if err != nil {
				t.Fatal(err)
			}
			dst := make([][3]float64, len(tc.mo.Cases))
			nan := 0
			for v := range tc.mo.Nodes {
				sol.DisplacementsTo(dst, v)
				for c := range dst {
					ux, uy, rz := sol.Displacement(c, v)
					want := [3]float64{ux, uy, rz}
					for d := range 3 {
						// To the bit: a zero keeps its sign, a NaN is Displacement's.
						if math.Float64bits(dst[c][d]) != math.Float64bits(want[d]) {
							t.Fatalf("node %d, case %d, direction %d: %v, Displacement gives %v", v, c, d, dst[c][d], want[d])
						}
						if math.IsNaN(want[d]) {
							nan++
						}
					}
				}
			}
			one := make([][3]float64, len(tc.mo.Cases))
			for v := range tc.mo.Nodes {
				for d := range 3 {
					const mark = 12345.5 // what the other directions keep
					for c := range one {
						one[c] = [3]float64{mark, mark, mark}
					}
					sol.DisplacementTo(one, v, d)
					for c := range one {
						ux, uy, rz := sol.Displacement(c, v)
						want := [3]float64{mark, mark, mark}
						want[d] = [3]float64{ux, uy, rz}[d]
						for e := range 3 {
							if math.Float64bits(one[c][e]) != math.Float64bits(want[e]) {
								t.Fatalf("DisplacementTo node %d, case %d, direction %d: component %d is %v, want %v", v, c, d, e, one[c][e], want[e])
							}
						}
					}
				}
			}
			if tc.name == "hinge" && nan != len(tc.mo.Cases) {
				t.Errorf("%d free rotations, want one per case", nan)
			}
		})
	}
}

// BenchmarkDisplacementsTo measures every node's displacements in every
// case, as the node envelopes read them.
func BenchmarkDisplacementsTo(b *testing.B) {
	for _, size := range []struct{ bays, storeys int }{{10, 10}, {30, 60}} {
		mo := pieceFrame(size.bays, size.storeys)
		sol, err := Solve(mo)
		if err != nil {
			b.Fatal(err)
		}
		dst := make([][3]float64, len(mo.Cases))
		b.Run(fmt.Sprintf("%dx%d/%d-columns", size.bays, size.storeys, len(mo.Cases)), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				for v := range mo.Nodes {
					sol.DisplacementsTo(dst, v)
				}
			}
		})
	}
}
