package frame

import "math"

// element is the stiffness of one member in local axes after its releases
// have been condensed out, with the transformation to global axes.
type element struct {
	k       [6][6]float64 // local stiffness, releases condensed
	full    [6][6]float64 // local stiffness before condensation
	release Release
	c, s    float64 // direction cosines of local x
	l       float64
	ei      float64 // bending stiffness E I
}

// newElement builds the local stiffness of member m of mo.
func newElement(mo *Model, m int) element {
	mem := mo.Members[m]
	sec := mo.Sections[mem.Section]
	c, s, l := mo.geometry(m)
	ei := sec.E * sec.I
	a, b, d, f := 12*ei/(l*l*l), 6*ei/(l*l), 4*ei/l, 2*ei/l
	return makeElement(c, s, l, ei, mem.Release, sec.E*sec.A/l, &[4][4]float64{
		{a, b, -a, b},
		{b, d, -b, f},
		{-a, -b, a, -b},
		{b, f, -b, d},
	})
}

// kinematic returns e with the same geometry and releases, and the
// stiffnesses of a member as stiff across its length as along it,
// EA/L = 12EI/L³ = 1, whatever its section: its strain energy
// ½δ² + (L²/6)(θ₁² + θ₁θ₂ + θ₂²), for an elongation δ and end rotations θ
// measured from the chord, weighs stretching and bending alike, in units
// of length squared. The mechanism search works on the matrix of such
// members (see diagnose), which has the frame's mechanisms and none of
// the disparity of its stiffnesses.
//
// Its rotations are taken in units of length: the rotation at the start is
// h1 θ₁ and at the end h2 θ₂, h1 and h2 the longest member held rigidly at
// each end's node, so that no entry is larger than 1 however long or short
// the members are (L³/12 itself would overflow past L = 1e102). Its ei is
// not that of any member.
func (e *element) kinematic(h1, h2 float64) element {
	r1, r2 := e.l/h1, e.l/h2
	b1, b2, d1, d2, f := r1/2, r2/2, r1*r1/3, r2*r2/3, r1*r2/6
	return makeElement(e.c, e.s, e.l, 0, e.release, 1, &[4][4]float64{
		{1, b1, -1, b2},
		{b1, d1, -b1, f},
		{-1, -b1, 1, -b2},
		{b2, f, -b2, d2},
	})
}

// makeElement builds the local stiffness of a member of direction cosines
// c, s, length l, bending stiffness ei (EI) and releases rel, from its
// axial stiffness ea (EA/L) and its bending block bend, in the order
// transverse displacement and rotation at the start, then at the end.
func makeElement(c, s, l, ei float64, rel Release, ea float64, bend *[4][4]float64) element {
	e := element{c: c, s: s, l: l, release: rel, ei: ei}
	k := &e.k
	k[0][0], k[0][3], k[3][0], k[3][3] = ea, -ea, -ea, ea
	at := [4]int{1, 2, 4, 5}
	for i, r := range at {
		for j, c := range at {
			k[r][c] = bend[i][j]
		}
	}
	e.full = e.k
	if rel.AtStart() {
		condense(k, nil, 2)
	}
	if rel.AtEnd() {
		condense(k, nil, 5)
	}
	return e
}

// condenseLoads applies the member's releases to its fixed-end forces f.
func (e *element) condenseLoads(f *[6]float64) {
	if e.release == ReleaseNone {
		return
	}
	k := e.full
	if e.release.AtStart() {
		condense(&k, f, 2)
	}
	if e.release.AtEnd() {
		condense(&k, f, 5)
	}
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

// addFixedEnd adds to f the fixed-end forces (forces the nodes exert on a
// member clamped at both ends) that load ld causes on a member of length l
// with direction cosines c, s. The shape functions are the exact
// deflected shapes of a prismatic member, so the result is exact.
func addFixedEnd(f *[6]float64, ld *MemberLoad, c, s, l float64) {
	add := func(xi, px, py float64) {
		r := xi / l
		f[0] -= (1 - r) * px
		f[3] -= r * px
		f[1] -= (1 - 3*r*r + 2*r*r*r) * py
		f[2] -= l * r * (1 - r) * (1 - r) * py
		f[4] -= (3*r*r - 2*r*r*r) * py
		f[5] -= l * r * r * (r - 1) * py
	}
	if ld.Point {
		px, py := ld.Direction.local(ld.P, c, s)
		add(clampTo(ld.At, 0, l), px, py)
		return
	}
	a, b := clampTo(ld.From, 0, l), clampTo(ld.To, 0, l)
	h, mid := (b-a)/2, (a+b)/2
	for _, g := range gauss3 {
		xi := mid + h*g.x
		qx, qy := ld.intensity(xi, c, s)
		add(xi, qx*g.w*h, qy*g.w*h)
	}
}

// Forces are the internal forces at a station.
type Forces struct {
	N, V, M float64
}

// stationForces returns the internal forces at distance x from the start of
// a member of length l and direction cosines c, s, given the local end
// forces at its start and the loads on it. A point load exactly at x is not
// yet included (the value just before it).
func stationForces(f0, f1, f2, x, l, c, s float64, loads []MemberLoad, idx []int32) Forces {
	n := -f0
	v := f1
	m := -f2 + x*f1
	tol := 1e-9 * l
	for _, i := range idx {
		ld := &loads[i]
		if ld.Point {
			if ld.At < x-tol {
				px, py := ld.Direction.local(ld.P, c, s)
				n -= px
				v += py
				m += (x - ld.At) * py
			}
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
