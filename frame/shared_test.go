package frame

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"runtime"
	"slices"
	"strings"
	"sync"
	"testing"
)

// sharedTol is how closely SolveCases must agree with SolveWith, relative
// to the largest value of the same kind: both solve the same equations on
// the same factor, so they agree to the last bit unless something differs.
const sharedTol = 1e-12

// sharedFrame is randomFrame of 3 bays and 4 storeys (releases,
// semi-rigid ends, rigid zones) on bases with springs, and two sets of
// cases: each
// with distributed, point, moment and thermal member loads, node loads
// and a settlement of a different support.
func sharedFrame(seed uint64) (mo *Model, axial []float64, first, second []Case) {
	rng := rand.New(rand.NewPCG(seed, 0))
	mo, axial = randomFrame(rng, 3, 4)
	for i := range mo.Sections {
		mo.Sections[i].Alpha, mo.Sections[i].Depth = 1e-5, 0.4
	}
	// The four bases: fixed, pinned with a rotational spring, held in X
	// on vertical and rotational springs, fixed.
	mo.Nodes[0].Support, mo.Nodes[3].Support = Fixed, Fixed
	mo.Nodes[1].Support, mo.Nodes[1].Springs = Pinned, [3]float64{0, 0, 5e3 * (1 + rng.Float64())}
	mo.Nodes[2].Support, mo.Nodes[2].Springs = HoldX, [3]float64{0, 1e5, 2e4}
	cases := func(settle int) []Case {
		var out []Case
		for c := range 4 {
			cs := Case{Name: string(rune('A' + c))}
			for range 4 {
				m := rng.IntN(len(mo.Members))
				l := mo.Length(m)
				switch c {
				case 0:
					cs.MemberLoads = append(cs.MemberLoads, MemberLoad{Member: m, From: 0.1 * l, To: 0.9 * l, W: -5 * rng.Float64(), WEnd: -8})
				case 1:
					cs.MemberLoads = append(cs.MemberLoads, MemberLoad{Member: m, Point: true, At: l * rng.Float64(), P: -20},
						MemberLoad{Member: m, Moment: true, At: l / 3, M: 7})
				case 2:
					cs.MemberLoads = append(cs.MemberLoads, MemberLoad{Member: m, Thermal: true, DT: 15, DTGrad: -10})
				case 3:
					cs.NodeLoads = append(cs.NodeLoads, NodeLoad{Node: rng.IntN(len(mo.Nodes)), Fx: 10 * rng.Float64(), Fy: -4, M: 3})
				}
			}
			out = append(out, cs)
		}
		return append(out, Case{Name: "settlement", Displacements: []NodeDisplacement{{Node: settle, Uy: -0.01, Rz: 0.002}}})
	}
	mo.Cases = cases(0)
	return mo, axial, mo.Cases, cases(3)
}

// compareSolutions checks that got and want agree in every node's
// displacements and reaction and every member's end forces, each case,
// to sharedTol of the largest of its kind.
func compareSolutions(t *testing.T, got, want *Solution) {
	t.Helper()
	mo := want.Model()
	type value struct {
		what string
		got  float64
		want float64
	}
	var kinds [3][]value // displacements, reactions, end forces
	for c := range mo.Cases {
		for v := range mo.Nodes {
			gx, gy, gr := got.Displacement(c, v)
			wx, wy, wr := want.Displacement(c, v)
			kinds[0] = append(kinds[0], value{"ux", gx, wx}, value{"uy", gy, wy}, value{"rz", gr, wr})
			gx, gy, gr = got.Reaction(c, v)
			wx, wy, wr = want.Reaction(c, v)
			kinds[1] = append(kinds[1], value{"Rx", gx, wx}, value{"Ry", gy, wy}, value{"M", gr, wr})
		}
		for m := range mo.Members {
			g, w := got.EndForces(c, m), want.EndForces(c, m)
			for i := range 6 {
				kinds[2] = append(kinds[2], value{"end force", g[i], w[i]})
			}
		}
	}
	for _, vs := range kinds {
		big := 0.0
		for _, v := range vs {
			big = max(big, math.Abs(v.want))
		}
		for _, v := range vs {
			if !(math.Abs(v.got-v.want) <= sharedTol*big) {
				t.Fatalf("%s: %.17g, SolveWith gives %.17g", v.what, v.got, v.want)
			}
		}
	}
}

// SolveCases on a solution's factor gives what SolveWith gives the same
// model with those cases, which assembles and factors the stiffness
// again: first and second order, on frames with releases, semi-rigid
// ends, rigid zones, springs and settlements of supports other than those
// of the solution's own cases.
func TestSolveCasesMatchesSolveWith(t *testing.T) {
	for _, tc := range []struct {
		name   string
		seed   uint64
		second bool
	}{{"first order", 3, false}, {"first order, other frame", 8, false}, {"second order", 3, true}} {
		t.Run(tc.name, func(t *testing.T) {
			mo, axial, _, more := sharedFrame(tc.seed)
			var opt Options
			if tc.second {
				opt.Axial = axial
			}
			sol, err := SolveWith(mo, opt)
			if err != nil {
				t.Fatal(err)
			}
			got, err := sol.SolveCases(more)
			if err != nil {
				t.Fatal(err)
			}
			m2 := *mo
			m2.Cases = more
			want, err := SolveWith(&m2, opt)
			if err != nil {
				t.Fatal(err)
			}
			compareSolutions(t, got, want)
			if got.Cond() != want.Cond() {
				t.Errorf("condition %v, SolveWith gives %v", got.Cond(), want.Cond())
			}
			// sol itself is unchanged: its own cases still agree.
			again, err := SolveWith(mo, opt)
			if err != nil {
				t.Fatal(err)
			}
			compareSolutions(t, sol, again)
		})
	}
}

// SolveCases refuses what SolveWith refuses in the cases: a load on a
// member that is not there, and a moment at a node whose rotation is
// free (every member end released there, no support holding it).
func TestSolveCasesValidates(t *testing.T) {
	sec := []Section{{Name: "S", E: 2e8, A: 1e-2, I: 1e-4}}
	mo := &Model{Sections: sec,
		Nodes: []Node{{Name: "a", Support: Fixed}, {Name: "b", X: 4}, {Name: "c", X: 8, Support: Fixed}},
		Members: []Member{{Name: "ab", Start: 0, End: 1, Release: ReleaseEnd},
			{Name: "bc", Start: 1, End: 2, Release: ReleaseStart}},
		Cases: []Case{{Name: "P", NodeLoads: []NodeLoad{{Node: 1, Fy: -10}}}}}
	sol, err := Solve(mo)
	if err != nil {
		t.Fatal(err)
	}
	t.Run("member not in the model", func(t *testing.T) {
		_, err := sol.SolveCases([]Case{{Name: "w", MemberLoads: []MemberLoad{{Member: 5, From: 0, To: 1, W: 1, WEnd: 1}}}})
		var ve ValidationErrors
		if !errors.As(err, &ve) {
			t.Fatalf("got %v, want a ValidationErrors", err)
		}
	})
	t.Run("moment at a free rotation", func(t *testing.T) {
		_, err := sol.SolveCases([]Case{{Name: "M", NodeLoads: []NodeLoad{{Node: 1, M: 5}}}})
		m2 := *mo
		m2.Cases = []Case{{Name: "M", NodeLoads: []NodeLoad{{Node: 1, M: 5}}}}
		_, want := Solve(&m2)
		var me *MechanismError
		if !errors.As(err, &me) || want == nil || err.Error() != want.Error() {
			t.Fatalf("got %v, SolveWith gives %v", err, want)
		}
	})
	t.Run("a load it can carry", func(t *testing.T) {
		// Two propped cantilevers joined by a hinge: a load P at the hinge
		// is shared equally, M = P L/2 at each fixed end (statics).
		got, err := sol.SolveCases([]Case{{Name: "P2", NodeLoads: []NodeLoad{{Node: 1, Fy: -20}}}})
		if err != nil {
			t.Fatal(err)
		}
		_, fy, m := got.Reaction(0, 0)
		if math.Abs(fy-10) > 1e-9 || math.Abs(m-40) > 1e-9 {
			t.Errorf("reaction at a: Fy = %v, M = %v; want 10, 40", fy, m)
		}
	})
}

// SolveCasesReusing gives SolveCases' results to the last bit (compared
// with a SolveWith of the same model, which assembles and factors
// anew), whether spent's memory is large enough to be taken or not, on
// one processor or two; spent gives up its results.
func TestSolveCasesReusingMatchesSolveWith(t *testing.T) {
	mo, axial, first, more := sharedFrame(5)
	opt := Options{Axial: axial}
	sol, err := SolveWith(mo, opt)
	if err != nil {
		t.Fatal(err)
	}
	m2 := *mo
	m2.Cases = more
	want, err := SolveWith(&m2, opt)
	if err != nil {
		t.Fatal(err)
	}
	for _, procs := range []int{1, 2} {
		for _, tc := range []struct {
			name  string
			cases []Case
			taken bool
		}{{"as many columns", first, true}, {"more columns", append(slices.Clone(more), renamed(more, "again")...), true}, {"fewer columns", first[:2], false}} {
			t.Run(fmt.Sprintf("%s/GOMAXPROCS=%d", tc.name, procs), func(t *testing.T) {
				defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
				spent, err := sol.SolveCases(tc.cases)
				if err != nil {
					t.Fatal(err)
				}
				mem := &spent.x[0]
				got, err := sol.SolveCasesReusing(more, spent)
				if err != nil {
					t.Fatal(err)
				}
				if taken := &got.x[0] == mem; taken != tc.taken {
					t.Errorf("spent's memory taken: %v, want %v", taken, tc.taken)
				}
				for i := range want.x {
					if got.x[i] != want.x[i] {
						t.Fatalf("x[%d] = %v, SolveWith %v", i, got.x[i], want.x[i])
					}
				}
				compareSolutions(t, got, want)
				func() {
					defer func() {
						if recover() == nil {
							t.Error("a spent solution still gives results")
						}
					}()
					spent.EndForces(0, 0)
				}()
			})
		}
	}
	t.Run("spent is the factor's own", func(t *testing.T) {
		defer func() {
			if r := recover(); r == nil || !strings.HasPrefix(fmt.Sprint(r), "frame: ") {
				t.Errorf("panic %v, want a frame: message", r)
			}
		}()
		sol.SolveCasesReusing(more, sol)
	})
}

// renamed returns cases with suffix added to their names.
func renamed(cases []Case, suffix string) []Case {
	out := slices.Clone(cases)
	for i := range out {
		out[i].Name += " " + suffix
	}
	return out
}

// Solutions sharing a factor list its terms once, whichever solves first:
// two SolveCases on one solution at once (as the critical load factors'
// and the storeys' solves run) give, each, what SolveWith gives their
// cases, and the terms they use are the solution's own.
func TestSolveCasesAtOnceShareTheTerms(t *testing.T) {
	mo, _, _, more := sharedFrame(3)
	sol, err := SolveWith(mo, Options{})
	if err != nil {
		t.Fatal(err)
	}
	sets := [][]Case{more, more[:len(more)-1]}
	got := make([]*Solution, len(sets))
	errs := make([]error, len(sets))
	var wg sync.WaitGroup
	for i, cs := range sets {
		wg.Add(1)
		go func() {
			defer wg.Done()
			got[i], errs[i] = sol.SolveCases(cs)
		}()
	}
	wg.Wait()
	if sol.terms.bs == nil {
		t.Fatal("no solve of more than one column: the shared terms are not checked")
	}
	for i, cs := range sets {
		if errs[i] != nil {
			t.Fatal(errs[i])
		}
		m2 := *mo
		m2.Cases = cs
		want, err := SolveWith(&m2, Options{})
		if err != nil {
			t.Fatal(err)
		}
		compareSolutions(t, got[i], want)
		if got[i].terms != sol.terms {
			t.Errorf("set %d: its own terms, not the solution's", i)
		}
	}
}
