package frame

import (
	"math"
	"strconv"
	"strings"
	"testing"
)

// The properties of the closed-form checks: EI = 1e4, EA = 1e6, α = 1.2e-5,
// h = 0.5, L = 6.
const (
	chkE, chkI, chkA   = 1e7, 1e-3, 0.1
	chkAlpha, chkDepth = 1.2e-5, 0.5
	chkL               = 6.0
)

// fixedBeam returns a beam of length l along X between two fixed nodes,
// drawn left to right, or right to left when reversed (the member then
// runs from the right node to the left one), with the loads of one case.
func fixedBeam(l float64, reversed bool, loads ...MemberLoad) *Model {
	mo := &Model{
		Sections: []Section{{Name: "S", E: chkE, A: chkA, I: chkI, Alpha: chkAlpha, Depth: chkDepth}},
		Nodes:    []Node{{Name: "L", Support: Fixed}, {Name: "R", X: l, Support: Fixed}},
		Members:  []Member{{Name: "LR", Start: 0, End: 1}},
		Cases:    []Case{{Name: "c", MemberLoads: loads}},
	}
	if reversed {
		mo.Members[0] = Member{Name: "RL", Start: 1, End: 0}
	}
	return mo
}

// sagging returns the bending moment at distance x from the left node,
// sagging positive, whichever way the beam was drawn: the member's own M
// for a beam drawn left to right, −M at l − x for one drawn right to left
// (its local −y face is the top).
func sagging(sol *Solution, l, x float64, reversed bool) Forces {
	if !reversed {
		return sol.At(0, 0, x)
	}
	f := sol.At(0, 0, l-x)
	return Forces{N: f.N, V: f.V, M: -f.M}
}

// TestNewLoadsAgainstFixedEndMoments checks each new load on a beam fixed
// at both ends against the fixed-end moment table (Hibbeler, Structural
// Analysis, inside back cover, "Fixed end moments") and the
// slope-deflection equations, drawn both ways: the moments, read as
// sagging from the left, must not depend on the direction the beam was
// drawn in. Equilibrium is checked beside each (checkEquilibrium).
func TestNewLoadsAgainstFixedEndMoments(t *testing.T) {
	const l, w = chkL, 10.0
	const ei, ea = chkE * chkI, chkE * chkA
	const dT, delta = 20.0, 0.01
	type want struct {
		x, m float64 // sagging moment at x from the left node
	}
	cases := []struct {
		name   string
		loads  func(reversed bool) []MemberLoad
		disp   []NodeDisplacement
		ms     []want
		n      float64 // axial force, tension positive
		vLeft  float64 // upward reaction at the left node
		source string
	}{
		{
			// w = 0 at the left end rising to w at the right: wL²/30 at
			// the zero end, wL²/20 at the heavy end; reactions 3wL/20 and
			// 7wL/20.
			name: "triangular load", source: "Hibbeler, inside back cover: triangular load, FEM wL²/30 and wL²/20",
			loads: func(rev bool) []MemberLoad {
				if rev {
					return []MemberLoad{{Member: 0, From: 0, To: l, W: w, WEnd: 0}}
				}
				return []MemberLoad{{Member: 0, From: 0, To: l, W: 0, WEnd: w}}
			},
			ms:    []want{{0, -w * l * l / 30}, {l, -w * l * l / 20}},
			vLeft: 3 * w * l / 20,
		},
		{
			// A clockwise moment M0 at midspan: M0/4 at each end, both
			// ends turned the same way; reactions 3M0/2L. Counter-
			// clockwise M0 here: hogging M0/4 at the left end, sagging
			// M0/4 at the right, and a jump of −M0 at midspan.
			name: "moment at midspan", source: "Hibbeler, inside back cover: couple M0 at midspan, FEM M0/4",
			loads: func(rev bool) []MemberLoad { return []MemberLoad{{Member: 0, Moment: true, At: l / 2, M: 12}} },
			ms:    []want{{0, -12.0 / 4}, {l, 12.0 / 4}, {l/2 - 0.1, -12.0/4 + 1.5*12/l*(l/2-0.1)}, {l/2 + 0.1, -12.0/4 + 1.5*12/l*(l/2+0.1) - 12}},
			vLeft: 1.5 * 12 / l,
		},
		{
			// The right end settles by Δ: slope-deflection gives
			// M = −6EIΔ/L² at each end (clockwise chord rotation Δ/L):
			// hogging at the left end, sagging at the right, shear
			// V = dM/dx = 12EIΔ/L³: the left support pushes up, the
			// right one pulls down.
			name: "settlement of the right end", source: "slope-deflection: |M| = 6EIΔ/L², V = 12EIΔ/L³",
			loads: func(bool) []MemberLoad { return nil },
			disp:  []NodeDisplacement{{Node: 1, Uy: -delta}},
			ms:    []want{{0, -6 * ei * delta / (l * l)}, {l, 6 * ei * delta / (l * l)}},
			vLeft: 12 * ei * delta / (l * l * l),
		},
		{
			// The left end turned counter-clockwise by θ: slope-deflection
			// gives 4EIθ/L at that end and 2EIθ/L at the far one (hogging
			// at the left, sagging at the right), shear 6EIθ/L².
			name: "rotation of the left end", source: "slope-deflection: 4EIθ/L, 2EIθ/L, 6EIθ/L²",
			loads: func(bool) []MemberLoad { return nil },
			disp:  []NodeDisplacement{{Node: 0, Rz: 0.002}},
			ms:    []want{{0, -4 * ei * 0.002 / l}, {l, 2 * ei * 0.002 / l}},
			vLeft: 6 * ei * 0.002 / (l * l),
		},
		{
			// Top hotter by ΔT: the clamped beam cannot curve, so it
			// carries a constant sagging moment EI α ΔT / h and no shear.
			name: "top hotter", source: "closed form: restrained thermal curvature, M = EI·α·ΔT/h",
			loads: func(rev bool) []MemberLoad {
				g := dT // local +y is the top for a beam drawn left to right
				if rev {
					g = -dT
				}
				return []MemberLoad{{Member: 0, Thermal: true, DTGrad: g}}
			},
			ms: []want{{0, ei * chkAlpha * dT / chkDepth}, {l / 3, ei * chkAlpha * dT / chkDepth}, {l, ei * chkAlpha * dT / chkDepth}},
		},
		{
			// A uniform rise on a bar held at both ends: N = −EA α ΔT.
			name: "uniform rise", source: "closed form: restrained thermal strain, N = −EA·α·ΔT",
			loads: func(bool) []MemberLoad { return []MemberLoad{{Member: 0, Thermal: true, DT: dT}} },
			ms:    []want{{0, 0}, {l, 0}},
			n:     -ea * chkAlpha * dT,
		},
	}
	for _, tc := range cases {
		for _, rev := range []bool{false, true} {
			name := tc.name + ", drawn left to right"
			if rev {
				name = tc.name + ", drawn right to left"
			}
			t.Run(name, func(t *testing.T) {
				mo := fixedBeam(l, rev, tc.loads(rev)...)
				mo.Cases[0].Displacements = tc.disp
				sol := solve(t, mo)
				for _, p := range tc.ms {
					if got := sagging(sol, l, p.x, rev).M; !near(got, p.m, tightTol) {
						t.Errorf("M at x = %g: got %.10g, want %.10g (%s)", p.x, got, p.m, tc.source)
					}
				}
				if got := sol.At(0, 0, l/3).N; !near(got, tc.n, tightTol) {
					t.Errorf("N: got %.10g, want %.10g (%s)", got, tc.n, tc.source)
				}
				if _, fy, _ := sol.Reaction(0, 0); !near(fy, tc.vLeft, tightTol) {
					t.Errorf("left reaction: got %.10g, want %.10g (%s)", fy, tc.vLeft, tc.source)
				}
				if b := sol.Balance(0); b.Relative() > 1e-12 {
					t.Errorf("statics check: out of balance by %g of the scale %g", b.Relative(), b.Scale())
				}
			})
		}
	}
}

// TestCheckValues prints the check values to four
// decimals: EI·α·ΔT/h = 4.8000, −EA·α·ΔT = −240.0000, 6EIΔ/L² = 16.6667,
// 12EIΔ/L³ = 5.5556 (closed forms above).
func TestCheckValues(t *testing.T) {
	const dT, delta = 20.0, 0.01
	thermal := solve(t, fixedBeam(chkL, false, MemberLoad{Member: 0, Thermal: true, DT: dT, DTGrad: dT}))
	settle := fixedBeam(chkL, false)
	settle.Cases[0].Displacements = []NodeDisplacement{{Node: 1, Uy: -delta}}
	s := solve(t, settle)
	_, v, _ := s.Reaction(0, 1)
	got := []string{
		fmtf(thermal.At(0, 0, 1).M), fmtf(thermal.At(0, 0, 1).N),
		fmtf(math.Abs(s.At(0, 0, 0).M)), fmtf(math.Abs(v)),
	}
	want := []string{"4.8000", "-240.0000", "16.6667", "5.5556"}
	if v := thermal.At(0, 0, 1).V; math.Abs(v) > 1e-12 {
		t.Errorf("shear under a temperature gradient %g, want 0", v)
	}
	if strings.Join(got, " ") != strings.Join(want, " ") {
		t.Errorf("got %v, want %v (the check values)", got, want)
	}
}

func fmtf(v float64) string { return strconv.FormatFloat(v, 'f', 4, 64) }

// TestThermalGradientOnASimpleBeam: a simply supported beam warmed on top
// is free to curve, so it carries nothing (no reactions, no moment) and
// hogs by α ΔT L² / (8h) at midspan (closed form: constant curvature
// α ΔT / h between supports that do not move). The statics check passes
// though every reaction is zero, the forces of the restrained case giving
// its scale.
func TestThermalGradientOnASimpleBeam(t *testing.T) {
	const l, dT = chkL, 20.0
	mo := fixedBeam(l, false, MemberLoad{Member: 0, Thermal: true, DTGrad: dT})
	mo.Nodes[0].Support, mo.Nodes[1].Support = Pinned, Roller
	sol := solve(t, mo)
	want := chkAlpha * dT * l * l / (8 * chkDepth)
	if got := sol.Deflection(0, 0, l/2); !near(got, want, tightTol) {
		t.Errorf("midspan deflection %.10g, want %.10g (up)", got, want)
	}
	if m := sol.At(0, 0, l/2).M; math.Abs(m) > 1e-9 {
		t.Errorf("midspan moment %g, want 0", m)
	}
	b := sol.Balance(0)
	if !b.Imposed || !(b.Restraint > 0) || b.Relative() > 1e-6 {
		t.Errorf("statics check: imposed %v, restraint %g, relative %g", b.Imposed, b.Restraint, b.Relative())
	}
	// Fixed at both ends it does not deflect at all.
	fixed := solve(t, fixedBeam(l, false, MemberLoad{Member: 0, Thermal: true, DTGrad: dT}))
	if d := fixed.Deflection(0, 0, l/2); math.Abs(d) > 1e-15 {
		t.Errorf("fixed-ended beam deflects by %g under a gradient", d)
	}
}

// TestImposedDeformationsBalanceThemselves: a two-span beam whose middle
// support settles carries reactions that sum to zero, with no load; the
// statics check compares them with the largest reaction. The reactions are
// those of the slope-deflection method: the middle support pulled down by
// Δ on two equal spans pinned at the ends, R_mid = 6EIΔ/L³ (from
// deflection δ = RL'³/48EI with L' = 2L: R = 48EIΔ/(8L³)).
func TestImposedDeformationsBalanceThemselves(t *testing.T) {
	const l, delta = 6.0, 0.01
	mo := continuous(2, l, 0, nil)
	mo.Cases[0].MemberLoads = nil
	mo.Cases[0].Displacements = []NodeDisplacement{{Node: 1, Uy: -delta}}
	sol := solve(t, mo)
	ei := mo.Sections[0].E * mo.Sections[0].I
	_, r, _ := sol.Reaction(0, 1)
	if want := -6 * ei * delta / (l * l * l); !near(r, want, tightTol) {
		t.Errorf("middle reaction %.10g, want %.10g", r, want)
	}
	b := sol.Balance(0)
	if b.Load != 0 || !near(b.Reaction, math.Abs(r), tightTol) || b.Relative() > 1e-12 {
		t.Errorf("balance: load %g, largest reaction %g (want %g), relative %g", b.Load, b.Reaction, math.Abs(r), b.Relative())
	}
	if _, uy, _ := sol.Displacement(0, 1); uy != -delta {
		t.Errorf("displacement of the settled node %g, want %g", uy, -delta)
	}
}

// TestMomentLoadStations: a concentrated moment on a simply supported
// beam (statics: reactions ±M0/L, moment jumping by −M0 at the load) with
// the station at the load giving the value before it, and one at the
// start giving the value inside the member.
func TestMomentLoadStations(t *testing.T) {
	const l, m0 = 6.0, 12.0
	for _, at := range []float64{0, 2, l} {
		mo := fixedBeam(l, false, MemberLoad{Member: 0, Moment: true, At: at, M: m0})
		mo.Nodes[0].Support, mo.Nodes[1].Support = Pinned, Roller
		sol := solve(t, mo)
		_, fy, _ := sol.Reaction(0, 0)
		if !near(fy, m0/l, tightTol) {
			t.Errorf("at = %g: left reaction %g, want M0/L = %g", at, fy, m0/l)
		}
		// M(x) = R x, less M0 beyond the load.
		for _, x := range []float64{0, 1, at, 4, l} {
			want := m0 / l * x
			if at < x || at == 0 {
				want -= m0
			}
			if got := sol.At(0, 0, x).M; !near(got, want, tightTol) {
				t.Errorf("at = %g: M(%g) = %g, want %g", at, x, got, want)
			}
		}
	}
}

// TestImposedLoadsAreValidated: displacements only where the support
// holds the node, temperature only with the section's alpha and depth.
func TestImposedLoadsAreValidated(t *testing.T) {
	for _, tc := range []struct {
		name string
		edit func(mo *Model)
		want string
	}{
		{"displacement where the node is free", func(mo *Model) {
			mo.Nodes[1].Support = Roller
			mo.Cases[0].Displacements = []NodeDisplacement{{Node: 1, Ux: 0.01}}
		}, `displacement at "R": ux is imposed where the support (roller) does not hold the node`},
		{"no alpha", func(mo *Model) {
			mo.Sections[0].Alpha = 0
			mo.Cases[0].MemberLoads = []MemberLoad{{Member: 0, Thermal: true, DT: 10}}
		}, `section "S" gives no alpha`},
		{"no depth", func(mo *Model) {
			mo.Sections[0].Depth = 0
			mo.Cases[0].MemberLoads = []MemberLoad{{Member: 0, Thermal: true, DTGrad: 10}}
		}, `section "S" gives no depth`},
		{"moment outside", func(mo *Model) {
			mo.Cases[0].MemberLoads = []MemberLoad{{Member: 0, Moment: true, At: 7, M: 1}}
		}, `at = 7 is outside the member`},
		{"two kinds at once", func(mo *Model) {
			mo.Cases[0].MemberLoads = []MemberLoad{{Member: 0, Moment: true, Point: true, At: 1, M: 1}}
		}, `a load is one of point, moment and thermal`},
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

// TestImposedDeformationsTakenFreely: where the frame takes an imposed
// deformation without any force (a member hinged at both ends warmed on
// top; the roller of a simple beam settling), every reaction is zero, by
// statics, and the check still passes: its scale is what the deformation
// does to a clamped member.
func TestImposedDeformationsTakenFreely(t *testing.T) {
	hinged := fixedBeam(chkL, false, MemberLoad{Member: 0, Thermal: true, DT: 20, DTGrad: 20})
	hinged.Members[0].Release = ReleaseBoth
	hinged.Nodes[1].Support = Roller
	hinged.Nodes[0].Support = Pinned
	settled := fixedBeam(chkL, false)
	settled.Nodes[0].Support, settled.Nodes[1].Support = Pinned, Roller
	settled.Cases[0].Displacements = []NodeDisplacement{{Node: 1, Uy: -0.01}}
	for name, mo := range map[string]*Model{"hinged and warmed": hinged, "simple beam settling": settled} {
		t.Run(name, func(t *testing.T) {
			sol := solve(t, mo)
			for v := range mo.Nodes {
				fx, fy, m := sol.Reaction(0, v)
				if math.Abs(fx)+math.Abs(fy)+math.Abs(m) > 1e-9 {
					t.Errorf("node %s: reaction (%g, %g, %g), want none", mo.Nodes[v].Name, fx, fy, m)
				}
			}
			if b := sol.Balance(0); !(b.Restraint > 0) || b.Relative() > 1e-9 {
				t.Errorf("restraint %g, relative %g", b.Restraint, b.Relative())
			}
		})
	}
	// The settled simple beam turns as a rigid body: its deflection
	// relative to its chord stays zero, the node moves by the settlement.
	sol := solve(t, settled)
	if d := sol.Deflection(0, 0, 3); math.Abs(d) > 1e-15 {
		t.Errorf("deflection %g", d)
	}
}
