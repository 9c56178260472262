package envelope

import (
	"math"
	"slices"
	"testing"

	"govern/combos"
	"govern/frame"
	"govern/patterns"
)

func TestSplitStrengthAndService(t *testing.T) {
	s, v := combos.Combination{Name: "s"}, combos.Combination{Name: "v", Service: true}
	for _, tc := range []struct {
		name              string
		cs                []combos.Combination
		strength, service []int
	}{
		{"strength only", []combos.Combination{s, s}, []int{0, 1}, nil},
		{"both", []combos.Combination{v, s, v, s}, []int{1, 3}, []int{0, 2}},
		{"service only: forces over them too", []combos.Combination{v, v}, []int{0, 1}, []int{0, 1}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			st, sv := split(tc.cs)
			if !slices.Equal(st, tc.strength) || !slices.Equal(sv, tc.service) {
				t.Errorf("split = %v, %v; want %v, %v", st, sv, tc.strength, tc.service)
			}
		})
	}
}

// A simple span under dead load g and live load q, with a strength and a
// service combination. Midspan deflection 5wL⁴/384EI (AISC Steel
// Construction Manual, Table 3-23, case 1, recalled from memory) and, for
// fixed ends, wL⁴/384EI (case 15). Deflection is along local y: downward
// is negative.
func TestDeflectionEnvelopeOverServiceCombinations(t *testing.T) {
	const l, g, q = 7.2, 18.0, 12.0
	ei := 30e6 * 6e-3
	for _, tc := range []struct {
		name   string
		s      frame.Support
		coeff  float64 // midspan deflection / (wL⁴/EI)
		moment float64 // midspan moment / (wL²)
	}{
		{"simple span: 5wL^4/384EI", frame.Pinned, 5.0 / 384, 1.0 / 8},
		{"fixed ends: wL^4/384EI", frame.Fixed, 1.0 / 384, 1.0 / 24},
	} {
		t.Run(tc.name, func(t *testing.T) {
			sb := tc.s
			if sb == frame.Pinned {
				sb = frame.Roller
			}
			udl := func(w float64) []frame.MemberLoad { return []frame.MemberLoad{{Member: 0, To: l, W: w, WEnd: w}} }
			mo := &frame.Model{
				Sections: []frame.Section{{Name: "B", E: 30e6, A: 0.2, I: 6e-3}},
				Nodes:    []frame.Node{{Name: "A", Support: tc.s}, {Name: "B", X: l, Support: sb}},
				Members:  []frame.Member{{Name: "AB", Start: 0, End: 1}},
				Cases: []frame.Case{
					{Name: "D", MemberLoads: udl(g)},
					{Name: "L", MemberLoads: udl(q)},
				},
			}
			sol, err := frame.Solve(mo)
			if err != nil {
				t.Fatal(err)
			}
			cs := []combos.Combination{
				{Name: "D+L", Service: true, Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}}},
				{Name: "1.2D+1.6L", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}}},
			}
			env, err := Compute(sol, cs, Settings{Kinds: kindsOf(sol, nil), Stations: 11}, nil)
			if err != nil {
				t.Fatal(err)
			}
			if !slices.Equal(env.Strength, []int{1}) || !slices.Equal(env.Service, []int{0}) {
				t.Fatalf("strength %v, service %v", env.Strength, env.Service)
			}
			mid := env.Members[0].Stations[5]
			d := env.Members[0].Deflection[5]
			// Forces: the strength combination only, though the service
			// one is listed first.
			if want := (1.2*g + 1.6*q) * l * l * tc.moment; !near(mid.M.Max, want) || mid.M.MaxBy != 1 {
				t.Errorf("M max = %g by %d, want %g by 1", mid.M.Max, mid.M.MaxBy, want)
			}
			// Deflections: the service combination; the live load acts where
			// adverse, so it is on for the downward extreme and off for the
			// upward one.
			l4 := l * l * l * l
			if want := -(g + q) * l4 * tc.coeff / ei; !near(d.Min, want) || d.MinBy != 0 {
				t.Errorf("deflection min = %g by %d, want %g by 0", d.Min, d.MinBy, want)
			}
			if want := -g * l4 * tc.coeff / ei; !near(d.Max, want) || d.MaxBy != 0 {
				t.Errorf("deflection max = %g by %d, want %g by 0", d.Max, d.MaxBy, want)
			}
			if d.MaxWith != ([3]float64{}) {
				t.Errorf("MaxWith = %v, want zeros", d.MaxWith)
			}
			ends := env.Members[0].Deflection
			if ends[0].Max != 0 || ends[0].Min != 0 || math.Abs(ends[10].Min) > tol*math.Abs(d.Min) {
				t.Errorf("deflection at the ends: %+v, %+v", ends[0], ends[10])
			}
		})
	}
	t.Run("no service combination, no deflections", func(t *testing.T) {
		sol, err := frame.Solve(twoSpans(6, 10, 5))
		if err != nil {
			t.Fatal(err)
		}
		env, err := Compute(sol, combos.EachCase(casesOf(sol)), Settings{Kinds: kindsOf(sol, nil), Stations: 5}, nil)
		if err != nil {
			t.Fatal(err)
		}
		if env.Service != nil || env.Members[0].Deflection != nil {
			t.Errorf("service %v, deflections %v", env.Service, env.Members[0].Deflection)
		}
	})
}

// Two equal spans with live load patterned span by span: the largest
// deflection of a span comes with only that span loaded, 0.472L from the
// end support, wL⁴/109EI (AISC Steel Construction Manual, Table 3-23, case
// 30, continuous beam, two equal spans, uniform load on one span; recalled
// from memory, and the closed form below: the simple span's curve less
// that of the support moment wL²/16).
func TestPatternedDeflection(t *testing.T) {
	const l, g, q = 6.0, 4.0, 10.0
	const at = 0.472 // of the span
	ei := 200e6 * 1e-4
	mo := beam(2, l, g, q)
	cs := []combos.Combination{{Name: "G+Q", Service: true, Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}}}}
	lay, err := patterns.Expand(mo, []int{1}, 1, patterns.Exact)
	if err != nil {
		t.Fatal(err)
	}
	sol, err := frame.Solve(lay.Model)
	if err != nil {
		t.Fatal(err)
	}
	env, err := Compute(sol, cs, Settings{Kinds: kindsOf(sol, lay), Stations: 3, Extra: [][]float64{{at * l}}}, lay)
	if err != nil {
		t.Fatal(err)
	}
	st := env.Members[0].Stations
	if !st[1].Extra || !near(st[1].X, at*l) {
		t.Fatalf("station 1 at %g, extra %v", st[1].X, st[1].Extra)
	}
	d := env.Members[0].Deflection[1]
	// Downward deflection of span 1 at x with end moment m at the interior
	// support: w x (L³ − 2Lx² + x³)/24EI − m x (L² − x²)/6LEI.
	x := at * l
	curve := func(w, m float64) float64 {
		return w*x*(l*l*l-2*l*x*x+x*x*x)/(24*ei) - m*x*(l*l-x*x)/(6*l*ei)
	}
	both := curve(g, g*l*l/8) // dead load on both spans: support moment wL²/8
	one := curve(q, q*l*l/16) // live load on span 1 only: wL²/16
	if want := -(both + one); !near(d.Min, want) {
		t.Errorf("deflection min = %g, want %g", d.Min, want)
	}
	// The published coefficient: the denominator is printed as a whole
	// number.
	if got := q * l * l * l * l / (one * ei); math.Abs(got-109) > 0.5 {
		t.Errorf("one span loaded: wL^4/%.2fEI, want wL^4/109EI", got)
	}
	if !slices.Equal(d.MinSpans, []int{0}) || d.MinLoaded != 1 {
		t.Errorf("pieces loaded for the largest deflection: %v (%d), want span 1 only", d.MinSpans, d.MinLoaded)
	}
	// The upward extreme loads span 2 alone, which lifts span 1.
	if want := -(both + curve(0, q*l*l/16)); !near(d.Max, want) || !slices.Equal(d.MaxSpans, []int{1}) {
		t.Errorf("deflection max = %g with %v, want %g with span 2", d.Max, d.MaxSpans, want)
	}
}
