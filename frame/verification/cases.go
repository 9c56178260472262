package verification

import (
	"fmt"
	"math"

	"govern/frame"
)

// Tolerances of the comparisons, relative to the published value.
const (
	// Exact is for exact theory: the stiffness method with exact fixed-end
	// forces is exact for prismatic members, so only round-off remains.
	Exact = 1e-9
	// Axial is for formulas that neglect the axial strain the solver
	// includes; the members are made axially stiff, leaving this much.
	Axial = 1e-5
)

// printed returns the relative tolerance of a value printed to the given
// number of decimals: half a unit of the last digit.
func printed(v float64, decimals int) float64 {
	return 0.5 * math.Pow(10, -float64(decimals)) / math.Abs(v)
}

// Steel beam properties of the beam cases, kN and m.
const (
	steelE = 200e6 // kN/m²
	steelI = 1e-4  // m⁴
	steelA = 1e-2  // m²
)

// line returns a beam along X with nodes at xs and the given supports, one
// member between each pair of neighbouring nodes, and one load case.
func line(xs []float64, sup []frame.Support, loads ...frame.MemberLoad) *frame.Model {
	mo := &frame.Model{Sections: []frame.Section{{Name: "steel", E: steelE, A: steelA, I: steelI}}}
	for i, x := range xs {
		mo.Nodes = append(mo.Nodes, frame.Node{Name: fmt.Sprint("N", i), X: x, Support: sup[i]})
	}
	for i := 1; i < len(xs); i++ {
		mo.Members = append(mo.Members, frame.Member{Name: fmt.Sprintf("N%d-N%d", i-1, i), Start: i - 1, End: i})
	}
	mo.Cases = []frame.Case{{Name: "load", MemberLoads: loads}}
	return mo
}

// spans returns n equal spans of length l on a pin and rollers, with a
// uniform load w on the spans listed.
func spans(n int, l, w float64, loaded ...int) *frame.Model {
	xs := make([]float64, n+1)
	sup := make([]frame.Support, n+1)
	for i := range xs {
		xs[i], sup[i] = float64(i)*l, frame.Roller
	}
	sup[0] = frame.Pinned
	mo := line(xs, sup)
	for _, m := range loaded {
		mo.Cases[0].MemberLoads = append(mo.Cases[0].MemberLoads, uniform(m, 0, l, w))
	}
	return mo
}

func uniform(m int, from, to, w float64) frame.MemberLoad {
	return frame.MemberLoad{Member: m, From: from, To: to, W: w, WEnd: w}
}

func point(m int, at, p float64) frame.MemberLoad {
	return frame.MemberLoad{Member: m, Point: true, At: at, P: p}
}

// Quantity accessors, all for load case 0.

func momentAt(m int, x float64) func(*Solved) float64 {
	return func(s *Solved) float64 { return s.Sol.At(0, m, x).M }
}

func reactionFy(v int) func(*Solved) float64 {
	return func(s *Solved) float64 { _, fy, _ := s.Sol.Reaction(0, v); return fy }
}

func reactionFx(v int) func(*Solved) float64 {
	return func(s *Solved) float64 { fx, _, _ := s.Sol.Reaction(0, v); return fx }
}

func shearAt(m int, x float64) func(*Solved) float64 {
	return func(s *Solved) float64 { return s.Sol.At(0, m, x).V }
}

func axialAt(m int, x float64) func(*Solved) float64 {
	return func(s *Solved) float64 { return s.Sol.At(0, m, x).N }
}

// sway returns the displacement of node v along X.
func sway(v int) func(*Solved) float64 {
	return func(s *Solved) float64 { ux, _, _ := s.Sol.Displacement(0, v); return ux }
}

func deflection(v int) func(*Solved) float64 {
	return func(s *Solved) float64 { _, uy, _ := s.Sol.Displacement(0, v); return -uy }
}

// endMoment returns the bending moment at an end of member m (side 0 start,
// 1 end) by moment distribution.
func endMoment(m, side int) func(*Solved) float64 {
	return func(s *Solved) float64 {
		a, b := s.Dist.EndMoments(0, m)
		if side == 0 {
			return -a
		}
		return b
	}
}

// inflection returns, as a fraction of the length of member m, the point in
// (0, L/2) where the bending moment changes sign, found by bisection.
func inflection(m int) func(*Solved) float64 {
	return func(s *Solved) float64 {
		l := s.Model.Length(m)
		lo, hi := 0.0, l/2
		flo := s.Sol.At(0, m, lo).M
		for range 200 {
			mid := (lo + hi) / 2
			if f := s.Sol.At(0, m, mid).M; (f < 0) == (flo < 0) {
				lo, flo = mid, f
			} else {
				hi = mid
			}
		}
		return (lo + hi) / 2 / l
	}
}

func q(name string, published, tol float64, get func(*Solved) float64) Quantity {
	return Quantity{Name: name, Published: published, Tol: tol, Method: Stiffness, Get: get}
}

// Cases returns the catalogue of published cases.
func Cases() []Case {
	var cs []Case
	cs = append(cs, beamTables()...)
	cs = append(cs, continuousBeams()...)
	cs = append(cs, rigidFrames()...)
	cs = append(cs, fixedEndMoments()...)
	cs = append(cs, closedForms()...)
	cs = append(cs, deformations()...)
	cs = append(cs, textbook()...)
	return cs
}

// beamTables are the single-span cases of the steel manual's beam table.
func beamTables() []Case {
	const l, w, p = 6.0, 10.0, 40.0
	const ei = steelE * steelI
	wl2, pl := w*l*l, p*l
	pin, rol, fix, free := frame.Pinned, frame.Roller, frame.Fixed, frame.Support(frame.Free)
	return []Case{
		{Name: "Simple beam, uniform load (L = 6, w = 10)", Source: AISC,
			Model: func() *frame.Model {
				return line([]float64{0, l / 2, l}, []frame.Support{pin, free, rol}, uniform(0, 0, l/2, w), uniform(1, 0, l/2, w))
			},
			Quantities: []Quantity{
				q("M at centre = wL²/8", wl2/8, Exact, momentAt(0, l/2)),
				q("R = wL/2", w*l/2, Exact, reactionFy(0)),
				q("deflection at centre = 5wL⁴/384EI", 5*w*l*l*l*l/(384*ei), Exact, deflection(1)),
			}},
		{Name: "Simple beam, load increasing uniformly to one end (L = 6, w = 10 at the right)", Source: AISC,
			Model: func() *frame.Model {
				return line([]float64{0, l}, []frame.Support{pin, rol}, frame.MemberLoad{To: l, WEnd: w})
			},
			Quantities: []Quantity{
				q("R1 = W/3, W = wL/2", w*l/6, Exact, reactionFy(0)),
				q("R2 = 2W/3", w*l/3, Exact, reactionFy(1)),
				q("M max = 2WL/(9√3) at L/√3", 2*(w*l/2)*l/(9*math.Sqrt(3)), Exact, momentAt(0, l/math.Sqrt(3))),
			}},
		{Name: "Simple beam, uniform load partially distributed (a = 1, b = 3, c = 2, w = 10)", Source: AISC,
			Model: func() *frame.Model {
				return line([]float64{0, l}, []frame.Support{pin, rol}, uniform(0, 1, 4, w))
			},
			Quantities: []Quantity{
				q("R1 = wb(2c+b)/2L", w*3*(2*2+3)/(2*l), Exact, reactionFy(0)),
				q("M max = R1(a + R1/2w) at a + R1/w", 17.5*(1+17.5/(2*w)), Exact, momentAt(0, 1+17.5/w)),
			}},
		{Name: "Simple beam, concentrated load at centre (L = 6, P = 40)", Source: AISC,
			Model: func() *frame.Model {
				return line([]float64{0, l / 2, l}, []frame.Support{pin, free, rol}, point(0, l/2, p))
			},
			Quantities: []Quantity{
				q("M at centre = PL/4", pl/4, Exact, momentAt(1, 0)),
				q("deflection at centre = PL³/48EI", p*l*l*l/(48*ei), Exact, deflection(1)),
			}},
		{Name: "Simple beam, concentrated load at any point (a = 2, b = 4, P = 40)", Source: AISC,
			Model: func() *frame.Model {
				return line([]float64{0, 2, l}, []frame.Support{pin, free, rol}, point(1, 0, p))
			},
			Quantities: []Quantity{
				q("R1 = Pb/L", p*4/l, Exact, reactionFy(0)),
				q("M at load = Pab/L", p*2*4/l, Exact, momentAt(0, 2)),
				q("deflection at load = Pa²b²/3EIL", p*4*16/(3*ei*l), Exact, deflection(1)),
			}},
		{Name: "Beam fixed at one end, supported at other, uniform load (L = 6, w = 10)", Source: AISC,
			Model: func() *frame.Model {
				return line([]float64{0, l}, []frame.Support{fix, rol}, uniform(0, 0, l, w))
			},
			Quantities: []Quantity{
				q("R at the support = 3wL/8", 3*w*l/8, Exact, reactionFy(1)),
				q("M at the fixed end = -wL²/8", -wl2/8, Exact, momentAt(0, 0)),
				q("M max = 9wL²/128 at 3L/8 from the support", 9*wl2/128, Exact, momentAt(0, 5*l/8)),
			}},
		{Name: "Beam fixed at one end, supported at other, concentrated load at centre (P = 40)", Source: AISC,
			Model: func() *frame.Model {
				return line([]float64{0, l}, []frame.Support{fix, rol}, point(0, l/2, p))
			},
			Quantities: []Quantity{
				q("R at the support = 5P/16", 5*p/16, Exact, reactionFy(1)),
				q("M at the fixed end = -3PL/16", -3*pl/16, Exact, momentAt(0, 0)),
				q("M at load = 5PL/32", 5*pl/32, Exact, momentAt(0, l/2)),
			}},
		{Name: "Beam fixed at both ends, uniform load (L = 6, w = 10)", Source: AISC,
			Model: func() *frame.Model {
				return line([]float64{0, l / 2, l}, []frame.Support{fix, free, fix}, uniform(0, 0, l/2, w), uniform(1, 0, l/2, w))
			},
			Quantities: []Quantity{
				q("M at ends = -wL²/12", -wl2/12, Exact, momentAt(0, 0)),
				q("M at centre = wL²/24", wl2/24, Exact, momentAt(1, 0)),
				q("deflection at centre = wL⁴/384EI", w*l*l*l*l/(384*ei), Exact, deflection(1)),
			}},
		{Name: "Beam fixed at both ends, concentrated load at centre (P = 40)", Source: AISC,
			Model: func() *frame.Model {
				return line([]float64{0, l / 2, l}, []frame.Support{fix, free, fix}, point(0, l/2, p))
			},
			Quantities: []Quantity{
				q("M at ends = -PL/8", -pl/8, Exact, momentAt(1, l/2)),
				q("M at centre = PL/8", pl/8, Exact, momentAt(1, 0)),
				q("deflection at centre = PL³/192EI", p*l*l*l/(192*ei), Exact, deflection(1)),
			}},
		{Name: "Cantilever beam, uniformly distributed load (L = 6, w = 10)", Source: AISC,
			Model: func() *frame.Model {
				return line([]float64{0, l}, []frame.Support{fix, free}, uniform(0, 0, l, w))
			},
			Quantities: []Quantity{
				q("M at the fixed end = -wL²/2", -wl2/2, Exact, momentAt(0, 0)),
				q("deflection at the free end = wL⁴/8EI", w*l*l*l*l/(8*ei), Exact, deflection(1)),
			}},
		{Name: "Cantilever beam, concentrated load at free end (P = 40)", Source: AISC,
			Model: func() *frame.Model {
				return line([]float64{0, l}, []frame.Support{fix, free}, point(0, l, p))
			},
			Quantities: []Quantity{
				q("M at the fixed end = -PL", -pl, Exact, momentAt(0, 0)),
				q("deflection at the free end = PL³/3EI", p*l*l*l/(3*ei), Exact, deflection(1)),
			}},
		{Name: "Continuous beam, two equal spans, uniform load on one span (L = 6, w = 10)", Source: AISC,
			Model: func() *frame.Model { return spans(2, l, w, 0) },
			Quantities: []Quantity{
				q("R1 = 7wL/16", 7*w*l/16, Exact, reactionFy(0)),
				q("R3 = -wL/16", -w*l/16, Exact, reactionFy(2)),
				q("M at the centre support = -wL²/16", -wl2/16, Exact, momentAt(0, l)),
				q("M max = 49wL²/512 at 7L/16", 49*wl2/512, Exact, momentAt(0, 7*l/16)),
			}},
		{Name: "Continuous beam, two equal spans, concentrated load at centre of one span (P = 40)", Source: AISC,
			Model: func() *frame.Model {
				mo := spans(2, l, 0)
				mo.Cases[0].MemberLoads = []frame.MemberLoad{point(0, l/2, p)}
				return mo
			},
			Quantities: []Quantity{
				q("R1 = 13P/32", 13*p/32, Exact, reactionFy(0)),
				q("R3 = -3P/32", -3*p/32, Exact, reactionFy(2)),
				q("M at the centre support = -3PL/32", -3*pl/32, Exact, momentAt(0, l)),
				q("M at load = 13PL/64", 13*pl/64, Exact, momentAt(0, l/2)),
			}},
	}
}

// continuousBeams are equal-span coefficients under full and patterned load.
// Each pattern is its own model with the live load on the spans named.
func continuousBeams() []Case {
	const l, w = 6.0, 10.0
	wl, wl2 := w*l, w*l*l
	return []Case{
		{Name: "2 equal spans, both loaded (L = 6, w = 10)", Source: Coefficients,
			Model: func() *frame.Model { return spans(2, l, w, 0, 1) },
			Quantities: []Quantity{
				q("M at B = -0.125wL²", -wl2/8, Exact, momentAt(0, l)),
				q("R at A = 0.375wL", 3*wl/8, Exact, reactionFy(0)),
				q("R at B = 1.25wL", 5*wl/4, Exact, reactionFy(1)),
				q("span M max = 0.0703wL² (9/128) at 0.375L", 9*wl2/128, Exact, momentAt(0, 3*l/8)),
			}},
		{Name: "3 equal spans, all loaded", Source: Coefficients,
			Model: func() *frame.Model { return spans(3, l, w, 0, 1, 2) },
			Quantities: []Quantity{
				q("M at B = -0.100wL²", -wl2/10, Exact, momentAt(0, l)),
				q("R at A = 0.400wL", 0.4*wl, Exact, reactionFy(0)),
				q("R at B = 1.100wL", 1.1*wl, Exact, reactionFy(1)),
				q("end span M max = 0.080wL² at 0.4L", 0.08*wl2, Exact, momentAt(0, 0.4*l)),
				q("centre span M = 0.025wL²", 0.025*wl2, Exact, momentAt(1, l/2)),
			}},
		{Name: "3 equal spans, spans 1 and 2 loaded (pattern for B)", Source: Coefficients,
			Model: func() *frame.Model { return spans(3, l, w, 0, 1) },
			Quantities: []Quantity{
				q("M at B = -0.117wL² (7/60)", -7*wl2/60, Exact, momentAt(0, l)),
				q("M at C = -0.033wL² (1/30)", -wl2/30, Exact, momentAt(1, l)),
			}},
		{Name: "3 equal spans, end spans loaded (pattern for span 1)", Source: Coefficients,
			Model: func() *frame.Model { return spans(3, l, w, 0, 2) },
			Quantities: []Quantity{
				q("M at B = -0.050wL²", -wl2/20, Exact, momentAt(0, l)),
				q("end span M max = 0.101wL² (81/800) at 0.45L", 81*wl2/800, Exact, momentAt(0, 0.45*l)),
			}},
		{Name: "3 equal spans, centre span loaded (pattern for span 2)", Source: Coefficients,
			Model: func() *frame.Model { return spans(3, l, w, 1) },
			Quantities: []Quantity{
				q("M at B = -0.050wL²", -wl2/20, Exact, momentAt(0, l)),
				q("centre span M = 0.075wL²", 0.075*wl2, Exact, momentAt(1, l/2)),
			}},
		{Name: "4 equal spans, all loaded", Source: Coefficients,
			Model: func() *frame.Model { return spans(4, l, w, 0, 1, 2, 3) },
			Quantities: []Quantity{
				q("M at B = -0.107wL² (3/28)", -3*wl2/28, Exact, momentAt(0, l)),
				q("M at C = -0.071wL² (1/14)", -wl2/14, Exact, momentAt(1, l)),
				q("R at A = 0.393wL (11/28)", 11*wl/28, Exact, reactionFy(0)),
				q("R at C = 0.929wL (13/14)", 13*wl/14, Exact, reactionFy(2)),
			}},
		{Name: "4 equal spans, spans 1, 2 and 4 loaded (pattern for B)", Source: Coefficients,
			Model: func() *frame.Model { return spans(4, l, w, 0, 1, 3) },
			Quantities: []Quantity{
				q("M at B = -0.121wL² (27/224)", -27*wl2/224, Exact, momentAt(0, l)),
				q("M at C = -0.018wL² (1/56)", -wl2/56, Exact, momentAt(1, l)),
				q("M at D = -0.058wL² (13/224)", -13*wl2/224, Exact, momentAt(2, l)),
			}},
		{Name: "4 equal spans, spans 2 and 3 loaded (pattern for C)", Source: Coefficients,
			Model: func() *frame.Model { return spans(4, l, w, 1, 2) },
			Quantities: []Quantity{
				q("M at C = -0.107wL² (3/28)", -3*wl2/28, Exact, momentAt(1, l)),
				q("M at B = -0.036wL² (1/28)", -wl2/28, Exact, momentAt(0, l)),
			}},
		{Name: "4 equal spans, spans 1 and 3 loaded (pattern for span 1)", Source: Coefficients,
			Model: func() *frame.Model { return spans(4, l, w, 0, 2) },
			Quantities: []Quantity{
				q("M at B = -0.054wL² (3/56)", -3*wl2/56, Exact, momentAt(0, l)),
				q("span 1 M max = 0.0996wL² (625/6272) at 25L/56", 625*wl2/6272, Exact, momentAt(0, 25*l/56)),
			}},
	}
}

// portal returns a single-bay portal A0-A1-B1-B0 with the given bases; the
// members are made axially stiff for formulas that neglect axial strain.
func portal(base frame.Support, l, h, ib, ic float64, c frame.Case) *frame.Model {
	c.Name = "load"
	return &frame.Model{
		Sections: []frame.Section{{Name: "column", E: 30e6, A: 1e3, I: ic}, {Name: "beam", E: 30e6, A: 1e3, I: ib}},
		Nodes: []frame.Node{
			{Name: "A0", Support: base}, {Name: "A1", Y: h},
			{Name: "B1", X: l, Y: h}, {Name: "B0", X: l, Support: base},
		},
		Members: []frame.Member{
			{Name: "A0-A1", Start: 0, End: 1, Section: 0},
			{Name: "A1-B1", Start: 1, End: 2, Section: 1},
			{Name: "B0-B1", Start: 3, End: 2, Section: 0},
		},
		Cases: []frame.Case{c},
	}
}

// rigidFrames are the portal frame formulas. Columns drawn bottom to top are
// in tension on their +X face under positive moment.
func rigidFrames() []Case {
	const l, h, w, p, hx = 8.0, 4.0, 12.0, 50.0, 30.0
	const ib, ic = 3e-3, 1e-3
	k := (ib / l) / (ic / h)
	beamUDL := frame.Case{MemberLoads: []frame.MemberLoad{uniform(1, 0, l, w)}}
	beamP := frame.Case{MemberLoads: []frame.MemberLoad{point(1, l/2, p)}}
	side := frame.Case{NodeLoads: []frame.NodeLoad{{Node: 1, Fx: hx}}}
	name := fmt.Sprintf(" (L = 8, h = 4, k = %g)", k)
	return []Case{
		{Name: "Portal, fixed bases, uniform load on the beam" + name, Source: RigidFrame,
			Model: func() *frame.Model { return portal(frame.Fixed, l, h, ib, ic, beamUDL) },
			Quantities: []Quantity{
				q("corner M = -wL²/(6(k+2))", -w*l*l/(6*(k+2)), Axial, momentAt(1, 0)),
				q("base M = wL²/(12(k+2))", w*l*l/(12*(k+2)), Axial, momentAt(0, 0)),
				q("base Fx = wL²/(4h(k+2))", w*l*l/(4*h*(k+2)), Axial, reactionFx(0)),
			}},
		{Name: "Portal, pinned bases, uniform load on the beam" + name, Source: RigidFrame,
			Model: func() *frame.Model { return portal(frame.Pinned, l, h, ib, ic, beamUDL) },
			Quantities: []Quantity{
				q("corner M = -wL²/(4(2k+3))", -w*l*l/(4*(2*k+3)), Axial, momentAt(1, 0)),
				q("base Fx = wL²/(4h(2k+3))", w*l*l/(4*h*(2*k+3)), Axial, reactionFx(0)),
			}},
		{Name: "Portal, fixed bases, central point load on the beam (P = 50)" + name, Source: RigidFrame,
			Model: func() *frame.Model { return portal(frame.Fixed, l, h, ib, ic, beamP) },
			Quantities: []Quantity{
				q("corner M = -PL/(4(k+2))", -p*l/(4*(k+2)), Axial, momentAt(1, l)),
				q("M under the load = PL/4 - PL/(4(k+2))", p*l/4-p*l/(4*(k+2)), Axial, momentAt(1, l/2)),
			}},
		{Name: "Portal, pinned bases, central point load on the beam (P = 50)" + name, Source: RigidFrame,
			Model: func() *frame.Model { return portal(frame.Pinned, l, h, ib, ic, beamP) },
			Quantities: []Quantity{
				q("corner M = -3PL/(8(2k+3))", -3*p*l/(8*(2*k+3)), Axial, momentAt(1, 0)),
			}},
		{Name: "Portal, fixed bases, horizontal load H at the beam (H = 30)" + name, Source: RigidFrame,
			Model: func() *frame.Model { return portal(frame.Fixed, l, h, ib, ic, side) },
			Quantities: []Quantity{
				q("base M = -(Hh/2)(3k+1)/(6k+1)", -hx*h/2*(3*k+1)/(6*k+1), Axial, momentAt(0, 0)),
				q("top M = (Hh/2)(3k)/(6k+1)", hx*h/2*(3*k)/(6*k+1), Axial, momentAt(0, h)),
				q("base Fx = -H/2", -hx/2, Axial, reactionFx(0)),
			}},
		{Name: "Portal, pinned bases, horizontal load H at the beam (H = 30)" + name, Source: RigidFrame,
			Model: func() *frame.Model { return portal(frame.Pinned, l, h, ib, ic, side) },
			Quantities: []Quantity{
				q("top M = Hh/2", hx*h/2, Axial, momentAt(0, h)),
				q("leeward base Fy = Hh/L", hx*h/l, Axial, reactionFy(3)),
				q("base Fx = -H/2", -hx/2, Axial, reactionFx(3)),
			}},
	}
}

// fixedEndMoments are entries of the fixed-end moment table: a single member
// clamped at both ends.
func fixedEndMoments() []Case {
	const l, w, p = 6.0, 10.0, 40.0
	const a = 2.0
	b := l - a
	clamped := func(loads ...frame.MemberLoad) func() *frame.Model {
		return func() *frame.Model {
			return line([]float64{0, l}, []frame.Support{frame.Fixed, frame.Fixed}, loads...)
		}
	}
	return []Case{
		{Name: "Fixed-end moments, point load at a (a = 2, b = 4, P = 40)", Source: FEMTable,
			Model: clamped(point(0, a, p)),
			Quantities: []Quantity{
				q("M at A = -Pab²/L²", -p*a*b*b/(l*l), Exact, momentAt(0, 0)),
				q("M at B = -Pa²b/L²", -p*a*a*b/(l*l), Exact, momentAt(0, l)),
			}},
		{Name: "Fixed-end moments, two equal loads at the third points (P = 40)", Source: FEMTable,
			Model: clamped(point(0, l/3, p), point(0, 2*l/3, p)),
			Quantities: []Quantity{
				q("M at A and B = -2PL/9", -2*p*l/9, Exact, momentAt(0, 0)),
			}},
		{Name: "Fixed-end moments, uniform load over a from A (a = 2, w = 10)", Source: FEMTable,
			Model: clamped(uniform(0, 0, a, w)),
			Quantities: []Quantity{
				q("M at A = -wa²(6L²-8aL+3a²)/12L²", -w*a*a*(6*l*l-8*a*l+3*a*a)/(12*l*l), Exact, momentAt(0, 0)),
				q("M at B = -wa³(4L-3a)/12L²", -w*a*a*a*(4*l-3*a)/(12*l*l), Exact, momentAt(0, l)),
			}},
		{Name: "Fixed-end moments, uniform load over the left half (w = 10)", Source: FEMTable,
			Model: clamped(uniform(0, 0, l/2, w)),
			Quantities: []Quantity{
				q("M at A = -11wL²/192", -11*w*l*l/192, Exact, momentAt(0, 0)),
				q("M at B = -5wL²/192", -5*w*l*l/192, Exact, momentAt(0, l)),
			}},
		{Name: "Fixed-end moments, triangular load rising from A to w at B (w = 10)", Source: FEMTable,
			Model: clamped(frame.MemberLoad{To: l, WEnd: w}),
			Quantities: []Quantity{
				q("M at A = -wL²/30", -w*l*l/30, Exact, momentAt(0, 0)),
				q("M at B = -wL²/20", -w*l*l/20, Exact, momentAt(0, l)),
			}},
		{Name: "Fixed-end moments, couple M0 at midspan (M0 = 12, counter-clockwise)", Source: FEMTable,
			Model: clamped(frame.MemberLoad{Moment: true, At: l / 2, M: 12}),
			Quantities: []Quantity{
				q("M at A = -M0/4 (hogging)", -12.0/4, Exact, momentAt(0, 0)),
				q("M at B = M0/4 (sagging)", 12.0/4, Exact, momentAt(0, l)),
				q("R at A = 3M0/2L", 1.5*12/l, Exact, reactionFy(0)),
			}},
		{Name: "Fixed-ended beam with rigid end zones of 0.3 (L = 6, w = 10)", Source: FEMTable,
			Model: func() *frame.Model {
				mo := line([]float64{0, l}, []frame.Support{frame.Fixed, frame.Fixed}, uniform(0, 0, l, w))
				mo.Members[0].OffsetStart, mo.Members[0].OffsetEnd = 0.3, 0.3
				return mo
			},
			Quantities: []Quantity{
				q("M at the face = -wl²/12, l = 5.4", -w*5.4*5.4/12, Exact, momentAt(0, 0.3)),
				q("V at the face = wl/2", w*5.4/2, Exact, shearAt(0, 0.3)),
				q("M at the node = -(wl²/12 + (wl/2)(0.3) + w(0.3)²/2)", -32.85, Exact, momentAt(0, 0)),
				q("M at midspan = wl²/24", w*5.4*5.4/24, Exact, momentAt(0, l/2)),
			}},
	}
}

// Properties of the cases of imposed deformations and elastic joints:
// EI = 1e4, EA = 1e6, α = 1.2e-5 per degree, depth h = 0.5.
const (
	defE, defI, defA   = 1e7, 1e-3, 0.1
	defAlpha, defDepth = 1.2e-5, 0.5
)

// deformations are the cases of settlements, temperature and elastic
// joints: each a closed form of the slope-deflection method or of beam
// theory.
func deformations() []Case {
	const l, w, dT, delta = 6.0, 10.0, 20.0, 0.01
	const ei, ea = defE * defI, defE * defA
	member := func(sup [2]frame.Support, loads ...frame.MemberLoad) *frame.Model {
		mo := line([]float64{0, l}, sup[:], loads...)
		mo.Sections[0] = frame.Section{Name: "EI = 1e4", E: defE, A: defA, I: defI, Alpha: defAlpha, Depth: defDepth}
		return mo
	}
	fixed := [2]frame.Support{frame.Fixed, frame.Fixed}
	return []Case{
		{Name: "Fixed-ended beam, right end settles by 0.01 (L = 6, EI = 1e4)", Source: SlopeDeflection,
			Model: func() *frame.Model {
				mo := member(fixed)
				mo.Cases[0].Displacements = []frame.NodeDisplacement{{Node: 1, Uy: -delta}}
				return mo
			},
			Quantities: []Quantity{
				q("M at A = -6EIΔ/L² (hogging)", -6*ei*delta/(l*l), Exact, momentAt(0, 0)),
				q("M at B = 6EIΔ/L² (sagging)", 6*ei*delta/(l*l), Exact, momentAt(0, l)),
				q("V = 12EIΔ/L³", 12*ei*delta/(l*l*l), Exact, shearAt(0, l/2)),
			}},
		{Name: "Fixed-ended beam, top 20 degrees hotter than the bottom (h = 0.5, α = 1.2e-5)", Source: ClosedForm,
			Model: func() *frame.Model { return member(fixed, frame.MemberLoad{Thermal: true, DTGrad: dT}) },
			Quantities: []Quantity{
				q("M = EIαΔT/h, sagging, constant", ei*defAlpha*dT/defDepth, Exact, momentAt(0, l/3)),
			}},
		{Name: "Bar fixed at both ends, uniform rise of 20 degrees (EA = 1e6, α = 1.2e-5)", Source: ClosedForm,
			Model: func() *frame.Model { return member(fixed, frame.MemberLoad{Thermal: true, DT: dT}) },
			Quantities: []Quantity{
				q("N = -EAαΔT (compression)", -ea*defAlpha*dT, Exact, axialAt(0, l/2)),
			}},
		{Name: "Fixed-ended beam joined to its nodes by rotational springs k = 2e4 (L = 6, EI = 4e4, w = 10)", Source: SlopeDeflection,
			Model: func() *frame.Model {
				mo := line([]float64{0, l}, fixed[:], uniform(0, 0, l, w))
				mo.Sections[0].I = 4e4 / steelE
				mo.Members[0].SpringStart, mo.Members[0].SpringEnd = 2e4, 2e4
				return mo
			},
			Quantities: []Quantity{
				q("M at the ends = -(wL²/12)/(1 + 2EI/kL)", -18, Exact, momentAt(0, 0)),
				q("M at midspan = wL²/8 - 18", w*l*l/8-18, Exact, momentAt(0, l/2)),
			}},
		{Name: "Cantilever propped at its tip by a spring ky = 500 (L = 6, EI = 1e4, w = 10)", Source: ClosedForm,
			Model: func() *frame.Model {
				mo := member([2]frame.Support{frame.Fixed, frame.Free}, uniform(0, 0, l, w))
				mo.Nodes[1].Springs[1] = 500
				return mo
			},
			Quantities: []Quantity{
				q("R = (3wL⁴/8)/(L³ + 3EI/ky)", (3*w*l*l*l*l/8)/(l*l*l+3*ei/500), Exact, reactionFy(1)),
			}},
		{Name: "Column on a rotational spring kr = 5e3, tip load H = 10 (L = 4, EI = 1e4)", Source: ClosedForm,
			Model: func() *frame.Model {
				mo := &frame.Model{
					Sections: []frame.Section{{Name: "EI = 1e4", E: defE, A: defA, I: defI}},
					Nodes:    []frame.Node{{Name: "base", Support: frame.Pinned, Springs: [3]float64{0, 0, 5e3}}, {Name: "top", Y: 4}},
					Members:  []frame.Member{{Name: "base-top", Start: 0, End: 1}},
					Cases:    []frame.Case{{Name: "H", NodeLoads: []frame.NodeLoad{{Node: 1, Fx: 10}}}},
				}
				return mo
			},
			Quantities: []Quantity{
				q("δ = HL³/3EI + HL²/kr", 10*64/(3*ei)+10*16/5e3, Exact, sway(1)),
			}},
		{Name: "Column fixed at its base and held along X only at its top, uniform lateral load w = 5 (L = 4)", Source: AISC,
			Model: func() *frame.Model {
				return &frame.Model{
					Sections: []frame.Section{{Name: "steel", E: steelE, A: steelA, I: steelI}},
					Nodes:    []frame.Node{{Name: "base", Support: frame.Fixed}, {Name: "top", Y: 4, Support: frame.HoldX}},
					Members:  []frame.Member{{Name: "base-top", Start: 0, End: 1}},
					Cases: []frame.Case{{Name: "w", MemberLoads: []frame.MemberLoad{{Direction: frame.GlobalX, To: 4, W: 5, WEnd: 5}},
						NodeLoads: []frame.NodeLoad{{Node: 1, Fy: -30}}}},
				}
			},
			Quantities: []Quantity{
				q("R at the top = -3wL/8 (propped cantilever)", -3*5*4.0/8, Exact, reactionFx(1)),
				q("vertical load to the base, Fy = 30", 30, Exact, reactionFy(0)),
			}},
	}
}

// closedForms are results of beam theory with no single published source.
func closedForms() []Case {
	const l, w = 6.0, 10.0
	return []Case{
		{Name: "Beam fixed at both ends, uniform load: inflection point", Source: ClosedForm,
			Model: func() *frame.Model {
				return line([]float64{0, l}, []frame.Support{frame.Fixed, frame.Fixed}, uniform(0, 0, l, w))
			},
			Quantities: []Quantity{
				q("x/L where M = 0: (3 - √3)/6 = 0.2113", (3-math.Sqrt(3))/6, Exact, inflection(0)),
			}},
	}
}

// TextbookBeam is the beam of Pytel and Singer, Fig. P-815, in lb and ft:
// simple support R1, a 12 ft span with 300 lb at 4 ft and at 8 ft, support
// R2, a 10 ft span with 60 lb/ft uniform plus a triangle of 75 lb/ft at R2
// falling to zero at R3, support R3, and an 8 ft overhang with a triangle of
// 60 lb/ft at R3 falling to zero at the tip; EI constant.
func TextbookBeam() *frame.Model {
	mo := line([]float64{0, 12, 22, 30}, []frame.Support{frame.Pinned, frame.Roller, frame.Roller, frame.Free},
		point(0, 4, 300), point(0, 8, 300),
		uniform(1, 0, 10, 60), frame.MemberLoad{Member: 1, To: 10, W: 75},
		frame.MemberLoad{Member: 2, To: 8, W: 60})
	mo.Sections[0] = frame.Section{Name: "EI constant", E: 29e6 * 144, A: 10, I: 500.0 / 20736}
	return mo
}

// textbook is the published moment distribution example.
func textbook() []Case {
	m2, m3 := -1077.27, -640.0
	return []Case{
		{Name: "Moment distribution: continuous beam with overhang, Fig. P-815 (lb, ft)", Source: Textbook,
			Model: TextbookBeam,
			Quantities: []Quantity{
				q("M2 (support R2)", m2, printed(m2, 2), momentAt(0, 12)),
				q("M3 (support R3)", m3, printed(m3, 2), momentAt(1, 10)),
				{Name: "M2 (support R2)", Published: m2, Tol: printed(m2, 2), Method: Distribution, Get: endMoment(0, 1)},
				{Name: "M3 (support R3)", Published: m3, Tol: printed(m3, 2), Method: Distribution, Get: endMoment(1, 1)},
			}},
	}
}
