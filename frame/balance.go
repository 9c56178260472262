package frame

import "math"

// Balance is the statics check of one solved load case: the resultant of the
// applied loads against the resultant of the support reactions, both about
// the lower left corner of the frame (X0, Y0), and the largest
// out-of-balance force and moment left at any free joint. For a correct
// solution Applied + Reactions and the joint residuals are round-off.
//
// Moments are taken about a point of the frame, not the global origin, so
// that a frame far from the origin (x = 1e12) is checked as closely as one
// beside it: about the origin each moment would carry the round-off of its
// position times its load.
type Balance struct {
	Applied   Resultant // resultant of the loads of the case
	Reactions Resultant // resultant of the support reactions

	// X0, Y0 is the point moments are taken about: the smallest X and the
	// smallest Y of any node, the lower left corner of the box that holds
	// the frame.
	X0, Y0 float64

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

	// Imposed is set when the cases impose deformations (displacements of
	// supports, changes of temperature): their reactions balance each
	// other, and may be far larger than the loads or there may be no load
	// at all, so the imbalance is compared with the largest of Load,
	// Reaction and Restraint rather than with Load alone.
	Imposed bool
	// Reaction is the largest reaction, a force or a moment divided by
	// Length; computed only where Imposed is set.
	Reaction float64
	// Restraint is the largest force, or moment divided by Length, that the
	// imposed deformations cause at the ends of a member clamped at both
	// its nodes, whatever its releases: the scale of the forces they make,
	// even in a frame that they strain without any (a simply supported
	// beam warmed on top); computed only where Imposed is set.
	Restraint float64
}

// Scale is what the imbalance is compared with: Load, or, for imposed
// deformations, the largest of Load, Reaction and Restraint.
func (b Balance) Scale() float64 {
	if b.Imposed {
		return max(b.Load, b.Reaction, b.Restraint)
	}
	return b.Load
}

// Out returns Applied + Reactions, the amount by which the reactions fail to
// balance the loads.
func (b Balance) Out() Resultant {
	return Resultant{Fx: b.Applied.Fx + b.Reactions.Fx, Fy: b.Applied.Fy + b.Reactions.Fy, M: b.Applied.M + b.Reactions.M}
}

// Relative returns the largest out-of-balance quantity of the check as a
// fraction of the load (of [Balance.Scale]): forces over it, moments over
// it × Length. It is 0 for an unloaded case that is exactly in balance and
// +Inf for an unloaded case that is not.
func (b Balance) Relative() float64 {
	o := b.Out()
	f := math.Max(math.Max(math.Abs(o.Fx), math.Abs(o.Fy)), b.JointForce)
	m := math.Max(math.Abs(o.M), b.JointMoment)
	if f == 0 && m == 0 {
		return 0
	}
	scale := b.Scale()
	if !(scale > 0) {
		return math.Inf(1)
	}
	return math.Max(f/scale, m/(scale*math.Max(b.Length, math.SmallestNonzeroFloat64)))
}

// Balance returns the statics check of case c.
func (sol *Solution) Balance(c int) Balance { return sol.BalanceOf([]int{c}) }

// BalanceOf returns the statics check of cases cs acting together: their
// loads against the reactions of their summed displacements, with the joint
// residuals of that sum. Checking a patterned case through the sum of its
// pieces costs one pass over the members, not one per piece.
func (sol *Solution) BalanceOf(cs []int) Balance {
	return sol.balanceOf(make([]float64, 3*len(sol.model.Nodes)), cs)
}

// BalanceSums is [Solution.BalanceOf] that leaves in u the displacements
// it checks: those of cases cs summed, as [Solution.DisplacementSums] sets
// them, to the last bit. A caller that needs both is spared reading the
// solution twice. u must have 3 entries per node.
func (sol *Solution) BalanceSums(u []float64, cs []int) Balance {
	if len(u) != 3*len(sol.model.Nodes) {
		panic("frame: BalanceSums: u has the wrong length")
	}
	return sol.balanceOf(u, cs)
}

// balanceOf is BalanceOf with the summed displacements set in u.
func (sol *Solution) balanceOf(u []float64, cs []int) Balance {
	mo := sol.model
	nn, nm := len(mo.Nodes), len(mo.Members)
	x0, y0, x1, y1 := box(mo)
	b := Balance{Length: math.Hypot(x1-x0, y1-y0), X0: x0, Y0: y0}
	fem := make([]float64, 6*nm)
	acc := make([]float64, 3*nn) // node loads less the end forces on the members
	for _, c := range cs {
		b.Imposed = b.Imposed || mo.Cases[c].Imposed()
		r := appliedAbout(mo, c, x0, y0)
		b.Applied = Resultant{Fx: b.Applied.Fx + r.Fx, Fy: b.Applied.Fy + r.Fy, M: b.Applied.M + r.M}
		b.Load += loadSize(mo, c, b.Length)
		for i, m := range sol.loaded[c] {
			for k := range 6 {
				fem[6*int(m)+k] += sol.fem[c][6*i+k]
			}
		}
		for _, nl := range mo.Cases[c].NodeLoads {
			acc[3*nl.Node] += nl.Fx
			acc[3*nl.Node+1] += nl.Fy
			acc[3*nl.Node+2] += nl.M
		}
	}
	sol.rowSums(u, cs)
	for m, mem := range mo.Members {
		e := &sol.elems[m]
		var ug, ul, f, g [6]float64
		copy(ug[:3], u[3*mem.Start:])
		copy(ug[3:], u[3*mem.End:])
		e.toLocal(&ul, &ug)
		for i := range 6 {
			v := fem[6*m+i]
			for j := range 6 {
				v += e.k[i][j] * ul[j]
			}
			f[i] = v
		}
		e.toGlobal(&g, &f)
		for i := range 3 {
			acc[3*mem.Start+i] -= g[i]
			acc[3*mem.End+i] -= g[3+i]
		}
		if e.so != nil {
			// On the deformed geometry the axial force of the geometric
			// stiffness, carried across the member from one displaced end to
			// the other, adds N Δv to the moment of the loads.
			b.Applied.M -= e.so.n * (ul[4] - ul[1])
		}
	}
	react := func(nd *Node, d int, rv float64) {
		switch d {
		case 0:
			b.Reactions.Fx += rv
			b.Reactions.M -= (nd.Y - y0) * rv // −y·Rx
		case 1:
			b.Reactions.Fy += rv
			b.Reactions.M += (nd.X - x0) * rv // x·Ry
		case 2:
			b.Reactions.M += rv
		}
		if b.Imposed {
			if d == 2 {
				rv /= math.Max(b.Length, math.SmallestNonzeroFloat64)
			}
			b.Reaction = math.Max(b.Reaction, math.Abs(rv))
		}
	}
	for v := range mo.Nodes {
		nd := &mo.Nodes[v]
		for d := range 3 {
			r := acc[3*v+d]
			if k := nd.Springs[d]; k > 0 && !nd.Support.Restrained(d) {
				// The spring's reaction, −k u, and what it leaves at the joint.
				rv := -k * u[3*v+d]
				react(nd, d, rv)
				r += rv
			}
			switch {
			case nd.Support.Restrained(d):
				// The reaction balances what is left at a held direction.
				react(nd, d, -r)
			case d == 2:
				b.JointMoment = math.Max(b.JointMoment, math.Abs(r))
			default:
				b.JointForce = math.Max(b.JointForce, math.Abs(r))
			}
		}
	}
	if b.Imposed {
		b.Restraint = sol.restraint(cs, b.Length)
	}
	return b
}

// restraint returns the largest force, or moment divided by length, at the
// ends of a member that the imposed deformations of cases cs (summed)
// cause with both its nodes held and its ends clamped, whatever its
// releases and springs: the forces that hold a change of temperature
// (EA α ΔT, EI α ΔT_gradient / depth) and those of the displacements
// imposed on its nodes. It is the scale of what the deformations do, not
// zero where the frame takes them freely (a member hinged at both ends).
func (sol *Solution) restraint(cs []int, length float64) float64 {
	mo := sol.model
	length = math.Max(length, math.SmallestNonzeroFloat64)
	out := 0.0
	for _, c := range cs {
		for m := range mo.Members {
			idx, _ := sol.loadsOn(c, m)
			e := &sol.elems[m]
			for _, i := range idx {
				if ld := &mo.Cases[c].MemberLoads[i]; ld.Thermal {
					out = math.Max(out, math.Abs(e.ea*e.alpha*ld.DT))
					if ld.DTGrad != 0 {
						out = math.Max(out, math.Abs(e.ei*e.alpha*ld.DTGrad/e.depth)/length)
					}
				}
			}
		}
	}
	if len(sol.imposed) == 0 {
		return out
	}
	nc := len(mo.Cases)
	for m, mem := range mo.Members {
		var ug, ul [6]float64
		has := false
		for k := range 6 {
			if e := sol.dof[3*[2]int{mem.Start, mem.End}[k/3]+k%3]; e < -1 {
				for _, c := range cs {
					ug[k] += sol.imposed[(-2-e)*nc+c]
				}
				has = has || ug[k] != 0
			}
		}
		if !has {
			continue
		}
		e := &sol.elems[m]
		e.toLocal(&ul, &ug)
		k := e.flex // clamped: no releases or springs
		e.offset(&k)
		for i := range 6 {
			f := 0.0
			for j := range 6 {
				f += k[i][j] * ul[j]
			}
			if i%3 == 2 {
				f /= length
			}
			out = math.Max(out, math.Abs(f))
		}
	}
	return out
}

// extent returns the diagonal of the bounding box of the nodes of mo.
func extent(mo *Model) float64 {
	x0, y0, x1, y1 := box(mo)
	return math.Hypot(x1-x0, y1-y0)
}

// box returns the lower left (x0, y0) and upper right (x1, y1) corners of
// the bounding box of the nodes of mo; all zero when there are none.
func box(mo *Model) (x0, y0, x1, y1 float64) {
	if len(mo.Nodes) == 0 {
		return 0, 0, 0, 0
	}
	x0, x1 = mo.Nodes[0].X, mo.Nodes[0].X
	y0, y1 = mo.Nodes[0].Y, mo.Nodes[0].Y
	for _, n := range mo.Nodes[1:] {
		x0, x1 = math.Min(x0, n.X), math.Max(x1, n.X)
		y0, y1 = math.Min(y0, n.Y), math.Max(y1, n.Y)
	}
	return x0, y0, x1, y1
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
		switch {
		case ld.Point:
			sum += math.Abs(ld.P)
			continue
		case ld.Moment:
			if length > 0 {
				sum += math.Abs(ld.M) / length
			}
			continue
		case ld.Thermal:
			continue // no resultant: see Balance.Restraint
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

// rowSums sets u[i] to the sum of displacement component i (3*node+d) over
// the cases cs, added in the order of cs: row by row, each row of the
// solution read along its contiguous cases once, eight rows at a time
// (eight independent sums in flight, where one row's additions would
// each wait on the one before; each row's order is that of cs).
func (sol *Solution) rowSums(u []float64, cs []int) {
	nc := len(sol.model.Cases)
	row := func(i int) []float64 {
		switch e := sol.dof[i]; {
		case e >= 0:
			return sol.x[e*nc : (e+1)*nc]
		case e < -1:
			return sol.imposed[(-2-e)*nc : (-1-e)*nc]
		}
		return nil
	}
	i := 0
	for ; i+8 <= len(u); i += 8 {
		r0, r1, r2, r3 := row(i), row(i+1), row(i+2), row(i+3)
		r4, r5, r6, r7 := row(i+4), row(i+5), row(i+6), row(i+7)
		if r0 == nil || r1 == nil || r2 == nil || r3 == nil || r4 == nil || r5 == nil || r6 == nil || r7 == nil {
			for k := i; k < i+8; k++ {
				u[k] = sum(row(k), cs)
			}
			continue
		}
		var s0, s1, s2, s3, s4, s5, s6, s7 float64
		for _, c := range cs {
			s0 += r0[c]
			s1 += r1[c]
			s2 += r2[c]
			s3 += r3[c]
			s4 += r4[c]
			s5 += r5[c]
			s6 += r6[c]
			s7 += r7[c]
		}
		u[i], u[i+1], u[i+2], u[i+3] = s0, s1, s2, s3
		u[i+4], u[i+5], u[i+6], u[i+7] = s4, s5, s6, s7
	}
	for ; i < len(u); i++ {
		u[i] = sum(row(i), cs)
	}
}

// sum returns the sum of r[c] over cs, in their order; 0 for r nil.
func sum(r []float64, cs []int) float64 {
	s := 0.0
	if r == nil {
		return s
	}
	for _, c := range cs {
		s += r[c]
	}
	return s
}
