package frame

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// column returns a vertical member of length l from a base node at the
// origin up to a top node, EI = chkE·chkI, with the supports given.
func column(l float64, base, top Support) *Model {
	return &Model{
		Sections: []Section{{Name: "S", E: chkE, A: chkA, I: chkI}},
		Nodes:    []Node{{Name: "B", Support: base}, {Name: "T", Y: l, Support: top}},
		Members:  []Member{{Name: "BT", Start: 0, End: 1}},
		Cases:    []Case{{Name: "c"}},
	}
}

// TestSpringsAtSupports checks elastic supports against closed forms
// (virtual work on a cantilever; the force method for a propped one),
// with equilibrium of the spring reactions beside them.
func TestSpringsAtSupports(t *testing.T) {
	const ei = chkE * chkI
	t.Run("cantilever on a rotational spring", func(t *testing.T) {
		// δ = HL³/3EI + HL²/kr: the member's bending plus the rotation
		// HL/kr of its base carried up the length L (closed form).
		const l, h, kr = 4.0, 10.0, 5e3
		mo := column(l, Pinned, Free)
		mo.Nodes[0].Springs[2] = kr
		mo.Cases[0].NodeLoads = []NodeLoad{{Node: 1, Fx: h}}
		sol := solve(t, mo)
		ux, _, _ := sol.Displacement(0, 1)
		if want := h*l*l*l/(3*ei) + h*l*l/kr; !near(ux, want, tightTol) {
			t.Errorf("tip deflection %.10g, want HL³/3EI + HL²/kr = %.10g", ux, want)
		}
		// The spring's reaction is −kr θ = −HL·sign: the whole overturning moment.
		if _, _, m := sol.Reaction(0, 0); !near(m, h*l, tightTol) {
			t.Errorf("base moment reaction %.10g, want HL = %g", m, h*l)
		}
	})
	t.Run("cantilever propped by a spring", func(t *testing.T) {
		// R = (3wL⁴/8)/(L³ + 3EI/ky): the tip deflection of the
		// cantilever under w, wL⁴/8EI, less RL³/3EI, equals R/ky
		// (force method).
		const l, w, ky = chkL, 10.0, 500.0
		mo := fixedBeam(l, false, MemberLoad{Member: 0, To: l, W: w, WEnd: w})
		mo.Nodes[1].Support = Free
		mo.Nodes[1].Springs[1] = ky
		sol := solve(t, mo)
		_, r, _ := sol.Reaction(0, 1)
		want := (3 * w * l * l * l * l / 8) / (l*l*l + 3*ei/ky)
		if !near(r, want, tightTol) {
			t.Errorf("spring reaction %.10g, want %.10g", r, want)
		}
		if _, uy, _ := sol.Displacement(0, 1); !near(uy, -want/ky, tightTol) {
			t.Errorf("tip deflection %.10g, want −R/ky = %.10g", uy, -want/ky)
		}
		// A stiff spring is a prop: 3wL/8 (propped cantilever, AISC
		// Manual beam diagram 12, recalled from memory).
		mo.Nodes[1].Springs[1] = 1e12
		sol = solve(t, mo)
		if _, r, _ := sol.Reaction(0, 1); !near(r, 3*w*l/8, 1e-6) {
			t.Errorf("stiff spring: %.10g, want 3wL/8 = %g", r, 3*w*l/8)
		}
	})
	t.Run("springs only vertically", func(t *testing.T) {
		// Nothing holds the beam along X: a mechanism, named.
		mo := fixedBeam(6, false, MemberLoad{Member: 0, To: 6, W: 1, WEnd: 1})
		mo.Nodes[0].Support, mo.Nodes[1].Support = Free, Free
		mo.Nodes[0].Springs = [3]float64{0, 1e3, 0}
		mo.Nodes[1].Springs = [3]float64{0, 1e3, 0}
		_, err := Solve(mo)
		var me *MechanismError
		if !errors.As(err, &me) || !strings.Contains(err.Error(), "move along X") {
			t.Fatalf("got %v, want a mechanism free along X", err)
		}
		mo.Nodes[0].Springs[0] = 1e3
		solve(t, mo) // held along X by a spring: stable
	})
	t.Run("held along X only", func(t *testing.T) {
		// Both ends held along X alone: nothing holds the beam up.
		mo := fixedBeam(6, false, MemberLoad{Member: 0, To: 6, W: 1, WEnd: 1})
		mo.Nodes[0].Support, mo.Nodes[1].Support = HoldX, HoldX
		_, err := Solve(mo)
		var me *MechanismError
		if !errors.As(err, &me) || !strings.Contains(err.Error(), "move along Y") {
			t.Fatalf("got %v, want a mechanism free along Y", err)
		}
		// A rotational spring at one end does not hold it up either; a
		// vertical spring does.
		mo.Nodes[0].Springs[2] = 1e3
		if _, err := Solve(mo); !errors.As(err, &me) {
			t.Fatalf("got %v, want a mechanism", err)
		}
		mo.Nodes[1].Springs[1] = 1e3
		solve(t, mo)
	})
}

// TestSupportHeldInXOnly: a column fixed at its base and held along X
// alone at its top is a propped cantilever for a lateral load and a
// cantilever for a vertical one. Under a uniform lateral load w the top
// takes 3wL/8 and the base moment is wL²/8 (AISC Manual, beam diagram
// 12, recalled from memory); a vertical load goes to the base.
func TestSupportHeldInXOnly(t *testing.T) {
	const l, w, p = 4.0, 5.0, 30.0
	mo := column(l, Fixed, HoldX)
	mo.Cases[0].MemberLoads = []MemberLoad{{Member: 0, Direction: GlobalX, To: l, W: w, WEnd: w}}
	mo.Cases[0].NodeLoads = []NodeLoad{{Node: 1, Fy: -p}}
	sol := solve(t, mo)
	fx, fy, m := sol.Reaction(0, 1)
	if !near(fx, -3*w*l/8, tightTol) || fy != 0 || m != 0 {
		t.Errorf("top reaction (%g, %g, %g), want (−3wL/8 = %g, 0, 0)", fx, fy, m, -3*w*l/8)
	}
	_, fy, m = sol.Reaction(0, 0)
	if !near(fy, p, tightTol) || !near(math.Abs(m), w*l*l/8, tightTol) {
		t.Errorf("base Fy %g, |M| %g, want %g and wL²/8 = %g", fy, math.Abs(m), p, w*l*l/8)
	}
	if s := HoldX.String(); s != "x" {
		t.Errorf("HoldX prints as %q", s)
	}
	if s := (HoldY | HoldRZ).String(); s != "y+rotation" {
		t.Errorf("HoldY|HoldRZ prints as %q", s)
	}
}

// TestSemiRigidEnds: a beam whose ends are joined to fixed nodes by
// rotational springs k carries, under a uniform load w, the end moment
// M = (wL²/12)/(1 + 2EI/(kL)): slope-deflection with the ends turning by
// θ and −θ against the nodes, M = wL²/12 − (2EI/L)(2θ − θ), and the
// springs' θ = M/k.
func TestSemiRigidEnds(t *testing.T) {
	const l, w, ei, k = 6.0, 10.0, 4e4, 2e4
	for _, rev := range []bool{false, true} {
		mo := fixedBeam(l, rev, MemberLoad{Member: 0, To: l, W: w, WEnd: w})
		mo.Sections[0] = Section{Name: "S", E: 2e8, I: ei / 2e8, A: 0.01}
		mo.Members[0].SpringStart, mo.Members[0].SpringEnd = k, k
		sol := solve(t, mo)
		want := (w * l * l / 12) / (1 + 2*ei/(k*l))
		if math.Abs(want-18) > 1e-12 {
			t.Fatalf("closed form %g, want 18.00", want)
		}
		for _, x := range []float64{0, l} {
			if got := sagging(sol, l, x, rev).M; !near(got, -want, tightTol) {
				t.Errorf("reversed %v: M at %g = %.10g, want −%g", rev, x, got, want)
			}
		}
		if got := sagging(sol, l, l/2, rev).M; !near(got, w*l*l/8-want, tightTol) {
			t.Errorf("reversed %v: midspan M %.10g, want wL²/8 − M_end = %g", rev, got, w*l*l/8-want)
		}
		// The end rotates relative to the node by M/k; the node is fixed,
		// so the member's slope at its end is M/k. Its deflection at
		// midspan: the fixed-ended value plus that of the end moments'
		// relief, 5wL⁴/384EI − M_end L²/8EI (superposition).
		d := sol.Deflection(0, 0, l/2)
		if rev {
			d = -d // local y points down
		}
		if wantD := -(5*w*l*l*l*l/(384*ei) - want*l*l/(8*ei)); !near(d, wantD, tightTol) {
			t.Errorf("reversed %v: midspan deflection %.10g, want %.10g", rev, d, wantD)
		}
	}
	// Very stiff springs are rigid ends; very soft ones hinges.
	mo := fixedBeam(l, false, MemberLoad{Member: 0, To: l, W: w, WEnd: w})
	mo.Members[0].SpringStart, mo.Members[0].SpringEnd = 1e15, 1e-9
	sol := solve(t, mo)
	if m0, m1 := sol.At(0, 0, 0).M, sol.At(0, 0, l).M; !near(m0, -w*l*l/8, 1e-6) || math.Abs(m1) > 1e-6 {
		t.Errorf("rigid start, nearly hinged end: M %g and %g, want −wL²/8 = %g and 0", m0, m1, -w*l*l/8)
	}
}

// TestRigidEndZones: a fixed-ended beam L = 6 with rigid zones of 0.3 at
// both ends under w = 10 is a fixed-ended beam of the flexible length
// l = 5.4 (fixed-end moment table: wl²/12 at the faces, wl²/24 at
// midspan, shear wl/2 at the faces); the zones carry the face forces to
// the nodes by statics: M_node = wl²/12 + (wl/2)(0.3) + w(0.3)²/2.
func TestRigidEndZones(t *testing.T) {
	const l, a, w = 6.0, 0.3, 10.0
	lf := l - 2*a
	for _, rev := range []bool{false, true} {
		mo := fixedBeam(l, rev, MemberLoad{Member: 0, To: l, W: w, WEnd: w})
		mo.Members[0].OffsetStart, mo.Members[0].OffsetEnd = a, a
		sol := solve(t, mo)
		for _, c := range []struct {
			x, m float64
			what string
		}{
			{a, -24.30, "face moment wl²/12"},
			{0, -32.85, "node moment"},
			{l / 2, 12.15, "midspan wl²/24"},
			{l - a, -24.30, "far face"},
		} {
			if got := sagging(sol, l, c.x, rev).M; !near(got, c.m, tightTol) {
				t.Errorf("reversed %v: %s at %g: %.10g, want %g", rev, c.what, c.x, got, c.m)
			}
		}
		v := sol.At(0, 0, a).V
		if rev {
			v = -v
		}
		if !near(v, 27.00, tightTol) {
			t.Errorf("reversed %v: face shear %.10g, want wl/2 = 27", rev, v)
		}
		// The flexible part deflects as a fixed-ended beam of span l:
		// wl⁴/384EI at midspan; the zones not at all.
		ei := chkE * chkI
		d := sol.Deflection(0, 0, l/2)
		if rev {
			d = -d // local y points down
		}
		if want := -w * lf * lf * lf * lf / (384 * ei); !near(d, want, tightTol) {
			t.Errorf("reversed %v: midspan deflection %.10g, want %.10g", rev, d, want)
		}
		if d := sol.Deflection(0, 0, a/2); math.Abs(d) > 1e-15 {
			t.Errorf("reversed %v: the rigid zone deflects by %g", rev, d)
		}
	}
	// A hinge at the face of a zone still turns the node: a beam pinned at
	// its faces, on zones, hangs from the nodes as a simple span of l
	// (moment wl²/8 at midspan) and puts the face shear times the zone,
	// plus the zone's own load, into the fixed nodes.
	mo := fixedBeam(l, false, MemberLoad{Member: 0, To: l, W: w, WEnd: w})
	mo.Members[0].OffsetStart, mo.Members[0].OffsetEnd = a, a
	mo.Members[0].Release = ReleaseBoth
	mo.Nodes[0].Support = Pinned // the zone holds the node's rotation
	mo.Nodes[1].Support = Pinned
	_, err := Solve(mo)
	var me *MechanismError
	if !errors.As(err, &me) {
		t.Fatalf("pinned nodes with hinged zones: got %v, want a mechanism (the zones turn about the pins)", err)
	}
	mo.Nodes[0].Support, mo.Nodes[1].Support = Fixed, Fixed
	sol := solve(t, mo)
	if got := sol.At(0, 0, l/2).M; !near(got, w*lf*lf/8, tightTol) {
		t.Errorf("hinged at the faces: midspan M %.10g, want wl²/8 = %g", got, w*lf*lf/8)
	}
	if got, want := sol.At(0, 0, 0).M, -(w*lf/2*a + w*a*a/2); !near(got, want, tightTol) {
		t.Errorf("hinged at the faces: node M %.10g, want %g", got, want)
	}
}

// TestRigidZonesFromDepths: beam ends take half the depth of the column
// they frame into (the smaller of the two at a node with a column above
// and one below), column ends half the depth of the beam, times the
// factor.
func TestRigidZonesFromDepths(t *testing.T) {
	mo := &Model{
		Sections: []Section{
			{Name: "C1", E: 1, A: 1, I: 1, Depth: 0.6},
			{Name: "C2", E: 1, A: 1, I: 1, Depth: 0.4},
			{Name: "B", E: 1, A: 1, I: 1, Depth: 0.8},
			{Name: "N", E: 1, A: 1, I: 1}, // no depth
		},
		Nodes: []Node{
			{Name: "A0", Support: Fixed}, {Name: "A1", Y: 4}, {Name: "A2", Y: 7},
			{Name: "B0", X: 6, Support: Fixed}, {Name: "B1", X: 6, Y: 4},
		},
		Members: []Member{
			{Name: "A0-A1", Start: 0, End: 1, Section: 0},
			{Name: "A1-A2", Start: 1, End: 2, Section: 1},
			{Name: "B0-B1", Start: 3, End: 4, Section: 3},
			{Name: "A1-B1", Start: 1, End: 4, Section: 2},
		},
	}
	z := RigidZones(mo, 0.5)
	want := [][2]float64{
		{0, 0.5 * 0.4}, // column below A1: half the beam's 0.8, times 0.5
		{0.5 * 0.4, 0}, // column above A1
		{0, 0.5 * 0.4}, // a column with no depth still takes the beam's
		{0.5 * 0.2, 0}, // the beam: the smaller column at A1 (0.4), none at B1
	}
	for m := range want {
		if !near(z[m][0], want[m][0], tightTol) || !near(z[m][1], want[m][1], tightTol) {
			t.Errorf("member %s: zones %v, want %v", mo.Members[m].Name, z[m], want[m])
		}
	}
	mo.Members[3].OffsetStart = 0.05
	mo.SetRigidZones(1, func(m, side int) bool { return m == 3 && side == 0 })
	if got := mo.Members[3]; got.OffsetStart != 0.05 || got.OffsetEnd != 0 {
		t.Errorf("a zone of its own is kept: %v, %v", got.OffsetStart, got.OffsetEnd)
	}
	if got := mo.Members[0].OffsetEnd; got != 0.4 {
		t.Errorf("factor 1: %v, want 0.4", got)
	}
}

// TestJointsAreValidated: springs only where the support does not hold
// the node, a semi-rigid end not also released, zones that leave the
// member some length.
func TestJointsAreValidated(t *testing.T) {
	for _, tc := range []struct {
		name string
		edit func(mo *Model)
		want string
	}{
		{"spring where held", func(mo *Model) { mo.Nodes[0].Springs[0] = 1 }, `node "L": spring kx acts in a direction the support holds`},
		{"negative spring", func(mo *Model) { mo.Nodes[1].Support = Free; mo.Nodes[1].Springs[1] = -1 }, `spring ky must be a finite number >= 0`},
		{"released and semi-rigid", func(mo *Model) {
			mo.Members[0].Release = ReleaseEnd
			mo.Members[0].SpringEnd = 10
		}, `a spring at its end, which is released`},
		{"zones too long", func(mo *Model) { mo.Members[0].OffsetStart, mo.Members[0].OffsetEnd = 3, 3 }, `leave no flexible length`},
		{"unknown support", func(mo *Model) { mo.Nodes[0].Support = 8 }, `unknown support`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			mo := fixedBeam(6, false)
			tc.edit(mo)
			err := mo.Validate()
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("got %v, want an error with %q", err, tc.want)
			}
		})
	}
}

// TestRigidZonesAgainstStiffStubs: rigid end zones give what short, very
// stiff members in their place give (the zones as members 10⁴ times
// stiffer, common practice for modelling them), on a portal that sways
// under a lateral load and carries a load across its zones: the node
// displacements and the moments agree to the stubs' flexibility (stubs
// stiffer still leave too few digits to compare).
func TestRigidZonesAgainstStiffStubs(t *testing.T) {
	const h, l, a, b = 4.0, 6.0, 0.25, 0.35
	loads := func(beam int, from float64) Case {
		return Case{Name: "c",
			MemberLoads: []MemberLoad{{Member: beam, From: from, To: from + l, W: 10, WEnd: 20}},
			NodeLoads:   []NodeLoad{{Node: 1, Fx: 15}},
		}
	}
	sec := []Section{{Name: "S", E: 2e8, A: 1e-2, I: 2e-4}, {Name: "R", E: 2e12, A: 1e-2, I: 2e-4}}
	zoned := &Model{
		Sections: sec,
		Nodes:    []Node{{Name: "A0", Support: Fixed}, {Name: "A1", Y: h}, {Name: "B1", X: l, Y: h}, {Name: "B0", X: l, Support: Pinned}},
		Members: []Member{
			{Name: "A0-A1", Start: 0, End: 1, OffsetEnd: b},
			{Name: "A1-B1", Start: 1, End: 2, OffsetStart: a, OffsetEnd: b},
			{Name: "B0-B1", Start: 3, End: 2, OffsetEnd: a},
		},
		Cases: []Case{loads(1, 0)},
	}
	stubs := &Model{
		Sections: sec,
		Nodes: []Node{{Name: "A0", Support: Fixed}, {Name: "A1", Y: h}, {Name: "B1", X: l, Y: h}, {Name: "B0", X: l, Support: Pinned},
			{Name: "a", Y: h - b}, {Name: "b", X: a, Y: h}, {Name: "c", X: l - b, Y: h}, {Name: "d", X: l, Y: h - a}},
		Members: []Member{
			{Name: "A0-a", Start: 0, End: 4}, {Name: "a-A1", Start: 4, End: 1, Section: 1},
			{Name: "A1-b", Start: 1, End: 5, Section: 1}, {Name: "b-c", Start: 5, End: 6}, {Name: "c-B1", Start: 6, End: 2, Section: 1},
			{Name: "B0-d", Start: 3, End: 7}, {Name: "d-B1", Start: 7, End: 2, Section: 1},
		},
	}
	c := Case{Name: "c", NodeLoads: []NodeLoad{{Node: 1, Fx: 15}}}
	// The same trapezoidal load, cut at the stubs' ends.
	for _, p := range []struct {
		m        int
		from, to float64
	}{{2, 0, a}, {3, 0, l - a - b}, {4, 0, b}} {
		x0 := p.from + map[int]float64{2: 0, 3: a, 4: l - b}[p.m]
		x1 := p.to + map[int]float64{2: 0, 3: a, 4: l - b}[p.m]
		c.MemberLoads = append(c.MemberLoads, MemberLoad{Member: p.m, From: p.from, To: p.to, W: 10 + 10*x0/l, WEnd: 10 + 10*x1/l})
	}
	stubs.Cases = []Case{c}
	sz, ss := solve(t, zoned), solve(t, stubs)
	const stubTol = 1e-3 // relative: the stubs bend by 10⁻⁴ of the members' curvature
	for v := range 4 {
		ux, uy, rz := sz.Displacement(0, v)
		wx, wy, wz := ss.Displacement(0, v)
		rel := func(a, b float64) bool { return math.Abs(a-b) <= stubTol*math.Abs(b)+1e-12 }
		if !rel(ux, wx) || !rel(uy, wy) || !rel(rz, wz) {
			t.Errorf("node %s: zones (%g, %g, %g), stubs (%g, %g, %g)", zoned.Nodes[v].Name, ux, uy, rz, wx, wy, wz)
		}
	}
	for _, p := range []struct {
		zm, sm int
		zx, sx float64
	}{{1, 2, 0, 0}, {1, 4, l, b}, {0, 0, h - b, h - b}, {1, 3, l / 2, l/2 - a}, {2, 5, h - a, h - a}} {
		mz, ms := sz.At(0, p.zm, p.zx).M, ss.At(0, p.sm, p.sx).M
		if math.Abs(mz-ms) > stubTol*math.Abs(ms) {
			t.Errorf("member %s at %g: zones %g, stubs %g", zoned.Members[p.zm].Name, p.zx, mz, ms)
		}
	}
}
