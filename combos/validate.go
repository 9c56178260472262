package combos

import (
	"fmt"
	"math"
	"strings"
)

// SetError is a problem of a [Set]: the rule, term and choice at fault and
// what is wrong.
type SetError struct {
	Rule   int // index into the set's Rules; -1 for the set as a whole
	Term   int // index into the rule's Terms; -1 for the rule as a whole
	Choice int // index into the term's Choices; -1 for the term as a whole
	// Key names the part at fault as the rule file format does
	// (docs/combinations.md): "name", "rule", "id", "terms", "kind",
	// "factor", "each_action", "psi", "sds_factor" or
	// "reduced_live_factor".
	Key string
	Msg string // what is wrong, starting with Key

	where string // the rule and term, as Error names them
}

func (e *SetError) Error() string { return e.where + e.Msg }

// SetErrors is every problem [Set.Validate] found, in rule and term order.
type SetErrors []*SetError

func (es SetErrors) Error() string {
	s := make([]string, len(es))
	for i, e := range es {
		s[i] = e.Error()
	}
	return strings.Join(s, "\n")
}

// Unwrap returns the individual errors.
func (es SetErrors) Unwrap() []error {
	out := make([]error, len(es))
	for i, e := range es {
		out[i] = e
	}
	return out
}

// Validate checks a set built in code, or read from a rule file, before it
// is used: it has a name and rules; each rule an id and terms; each term at
// least one kind, and each_action not with together; each choice a known
// kind and finite factors, the S_DS factor on dead load only, the reduced
// live load factor on live load only and a ψ factor on variable loads
// only; a limit only in a service set, positive. It returns every problem found as [SetErrors], or nil.
// [Set.Generate] validates the set first.
func (s *Set) Validate() error {
	v := &validator{}
	if s.Name == "" {
		v.add(-1, -1, -1, "", "name", "name is empty: the rule column of every combination starts with the set's name")
	}
	if len(s.Rules) == 0 {
		v.add(-1, -1, -1, "", "rule", "the set has no rules: give at least one rule")
	}
	for i := range s.Rules {
		r := &s.Rules[i]
		name := fmt.Sprintf("rule %d", i+1)
		if r.ID != "" {
			name = fmt.Sprintf("rule %q", r.ID)
		} else {
			v.add(i, -1, -1, name+": ", "id", "id is required: it starts the name of every combination the rule gives")
		}
		if len(r.Terms) == 0 {
			v.add(i, -1, -1, name+": ", "terms", "terms is empty: a rule needs at least one term")
		}
		switch {
		case r.Limit != 0 && !s.Service:
			v.add(i, -1, -1, name+": ", "limit", "limit = %g: only a service set's combinations have a deflection limit; give the set service = true", r.Limit)
		case math.IsNaN(r.Limit) || math.IsInf(r.Limit, 0) || r.Limit < 0:
			v.add(i, -1, -1, name+": ", "limit", "limit = %v: span/deflection must be a positive number, such as 360 for span/360", r.Limit)
		}
		for j := range r.Terms {
			v.term(i, j, &r.Terms[j], fmt.Sprintf("%s, term %d: ", name, j+1))
		}
	}
	if len(v.errs) == 0 {
		return nil
	}
	return v.errs
}

type validator struct {
	errs SetErrors
}

func (v *validator) add(rule, term, choice int, where, key, format string, args ...any) {
	v.errs = append(v.errs, &SetError{Rule: rule, Term: term, Choice: choice, Key: key, Msg: fmt.Sprintf(format, args...), where: where})
}

func (v *validator) term(i, j int, t *RuleTerm, where string) {
	if len(t.Choices) == 0 {
		v.add(i, j, -1, where, "kind", "kind is empty: a term needs at least one load kind")
	}
	if t.EachAction && t.Together {
		v.add(i, j, -1, where, "each_action", "each_action cannot be used with together: together puts every action in one combination, each_action gives one combination for each")
	}
	for k := range t.Choices {
		c := &t.Choices[k]
		if int(c.Kind) >= len(kindNames) {
			v.add(i, j, k, where, "kind", "kind %s is not a load kind; the kinds are %s", c.Kind, kindList())
			continue
		}
		finite := func(key string, f float64) bool {
			if math.IsNaN(f) || math.IsInf(f, 0) {
				v.add(i, j, k, where, key, "%s must be a finite number, not %v", key, f)
				return false
			}
			return true
		}
		finite("factor", c.Factor)
		if finite("sds_factor", c.SDSFactor) && c.SDSFactor != 0 && c.Kind != Dead {
			v.add(i, j, k, where, "sds_factor", "sds_factor applies to dead load only (Ev = 0.2 S_DS D), not to %s", c.Kind)
		}
		if c.HasReducedLive && finite("reduced_live_factor", c.ReducedLive) && c.Kind != Live {
			v.add(i, j, k, where, "reduced_live_factor", "reduced_live_factor applies to live load only (ASCE/SEI 7-16 section 2.3.1 exception 1), not to %s", c.Kind)
		}
		if c.HasFavourable && finite("favourable_factor", c.Favourable) {
			switch {
			case !c.Kind.Permanent():
				v.add(i, j, k, where, "favourable_factor", "favourable_factor applies to permanent loads only, not to %s: a variable load is left out where favourable", c.Kind)
			case c.Favourable < 0 || c.Favourable > c.Factor:
				v.add(i, j, k, where, "favourable_factor", "favourable_factor = %g must be from 0 to the factor, %g", c.Favourable, c.Factor)
			}
		}
		switch {
		case int(c.Psi) >= len(psiNames):
			v.add(i, j, k, where, "psi", "psi %s is not one of psi0, psi1, psi2", c.Psi)
		case c.Psi != NoPsi && c.Kind.Permanent():
			v.add(i, j, k, where, "psi", "psi applies to variable loads; %s load has no ψ factors", c.Kind)
		}
	}
}

// kindList is how messages list the load kinds.
func kindList() string {
	s := make([]string, len(kindNames))
	for i, n := range kindNames {
		s[i] = fmt.Sprintf("%q", n)
	}
	return strings.Join(s, ", ")
}
