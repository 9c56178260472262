package modelfile

import (
	"fmt"
	"math"
	"slices"
	"sort"
	"strings"

	"govern/frame/units"
)

// table is one TOML table being read, of a model file or a rule file, with
// what is needed to report problems in it. Its methods read a key's value
// as a type, report a value of another type, and mark the key as known;
// done reports the keys no method read, with the nearest known key.
type table struct {
	d     *doc
	m     map[string]any
	pos   place    // where it is in the file
	where string   // how messages name it, such as `case "L", load 1`
	used  []string // the keys read; few, so a slice is smaller than a map
}

// fail records a problem at key (or at the table when key is empty).
func (t *table) fail(key string, err error) {
	d := t.d
	if d.failed != nil {
		d.failed[t] = append(d.failed[t], key)
	}
	if len(d.errs) >= MaxProblems {
		d.more++ // not listed, so its line is not needed
		return
	}
	d.fail(d.loc.at(&t.pos, key), t.where, err)
}

// failedAt reports whether the table has reported a problem at key; only
// for a document that records them (doc.failed).
func (t *table) failedAt(key string) bool { return slices.Contains(t.d.failed[t], key) }

// line returns the line of key in the table, else of the table.
func (t *table) line(key string) int { return t.d.loc.at(&t.pos, key) }

func (t *table) get(key string) (any, bool) {
	t.use(key)
	v, ok := t.m[key]
	return v, ok
}

// use marks key as read.
func (t *table) use(key string) {
	if t.used == nil {
		t.used = make([]string, 0, len(t.m))
	}
	if !slices.Contains(t.used, key) {
		t.used = append(t.used, key)
	}
}

// known marks keys as read, present or not: the keys of the table's
// format, which done suggests in place of an unknown one.
func (t *table) known(keys ...string) {
	for _, k := range keys {
		t.use(k)
	}
}

// inline returns the inline table m, the value of key, to be read on its own.
func (t *table) inline(key string, m map[string]any) *table {
	return &table{d: t.d, m: m, pos: t.pos.subPlace(key), where: t.where}
}

// has reports whether key is present.
func (t *table) has(key string) bool {
	_, ok := t.m[key]
	return ok
}

func typeName(v any) string {
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

func (t *table) wrongType(key, want string, v any) {
	t.fail(key, problem(ErrType, "%s must be %s, not %s", key, want, typeName(v)))
}

// str reads a string; def when absent.
func (t *table) str(key, def string) string {
	v, ok := t.get(key)
	if !ok {
		return def
	}
	s, ok := v.(string)
	if !ok {
		t.wrongType(key, "a string", v)
		return def
	}
	return s
}

// need reports key as missing when absent and returns whether it is present.
func (t *table) need(key string) bool {
	if t.has(key) {
		return true
	}
	t.fail("", problem(ErrMissing, "%s is required", key))
	return false
}

// num reads a number (integer or float) that must be finite: a pure
// number, such as a factor, which takes no unit. A value with a dimension
// is read with qty.
func (t *table) num(key string, def float64) float64 {
	v, _ := t.numOK(key, def)
	return v
}

// numOK is num that also reports whether a valid number was read.
func (t *table) numOK(key string, def float64) (float64, bool) {
	v, ok := t.get(key)
	if !ok {
		return def, false
	}
	return t.number(key, v, "a number", def)
}

// number reads v, the value of key, as a finite number; want names the
// types accepted, for the message when v is of another.
func (t *table) number(key string, v any, want string, def float64) (float64, bool) {
	var f float64
	switch x := v.(type) {
	case int64:
		f = float64(x)
	case float64:
		f = x
	default:
		t.wrongType(key, want, v)
		return def, false
	}
	if math.IsNaN(f) || math.IsInf(f, 0) {
		t.fail(key, problem(ErrValue, "%s must be a finite number, not %v", key, f))
		return def, false
	}
	return f, true
}

// Values with a unit. Every key with a dimension is read by qty (or qtyOK,
// qtys) with its quantity, such as units.LineLoad for a distributed load:
// a number is in the model's units, a string such as "2.4 kip/ft" is
// converted to them. Converting a key read with num is the one change
// from t.num(key, def) to t.qty(key, units.Quantity, def).

// withUnit names the types a key with a dimension accepts.
const withUnit = "a number, or a string of a number and a unit such as \"12 kN\""

// siUnits checks values with a unit while the model's units are not known.
var siUnits = units.System{Force: units.MustParse("N"), Length: units.MustParse("m"), Temperature: units.MustParse("K")}

// qty reads key as a value of quantity q in the model's units.
func (t *table) qty(key string, q units.Quantity, def float64) float64 {
	v, _ := t.qtyOK(key, q, def)
	return v
}

// qtyOK is qty that also reports whether a valid value was read.
func (t *table) qtyOK(key string, q units.Quantity, def float64) (float64, bool) {
	v, ok := t.get(key)
	if !ok {
		return def, false
	}
	if s, ok := v.(string); ok {
		return t.withUnit(key, key, s, q, def)
	}
	return t.number(key, v, withUnit, def)
}

// withUnit converts s, the value of key (named as label in messages), a
// number and a unit of quantity q, to the model's units.
func (t *table) withUnit(key, label, s string, q units.Quantity, def float64) (float64, bool) {
	sys := t.d.units
	switch {
	case sys == nil && !t.d.unitsBad:
		t.fail(key, problem(ErrType, "%s must be a number, not a string", label))
		return def, false
	case sys == nil:
		// [units] has a problem, reported there: the value is checked
		// all the same, but cannot be converted.
		sys = &siUnits
	}
	f, _, err := sys.Value(s, q)
	if err != nil {
		t.fail(key, problem(ErrValue, "%s = %q: %v", label, s, err))
		return def, false
	}
	if t.d.unitsBad {
		return def, false
	}
	if math.IsNaN(f) || math.IsInf(f, 0) {
		t.fail(key, problem(ErrValue, "%s = %q is too large in the model's units", label, s))
		return def, false
	}
	return f, true
}

// integer reads an integer.
func (t *table) integer(key string, def int) int {
	v, ok := t.get(key)
	if !ok {
		return def
	}
	x, ok := v.(int64)
	if !ok {
		t.wrongType(key, "an integer", v)
		return def
	}
	if x > math.MaxInt32 || x < math.MinInt32 {
		t.fail(key, problem(ErrValue, "%s = %d is out of range", key, x))
		return def
	}
	return int(x)
}

func (t *table) boolean(key string, def bool) bool {
	v, ok := t.get(key)
	if !ok {
		return def
	}
	b, ok := v.(bool)
	if !ok {
		t.wrongType(key, "true or false", v)
		return def
	}
	return b
}

// qtys reads an array of values of quantity q, each a number in the
// model's units or a string with a unit (qty).
func (t *table) qtys(key string, q units.Quantity) []float64 {
	v, ok := t.get(key)
	if !ok {
		return nil
	}
	arr, ok := v.([]any)
	if !ok {
		t.wrongType(key, "an array of numbers", v)
		return nil
	}
	out := make([]float64, 0, len(arr))
	for i, e := range arr {
		label := fmt.Sprintf("%s[%d]", key, i+1)
		switch x := e.(type) {
		case int64:
			out = append(out, float64(x))
		case float64:
			if math.IsNaN(x) || math.IsInf(x, 0) {
				t.fail(key, problem(ErrValue, "%s must be a finite number, not %v", label, x))
				return nil
			}
			out = append(out, x)
		case string:
			f, ok := t.withUnit(key, label, x, q, 0)
			if !ok {
				return nil
			}
			out = append(out, f)
		default:
			t.fail(key, problem(ErrType, "%s must be %s, not %s", label, withUnit, typeName(e)))
			return nil
		}
	}
	return out
}

// strs reads a string or an array of strings.
func (t *table) strs(key string) []string {
	v, ok := t.get(key)
	if !ok {
		return nil
	}
	if s, ok := v.(string); ok {
		return []string{s}
	}
	arr, ok := v.([]any)
	if !ok {
		t.wrongType(key, "a string or an array of strings", v)
		return nil
	}
	out := make([]string, 0, len(arr))
	for i, e := range arr {
		s, ok := e.(string)
		if !ok {
			t.fail(key, problem(ErrType, "%s[%d] must be a string, not %s", key, i+1, typeName(e)))
			return nil
		}
		out = append(out, s)
	}
	return out
}

// sub reads a sub-table.
func (t *table) sub(key, where string) *table {
	v, ok := t.get(key)
	if !ok {
		return nil
	}
	m, ok := v.(map[string]any)
	if !ok {
		t.wrongType(key, "a table", v)
		return nil
	}
	return &table{d: t.d, m: m, pos: t.pos.subPlace(key), where: where}
}

// array reads an array of tables; where names element i (0-based).
func (t *table) array(key string, where func(i int, m map[string]any) string) []*table {
	v, ok := t.get(key)
	if !ok {
		return nil
	}
	var ms []map[string]any
	switch x := v.(type) {
	case []map[string]any:
		ms = x
	case []any:
		for _, e := range x {
			m, ok := e.(map[string]any)
			if !ok {
				t.fail(key, problem(ErrType, "%s must be an array of tables ([[%s]]), not %s", key, t.header(key), typeName(v)))
				return nil
			}
			ms = append(ms, m)
		}
	default:
		t.fail(key, problem(ErrType, "%s must be an array of tables ([[%s]]), not %s", key, t.header(key), typeName(v)))
		return nil
	}
	out := make([]*table, len(ms))
	for i, m := range ms {
		out[i] = &table{d: t.d, m: m, pos: t.pos.elemPlace(key, i), where: where(i, m)}
	}
	// From now on each element is held by its table alone, so that
	// release can let it go.
	switch x := v.(type) {
	case []map[string]any:
		clear(x)
	case []any:
		clear(x)
	}
	return out
}

// header returns the name the header of table key in t is written with,
// such as "case.load".
func (t *table) header(key string) string {
	parts := []string{key}
	for p := &t.pos; !p.isRoot(); p = p.up {
		parts = append(parts, p.key)
	}
	slices.Reverse(parts)
	return strings.Join(parts, ".")
}

// release lets the table's values go once they are read: a large model's
// decoded tables then need not all stay in memory while it is built. The
// table can still report problems.
func (t *table) release() {
	t.m, t.used = nil, nil
}

// skipRest marks every key of the table as read, so that done reports
// none: for a table whose kind is unknown, where which keys belong to it
// cannot be told.
func (t *table) skipRest() {
	for k := range t.m {
		t.use(k)
	}
}

// done reports every key of the table that was not read, suggesting the
// nearest known key when one is close.
func (t *table) done() {
	var unknown []string
	for k := range t.m {
		if !slices.Contains(t.used, k) {
			unknown = append(unknown, k)
		}
	}
	if len(unknown) == 0 {
		return
	}
	sort.Strings(unknown)
	known := slices.Sorted(slices.Values(t.used))
	for _, k := range unknown {
		msg := fmt.Sprintf("unknown key %q", k)
		if s := closest(k, known); s != "" {
			msg += fmt.Sprintf(" (did you mean %q?)", s)
		}
		if t.where == "" {
			msg += " at the top level"
		}
		t.fail(k, problem(ErrUnknownKey, "%s", msg))
	}
}

// closest returns the candidate that s is most likely a misspelling of, or
// "": one differing only in case, else the nearest within one edit for
// names of up to four letters and two edits for longer ones (an edit being
// an insertion, deletion, substitution or swap of neighbours), never
// replacing most of s.
func closest(s string, candidates []string) string {
	best, bestD := "", 3
	limit := 2
	if len(s) <= 4 {
		limit = 1
	}
	if len(s) > maxSuggest {
		return ""
	}
	for _, c := range candidates {
		if strings.EqualFold(c, s) {
			return c
		}
		if len(c) > len(s)+limit || len(c) < len(s)-limit {
			continue // too long or short to be within the limit
		}
		d := editDistance(strings.ToLower(s), strings.ToLower(c))
		if d <= limit && d < len(s) && d < bestD {
			best, bestD = c, d
		}
	}
	return best
}

// maxSuggest is the longest name for which closest looks for a suggestion;
// the edit distance costs the product of the lengths.
const maxSuggest = 64

// editDistance is the optimal string alignment distance of a and b.
func editDistance(a, b string) int {
	d := make([][]int, len(a)+1)
	for i := range d {
		d[i] = make([]int, len(b)+1)
		d[i][0] = i
	}
	for j := range d[0] {
		d[0][j] = j
	}
	for i := 1; i <= len(a); i++ {
		for j := 1; j <= len(b); j++ {
			cost := 1
			if a[i-1] == b[j-1] {
				cost = 0
			}
			d[i][j] = min(d[i-1][j]+1, d[i][j-1]+1, d[i-1][j-1]+cost)
			if i > 1 && j > 1 && a[i-1] == b[j-2] && a[i-2] == b[j-1] {
				d[i][j] = min(d[i][j], d[i-2][j-2]+1)
			}
		}
	}
	return d[len(a)][len(b)]
}

// oneOf checks that s is one of the allowed words.
func (t *table) oneOf(key, s string, allowed ...string) bool {
	if slices.Contains(allowed, s) {
		return true
	}
	msg := fmt.Sprintf("%s = %q: must be one of %s", key, s, quoteList(allowed))
	if c := closest(s, allowed); c != "" {
		msg += fmt.Sprintf(" (did you mean %q?)", c)
	}
	t.fail(key, problem(ErrValue, "%s", msg))
	return false
}

func quoteList(s []string) string {
	q := make([]string, len(s))
	for i, v := range s {
		q[i] = fmt.Sprintf("%q", v)
	}
	return strings.Join(q, ", ")
}
