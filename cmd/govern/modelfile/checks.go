package modelfile

import (
	"fmt"
	"math"
	"sort"

	"govern/frame"
)

// MaxMemberLoads is the most member loads a model may hold, counting each
// member a selector picks and each member a case's self weight loads.
const MaxMemberLoads = 5_000_000

// checks holds what the model-wide checks need beyond the model itself.
type checks struct {
	more     int            // problems found past MaxProblems
	nodeAt   map[int]*table // the [[node]] table that defined each explicit node
	memberAt map[int]*table // the [[member]] table that defined each explicit member

	memberLoads  int  // member loads so far
	loadsRefused bool // the member load limit has been reported

	selected map[string][]int // members each selector picks, by canonical selector
	levelYs  []float64        // r.levels(), once computed
	lineXs   []float64        // r.lines(), once computed
}

// noteNode records that node i was defined by table t.
func (r *reader) noteNode(i int, t *table) {
	if r.nodeAt == nil {
		r.nodeAt = map[int]*table{}
	}
	r.nodeAt[i] = t
}

// noteMember records that member i was defined by table t.
func (r *reader) noteMember(i int, t *table) {
	if r.memberAt == nil {
		r.memberAt = map[int]*table{}
	}
	r.memberAt[i] = t
}

// budget counts n more member loads against MaxMemberLoads and reports,
// once, at key of t, when they no longer fit.
func (r *reader) budget(t *table, key string, n int) bool {
	r.memberLoads += n
	if r.memberLoads <= MaxMemberLoads {
		return true
	}
	if !r.loadsRefused {
		r.loadsRefused = true
		t.fail(key, problem(ErrTooLarge, "more than %s member loads (each member a selector picks, and each member a self weight loads, counts as one); the limit is %s",
			Thousands(MaxMemberLoads), Thousands(MaxMemberLoads)))
	}
	return false
}

// failAt reports a problem at key of the table that defined an explicit
// node or member, or without a line for one a [grid] generated.
func (r *reader) failAt(t *table, where, key string, err error) {
	if t != nil {
		t.fail(key, err)
		return
	}
	r.fail(0, where, err)
}

// checkModel makes the checks that need the whole model: that it is not
// empty, that every node is joined to a member, that no two nodes share a
// position and no two members join the same nodes, and that it is within
// the size limit. Together with the checks made while reading, these are
// every check of frame.Model.Validate, each reported with its line.
func (r *reader) checkModel(top *table) {
	mo := r.job.Model
	_, grid := top.m["grid"]
	_, nodes := top.m["node"]
	_, members := top.m["member"]
	_, cases := top.m["case"]
	if !grid && !nodes && !members && !cases {
		r.fail(0, "", problem(ErrMissing, "the model is empty: give a [grid] or [[node]] and [[member]] tables, and [[case]] tables (see docs/model-format.md)"))
		return
	}
	if !grid && !nodes {
		r.fail(0, "", problem(ErrMissing, "the model has no nodes: give a [grid] or [[node]] tables"))
	}
	if !grid && !members {
		r.fail(0, "", problem(ErrMissing, "the model has no members: give a [grid] or [[member]] tables"))
	}
	if !cases {
		r.fail(0, "", problem(ErrMissing, "the model has no load cases: give at least one [[case]]"))
	}
	r.checkConnected(top)
	r.checkPositions(top)
	r.checkMemberEnds()
	free := 0
	for _, nd := range mo.Nodes {
		for d := range 3 {
			if !nd.Support.Restrained(d) {
				free++
			}
		}
	}
	if free > frame.MaxEquations {
		r.fail(0, "", problem(ErrTooLarge, "the model has %s free degrees of freedom (%s nodes); the limit is %s",
			Thousands(free), Thousands(len(mo.Nodes)), Thousands(frame.MaxEquations)))
	}
}

// rawEnds returns the nodes that each [[member]] table names as its start
// and end, -1 where the name is not a node, whether or not the member could
// be built.
func (r *reader) rawEnds(top *table) [][2]int {
	ts, _ := top.m["member"].([]map[string]any)
	out := make([][2]int, len(ts))
	for i, t := range ts {
		for j, k := range []string{"start", "end"} {
			out[i][j] = -1
			if s, ok := t[k].(string); ok {
				if n, ok := r.nodes[s]; ok {
					out[i][j] = n
				}
			}
		}
	}
	return out
}

// checkConnected reports nodes that no member joins. While some [[member]]
// table could not be built it reports nothing: that member may be the one
// meant to join the node, and its own problem is reported.
func (r *reader) checkConnected(top *table) {
	if len(r.broken) > 0 {
		return
	}
	mo := r.job.Model
	joined := map[string]bool{} // by name, so a node defined twice is one node
	for _, m := range mo.Members {
		joined[mo.Nodes[m.Start].Name], joined[mo.Nodes[m.End].Name] = true, true
	}
	for _, e := range r.rawEnds(top) {
		for _, n := range e {
			if n >= 0 {
				joined[mo.Nodes[n].Name] = true
			}
		}
	}
	for i, nd := range mo.Nodes {
		if !joined[nd.Name] {
			r.failAt(r.nodeAt[i], fmt.Sprintf("node %q", nd.Name), "name",
				problem(ErrValue, "node %q is not joined to any member", nd.Name))
		}
	}
}

// checkPositions reports a node at the position of an earlier one, unless
// the two share a name (reported as defined twice) or a member joins them
// (reported as having zero length).
func (r *reader) checkPositions(top *table) {
	mo := r.job.Model
	joins := map[[2]int]bool{}
	for _, e := range r.rawEnds(top) {
		joins[[2]int{min(e[0], e[1]), max(e[0], e[1])}] = true
	}
	var idx []int
	for i, nd := range mo.Nodes {
		if !math.IsNaN(nd.X) && !math.IsNaN(nd.Y) { // NaN: already reported
			idx = append(idx, i)
		}
	}
	sort.Slice(idx, func(a, b int) bool {
		p, q := mo.Nodes[idx[a]], mo.Nodes[idx[b]]
		if p.X != q.X {
			return p.X < q.X
		}
		if p.Y != q.Y {
			return p.Y < q.Y
		}
		return idx[a] < idx[b]
	})
	// Coincident nodes are neighbours in this order (up to the rare pair
	// within coordTol but split by a third node, which is let pass).
	for a := 1; a < len(idx); a++ {
		i, j := idx[a-1], idx[a]
		p, q := mo.Nodes[i], mo.Nodes[j]
		first, later := min(i, j), max(i, j)
		if q.X-p.X > coordTol || math.Abs(q.Y-p.Y) > coordTol || p.Name == q.Name || joins[[2]int{first, later}] {
			continue
		}
		nd := mo.Nodes[later]
		r.failAt(r.nodeAt[later], fmt.Sprintf("node %q", nd.Name), "x",
			problem(ErrDuplicate, "node %q is at the same position (%g, %g) as node %q", nd.Name, nd.X, nd.Y, mo.Nodes[first].Name))
	}
}

// checkMemberEnds reports a member that joins the same two nodes as an
// earlier one, which would silently double its stiffness.
func (r *reader) checkMemberEnds() {
	mo := r.job.Model
	seen := map[[2]int]int{}
	for i, m := range mo.Members {
		key := [2]int{min(m.Start, m.End), max(m.Start, m.End)}
		first, dup := seen[key]
		if !dup {
			seen[key] = i
			continue
		}
		msg := fmt.Sprintf("member %q joins the same nodes as member %q", m.Name, mo.Members[first].Name)
		if r.job.Grid != nil && r.job.Grid.isGridMember(first) {
			msg += fmt.Sprintf("; to change the grid's member, give a [[member]] with name = %q", mo.Members[first].Name)
		}
		r.failAt(r.memberAt[i], fmt.Sprintf("member %q", m.Name), "end", problem(ErrDuplicate, "%s", msg))
	}
}

// Thousands formats n with commas between groups of three digits, as the
// size limits are written in messages.
func Thousands(n int) string {
	s := fmt.Sprint(n)
	out := make([]byte, 0, len(s)+len(s)/3)
	for i := range len(s) {
		if i > 0 && s[i-1] != '-' && (len(s)-i)%3 == 0 {
			out = append(out, ',')
		}
		out = append(out, s[i])
	}
	return string(out)
}
