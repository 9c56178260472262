package analysis

import (
	"context"
	"math"
	"slices"
	"testing"

	"govern/combos"
	"govern/envelope"
	"govern/frame"
	"govern/patterns"
)

// Member factors are applied: in the two-span beam of ExampleRun, the
// live case's effects halved in every member give the envelopes of the
// live load halved (linearity, closed form), every pattern piece included;
// the statics check and the deflections stay those of the loads as given.
func TestMemberFactorsApplied(t *testing.T) {
	job := twoSpans()
	for m := range job.Model.Members {
		job.MemberFactors = append(job.MemberFactors, MemberFactor{Member: m, Case: 1, N: 0.5, V: 0.5, M: 0.5})
	}
	got, err := Run(context.Background(), job, Options{})
	if err != nil {
		t.Fatal(err)
	}
	half := twoSpans()
	half.Combinations[1].Terms[1].Factor = 0.8 // 1.6 × 0.5
	want, err := Run(context.Background(), half, Options{})
	if err != nil {
		t.Fatal(err)
	}
	for m := range got.Envelope.Members {
		for i, s := range got.Envelope.Members[m].Stations {
			w := want.Envelope.Members[m].Stations[i]
			if math.Abs(s.M.Max-w.M.Max) > closeTol*math.Abs(w.M.Max)+closeTol || math.Abs(s.M.Min-w.M.Min) > closeTol*math.Abs(w.M.Min)+closeTol ||
				math.Abs(s.V.Max-w.V.Max) > closeTol*math.Abs(w.V.Max)+closeTol {
				t.Fatalf("member %d station %d: M %g..%g V max %g, want M %g..%g V max %g", m, i, s.M.Min, s.M.Max, s.V.Max, w.M.Min, w.M.Max, w.V.Max)
			}
		}
	}
	for v, r := range got.Envelope.Reactions {
		if w := want.Envelope.Reactions[v]; math.Abs(r.Fy.Max-w.Fy.Max) > closeTol*math.Abs(w.Fy.Max) {
			t.Errorf("reaction %d: Fy max %g, want %g", v, r.Fy.Max, w.Fy.Max)
		}
	}
	// The statics check is of the loads as given: the live case's
	// reactions still carry its whole load, 5 kN/m × 12 m.
	for _, b := range got.Statics {
		if !b.OK() {
			t.Errorf("case %s out of balance", b.Case)
		}
	}
	t.Run("case reactions unreduced and reduced", func(t *testing.T) {
		// Two equal spans with w on both: end reactions 3wL/8, centre
		// 10wL/8 (three-moment equation, common practice); every member
		// factor 0.5 halves the reduced ones.
		const w, l = 5.0, 6.0
		rs := got.ReducedReactions(1)
		if len(rs) != 3 {
			t.Fatalf("%d reactions", len(rs))
		}
		for i, want := range []float64{3 * w * l / 8, 10 * w * l / 8, 3 * w * l / 8} {
			if r := rs[i]; math.Abs(r.Unreduced[1]-want) > 1e-9 || math.Abs(r.Reduced[1]-want/2) > 1e-9 {
				t.Errorf("node %d: Fy %g reduced %g, want %g and %g", r.Node, r.Unreduced[1], r.Reduced[1], want, want/2)
			}
		}
		// The load case results carry the same beside the unreduced
		// ones, node for node; the dead case none.
		cr := got.Cases()
		if cr[0].Reduced != nil || len(cr[1].Reduced) != 3 {
			t.Fatalf("reduced reactions of D %v, of L %v", cr[0].Reduced, cr[1].Reduced)
		}
		for i, r := range cr[1].Reduced {
			if r.Node != rs[i].Node || r.Fy != rs[i].Reduced[1] || cr[1].Reactions[i].Fy != rs[i].Unreduced[1] || r.Components != cr[1].Reactions[i].Components {
				t.Errorf("node %d: %+v beside %+v, want %+v", r.Node, r, cr[1].Reactions[i], rs[i])
			}
		}
		rd := got.ReducedReactions(0) // dead load: no factor
		if rd[1].Reduced != rd[1].Unreduced {
			t.Errorf("dead case reduced: %v, %v", rd[1].Reduced, rd[1].Unreduced)
		}
	})
}

// A column's factor on N enters the vertical reaction below it, on V the
// horizontal one and on M the moment: a fixed-base cantilever column
// under a lateral point load H at its top and a vertical one P gives
// Fx = −H, Fy = P, M = H·h counter-clockwise (statics); with factors 0.4, 0.6, 0.8 on N,
// V, M those are scaled each by its own.
func TestReducedReactionComponents(t *testing.T) {
	const h, H, P = 4.0, 10.0, 50.0
	job := &Job{
		Units: Units{Force: "kN", Length: "m"},
		Model: &frame.Model{
			Sections: []frame.Section{{Name: "C", E: 30e6, A: 0.16, I: 2e-3}},
			Nodes:    []frame.Node{{Name: "base", Support: frame.Fixed}, {Name: "top", Y: h}},
			Members:  []frame.Member{{Name: "col", Start: 0, End: 1}},
			Cases:    []frame.Case{{Name: "L", NodeLoads: []frame.NodeLoad{{Node: 1, Fx: H, Fy: -P}}}},
		},
		Cases:         []combos.Case{{Name: "L", Kind: combos.Live}},
		Combinations:  []combos.Combination{{Name: "L", Terms: []combos.Term{{Case: 0, Factor: 1}}}},
		Settings:      Settings{Stations: 3},
		MemberFactors: []MemberFactor{{Member: 0, Case: 0, N: 0.4, V: 0.6, M: 0.8}},
	}
	res, err := Run(context.Background(), job, Options{})
	if err != nil {
		t.Fatal(err)
	}
	r := res.ReducedReactions(0)[0]
	want := [3]float64{-0.6 * H, 0.4 * P, 0.8 * H * h}
	for d := range 3 {
		if math.Abs(r.Reduced[d]-want[d]) > 1e-9 {
			t.Errorf("component %d: %g, want %g (unreduced %v)", d, r.Reduced[d], want[d], r.Unreduced)
		}
	}
	// The envelope's reaction is the same (a variable case acts only
	// where adverse: Fx is its least).
	env := res.Envelope.Reactions[0]
	if math.Abs(env.Fy.Max-want[1]) > 1e-9 || math.Abs(env.Fx.Min-want[0]) > 1e-9 || math.Abs(env.M.Max-want[2]) > 1e-9 {
		t.Errorf("envelope reaction Fx %g Fy %g M %g, want %v", env.Fx.Min, env.Fy.Max, env.M.Max, want)
	}
}

// secondOrderAxial returns the axial forces of job's combination k, every
// case at its factor and every piece loaded, iterated in second order
// until none changes by more than 1e-12 of the largest: the geometric
// stiffness of the unreduced loads, found here apart from Run.
func secondOrderAxial(t *testing.T, job *Job, k int) []float64 {
	t.Helper()
	mo := job.Model
	var c frame.Case
	for _, tm := range job.Combinations[k].Terms {
		for _, ld := range mo.Cases[tm.Case].MemberLoads {
			ld.W, ld.WEnd, ld.P = tm.Factor*ld.W, tm.Factor*ld.WEnd, tm.Factor*ld.P
			c.MemberLoads = append(c.MemberLoads, ld)
		}
		for _, nl := range mo.Cases[tm.Case].NodeLoads {
			nl.Fx, nl.Fy, nl.M = tm.Factor*nl.Fx, tm.Factor*nl.Fy, tm.Factor*nl.M
			c.NodeLoads = append(c.NodeLoads, nl)
		}
	}
	one := &frame.Model{Nodes: mo.Nodes, Sections: mo.Sections, Members: mo.Members, Cases: []frame.Case{c}}
	var n []float64
	for it := 0; it < 200; it++ {
		sol, err := frame.SolveWith(one, frame.Options{Axial: n})
		if err != nil {
			t.Fatal(err)
		}
		next := axialForces(sol, 0)
		big, change := 0.0, 0.0
		for m := range next {
			big = max(big, math.Abs(next[m]))
			if n != nil {
				change = max(change, math.Abs(next[m]-n[m]))
			}
		}
		done := n != nil && change <= 1e-12*big
		n = next
		if done {
			return n
		}
	}
	t.Fatal("the second-order axial forces did not converge")
	return nil
}

// Live load reduction in a second-order combination: in
// the three-storey frame of linearFrame under 1.2D + 1.6L + 0.8W in second
// order, every case acting as written, factors on L in the interior
// ground-floor column (0.4 on N, 0.6 on V and M) scale L's part of that
// column's N, V and M at every station, second-order station moment
// included, and nothing else: at each station the envelope is 1.2 D +
// 1.6 f L + 0.8 W of the cases solved on the geometric stiffness of the
// unreduced combination (found apart, secondOrderAxial), by linearity
// once that stiffness is fixed; the reduced column's N from L is exactly
// f × the unreduced one of the run without factors. The critical load
// factor, the iterations, the statics and the other members are those of
// the run without factors: the axial forces of the geometric stiffness
// are unreduced.
func TestMemberFactorsSecondOrder(t *testing.T) {
	const col = 1 // B0-B1
	fN, fVM := 0.4, 0.6
	mk := func(reduced bool) *Job {
		job := linearFrame(1.2e-5)
		job.Patterned, job.Settings.AsWritten = nil, true
		if reduced {
			job.MemberFactors = []MemberFactor{{Member: col, Case: 1, N: fN, V: fVM, M: fVM}}
		}
		return job
	}
	red, err := Run(context.Background(), mk(true), Options{})
	if err != nil {
		t.Fatal(err)
	}
	whole, err := Run(context.Background(), mk(false), Options{})
	if err != nil {
		t.Fatal(err)
	}
	job := mk(true)
	if job.Model.Members[col].Name != "B0-B1" {
		t.Fatalf("member %d is %s", col, job.Model.Members[col].Name)
	}
	axial := secondOrderAxial(t, job, 0)
	sol, err := frame.SolveWith(job.Model, frame.Options{Axial: axial})
	if err != nil {
		t.Fatal(err)
	}
	for m := range job.Model.Members {
		st := red.Envelope.Members[m].Stations
		xs := make([]float64, len(st))
		for i := range st {
			xs[i] = st[i].X
		}
		f := make([]frame.Forces, 3*len(xs))
		sol.StationsTo(f, m, xs)
		s := [3]float64{1, 1, 1}
		if m == col {
			s = [3]float64{fN, fVM, fVM}
		}
		scale := 1.0 // the largest of the member's values, for the tolerance
		for _, g := range f {
			scale = max(scale, math.Abs(g.N), math.Abs(g.V), math.Abs(g.M))
		}
		for i := range st {
			d, l, w := f[i], f[len(xs)+i], f[2*len(xs)+i]
			want := [3]float64{
				1.2*d.N + 1.6*s[0]*l.N + 0.8*w.N,
				1.2*d.V + 1.6*s[1]*l.V + 0.8*w.V,
				1.2*d.M + 1.6*s[2]*l.M + 0.8*w.M,
			}
			for j, ex := range [3]envelope.Extreme{st[i].N, st[i].V, st[i].M} {
				if math.Abs(ex.Max-want[j]) > 1e-6*scale || math.Abs(ex.Min-want[j]) > 1e-6*scale {
					t.Errorf("%s x=%g effect %d: %g..%g, want %g", job.Model.Members[m].Name, st[i].X, j, ex.Min, ex.Max, want[j])
				}
			}
			// Against the run without factors: L's part of N is f × its
			// unreduced part, of V and M the same with their factor.
			u := whole.Envelope.Members[m].Stations[i]
			for j, p := range [3][2]float64{{st[i].N.Max, u.N.Max}, {st[i].V.Max, u.V.Max}, {st[i].M.Max, u.M.Max}} {
				lj := [3]float64{l.N, l.V, l.M}[j]
				if got, want := p[0]-p[1], 1.6*(s[j]-1)*lj; math.Abs(got-want) > 1e-9*scale {
					t.Errorf("%s x=%g effect %d: reduced − unreduced %g, want 1.6 × (%g − 1) × %g", job.Model.Members[m].Name, st[i].X, j, got, s[j], lj)
				}
			}
		}
	}
	// The envelope at any point, on request after the run (the design
	// tables' faces and points), takes the same factors on the
	// combination's own solution.
	{
		st := red.Envelope.Members[col].Stations
		xs := make([]float64, len(st))
		for i := range st {
			xs[i] = st[i].X
		}
		at, err := red.StationsAt(col, xs)
		if err != nil {
			t.Fatal(err)
		}
		for i := range st {
			if math.Abs(at[i].N.Max-st[i].N.Max) > 1e-9*math.Abs(st[i].N.Max) || math.Abs(at[i].M.Max-st[i].M.Max) > 1e-9*math.Abs(st[i].M.Max)+1e-9 {
				t.Errorf("StationsAt x=%g: N %g M %g, the envelope N %g M %g", xs[i], at[i].N.Max, at[i].M.Max, st[i].N.Max, st[i].M.Max)
			}
		}
	}
	rc, wc := red.Combinations[0], whole.Combinations[0]
	if rc.CriticalFactor != wc.CriticalFactor || rc.Iterations != wc.Iterations || rc.CriticalFactor > 10 {
		t.Errorf("αcr %g in %d iterations, without factors %g in %d: the geometric stiffness must be the unreduced one (and αcr < 10 for this test to mean anything)",
			rc.CriticalFactor, rc.Iterations, wc.CriticalFactor, wc.Iterations)
	}
	// The governing column moments beside the first-order ones of the same
	// state (ACI 318-19 6.2.5.3): the first-order moment takes the same
	// factors, so that the ratio compares like with like.
	first, err := frame.Solve(job.Model)
	if err != nil {
		t.Fatal(err)
	}
	if len(red.Amplifications) == 0 {
		t.Fatal("no amplifications")
	}
	for _, a := range red.Amplifications {
		f := make([]frame.Forces, 3)
		first.StationsTo(f, a.Member, []float64{a.X})
		s := 1.0
		if a.Member == col {
			s = fVM
		}
		want := math.Abs(1.2*f[0].M + 1.6*s*f[1].M + 0.8*f[2].M)
		if math.Abs(a.First-want) > 1e-9*want {
			t.Errorf("%s x=%g: first-order moment %g, want %g", job.Model.Members[a.Member].Name, a.X, a.First, want)
		}
	}
	for c, b := range red.Statics {
		if b.Balance != whole.Statics[c].Balance {
			t.Errorf("case %s: statics %+v, without factors %+v", b.Case, b.Balance, whole.Statics[c].Balance)
		}
	}
}

// A uniform factor f on every member of a live case in a second-order
// combination gives the envelope of that case's loads scaled by f, the
// geometric stiffness kept from the unscaled loads:
// the frame of linearFrame, L placed beam by beam ("exact"), built here
// straight from the libraries: the axial forces of the unreduced
// combination (secondOrderAxial), the model with L's loads × f expanded
// into its pieces (patterns.Expand), solved on that geometric stiffness
// and enveloped (envelope.Compute). Linearity once the geometric
// stiffness is fixed; every station's N, V and M, extremes and
// combination, and every reaction.
func TestMemberFactorsSecondOrderUniform(t *testing.T) {
	const f = 0.55
	job := linearFrame(1.2e-5)
	for m := range job.Model.Members {
		job.MemberFactors = append(job.MemberFactors, MemberFactor{Member: m, Case: 1, N: f, V: f, M: f})
	}
	got, err := Run(context.Background(), job, Options{})
	if err != nil {
		t.Fatal(err)
	}
	axial := secondOrderAxial(t, job, 0)
	mo := *job.Model
	mo.Cases = slices.Clone(mo.Cases)
	l := &mo.Cases[1]
	l.MemberLoads = slices.Clone(l.MemberLoads)
	for i := range l.MemberLoads {
		l.MemberLoads[i].W *= f
		l.MemberLoads[i].WEnd *= f
	}
	lay, err := patterns.Expand(&mo, job.Patterned, job.Segments, job.Patterns)
	if err != nil {
		t.Fatal(err)
	}
	sol, err := frame.SolveWith(lay.Model, frame.Options{Axial: axial})
	if err != nil {
		t.Fatal(err)
	}
	want, err := envelope.Compute(sol, job.Combinations, envelope.Settings{Stations: job.Settings.Stations,
		Kinds: []combos.Kind{combos.Dead, combos.Live, combos.Wind}}, lay)
	if err != nil {
		t.Fatal(err)
	}
	near := func(a, b, scale float64) bool { return math.Abs(a-b) <= 1e-6*scale }
	for m := range got.Envelope.Members {
		gs, ws := got.Envelope.Members[m].Stations, want.Members[m].Stations
		scale := 1.0
		for _, s := range ws {
			scale = max(scale, math.Abs(s.N.Max), math.Abs(s.N.Min), math.Abs(s.V.Max), math.Abs(s.V.Min), math.Abs(s.M.Max), math.Abs(s.M.Min))
		}
		for i := range gs {
			for j, p := range [3][2]envelope.Extreme{{gs[i].N, ws[i].N}, {gs[i].V, ws[i].V}, {gs[i].M, ws[i].M}} {
				if !near(p[0].Max, p[1].Max, scale) || !near(p[0].Min, p[1].Min, scale) || p[0].MaxBy != p[1].MaxBy || p[0].MinBy != p[1].MinBy {
					t.Errorf("%s x=%g effect %d: %g..%g, want %g..%g", job.Model.Members[m].Name, gs[i].X, j, p[0].Min, p[0].Max, p[1].Min, p[1].Max)
				}
			}
		}
	}
	if len(got.Envelope.Reactions) != len(want.Reactions) {
		t.Fatalf("%d reactions, want %d", len(got.Envelope.Reactions), len(want.Reactions))
	}
	for i, r := range got.Envelope.Reactions {
		w := want.Reactions[i]
		for j, p := range [3][2]envelope.Extreme{{r.Fx, w.Fx}, {r.Fy, w.Fy}, {r.M, w.M}} {
			scale := max(1, math.Abs(p[1].Max), math.Abs(p[1].Min))
			if !near(p[0].Max, p[1].Max, scale) || !near(p[0].Min, p[1].Min, scale) {
				t.Errorf("reaction at %s, component %d: %g..%g, want %g..%g", job.Model.Nodes[r.Node].Name, j, p[0].Min, p[0].Max, p[1].Min, p[1].Max)
			}
		}
	}
}

// Notional loads come from the gravity loads as applied, unreduced (AISC
// 360-16 C2.2b: Yi is the gravity load applied at level i; live load
// reduction is a design rule on member effects, not a load): the portal
// of portalJob with a live load of 10 kN/m on its beam, 1.2D + 1.6L in
// second order, L's effects halved in every member: Yi = 1.2 × (20 × 6 +
// 100) + 1.6 × 10 × 6 = 360 kN, Ni = 0.002 × 360 = 0.72 kN in each
// direction, as without the factors; the feet's shears from them still
// sum to the notional base shear, every case acting as written (the
// notional case is not scaled; the gravity thrusts, scaled alike in both
// columns, cancel).
func TestMemberFactorsNotional(t *testing.T) {
	const yi = 1.2*(20*6+100) + 1.6*10*6
	mk := func(reduced bool) *Job {
		job := portalJob(Method{SecondOrder: true}, NotionalAISC360)
		job.Model.Cases = append(job.Model.Cases, frame.Case{Name: "L", MemberLoads: []frame.MemberLoad{{Member: 1, To: 6, W: 10, WEnd: 10}}})
		job.Cases = append(job.Cases, combos.Case{Name: "L", Kind: combos.Live})
		job.Combinations = []combos.Combination{{Name: "1.2D+1.6L", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}}}}
		job.Settings.AsWritten = true
		if reduced {
			for m := range job.Model.Members {
				job.MemberFactors = append(job.MemberFactors, MemberFactor{Member: m, Case: 1, N: 0.5, V: 0.5, M: 0.5})
			}
		}
		return job
	}
	var runs [2]*Result
	for i, reduced := range []bool{false, true} {
		res, err := Run(context.Background(), mk(reduced), Options{})
		if err != nil {
			t.Fatal(err)
		}
		runs[i] = res
		ns := res.Combinations[0].Notional
		if len(ns) != 2 {
			t.Fatalf("reduced %v: notional loads %+v, want one per direction", reduced, ns)
		}
		for _, n := range ns {
			if len(n.Levels) != 1 || !within(n.Levels[0].Gravity, yi, 1e-12) || !within(math.Abs(n.Total), 0.002*yi, 1e-12) {
				t.Errorf("reduced %v: notional %+v, want Yi = %g and Ni = %g", reduced, n, yi, 0.002*yi)
			}
		}
		var hi, lo float64
		for _, rc := range res.Envelope.Reactions {
			hi += rc.Fx.Max
			lo += rc.Fx.Min
		}
		if !within(hi, 0.002*yi, 1e-6) || !within(lo, -0.002*yi, 1e-6) {
			t.Errorf("reduced %v: base shears sum to %.6g and %.6g, want ±%.6g", reduced, hi, lo, 0.002*yi)
		}
	}
	// The reduction did act: the beam's largest sagging moment is less.
	mid := func(r *Result) float64 { st := r.Envelope.Members[1].Stations; return st[len(st)/2].M.Max }
	if !(mid(runs[1]) < mid(runs[0])) {
		t.Errorf("beam's midspan moment %g reduced, %g unreduced", mid(runs[1]), mid(runs[0]))
	}
}

// EN 1991-1-1 6.3.1.2(11): αn applies only where the imposed load leads,
// in second order too: the frame of TestMemberFactorsSecondOrder with αn =
// 0.9 (n = 3, ψ0 = 0.7) on L in the ground-floor interior column and 1.0
// where L accompanies, and two second-order combinations of the same
// terms, one led by L and one by W: the first gives L's part of the
// column's N × 0.9, the second the unreduced N (the run without factors),
// each on the geometric stiffness of its unreduced loads.
func TestMemberFactorsSecondOrderLead(t *testing.T) {
	const col, an = 1, 0.9
	mk := func(reduced bool) *Job {
		job := linearFrame(1.2e-5)
		job.Patterned, job.Settings.AsWritten = nil, true
		led := job.Combinations[0]
		led.Name, led.Lead = "L leads", []int{1}
		acc := job.Combinations[0]
		acc.Name, acc.Lead = "W leads", []int{2}
		acc.Terms = slices.Clone(acc.Terms)
		job.Combinations = []combos.Combination{led, acc}
		job.Methods = []Method{{SecondOrder: true}, {SecondOrder: true}}
		if reduced {
			job.MemberFactors = []MemberFactor{{Member: col, Case: 1, N: an, V: 1, M: 1, Accompanying: [3]float64{1, 1, 1}, HasAccompanying: true}}
		}
		return job
	}
	red, err := Run(context.Background(), mk(true), Options{})
	if err != nil {
		t.Fatal(err)
	}
	whole, err := Run(context.Background(), mk(false), Options{})
	if err != nil {
		t.Fatal(err)
	}
	job := mk(true)
	axial := secondOrderAxial(t, job, 0) // both combinations have the same loads
	sol, err := frame.SolveWith(job.Model, frame.Options{Axial: axial})
	if err != nil {
		t.Fatal(err)
	}
	st := red.Envelope.Members[col].Stations
	for i := range st {
		f := make([]frame.Forces, 3)
		sol.StationsTo(f, col, []float64{st[i].X})
		nl := 1.6 * f[1].N
		led := 1.2*f[0].N + an*nl + 0.8*f[2].N
		acc := whole.Envelope.Members[col].Stations[i].N.Min
		// N is compression: the largest (least compression) is the led
		// combination's, the smallest the accompanied one's.
		if math.Abs(st[i].N.Max-led) > 1e-6*math.Abs(led) || st[i].N.MaxBy != 0 {
			t.Errorf("x=%g: largest N %g by %d, want %g by L leads (αn)", st[i].X, st[i].N.Max, st[i].N.MaxBy, led)
		}
		if st[i].N.Min != acc || st[i].N.MinBy != 1 {
			t.Errorf("x=%g: smallest N %g by %d, want the unreduced %g by W leads", st[i].X, st[i].N.Min, st[i].N.MinBy, acc)
		}
	}
}
