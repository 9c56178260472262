package main

import (
	"math"
	"sort"

	"govern/envelope"
	"govern/frame"
	"govern/patterns"
)

// A run is a span or a cantilever: a line of collinear members that are
// not vertical (beams, rafters), whose deflection is reported as one.
//
//   - A span runs between two nodes that hold it: a support, or a column
//     or other member from below. Its deflection is measured from the chord
//     between its displaced ends, and its length is the run's.
//   - A cantilever runs from a free end (a node with no support and no
//     other member) back to the first node that holds it, its root. Its
//     deflection is measured from the line through the displaced root
//     parallel to the run as built: the free end's movement relative to
//     the root, including the root's rotation. Span/deflection uses twice
//     its length.
//
// A member that only rises from a node (a column standing on the beam)
// is carried by the run and does not end it. A run whose ends would both
// be free, carried only by such members (hangers), is divided at every
// node another member meets instead.
type run struct {
	members     []int // left to right
	left, right int   // end nodes, left the one of smaller X
	cantilever  bool
	root        int // the cantilever's root: left or right
	length      float64
	beam        bool // horizontal: the members are beams
}

// ratioLength is the length span/deflection is taken over: the length of a
// span, twice that of a cantilever.
func (r *run) ratioLength() float64 {
	if r.cantilever {
		return 2 * r.length
	}
	return r.length
}

// collinearTol is the tolerance on the sine of the angle between two
// members taken as one straight line, as the one under which a member
// counts as horizontal (frame's orientation tolerance).
const collinearTol = 1e-6

// runs returns the spans and cantilevers of mo, beams level by level from
// the lowest and left to right, then rafters from the lowest.
func runs(mo *frame.Model) []run {
	at := make([][]int, len(mo.Nodes))
	for m, mem := range mo.Members {
		at[mem.Start] = append(at[mem.Start], m)
		at[mem.End] = append(at[mem.End], m)
	}
	// dir returns the unit vector along member m away from node n.
	dir := func(m, n int) (float64, float64) {
		mem := mo.Members[m]
		o := mem.End
		if o == n {
			o = mem.Start
		}
		l := mo.Length(m)
		return (mo.Nodes[o].X - mo.Nodes[n].X) / l, (mo.Nodes[o].Y - mo.Nodes[n].Y) / l
	}
	rises := func(m, n int) bool {
		_, dy := dir(m, n)
		return dy > collinearTol
	}
	// next returns the member that carries on the line of m through node
	// n, or -1 where the line ends there. strict: any other member at n
	// ends it.
	next := func(m, n int, strict bool) int {
		if mo.Nodes[n].Support != frame.Free {
			return -1
		}
		ux, uy := dir(m, n)
		on := -1
		for _, k := range at[n] {
			if k == m {
				continue
			}
			vx, vy := dir(k, n)
			if !mo.IsColumn(k) && math.Abs(ux*vy-uy*vx) <= collinearTol && ux*vx+uy*vy < 0 {
				if on >= 0 {
					return -1 // two members carry on: not a line
				}
				on = k
				continue
			}
			if strict || !rises(k, n) {
				return -1
			}
		}
		return on
	}
	free := func(n int) bool { return mo.Nodes[n].Support == frame.Free && len(at[n]) == 1 }
	chain := func(m int, strict bool) []int {
		out := []int{m}
		for _, n := range [2]int{mo.Members[m].Start, mo.Members[m].End} {
			prev := m
			for k := next(prev, n, strict); k >= 0 && k != m; k = next(prev, n, strict) {
				out = append(out, k)
				mem := mo.Members[k]
				if mem.Start == n {
					n = mem.End
				} else {
					n = mem.Start
				}
				prev = k
			}
		}
		return out
	}
	done := make([]bool, len(mo.Members))
	var out []run
	var add func(members []int, strict bool)
	add = func(members []int, strict bool) {
		r := newRun(mo, members)
		if free(r.left) && free(r.right) {
			if strict {
				return // a line held by nothing: the solver refuses it
			}
			for _, m := range members {
				done[m] = false
			}
			for _, m := range members {
				if !done[m] {
					c := chain(m, true)
					for _, k := range c {
						done[k] = true
					}
					add(c, true)
				}
			}
			return
		}
		switch {
		case free(r.left):
			r.cantilever, r.root = true, r.right
		case free(r.right):
			r.cantilever, r.root = true, r.left
		}
		out = append(out, r)
	}
	for m := range mo.Members {
		if done[m] || mo.IsColumn(m) {
			continue
		}
		c := chain(m, false)
		for _, k := range c {
			done[k] = true
		}
		add(c, false)
	}
	spans := patterns.Spans(mo)
	sort.SliceStable(out, func(i, j int) bool {
		a, b := &out[i], &out[j]
		if a.beam != b.beam {
			return a.beam
		}
		if a.beam {
			la, lb := spans[a.members[0]].Level, spans[b.members[0]].Level
			if la != lb {
				return la < lb
			}
		} else if ya, yb := math.Min(mo.Nodes[a.left].Y, mo.Nodes[a.right].Y), math.Min(mo.Nodes[b.left].Y, mo.Nodes[b.right].Y); ya != yb {
			return ya < yb
		}
		return mo.Nodes[a.left].X < mo.Nodes[b.left].X
	})
	return out
}

// newRun orders the members of a line left to right and finds its ends.
func newRun(mo *frame.Model, members []int) run {
	mid := func(m int) float64 {
		mem := mo.Members[m]
		return mo.Nodes[mem.Start].X + mo.Nodes[mem.End].X
	}
	sort.Slice(members, func(i, j int) bool { return mid(members[i]) < mid(members[j]) })
	left, _ := shownEnds(mo, members[0])
	_, right := shownEnds(mo, members[len(members)-1])
	r := run{members: members, left: left, right: right, beam: true}
	for _, m := range members {
		r.length += mo.Length(m)
		r.beam = r.beam && mo.IsBeam(m)
	}
	return r
}

// runLines returns, for every member of mo, the line its deflection is
// measured across: that of its span or cantilever (envelope.Settings.Lines).
// Every line runs left to right, so that its deflections are positive up.
func runLines(mo *frame.Model, rs []run) []envelope.Line {
	lines := make([]envelope.Line, len(mo.Members))
	for _, r := range rs {
		l := envelope.Line{A: r.left, B: r.right}
		switch {
		case r.cantilever && r.root == r.left:
			l.From = envelope.ThroughA
		case r.cantilever:
			l.From = envelope.ThroughB
		}
		for _, m := range r.members {
			lines[m] = l
		}
	}
	return lines
}
