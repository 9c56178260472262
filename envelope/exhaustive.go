package envelope

import (
	"math"
	"math/bits"
)

// exhaustivePlacement tries every on/off subset of the pieces of a
// combination's patterned cases (patterns.Exhaustive, at most
// patterns.MaxExhaustive pieces): slow, and kept to check exact placement
// against, which must give the same extremes.
type exhaustivePlacement struct {
	terms []exTerm // scratch: the pieces of the combination being placed
}

// exTerm is one piece's factored contribution in exhaustive mode.
type exTerm struct {
	f      float64
	v      [3]float64
	pieces []int
}

func (pl *exhaustivePlacement) scan(*evaluator, *work) {}

// extremes is noPlacement.extremes with this placement's combine.
func (pl *exhaustivePlacement) extremes(e *evaluator, w *work) [3]Extreme {
	out := [3]Extreme{empty(), empty(), empty()}
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

// combine adds the subset of the combination's pieces that makes effect j
// largest (hi) or smallest, after the combination's other loads.
func (pl *exhaustivePlacement) combine(e *evaluator, w *work, k, j int, hi bool) [3]float64 {
	var tot [3]float64
	ex := pl.terms[:0]
	act := e.acting(w, k, j, hi)
	for i, t := range e.cs[k].Terms {
		if act == nil {
			addWhole(&tot, &w.ev[t.Case], t.Factor, e.always[t.Case], j, hi)
		} else if act[i] {
			add(&tot, &w.ev[t.Case], t.Factor)
		}
		if p := e.patternOf[t.Case]; p >= 0 {
			ex = exTerms(e, w, ex, p, t.Factor)
		}
	}
	pl.terms = ex
	if len(ex) > 0 {
		best := exhaustive(ex, j, hi, w.noise[j])
		for i, t := range ex {
			if best&(1<<i) != 0 {
				tot[0], tot[1], tot[2] = tot[0]+t.f*t.v[0], tot[1]+t.f*t.v[1], tot[2]+t.f*t.v[2]
			}
		}
	}
	return tot
}

// pieces adds to l the pieces of patterned case p in the best subset for
// combination k, effect j, with at least w.share of the largest one's
// factored effect, and returns how many of p's pieces that subset loads.
func (pl *exhaustivePlacement) pieces(e *evaluator, w *work, l *spanList, k, p, j int, f float64, hi bool) int {
	ex := pl.terms[:0]
	from := -1
	for _, t := range e.cs[k].Terms {
		if q := e.patternOf[t.Case]; q >= 0 {
			if q == p {
				from = len(ex)
			}
			ex = exTerms(e, w, ex, q, t.Factor)
		}
	}
	pl.terms = ex
	if from < 0 {
		return 0
	}
	best := exhaustive(ex, j, hi, w.noise[j])
	big := 0.0
	for i, t := range ex {
		if best&(1<<i) != 0 {
			big = math.Max(big, math.Abs(t.f*t.v[j]))
		}
	}
	n := 0
	for i := from; i < from+len(e.lay.Patterned[p].Units); i++ {
		if best&(1<<i) == 0 {
			continue
		}
		n++
		if t := ex[i]; math.Abs(t.f*t.v[j]) >= w.share*big {
			l.pieces = append(l.pieces, t.pieces...)
		}
	}
	return n
}

// exTerms appends to ex the units of patterned case p, with factor f.
func exTerms(e *evaluator, w *work, ex []exTerm, p int, f float64) []exTerm {
	for i, u := range e.lay.Patterned[p].Units {
		ex = append(ex, exTerm{f: f, v: w.ev[e.first[p]+i], pieces: u.Pieces})
	}
	return ex
}

// exhaustive tries every on/off subset of the terms, in Gray-code order so
// that each step switches one piece, and returns the subset (as a bit mask)
// giving the largest (hi) or smallest sum of effect j. Ties keep the
// earlier subset in that order; the empty subset comes first. A term whose
// unfactored effect is at most noise (round-off) is never in the subset.
func exhaustive(ts []exTerm, j int, hi bool, noise float64) uint32 {
	best := bestSubset(ts, j, hi)
	for i, t := range ts {
		if math.Abs(t.v[j]) <= noise {
			best &^= 1 << i
		}
	}
	return best
}

func bestSubset(ts []exTerm, j int, hi bool) uint32 {
	n := len(ts)
	var sum, bestV float64
	var mask, best uint32
	for i := uint32(1); i < 1<<n; i++ {
		b := bits.TrailingZeros32(i)
		mask ^= 1 << b
		v := ts[b].f * ts[b].v[j]
		if mask&(1<<b) != 0 {
			sum += v
		} else {
			sum -= v
		}
		if (hi && sum > bestV) || (!hi && sum < bestV) {
			bestV, best = sum, mask
		}
	}
	return best
}
