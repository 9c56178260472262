package frame

import (
	"fmt"
	"math"
)

// Direction is the global direction of a member load.
type Direction uint8

const (
	Gravity Direction = iota // global −Y; positive values act downward
	GlobalX                  // global +X
)

// MemberLoad is a load on a member: a distributed load varying linearly
// from W at From to WEnd at To, or a point load P at At. Distances are
// measured along the member from its start node; intensities are force per
// unit length of member.
type MemberLoad struct {
	Member    int
	Direction Direction
	Point     bool

	From, To float64 // distributed: extent, 0 <= From < To <= length
	W, WEnd  float64 // distributed: intensity at From and at To

	At, P float64 // point: position, 0 <= At <= length, and magnitude
}

// IntensityAt returns the intensity of a distributed load at distance x
// from the member start, interpolated linearly between W at From and WEnd
// at To.
func (ld *MemberLoad) IntensityAt(x float64) float64 {
	if !(ld.To > ld.From) {
		return ld.W
	}
	return ld.W + (ld.WEnd-ld.W)*(x-ld.From)/(ld.To-ld.From)
}

// NodeLoad is a force and moment applied at a node, in global axes.
type NodeLoad struct {
	Node      int
	Fx, Fy, M float64 // +X right, +Y up, counter-clockwise
}

// Case is a load case: a set of loads that act together.
type Case struct {
	Name        string
	MemberLoads []MemberLoad
	NodeLoads   []NodeLoad
}

func (c *Case) validate(mo *Model) []error {
	var errs []error
	for i, ld := range c.MemberLoads {
		if ld.Member < 0 || ld.Member >= len(mo.Members) {
			errs = append(errs, fmt.Errorf("load %d: member index out of range", i+1))
			continue
		}
		name := mo.Members[ld.Member].Name
		l := mo.Length(ld.Member)
		tol := 1e-9 * l
		if ld.Point {
			if !finite(ld.P) || !finite(ld.At) {
				errs = append(errs, fmt.Errorf("point load on %q: P and at must be finite", name))
			} else if ld.At < -tol || ld.At > l+tol {
				errs = append(errs, fmt.Errorf("point load on %q: at = %g is outside the member (length %g)", name, ld.At, l))
			}
			continue
		}
		if !finite(ld.W) || !finite(ld.WEnd) || !finite(ld.From) || !finite(ld.To) {
			errs = append(errs, fmt.Errorf("distributed load on %q: values must be finite", name))
		} else if ld.From < -tol || ld.To > l+tol || !(ld.To > ld.From) {
			errs = append(errs, fmt.Errorf("distributed load on %q: from = %g, to = %g is not a part of the member (length %g)", name, ld.From, ld.To, l))
		}
	}
	for i, nl := range c.NodeLoads {
		if nl.Node < 0 || nl.Node >= len(mo.Nodes) {
			errs = append(errs, fmt.Errorf("node load %d: node index out of range", i+1))
			continue
		}
		if !finite(nl.Fx) || !finite(nl.Fy) || !finite(nl.M) {
			errs = append(errs, fmt.Errorf("node load at %q: values must be finite", mo.Nodes[nl.Node].Name))
		}
	}
	return errs
}

// local returns the components of a load of intensity v in direction d along
// and across a member with direction cosines c, s: (axial, transverse).
func (d Direction) local(v, c, s float64) (qx, qy float64) {
	var gx, gy float64
	switch d {
	case Gravity:
		gy = -v
	case GlobalX:
		gx = v
	}
	return gx*c + gy*s, -gx*s + gy*c
}

// clampTo limits x to [lo, hi].
func clampTo(x, lo, hi float64) float64 { return math.Max(lo, math.Min(hi, x)) }
