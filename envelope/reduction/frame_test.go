package reduction

import (
	"context"
	"math"
	"testing"

	"govern/combos"
	"govern/envelope/analysis"
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
