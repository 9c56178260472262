package envelope

import "math"

// codePlacement places a patterned case as one of the arrangements the
// design standards describe (patterns.Code), each unit a whole
// arrangement: for each extreme the one whose effect is largest or
// smallest, acting only where adverse unless as written.
type codePlacement struct {
	// Per patterned case and effect, the unit with the largest (0) and
	// the smallest (1) effect at the station; -1 for a case without units.
	best [][3][2]int
}

func (pl *codePlacement) scan(e *evaluator, w *work) {
	for p, pc := range e.lay.Patterned {
		if len(pc.Units) == 0 {
			pl.best[p] = [3][2]int{{-1, -1}, {-1, -1}, {-1, -1}}
			continue
		}
		units := w.ev[e.first[p] : e.first[p]+len(pc.Units)]
		for j := range e.nEff {
			hi, lo := 0, 0
			for i, v := range units {
				if v[j] > units[hi][j] {
					hi = i
				}
				if v[j] < units[lo][j] {
					lo = i
				}
			}
			pl.best[p][j] = [2]int{hi, lo}
		}
	}
}

// extremes is noPlacement.extremes with this placement's combine.
func (pl *codePlacement) extremes(e *evaluator, w *work) [3]Extreme {
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

func (pl *codePlacement) combine(e *evaluator, w *work, k, j int, hi bool) [3]float64 {
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
		if i, ok := pl.unit(e, w, p, j, f, hi); ok {
			v := w.ev[e.first[p]+i]
			tot[0], tot[1], tot[2] = tot[0]+f*v[0], tot[1]+f*v[1], tot[2]+f*v[2]
		}
	}
	return tot
}

func (pl *codePlacement) pieces(e *evaluator, w *work, l *spanList, k, p, j int, f float64, hi bool) int {
	i, ok := pl.unit(e, w, p, j, f, hi)
	if !ok {
		return 0
	}
	u := e.lay.Patterned[p].Units[i]
	l.pieces = append(l.pieces, u.Pieces...)
	return len(u.Pieces)
}

// unit returns the arrangement (an index into patterned case p's units)
// chosen for effect j, largest (hi) or smallest, where p's factor is f,
// and whether it acts: with variable loads adverse, an arrangement that
// would relieve the effect is left off, and one whose effect is round-off
// is not loaded. A case with no load on any beam has no arrangement: only
// its rest acts.
func (pl *codePlacement) unit(e *evaluator, w *work, p, j int, f float64, hi bool) (int, bool) {
	want := hi == (f >= 0) // the largest unfactored effect is wanted
	i := pl.best[p][j][sign(want)]
	if i < 0 {
		return i, false
	}
	v := w.ev[e.first[p]+i]
	if math.Abs(v[j]) <= w.noise[j] {
		return i, false // round-off: not loaded
	}
	return i, e.set.AsWritten || (hi && f*v[j] > 0) || (!hi && f*v[j] < 0)
}
