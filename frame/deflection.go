package frame

// Deflection returns the transverse deflection of member m in case c at
// distance x from its start, relative to the member's chord: the straight
// line between its displaced ends. It is measured along local y (positive
// up for a beam drawn left to right, so a sagging beam deflects negatively).
//
// The deflection is the elastic curve of the member: the curvature M/EI,
// integrated twice from the member's bending moment, which statics gives
// exactly from its end forces and loads, and set to zero at both ends.
// Between point loads the moment is a polynomial of degree three at most
// (a linearly varying distributed load), so the integrals are evaluated in
// closed form; a moment release only makes the moment zero at that end and
// needs nothing more. Shear deformation is neglected, as in the solver.
func (sol *Solution) Deflection(c, m int, x float64) float64 {
	var d [1]float64
	sol.deflectionsOf(d[:], c, m, []float64{x})
	return d[0]
}

// DeflectionsTo fills dst with the deflections of member m relative to its
// chord at the distances xs from its start, in every case: dst[c*len(xs)+i]
// holds case c at xs[i]. dst must have length len(xs) × the number of cases.
// See [Solution.Deflection].
func (sol *Solution) DeflectionsTo(dst []float64, m int, xs []float64) {
	nc := len(sol.model.Cases)
	if len(dst) != nc*len(xs) {
		panic("frame: DeflectionsTo: dst has the wrong length")
	}
	for c := range nc {
		sol.deflectionsOf(dst[c*len(xs):(c+1)*len(xs)], c, m, xs)
	}
}

// deflectionsOf fills dst[i] with the deflection of member m in case c at
// xs[i] relative to its chord.
func (sol *Solution) deflectionsOf(dst []float64, c, m int, xs []float64) {
	var f [6]float64
	sol.endForcesTo(&f, c, m)
	idx, _ := sol.loadsOn(c, m)
	deflectionsTo(dst, &f, &sol.elems[m], sol.model.Cases[c].MemberLoads, idx, xs)
}

// deflectionsTo fills dst[i] with the deflection relative to the chord at
// xs[i] of an element with local end forces f and the loads idx.
func deflectionsTo(dst []float64, f *[6]float64, e *element, loads []MemberLoad, idx []int32, xs []float64) {
	if len(idx) == 0 {
		// Unloaded: the moment is linear, −f2 + f1 ξ.
		fl := -f[2]*e.l*e.l/2 + f[1]*e.l*e.l*e.l/6
		for i, x := range xs {
			dst[i] = (-f[2]*x*x/2 + f[1]*x*x*x/6 - x/e.l*fl) / e.ei
		}
		return
	}
	fl := curvatureIntegral(f[1], f[2], e.l, e.l, e.c, e.s, loads, idx)
	for i, x := range xs {
		dst[i] = (curvatureIntegral(f[1], f[2], x, e.l, e.c, e.s, loads, idx) - x/e.l*fl) / e.ei
	}
}

// curvatureIntegral returns F(x) = ∫₀ˣ (x − ξ) M(ξ) dξ, the moment of a
// member integrated twice from its start with F(0) = F'(0) = 0, given the
// local end forces at its start (f1 transverse, f2 moment) and its loads.
// Then EI v(x) = F(x) − (x/L) F(L) is the deflection relative to the chord.
//
// With M(ξ) = −f2 + f1 ξ plus, for a transverse point load p at a, p (ξ − a)
// beyond a, and for a distributed load q, ∫ q(t) (ξ − t) dt over its part
// before ξ, the integral is
//
//	F(x) = −f2 x²/2 + f1 x³/6 + Σ p (x − a)³/6 + Σ ∫ q(t) (x − t)³/6 dt,
//
// the last over the part of each distributed load before x. q varies
// linearly, so that integrand is a polynomial of degree four, which the
// three-point Gauss–Legendre rule integrates exactly.
func curvatureIntegral(f1, f2, x, l, c, s float64, loads []MemberLoad, idx []int32) float64 {
	v := -f2*x*x/2 + f1*x*x*x/6
	for _, i := range idx {
		ld := &loads[i]
		if ld.Point {
			if a := clampTo(ld.At, 0, l); a < x {
				_, py := ld.Direction.local(ld.P, c, s)
				d := x - a
				v += py * d * d * d / 6
			}
			continue
		}
		a, b := clampTo(ld.From, 0, l), clampTo(ld.To, 0, l)
		b = min(b, x)
		if b <= a {
			continue
		}
		h, mid := (b-a)/2, (a+b)/2
		for _, g := range gauss3 {
			t := mid + h*g.x
			_, qy := ld.intensity(t, c, s)
			d := x - t
			v += qy * g.w * h * d * d * d / 6
		}
	}
	return v
}
