package modelfile

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"govern/envelope/reduction"
	"govern/frame"
)

// Assignment is one [[assign]] table: the members its selectors pick and
// the section or release (or both) it gives them.
type Assignment struct {
	Line    int      // the line of the table
	On      []string // its selectors, a union
	Section string   // the section's name; "" when it gives none
	Release string   // "" when it gives none
	// Reduction gives the live load reduction values it gives, in the
	// model's units; the zero value when none.
	Reduction reduction.Member
	Members   []int // the members picked, in model order
}

// What says what the assignment gives, such as "section C600, release
// both" or "kll 3", with lengths and areas in length, the model's unit.
func (a Assignment) What(length string) string {
	var what []string
	if a.Section != "" {
		what = append(what, "section "+a.Section)
	}
	if a.Release != "" {
		what = append(what, "release "+a.Release)
	}
	g := func(v float64) string { return strconv.FormatFloat(v, 'g', 6, 64) }
	if r := a.Reduction; r.Area > 0 {
		what = append(what, "tributary_area "+g(r.Area)+" "+length+"²")
	}
	if r := a.Reduction; r.Width > 0 {
		what = append(what, "tributary_width "+g(r.Width)+" "+length)
	}
	if r := a.Reduction; r.KLL > 0 {
		what = append(what, "kll "+g(r.KLL))
	}
	return strings.Join(what, ", ")
}

// Overlap is a section or release given to members twice: by a table
// (an [[assign]] or a [[member]]) and by an [[assign]] before it in the
// file, or the other way round. Tables apply in file order, so the later
// one's value is the member's.
type Overlap struct {
	Key             string // "section" or "release"
	Line, Earlier   int    // the lines of the later and the earlier table
	Value, Before   string // the later table's value (the member's) and the earlier's
	Members         []int  // the members given both, in model order
	LaterIsMember   bool   // the later table is a [[member]], else an [[assign]]
	EarlierIsMember bool   // the earlier table is a [[member]], else an [[assign]]
}

// memberSets records, per member, what its [[member]] table (if any)
// gives: bit 1 the section, bit 2 the release.
type memberSets []uint8

const (
	setsSection uint8 = 1 << iota
	setsRelease
)

func (s *memberSets) set(i int, section, release bool) {
	for len(*s) <= i {
		*s = append(*s, 0)
	}
	var b uint8
	if section {
		b |= setsSection
	}
	if release {
		b |= setsRelease
	}
	(*s)[i] = b
}

func (s memberSets) has(i int, bit uint8) bool { return i < len(s) && s[i]&bit != 0 }

// given is who gave a member its section or release: the line of that
// table, or 0 for the model's own (a [grid]'s, or none), and whether it is
// a [[member]] table.
type given struct {
	line   int32
	member bool
}

// readAssigns reads the [[assign]] tables and applies them, with the
// [[member]] tables, in file order (the later table's value is a
// member's), and keeps each assignment and each overlap for govern check.
func (r *reader) readAssigns(ts []*table) {
	type pending struct {
		t       *table
		a       Assignment
		section int
		release frame.Release
	}
	var all []pending
	for _, t := range ts {
		p := pending{t: t, a: Assignment{Line: t.line("")}}
		red, hasRed := readMemberReduction(t)
		p.a.Reduction = red
		if !t.has("section") && !t.has("release") && !hasRed {
			t.fail("", problem(ErrMissing, "an [[assign]] gives section or release (or both), or tributary_area, tributary_width or kll, to the members its on selects"))
		}
		var okS bool
		if t.has("section") {
			p.section, okS = r.section(t, "section")
			if okS {
				p.a.Section = r.job.Model.Sections[p.section].Name
			}
		}
		if t.has("release") {
			p.release = r.release(t, frame.ReleaseNone)
			if !t.failedAtRelease() {
				p.a.Release = p.release.String()
			}
		}
		if t.need("on") {
			p.a.On = t.strs("on")
			p.a.Members = slices.Clone(r.selectAll(t, false))
			slices.Sort(p.a.Members)
		}
		t.done()
		if hasRed {
			for _, m := range p.a.Members {
				r.setMemberReduction(m, red)
			}
		}
		if len(p.a.Members) > 0 && (p.a.Section != "" || p.a.Release != "") {
			all = append(all, p)
		}
		r.job.Assignments = append(r.job.Assignments, p.a)
	}
	if len(all) == 0 {
		return
	}
	mo := r.job.Model
	// Who gave each member its section (k = 0) and release (k = 1) so
	// far.
	var by [2][]given
	for k, bit := range []uint8{setsSection, setsRelease} {
		by[k] = make([]given, len(mo.Members))
		for m := range mo.Members {
			if t := r.memberAt.at(m); t != nil && r.sets.has(m, bit) {
				by[k][m] = given{line: int32(t.line("")), member: true}
			}
		}
	}
	keys := [2]string{"section", "release"}
	value := func(k, m int) string {
		if k == 0 {
			return mo.Sections[mo.Members[m].Section].Name
		}
		return mo.Members[m].Release.String()
	}
	index := map[[3]int]int{} // key, later line, earlier line → index in Overlaps
	note := func(k int, later, earlier given, m int, laterValue, earlierValue string) {
		id := [3]int{k, int(later.line), int(earlier.line)}
		i, ok := index[id]
		if !ok {
			i = len(r.job.Overlaps)
			index[id] = i
			r.job.Overlaps = append(r.job.Overlaps, Overlap{Key: keys[k], Line: int(later.line), Earlier: int(earlier.line),
				Value: laterValue, Before: earlierValue, LaterIsMember: later.member, EarlierIsMember: earlier.member})
		}
		r.job.Overlaps[i].Members = append(r.job.Overlaps[i].Members, m)
	}
	for _, p := range all {
		g := given{line: int32(p.a.Line)}
		if p.a.Release != "" && !r.releaseFits(p.t, p.release, p.a.Members, by[1], g.line) {
			p.a.Release = "" // reported: the members keep their ends
		}
		for k, v := range [2]string{p.a.Section, p.a.Release} {
			if v == "" {
				continue
			}
			for _, m := range p.a.Members {
				switch cur := by[k][m]; {
				case cur.line == 0: // the model's own: replaced without a word
				case cur.line < g.line:
					note(k, g, cur, m, v, value(k, m))
				default: // a [[member]] table later in the file keeps its own
					note(k, cur, g, m, value(k, m), v)
					continue
				}
				by[k][m] = g
				if k == 0 {
					mo.Members[m].Section = p.section
				} else {
					mo.Members[m].Release = p.release
				}
			}
		}
	}
	slices.SortStableFunc(r.job.Overlaps, func(a, b Overlap) int { return a.Line - b.Line })
}

// releaseFits reports whether release may be given to members, those of
// them whose [[member]] table gives a release later in the file (by, the
// line of who gave each its release) keeping their own: a hinge where a
// member has a semi-rigid end (spring_start, spring_end) is an error at
// the [[assign]]'s release, naming the first such member and the line of
// its spring.
func (r *reader) releaseFits(t *table, release frame.Release, members []int, by []given, line int32) bool {
	mo := r.job.Model
	first, n, side := -1, 0, ""
	for _, m := range members {
		if by[m].member && by[m].line > line {
			continue // its own release, later in the file, stands
		}
		mem := &mo.Members[m]
		s := ""
		switch {
		case release.AtStart() && mem.SpringStart > 0:
			s = "start"
		case release.AtEnd() && mem.SpringEnd > 0:
			s = "end"
		default:
			continue
		}
		if first < 0 {
			first, side = m, s
		}
		n++
	}
	if first < 0 {
		return true
	}
	where := ""
	if mt := r.memberAt.at(first); mt != nil {
		where = fmt.Sprintf(" (spring_%s, line %d)", side, mt.line("spring_"+side))
	}
	more := ""
	if n > 1 {
		more = fmt.Sprintf(", and %d more members have a spring at an end it releases", n-1)
	}
	t.fail("release", problem(ErrValue, "release = %q: member %q has a semi-rigid %s%s%s; give a release or a spring, not both",
		release, mo.Members[first].Name, side, where, more))
	return false
}

// failedAtRelease reports whether release could not be read.
func (t *table) failedAtRelease() bool {
	s, ok := t.m["release"].(string)
	_, known := releases[s]
	return !ok || !known
}

// DescribeOverlap says what an overlap is, for govern check: which table
// gives what to how many members, over which earlier one.
func (j *Job) DescribeOverlap(o Overlap) string {
	mo := j.Model
	names := make([]string, 0, 4)
	for i, m := range o.Members {
		if i == 3 {
			names = append(names, fmt.Sprintf("and %d more", len(o.Members)-3))
			break
		}
		names = append(names, mo.Members[m].Name)
	}
	table := func(isMember bool) string {
		if isMember {
			return "[[member]]"
		}
		return "[[assign]]"
	}
	list := ""
	for i, n := range names {
		if i > 0 {
			list += ", "
		}
		list += n
	}
	count := "1 member"
	if len(o.Members) != 1 {
		count = fmt.Sprintf("%d members", len(o.Members))
	}
	return fmt.Sprintf("line %d: %s gives %s %s to %s given %s %s by the %s at line %d, which it follows in the file and so replaces: %s",
		o.Line, table(o.LaterIsMember), o.Key, o.Value, count, o.Key, o.Before, table(o.EarlierIsMember), o.Earlier, list)
}
