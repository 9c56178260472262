package envelope

import (
	"errors"
	"math"
	"testing"

	"govern/combos"
	"govern/frame"
)

const tol = 1e-9 // relative; the solver is exact for these beams

func near(got, want float64) bool { return math.Abs(got-want) <= tol*math.Max(1, math.Abs(want)) }

// twoSpans is a continuous beam of two equal spans l on a pin and rollers,
// with dead load g on both spans and live load q on span 1 (case L1) and
// span 2 (case L2) as separate cases.
func twoSpans(l, g, q float64) *frame.Model {
	udl := func(m int, w float64) frame.MemberLoad { return frame.MemberLoad{Member: m, To: l, W: w, WEnd: w} }
	return &frame.Model{
		Sections: []frame.Section{{Name: "S", E: 200e6, A: 1e-2, I: 1e-4}},
		Nodes: []frame.Node{
			{Name: "A", Support: frame.Pinned}, {Name: "B", X: l, Support: frame.Roller}, {Name: "C", X: 2 * l, Support: frame.Roller},
		},
		Members: []frame.Member{{Name: "AB", Start: 0, End: 1}, {Name: "BC", Start: 1, End: 2}},
		Cases: []frame.Case{
			{Name: "D", MemberLoads: []frame.MemberLoad{udl(0, g), udl(1, g)}},
			{Name: "L1", MemberLoads: []frame.MemberLoad{udl(0, q)}},
			{Name: "L2", MemberLoads: []frame.MemberLoad{udl(1, q)}},
		},
	}
}

func TestAdverseVariableLoads(t *testing.T) {
	const l, g, q = 8.0, 20.0, 15.0
	sol, err := frame.Solve(twoSpans(l, g, q))
	if err != nil {
		t.Fatal(err)
	}
	cs := []combos.Combination{
		{Name: "1.4D", Terms: []combos.Term{{Case: 0, Factor: 1.4}}},
		{Name: "1.2D+1.6L", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}, {Case: 2, Factor: 1.6}}},
	}
	// 17 stations put one at 7L/16, where the one-span-loaded moment peaks.
	env, err := Compute(sol, cs, Settings{Kinds: kindsOf(sol, nil), Stations: 17}, nil)
	if err != nil {
		t.Fatal(err)
	}
	gl2, ql2 := g*l*l, q*l*l
	t.Run("span moment at 7L/16 takes live load on that span only", func(t *testing.T) {
		// Two equal spans: both spans loaded give 3wL/8·x − wx²/2 = 35/512 wL²
		// at x = 7L/16; one span loaded gives its peak 49/512 wL² there (AISC
		// Steel Construction Manual Table 3-23, recalled from memory).
		st := env.Members[0].Stations[7]
		if !near(st.X, 7*l/16) {
			t.Fatalf("station 7 at x = %g", st.X)
		}
		want := 1.2*35*gl2/512 + 1.6*49*ql2/512
		if !near(st.M.Max, want) || st.M.MaxBy != 1 {
			t.Errorf("M max = %g by %d, want %g by 1", st.M.Max, st.M.MaxBy, want)
		}
		// The least sagging: 1.4D or 1.2D with live load only on span 2,
		// which lifts span 1: its moment at x is −(q/16)·x·… = −qL/16·x.
		minLive := 1.2*35*gl2/512 - 1.6*q*l*(7*l/16)/16
		wantMin := math.Min(1.4*35*gl2/512, minLive)
		if !near(st.M.Min, wantMin) {
			t.Errorf("M min = %g, want %g", st.M.Min, wantMin)
		}
	})
	t.Run("support moment takes live load on both spans", func(t *testing.T) {
		// Two equal spans under UDL on both: support −wL²/8 (AISC Table 3-23).
		st := env.Members[0].Stations[16]
		want := -(1.2*g + 1.6*q) * l * l / 8
		if !near(st.M.Min, want) || st.M.MinBy != 1 {
			t.Errorf("M min = %g by %d, want %g by 1", st.M.Min, st.M.MinBy, want)
		}
	})
	t.Run("centre reaction", func(t *testing.T) {
		// Centre reaction 10wL/8 with both spans loaded (AISC Table 3-23).
		r := env.Reactions[1]
		if want := 10 * (1.2*g + 1.6*q) * l / 8; !near(r.Fy.Max, want) {
			t.Errorf("Fy max = %g, want %g", r.Fy.Max, want)
		}
		if r.Fx.Max != 0 || r.M.Max != 0 {
			t.Errorf("roller carries Fx %g, M %g", r.Fx.Max, r.M.Max)
		}
	})
	t.Run("as written: every case always acts", func(t *testing.T) {
		aw, err := Compute(sol, cs, Settings{Kinds: kindsOf(sol, nil), Stations: 17, AsWritten: true}, nil)
		if err != nil {
			t.Fatal(err)
		}
		st := aw.Members[0].Stations[16]
		want := -(1.2*g + 1.6*q) * l * l / 8
		if !near(st.M.Min, want) || !near(st.M.Max, -1.4*g*l*l/8) {
			t.Errorf("M = [%g, %g], want [%g, %g]", st.M.Min, st.M.Max, want, -1.4*g*l*l/8)
		}
	})
}

func TestComputeRejects(t *testing.T) {
	sol, err := frame.Solve(twoSpans(4, 1, 1))
	if err != nil {
		t.Fatal(err)
	}
	if _, err := Compute(sol, nil, Settings{Kinds: kindsOf(sol, nil), Stations: 3}, nil); !errors.Is(err, ErrNoCombinations) {
		t.Errorf("no combinations: err = %v", err)
	}
	cs := combos.EachCase(casesOf(sol))
	if _, err := Compute(sol, cs, Settings{Kinds: kindsOf(sol, nil), Stations: 1}, nil); err == nil || err.Error() != "envelope: 1 stations per member; need at least 2" {
		t.Errorf("one station: err = %v", err)
	}
}
