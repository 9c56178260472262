package frame

import "math"

// element is the stiffness of one member in local axes, at its nodes: the
// flexible part's stiffness with its end conditions (releases, rotational
// springs) condensed out, carried to the nodes through the rigid end zones;
// with the transformation to global axes.
type element struct {
	k       [6][6]float64 // local stiffness at the nodes
	flex    [6][6]float64 // stiffness of the flexible part before its end conditions
	release Release
	spring  [2]float64 // rotational springs at the flexible part's start and end; 0: none
	c, s    float64    // direction cosines of local x
	l       float64    // length between the nodes
	a, b    float64    // rigid end zones at the start and the end
	lf      float64    // flexible length, l − a − b
	ei, ea  float64    // bending stiffness E I and axial stiffness E A
	alpha   float64    // coefficient of thermal expansion
	depth   float64    // section depth, for a temperature gradient
	// so is set for a member solved with a geometric stiffness
	// (Options.Axial): its flexible part is then subdivided (geometric.go).
	so *secondOrder
}

// newElement builds the local stiffness of member m of mo.
func newElement(mo *Model, m int) element {
	e, _ := newElementAxial(mo, m, 0, false)
	return e
}

// newElementAxial builds the local stiffness of member m of mo, with the
// geometric stiffness of axial force n (tension positive) when second is
// set. ok is false when the member buckles between its ends under n with
// them held (see condenseInner).
func newElementAxial(mo *Model, m int, n float64, second bool) (e element, ok bool) {
	return newElementAxialIn(mo, m, n, second, nil)
}

// newElementAxialIn is newElementAxial with the second-order part in so
// when it is not nil (memory reused from element to element), else in
// memory of its own.
func newElementAxialIn(mo *Model, m int, n float64, second bool, so *secondOrder) (e element, ok bool) {
	mem := mo.Members[m]
	sec := mo.Sections[mem.Section]
	c, s, l := mo.geometry(m)
	e = element{c: c, s: s, l: l, release: mem.Release, ei: sec.E * sec.I, ea: sec.E * sec.A,
		spring: [2]float64{mem.SpringStart, mem.SpringEnd}, a: mem.OffsetStart, b: mem.OffsetEnd,
		alpha: sec.Alpha, depth: sec.Depth}
	e.lf = l - e.a - e.b
	if e.a == 0 && e.b == 0 {
		e.lf = l // exactly
	}
	ei, lf := e.ei, e.lf
	ea := e.ea / lf
	k := &e.flex
	k[0][0], k[0][3], k[3][0], k[3][3] = ea, -ea, -ea, ea
	a, b, d, f := 12*ei/(lf*lf*lf), 6*ei/(lf*lf), 4*ei/lf, 2*ei/lf
	k[1][1], k[1][2], k[1][4], k[1][5] = a, b, -a, b
	k[2][1], k[2][2], k[2][4], k[2][5] = b, d, -b, f
	k[4][1], k[4][2], k[4][4], k[4][5] = -a, -b, a, -b
	k[5][1], k[5][2], k[5][4], k[5][5] = b, f, -b, d
	if second && !e.condenseInner(n, so) {
		return e, false
	}
	e.k = e.flex
	if !e.endConditions(&e.k, nil) && second {
		return e, false // a released end's own rotation has lost its stiffness
	}
	e.offset(&e.k)
	if second {
		e.zoneGeometric(&e.k, n)
	}
	return e, true
}

// kinematic returns e with the same geometry, releases and rigid end
// zones, and the stiffnesses of a member as stiff across its flexible
// length as along it, EA/lf = 12EI/lf³ = 1, whatever its section, with a
// rotational spring at an end taken as rigid (it holds the rotation): its
// strain energy ½δ² + (lf²/6)(θ₁² + θ₁θ₂ + θ₂²), for an elongation δ and
// end rotations θ measured from the chord, weighs stretching and bending
// alike, in units of length squared. The mechanism search works on the
// matrix of such members (see diagnose), which has the frame's mechanisms
// and none of the disparity of its stiffnesses.
//
// Its rotations are taken in units of length: the rotation at the start is
// h1 θ₁ and at the end h2 θ₂, h1 and h2 the longest member held rigidly at
// each end's node, so that no entry is larger than 1 however long or short
// the members are (lf³/12 itself would overflow past lf = 1e102). Its ei
// and ea are not those of any member.
func (e *element) kinematic(h1, h2 float64) element {
	r1, r2 := e.lf/h1, e.lf/h2
	b1, b2, d1, d2, f := r1/2, r2/2, r1*r1/3, r2*r2/3, r1*r2/6
	k := element{c: e.c, s: e.s, l: e.l, lf: e.lf, release: e.release,
		a: e.a / h1, b: e.b / h2} // a zone moves its flexible end by a θ = (a/h1)(h1 θ)
	m := &k.flex
	m[0][0], m[0][3], m[3][0], m[3][3] = 1, -1, -1, 1
	at := [4]int{1, 2, 4, 5}
	for i, r := range at {
		for j, c := range at {
			m[r][c] = [4][4]float64{
				{1, b1, -1, b2},
				{b1, d1, -b1, f},
				{-1, -b1, 1, -b2},
				{b2, f, -b2, d2},
			}[i][j]
		}
	}
	k.k = k.flex
	k.endConditions(&k.k, nil) // releases only: k has no springs
	k.offset(&k.k)
	return k
}

// endConditions condenses the releases and rotational springs of the
// flexible part's ends out of its stiffness k and, when f is not nil, out
// of its fixed-end forces f.
//
// It reports whether the stiffness of each end rotation condensed was
// positive when it was condensed: with a geometric stiffness, whether the
// member's own end rotations are still stable.
func (e *element) endConditions(k *[6][6]float64, f *[6]float64) bool {
	ok := true
	for side, r := range [2]int{2, 5} {
		released := e.release.AtStart()
		if side == 1 {
			released = e.release.AtEnd()
		}
		switch {
		case released:
			ok = ok && k[r][r] > 0
			condense(k, f, r)
		case e.spring[side] > 0:
			ok = ok && k[r][r]+e.spring[side] > 0
			springEnd(k, f, r, e.spring[side])
		}
	}
	return ok
}

// springEnd puts a rotational spring of stiffness ks between the member's
// rotation r and its node: the member's own end rotation becomes an inner
// degree of freedom, joined to the node's by the spring, and is condensed
// out. With p = k[r][r] + ks, the node's rotation keeps ks k[r][r] / p of
// the member's stiffness, and the fixed-end moment ks/p of its own.
func springEnd(k *[6][6]float64, f *[6]float64, r int, ks float64) {
	p := k[r][r] + ks
	col := [6]float64{}
	for i := range 6 {
		col[i] = k[i][r]
	}
	for i := range 6 {
		if i == r {
			continue
		}
		for j := range 6 {
			if j == r {
				continue
			}
			k[i][j] -= col[i] * col[j] / p
		}
		k[i][r] = col[i] * ks / p
		k[r][i] = k[i][r]
	}
	k[r][r] = ks * col[r] / p
	if f != nil {
		fr := f[r]
		for i := range 6 {
			if i != r {
				f[i] -= col[i] * fr / p
			}
		}
		f[r] = ks * fr / p
	}
}

// offset carries the stiffness k of the flexible part to the nodes through
// the rigid end zones: Tᵀ k T, where T gives the flexible ends'
// displacements from the nodes' (a transverse displacement of a rotation
// times the zone's length).
func (e *element) offset(k *[6][6]float64) {
	if e.a == 0 && e.b == 0 {
		return
	}
	// Columns: k T adds a·(column 1) to column 2 and −b·(column 4) to column 5.
	for i := range 6 {
		k[i][2] += e.a * k[i][1]
		k[i][5] -= e.b * k[i][4]
	}
	// Rows: Tᵀ (k T) likewise.
	for j := range 6 {
		k[2][j] += e.a * k[1][j]
		k[5][j] -= e.b * k[4][j]
	}
}

// offsetLoads carries the fixed-end forces f of the flexible part to the
// nodes: Tᵀ f, the moments about the nodes.
func (e *element) offsetLoads(f *[6]float64) {
	f[2] += e.a * f[1]
	f[5] -= e.b * f[4]
}

// condense removes degree of freedom r from k (and from the fixed-end force
// vector f when f is not nil) by static condensation, leaving row and column
// r zero.
func condense(k *[6][6]float64, f *[6]float64, r int) {
	p := k[r][r]
	if p == 0 {
		return
	}
	if f != nil {
		fr := f[r]
		for i := range 6 {
			f[i] -= k[i][r] * fr / p
		}
		f[r] = 0
	}
	col, row := [6]float64{}, k[r]
	for i := range 6 {
		col[i] = k[i][r]
	}
	for i := range 6 {
		for j := range 6 {
			k[i][j] -= col[i] * row[j] / p
		}
	}
	for i := range 6 {
		k[i][r], k[r][i] = 0, 0
	}
}

// toLocal rotates a global 6-vector of member end quantities to local axes.
func (e *element) toLocal(dst *[6]float64, g *[6]float64) {
	for n := 0; n < 6; n += 3 {
		dst[n] = e.c*g[n] + e.s*g[n+1]
		dst[n+1] = -e.s*g[n] + e.c*g[n+1]
		dst[n+2] = g[n+2]
	}
}

// toGlobal rotates a local 6-vector of member end quantities to global axes.
func (e *element) toGlobal(dst *[6]float64, l *[6]float64) {
	for n := 0; n < 6; n += 3 {
		dst[n] = e.c*l[n] - e.s*l[n+1]
		dst[n+1] = e.s*l[n] + e.c*l[n+1]
		dst[n+2] = l[n+2]
	}
}

// global returns Tᵀ k T, the member stiffness in global axes.
func (e *element) global() [6][6]float64 {
	var t [6][6]float64
	for n := 0; n < 6; n += 3 {
		t[n][n], t[n][n+1] = e.c, e.s
		t[n+1][n], t[n+1][n+1] = -e.s, e.c
		t[n+2][n+2] = 1
	}
	var kt, g [6][6]float64
	for i := range 6 {
		for j := range 6 {
			var sum float64
			for q := range 6 {
				sum += e.k[i][q] * t[q][j]
			}
			kt[i][j] = sum
		}
	}
	for i := range 6 {
		for j := range 6 {
			var sum float64
			for q := range 6 {
				sum += t[q][i] * kt[q][j]
			}
			g[i][j] = sum
		}
	}
	return g
}

// gauss3 holds the 3-point Gauss–Legendre rule on [-1, 1]; it integrates
// polynomials up to degree 5 exactly, enough for a linearly varying load
// times the cubic Hermite shape functions.
var gauss3 = [3]struct{ x, w float64 }{
	{-0.7745966692414834, 5.0 / 9},
	{0, 8.0 / 9},
	{0.7745966692414834, 5.0 / 9},
}

// intensity returns the local components of a distributed load at ξ.
func (ld *MemberLoad) intensity(xi, c, s float64) (qx, qy float64) {
	return ld.Direction.local(ld.IntensityAt(xi), c, s)
}

// fixedEnd sets f to the fixed-end forces (forces the nodes exert on the
// member, both nodes clamped) of the loads idx of loads, in local axes at
// the nodes, with the member's end conditions applied. The loads on the
// flexible part are integrated against its exact deflected shapes (cubic
// Hermite functions; linear for axial load), so the result is exact; its
// releases and springs are condensed, and its end forces carried to the
// nodes through the rigid end zones. A load on a rigid zone goes straight
// to its node.
func (e *element) fixedEnd(f *[6]float64, loads []MemberLoad, idx []int32) {
	if e.so != nil {
		e.fixedEndSecond(f, loads, idx)
		return
	}
	*f = [6]float64{}
	var direct [6]float64
	for _, i := range idx {
		e.addFixedEnd(f, &direct, &loads[i])
	}
	k := e.flex
	e.endConditions(&k, f)
	e.offsetLoads(f)
	for i := range 6 {
		f[i] += direct[i]
	}
}

// addFixedEnd adds to f the fixed-end forces of load ld on the flexible
// part (local axes at its ends, before its end conditions), and to direct
// the forces the nodes exert on the rigid zones under it.
func (e *element) addFixedEnd(f, direct *[6]float64, ld *MemberLoad) {
	l, lf, a0 := e.l, e.lf, e.a
	b0 := l - e.b // the flexible part is [a0, b0]
	// at adds a force (px, py) or a moment m at ξ from the start node.
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
		r := (xi - a0) / lf
		f[0] -= (1 - r) * px
		f[3] -= r * px
		f[1] -= (1-3*r*r+2*r*r*r)*py + (6*r*r-6*r)/lf*m
		f[2] -= lf*r*(1-r)*(1-r)*py + (1-r)*(1-3*r)*m
		f[4] -= (3*r*r-2*r*r*r)*py + (6*r-6*r*r)/lf*m
		f[5] -= lf*r*r*(r-1)*py + r*(3*r-2)*m
	}
	switch {
	case ld.Point:
		px, py := ld.Direction.local(ld.P, e.c, e.s)
		at(clampTo(ld.At, 0, l), px, py, 0)
	case ld.Moment:
		at(clampTo(ld.At, 0, l), 0, 0, ld.M)
	case ld.Thermal:
		n := e.ea * e.alpha * ld.DT // axial force of the clamped member, compression positive
		f[0] += n
		f[3] -= n
		if ld.DTGrad != 0 {
			m := e.ei * e.alpha * ld.DTGrad / e.depth // sagging moment of the clamped member
			f[2] -= m
			f[5] += m
		}
	default:
		lo, hi := clampTo(ld.From, 0, l), clampTo(ld.To, 0, l)
		// Each of the three parts, rigid or flexible, integrated on its own
		// so that the rule stays exact on each.
		for _, part := range [3][2]float64{{lo, min(hi, a0)}, {max(lo, a0), min(hi, b0)}, {max(lo, b0), hi}} {
			pa, pb := part[0], part[1]
			if !(pb > pa) {
				continue
			}
			h, mid := (pb-pa)/2, (pa+pb)/2
			for _, g := range gauss3 {
				xi := mid + h*g.x
				qx, qy := ld.intensity(xi, e.c, e.s)
				at(xi, qx*g.w*h, qy*g.w*h, 0)
			}
		}
	}
}

// Forces are the internal forces at a station.
type Forces struct {
	N, V, M float64
}

// stationForces returns the internal forces at distance x from the start of
// a member of length l and direction cosines c, s, given the local end
// forces at its start and the loads on it. A point load or a concentrated
// moment exactly at x is not yet included (the value just before it),
// except a concentrated moment at the start (x = 0), which is: the value
// at the start is the one inside the member. Temperature changes give no
// forces of their own: they act through the end forces.
func stationForces(f0, f1, f2, x, l, c, s float64, loads []MemberLoad, idx []int32) Forces {
	n := -f0
	v := f1
	m := -f2 + x*f1
	tol := 1e-9 * l
	for _, i := range idx {
		ld := &loads[i]
		switch {
		case ld.Point:
			if ld.At < x-tol {
				px, py := ld.Direction.local(ld.P, c, s)
				n -= px
				v += py
				m += (x - ld.At) * py
			}
			continue
		case ld.Moment:
			if ld.At < x-tol || ld.At <= tol {
				m -= ld.M
			}
			continue
		case ld.Thermal:
			continue
		}
		a, b := clampTo(ld.From, 0, l), math.Min(clampTo(ld.To, 0, l), x)
		if b <= a {
			continue
		}
		h, mid := (b-a)/2, (a+b)/2
		for _, g := range gauss3 {
			xi := mid + h*g.x
			qx, qy := ld.intensity(xi, c, s)
			n -= qx * g.w * h
			v += qy * g.w * h
			m += (x - xi) * qy * g.w * h
		}
	}
	return Forces{N: n, V: v, M: m}
}
