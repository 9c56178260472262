package envelope

import (
	"math"

	"govern/patterns"
)

// exactPlacement places each piece of a patterned case on its own, where
// its factored effect makes the extreme sought worse (patterns.Exact):
// by superposition the sum of the adverse pieces is the worst of every
// arrangement. At a station it sums, for each patterned case and effect,
// the units whose effect is positive and those whose effect is negative,
// so that each combination then adds one sum per patterned term.
type exactPlacement struct {
	// Per patterned case, effect and sign (0 positive, 1 negative), over
	// the units of that sign: the sum of their effects (N, V, M), the
	// largest single magnitude, how many there are and the most
	// influential of them (min-heaps of unit indices, see keepLargest).
	sum   [][3][2][3]float64
	big   [][3][2]float64
	count [][3][2]int
	top   [][3][2][]candidate
	// kept holds, per patterned case, effect and sign, the units of the
	// list the last scan made, which seed the next one's ranking (seed.go).
	kept [][3][2][]int32
	// nvID gives, per patterned case, the fold whose N and V (sums,
	// largest sizes, counts and lists, effects 0 and 1) the station's are,
	// unchanged (foldNV.id; 0 for none): stations with the same one give
	// the same spans lists of N and V for the same combination (spans).
	nvID []uint64
}

func newExactPlacement(patterned int) *exactPlacement {
	return &exactPlacement{
		sum:   make([][3][2][3]float64, patterned),
		big:   make([][3][2]float64, patterned),
		count: make([][3][2]int, patterned),
		top:   make([][3][2][]candidate, patterned),
		kept:  make([][3][2][]int32, patterned),
		nvID:  make([]uint64, patterned),
	}
}

// scan forms, in one pass over each patterned case's units, the sums, the
// largest magnitudes, how many units are of each sign, and the most
// influential units of each sign, for the spans lists. A unit whose effect
// is round-off is of neither sign.
func (pl *exactPlacement) scan(e *evaluator, w *work) {
	// The effects scanned: all of them, or the one w.only names (the
	// others' sums are then zero: only that effect's are read).
	js, je := 0, e.nEff
	if w.only > 0 {
		js, je = w.only-1, w.only
	}
	clear(pl.nvID)
	for p, pc := range e.lay.Patterned {
		if !e.uses(p) {
			continue // read by no combination
		}
		units := w.ev[e.first[p] : e.first[p]+len(pc.Units)]
		var sum [3][2][3]float64
		var big [3][2]float64
		var count [3][2]int
		top := &pl.top[p]
		for j := range top {
			top[j][0], top[j][1] = top[j][0][:0], top[j][1][:0]
		}
		// Only the positive sums (and those of round-off) are
		// accumulated; the negative ones are the total less them.
		var tot [3]float64
		var zero [3][3]float64
		// The threshold for ranking seeded from the largest sizes, found
		// first: units in the order of the pieces grow in influence
		// toward the member, and a threshold following the largest so
		// far let most of them through the heap.
		var thr, seed [3][2]float64
		for _, v := range units {
			for j := js; j < je; j++ {
				if x := v[j]; x > w.noise[j] && x > seed[j][0] {
					seed[j][0] = x
				} else if x < -w.noise[j] && -x > seed[j][1] {
					seed[j][1] = -x
				}
			}
		}
		// And from the units the list kept at the last scan (keptRows):
		// with all of them of its sign, at least the list's length of
		// units reach the smallest of their sizes here, and the largest
		// are among them.
		kept := &pl.kept[p]
		for j := js; j < je; j++ {
			for s := range 2 {
				seed[j][s] *= w.share
				if seeds(w) {
					seed[j][s] = max(seed[j][s], keptRows(kept[j][s], units, j, w.noise[j], s == 1, w.limit))
				}
				thr[j][s] = seed[j][s]
			}
		}
		for i, v := range units {
			tot[0] += v[0]
			tot[1] += v[1]
			tot[2] += v[2]
			for j := js; j < je; j++ {
				x := v[j]
				s, a := 0, x
				switch {
				case x > w.noise[j]:
					t := &sum[j][0]
					t[0] += v[0]
					t[1] += v[1]
					t[2] += v[2]
				case x < -w.noise[j]:
					s, a = 1, -x
				default:
					z := &zero[j]
					z[0] += v[0]
					z[1] += v[1]
					z[2] += v[2]
					continue
				}
				count[j][s]++
				if a > big[j][s] {
					big[j][s] = a
				}
				// thr is what a unit must reach to be listed: w.share of
				// the largest (spanShare, or 0 with AllSpans) and, once
				// the heap is full, more than its smallest. Most units
				// fall short at this one test.
				if a >= thr[j][s] {
					h := keepLargest(top[j][s], candidate{piece: i, a: a}, w.limit)
					top[j][s] = h
					t := seed[j][s]
					if len(h) == w.limit && h[0].a > t {
						t = math.Nextafter(h[0].a, math.Inf(1))
					}
					thr[j][s] = t
				}
			}
		}
		for j := js; j < je; j++ {
			for q := range 3 {
				sum[j][1][q] = tot[q] - sum[j][0][q] - zero[j][q]
			}
			for s := range 2 {
				kept[j][s] = kept[j][s][:0]
				for _, c := range top[j][s] {
					kept[j][s] = append(kept[j][s], int32(c.piece))
				}
			}
		}
		pl.sum[p], pl.big[p], pl.count[p] = sum, big, count
	}
}

// extremes is noPlacement.extremes with this placement's combine: the
// effect sought first (combineOne), and the forces acting with it only
// for a combination that makes it worse, the same numbers. (Not where
// the compiler may fuse a product and a sum, goFuses: it might fuse them
// in one function and not in the other.)
func (pl *exactPlacement) extremes(e *evaluator, w *work) [3]Extreme {
	out := [3]Extreme{empty(), empty(), empty()}
	if goFuses {
		for k := range e.cs {
			for j := range e.nEff {
				if hi := pl.combine(e, w, k, j, true); hi[j] > out[j].Max {
					out[j].Max, out[j].MaxBy, out[j].MaxWith = hi[j], k, hi
				}
				if lo := pl.combine(e, w, k, j, false); lo[j] < out[j].Min {
					out[j].Min, out[j].MinBy, out[j].MinWith = lo[j], k, lo
				}
			}
		}
		return out
	}
	// The forces acting with each extreme are formed once, for the
	// combination that governs in the end (combine depends on the station
	// alone): the same numbers as formed for each combination that makes
	// the extreme worse on the way.
	for k := range e.cs {
		if e.flat != nil && (e.joined == nil || e.joined[k].n == 0) {
			// No joined group: the largest and the smallest at once.
			ts := e.flat[k]
			for j := range e.nEff {
				h, l := pl.combineBoth(w, ts, j)
				if h > out[j].Max {
					out[j].Max, out[j].MaxBy = h, k
				}
				if l < out[j].Min {
					out[j].Min, out[j].MinBy = l, k
				}
			}
			continue
		}
		for j := range e.nEff {
			if h := pl.combineOne(e, w, k, j, true); h > out[j].Max {
				out[j].Max, out[j].MaxBy = h, k
			}
			if l := pl.combineOne(e, w, k, j, false); l < out[j].Min {
				out[j].Min, out[j].MinBy = l, k
			}
		}
	}
	for j := range e.nEff {
		if k := out[j].MaxBy; k >= 0 {
			hi := pl.combine(e, w, k, j, true)
			out[j].Max, out[j].MaxWith = hi[j], hi
		}
		if k := out[j].MinBy; k >= 0 {
			lo := pl.combine(e, w, k, j, false)
			out[j].Min, out[j].MinWith = lo[j], lo
		}
	}
	return out
}

// combineBoth is combineOne for the largest (hi) and the smallest (lo)
// at once, for a combination without joined groups (its terms ts): each
// the same terms added in the same order, the product of each term formed
// once for both (combineOne forms the same product twice), so the same
// numbers to the last bit.
func (pl *exactPlacement) combineBoth(w *work, ts []flatTerm, j int) (hi, lo float64) {
	for _, t := range ts {
		a := t.f * w.ev[t.c][j]
		if t.always || a > 0 {
			hi += a
		}
		if t.always || a < 0 {
			lo += a
		}
		if t.p < 0 {
			continue
		}
		s := &pl.sum[t.p][j]
		if t.f >= 0 {
			hi += t.f * s[0][j]
			lo += t.f * s[1][j]
		} else {
			hi += t.f * s[1][j]
			lo += t.f * s[0][j]
		}
	}
	return hi, lo
}

// combineOne is combine's effect j alone: the same terms added in the
// same order, so the same number to the last bit.
func (pl *exactPlacement) combineOne(e *evaluator, w *work, k, j int, hi bool) float64 {
	var tot float64
	act := e.acting(w, k, j, hi)
	for i, t := range e.cs[k].Terms {
		f := t.Factor
		if act == nil {
			if a := f * w.ev[t.Case][j]; e.always[t.Case] || (hi && a > 0) || (!hi && a < 0) {
				tot += f * w.ev[t.Case][j]
			}
		} else if act[i] {
			tot += f * w.ev[t.Case][j]
		}
		p := e.patternOf[t.Case]
		if p < 0 {
			continue
		}
		tot += f * pl.sum[p][j][sign(hi == (f >= 0))][j]
	}
	return tot
}

// combine adds, for each patterned term, the sum of the units of the sign
// that makes effect j worse once factored: the positive ones when the
// largest unfactored effect is wanted.
func (pl *exactPlacement) combine(e *evaluator, w *work, k, j int, hi bool) [3]float64 {
	var tot [3]float64
	act := e.acting(w, k, j, hi)
	for i, t := range e.cs[k].Terms {
		if act == nil {
			addWhole(&tot, &w.ev[t.Case], t.Factor, e.always[t.Case], j, hi)
		} else if act[i] {
			add(&tot, &w.ev[t.Case], t.Factor)
		}
		p := e.patternOf[t.Case]
		if p < 0 {
			continue
		}
		f := t.Factor
		v := pl.sum[p][j][sign(hi == (f >= 0))]
		tot[0], tot[1], tot[2] = tot[0]+f*v[0], tot[1]+f*v[1], tot[2]+f*v[2]
	}
	return tot
}

// pieces loads every unit of the adverse sign and offers the most
// influential of them, with at least w.share of the largest one's effect,
// for listing: ranked by factored size, so that pieces of cases with
// different factors rank fairly against each other.
//
// With a limit to the lists, the units are sorted the smallest first (in
// place: still a heap; one comparison each when the scan sorted them)
// and offered the largest first to the list, kept sorted the largest
// first (keepDescending), so that spanList.order need not sort it: the
// same pieces in the same order as keepLargest and sortLargestFirst give.
// The factored sizes are the units' times one factor, so in the same
// order but where two round to the same size, and keepDescending places
// each where its factored size and piece put it; once one is smaller
// than the smallest of a full list, so are the rest.
func (pl *exactPlacement) pieces(e *evaluator, w *work, l *spanList, k, p, j int, f float64, hi bool) int {
	s := sign(hi == (f >= 0))
	units := e.lay.Patterned[p].Units
	cut := w.share * pl.big[p][j][s]
	top := pl.top[p][j][s]
	af := math.Abs(f)
	if w.limit == math.MaxInt {
		for _, c := range top {
			if c.a >= cut {
				l.ranked = keepLargest(l.ranked, candidate{piece: units[c.piece].Pieces[0], a: c.a * af}, w.limit)
			}
		}
		return pl.count[p][j][s]
	}
	sortSmallestFirst(top)
	l.sorted = true
	piece0 := units0(e, p)
	for q := len(top) - 1; q >= 0 && top[q].a >= cut; q-- {
		a := top[q].a * af
		if n := len(l.ranked); n == w.limit && a < l.ranked[n-1].a {
			// Smaller than the smallest of a full list, and so is every
			// unit after it (their factored sizes are no larger): none
			// is kept.
			break
		}
		pc := piece0[top[q].piece]
		if pc < 0 {
			pc = units[top[q].piece].Pieces[0] // none: as before
		}
		l.ranked = keepDescending(l.ranked, candidate{piece: pc, a: a}, w.limit)
	}
	return pl.count[p][j][s]
}

// units0 returns each unit's first piece for patterned case p of e
// (evaluator.piece0), formed here for an evaluator not made by
// newEvaluator (the tests'), -1 for none.
func units0(e *evaluator, p int) []int {
	if e.piece0 != nil {
		return e.piece0[p]
	}
	return firstPieces(e.lay.Patterned[p].Units)
}

// firstPieces returns each unit's first piece, -1 for none.
func firstPieces(units []patterns.Unit) []int {
	out := make([]int, len(units))
	for u, un := range units {
		out[u] = -1
		if len(un.Pieces) > 0 {
			out[u] = un.Pieces[0]
		}
	}
	return out
}

// sign returns the index of the sign sought: 0 for the positive units when
// the largest unfactored effect is wanted, 1 for the negative ones.
func sign(largest bool) int {
	if largest {
		return 0
	}
	return 1
}
