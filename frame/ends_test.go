package frame

import (
	"math"
	"testing"
)

func TestStartLoadsTo(t *testing.T) {
	// A cantilever drawn from its free tip (x = 0) to its fixed root at
	// x = 3, carrying 10 downward and 4 along +X at the tip and 6
	// downward at midlength. Just inside the tip, by statics: N = -4
	// (the 4 pushes the member towards its root: compression), V = -10
	// (M = -10 x, V = dM/dx).
	mo := &Model{
		Nodes:    []Node{{Name: "T"}, {Name: "R", X: 3, Support: Fixed}},
		Sections: []Section{{Name: "S", E: 2e8, A: 0.01, I: 1e-4}},
		Members:  []Member{{Name: "T-R", Start: 0, End: 1}},
		Cases: []Case{{Name: "P", MemberLoads: []MemberLoad{
			{Member: 0, Point: true, At: 0, P: 10},
			{Member: 0, Point: true, At: 0, P: 4, Direction: GlobalX},
			{Member: 0, Point: true, At: 1.5, P: 6},
		}}, {Name: "none"}},
	}
	sol, err := Solve(mo)
	if err != nil {
		t.Fatal(err)
	}
	dst := make([]Forces, 2)
	sol.StartLoadsTo(dst, 0)
	at0 := sol.At(0, 0, 0)
	inside := Forces{N: at0.N + dst[0].N, V: at0.V + dst[0].V, M: at0.M + dst[0].M}
	const tol = 1e-9
	if math.Abs(inside.N+4) > tol || math.Abs(inside.V+10) > tol || math.Abs(inside.M) > tol {
		t.Errorf("inside the tip: %+v, want N -4, V -10, M 0", inside)
	}
	// Outside the member, at the free node, nothing acts.
	if math.Abs(at0.N) > tol || math.Abs(at0.V) > tol {
		t.Errorf("At(x = 0) = %+v, want the node's side: 0", at0)
	}
	if dst[1] != (Forces{}) {
		t.Errorf("unloaded case: %+v", dst[1])
	}
}
