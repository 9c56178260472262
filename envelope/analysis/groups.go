package analysis

import (
	"fmt"
	"math"
	"slices"
	"sort"
	"strings"

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
	// A floor: its level as the model names it (Job.Levels), such as
	// "level 2", and its index there; for beams at a height that is no
	// level of the model (beside a grid), Level is "" and Index -1, and Off
	// numbers such floors 1, 2, … from the lowest. Y is its height.
	Level string
	Index int
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
	levels := Levels(job)
	floors := map[float64]*Group{} // by height: a level's, or the beam's own
	lines := columnLines(job)
	byLine := make([][]int, len(lines))
	other := &Group{Kind: Other}
	for m := range mo.Members {
		switch {
		case mo.IsBeam(m):
			y := mo.Nodes[mo.Members[m].Start].Y
			g := &Group{Kind: Floor, Index: levelAt(levels, y), Y: y}
			if g.Index >= 0 {
				g.Level, g.Y = levels[g.Index].Name, levels[g.Index].Y
			} else if f := nearestFloor(floors, y); f != nil {
				g = f
			}
			if floors[g.Y] == nil {
				floors[g.Y] = g
			}
			floors[g.Y].Members = append(floors[g.Y].Members, m)
		case mo.IsColumn(m):
			i := lineOf(lines, mo.Nodes[mo.Bottom(m)].X)
			byLine[i] = append(byLine[i], m)
		default:
			other.Members = append(other.Members, m)
		}
	}
	var out []Group
	ys := make([]float64, 0, len(floors))
	for y := range floors {
		ys = append(ys, y)
	}
	sort.Float64s(ys)
	off := 0
	for _, y := range ys {
		g := floors[y]
		if g.Index < 0 {
			off++
			g.Off = off
		}
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

// Levels returns the levels of job as its model names them (Job.Levels),
// from the lowest; for a job that gives none, every distinct node height
// from the lowest, named "level 0", "level 1", … as the model file's
// "level N" selectors count them.
func Levels(job *Job) []Level {
	if len(job.Levels) > 0 {
		out := slices.Clone(job.Levels)
		sort.SliceStable(out, func(i, j int) bool { return out[i].Y < out[j].Y })
		return out
	}
	ys := make([]float64, 0, len(job.Model.Nodes))
	for _, n := range job.Model.Nodes {
		ys = append(ys, n.Y)
	}
	sort.Float64s(ys)
	var out []Level
	for _, y := range ys {
		if len(out) == 0 || y-out[len(out)-1].Y > coordTol {
			out = append(out, Level{Name: fmt.Sprintf("level %d", len(out)), Y: y})
		}
	}
	return out
}

// levelAt returns the index of the level at height y (within coordTol)
// in levels, sorted by height; -1 for none.
func levelAt(levels []Level, y float64) int {
	i := sort.Search(len(levels), func(i int) bool { return levels[i].Y >= y-coordTol })
	if i < len(levels) && levels[i].Y <= y+coordTol {
		return i
	}
	return -1
}

// nearestFloor returns the floor of floors on no level at height y
// (within coordTol), or nil.
func nearestFloor(floors map[float64]*Group, y float64) *Group {
	for fy, g := range floors {
		if g.Index < 0 && math.Abs(fy-y) <= coordTol {
			return g
		}
	}
	return nil
}

// LevelName returns the short name of member m's level, the one the
// deflection table shows: "2" for "level 2", the name itself for a level
// named otherwise, "-" for a member on no level.
func LevelName(job *Job, levels []Level, m int) string {
	mo := job.Model
	i := levelAt(levels, mo.Nodes[mo.Members[m].Start].Y)
	if i < 0 {
		return "-"
	}
	return strings.TrimPrefix(levels[i].Name, "level ")
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
