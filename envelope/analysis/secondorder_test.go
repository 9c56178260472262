package analysis

import (
	"context"
	"errors"
	"fmt"
	"math"
	"reflect"
	"runtime"
	"slices"
	"strings"
	"testing"

	"govern/combos"
	"govern/envelope"
	"govern/frame"
	"govern/patterns"
)

// cantileverJob is a cantilever column, fixed at its base, EI = 250,
// L = 10, under a dead load p down and a wind load h along X at its top:
// the beam-column of Timoshenko & Gere, Theory of Elastic Stability.
func cantileverJob(p, h float64, m Method) *Job {
	const ei, l = 250.0, 10.0
	return &Job{
		Units: Units{Force: "kN", Length: "m"},
		Model: &frame.Model{
			Sections: []frame.Section{{Name: "C", E: 2e8, A: 1e4 * ei / (l * l) / 2e8, I: ei / 2e8}},
			Nodes:    []frame.Node{{Name: "B", Support: frame.Fixed}, {Name: "T", Y: l}},
			Members:  []frame.Member{{Name: "B-T", Start: 0, End: 1}},
			Cases: []frame.Case{
				{Name: "D", NodeLoads: []frame.NodeLoad{{Node: 1, Fy: -p}}},
				{Name: "W", NodeLoads: []frame.NodeLoad{{Node: 1, Fx: h}}},
			},
		},
		Cases:        []combos.Case{{Name: "D", Kind: combos.Dead}, {Name: "W", Kind: combos.Wind}},
		Combinations: []combos.Combination{{Name: "D+W", Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}}}},
		Methods:      []Method{m},
		Settings:     Settings{Stations: 11},
		Levels:       []Level{{Name: "level 0"}, {Name: "level 1", Y: l}},
	}
}

// cantileverMoment is the base moment of the cantilever beam-column, H
// tan(kL)/k with k = √(P/EI) (Timoshenko & Gere).
func cantileverMoment(p, h float64) float64 {
	k := math.Sqrt(p / 250)
	return h * math.Tan(k*10) / k
}

// TestSecondOrderCantileverRun checks a second-order run of the
// cantilever column against the closed form (Timoshenko & Gere): base
// moment 1.126536 for P = 4, H = 0.045, αcr = π²EI/(4L²)/P = 1.542126;
// a first-order run of it gives H L = 0.45 with a warning that names the
// thresholds (EN 1993-1-1 5.2.1(3), ACI 318-19 6.6.4.3).
func TestSecondOrderCantileverRun(t *testing.T) {
	const p, h = 4.0, 0.045
	want := cantileverMoment(p, h)
	if !within(want, 1.126536, 2e-6) {
		t.Fatalf("closed form %.7g", want)
	}
	res, err := Run(context.Background(), cantileverJob(p, h, Method{SecondOrder: true}), Options{})
	if err != nil {
		t.Fatal(err)
	}
	base := res.Envelope.Members[0].Stations[0].M
	if got := math.Max(math.Abs(base.Max), math.Abs(base.Min)); !within(got, want, 1e-3) {
		t.Errorf("base moment %.7g, want %.7g (Timoshenko & Gere)", got, want)
	}
	cb := res.Combinations[0]
	if a := math.Pi * math.Pi * 250 / 400 / p; !within(cb.CriticalFactor, a, 1e-3) {
		t.Errorf("αcr %.7g, want π²EI/(4L²)/P = %.7g", cb.CriticalFactor, a)
	}
	if cb.Iterations < 1 {
		t.Errorf("%d iterations on the axial forces", cb.Iterations)
	}
	// The column's governing moment beside the first-order one of the same
	// state, H L = 0.45: the ratio ACI 318-19 6.2.5.3 limits to 1.4.
	if a := res.Amplifications; len(a) != 1 || a[0].X != 0 || a[0].By != 0 || !within(a[0].Second, want, 1e-3) ||
		!within(a[0].First, 0.45, 1e-9) || !within(a[0].Ratio, want/0.45, 1e-3) || a[0].Ratio <= AmplificationLimit {
		t.Errorf("amplifications %+v, want %.6g / 0.45 at the base", a, want)
	}
	for _, w := range res.Warnings {
		if strings.Contains(w, "first-order") {
			t.Errorf("a second-order run warned: %s", w)
		}
	}

	first, err := Run(context.Background(), cantileverJob(p, h, Method{}), Options{})
	if err != nil {
		t.Fatal(err)
	}
	if m := first.Envelope.Members[0].Stations[0].M; !within(math.Max(math.Abs(m.Max), math.Abs(m.Min)), h*10, 1e-9) {
		t.Errorf("first-order base moment %v, want HL = 0.45", m)
	}
	if !within(first.Combinations[0].CriticalFactor, cb.CriticalFactor, 1e-9) {
		t.Errorf("first-order run's αcr %.7g, the second-order run's %.7g", first.Combinations[0].CriticalFactor, cb.CriticalFactor)
	}
	warned := false
	for _, w := range first.Warnings {
		warned = warned || strings.Contains(w, `combination "D+W"`) && strings.Contains(w, "αcr ≥ 10") && strings.Contains(w, "Q ≤ 0.05")
	}
	if !warned {
		t.Errorf("no first-order warning for αcr = 1.54: %q", first.Warnings)
	}
}

// TestSecondOrderAllowable checks an allowable stress combination: it is
// analysed at 1.6 times its loads and its forces divided by 1.6 (AISC
// 360-16 C2.1(d)), here against the closed form of the cantilever at 1.6P
// and 1.6H, divided by 1.6 (Timoshenko & Gere); with αcr ≤ 1.6 it is an
// error naming the combination.
func TestSecondOrderAllowable(t *testing.T) {
	const p, h = 2.0, 0.045
	res, err := Run(context.Background(), cantileverJob(p, h, Method{SecondOrder: true, Allowable: true}), Options{})
	if err != nil {
		t.Fatal(err)
	}
	want := cantileverMoment(1.6*p, 1.6*h) / 1.6
	base := res.Envelope.Members[0].Stations[0].M
	if got := math.Max(math.Abs(base.Max), math.Abs(base.Min)); !within(got, want, 1e-3) {
		t.Errorf("base moment %.7g, want M(1.6P, 1.6H)/1.6 = %.7g", got, want)
	}
	if strength := cantileverMoment(p, h); within(want, strength, 1e-2) {
		t.Fatalf("the test cannot tell 1.6 scaling from none: %g and %g", want, strength)
	}
	_, err = Run(context.Background(), cantileverJob(4, h, Method{SecondOrder: true, Allowable: true}), Options{})
	if !errors.Is(err, ErrBuckles) || !strings.Contains(err.Error(), `combination "D+W"`) || !strings.Contains(err.Error(), "not above 1.6") {
		t.Errorf("αcr = 1.54 on an allowable combination: %v", err)
	}
}

// TestBucklingIsAnError checks that a combination whose critical load
// factor is at most 1 is an error naming it in a second-order run, and a
// warning saying the results do not stand in a first-order one.
func TestBucklingIsAnError(t *testing.T) {
	_, err := Run(context.Background(), cantileverJob(7, 0.045, Method{SecondOrder: true}), Options{})
	if !errors.Is(err, ErrBuckles) || !strings.Contains(err.Error(), `combination "D+W"`) {
		t.Errorf("P = 7 over the Euler load 6.17: %v", err)
	}
	res, err := Run(context.Background(), cantileverJob(7, 0.045, Method{}), Options{})
	if err != nil {
		t.Fatal(err)
	}
	if len(res.Warnings) != 1 || !strings.Contains(res.Warnings[0], `combination "D+W": the critical load factor αcr = 0.8812 is not above 1`) || !strings.Contains(res.Warnings[0], "do not stand") {
		t.Errorf("first order, P = 7: warnings %q", res.Warnings)
	}
}

// portalJob is a symmetric portal frame, fixed feet, under gravity only.
func portalJob(m Method, rule NotionalRule) *Job {
	const h, l = 4.0, 6.0
	return &Job{
		Units: Units{Force: "kN", Length: "m"},
		Model: &frame.Model{
			Sections: []frame.Section{{Name: "S", E: 2e8, A: 5e-3, I: 8e-5}},
			Nodes: []frame.Node{{Name: "A0", Support: frame.Fixed}, {Name: "A1", Y: h},
				{Name: "B1", X: l, Y: h}, {Name: "B0", X: l, Support: frame.Fixed}},
			Members: []frame.Member{{Name: "A0-A1", Start: 0, End: 1}, {Name: "A1-B1", Start: 1, End: 2}, {Name: "B0-B1", Start: 3, End: 2}},
			Cases: []frame.Case{{Name: "D", MemberLoads: []frame.MemberLoad{{Member: 1, To: l, W: 20, WEnd: 20}},
				NodeLoads: []frame.NodeLoad{{Node: 1, Fy: -50}, {Node: 2, Fy: -50}}}},
		},
		Cases:        []combos.Case{{Name: "D", Kind: combos.Dead}},
		Combinations: []combos.Combination{{Name: "1.4D", Terms: []combos.Term{{Case: 0, Factor: 1.4}}}},
		Methods:      []Method{m},
		Sway:         Sway{Notional: rule},
		Settings:     Settings{Stations: 5},
		Levels:       []Level{{Name: "level 0"}, {Name: "level 1", Y: h}},
	}
}

// TestNotionalGravityOnly checks the notional loads of a gravity-only
// combination of a symmetric frame (AISC 360-16 C2.2b: Ni = 0.002 α Yi):
// the base shears sum to 0.002 ΣP in each direction, the directions
// alternatives; without the notional loads the reactions balance.
func TestNotionalGravityOnly(t *testing.T) {
	total := 1.4 * (20*6 + 100)
	for _, m := range []Method{{}, {SecondOrder: true}} {
		res, err := Run(context.Background(), portalJob(m, NotionalAISC360), Options{})
		if err != nil {
			t.Fatal(err)
		}
		ns := res.Combinations[0].Notional
		if len(ns) != 2 || !ns[0].Alternative || ns[0].Direction != 1 || ns[1].Direction != -1 {
			t.Fatalf("notional loads %+v, want one per direction as alternatives", ns)
		}
		for _, n := range ns {
			if !within(math.Abs(n.Total), 0.002*total, 1e-12) || len(n.Levels) != 1 || !within(n.Levels[0].Gravity, total, 1e-12) {
				t.Errorf("notional %+v: total %g, want 0.002 × %g", n, n.Total, total)
			}
		}
		var lo, hi, bareLo, bareHi float64
		for i, rc := range res.Envelope.Reactions {
			lo += rc.Fx.Min
			hi += rc.Fx.Max
			bareLo += res.BareReactions[i].Fx.Min
			bareHi += res.BareReactions[i].Fx.Max
		}
		// Sway amplifies the base shear of the notional loads only through
		// the P-Δ shear, which the feet carry back: the sum stays 0.002 ΣP.
		if !within(hi, 0.002*total, 1e-6) || !within(lo, -0.002*total, 1e-6) {
			t.Errorf("second order %v: base shears sum to %.6g and %.6g, want ±%.6g", m.SecondOrder, hi, lo, 0.002*total)
		}
		if math.Abs(bareLo) > 1e-9*total || math.Abs(bareHi) > 1e-9*total {
			t.Errorf("without the notional loads the base shears sum to %.6g and %.6g, want 0", bareLo, bareHi)
		}
		if f := res.BareReactions[0].Fx; !(f.Max > 0.01*total) || !within(f.Min, f.Max, 1e-9) {
			t.Errorf("without the notional loads the left foot's shear %+v: want the gravity thrust alone", f)
		}
	}
}

func within(got, want, tol float64) bool { return math.Abs(got-want) <= tol*math.Abs(want) }

// TestStiffnessReduction checks the stiffness factors against closed
// forms: αcr = π²(0.8 EI)/(4L²)/P with AISC 360-16 C2.3(a)'s 0.8 on EI
// (the nominal αcr beside it); τb = 4(αPr/Pns)(1 − αPr/Pns) = 0.75 for
// αPr/Pns = 0.75 (C2.3(b)), the base moment that of the beam-column with
// 0.75 EI (Timoshenko & Gere); and ACI 318-19 6.6.3: a section factor
// 0.35 on I for strength, min(1.4 × 0.35, 1) = 0.49 for service drift, the
// cantilever's tip HL³/(3 × 0.49 EI).
func TestStiffnessReduction(t *testing.T) {
	const p, h, ei = 4.0, 0.045, 250.0
	euler := math.Pi * math.Pi * ei / 400 / p
	t.Run("AISC 0.8", func(t *testing.T) {
		job := cantileverJob(p*0.5, h, Method{SecondOrder: true, Stiffness: Strength})
		job.Sway.StrengthEI, job.Sway.StrengthEA = 0.8, 0.8
		res, err := Run(context.Background(), job, Options{})
		if err != nil {
			t.Fatal(err)
		}
		cb := res.Combinations[0]
		if !within(cb.CriticalFactor, 0.8*2*euler, 1e-3) || !within(cb.CriticalNominal, 2*euler, 1e-3) {
			t.Errorf("αcr %g, nominal %g; want 0.8 × %g and %g", cb.CriticalFactor, cb.CriticalNominal, 2*euler, 2*euler)
		}
		k := math.Sqrt(p * 0.5 / (0.8 * ei))
		want := h * math.Tan(k*10) / k
		if m := res.Envelope.Members[0].Stations[0].M; !within(math.Max(math.Abs(m.Max), math.Abs(m.Min)), want, 1e-3) {
			t.Errorf("base moment %v, want %g with 0.8 EI", m, want)
		}
	})
	t.Run("tau_b", func(t *testing.T) {
		job := cantileverJob(p*0.5, h, Method{SecondOrder: true, Stiffness: Strength})
		a := job.Model.Sections[0].A
		job.Sway.TauB = TauBFy
		job.Sway.Fy = []float64{p * 0.5 / (0.75 * a)} // αPr/Pns = 0.75
		res, err := Run(context.Background(), job, Options{})
		if err != nil {
			t.Fatal(err)
		}
		k := math.Sqrt(p * 0.5 / (0.75 * ei))
		want := h * math.Tan(k*10) / k
		if m := res.Envelope.Members[0].Stations[0].M; !within(math.Max(math.Abs(m.Max), math.Abs(m.Min)), want, 1e-3) {
			t.Errorf("base moment %v, want %g with τb = 0.75", m, want)
		}
	})
	t.Run("ACI sections", func(t *testing.T) {
		job := cantileverJob(0.01, h, Method{})
		job.Combinations = append(job.Combinations, combos.Combination{Name: "W service", Service: true, Terms: []combos.Term{{Case: 1, Factor: 1}}})
		job.Methods = []Method{{Stiffness: Strength}, {Stiffness: Service}}
		job.Sway.SectionI = []float64{0.35}
		res, err := Run(context.Background(), job, Options{})
		if err != nil {
			t.Fatal(err)
		}
		want := h * 1000 / (3 * 0.49 * ei)
		if ux := res.Displacements[1].Ux; !within(ux.Max, want, 1e-9) || ux.MaxBy != 1 {
			t.Errorf("service tip %+v, want HL³/(3 × 0.49 EI) = %g", ux, want)
		}
		if !within(res.Combinations[0].CriticalFactor, 0.35*math.Pi*math.Pi*ei/400/0.01, 1e-3) {
			t.Errorf("strength αcr %g, want with 0.35 I", res.Combinations[0].CriticalFactor)
		}
	})
}

// TestNotionalEN1993 checks φ = φ0 αh αm of EN 1993-1-1 5.3.2(3)a on the
// portal: h = 4 m gives αh = 2/√4 = 1, two equally loaded columns m = 2,
// αm = √(0.5(1 + 1/2)), φ = αm/200 = 0.004330.
func TestNotionalEN1993(t *testing.T) {
	res, err := Run(context.Background(), portalJob(Method{}, NotionalEN1993), Options{})
	if err != nil {
		t.Fatal(err)
	}
	want := math.Sqrt(0.75) / 200
	for _, n := range res.Combinations[0].Notional {
		if !within(n.Ratio, want, 1e-12) {
			t.Errorf("φ = %g, want %g", n.Ratio, want)
		}
	}
	if len(res.Combinations[0].Notional) != 2 {
		t.Errorf("notional %+v", res.Combinations[0].Notional)
	}
}

// TestSecondOrderOnRequest: what the tables ask of a result after the run,
// the end moments of an extreme's state and the envelope at any point,
// come from the combination's own second-order solution: the cantilever's
// base moment H tan(kL)/k = 1.126536 (Timoshenko & Gere), not the
// first-order H L = 0.45.
func TestSecondOrderOnRequest(t *testing.T) {
	const p, h = 4.0, 0.045
	want := cantileverMoment(p, h)
	res, err := Run(context.Background(), cantileverJob(p, h, Method{SecondOrder: true}), Options{})
	if err != nil {
		t.Fatal(err)
	}
	st, err := res.StationsAt(0, []float64{0, 5})
	if err != nil {
		t.Fatal(err)
	}
	m := st[0].M
	base := m.Max
	hi := true
	if math.Abs(m.Min) > math.Abs(m.Max) {
		base, hi = m.Min, false
	}
	if !within(math.Abs(base), want, 1e-3) {
		t.Errorf("StationsAt: base moment %v, want %.6g", m, want)
	}
	ends, ok := res.EndMoments(0, 0, 0, 2, hi, base)
	if !ok || !within(math.Abs(ends[0]), want, 1e-3) || math.Abs(ends[1]) > 1e-9 {
		t.Errorf("EndMoments: %v (ok %v), want %.6g at the base and 0 at the top", ends, ok, want)
	}
}

// TestEndMomentsOfMany: the end moments of several members' states asked
// together (each second-order combination's solution formed once and let
// go) are those asked member by member; on the cantilever, H tan(kL)/k =
// 1.126536 at the base (Timoshenko & Gere), and the solutions asked
// together are not kept.
func TestEndMomentsOfMany(t *testing.T) {
	const p, h = 4.0, 0.045
	want := cantileverMoment(p, h)
	res, err := Run(context.Background(), cantileverJob(p, h, Method{SecondOrder: true}), Options{})
	if err != nil {
		t.Fatal(err)
	}
	m := res.Envelope.Members[0].Stations[0].M
	base, hi := m.Max, true
	if math.Abs(m.Min) > math.Abs(m.Max) {
		base, hi = m.Min, false
	}
	asks := []envelope.State{{X: 0, By: 0, Effect: 2, Hi: hi, Want: base}, {X: 0, By: 0, Effect: 0, Hi: true, Want: m.Max}}
	many := res.EndMomentsOfMany([]int{0, 0}, [][]envelope.State{asks, asks[:1]})
	if len(res.solutions) != 0 {
		t.Errorf("%d solutions kept", len(res.solutions))
	}
	one := res.EndMomentsOf(0, asks)
	for i, got := range [][]envelope.State{many[0], many[1]} {
		for q := range got {
			if got[q] != one[q] {
				t.Errorf("member %d state %d: %+v together, %+v alone", i, q, got[q], one[q])
			}
		}
	}
	if !many[0][0].OK || !within(math.Abs(many[0][0].Ends[0]), want, 1e-3) {
		t.Errorf("base moment %v, want %.6g", many[0][0].Ends, want)
	}
}

// A second-order combination without patterned terms (1.4D, 0.9D ± W) is
// solved without the pattern pieces, which none of its results reads:
// every result is the same, to the last bit, as when they are solved, on
// a regular frame whose live and roof live loads are patterned (span by
// span, and by the code's arrangements), with a service combination.
func TestCombinationsWithoutPatternsLeaveOutThePieces(t *testing.T) {
	for _, mode := range []patterns.Mode{patterns.Exact, patterns.Code} {
		t.Run(mode.String(), func(t *testing.T) { leaveOutThePieces(t, mode) })
	}
}

func leaveOutThePieces(t *testing.T, mode patterns.Mode) {
	job := regularJob(4, 3, true)
	job.Patterns = mode
	job.Methods = make([]Method, len(job.Combinations))
	without := 0
	for k, cb := range job.Combinations {
		job.Methods[k] = Method{SecondOrder: true}
		patterned := false
		for _, term := range cb.Terms {
			patterned = patterned || term.Case == 1 || term.Case == 2
		}
		if !patterned {
			without++
		}
	}
	if without == 0 {
		t.Fatal("every combination has a patterned term: nothing is left out")
	}
	got, err := Run(context.Background(), job, Options{})
	if err != nil {
		t.Fatal(err)
	}
	leaveOutUnits = false
	defer func() { leaveOutUnits = true }()
	want, err := Run(context.Background(), job, Options{})
	if err != nil {
		t.Fatal(err)
	}
	sameResults(t, got, want, "with the pieces left out")
}

// inclinedJob is a cantilever of length 4 inclined at 30°, E = 200e6,
// I = 1e-4 and area a, under 1 down and 0.1 along X at its tip. With
// a = 5e8 its axial stiffness is about 7e12 times its bending stiffness
// across the member, a condition number between frame.RefuseCond and
// frame.MaxCond (the frame package's inclined cantilever).
func inclinedJob(a float64, m Method) *Job {
	const l = 4.0
	c, s := math.Cos(math.Pi/6), math.Sin(math.Pi/6)
	return &Job{
		Units: Units{Force: "kN", Length: "m"},
		Model: &frame.Model{
			Sections: []frame.Section{{Name: "S", E: 200e6, A: a, I: 1e-4}},
			Nodes:    []frame.Node{{Name: "B", Support: frame.Fixed}, {Name: "T", X: l * c, Y: l * s}},
			Members:  []frame.Member{{Name: "B-T", Start: 0, End: 1}},
			Cases: []frame.Case{
				{Name: "D", NodeLoads: []frame.NodeLoad{{Node: 1, Fy: -1}}},
				{Name: "W", NodeLoads: []frame.NodeLoad{{Node: 1, Fx: 0.1}}},
			},
		},
		Cases:        []combos.Case{{Name: "D", Kind: combos.Dead}, {Name: "W", Kind: combos.Wind}},
		Combinations: []combos.Combination{{Name: "D+W", Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}}}},
		Methods:      []Method{m},
		Settings:     Settings{Stations: 11},
	}
}

// TestIllConditionedSecondOrderIsRefusedAlike checks that a second-order
// run of an ill-conditioned frame is refused with the error of a
// first-order run (frame.IllConditionedError, the frame package's own
// estimate), whatever the stiffness, although the iteration's steps leave
// the estimate out; accepted, the combination reports the estimate of
// the solution its results come from, above frame.RefuseCond, with the
// warning.
func TestIllConditionedSecondOrderIsRefusedAlike(t *testing.T) {
	_, want := Run(context.Background(), inclinedJob(5e8, Method{}), Options{})
	var ice *frame.IllConditionedError
	if !errors.As(want, &ice) || !ice.Acceptable {
		t.Fatalf("first order: err = %v, want an acceptable *frame.IllConditionedError", want)
	}
	for _, m := range []Method{{SecondOrder: true}, {SecondOrder: true, Stiffness: Strength}} {
		t.Run(m.Stiffness.String(), func(t *testing.T) {
			_, err := Run(context.Background(), inclinedJob(5e8, m), Options{})
			if err == nil || err.Error() != want.Error() || !errors.Is(err, frame.ErrIllConditioned) {
				t.Fatalf("err = %v\nwant %v", err, want)
			}
			res, err := Run(context.Background(), inclinedJob(5e8, m), Options{Solver: frame.Options{AcceptIllConditioned: true}})
			if err != nil {
				t.Fatal(err)
			}
			cb := res.Combinations[0]
			if cb.Iterations < 1 || !(cb.Condition > frame.RefuseCond && cb.Condition <= frame.MaxCond) {
				t.Errorf("%d iterations, condition %g: want iterations and an estimate between %g and %g", cb.Iterations, cb.Condition, frame.RefuseCond, frame.MaxCond)
			}
			warned := false
			for _, w := range res.Warnings {
				warned = warned || strings.Contains(w, "ill-conditioned") && strings.Contains(w, "accepted")
			}
			if !warned {
				t.Errorf("no warning of the accepted ill-conditioning: %q", res.Warnings)
			}
		})
	}
}

// TestSecondOrderSharedFactorsChangeNothing checks that the second-order
// solves made on the factors of others of the same stiffness (the
// first-order start and storeys on the run's, the envelope on the
// iteration's last) give every result to the last bit as solves of their
// own do: an independent factorization of the same matrix (shareFactors
// off), on the regular frame with patterned live loads, with the sections
// as given, reduced, and reduced by τb.
func TestSecondOrderSharedFactorsChangeNothing(t *testing.T) {
	for _, tc := range []struct {
		name string
		set  func(*Job)
	}{
		{"nominal", func(*Job) {}},
		{"strength 0.8", func(j *Job) {
			j.Sway.StrengthEI, j.Sway.StrengthEA = 0.8, 0.8
			for k := range j.Methods {
				j.Methods[k].Stiffness = Strength
			}
		}},
		{"tau_b", func(j *Job) {
			// Fy low enough that the lower columns' αPr/Pns passes 0.5.
			j.Sway.TauB = TauBFy
			j.Sway.Fy = []float64{8000, 1e6} // Pns = 2000 for the columns
			for k := range j.Methods {
				j.Methods[k].Stiffness = Strength
			}
		}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			job := secondOrderJob(4, 3, true)
			tc.set(job)
			got, err := Run(context.Background(), job, Options{})
			if err != nil {
				t.Fatal(err)
			}
			if job.Sway.TauB == TauBFy {
				plain := *job
				plain.Sway.TauB = TauBNone
				p, err := Run(context.Background(), &plain, Options{})
				if err != nil {
					t.Fatal(err)
				}
				if reflect.DeepEqual(p.Envelope.Members, got.Envelope.Members) {
					t.Fatal("τb reduces no member: the case tests nothing of its own")
				}
			}
			shareFactors = false
			defer func() { shareFactors = true }()
			want, err := Run(context.Background(), job, Options{})
			if err != nil {
				t.Fatal(err)
			}
			sameResults(t, got, want, "on shared factors")
		})
	}
}

// sameResults reports each part of got that is not deeply equal to want's
// (members, reactions, combinations, node displacements, storeys,
// amplifications, warnings), saying how got was found: "differ " + why.
func sameResults(t *testing.T, got, want *Result, why string) {
	t.Helper()
	for _, c := range []struct {
		what      string
		got, want any
	}{
		{"members", got.Envelope.Members, want.Envelope.Members},
		{"reactions", got.Envelope.Reactions, want.Envelope.Reactions},
		{"combinations", got.Combinations, want.Combinations},
		{"node displacements", got.Displacements, want.Displacements},
		{"storeys", got.Storeys, want.Storeys},
		{"amplifications", got.Amplifications, want.Amplifications},
		{"warnings", got.Warnings, want.Warnings},
	} {
		if !reflect.DeepEqual(c.got, c.want) {
			t.Errorf("%s differ %s", c.what, why)
		}
	}
}

// TestSecondOrderCriticalTogether checks that the critical load factors
// of a second-order run's combinations, found side by side on one factor
// of the stiffness (iterateAll), are those found for each alone
// (criticalTogether off) within what Buckling.Factors promises of each
// (frame.CriticalTol, and the rounding to six figures), the first
// combination's to the last bit (its iteration is the same), and that
// nothing else changes: on the regular frame with patterned live loads,
// with the sections as given and reduced, on one processor and two.
func TestSecondOrderCriticalTogether(t *testing.T) {
	const tol = 2e-6 // frame.CriticalTol and two roundings to six figures
	for _, tc := range []struct {
		name string
		set  func(*Job)
	}{
		{"nominal", func(*Job) {}},
		{"strength 0.8", func(j *Job) {
			j.Sway.StrengthEI, j.Sway.StrengthEA = 0.8, 0.8
			for k := range j.Methods {
				j.Methods[k].Stiffness = Strength
			}
		}},
	} {
		for _, procs := range []int{1, 2} {
			t.Run(fmt.Sprintf("%s/GOMAXPROCS=%d", tc.name, procs), func(t *testing.T) {
				defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
				job := secondOrderJob(4, 6, true)
				tc.set(job)
				got, err := Run(context.Background(), job, Options{})
				if err != nil {
					t.Fatal(err)
				}
				criticalTogether = false
				defer func() { criticalTogether = true }()
				want, err := Run(context.Background(), job, Options{})
				if err != nil {
					t.Fatal(err)
				}
				if len(got.Combinations) < 2 {
					t.Fatal("fewer than two combinations: nothing is found side by side")
				}
				for k := range want.Combinations {
					g, w := got.Combinations[k], want.Combinations[k]
					if math.IsInf(w.CriticalFactor, 1) {
						t.Fatalf("combination %q: αcr = +Inf, nothing to compare", w.Name)
					}
					if !within(g.CriticalFactor, w.CriticalFactor, tol) || !within(g.CriticalNominal, w.CriticalNominal, tol) {
						t.Errorf("combination %q: αcr %.7g and %.7g side by side, %.7g and %.7g alone", w.Name, g.CriticalFactor, g.CriticalNominal, w.CriticalFactor, w.CriticalNominal)
					}
					if k == 0 && (g.CriticalFactor != w.CriticalFactor || g.CriticalNominal != w.CriticalNominal) {
						t.Errorf("the first combination's αcr %v, alone %v", g.CriticalFactor, w.CriticalFactor)
					}
					// The rest to the last bit.
					got.Combinations[k].CriticalFactor, got.Combinations[k].CriticalNominal = w.CriticalFactor, w.CriticalNominal
				}
				sameResults(t, got, want, "side by side")
			})
		}
	}
}

// TestSecondOrderErrorsInOrder checks that a second-order run with
// several combinations, their critical load factors found side by side,
// the first enveloped while the others iterate or not (iterationsBeside),
// returns the error of the first combination in the job's order whose
// factor is not above 1: the cantilever under a dead load of 7 past its
// Euler load π²EI/(4L²) = 6.17 (Timoshenko & Gere; TestBucklingIsAnError),
// the others under 2 to 4.
func TestSecondOrderErrorsInOrder(t *testing.T) {
	combination := func(name string, d float64) combos.Combination {
		return combos.Combination{Name: name, Terms: []combos.Term{{Case: 0, Factor: d}, {Case: 1, Factor: 1}}}
	}
	for _, tc := range []struct {
		name   string
		factor []float64 // on the dead load of 4 of each combination
		want   string
		is     error
	}{
		{"the second buckles", []float64{1, 1.75, 1}, `combination "c2"`, ErrBuckles},
		{"the first and third buckle", []float64{1.75, 1, 2}, `combination "c1"`, ErrBuckles},
		{"the third buckles", []float64{0.5, 1, 1.75}, `combination "c3"`, ErrBuckles},
	} {
		for _, beside := range []bool{true, false} {
			t.Run(fmt.Sprintf("%s/beside %v", tc.name, beside), func(t *testing.T) {
				iterationsBeside = beside
				defer func() { iterationsBeside = true }()
				job := cantileverJob(4, 0.045, Method{SecondOrder: true})
				job.Combinations, job.Methods = nil, nil
				for i, f := range tc.factor {
					job.Combinations = append(job.Combinations, combination(fmt.Sprintf("c%d", i+1), f))
					job.Methods = append(job.Methods, Method{SecondOrder: true})
				}
				_, err := Run(context.Background(), job, Options{})
				if !errors.Is(err, tc.is) || !strings.Contains(err.Error(), tc.want) {
					t.Errorf("got %v, want %v naming %s", err, tc.is, tc.want)
				}
			})
		}
	}
}

// TestSecondOrderIterationsBesideChangeNothing checks that a second-order
// run whose first combinations are enveloped while the later ones iterate
// gives every result, warnings and their order included, to the last bit
// as one that envelopes them once all have iterated (iterationsBeside
// off): on the regular frame with patterned live loads, with the
// sections as given and with a notional load in each direction (two
// units a combination), on one processor and two.
func TestSecondOrderIterationsBesideChangeNothing(t *testing.T) {
	for _, tc := range []struct {
		name string
		set  func(*Job)
	}{
		{"nominal", func(*Job) {}},
		{"notional", func(j *Job) { j.Sway.Notional = NotionalAISC360 }},
	} {
		for _, procs := range []int{1, 2} {
			t.Run(fmt.Sprintf("%s/GOMAXPROCS=%d", tc.name, procs), func(t *testing.T) {
				defer runtime.GOMAXPROCS(runtime.GOMAXPROCS(procs))
				job := secondOrderJob(4, 5, true)
				tc.set(job)
				got, err := Run(context.Background(), job, Options{})
				if err != nil {
					t.Fatal(err)
				}
				iterationsBeside = false
				defer func() { iterationsBeside = true }()
				want, err := Run(context.Background(), job, Options{})
				if err != nil {
					t.Fatal(err)
				}
				sameResults(t, got, want, "beside the iterations")
			})
		}
	}
}

// axialForcesFirst, member by member, gives what axialForces gives case
// by case, to the bit: the solution of a regular frame with patterned
// live loads (its load cases and pieces), every column of it.
func TestAxialForcesFirstIsAxialForces(t *testing.T) {
	res, err := Run(context.Background(), regularJob(4, 3, false), Options{})
	if err != nil {
		t.Fatal(err)
	}
	n := len(res.sol.Model().Cases)
	if n < 8 {
		t.Fatalf("%d columns: the case tests little", n)
	}
	got := axialForcesFirst(res.sol, n)
	for c := range n {
		if want := axialForces(res.sol, c); !slices.Equal(got[c], want) {
			t.Fatalf("column %d: %v, axialForces %v", c, got[c], want)
		}
	}
}
