package patterns

import (
	"fmt"
	"math"
	"slices"

	"govern/frame"
)

// Piece is one independently placed part of a patterned load case.
type Piece struct {
	Case    int    // the patterned case, index into the original model's cases
	Member  int    // the beam it lies on
	Segment int    // 0-based segment of the beam; 0 when the beam is whole
	Name    string // member name, with ":n" (1-based segment) when segments > 1
	Loads   []frame.MemberLoad
}

// Split divides the member loads of case c on beams into pieces, one per
// beam or, with segments k > 1, one per loaded k-th of a beam. It returns
// the rest of the case (node loads and loads on other members) and the
// pieces in member order, then segment order.
//
// A distributed load is cut at the segment boundaries, its intensity
// interpolated there. A point load or a concentrated moment exactly on a
// boundary belongs to the segment after it (the last one when it is at the
// member's end). Imposed deformations (temperature changes and
// displacements of supports) are not loads on a span: they stay in the
// rest.
func Split(mo *frame.Model, c, segments int) (rest frame.Case, pieces []Piece) {
	if segments < 1 {
		panic("patterns: segments < 1")
	}
	cs := &mo.Cases[c]
	rest = frame.Case{Name: cs.Name, NodeLoads: cs.NodeLoads, Displacements: cs.Displacements}
	byMember := map[int][]frame.MemberLoad{}
	var order []int
	for _, ld := range cs.MemberLoads {
		if !mo.IsBeam(ld.Member) || ld.Thermal {
			rest.MemberLoads = append(rest.MemberLoads, ld)
			continue
		}
		if _, ok := byMember[ld.Member]; !ok {
			order = append(order, ld.Member)
		}
		byMember[ld.Member] = append(byMember[ld.Member], ld)
	}
	slices.Sort(order)
	for _, m := range order {
		l := mo.Length(m)
		seg := make([][]frame.MemberLoad, segments)
		for _, ld := range byMember[m] {
			if ld.Point || ld.Moment {
				j := int(math.Floor(ld.At / (l / float64(segments))))
				j = max(0, min(segments-1, j))
				seg[j] = append(seg[j], ld)
				continue
			}
			for j := range segments {
				s0, s1 := l*float64(j)/float64(segments), l*float64(j+1)/float64(segments)
				a, b := math.Max(ld.From, s0), math.Min(ld.To, s1)
				if b-a <= 1e-12*l {
					continue
				}
				part := ld
				part.From, part.To = a, b
				part.W, part.WEnd = ld.IntensityAt(a), ld.IntensityAt(b)
				seg[j] = append(seg[j], part)
			}
		}
		for j, loads := range seg {
			if len(loads) == 0 {
				continue
			}
			name := mo.Members[m].Name
			if segments > 1 {
				name = fmt.Sprintf("%s:%d", name, j+1)
			}
			pieces = append(pieces, Piece{Case: c, Member: m, Segment: j, Name: name, Loads: loads})
		}
	}
	return rest, pieces
}
