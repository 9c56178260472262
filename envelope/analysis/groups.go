package analysis

import (
	"math"
	"sort"

	"govern/patterns"
)

// GroupKind says what a Group holds.
type GroupKind uint8

const (
	// Floor is the beams at one level, in span order.
	Floor GroupKind = iota
	// ColumnLine is the columns at one X, from the bottom.
	ColumnLine
	// Other is every member that is neither a beam nor a column.
	Other
)

// Group is a floor, a column line or the other members: what the tables
// and the report gather members by.
type Group struct {
	Kind GroupKind
	// A floor: its level, counted from 1 at the lowest beam height
	// (patterns.Spans), and its height, that of its first beam's start.
	Level int
	Y     float64
	// A column line: its X and its name in Job.Lines, or "" for a line
	// of columns on none of them, then numbered Off = 1, 2, … from the
	// left among those.
	X    float64
	Line string
	Off  int
	// Members, in span order for a floor and from the bottom for a line.
	Members []int
}

// Groups returns the floors from the lowest, then the column lines from
// the left, then the other members, if any.
func Groups(job *Job) []Group {
	mo := job.Model
	spans := patterns.Spans(mo)
	levels := map[int]*Group{}
	lines := columnLines(job)
	byLine := make([][]int, len(lines))
	other := &Group{Kind: Other}
	for m := range mo.Members {
		switch {
		case mo.IsBeam(m):
			lv := spans[m].Level
			if levels[lv] == nil {
				levels[lv] = &Group{Kind: Floor, Level: lv, Y: mo.Nodes[mo.Members[m].Start].Y}
			}
			levels[lv].Members = append(levels[lv].Members, m)
		case mo.IsColumn(m):
			i := lineOf(lines, mo.Nodes[mo.Bottom(m)].X)
			byLine[i] = append(byLine[i], m)
		default:
			other.Members = append(other.Members, m)
		}
	}
	var out []Group
	lvs := make([]int, 0, len(levels))
	for lv := range levels {
		lvs = append(lvs, lv)
	}
	sort.Ints(lvs)
	for _, lv := range lvs {
		g := levels[lv]
		sort.SliceStable(g.Members, func(i, j int) bool { return spans[g.Members[i]].Number < spans[g.Members[j]].Number })
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
		g := Group{Kind: ColumnLine, X: l.x, Line: l.name, Off: l.off, Members: ms}
		sort.SliceStable(g.Members, func(i, j int) bool { return bottom(g.Members[i]) < bottom(g.Members[j]) })
		out = append(out, g)
	}
	if len(other.Members) > 0 {
		out = append(out, *other)
	}
	return out
}

// coordTol is the distance under which a column stands on a line: the
// model reader's tolerance on coordinates.
const coordTol = 1e-9

// columnLine is an X position where columns stand, with the name the model
// gives it.
type columnLine struct {
	x    float64
	name string // the line's name; "" for a position on no line
	off  int    // for one on no line: 1, 2, … from the left
}

// columnLines returns the X positions of the columns of a job, from the
// left: the job's lines, named, and any column off them unnamed.
func columnLines(job *Job) []columnLine {
	var out []columnLine
	for _, l := range job.Lines {
		out = append(out, columnLine{x: l.X, name: l.Name})
	}
	sort.SliceStable(out, func(i, j int) bool { return out[i].x < out[j].x })
	mo := job.Model
	var off []columnLine
	for m := range mo.Members {
		if x := mo.Nodes[mo.Bottom(m)].X; mo.IsColumn(m) && nearest(out, x) < 0 && nearest(off, x) < 0 {
			off = append(off, columnLine{x: x})
			sort.Slice(off, func(i, j int) bool { return off[i].x < off[j].x })
		}
	}
	for i := range off {
		off[i].off = i + 1
	}
	out = append(out, off...)
	sort.SliceStable(out, func(i, j int) bool { return out[i].x < out[j].x })
	return out
}

// nearest returns the index of the line at x (within coordTol) in lines,
// sorted by x; -1 for none.
func nearest(lines []columnLine, x float64) int {
	i := sort.Search(len(lines), func(i int) bool { return lines[i].x >= x-coordTol })
	if i < len(lines) && lines[i].x <= x+coordTol {
		return i
	}
	return -1
}

// lineOf returns the index of the line at x, which must be one of lines.
func lineOf(lines []columnLine, x float64) int {
	i := nearest(lines, x)
	if i < 0 {
		panic("analysis: a column on no line")
	}
	return i
}
