package frame

import "math"

// Resultant is a force system reduced to the global origin.
type Resultant struct {
	Fx, Fy float64 // global components
	M      float64 // moment about the origin, counter-clockwise
}

// AppliedResultant returns the resultant of the loads of case c.
func AppliedResultant(mo *Model, c int) Resultant {
	var r Resultant
	add := func(x, y, fx, fy float64) {
		r.Fx += fx
		r.Fy += fy
		r.M += x*fy - y*fx
	}
	cs := &mo.Cases[c]
	for _, nl := range cs.NodeLoads {
		nd := mo.Nodes[nl.Node]
		add(nd.X, nd.Y, nl.Fx, nl.Fy)
		r.M += nl.M
	}
	for i := range cs.MemberLoads {
		ld := &cs.MemberLoads[i]
		a := mo.Nodes[mo.Members[ld.Member].Start]
		c, s, l := mo.geometry(ld.Member)
		gx, gy := 0.0, 0.0
		at := func(xi, v float64) {
			switch ld.Direction {
			case Gravity:
				gx, gy = 0, -v
			case GlobalX:
				gx, gy = v, 0
			}
			add(a.X+xi*c, a.Y+xi*s, gx, gy)
		}
		if ld.Point {
			at(clampTo(ld.At, 0, l), ld.P)
			continue
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
