package report

import (
	"math"

	"govern/envelope"

	"govern/envelope/analysis"
)

// endRoundOff is the fraction of the larger end moment at or below which
// the smaller one is zero: the member is then bent by one end moment only.
const endRoundOff = 1e-9

// columnState is one governing value of a member that carries axial force
// (a column, or a member that is neither a column nor a beam), with the
// forces acting with it and its end moments: all of the one state, the
// governing combination with the same loaded pieces.
type columnState struct {
	what string     // "N max", "N min", "|M| max"
	pk   peak       // the value and the forces with it, as shown
	ends [2]float64 // M at the shown start and end, as shown
	ok   bool       // the end moments were found
}

// columnStates returns member m's largest and smallest N and its largest
// |M|, each with the forces acting with it and the
// moments at the member's ends in the same state (analysis.EndMoments).
// Values are as the tables show the member: a member that is not vertical
// from its left end.
func (p *Report) columnStates(m int) []columnState {
	out, asks := p.stateAsks(m)
	return p.stateEnds(m, out, p.res.EndMomentsOf(m, asks))
}

// columnStatesOf is columnStates for the members ms, the end moments of
// all found together (analysis.EndMomentsOfMany: in second order, each
// combination's solution formed once and let go).
func (p *Report) columnStatesOf(ms []int) [][]columnState {
	outs := make([][]columnState, len(ms))
	asks := make([][]envelope.State, len(ms))
	for i, m := range ms {
		outs[i], asks[i] = p.stateAsks(m)
	}
	got := p.res.EndMomentsOfMany(ms, asks)
	for i, m := range ms {
		outs[i] = p.stateEnds(m, outs[i], got[i])
	}
	return outs
}

// prefetchStates sets p.states of the members ms that have none, all
// found together (columnStatesOf).
func (p *Report) prefetchStates(ms []int) {
	var need []int
	seen := map[int]bool{}
	for _, m := range ms {
		if _, ok := p.states[m]; !ok && !seen[m] {
			seen[m] = true
			need = append(need, m)
		}
	}
	if len(need) == 0 {
		return
	}
	if p.states == nil {
		p.states = map[int][]columnState{}
	}
	for i, s := range p.columnStatesOf(need) {
		p.states[need[i]] = s
	}
}

// stateWants are the states columnStates gives: effect j (0 N, 2 M), the
// largest (hi) or smallest.
func stateWants(pk peaks) []stateWant {
	return []stateWant{{"N max", 0, true}, {"N min", 0, false}, {"|M| max", 2, -pk.lo[2].v <= pk.hi[2].v}}
}

type stateWant struct {
	what string
	j    int
	hi   bool
}

// stateAsks returns member m's states without their end moments, and the
// states to ask the end moments of.
func (p *Report) stateAsks(m int) ([]columnState, []envelope.State) {
	pk := memberPeaks(p.res.Envelope.Members[m])
	var out []columnState
	var asks []envelope.State
	for _, w := range stateWants(pk) {
		s := columnState{what: w.what, pk: pk.lo[w.j]}
		if w.hi {
			s.pk = pk.hi[w.j]
		}
		out = append(out, s)
		asks = append(asks, envelope.State{X: s.pk.x, By: s.pk.by, Effect: w.j, Hi: w.hi, Want: s.pk.v})
	}
	return out, asks
}

// stateEnds sets the end moments got of member m's states out, and turns
// them as the tables show the member.
func (p *Report) stateEnds(m int, out []columnState, got []envelope.State) []columnState {
	wants := stateWants(memberPeaks(p.res.Envelope.Members[m]))
	mo := p.model()
	flip, l := analysis.Flipped(mo, m), mo.Length(m)
	for q := range out {
		s := &out[q]
		if s.pk.by >= 0 {
			s.ends, s.ok = got[q].Ends, got[q].OK
		}
		if flip {
			// Seen from the other end: x' = l − x, M' = −M, the ends swapped.
			s.pk.x = l - s.pk.x
			s.pk.with[2] = -s.pk.with[2]
			if wants[q].j == 2 {
				s.pk.v = -s.pk.v
			}
			s.ends = [2]float64{-s.ends[1], -s.ends[0]}
		}
	}
	return out
}

// statesOf returns the governing states of member m as the design tables
// formed them, or forms them.
func (p *Report) statesOf(m int) []columnState {
	p.tables()
	if s, ok := p.states[m]; ok {
		return s
	}
	return p.columnStates(m)
}

// endPair returns the end moments of a state as M1, the smaller in size,
// and M2, the larger, with the end of M2 (0 the shown start, 1 the end),
// M1/M2 with the sign of ACI 318-19 6.6.4.5.3 and AISC 360-16 Appendix 8
// (positive for double, reverse, curvature; negative for single) and
// the curvature named. The ends are moments in one sign convention along
// the member: ends of the same sign bend it in single curvature, and so
// does one end moment alone (M1/M2 = 0). ratio and curvature are "-" when
// both ends are zero.
func endPair(ends [2]float64) (m1, m2 float64, at int, ratioText, curvature string) {
	m1, m2 = ends[0], ends[1]
	at = 1
	if math.Abs(m1) > math.Abs(m2) {
		m1, m2, at = m2, m1, 0
	}
	switch {
	case m2 == 0:
		return m1, m2, at, "-", "-"
	case math.Abs(m1) <= endRoundOff*math.Abs(m2):
		return 0, m2, at, fixed(0), "single"
	}
	r := -m1 / m2
	curvature = "single"
	if r > 0 {
		curvature = "double"
	}
	return m1, m2, at, fixed(r), curvature
}

// stateHeader is the header of the tables of the states of columns.
func stateHeader(force, moment, length string, patterned bool) []string {
	h := []string{"member", "value", "N (" + force + ")", "V (" + force + ")", "M (" + moment + ")", "at x (" + length + ")", "governing"}
	if patterned {
		h = append(h, "spans loaded")
	}
	return append(h, "M1 ("+moment+")", "M2 ("+moment+")", "M2 at", "M1/M2", "curvature")
}

// stateRows gives, per member, three rows: the largest tension (N max, N
// positive in tension) and compression (N min) and the largest moment in
// size, each with the N, V and M acting with it at the same
// station, where and what governs, and the moments at the member's ends
// in the same state: M1 the smaller, M2 the larger in size, M1/M2 and
// single or double curvature.
func (p *Report) stateRows(members []int) [][]string {
	mo := p.model()
	patterned := p.pieces() > 0
	var rows [][]string
	p.prefetchStates(members)
	for _, m := range members {
		from, to := analysis.ShownEnds(mo, m)
		name := mo.Members[m].Name
		states := p.states[m]
		for _, s := range states {
			if s.pk.by < 0 {
				continue
			}
			n, v, mm := s.pk.with[0], s.pk.with[1], s.pk.with[2]
			row := []string{name, s.what, fixed(p.force.Of(n)), fixed(p.force.Of(v)), fixed(p.moment.Of(mm)), fixed(s.pk.x), p.comboName(s.pk.by)}
			if patterned {
				row = append(row, p.shortSpans(s.pk.spans, s.pk.loaded))
			}
			if s.ok {
				m1, m2, at, r, c := endPair(s.ends)
				node := mo.Nodes[[2]int{from, to}[at]].Name
				row = append(row, fixed(p.moment.Of(m1)), fixed(p.moment.Of(m2)), node, r, c)
			} else {
				row = append(row, "-", "-", "-", "-", "-")
			}
			rows = append(rows, row)
			name = ""
		}
	}
	return rows
}
