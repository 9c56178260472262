package envelope

import (
	"math"
	"testing"

	"govern/combos"
	"govern/frame"
	"govern/patterns"
)

// TestEndMomentsOfTheGoverningState: on a three-span beam with dead load
// and live load patterned span by span (exact placement, every loaded
// piece listed), the end moments of the state of every extreme of N, V
// and M at every station are, by superposition, the dead load's end
// moments times its factor plus those of the listed pieces times the live
// load's factor: the state is the combination with exactly those pieces
// loaded. A value the state does not give is refused.
func TestEndMomentsOfTheGoverningState(t *testing.T) {
	const l, g, q = 6.0, 1.0, 1.5
	mo := beam(3, l, g, q)
	cs := []combos.Combination{
		{Name: "1.4D", Terms: []combos.Term{{Case: 0, Factor: 1.4}}},
		{Name: "1.2D+1.6L", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}}},
	}
	lay, err := patterns.Expand(mo, []int{1}, 1, patterns.Exact)
	if err != nil {
		t.Fatal(err)
	}
	sol, err := frame.Solve(lay.Model)
	if err != nil {
		t.Fatal(err)
	}
	set := Settings{Kinds: kindsOf(sol, lay), Stations: 9, AllSpans: true}
	env, err := Compute(sol, cs, set, lay)
	if err != nil {
		t.Fatal(err)
	}
	column := map[int]int{} // piece → its case in the expanded model
	for _, u := range lay.Patterned[0].Units {
		column[u.Pieces[0]] = u.Column
	}
	ends := func(c, m int) [2]float64 {
		return [2]float64{sol.At(c, m, 0).M, sol.At(c, m, mo.Length(m)).M}
	}
	checked := 0
	for m, em := range env.Members {
		for _, st := range em.Stations {
			for j, e := range [3]Extreme{st.N, st.V, st.M} {
				for _, side := range []struct {
					hi     bool
					v      float64
					by     int
					spans  []int
					loaded int
				}{{true, e.Max, e.MaxBy, e.MaxSpans, e.MaxLoaded}, {false, e.Min, e.MinBy, e.MinSpans, e.MinLoaded}} {
					if len(side.spans) != side.loaded {
						t.Fatalf("AllSpans lists %d of %d pieces", len(side.spans), side.loaded)
					}
					var want [2]float64
					for _, tm := range cs[side.by].Terms {
						if tm.Case == 0 {
							d := ends(0, m)
							want[0] += tm.Factor * d[0]
							want[1] += tm.Factor * d[1]
							continue
						}
						for _, p := range side.spans {
							d := ends(column[p], m)
							want[0] += tm.Factor * d[0]
							want[1] += tm.Factor * d[1]
						}
					}
					got, ok := EndMoments(sol, cs, set, lay, m, st.X, side.by, j, side.hi, side.v)
					if !ok {
						t.Fatalf("member %d x %g effect %d hi %v: the state does not give %g again", m, st.X, j, side.hi, side.v)
					}
					for k := range 2 {
						if math.Abs(got[k]-want[k]) > 1e-9*(1+math.Abs(want[k])) {
							t.Errorf("member %d x %g effect %d hi %v by %s: end %d moment %g, want %g (superposition of the pieces listed)", m, st.X, j, side.hi, cs[side.by].Name, k, got[k], want[k])
						}
					}
					checked++
				}
			}
		}
	}
	if checked == 0 {
		t.Fatal("nothing checked")
	}
	// A value that no state of that combination gives, a station that is
	// not one, a combination out of range: refused.
	st := env.Members[1].Stations[4]
	if _, ok := EndMoments(sol, cs, set, lay, 1, st.X, st.M.MaxBy, 2, true, st.M.Max+1); ok {
		t.Error("a value the state does not give was accepted")
	}
	if _, ok := EndMoments(sol, cs, set, lay, 1, st.X+1e-3, st.M.MaxBy, 2, true, st.M.Max); ok {
		t.Error("a point that is not a station was accepted")
	}
	if _, ok := EndMoments(sol, cs, set, lay, 1, st.X, len(cs), 2, true, st.M.Max); ok {
		t.Error("a combination out of range was accepted")
	}
}

// TestStationsAt: the envelope at points between the equally spaced
// stations is what Compute gives with those points as extra stations, and
// on a simple span under its dead load alone V = w(L/2 − x) (statics).
func TestStationsAt(t *testing.T) {
	const l, g, q = 6.0, 1.0, 1.5
	mo := beam(3, l, g, q)
	cs := []combos.Combination{
		{Name: "1.4D", Terms: []combos.Term{{Case: 0, Factor: 1.4}}},
		{Name: "1.2D+1.6L", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 1, Factor: 1.6}}},
		{Name: "D+L", Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}}, Service: true},
	}
	lay, err := patterns.Expand(mo, []int{1}, 1, patterns.Exact)
	if err != nil {
		t.Fatal(err)
	}
	sol, err := frame.Solve(lay.Model)
	if err != nil {
		t.Fatal(err)
	}
	set := Settings{Kinds: kindsOf(sol, lay), Stations: 7}
	xs := []float64{0.45, 5.1}
	with := set
	with.Extra = [][]float64{nil, xs}
	env, err := Compute(sol, cs, with, lay)
	if err != nil {
		t.Fatal(err)
	}
	got, err := StationsAt(sol, cs, set, lay, 1, xs)
	if err != nil {
		t.Fatal(err)
	}
	for k, x := range xs {
		var want *Station
		for i := range env.Members[1].Stations {
			if env.Members[1].Stations[i].X == x {
				want = &env.Members[1].Stations[i]
			}
		}
		if want == nil {
			t.Fatalf("Compute has no station at %g", x)
		}
		if got[k].X != x || got[k].V.Max != want.V.Max || got[k].V.Min != want.V.Min || got[k].M.Max != want.M.Max || got[k].M.MinBy != want.M.MinBy {
			t.Errorf("at %g: %+v, Compute gives %+v", x, got[k], *want)
		}
	}
	// One span, dead load only: V = w(L/2 − x) at any point.
	one := beam(1, l, g, 0)
	one.Cases = one.Cases[:1]
	sol1, err := frame.Solve(one)
	if err != nil {
		t.Fatal(err)
	}
	d := []combos.Combination{{Name: "D", Terms: []combos.Term{{Case: 0, Factor: 1}}}}
	st, err := StationsAt(sol1, d, Settings{Kinds: []combos.Kind{combos.Dead}, Stations: 3}, nil, 0, []float64{0.37, 4.2})
	if err != nil {
		t.Fatal(err)
	}
	for _, s := range st {
		if want := g * (l/2 - s.X); math.Abs(s.V.Max-want) > 1e-9 || math.Abs(s.V.Min-want) > 1e-9 {
			t.Errorf("V at %g: %g to %g, want %g (statics)", s.X, s.V.Min, s.V.Max, want)
		}
	}
	if _, err := StationsAt(sol1, d, Settings{Kinds: []combos.Kind{combos.Dead}, Stations: 3}, nil, 0, []float64{l + 1}); err == nil {
		t.Error("a point off the member was accepted")
	}
}
