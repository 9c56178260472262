package analysis

import (
	"math"
	"sort"

	"govern/envelope"
	"govern/frame"
	"govern/patterns"
)

// Span is a span or a cantilever: a line of collinear members that are
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
type Span struct {
	Members     []int // left to right
	Left, Right int   // end nodes, Left the one of smaller X
	Cantilever  bool
	Root        int // the cantilever's root: Left or Right
	Length      float64
	Beam        bool // horizontal: the members are beams
	// Deflection is over the service combinations; its Found is false
	// when there are none.
	Deflection SpanDeflection
}

// RatioLength is the length span/deflection is taken over: the length of
// a span, twice that of a cantilever.
func (s *Span) RatioLength() float64 {
	if s.Cantilever {
		return 2 * s.Length
	}
	return s.Length
}

// collinearTol is the tolerance on the sine of the angle between two
// members taken as one straight line, as the one under which a member
// counts as horizontal (frame's orientation tolerance).
const collinearTol = 1e-6

// Spans returns the spans and cantilevers of mo, beams level by level from
// the lowest and left to right, then rafters from the lowest. Their
// Deflection is left empty.
func Spans(mo *frame.Model) []Span { return spans(mo) }

func spans(mo *frame.Model) []Span {
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
		if mo.Nodes[n].Supported() {
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
	free := func(n int) bool { return !mo.Nodes[n].Supported() && len(at[n]) == 1 }
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
	var out []Span
	var add func(members []int, strict bool)
	add = func(members []int, strict bool) {
		r := newSpan(mo, members)
		if free(r.Left) && free(r.Right) {
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
		case free(r.Left):
			r.Cantilever, r.Root = true, r.Right
		case free(r.Right):
			r.Cantilever, r.Root = true, r.Left
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
	levels := patterns.Spans(mo)
	sort.SliceStable(out, func(i, j int) bool {
		a, b := &out[i], &out[j]
		if a.Beam != b.Beam {
			return a.Beam
		}
		if a.Beam {
			la, lb := levels[a.Members[0]].Level, levels[b.Members[0]].Level
			if la != lb {
				return la < lb
			}
		} else if ya, yb := math.Min(mo.Nodes[a.Left].Y, mo.Nodes[a.Right].Y), math.Min(mo.Nodes[b.Left].Y, mo.Nodes[b.Right].Y); ya != yb {
			return ya < yb
		}
		return mo.Nodes[a.Left].X < mo.Nodes[b.Left].X
	})
	return out
}

// newSpan orders the members of a line left to right and finds its ends.
func newSpan(mo *frame.Model, members []int) Span {
	mid := func(m int) float64 {
		mem := mo.Members[m]
		return mo.Nodes[mem.Start].X + mo.Nodes[mem.End].X
	}
	sort.Slice(members, func(i, j int) bool { return mid(members[i]) < mid(members[j]) })
	left, _ := ShownEnds(mo, members[0])
	_, right := ShownEnds(mo, members[len(members)-1])
	r := Span{Members: members, Left: left, Right: right, Beam: true}
	for _, m := range members {
		r.Length += mo.Length(m)
		r.Beam = r.Beam && mo.IsBeam(m)
	}
	return r
}

// spanLines returns, for every member of mo, the line its deflection is
// measured across: that of its span or cantilever (envelope.Settings.Lines).
// Every line runs left to right, so that its deflections are positive up.
func spanLines(mo *frame.Model, ss []Span) []envelope.Line {
	lines := make([]envelope.Line, len(mo.Members))
	for _, r := range ss {
		l := envelope.Line{A: r.Left, B: r.Right}
		switch {
		case r.Cantilever && r.Root == r.Left:
			l.From = envelope.ThroughA
		case r.Cantilever:
			l.From = envelope.ThroughB
		}
		for _, m := range r.Members {
			lines[m] = l
		}
	}
	return lines
}
