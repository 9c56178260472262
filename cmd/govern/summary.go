package main

import (
	"fmt"
	"io"
	"math"
	"sort"
	"strings"

	"govern/envelope"
	"govern/patterns"
)

// peak is the governing value of one effect over a member's stations, with
// where it occurs, the combination, the pieces loaded and the forces acting
// with it.
type peak struct {
	v, x   float64
	by     int
	spans  []int
	loaded int
	with   [3]float64
}

// member peaks of N, V, M: largest and smallest over the stations.
type peaks struct {
	hi, lo [3]peak
}

func memberPeaks(em envelope.Member) peaks {
	var p peaks
	for j := range 3 {
		p.hi[j].v, p.lo[j].v = math.Inf(-1), math.Inf(1)
	}
	for _, st := range em.Stations {
		for j, e := range [3]envelope.Extreme{st.N, st.V, st.M} {
			if e.Max > p.hi[j].v {
				p.hi[j] = peak{e.Max, st.X, e.MaxBy, e.MaxSpans, e.MaxLoaded, e.MaxWith}
			}
			if e.Min < p.lo[j].v {
				p.lo[j] = peak{e.Min, st.X, e.MinBy, e.MinSpans, e.MinLoaded, e.MinWith}
			}
		}
	}
	return p
}

// shortSpans lists at most three of the pieces loaded, then how many
// more are loaded.
func (a *analysis) shortSpans(idx []int, loaded int) string {
	names := a.spanNames(idx)
	if len(names) == 0 {
		return "-"
	}
	if len(names) > 3 {
		names = names[:3]
	}
	if more := loaded - len(names); more > 0 {
		names = append(names, fmt.Sprintf("+%d", more))
	}
	return strings.Join(names, " ")
}

// tables receives titled tables: the terminal renders them as text, the
// report as HTML.
type tables interface {
	note(text string) error
	table(title string, header []string, rows [][]string) error
}

// textTables renders tables as text with box-drawing rules.
type textTables struct{ w io.Writer }

func (t textTables) note(text string) error {
	_, err := fmt.Fprintf(t.w, "%s\n", escapeLines(text))
	return err
}

func (t textTables) table(title string, header []string, rows [][]string) error {
	if title != "" {
		fmt.Fprintf(t.w, "\n%s\n", escape(title))
	}
	tw := newTable(t.w, header...)
	if err := tw.Bulk(rows); err != nil {
		return err
	}
	return tw.Render()
}

// memberGroup is a floor (the beams at one level, in span order), a column
// line (bottom to top) or the other members.
type memberGroup struct {
	kind    groupKind
	title   string
	id      string // a short name without spaces, such as "level-1"
	members []int
}

type groupKind uint8

const (
	floorGroup groupKind = iota
	lineGroup
	otherGroup
)

// groups returns the floors from the lowest, then the column lines from
// the left, then the other members, if any.
func (a *analysis) groups() []memberGroup {
	mo := a.job.Model
	u := a.job.Units
	spans := patterns.Spans(mo)
	levels := map[int]*memberGroup{}
	lines := columnLines(a.job)
	byLine := make([][]int, len(lines))
	other := &memberGroup{kind: otherGroup, title: "Other members", id: "other"}
	for m := range mo.Members {
		switch {
		case mo.IsBeam(m):
			lv := spans[m].Level
			if levels[lv] == nil {
				y := mo.Nodes[mo.Members[m].Start].Y
				levels[lv] = &memberGroup{kind: floorGroup, title: fmt.Sprintf("Beams at level %d (y = %s %s)", lv, fixed(y), u.Length), id: fmt.Sprintf("level-%d", lv)}
			}
			levels[lv].members = append(levels[lv].members, m)
		case mo.IsColumn(m):
			i := lineOf(lines, mo.Nodes[mo.Members[m].Start].X)
			byLine[i] = append(byLine[i], m)
		default:
			other.members = append(other.members, m)
		}
	}
	var out []memberGroup
	lvs := make([]int, 0, len(levels))
	for lv := range levels {
		lvs = append(lvs, lv)
	}
	sort.Ints(lvs)
	for _, lv := range lvs {
		g := levels[lv]
		sort.SliceStable(g.members, func(i, j int) bool { return spans[g.members[i]].Number < spans[g.members[j]].Number })
		out = append(out, *g)
	}
	bottom := func(m int) float64 {
		return math.Min(mo.Nodes[mo.Members[m].Start].Y, mo.Nodes[mo.Members[m].End].Y)
	}
	for i, l := range lines {
		ms := byLine[i]
		if len(ms) == 0 {
			continue
		}
		g := memberGroup{kind: lineGroup, members: ms}
		if l.name != "" {
			g.title = fmt.Sprintf("Columns on line %s (x = %s %s)", l.name, fixed(l.x), u.Length)
			g.id = "line-" + l.name
		} else {
			g.title = fmt.Sprintf("Columns at x = %s %s, on no grid line", fixed(l.x), u.Length)
			g.id = fmt.Sprintf("line-x%d", l.off)
		}
		sort.SliceStable(g.members, func(i, j int) bool { return bottom(g.members[i]) < bottom(g.members[j]) })
		out = append(out, g)
	}
	if len(other.members) > 0 {
		out = append(out, *other)
	}
	return out
}

// writeSummary prints the governing design values: one table per floor
// (beams: largest sagging and hogging moment and largest shear, and with
// column faces the values at the supports, centreline and face), one per
// column line (columns: largest tension and compression with the moment
// acting with each, largest moment and shear), one for any other members,
// the deflections of the beams when there are service combinations, then
// the reaction envelopes.
func (a *analysis) writeSummary(w io.Writer) error { return a.summaryTables(textTables{w}) }

func (a *analysis) summaryTables(tb tables) error {
	over := ""
	if s := len(a.env.Service); s > 0 && s < len(a.env.Combinations) {
		over = " over the strength combinations"
	}
	if err := tb.note(fmt.Sprintf("Governing design values%s (in %s; beams: x from the left end, +M sagging; columns: x from the start node)", over, a.job.Units.Length)); err != nil {
		return err
	}
	for _, g := range a.groups() {
		if err := a.groupTables(tb, g); err != nil {
			return err
		}
	}
	if err := a.deflectionTable(tb); err != nil {
		return err
	}
	return a.reactionTable(tb)
}

// groupTables gives the design values of one group of members.
func (a *analysis) groupTables(tb tables, g memberGroup) error {
	mo := a.job.Model
	u := a.job.Units
	force, moment := u.Force, u.Moment()
	if g.kind != floorGroup {
		return tb.table(g.title, columnHeader(force, moment), a.columnRows(g.members))
	}
	patterned := len(a.env.Pieces) > 0
	header := []string{"beam", "+M (" + moment + ")", "at x", "governing", "-M (" + moment + ")", "at x", "governing", "|V| (" + force + ")", "at x", "governing"}
	if patterned {
		header = []string{"beam", "+M (" + moment + ")", "at x", "governing", "spans loaded", "-M (" + moment + ")", "at x", "governing", "spans loaded", "|V| (" + force + ")", "at x", "governing"}
	}
	var rows [][]string
	for _, m := range g.members {
		p := memberPeaks(a.shown(m))
		v := p.hi[1]
		if -p.lo[1].v > v.v {
			v = p.lo[1]
			v.v = -v.v
		}
		row := []string{mo.Members[m].Name, fixed(p.hi[2].v), fixed(p.hi[2].x), a.comboName(p.hi[2].by)}
		if patterned {
			row = append(row, a.shortSpans(p.hi[2].spans, p.hi[2].loaded))
		}
		row = append(row, fixed(p.lo[2].v), fixed(p.lo[2].x), a.comboName(p.lo[2].by))
		if patterned {
			row = append(row, a.shortSpans(p.lo[2].spans, p.lo[2].loaded))
		}
		row = append(row, fixed(v.v), fixed(v.x), a.comboName(v.by))
		rows = append(rows, row)
	}
	if err := tb.table(g.title, header, rows); err != nil {
		return err
	}
	if !a.hasFaces(g.members) {
		return nil
	}
	header = []string{"beam", "support", "M min, centreline (" + moment + ")", "governing", "M min, face (" + moment + ")", "face at x", "governing",
		"|V| centreline (" + force + ")", "|V| face (" + force + ")", "governing"}
	return tb.table(g.title+": at the supports, centreline and column face", header, a.supportRows(g.members))
}

func columnHeader(force, moment string) []string {
	return []string{"member", "N max (" + force + ")", "with M", "governing", "N min (" + force + ")", "with M", "governing", "|M| (" + moment + ")", "at x", "governing", "|V| (" + force + ")", "governing"}
}

// columnRows gives, per member, the largest tension and compression (N is
// positive in tension) with the moment acting with each, and the largest
// moment and shear in magnitude.
func (a *analysis) columnRows(members []int) [][]string {
	mo := a.job.Model
	var rows [][]string
	for _, m := range members {
		p := memberPeaks(a.shown(m))
		mm, v := p.hi[2], p.hi[1]
		if -p.lo[2].v > mm.v {
			mm = p.lo[2]
			mm.v = -mm.v
		}
		if -p.lo[1].v > v.v {
			v = p.lo[1]
			v.v = -v.v
		}
		rows = append(rows, []string{mo.Members[m].Name,
			fixed(p.hi[0].v), fixed(p.hi[0].with[2]), a.comboName(p.hi[0].by),
			fixed(p.lo[0].v), fixed(p.lo[0].with[2]), a.comboName(p.lo[0].by),
			fixed(mm.v), fixed(mm.x), a.comboName(mm.by),
			fixed(v.v), a.comboName(v.by)})
	}
	return rows
}

// reactionTable gives the envelope of every restrained reaction component.
func (a *analysis) reactionTable(tb tables) error {
	if len(a.env.Reactions) == 0 {
		return nil
	}
	mo := a.job.Model
	u := a.job.Units
	var rows [][]string
	for _, r := range a.env.Reactions {
		node := mo.Nodes[r.Node]
		name := node.Name
		for d, e := range []struct {
			label string
			x     envelope.Extreme
		}{{"Fx (" + u.Force + ")", r.Fx}, {"Fy (" + u.Force + ")", r.Fy}, {"M (" + u.Moment() + ")", r.M}} {
			if !node.Support.Restrained(d) {
				continue
			}
			rows = append(rows, []string{name, e.label, fixed(e.x.Max), a.comboName(e.x.MaxBy), fixed(e.x.Min), a.comboName(e.x.MinBy)})
			name = ""
		}
	}
	return tb.table("Reactions (global: +X right, +Y up, M counter-clockwise)", []string{"node", "component", "max", "governing", "min", "governing"}, rows)
}
