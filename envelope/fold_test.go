package envelope

import (
	"fmt"
	"math"
	"reflect"
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
// start (D), extra stations, and a service combination; in first order,
// and in second order (frame.Options.Axial, the axial forces 1.5 times
// those of D in first order) with a released beam end, rigid end zones
// and a rotational spring at a beam end; each without and with member
// factors (foldFactors: a factor per effect, and one that depends on the
// combination, so that the envelope is formed in parts).
func TestFoldedEqualsUnfolded(t *testing.T) {
	for _, second := range []bool{false, true} {
		for _, factors := range []bool{false, true} {
			for _, segments := range []int{1, 2} {
				name := "first order"
				if second {
					name = "second order"
				}
				if factors {
					name += " with member factors"
				}
				name += fmt.Sprintf("/segments=%d", segments)
				t.Run(name, func(t *testing.T) { foldedEqualsUnfolded(t, second, segments, factors) })
			}
		}
	}
}

// foldFrame is the frame of TestFoldedEqualsUnfolded, with its releases,
// rigid end zones and spring in second order, a beam drawn right to left
// (b3-2) and the top right node raised 0.6 m (the last roof beam sloping,
// the column under it longer).
func foldFrame(second bool) *frame.Model {
	mo := regularFrame(6, 5)
	for m := range mo.Members {
		if mem := &mo.Members[m]; mem.Name == "b3-2" {
			mem.Start, mem.End = mem.End, mem.Start
		}
	}
	mo.Nodes[len(mo.Nodes)-1].Y += 0.6
	d := &mo.Cases[0]
	for m, mem := range mo.Members {
		if mo.Nodes[mem.Start].X == mo.Nodes[mem.End].X { // a column
			d.MemberLoads = append(d.MemberLoads, frame.MemberLoad{Member: m, Direction: frame.Gravity, To: mo.Length(m), W: 4, WEnd: 4})
		}
	}
	d.MemberLoads = append(d.MemberLoads, frame.MemberLoad{Member: 0, Point: true, At: 0, P: 30})
	if second {
		mo.Members[8].Release = frame.ReleaseStart // b2-1
		mo.Members[0].OffsetStart, mo.Members[0].OffsetEnd = 0.2, 0.3
		mo.Members[9].OffsetStart = 0.25
		mo.Members[20].SpringEnd = 5e4
	}
	return mo
}

// solvePatterned expands cases 1 and 2 of mo into exact pattern pieces
// of segments each and solves them: in first order, or, with second, in
// second order under the axial forces of case 0 times 1.5 (the mean of
// each member's end forces in a first-order solve).
func solvePatterned(t *testing.T, mo *frame.Model, segments int, second bool) (*frame.Solution, *patterns.Layout) {
	t.Helper()
	lay, err := patterns.Expand(mo, []int{1, 2}, segments, patterns.Exact)
	if err != nil {
		t.Fatal(err)
	}
	var opt frame.Options
	if second {
		first, err := frame.Solve(mo)
		if err != nil {
			t.Fatal(err)
		}
		opt.Axial = make([]float64, len(mo.Members))
		for m := range mo.Members {
			f := first.EndForces(0, m)
			opt.Axial[m] = 1.5 * (-f[0] + f[3]) / 2
		}
	}
	sol, err := frame.SolveWith(lay.Model, opt)
	if err != nil {
		t.Fatal(err)
	}
	return sol, lay
}

// foldedEqualsUnfolded compares the folded and unfolded envelopes of
// foldFrame, with member factors (live load reduction) when factors is
// set.
func foldedEqualsUnfolded(t *testing.T, second bool, segments int, factors bool) {
	mo := foldFrame(second)
	sol, lay := solvePatterned(t, mo, segments, second)
	cs := append(frameCombos(), combos.Combination{Name: "D+L", Service: true, Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 1, Factor: 1}}})
	set := Settings{Kinds: kindsOf(sol, lay), Stations: 11, Extra: [][]float64{nil, nil, nil, nil, nil, nil, nil, {0.4, 6.8}}}
	if factors {
		set.Factors = foldFactors(mo)
	}
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
	folding = true
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
	if factors {
		e.setFactors(set.Factors, cs)
		if len(e.parts) < 2 {
			t.Fatalf("the member factors make %d parts: the factors that depend on the combination are not checked", len(e.parts))
		}
	}
	w := e.scratch()
	for m := range mo.Members {
		var extra []float64
		if m < len(set.Extra) {
			extra = set.Extra[m]
		}
		w.stations(mo.Length(m), set.Stations, extra)
		if _, ok := e.foldable(w, sol, m); !ok {
			t.Errorf("member %s is not folded: the test compares nothing there", mo.Members[m].Name)
		}
		w.fold.load(e, w, sol, m)
		got := w.noiseAt
		e.evaluate(w, sol, m)
		if got != w.noiseAt {
			t.Errorf("member %s: round-off folded %v, unfolded %v", mo.Members[m].Name, got, w.noiseAt)
		}
	}
}

// foldFactors are member factors for foldFrame: every column scales L and
// Lr, differently on N, V and M, and the beams of the first level scale L
// with another factor where it does not lead (as live load reduction's
// αn does).
func foldFactors(mo *frame.Model) *Factors {
	f := &Factors{Of: make([][][3]float64, len(mo.Members)), Accompanying: make([][][3]float64, len(mo.Members))}
	for m, mem := range mo.Members {
		row := [][3]float64{{1, 1, 1}, {1, 1, 1}, {1, 1, 1}, {1, 1, 1}}
		if mo.Nodes[mem.Start].X == mo.Nodes[mem.End].X {
			row[1] = [3]float64{0.7, 0.8, 0.9}
			row[2] = [3]float64{0.6, 1, 0.75}
			f.Of[m] = row
			continue
		}
		if mo.Nodes[mem.Start].Y == 3.6 {
			f.Of[m] = row
			acc := slices.Clone(row)
			acc[1] = [3]float64{0.85, 0.85, 0.85}
			f.Accompanying[m] = acc
		}
	}
	return f
}

// The units of a patterned case that no combination uses are neither
// folded nor scanned: the envelope over combinations without L (1.4D and
// 1.2D+1.6Lr ± 0.5W of foldFrame, in first and second order, folded and
// unfolded) is the same, to the last bit, as when they are.
func TestUnusedPatternedCasesAreNotScanned(t *testing.T) {
	cs := []combos.Combination{
		{Name: "1.4D", Terms: []combos.Term{{Case: 0, Factor: 1.4}}},
		{Name: "1.2D+1.6Lr+0.5W", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 2, Factor: 1.6}, {Case: 3, Factor: 0.5}}},
		{Name: "1.2D+1.6Lr-0.5W", Terms: []combos.Term{{Case: 0, Factor: 1.2}, {Case: 2, Factor: 1.6}, {Case: 3, Factor: -0.5}}},
		{Name: "D+Lr", Service: true, Terms: []combos.Term{{Case: 0, Factor: 1}, {Case: 2, Factor: 1}}},
	}
	for _, second := range []bool{false, true} {
		for _, fold := range []bool{false, true} {
			t.Run(fmt.Sprintf("second order %v/folded %v", second, fold), func(t *testing.T) {
				mo := foldFrame(second)
				lay, err := patterns.Expand(mo, []int{1, 2}, 1, patterns.Exact)
				if err != nil {
					t.Fatal(err)
				}
				var opt frame.Options
				if second {
					opt.Axial = make([]float64, len(mo.Members))
					for m := range opt.Axial {
						opt.Axial[m] = -50 // compression in every member
					}
				}
				sol, err := frame.SolveWith(lay.Model, opt)
				if err != nil {
					t.Fatal(err)
				}
				set := Settings{Kinds: kindsOf(sol, lay), Stations: 11}
				folding = fold
				defer func() { folding = true }()
				got, err := Compute(sol, cs, set, lay)
				if err != nil {
					t.Fatal(err)
				}
				e := newEvaluator(sol.Model(), cs, []int{0, 1, 2}, 3, set, lay)
				if e.uses(0) || !e.uses(1) {
					t.Fatalf("L used %v, Lr used %v: want false, true", e.uses(0), e.uses(1))
				}
				// What counts as round-off is that of every column, the
				// unused units' included, to the last bit.
				w := e.scratch()
				for m := range mo.Members {
					w.stations(mo.Length(m), set.Stations, nil)
					w.fold.load(e, w, sol, m)
					got := w.noiseAt
					e.evaluate(w, sol, m)
					if got != w.noiseAt {
						t.Errorf("member %s: round-off folded %v, unfolded %v", mo.Members[m].Name, got, w.noiseAt)
					}
				}
				skipUnused = false
				defer func() { skipUnused = true }()
				want, err := Compute(sol, cs, set, lay)
				if err != nil {
					t.Fatal(err)
				}
				if !reflect.DeepEqual(got.Members, want.Members) || !reflect.DeepEqual(got.Reactions, want.Reactions) {
					t.Error("the envelopes differ when the unused units are scanned")
				}
			})
		}
	}
}
