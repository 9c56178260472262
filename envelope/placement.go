package envelope

import (
	"fmt"

	"govern/patterns"
)

// A placement decides, at one station, how the units of the patterned
// cases (pieces, or the code's arrangements of them; see package patterns)
// act in each combination: exactPlacement (exact.go), codePlacement
// (code.go), exhaustivePlacement (exhaustive.go), or noPlacement when no
// case is patterned. Compute chooses it once from the layout's mode; each
// goroutine holds its own (it keeps the station's scratch), and the
// evaluator e passed to its methods gives what is fixed for the call: the
// combinations, the layout and the effects enveloped.
//
// Every placement places a case that is not patterned, and a patterned
// case's rest, as a whole (addWhole, or with its joined group: acting,
// joined.go), in the order of the combination's terms, so that
// sums are formed in the same order whatever the placement.
type placement interface {
	// scan reads the units' effects at the station (w.ev, with round-off
	// w.noise) and keeps what combine and pieces need. It is called once
	// per station, before them.
	scan(e *evaluator, w *work)
	// extremes returns, for each effect enveloped, the largest and the
	// smallest value over the combinations, each placed with combine, with
	// the combination (an index into e.cs) and the forces acting with it;
	// of equal values the first combination is kept. It is called once per
	// station, after scan. Its loop over the combinations is the hot one:
	// each placement has its own copy, which calls its combine directly (a
	// call through the interface for each combination made BenchmarkCompute
	// a third slower on a frame without patterns).
	extremes(e *evaluator, w *work) [3]Extreme
	// combine returns the forces (N, V, M) of combination k, an index
	// into e.cs, with its loads placed to make effect j largest (hi) or
	// smallest.
	combine(e *evaluator, w *work, k, j int, hi bool) [3]float64
	// pieces adds to l the pieces of patterned case p (an index into
	// e.lay.Patterned) that combination k loads for effect j, largest (hi)
	// or smallest, where p's factor in k is f (not 0), and returns how many
	// of p's pieces it loads, listed or not.
	pieces(e *evaluator, w *work, l *spanList, k, p, j int, f float64, hi bool) int
}

// newPlacement returns a new placement, with its own scratch space, for
// the layout of e.
func newPlacement(e *evaluator) placement {
	if !e.patterned {
		return noPlacement{}
	}
	n := len(e.lay.Patterned)
	switch e.lay.Mode {
	case patterns.Exact:
		return newExactPlacement(n)
	case patterns.Code:
		return &codePlacement{best: make([][3][2]int, n)}
	case patterns.Exhaustive:
		return &exhaustivePlacement{}
	case patterns.Full:
		return noPlacement{}
	}
	panic(fmt.Sprintf("envelope: unknown pattern mode %v", e.lay.Mode))
}

// addWhole adds to tot the factored effects f·v of a term that acts as a
// whole: a case that is not patterned, or a patterned case's rest. A
// permanent case (or any, as written: always) acts wherever it is; a
// variable one only where its factored effect j makes the extreme sought,
// largest (hi) or smallest, worse.
func addWhole(tot, v *[3]float64, f float64, always bool, j int, hi bool) {
	if a := f * v[j]; always || (hi && a > 0) || (!hi && a < 0) {
		tot[0], tot[1], tot[2] = tot[0]+f*v[0], tot[1]+f*v[1], tot[2]+f*v[2]
	}
}

// noPlacement is the placement of a layout without patterned cases, or
// with every piece on ("full"): every case acts as a whole.
type noPlacement struct{}

func (noPlacement) scan(*evaluator, *work) {}

// extremes is the loop over the combinations that every placement repeats
// with its own combine.
func (pl noPlacement) extremes(e *evaluator, w *work) [3]Extreme {
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

func (pl noPlacement) combine(e *evaluator, w *work, k, j int, hi bool) [3]float64 {
	var tot [3]float64
	act := e.acting(w, k, j, hi)
	for i, t := range e.cs[k].Terms {
		if act == nil {
			addWhole(&tot, &w.ev[t.Case], t.Factor, e.always[t.Case], j, hi)
		} else if act[i] {
			add(&tot, &w.ev[t.Case], t.Factor)
		}
	}
	return tot
}

func (noPlacement) pieces(*evaluator, *work, *spanList, int, int, int, float64, bool) int {
	return 0
}
