package reduction_test

import (
	"fmt"

	"govern/envelope/reduction"
	"govern/frame"
	"govern/frame/units"
)

// ASCE/SEI 7-16 4.7.2: an interior column (K_LL = 4) under two floors of
// 9 m × 9 m bays, and EN 1991-1-1 αA for 50 m² of category B.
func ExampleFloor() {
	f, limit := reduction.Floor(reduction.SI, 4, 162, 2, reduction.Office, 2.4)
	fmt.Printf("%.4f %q\n", f, limit)
	a, _ := reduction.AlphaA("B", 0.7, 50)
	fmt.Printf("%.2f\n", a)
	// Output:
	// 0.4295 ""
	// 0.70
}

// The factors of a floor live case in a one-bay, one-storey frame: the
// beam of 6 m × 9 m = 54 m² (K_LL 2) and its two columns with half each
// (K_LL 4): K_LL·A_T = 108 m² for all three, 0.25 + 4.57/√108 = 0.68976.
func ExampleFactors() {
	mo := &frame.Model{
		Sections: []frame.Section{{Name: "S", E: 30e6, A: 0.2, I: 5e-3}},
		Nodes:    []frame.Node{{Name: "a", Support: frame.Fixed}, {Name: "b", Y: 3.5}, {Name: "c", X: 6, Y: 3.5}, {Name: "d", X: 6, Support: frame.Fixed}},
		Members:  []frame.Member{{Name: "ab", Start: 0, End: 1}, {Name: "bc", Start: 1, End: 2}, {Name: "dc", Start: 3, End: 2}},
		Cases:    []frame.Case{{Name: "L", MemberLoads: []frame.MemberLoad{{Member: 1, To: 6, W: 21.6, WEnd: 21.6}}}},
	}
	sys, _ := units.NewSystem("kN", "m", "")
	c := reduction.Case{Rule: reduction.ASCE716, Lo: 2.4, Width: 9, Loaded: []bool{false, true, false}}
	for _, f := range reduction.Factors(mo, sys, nil, c) {
		fmt.Printf("%s N %.4f, A_T %g m², K_LL %g, %d floor\n", mo.Members[f.Member].Name, f.N, f.Basis.Area, f.Basis.KLL, f.Basis.Floors)
	}
	// Output:
	// ab N 0.6897, A_T 27 m², K_LL 4, 1 floor
	// bc N 0.6897, A_T 54 m², K_LL 2, 1 floor
	// dc N 0.6897, A_T 27 m², K_LL 4, 1 floor
}
