package frame

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
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
			// Three hinges in a line (common practice: a three-hinged arch
			// whose hinges are collinear is unstable): the middle one moves
			// across the line while both members turn about their supports.
			// No member end is free of stiffness there, so only the
			// factorization can find it.
			name: "geometric: two members on pins, hinged to each other on the line between them",
			model: func() *Model {
				mo := continuous(2, 4, 1, nil)
				mo.Nodes[1].Support, mo.Nodes[2].Support = Free, Pinned
				mo.Members[0].Release = ReleaseEnd
				mo.Members[1].Release = ReleaseStart
				return mo
			},
			want: `node "N1" is free to move along Y (uy)`,
		},
		{
			// Two bars pinned at both ends in one line, on pins at the ends
			// of the line (common practice: three hinges in a line, an
			// infinitesimal mechanism): the middle node moves across the
			// line, more along Y than X at a slope of 0.5 rad. The diagonal
			// has stiffness in X and Y there.
			name: "geometric: two pinned bars in a line on a slope",
			model: func() *Model {
				return pinnedBars(0.5, 0)
			},
			want: `node "N1" is free to move along Y (uy)`,
		},
		{
			// The same, the middle node 1e-9 off the line: what holds it
			// across the line, EA/L × (1e-9/3)², is lost in round-off.
			name: "geometric: two pinned bars 1e-9 off a line",
			model: func() *Model {
				return pinnedBars(0.5, 1e-9)
			},
			want: `node "N1" is free to move along Y (uy)`,
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

// pinnedBars returns two bars of length 3 pinned at both ends (all member
// ends released), joined end to end along a line at angle radians from X,
// on pinned supports at both ends of the line; the middle node is moved off
// the line, across it, by offset.
func pinnedBars(angle, offset float64) *Model {
	mo := &Model{Sections: []Section{{Name: "S", E: 200e6, A: 1e-2, I: 1e-4}}}
	c, s := math.Cos(angle), math.Sin(angle)
	for i := range 3 {
		sp := Free
		if i != 1 {
			sp = Pinned
		}
		mo.Nodes = append(mo.Nodes, Node{Name: fmt.Sprint("N", i), X: 3 * float64(i) * c, Y: 3 * float64(i) * s, Support: sp})
	}
	mo.Nodes[1].X -= offset * s
	mo.Nodes[1].Y += offset * c
	for i := range 2 {
		mo.Members = append(mo.Members, Member{Name: fmt.Sprint("M", i+1), Start: i, End: i + 1, Release: ReleaseBoth})
	}
	return mo
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
		{"two pinned bars, the middle node 0.3 off the line between the pins (a shallow truss)", func() *Model {
			return pinnedBars(0.5, 0.3)
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

// kinematicTol is the agreement asked of the kinematic member's energy, a
// sum of a few products of numbers of order one.
const kinematicTol = 1e-12

func TestKinematicMemberEnergy(t *testing.T) {
	// The member the mechanism search puts in place of each member,
	// EA/L = 12EI/L³ = 1, against the strain energy of a prismatic member,
	// ½(EA/L)δ² + (2EI/L)(θ₁² + θ₁θ₂ + θ₂²) for an elongation δ and end
	// rotations θ measured from the chord (slope-deflection equations;
	// common practice): ½δ² + (L²/6)(θ₁² + θ₁θ₂ + θ₂²). A released end's θ
	// takes the value that makes it least, −θ/2 of the other: L²θ²/8 is
	// left, and ½δ² alone with both ends released. Its rotations are h θ,
	// h at least L. Rigid-body motions strain nothing.
	rng := rand.New(rand.NewPCG(12, 1))
	for _, rel := range []Release{ReleaseNone, ReleaseStart, ReleaseEnd, ReleaseBoth} {
		t.Run(fmt.Sprintf("release %d", rel), func(t *testing.T) {
			for range 20 {
				angle, l := rng.Float64()*2*math.Pi, 0.1+10*rng.Float64()
				h1, h2 := l*(1+3*rng.Float64()), l*(1+3*rng.Float64())
				c, s := math.Cos(angle), math.Sin(angle)
				base := element{c: c, s: s, l: l, lf: l, release: rel, ei: 1e12 * rng.Float64()}
				k := base.kinematic(h1, h2)
				g := k.global()
				var u [6]float64
				for i := range u {
					u[i] = rng.Float64()*2 - 1
				}
				energy := 0.0
				for i := range 6 {
					for j := range 6 {
						energy += u[i] * g[i][j] * u[j] / 2
					}
				}
				var d [6]float64
				k.toLocal(&d, &u)
				delta, psi := d[3]-d[0], (d[4]-d[1])/l
				t1, t2 := d[2]/h1-psi, d[5]/h2-psi
				want := delta*delta/2 + l*l/6*(t1*t1+t1*t2+t2*t2)
				switch rel {
				case ReleaseStart:
					want = delta*delta/2 + l*l*t2*t2/8
				case ReleaseEnd:
					want = delta*delta/2 + l*l*t1*t1/8
				case ReleaseBoth:
					want = delta * delta / 2
				}
				if !near(energy, want, kinematicTol) {
					t.Errorf("angle %.3f, L = %.3f: energy %.15g, want %.15g", angle, l, energy, want)
				}
				// A rigid-body motion: translation (tx, ty) and rotation r
				// about the start.
				tx, ty, r := rng.Float64(), rng.Float64(), rng.Float64()
				rigid := [6]float64{tx, ty, h1 * r, tx - r*l*s, ty + r*l*c, h2 * r}
				for i := range 6 {
					f := 0.0
					for j := range 6 {
						f += g[i][j] * rigid[j]
					}
					if math.Abs(f) > kinematicTol*(1+l) {
						t.Errorf("angle %.3f, L = %.3f: a rigid-body motion leaves force %g in place %d", angle, l, f, i)
					}
				}
			}
		})
	}
}
