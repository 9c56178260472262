package distribution

import (
	"errors"
	"math"
	"strings"
	"testing"

	"govern/frame"
)

// compare checks that moment distribution gives the end moments of the
// direct stiffness solver of package frame, case by case.
func compare(t *testing.T, mo *frame.Model, tol float64) *Result {
	t.Helper()
	sol, err := frame.Solve(mo)
	if err != nil {
		t.Fatalf("frame.Solve: %v", err)
	}
	r := solve(t, mo)
	for c := range mo.Cases {
		scale := 0.0
		for m := range mo.Members {
			f := sol.EndForces(c, m)
			scale = math.Max(scale, math.Max(math.Abs(f[2]), math.Abs(f[5])))
		}
		for m := range mo.Members {
			f := sol.EndForces(c, m)
			s, e := r.EndMoments(c, m)
			if math.Abs(s-f[2]) > tol*scale || math.Abs(e-f[5]) > tol*scale {
				t.Errorf("case %q member %q: distribution %g, %g; stiffness %g, %g",
					mo.Cases[c].Name, mo.Members[m].Name, s, e, f[2], f[5])
			}
		}
	}
	return r
}

// shed is a single-storey, two-bay frame with a roof overhang: bases at two
// levels (so the columns differ in height), one pinned base, a hinge at one
// beam end, and loads of every kind. Members are axially stiff so that the
// stiffness solver's axial strain is negligible.
func shed() *frame.Model {
	const a = 1e5
	mo := &frame.Model{
		Sections: []frame.Section{{Name: "col", E: 30e6, A: a, I: 2e-3}, {Name: "beam", E: 30e6, A: a, I: 5e-3}},
		Nodes: []frame.Node{
			{Name: "A0", Y: 0, Support: frame.Fixed}, {Name: "B0", X: 7, Y: -1.5, Support: frame.Pinned}, {Name: "C0", X: 12, Y: 0, Support: frame.Fixed},
			{Name: "A1", Y: 4}, {Name: "B1", X: 7, Y: 4}, {Name: "C1", X: 12, Y: 4}, {Name: "tip", X: 14, Y: 4},
		},
		Members: []frame.Member{
			{Name: "A0-A1", Start: 0, End: 3}, {Name: "B0-B1", Start: 1, End: 4}, {Name: "C1-C0", Start: 5, End: 2},
			{Name: "A1-B1", Start: 3, End: 4, Section: 1}, {Name: "B1-C1", Start: 4, End: 5, Section: 1, Release: frame.ReleaseStart},
			{Name: "C1-tip", Start: 5, End: 6, Section: 1},
		},
	}
	mo.Cases = []frame.Case{
		{Name: "gravity", MemberLoads: []frame.MemberLoad{
			{Member: 3, To: 7, W: 10, WEnd: 10},
			{Member: 4, From: 1, To: 4, W: 6, WEnd: 14},
			{Member: 4, Point: true, At: 3.5, P: 25},
			{Member: 5, To: 2, W: 10, WEnd: 4},
		}, NodeLoads: []frame.NodeLoad{{Node: 6, Fy: -8}}},
		{Name: "wind", MemberLoads: []frame.MemberLoad{
			{Member: 0, Direction: frame.GlobalX, To: 4, W: 3, WEnd: 3},
			{Member: 2, Direction: frame.GlobalX, From: 1, To: 3, W: 2, WEnd: 1},
			{Member: 1, Direction: frame.GlobalX, Point: true, At: 2, P: 5},
			{Member: 3, Direction: frame.GlobalX, To: 7, W: 0.5, WEnd: 0.5},
		}, NodeLoads: []frame.NodeLoad{{Node: 3, Fx: 12}, {Node: 4, M: 9}, {Node: 6, Fx: -2}}},
	}
	return mo
}

func TestAgreesWithTheStiffnessSolver(t *testing.T) {
	t.Run("single storey with sway, hinge, overhang and mixed bases", func(t *testing.T) {
		r := compare(t, shed(), axialTol)
		if !r.Sway || len(r.SwayLines) != 1 || strings.Join(r.SwayLines[0], " ") != "A1 B1 C1" {
			t.Errorf("sway %v, lines %v", r.Sway, r.SwayLines)
		}
	})
	t.Run("two storeys held at every level: no sway", func(t *testing.T) {
		mo := shed()
		// Hold each beam line along X with a pinned support at its end and
		// add a storey above.
		mo.Nodes[6] = frame.Node{Name: "C1p", X: 14, Y: 4, Support: frame.Pinned}
		mo.Nodes = append(mo.Nodes, frame.Node{Name: "A2", Y: 7}, frame.Node{Name: "C2", X: 12, Y: 7, Support: frame.Pinned})
		mo.Members = append(mo.Members, frame.Member{Name: "A1-A2", Start: 3, End: 7}, frame.Member{Name: "A2-C2", Start: 7, End: 8, Section: 1})
		mo.Cases[0].NodeLoads = nil
		mo.Cases[1].NodeLoads = []frame.NodeLoad{{Node: 7, M: -6}}
		mo.Cases[1].MemberLoads = append(mo.Cases[1].MemberLoads, frame.MemberLoad{Member: 6, Direction: frame.GlobalX, To: 3, W: 2, WEnd: 2})
		r := compare(t, mo, axialTol)
		if r.Sway {
			t.Error("a frame held at every level was given a sway correction")
		}
	})
	t.Run("single storey with a mast on the roof loaded sideways", func(t *testing.T) {
		mo := shed()
		mo.Nodes = append(mo.Nodes, frame.Node{Name: "mast", Y: 7})
		mo.Members = append(mo.Members, frame.Member{Name: "A1-mast", Start: 3, End: 7})
		mo.Cases[1].MemberLoads = append(mo.Cases[1].MemberLoads, frame.MemberLoad{Member: 6, Direction: frame.GlobalX, To: 3, W: 2, WEnd: 1})
		mo.Cases[1].NodeLoads = append(mo.Cases[1].NodeLoads, frame.NodeLoad{Node: 7, Fx: 3, Fy: -4, M: 1.5})
		compare(t, mo, axialTol)
	})
	t.Run("textbook beam with overhang", func(t *testing.T) {
		compare(t, TextbookBeam(), closeTol)
	})
}

func TestWhereItDoesNotApply(t *testing.T) {
	for _, tc := range []struct {
		name, want string
		edit       func(mo *frame.Model)
	}{
		{"inclined member", `member "A1-B1" is inclined`, func(mo *frame.Model) { mo.Nodes[4].Y = 5 }},
		{"an upper storey on pin-ended columns", `the joints "A2", "B2" are free to move along X and no column resists it`, func(mo *frame.Model) {
			mo.Nodes = append(mo.Nodes, frame.Node{Name: "A2", Y: 7}, frame.Node{Name: "B2", X: 7, Y: 7})
			mo.Members = append(mo.Members, frame.Member{Name: "A1-A2", Start: 3, End: 7, Release: frame.ReleaseBoth},
				frame.Member{Name: "B1-B2", Start: 4, End: 8, Release: frame.ReleaseBoth},
				frame.Member{Name: "A2-B2", Start: 7, End: 8, Section: 1})
		}},
		{"a column top with nothing else is a cantilever, not a storey", "", func(mo *frame.Model) {
			mo.Nodes = append(mo.Nodes, frame.Node{Name: "A2", Y: 7})
			mo.Members = append(mo.Members, frame.Member{Name: "A1-A2", Start: 3, End: 7})
		}},
		{"beam split at an unsupported node", `node "mid" is not held vertically`, func(mo *frame.Model) {
			mo.Nodes = append(mo.Nodes, frame.Node{Name: "mid", X: 3.5, Y: 4})
			mo.Members[3].End = 7
			mo.Members = append(mo.Members, frame.Member{Name: "mid-B1", Start: 7, End: 4, Section: 1})
		}},
		{"nothing resists sway", `free to move along X and no column resists it`, func(mo *frame.Model) {
			for _, m := range []int{0, 1, 2} {
				mo.Members[m].Release = frame.ReleaseBoth
			}
		}},
		{"a spring support", `node "A0" has a spring support`, func(mo *frame.Model) {
			mo.Nodes[0].Support = frame.Pinned
			mo.Nodes[0].Springs[2] = 1e4
		}},
		{"a support by direction", `node "A0" is held in the directions x+rotation`, func(mo *frame.Model) {
			mo.Nodes[0].Support = frame.HoldX | frame.HoldRZ
		}},
		{"a semi-rigid end", `member "A1-B1" has a semi-rigid end`, func(mo *frame.Model) { mo.Members[3].SpringEnd = 1e4 }},
		{"rigid end zones", `member "A1-B1" has rigid end zones`, func(mo *frame.Model) { mo.Members[3].OffsetStart = 0.2 }},
		{"a settlement", `imposes displacements on supports`, func(mo *frame.Model) {
			mo.Cases[0].Displacements = []frame.NodeDisplacement{{Node: 0, Uy: -0.01}}
		}},
		{"a moment on a member", `has a concentrated moment on member "A1-B1"`, func(mo *frame.Model) {
			mo.Cases[0].MemberLoads = append(mo.Cases[0].MemberLoads, frame.MemberLoad{Member: 3, Moment: true, At: 1, M: 2})
		}},
		{"a change of temperature", `has a change of temperature of member "A1-B1"`, func(mo *frame.Model) {
			mo.Sections[1].Alpha = 1e-5
			mo.Cases[0].MemberLoads = append(mo.Cases[0].MemberLoads, frame.MemberLoad{Member: 3, Thermal: true, DT: 20})
		}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			mo := shed()
			tc.edit(mo)
			_, err := Solve(mo, nil)
			if tc.want == "" {
				if err != nil {
					t.Errorf("err = %v, want none", err)
				}
				return
			}
			var na *NotApplicableError
			if !errors.As(err, &na) || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("err = %v, want a NotApplicableError containing %q", err, tc.want)
			}
		})
	}
	t.Run("iteration limit", func(t *testing.T) {
		_, err := Solve(shed(), &Options{MaxSweeps: 2})
		if err == nil || !strings.Contains(err.Error(), "did not converge in 2 sweeps") {
			t.Errorf("err = %v", err)
		}
	})
}
