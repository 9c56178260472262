package frame

import "math"

// Resultant is a force system reduced to a point: the global origin for
// [AppliedResultant], the lower left corner of the frame in a [Balance].
type Resultant struct {
	Fx, Fy float64 // global components
	M      float64 // moment about the point, counter-clockwise
}

// AppliedResultant returns the resultant of the loads of case c about the
// global origin.
func AppliedResultant(mo *Model, c int) Resultant { return appliedAbout(mo, c, 0, 0) }

// appliedAbout returns the resultant of the loads of case c about the point
// (x0, y0). Lever arms are taken from the nodes' offsets to the point, so
// that a frame far from the origin loses no digits to its position.
func appliedAbout(mo *Model, c int, x0, y0 float64) Resultant {
	var r Resultant
	add := func(x, y, fx, fy float64) {
		r.Fx += fx
		r.Fy += fy
		r.M += x*fy - y*fx
	}
	cs := &mo.Cases[c]
	for _, nl := range cs.NodeLoads {
		nd := mo.Nodes[nl.Node]
		add(nd.X-x0, nd.Y-y0, nl.Fx, nl.Fy)
		r.M += nl.M
	}
	for i := range cs.MemberLoads {
		ld := &cs.MemberLoads[i]
		a := mo.Nodes[mo.Members[ld.Member].Start]
		ax, ay := a.X-x0, a.Y-y0
		c, s, l := mo.geometry(ld.Member)
		gx, gy := 0.0, 0.0
		at := func(xi, v float64) {
			switch ld.Direction {
			case Gravity:
				gx, gy = 0, -v
			case GlobalX:
				gx, gy = v, 0
			}
			add(ax+xi*c, ay+xi*s, gx, gy)
		}
		switch {
		case ld.Point:
			at(clampTo(ld.At, 0, l), ld.P)
			continue
		case ld.Moment:
			r.M += ld.M
			continue
		case ld.Thermal:
			continue // a strain: no resultant
		}
		lo, hi := clampTo(ld.From, 0, l), clampTo(ld.To, 0, l)
		h, mid := (hi-lo)/2, (lo+hi)/2
		for _, g := range gauss3 {
			xi := mid + h*g.x
			at(xi, ld.IntensityAt(xi)*g.w*h)
		}
	}
	return r
}

// Residual returns the largest out-of-balance force or moment at any free
// degree of freedom of any node in case c: the applied node load minus the
// sum of the member end forces acting on the node. It is round-off for a
// correct solution.
func (sol *Solution) Residual(c int) float64 {
	b := sol.Balance(c)
	return math.Max(b.JointForce, b.JointMoment)
}
