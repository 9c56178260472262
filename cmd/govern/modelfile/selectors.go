package modelfile

import (
	"errors"
	"fmt"
	"math"
	"sort"
	"strconv"
	"strings"
)

// selectorWords lists the keyword selectors, for messages.
const selectorWords = `"level N", "roof", "storey N", "line A", "all beams", "all columns", a range such as "level 1-3", or several joined by " & "`

// isSelector reports whether s reads as a keyword selector (whether or not
// the level, storey or line it names exists), or as an intersection of
// them, so that no member may be named s.
func isSelector(s string) bool {
	if strings.Contains(s, "&") {
		for _, p := range strings.Split(s, "&") {
			if !isSelector(strings.TrimSpace(p)) {
				return false
			}
		}
		return true
	}
	if s == "roof" || s == "all beams" || s == "all columns" {
		return true
	}
	f := strings.Fields(s)
	return len(f) == 2 && (f[0] == "level" || f[0] == "line" || f[0] == "storey")
}

// errNoSuchMember marks a selector that is neither a member name nor a
// keyword selector; its message is empty so that it adds nothing when wrapped.
var errNoSuchMember = errors.New("")

// selectMembers resolves a member selector: a member name, "level N" or
// "level N-M" (the beams at those levels), "roof", "storey N" or
// "storey N-M" (the columns between level N−1 and level N, or of those
// storeys), "line A" or "line A-C" (the columns on those lines), "all
// beams", "all columns", or several of them joined by "&": the members
// every part picks. A member's own name is taken first, whatever it reads
// as. The members each keyword selector picks are found once and kept, so
// the slice returned is shared: callers must not modify it. A selector
// that picks nothing is an error.
func (r *reader) selectMembers(sel string) ([]int, error) {
	if i, ok := r.members[sel]; ok {
		return []int{i}, nil
	}
	if !strings.Contains(sel, "&") {
		out, err := r.selectOne(sel)
		if err == nil && len(out) == 0 {
			err = fmt.Errorf("selector %q matches no member", sel)
		}
		return out, err
	}
	parts := strings.Split(sel, "&")
	var out []int
	for k, p := range parts {
		p = strings.TrimSpace(p)
		if p == "" {
			return nil, fmt.Errorf("selector %q: an empty part before or after \"&\"", sel)
		}
		var ms []int
		if i, ok := r.members[p]; ok {
			ms = []int{i}
		} else {
			var err error
			if ms, err = r.selectOne(p); err != nil {
				return nil, fmt.Errorf("in selector %q: %w", sel, err)
			}
			if len(ms) == 0 {
				return nil, fmt.Errorf("selector %q matches no member: %q picks none", sel, p)
			}
		}
		if k == 0 {
			out = ms
			continue
		}
		out = intersect(out, ms)
		if len(out) == 0 {
			return nil, fmt.Errorf("selector %q matches no member: no member is picked by %s", sel, quoteParts(parts[:k+1]))
		}
	}
	return out, nil
}

// quoteParts lists the parts of an intersection for a message: "a" and "b",
// or "a", "b" and "c".
func quoteParts(parts []string) string {
	q := make([]string, len(parts))
	for i, p := range parts {
		q[i] = fmt.Sprintf("%q", strings.TrimSpace(p))
	}
	if len(q) == 2 {
		return "both " + q[0] + " and " + q[1]
	}
	return "all of " + strings.Join(q[:len(q)-1], ", ") + " and " + q[len(q)-1]
}

// intersect returns the members in both a and b, both in model order, as
// a new slice.
func intersect(a, b []int) []int {
	var out []int
	for i, j := 0, 0; i < len(a) && j < len(b); {
		switch {
		case a[i] < b[j]:
			i++
		case a[i] > b[j]:
			j++
		default:
			out = append(out, a[i])
			i++
			j++
		}
	}
	return out
}

// selectOne resolves a selector without "&"; the members it picks, in
// model order, may be none.
func (r *reader) selectOne(sel string) ([]int, error) {
	mo := r.job.Model
	var pick func(m int) bool
	key := sel // canonical form, under which the members picked are kept
	f := strings.Fields(sel)
	switch {
	case sel == "all beams":
		pick = mo.IsBeam
	case sel == "all columns":
		pick = mo.IsColumn
	case sel == "roof" || (len(f) == 2 && f[0] == "level"):
		lv := r.levels()
		if len(lv) == 0 {
			return nil, fmt.Errorf("selector %q: the model has no nodes, so no levels", sel)
		}
		a, b := len(lv)-1, len(lv)-1
		if sel != "roof" {
			var ok bool
			if a, b, ok = numberRange(f[1], 0, len(lv)-1); !ok {
				return nil, fmt.Errorf("selector %q: levels are numbered 0 to %d%s", sel, len(lv)-1, rangeHint("level", "0", strconv.Itoa(len(lv)-1)))
			}
		}
		key = "level " + rangeKey(strconv.Itoa(a), strconv.Itoa(b))
		of := r.beamLevels(lv)
		pick = func(m int) bool {
			// −1 for a member that is not a beam, or at no level: a ≥ 0.
			k := of[m]
			return k >= a && k <= b
		}
	case len(f) == 2 && f[0] == "storey":
		lv := r.levels()
		if len(lv) < 2 {
			return nil, fmt.Errorf("selector %q: the model has fewer than two levels, so no storeys", sel)
		}
		a, b, ok := numberRange(f[1], 1, len(lv)-1)
		if !ok {
			return nil, fmt.Errorf("selector %q: storeys are numbered 1 to %d (storey N is between levels N-1 and N)%s", sel, len(lv)-1, rangeHint("storey", "1", strconv.Itoa(len(lv)-1)))
		}
		key = "storey " + rangeKey(strconv.Itoa(a), strconv.Itoa(b))
		lo, hi := lv[a-1], lv[b]
		pick = func(m int) bool {
			if !mo.IsColumn(m) {
				return false
			}
			y0, y1 := mo.Nodes[mo.Members[m].Start].Y, mo.Nodes[mo.Members[m].End].Y
			// A column in part between the levels: one that spans several
			// storeys is in each of them.
			return math.Min(y0, y1) < hi-coordTol && math.Max(y0, y1) > lo+coordTol
		}
	case len(f) == 2 && f[0] == "line":
		ls := r.lines()
		if len(ls) == 0 {
			return nil, fmt.Errorf("selector %q: the model has no nodes, so no column lines", sel)
		}
		from, to, _ := strings.Cut(f[1], "-")
		if to == "" {
			to = from
		}
		a, b := lineIndex(from), lineIndex(to)
		if a < 0 || b < a || b >= len(ls) {
			return nil, fmt.Errorf("selector %q: column lines are A to %s%s", sel, LineName(len(ls)-1), rangeHint("line", "A", LineName(len(ls)-1)))
		}
		key = "line " + rangeKey(LineName(a), LineName(b))
		pick = func(m int) bool {
			if !mo.IsColumn(m) {
				return false
			}
			k := nearest(ls, mo.Nodes[mo.Bottom(m)].X)
			return k >= a && k <= b
		}
	default:
		msg := fmt.Sprintf("selector %q: no member of that name, and not one of %s", sel, selectorWords)
		if s := r.suggest(sel, r.members); s != "" {
			msg += fmt.Sprintf(" (did you mean %q?)", s)
		}
		return nil, fmt.Errorf("%s%w", msg, errNoSuchMember)
	}
	out, done := r.selected[key]
	if !done {
		for m := range mo.Members {
			if pick(m) {
				out = append(out, m)
			}
		}
		if r.selected == nil {
			r.selected = map[string][]int{}
		}
		r.selected[key] = out
	}
	return out, nil
}

// beamLevels returns, per member of the model, the level among lv its
// start is at (nearest) when it is a beam, else −1: found once for every
// "level" selector (a file may name each of a tall frame's levels),
// again only when the members or the levels are not those it was found
// for.
func (r *reader) beamLevels(lv []float64) []int {
	mo := r.job.Model
	if len(r.beamLevel) != len(mo.Members) || len(r.levelsOf) != len(lv) || len(lv) > 0 && &r.levelsOf[0] != &lv[0] {
		r.beamLevel, r.levelsOf = make([]int, len(mo.Members)), lv
		for m := range mo.Members {
			r.beamLevel[m] = -1
			if mo.IsBeam(m) {
				r.beamLevel[m] = nearest(lv, mo.Nodes[mo.Members[m].Start].Y)
			}
		}
	}
	return r.beamLevel
}

// rangeHint shows how a range of levels, storeys or lines is written,
// from first to last, when there are two or more.
func rangeHint(word, first, last string) string {
	if first == last {
		return ""
	}
	return fmt.Sprintf("; a range is written such as %q", word+" "+first+"-"+last)
}

// numberRange reads "N" or "N-M" with lo ≤ N ≤ M ≤ hi.
func numberRange(s string, lo, hi int) (int, int, bool) {
	from, to, isRange := strings.Cut(s, "-")
	a, err := strconv.Atoi(from)
	if err != nil || strings.HasPrefix(from, "+") {
		return 0, 0, false
	}
	b := a
	if isRange {
		if b, err = strconv.Atoi(to); err != nil || strings.HasPrefix(to, "+") {
			return 0, 0, false
		}
	}
	return a, b, a >= lo && a <= b && b <= hi
}

// rangeKey writes a range as its canonical selector: "2" or "1-3".
func rangeKey(a, b string) string {
	if a == b {
		return a
	}
	return a + "-" + b
}

// nearest returns the index of the value of sorted v within coordTol of
// x, or -1 when none is.
func nearest(v []float64, x float64) int {
	i := sort.SearchFloat64s(v, x-coordTol)
	if i < len(v) && math.Abs(v[i]-x) <= coordTol {
		return i
	}
	return -1
}
