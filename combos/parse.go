package combos

import (
	"errors"
	"fmt"
	"math"
	"path"
	"sort"
	"strings"

	"github.com/BurntSushi/toml"
)

// SetError is a problem in a rule file.
type SetError struct {
	File   string
	Line   int    // 1-based; 0 when unknown
	Where  string // the rule and term at fault, such as `rule "2.3.1-3", term 2`
	Msg    string
	Syntax bool // the file is not valid TOML
}

func (e *SetError) Error() string {
	var b strings.Builder
	b.WriteString(e.File)
	if e.Line > 0 {
		fmt.Fprintf(&b, ":%d", e.Line)
	}
	b.WriteString(": ")
	if e.Where != "" {
		b.WriteString(e.Where + ": ")
	}
	b.WriteString(e.Msg)
	return b.String()
}

// SetErrors is every problem found in one rule file, in file order.
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

// ParseSet reads a rule set in the format of docs/combinations.md. file
// names the source in messages; without a name key the set is named after
// file. All problems found are returned together as [SetErrors].
func ParseSet(file string, src []byte) (*Set, error) {
	var raw map[string]any
	if _, err := toml.Decode(string(src), &raw); err != nil {
		e := &SetError{File: file, Msg: err.Error(), Syntax: true}
		var pe toml.ParseError
		if errors.As(err, &pe) {
			e.Line, e.Msg = pe.Position.Line, pe.Message
		}
		return nil, SetErrors{e}
	}
	p := &parser{file: file, lines: locate(string(src))}
	s := p.set(raw)
	if len(p.errs) > 0 {
		sort.SliceStable(p.errs, func(i, j int) bool { return p.errs[i].Line < p.errs[j].Line })
		return nil, p.errs
	}
	return s, nil
}

type parser struct {
	file  string
	lines *lines
	errs  SetErrors
}

// ruleTable is one TOML table of a rule file being read.
type ruleTable struct {
	p     *parser
	m     map[string]any
	line  int
	keys  map[string]int // key → line, where known
	where string
	used  map[string]bool
}

func (p *parser) table(m map[string]any, line int, keys map[string]int, where string) *ruleTable {
	return &ruleTable{p: p, m: m, line: line, keys: keys, where: where, used: map[string]bool{}}
}

func (t *ruleTable) fail(key, format string, args ...any) {
	line := t.line
	if n, ok := t.keys[key]; ok {
		line = n
	}
	t.p.errs = append(t.p.errs, &SetError{File: t.p.file, Line: line, Where: t.where, Msg: fmt.Sprintf(format, args...)})
}

func (t *ruleTable) get(key string) (any, bool) {
	t.used[key] = true
	v, ok := t.m[key]
	return v, ok
}

func (t *ruleTable) has(key string) bool {
	_, ok := t.m[key]
	return ok
}

func tomlType(v any) string {
	switch v.(type) {
	case string:
		return "a string"
	case int64:
		return "an integer"
	case float64:
		return "a number"
	case bool:
		return "a boolean"
	case []any, []map[string]any:
		return "an array"
	case map[string]any:
		return "a table"
	}
	return fmt.Sprintf("a %T", v)
}

func (t *ruleTable) str(key string) string {
	v, ok := t.get(key)
	if !ok {
		return ""
	}
	s, ok := v.(string)
	if !ok {
		t.fail(key, "%s must be a string, not %s", key, tomlType(v))
	}
	return s
}

func (t *ruleTable) boolean(key string) bool {
	v, ok := t.get(key)
	if !ok {
		return false
	}
	b, ok := v.(bool)
	if !ok {
		t.fail(key, "%s must be true or false, not %s", key, tomlType(v))
	}
	return b
}

// num reads a finite number; ok is false when absent or wrong.
func (t *ruleTable) num(key string) (f float64, ok bool) {
	v, present := t.get(key)
	if !present {
		return 0, false
	}
	switch x := v.(type) {
	case int64:
		f = float64(x)
	case float64:
		f = x
	default:
		t.fail(key, "%s must be a number, not %s", key, tomlType(v))
		return 0, false
	}
	if math.IsNaN(f) || math.IsInf(f, 0) {
		t.fail(key, "%s must be a finite number, not %v", key, f)
		return 0, false
	}
	return f, true
}

// tables reads an array of tables.
func (t *ruleTable) tables(key string) []map[string]any {
	v, ok := t.get(key)
	if !ok {
		return nil
	}
	switch x := v.(type) {
	case []map[string]any:
		return x
	case []any:
		out := make([]map[string]any, 0, len(x))
		for _, e := range x {
			m, ok := e.(map[string]any)
			if !ok {
				t.fail(key, "%s must be an array of tables, not an array of %s", key, strings.TrimPrefix(strings.TrimPrefix(tomlType(e), "a "), "an "))
				return nil
			}
			out = append(out, m)
		}
		return out
	}
	t.fail(key, "%s must be an array of tables, not %s", key, tomlType(v))
	return nil
}

// Keys of each table of the format, as messages list them.
var (
	topKeys  = []string{"name", "title", "service", "rule"}
	ruleKeys = []string{"id", "text", "terms"}
	termKeys = []string{"kind", "factor", "lead", "together", "each_action", "psi", "sds_factor", "reduced_live_factor", "or"}
	altKeys  = []string{"kind", "factor", "psi", "sds_factor", "reduced_live_factor"}
)

// done reports every key of the table that was not read; known lists the
// keys the format allows there.
func (t *ruleTable) done(known []string) {
	var unknown []string
	for k := range t.m {
		if !t.used[k] {
			unknown = append(unknown, k)
		}
	}
	sort.Strings(unknown)
	for _, k := range unknown {
		t.fail(k, "unknown key %q; the keys here are %s", k, strings.Join(known, ", "))
	}
}

func (p *parser) set(raw map[string]any) *Set {
	top := p.table(raw, 0, p.lines.top, "")
	s := &Set{Name: top.str("name"), Title: top.str("title"), Service: top.boolean("service")}
	if s.Name == "" {
		s.Name = strings.TrimSuffix(path.Base(strings.ReplaceAll(p.file, "\\", "/")), ".toml")
	}
	rules := top.tables("rule")
	if !top.has("rule") || isEmptyArray(raw["rule"]) {
		top.fail("rule", "the file has no rules: give at least one [[rule]] table")
	}
	top.done(topKeys)
	for i, m := range rules {
		rl := p.lines.rule(i)
		where := fmt.Sprintf("rule %d", i+1)
		if id, ok := m["id"].(string); ok && id != "" {
			where = fmt.Sprintf("rule %q", id)
		}
		t := p.table(m, rl.header, rl.keys, where)
		r := Rule{ID: t.str("id"), Text: t.str("text")}
		if _, isStr := m["id"].(string); r.ID == "" && (isStr || !t.has("id")) {
			t.fail("id", "id is required: it starts the name of every combination the rule gives")
		}
		terms := t.tables("terms")
		if !t.has("terms") {
			t.fail("", "terms is required: the loads of the rule with their factors")
		} else if isEmptyArray(m["terms"]) {
			t.fail("terms", "terms is empty: a rule needs at least one term")
		}
		t.done(ruleKeys)
		for j, tm := range terms {
			line, keys := rl.term(j)
			tt := p.table(tm, line, keys, fmt.Sprintf("%s, term %d", where, j+1))
			r.Terms = append(r.Terms, p.term(tt))
		}
		s.Rules = append(s.Rules, r)
	}
	return s
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

// kindList is how messages list the load kinds.
func kindList() string {
	var s []string
	for _, k := range Kinds() {
		s = append(s, fmt.Sprintf("%q", k.String()))
	}
	return strings.Join(s, ", ")
}

func (p *parser) term(t *ruleTable) RuleTerm {
	rt := RuleTerm{Lead: t.boolean("lead"), Together: t.boolean("together"), EachAction: t.boolean("each_action")}
	if rt.EachAction && rt.Together {
		t.fail("each_action", "each_action cannot be used with together: together puts every action in one combination, each_action gives one combination for each")
	}
	if t.has("or") {
		if rt.EachAction {
			t.fail("each_action", "each_action cannot be used with or: give the kinds as one term's kind instead")
		}
		for _, k := range []string{"kind", "factor", "sds_factor", "reduced_live_factor", "psi"} {
			if t.has(k) {
				t.get(k)
				t.fail(k, "%s cannot stand beside or: give it inside each alternative", k)
			}
		}
		if rt.Together {
			t.fail("together", "together cannot be used with or: the alternatives of or never act together")
		}
		alts := t.tables("or")
		if isEmptyArray(t.m["or"]) {
			t.fail("or", "or is empty: list the alternatives")
		}
		for i, m := range alts {
			line := t.line
			if n, ok := t.keys["or"]; ok {
				line = n
			}
			at := p.table(m, line, nil, fmt.Sprintf("%s, alternative %d", t.where, i+1))
			kinds := p.kinds(at, false)
			c := p.choice(at, kinds)
			at.done(altKeys)
			if len(kinds) == 1 {
				c.Kind = kinds[0]
				rt.Choices = append(rt.Choices, c)
			}
		}
		t.done(termKeys)
		return rt
	}
	kinds := p.kinds(t, true)
	c := p.choice(t, kinds)
	t.done(termKeys)
	for _, k := range kinds {
		c.Kind = k
		rt.Choices = append(rt.Choices, c)
	}
	return rt
}

// kinds reads the kind key: a kind name, or with many an array of them.
func (p *parser) kinds(t *ruleTable, many bool) []Kind {
	v, ok := t.get("kind")
	if !ok {
		t.fail("kind", "kind is required: the load kind the factor applies to (%s)", kindList())
		return nil
	}
	var names []string
	switch x := v.(type) {
	case string:
		names = []string{x}
	case []any:
		if !many {
			t.fail("kind", "kind must be one kind in an alternative of or")
			return nil
		}
		for _, e := range x {
			s, ok := e.(string)
			if !ok {
				t.fail("kind", "kind must be a kind name or an array of them, not an array holding %s", tomlType(e))
				return nil
			}
			names = append(names, s)
		}
		if len(names) == 0 {
			t.fail("kind", "kind is empty: name at least one load kind")
			return nil
		}
	default:
		t.fail("kind", "kind must be a kind name or an array of them, not %s", tomlType(v))
		return nil
	}
	var out []Kind
	bad := false
	for _, n := range names {
		k, ok := ParseKind(n)
		if !ok {
			t.fail("kind", "kind %q is not a load kind; the kinds are %s", n, kindList())
			bad = true
			continue
		}
		out = append(out, k)
	}
	if bad {
		return nil
	}
	return out
}

// choice reads the factor keys of a term or an alternative; kinds are the
// kinds they apply to, for checks.
func (p *parser) choice(t *ruleTable, kinds []Kind) Choice {
	var c Choice
	c.Factor, _ = t.num("factor")
	if !t.has("factor") {
		t.fail("factor", "factor is required")
	}
	only := func(key string, k Kind, why string) {
		for _, kk := range kinds {
			if kk != k {
				t.fail(key, "%s applies to %s load only (%s), not to %s", key, k, why, kk)
				return
			}
		}
	}
	if v, ok := t.num("sds_factor"); ok {
		c.SDSFactor = v
		only("sds_factor", Dead, "Ev = 0.2 S_DS D")
	}
	if v, ok := t.num("reduced_live_factor"); ok {
		c.ReducedLive, c.HasReducedLive = v, true
		only("reduced_live_factor", Live, "ASCE/SEI 7-16 section 2.3.1 exception 1")
	}
	if t.has("psi") {
		s := t.str("psi")
		switch s {
		case "psi0":
			c.Psi = Psi0
		case "psi1":
			c.Psi = Psi1
		case "psi2":
			c.Psi = Psi2
		default:
			if _, isStr := t.m["psi"].(string); isStr {
				t.fail("psi", `psi = %q: must be "psi0", "psi1" or "psi2"`, s)
			}
		}
		if c.Psi != NoPsi {
			for _, k := range kinds {
				if k.Permanent() {
					t.fail("psi", "psi applies to variable loads; %s load has no ψ factors", k)
					break
				}
			}
		}
	}
	return c
}

// lines records where the tables and keys of a rule file are. The parser
// has already checked the syntax, so a scan of brackets outside strings and
// comments is enough.
type lines struct {
	top   map[string]int
	rules []ruleLines
}

type ruleLines struct {
	header   int
	keys     map[string]int
	terms    []int
	termKeys []map[string]int // keys of terms written as [[rule.terms]]
}

func (l *lines) rule(i int) ruleLines {
	if i < len(l.rules) {
		return l.rules[i]
	}
	return ruleLines{}
}

func (r ruleLines) term(j int) (int, map[string]int) {
	if j < len(r.terms) {
		var keys map[string]int
		if j < len(r.termKeys) {
			keys = r.termKeys[j]
		}
		return r.terms[j], keys
	}
	return r.header, nil
}

func locate(src string) *lines {
	l := &lines{top: map[string]int{}}
	const (
		atTop = iota
		inRule
		inTerm
		elsewhere
	)
	section := atTop
	depth := 0          // open [ and { of a value
	collecting := false // inside the value of a rule's terms key
	var quote byte      // the open string's quote, 0 outside strings
	for n, line := range strings.Split(src, "\n") {
		ln := n + 1
		rest := line
		if depth == 0 && quote == 0 {
			t := strings.TrimSpace(line)
			switch {
			case t == "" || t[0] == '#':
				continue
			case strings.HasPrefix(t, "[["):
				name := strings.TrimSpace(strings.SplitN(t[2:], "]]", 2)[0])
				switch {
				case name == "rule":
					l.rules = append(l.rules, ruleLines{header: ln, keys: map[string]int{}})
					section = inRule
				case name == "rule.terms" && len(l.rules) > 0:
					r := &l.rules[len(l.rules)-1]
					r.terms = append(r.terms, ln)
					r.termKeys = append(r.termKeys, map[string]int{})
					section = inTerm
				default:
					section = elsewhere
				}
				continue
			case t[0] == '[':
				section = elsewhere
				continue
			}
			eq := strings.Index(t, "=")
			if eq <= 0 {
				continue
			}
			key := strings.Trim(strings.TrimSpace(t[:eq]), `"'`)
			switch section {
			case atTop:
				if _, ok := l.top[key]; !ok {
					l.top[key] = ln
				}
			case inRule:
				r := &l.rules[len(l.rules)-1]
				if _, ok := r.keys[key]; !ok {
					r.keys[key] = ln
				}
			case inTerm:
				r := &l.rules[len(l.rules)-1]
				if k := r.termKeys[len(r.termKeys)-1]; k[key] == 0 {
					k[key] = ln
				}
			}
			collecting = section == inRule && key == "terms"
			rest = t[eq+1:]
		}
		for i := 0; i < len(rest); i++ {
			c := rest[i]
			if quote != 0 {
				if c == '\\' && quote == '"' {
					i++
				} else if c == quote {
					quote = 0
				}
				continue
			}
			switch c {
			case '"', '\'':
				quote = c
			case '#':
				i = len(rest)
			case '{':
				if collecting && depth == 1 {
					r := &l.rules[len(l.rules)-1]
					r.terms = append(r.terms, ln)
				}
				depth++
			case '[':
				depth++
			case '}', ']':
				depth--
			}
		}
		quote = 0 // basic and literal strings end with their line
	}
	return l
}
