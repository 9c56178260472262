package analysis

import "math"

// Sag is one deflection of a span or cantilever and where it occurs.
type Sag struct {
	V, X float64 // the deflection (+ up) and where, from the span's left end
	By   int     // the combination; -1 for none
	// Member and Station say where it is: the member and the index of its
	// station as shown (Result.Shown).
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

// spanDeflection finds the deflection of s over its stations.
func (r *Result) spanDeflection(s *Span) SpanDeflection {
	mo := r.Job.Model
	d := SpanDeflection{Down: Sag{V: math.Inf(1), By: -1}, Up: Sag{V: math.Inf(-1), By: -1}, Largest: Sag{By: -1}}
	offset := 0.0
	for _, m := range s.Members {
		em := r.Shown(m)
		if em.LineDeflection == nil {
			return SpanDeflection{}
		}
		for i, e := range em.LineDeflection {
			x := offset + em.Stations[i].X
			if e.Min < d.Down.V {
				d.Down = Sag{e.Min, x, e.MinBy, m, i}
			}
			if e.Max > d.Up.V {
				d.Up = Sag{e.Max, x, e.MaxBy, m, i}
			}
		}
		offset += mo.Length(m)
	}
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
