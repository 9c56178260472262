package analysis

import (
	"math"
	"sort"

	"govern/envelope"
	"govern/frame"
	"govern/patterns"
)

// SpanKind says what a Span is.
type SpanKind uint8

const (
	// KindSpan is a straight run between two nodes that hold it. Its
	// deflection is measured from the chord between its displaced ends.
	KindSpan SpanKind = iota
	// KindCantilever is a run from a node that holds it, its root, to a
	// free end. Its deflection is measured from the line through the
	// displaced root parallel to the line from root to tip as built: the
	// movement relative to the root, including the root's rotation.
	KindCantilever
	// KindRafter is a straight part of a run that changes slope between
	// the two nodes that hold it (a rafter between eave and ridge). Its
	// deflection is measured from the chord between its displaced ends.
	KindRafter
	// KindRidge is a change of slope of such a run that nothing holds,
	// lying above the line between the run's ends (the apex of a pitched
	// roof). Its deflection is the movement of its node across that line,
	// from the chord between the run's displaced ends.
	KindRidge
	// KindValley is KindRidge for a change of slope below that line.
	KindValley
)

var spanKindNames = [...]string{"span", "cantilever", "rafter", "ridge", "valley"}

func (k SpanKind) String() string {
	if int(k) < len(spanKindNames) {
		return spanKindNames[k]
	}
	return "SpanKind(?)"
}

// Span is a span, a cantilever, a rafter or a ridge (or valley): a run of
// members that are not vertical and not steeper than 45° (beams, rafters),
// whose deflection is reported as one (see docs/output.md).
//
// A run holds together the members met end to end through nodes that
// nothing holds: straight on, or through a change of slope (a ridge) where
// the two members are the only ones of their kind at the node. A node
// holds the run when it is supported, or when another member there holds
// it: one that does not rise from the node (a column from below, a strut,
// a brace, a beam meeting it) and whose far side reaches a support
// without passing through the run. A member that hangs from the run or
// stands on it and leads only to free ends is carried by it; a member
// rising from the run never holds it (it may be a column the run carries,
// as a transfer beam carries one, or a hanger it hangs from: the
// geometry cannot tell, and the longer run, whose deflection includes
// the movement there, is the safe side), except for a run that nothing
// else holds, which is divided where such members reaching a support
// meet it.
//
// A run between two nodes that hold it is a span, or, when it changes
// slope, its straight parts are rafters and each change of slope a ridge
// or valley. A run from a node that holds it to a free end (a node that
// nothing holds) is a cantilever, straight or not.
type Span struct {
	Kind SpanKind
	// Members are in order along the run from Left to Right.
	Members     []int
	Left, Right int // end nodes, Left the one of smaller X
	Root        int // a cantilever's root: Left or Right
	// Node is a ridge's or valley's node and At its distance from Left
	// along the line from Left to Right.
	Node int
	At   float64
	// Length is the run's length along its members; for a cantilever that
	// changes slope, and for a ridge or valley, the straight distance
	// between its ends (the line its deflection is measured across).
	Length float64
	Beam   bool // horizontal: a span or cantilever of beams
	// Deflection is over the service combinations; its Found is false
	// when there are none.
	Deflection SpanDeflection
	// Limits holds the deflection under each service combination with a
	// limit, against it (limitChecks); none for a ridge or valley.
	Limits []LimitCheck
}

// RatioLength is the length span/deflection is taken over: the length of
// a span, twice that of a cantilever.
func (s *Span) RatioLength() float64 {
	if s.Kind == KindCantilever {
		return 2 * s.Length
	}
	return s.Length
}

// ofLine reports whether the span's deflections are those of its members'
// lines (envelope.Settings.Lines): every kind but a ridge or valley, which
// is measured across the line of the whole run.
func (s *Span) ofLine() bool { return s.Kind != KindRidge && s.Kind != KindValley }

// collinearTol is the tolerance on the sine of the angle between two
// members taken as one straight line, as the one under which a member
// counts as horizontal (frame's orientation tolerance).
const collinearTol = 1e-6

// Spans returns the spans, cantilevers, rafters and ridges of mo: spans
// and cantilevers of beams level by level from the lowest and left to
// right, then the others from the lowest, each run's rafters left to
// right followed by its ridges. Their Deflection is left empty.
func Spans(mo *frame.Model) []Span { return spans(mo) }

// Runs says whether member m can be part of a span or cantilever: it is
// neither a column (frame.Model.IsColumn) nor steeper than 45°. A steeper
// member (a brace, a raking column) is reported as the others are, with
// its deflection from its own chord.
func Runs(mo *frame.Model, m int) bool {
	if mo.IsColumn(m) {
		return false
	}
	a, b := mo.Nodes[mo.Members[m].Start], mo.Nodes[mo.Members[m].End]
	return math.Abs(b.Y-a.Y) <= math.Abs(b.X-a.X)
}

// runGraph is what finding the runs needs of a model.
type runGraph struct {
	mo  *frame.Model
	at  [][]int // members at each node
	run []bool  // members that can be part of a run (Runs)

	// The marks of the holding of one chain at a time (holding), each
	// valid where it holds that holding's stamp: a frame's chains are
	// many, and marks in slices, not cleared from chain to chain, cost
	// less than maps made afresh for each.
	stamp   int32
	chainAt []int32 // node → the stamp of the chain it is of
	runAt   []int32 // member → the stamp of the chain it is of
	seenAt  []int32 // node → the stamp of the holding that gave it a part
	part    []int32 // node → its part, where seenAt is the stamp
	queue   []int   // reaches's, reused
}

func newRunGraph(mo *frame.Model) *runGraph {
	g := &runGraph{mo: mo, at: make([][]int, len(mo.Nodes)), run: make([]bool, len(mo.Members))}
	for m, mem := range mo.Members {
		g.at[mem.Start] = append(g.at[mem.Start], m)
		g.at[mem.End] = append(g.at[mem.End], m)
		g.run[m] = Runs(mo, m)
	}
	return g
}

func (g *runGraph) supported(n int) bool { return g.mo.Nodes[n].Supported() }

// far returns the node at the other end of member m from n.
func (g *runGraph) far(m, n int) int {
	mem := g.mo.Members[m]
	if mem.Start == n {
		return mem.End
	}
	return mem.Start
}

// dir returns the unit vector along member m away from node n.
func (g *runGraph) dir(m, n int) (float64, float64) {
	o := g.far(m, n)
	l := g.mo.Length(m)
	return (g.mo.Nodes[o].X - g.mo.Nodes[n].X) / l, (g.mo.Nodes[o].Y - g.mo.Nodes[n].Y) / l
}

// straight reports whether members m and k, meeting at n, make one
// straight line through it.
func (g *runGraph) straight(m, k, n int) bool {
	ux, uy := g.dir(m, n)
	vx, vy := g.dir(k, n)
	return math.Abs(ux*vy-uy*vx) <= collinearTol && ux*vx+uy*vy < 0
}

// next returns the member that carries the run of m on through node n, or
// -1 where it ends there: at a support; where m is the only run member;
// where exactly one other meets it, that one (straight on or at a change
// of slope); where more meet, the one straight on, if exactly one is.
func (g *runGraph) next(m, n int) int {
	if g.supported(n) {
		return -1
	}
	var others []int
	for _, k := range g.at[n] {
		if k != m && g.run[k] {
			others = append(others, k)
		}
	}
	if len(others) == 1 {
		return others[0]
	}
	on := -1
	for _, k := range others {
		if g.straight(m, k, n) {
			if on >= 0 {
				return -1 // two carry on: not a line
			}
			on = k
		}
	}
	return on
}

// chain is a run of members met end to end: members[i] joins nodes[i] and
// nodes[i+1]. A closed one (a ring) has its first node again last.
type chain struct {
	nodes, members []int
	closed         bool
}

// walk returns the chain through member m0, marking its members done.
func (g *runGraph) walk(m0 int, done []bool) chain {
	mem := g.mo.Members[m0]
	done[m0] = true
	follow := func(n int) (members, nodes []int, closed bool) {
		prev := m0
		for k := g.next(prev, n); k >= 0; k = g.next(prev, n) {
			if k == m0 {
				return members, nodes, true
			}
			if done[k] {
				break
			}
			done[k] = true
			n = g.far(k, n)
			members, nodes = append(members, k), append(nodes, n)
			prev = k
		}
		return members, nodes, false
	}
	fm, fn, closed := follow(mem.End)
	c := chain{members: append([]int{m0}, fm...), nodes: append([]int{mem.Start, mem.End}, fn...), closed: closed}
	if closed {
		return c
	}
	bm, bn, _ := follow(mem.Start)
	for i, j := 0, len(bm)-1; i < j; i, j = i+1, j-1 {
		bm[i], bm[j] = bm[j], bm[i]
		bn[i], bn[j] = bn[j], bn[i]
	}
	c.members = append(bm, c.members...)
	c.nodes = append(bn, c.nodes...)
	return c
}

// holding finds, for the nodes of one chain, whether other members hold
// it there: whether a member's far side reaches a support without passing
// through the chain. The parts of the frame left when the chain's nodes
// are taken away are found as they are needed. A holding is read before
// the graph's next one is made: they share the graph's marks.
type holding struct {
	g       *runGraph
	stamp   int32
	reached []bool // per part: it holds a support
}

func (g *runGraph) holding(c chain) *holding {
	if g.chainAt == nil {
		g.chainAt, g.seenAt, g.part = make([]int32, len(g.mo.Nodes)), make([]int32, len(g.mo.Nodes)), make([]int32, len(g.mo.Nodes))
		g.runAt = make([]int32, len(g.mo.Members))
	}
	g.stamp++
	h := &holding{g: g, stamp: g.stamp}
	for _, n := range c.nodes {
		g.chainAt[n] = h.stamp
	}
	for _, m := range c.members {
		g.runAt[m] = h.stamp
	}
	return h
}

// inChain reports whether node n is of the chain.
func (h *holding) inChain(n int) bool { return h.g.chainAt[n] == h.stamp }

// reaches reports whether node f, not of the chain, is joined to a support
// by members that do not pass through the chain.
func (h *holding) reaches(f int) bool {
	g := h.g
	if g.seenAt[f] == h.stamp {
		return h.reached[g.part[f]]
	}
	p := int32(len(h.reached))
	found := false
	g.seenAt[f], g.part[f] = h.stamp, p
	queue := append(g.queue[:0], f)
	for i := 0; i < len(queue); i++ {
		n := queue[i]
		found = found || g.supported(n)
		for _, m := range g.at[n] {
			o := g.far(m, n)
			if g.seenAt[o] == h.stamp || h.inChain(o) {
				continue
			}
			g.seenAt[o], g.part[o] = h.stamp, p
			queue = append(queue, o)
		}
	}
	g.queue = queue
	h.reached = append(h.reached, found)
	return found
}

// holds reports whether node n of the chain is held: supported, or with a
// member that is not of the run, does not rise from n, and reaches a
// support without passing through the chain. With rising, it reports
// instead whether a member rising from n reaches one (a hanger).
func (h *holding) holds(n int, rising bool) bool {
	g := h.g
	if !rising && g.supported(n) {
		return true
	}
	for _, k := range g.at[n] {
		if g.runAt[k] == h.stamp {
			continue
		}
		_, dy := g.dir(k, n)
		if (dy > collinearTol) != rising {
			continue
		}
		if f := g.far(k, n); !h.inChain(f) && h.reaches(f) {
			return true
		}
	}
	return false
}

// piece is a part of a chain: members[i] joins nodes[i] and nodes[i+1].
type piece struct{ nodes, members []int }

// split cuts the chain c into pieces at the nodes cut marks (by index in
// c.nodes); a closed chain is first turned to begin at a marked node.
// A closed chain with none marked is one piece beginning and ending at
// its first node.
func split(c chain, cut func(i int) bool) []piece {
	nodes, members := c.nodes, c.members
	if c.closed {
		k := len(members)
		for i := range k {
			if cut(i) {
				nodes = append(append([]int(nil), nodes[i:k]...), nodes[:i+1]...)
				members = append(append([]int(nil), members[i:]...), members[:i]...)
				break
			}
		}
		marked := map[int]bool{}
		for i := range k {
			if cut(i) {
				marked[c.nodes[i]] = true
			}
		}
		cut = func(i int) bool { return marked[nodes[i]] }
	}
	var out []piece
	start := 0
	for i := 1; i <= len(members); i++ {
		if i == len(members) || cut(i) {
			out = append(out, piece{nodes: nodes[start : i+1], members: members[start:i]})
			start = i
		}
	}
	return out
}

func spans(mo *frame.Model) []Span {
	g := newRunGraph(mo)
	done := make([]bool, len(mo.Members))
	type entry struct {
		Span
		run, order int // the run it belongs to, its place in that run
	}
	var all []entry
	runs := 0
	for m := range mo.Members {
		if done[m] || !g.run[m] {
			continue
		}
		c := g.walk(m, done)
		h := g.holding(c)
		held := map[int]bool{}
		for _, n := range c.nodes {
			held[n] = h.holds(n, false)
		}
		pieces := split(c, func(i int) bool { return held[c.nodes[i]] })
		for _, p := range pieces {
			a, b := p.nodes[0], p.nodes[len(p.nodes)-1]
			var parts []piece
			var partHeld func(n int) bool
			if held[a] || held[b] {
				parts, partHeld = []piece{p}, func(n int) bool { return held[n] }
			} else {
				// Held by nothing but members rising from it: divided
				// where those that reach a support meet it.
				hung := map[int]bool{}
				for _, n := range p.nodes {
					hung[n] = h.holds(n, true)
				}
				sub := chain{nodes: p.nodes, members: p.members, closed: c.closed && len(pieces) == 1}
				parts, partHeld = split(sub, func(i int) bool { return hung[sub.nodes[i]] }), func(n int) bool { return hung[n] }
			}
			for _, q := range parts {
				for k, s := range g.classify(q, partHeld) {
					all = append(all, entry{s, runs, k})
				}
				runs++
			}
		}
	}
	// Each run's place: beams by level, then left to right; the others
	// from the lowest, then left to right.
	levels := patterns.Spans(mo)
	type place struct {
		beam  bool
		level int
		y, x  float64
	}
	where := make([]place, runs)
	for i := len(all) - 1; i >= 0; i-- {
		e := &all[i]
		if e.order == 0 {
			pl := place{beam: e.Beam, y: math.Min(mo.Nodes[e.Left].Y, mo.Nodes[e.Right].Y), x: mo.Nodes[e.Left].X}
			if e.Beam {
				pl.level = levels[e.Members[0]].Level
			}
			where[e.run] = pl
		}
	}
	sort.SliceStable(all, func(i, j int) bool {
		a, b := where[all[i].run], where[all[j].run]
		switch {
		case a.beam != b.beam:
			return a.beam
		case a.beam && a.level != b.level:
			return a.level < b.level
		case !a.beam && a.y != b.y:
			return a.y < b.y
		case a.x != b.x:
			return a.x < b.x
		case all[i].run != all[j].run:
			return all[i].run < all[j].run
		}
		return all[i].order < all[j].order
	})
	out := make([]Span, len(all))
	for i := range all {
		out[i] = all[i].Span
	}
	return out
}

// classify makes the spans of one piece of a run whose ends are held or
// not as held says: a span, or rafters and ridges, between two held
// ends; a cantilever from a held end to a free one; nothing for a piece
// held at neither end.
func (g *runGraph) classify(p piece, held func(n int) bool) []Span {
	mo := g.mo
	p = g.leftToRight(p)
	a, b := p.nodes[0], p.nodes[len(p.nodes)-1]
	ha, hb := held(a), held(b)
	var kinks []int // indices into p.nodes of changes of slope
	for i := 1; i < len(p.members); i++ {
		if !g.straight(p.members[i-1], p.members[i], p.nodes[i]) {
			kinks = append(kinks, i)
		}
	}
	length := func(ms []int) float64 {
		l := 0.0
		for _, m := range ms {
			l += mo.Length(m)
		}
		return l
	}
	beam := func(ms []int) bool {
		for _, m := range ms {
			if !mo.IsBeam(m) {
				return false
			}
		}
		return true
	}
	chord := func() float64 { return math.Hypot(mo.Nodes[b].X-mo.Nodes[a].X, mo.Nodes[b].Y-mo.Nodes[a].Y) }
	switch {
	case ha && hb && len(kinks) == 0:
		return []Span{{Kind: KindSpan, Members: p.members, Left: a, Right: b, Length: length(p.members), Beam: beam(p.members)}}
	case ha && hb:
		var out []Span
		cuts := append(append([]int{0}, kinks...), len(p.members))
		for i := 1; i < len(cuts); i++ {
			q := g.leftToRight(piece{nodes: p.nodes[cuts[i-1] : cuts[i]+1], members: p.members[cuts[i-1]:cuts[i]]})
			out = append(out, Span{Kind: KindRafter, Members: q.members, Left: q.nodes[0], Right: q.nodes[len(q.nodes)-1], Length: length(q.members)})
		}
		if a == b {
			return out // a ring held at one node: no line between its ends
		}
		na, nb := mo.Nodes[a], mo.Nodes[b]
		l := chord()
		tx, ty := (nb.X-na.X)/l, (nb.Y-na.Y)/l
		for _, k := range kinks {
			n := mo.Nodes[p.nodes[k]]
			dx, dy := n.X-na.X, n.Y-na.Y
			kind := KindRidge
			if -ty*dx+tx*dy < 0 {
				kind = KindValley
			}
			out = append(out, Span{Kind: kind, Members: p.members, Left: a, Right: b, Node: p.nodes[k], At: dx*tx + dy*ty, Length: l})
		}
		return out
	case ha || hb:
		s := Span{Kind: KindCantilever, Members: p.members, Left: a, Right: b, Root: a, Length: length(p.members), Beam: len(kinks) == 0 && beam(p.members)}
		if !ha {
			s.Root = b
		}
		if len(kinks) > 0 {
			s.Length = chord()
		}
		return []Span{s}
	}
	return nil
}

// leftToRight returns p in order from its end of smaller X.
func (g *runGraph) leftToRight(p piece) piece {
	n := len(p.nodes) - 1
	if g.mo.Nodes[p.nodes[n]].X >= g.mo.Nodes[p.nodes[0]].X {
		return p
	}
	q := piece{nodes: make([]int, n+1), members: make([]int, n)}
	for i, v := range p.nodes {
		q.nodes[n-i] = v
	}
	for i, m := range p.members {
		q.members[n-1-i] = m
	}
	return q
}

// spanLines returns, for every member of mo, the line its deflection is
// measured across: that of its span, cantilever or rafter
// (envelope.Settings.Lines). Every line runs left to right, so that its
// deflections are positive up.
func spanLines(mo *frame.Model, ss []Span) []envelope.Line {
	lines := make([]envelope.Line, len(mo.Members))
	for _, r := range ss {
		if !r.ofLine() {
			continue
		}
		l := envelope.Line{A: r.Left, B: r.Right}
		switch {
		case r.Kind == KindCantilever && r.Root == r.Left:
			l.From = envelope.ThroughA
		case r.Kind == KindCantilever:
			l.From = envelope.ThroughB
		}
		for _, m := range r.Members {
			lines[m] = l
		}
	}
	return lines
}

// ridgeLines returns, for the members of runs with a ridge or valley, the
// line between the run's ends, from the chord between them; nil when
// there is none.
func ridgeLines(mo *frame.Model, ss []Span) []envelope.Line {
	var lines []envelope.Line
	for _, r := range ss {
		if r.ofLine() {
			continue
		}
		if lines == nil {
			lines = make([]envelope.Line, len(mo.Members))
		}
		for _, m := range r.Members {
			lines[m] = envelope.Line{A: r.Left, B: r.Right}
		}
	}
	return lines
}

// HeldAt reports whether node n, an end of member m, holds the span,
// cantilever or rafter m is part of: whether it is an end of its span, its
// cantilever's root, or an end of its rafter other than a ridge or
// valley. It is true for a member of none. A cantilever's free end and a
// node inside a span hold nothing: there is no support there to design.
func (r *Result) HeldAt(m, n int) bool {
	i := r.SpanOf(m)
	if i < 0 {
		return true
	}
	s := &r.Spans[i]
	switch s.Kind {
	case KindCantilever:
		return n == s.Root
	case KindRafter:
		for k := range r.Spans {
			if t := &r.Spans[k]; !t.ofLine() && t.Node == n {
				return false
			}
		}
	}
	return n == s.Left || n == s.Right
}
