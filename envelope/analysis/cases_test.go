package analysis

import (
	"context"
	"fmt"
	"math"
	"runtime"
	"slices"
	"testing"

	"govern/combos"
	"govern/frame"
	"govern/patterns"
)

// one is a job of a single member a-b of length l with case "P" holding
// loads, alone in its one combination.
func one(nodes []frame.Node, loads []frame.MemberLoad) *Job {
	return &Job{
		Units: Units{Force: "kN", Length: "m"},
		Model: &frame.Model{
			Sections: []frame.Section{{Name: "B", E: 200e6, A: 1e-2, I: 2e-4}},
			Nodes:    nodes,
			Members:  []frame.Member{{Name: "a-b", Start: 0, End: 1}},
			Cases:    []frame.Case{{Name: "P", MemberLoads: loads}},
		},
		Cases:        []combos.Case{{Name: "P", Kind: combos.Dead}},
		Combinations: []combos.Combination{{Name: "1.0P", Terms: []combos.Term{{Case: 0, Factor: 1}}}},
		Segments:     1, Patterns: patterns.Exact,
		Settings: Settings{Stations: 5},
	}
}

func near(t *testing.T, what string, got, want, scale float64) {
	t.Helper()
	if math.Abs(got-want) > closeTol*scale {
		t.Errorf("%s = %.10g, want %.10g", what, got, want)
	}
}

func cases(t *testing.T, job *Job) []CaseResult {
	t.Helper()
	res, err := Run(context.Background(), job, Options{})
	if err != nil {
		t.Fatal(err)
	}
	return res.Cases()
}

// TestCasesFixedBeam: a beam fixed at both ends under a uniform load w
// over its span L has end moments −wL²/12 (hogging), end shears wL/2 and
// reactions wL/2 and wL²/12 (AISC Steel Construction Manual, Table 3-23,
// fixed at both ends with a uniform load; from memory). Drawn from right
// to left, the member's own axes turn over: its local −y face is the top,
// so the hogging end moments are positive and the shears change sign.
func TestCasesFixedBeam(t *testing.T) {
	const l, w = 8.0, 12.0
	for _, tc := range []struct {
		name  string
		ax    float64 // x of node a; b is at the other end
		sign  float64 // +1 left to right, −1 right to left
		leftA bool
	}{
		{"left to right", 0, 1, true},
		{"right to left", l, -1, false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			nodes := []frame.Node{{Name: "a", X: tc.ax, Support: frame.Fixed}, {Name: "b", X: l - tc.ax, Support: frame.Fixed}}
			cs := cases(t, one(nodes, []frame.MemberLoad{{Member: 0, To: l, W: w, WEnd: w}}))
			if len(cs) != 1 || cs[0].Name != "P" {
				t.Fatalf("cases %+v", cs)
			}
			c := cs[0]
			e := c.Ends[0]
			mEnd, vEnd := w*l*l/12, w*l/2
			near(t, "start M", e.Start.M, -tc.sign*mEnd, mEnd)
			near(t, "end M", e.End.M, -tc.sign*mEnd, mEnd)
			near(t, "start V", e.Start.V, tc.sign*vEnd, vEnd)
			near(t, "end V", e.End.V, -tc.sign*vEnd, vEnd)
			near(t, "start N", e.Start.N, 0, vEnd)
			if len(c.Reactions) != 2 {
				t.Fatalf("reactions %+v", c.Reactions)
			}
			for _, r := range c.Reactions {
				near(t, "Fy", r.Fy, vEnd, vEnd)
				near(t, "Fx", r.Fx, 0, vEnd)
				// Counter-clockwise at the left support, clockwise at the right.
				left := (r.Node == 0) == tc.leftA
				want := mEnd
				if !left {
					want = -mEnd
				}
				near(t, "M of "+job0Name(r.Node), r.M, want, mEnd)
				if r.Components != [3]bool{true, true, true} {
					t.Errorf("components %v, want all three", r.Components)
				}
			}
			if c.Reduced != nil {
				t.Errorf("reduced reactions %v without live load reduction", c.Reduced)
			}
			for _, d := range c.Displacements {
				if d.Ux != 0 || d.Uy != 0 || d.Rz != 0 {
					t.Errorf("node %d of a fixed beam moves: %+v", d.Node, d)
				}
			}
		})
	}
}

func job0Name(v int) string { return [...]string{"a", "b"}[v] }

// TestCasesCantilever: a cantilever of length L fixed at a, with a point
// load P down at its free end b: the tip deflects PL³/3EI and turns
// PL²/2EI (clockwise), the root's reactions are P up and PL
// counter-clockwise (AISC Steel Construction Manual, Table 3-23,
// cantilever with a load at the free end; from memory).
func TestCasesCantilever(t *testing.T) {
	const l, p = 3.0, 20.0
	job := one([]frame.Node{{Name: "a", Support: frame.Fixed}, {Name: "b", X: l}}, []frame.MemberLoad{{Member: 0, Point: true, At: l, P: p}})
	c := cases(t, job)[0]
	ei := 200e6 * 2e-4
	tip := p * l * l * l / (3 * ei)
	d := c.Displacements[1]
	near(t, "tip uy", d.Uy, -tip, tip)
	near(t, "tip ux", d.Ux, 0, tip)
	near(t, "tip rz", d.Rz, -p*l*l/(2*ei), p*l*l/(2*ei))
	if len(c.Reactions) != 1 || c.Reactions[0].Node != 0 {
		t.Fatalf("reactions %+v, want one at a", c.Reactions)
	}
	r := c.Reactions[0]
	near(t, "Fy", r.Fy, p, p)
	near(t, "M", r.M, p*l, p*l)
	e := c.Ends[0]
	near(t, "root M", e.Start.M, -p*l, p*l) // hogging
	near(t, "tip M", e.End.M, 0, p*l)
	near(t, "root V", e.Start.V, p, p)
	// The load at the tip is carried to the free node, which exerts
	// nothing: the end force there is zero (by statics of the node).
	near(t, "tip V", e.End.V, 0, p)
}

// TestCasesPatternedWhole: a patterned case's result is the case as
// written, every span loaded: on two equal spans L under w the reactions
// are 3wL/8, 10wL/8, 3wL/8 and the moment over the middle support −wL²/8
// (three-moment equation, common practice).
func TestCasesPatternedWhole(t *testing.T) {
	job := twoSpans() // L = 5 kN/m patterned, spans 6 m
	cs := cases(t, job)
	const w, l = 5.0, 6.0
	c := cs[1]
	if c.Name != "L" || len(c.Reactions) != 3 {
		t.Fatalf("case %+v", c)
	}
	for i, want := range []float64{3 * w * l / 8, 10 * w * l / 8, 3 * w * l / 8} {
		near(t, "Fy", c.Reactions[i].Fy, want, w*l)
		if c.Reactions[i].Components[2] {
			t.Errorf("a pin or roller holds M at node %d", i)
		}
	}
	near(t, "M over b", c.Ends[0].End.M, -w*l*l/8, w*l*l)
	near(t, "M over b from b-c", c.Ends[1].Start.M, -w*l*l/8, w*l*l)
	// The dead load case D (10 kN/m) is twice as large everywhere.
	for i := range c.Reactions {
		near(t, "D against L", cs[0].Reactions[i].Fy, 2*c.Reactions[i].Fy, w*l)
	}
}

// Cases forms each case's end forces from every column's at once and
// takes its displacements as the statics check summed them row by row
// (Result.sums), the members by chunks and the cases' nodes
// on every processor: the same sums, in the same order, as adding up
// EndForces, Displacement and Reaction column by column, to the last bit,
// on one processor and on two; on a frame of two spans and on one of
// 10 x 10 bays and storeys (210 members: four chunks).
func TestCasesAreTheColumnSums(t *testing.T) {
	for _, tc := range []struct {
		name string
		job  *Job
	}{{"two spans", twoSpans()}, {"10x10", regularJob(10, 10, false)}} {
		res, err := Run(context.Background(), tc.job, Options{})
		if err != nil {
			t.Fatal(err)
		}
		if len(res.sums) != len(tc.job.Model.Cases) {
			// Cases gives the statics check's sums: those are checked here.
			t.Fatalf("%s: %d cases' displacement sums kept by the statics check, want %d", tc.name, len(res.sums), len(tc.job.Model.Cases))
		}
		for _, procs := range []int{1, 2} {
			t.Run(fmt.Sprintf("%s/GOMAXPROCS=%d", tc.name, procs), func(t *testing.T) {
				defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
				checkColumnSums(t, res)
			})
		}
	}
}

func checkColumnSums(t *testing.T, res *Result) {
	got := res.Cases()
	mo := res.Job.Model
	checked := 0
	for c := range mo.Cases {
		cols := res.lay.Whole(c)
		for m := range mo.Members {
			f := res.endForces(c, m)
			want := MemberEnds{Member: m, Start: frame.Forces{N: -f[0], V: f[1], M: -f[2]}, End: frame.Forces{N: f[3], V: -f[4], M: f[5]}}
			if got[c].Ends[m] != want {
				t.Errorf("case %d member %d: %+v, column by column %+v", c, m, got[c].Ends[m], want)
			}
		}
		var reactions []Reaction
		for v := range mo.Nodes {
			var want Displacement
			want.Node, want.RotationFree = v, res.sol.RotationFree(v)
			re := Reaction{Node: v}
			for _, col := range cols {
				ux, uy, rz := res.sol.Displacement(col, v)
				want.Ux, want.Uy = want.Ux+ux, want.Uy+uy
				if !want.RotationFree {
					want.Rz += rz
				}
				fx, fy, m := res.sol.Reaction(col, v)
				re.Fx, re.Fy, re.M = re.Fx+fx, re.Fy+fy, re.M+m
			}
			if got[c].Displacements[v] != want {
				t.Errorf("case %d node %d: %+v, column by column %+v", c, v, got[c].Displacements[v], want)
			}
			if nd := &mo.Nodes[v]; nd.Supported() {
				for k := range re.Components {
					re.Components[k] = nd.Reacts(k)
				}
				reactions = append(reactions, re)
			}
		}
		if !slices.Equal(got[c].Reactions, reactions) {
			t.Errorf("case %d: reactions %+v, column by column %+v", c, got[c].Reactions, reactions)
		}
		checked += len(cols)
	}
	if checked <= len(mo.Cases) {
		t.Fatal("no patterned case: the test sums no pieces")
	}
}
