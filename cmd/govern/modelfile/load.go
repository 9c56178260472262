package modelfile

import (
	"errors"

	"govern/frame"
)

// readLoad reads one [[case.load]] table into c.
func (r *reader) readLoad(t *table, c *frame.Case) {
	defer t.done()
	if !t.need("type") {
		t.skipRest() // which keys belong cannot be told
		return
	}
	typ := t.str("type", "")
	if !t.oneOf("type", typ, "udl", "point", "area", "node") {
		t.skipRest() // which keys belong cannot be told
		return
	}
	mo := r.job.Model
	if typ == "node" {
		n, ok := r.node(t, "node")
		nl := frame.NodeLoad{Node: n, Fx: t.num("fx", 0), Fy: t.num("fy", 0), M: t.num("m", 0)}
		if ok {
			c.NodeLoads = append(c.NodeLoads, nl)
		}
		return
	}
	dir := frame.Gravity
	if typ != "area" {
		d := t.str("direction", "gravity")
		if t.oneOf("direction", d, "gravity", "x") && d == "x" {
			dir = frame.GlobalX
		}
	}
	var members []int
	if t.need("on") {
		for _, sel := range t.strs("on") {
			if r.broken[sel] {
				continue // already reported where the member is defined
			}
			ms, err := r.selectMembers(sel)
			if errors.Is(err, errNoSuchMember) && len(r.broken) > 0 {
				continue // likely a member whose definition failed, reported there
			}
			if err != nil {
				t.fail("on", problem(ErrReference, "%v", err))
				continue
			}
			members = append(members, ms...)
		}
	}
	if !r.budget(t, "on", len(members)) {
		members = nil
	}
	switch typ {
	case "udl":
		has := t.need("w")
		w := t.num("w", 0)
		from, to := t.num("from", 0), t.num("to", -1)
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
			c.MemberLoads = append(c.MemberLoads, frame.MemberLoad{Member: m, Direction: dir, From: a, To: b, W: w, WEnd: w})
		}
	case "point":
		hasP := t.need("P")
		hasAt := t.need("at")
		p, at := t.num("P", 0), t.num("at", 0)
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
		q := t.num("q", 0)
		if !has {
			return
		}
		if r.job.Grid == nil || r.job.Grid.Spacing == 0 {
			t.fail("q", problem(ErrMissing, "an area load needs [grid] spacing, the distance between parallel frames"))
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
