package frame

import (
	"errors"
	"fmt"
	"testing"
)

// twoPortals returns a fixed-base portal A0-A1-B1-B0 and, beside it, a
// second frame of nodes E1, F1 joined by a beam and not joined to anything
// else; supportE is the support given to E1.
func twoPortals(supportE Support) *Model {
	mo := portal(Fixed, 6, 3, 1e-3, 1e-3)
	mo.Nodes = append(mo.Nodes, Node{Name: "E1", X: 10, Y: 3, Support: supportE}, Node{Name: "F1", X: 14, Y: 3})
	mo.Members = append(mo.Members, Member{Name: "E1-F1", Start: 4, End: 5, Section: 1})
	return mo
}

func TestMechanismOfEachKindIsNamed(t *testing.T) {
	// Each model below is a mechanism by the rules of statics and stability
	// of plane frames (common practice: a plane rigid body needs three
	// independent restraints, and every part of a frame must be held).
	const prefix = "the structure is a mechanism (it cannot carry load): "
	for _, tc := range []struct {
		name   string
		model  func() *Model
		want   string
		parts  int     // len(MechanismError.Unsupported)
		moment float64 // applied at node 1 with the horizontal load
	}{
		{
			name: "no support against sway: pinned bases, beam hinged at both ends",
			model: func() *Model {
				mo := portal(Pinned, 6, 3, 1e-3, 1e-3)
				mo.Members[1].Release = ReleaseBoth
				return mo
			},
			want: `node "B1" is free to move along X (ux)`,
		},
		{
			name: "no support against sway: portal standing on rollers",
			model: func() *Model {
				return portal(Roller, 6, 3, 1e-3, 1e-3)
			},
			want: `node "B0" is free to move along X (ux)`,
		},
		{
			name: "no support against sway: beam on rollers slides along X",
			model: func() *Model {
				mo := continuous(1, 4, 1, nil)
				mo.Nodes[0].Support = Roller
				return mo
			},
			want: `node "N1" is free to move along X (ux)`,
		},
		{
			name: "moment applied where every member end is released",
			model: func() *Model {
				mo := continuous(2, 4, 1, nil)
				mo.Members[0].Release = ReleaseEnd
				mo.Members[1].Release = ReleaseStart
				return mo
			},
			moment: 1,
			want:   `node "N1" is free to rotate (rz): every member end there is released (hinged) and no support holds its rotation, so nothing resists the moment that case "H" applies there`,
		},
		{
			name: "moment at a frame corner where beam and column are both released",
			model: func() *Model {
				mo := portal(Fixed, 6, 3, 1e-3, 1e-3)
				mo.Members[0].Release = ReleaseEnd   // A0-A1 at A1
				mo.Members[1].Release = ReleaseStart // A1-B1 at A1
				return mo
			},
			moment: 1,
			want:   `node "A1" is free to rotate (rz): every member end there is released (hinged) and no support holds its rotation, so nothing resists the moment that case "H" applies there`,
		},
		{
			name: "floating part: a beam joined to nothing that is supported",
			model: func() *Model {
				return twoPortals(Free)
			},
			want:  `nodes "E1", "F1" form a part joined to no support, free to move along X (ux) and Y (uy) and to rotate (rz)`,
			parts: 1,
		},
		{
			name: "no support at all: the whole frame floats",
			model: func() *Model {
				return portal(Free, 6, 3, 1e-3, 1e-3)
			},
			want:  `nodes "A0", "A1", "B1", "B0" form a part joined to no support, free to move along X (ux) and Y (uy) and to rotate (rz)`,
			parts: 1,
		},
		{
			name: "floating part and a moment at a released node are reported together",
			model: func() *Model {
				mo := twoPortals(Free)
				mo.Members[0].Release = ReleaseEnd
				mo.Members[1].Release = ReleaseStart
				return mo
			},
			moment: 1,
			want:   `nodes "E1", "F1" form a part joined to no support, free to move along X (ux) and Y (uy) and to rotate (rz); node "A1" is free to rotate (rz): every member end there is released (hinged) and no support holds its rotation, so nothing resists the moment that case "H" applies there`,
			parts:  1,
		},
		{
			// The part slides along X as a whole (E1 and F1 alike) and turns
			// about E1.
			name: "part held by a single roller still slides and turns",
			model: func() *Model {
				return twoPortals(Roller)
			},
			want: `node "F1" is free to move along X (ux); node "F1" is free to move along Y (uy)`,
		},
	} {
		t.Run(tc.name, func(t *testing.T) {
			mo := tc.model()
			mo.Cases = []Case{{Name: "H", NodeLoads: []NodeLoad{{Node: 1, Fx: 1, M: tc.moment}}}}
			_, err := Solve(mo)
			var me *MechanismError
			if !errors.As(err, &me) {
				t.Fatalf("err = %v, want a *MechanismError", err)
			}
			if got := err.Error(); got != prefix+tc.want {
				t.Errorf("error\n got: %s\nwant: %s", got, prefix+tc.want)
			}
			if len(me.Unsupported) != tc.parts {
				t.Errorf("%d unsupported parts, want %d", len(me.Unsupported), tc.parts)
			}
		})
	}
}

func TestStableFramesAreNotMechanisms(t *testing.T) {
	// Controls for the mechanism checks: each of these is stable (common
	// practice), so Solve must succeed and balance the load.
	for _, tc := range []struct {
		name  string
		model func() *Model
	}{
		{"pinned bases, rigid beam", func() *Model { return portal(Pinned, 6, 3, 1e-3, 1e-3) }},
		{"fixed bases, beam hinged at both ends (columns are cantilevers)", func() *Model {
			mo := portal(Fixed, 6, 3, 1e-3, 1e-3)
			mo.Members[1].Release = ReleaseBoth
			return mo
		}},
		{"three-hinged frame: pinned bases and a hinge at midspan", func() *Model {
			mo := portal(Pinned, 6, 3, 1e-3, 1e-3)
			mo.Nodes = append(mo.Nodes, Node{Name: "M1", X: 3, Y: 3})
			mo.Members[1] = Member{Name: "A1-M1", Start: 1, End: 4, Section: 1, Release: ReleaseEnd}
			mo.Members = append(mo.Members, Member{Name: "M1-B1", Start: 4, End: 2, Section: 1})
			return mo
		}},
		{"two separate frames, each supported", func() *Model { return twoPortals(Fixed) }},
		{"frame corner where beam and column are both released (the column is a cantilever)", func() *Model {
			mo := portal(Fixed, 6, 3, 1e-3, 1e-3)
			mo.Members[0].Release = ReleaseEnd   // A0-A1 at A1
			mo.Members[1].Release = ReleaseStart // A1-B1 at A1
			return mo
		}},
		{"node where every member end is released, on a support", func() *Model {
			mo := continuous(2, 4, 1, nil)
			mo.Members[0].Release = ReleaseEnd
			mo.Members[1].Release = ReleaseStart
			return mo
		}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			mo := tc.model()
			for i := range mo.Sections {
				mo.Sections[i].A = 0.1 // a real area, not portal's nearly rigid one
			}
			mo.Cases = []Case{{Name: "H", NodeLoads: []NodeLoad{{Node: 1, Fx: 10, Fy: -5}}}}
			sol := solve(t, mo)
			if w := sol.Warnings(); len(w) != 0 {
				t.Errorf("warnings %q", w)
			}
		})
	}
}

func TestUnsupportedParts(t *testing.T) {
	mo := twoPortals(Free)
	// A third part, a single member between G and H, listed before the
	// others' nodes would be in model order.
	mo.Nodes = append([]Node{{Name: "G"}, {Name: "H", X: 1}}, mo.Nodes...)
	for i := range mo.Members {
		mo.Members[i].Start += 2
		mo.Members[i].End += 2
	}
	mo.Members = append(mo.Members, Member{Name: "G-H", Start: 0, End: 1})
	got := fmt.Sprint(unsupportedParts(mo))
	if want := "[[0 1] [6 7]]"; got != want {
		t.Errorf("parts %s, want %s", got, want)
	}
}
