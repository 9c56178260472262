package envelope

import (
	"testing"

	"govern/combos"
	"govern/frame"
	"govern/patterns"
)

func TestCodeArrangementsOfTwoSpans(t *testing.T) {
	// Two equal spans: the code arrangements are both spans, span 1 alone
	// and span 2 alone (patterns.Arrangements), which with live load left
	// off where it relieves are every arrangement there is. Closed forms
	// from AISC Steel Construction Manual Table 3-23 (recalled from
	// memory): both spans loaded, support moment -wL²/8 and 35/512 wL² at
	// 7L/16; one span loaded, 49/512 wL² at 7L/16 of the loaded span and
	// -wL/16·x in the other span at x from its far support.
	const l, g, q = 8.0, 20.0, 15.0
	mo := beam(2, l, g, q)
	cs := []combos.Combination{{Name: "1.2D+1.6L", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}}}}
	lay, err := patterns.Expand(mo, []int{1}, 1, patterns.Code)
	if err != nil {
		t.Fatal(err)
	}
	sol, err := frame.Solve(lay.Model)
	if err != nil {
		t.Fatal(err)
	}
	for _, tc := range []struct {
		name      string
		asWritten bool
		// at 7L/16 of span 1 and at the middle support
		spanMax, spanMin, supportMax, supportMin float64
	}{
		{
			name:       "adverse: an arrangement that relieves is left off",
			spanMax:    1.2*35*g*l*l/512 + 1.6*49*q*l*l/512,
			spanMin:    1.2*35*g*l*l/512 - 1.6*q*l*(7*l/16)/16,
			supportMax: -1.2 * g * l * l / 8,
			supportMin: -(1.2*g + 1.6*q) * l * l / 8,
		},
		{
			// As written the least adverse arrangement still acts: at the
			// support that is one span loaded, -qL²/16.
			name:       "as written: the arrangement always acts",
			asWritten:  true,
			spanMax:    1.2*35*g*l*l/512 + 1.6*49*q*l*l/512,
			spanMin:    1.2*35*g*l*l/512 - 1.6*q*l*(7*l/16)/16,
			supportMax: -1.2*g*l*l/8 - 1.6*q*l*l/16,
			supportMin: -(1.2*g + 1.6*q) * l * l / 8,
		},
	} {
		t.Run(tc.name, func(t *testing.T) {
			env, err := Compute(sol, cs, Settings{Kinds: kindsOf(sol, lay), Stations: 17, AsWritten: tc.asWritten}, lay)
			if err != nil {
				t.Fatal(err)
			}
			span, support := env.Members[0].Stations[7].M, env.Members[0].Stations[16].M
			for _, c := range []struct {
				what      string
				got, want float64
			}{
				{"M max at 7L/16", span.Max, tc.spanMax},
				{"M min at 7L/16", span.Min, tc.spanMin},
				{"M max at the support", support.Max, tc.supportMax},
				{"M min at the support", support.Min, tc.supportMin},
			} {
				if !near(c.got, c.want) {
					t.Errorf("%s = %g, want %g", c.what, c.got, c.want)
				}
			}
			if got := names(env, span.MaxSpans); got != "span1" {
				t.Errorf("pieces for the span maximum %q, want span1", got)
			}
			if got := names(env, support.MinSpans); got != "span1 span2" {
				t.Errorf("pieces for the support minimum %q, want span1 span2", got)
			}
		})
	}
}

func TestCodeCaseWithNothingOnBeams(t *testing.T) {
	// A patterned case whose only load is at a node has no pieces and so
	// no arrangement: its rest acts as a whole, as with exact placement.
	// A simple span on a pin and a roller with a pull P at the roller
	// carries N = P in tension (statics).
	const l, g, p = 6.0, 10.0, 5.0
	mo := beam(1, l, g, 0)
	mo.Cases[1] = frame.Case{Name: "L", NodeLoads: []frame.NodeLoad{{Node: 1, Fx: p}}}
	cs := []combos.Combination{{Name: "D+L", Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}}}}
	for _, mode := range []patterns.Mode{patterns.Code, patterns.Exact, patterns.Exhaustive} {
		t.Run(mode.String(), func(t *testing.T) {
			env := patterned(t, mo, []int{1}, 1, mode, cs, 3)
			mid := env.Members[0].Stations[1]
			if !near(mid.N.Max, p) || mid.N.Min != 0 || !near(mid.M.Max, g*l*l/8) {
				t.Errorf("N = [%g, %g], M max = %g; want [0, %g], %g (wL²/8)", mid.N.Min, mid.N.Max, mid.M.Max, p, g*l*l/8)
			}
			if mid.N.MaxLoaded != 0 || len(mid.N.MaxSpans) != 0 {
				t.Errorf("pieces loaded: %+v", mid.N)
			}
		})
	}
}
