package frame

import (
	"fmt"
	"math"
	"testing"
)

// beam returns a single horizontal span of length l between nodes a and b
// with the supports given, under a downward UDL w over its whole length.
func beam(l, w float64, sa, sb Support, rel Release) *Model {
	return &Model{
		Sections: []Section{{Name: "S", E: 200e6, A: 1e-2, I: 1e-4}},
		Nodes:    []Node{{Name: "a", Support: sa}, {Name: "b", X: l, Support: sb}},
		Members:  []Member{{Name: "a-b", Start: 0, End: 1, Release: rel}},
		Cases: []Case{{Name: "w",
			MemberLoads: []MemberLoad{{Member: 0, From: 0, To: l, W: w, WEnd: w}}}},
	}
}

// The deflection relative to the chord of single spans against the beam
// tables: AISC Steel Construction Manual, Table 3-23 (recalled from
// memory; each formula is also the beam's elastic curve, EI d²v/dx² = M with
// v = 0 at both supports). Deflections there are downward; local y of a
// beam drawn left to right is up, hence the minus signs.
func TestDeflectionBeamTables(t *testing.T) {
	const l, w, p = 7.5, 12.0, 40.0
	ei := 200e6 * 1e-4
	simple := beam(l, w, Pinned, Roller, ReleaseNone)
	fixed := beam(l, w, Fixed, Fixed, ReleaseNone)
	// A hinge at the end of a member framing into a fixed node: a propped
	// cantilever, fixed at a and simply supported at b.
	propped := beam(l, w, Fixed, Fixed, ReleaseEnd)
	point := beam(l, 0, Pinned, Roller, ReleaseNone)
	point.Cases[0].MemberLoads = []MemberLoad{{Member: 0, Point: true, At: l / 2, P: p}}
	for _, tc := range []struct {
		name   string
		mo     *Model
		source string
		want   func(x float64) float64 // downward deflection at x
	}{
		// Case 1, simple beam, uniformly distributed load:
		// Δx = w x (L³ − 2 L x² + x³) / 24EI; at midspan 5wL⁴/384EI.
		{"simple span, uniform load", simple, "AISC 3-23 case 1", func(x float64) float64 {
			return w * x * (l*l*l - 2*l*x*x + x*x*x) / (24 * ei)
		}},
		// Case 15, beam fixed at both ends, uniformly distributed load:
		// Δx = w x² (L − x)² / 24EI; at midspan wL⁴/384EI.
		{"fixed at both ends, uniform load", fixed, "AISC 3-23 case 15", func(x float64) float64 {
			return w * x * x * (l - x) * (l - x) / (24 * ei)
		}},
		// Case 12, beam fixed at one end, supported at the other, uniformly
		// distributed load: Δx = w x (L³ − 3 L x² + 2 x³) / 48EI measured
		// from the supported end; here the fixed end is at x = 0, so the
		// formula is taken at L − x.
		{"hinge at the end: propped cantilever", propped, "AISC 3-23 case 12", func(x float64) float64 {
			y := l - x
			return w * y * (l*l*l - 3*l*y*y + 2*y*y*y) / (48 * ei)
		}},
		// Case 7, simple beam, concentrated load at centre:
		// Δx = P x (3L² − 4x²) / 48EI for x < L/2; at centre PL³/48EI.
		{"simple span, central point load", point, "AISC 3-23 case 7", func(x float64) float64 {
			if x > l/2 {
				x = l - x
			}
			return p * x * (3*l*l - 4*x*x) / (48 * ei)
		}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			sol := solve(t, tc.mo)
			for i := 0; i <= 16; i++ {
				x := l * float64(i) / 16
				got, want := sol.Deflection(0, 0, x), -tc.want(x)
				// Scaled by the largest deflection: the values are exact
				// but vanish at the supports.
				if math.Abs(got-want) > tightTol*tc.want(l/2) {
					t.Errorf("%s: x = %g: deflection %.12g, want %.12g", tc.source, x, got, want)
				}
			}
		})
	}
	t.Run("midspan values 5wL^4/384EI and wL^4/384EI", func(t *testing.T) {
		// The two values the report's deflections are most often checked
		// against (AISC 3-23 cases 1 and 15).
		if got, want := -solve(t, simple).Deflection(0, 0, l/2), 5*w*l*l*l*l/(384*ei); !near(got, want, tightTol) {
			t.Errorf("simple span: %g, want 5wL^4/384EI = %g", got, want)
		}
		if got, want := -solve(t, fixed).Deflection(0, 0, l/2), w*l*l*l*l/(384*ei); !near(got, want, tightTol) {
			t.Errorf("fixed ends: %g, want wL^4/384EI = %g", got, want)
		}
	})
}

// TestDeflectionMatchesAnInteriorNode checks the deflection of a member
// relative to its chord against the exact nodal displacements of the
// stiffness method: the same frame with the member split by a node at x
// gives that node's displacement, and its component across the chord of
// the displaced ends is the deflection. The frame sways, has an inclined
// member with a hinge, a trapezoidal partial load, loads along global X
// and point loads on both sides of the node (closed form: the stiffness
// method is exact at the nodes of prismatic members, common practice).
func TestDeflectionMatchesAnInteriorNode(t *testing.T) {
	const splitAt = 0.37 // fraction of the member's length
	for _, tc := range []struct {
		name string
		m    int
		rel  Release
	}{
		{"inclined rafter, rigid", 1, ReleaseNone},
		{"inclined rafter, hinged at its start", 1, ReleaseStart},
		{"column", 0, ReleaseNone},
		{"horizontal beam hinged at its end", 2, ReleaseEnd},
	} {
		t.Run(tc.name, func(t *testing.T) {
			whole := slopedFrame(tc.rel, -1, 0)
			sol := solve(t, whole)
			l := whole.Length(tc.m)
			x := splitAt * l
			split := slopedFrame(tc.rel, tc.m, x)
			ss := solve(t, split)
			c, s, _ := whole.geometry(tc.m)
			mem := whole.Members[tc.m]
			u := func(n int) (float64, float64) { ux, uy, _ := ss.Displacement(0, n); return ux, uy }
			ax, ay := u(mem.Start)
			bx, by := u(mem.End)
			px, py := u(len(split.Nodes) - 1)
			r := x / l
			dx, dy := px-ax-r*(bx-ax), py-ay-r*(by-ay)
			want := -s*dx + c*dy
			got := sol.Deflection(0, tc.m, x)
			if !near(got, want, tightTol) || want == 0 {
				t.Errorf("deflection at x = %g: %.12g, by an interior node %.12g", x, got, want)
			}
			// And through the buffer-filling form, among other stations.
			xs := []float64{0, x, l}
			dst := make([]float64, len(xs)*len(whole.Cases))
			sol.DeflectionsTo(dst, tc.m, xs)
			if dst[0] != 0 || math.Abs(dst[2]) > tightTol*math.Abs(want) || dst[1] != got {
				t.Errorf("DeflectionsTo = %v, want [0 %g 0]", dst, got)
			}
		})
	}
}

// slopedFrame is a portal with a pitched rafter and a lean-to beam: fixed
// bases at a and e, column a-b, rafter b-c (release rel at its start),
// beam c-d with a hinge at d, column d-e. With split ≥ 0, member split is
// divided by a node at distance at from its start, its loads shared out.
func slopedFrame(rel Release, split int, at float64) *Model {
	mo := &Model{
		Sections: []Section{{Name: "col", E: 200e6, A: 8e-3, I: 1.2e-4}, {Name: "beam", E: 200e6, A: 6e-3, I: 2.1e-4}},
		Nodes: []Node{
			{Name: "a", X: 0, Y: 0, Support: Fixed}, {Name: "b", X: 0, Y: 4},
			{Name: "c", X: 5, Y: 5.5}, {Name: "d", X: 9, Y: 5.5}, {Name: "e", X: 9, Y: 0, Support: Fixed},
		},
		Members: []Member{
			{Name: "a-b", Start: 0, End: 1, Section: 0},
			{Name: "b-c", Start: 1, End: 2, Section: 1, Release: rel},
			{Name: "c-d", Start: 2, End: 3, Section: 1, Release: ReleaseEnd},
			{Name: "d-e", Start: 3, End: 4, Section: 0},
		},
	}
	lr := mo.Length(1)
	loads := []MemberLoad{
		{Member: 0, Direction: GlobalX, From: 0.5, To: 3.5, W: 2, WEnd: 5},
		{Member: 0, Direction: GlobalX, Point: true, At: 0.8, P: 6},
		{Member: 1, From: 0.2 * lr, To: 0.9 * lr, W: 9, WEnd: 3},
		{Member: 1, Point: true, At: 0.2 * lr, P: 15},
		{Member: 1, Point: true, At: 0.75 * lr, P: 11},
		{Member: 1, Direction: GlobalX, From: 0, To: lr, W: 1.5, WEnd: 1.5},
		{Member: 2, From: 0, To: 4, W: 7, WEnd: 7},
		{Member: 2, Point: true, At: 3, P: 8},
	}
	c := Case{Name: "mixed", NodeLoads: []NodeLoad{{Node: 2, Fx: 4, Fy: -10}}}
	if split < 0 {
		c.MemberLoads = loads
		mo.Cases = []Case{c}
		return mo
	}
	// Split member split at distance at: a new node p, the member becomes
	// start-p and p-end (the release kept at its own end), loads cut at p.
	m := mo.Members[split]
	a, b := mo.Nodes[m.Start], mo.Nodes[m.End]
	l := mo.Length(split)
	r := at / l
	mo.Nodes = append(mo.Nodes, Node{Name: "p", X: a.X + r*(b.X-a.X), Y: a.Y + r*(b.Y-a.Y)})
	p := len(mo.Nodes) - 1
	second := len(mo.Members)
	first := m
	first.End = p
	first.Name = fmt.Sprint(m.Name, "/1")
	rest := m
	rest.Start = p
	rest.Name = fmt.Sprint(m.Name, "/2")
	first.Release, rest.Release = ReleaseNone, ReleaseNone
	if m.Release.AtStart() {
		first.Release = ReleaseStart
	}
	if m.Release.AtEnd() {
		rest.Release = ReleaseEnd
	}
	mo.Members[split] = first
	mo.Members = append(mo.Members, rest)
	for _, ld := range loads {
		if ld.Member != split {
			c.MemberLoads = append(c.MemberLoads, ld)
			continue
		}
		if ld.Point {
			if ld.At < at {
				c.MemberLoads = append(c.MemberLoads, ld)
			} else {
				ld.Member, ld.At = second, ld.At-at
				c.MemberLoads = append(c.MemberLoads, ld)
			}
			continue
		}
		if ld.From < at {
			part := ld
			part.To = math.Min(ld.To, at)
			part.WEnd = ld.IntensityAt(part.To)
			c.MemberLoads = append(c.MemberLoads, part)
		}
		if ld.To > at {
			part := ld
			part.Member = second
			part.From = math.Max(ld.From, at)
			part.W = ld.IntensityAt(part.From)
			part.From, part.To = part.From-at, ld.To-at
			c.MemberLoads = append(c.MemberLoads, part)
		}
	}
	mo.Cases = []Case{c}
	return mo
}

func TestStationsAndDeflectionsToAgree(t *testing.T) {
	mo := slopedFrame(ReleaseStart, -1, 0)
	mo.Cases = append(mo.Cases, Case{Name: "nodes only", NodeLoads: []NodeLoad{{Node: 1, Fx: 7}}})
	sol := solve(t, mo)
	for m := range mo.Members {
		l := mo.Length(m)
		xs := []float64{0, 0.2 * l, 0.5 * l, 0.93 * l, l}
		n := len(xs) * len(mo.Cases)
		f1, f2 := make([]Forces, n), make([]Forces, n)
		d1, d2 := make([]float64, n), make([]float64, n)
		sol.StationsTo(f1, m, xs)
		sol.DeflectionsTo(d1, m, xs)
		sol.StationsAndDeflectionsTo(f2, d2, m, xs)
		for i := range n {
			if f1[i] != f2[i] || d1[i] != d2[i] {
				t.Errorf("member %s, value %d: separately %v %g, together %v %g", mo.Members[m].Name, i, f1[i], d1[i], f2[i], d2[i])
			}
		}
	}
}
