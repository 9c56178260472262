package modelfile

import (
	"errors"
	"fmt"
	"slices"

	"govern/frame"
	"govern/frame/units"
)

// readLoad reads one [[case.load]] table into c.
func (r *reader) readLoad(t *table, c *frame.Case) {
	defer t.done()
	if !t.need("type") {
		t.skipRest() // which keys belong cannot be told
		return
	}
	typ := t.str("type", "")
	if !t.oneOf("type", typ, loadTypes...) {
		t.skipRest() // which keys belong cannot be told
		return
	}
	mo := r.job.Model
	switch typ {
	case "node":
		n, ok := r.node(t, "node")
		nl := frame.NodeLoad{Node: n, Fx: t.qty("fx", units.Force, 0), Fy: t.qty("fy", units.Force, 0), M: t.qty("m", units.Moment, 0)}
		if ok {
			c.NodeLoads = append(c.NodeLoads, nl)
			r.noteMoment(t, nl)
		}
		return
	case "displacement":
		r.readDisplacement(t, c)
		return
	}
	dir := frame.Gravity
	if typ == "udl" || typ == "point" {
		d := t.str("direction", "gravity")
		if t.oneOf("direction", d, "gravity", "x") && d == "x" {
			dir = frame.GlobalX
		}
	}
	var members []int
	if t.need("on") {
		members = r.selectAll(t, true)
	}
	if !r.budget(t, "on", len(members)) {
		members = nil
	}
	switch typ {
	case "udl":
		has := t.need("w")
		w := t.qty("w", units.LineLoad, 0)
		w2 := t.qty("w2", units.LineLoad, w) // at to
		from, to := t.qty("from", units.Length, 0), t.qty("to", units.Length, -1)
		if !has {
			return
		}
		for _, m := range members {
			l := mo.Length(m)
			a, b := from, to
			if !t.has("to") {
				b = l
			}
			if a < -coordTol || b > l+coordTol || !(b > a) {
				t.fail("from", problem(ErrValue, "member %q: from = %g, to = %g is not a part of the member (length %g)", mo.Members[m].Name, a, b, l))
				continue
			}
			c.MemberLoads = append(c.MemberLoads, frame.MemberLoad{Member: m, Direction: dir, From: a, To: b, W: w, WEnd: w2})
		}
	case "moment":
		hasM := t.need("m")
		hasAt := t.need("at")
		mv := t.qty("m", units.Moment, 0) // counter-clockwise
		at := t.qty("at", units.Length, 0)
		if !hasM || !hasAt {
			return
		}
		for _, m := range members {
			if l := mo.Length(m); at < -coordTol || at > l+coordTol {
				t.fail("at", problem(ErrValue, "member %q: at = %g is outside the member (length %g)", mo.Members[m].Name, at, l))
				continue
			}
			c.MemberLoads = append(c.MemberLoads, frame.MemberLoad{Member: m, Moment: true, At: at, M: mv})
		}
	case "temperature":
		dT := t.qty("dT", units.TempDiff, 0)
		g := t.qty("dT_gradient", units.TempDiff, 0) // local +y face less local −y face
		if !t.has("dT") && !t.has("dT_gradient") {
			t.fail("", problem(ErrMissing, "a temperature load needs dT (a uniform change), dT_gradient (the local +y face less the local -y face) or both"))
			return
		}
		for _, m := range members {
			si := mo.Members[m].Section
			sec := &mo.Sections[si]
			switch {
			case !(sec.Alpha > 0) && r.thermal[si][0], g != 0 && !(sec.Depth > 0) && r.thermal[si][1]:
				return // the section's alpha or depth is wrong, reported there
			case !(sec.Alpha > 0):
				key := "dT"
				if !t.has(key) {
					key = "dT_gradient"
				}
				t.fail(key, problem(ErrMissing, "member %q: section %q gives no alpha, the coefficient of thermal expansion a temperature load needs", mo.Members[m].Name, sec.Name))
				return // once: the other members likely share the section
			case g != 0 && !(sec.Depth > 0):
				t.fail("dT_gradient", problem(ErrMissing, "member %q: section %q gives no depth, which a temperature gradient needs (the curvature is alpha × dT_gradient / depth)", mo.Members[m].Name, sec.Name))
				return
			}
			c.MemberLoads = append(c.MemberLoads, frame.MemberLoad{Member: m, Thermal: true, DT: dT, DTGrad: g})
		}
	case "point":
		hasP := t.need("P")
		hasAt := t.need("at")
		p, at := t.qty("P", units.Force, 0), t.qty("at", units.Length, 0)
		if !hasP || !hasAt {
			return
		}
		for _, m := range members {
			if l := mo.Length(m); at < -coordTol || at > l+coordTol {
				t.fail("at", problem(ErrValue, "member %q: at = %g is outside the member (length %g)", mo.Members[m].Name, at, l))
				continue
			}
			c.MemberLoads = append(c.MemberLoads, frame.MemberLoad{Member: m, Direction: dir, Point: true, At: at, P: p})
		}
	case "area":
		has := t.need("q")
		q := t.qty("q", units.Pressure, 0)
		if !has {
			return
		}
		if r.job.Grid == nil || r.job.Grid.Spacing == 0 {
			if !r.gridFailed && !r.spacingBad { // else already reported in [grid]
				t.fail("q", problem(ErrMissing, "an area load needs [grid] spacing, the distance between parallel frames"))
			}
			return
		}
		w := q * r.job.Grid.Spacing
		for _, m := range members {
			if !mo.IsBeam(m) {
				t.fail("on", problem(ErrValue, "member %q is not a beam: area loads act on beams", mo.Members[m].Name))
				continue
			}
			l := mo.Length(m)
			c.MemberLoads = append(c.MemberLoads, frame.MemberLoad{Member: m, To: l, W: w, WEnd: w})
		}
	}
}

// noteMoment records the line of a moment applied at a node where every
// member end is released, which the solver refuses as a mechanism for the
// case (Job.MomentLoad): the first such load of each case at each node.
// The case being read is the next one of the model.
func (r *reader) noteMoment(t *table, nl frame.NodeLoad) {
	if nl.M == 0 {
		return
	}
	if r.released == nil {
		r.released = r.job.Model.ReleasedRotations()
	}
	if !r.released[nl.Node] {
		return
	}
	key := [2]int{len(r.job.Model.Cases), nl.Node}
	if r.job.moments == nil {
		r.job.moments = map[[2]int]loadLine{}
	}
	if _, seen := r.job.moments[key]; !seen {
		r.job.moments[key] = loadLine{r.loc.at(&t.pos, "m"), t.where}
	}
}

// loadTypes are the values of a load's type.
var loadTypes = []string{"udl", "point", "moment", "area", "temperature", "node", "displacement"}

// displacementKeys are the components of an imposed displacement, by
// direction, and their quantities.
var (
	displacementKeys = [3]string{"dx", "dy", "rz"}
	displacementQty  = [3]units.Quantity{units.Length, units.Length, units.Rotation}
)

// readDisplacement reads a displacement imposed on a supported node (a
// settlement): dx and dy, lengths (dy positive up, so a settlement is
// negative), and rz, a rotation in radians, counter-clockwise; each only
// in a direction the node's support holds.
func (r *reader) readDisplacement(t *table, c *frame.Case) {
	n, ok := r.node(t, "node")
	var v [3]float64
	given := false
	for d, key := range displacementKeys {
		v[d] = t.qty(key, displacementQty[d], 0)
		given = given || t.has(key)
	}
	if !given {
		t.fail("", problem(ErrMissing, "a displacement needs dx, dy or rz (in directions the node's support holds)"))
		return
	}
	if !ok {
		return
	}
	nd := &r.job.Model.Nodes[n]
	for d, key := range displacementKeys {
		if t.has(key) && !nd.Support.Restrained(d) {
			what := fmt.Sprintf("its support (%v) does not hold it in %s", nd.Support, directionWords[d])
			if nd.Support == frame.Free {
				what = "it has no support"
			}
			t.fail(key, problem(ErrValue, "node %q: %s; a displacement is imposed only where a support holds the node (a spring's node moves with the frame: load it instead)", nd.Name, what))
			return
		}
	}
	c.Displacements = append(c.Displacements, frame.NodeDisplacement{Node: n, Ux: v[0], Uy: v[1], Rz: v[2]})
}

// selectAll returns the members that the selectors of on pick, their
// union. With once, a member picked by two of them is an error: one load
// acts on each member once; without, it is picked once.
func (r *reader) selectAll(t *table, once bool) []int {
	sels := t.strs("on")
	if sels != nil && len(sels) == 0 {
		t.fail("on", problem(ErrValue, "on is empty: name at least one member or selector"))
		return nil
	}
	var members []int
	var by map[int]int // the selector that picked each member, when there are several
	if len(sels) > 1 {
		by = map[int]int{}
	}
	type overlap struct {
		a, b, first, n int // selectors a and b both pick first and n-1 more
	}
	var overlaps []overlap
	for si, sel := range sels {
		if sel == "" {
			t.fail("on", problem(ErrValue, "on: an empty selector"))
			continue
		}
		if before := countOf(sels[:si], sel); before > 0 {
			if before == 1 { // reported once, however often it is repeated
				t.fail("on", problem(ErrDuplicate, "on: %q is given twice", sel))
			}
			continue
		}
		if r.broken[sel] {
			continue // already reported where the member is defined
		}
		ms, err := r.selectMembers(sel)
		if errors.Is(err, errNoSuchMember) && len(r.broken) > 0 {
			continue // likely a member whose definition failed, reported there
		}
		if err != nil {
			if !r.gridFailed { // else perhaps the grid's, which was not generated
				t.fail("on", problem(ErrReference, "%v", err))
			}
			continue
		}
		if by == nil {
			members = append(members, ms...)
			continue
		}
		for _, m := range ms {
			prev, dup := by[m]
			if !dup {
				by[m] = si
				members = append(members, m)
				continue
			}
			if !once {
				continue
			}
			k := slices.IndexFunc(overlaps, func(o overlap) bool { return o.a == prev && o.b == si })
			if k < 0 {
				overlaps = append(overlaps, overlap{a: prev, b: si, first: m})
				k = len(overlaps) - 1
			}
			overlaps[k].n++
		}
	}
	for _, o := range overlaps {
		more := ""
		if o.n > 1 {
			more = fmt.Sprintf(" and %d more", o.n-1)
		}
		t.fail("on", problem(ErrDuplicate, "on: %q and %q both pick member %q%s; a load acts once on each member, so remove one of them",
			sels[o.a], sels[o.b], r.job.Model.Members[o.first].Name, more))
	}
	return members
}

func countOf(ss []string, s string) int {
	n := 0
	for _, v := range ss {
		if v == s {
			n++
		}
	}
	return n
}
