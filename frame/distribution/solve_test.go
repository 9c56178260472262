package distribution

import (
	"fmt"
	"math"
	"testing"

	"govern/frame"
)

// Tolerances. Distribution is iterated to 1e-12, so published closed forms
// are matched closely; the stiffness solver includes axial strain, which
// moment distribution neglects, so the two agree to that order only.
const (
	closeTol = 1e-9 // relative, closed forms
	axialTol = 1e-5 // relative, against the stiffness solver with stiff members
	printTol = 5e-3 // absolute, values printed to two decimals
)

func near(got, want, tol float64) bool {
	return math.Abs(got-want) <= tol*math.Max(1, math.Abs(want))
}

// beam returns a continuous beam of the given spans along X: the first
// support pinned, the rest rollers, one section, and one empty case.
func beam(spans ...float64) *frame.Model {
	mo := &frame.Model{Sections: []frame.Section{{Name: "S", E: 200e6, A: 1e-2, I: 1e-4}}}
	x := 0.0
	for i := 0; i <= len(spans); i++ {
		s := frame.Roller
		if i == 0 {
			s = frame.Pinned
		}
		mo.Nodes = append(mo.Nodes, frame.Node{Name: fmt.Sprint("N", i), X: x, Support: s})
		if i < len(spans) {
			x += spans[i]
		}
	}
	for i := range spans {
		mo.Members = append(mo.Members, frame.Member{Name: fmt.Sprint("S", i+1), Start: i, End: i + 1})
	}
	mo.Cases = []frame.Case{{Name: "w"}}
	return mo
}

func udl(m int, w, l float64) frame.MemberLoad {
	return frame.MemberLoad{Member: m, From: 0, To: l, W: w, WEnd: w}
}

func solve(t *testing.T, mo *frame.Model) *Result {
	t.Helper()
	if err := mo.Validate(); err != nil {
		t.Fatal(err)
	}
	r, err := Solve(mo, nil)
	if err != nil {
		t.Fatalf("Solve: %v", err)
	}
	return r
}

// support returns the bending moment (sagging positive) at the end of member
// m (side 0 start, 1 end) from the end moments.
func bending(r *Result, c, m, side int) float64 {
	s, e := r.EndMoments(c, m)
	if side == 0 {
		return -s
	}
	return e
}

func TestContinuousBeams(t *testing.T) {
	// Continuous beam coefficients for equal spans under uniform load w
	// (AISC Steel Construction Manual, Table 3-23, and continuous beam
	// coefficient tables; recalled from memory). Exact fractions by the
	// three-moment equation (closed form).
	const l, w = 5.0, 8.0
	wl2 := w * l * l
	for _, tc := range []struct {
		name   string
		spans  int
		loaded []int
		want   []float64 // bending moment at the interior supports, in wL^2
	}{
		{"2 spans, both loaded: -1/8", 2, []int{0, 1}, []float64{-1.0 / 8}},
		{"2 spans, one loaded: -1/16", 2, []int{0}, []float64{-1.0 / 16}},
		{"3 spans, all loaded: -1/10, -1/10", 3, []int{0, 1, 2}, []float64{-0.1, -0.1}},
		{"3 spans, 1 and 2 loaded: -7/60, -1/30", 3, []int{0, 1}, []float64{-7.0 / 60, -1.0 / 30}},
		{"3 spans, end spans loaded: -1/20, -1/20", 3, []int{0, 2}, []float64{-0.05, -0.05}},
		{"4 spans, all loaded: -3/28, -1/14, -3/28", 4, []int{0, 1, 2, 3}, []float64{-3.0 / 28, -1.0 / 14, -3.0 / 28}},
		{"4 spans, 1, 2 and 4 loaded: -27/224, -1/56, -13/224", 4, []int{0, 1, 3}, []float64{-27.0 / 224, -1.0 / 56, -13.0 / 224}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			spans := make([]float64, tc.spans)
			for i := range spans {
				spans[i] = l
			}
			mo := beam(spans...)
			for _, m := range tc.loaded {
				mo.Cases[0].MemberLoads = append(mo.Cases[0].MemberLoads, udl(m, w, l))
			}
			r := solve(t, mo)
			for i, want := range tc.want {
				if got := bending(r, 0, i, 1); !near(got, want*wl2, closeTol) {
					t.Errorf("support %d: M = %g, want %g", i+1, got, want*wl2)
				}
				// Equilibrium of the joint: the moments either side are equal.
				if left, right := bending(r, 0, i, 1), bending(r, 0, i+1, 0); !near(left, right, closeTol) {
					t.Errorf("support %d: %g left, %g right", i+1, left, right)
				}
			}
			// Pinned end supports carry no moment.
			if got := bending(r, 0, 0, 0); math.Abs(got) > closeTol*wl2 {
				t.Errorf("end support M = %g", got)
			}
		})
	}
}

func TestTextbookExample(t *testing.T) {
	// Pytel and Singer, Strength of Materials, 4th ed., Problem 877: the
	// beam of Fig. P-815 by moment distribution (book and problem number
	// recalled from memory; data and final moments as in a stored worked
	// solution, checked here by the three-moment equation by hand): simple
	// support R1, span 12 ft with 300 lb at 4 ft and 8 ft; span 10 ft with
	// 60 lb/ft uniform plus a triangle of 75 lb/ft at R2 falling to 0 at R3;
	// overhang 8 ft with a triangle of 60 lb/ft at R3 falling to 0 at the
	// tip. EI constant. M2 = -1077.27 lb·ft, M3 = -640 lb·ft.
	mo := TextbookBeam()
	r := solve(t, mo)
	if got := bending(r, 0, 0, 1); math.Abs(got-(-1077.27)) > printTol {
		t.Errorf("M2 = %.4f, want -1077.27", got)
	}
	if got := bending(r, 0, 1, 1); math.Abs(got-(-640)) > printTol {
		t.Errorf("M3 = %.4f, want -640", got)
	}
	if got := bending(r, 0, 2, 0); math.Abs(got-(-640)) > printTol {
		t.Errorf("overhang root M = %.4f, want -640", got)
	}
}

// TextbookBeam is the beam of Pytel and Singer, Fig. P-815, in lb and ft.
func TextbookBeam() *frame.Model {
	mo := beam(12, 10)
	mo.Nodes = append(mo.Nodes, frame.Node{Name: "tip", X: 30})
	mo.Members = append(mo.Members, frame.Member{Name: "overhang", Start: 2, End: 3})
	mo.Sections[0] = frame.Section{Name: "EI", E: 1.5e9, A: 1, I: 1}
	mo.Cases[0].MemberLoads = []frame.MemberLoad{
		{Member: 0, Point: true, At: 4, P: 300},
		{Member: 0, Point: true, At: 8, P: 300},
		udl(1, 60, 10),
		{Member: 1, To: 10, W: 75},
		{Member: 2, To: 8, W: 60},
	}
	return mo
}

// portal returns a single-bay portal: columns of height h, beam of span l.
func portal(base frame.Support, l, h, ib, ic float64) *frame.Model {
	return &frame.Model{
		Sections: []frame.Section{{Name: "col", E: 30e6, A: 1e4, I: ic}, {Name: "beam", E: 30e6, A: 1e4, I: ib}},
		Nodes: []frame.Node{
			{Name: "A0", Support: base}, {Name: "A1", Y: h},
			{Name: "B1", X: l, Y: h}, {Name: "B0", X: l, Support: base},
		},
		Members: []frame.Member{
			{Name: "A0-A1", Start: 0, End: 1, Section: 0},
			{Name: "A1-B1", Start: 1, End: 2, Section: 1},
			{Name: "B0-B1", Start: 3, End: 2, Section: 0},
		},
	}
}

func TestPortalFrames(t *testing.T) {
	// Rigid frame formulas for a single-bay portal, k = (Ib/L)/(Ic/h)
	// (rigid frame formula tables, recalled from memory; checked by
	// slope-deflection by hand). Signs: a column drawn bottom to top is in
	// tension on its +X face under positive M, so a sway to the right puts
	// the base of the left column in negative and its top in positive moment.
	const l, h, w, hx = 8.0, 4.0, 12.0, 30.0
	const ib, ic = 2e-3, 1e-3
	k := (ib / l) / (ic / h)
	for _, tc := range []struct {
		name   string
		base   frame.Support
		load   frame.Case
		member int
		x      int // side
		want   float64
	}{
		{"fixed bases, beam UDL: corner wL^2/(6(k+2))", frame.Fixed,
			frame.Case{MemberLoads: []frame.MemberLoad{udl(1, w, l)}}, 1, 0, -w * l * l / (6 * (k + 2))},
		{"fixed bases, beam UDL: base wL^2/(12(k+2))", frame.Fixed,
			frame.Case{MemberLoads: []frame.MemberLoad{udl(1, w, l)}}, 0, 0, w * l * l / (12 * (k + 2))},
		{"pinned bases, beam UDL: corner wL^2/(4(2k+3))", frame.Pinned,
			frame.Case{MemberLoads: []frame.MemberLoad{udl(1, w, l)}}, 1, 1, -w * l * l / (4 * (2*k + 3))},
		{"pinned bases, central point: corner 3PL/(8(2k+3))", frame.Pinned,
			frame.Case{MemberLoads: []frame.MemberLoad{{Member: 1, Point: true, At: l / 2, P: w}}}, 1, 0, -3 * w * l / (8 * (2*k + 3))},
		{"fixed bases, H at the beam: base (Hh/2)(3k+1)/(6k+1)", frame.Fixed,
			frame.Case{NodeLoads: []frame.NodeLoad{{Node: 1, Fx: hx}}}, 0, 0, -hx * h / 2 * (3*k + 1) / (6*k + 1)},
		{"fixed bases, H at the beam: top (Hh/2)(3k)/(6k+1)", frame.Fixed,
			frame.Case{NodeLoads: []frame.NodeLoad{{Node: 1, Fx: hx}}}, 0, 1, hx * h / 2 * 3 * k / (6*k + 1)},
		{"pinned bases, H at the beam: top Hh/2", frame.Pinned,
			frame.Case{NodeLoads: []frame.NodeLoad{{Node: 1, Fx: hx}}}, 2, 1, hx * h / 2},
	} {
		t.Run(tc.name, func(t *testing.T) {
			mo := portal(tc.base, l, h, ib, ic)
			tc.load.Name = "c"
			mo.Cases = []frame.Case{tc.load}
			r := solve(t, mo)
			if !r.Sway || len(r.SwayLines) != 1 || len(r.SwayLines[0]) != 2 {
				t.Errorf("sway %v %v, want the beam line to sway", r.Sway, r.SwayLines)
			}
			if got := bending(r, 0, tc.member, tc.x); !near(got, tc.want, closeTol) {
				t.Errorf("M = %g, want %g", got, tc.want)
			}
		})
	}
}
