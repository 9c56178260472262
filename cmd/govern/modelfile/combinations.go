package modelfile

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"govern/combos"
)

// readCaseInfo reads the keys of a [[case]] that only the combination rules
// use: reversible, category, psi0, psi1, psi2.
func (r *reader) readCaseInfo(t *table) combos.CaseInfo {
	var ci combos.CaseInfo
	word, _ := t.m["kind"].(string) // read and checked by readCases
	kind, kindOK := combos.ParseKind(word)
	ci.Reversible = t.boolean("reversible", false)
	if ci.Reversible && kindOK && kind.Permanent() {
		t.fail("reversible", problem(ErrValue, "reversible = true: dead load acts one way only; only variable cases (wind, seismic, …) reverse"))
	}
	if t.has("category") {
		ci.Category = t.str("category", "")
		c, ok := combos.LookupCategory(ci.Category)
		switch {
		case !ok:
			var names []string
			for _, c := range combos.Categories() {
				if !kindOK || c.Fits(kind) {
					names = append(names, c.Name)
				}
			}
			msg := fmt.Sprintf("category = %q is not a row of EN 1990 Table A1.1", ci.Category)
			if s := closest(ci.Category, names); s != "" {
				msg += fmt.Sprintf(" (did you mean %q?)", s)
			}
			if len(names) > 0 {
				msg += fmt.Sprintf("; for %s load it is one of %s", word, quoteList(names))
			}
			t.fail("category", problem(ErrValue, "%s", msg))
			ci.Category = ""
		case kindOK && !c.Fits(kind):
			t.fail("category", problem(ErrValue, "category = %q (%s) does not apply to %s load", c.Name, c.Row, kind))
			ci.Category = ""
		}
	}
	for i, key := range []string{"psi0", "psi1", "psi2"} {
		v, ok := t.numOK(key, 0)
		if !ok {
			continue
		}
		if v < 0 || v > 1 {
			t.fail(key, problem(ErrValue, "%s = %g: must be from 0 to 1", key, v))
		}
		ci.Psi[i], ci.PsiGiven[i] = v, true
	}
	if kindOK && kind.Permanent() {
		for _, key := range []string{"category", "psi0", "psi1", "psi2"} {
			if t.has(key) {
				t.fail(key, problem(ErrValue, "%s: dead load is permanent and has no ψ factors", key))
				break
			}
		}
	}
	r.readActionKeys(t, &ci, kindOK && kind.Permanent())
	r.caseTables = append(r.caseTables, t)
	return ci
}

// readActionKeys reads the keys that group a case into an action and an
// alternative: action, alternative and with. What needs the other cases is
// checked by groupActions.
func (r *reader) readActionKeys(t *table, ci *combos.CaseInfo, permanent bool) {
	for _, k := range []struct {
		key string
		dst *string
	}{{"action", &ci.Action}, {"alternative", &ci.Alternative}, {"with", &ci.With}} {
		if !t.has(k.key) {
			continue
		}
		v := t.str(k.key, "")
		if _, isStr := t.m[k.key].(string); !isStr {
			continue
		}
		if strings.TrimSpace(v) == "" {
			t.fail(k.key, problem(ErrValue, "%s is empty: give a name", k.key))
			continue
		}
		if permanent {
			t.fail(k.key, problem(ErrValue, "%s: dead load is permanent and always acts in full, as one action with every dead case; only variable cases are grouped into actions and alternatives", k.key))
			return
		}
		*k.dst = v
	}
	name, _ := t.m["name"].(string)
	switch {
	case ci.With != "" && (ci.Action != "" || ci.Alternative != ""):
		t.fail("with", problem(ErrValue, "with = %q: give with, or action and alternative, not both (with takes the action and alternative of case %q)", ci.With, ci.With))
	case ci.With != "" && ci.With == name:
		t.fail("with", problem(ErrValue, "with = %q names the case itself; name the case whose action and alternative this one shares", ci.With))
	default:
		return
	}
	ci.With = ""
}

// groupActions groups the cases into actions and alternatives and checks
// that no combination of the model holds two alternatives of one action.
// The cross-case checks run only on a file without other problems, so
// that every case is there with its kind.
func (r *reader) groupActions() {
	job := r.job
	cases := map[string]int{}
	for i, c := range job.Model.Cases {
		cases[c.Name] = i
	}
	for i, ci := range r.caseInfo {
		if _, ok := cases[ci.With]; ci.With != "" && !ok {
			msg := fmt.Sprintf("with = %q: no such case", ci.With)
			if s := closest(ci.With, keys(cases)); s != "" {
				msg += fmt.Sprintf(" (did you mean %q?)", s)
			}
			r.caseTables[i].fail("with", problem(ErrReference, "%s", msg))
		}
	}
	if len(r.errs) > 0 {
		return
	}
	acts, err := combos.GroupActions(job.Cases, r.caseInfo)
	var ce combos.CaseErrors
	if errors.As(err, &ce) {
		for _, e := range ce {
			r.caseTables[e.Case].fail(e.Key, problem(ErrValue, "%s", e.Msg))
		}
		return
	}
	if err != nil {
		panic("modelfile: groupActions: " + err.Error())
	}
	job.Actions = acts
	for i := range job.Combinations {
		cb := &job.Combinations[i]
		c1, c2, clash := acts.Clash(cb)
		if !clash {
			continue
		}
		mo := job.Model
		p := acts.Of[c1]
		act := &acts.List[p.Action]
		a1, a2 := act.Alternatives[p.Alternative].Name, act.Alternatives[acts.Of[c2].Alternative].Name
		n1, n2 := mo.Cases[c1].Name, mo.Cases[c2].Name
		var msg string
		if act.Default {
			msg = fmt.Sprintf("factors: %s and %s are alternatives of action %q and never act together (read by the default rule for %s cases: each %s case is an alternative of its own); if they are parts of one load, write with = %q in case %q",
				n1, n2, act.Name, act.Kind, act.Kind, n1, n2)
		} else {
			msg = fmt.Sprintf("factors: %s and %s are alternatives %q and %q of action %q and never act together; if they act together, write with = %q in case %q (in place of its action, alternative or with)",
				n1, n2, a1, a2, act.Name, n1, n2)
		}
		r.fail(r.loc.line(elem("combination", i), "factors"), fmt.Sprintf("combination %q", cb.Name), problem(ErrValue, "%s", msg))
	}
}

// readCombinationSet reads the [combinations] table: the rule set and the
// values of its options.
func (r *reader) readCombinationSet(t *table) {
	if t == nil {
		return
	}
	r.setTable = t
	job := r.job
	std, file := t.str("standard", ""), t.str("file", "")
	switch hasStd, hasFile := t.has("standard"), t.has("file"); {
	case hasStd && hasFile:
		t.fail("file", problem(ErrValue, "give standard or file, not both"))
	case !hasStd && !hasFile && (len(t.m) != 1 || !t.has("unused")):
		t.fail("", problem(ErrMissing, "[combinations] needs standard (one of %s) or file (a rule file of your own)", quoteList(combos.Standards())))
	case hasStd:
		s, err := combos.Standard(std)
		if err != nil {
			msg := fmt.Sprintf("standard = %q is not a built-in set", std)
			if c := closest(std, combos.Standards()); c != "" {
				msg += fmt.Sprintf(" (did you mean %q?)", c)
			}
			msg += "; the known ones are " + quoteList(combos.Standards())
			t.fail("standard", problem(ErrValue, "%s", msg))
			break
		}
		job.Set = s
	case hasFile:
		job.Set = r.readRuleFile(t, file)
	}
	if v, ok := t.numOK("sds", 0); ok {
		if v < 0 {
			t.fail("sds", problem(ErrValue, "sds = %g: S_DS, in g, must not be negative", v))
		}
		job.Params.SDS = v
	}
	job.Params.ReducedLive = t.boolean("reduced_live_factor", false)
	limit, hasLimit := t.numOK("limit", 0)
	if hasLimit && !(limit > 0) {
		t.fail("limit", problem(ErrValue, "limit = %g: span/deflection must be positive, such as 360 for span/360", limit))
		hasLimit = false
	}
	if u := t.str("unused", "error"); t.oneOf("unused", u, "error", "allow") {
		job.AllowUnused = u == "allow"
	}
	t.done()
	if s := job.Set; s != nil {
		if t.has("sds") && !s.UsesSDS() {
			t.fail("sds", problem(ErrValue, "sds: %s takes no S_DS into its factors", s.Name))
		}
		if job.Params.ReducedLive && !s.UsesReducedLive() {
			t.fail("reduced_live_factor", problem(ErrValue, "reduced_live_factor: %s has no reduced live load factor", s.Name))
		}
		if hasLimit {
			if !s.Service {
				t.fail("limit", problem(ErrValue, "limit: %s is not a set of service combinations; only those have a deflection limit", s.Name))
			} else {
				r.setLimit = limit
			}
		}
	}
}

// readRuleFile reads and parses the rule file named by file, relative to
// the model's folder.
func (r *reader) readRuleFile(t *table, file string) *combos.Set {
	if file == "" {
		t.fail("file", problem(ErrValue, "file is empty: name a rule file, relative to the model"))
		return nil
	}
	path := file
	if !filepath.IsAbs(path) {
		path = filepath.Join(r.dir, file)
	}
	fi, err := os.Stat(path)
	if err == nil && !fi.Mode().IsRegular() {
		err = errors.New("not a regular file")
	} else if err == nil && fi.Size() > MaxRuleFileSize {
		err = fmt.Errorf("larger than %d bytes", MaxRuleFileSize)
	}
	var src []byte
	if err == nil {
		src, err = readLimited(path, MaxRuleFileSize)
	}
	if err != nil {
		var pe *os.PathError
		if errors.As(err, &pe) {
			err = pe.Err
		}
		t.fail("file", problem(ErrReference, "file = %q: cannot read it: %v", file, err))
		return nil
	}
	s, err := ReadSet(file, src)
	var l ErrorList
	if errors.As(err, &l) {
		r.errs = append(r.errs, l...)
		return nil
	}
	if err != nil {
		panic("modelfile: ReadSet: " + err.Error())
	}
	return s
}

// lineUnused records the line of each case no combination uses, for
// CheckUnused; the position index is built only when there is one.
func (r *reader) lineUnused(job *Job) {
	for _, c := range job.Unused() {
		if c < len(r.caseTables) {
			if job.caseLines == nil {
				job.caseLines = map[int]int{}
			}
			job.caseLines[c] = r.loc.at(&r.caseTables[c].pos, "")
		}
	}
}

// generate expands the rule set against the cases, ahead of the model's
// own combinations. It runs only on a file without other problems, so that
// the cases are those of the file, in its order.
func (r *reader) generate() {
	job := r.job
	job.CaseInfo = r.caseInfo
	job.file = r.file
	r.groupActions()
	if job.Set == nil || len(r.errs) > 0 {
		return
	}
	cs, err := job.Set.Generate(job.Cases, r.caseInfo, job.Params)
	var ce combos.CaseErrors
	switch {
	case errors.As(err, &ce):
		for _, e := range ce {
			key := e.Key
			if key == "" {
				key = "kind"
			}
			r.caseTables[e.Case].fail(key, problem(ErrMissing, "%s", e.Msg))
		}
		return
	case err != nil:
		r.setTable.fail("", problem(ErrValue, "%v", err))
		return
	case len(cs) == 0 && len(job.Combinations) == 0:
		var kinds []string
		for _, c := range job.Cases {
			kinds = append(kinds, c.Kind.String())
		}
		r.setTable.fail("", problem(ErrValue, "%s gives no combinations for load cases of kinds %s", job.Set.Name, strings.Join(kinds, ", ")))
		return
	}
	generated := map[string]bool{}
	for _, cb := range cs {
		generated[cb.Name] = true
	}
	for i, cb := range job.Combinations {
		if generated[cb.Name] {
			r.fail(r.loc.line(elem("combination", i), "name"), fmt.Sprintf("combination %q", cb.Name),
				problem(ErrDuplicate, "%s also gives a combination named %q; rename this one", job.Set.Name, cb.Name))
		}
	}
	// The set's limit for the rules that give none of their own.
	for i := range cs {
		if cs[i].Limit == 0 {
			cs[i].Limit = r.setLimit
		}
	}
	job.Combinations = append(cs, job.Combinations...)
}

// readLimited reads the file at path, refusing one of more than limit bytes
// whatever its size claimed.
func readLimited(path string, limit int64) ([]byte, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	src, err := io.ReadAll(io.LimitReader(f, limit+1))
	if err == nil && int64(len(src)) > limit {
		err = fmt.Errorf("larger than %d bytes", limit)
	}
	return src, err
}

// CheckUnused returns an error naming each case that no combination uses,
// at its line, unless the model allows them ([combinations] unused =
// "allow"). An analysis calls it; a listing of the model does not.
func (j *Job) CheckUnused() error {
	if j.AllowUnused {
		return nil
	}
	var l ErrorList
	for _, c := range j.Unused() {
		l.Add(Pos{File: j.file, Line: j.caseLines[c]}, fmt.Sprintf("case %q", j.Model.Cases[c].Name), ErrUnused,
			"no load combination uses this case, so it would be left out of every envelope; put it in a combination, or write unused = \"allow\" in [combinations] to analyse the model without it")
	}
	return l.Err()
}
