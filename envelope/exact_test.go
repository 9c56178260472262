package envelope

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"govern/combos"
	"govern/frame"
	"govern/patterns"
)

// onePatterned returns an evaluator for one variable case (column 0, its
// rest) patterned into the given number of units (columns 1 to n, unit i
// loading piece 100+i) and a combination "f·L", with scratch for it.
func onePatterned(mode patterns.Mode, units int, f float64) (*evaluator, *work) {
	pc := patterns.Patterned{Case: 0}
	for i := range units {
		pc.Units = append(pc.Units, patterns.Unit{Column: 1 + i, Pieces: []int{100 + i}})
	}
	e := &evaluator{
		cs:        []combos.Combination{{Name: "f·L", Terms: []combos.Term{{Case: 0, Factor: f}}}},
		index:     []int{0},
		nEff:      3,
		lay:       &patterns.Layout{Mode: mode, Patterned: []patterns.Patterned{pc}, Model: &frame.Model{Cases: make([]frame.Case, 1+units)}},
		patterned: true,
		nOrig:     1,
		always:    make([]bool, 1+units),
		patternOf: []int{0},
		first:     []int{1},
	}
	return e, e.scratch()
}

// scatter fills the units' effects with sizes over five decades and of
// either sign, a few of them round-off, and returns the round-off level.
func scatter(rng *rand.Rand, ev [][3]float64) [3]float64 {
	const noise = 1e-9
	for c := range ev {
		for j := range 3 {
			a := math.Pow(10, -4*rng.Float64())
			if rng.IntN(10) == 0 {
				a = noise * rng.Float64()
			}
			if rng.IntN(2) == 0 {
				a = -a
			}
			ev[c][j] = a
		}
	}
	return [3]float64{noise, noise, noise}
}

// exactTol is the round-off allowed between sums of a hundred effects of
// size at most 1 formed in different orders.
const exactTol = 1e-13

func TestExactSumsAndListsAgainstSorting(t *testing.T) {
	// Exact placement by superposition: the adverse sum is the sum of
	// every unit whose effect has the adverse sign (closed form), and the
	// pieces listed are the most influential of them, found here by
	// sorting all of them: at least spanShare of the largest, at most
	// maxSpans, the largest first. Few units leave the list short, so
	// that it is the share that cuts it; many leave it long.
	rng := rand.New(rand.NewPCG(13, 6))
	for _, f := range []float64{1.6, -0.9} {
		for trial := range 20 {
			e, w := onePatterned(patterns.Exact, []int{8, 120}[trial%2], f)
			w.noise = scatter(rng, w.ev)
			pl := w.place.(*exactPlacement)
			pl.scan(e, w)
			units := w.ev[1:]
			for j := range 3 {
				for _, hi := range []bool{true, false} {
					positive := hi == (f >= 0) // the sign of the units loaded
					var sum [3]float64
					var loaded []candidate
					for i, v := range units {
						if (positive && v[j] > w.noise[j]) || (!positive && v[j] < -w.noise[j]) {
							for q := range 3 {
								sum[q] += v[q]
							}
							loaded = append(loaded, candidate{piece: 100 + i, a: math.Abs(v[j] * f)})
						}
					}
					got := pl.combine(e, w, 0, j, hi)
					rest := w.ev[0]
					for q := range 3 {
						want := f * sum[q]
						if a := f * rest[j]; (hi && a > 0) || (!hi && a < 0) {
							want += f * rest[q]
						}
						if math.Abs(got[q]-want) > exactTol {
							t.Errorf("f %g trial %d effect %d hi %v: force %d = %.17g, want %.17g", f, trial, j, hi, q, got[q], want)
						}
					}
					slices.SortFunc(loaded, byInfluence)
					var want []int
					for _, c := range loaded {
						if c.a >= spanShare*loaded[0].a && len(want) < maxSpans {
							want = append(want, c.piece)
						}
					}
					var l spanList
					n := pl.pieces(e, w, &l, 0, 0, j, f, hi)
					l.order()
					if n != len(loaded) || !slices.Equal(l.pieces, want) {
						t.Errorf("f %g trial %d effect %d hi %v: %d loaded, listed %v; want %d, %v", f, trial, j, hi, n, l.pieces, len(loaded), want)
					}
				}
			}
		}
	}
}

func TestAllSpansListsEveryLoadedPiece(t *testing.T) {
	// With AllSpans every loaded piece is listed, whatever its share of
	// the largest and wherever it comes in piece order: the list is that of
	// sorting every unit of the adverse sign by its influence (brute force).
	rng := rand.New(rand.NewPCG(11, 29))
	for _, f := range []float64{1.6, -0.9} {
		for trial := range 10 {
			e, _ := onePatterned(patterns.Exact, 120, f)
			e.set.AllSpans = true
			w := e.scratch()
			w.noise = scatter(rng, w.ev)
			units := w.ev[1:]
			// Half the trials put the units in decreasing size of M, the
			// order that hid the small ones behind a large one before them.
			if trial%2 == 1 {
				slices.SortFunc(units, func(x, y [3]float64) int { return -cmpFloat(math.Abs(x[2]), math.Abs(y[2])) })
			}
			pl := w.place.(*exactPlacement)
			pl.scan(e, w)
			for j := range 3 {
				for _, hi := range []bool{true, false} {
					positive := hi == (f >= 0)
					var loaded []candidate
					for i, v := range units {
						if (positive && v[j] > w.noise[j]) || (!positive && v[j] < -w.noise[j]) {
							loaded = append(loaded, candidate{piece: 100 + i, a: math.Abs(v[j] * f)})
						}
					}
					slices.SortFunc(loaded, byInfluence)
					var want []int
					for _, c := range loaded {
						want = append(want, c.piece)
					}
					var l spanList
					n := pl.pieces(e, w, &l, 0, 0, j, f, hi)
					l.order()
					if n != len(loaded) || !slices.Equal(l.pieces, want) {
						t.Errorf("f %g trial %d effect %d hi %v: %d loaded, listed %d %v; want %d listed", f, trial, j, hi, n, len(l.pieces), l.pieces, len(want))
					}
				}
			}
		}
	}
	t.Run("a twelve-span beam", func(t *testing.T) {
		// A continuous beam of twelve spans under live load alone: the
		// influence of a span dies away by a factor of about 0.27 a span
		// (common practice for equal spans), so most pieces fall below 1%
		// of the nearest. Every loaded piece must be listed, and the
		// pieces listed must sum to the extreme with each of them adverse
		// and every piece not listed round-off or relieving.
		mo := beam(12, 5, 0, 10)
		lay, err := patterns.Expand(mo, []int{1}, 1, patterns.Exact)
		if err != nil {
			t.Fatal(err)
		}
		sol, err := frame.Solve(lay.Model)
		if err != nil {
			t.Fatal(err)
		}
		cs := []combos.Combination{{Name: "L", Terms: []combos.Term{{Case: 1, Factor: 1}}}}
		env, err := Compute(sol, cs, Settings{Kinds: kindsOf(sol, lay), Stations: 5, AllSpans: true}, lay)
		if err != nil {
			t.Fatal(err)
		}
		column := make(map[int]int) // piece → its column
		for _, u := range lay.Patterned[0].Units {
			column[u.Pieces[0]] = u.Column
		}
		small := 0 // pieces listed with less than spanShare of the largest
		for m, em := range env.Members {
			scale := 0.0
			for _, st := range em.Stations {
				scale = math.Max(scale, math.Max(math.Abs(st.M.Max), math.Abs(st.M.Min)))
			}
			for _, st := range em.Stations {
				for _, side := range []struct {
					v      float64
					spans  []int
					loaded int
					sign   float64
				}{{st.M.Max, st.M.MaxSpans, st.M.MaxLoaded, 1}, {st.M.Min, st.M.MinSpans, st.M.MinLoaded, -1}} {
					if len(side.spans) != side.loaded {
						t.Errorf("member %d x %g: %d pieces listed of %d loaded", m, st.X, len(side.spans), side.loaded)
					}
					sum, big := 0.0, 0.0
					for _, p := range side.spans {
						big = math.Max(big, math.Abs(sol.At(column[p], m, st.X).M))
					}
					for p, c := range column {
						v := sol.At(c, m, st.X).M
						if slices.Contains(side.spans, p) {
							sum += v
							if math.Abs(v) < spanShare*big {
								small++
							}
							if side.sign*v <= 0 {
								t.Errorf("member %d x %g: piece %d listed, effect %g", m, st.X, p, v)
							}
						} else if side.sign*v > 1e-9*scale {
							t.Errorf("member %d x %g: piece %d of effect %g not listed", m, st.X, p, v)
						}
					}
					if math.Abs(sum-side.v) > 1e-9*scale {
						t.Errorf("member %d x %g: listed pieces sum to %g, extreme %g", m, st.X, sum, side.v)
					}
				}
			}
		}
		if small == 0 {
			t.Errorf("no piece listed below %g of the largest: the beam tests nothing past the usual share", spanShare)
		}
		t.Logf("%d pieces listed below %g of the largest", small, spanShare)
	})
}

func cmpFloat(a, b float64) int {
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return 0
}

// TestPiecesSortedAsRanked checks the lists exactPlacement.pieces keeps
// sorted (the units offered the largest first, keepDescending) against
// the way they were formed before: every unit reaching the cut offered
// in heap order to a heap of keepLargest, then sortLargestFirst and the
// repeats left out (spanList.order). Two patterned cases offer their
// units to one list, with factors that round sizes one unit of the last
// digit apart to the same factored size (so that their order falls to
// the pieces), sizes drawn from a few values (ties) and some below the
// share of the largest (the cut), and with a
// hand-made layout whose two cases share pieces (repeats).
func TestPiecesSortedAsRanked(t *testing.T) {
	rng := rand.New(rand.NewPCG(41, 3))
	collided := 0
	for _, shared := range []bool{false, true} {
		for _, f := range []float64{1.6, 1.0 / 3, -0.7, 1} {
			for trial := range 50 {
				nu := []int{40, 12}[trial%2] // the list full, or holding units below the cut
				var pcs []patterns.Patterned
				for p := range 2 {
					pc := patterns.Patterned{Case: p}
					for u := range nu {
						piece := 1000*p + u
						if shared && u%3 == 0 {
							piece = u
						}
						pc.Units = append(pc.Units, patterns.Unit{Column: 2 + p*nu + u, Pieces: []int{piece}})
					}
					pcs = append(pcs, pc)
				}
				e := &evaluator{lay: &patterns.Layout{Mode: patterns.Exact, Patterned: pcs}}
				w := &work{share: spanShare, limit: maxSpans}
				pl := newExactPlacement(2)
				for p := range 2 {
					for j := range 3 {
						for s := range 2 {
							var h []candidate
							big := 0.0
							for u := range nu {
								a := 1 + float64(rng.IntN(6))/8
								switch rng.IntN(4) {
								case 0:
									a = math.Nextafter(a, 2)
								case 1: // over three decades, a third below the cut
									a = math.Pow(10, -3*rng.Float64())
								}
								if a*math.Abs(f) == math.Nextafter(a, 2)*math.Abs(f) {
									collided++
								}
								big = max(big, a)
								if rng.IntN(3) > 0 { // the others not ranked
									h = keepLargest(h, candidate{piece: u, a: a}, maxSpans)
								}
							}
							pl.top[p][j][s], pl.big[p][j][s], pl.count[p][j][s] = h, big, nu
						}
					}
				}
				for j := range 3 {
					for _, hi := range []bool{true, false} {
						var want spanList
						got := spanList{distinct: distinctPieces(e.lay)}
						if got.distinct == shared {
							t.Fatalf("shared %v: distinctPieces %v", shared, got.distinct)
						}
						for p := range 2 {
							s := sign(hi == (f >= 0))
							cut := w.share * pl.big[p][j][s]
							for _, c := range pl.top[p][j][s] {
								if c.a >= cut {
									want.ranked = keepLargest(want.ranked, candidate{piece: pcs[p].Units[c.piece].Pieces[0], a: c.a * math.Abs(f)}, w.limit)
								}
							}
						}
						want.order()
						for p := range 2 {
							pl.pieces(e, w, &got, 0, p, j, f, hi)
						}
						got.order()
						if !slices.Equal(got.pieces, want.pieces) {
							t.Fatalf("shared %v f %g trial %d effect %d hi %v: listed %v, want %v", shared, f, trial, j, hi, got.pieces, want.pieces)
						}
					}
				}
			}
		}
	}
	if collided == 0 {
		t.Error("no two sizes rounded to the same factored size: the ties of factored sizes are not checked")
	}
}

// TestCombineOneIsCombine checks that the effect sought alone
// (exactPlacement.combineOne, which extremes compares first) is, to the
// last bit, the same effect of the whole combination (combine), for
// every combination, effect and sense at every station of foldFrame with
// its live cases patterned: the same terms added in the same order. With
// L and Lr joined in a group (Settings.Groups: the terms act by the sum
// of the group) and without.
func TestCombineOneIsCombine(t *testing.T) {
	if goFuses {
		t.Skip("the compiler may fuse products and sums: extremes does not use combineOne")
	}
	mo := foldFrame(false)
	sol, lay := solvePatterned(t, mo, 2, false)
	cs := frameCombos()
	for _, groups := range [][]int{nil, {-1, 0, 0, -1}} {
		t.Run(fmt.Sprintf("groups %v", groups), func(t *testing.T) {
			set := Settings{Kinds: kindsOf(sol, lay), Stations: 11, Groups: groups}
			idx := make([]int, len(cs))
			for k := range idx {
				idx[k] = k
			}
			e := newEvaluator(sol.Model(), cs, idx, 3, set, lay)
			if (groups != nil) != (e.joined != nil) {
				t.Fatalf("groups %v: joined plans %v", groups, e.joined)
			}
			w := e.scratch()
			pl := w.place.(*exactPlacement)
			compared := 0
			for m := range mo.Members {
				e.evaluate(w, sol, m)
				ns := len(w.xs)
				for i := range ns {
					for c := range w.ev {
						f := w.at[c*ns+i]
						w.ev[c] = [3]float64{f.N, f.V, f.M}
					}
					w.noise = w.noiseAt
					pl.scan(e, w)
					for k := range e.cs {
						for j := range 3 {
							for _, hi := range []bool{true, false} {
								got, want := pl.combineOne(e, w, k, j, hi), pl.combine(e, w, k, j, hi)[j]
								if math.Float64bits(got) != math.Float64bits(want) {
									t.Fatalf("member %d station %d combination %d effect %d hi %v: %v, want %v", m, i, k, j, hi, got, want)
								}
								compared++
							}
						}
					}
				}
			}
			if compared == 0 {
				t.Fatal("nothing compared")
			}
		})
	}
}

// TestCombineBoth checks the largest and the smallest value of effect j
// of a combination formed in one pass (combineBoth) against the
// definition, bit for bit: in the order of its terms, each case's
// factored effect where it acts (a permanent case always, a variable one
// where adverse) and each patterned case's factored sum of its units of
// the adverse sign (exactPlacement.sum), with effects of either sign,
// zeros of either sign and NaN, and factors of either sign and zero; and
// against combineOne and combine's effect j, which extremes used before
// (the forces acting with an extreme are combine's).
func TestCombineBoth(t *testing.T) {
	rng := rand.New(rand.NewPCG(21, 8))
	const units = 9
	pc := patterns.Patterned{Case: 1}
	for i := range units {
		pc.Units = append(pc.Units, patterns.Unit{Column: 3 + i, Pieces: []int{i}})
	}
	always := make([]bool, 3+units)
	always[0] = true // D
	term := func(c int, f float64) combos.Term { return combos.Term{Case: c, Factor: f} }
	e := &evaluator{
		cs: []combos.Combination{
			{Name: "1.4D", Terms: []combos.Term{term(0, 1.4)}},
			{Name: "1.2D+1.6L+0.5W", Terms: []combos.Term{term(0, 1.2), term(1, 1.6), term(2, 0.5)}},
			{Name: "0.9D-W-0.5L", Terms: []combos.Term{term(0, 0.9), term(2, -1), term(1, -0.5)}},
			{Name: "L+0W+L", Terms: []combos.Term{term(1, 1), term(2, 0), term(1, 1)}},
		},
		nEff:      3,
		lay:       &patterns.Layout{Mode: patterns.Exact, Patterned: []patterns.Patterned{pc}, Model: &frame.Model{Cases: make([]frame.Case, 3+units)}},
		patterned: true,
		nOrig:     3,
		always:    always,
		patternOf: []int{-1, 0, -1},
		first:     []int{3},
	}
	e.flatten()
	w := e.scratch()
	pl := w.place.(*exactPlacement)
	num := func() float64 {
		switch rng.IntN(8) {
		case 0:
			return 0
		case 1:
			return math.Copysign(0, -1)
		case 2:
			return math.NaN()
		}
		return rng.NormFloat64()
	}
	for trial := range 200 {
		for c := range w.ev {
			w.ev[c] = [3]float64{num(), num(), num()}
		}
		w.noise = [3]float64{1e-3, 1e-3, 1e-3}
		pl.scan(e, w)
		for k, cb := range e.cs {
			for j := range 3 {
				var want [2]float64 // largest, smallest
				for s, hi := range []bool{true, false} {
					for _, t := range cb.Terms {
						a := t.Factor * w.ev[t.Case][j]
						if always[t.Case] || (hi && a > 0) || (!hi && a < 0) {
							want[s] += a
						}
						if t.Case == 1 {
							adverse := 0 // the positive units
							if hi != (t.Factor >= 0) {
								adverse = 1
							}
							want[s] += t.Factor * pl.sum[0][j][adverse][j]
						}
					}
				}
				hi, lo := pl.combineBoth(w, e.flat[k], j)
				one := [2]float64{pl.combineOne(e, w, k, j, true), pl.combineOne(e, w, k, j, false)}
				all := [2]float64{pl.combine(e, w, k, j, true)[j], pl.combine(e, w, k, j, false)[j]}
				if !sameBits([]float64{hi, lo}, want[:]) || !sameBits(one[:], want[:]) || !sameBits(all[:], want[:]) {
					t.Errorf("trial %d, %s, effect %d: %v %v (combineOne %v, combine %v), want %v", trial, cb.Name, j, hi, lo, one, all, want)
				}
			}
		}
	}
}
