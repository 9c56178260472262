package envelope

import (
	"fmt"
	"math"
	"slices"

	"govern/combos"
	"govern/frame"
	"govern/patterns"
)

// evaluator holds what is fixed for one Compute call and one kind of
// envelope: forces over the strength combinations, or deflections over
// the service ones.
type evaluator struct {
	mo        *frame.Model         // the model solved (the layout's, with patterns)
	cs        []combos.Combination // the combinations enveloped
	index     []int                // their indices in the combinations given to Compute
	nEff      int                  // effects enveloped: 3 (N, V, M) or 1 (deflection)
	defl      *evaluator           // the deflections' evaluator, nil without service combinations
	set       Settings
	lay       *patterns.Layout
	patterned bool   // the layout has patterned cases
	nOrig     int    // original cases, leading the columns
	always    []bool // column acts whatever its sign (permanent, or as written)
	patternOf []int  // original case → index into lay.Patterned, or -1
	first     []int  // column of each patterned case's first unit; its units follow in order
	// unitCase gives, for each column past the original cases, the
	// patterned case it is a unit of; nil when some column is of none,
	// and then no member is folded (fold.go).
	unitCase []int
	// joined gives, per combination of cs, its groups of joined terms
	// (joined.go); nil when no combination has any, or as written.
	joined []joinPlan
	// used tells, per patterned case, whether some combination of cs has
	// a term on it: exact placement scans the units of no other (plan;
	// nil: every one).
	used []bool
	// fac gives, per member, the factors on each original case's N, V
	// and M, nil for a member not scaled (factors.go); nil without
	// factors, and for deflections. caseOf gives each column's original
	// case. parts, when not nil, are the evaluators of the sets of
	// combinations whose factors differ; forces and reactions merge them.
	fac    [][][3]float64
	caseOf []int
	parts  []*evaluator
	// distinct is whether no two units of the layout's patterned cases
	// name the same first piece (as patterns.Expand makes them), so that
	// the spans lists need not look for repeats (spanList.order).
	distinct bool
	// piece0 gives, per patterned case, each unit's first piece (its
	// Pieces[0], -1 for none): what exactPlacement.pieces lists, read
	// from one short slice rather than from each unit's.
	piece0 [][]int
	// flat gives, per combination of cs, its terms with what the loops
	// over the combinations read of each (flatTerm); nil for an
	// evaluator not made by newEvaluator (the tests').
	flat [][]flatTerm
}

// flatTerm is a combination's term with what exactPlacement.extremes
// reads of its case, in one place: the case, its factor, whether it acts
// whatever its sign (evaluator.always) and its patterned case
// (evaluator.patternOf, -1 for none).
type flatTerm struct {
	c      int
	f      float64
	always bool
	p      int
}

// flatten sets e.flat from e.cs, e.always and e.patternOf; a term of no
// original case is Compute's to report.
func (e *evaluator) flatten() {
	e.flat = make([][]flatTerm, len(e.cs))
	for k, cb := range e.cs {
		ts := make([]flatTerm, len(cb.Terms))
		for i, t := range cb.Terms {
			ts[i] = flatTerm{c: t.Case, f: t.Factor, p: -1}
			if t.Case >= 0 && t.Case < len(e.patternOf) { // else Compute reports it
				ts[i].always, ts[i].p = e.always[t.Case], e.patternOf[t.Case]
			}
		}
		e.flat[k] = ts
	}
}

func newEvaluator(mo *frame.Model, cs []combos.Combination, idx []int, nEff int, set Settings, lay *patterns.Layout) *evaluator {
	e := &evaluator{mo: mo, cs: pick(cs, idx), index: idx, nEff: nEff, set: set, lay: lay, nOrig: len(mo.Cases)}
	if lay != nil {
		e.patterned = len(lay.Patterned) > 0
		for _, p := range lay.Patterned {
			e.nOrig -= len(p.Units)
		}
	}
	if len(set.Kinds) != e.nOrig {
		panic(fmt.Sprintf("envelope: Settings.Kinds gives %d kinds for %d load cases", len(set.Kinds), e.nOrig))
	}
	checkGroups(set.Groups, set.Kinds)
	e.plan()
	e.always = make([]bool, len(mo.Cases))
	for c := range e.nOrig {
		e.always[c] = set.AsWritten || set.Kinds[c].AlwaysActs()
	}
	e.caseOf = make([]int, len(mo.Cases))
	for c := range e.caseOf {
		e.caseOf[c] = c
	}
	if lay != nil {
		for _, p := range lay.Patterned {
			for _, u := range p.Units {
				e.caseOf[u.Column] = p.Case
			}
		}
	}
	e.patternOf = make([]int, e.nOrig)
	for c := range e.patternOf {
		e.patternOf[c] = -1
	}
	if lay != nil {
		for i, p := range lay.Patterned {
			e.patternOf[p.Case] = i
			if len(p.Units) == 0 {
				e.first = append(e.first, 0)
				continue
			}
			e.first = append(e.first, p.Units[0].Column)
			for k, u := range p.Units {
				if u.Column != p.Units[0].Column+k {
					panic("envelope: a patterned case's units are not consecutive columns")
				}
			}
		}
	}
	e.flatten()
	if lay != nil {
		e.unitCase = make([]int, len(mo.Cases)-e.nOrig)
		for i := range e.unitCase {
			e.unitCase[i] = -1
		}
		for p, pc := range lay.Patterned {
			for k := range pc.Units {
				if c := e.first[p] + k - e.nOrig; c >= 0 && c < len(e.unitCase) {
					e.unitCase[c] = p
				}
			}
		}
		if slices.Contains(e.unitCase, -1) {
			e.unitCase = nil
		}
		e.distinct = distinctPieces(lay)
		e.piece0 = make([][]int, len(lay.Patterned))
		for p, pc := range lay.Patterned {
			e.piece0[p] = firstPieces(pc.Units)
		}
	}
	return e
}

// distinctPieces reports whether no two units of lay's patterned cases
// name the same first piece.
func distinctPieces(lay *patterns.Layout) bool {
	seen := make(map[int]bool)
	for _, pc := range lay.Patterned {
		for _, u := range pc.Units {
			if len(u.Pieces) == 0 {
				continue
			}
			if seen[u.Pieces[0]] {
				return false
			}
			seen[u.Pieces[0]] = true
		}
	}
	return true
}

// plan forms the groups of joined terms of each combination of e.cs
// (none as written, where every case acts whatever its sign), and which
// patterned cases they use.
func (e *evaluator) plan() {
	e.joined = nil
	if !e.set.AsWritten {
		e.joined = joinPlans(e.cs, e.set.Groups)
	}
	// A patterned case no combination has a term on is read by none:
	// neither its sums (combine) nor its pieces (spans) are asked for.
	e.used = nil
	if e.lay != nil && skipUnused {
		e.used = make([]bool, len(e.lay.Patterned))
		for p, pc := range e.lay.Patterned {
			for _, cb := range e.cs {
				for _, t := range cb.Terms {
					e.used[p] = e.used[p] || t.Case == pc.Case
				}
			}
		}
	}
	// The copies of an evaluator made with other combinations (Compute's
	// deflections, setFactors' parts) have its cases' always and
	// patternOf already.
	if e.always != nil && e.patternOf != nil {
		e.flatten()
	}
}

// skipUnused is whether the patterned cases no combination uses are
// left unscanned; the tests turn it off to compare.
var skipUnused = true

// uses reports whether some combination of e.cs has a term on patterned
// case p (see used).
func (e *evaluator) uses(p int) bool { return e.used == nil || e.used[p] }

// work is one goroutine's scratch space.
type work struct {
	// The current member, filled by evaluate: its stations and the values
	// of every column at each of them (column c at station i is entry
	// c*len(xs)+i of at, defl and line).
	xs    []float64      // station positions
	extra []bool         // whether each was asked for by Settings.Extra
	at    []frame.Forces // forces
	defl  []float64      // deflections relative to the chord
	line  []float64      // deflections across the member's line
	start []frame.Forces // each column's point loads at the member's start
	jump  []float64      // each column's change of M past concentrated moments at each station
	jumps bool           // some column has one at some station
	fac   [][3]float64   // the current member's factors of each original case, nil for none
	// What counts as round-off in the member (see roundOff): for N, V, M,
	// for the deflection and for the deflection across its line.
	noiseAt              [3]float64
	noiseDefl, noiseLine float64

	// The current station, read by station.
	ev    [][3]float64 // effects of every column
	noise [3]float64   // effects of a piece at or below these are round-off

	// The current combination's joined groups (see acting): whether each
	// term acts, and each group's sum.
	act   []bool
	group []float64

	place placement   // how the patterned cases' units are placed, with its scratch
	only  int         // when not 0, exact placement scans effect only−1 alone (endMoments)
	fold  fold        // the current member folded, for exact placement (fold.go)
	lists [6]spanList // pieces being collected: max and min of N, V, M
	// spanCache holds the lists of N and V (the first four) of the last
	// folded station, for the next (spans).
	spanCache [4]spanCache
	// spanBuf is the rest of the chunk the stations' lists are copied
	// into (spans).
	spanBuf []int
	share   float64 // a piece is listed with at least this share of the largest one's effect
	limit   int     // most pieces listed: maxSpans, or unlimited with AllSpans
}

// scratch returns scratch space for one goroutine enveloping with e, with
// its own placement, chosen from the layout's mode.
func (e *evaluator) scratch() *work {
	w := &work{ev: make([][3]float64, e.nOrig), place: newPlacement(e), share: spanShare, limit: maxSpans}
	if e.lay != nil {
		w.ev = make([][3]float64, len(e.lay.Model.Cases))
	}
	if e.set.AllSpans {
		w.share, w.limit = 0, math.MaxInt
	}
	return w
}
