package modelfile

import (
	"fmt"
	"math"
	"sort"
	"strconv"

	"govern/frame"
	"govern/frame/units"
)

// Grid records the regular frame a [grid] table generated: column lines
// lettered A, B, … left to right at X positions Lines, levels numbered 0
// (base) up at heights Levels.
type Grid struct {
	Lines   []float64 // X of each column line
	Levels  []float64 // Y of each level, 0 = base
	Spacing float64   // distance between parallel frames; 0 when not given

	nodes, members int // the first nodes and members of the model are the grid's
}

func (g *Grid) isGridNode(i int) bool   { return i < g.nodes }
func (g *Grid) isGridMember(i int) bool { return i < g.members }

// LineName returns the letters of column line i: A … Z, AA, AB, …
func LineName(i int) string {
	s := ""
	for i++; i > 0; i = (i - 1) / 26 {
		s = string(rune('A'+(i-1)%26)) + s
	}
	return s
}

// lineIndex is the inverse of LineName; -1 when s is not letters.
func lineIndex(s string) int {
	if s == "" || len(s) > 4 { // four letters are past any grid
		return -1
	}
	n := 0
	for _, r := range s {
		if r < 'A' || r > 'Z' {
			return -1
		}
		n = n*26 + int(r-'A'+1)
	}
	return n - 1
}

// maxGrid bounds the generated frame so that a typing slip cannot ask for
// more memory than the machine has.
const maxGrid = 2000

func (r *reader) readGrid(t *table) {
	r.gridFailed = true // until it is generated
	defer func() {
		if r.gridFailed {
			t.fail("", problem(ErrValue, "no frame is generated until the problems in [grid] are corrected; until then, what refers to its nodes, members, levels and lines is not checked"))
		}
	}()
	bays, storeys := t.qtys("bays", units.Length), t.qtys("storeys", units.Length)
	ok := t.has("bays") && t.has("storeys") && bays != nil && storeys != nil
	if t.need("bays") && emptyArray(t.m["bays"]) {
		t.fail("bays", problem(ErrValue, "bays is empty: give at least one bay width"))
		ok = false
	}
	if t.need("storeys") && emptyArray(t.m["storeys"]) {
		t.fail("storeys", problem(ErrValue, "storeys is empty: give at least one storey height"))
		ok = false
	}
	for key, v := range map[string][]float64{"bays": bays, "storeys": storeys} {
		for i, x := range v {
			if !(x > 0) {
				t.fail(key, problem(ErrValue, "%s[%d] = %g: must be greater than zero", key, i+1, x))
				ok = false
			}
		}
		if len(v) > maxGrid {
			t.fail(key, problem(ErrValue, "%d %s: at most %d", len(v), key, maxGrid))
			ok = false
		}
	}
	// Lines or levels closer than coordTol would put every node of one on
	// a node of the other: say so once, here, not node by node.
	for key, v := range map[string][]float64{"bays": bays, "storeys": storeys} {
		at, name := 0.0, func(i int) string { return "column lines " + LineName(i) + " and " + LineName(i+1) }
		if key == "storeys" {
			name = func(i int) string { return fmt.Sprintf("levels %d and %d", i, i+1) }
		}
		for i, x := range v {
			next := at + x
			if x > 0 && !(next-at > coordTol) {
				t.fail(key, problem(ErrValue, "%s[%d] = %g puts %s %.2g apart, not more than %g, the distance within which two nodes are one position",
					key, i+1, x, name(i), next-at, coordTol))
				ok = false
			}
			at = next
		}
	}
	base := t.str("base", "fixed")
	if !t.oneOf("base", base, "fixed", "pinned") {
		ok = false
	}
	var col, beam int
	var okC, okB bool
	if t.need("column") {
		col, okC = r.section(t, "column")
	}
	if t.need("beam") {
		beam, okB = r.section(t, "beam")
	}
	spacing, okSp := t.qtyOK("spacing", units.Length, 0)
	if okSp && !(spacing > 0) {
		t.fail("spacing", problem(ErrValue, "spacing = %g: must be greater than zero", spacing))
		spacing = 0
	}
	r.spacingBad = t.has("spacing") && spacing == 0
	t.done()
	if !ok || !okC || !okB || len(bays) == 0 || len(storeys) == 0 {
		return
	}
	// Refuse a grid past the size limit before generating it.
	lines, levels := len(bays)+1, len(storeys)+1
	free := 3 * lines * levels
	for d := range 3 {
		if supports[base].Restrained(d) {
			free -= lines
		}
	}
	if free > frame.MaxEquations {
		t.fail("", problem(ErrTooLarge, "%d column lines × %d levels make %s nodes with %s free degrees of freedom; the limit is %s",
			lines, levels, Thousands(lines*levels), Thousands(free), Thousands(frame.MaxEquations)))
		return
	}
	if err := tooManyMembers(lines*(levels-1)+(lines-1)*(levels-1), fmt.Sprintf("%d column lines × %d levels make", lines, levels), "use fewer bays or storeys"); err != nil {
		t.fail("", err)
		return
	}
	g := &Grid{Spacing: spacing}
	x := 0.0
	g.Lines = append(g.Lines, 0)
	for _, b := range bays {
		x += b
		g.Lines = append(g.Lines, x)
	}
	y := 0.0
	g.Levels = append(g.Levels, 0)
	for _, h := range storeys {
		y += h
		g.Levels = append(g.Levels, y)
	}
	mo := r.job.Model
	r.nodes, r.members = map[string]int{}, map[string]int{}
	id := func(line, level int) int { return level*len(g.Lines) + line }
	for lv, y := range g.Levels {
		for ln, x := range g.Lines {
			s := frame.Free
			if lv == 0 {
				s = supports[base]
			}
			name := LineName(ln) + strconv.Itoa(lv)
			r.nodes[name] = len(mo.Nodes)
			mo.Nodes = append(mo.Nodes, frame.Node{Name: name, X: x, Y: y, Support: s})
		}
	}
	add := func(a, b, sec int) {
		name := mo.Nodes[a].Name + "-" + mo.Nodes[b].Name
		r.members[name] = len(mo.Members)
		mo.Members = append(mo.Members, frame.Member{Name: name, Start: a, End: b, Section: sec})
	}
	for lv := 1; lv < len(g.Levels); lv++ {
		for ln := range g.Lines {
			add(id(ln, lv-1), id(ln, lv), col)
		}
		for ln := 1; ln < len(g.Lines); ln++ {
			add(id(ln-1, lv), id(ln, lv), beam)
		}
	}
	g.nodes, g.members = len(mo.Nodes), len(mo.Members)
	r.job.Grid = g
	r.gridFailed = false
}

// levels returns the heights that "level N" selectors count: the grid's
// levels, or without a grid every distinct node height from the lowest up.
// Selectors are resolved once all nodes are read, so it is computed once.
func (r *reader) levels() []float64 {
	if r.job.Grid != nil {
		return r.job.Grid.Levels
	}
	if r.levelYs == nil {
		r.levelYs = distinct(r.job.Model.Nodes, func(n frame.Node) float64 { return n.Y })
	}
	return r.levelYs
}

// lines returns the X positions that "line A" selectors count: the grid's
// column lines, or without a grid every distinct node X from the left.
func (r *reader) lines() []float64 {
	if r.job.Grid != nil {
		return r.job.Grid.Lines
	}
	if r.lineXs == nil {
		r.lineXs = distinct(r.job.Model.Nodes, func(n frame.Node) float64 { return n.X })
	}
	return r.lineXs
}

// emptyArray reports whether v is an array with no elements.
func emptyArray(v any) bool {
	a, ok := v.([]any)
	return ok && len(a) == 0
}

func distinct(nodes []frame.Node, f func(frame.Node) float64) []float64 {
	v := make([]float64, 0, len(nodes))
	for _, n := range nodes {
		if x := f(n); !math.IsNaN(x) { // NaN: a coordinate already reported
			v = append(v, x)
		}
	}
	sort.Float64s(v)
	var out []float64
	for _, x := range v {
		if len(out) == 0 || x-out[len(out)-1] > coordTol {
			out = append(out, x)
		}
	}
	return out
}
