package modelfile

import (
	"fmt"
	"maps"
	"math"
	"slices"

	"govern/envelope/analysis"
	"govern/frame"
)

// MaxMemberLoads is the most member loads a model may hold, counting each
// member a selector picks and each member a case's self weight loads.
const MaxMemberLoads = 5_000_000

// MaxStationValues is the most station values (members × stations) the
// envelopes of a model may hold: analysis.MaxStationValues. The analysis
// refuses a model past it, asking for fewer stations; the reader refuses
// one whose members are too many for it at the fewest stations there can
// be, two (the ends of each member), where fewer stations cannot help.
const MaxStationValues = analysis.MaxStationValues

// maxMembers is the most members MaxStationValues admits, at two stations.
const maxMembers = MaxStationValues / 2

// tooManyMembers returns the problem of a model of n members, what (such
// as "the model has") saying where they come from and how to have fewer,
// or nil when they fit.
func tooManyMembers(n int, what, fewer string) error {
	if n <= maxMembers {
		return nil
	}
	return problem(ErrTooLarge, "%s %s members, whose envelopes would hold at least %s station values (two a member, its ends, the fewest there can be); the limit is %s station values, which admits %s members: %s",
		what, Thousands(n), Thousands(2*n), Thousands(MaxStationValues), Thousands(maxMembers), fewer)
}

// checks holds what the model-wide checks need beyond the model itself.
type checks struct {
	nodeAt   tablesBy // the [[node]] table that defined or changed each node
	memberAt tablesBy // the [[member]] table that defined or changed each member
	passes   passesBy // nodes each member may pass by without being joined to them
	ends     [][2]int // the nodes each [[member]] table names as start and end (-1: none), built or not

	gridFailed bool // a [grid] was given but could not be generated
	spacingBad bool // its spacing was given but is not valid

	memberLoads  int  // member loads so far
	loadsRefused bool // the member load limit has been reported

	sets     memberSets       // what each member's [[member]] table gives
	selected map[string][]int // members each selector picks, by canonical selector
	levelYs  []float64        // r.levels(), once computed
	// beamLevel holds, per member, the level its start is at when it is
	// a beam, else −1 (beamLevels), for the levels of levelsOf.
	beamLevel []int
	levelsOf  []float64
	lineXs    []float64 // r.lines(), once computed
}

// tablesBy records the table that defined or changed each node or member,
// by index; nil for those of a [grid] no table changed.
type tablesBy []*table

func (ts tablesBy) at(i int) *table {
	if i < len(ts) {
		return ts[i]
	}
	return nil
}

func (ts *tablesBy) set(i int, t *table) {
	for len(*ts) <= i {
		*ts = append(*ts, nil)
	}
	(*ts)[i] = t
}

// passesBy records, by member, the nodes listed in its passes.
type passesBy map[int][]int32

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
	r.checkConnected()
	r.checkPositions()
	r.checkMemberEnds()
	r.checkOnMembers()
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
	if err := tooManyMembers(len(mo.Members), "the model has", "use fewer members"); err != nil {
		r.fail(0, "", err)
	}
}

// checkConnected reports nodes that no member joins. While some [[member]]
// table could not be built it reports nothing: that member may be the one
// meant to join the node, and its own problem is reported.
func (r *reader) checkConnected() {
	if len(r.broken) > 0 {
		return
	}
	mo := r.job.Model
	joined := map[string]bool{} // by name, so a node defined twice is one node
	for _, m := range mo.Members {
		joined[mo.Nodes[m.Start].Name], joined[mo.Nodes[m.End].Name] = true, true
	}
	for _, e := range r.ends {
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

// checkPositions reports a node within coordTol of an earlier one, against
// the first such, unless the two share a name (reported as defined twice)
// or a member joins them (reported as having zero length).
func (r *reader) checkPositions() {
	mo := r.job.Model
	joins := map[[2]int]bool{}
	for _, e := range r.ends {
		joins[[2]int{min(e[0], e[1]), max(e[0], e[1])}] = true
	}
	xs, ys := r.coordinates()
	nearPoints(xs, ys, coordTol, func(first, later int) bool {
		p, q := mo.Nodes[first], mo.Nodes[later]
		if p.Name == q.Name || joins[[2]int{first, later}] {
			return false
		}
		r.failAt(r.nodeAt.at(later), fmt.Sprintf("node %q", q.Name), "x",
			problem(ErrDuplicate, "node %q is at the same position (%g, %g) as node %q", q.Name, q.X, q.Y, p.Name))
		return true
	})
}

// coordinates returns the nodes' coordinates, NaN where one could not be read.
func (r *reader) coordinates() (xs, ys []float64) {
	mo := r.job.Model
	xs, ys = make([]float64, len(mo.Nodes)), make([]float64, len(mo.Nodes))
	for i, nd := range mo.Nodes {
		xs[i], ys[i] = nd.X, nd.Y
	}
	return xs, ys
}

// checkOnMembers reports a node that lies on a member between its ends
// without being joined to it (the member would carry on as if the node
// were not there), unless the member lists it in passes, and a node a
// member lists in passes that does not lie on it.
func (r *reader) checkOnMembers() {
	mo := r.job.Model
	xs, ys := r.coordinates()
	segs := make([][2]int, len(mo.Members))
	for i, m := range mo.Members {
		segs[i] = [2]int{m.Start, m.End}
	}
	passed := map[[2]int]bool{} // (member, node) pairs that passes allows and that do lie on it
	pointsOnSegments(xs, ys, segs, coordTol, func(s, p int, along float64) {
		if slices.Contains(r.passes[s], int32(p)) {
			passed[[2]int{s, p}] = true
			return
		}
		m, nd := mo.Members[s], mo.Nodes[p]
		err := problem(ErrValue, "node %q lies on member %q, %g from its start, but is not joined to it: split the member at the node, or, if the two cross without a connection, give the member passes = [%q]",
			nd.Name, m.Name, along, nd.Name)
		if t := r.memberAt.at(s); t != nil {
			t.fail("passes", err)
		} else {
			r.failAt(r.nodeAt.at(p), fmt.Sprintf("node %q", nd.Name), "x", err)
		}
	})
	for _, s := range slices.Sorted(maps.Keys(r.passes)) {
		for _, p := range r.passes[s] {
			if !passed[[2]int{s, int(p)}] && !math.IsNaN(xs[p]) && !math.IsNaN(ys[p]) {
				r.memberAt.at(s).fail("passes", problem(ErrValue, "passes: node %q does not lie on member %q between its ends", mo.Nodes[p].Name, mo.Members[s].Name))
			}
		}
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
