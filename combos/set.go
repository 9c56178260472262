package combos

import (
	"fmt"
	"slices"
	"strings"
)

// Set is a set of combination rules, such as the strength combinations of
// a design standard. [Standard] returns a built-in one; a program may
// build its own (and check it with [Set.Validate]); the govern command
// reads one from a rule file (docs/combinations.md). The comment of each
// field gives its key in that format, which [SetError] names it by.
type Set struct {
	Name  string // name: "asce7-16-strength", or the name a rule file gives itself
	Title string // title: what the set is, with the standard and its clauses
	// Service marks a set of serviceability combinations (EN 1990's
	// characteristic, frequent and quasi-permanent ones): its combinations
	// give deflections, and strength envelopes leave them out. Key service.
	Service bool
	// Allowable marks a set of allowable stress design combinations
	// (ASCE/SEI 7-16 section 2.4); its combinations are marked Allowable.
	// Key allowable.
	Allowable bool
	Rules     []Rule // rule
}

// Rule is one combination expression of a standard, such as ASCE/SEI 7-16
// section 2.3.1 combination 3, "1.2D + 1.6(Lr or S or R) + (L or 0.5W)".
type Rule struct {
	ID    string     // id: short reference that starts the name of every combination it gives, such as "2.3.1-3"
	Text  string     // text: the expression as the standard writes it; for people only
	Terms []RuleTerm // terms
	// Limit is the span/deflection limit of the combinations the rule
	// gives, in a service set (Combination.Limit); 0 for none. Key limit.
	Limit float64
}

// RuleTerm is one term of a rule: the loads of one or more kinds with their
// factors.
type RuleTerm struct {
	// Choices lists the kinds the term may take, each with its factor.
	// With more than one, the term is an alternative, "(Lr or S or R)",
	// and the rule gives one combination for each choice present, unless
	// Together is set. Key kind, with one Choice per kind named; or or,
	// with one Choice per alternative.
	Choices []Choice
	// Lead marks the principal load of the rule: when none of the term's
	// kinds has a case, the rule gives no combination. Key lead.
	Lead bool
	// Together puts every choice present into the same combination, as
	// the accompanying variable actions of EN 1990 are. Key together.
	Together bool
	// EachAction gives one combination for each action of the term's
	// kinds instead of one for each kind: each variable action leading in
	// turn, as EN 1990 section 6.4.3.2 has it. Without it, a term takes
	// every action of a kind (ASCE/SEI 7's L is all the live load). Key
	// each_action.
	EachAction bool
}

// Choice is one kind of load in a term and how its factor is found.
type Choice struct {
	Kind   Kind    // kind
	Factor float64 // factor
	// SDSFactor times the model's S_DS is added to Factor: ASCE/SEI 7's
	// vertical seismic load effect Ev = 0.2 S_DS D taken into the dead
	// load factor. Dead load only. Key sds_factor.
	SDSFactor float64
	// ReducedLive replaces Factor when the model asks for the reduced live
	// load factor (ASCE/SEI 7-16 section 2.3.1 exception 1) and
	// HasReducedLive is set. Live load only. Key reduced_live_factor.
	ReducedLive    float64
	HasReducedLive bool
	// Psi, when set, multiplies the factor by the case's own ψ factor.
	// Key psi.
	Psi Psi
	// Favourable, when HasFavourable is set, is the factor of the load
	// where its effect is favourable: it takes Factor where its effect is
	// adverse and Favourable elsewhere, span by span when its case is
	// patterned (BS 8110-1 clause 3.2.1.2.2: 1.4Gk on the loaded spans
	// and 1.0Gk on the others). Permanent loads only, from 0 to Factor.
	// Only with it may a permanent case be patterned. Key
	// favourable_factor.
	Favourable    float64
	HasFavourable bool
}

// UsesSDS reports whether any rule of the set takes S_DS into a factor.
func (s *Set) UsesSDS() bool {
	return s.any(func(c *Choice) bool { return c.SDSFactor != 0 })
}

// UsesReducedLive reports whether any rule of the set has a reduced live
// load factor.
func (s *Set) UsesReducedLive() bool {
	return s.any(func(c *Choice) bool { return c.HasReducedLive })
}

// UsesFavourable reports whether any rule of the set gives a favourable
// factor.
func (s *Set) UsesFavourable() bool {
	return s.any(func(c *Choice) bool { return c.HasFavourable })
}

// UsesPsi reports whether any rule of the set takes ψ factors from the cases.
func (s *Set) UsesPsi() bool {
	return s.any(func(c *Choice) bool { return c.Psi != NoPsi })
}

func (s *Set) any(f func(c *Choice) bool) bool {
	for i := range s.Rules {
		for j := range s.Rules[i].Terms {
			for k := range s.Rules[i].Terms[j].Choices {
				if f(&s.Rules[i].Terms[j].Choices[k]) {
					return true
				}
			}
		}
	}
	return false
}

// Standards lists the names of the built-in sets, sorted.
func Standards() []string {
	out := make([]string, len(builtinSets))
	for i := range builtinSets {
		out[i] = builtinSets[i].Name
	}
	return out
}

// Standard returns the built-in set named name, such as
// "asce7-16-strength": a copy of its own, which the caller may change. An
// unknown name is an error that lists the known ones.
//
// The built-in sets are Go values (builtin_sets.go) generated from the
// rule files of the sets folder, which are their readable source.
func Standard(name string) (*Set, error) {
	for i := range builtinSets {
		if builtinSets[i].Name == name {
			return builtinSets[i].clone(), nil
		}
	}
	return nil, fmt.Errorf("unknown standard %q; the known ones are %s", name, strings.Join(Standards(), ", "))
}

// clone returns a copy of s that shares nothing with it.
func (s *Set) clone() *Set {
	c := *s
	c.Rules = make([]Rule, len(s.Rules))
	for i, r := range s.Rules {
		r.Terms = slices.Clone(r.Terms)
		for j := range r.Terms {
			r.Terms[j].Choices = slices.Clone(r.Terms[j].Choices)
		}
		c.Rules[i] = r
	}
	return &c
}
