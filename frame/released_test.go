package frame

import (
	"errors"
	"math"
	"testing"
)

// A node where every member end is released carries no moment, so its
// rotation is left out of the equations: such frames are sound, not
// mechanisms (common practice: a hinge transmits force, not moment).

// gerber returns a Gerber beam: a cantilever A-H of length a fixed at A, a
// hinge at H, and a suspended span H-B of length b on a roller at B, with a
// downward UDL w on the suspended span.
func gerber(a, b, w float64) *Model {
	return &Model{
		Sections: []Section{{Name: "S", E: 200e6, A: 1e-2, I: 1e-4}},
		Nodes:    []Node{{Name: "A", Support: Fixed}, {Name: "H", X: a}, {Name: "B", X: a + b, Support: Roller}},
		Members: []Member{
			{Name: "A-H", Start: 0, End: 1, Release: ReleaseEnd},
			{Name: "H-B", Start: 1, End: 2, Release: ReleaseStart},
		},
		Cases: []Case{{Name: "w", MemberLoads: []MemberLoad{{Member: 1, To: b, W: w, WEnd: w}}}},
	}
}

// simpleSpans returns two spans of length l on a pin and two rollers, both
// members released at the middle support N1: two simple spans side by side.
func simpleSpans(l, w float64) *Model {
	mo := continuous(2, l, w, nil)
	mo.Members[0].Release = ReleaseEnd
	mo.Members[1].Release = ReleaseStart
	return mo
}

func TestReleasedNodesAreNotMechanisms(t *testing.T) {
	const l, w = 5.0, 5.0
	t.Run("two simple spans made with releases: wL^2/8 and wL/2", func(t *testing.T) {
		// Simply supported beam under a UDL: midspan moment wL²/8, end
		// reactions wL/2 (AISC Steel Construction Manual, Table 3-23, case 1;
		// recalled from memory). The middle support takes wL/2 from each span.
		sol := solve(t, simpleSpans(l, w))
		for m := range 2 {
			if got := sol.At(0, m, l/2).M; !near(got, w*l*l/8, tightTol) {
				t.Errorf("span %d midspan M = %g, want wL²/8 = %g", m+1, got, w*l*l/8)
			}
			for _, x := range []float64{0, l} {
				if got := sol.At(0, m, x).M; math.Abs(got) > tightTol*w*l*l {
					t.Errorf("span %d M(%g) = %g, want 0 at a support of a simple span", m+1, x, got)
				}
			}
		}
		for v, want := range []float64{w * l / 2, w * l, w * l / 2} {
			if _, fy, _ := sol.Reaction(0, v); !near(fy, want, tightTol) {
				t.Errorf("reaction at N%d = %g, want %g", v, fy, want)
			}
		}
		// Each span turns at N1 by wL³/24EI, in opposite senses (beam
		// tables; recalled from memory): the node itself has no one rotation.
		if _, _, rz := sol.Displacement(0, 1); !math.IsNaN(rz) {
			t.Errorf("rotation of the released node N1 = %g, want NaN (free, not a number)", rz)
		}
		if _, _, rz := sol.Displacement(0, 0); math.IsNaN(rz) || !near(rz, -w*l*l*l/(24*200e6*1e-4), tightTol) {
			t.Errorf("rotation at N0 = %g, want -wL³/24EI = %g", rz, -w*l*l*l/(24*200e6*1e-4))
		}
	})
	t.Run("Gerber beam: suspended span wb/2 on the cantilever tip", func(t *testing.T) {
		// By statics: the suspended span H-B (length b) is simply supported,
		// wb²/8 at its middle and wb/2 at each end; the cantilever A-H
		// (length a) carries P = wb/2 at its tip: M = -Pa at A and a tip
		// deflection Pa³/3EI (beam tables; recalled from memory).
		const a, b = 2.0, 6.0
		sol := solve(t, gerber(a, b, w))
		p := w * b / 2
		ei := 200e6 * 1e-4
		if got := sol.At(0, 1, b/2).M; !near(got, w*b*b/8, tightTol) {
			t.Errorf("suspended span midspan M = %g, want wb²/8 = %g", got, w*b*b/8)
		}
		if got := sol.At(0, 0, 0).M; !near(got, -p*a, tightTol) {
			t.Errorf("cantilever root M = %g, want -Pa = %g", got, -p*a)
		}
		if fx, fy, m := sol.Reaction(0, 0); !near(fy, p, tightTol) || !near(m, p*a, tightTol) || math.Abs(fx) > tightTol*p {
			t.Errorf("reaction at A (%g, %g, %g), want (0, %g, %g)", fx, fy, m, p, p*a)
		}
		if _, uy, rz := sol.Displacement(0, 1); !near(-uy, p*a*a*a/(3*ei), tightTol) || !math.IsNaN(rz) {
			t.Errorf("hinge H: uy = %g, rz = %g; want -Pa³/3EI = %g and a free (NaN) rotation", uy, rz, -p*a*a*a/(3*ei))
		}
	})
	t.Run("pinned feet under released column ends: as the pinned portal", func(t *testing.T) {
		// A release at a pinned foot changes nothing: the foot already
		// carries no moment. Pinned-base portal under H at beam level: each
		// column takes H/2 (rigid frame formulas, recalled from memory).
		const hx = 30.0
		pinned := portal(Pinned, 8, 4, 2e-3, 1e-3)
		released := portal(Pinned, 8, 4, 2e-3, 1e-3)
		released.Members[0].Release = ReleaseStart // A0-A1 at A0
		released.Members[2].Release = ReleaseStart // B0-B1 at B0
		for _, mo := range []*Model{pinned, released} {
			mo.Cases = []Case{{Name: "H", NodeLoads: []NodeLoad{{Node: 1, Fx: hx}}}}
		}
		want, got := solve(t, pinned), solve(t, released)
		for m := range 3 {
			for _, x := range []float64{0, 2} {
				if g, w := got.At(0, m, x).M, want.At(0, m, x).M; !near(g, w, tightTol) {
					t.Errorf("member %d M(%g) = %g, want %g as with no release", m, x, g, w)
				}
			}
		}
		for _, v := range []int{0, 3} {
			if fx, _, _ := got.Reaction(0, v); !near(fx, -hx/2, rigidTol) {
				t.Errorf("base %d Fx = %g, want -H/2 = %g", v, fx, -hx/2)
			}
			if _, _, rz := got.Displacement(0, v); !math.IsNaN(rz) {
				t.Errorf("released foot %d rotation %g, want NaN", v, rz)
			}
		}
	})
	t.Run("released tip of a cantilever", func(t *testing.T) {
		// A release at a free tip changes nothing: the tip deflection is
		// PL³/3EI (beam tables; recalled from memory).
		mo := cantilever(4, 200e6, 1e-2, 1e-4)
		mo.Members[0].Release = ReleaseEnd
		sol := solve(t, mo)
		if _, uy, _ := sol.Displacement(0, 1); !near(-uy, 64/(3*200e6*1e-4), tightTol) {
			t.Errorf("tip deflection %g, want PL³/3EI = %g", -uy, 64/(3*200e6*1e-4))
		}
	})
}

func TestMomentAtAReleasedNodeIsAMechanism(t *testing.T) {
	// A moment applied where every member end is released has nothing to
	// resist it: a mechanism for that load, named with the node and case.
	mo := simpleSpans(5, 5)
	mo.Cases = append(mo.Cases,
		Case{Name: "no moment", NodeLoads: []NodeLoad{{Node: 1, Fy: -10}}},
		Case{Name: "M at the hinge", NodeLoads: []NodeLoad{{Node: 1, Fy: -10, M: 3}}})
	_, err := Solve(mo)
	var me *MechanismError
	if !errors.As(err, &me) {
		t.Fatalf("err = %v, want a *MechanismError", err)
	}
	want := `the structure is a mechanism (it cannot carry load): node "N1" is free to rotate (rz): every member end there is released (hinged) and no support holds its rotation, so nothing resists the moment that case "M at the hinge" applies there`
	if err.Error() != want {
		t.Errorf("error\n got: %s\nwant: %s", err, want)
	}
}
