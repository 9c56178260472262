package envelope

import (
	"slices"
	"strings"
	"testing"

	"govern/combos"
	"govern/frame"
)

func TestExtraStationsAreMergedAndMarked(t *testing.T) {
	w := &work{}
	// A repeat, one within round-off of an equally spaced station, one on
	// an end, unsorted.
	w.stations(6, 5, []float64{5.75, 0.25, 3 + 1e-12, 0.25, 6})
	wantX := []float64{0, 0.25, 1.5, 3, 4.5, 5.75, 6}
	wantExtra := []bool{false, true, false, true, false, true, true}
	if !slices.Equal(w.xs, wantX) || !slices.Equal(w.extra, wantExtra) {
		t.Errorf("stations %v %v, want %v %v", w.xs, w.extra, wantX, wantExtra)
	}
	w.stations(6, 3, nil)
	if !slices.Equal(w.xs, []float64{0, 3, 6}) || slices.Contains(w.extra, true) {
		t.Errorf("without extras: %v %v", w.xs, w.extra)
	}
}

// A beam fixed at both ends under a uniform load w has, at a distance x
// from an end, M = w/12 (6Lx − L² − 6x²) and V = w (L/2 − x) (AISC Steel
// Construction Manual, Table 3-23, case 15, recalled from memory; also the
// statics of the beam with end moments wL²/12). Stations at the faces of
// supports a/2 in from each end take those values.
func TestFaceStationsOfAFixedBeam(t *testing.T) {
	const l, g, a = 8.0, 25.0, 0.6 // span, load, support width
	mo := &frame.Model{
		Sections: []frame.Section{{Name: "S", E: 30e6, A: 0.2, I: 8e-3}},
		Nodes:    []frame.Node{{Name: "A", Support: frame.Fixed}, {Name: "B", X: l, Support: frame.Fixed}},
		Members:  []frame.Member{{Name: "AB", Start: 0, End: 1}},
		Cases:    []frame.Case{{Name: "D", MemberLoads: []frame.MemberLoad{{Member: 0, To: l, W: g, WEnd: g}}}},
	}
	sol, err := frame.Solve(mo)
	if err != nil {
		t.Fatal(err)
	}
	cs := []combos.Combination{
		{Name: "1.4D", Terms: []combos.Term{{Case: 0, Factor: 1.4}}},
		{Name: "1.2D", Terms: []combos.Term{{Case: 0, Factor: 1.2}}},
	}
	env, err := Compute(sol, cs, Settings{Kinds: kindsOf(sol, nil), Stations: 11, Extra: [][]float64{{a / 2, l - a/2}}}, nil)
	if err != nil {
		t.Fatal(err)
	}
	st := env.Members[0].Stations
	if len(st) != 13 || !st[1].Extra || !st[11].Extra || st[0].Extra || st[5].Extra {
		t.Fatalf("%d stations, extra flags %v %v %v %v", len(st), st[0].Extra, st[1].Extra, st[5].Extra, st[11].Extra)
	}
	moment := func(x float64) float64 { return g / 12 * (6*l*x - l*l - 6*x*x) }
	shear := func(x float64) float64 { return g * (l/2 - x) }
	for _, s := range []Station{st[1], st[11]} {
		m := moment(s.X)
		// Hogging at the face: 1.4D gives the least, 1.2D the greatest.
		if !near(s.M.Min, 1.4*m) || s.M.MinBy != 0 || !near(s.M.Max, 1.2*m) || s.M.MaxBy != 1 {
			t.Errorf("x = %g: M = [%g by %d, %g by %d], want [%g by 0, %g by 1]", s.X, s.M.Min, s.M.MinBy, s.M.Max, s.M.MaxBy, 1.4*m, 1.2*m)
		}
		v := shear(s.X)
		if got := map[bool]float64{true: s.V.Max, false: s.V.Min}[v > 0]; !near(got, 1.4*v) {
			t.Errorf("x = %g: V = %g, want %g", s.X, got, 1.4*v)
		}
	}
	// At the centreline the end moment is −wL²/12, larger than at the face.
	if !near(st[0].M.Min, -1.4*g*l*l/12) || !(st[0].M.Min < st[1].M.Min) {
		t.Errorf("centreline M = %g, face %g", st[0].M.Min, st[1].M.Min)
	}
}

func TestExtraStationsOffTheMemberAreRejected(t *testing.T) {
	sol, err := frame.Solve(twoSpans(4, 1, 1))
	if err != nil {
		t.Fatal(err)
	}
	cs := combos.EachCase(casesOf(sol))
	for _, extra := range [][][]float64{{{-0.1}}, {nil, {4.5}}, {nil, nil, nil}} {
		_, err := Compute(sol, cs, Settings{Kinds: kindsOf(sol, nil), Stations: 3, Extra: extra}, nil)
		if err == nil || !strings.HasPrefix(err.Error(), "envelope: ") {
			t.Errorf("extra %v: err = %v", extra, err)
		}
	}
}
