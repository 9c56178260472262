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
// closed form; a moment release or a semi-rigid end only changes the
// moment at that end and needs nothing more. A temperature gradient adds
// its curvature, −α ΔT_gradient / depth, to M/EI; rigid end zones do not
// bend. Shear deformation is neglected, as in the solver.
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
	if sol.elems[m].so != nil {
		sol.secondTo(nil, dst, c, m, xs)
		return
	}
	var f [6]float64
	sol.endForcesTo(&f, c, m)
	idx, _ := sol.loadsOn(c, m)
	deflectionsTo(dst, &f, &sol.elems[m], sol.model.Cases[c].MemberLoads, idx, xs)
}

// deflectionsTo fills dst[i] with the deflection relative to the chord at
// xs[i] of an element with local end forces f and the loads idx.
func deflectionsTo(dst []float64, f *[6]float64, e *element, loads []MemberLoad, idx []int32, xs []float64) {
	if len(idx) == 0 && e.a == 0 && e.b == 0 {
		// Unloaded: the moment is linear, −f2 + f1 ξ.
		fl := -f[2]*e.l*e.l/2 + f[1]*e.l*e.l*e.l/6
		for i, x := range xs {
			dst[i] = (-f[2]*x*x/2 + f[1]*x*x*x/6 - x/e.l*fl) / e.ei
		}
		return
	}
	// The thermal curvature, times EI: −EI α ΔT_gradient / depth.
	kt := 0.0
	for _, i := range idx {
		if ld := &loads[i]; ld.Thermal && ld.DTGrad != 0 {
			kt -= e.ei * e.alpha * ld.DTGrad / e.depth
		}
	}
	fl := e.bent(f[1], f[2], e.l, kt, loads, idx)
	for i, x := range xs {
		dst[i] = (e.bent(f[1], f[2], x, kt, loads, idx) - x/e.l*fl) / e.ei
	}
}

// bent returns EI times the displacement at x of the member's axis, from a
// start that neither moves nor turns: ∫ (x − ξ) κ(ξ) dξ from 0 to x, times
// EI, with the curvature κ = M/EI + kt/EI on the flexible part [a, l − b]
// and none on the rigid end zones. kt is EI times the thermal curvature.
func (e *element) bent(f1, f2, x, kt float64, loads []MemberLoad, idx []int32) float64 {
	if e.a == 0 && e.b == 0 {
		return curvatureIntegral(f1, f2, x, e.l, e.c, e.s, loads, idx) + kt*x*x/2
	}
	lo, hi := e.a, min(x, e.l-e.b)
	if !(hi > lo) {
		return 0
	}
	// ∫ from 0 to y of (x − ξ) M is F(y) + (x − y) F'(y).
	j := func(y float64) float64 {
		fy, gy := curvatureIntegrals(f1, f2, y, e.l, e.c, e.s, loads, idx)
		return fy + (x-y)*gy
	}
	return j(hi) - j(lo) + kt*((x-lo)*(x-lo)-(x-hi)*(x-hi))/2
}

// curvatureIntegral returns F(x) = ∫₀ˣ (x − ξ) M(ξ) dξ, the moment of a
// member integrated twice from its start with F(0) = F'(0) = 0, given the
// local end forces at its start (f1 transverse, f2 moment) and its loads.
// Then EI v(x) = F(x) − (x/L) F(L) is the deflection relative to the chord
// of a member without rigid end zones or temperature gradient.
//
// With M(ξ) = −f2 + f1 ξ plus, for a transverse point load p at a, p (ξ − a)
// beyond a, for a concentrated moment C at a, −C beyond a, and for a
// distributed load q, ∫ q(t) (ξ − t) dt over its part before ξ, the
// integral is
//
//	F(x) = −f2 x²/2 + f1 x³/6 + Σ p (x − a)³/6 − Σ C (x − a)²/2 + Σ ∫ q(t) (x − t)³/6 dt,
//
// the last over the part of each distributed load before x. q varies
// linearly, so that integrand is a polynomial of degree four, which the
// three-point Gauss–Legendre rule integrates exactly.
func curvatureIntegral(f1, f2, x, l, c, s float64, loads []MemberLoad, idx []int32) float64 {
	v, _ := curvatureIntegrals(f1, f2, x, l, c, s, loads, idx)
	return v
}

// curvatureIntegrals returns F(x) of curvatureIntegral and its derivative
// F'(x) = ∫₀ˣ M(ξ) dξ.
func curvatureIntegrals(f1, f2, x, l, c, s float64, loads []MemberLoad, idx []int32) (float64, float64) {
	v := -f2*x*x/2 + f1*x*x*x/6
	d1 := -f2*x + f1*x*x/2
	for _, i := range idx {
		ld := &loads[i]
		switch {
		case ld.Point:
			if a := clampTo(ld.At, 0, l); a < x {
				_, py := ld.Direction.local(ld.P, c, s)
				d := x - a
				v += py * d * d * d / 6
				d1 += py * d * d / 2
			}
			continue
		case ld.Moment:
			if a := clampTo(ld.At, 0, l); a < x {
				d := x - a
				v -= ld.M * d * d / 2
				d1 -= ld.M * d
			}
			continue
		case ld.Thermal:
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
			d1 += qy * g.w * h * d * d / 2
		}
	}
	return v, d1
}
