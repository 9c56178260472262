package analysis

import (
	"math"

	"govern/envelope"
)

// Sag is one deflection of a span or cantilever and where it occurs.
type Sag struct {
	V, X float64 // the deflection (+ up) and where, from the span's left end
	By   int     // the combination; -1 for none
	// Member and Station say where it is: the member and the index of its
	// station as shown (Result.Shown); for a ridge, a member with an end
	// at its node.
	Member, Station int
}

// SpanDeflection is the deflection of a span or cantilever over the
// service combinations, measured across its line (see Span).
type SpanDeflection struct {
	// Down is the smallest (most downward) deflection and Up the largest,
	// each with By -1 and V 0 when the span never moves that way
	// (movement of at most 1e-9 of the largest counts as none); Largest is
	// the one of larger size.
	Down, Up, Largest Sag
	// Ratio is RatioLength over |Largest.V|, +Inf when it is zero.
	Ratio float64
	// Found is false when there are no service combinations.
	Found bool
}

// deflectionRoundOff is the fraction of a span's largest deflection at or
// below which a deflection the other way is taken as round-off.
const deflectionRoundOff = 1e-9

// spanDeflection finds the deflection of s over its stations, x along
// its members from its left end.
func (r *Result) spanDeflection(s *Span) SpanDeflection {
	return r.spanDeflectionIn(s, r.Envelope)
}

// spanDeflectionIn is spanDeflection over the service combinations of
// env, an envelope of the result's solution with the same stations.
func (r *Result) spanDeflectionIn(s *Span, env *envelope.Envelope) SpanDeflection {
	mo := r.Job.Model
	d := SpanDeflection{Down: Sag{V: math.Inf(1), By: -1}, Up: Sag{V: math.Inf(-1), By: -1}}
	offset := 0.0
	prev := s.Left
	for _, m := range s.Members {
		em := ShownMember(env.Members[m], mo.Length(m), Flipped(mo, m))
		if em.LineDeflection == nil {
			return SpanDeflection{}
		}
		from, to := ShownEnds(mo, m)
		l := mo.Length(m)
		for i, e := range em.LineDeflection {
			x := offset + em.Stations[i].X
			if from != prev { // a member of a run that turns back on itself
				x = offset + l - em.Stations[i].X
			}
			d.add(e, x, m, i)
		}
		if from != prev {
			from, to = to, from
		}
		offset += l
		prev = to
	}
	return d.finish(s)
}

// add takes in the envelope e of a deflection at x, at station i of
// member m as shown.
func (d *SpanDeflection) add(e envelope.Extreme, x float64, m, i int) {
	if e.Min < d.Down.V {
		d.Down = Sag{e.Min, x, e.MinBy, m, i}
	}
	if e.Max > d.Up.V {
		d.Up = Sag{e.Max, x, e.MaxBy, m, i}
	}
}

// finish drops round-off and finds the largest and span/deflection.
func (d SpanDeflection) finish(s *Span) SpanDeflection {
	// Round-off is no movement: a span that does not rise has no upward
	// deflection to show.
	size := math.Max(-d.Down.V, d.Up.V)
	if d.Up.V <= deflectionRoundOff*size {
		d.Up = Sag{By: -1}
	}
	if -d.Down.V <= deflectionRoundOff*size {
		d.Down = Sag{By: -1}
	}
	d.Largest = d.Up
	if -d.Down.V >= d.Up.V {
		d.Largest = d.Down
	}
	d.Ratio = s.RatioLength() / math.Abs(d.Largest.V)
	d.Found = true
	return d
}

// ridgeDeflection finds the deflection of a ridge or valley: the movement
// of its node across the line between the ends of its run, from the chord
// between them, given across, the envelopes with the deflections across
// that line (ridgeLines) at the ends of every member.
func (r *Result) ridgeDeflection(s *Span, across *envelope.Envelope) SpanDeflection {
	mo := r.Job.Model
	d := SpanDeflection{Down: Sag{V: math.Inf(1), By: -1}, Up: Sag{V: math.Inf(-1), By: -1}}
	for _, m := range s.Members {
		mem := mo.Members[m]
		if mem.Start != s.Node && mem.End != s.Node {
			continue
		}
		em := across.Members[m]
		if em.LineDeflection == nil {
			return SpanDeflection{}
		}
		i := 0 // the node's station in across, then as shown
		if mem.End == s.Node {
			i = len(em.Stations) - 1
		}
		shown := 0
		if from, _ := ShownEnds(mo, m); from != s.Node {
			shown = len(r.Envelope.Members[m].Stations) - 1
		}
		d.add(em.LineDeflection[i], s.At, m, shown)
		break
	}
	return d.finish(s)
}
