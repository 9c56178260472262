package modelfile

import (
	"errors"
	"fmt"
	"path"
	"strings"

	"govern/combos"
)

// MaxRuleFileSize is the largest rule file read, in bytes.
const MaxRuleFileSize = 1 << 20

// The keys of each table of a rule file (docs/combinations.md).
var (
	setKeys    = []string{"name", "title", "service", "allowable", "rule"}
	ruleKeys   = []string{"id", "text", "terms", "limit"}
	termKeys   = []string{"kind", "factor", "lead", "together", "each_action", "psi", "sds_factor", "reduced_live_factor", "favourable_factor", "or"}
	choiceKeys = []string{"kind", "factor", "psi", "sds_factor", "reduced_live_factor", "favourable_factor"}
)

// ReadSet reads a combination rule file, in the format of
// docs/combinations.md, into a rule set. name is the file's name in
// messages; a file without a name key names the set after it (without
// its folder and ".toml"). The set is checked with [combos.Set.Validate]
// as well, each problem at its key's line. All problems found are
// returned together as an [ErrorList], as [Read] returns them.
func ReadSet(name string, src []byte) (*combos.Set, error) {
	if len(src) > MaxRuleFileSize {
		var l ErrorList
		l.Add(Pos{File: name}, "", ErrTooLarge, fmt.Sprintf("the file is %d bytes; the limit for a rule file is %d (%d MiB)", len(src), MaxRuleFileSize, MaxRuleFileSize>>20))
		return nil, l
	}
	d, raw, err := decode(name, src)
	if err != nil {
		return nil, err
	}
	d.failed = map[*table][]string{}
	sr := &setReader{doc: d}
	s := sr.set(raw)
	sr.validate(s)
	if err := d.finish(); err != nil {
		return nil, err
	}
	return s, nil
}

// setReader reads a rule file, and records the table each part of the
// set came from, to place the problems that Validate finds.
type setReader struct {
	*doc
	top   *table
	rules []ruleTables
}

type ruleTables struct {
	t     *table
	terms []termTables
}

type termTables struct {
	t       *table
	choices []*table // the table of each choice: the term's, or its alternative's
	failed  bool     // a problem was found in the term
}

func (sr *setReader) set(raw map[string]any) *combos.Set {
	top := sr.table(raw, "", "")
	sr.top = top
	top.known(setKeys...)
	s := &combos.Set{Name: top.str("name", ""), Title: top.str("title", ""), Service: top.boolean("service", false), Allowable: top.boolean("allowable", false)}
	if s.Service && s.Allowable {
		top.fail("allowable", problem(ErrValue, "allowable = true with service = true: a set is for strength, allowable stress or service, one of them"))
	}
	if s.Name == "" {
		s.Name = strings.TrimSuffix(path.Base(strings.ReplaceAll(sr.file, "\\", "/")), ".toml")
	}
	empty := isEmptyArray(raw["rule"])
	rules := top.array("rule", func(i int, m map[string]any) string {
		if id, ok := m["id"].(string); ok && id != "" {
			return fmt.Sprintf("rule %q", id)
		}
		return fmt.Sprintf("rule %d", i+1)
	})
	if !top.has("rule") || empty {
		top.fail("rule", problem(ErrMissing, "the file has no rules: give at least one [[rule]] table"))
	}
	top.done()
	for _, t := range rules {
		s.Rules = append(s.Rules, sr.rule(t))
	}
	return s
}

func (sr *setReader) rule(t *table) combos.Rule {
	t.known(ruleKeys...)
	r := combos.Rule{ID: t.str("id", ""), Text: t.str("text", ""), Limit: t.num("limit", 0)}
	terms := t.array("terms", func(j int, _ map[string]any) string { return fmt.Sprintf("%s, term %d", t.where, j+1) })
	if !t.has("terms") {
		t.fail("terms", problem(ErrMissing, "terms is required: the loads of the rule with their factors"))
	} // an empty array is left to Validate
	t.done()
	rt := ruleTables{t: t}
	for _, tt := range terms {
		n := len(sr.errs) + sr.more
		term, tabs := sr.term(tt)
		tabs.failed = len(sr.errs)+sr.more > n
		r.Terms = append(r.Terms, term)
		rt.terms = append(rt.terms, tabs)
	}
	sr.rules = append(sr.rules, rt)
	return r
}

func (sr *setReader) term(t *table) (combos.RuleTerm, termTables) {
	t.known(termKeys...)
	rt := combos.RuleTerm{Lead: t.boolean("lead", false), Together: t.boolean("together", false), EachAction: t.boolean("each_action", false)}
	tabs := termTables{t: t}
	if !t.has("or") {
		kinds := sr.kinds(t, true)
		c := sr.choice(t)
		for _, k := range kinds {
			c.Kind = k
			rt.Choices = append(rt.Choices, c)
			tabs.choices = append(tabs.choices, t)
		}
		t.done()
		return rt, tabs
	}
	if rt.EachAction {
		t.fail("each_action", problem(ErrValue, "each_action cannot be used with or: give the kinds as one term's kind instead"))
	}
	for _, k := range choiceKeys {
		if t.has(k) {
			t.fail(k, problem(ErrValue, "%s cannot stand beside or: give it inside each alternative", k))
		}
	}
	if rt.Together {
		t.fail("together", problem(ErrValue, "together cannot be used with or: the alternatives of or never act together"))
	}
	empty := isEmptyArray(t.m["or"])
	alts := t.array("or", func(i int, _ map[string]any) string { return fmt.Sprintf("%s, alternative %d", t.where, i+1) })
	if empty {
		t.fail("or", problem(ErrValue, "or is empty: list the alternatives"))
	}
	t.done()
	for _, at := range alts {
		at.known(choiceKeys...)
		kinds := sr.kinds(at, false)
		c := sr.choice(at)
		at.done()
		if len(kinds) == 1 {
			c.Kind = kinds[0]
			rt.Choices = append(rt.Choices, c)
			tabs.choices = append(tabs.choices, at)
		}
	}
	return rt, tabs
}

// kinds reads the kind key: a kind's name, or with many an array of them.
func (sr *setReader) kinds(t *table, many bool) []combos.Kind {
	if !t.has("kind") {
		t.fail("kind", problem(ErrMissing, "kind is required: the load kind the factor applies to (%s)", quoteList(kindWords)))
		return nil
	}
	var names []string
	if many {
		names = t.strs("kind")
		if names == nil {
			return nil // its type is reported
		}
	} else {
		v, _ := t.get("kind")
		s, ok := v.(string)
		if !ok {
			t.fail("kind", problem(ErrType, "kind must be one kind in an alternative of or, not %s", typeName(v)))
			return nil
		}
		names = []string{s}
	}
	if len(names) == 0 {
		t.fail("kind", problem(ErrValue, "kind is empty: name at least one load kind"))
		return nil
	}
	var out []combos.Kind
	for _, n := range names {
		if !t.oneOf("kind", n, kindWords...) {
			return nil
		}
		k, _ := combos.ParseKind(n)
		out = append(out, k)
	}
	return out
}

// choice reads the factor keys of a term or an alternative.
func (sr *setReader) choice(t *table) combos.Choice {
	var c combos.Choice
	if t.need("factor") {
		c.Factor = t.num("factor", 0)
	}
	c.SDSFactor = t.num("sds_factor", 0)
	c.ReducedLive, c.HasReducedLive = t.numOK("reduced_live_factor", 0)
	c.Favourable, c.HasFavourable = t.numOK("favourable_factor", 0) // a factor, no unit
	if t.has("psi") {
		s := t.str("psi", "")
		if _, isStr := t.m["psi"].(string); isStr && t.oneOf("psi", s, "psi0", "psi1", "psi2") {
			c.Psi = map[string]combos.Psi{"psi0": combos.Psi0, "psi1": combos.Psi1, "psi2": combos.Psi2}[s]
		}
	}
	return c
}

// validate reports the problems combos.Set.Validate finds in the set, at
// the key of the table each came from, unless that table has already
// reported a problem at that key (a value of the wrong type, read as its
// default, say).
func (sr *setReader) validate(s *combos.Set) {
	var es combos.SetErrors
	if !errors.As(s.Validate(), &es) {
		return
	}
	for _, e := range es {
		t := sr.top
		if e.Rule >= 0 {
			rt := &sr.rules[e.Rule]
			t = rt.t
			if e.Term >= 0 {
				tt := &rt.terms[e.Term]
				t = tt.t
				if e.Choice >= 0 {
					t = tt.choices[e.Choice]
				} else if e.Key == "kind" && tt.failed {
					continue // a term left without kinds by the problems reported in it
				}
			}
		}
		if t.failedAt(e.Key) {
			continue
		}
		kind := ErrValue
		if !t.has(e.Key) {
			kind = ErrMissing
		}
		t.fail(e.Key, problem(kind, "%s", e.Msg))
	}
}

func isEmptyArray(v any) bool {
	switch x := v.(type) {
	case []any:
		return len(x) == 0
	case []map[string]any:
		return len(x) == 0
	}
	return false
}
