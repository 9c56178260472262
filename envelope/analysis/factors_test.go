package analysis

import (
	"context"
	"math"
	"testing"

	"govern/combos"
	"govern/frame"
)

// Member factors are applied: in the two-span beam of ExampleRun, the
// live case's effects halved in every member give the envelopes of the
// live load halved (linearity, closed form), every pattern piece included;
// the statics check and the deflections stay those of the loads as given.
func TestMemberFactorsApplied(t *testing.T) {
	job := twoSpans()
	for m := range job.Model.Members {
		job.MemberFactors = append(job.MemberFactors, MemberFactor{Member: m, Case: 1, N: 0.5, V: 0.5, M: 0.5})
	}
	got, err := Run(context.Background(), job, Options{})
	if err != nil {
		t.Fatal(err)
	}
	half := twoSpans()
	half.Combinations[1].Terms[1].Factor = 0.8 // 1.6 × 0.5
	want, err := Run(context.Background(), half, Options{})
	if err != nil {
		t.Fatal(err)
	}
	for m := range got.Envelope.Members {
		for i, s := range got.Envelope.Members[m].Stations {
			w := want.Envelope.Members[m].Stations[i]
			if math.Abs(s.M.Max-w.M.Max) > closeTol*math.Abs(w.M.Max)+closeTol || math.Abs(s.M.Min-w.M.Min) > closeTol*math.Abs(w.M.Min)+closeTol ||
				math.Abs(s.V.Max-w.V.Max) > closeTol*math.Abs(w.V.Max)+closeTol {
				t.Fatalf("member %d station %d: M %g..%g V max %g, want M %g..%g V max %g", m, i, s.M.Min, s.M.Max, s.V.Max, w.M.Min, w.M.Max, w.V.Max)
			}
		}
	}
	for v, r := range got.Envelope.Reactions {
		if w := want.Envelope.Reactions[v]; math.Abs(r.Fy.Max-w.Fy.Max) > closeTol*math.Abs(w.Fy.Max) {
			t.Errorf("reaction %d: Fy max %g, want %g", v, r.Fy.Max, w.Fy.Max)
		}
	}
	// The statics check is of the loads as given: the live case's
	// reactions still carry its whole load, 5 kN/m × 12 m.
	for _, b := range got.Statics {
		if !b.OK() {
			t.Errorf("case %s out of balance", b.Case)
		}
	}
	t.Run("case reactions unreduced and reduced", func(t *testing.T) {
		// Two equal spans with w on both: end reactions 3wL/8, centre
		// 10wL/8 (three-moment equation, common practice); every member
		// factor 0.5 halves the reduced ones.
		const w, l = 5.0, 6.0
		rs := got.ReducedReactions(1)
		if len(rs) != 3 {
			t.Fatalf("%d reactions", len(rs))
		}
		for i, want := range []float64{3 * w * l / 8, 10 * w * l / 8, 3 * w * l / 8} {
			if r := rs[i]; math.Abs(r.Unreduced[1]-want) > 1e-9 || math.Abs(r.Reduced[1]-want/2) > 1e-9 {
				t.Errorf("node %d: Fy %g reduced %g, want %g and %g", r.Node, r.Unreduced[1], r.Reduced[1], want, want/2)
			}
		}
		// The load case results carry the same beside the unreduced
		// ones, node for node; the dead case none.
		cr := got.Cases()
		if cr[0].Reduced != nil || len(cr[1].Reduced) != 3 {
			t.Fatalf("reduced reactions of D %v, of L %v", cr[0].Reduced, cr[1].Reduced)
		}
		for i, r := range cr[1].Reduced {
			if r.Node != rs[i].Node || r.Fy != rs[i].Reduced[1] || cr[1].Reactions[i].Fy != rs[i].Unreduced[1] || r.Components != cr[1].Reactions[i].Components {
				t.Errorf("node %d: %+v beside %+v, want %+v", r.Node, r, cr[1].Reactions[i], rs[i])
			}
		}
		rd := got.ReducedReactions(0) // dead load: no factor
		if rd[1].Reduced != rd[1].Unreduced {
			t.Errorf("dead case reduced: %v, %v", rd[1].Reduced, rd[1].Unreduced)
		}
	})
}

// A column's factor on N enters the vertical reaction below it, on V the
// horizontal one and on M the moment: a fixed-base cantilever column
// under a lateral point load H at its top and a vertical one P gives
// Fx = −H, Fy = P, M = H·h counter-clockwise (statics); with factors 0.4, 0.6, 0.8 on N,
// V, M those are scaled each by its own.
func TestReducedReactionComponents(t *testing.T) {
	const h, H, P = 4.0, 10.0, 50.0
	job := &Job{
		Units: Units{Force: "kN", Length: "m"},
		Model: &frame.Model{
			Sections: []frame.Section{{Name: "C", E: 30e6, A: 0.16, I: 2e-3}},
			Nodes:    []frame.Node{{Name: "base", Support: frame.Fixed}, {Name: "top", Y: h}},
			Members:  []frame.Member{{Name: "col", Start: 0, End: 1}},
			Cases:    []frame.Case{{Name: "L", NodeLoads: []frame.NodeLoad{{Node: 1, Fx: H, Fy: -P}}}},
		},
		Cases:         []combos.Case{{Name: "L", Kind: combos.Live}},
		Combinations:  []combos.Combination{{Name: "L", Terms: []combos.Term{{Case: 0, Factor: 1}}}},
		Settings:      Settings{Stations: 3},
		MemberFactors: []MemberFactor{{Member: 0, Case: 0, N: 0.4, V: 0.6, M: 0.8}},
	}
	res, err := Run(context.Background(), job, Options{})
	if err != nil {
		t.Fatal(err)
	}
	r := res.ReducedReactions(0)[0]
	want := [3]float64{-0.6 * H, 0.4 * P, 0.8 * H * h}
	for d := range 3 {
		if math.Abs(r.Reduced[d]-want[d]) > 1e-9 {
			t.Errorf("component %d: %g, want %g (unreduced %v)", d, r.Reduced[d], want[d], r.Unreduced)
		}
	}
	// The envelope's reaction is the same (a variable case acts only
	// where adverse: Fx is its least).
	env := res.Envelope.Reactions[0]
	if math.Abs(env.Fy.Max-want[1]) > 1e-9 || math.Abs(env.Fx.Min-want[0]) > 1e-9 || math.Abs(env.M.Max-want[2]) > 1e-9 {
		t.Errorf("envelope reaction Fx %g Fy %g M %g, want %v", env.Fx.Min, env.Fy.Max, env.M.Max, want)
	}
}
