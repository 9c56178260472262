package envelope

import (
	"fmt"

	"govern/combos"
)

// Cases joined explicitly into one alternative of an action (a wall
// pressure and the roof suction of one wind direction entered as two
// cases; see combos.Alternative.Joined) are parts of one load. Where
// variable loads act only where adverse they act as a whole: the terms of
// a group in a combination act all at their factors or none, as the sum of
// their factored effects makes the extreme sought worse or not
// (Settings.Groups). A patterned case's rest follows its group; its pieces
// are still placed one by one, as its pattern mode says. Every other
// variable term acts on its own where adverse (addWhole).

// joinPlan is the joined groups of one combination, formed once per
// Compute: of[i] is the group of term i among the combination's, 0 to
// n-1, or -1 for a term that acts on its own. n is 0 when no two terms of
// the combination are of one group.
type joinPlan struct {
	of []int
	n  int
}

// checkGroups panics unless groups is nil or gives, for every case of
// kinds, its group (-1 for none), with no permanent case in a group.
func checkGroups(groups []int, kinds []combos.Kind) {
	if groups == nil {
		return
	}
	if len(groups) != len(kinds) {
		panic(fmt.Sprintf("envelope: Settings.Groups gives %d groups for %d load cases", len(groups), len(kinds)))
	}
	for c, g := range groups {
		switch {
		case g < -1:
			panic(fmt.Sprintf("envelope: Settings.Groups puts case %d in group %d; groups are numbered from 0, -1 for none", c, g))
		case g >= 0 && kinds[c].Permanent():
			panic(fmt.Sprintf("envelope: Settings.Groups puts case %d, of %s load, in group %d; permanent cases always act and are joined to none", c, kinds[c], g))
		}
	}
}

// joinPlans returns the joinPlan of each combination of cs, or nil when no
// combination has two terms of one group: then every term acts on its
// own, as without groups.
func joinPlans(cs []combos.Combination, groups []int) []joinPlan {
	if groups == nil {
		return nil
	}
	// A term of no case is Compute's to report: it joins nothing here.
	groupOf := func(c int) int {
		if c < 0 || c >= len(groups) {
			return -1
		}
		return groups[c]
	}
	var plans []joinPlan
	for k, cb := range cs {
		count := map[int]int{}
		for _, t := range cb.Terms {
			if g := groupOf(t.Case); g >= 0 {
				count[g]++
			}
		}
		local := map[int]int{}
		for _, t := range cb.Terms {
			if g := groupOf(t.Case); g >= 0 && count[g] > 1 {
				if _, ok := local[g]; !ok {
					local[g] = len(local)
				}
			}
		}
		if len(local) == 0 {
			continue
		}
		if plans == nil {
			plans = make([]joinPlan, len(cs))
		}
		p := joinPlan{of: make([]int, len(cb.Terms)), n: len(local)}
		for i, t := range cb.Terms {
			p.of[i] = -1
			if l, ok := local[groupOf(t.Case)]; ok {
				p.of[i] = l
			}
		}
		plans[k] = p
	}
	return plans
}

// acting returns, for combination k (an index into e.cs), whether the
// whole load of each of its terms (the case, or a patterned case's rest)
// acts for effect j, largest (hi) or smallest; nil when the combination
// has no joined group, whose terms addWhole places one by one. The loops
// over the terms test act themselves, so that a combination without
// joined groups costs one test per term and no call (a helper doing both
// is past the compiler's inlining budget).
func (e *evaluator) acting(w *work, k, j int, hi bool) []bool {
	if e.joined == nil || e.joined[k].n == 0 {
		return nil
	}
	return e.decide(w, k, j, hi)
}

// decide is acting for a combination with joined groups: a joined term
// acts with its group, when the sum of the group's factored effects j
// makes the extreme worse; any other as addWhole would place it.
func (e *evaluator) decide(w *work, k, j int, hi bool) []bool {
	p := &e.joined[k]
	terms := e.cs[k].Terms
	if cap(w.act) < len(terms) {
		w.act = make([]bool, len(terms))
	}
	if cap(w.group) < p.n {
		w.group = make([]float64, p.n)
	}
	act, sum := w.act[:len(terms)], w.group[:p.n]
	clear(sum)
	for i, t := range terms {
		if g := p.of[i]; g >= 0 {
			sum[g] += t.Factor * w.ev[t.Case][j]
		}
	}
	for i, t := range terms {
		a := t.Factor * w.ev[t.Case][j]
		if g := p.of[i]; g >= 0 {
			a = sum[g]
		}
		act[i] = e.always[t.Case] || adverse(a, hi)
	}
	return act
}

// adverse reports whether a factored effect a makes the extreme sought,
// largest (hi) or smallest, worse.
func adverse(a float64, hi bool) bool { return (hi && a > 0) || (!hi && a < 0) }

// add adds to tot the factored effects f·v of a term that acts.
func add(tot, v *[3]float64, f float64) {
	tot[0], tot[1], tot[2] = tot[0]+f*v[0], tot[1]+f*v[1], tot[2]+f*v[2]
}
