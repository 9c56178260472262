package envelope

import (
	"math"
	"slices"
	"strings"
	"testing"

	"govern/combos"
	"govern/frame"
	"govern/patterns"
)

func TestJoinedGroupActsAsAWhole(t *testing.T) {
	// Two equal spans (twoSpans) with L1 on span 1 and L2 on span 2, both
	// live. At 7L/16 of span 1 their moments have opposite signs: L1 alone
	// gives 49/512 qL², L2 alone -qL/16 · 7L/16 = -14/512 qL², both 35/512
	// qL² (AISC Steel Construction Manual Table 3-23, two equal spans,
	// recalled from memory; the three-moment equation gives the support
	// moments wL²/16 and wL²/8). Acting one by one where adverse (the
	// default grouping of live cases), the largest moment takes L1 alone
	// and the smallest L2 alone; joined into one group they act together or
	// not at all: both for the largest (35/512 > 0), neither for the
	// smallest.
	const l, g, q = 8.0, 20.0, 15.0
	ei := 200e6 * 1e-4
	sol, err := frame.Solve(twoSpans(l, g, q))
	if err != nil {
		t.Fatal(err)
	}
	cs := []combos.Combination{
		{Name: "1.4D", Terms: []combos.Term{{Case: 0, Factor: 1.4}}},
		{Name: "1.2D+1.6L", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}, {Case: 2, Factor: 1.6}}},
		{Name: "D+L", Service: true, Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}, {Case: 2, Factor: 1}}},
	}
	gl2, ql2 := g*l*l, q*l*l
	l4 := l * l * l * l / ei
	// Deflection at mid-span of span 1, downward positive: the simple
	// span's 5wL⁴/384EI less the support moment M's ML²/16EI
	// (superposition, common practice): both spans loaded (M = wL²/8)
	// wL⁴/192EI, span 1 alone (wL²/16) 7wL⁴/768EI, span 2 alone -3wL⁴/768EI.
	type want struct {
		mMax, mMin   float64 // M at 7L/16 of span 1
		fyMax, fyMin float64 // the reaction at A: 3wL/8 both spans, 7wL/16 span 1, -wL/16 span 2
		dMax, dMin   float64 // deflection at mid-span of span 1, up positive
	}
	dead := want{
		mMax: 1.2 * 35 * gl2 / 512, fyMax: 1.2 * 3 * g * l / 8, dMax: -g * l4 / 192,
	}
	oneByOne := want{
		mMax: dead.mMax + 1.6*49*ql2/512, mMin: dead.mMax - 1.6*14*ql2/512,
		fyMax: dead.fyMax + 1.6*7*q*l/16, fyMin: dead.fyMax - 1.6*q*l/16,
		dMax: dead.dMax + 3*q*l4/768, dMin: dead.dMax - 7*q*l4/768,
	}
	together := want{
		mMax: dead.mMax + 1.6*35*ql2/512, mMin: dead.mMax,
		fyMax: dead.fyMax + 1.6*3*q*l/8, fyMin: dead.fyMax,
		dMax: dead.dMax, dMin: dead.dMax - q*l4/192,
	}
	// The default grouping of the two live cases: one action, acting
	// together, no joined set.
	acts, err := combos.GroupActions(casesOf(sol), nil)
	if err != nil {
		t.Fatal(err)
	}
	if acts.Groups() != nil {
		t.Fatalf("live cases grouped by default are joined: %v", acts.Groups())
	}
	for _, tc := range []struct {
		name   string
		groups []int
		want   want
	}{
		{"live cases grouped by default act one by one where adverse", acts.Groups(), oneByOne},
		{"cases in no group act one by one", []int{-1, -1, -1}, oneByOne},
		{"a joined group acts as a whole", []int{-1, 4, 4}, together},
	} {
		t.Run(tc.name, func(t *testing.T) {
			env, err := Compute(sol, cs, Settings{Kinds: kindsOf(sol, nil), Stations: 17, Groups: tc.groups}, nil)
			if err != nil {
				t.Fatal(err)
			}
			st := env.Members[0].Stations[7]
			d := env.Members[0].Deflection[8]
			r := env.Reactions[0]
			if !near(st.X, 7*l/16) || !near(env.Members[0].Stations[8].X, l/2) {
				t.Fatalf("stations 7 and 8 at %g and %g", st.X, env.Members[0].Stations[8].X)
			}
			for _, c := range []struct {
				what      string
				got, want float64
			}{
				{"M max at 7L/16", st.M.Max, tc.want.mMax},
				{"M min at 7L/16", st.M.Min, tc.want.mMin},
				{"Fy max at A", r.Fy.Max, tc.want.fyMax},
				{"Fy min at A", r.Fy.Min, tc.want.fyMin},
				{"deflection max at L/2", d.Max, tc.want.dMax},
				{"deflection min at L/2", d.Min, tc.want.dMin},
			} {
				if !near(c.got, c.want) {
					t.Errorf("%s = %.12g, want %.12g", c.what, c.got, c.want)
				}
			}
			// Equilibrium beside the closed forms: the moment at 7L/16 is
			// that of the reaction at A and the load on the span before
			// it, in the same loading.
			x := 7 * l / 16
			if tc.want.mMax == together.mMax {
				w := 1.2*g + 1.6*q
				if m := r.Fy.Max*x - w*x*x/2; !near(m, st.M.Max) {
					t.Errorf("statics: R_A x - w x²/2 = %g, envelope %g", m, st.M.Max)
				}
			}
		})
	}
	t.Run("a term of no case is an error, groups or not", func(t *testing.T) {
		bad := []combos.Combination{{Name: "bad", Terms: []combos.Term{{Case: 1, Factor: 1}, {Case: 2, Factor: 1}, {Case: 3, Factor: 1}}}}
		_, err := Compute(sol, bad, Settings{Kinds: kindsOf(sol, nil), Stations: 3, Groups: []int{-1, 0, 0}}, nil)
		if err == nil || err.Error() != `envelope: combination "bad" refers to case 3 of 3` {
			t.Errorf("err = %v", err)
		}
	})
	t.Run("as written the groups change nothing", func(t *testing.T) {
		for _, groups := range [][]int{nil, {-1, 0, 0}} {
			env, err := Compute(sol, cs, Settings{Kinds: kindsOf(sol, nil), Stations: 17, Groups: groups, AsWritten: true}, nil)
			if err != nil {
				t.Fatal(err)
			}
			st := env.Members[0].Stations[7]
			if w := together.mMax; !near(st.M.Max, w) || !near(st.M.Min, math.Min(1.4*35*gl2/512, w)) {
				t.Errorf("groups %v: M = [%g, %g], want [%g, %g]", groups, st.M.Min, st.M.Max, math.Min(1.4*35*gl2/512, w), w)
			}
		}
	})
}

func TestJoinedPatternedCase(t *testing.T) {
	// A patterned case L joined to a case Q: L's rest (the loads off the
	// beams) follows the group, decided by the sum of the rest's and Q's
	// factored effects; L's pieces are placed one by one as the mode
	// says. Effects chosen by hand, each of N, V, M 1, 10 and 100 times
	// the base numbers: rest +3, Q -5, piece 0 +2, piece 1 -1; 1.0L + 1.0Q.
	// Largest: the group sums to -2 and stays off, piece 0 is on: 2.
	// Smallest: the group is on, and piece 1: 3 - 5 - 1 = -3.
	// Without the group each acts alone: 3 + 2 = 5 and -5 - 1 = -6.
	scale := [3]float64{1, 10, 100}
	val := func(x float64) [3]float64 { return [3]float64{x * scale[0], x * scale[1], x * scale[2]} }
	for _, mode := range []patterns.Mode{patterns.Exact, patterns.Code, patterns.Exhaustive} {
		for _, tc := range []struct {
			name               string
			groups             []int
			max, min           float64
			maxSpans, minSpans []int
		}{
			{"joined", []int{0, 0}, 2, -3, []int{0}, []int{1}},
			{"alone", nil, 5, -6, []int{0}, []int{1}},
		} {
			t.Run(mode.String()+" "+tc.name, func(t *testing.T) {
				pc := patterns.Patterned{Case: 0, Units: []patterns.Unit{{Column: 2, Pieces: []int{0}}, {Column: 3, Pieces: []int{1}}}}
				lay := &patterns.Layout{Mode: mode, Patterned: []patterns.Patterned{pc}, Model: &frame.Model{Cases: make([]frame.Case, 4)}}
				cs := []combos.Combination{{Name: "L+Q", Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}}}}
				set := Settings{Kinds: []combos.Kind{combos.Live, combos.Live}, Groups: tc.groups, Stations: 2}
				e := newEvaluator(lay.Model, cs, []int{0}, 3, set, lay)
				w := e.scratch()
				copy(w.ev, [][3]float64{val(3), val(-5), val(2), val(-1)})
				w.noise = [3]float64{1e-9, 1e-9, 1e-9}
				out := e.station(w)
				for j := range 3 {
					x := out[j]
					if x.Max != tc.max*scale[j] || x.Min != tc.min*scale[j] || x.MaxWith != val(tc.max) || x.MinWith != val(tc.min) {
						t.Errorf("effect %d: [%g, %g] with %v and %v, want [%g, %g]", j, x.Min, x.Max, x.MinWith, x.MaxWith, tc.min*scale[j], tc.max*scale[j])
					}
					if !slices.Equal(x.MaxSpans, tc.maxSpans) || !slices.Equal(x.MinSpans, tc.minSpans) {
						t.Errorf("effect %d: pieces %v and %v, want %v and %v", j, x.MaxSpans, x.MinSpans, tc.maxSpans, tc.minSpans)
					}
				}
			})
		}
	}
}

func TestJoinPlans(t *testing.T) {
	// Groups are formed per combination from the terms present: a group
	// with one term there acts as that term alone.
	cs := []combos.Combination{
		{Name: "both", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 2, Factor: 1}, {Case: 1, Factor: 1}, {Case: 3, Factor: 1}, {Case: 4, Factor: 1}}},
		{Name: "one of each", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1}, {Case: 2, Factor: 1}}},
	}
	groups := []int{-1, 7, 3, 7, 3}
	p := joinPlans(cs, groups)
	if len(p) != 2 || !slices.Equal(p[0].of, []int{-1, 0, 1, 1, 0}) || p[0].n != 2 || p[1].n != 0 || p[1].of != nil {
		t.Errorf("plans %+v", p)
	}
	if p := joinPlans(cs[1:], groups); p != nil {
		t.Errorf("no combination with two terms of a group: plans %+v", p)
	}
	if p := joinPlans(cs, nil); p != nil {
		t.Errorf("no groups: plans %+v", p)
	}
}

func TestGroupsRefused(t *testing.T) {
	// Settings.Groups is set by the program, not the user: what cannot be
	// is a programmer error, and Compute panics.
	sol, err := frame.Solve(twoSpans(4, 1, 1))
	if err != nil {
		t.Fatal(err)
	}
	cs := combos.EachCase(casesOf(sol))
	for _, tc := range []struct {
		name   string
		groups []int
		want   string
	}{
		{"not one group per case", []int{-1, 0}, "envelope: Settings.Groups gives 2 groups for 3 load cases"},
		{"a group below -1", []int{-1, -2, 0}, "envelope: Settings.Groups puts case 1 in group -2"},
		{"a permanent case in a group", []int{0, 0, -1}, "envelope: Settings.Groups puts case 0, of dead load, in group 0"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			defer func() {
				r := recover()
				if s, ok := r.(string); !ok || !strings.HasPrefix(s, tc.want) {
					t.Errorf("panic %v, want %q", r, tc.want)
				}
			}()
			Compute(sol, cs, Settings{Kinds: kindsOf(sol, nil), Stations: 3, Groups: tc.groups}, nil)
		})
	}
}
