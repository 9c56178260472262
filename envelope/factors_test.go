package envelope

import (
	"math"
	"testing"

	"govern/combos"
	"govern/frame"
	"govern/patterns"
)

// uniform returns factors s on N, V and M of every case in cases, in
// every one of n members, with nOrig cases.
func uniform(n, nOrig int, s float64, cases ...int) [][][3]float64 {
	out := make([][][3]float64, n)
	for m := range out {
		out[m] = make([][3]float64, nOrig)
		for c := range out[m] {
			out[m][c] = [3]float64{1, 1, 1}
		}
		for _, c := range cases {
			out[m][c] = [3]float64{s, s, s}
		}
	}
	return out
}

// sameEnvelopes reports the first station or reaction where a and b differ.
func sameEnvelopes(t *testing.T, a, b *Envelope) {
	t.Helper()
	for m := range a.Members {
		for i, sa := range a.Members[m].Stations {
			sb := b.Members[m].Stations[i]
			for q, p := range [3][2]Extreme{{sa.N, sb.N}, {sa.V, sb.V}, {sa.M, sb.M}} {
				if !near(p[0].Max, p[1].Max) || !near(p[0].Min, p[1].Min) || p[0].MaxBy != p[1].MaxBy || p[0].MinBy != p[1].MinBy {
					t.Fatalf("member %d station %d effect %d: %+v, want %+v", m, i, q, p[0], p[1])
				}
			}
		}
	}
	for v, ra := range a.Reactions {
		rb := b.Reactions[v]
		for q, p := range [3][2]Extreme{{ra.Fx, rb.Fx}, {ra.Fy, rb.Fy}, {ra.M, rb.M}} {
			if !near(p[0].Max, p[1].Max) || !near(p[0].Min, p[1].Min) {
				t.Fatalf("reaction %d component %d: %+v, want %+v", v, q, p[0], p[1])
			}
		}
	}
}

// scaled returns cs with the factors of the cases in scale multiplied.
func scaled(cs []combos.Combination, s float64, cases ...int) []combos.Combination {
	out := make([]combos.Combination, len(cs))
	for k, cb := range cs {
		out[k] = cb
		out[k].Terms = append([]combos.Term(nil), cb.Terms...)
		for i, t := range out[k].Terms {
			for _, c := range cases {
				if t.Case == c {
					out[k].Terms[i].Factor *= s
				}
			}
		}
	}
	return out
}

// A factor s on a case in every member is, by linearity, the case's loads
// times s: the same envelopes as the combinations with the case's factor
// times s (closed form of a linear frame), patterned or not.
func TestUniformFactorIsScaledLoad(t *testing.T) {
	const s = 0.6
	cs := []combos.Combination{
		{Name: "1.4D", Terms: []combos.Term{{Case: 0, Factor: 1.4}}},
		{Name: "1.2D+1.6L", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}, {Case: 2, Factor: 1.6}}},
	}
	t.Run("not patterned", func(t *testing.T) {
		sol, err := frame.Solve(twoSpans(8, 20, 15))
		if err != nil {
			t.Fatal(err)
		}
		kinds := kindsOf(sol, nil)
		got, err := Compute(sol, cs, Settings{Kinds: kinds, Stations: 9, Factors: &Factors{Of: uniform(2, 3, s, 1, 2)}}, nil)
		if err != nil {
			t.Fatal(err)
		}
		want, err := Compute(sol, scaled(cs, s, 1, 2), Settings{Kinds: kinds, Stations: 9}, nil)
		if err != nil {
			t.Fatal(err)
		}
		sameEnvelopes(t, got, want)
	})
	t.Run("patterned exact", func(t *testing.T) {
		mo := beam(3, 6, 10, 12)
		cs := []combos.Combination{{Name: "1.2D+1.6L", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}}}}
		lay, err := patterns.Expand(mo, []int{1}, 1, patterns.Exact)
		if err != nil {
			t.Fatal(err)
		}
		sol, err := frame.Solve(lay.Model)
		if err != nil {
			t.Fatal(err)
		}
		kinds := kindsOf(sol, lay)
		got, err := Compute(sol, cs, Settings{Kinds: kinds, Stations: 9, Factors: &Factors{Of: uniform(3, 2, s, 1)}}, lay)
		if err != nil {
			t.Fatal(err)
		}
		want, err := Compute(sol, scaled(cs, s, 1), Settings{Kinds: kinds, Stations: 9}, lay)
		if err != nil {
			t.Fatal(err)
		}
		sameEnvelopes(t, got, want)
	})
}

// A reaction is the sum of the scaled end forces of the members at the
// support. Two equal spans with q on span 1 only: R_A = 7qL/16, the end
// shear of AB at B 9qL/16 and of BC qL/16, R_C = −qL/16 (three-moment
// equation, closed form). With AB's effects of L1 halved: R_A = 3.5qL/16,
// R_B = 4.5qL/16 + qL/16, R_C unchanged.
func TestReactionFromScaledMembers(t *testing.T) {
	const l, q = 8.0, 10.0
	sol, err := frame.Solve(twoSpans(l, 0, q))
	if err != nil {
		t.Fatal(err)
	}
	of := uniform(2, 3, 1)
	of[0][1] = [3]float64{0.5, 0.5, 0.5}
	cs := []combos.Combination{{Name: "L1", Terms: []combos.Term{{Case: 1, Factor: 1}}}}
	env, err := Compute(sol, cs, Settings{Kinds: kindsOf(sol, nil), Stations: 3, AsWritten: true, Factors: &Factors{Of: of}}, nil)
	if err != nil {
		t.Fatal(err)
	}
	for i, want := range []float64{3.5 * q * l / 16, 5.5 * q * l / 16, -q * l / 16} {
		if got := env.Reactions[i].Fy.Max; !near(got, want) {
			t.Errorf("reaction %d: Fy = %g, want %g", i, got, want)
		}
	}
	// AB's moment at B is halved: −qL²/16 × 0.5 (three-moment equation).
	if got, want := env.Members[0].Stations[2].M.Min, -0.5*q*l*l/16; !near(got, want) {
		t.Errorf("M at B = %g, want %g", got, want)
	}
}

// EN 1991-1-1 6.3.1.2(11): αn only where the imposed load leads. With
// Of 0.5 and Accompanying 1 for L1 and L2, the combination led by L1
// takes 0.5 × its L1 and 1 × its L2, and the other the reverse: the
// envelopes of the combinations with those factors.
func TestAccompanyingFactors(t *testing.T) {
	sol, err := frame.Solve(twoSpans(8, 20, 15))
	if err != nil {
		t.Fatal(err)
	}
	kinds := kindsOf(sol, nil)
	cs := []combos.Combination{
		{Name: "L1 leads", Terms: []combos.Term{{Case: 0, Factor: 1.35}, {Case: 1, Factor: 1.5}, {Case: 2, Factor: 1.05}}, Lead: []int{1}},
		{Name: "L2 leads", Terms: []combos.Term{{Case: 0, Factor: 1.35}, {Case: 2, Factor: 1.5}, {Case: 1, Factor: 1.05}}, Lead: []int{2}},
	}
	f := &Factors{Of: uniform(2, 3, 0.5, 1, 2), Accompanying: uniform(2, 3, 1, 1, 2)}
	got, err := Compute(sol, cs, Settings{Kinds: kinds, Stations: 9, AsWritten: true, Factors: f}, nil)
	if err != nil {
		t.Fatal(err)
	}
	plain := []combos.Combination{
		{Name: "L1 leads", Terms: []combos.Term{{Case: 0, Factor: 1.35}, {Case: 1, Factor: 0.75}, {Case: 2, Factor: 1.05}}},
		{Name: "L2 leads", Terms: []combos.Term{{Case: 0, Factor: 1.35}, {Case: 2, Factor: 0.75}, {Case: 1, Factor: 1.05}}},
	}
	want, err := Compute(sol, plain, Settings{Kinds: kinds, Stations: 9, AsWritten: true}, nil)
	if err != nil {
		t.Fatal(err)
	}
	sameEnvelopes(t, got, want)
}

func TestLeads(t *testing.T) {
	kinds := []combos.Kind{combos.Dead, combos.Live, combos.Wind}
	for _, c := range []struct {
		name string
		cb   combos.Combination
		c    int
		want bool
	}{
		{"named lead", combos.Combination{Terms: []combos.Term{{Case: 1, Factor: 1.05}}, Lead: []int{1}}, 1, true},
		{"named other", combos.Combination{Terms: []combos.Term{{Case: 1, Factor: 1.5}}, Lead: []int{2}}, 1, false},
		{"largest variable factor", combos.Combination{Terms: []combos.Term{{Case: 0, Factor: 1.35}, {Case: 1, Factor: 1.5}, {Case: 2, Factor: 0.9}}}, 1, true},
		{"accompanying", combos.Combination{Terms: []combos.Term{{Case: 0, Factor: 1.35}, {Case: 1, Factor: 1.05}, {Case: 2, Factor: 1.5}}}, 1, false},
		{"absent", combos.Combination{Terms: []combos.Term{{Case: 0, Factor: 1.35}}}, 1, false},
	} {
		if got := Leads(&c.cb, c.c, kinds); got != c.want {
			t.Errorf("%s: Leads = %v, want %v", c.name, got, c.want)
		}
	}
}

func TestFactorsChecked(t *testing.T) {
	sol, err := frame.Solve(twoSpans(8, 20, 15))
	if err != nil {
		t.Fatal(err)
	}
	cs := []combos.Combination{{Name: "D", Terms: []combos.Term{{Case: 0, Factor: 1}}}}
	for name, f := range map[string]*Factors{
		"too many members": {Of: uniform(3, 3, 1)},
		"too few cases":    {Of: uniform(2, 2, 1)},
		"negative":         {Of: uniform(2, 3, -1, 1)},
	} {
		if _, err := Compute(sol, cs, Settings{Kinds: kindsOf(sol, nil), Stations: 3, Factors: f}, nil); err == nil {
			t.Errorf("%s: no error", name)
		}
	}
}

// The combinations are split into parts only by the cases whose factors
// where they accompany differ from where they lead: equal ones give one
// table, and one differing case two parts (it leads or not).
func TestFactorsPartsOnlyWhereTheyDiffer(t *testing.T) {
	sol, err := frame.Solve(twoSpans(8, 20, 15))
	if err != nil {
		t.Fatal(err)
	}
	cs := []combos.Combination{
		{Name: "L1 leads", Terms: []combos.Term{{Case: 1, Factor: 1.5}, {Case: 2, Factor: 1.05}}, Lead: []int{1}},
		{Name: "L2 leads", Terms: []combos.Term{{Case: 2, Factor: 1.5}, {Case: 1, Factor: 1.05}}, Lead: []int{2}},
		{Name: "D", Terms: []combos.Term{{Case: 0, Factor: 1.35}}, Lead: []int{0}},
	}
	set := Settings{Kinds: kindsOf(sol, nil), Stations: 3}
	for _, c := range []struct {
		name  string
		acc   [][][3]float64
		parts int
	}{
		{"same", uniform(2, 3, 0.5, 1), 0},
		{"L1 differs", uniform(2, 3, 1, 2), 2},
	} {
		e := newEvaluator(sol.Model(), cs, []int{0, 1, 2}, 3, set, nil)
		e.setFactors(&Factors{Of: uniform(2, 3, 0.5, 1), Accompanying: c.acc}, cs)
		if len(e.parts) != c.parts {
			t.Errorf("%s: %d parts, want %d", c.name, len(e.parts), c.parts)
		}
	}
}

// With member factors, the state of each extreme (EndMoments) is formed
// with the same factors, by the part of the combinations its combination
// is in: every extreme of M at a member's end is given again, and its own
// end's moment is the extreme itself; StationsAt gives Compute's
// stations. Factors differ by member and by which case leads.
func TestEndMomentsAndStationsWithFactors(t *testing.T) {
	mo := beam(3, 6, 1, 1.5)
	mo.Cases = append(mo.Cases, frame.Case{Name: "L2", MemberLoads: []frame.MemberLoad{{Member: 1, To: 6, W: 2, WEnd: 2}}})
	cs := []combos.Combination{
		{Name: "L leads", Terms: []combos.Term{{Case: 0, Factor: 1.35}, {Case: 1, Factor: 1.5}, {Case: 2, Factor: 1.05}}, Lead: []int{1}},
		{Name: "L2 leads", Terms: []combos.Term{{Case: 0, Factor: 1.35}, {Case: 2, Factor: 1.5}, {Case: 1, Factor: 1.05}}, Lead: []int{2}},
	}
	lay, err := patterns.Expand(mo, []int{1}, 1, patterns.Exact)
	if err != nil {
		t.Fatal(err)
	}
	sol, err := frame.Solve(lay.Model)
	if err != nil {
		t.Fatal(err)
	}
	of := uniform(3, 3, 1)
	acc := uniform(3, 3, 1)
	for m := range of {
		of[m][1] = [3]float64{0.9 - 0.1*float64(m), 0.8, 0.7 - 0.1*float64(m)}
		acc[m][1] = [3]float64{1, 0.8, 0.9}
	}
	set := Settings{Kinds: kindsOf(sol, lay), Stations: 5, Factors: &Factors{Of: of, Accompanying: acc}}
	env, err := Compute(sol, cs, set, lay)
	if err != nil {
		t.Fatal(err)
	}
	for m, em := range env.Members {
		last := len(em.Stations) - 1
		for _, end := range []int{0, last} {
			st := em.Stations[end]
			for _, side := range []struct {
				hi bool
				v  float64
				by int
			}{{true, st.M.Max, st.M.MaxBy}, {false, st.M.Min, st.M.MinBy}} {
				ends, ok := EndMoments(sol, cs, set, lay, m, st.X, side.by, 2, side.hi, side.v)
				own := ends[0]
				if end == last {
					own = ends[1]
				}
				if !ok || math.Abs(own-side.v) > 1e-9*math.Max(1, math.Abs(side.v)) {
					t.Errorf("member %d at x = %g: ends %v (ok %v), want the extreme %g at its own end", m, st.X, ends, ok, side.v)
				}
			}
		}
		xs := []float64{em.Stations[1].X, em.Stations[3].X}
		got, err := StationsAt(sol, cs, set, lay, m, xs)
		if err != nil {
			t.Fatal(err)
		}
		for i, st := range got {
			want := em.Stations[1+2*i]
			if st.M.Max != want.M.Max || st.M.Min != want.M.Min || st.N.Max != want.N.Max || st.V.Min != want.V.Min {
				t.Errorf("member %d at x = %g: StationsAt %+v, Compute %+v", m, st.X, st.M, want.M)
			}
		}
	}
}
