package reduction

import (
	"context"
	"math"
	"testing"

	"govern/combos"
	"govern/envelope/analysis"
	"govern/frame"
)

// In a frame, the reduced case's effects in the first storey interior
// column are its factors times the unreduced ones at every station: N by
// the column's factor (three floors, 0.40, ASCE/SEI 7-16 4.7.2), M and V
// by the one-floor rule (0.5039); the roof beam, which the floor case
// does not load, keeps its effects (linearity of the frame, closed form).
func TestReducedCaseInFrame(t *testing.T) {
	b := newBuilding(3, 4, 9, 3.5, 1, []int{1, 2, 3}, nil)
	job := func(factors []analysis.MemberFactor) *analysis.Job {
		return &analysis.Job{
			Units:         analysis.Units{Force: "kN", Length: "m"},
			Model:         b.mo,
			Cases:         []combos.Case{{Name: "L", Kind: combos.Live}},
			Combinations:  []combos.Combination{{Name: "L", Terms: []combos.Term{{Case: 0, Factor: 1}}}},
			Settings:      analysis.Settings{Stations: 5, AsWritten: true},
			MemberFactors: factors,
		}
	}
	fs := Factors(b.mo, metres(t), nil, Case{Rule: ASCE716, Lo: 2.4, Width: 9, Loaded: b.loaded})
	red, err := analysis.Run(context.Background(), job(fs), analysis.Options{})
	if err != nil {
		t.Fatal(err)
	}
	plain, err := analysis.Run(context.Background(), job(nil), analysis.Options{})
	if err != nil {
		t.Fatal(err)
	}
	const tol = 1e-12
	col := b.col[[2]int{1, 1}]
	f := factorOf(t, fs, col)
	if !near(f.N, 0.40, 1e-12) || !near(f.M, 0.25+4.57/18, 1e-12) {
		t.Fatalf("factors %+v", f)
	}
	for i, s := range red.Envelope.Members[col].Stations {
		u := plain.Envelope.Members[col].Stations[i]
		for _, p := range []struct {
			what      string
			got, want float64
		}{
			{"N", s.N.Min, f.N * u.N.Min}, {"V", s.V.Max, f.V * u.V.Max}, {"M", s.M.Max, f.M * u.M.Max}, {"M min", s.M.Min, f.M * u.M.Min},
		} {
			if math.Abs(p.got-p.want) > tol*math.Max(1, math.Abs(p.want)) {
				t.Errorf("station %d: %s %g, want %g", i, p.what, p.got, p.want)
			}
		}
	}
	roof := b.beam[[2]int{1, 4}]
	for i, s := range red.Envelope.Members[roof].Stations {
		if u := plain.Envelope.Members[roof].Stations[i]; s.M.Max != u.M.Max {
			t.Errorf("roof beam station %d: M %g, unreduced %g", i, s.M.Max, u.M.Max)
		}
	}
	// The base reaction under the column is the column's N factor times
	// its unreduced one (the only member there).
	base := b.mo.Members[col].Start
	for _, r := range red.ReducedReactions(0) {
		if r.Node == base && math.Abs(r.Reduced[1]-f.N*r.Unreduced[1]) > tol*math.Abs(r.Unreduced[1]) {
			t.Errorf("base Fy %g, want %g × %g", r.Reduced[1], f.N, r.Unreduced[1])
		}
	}
}

// EN 1991-1-1 6.3.1.2(11) in the combinations of EN 1990 6.10: αn
// applies to the first storey column's N where the imposed load Q leads
// (1.35G + 1.5Q + 0.9W: N of Q × 1.5 × 0.90) and not where it accompanies
// (1.35G + 1.5W + 1.05Q: N of Q × 1.05 × 1.0; 3.3.1(2)P and 6.2.2(2),
// from memory). Linearity of the frame gives both from the unreduced N.
func TestENAccompanyingWithoutAlphaN(t *testing.T) {
	b := newBuilding(3, 4, 9, 3.5, 1, []int{1, 2, 3}, nil)
	mo := b.mo
	// G: nothing, so N is Q's alone; W: a lateral load at the roof.
	mo.Cases = append([]frame.Case{{Name: "G", NodeLoads: []frame.NodeLoad{{Node: 0, Fy: 0}}}}, mo.Cases[0], frame.Case{Name: "W"})
	mo.Cases[1].Name = "Q"
	top := len(mo.Nodes) - 1
	mo.Cases[2].NodeLoads = []frame.NodeLoad{{Node: top, Fx: 1e-9}}
	cases := []combos.Case{{Name: "G", Kind: combos.Dead}, {Name: "Q", Kind: combos.Live}, {Name: "W", Kind: combos.Wind}}
	info := []combos.CaseInfo{{}, {Category: "B"}, {}}
	set, err := combos.Standard("en1990-6.10")
	if err != nil {
		t.Fatal(err)
	}
	all, err := set.Generate(cases, info, combos.Params{})
	if err != nil {
		t.Fatal(err)
	}
	pick := func(name string) combos.Combination {
		for _, cb := range all {
			if combos.Compact(cb.Terms, cases) == name {
				return cb
			}
		}
		t.Fatalf("no combination %s", name)
		return combos.Combination{}
	}
	loaded := make([]bool, len(mo.Members))
	copy(loaded, b.loaded)
	fs := Factors(mo, metres(t), nil, Case{Case: 1, Rule: EN1991, Width: 9, Loaded: loaded, Category: "B", Psi0: 0.7})
	col := b.col[[2]int{1, 1}]
	run := func(cb combos.Combination, factors []analysis.MemberFactor) float64 {
		job := &analysis.Job{Units: analysis.Units{Force: "kN", Length: "m"}, Model: mo, Cases: cases,
			Combinations: []combos.Combination{cb}, Settings: analysis.Settings{Stations: 3, AsWritten: true}, MemberFactors: factors, AllowUnused: true}
		res, err := analysis.Run(context.Background(), job, analysis.Options{})
		if err != nil {
			t.Fatal(err)
		}
		return res.Envelope.Members[col].Stations[0].N.Min
	}
	unit := run(combos.Combination{Name: "Q", Terms: []combos.Term{{Case: 1, Factor: 1}}}, nil)
	for _, c := range []struct {
		name string
		want float64
	}{
		{"1.35G+1.5Q+0.9W", 1.5 * 0.9 * unit},   // Q leads: αn = (2 + 0.7)/3
		{"1.35G+1.5W+1.05Q", 1.05 * 1.0 * unit}, // Q accompanies: ψ0, no αn
	} {
		if got := run(pick(c.name), fs); math.Abs(got-c.want) > 1e-9*math.Abs(c.want) {
			t.Errorf("%s: N %g, want %g", c.name, got, c.want)
		}
	}
}

// ASCE/SEI 7-16 4.8.2 on a frame: a roof live case of 0.96 kN/m² on the
// roof beams (9 m × 9 m, 81 m² ≥ 55.74 m²: R1 = 0.6) at a slope of 6 on
// 12 (R2 = 0.9) gives 0.96 × 0.54 = 0.518 kN/m², raised to the 0.58 kN/m²
// floor: factor 0.58/0.96.
func TestRoofCaseOnFrame(t *testing.T) {
	b := newBuilding(3, 4, 9, 3.5, 1, []int{4}, nil)
	fs := Factors(b.mo, metres(t), nil, Case{Rule: ASCE716, Roof: true, Lo: 0.96, Rise: 6, Width: 9, Loaded: b.loaded})
	f := factorOf(t, fs, b.beam[[2]int{1, 4}])
	if !near(f.N, 0.58/0.96, 1e-12) || f.Basis.Rule != ClauseRoof || f.Basis.Limit != string(RoofMin) {
		t.Errorf("roof beam: %+v", f)
	}
}
