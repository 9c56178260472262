package envelope

import (
	"fmt"
	"math"
	"runtime"
	"sync"

	"govern/combos"
	"govern/frame"
	"govern/patterns"
)

// roundOff is the fraction of the largest size of an effect in a member
// (or of a reaction component at a node), over every load case and piece,
// at or below which a pattern piece's effect counts as round-off: such a
// piece is neither loaded for that effect nor listed or counted.
const roundOff = 1e-9

// Compute forms the envelopes of every member and support over the
// combinations cs. sol must be the solution of lay.Model when lay is not
// nil (pattern loading), or of the model itself when lay is nil.
// Combination terms refer to the original cases, which lead the expanded
// model's cases.
//
// Forces and reactions are enveloped over the strength combinations (those
// not marked Service), or over every combination when all are service ones.
// Deflections are enveloped over the service combinations, with the same
// rules for variable cases and pattern pieces, when there are any.
func Compute(sol *frame.Solution, cs []combos.Combination, set Settings, lay *patterns.Layout) (*Envelope, error) {
	if len(cs) == 0 {
		return nil, ErrNoCombinations
	}
	if set.Stations < 2 {
		return nil, fmt.Errorf("envelope: %d stations per member; need at least 2", set.Stations)
	}
	mo := sol.Model()
	if lay != nil && lay.Model != mo {
		panic("envelope: solution is not of the layout's model")
	}
	if err := checkLines(mo, set.Lines); err != nil {
		return nil, err
	}
	if len(set.Extra) > len(mo.Members) {
		return nil, fmt.Errorf("envelope: extra stations for %d members; the model has %d", len(set.Extra), len(mo.Members))
	}
	for m, xs := range set.Extra {
		l := mo.Length(m)
		for _, x := range xs {
			if !(x >= 0 && x <= l) {
				return nil, fmt.Errorf("envelope: member %q: extra station at %g is not on the member (length %g)", mo.Members[m].Name, x, l)
			}
		}
	}
	env := &Envelope{Settings: set, Combinations: cs}
	env.Strength, env.Service = split(cs)
	e := newEvaluator(mo, cs, env.Strength, 3, set, lay)
	for _, cb := range cs {
		for _, t := range cb.Terms {
			if t.Case < 0 || t.Case >= e.nOrig {
				return nil, fmt.Errorf("envelope: combination %q refers to case %d of %d", cb.Name, t.Case, e.nOrig)
			}
		}
	}
	if len(env.Service) > 0 {
		d := *e
		d.cs, d.index, d.nEff = pick(cs, env.Service), env.Service, 1
		d.plan()
		e.defl = &d
	}
	if set.Factors != nil {
		if err := set.Factors.check(mo, e.nOrig); err != nil {
			return nil, err
		}
		e.setFactors(set.Factors, cs)
	}
	if lay != nil {
		env.Pieces = lay.Pieces
	}
	env.Members = make([]Member, len(mo.Members))
	errs := make([]error, len(mo.Members))
	// Members are independent: share them out among the processors.
	var wg sync.WaitGroup
	next := make(chan int, len(mo.Members))
	for m := range mo.Members {
		next <- m
	}
	close(next)
	for range min(runtime.GOMAXPROCS(0), len(mo.Members)) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			w := e.scratch()
			for m := range next {
				env.Members[m], errs[m] = e.member(w, sol, m)
			}
		}()
	}
	wg.Wait()
	for _, err := range errs {
		if err != nil {
			return nil, err
		}
	}
	w := e.scratch()
	var at [][]int // the members meeting at each node, with factors
	if set.Factors != nil {
		at = make([][]int, len(mo.Nodes))
		for m, mem := range mo.Members {
			at[mem.Start] = append(at[mem.Start], m)
			if mem.End != mem.Start {
				at[mem.End] = append(at[mem.End], m)
			}
		}
	}
	for v, nd := range mo.Nodes {
		if !nd.Supported() { // held by nothing: no reactions
			continue
		}
		var here []int
		if at != nil {
			here = at[v]
		}
		r, err := e.reaction(w, sol, v, here)
		if err != nil {
			return nil, err
		}
		env.Reactions = append(env.Reactions, r)
	}
	return env, nil
}

// reaction envelopes the reaction at supported node v, where the members
// at meet (used with factors only).
func (e *evaluator) reaction(w *work, sol *frame.Solution, v int, at []int) (Reaction, error) {
	one := func(p *evaluator) [3]Extreme {
		p.reactionsTo(w, sol, v, at)
		w.noise = [3]float64{}
		for c := range w.ev {
			for j, r := range w.ev[c] {
				w.noise[j] = math.Max(w.noise[j], math.Abs(r))
			}
		}
		for j := range w.noise {
			w.noise[j] *= roundOff
		}
		return p.station(w)
	}
	var x [3]Extreme
	if e.parts == nil {
		x = one(e)
	}
	for k, p := range e.parts {
		y := one(p)
		if k == 0 {
			x = y
			continue
		}
		merge(&x, &y, 3)
	}
	if !allFinite(&x, 3) {
		components := [3]string{"Fx", "Fy", "M"}
		return Reaction{}, e.nonFinite(w, func(q int) string { return fmt.Sprintf("%s at node %q", components[q], e.mo.Nodes[v].Name) })
	}
	return Reaction{Node: v, Fx: x[0], Fy: x[1], M: x[2]}, nil
}
