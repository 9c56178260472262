package envelope

import (
	"fmt"
	"math"
	"slices"
	"testing"

	"govern/combos"
	"govern/frame"
	"govern/patterns"
)

// foldTol is the agreement of the folded and unfolded envelopes relative to
// the largest size of each effect in the member: the same pieces loaded,
// summed in another order, differ by round-off only.
const foldTol = 1e-12

// Folding the members (fold.go) loads, counts and lists the same pieces
// with the same governing combinations as evaluating every column at every
// station, and gives the same values to round-off: on the benchmark frame
// with the columns' own weight along them and a point load at a column's
// start (D), extra stations, and a service combination.
func TestFoldedEqualsUnfolded(t *testing.T) {
	for _, segments := range []int{1, 2} {
		t.Run(fmt.Sprintf("segments=%d", segments), func(t *testing.T) {
			mo := regularFrame(6, 5)
			d := &mo.Cases[0]
			for m, mem := range mo.Members {
				if mo.Nodes[mem.Start].X == mo.Nodes[mem.End].X { // a column
					d.MemberLoads = append(d.MemberLoads, frame.MemberLoad{Member: m, Direction: frame.Gravity, To: mo.Length(m), W: 4, WEnd: 4})
				}
			}
			d.MemberLoads = append(d.MemberLoads, frame.MemberLoad{Member: 0, Point: true, At: 0, P: 30})
			lay, err := patterns.Expand(mo, []int{1, 2}, segments, patterns.Exact)
			if err != nil {
				t.Fatal(err)
			}
			sol, err := frame.Solve(lay.Model)
			if err != nil {
				t.Fatal(err)
			}
			cs := append(frameCombos(), combos.Combination{Name: "D+L", Service: true, Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}}})
			set := Settings{Kinds: kindsOf(sol, lay), Stations: 11, Extra: [][]float64{nil, nil, nil, nil, nil, nil, nil, {0.4, 6.8}}}
			folded, err := Compute(sol, cs, set, lay)
			if err != nil {
				t.Fatal(err)
			}
			folding = false
			defer func() { folding = true }()
			plain, err := Compute(sol, cs, set, lay)
			if err != nil {
				t.Fatal(err)
			}
			compared := 0
			for m := range plain.Members {
				a, b := folded.Members[m], plain.Members[m]
				var scale [3]float64
				for _, s := range b.Stations {
					for j, x := range [3]Extreme{s.N, s.V, s.M} {
						scale[j] = max(scale[j], math.Abs(x.Max), math.Abs(x.Min))
					}
				}
				for i, s := range b.Stations {
					r := a.Stations[i]
					if r.X != s.X || r.Extra != s.Extra {
						t.Fatalf("member %d station %d: x %v %v", m, i, r.X, s.X)
					}
					for j, pair := range [3][2]Extreme{{r.N, s.N}, {r.V, s.V}, {r.M, s.M}} {
						got, want := pair[0], pair[1]
						where := fmt.Sprintf("member %s station %d effect %d", mo.Members[m].Name, i, j)
						tol := foldTol * scale[j]
						if math.Abs(got.Max-want.Max) > tol || math.Abs(got.Min-want.Min) > tol {
							t.Errorf("%s: folded [%v, %v], unfolded [%v, %v]", where, got.Min, got.Max, want.Min, want.Max)
						}
						for q := range 3 {
							if math.Abs(got.MaxWith[q]-want.MaxWith[q]) > foldTol*max(scale[q], 1) || math.Abs(got.MinWith[q]-want.MinWith[q]) > foldTol*max(scale[q], 1) {
								t.Errorf("%s: acting with it, folded %v %v, unfolded %v %v", where, got.MaxWith, got.MinWith, want.MaxWith, want.MinWith)
							}
						}
						if got.MaxBy != want.MaxBy || got.MinBy != want.MinBy || got.MaxLoaded != want.MaxLoaded || got.MinLoaded != want.MinLoaded ||
							!slices.Equal(got.MaxSpans, want.MaxSpans) || !slices.Equal(got.MinSpans, want.MinSpans) {
							t.Errorf("%s: folded by %d/%d loading %d/%d %v/%v, unfolded by %d/%d loading %d/%d %v/%v", where,
								got.MaxBy, got.MinBy, got.MaxLoaded, got.MinLoaded, got.MaxSpans, got.MinSpans,
								want.MaxBy, want.MinBy, want.MaxLoaded, want.MinLoaded, want.MaxSpans, want.MinSpans)
						}
						compared++
					}
				}
				if !slices.EqualFunc(a.Deflection, b.Deflection, func(x, y Extreme) bool {
					return x.Max == y.Max && x.Min == y.Min && x.MaxBy == y.MaxBy && x.MinBy == y.MinBy && slices.Equal(x.MaxSpans, y.MaxSpans)
				}) {
					t.Errorf("member %d: deflections differ", m)
				}
			}
			if compared == 0 {
				t.Fatal("nothing compared")
			}
			// What counts as round-off is the same to the last bit: a piece
			// near it would otherwise be loaded on one path only.
			strength, _ := split(cs)
			e := newEvaluator(sol.Model(), cs, strength, 3, set, lay)
			w := e.scratch()
			for m := range mo.Members {
				var extra []float64
				if m < len(set.Extra) {
					extra = set.Extra[m]
				}
				w.stations(mo.Length(m), set.Stations, extra)
				w.fold.load(e, w, sol, m)
				got := w.noiseAt
				e.evaluate(w, sol, m)
				if got != w.noiseAt {
					t.Errorf("member %s: round-off folded %v, unfolded %v", mo.Members[m].Name, got, w.noiseAt)
				}
			}
		})
	}
}
