package envelope_test

import (
	"fmt"

	"govern/combos"
	"govern/envelope"
	"govern/frame"
	"govern/patterns"
)

// A beam continuous over two equal spans of 8 m, with dead load 20 kN/m
// and live load 15 kN/m on both spans, the live load placed span by span,
// under 1.2D + 1.6L. Closed forms for two equal spans (AISC Steel
// Construction Manual, Table 3-23, recalled from memory): under w on both
// spans the support moment is -wL²/8 and the moment at 7L/16 is
// 35/512 wL²; with one span loaded the moment at 7L/16 of that span is
// 49/512 wL². So the support takes live load on both spans,
// -(1.2·20 + 1.6·15)·8²/8 = -384 kN·m, and the span at 7L/16 = 3.5 m takes
// it on its own span only, 1.2·20·8²·35/512 + 1.6·15·8²·49/512 = 105 + 147
// = 252 kN·m.
func ExampleCompute() {
	const l = 8.0 // m
	udl := func(m int, w float64) frame.MemberLoad { return frame.MemberLoad{Member: m, To: l, W: w, WEnd: w} }
	mo := &frame.Model{
		Sections: []frame.Section{{Name: "B", E: 30e6, A: 0.18, I: 5.4e-3}}, // kN/m², m², m⁴
		Nodes: []frame.Node{
			{Name: "A", Support: frame.Pinned}, {Name: "B", X: l, Support: frame.Roller}, {Name: "C", X: 2 * l, Support: frame.Roller},
		},
		Members: []frame.Member{{Name: "AB", Start: 0, End: 1}, {Name: "BC", Start: 1, End: 2}},
		Cases: []frame.Case{
			{Name: "D", MemberLoads: []frame.MemberLoad{udl(0, 20), udl(1, 20)}},
			{Name: "L", MemberLoads: []frame.MemberLoad{udl(0, 15), udl(1, 15)}},
		},
	}
	// Case L (index 1) is placed span by span, one piece per beam.
	lay, err := patterns.Expand(mo, []int{1}, 1, patterns.Exact)
	if err != nil {
		fmt.Println(err)
		return
	}
	sol, err := frame.Solve(lay.Model)
	if err != nil {
		fmt.Println(err)
		return
	}
	cs := []combos.Combination{{Name: "1.2D+1.6L", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}}}}
	set := envelope.Settings{Stations: 17, Kinds: []combos.Kind{combos.Dead, combos.Live}} // every L/16
	env, err := envelope.Compute(sol, cs, set, lay)
	if err != nil {
		fmt.Println(err)
		return
	}
	spans := func(idx []int) []string {
		var s []string
		for _, p := range idx {
			s = append(s, env.Pieces[p].Name)
		}
		return s
	}
	span, support := env.Members[0].Stations[7], env.Members[0].Stations[16]
	fmt.Printf("AB at x = %.1f m: M max %.1f kN·m by %s, live load on %v\n",
		span.X, span.M.Max, cs[span.M.MaxBy].Name, spans(span.M.MaxSpans))
	fmt.Printf("AB at x = %.1f m: M min %.1f kN·m by %s, live load on %v\n",
		support.X, support.M.Min, cs[support.M.MinBy].Name, spans(support.M.MinSpans))
	// Output:
	// AB at x = 3.5 m: M max 252.0 kN·m by 1.2D+1.6L, live load on [AB]
	// AB at x = 8.0 m: M min -384.0 kN·m by 1.2D+1.6L, live load on [AB BC]
}

// The beam of ExampleCompute: the largest sagging moment of AB, at
// x = 3.5 m, has the live load on AB alone; in that same state the
// moment at B is the dead load's -wL²/8 on both spans and the live load's
// -wL²/16 on one span (AISC Manual Table 3-23, recalled from memory):
// -1.2·20·8²/8 - 1.6·15·8²/16 = -192 - 96 = -288 kN·m; at the pin A, 0.
func ExampleEndMoments() {
	const l = 8.0 // m
	udl := func(m int, w float64) frame.MemberLoad { return frame.MemberLoad{Member: m, To: l, W: w, WEnd: w} }
	mo := &frame.Model{
		Sections: []frame.Section{{Name: "B", E: 30e6, A: 0.18, I: 5.4e-3}},
		Nodes: []frame.Node{
			{Name: "A", Support: frame.Pinned}, {Name: "B", X: l, Support: frame.Roller}, {Name: "C", X: 2 * l, Support: frame.Roller},
		},
		Members: []frame.Member{{Name: "AB", Start: 0, End: 1}, {Name: "BC", Start: 1, End: 2}},
		Cases: []frame.Case{
			{Name: "D", MemberLoads: []frame.MemberLoad{udl(0, 20), udl(1, 20)}},
			{Name: "L", MemberLoads: []frame.MemberLoad{udl(0, 15), udl(1, 15)}},
		},
	}
	lay, err := patterns.Expand(mo, []int{1}, 1, patterns.Exact)
	if err != nil {
		fmt.Println(err)
		return
	}
	sol, err := frame.Solve(lay.Model)
	if err != nil {
		fmt.Println(err)
		return
	}
	cs := []combos.Combination{{Name: "1.2D+1.6L", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}}}}
	set := envelope.Settings{Stations: 17, Kinds: []combos.Kind{combos.Dead, combos.Live}}
	env, err := envelope.Compute(sol, cs, set, lay)
	if err != nil {
		fmt.Println(err)
		return
	}
	st := env.Members[0].Stations[7]
	ends, ok := envelope.EndMoments(sol, cs, set, lay, 0, st.X, st.M.MaxBy, 2, true, st.M.Max)
	fmt.Printf("M max %.1f kN·m at x = %.1f m; in its state M at A %.1f, at B %.1f kN·m (%v)\n", st.M.Max, st.X, ends[0]+0, ends[1], ok)
	// Output:
	// M max 252.0 kN·m at x = 3.5 m; in its state M at A 0.0, at B -288.0 kN·m (true)
}

// The beam of ExampleCompute: the reaction at the middle support B as a
// quantity of its own. For two equal spans under w on both it is
// 10/8 wL, under w on one span 5/8 wL (AISC Manual Table 3-23, recalled
// from memory): the largest, with the live load on both spans,
// 10/8 (1.2·20 + 1.6·15) 8 = 480 kN; the smallest, the live load on
// neither, 10/8 · 1.2·20 · 8 = 240 kN.
func ExampleValuesRows() {
	const l = 8.0 // m
	udl := func(m int, w float64) frame.MemberLoad { return frame.MemberLoad{Member: m, To: l, W: w, WEnd: w} }
	mo := &frame.Model{
		Sections: []frame.Section{{Name: "B", E: 30e6, A: 0.18, I: 5.4e-3}},
		Nodes: []frame.Node{
			{Name: "A", Support: frame.Pinned}, {Name: "B", X: l, Support: frame.Roller}, {Name: "C", X: 2 * l, Support: frame.Roller},
		},
		Members: []frame.Member{{Name: "AB", Start: 0, End: 1}, {Name: "BC", Start: 1, End: 2}},
		Cases: []frame.Case{
			{Name: "D", MemberLoads: []frame.MemberLoad{udl(0, 20), udl(1, 20)}},
			{Name: "L", MemberLoads: []frame.MemberLoad{udl(0, 15), udl(1, 15)}},
		},
	}
	lay, err := patterns.Expand(mo, []int{1}, 1, patterns.Exact)
	if err != nil {
		fmt.Println(err)
		return
	}
	sol, err := frame.Solve(lay.Model)
	if err != nil {
		fmt.Println(err)
		return
	}
	cs := []combos.Combination{{Name: "1.2D+1.6L", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}}}}
	set := envelope.Settings{Stations: 2, Kinds: []combos.Kind{combos.Dead, combos.Live}}
	// One quantity, one component: Fy at node B in every column.
	out, err := envelope.ValuesRows(sol, cs, []int{0}, set, lay, 1, 1,
		func(_ int, row, _ [][3]float64) {
			for c := range row {
				_, fy, _ := sol.Reaction(c, 1)
				row[c] = [3]float64{fy}
			}
		},
		func(_, _ int) string { return "Fy at B" })
	if err != nil {
		fmt.Println(err)
		return
	}
	fy := out[0][0]
	fmt.Printf("Fy at B: largest %.1f kN (%d spans loaded), smallest %.1f kN (%d)\n", fy.Max, len(fy.MaxSpans), fy.Min, len(fy.MinSpans))
	// Output:
	// Fy at B: largest 480.0 kN (2 spans loaded), smallest 240.0 kN (0)
}
