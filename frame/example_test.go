package frame_test

import (
	"fmt"

	"govern/frame"
)

// A beam fixed at both ends under a uniform load w has end moments −wL²/12
// and a midspan moment wL²/24 (common practice; beam tables).
func ExampleSolve() {
	const l, w = 6.0, 10.0 // m, kN/m
	mo := &frame.Model{
		Sections: []frame.Section{{Name: "S", E: 200e6, A: 5e-3, I: 8e-5}},
		Nodes:    []frame.Node{{Name: "a", Support: frame.Fixed}, {Name: "b", X: l, Support: frame.Fixed}},
		Members:  []frame.Member{{Name: "a-b", Start: 0, End: 1}},
		Cases: []frame.Case{{Name: "w",
			MemberLoads: []frame.MemberLoad{{Member: 0, From: 0, To: l, W: w, WEnd: w}}}},
	}
	sol, err := frame.Solve(mo)
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, x := range []float64{0, l / 4, l / 2, l} {
		f := sol.At(0, 0, x)
		fmt.Printf("x = %.1f m: M = %6.2f kN·m\n", x, f.M)
	}
	fmt.Printf("V at the ends: %.2f kN, %.2f kN\n", sol.At(0, 0, 0).V, sol.At(0, 0, l).V)
	_, fy, m := sol.Reaction(0, 0)
	fmt.Printf("left support: Fy = %.2f kN, M = %.2f kN·m\n", fy, m)
	// Output:
	// x = 0.0 m: M = -30.00 kN·m
	// x = 1.5 m: M =   3.75 kN·m
	// x = 3.0 m: M =  15.00 kN·m
	// x = 6.0 m: M = -30.00 kN·m
	// V at the ends: 30.00 kN, -30.00 kN
	// left support: Fy = 30.00 kN, M = 30.00 kN·m
}

// The midspan deflection of a simple span under a uniform load is
// 5wL⁴/384EI downward (AISC Steel Construction Manual, Table 3-23, case 1;
// recalled from memory). Deflection is along local y, up for a beam drawn
// left to right, and relative to the chord joining the member's ends.
func ExampleSolution_Deflection() {
	const l, w = 6.0, 10.0 // m, kN/m
	const e, i = 200e6, 8e-5
	mo := &frame.Model{
		Sections: []frame.Section{{Name: "S", E: e, A: 5e-3, I: i}},
		Nodes:    []frame.Node{{Name: "a", Support: frame.Pinned}, {Name: "b", X: l, Support: frame.Roller}},
		Members:  []frame.Member{{Name: "a-b", Start: 0, End: 1}},
		Cases: []frame.Case{{Name: "w",
			MemberLoads: []frame.MemberLoad{{Member: 0, From: 0, To: l, W: w, WEnd: w}}}},
	}
	sol, err := frame.Solve(mo)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("computed:   %.3f mm\n", 1000*sol.Deflection(0, 0, l/2))
	fmt.Printf("5wL⁴/384EI: %.3f mm\n", 1000*5*w*l*l*l*l/(384*e*i))
	// Output:
	// computed:   -10.547 mm
	// 5wL⁴/384EI: 10.547 mm
}

// Before solving a large model a program can ask what it would take: a
// portal frame on fixed bases has its two top nodes free, 6 equations,
// coupled through the beam (half-bandwidth 5 at most), far within the
// limit.
func ExampleEstimateMemory() {
	mo := &frame.Model{
		Sections: []frame.Section{{Name: "S", E: 200e6, A: 5e-3, I: 8e-5}},
		Nodes: []frame.Node{{Name: "a", Support: frame.Fixed}, {Name: "b", Y: 4}, {Name: "c", X: 6, Y: 4},
			{Name: "d", X: 6, Support: frame.Fixed}},
		Members: []frame.Member{{Name: "a-b", Start: 0, End: 1}, {Name: "b-c", Start: 1, End: 2}, {Name: "c-d", Start: 2, End: 3}},
		Cases:   []frame.Case{{Name: "H", NodeLoads: []frame.NodeLoad{{Node: 1, Fx: 10}}}},
	}
	bytes, info, err := frame.EstimateMemory(mo, frame.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Println(info.Equations, "equations, half-bandwidth at most 5:", info.Bandwidth <= 5)
	fmt.Println("within the limit:", bytes <= frame.MaxMemory)
	// Output:
	// 6 equations, half-bandwidth at most 5: true
	// within the limit: true
}

// A cantilever column, EI = 250 kN·m², L = 10 m, under P = 4 kN and
// H = 0.045 kN at its top: solved with the geometric stiffness of its axial
// force it sways H(tan kL − kL)/(P k) = 0.1691 m with a base moment of
// H tan(kL)/k = 1.127 kN·m (first order 0.45), and it buckles at
// π²EI/(4L²) = 1.542 P (Timoshenko & Gere, Theory of Elastic Stability).
func ExampleCriticalFactor() {
	mo := &frame.Model{
		Sections: []frame.Section{{Name: "C", E: 200e6, A: 0.01, I: 1.25e-6}},
		Nodes:    []frame.Node{{Name: "base", Support: frame.Fixed}, {Name: "top", Y: 10}},
		Members:  []frame.Member{{Name: "col", Start: 0, End: 1}},
		Cases:    []frame.Case{{Name: "P+H", NodeLoads: []frame.NodeLoad{{Node: 1, Fx: 0.045, Fy: -4}}}},
	}
	axial := []float64{-4} // kN, tension positive
	sol, err := frame.SolveWith(mo, frame.Options{Axial: axial})
	if err != nil {
		fmt.Println(err)
		return
	}
	ux, _, _ := sol.Displacement(0, 1)
	_, _, m := sol.Reaction(0, 0)
	a, err := frame.CriticalFactor(mo, axial)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("sway %.4f m, base moment %.3f kN·m, αcr %.3f\n", ux, m, a)
	// Output:
	// sway 0.1691 m, base moment 1.127 kN·m, αcr 1.542
}

// One factor of a pinned strut's stiffness (EI = 250 kN·m², L = 10 m)
// serves every set of axial forces: it buckles at π²EI/L² = 24.674 kN, so
// at 4 kN αcr = 6.1685 and at 8 kN half that (closed form; Timoshenko &
// Gere, Theory of Elastic Stability, the Euler strut); the four
// sub-elements of SubElements reach it from above within 0.06 %.
func ExampleNewBuckling() {
	mo := &frame.Model{
		Sections: []frame.Section{{Name: "S", E: 200e6, A: 0.01, I: 1.25e-6}},
		Nodes:    []frame.Node{{Name: "A", Support: frame.Pinned}, {Name: "B", X: 10, Support: frame.HoldY}},
		Members:  []frame.Member{{Name: "AB", Start: 0, End: 1}},
	}
	b, err := frame.NewBuckling(mo)
	if err != nil {
		fmt.Println(err)
		return
	}
	as, err := b.Factors([][]float64{{-4}, {-8}, {3}}) // kN, tension positive
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("αcr %.4f, %.4f, %v\n", as[0], as[1], as[2])
	// Output:
	// αcr 6.1717, 3.0858, +Inf
}

// The per-member access of a second-order solution: a cantilever column,
// EI = 250, L = 10, fixed at its base, with P = 4 down and H = 0.045
// across at its top, has the base moment H·tan(kL)/k = 1.126536,
// k = √(P/EI) (Timoshenko & Gere, Theory of Elastic Stability; the member
// with its four sub-elements gives it within 3e-5). Along the member the
// moment is that of its end forces, −f₂ + x·f₁, plus N·(v(x) − v(0)), from
// its nodes' displacements and its weights: zero at the base, and at the
// top it brings the moment back to zero. Their sum is what
// Solution.StationsTo gives, to the last bit.
func ExampleSolution_SecondFrom() {
	const ei, l, p, h = 250.0, 10.0, 4.0, 0.045
	mo := &frame.Model{
		Sections: []frame.Section{{Name: "C", E: 2e8, A: 1, I: ei / 2e8}},
		Nodes:    []frame.Node{{Name: "base", Support: frame.Fixed}, {Name: "top", Y: l}},
		Members:  []frame.Member{{Name: "column", Start: 0, End: 1}},
		Cases:    []frame.Case{{Name: "P+H", NodeLoads: []frame.NodeLoad{{Node: 1, Fx: h, Fy: -p}}}},
	}
	sol, err := frame.SolveWith(mo, frame.Options{Axial: []float64{-p}})
	if err != nil {
		fmt.Println(err)
		return
	}
	xs := []float64{0, l / 2, l}
	ends := make([][6]float64, 1)
	disp := make([][6]float64, 1)
	w := make([][6]float64, len(xs))
	sol.StartForcesEach(ends, 0)
	sol.DisplacementsEach(disp, 0)
	n := sol.SecondOrderWeightsTo(w, 0, xs)
	st := make([]frame.Forces, len(xs))
	sol.StationsFrom(st, 0, 0, &ends[0], xs)
	part := make([]float64, len(xs))
	for i := range st {
		part[i] = st[i].M
	}
	sol.SecondFrom(st, nil, 0, 0, &disp[0], w, xs)
	want := make([]frame.Forces, len(xs))
	sol.StationsTo(want, 0, xs)
	fmt.Printf("N = %.1f kN\n", n)
	// (+ 0 prints N·0 at the base without a minus sign.)
	for i, x := range xs {
		fmt.Printf("x = %4.1f m: M = %9.6f %+9.6f = %9.6f kN·m, as StationsTo: %v\n", x, part[i], n*frame.Sway(&w[i], &disp[0])+0, st[i].M, st[i] == want[i])
	}
	// Output:
	// N = -4.0 kN
	// x =  0.0 m: M = -1.126510 +0.000000 = -1.126510 kN·m, as StationsTo: true
	// x =  5.0 m: M = -0.901510 +0.203186 = -0.698324 kN·m, as StationsTo: true
	// x = 10.0 m: M = -0.676510 +0.676510 =  0.000000 kN·m, as StationsTo: true
}

// More cases on the stiffness already factored: a fixed-ended beam solved
// for a uniform load, then for a point load P at midspan, whose end
// moments are −PL/8 (beam tables; from memory).
func ExampleSolution_SolveCases() {
	const l, w, p = 6.0, 10.0, 40.0 // m, kN/m, kN
	mo := &frame.Model{
		Sections: []frame.Section{{Name: "S", E: 200e6, A: 5e-3, I: 8e-5}},
		Nodes:    []frame.Node{{Name: "a", Support: frame.Fixed}, {Name: "b", X: l, Support: frame.Fixed}},
		Members:  []frame.Member{{Name: "a-b", Start: 0, End: 1}},
		Cases: []frame.Case{{Name: "w",
			MemberLoads: []frame.MemberLoad{{Member: 0, From: 0, To: l, W: w, WEnd: w}}}},
	}
	sol, err := frame.Solve(mo)
	if err != nil {
		fmt.Println(err)
		return
	}
	more, err := sol.SolveCases([]frame.Case{{Name: "P",
		MemberLoads: []frame.MemberLoad{{Member: 0, Point: true, At: l / 2, P: p}}}})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s: M at the start %.2f kN·m\n", sol.Model().Cases[0].Name, sol.At(0, 0, 0).M)
	fmt.Printf("%s: M at the start %.2f kN·m, at midspan %.2f kN·m\n", more.Model().Cases[0].Name, more.At(0, 0, 0).M, more.At(0, 0, l/2).M)
	// Output:
	// w: M at the start -30.00 kN·m
	// P: M at the start -30.00 kN·m, at midspan 30.00 kN·m
}

// A fixed-end beam's cases solved one set after another on its factor,
// each set in the memory of the one before, once that is read: the
// midspan moment of a central point load P is P l / 8 (a handbook
// formula, from memory).
func ExampleSolution_SolveCasesReusing() {
	const l = 6.0 // m
	mo := &frame.Model{
		Sections: []frame.Section{{Name: "S", E: 200e6, A: 5e-3, I: 8e-5}},
		Nodes:    []frame.Node{{Name: "a", Support: frame.Fixed}, {Name: "b", X: l, Support: frame.Fixed}},
		Members:  []frame.Member{{Name: "a-b", Start: 0, End: 1}},
	}
	sol, err := frame.Solve(mo)
	if err != nil {
		fmt.Println(err)
		return
	}
	var spent *frame.Solution
	for _, p := range []float64{40, 80} { // kN
		set, err := sol.SolveCasesReusing([]frame.Case{{Name: fmt.Sprintf("P = %g kN", p),
			MemberLoads: []frame.MemberLoad{{Member: 0, Point: true, At: l / 2, P: p}}}}, spent)
		if err != nil {
			fmt.Println(err)
			return
		}
		fmt.Printf("%s: M at midspan %.2f kN·m\n", set.Model().Cases[0].Name, set.At(0, 0, l/2).M)
		spent = set // read no more
	}
	// Output:
	// P = 40 kN: M at midspan 30.00 kN·m
	// P = 80 kN: M at midspan 60.00 kN·m
}
