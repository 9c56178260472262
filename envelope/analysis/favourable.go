package analysis

import (
	"fmt"
	"strings"

	"govern/combos"
	"govern/frame"
	"govern/patterns"
)

// solved is what Run solves and envelopes: the job's model, combinations,
// kinds and patterned cases, or, where a combination takes a permanent case
// with a favourable factor below its factor, those with the case split in
// two (favourableSplit).
type solved struct {
	model        *frame.Model
	combinations []combos.Combination
	kinds        []combos.Kind
	patterned    []int
	original     map[int]int // copy → the job's case it copies
}

// namePieces gives the pieces of a copy the names of the job's case
// ("G/A1-B1", not "G (adverse part)/A1-B1"): the copy is how the case is
// solved, not a case of the job.
func (sv *solved) namePieces(job *Job, lay *patterns.Layout) {
	for i := range lay.Pieces {
		pc := &lay.Pieces[i]
		c, ok := sv.original[pc.Case]
		if !ok {
			continue
		}
		pc.Name = strings.Replace(pc.Name, sv.model.Cases[pc.Case].Name+"/", job.Model.Cases[c].Name+"/", 1)
	}
	for p := range lay.Patterned {
		for u := range lay.Patterned[p].Units {
			un := &lay.Patterned[p].Units[u]
			if c, ok := sv.original[lay.Patterned[p].Case]; ok {
				un.Name = strings.Replace(un.Name, sv.model.Cases[lay.Patterned[p].Case].Name+"/", job.Model.Cases[c].Name+"/", 1)
			}
		}
	}
}

// favourableSplit returns what Run solves for job. A term that takes a
// permanent case c with factor f where its effect is adverse and
// favourable factor g elsewhere (combos.Term.HasFavourable, from a rule's
// favourable_factor; BS 8110-1 clause 3.2.1.2.2's 1.4Gk on the loaded
// spans and 1.0Gk on the others) is split into c at g, acting everywhere,
// and a copy of c at f − g that acts only where its effect is adverse, as
// a variable load does: span by span when c is patterned (the copy is
// patterned in its place and c acts whole), as a whole otherwise. The
// copies follow the model's cases and are named "<case> (adverse part)";
// the job is not changed, and the envelopes keep its combinations' order
// and names.
func favourableSplit(job *Job) solved {
	out := solved{model: job.Model, combinations: job.Combinations, patterned: job.Patterned}
	out.kinds = make([]combos.Kind, len(job.Cases))
	for c, cc := range job.Cases {
		out.kinds[c] = cc.Kind
	}
	nc := len(job.Model.Cases)
	copyOf := map[int]int{} // case → its copy
	var order []int
	for _, cb := range job.Combinations {
		for _, t := range cb.Terms {
			if t.HasFavourable && t.Factor != t.Favourable {
				if _, ok := copyOf[t.Case]; !ok {
					copyOf[t.Case] = nc + len(order)
					order = append(order, t.Case)
				}
			}
		}
	}
	if len(order) == 0 {
		return out
	}
	mo := *job.Model
	mo.Cases = append(make([]frame.Case, 0, nc+len(order)), job.Model.Cases...)
	out.original = map[int]int{}
	for _, c := range order {
		out.original[len(mo.Cases)] = c
		cs := job.Model.Cases[c]
		cs.Name = fmt.Sprintf("%s (adverse part)", cs.Name)
		mo.Cases = append(mo.Cases, cs)
		// The copy acts only where adverse: a permanent kind that does not
		// always act, as a settlement does.
		out.kinds = append(out.kinds, combos.Settlement)
	}
	out.model = &mo
	out.combinations = make([]combos.Combination, len(job.Combinations))
	for k, cb := range job.Combinations {
		terms := make([]combos.Term, 0, len(cb.Terms)+1)
		for _, t := range cb.Terms {
			if !t.HasFavourable || t.Factor == t.Favourable {
				terms = append(terms, combos.Term{Case: t.Case, Factor: t.Factor})
				continue
			}
			terms = append(terms, combos.Term{Case: t.Case, Factor: t.Favourable}, combos.Term{Case: copyOf[t.Case], Factor: t.Factor - t.Favourable})
		}
		cb.Terms = terms
		out.combinations[k] = cb
	}
	out.patterned = make([]int, len(job.Patterned))
	for i, c := range job.Patterned {
		if d, ok := copyOf[c]; ok {
			c = d
		}
		out.patterned[i] = c
	}
	return out
}
