package analysis

import (
	"slices"

	"govern/envelope"
	"govern/frame"
)

// How the tables and the report show a member: a beam or a rafter (any
// member that is not vertical) as if drawn from its left end (smaller X)
// to its right, whatever the direction it was entered in, so that x runs
// from the left, +M is sagging (the lower face in tension) and a positive
// deflection is up; a column as entered (docs/conventions.md). The JSON
// and CSV keep each member's own axes.

// Flipped reports whether member m is shown reversed: it is not vertical
// and was drawn from right to left.
func Flipped(mo *frame.Model, m int) bool {
	mem := mo.Members[m]
	return !mo.IsColumn(m) && mo.Nodes[mem.End].X < mo.Nodes[mem.Start].X
}

// ShownEnds returns the nodes member m is shown from and to: left and
// right for a beam or rafter, start and end for a column.
func ShownEnds(mo *frame.Model, m int) (from, to int) {
	mem := mo.Members[m]
	if Flipped(mo, m) {
		return mem.End, mem.Start
	}
	return mem.Start, mem.End
}

// Shown returns the envelope of member m as the tables and the report show
// it (see ShownMember).
func (r *Result) Shown(m int) envelope.Member {
	mo := r.Job.Model
	return ShownMember(r.Envelope.Members[m], mo.Length(m), Flipped(mo, m))
}

// ShownMember returns em unchanged, or when flip is set, turned end for
// end: a member of length l seen from its other end, with its stations in
// the order of x' = l − x, its moment and its deflections (the member's own,
// along its local y) of opposite sign, largest and smallest exchanged, and
// the forces acting with each extreme likewise. N and V keep their signs:
// with x' = l − x and M' = −M, V' = dM'/dx' = dM/dx = V. LineDeflection is
// measured across its line whatever the member's direction, and is only
// reordered. em is not modified.
func ShownMember(em envelope.Member, l float64, flip bool) envelope.Member {
	if !flip {
		return em
	}
	out := envelope.Member{Member: em.Member, Stations: make([]envelope.Station, len(em.Stations))}
	n := len(em.Stations)
	for i, st := range em.Stations {
		out.Stations[n-1-i] = envelope.Station{
			X:     l - st.X,
			Extra: st.Extra,
			N:     withFlipped(st.N),
			V:     withFlipped(st.V),
			M:     negated(withFlipped(st.M)),
		}
	}
	out.Stations[0].X = 0 // exactly, whatever the rounding of l − l
	if em.Deflection != nil {
		out.Deflection = make([]envelope.Extreme, n)
		for i, d := range em.Deflection {
			out.Deflection[n-1-i] = negated(d)
		}
	}
	if em.LineDeflection != nil {
		out.LineDeflection = slices.Clone(em.LineDeflection)
		slices.Reverse(out.LineDeflection)
	}
	return out
}

// withFlipped changes the sign of the moment acting with each extreme.
func withFlipped(e envelope.Extreme) envelope.Extreme {
	e.MaxWith[2], e.MinWith[2] = -e.MaxWith[2], -e.MinWith[2]
	return e
}

// negated returns the extreme of −v for the extreme e of v: the largest of
// −v is the smallest of v, with its combination, pieces and forces.
func negated(e envelope.Extreme) envelope.Extreme {
	return envelope.Extreme{
		Max: -e.Min, MaxBy: e.MinBy, MaxWith: e.MinWith, MaxSpans: e.MinSpans, MaxLoaded: e.MinLoaded,
		Min: -e.Max, MinBy: e.MaxBy, MinWith: e.MaxWith, MinSpans: e.MaxSpans, MinLoaded: e.MaxLoaded,
	}
}

// ShownDeflection is the deflection shown at station i of a member as
// shown: across the line of its span or cantilever for a beam or rafter,
// from its own chord for a column.
func ShownDeflection(em envelope.Member, i int) envelope.Extreme {
	if em.LineDeflection != nil {
		return em.LineDeflection[i]
	}
	return em.Deflection[i]
}
