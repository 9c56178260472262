package distribution_test

import (
	"fmt"

	"govern/frame"
	"govern/frame/distribution"
)

// Two equal spans under a uniform load w have a support moment of −wL²/8
// (common practice; beam tables). Moment distribution gets it from the
// fixed-end moments ±wL²/12 and the far ends' pinned stiffness 3EI/L.
func ExampleSolve() {
	const l, w = 6.0, 10.0 // m, kN/m
	mo := &frame.Model{
		Sections: []frame.Section{{Name: "S", E: 200e6, A: 5e-3, I: 8e-5}},
		Nodes: []frame.Node{{Name: "a", Support: frame.Pinned}, {Name: "b", X: l, Support: frame.Roller},
			{Name: "c", X: 2 * l, Support: frame.Roller}},
		Members: []frame.Member{{Name: "a-b", Start: 0, End: 1}, {Name: "b-c", Start: 1, End: 2}},
		Cases: []frame.Case{{Name: "w", MemberLoads: []frame.MemberLoad{
			{Member: 0, To: l, W: w, WEnd: w}, {Member: 1, To: l, W: w, WEnd: w}}}},
	}
	r, err := distribution.Solve(mo, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	for m := range mo.Members {
		s, e := r.EndMoments(0, m)
		fmt.Printf("%s: end moments %.2f, %.2f kN·m (counter-clockwise on the member)\n", mo.Members[m].Name, s, e)
	}
	_, e := r.EndMoments(0, 0)
	fmt.Printf("support moment at b: %.2f kN·m = -wL²/8\n", e)
	// Output:
	// a-b: end moments 0.00, -45.00 kN·m (counter-clockwise on the member)
	// b-c: end moments 45.00, 0.00 kN·m (counter-clockwise on the member)
	// support moment at b: -45.00 kN·m = -wL²/8
}
