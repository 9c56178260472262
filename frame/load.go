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
// from W at From to WEnd at To; a point load P at At (Point); a
// concentrated moment M at At, counter-clockwise positive (Moment); or a
// change of temperature of the whole member (Thermal): DT uniform over the
// section, and DTGrad = T(local +y face) − T(local −y face), through the
// section's depth. Distances are measured along the member from its start
// node; intensities are force per unit length of member. Direction applies
// to distributed and point loads only.
type MemberLoad struct {
	Member    int
	Direction Direction
	Point     bool // a point load P at At
	Moment    bool // a concentrated moment M at At
	Thermal   bool // a temperature change DT, DTGrad

	From, To float64 // distributed: extent, 0 <= From < To <= length
	W, WEnd  float64 // distributed: intensity at From and at To

	At, P float64 // point: position, 0 <= At <= length, and magnitude
	M     float64 // moment: magnitude at At, counter-clockwise

	// Thermal: the change of temperature, uniform (DT) and across the
	// section (DTGrad, the local +y face less the local −y face; for a
	// beam drawn left to right, top less bottom). They strain the
	// member's flexible length by α DT and curve it by −α DTGrad / depth.
	DT, DTGrad float64
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

// NodeDisplacement is a displacement imposed on a supported node (a
// settlement of a support, say), in global axes, in directions its
// support holds: Ux along +X, Uy along +Y (a settlement is negative), Rz
// counter-clockwise, in radians.
type NodeDisplacement struct {
	Node       int
	Ux, Uy, Rz float64
}

// Case is a load case: a set of loads that act together. Displacements
// and thermal loads are imposed deformations: they strain the frame
// without a resultant, so their reactions balance each other.
type Case struct {
	Name          string
	MemberLoads   []MemberLoad
	NodeLoads     []NodeLoad
	Displacements []NodeDisplacement
}

// Imposed reports whether the case imposes deformations: a displacement
// of a support or a change of temperature.
func (c *Case) Imposed() bool {
	if len(c.Displacements) > 0 {
		return true
	}
	for i := range c.MemberLoads {
		if c.MemberLoads[i].Thermal {
			return true
		}
	}
	return false
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
		if n := b2i(ld.Point) + b2i(ld.Moment) + b2i(ld.Thermal); n > 1 {
			errs = append(errs, fmt.Errorf("load %d on %q: a load is one of point, moment and thermal", i+1, name))
			continue
		}
		switch {
		case ld.Point:
			if !finite(ld.P) || !finite(ld.At) {
				errs = append(errs, fmt.Errorf("point load on %q: P and at must be finite", name))
			} else if ld.At < -tol || ld.At > l+tol {
				errs = append(errs, fmt.Errorf("point load on %q: at = %g is outside the member (length %g)", name, ld.At, l))
			}
			continue
		case ld.Moment:
			if !finite(ld.M) || !finite(ld.At) {
				errs = append(errs, fmt.Errorf("moment on %q: m and at must be finite", name))
			} else if ld.At < -tol || ld.At > l+tol {
				errs = append(errs, fmt.Errorf("moment on %q: at = %g is outside the member (length %g)", name, ld.At, l))
			}
			continue
		case ld.Thermal:
			sec := mo.Members[ld.Member].Section
			switch {
			case !finite(ld.DT) || !finite(ld.DTGrad):
				errs = append(errs, fmt.Errorf("temperature load on %q: dT and dT_gradient must be finite", name))
			case sec < 0 || sec >= len(mo.Sections):
				// reported with the member
			case (ld.DT != 0 || ld.DTGrad != 0) && !(mo.Sections[sec].Alpha > 0):
				errs = append(errs, fmt.Errorf("temperature load on %q: section %q gives no alpha (coefficient of thermal expansion)", name, mo.Sections[sec].Name))
			case ld.DTGrad != 0 && !(mo.Sections[sec].Depth > 0):
				errs = append(errs, fmt.Errorf("temperature gradient on %q: section %q gives no depth", name, mo.Sections[sec].Name))
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
	for i, nd := range c.Displacements {
		if nd.Node < 0 || nd.Node >= len(mo.Nodes) {
			errs = append(errs, fmt.Errorf("displacement %d: node index out of range", i+1))
			continue
		}
		n := &mo.Nodes[nd.Node]
		for d, v := range [3]float64{nd.Ux, nd.Uy, nd.Rz} {
			switch {
			case !finite(v):
				errs = append(errs, fmt.Errorf("displacement at %q: values must be finite", n.Name))
			case v != 0 && !n.Support.Restrained(d):
				errs = append(errs, fmt.Errorf("displacement at %q: %s is imposed where the support (%v) does not hold the node", n.Name, dirNames[d], n.Support))
			}
		}
	}
	return errs
}

func b2i(b bool) int {
	if b {
		return 1
	}
	return 0
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
