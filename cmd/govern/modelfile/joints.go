package modelfile

import (
	"fmt"
	"slices"

	"govern/frame"
	"govern/frame/units"
)

// The supports and joints of a model: support (a named kind or the
// directions held) and springs kx, ky, kr of a [[node]]; semi-rigid ends
// and rigid end zones of a [[member]]; [analysis] rigid_zones.

var supports = map[string]frame.Support{"free": frame.Free, "fixed": frame.Fixed, "pinned": frame.Pinned, "roller": frame.Roller}

// directionWords name the directions a support may hold, in the order of
// the degrees of freedom.
var directionWords = []string{"x", "y", "rotation"}

// support reads support: a named kind ("fixed", "pinned", "roller",
// "free"), or an array of the directions held, such as ["x"] for a floor
// held laterally only or ["x", "rotation"].
func (r *reader) support(t *table, def frame.Support) frame.Support {
	v, ok := t.get("support")
	if !ok {
		return def
	}
	if _, isArray := v.([]any); !isArray {
		s := t.str("support", def.String())
		if !t.oneOf("support", s, "fixed", "pinned", "roller", "free") {
			return def
		}
		return supports[s]
	}
	words := t.strs("support")
	if words == nil {
		return def // its type is reported
	}
	if len(words) == 0 {
		t.fail("support", problem(ErrValue, `support = []: name the directions held (%s), or write support = "free"`, quoteList(directionWords)))
		return def
	}
	var s frame.Support
	for _, w := range words {
		d := slices.Index(directionWords, w)
		if d < 0 {
			msg := fmt.Sprintf("support: %q is not a direction; the directions are %s", w, quoteList(directionWords))
			if c := closest(w, directionWords); c != "" {
				msg += fmt.Sprintf(" (did you mean %q?)", c)
			}
			t.fail("support", problem(ErrValue, "%s", msg))
			return def
		}
		if s.Restrained(d) {
			t.fail("support", problem(ErrDuplicate, "support: %q is given twice", w))
			return def
		}
		s |= frame.Hold(d)
	}
	return s
}

// springKeys are the springs of a node, by direction, and their
// quantities.
var (
	springKeys = [3]string{"kx", "ky", "kr"}
	springQty  = [3]units.Quantity{units.Spring, units.Spring, units.RotSpring}
)

// springs reads the elastic supports of a node, in the directions its
// support s leaves free: kx and ky are stiffnesses (force/length, such as
// kN/m) and kr a rotational stiffness (moment/radian, kN·m/rad). def is
// what the node had.
func (r *reader) springs(t *table, s frame.Support, def [3]float64) [3]float64 {
	out := def
	for d, key := range springKeys {
		k, ok := t.qtyOK(key, springQty[d], 0)
		if !ok {
			if !t.has(key) && s.Restrained(d) {
				out[d] = 0 // a support that now holds the direction replaces a spring
			}
			continue
		}
		switch {
		case k < 0:
			t.fail(key, problem(ErrValue, "%s = %g: must not be negative", key, k))
		case k > 0 && s.Restrained(d):
			t.fail(key, problem(ErrValue, "%s = %g: the support (%v) already holds the node in %s; a spring acts in a direction the support leaves free", key, k, s, directionWords[d]))
		default:
			out[d] = k
		}
	}
	return out
}

// memberEnds reads the semi-rigid ends and rigid end zones of a member
// of length l (0 when unknown) into mem, whose Name and Release are set:
// spring_start and spring_end, rotational stiffnesses (moment/radian), and
// offset_start and offset_end, lengths. It returns which zones the member
// gives itself (start, end), which [analysis] rigid_zones leaves.
func (r *reader) memberEnds(t *table, mem *frame.Member, l float64) (own [2]bool) {
	for side, key := range [2]string{"spring_start", "spring_end"} {
		k, ok := t.qtyOK(key, units.RotSpring, 0)
		if !ok {
			continue
		}
		released := mem.Release.AtStart()
		if side == 1 {
			released = mem.Release.AtEnd()
		}
		switch {
		case k < 0:
			t.fail(key, problem(ErrValue, "%s = %g: must not be negative (a hinge is release = %q)", key, k, [2]string{"start", "end"}[side]))
		case k == 0:
			t.fail(key, problem(ErrValue, "%s = 0: a spring of no stiffness is a hinge; write release = %q", key, [2]string{"start", "end"}[side]))
		case released:
			t.fail(key, problem(ErrValue, "%s: the member's %s is released (release = %q); give a release or a spring, not both", key, [2]string{"start", "end"}[side], mem.Release))
		default:
			if side == 0 {
				mem.SpringStart = k
			} else {
				mem.SpringEnd = k
			}
		}
	}
	for side, key := range [2]string{"offset_start", "offset_end"} {
		a, ok := t.qtyOK(key, units.Length, 0)
		if !ok {
			continue
		}
		if a < 0 {
			t.fail(key, problem(ErrValue, "%s = %g: must not be negative", key, a))
			continue
		}
		if side == 0 {
			mem.OffsetStart = a
		} else {
			mem.OffsetEnd = a
		}
		own[side] = true
	}
	if l > 0 && (t.has("offset_start") || t.has("offset_end")) && !(l-mem.OffsetStart-mem.OffsetEnd > 1e-6*l) {
		key := "offset_end"
		if !t.has(key) {
			key = "offset_start"
		}
		t.fail(key, problem(ErrValue, "rigid end zones %g and %g leave member %q (length %g) no flexible length", mem.OffsetStart, mem.OffsetEnd, mem.Name, l))
	}
	return own
}

// ownZones records the rigid end zones member m gives itself.
func (r *reader) ownZones(m int, own [2]bool) {
	for side, o := range own {
		if o {
			if r.ownZone == nil {
				r.ownZone = map[[2]int]bool{}
			}
			r.ownZone[[2]int{m, side}] = true
		}
	}
}

// rigidZones gives the members the rigid end zones the depths of the
// sections give (frame.RigidZones, times factor), where [analysis]
// rigid_zones asks for them, leaving the zones a member gives itself.
func (r *reader) rigidZones(factor float64) {
	mo := r.job.Model
	mo.SetRigidZones(factor, func(m, side int) bool { return r.ownZone[[2]int{m, side}] })
	// A zone of its own at one end beside one from the depths at the
	// other may leave a member too short.
	for m := range mo.Members {
		mem := &mo.Members[m]
		if l := mo.Length(m); !(l-mem.OffsetStart-mem.OffsetEnd > 1e-6*l) {
			if t := r.memberAt.at(m); t != nil {
				t.fail("", problem(ErrValue, "rigid end zones %g (start) and %g (end), its own and those rigid_zones gives, leave member %q (length %g) no flexible length", mem.OffsetStart, mem.OffsetEnd, mem.Name, l))
			}
		}
	}
}
