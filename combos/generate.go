package combos

import (
	"fmt"
	"math"
	"slices"
	"sort"
	"strconv"
	"strings"
)

// Params are the values a model gives for the options of a rule set.
type Params struct {
	// SDS is ASCE/SEI 7's design spectral response acceleration parameter
	// at short periods, S_DS, in g. Rules with an sds_factor take
	// sds_factor × S_DS into the dead load factor (Ev = 0.2 S_DS D); 0
	// leaves Ev out.
	SDS float64
	// ReducedLive uses each rule's reduced live load factor where it has
	// one (ASCE/SEI 7-16 section 2.3.1 exception 1: 0.5L where the live
	// load is not over 100 psf and not a garage or place of public
	// assembly).
	ReducedLive bool
}

// MaxCombinations bounds what one set may generate for one model, so that
// a model with many reversible cases cannot exhaust memory.
const MaxCombinations = 20000

// CaseError is a load case that a rule cannot be applied to.
type CaseError struct {
	Case int    // index into the cases
	Key  string // the case's key at fault, such as "with"; "" for its kind
	Msg  string
}

func (e *CaseError) Error() string { return e.Msg }

// CaseErrors is every case problem found, one per case at most.
type CaseErrors []*CaseError

func (es CaseErrors) Error() string {
	s := make([]string, len(es))
	for i, e := range es {
		s[i] = e.Error()
	}
	return strings.Join(s, "\n")
}

// Unwrap returns the individual errors.
func (es CaseErrors) Unwrap() []error {
	out := make([]error, len(es))
	for i, e := range es {
		out[i] = e
	}
	return out
}

// Generate expands the rules of the set against the load cases, through
// their actions and alternatives ([GroupActions]), into factored
// combinations, in rule order:
//
//   - a term takes every action of its kind, each with one of its
//     alternatives: one combination per alternative, every case of the
//     alternative at the term's factor;
//   - a term of several kinds gives one combination for each kind that has
//     cases (an alternative), or with Together one combination with them
//     all, or with EachAction one combination for each action of those
//     kinds (each leading in turn);
//   - kinds with no case drop out of a term, and a term left empty drops
//     out of its rule, except a lead term: then the rule gives nothing;
//   - an action already taken by an earlier term of the combination is not
//     taken again;
//   - a factor of zero (a ψ of zero, say) leaves the case out;
//   - a reversible alternative enters once with its factors and once with
//     them negated, its cases together;
//   - a combination whose factors equal an earlier one's is kept once.
//
// So two alternatives of one action are never in one combination. info,
// when not nil, holds one entry per case. Each combination is named after
// its rule's ID and its factors, such as "2.3.1-3 1.2D+1.6S+0.5W", and its
// Rule is the set's name and the rule's ID. Cases that lack a ψ factor a
// rule needs, or whose action keys are wrong, are returned as
// [CaseErrors]; a set that [Set.Validate] refuses, as its [SetErrors].
func (s *Set) Generate(cases []Case, info []CaseInfo, p Params) ([]Combination, error) {
	if err := s.Validate(); err != nil {
		return nil, err
	}
	if info == nil {
		info = make([]CaseInfo, len(cases))
	}
	if len(info) != len(cases) {
		panic("combos: Generate: info and cases differ in length")
	}
	for _, c := range cases {
		if int(c.Kind) >= len(Kinds()) {
			panic("combos: Generate: case " + c.Name + " has no known kind")
		}
	}
	acts, err := GroupActions(cases, info)
	if err != nil {
		return nil, err
	}
	g := &generator{set: s, cases: cases, info: info, acts: acts, p: p, seen: map[string]bool{}, bad: map[int]bool{}}
	g.byKind = make([][]int, len(Kinds()))
	for i, a := range acts.List {
		g.byKind[a.Kind] = append(g.byKind[a.Kind], i)
	}
	g.altID = make([][]int, len(acts.List))
	for i, a := range acts.List {
		for range a.Alternatives {
			g.altID[i] = append(g.altID[i], g.nAlts)
			g.nAlts++
		}
	}
	taken := make([]bool, len(acts.List))
	for i := range s.Rules {
		g.rule = &s.Rules[i]
		g.expand(0, taken, nil)
		if g.tooMany {
			return nil, fmt.Errorf("%s gives more than %d combinations for these cases; mark fewer cases reversible or give fewer alternatives", s.Name, MaxCombinations)
		}
	}
	if len(g.errs) > 0 {
		sortCaseErrors(g.errs)
		return nil, g.errs
	}
	return g.out, nil
}

type generator struct {
	set    *Set
	cases  []Case
	info   []CaseInfo
	acts   *Actions
	p      Params
	byKind [][]int // actions of each kind
	altID  [][]int // a number for each alternative of each action
	nAlts  int
	rule   *Rule

	out     []Combination
	seen    map[string]bool // factor sets already given
	tried   int             // combinations formed, duplicates included
	errs    CaseErrors
	bad     map[int]bool // cases already reported
	tooMany bool
}

// term is a case with its factor and the alternative it came with.
type term struct {
	Term
	alt  int // the alternative's number (altID)
	rev  bool
	lead bool // from a term of its rule marked lead
}

// pick is an action a term takes, with the choice that gives its factor.
type pick struct {
	action int
	ch     *Choice
}

// expand takes term ti of the current rule given the actions already
// taken and the terms so far.
func (g *generator) expand(ti int, taken []bool, acc []term) {
	if g.tooMany {
		return
	}
	if ti == len(g.rule.Terms) {
		g.emit(acc)
		return
	}
	rt := &g.rule.Terms[ti]
	// The units of the term: the actions that enter a combination
	// together, one unit per combination.
	var units [][]pick
	switch {
	case rt.Together:
		var u []pick
		in := map[int]bool{}
		for i := range rt.Choices {
			ch := &rt.Choices[i]
			for _, a := range g.byKind[ch.Kind] {
				if !taken[a] && !in[a] {
					in[a] = true
					u = append(u, pick{a, ch})
				}
			}
		}
		units = append(units, u)
	case rt.EachAction:
		for i := range rt.Choices {
			ch := &rt.Choices[i]
			for _, a := range g.byKind[ch.Kind] {
				if !taken[a] {
					units = append(units, []pick{{a, ch}})
				}
			}
		}
	default:
		for i := range rt.Choices {
			ch := &rt.Choices[i]
			var u []pick
			for _, a := range g.byKind[ch.Kind] {
				if !taken[a] {
					u = append(u, pick{a, ch})
				}
			}
			units = append(units, u)
		}
	}
	found := false
	base := len(acc)
	for _, u := range units {
		g.unit(u, 0, taken, acc, base, func(taken []bool, acc []term) {
			found = true
			if rt.Lead {
				// acc is the unit's own copy: marking it changes no other.
				for i := base; i < len(acc); i++ {
					acc[i].lead = true
				}
			}
			g.expand(ti+1, taken, acc)
		})
	}
	if !found && !rt.Lead {
		g.expand(ti+1, taken, acc)
	}
}

// unit takes action u[k] and the rest of the unit, each action with each
// of its alternatives in turn, and calls next with every set of terms that
// adds at least one case to acc[:base]. Alternatives whose factors are all
// zero leave the action out; they are tried once.
func (g *generator) unit(u []pick, k int, taken []bool, acc []term, base int, next func([]bool, []term)) {
	if g.tooMany {
		return
	}
	if k == len(u) {
		if len(acc) > base {
			g.tried++
			if g.tried > triesPerCombination*MaxCombinations {
				g.tooMany = true
				return
			}
			next(taken, acc)
		}
		return
	}
	pk := u[k]
	act := &g.acts.List[pk.action]
	absent := false
	for li := range act.Alternatives {
		alt := &act.Alternatives[li]
		var ts []term
		for _, c := range alt.Cases {
			if f := g.factor(pk.ch, c); f != 0 {
				t := term{Term: Term{Case: c, Factor: f}, alt: g.altID[pk.action][li], rev: alt.Reversible}
				if pk.ch.HasFavourable {
					t.Favourable, t.HasFavourable = round12(pk.ch.Favourable), true
				}
				ts = append(ts, t)
			}
		}
		if len(ts) == 0 {
			absent = true
			continue
		}
		tk := append([]bool(nil), taken...)
		tk[pk.action] = true
		g.unit(u, k+1, tk, append(append([]term(nil), acc...), ts...), base, next)
	}
	if absent {
		g.unit(u, k+1, taken, acc, base, next)
	}
}

// triesPerCombination bounds the work of one set: combinations formed,
// duplicates, sign patterns and partial ones included, per combination
// allowed.
const triesPerCombination = 8

// factor returns the factor of case c under choice ch, rounded to 12
// significant digits so that 1.5 × 0.7 is 1.05; 0 when the case lacks a ψ
// the choice needs, which is recorded as an error.
func (g *generator) factor(ch *Choice, c int) float64 {
	f := ch.Factor
	if ch.HasReducedLive && g.p.ReducedLive {
		f = ch.ReducedLive
	}
	f += ch.SDSFactor * g.p.SDS
	if ch.Psi != NoPsi {
		psi, ok := g.info[c].PsiFactor(ch.Psi, g.cases[c].Kind)
		if !ok {
			g.needPsi(ch.Psi, c)
			return 0
		}
		f *= psi
	}
	return round12(f)
}

func round12(f float64) float64 {
	if f == 0 || math.IsNaN(f) || math.IsInf(f, 0) {
		return f
	}
	r, _ := strconv.ParseFloat(strconv.FormatFloat(f, 'g', 12, 64), 64)
	return r
}

func (g *generator) needPsi(p Psi, c int) {
	if g.bad[c] {
		return
	}
	g.bad[c] = true
	k := g.cases[c].Kind
	var rows []string
	for _, cat := range categories {
		if cat.Fits(k) {
			rows = append(rows, fmt.Sprintf("%q", cat.Name))
		}
	}
	how := fmt.Sprintf("give psi0, psi1 and psi2 (EN 1990 Table A1.1 has no row for %s load)", k)
	if len(rows) > 0 {
		how = fmt.Sprintf("give category (%s, EN 1990 Table A1.1) or psi0, psi1 and psi2", strings.Join(rows, ", "))
	}
	g.errs = append(g.errs, &CaseError{Case: c, Msg: fmt.Sprintf("%s rule %s needs %s of this %s case: %s", g.set.Name, g.rule.ID, p, k, how)})
}

// emit adds the combination of terms, once for each sign of its
// reversible alternatives (the cases of one alternative change sign
// together), skipping factor sets already given.
func (g *generator) emit(terms []term) {
	if len(terms) == 0 {
		return
	}
	var revAlts []int // reversible alternatives, in order of first term
	for _, t := range terms {
		if t.rev && !slices.Contains(revAlts, t.alt) {
			revAlts = append(revAlts, t.alt)
		}
	}
	if len(revAlts) > 30 {
		g.tooMany = true
		return
	}
	for signs := 0; signs < 1<<len(revAlts); signs++ {
		g.tried++
		if g.tried > triesPerCombination*MaxCombinations {
			g.tooMany = true
			return
		}
		ts := make([]Term, len(terms))
		var lead []int
		for i, t := range terms {
			ts[i] = t.Term
			if t.lead && !slices.Contains(lead, t.Case) {
				lead = append(lead, t.Case)
			}
			if !t.rev {
				continue
			}
			// the highest bit flips the first reversible alternative, so
			// that all + comes first and each alternative's + before its -
			j := slices.Index(revAlts, t.alt)
			if signs&(1<<(len(revAlts)-1-j)) != 0 {
				ts[i].Factor = -ts[i].Factor
			}
		}
		key := factorKey(ts)
		if g.seen[key] {
			continue
		}
		g.seen[key] = true
		if len(g.out) == MaxCombinations {
			g.tooMany = true
			return
		}
		g.out = append(g.out, Combination{
			Name:      g.rule.ID + " " + Compact(ts, g.cases),
			Rule:      g.set.Name + " " + g.rule.ID,
			Terms:     ts,
			Service:   g.set.Service,
			Allowable: g.set.Allowable,
			Lead:      lead,
			Limit:     g.rule.Limit,
		})
	}
}

// factorKey identifies a factor set whatever the order of its terms.
func factorKey(ts []Term) string {
	s := make([]string, len(ts))
	for i, t := range ts {
		s[i] = strconv.Itoa(t.Case) + ":" + strconv.FormatFloat(t.Factor, 'g', -1, 64)
		if t.HasFavourable {
			s[i] += "/" + strconv.FormatFloat(t.Favourable, 'g', -1, 64)
		}
	}
	sort.Strings(s)
	return strings.Join(s, " ")
}

// FormatFactor writes a load factor as combination names show it: the
// shortest decimal with at least one digit after the point, such as "1.0",
// "1.35" or "-0.5".
func FormatFactor(f float64) string {
	s := strconv.FormatFloat(f, 'f', -1, 64)
	if !strings.ContainsAny(s, ".eEnN") {
		s += ".0"
	}
	return s
}

// Compact writes terms as factors and case names without spaces, such as
// "1.2D+1.6S-0.5W"; a term with a favourable factor other than its factor
// shows both, such as "1.4/1.0G" (1.4 where adverse, 1.0 where favourable).
func Compact(terms []Term, cases []Case) string {
	var b strings.Builder
	for i, t := range terms {
		f := t.Factor
		switch {
		case f < 0:
			b.WriteString("-")
			f = -f
		case i > 0:
			b.WriteString("+")
		}
		b.WriteString(FormatFactor(f))
		if t.HasFavourable && t.Favourable != t.Factor {
			// The factor where the case's effect is favourable.
			b.WriteString("/" + FormatFactor(t.Favourable))
		}
		b.WriteString(cases[t.Case].Name)
	}
	return b.String()
}
