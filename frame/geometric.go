package frame

import (
	"errors"
	"math"
)

// SubElements is the number of equal sub-elements the flexible part of a
// member is divided into for its geometric stiffness in a second-order
// analysis ([Options.Axial]). With the consistent geometric stiffness of
// a cubic beam element, a pinned member reaches the Euler load within
// 21.6 %, 0.75 %, 0.16 % and 0.05 % for 1 to 4 sub-elements (the
// 4-element value is checked in geometric_test.go): 4 is the least that
// keeps the error under 0.1 %. The sub-elements' inner nodes are condensed
// out of the member's stiffness, so the frame's equations keep their
// size and bandwidth.
const SubElements = 4

// inner is the number of degrees of freedom of the inner nodes of a
// member's sub-elements.
const inner = 3 * (SubElements - 1)

// ErrUnstable is wrapped by the error of a second-order solve whose
// stiffness, with the geometric stiffness of the given axial forces, is
// not positive definite: the frame buckles under those forces.
var ErrUnstable = errors.New("the frame buckles under the axial forces")

// secondOrder is what a member solved with a geometric stiffness keeps to
// recover its deflected shape: the axial force, the Cholesky factor of the
// stiffness of the inner nodes and their coupling to the flexible part's
// ends.
type secondOrder struct {
	n   float64               // axial force of the geometric stiffness, tension positive
	h   float64               // sub-element length
	lii [inner][inner]float64 // lower Cholesky factor of the inner stiffness
	kie [inner][6]float64     // inner rows, end columns
}

// subStiffness returns the 15 × 15 stiffness of the flexible part of
// length lf divided into SubElements sub-elements, with the consistent
// geometric stiffness of axial force n (tension positive): nodes 0 to
// SubElements, dofs u, v, θ each, in local axes.
func subStiffness(ea, ei, lf, n float64) [3 * (SubElements + 1)][3 * (SubElements + 1)]float64 {
	var k [3 * (SubElements + 1)][3 * (SubElements + 1)]float64
	h := lf / SubElements
	a, b, d, f := 12*ei/(h*h*h), 6*ei/(h*h), 4*ei/h, 2*ei/h
	g := n / h
	ke := [6][6]float64{
		{ea / h, 0, 0, -ea / h, 0, 0},
		{0, a + g*6/5, b + g*h/10, 0, -a - g*6/5, b + g*h/10},
		{0, b + g*h/10, d + g*2*h*h/15, 0, -b - g*h/10, f - g*h*h/30},
		{-ea / h, 0, 0, ea / h, 0, 0},
		{0, -a - g*6/5, -b - g*h/10, 0, a + g*6/5, -b - g*h/10},
		{0, b + g*h/10, f - g*h*h/30, 0, -b - g*h/10, d + g*2*h*h/15},
	}
	for s := range SubElements {
		o := 3 * s
		for i := range 6 {
			for j := range 6 {
				k[o+i][o+j] += ke[i][j]
			}
		}
	}
	return k
}

// endDOF maps the 6 end degrees of freedom of the flexible part to those
// of the subdivided member, and innerDOF the inner ones.
var endDOF = [6]int{0, 1, 2, 3 * SubElements, 3*SubElements + 1, 3*SubElements + 2}

func innerDOF(i int) int { return 3 + i }

// The degrees of freedom of the subdivided member fall in two sets that
// subStiffness never couples: the axial ones (u at each node) and the
// bending ones (v and θ). Between the sets the inner stiffness, its
// Cholesky factor (whose entries there come out +0) and the coupling kie
// are +0 exactly, and so is each product with them, which changes no sum
// it would be added to or subtracted from (no such sum is −0: every one
// starts from an entry formed by adding to +0). So the factor, the solves
// and the condensation go set by set, over each set's terms in the order
// the full loops take them, and give the full loops' results to the last
// bit in a third of the operations (TestInnerSetsAreTheFullLoops);
// innerAxial and innerBending list each set's inner degrees of freedom,
// ascending, and endAxial and endBending its end ones (places in endDOF).
var (
	innerAxial, innerBending = innerSets()
	endAxial                 = [...]int{0, 3}
	endBending               = [...]int{1, 2, 4, 5}
)

func innerSets() (a [SubElements - 1]int, b [2 * (SubElements - 1)]int) {
	for n := range SubElements - 1 {
		a[n] = 3 * n
		b[2*n], b[2*n+1] = 3*n+1, 3*n+2
	}
	return a, b
}

// innerOf returns the inner set of the end degree of freedom j (a place
// in endDOF).
func innerOf(j int) []int {
	if j == 0 || j == 3 {
		return innerAxial[:]
	}
	return innerBending[:]
}

// condenseInner sets e.flex to the stiffness of the subdivided flexible
// part with the geometric stiffness of axial force n, its inner nodes
// condensed out, and e.so to what recovers them: so, overwritten, when it
// is not nil. ok is false when the inner stiffness is not positive
// definite: the member buckles between its ends under n even with them
// held.
func (e *element) condenseInner(n float64, so *secondOrder) bool {
	k := subStiffness(e.ea, e.ei, e.lf, n)
	if so == nil {
		so = new(secondOrder)
	}
	*so = secondOrder{n: n, h: e.lf / SubElements}
	var kii [inner][inner]float64
	for i := range inner {
		for j := range inner {
			kii[i][j] = k[innerDOF(i)][innerDOF(j)]
		}
		for j := range 6 {
			so.kie[i][j] = k[innerDOF(i)][endDOF[j]]
		}
	}
	if !cholesky(&kii, &so.lii) {
		return false
	}
	// flex = kee − keiᵀ kii⁻¹ kie, column by column: a column of kie has
	// its end's set only, and so has its solve (the other set's entries
	// of col and of flex's column stay +0).
	for _, ends := range [2][]int{endAxial[:], endBending[:]} {
		set := innerOf(ends[0])
		for _, j := range ends {
			var col [inner]float64
			for _, i := range set {
				col[i] = so.kie[i][j]
			}
			so.solveSet(&col, set)
			for _, i := range ends {
				v := k[endDOF[i]][endDOF[j]]
				for _, q := range set {
					v -= so.kie[q][i] * col[q]
				}
				e.flex[i][j] = v
			}
		}
	}
	// Symmetric to the last bit, as the band storage assumes.
	for i := range 6 {
		for j := i + 1; j < 6; j++ {
			v := (e.flex[i][j] + e.flex[j][i]) / 2
			e.flex[i][j], e.flex[j][i] = v, v
		}
	}
	e.so = so
	return true
}

// cholesky sets l, whose entries between the sets must be +0, to the
// lower Cholesky factor of the inner stiffness a, set by set; false when
// a is not positive definite.
func cholesky(a, l *[inner][inner]float64) bool {
	return choleskySet(a, l, innerAxial[:]) && choleskySet(a, l, innerBending[:])
}

// choleskySet factors the rows and columns set of a into l.
func choleskySet(a, l *[inner][inner]float64, set []int) bool {
	for jj, j := range set {
		s := a[j][j]
		for _, k := range set[:jj] {
			s -= l[j][k] * l[j][k]
		}
		if !(s > 0) {
			return false
		}
		l[j][j] = math.Sqrt(s)
		for _, i := range set[jj+1:] {
			t := a[i][j]
			for _, k := range set[:jj] {
				t -= l[i][k] * l[j][k]
			}
			l[i][j] = t / l[j][j]
		}
	}
	return true
}

// solve overwrites x with kii⁻¹ x.
func (so *secondOrder) solve(x *[inner]float64) {
	so.solveSet(x, innerAxial[:])
	so.solveSet(x, innerBending[:])
}

// solveSet overwrites the entries set of x with those of kii⁻¹ x, from
// the same entries of x.
func (so *secondOrder) solveSet(x *[inner]float64, set []int) {
	for ii, i := range set {
		s := x[i]
		for _, k := range set[:ii] {
			s -= so.lii[i][k] * x[k]
		}
		x[i] = s / so.lii[i][i]
	}
	for ii := len(set) - 1; ii >= 0; ii-- {
		i := set[ii]
		s := x[i]
		for _, k := range set[ii+1:] {
			s -= so.lii[k][i] * x[k]
		}
		x[i] = s / so.lii[i][i]
	}
}

// subLoads returns the fixed-end forces, in local axes, of the loads idx
// on the subdivided flexible part (every node of the sub-elements held,
// 15 entries), and in direct the forces the nodes exert on the rigid
// zones under them; as addFixedEnd for the whole flexible part, with each
// load's consistent nodal forces taken on the sub-element it lies on.
func (e *element) subLoads(loads []MemberLoad, idx []int32) (f [3 * (SubElements + 1)]float64, direct [6]float64) {
	l, lf, a0 := e.l, e.lf, e.a
	b0 := l - e.b
	h := lf / SubElements
	at := func(xi, px, py, m float64) {
		switch {
		case xi < a0:
			direct[0] -= px
			direct[1] -= py
			direct[2] -= xi*py + m
			return
		case xi > b0:
			direct[3] -= px
			direct[4] -= py
			direct[5] -= (xi-l)*py + m
			return
		}
		s := min(int((xi-a0)/h), SubElements-1)
		r := (xi - a0 - float64(s)*h) / h
		o := 3 * s
		f[o] -= (1 - r) * px
		f[o+3] -= r * px
		f[o+1] -= (1-3*r*r+2*r*r*r)*py + (6*r*r-6*r)/h*m
		f[o+2] -= h*r*(1-r)*(1-r)*py + (1-r)*(1-3*r)*m
		f[o+4] -= (3*r*r-2*r*r*r)*py + (6*r-6*r*r)/h*m
		f[o+5] -= h*r*r*(r-1)*py + r*(3*r-2)*m
	}
	for _, i := range idx {
		ld := &loads[i]
		switch {
		case ld.Point:
			px, py := ld.Direction.local(ld.P, e.c, e.s)
			at(clampTo(ld.At, 0, l), px, py, 0)
		case ld.Moment:
			at(clampTo(ld.At, 0, l), 0, 0, ld.M)
		case ld.Thermal:
			// Uniform along the member: the inner nodes' shares cancel.
			n := e.ea * e.alpha * ld.DT
			f[0] += n
			f[3*SubElements] -= n
			if ld.DTGrad != 0 {
				m := e.ei * e.alpha * ld.DTGrad / e.depth
				f[2] -= m
				f[3*SubElements+2] += m
			}
		default:
			lo, hi := clampTo(ld.From, 0, l), clampTo(ld.To, 0, l)
			// The rigid zones and each sub-element apart, so that the rule
			// stays exact on each.
			cuts := [SubElements + 3]float64{0}
			for s := range SubElements + 1 {
				cuts[s+1] = a0 + float64(s)*h
			}
			cuts[SubElements+1] = b0
			cuts[SubElements+2] = l
			for p := range SubElements + 2 {
				pa, pb := max(lo, cuts[p]), min(hi, cuts[p+1])
				if !(pb > pa) {
					continue
				}
				hh, mid := (pb-pa)/2, (pa+pb)/2
				for _, g := range gauss3 {
					xi := mid + hh*g.x
					qx, qy := ld.intensity(xi, e.c, e.s)
					at(xi, qx*g.w*hh, qy*g.w*hh, 0)
				}
			}
		}
	}
	return f, direct
}

// fixedEndSecond is fixedEnd for a member with a geometric stiffness: the
// loads' fixed-end forces on the subdivided flexible part, the inner nodes
// condensed out, then the end conditions and rigid zones as fixedEnd.
func (e *element) fixedEndSecond(f *[6]float64, loads []MemberLoad, idx []int32) {
	full, direct := e.subLoads(loads, idx)
	*f = e.so.condenseLoads(&full)
	k := e.flex
	e.endConditions(&k, f)
	e.offsetLoads(f)
	for i := range 6 {
		f[i] += direct[i]
	}
}

// condenseLoads returns fe − keiᵀ kii⁻¹ fi of the subdivided part's
// fixed-end forces full.
func (so *secondOrder) condenseLoads(full *[3 * (SubElements + 1)]float64) [6]float64 {
	var fi [inner]float64
	for i := range inner {
		fi[i] = full[innerDOF(i)]
	}
	so.solve(&fi)
	var out [6]float64
	for i := range 6 {
		v := full[endDOF[i]]
		for _, q := range innerOf(i) {
			v -= so.kie[q][i] * fi[q]
		}
		out[i] = v
	}
	return out
}

// shape returns the local displacements of the nodes of the sub-elements
// of a member solved with a geometric stiffness, given the local
// displacements ul of its nodes and its loads idx: the flexible part's end
// displacements from the nodes' through the rigid zones, its end rotations
// where a release or a spring parts them from the nodes' (from the
// condition that the end moment is zero, or the spring's), and the inner
// nodes' from the condensed equations.
func (e *element) shape(ul *[6]float64, loads []MemberLoad, idx []int32) [3 * (SubElements + 1)]float64 {
	full, _ := e.subLoads(loads, idx)
	fe := e.so.condenseLoads(&full) // flexible part, before its end conditions
	var ue [6]float64
	ue[0], ue[1], ue[2] = ul[0], ul[1]+e.a*ul[2], ul[2]
	ue[3], ue[4], ue[5] = ul[3], ul[4]-e.b*ul[5], ul[5]
	// End rotations parted from the nodes': a 2 × 2 system, rigid ends
	// held at the node's rotation.
	free := [2]bool{e.release.AtStart() || e.spring[0] > 0, e.release.AtEnd() || e.spring[1] > 0}
	if free[0] || free[1] {
		rs := [2]int{2, 5}
		var a [2][2]float64
		var rhs [2]float64
		for p, r := range rs {
			if !free[p] {
				a[p][p], rhs[p] = 1, ue[r]
				continue
			}
			ks := e.spring[p]
			if e.release.AtStart() && p == 0 || e.release.AtEnd() && p == 1 {
				ks = 0
			}
			rhs[p] = ks*ue[r] - fe[r]
			for j := range 6 {
				if j != 2 && j != 5 {
					rhs[p] -= e.flex[r][j] * ue[j]
				}
			}
			for q, c := range rs {
				a[p][q] = e.flex[r][c]
			}
			a[p][p] += ks
		}
		det := a[0][0]*a[1][1] - a[0][1]*a[1][0]
		ue[2] = (rhs[0]*a[1][1] - a[0][1]*rhs[1]) / det
		ue[5] = (a[0][0]*rhs[1] - a[1][0]*rhs[0]) / det
	}
	var ui [inner]float64
	for _, ends := range [2][]int{endAxial[:], endBending[:]} {
		for _, i := range innerOf(ends[0]) {
			v := full[innerDOF(i)]
			for _, j := range ends {
				v += e.so.kie[i][j] * ue[j]
			}
			ui[i] = -v
		}
	}
	e.so.solve(&ui)
	var out [3 * (SubElements + 1)]float64
	for j := range 6 {
		out[endDOF[j]] = ue[j]
	}
	for i := range inner {
		out[innerDOF(i)] = ui[i]
	}
	return out
}

// transverse returns the local transverse displacement at x of a member
// whose sub-element nodes move by sh and whose nodes move by ul: along the
// rigid zones, their rigid motion; along the flexible part, the cubic
// through the displacements and rotations of the sub-element's nodes.
func (e *element) transverse(sh *[3 * (SubElements + 1)]float64, ul *[6]float64, x float64) float64 {
	switch {
	case x <= e.a:
		return ul[1] + x*ul[2]
	case x >= e.l-e.b:
		return ul[4] - (e.l-x)*ul[5]
	}
	h := e.so.h
	s := min(int((x-e.a)/h), SubElements-1)
	r := (x - e.a - float64(s)*h) / h
	o := 3 * s
	return (1-3*r*r+2*r*r*r)*sh[o+1] + h*r*(1-r)*(1-r)*sh[o+2] + (3*r*r-2*r*r*r)*sh[o+4] + h*r*r*(r-1)*sh[o+5]
}

// zoneGeometric adds to k, the member's stiffness at its nodes, the
// geometric stiffness of its rigid zones under axial force n: a zone of
// length a turned by θ moves the flexible end across the axis by a θ,
// and the axial force then does work ½ n a θ².
func (e *element) zoneGeometric(k *[6][6]float64, n float64) {
	k[2][2] += n * e.a
	k[5][5] += n * e.b
}

// Axial returns the axial forces of the geometric stiffness the model was
// solved with ([Options.Axial]), nil for a first-order solution. The
// slice is the solution's own: do not modify it.
func (sol *Solution) Axial() []float64 { return sol.axial }

// localU returns the local displacements of the nodes of member m in case c.
func (sol *Solution) localU(c, m int) [6]float64 {
	mem := sol.model.Members[m]
	var ug, ul [6]float64
	for d := range 3 {
		ug[d], ug[3+d] = sol.u(c, 3*mem.Start+d), sol.u(c, 3*mem.End+d)
	}
	sol.elems[m].toLocal(&ul, &ug)
	return ul
}

// secondTo adds to the moments of row, member m's forces in case c at xs,
// the second-order moment N (v(x) − v(0)): the axial force of the
// geometric stiffness times the member's transverse displacement at x from
// that of its start node, in the member's undeformed local axes. With it
// the moment at the end equals the end moment, as the member's
// equilibrium on the deformed geometry asks. When defl is not nil it is
// filled with the deflections relative to the chord from the same shape.
func (sol *Solution) secondTo(row []Forces, defl []float64, c, m int, xs []float64) {
	w := sol.elems[m].weights(xs)
	sol.secondWith(w, row, defl, c, m, xs)
}

// weights returns, for an element solved with a geometric stiffness, the
// weights that give its transverse displacement at each of xs, less its
// start node's, from the local displacements of its nodes when it carries
// no load: the shape is linear in them.
func (e *element) weights(xs []float64) [][6]float64 {
	w := make([][6]float64, len(xs))
	for j := range 6 {
		var ul [6]float64
		ul[j] = 1
		sh := e.shape(&ul, nil, nil)
		for i, x := range xs {
			w[i][j] = e.transverse(&sh, &ul, x) - ul[1]
		}
	}
	return w
}

// secondWith is secondTo with the element's weights at xs (weights): the
// shape of the unloaded member from them, and that of the loads of case c
// on the member with its nodes held added where there are any.
func (sol *Solution) secondWith(w [][6]float64, row []Forces, defl []float64, c, m int, xs []float64) {
	ul := sol.localU(c, m)
	sol.secondFrom(w, row, defl, c, m, &ul, xs)
}

// secondFrom is secondWith given the local displacements ul of the
// member's nodes in case c.
func (sol *Solution) secondFrom(w [][6]float64, row []Forces, defl []float64, c, m int, ul *[6]float64, xs []float64) {
	e := &sol.elems[m]
	idx, _ := sol.loadsOn(c, m)
	var held [6]float64
	var sh [3 * (SubElements + 1)]float64
	if len(idx) > 0 {
		sh = e.shape(&held, sol.model.Cases[c].MemberLoads, idx)
	}
	for i, x := range xs {
		v := Sway(&w[i], ul)
		if len(idx) > 0 {
			v += e.transverse(&sh, &held, x)
		}
		if row != nil {
			row[i].M += e.so.n * v
		}
		if defl != nil {
			defl[i] = v - x/e.l*(ul[4]-ul[1])
		}
	}
}

// Sway returns Σ w[j]·u[j], j = 0 to 5 in that order: the transverse
// displacement v(x) − v(0) of a member solved with a geometric stiffness,
// at a station whose weights are w ([Solution.SecondOrderWeightsTo]), in a
// case that does not load it, whose nodes' local displacements are u
// ([Solution.DisplacementsEach]). Its moment there is the first-order
// −f₂ + x·f₁ plus N·Sway, to the last bit of [Solution.StationsTo].
func Sway(w, u *[6]float64) float64 {
	v := 0.0
	v += w[0] * u[0]
	v += w[1] * u[1]
	v += w[2] * u[2]
	v += w[3] * u[3]
	v += w[4] * u[4]
	v += w[5] * u[5]
	return v
}

// SecondOrderWeightsTo fills dst[i] with the weights ([Sway]) at xs[i] of
// member m, solved with a geometric stiffness, and returns its axial force
// N (tension positive). It panics for a member of a first-order solution
// ([Solution.Unloaded]). dst must have length len(xs).
func (sol *Solution) SecondOrderWeightsTo(dst [][6]float64, m int, xs []float64) float64 {
	e := &sol.elems[m]
	if e.so == nil {
		panic("frame: SecondOrderWeightsTo: the member is not solved in second order")
	}
	if len(dst) != len(xs) {
		panic("frame: SecondOrderWeightsTo: dst has the wrong length")
	}
	copy(dst, e.weights(xs))
	return e.so.n
}

// SecondFrom adds to dst[i].M, when dst is not nil, the second-order
// moment N·(v(x) − v(0)) of member m in case c at xs[i], and sets defl[i],
// when defl is not nil, to its deflection there relative to its chord,
// given the local displacements u of the member's nodes in that case
// ([Solution.DisplacementsEach]) and the member's weights w at xs
// ([Solution.SecondOrderWeightsTo]): after [Solution.StationsFrom], dst
// holds the values of [Solution.StationsTo] to the last bit, and defl
// those of [Solution.DeflectionsTo]. dst (when not nil), defl (when not
// nil) and w must have length len(xs).
func (sol *Solution) SecondFrom(dst []Forces, defl []float64, c, m int, u *[6]float64, w [][6]float64, xs []float64) {
	if sol.elems[m].so == nil {
		panic("frame: SecondFrom: the member is not solved in second order")
	}
	if (dst != nil && len(dst) != len(xs)) || (defl != nil && len(defl) != len(xs)) || len(w) != len(xs) {
		panic("frame: SecondFrom: dst, defl or w has the wrong length")
	}
	sol.secondFrom(w, dst, defl, c, m, u, xs)
}
