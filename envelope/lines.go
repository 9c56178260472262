package envelope

import (
	"fmt"
	"math"

	"govern/frame"
)

// Reference says which straight line of the displaced frame the
// deflections along a [Line] are measured from.
type Reference uint8

const (
	// Chord is the straight line between the displaced nodes A and B, as
	// for a span between two supports.
	Chord Reference = iota
	// ThroughA is the line through the displaced node A parallel to AB as
	// built: the deflection of a cantilever whose root is A, relative to
	// the displaced root and including the root's rotation.
	ThroughA
	// ThroughB is ThroughA for a cantilever whose root is B.
	ThroughB
)

// Line is a straight line of members, such as the span of a beam built of
// several members or a cantilever, along which deflections are measured
// from one reference line instead of each member's own chord (see
// [Settings.Lines]). The deflection is the displacement across the line
// AB, positive along its normal: AB turned +90°, so up for a line whose B
// lies to the right of A.
type Line struct {
	A, B int // nodes at the ends of the line; A == B (the zero value) for none
	From Reference
}

// none reports whether l is the zero Line: no line.
func (l Line) none() bool { return l.A == l.B }

// checkLines returns an error for a line that names a node not in the
// model or whose ends coincide.
func checkLines(mo *frame.Model, lines []Line) error {
	if len(lines) > len(mo.Members) {
		return fmt.Errorf("envelope: lines for %d members; the model has %d", len(lines), len(mo.Members))
	}
	for m, l := range lines {
		if l.none() {
			continue
		}
		if l.A < 0 || l.A >= len(mo.Nodes) || l.B < 0 || l.B >= len(mo.Nodes) || l.From > ThroughB {
			return fmt.Errorf("envelope: member %q: line %+v names no node of the model or no reference", mo.Members[m].Name, l)
		}
		a, b := mo.Nodes[l.A], mo.Nodes[l.B]
		if !(math.Hypot(b.X-a.X, b.Y-a.Y) > 0) {
			return fmt.Errorf("envelope: member %q: the ends of its line, %q and %q, coincide", mo.Members[m].Name, a.Name, b.Name)
		}
	}
	return nil
}

// lineDeflectionsTo fills dst[c*len(xs)+i], for every case c, with the
// deflection of member m at xs[i] across line l from its reference, given
// defl, the member's deflections relative to its own chord in the same
// layout (along its local y). The member's chord moves with its end nodes;
// the point at xs[i] lies the chord's displacement plus its own deflection
// across the line, and the reference line's displacement there is taken
// away. At the ends of the line the result is exactly zero.
func lineDeflectionsTo(dst, defl []float64, sol *frame.Solution, m int, l Line, xs []float64) {
	mo := sol.Model()
	mem := mo.Members[m]
	na, nb := mo.Nodes[l.A], mo.Nodes[l.B]
	span := math.Hypot(nb.X-na.X, nb.Y-na.Y)
	tx, ty := (nb.X-na.X)/span, (nb.Y-na.Y)/span
	nx, ny := -ty, tx // the line's normal
	// at returns how far node v lies along the line, as a fraction of AB:
	// exactly 0 at A and 1 at B.
	at := func(v int) float64 {
		switch v {
		case l.A:
			return 0
		case l.B:
			return 1
		}
		return ((mo.Nodes[v].X-na.X)*tx + (mo.Nodes[v].Y-na.Y)*ty) / span
	}
	ra, rb := at(mem.Start), at(mem.End)
	lm := mo.Length(m)
	pa, pb := mo.Nodes[mem.Start], mo.Nodes[mem.End]
	sgn := (-(pb.Y-pa.Y)*nx + (pb.X-pa.X)*ny) / lm // the member's local y across the line: ±1 on the line
	across := func(c, v int) float64 {
		ux, uy, _ := sol.Displacement(c, v)
		return ux*nx + uy*ny
	}
	ns := len(xs)
	for c := range len(mo.Cases) {
		ua, ub := across(c, mem.Start), across(c, mem.End)
		wa, wb := across(c, l.A), across(c, l.B)
		row, own := dst[c*ns:(c+1)*ns], defl[c*ns:(c+1)*ns]
		for i, x := range xs {
			r := x / lm
			var ref float64
			switch l.From {
			case Chord:
				rho := (1-r)*ra + r*rb
				ref = (1-rho)*wa + rho*wb
			case ThroughA:
				ref = wa
			case ThroughB:
				ref = wb
			}
			row[i] = (1-r)*ua + r*ub + sgn*own[i] - ref
		}
	}
}
