package analysis_test

import (
	"context"
	"fmt"

	"govern/combos"
	"govern/envelope/analysis"
	"govern/frame"
	"govern/patterns"
)

// A program builds a job in code and gets the envelopes: a beam of two
// equal spans L = 6 m on knife-edge supports, dead load D = 10 kN/m and
// live load L = 5 kN/m placed span by span, under 1.4D and 1.2D + 1.6L.
//
// By the three-moment equation (common practice), with w = 1.2D + 1.6L =
// 20 kN/m on both spans the moment at the middle support is −wL²/8 = −90
// kN·m; the largest sagging moment of the left span comes with the live
// load on that span only: M(x) = 48x − 10x², 57.6 kN·m at x = 2.4 m.
func ExampleRun() {
	const l = 6.0 // m
	udl := func(m int, w float64) frame.MemberLoad {
		return frame.MemberLoad{Member: m, To: l, W: w, WEnd: w} // kN/m, downward
	}
	job := &analysis.Job{
		Units: analysis.Units{Force: "kN", Length: "m"},
		Model: &frame.Model{
			Sections: []frame.Section{{Name: "B", E: 30e6, A: 0.24, I: 7.2e-3}},
			Nodes: []frame.Node{
				{Name: "a", Support: frame.Pinned},
				{Name: "b", X: l, Support: frame.Roller},
				{Name: "c", X: 2 * l, Support: frame.Roller},
			},
			Members: []frame.Member{{Name: "a-b", Start: 0, End: 1}, {Name: "b-c", Start: 1, End: 2}},
			Cases: []frame.Case{
				{Name: "D", MemberLoads: []frame.MemberLoad{udl(0, 10), udl(1, 10)}},
				{Name: "L", MemberLoads: []frame.MemberLoad{udl(0, 5), udl(1, 5)}},
			},
		},
		Cases: []combos.Case{{Name: "D", Kind: combos.Dead}, {Name: "L", Kind: combos.Live}},
		Combinations: []combos.Combination{
			{Name: "1.4D", Terms: []combos.Term{{Case: 0, Factor: 1.4}}},
			{Name: "1.2D+1.6L", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}}},
		},
		Patterned: []int{1}, // L, span by span
		Segments:  1,
		Patterns:  patterns.Exact,
		Settings:  analysis.Settings{Stations: 11},
	}
	res, err := analysis.Run(context.Background(), job, analysis.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	env := res.Envelope
	pieces := func(idx []int) []string {
		var names []string
		for _, p := range idx {
			names = append(names, env.Pieces[p].Name)
		}
		return names
	}
	for m, mem := range job.Model.Members {
		em := res.Shown(m)
		top, bottom := em.Stations[0], em.Stations[0]
		for _, st := range em.Stations {
			if st.M.Max > top.M.Max {
				top = st
			}
			if st.M.Min < bottom.M.Min {
				bottom = st
			}
		}
		fmt.Printf("%s: +M %.1f kN·m at x = %.1f m by %s, L on %v\n", mem.Name, top.M.Max, top.X, env.Combinations[top.M.MaxBy].Name, pieces(top.M.MaxSpans))
		fmt.Printf("%s: -M %.1f kN·m at x = %.1f m by %s, L on %v\n", mem.Name, bottom.M.Min, bottom.X, env.Combinations[bottom.M.MinBy].Name, pieces(bottom.M.MinSpans))
	}
	for _, b := range res.Statics {
		fmt.Printf("statics of %s: loads ΣFy %.1f kN, reactions ΣFy %.1f kN\n", b.Case, b.Applied.Fy, b.Reactions.Fy)
	}
	// Output:
	// a-b: +M 57.6 kN·m at x = 2.4 m by 1.2D+1.6L, L on [a-b]
	// a-b: -M -90.0 kN·m at x = 6.0 m by 1.2D+1.6L, L on [a-b b-c]
	// b-c: +M 57.6 kN·m at x = 3.6 m by 1.2D+1.6L, L on [b-c]
	// b-c: -M -90.0 kN·m at x = 0.0 m by 1.2D+1.6L, L on [a-b b-c]
	// statics of D: loads ΣFy -120.0 kN, reactions ΣFy 120.0 kN
	// statics of L: loads ΣFy -60.0 kN, reactions ΣFy 60.0 kN
}

// The unfactored results of each load case: a beam of two equal spans L =
// 6 m under a uniform load w, patterned or not, has the reactions 3wL/8,
// 10wL/8 and 3wL/8 and the moment −wL²/8 over the middle support
// (three-moment equation, common practice): for D = 10 kN/m 22.5, 75 and
// 22.5 kN and −45 kN·m.
func ExampleResult_Cases() {
	const l = 6.0
	udl := func(m int, w float64) frame.MemberLoad { return frame.MemberLoad{Member: m, To: l, W: w, WEnd: w} }
	job := &analysis.Job{
		Units: analysis.Units{Force: "kN", Length: "m"},
		Model: &frame.Model{
			Sections: []frame.Section{{Name: "B", E: 30e6, A: 0.24, I: 7.2e-3}},
			Nodes:    []frame.Node{{Name: "a", Support: frame.Pinned}, {Name: "b", X: l, Support: frame.Roller}, {Name: "c", X: 2 * l, Support: frame.Roller}},
			Members:  []frame.Member{{Name: "a-b", Start: 0, End: 1}, {Name: "b-c", Start: 1, End: 2}},
			Cases: []frame.Case{
				{Name: "D", MemberLoads: []frame.MemberLoad{udl(0, 10), udl(1, 10)}},
				{Name: "L", MemberLoads: []frame.MemberLoad{udl(0, 5), udl(1, 5)}},
			},
		},
		Cases:        []combos.Case{{Name: "D", Kind: combos.Dead}, {Name: "L", Kind: combos.Live}},
		Combinations: []combos.Combination{{Name: "1.2D+1.6L", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}}}},
		Patterned:    []int{1}, // L, span by span in the envelopes; whole in its case result
		Segments:     1,
		Patterns:     patterns.Exact,
		Settings:     analysis.Settings{Stations: 11},
	}
	res, err := analysis.Run(context.Background(), job, analysis.Options{})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, c := range res.Cases() {
		fmt.Printf("%s: reactions", c.Name)
		for _, r := range c.Reactions {
			fmt.Printf(" %s %.2f", job.Model.Nodes[r.Node].Name, r.Fy)
		}
		fmt.Printf(" kN; M over b %.2f kN·m\n", c.Ends[0].End.M)
	}
	// Output:
	// D: reactions a 22.50 b 75.00 c 22.50 kN; M over b -45.00 kN·m
	// L: reactions a 11.25 b 37.50 c 11.25 kN; M over b -22.50 kN·m
}
