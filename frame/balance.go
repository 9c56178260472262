package frame

import "math"

// Balance is the statics check of one solved load case: the resultant of the
// applied loads against the resultant of the support reactions, both about
// the global origin, and the largest out-of-balance force and moment left at
// any free joint. For a correct solution Applied + Reactions and the joint
// residuals are round-off.
type Balance struct {
	Applied   Resultant // resultant of the loads of the case
	Reactions Resultant // resultant of the support reactions

	JointForce  float64 // largest out-of-balance force at a free degree of freedom
	JointMoment float64 // largest out-of-balance moment at a free degree of freedom

	// Load is the size of the loading: the sum of the magnitudes of every
	// applied force (a distributed load counts its integral of |w|) plus each
	// applied node moment divided by Length. It is never smaller than the
	// resultant, and is positive for any case that has a nonzero load.
	Load float64
	// Length is the diagonal of the box that holds every node; moments are
	// compared with Load × Length.
	Length float64
}

// Out returns Applied + Reactions, the amount by which the reactions fail to
// balance the loads.
func (b Balance) Out() Resultant {
	return Resultant{Fx: b.Applied.Fx + b.Reactions.Fx, Fy: b.Applied.Fy + b.Reactions.Fy, M: b.Applied.M + b.Reactions.M}
}

// Relative returns the largest out-of-balance quantity of the check as a
// fraction of the load: forces over Load, moments over Load × Length. It is 0
// for an unloaded case that is exactly in balance and +Inf for an unloaded
// case that is not.
func (b Balance) Relative() float64 {
	o := b.Out()
	f := math.Max(math.Max(math.Abs(o.Fx), math.Abs(o.Fy)), b.JointForce)
	m := math.Max(math.Abs(o.M), b.JointMoment)
	if f == 0 && m == 0 {
		return 0
	}
	if !(b.Load > 0) {
		return math.Inf(1)
	}
	return math.Max(f/b.Load, m/(b.Load*math.Max(b.Length, math.SmallestNonzeroFloat64)))
}

// Balance returns the statics check of case c.
func (sol *Solution) Balance(c int) Balance {
	mo := sol.model
	b := Balance{Applied: AppliedResultant(mo, c), Length: extent(mo)}
	for v, nd := range mo.Nodes {
		if nd.Support == Free {
			continue
		}
		fx, fy, m := sol.Reaction(c, v)
		b.Reactions.Fx += fx
		b.Reactions.Fy += fy
		b.Reactions.M += m + nd.X*fy - nd.Y*fx
	}
	b.JointForce, b.JointMoment = sol.residuals(c)
	b.Load = loadSize(mo, c, b.Length)
	return b
}

// extent returns the diagonal of the bounding box of the nodes of mo.
func extent(mo *Model) float64 {
	if len(mo.Nodes) == 0 {
		return 0
	}
	x0, x1 := mo.Nodes[0].X, mo.Nodes[0].X
	y0, y1 := mo.Nodes[0].Y, mo.Nodes[0].Y
	for _, n := range mo.Nodes[1:] {
		x0, x1 = math.Min(x0, n.X), math.Max(x1, n.X)
		y0, y1 = math.Min(y0, n.Y), math.Max(y1, n.Y)
	}
	return math.Hypot(x1-x0, y1-y0)
}

// loadSize returns the sum of the magnitudes of the loads of case c, node
// moments divided by length.
func loadSize(mo *Model, c int, length float64) float64 {
	cs := &mo.Cases[c]
	sum := 0.0
	for _, nl := range cs.NodeLoads {
		sum += math.Hypot(nl.Fx, nl.Fy)
		if length > 0 {
			sum += math.Abs(nl.M) / length
		}
	}
	for _, ld := range cs.MemberLoads {
		if ld.Point {
			sum += math.Abs(ld.P)
			continue
		}
		l := mo.Length(ld.Member)
		a, b := clampTo(ld.From, 0, l), clampTo(ld.To, 0, l)
		// Intensities at the clamped ends of the load.
		span := ld.To - ld.From
		wa, wb := ld.W, ld.WEnd
		if span > 0 {
			wa = ld.W + (ld.WEnd-ld.W)*(a-ld.From)/span
			wb = ld.W + (ld.WEnd-ld.W)*(b-ld.From)/span
		}
		sum += absIntegral(wa, wb, b-a)
	}
	return sum
}

// absIntegral returns the integral of |w| over a length len where w varies
// linearly from wa to wb.
func absIntegral(wa, wb, length float64) float64 {
	if wa*wb >= 0 {
		return (math.Abs(wa) + math.Abs(wb)) / 2 * length
	}
	// w changes sign: two triangles.
	return length * (wa*wa + wb*wb) / (2 * (math.Abs(wa) + math.Abs(wb)))
}
