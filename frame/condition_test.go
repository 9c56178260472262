package frame

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/gonum/blas"
	"gonum.org/v1/gonum/blas/blas64"
	lapackgo "gonum.org/v1/gonum/lapack/gonum"
	"gonum.org/v1/gonum/lapack/lapack64"
)

// cantilever returns a horizontal member of length l fixed at node "a" and
// free at node "b", whose three free degrees of freedom are those of b.
func cantilever(l, e, a, i float64) *Model {
	return &Model{
		Sections: []Section{{Name: "S", E: e, A: a, I: i}},
		Nodes:    []Node{{Name: "a", Support: Fixed}, {Name: "b", X: l}},
		Members:  []Member{{Name: "a-b", Start: 0, End: 1}},
		Cases:    []Case{{Name: "P", NodeLoads: []NodeLoad{{Node: 1, Fy: -1}}}},
	}
}

// cantileverCond is the 1-norm condition number of the tip stiffness
// matrix of a cantilever scaled to unit diagonal. The tip stiffness is
// K = [EA/L] ⊕ [12EI/L³, 6EI/L²; 6EI/L², 4EI/L] (beam tables; common
// practice); scaled, the bending block is [1, c; c, 1] with
// c = 6/√48 = √3/2, whose inverse is [1, -c; -c, 1]/(1 - c²), so
// κ₁ = (1 + c)²/(1 - c²) = 4(1 + √3/2)² = 7 + 4√3 ≈ 13.93 whatever L, E, A
// and I are: how stiff the member is axially against in bending, or the
// units, do not matter to a scaled matrix.
var cantileverCond = 7 + 4*math.Sqrt(3)

// condTol is the relative agreement asked of the condition estimate on a
// 3 × 3 matrix, where LAPACK's estimator finds the exact 1-norm of the
// inverse.
const condTol = 1e-9

func TestConditionNumberAgainstClosedForm(t *testing.T) {
	for _, tc := range []struct {
		name       string
		l, e, a, i float64
	}{
		{"steel cantilever, consistent units", 4, 200e6, 0.01, 1e-4},
		{"the same in N and mm", 4000, 200e3, 1e4, 1e8},
		{"area entered in mm² with E in kN/m²", 4, 200e6, 1e4, 1e-4},
		{"axial stiffness 10^16 times the bending stiffness", 4, 200e6, 1e12, 1e-4},
	} {
		t.Run(tc.name, func(t *testing.T) {
			sol, err := Solve(cantilever(tc.l, tc.e, tc.a, tc.i))
			if err != nil {
				t.Fatal(err)
			}
			if got := sol.Cond(); !near(got, cantileverCond, condTol) {
				t.Errorf("Cond() = %.6g, want 7 + 4√3 = %.6g", got, cantileverCond)
			}
			if w := sol.Warnings(); len(w) != 0 {
				t.Errorf("unexpected warnings %q", w)
			}
			// The tip deflection PL³/3EI and rotation PL²/2EI under a unit
			// load (beam tables; common practice), to round-off: the axial
			// and bending equations do not mix, however far apart their
			// stiffnesses are.
			_, uy, rz := sol.Displacement(0, 1)
			if d := tc.l * tc.l * tc.l / (3 * tc.e * tc.i); !near(-uy, d, tightTol) {
				t.Errorf("tip deflection %g, want %g", -uy, d)
			}
			if r := tc.l * tc.l / (2 * tc.e * tc.i); !near(-rz, r, tightTol) {
				t.Errorf("tip rotation %g, want %g", -rz, r)
			}
		})
	}
}

// linkedColumns returns two fixed-base columns of height h, 6 apart, joined
// at the top by a link hinged at both ends whose axial stiffness is set by
// its area a; a horizontal load hx acts at the top of the left column. The
// link carries no moment, so each column is a cantilever: with a link rigid
// against stretching each takes hx/2, sways (hx/2)h³/3EI and has a base
// moment (hx/2)h (beam tables; common practice).
func linkedColumns(h, a, hx float64) *Model {
	mo := portal(Fixed, 6, h, 1e-4, 1e-4)
	mo.Sections[0].A = 1e-2
	mo.Sections[1].A = a
	mo.Members[1].Release = ReleaseBoth
	mo.Cases = []Case{{Name: "H", NodeLoads: []NodeLoad{{Node: 1, Fx: hx}}}}
	return mo
}

func TestStableIllConditionedFrameIsNotAMechanism(t *testing.T) {
	// The link's axial stiffness EA/L = 5e13 is 1.5e11 times the columns'
	// sway stiffness 3EI/h³ = 333: a stable frame that costs about eleven
	// digits, not a mechanism. It runs with the warning, and the sway and
	// base moments agree with the closed forms to the digits left.
	const h, hx = 3.0, 10.0
	sol, err := Solve(linkedColumns(h, 1e7, hx))
	if err != nil {
		t.Fatalf("Solve: %v", err)
	}
	cond := sol.Cond()
	if !(cond > WarnCond && cond < RefuseCond) {
		t.Fatalf("Cond() = %.3g, want between the warning limit %g and the refusal limit %g", cond, WarnCond, RefuseCond)
	}
	if w := sol.Warnings(); len(w) != 1 || !strings.HasPrefix(w[0], "the stiffness matrix is ill-conditioned: estimated condition number") {
		t.Errorf("warnings %q, want the one on conditioning", w)
	}
	// Digits left: about 16 - log10 κ; ask for them less one.
	tol := 10 * cond * 0x1p-52
	ei := 30e6 * 1e-4
	for _, v := range []int{1, 2} {
		if ux, _, _ := sol.Displacement(0, v); !near(ux, hx/2*h*h*h/(3*ei), tol) {
			t.Errorf("sway of node %d = %.12g, want (H/2)h³/3EI = %.12g", v, ux, hx/2*h*h*h/(3*ei))
		}
	}
	for _, v := range []int{0, 3} {
		if _, _, m := sol.Reaction(0, v); !near(m, hx/2*h, tol) {
			t.Errorf("base moment at node %d = %.12g, want (H/2)h = %.12g", v, m, hx/2*h)
		}
	}
}

// toNmm returns mo in N and mm, given in kN and m: lengths ×1e3, E ×1e-3,
// A ×1e6, I ×1e12, forces ×1e3, distributed loads ×1, moments ×1e6.
func toNmm(mo *Model) *Model {
	out := &Model{Sections: slices.Clone(mo.Sections), Nodes: slices.Clone(mo.Nodes), Members: mo.Members}
	for i := range out.Sections {
		s := &out.Sections[i]
		s.E, s.A, s.I = s.E*1e-3, s.A*1e6, s.I*1e12
	}
	for i := range out.Nodes {
		out.Nodes[i].X *= 1e3
		out.Nodes[i].Y *= 1e3
	}
	for _, c := range mo.Cases {
		c.MemberLoads, c.NodeLoads = slices.Clone(c.MemberLoads), slices.Clone(c.NodeLoads)
		for i := range c.MemberLoads {
			ld := &c.MemberLoads[i]
			ld.From, ld.To, ld.At, ld.P = ld.From*1e3, ld.To*1e3, ld.At*1e3, ld.P*1e3
		}
		for i := range c.NodeLoads {
			nl := &c.NodeLoads[i]
			nl.Fx, nl.Fy, nl.M = nl.Fx*1e3, nl.Fy*1e3, nl.M*1e6
		}
		out.Cases = append(out.Cases, c)
	}
	return out
}

// unitsTol is the agreement asked of one frame solved in kN and m and in N
// and mm, relative to the largest value of each quantity: both are the same
// scaled system, so they differ only by round-off.
const unitsTol = 1e-13

func TestConsistentUnitsGiveTheSameCondition(t *testing.T) {
	// A two-bay, three-storey steel frame with gravity, lateral and moment
	// loads, in kN and m and again in N and mm. A change of consistent units
	// scales the stiffness matrix by a diagonal matrix, which the estimate,
	// taken on the matrix scaled to unit diagonal, does not see: the same
	// condition number, no warning, and results that agree to round-off.
	kn := gridFrame(2, 3, 1)
	kn.Sections = []Section{{Name: "S", E: 200e6, A: 1.2e-2, I: 2.5e-4}}
	var c Case
	c.Name = "D+W"
	for m := range kn.Members {
		if kn.IsBeam(m) {
			c.MemberLoads = append(c.MemberLoads, MemberLoad{Member: m, To: 6, W: 20, WEnd: 20}, MemberLoad{Member: m, Point: true, At: 2, P: 40})
		}
	}
	for v, nd := range kn.Nodes {
		if nd.X == 0 && nd.Y > 0 {
			c.NodeLoads = append(c.NodeLoads, NodeLoad{Node: v, Fx: 15, M: 10})
		}
	}
	kn.Cases = []Case{c}
	mm := toNmm(kn)
	a, b := solve(t, kn), solve(t, mm)
	if w := b.Warnings(); len(w) != 0 {
		t.Errorf("N and mm: warnings %q", w)
	}
	if !near(a.Cond(), b.Cond(), 1e-6) || a.Cond() > WarnCond {
		t.Errorf("Cond() = %.6g in kN and m, %.6g in N and mm; want the same, below %g", a.Cond(), b.Cond(), WarnCond)
	}
	var big [3]float64
	for v := range kn.Nodes {
		ux, uy, rz := a.Displacement(0, v)
		big = [3]float64{max(big[0], math.Abs(ux)), max(big[1], math.Abs(uy)), max(big[2], math.Abs(rz))}
	}
	for v := range kn.Nodes {
		ux, uy, rz := a.Displacement(0, v)
		vx, vy, vz := b.Displacement(0, v)
		if math.Abs(vx/1e3-ux) > unitsTol*big[0] || math.Abs(vy/1e3-uy) > unitsTol*big[1] || math.Abs(vz-rz) > unitsTol*big[2] {
			t.Errorf("node %q: (%g, %g, %g) in m, (%g, %g, %g) in mm", kn.Nodes[v].Name, ux, uy, rz, vx, vy, vz)
		}
	}
}

// inclined returns the cantilever of cantilever(4, 200e6, a, 1e-4) turned
// 30° up from X, with a downward unit load at its tip b. Its axial and
// bending stiffnesses now both act along X and Y, so across the member the
// bending stiffness 12EI/L³ = 3750 is what is left of the axial stiffness
// EA/L = 5e7·a taken from itself: the larger a, the more digits that costs.
// Tip deflection (beam tables; common practice): the load's components
// along and across the member, sin 30° and cos 30°, give
// uy = −(s² L/EA + c² L³/3EI).
func inclined(a float64) (mo *Model, uy float64) {
	const l, e, i = 4.0, 200e6, 1e-4
	c, s := math.Cos(math.Pi/6), math.Sin(math.Pi/6)
	mo = cantilever(l, e, a, i)
	mo.Nodes[1].X, mo.Nodes[1].Y = l*c, l*s
	return mo, -(s*s*l/(e*a) + c*c*l*l*l/(3*e*i))
}

func TestIllConditionedIsRefusedUnlessAccepted(t *testing.T) {
	// a = 5e8: EA/L is about 7e12 times 12EI/L³, a condition number above
	// the refusal limit (fewer than three digits left) and below MaxCond.
	mo, uy := inclined(5e8)
	_, err := Solve(mo)
	var ice *IllConditionedError
	if !errors.As(err, &ice) || !errors.Is(err, ErrIllConditioned) || !ice.Acceptable {
		t.Fatalf("err = %v, want an acceptable *IllConditionedError", err)
	}
	if !(ice.Cond > RefuseCond && ice.Cond < MaxCond) {
		t.Fatalf("estimate %.3g, want between %g and %g", ice.Cond, RefuseCond, MaxCond)
	}
	want := fmt.Sprintf("the stiffness matrix is too ill-conditioned to solve: estimated condition number %.2g, above the limit 1e+13, so the results may have lost about %.0f of their 16 significant digits, leaving fewer than three; %s",
		ice.Cond, math.Log10(ice.Cond), illAdvice)
	if err.Error() != want {
		t.Errorf("error\n got: %s\nwant: %s", err, want)
	}

	sol, err := SolveWith(mo, Options{AcceptIllConditioned: true})
	if err != nil {
		t.Fatalf("accepted: %v", err)
	}
	if sol.Cond() != ice.Cond {
		t.Errorf("accepted: Cond() = %g, refused with %g", sol.Cond(), ice.Cond)
	}
	warn := fmt.Sprintf("the stiffness matrix is ill-conditioned: estimated condition number %.2g, above the limit 1e+13 and solved only because that was accepted, so results may have lost about %.0f of their 16 significant digits; %s",
		sol.Cond(), math.Log10(sol.Cond()), illAdvice)
	if w := sol.Warnings(); len(w) != 1 || w[0] != warn {
		t.Errorf("warnings %q\nwant [%q]", w, warn)
	}
	// What is left is still the closed form to the digits the estimate
	// promises.
	if _, got, _ := sol.Displacement(0, 1); !near(got, uy, 10*sol.Cond()*0x1p-52) {
		t.Errorf("tip uy = %.6g, want %.6g", got, uy)
	}
}

func TestIllConditionedErrorMessages(t *testing.T) {
	for _, tc := range []struct {
		err  IllConditionedError
		want string
	}{
		{IllConditionedError{Cond: 2.5e14, Acceptable: true}, "the stiffness matrix is too ill-conditioned to solve: estimated condition number 2.5e+14, above the limit 1e+13, so the results may have lost about 14 of their 16 significant digits, leaving fewer than three; " + illAdvice},
		{IllConditionedError{Cond: 3e17}, "the stiffness matrix is too ill-conditioned to solve: estimated condition number 3e+17, so the results would carry no correct digit; " + illAdvice},
	} {
		if got := tc.err.Error(); got != tc.want {
			t.Errorf("got  %s\nwant %s", got, tc.want)
		}
	}
}

func TestStiffnessLostInRoundOffIsIllConditioned(t *testing.T) {
	// a = 1e12 and 1e13: across the member the bending stiffness is 1e16
	// times smaller than the axial stiffness it is the remainder of, and
	// more, below the round-off of the arithmetic. The frame is still a
	// sound cantilever, not a mechanism: it is refused as having no correct
	// digit, whatever the options, with the estimate where the matrix could
	// be factored and without one where it could not.
	for _, tc := range []struct {
		a      float64
		factor bool // Cholesky succeeds and gives an estimate
	}{{1e12, true}, {1e13, false}} {
		t.Run(fmt.Sprintf("A = %g", tc.a), func(t *testing.T) {
			mo, _ := inclined(tc.a)
			_, err := SolveWith(mo, Options{AcceptIllConditioned: true})
			var ice *IllConditionedError
			if !errors.As(err, &ice) || ice.Acceptable {
				t.Fatalf("err = %v, want an *IllConditionedError that no option accepts", err)
			}
			if tc.factor != !math.IsInf(ice.Cond, 1) || !(ice.Cond > MaxCond) {
				t.Errorf("estimate %g, want one above %g (+Inf only where the factorization failed: %v)", ice.Cond, MaxCond, !tc.factor)
			}
			want := fmt.Sprintf("the stiffness matrix is too ill-conditioned to solve: estimated condition number %.2g, so the results would carry no correct digit; %s", ice.Cond, illAdvice)
			if !tc.factor {
				want = "the stiffness matrix is too ill-conditioned to solve: its factorization failed (it is not positive definite to the precision of the arithmetic, although nothing in the frame is free to move), so the results would carry no correct digit; " + illAdvice
			}
			if err.Error() != want {
				t.Errorf("error\n got: %s\nwant: %s", err, want)
			}
		})
	}
}

// stiffColumn returns the regular frame of gridFrame, 20 bays of 6 and 10
// storeys of 3.5, fixed bases, with the column on line 5 of storey 6 made
// of a section of area a (E = 30e6, I = 5e-3 like the rest), beams under
// w = 20 and a horizontal load of 21 at each level of line 0.
func stiffColumn(a float64) *Model {
	mo := gridFrame(20, 10, 3)
	mo.Sections = append(mo.Sections, Section{Name: "stiff", E: 30e6, A: a, I: 5e-3})
	c := Case{Name: "G+W"}
	for m, mem := range mo.Members {
		if mem.Name == "c5-6" {
			mo.Members[m].Section = 1
		}
		if mo.IsBeam(m) {
			c.MemberLoads = append(c.MemberLoads, MemberLoad{Member: m, To: 6, W: 20, WEnd: 20})
		}
	}
	for v, nd := range mo.Nodes {
		if nd.X == 0 && nd.Y > 0 {
			c.NodeLoads = append(c.NodeLoads, NodeLoad{Node: v, Fx: 21})
		}
	}
	mo.Cases = []Case{c}
	return mo
}

func TestSoundIllConditionedFramesAreNotMechanisms(t *testing.T) {
	// Sound frames whose matrices, scaled to unit diagonal, have condition
	// numbers of about 1e15: each is refused as ill-conditioned, with the
	// refusal that the option overrides, never named a mechanism; accepted,
	// it is solved, and its results agree with the closed forms to about
	// the digits the estimate leaves, κ ε of the largest value.
	t.Run("cantilever rising at 30°, A = 2.5e10", func(t *testing.T) {
		// EA/L = 1.25e18 against 12EI/L³ = 3750 across the member.
		mo, _ := inclined(2.5e10)
		sol := solveIllConditioned(t, mo)
		// Across the member the tip deflects P⊥L³/3EI and turns P⊥L²/2EI,
		// P⊥ = P cos 30°, whatever A (beam tables; common practice).
		const l, ei = 4.0, 200e6 * 1e-4
		c, s := math.Cos(math.Pi/6), math.Sin(math.Pi/6)
		ux, uy, rz := sol.Displacement(0, 1)
		tol := sol.Cond() * 0x1p-52
		if across, want := -s*ux+c*uy, -c*l*l*l/(3*ei); !near(across, want, tol) {
			t.Errorf("tip deflection across the member %.6g, want P⊥L³/3EI = %.6g (tolerance %.2g)", across, want, tol)
		}
		if want := -c * l * l / (2 * ei); !near(rz, want, tol) {
			t.Errorf("tip rotation %.6g, want P⊥L²/2EI = %.6g (tolerance %.2g)", rz, want, tol)
		}
	})
	t.Run("20 × 10 frame with one column of A = 1e13", func(t *testing.T) {
		// The column's EA/L = 8.6e19 against beams and columns of about 1e6:
		// the column moves as a rigid body, and the frame holds it.
		sol := solveIllConditioned(t, stiffColumn(1e13))
		// The same frame with the column at A = 1e9, axially rigid too
		// (it shortens by about 1e-10 of the frame's displacements) and
		// resolved to about five digits (κ ≈ 1e11), and the statics of
		// the loads: 20 × 6 × 10 × 20 = 24,000 down, 210 across.
		ref, err := Solve(stiffColumn(1e9))
		if err != nil {
			t.Fatal(err)
		}
		tol := sol.Cond() * 0x1p-52
		var big, diff [3]float64
		for v := range ref.Model().Nodes {
			a, b := [3]float64{}, [3]float64{}
			a[0], a[1], a[2] = ref.Displacement(0, v)
			b[0], b[1], b[2] = sol.Displacement(0, v)
			for d := range 3 {
				big[d], diff[d] = max(big[d], math.Abs(a[d])), max(diff[d], math.Abs(a[d]-b[d]))
			}
		}
		for d, name := range dirNames {
			if diff[d] > tol*big[d] {
				t.Errorf("%s differs from the frame with A = 1e9 by %.2g of its largest value, above κ ε = %.2g", name, diff[d]/big[d], tol)
			}
		}
		var fx, fy float64
		for v := range sol.Model().Nodes {
			rx, ry, _ := sol.Reaction(0, v)
			fx, fy = fx+rx, fy+ry
		}
		if !near(fy, 24000, tol) || !near(fx, -210, tol) {
			t.Errorf("reactions ΣFx = %.6g, ΣFy = %.6g; want -210 and 24000", fx, fy)
		}
	})
}

// solveIllConditioned solves mo, which must be refused for its condition
// number (between RefuseCond and MaxCond) unless accepted, and accepted,
// solved with the warning and in balance to round-off.
func solveIllConditioned(t *testing.T, mo *Model) *Solution {
	t.Helper()
	_, err := Solve(mo)
	var ice *IllConditionedError
	if !errors.As(err, &ice) || !ice.Acceptable {
		t.Fatalf("err = %v, want an acceptable *IllConditionedError", err)
	}
	if !(ice.Cond > RefuseCond && ice.Cond < MaxCond) {
		t.Fatalf("estimate %.3g, want between %g and %g", ice.Cond, RefuseCond, MaxCond)
	}
	sol, err := SolveWith(mo, Options{AcceptIllConditioned: true})
	if err != nil {
		t.Fatalf("accepted: %v", err)
	}
	if w := sol.Warnings(); len(w) != 1 || !strings.Contains(w[0], "solved only because that was accepted") {
		t.Errorf("warnings %q, want the one on an accepted condition number", w)
	}
	if b := sol.Balance(0).Relative(); !(b <= sol.RoundOff()) {
		t.Errorf("out of balance by %.2g of the load, above round-off %.2g", b, sol.RoundOff())
	}
	return sol
}

func TestPivotWatchFindsTheRayleighQuotient(t *testing.T) {
	// The quotient pivotWatch keeps up along the factorization against the
	// mechanism shape found by back-substitution (nullVector), for random
	// band matrices of unit diagonal, some equations restrained on the way.
	rng := rand.New(rand.NewPCG(7, 0))
	for _, sz := range []struct{ n, kb int }{{1, 0}, {6, 1}, {30, 4}, {60, 9}} {
		t.Run(fmt.Sprintf("n=%d kb=%d", sz.n, sz.kb), func(t *testing.T) {
			n, kb := sz.n, sz.kb
			w := kb + 1
			// Diagonally dominant, then scaled to unit diagonal.
			data := make([]float64, n*w)
			for i := range n {
				for j := 1; j < w && i+j < n; j++ {
					data[i*w+j] = rng.Float64()*2 - 1
				}
			}
			for i := range n {
				d := 1.0
				for j := 1; j < w; j++ {
					if i+j < n {
						d += math.Abs(data[i*w+j])
					}
					if i-j >= 0 {
						d += math.Abs(data[(i-j)*w+j])
					}
				}
				data[i*w] = d
			}
			equilibrate(data, n, kb)
			u := slices.Clone(data)
			watch := newPivotWatch(kb)
			for i := range n {
				p := u[i*w]
				got := watch.quotient(u, i, p)
				z := nullVector(u, w, i)
				zz := 0.0
				for _, v := range z {
					zz += v * v
				}
				if want := p / zz; !near(got, want, 1e-10) {
					t.Fatalf("equation %d: quotient %g, want %g", i, got, want)
				}
				if i%7 == 3 { // restrain it, as diagnose does a mechanism
					watch.take(i, 1)
					u[i*w] = 1
					for j := 1; j < w && i+j < n; j++ {
						u[i*w+j] = 0
					}
					continue
				}
				p = math.Sqrt(p)
				watch.take(i, p)
				u[i*w] = p
				for j := 1; j < w && i+j < n; j++ {
					u[i*w+j] /= p
				}
				for j := 1; j < w && i+j < n; j++ {
					for l := j; l < w && i+l < n; l++ {
						u[(i+j)*w+l-j] -= u[i*w+j] * u[i*w+l]
					}
				}
			}
		})
	}
}

func TestUnitSlipLeavesTheMatrixWellConditioned(t *testing.T) {
	// A 4 m steel cantilever, A = 0.01 m², I = 1e-4 m⁴: radius of gyration
	// √(I/A) = 0.1 m. With I entered in mm⁴ (1e8) beside A in m² every
	// bending stiffness is 10¹² times too large, uniformly: scaled to unit
	// diagonal the matrix is as well conditioned as any other cantilever
	// (7 + 4√3), so the conditioning warning cannot catch the slip, and the
	// solver says nothing. Package envelope/analysis looks for such slips
	// (Plausibility), knowing the model's units.
	for _, tc := range []struct {
		name string
		a, i float64
		l    float64
	}{
		{"kN and m", 0.01, 1e-4, 4},
		{"N and mm", 1e4, 1e8, 4000},
		{"axially rigid link: A × 1e6", 1e4, 1e-4, 4},
		{"I in mm⁴ beside A in m²", 0.01, 1e8, 4},
	} {
		t.Run(tc.name, func(t *testing.T) {
			sol, err := Solve(cantilever(tc.l, 200e6, tc.a, tc.i))
			if err != nil {
				t.Fatal(err)
			}
			if w := sol.Warnings(); len(w) != 0 {
				t.Errorf("warnings %q", w)
			}
			if !near(sol.Cond(), cantileverCond, condTol) {
				t.Errorf("Cond() = %g, want 7 + 4√3", sol.Cond())
			}
		})
	}
}

// estimateTol is the agreement asked of the two ways of estimating
// ‖A⁻¹‖₁: the same estimator on the same solves, one of them scaled
// against overflow.
const estimateTol = 1e-12

func TestInverseNormEstimateMatchesLAPACK(t *testing.T) {
	// invNorm1 runs LAPACK's estimator (dlacn2) with the project's band
	// substitution (bandSolveVec); LAPACK's dpbcon runs it with solves
	// guarded against overflow (dlatbs), and invNorm1Tbsv with gonum's
	// plain triangular solves (dtbsv), as invNorm1 did before. Where
	// nothing overflows all three must agree: frames scaled to unit
	// diagonal, well and badly conditioned.
	for _, tc := range []struct {
		name string
		mo   *Model
	}{
		{"regular frame 10 × 10", gridFrame(10, 10, 4)},
		{"regular frame 30 × 20", gridFrame(30, 20, 5)},
		{"20 × 10 frame with one column of A = 1e13", stiffColumn(1e13)},
		{"cantilever rising at 30°, A = 2.5e10", func() *Model { mo, _ := inclined(2.5e10); return mo }()},
	} {
		t.Run(tc.name, func(t *testing.T) {
			order := rcmOrder(adjacency(tc.mo))
			dof, n, band := dofMap(tc.mo, order, releasedRotations(tc.mo))
			sol := &Solution{model: tc.mo, dof: dof, elems: make([]element, len(tc.mo.Members))}
			for m := range tc.mo.Members {
				sol.elems[m] = newElement(tc.mo, m)
			}
			kb := min(band, n-1)
			data := sol.assemble(n, kb)
			equilibrate(data, n, kb)
			a := blas64.SymmetricBand{Uplo: blas.Upper, N: n, K: kb, Data: slices.Clone(data), Stride: kb + 1}
			u, ok := lapack64.Pbtrf(a)
			if !ok {
				t.Fatal("not positive definite")
			}
			got, ok := invNorm1(u.Data, n, kb)
			if !ok {
				t.Fatal("the plain solves overflowed")
			}
			f := blas64.SymmetricBand{Uplo: blas.Upper, N: n, K: kb, Data: u.Data, Stride: kb + 1}
			want := 1 / lapack64.Pbcon(f, 1, make([]float64, 3*n), make([]int, n))
			if !near(got, want, estimateTol) {
				t.Errorf("‖A⁻¹‖₁ estimated %.15g, dpbcon %.15g", got, want)
			}
			tb, ok := invNorm1Tbsv(u.Data, n, kb)
			if !ok {
				t.Fatal("the dtbsv solves overflowed")
			}
			if !near(got, tb, estimateTol) {
				t.Errorf("‖A⁻¹‖₁ estimated %.15g, with dtbsv %.15g", got, tb)
			}
		})
	}
}

// invNorm1Tbsv is invNorm1 with gonum's band triangular solves (dtbsv), as
// it was before it took the project's substitution: the reference of
// TestInverseNormEstimateMatchesLAPACK and BenchmarkConditionEstimate.
func invNorm1Tbsv(u []float64, n, kb int) (est float64, ok bool) {
	t := blas64.TriangularBand{Uplo: blas.Upper, Diag: blas.NonUnit, N: n, K: kb, Data: u, Stride: kb + 1}
	x, v, sign := make([]float64, n), make([]float64, n), make([]int, n)
	xv := blas64.Vector{N: n, Data: x, Inc: 1}
	var kase int
	var save [3]int
	for {
		est, kase = lapackgo.Implementation{}.Dlacn2(n, v, x, sign, est, kase, &save)
		if kase == 0 {
			return est, finite(est)
		}
		blas64.Tbsv(blas.Trans, t, xv)
		blas64.Tbsv(blas.NoTrans, t, xv)
		for _, xi := range x {
			if !finite(xi) {
				return 0, false
			}
		}
	}
}

func TestSkipConditionSolvesAlikeAndRefusesOnlyWhatCannotBeFactored(t *testing.T) {
	// The inclined cantilever's tip deflection is the closed form of
	// inclined (beam tables, from memory); the estimate left out changes no
	// digit of the results, only what is refused or warned of.
	t.Run("well-conditioned: the same results, no estimate", func(t *testing.T) {
		mo, _ := inclined(0.01)
		want, err := Solve(mo)
		if err != nil {
			t.Fatal(err)
		}
		got, err := SolveWith(mo, Options{SkipCondition: true})
		if err != nil {
			t.Fatal(err)
		}
		if !math.IsNaN(got.Cond()) {
			t.Errorf("Cond() = %g, want NaN (not estimated)", got.Cond())
		}
		for d := range 3 {
			if g, w := got.x[d], want.x[d]; g != w {
				t.Errorf("displacement %d = %v, estimated %v", d, g, w)
			}
		}
	})
	t.Run("ill-conditioned: solved without refusal or warning", func(t *testing.T) {
		mo, uy := inclined(5e8)
		accepted, err := SolveWith(mo, Options{AcceptIllConditioned: true})
		if err != nil {
			t.Fatal(err)
		}
		got, err := SolveWith(mo, Options{SkipCondition: true})
		if err != nil {
			t.Fatalf("err = %v, want no refusal without an estimate", err)
		}
		if len(got.Warnings()) != 0 {
			t.Errorf("warnings %q, want none", got.Warnings())
		}
		_, gy, _ := got.Displacement(0, 1)
		if _, ay, _ := accepted.Displacement(0, 1); gy != ay {
			t.Errorf("tip uy = %v, accepted with an estimate %v", gy, ay)
		}
		if !near(gy, uy, 10*accepted.Cond()*0x1p-52) {
			t.Errorf("tip uy = %.6g, want %.6g", gy, uy)
		}
	})
	t.Run("not factorable: refused as before", func(t *testing.T) {
		mo, _ := inclined(1e13)
		_, err := SolveWith(mo, Options{SkipCondition: true})
		var ice *IllConditionedError
		if !errors.As(err, &ice) || !math.IsInf(ice.Cond, 1) {
			t.Fatalf("err = %v, want an *IllConditionedError with Cond +Inf", err)
		}
	})
}
