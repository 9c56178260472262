package frame

// The per-member access the envelope streams: every case's end forces of
// one member at once, read from the displacement rows of its ends, and
// which cases load it, so that a case that does not load the member can be
// folded once (N and V constant along it, M linear) and only the others
// evaluated station by station. In second order, every case's local
// displacements of the member's nodes as well, which give the moment
// N·(v(x) − v(0)) of a case that does not load the member with the
// member's weights (geometric.go: Sway, SecondOrderWeightsTo, SecondFrom).

// EndForcesEach fills dst[c] with the local end forces of member m in
// case c, for every case: the values [Solution.EndForces] gives, to the
// last bit, with each end's displacement rows read once for all the cases
// (they are contiguous). dst must have the length of the model's cases.
// Nothing is mutated but dst.
func (sol *Solution) EndForcesEach(dst [][6]float64, m int) { sol.endForcesEach(dst, m, 6) }

// StartForcesEach is [Solution.EndForcesEach] for the forces at the
// member's start only, dst[c][0:3], which give its internal forces
// anywhere along it with its loads (and its deflections); dst[c][3:6] are
// left zero. It does half the work.
func (sol *Solution) StartForcesEach(dst [][6]float64, m int) { sol.endForcesEach(dst, m, 3) }

// DisplacementsEach fills dst[c] with the local displacements of the nodes
// of member m in case c (start u, v, θ; end u, v, θ), for every case, read
// from the contiguous displacement rows as [Solution.EndForcesEach] reads
// them: in a second-order solution they give, with
// [Solution.SecondOrderWeightsTo], N times the member's displacement at
// its stations ([Sway], [Solution.SecondFrom]). dst must have the length
// of the model's cases. Nothing is mutated but dst.
func (sol *Solution) DisplacementsEach(dst [][6]float64, m int) {
	if len(dst) != len(sol.model.Cases) {
		panic("frame: DisplacementsEach: dst has the wrong length")
	}
	nc := len(sol.model.Cases)
	disp := sol.endRows(m)
	r0, r1, r2, r3, r4, r5 := disp[0][:nc], disp[1][:nc], disp[2][:nc], disp[3][:nc], disp[4][:nc], disp[5][:nc]
	e := &sol.elems[m]
	cs, sn := e.c, e.s
	for c := range dst {
		g0, g1, g2, g3, g4, g5 := r0[c], r1[c], r2[c], r3[c], r4[c], r5[c]
		// toLocal
		dst[c] = [6]float64{cs*g0 + sn*g1, -sn*g0 + cs*g1, g2, cs*g3 + sn*g4, -sn*g3 + cs*g4, g5}
	}
}

// endRows returns, for each of the 6 end directions of member m (start
// ux, uy, rz, end ux, uy, rz, global), its displacement in every case:
// solved, imposed, or zero where a support holds it.
func (sol *Solution) endRows(m int) [6][]float64 {
	nc := len(sol.model.Cases)
	mem := sol.model.Members[m]
	var disp [6][]float64
	zero := sol.zero
	for d := range 6 {
		node := mem.Start
		if d >= 3 {
			node = mem.End
		}
		switch i := sol.dof[3*node+d%3]; {
		case i >= 0:
			disp[d] = sol.x[i*nc : (i+1)*nc]
		case i < -1:
			disp[d] = sol.imposed[(-2-i)*nc : (-1-i)*nc]
		default:
			if len(zero) != nc {
				zero = make([]float64, nc)
			}
			disp[d] = zero
		}
	}
	return disp
}

// endForcesEach fills dst[c][0:rows] (see EndForcesEach).
func (sol *Solution) endForcesEach(dst [][6]float64, m, rows int) {
	nc := len(sol.model.Cases)
	if len(dst) != nc {
		panic("frame: EndForcesEach: dst has the wrong length")
	}
	e := &sol.elems[m]
	disp := sol.endRows(m)
	if useAVX && nc >= 4 {
		sol.endForcesLanes(dst, nil, m, rows, &disp)
		return
	}
	clear(dst)
	// The fixed-end forces of the cases that load the member, then k u,
	// summed in the order of endForcesTo: f[i] + k[i][0] u[0] + … + k[i][5] u[5].
	for _, ref := range sol.onMember[m] {
		at := 6 * int(ref.i)
		copy(dst[ref.c][:rows], sol.fem[ref.c][at:at+rows])
	}
	r0, r1, r2, r3, r4, r5 := disp[0][:nc], disp[1][:nc], disp[2][:nc], disp[3][:nc], disp[4][:nc], disp[5][:nc]
	k := &e.k
	cs, sn := e.c, e.s
	for c := range dst {
		g0, g1, g2, g3, g4, g5 := r0[c], r1[c], r2[c], r3[c], r4[c], r5[c]
		// toLocal
		u0, u1, u2 := cs*g0+sn*g1, -sn*g0+cs*g1, g2
		u3, u4, u5 := cs*g3+sn*g4, -sn*g3+cs*g4, g5
		f := &dst[c]
		for i := range rows {
			ki := &k[i]
			f[i] = f[i] + ki[0]*u0 + ki[1]*u1 + ki[2]*u2 + ki[3]*u3 + ki[4]*u4 + ki[5]*u5
		}
	}
}

// endForcesLanes is endForcesEach with AVX: every case as if it did not
// load the member (0 for the fixed-end forces), four cases at a time
// (endForces4, the last few one by one), then the cases that load it
// again with their fixed-end forces, as endForcesEach forms each. Where
// local is not nil, local[c] is set to the local displacements of case c
// (as DisplacementsEach gives them).
func (sol *Solution) endForcesLanes(dst, local [][6]float64, m, rows int, disp *[6][]float64) {
	nc := len(dst)
	e := &sol.elems[m]
	k := &e.k
	cs, sn := e.c, e.s
	n4 := nc / 4
	var l0 *[6]float64
	if local != nil {
		l0 = &local[:nc][0]
	}
	endForces4(&dst[0], &disp[0][0], &disp[1][0], &disp[2][0], &disp[3][0], &disp[4][0], &disp[5][0], n4, k, cs, sn, rows, l0)
	for c := 4 * n4; c < nc; c++ {
		dst[c] = [6]float64{}
		u := endForcesCol(&dst[c], k, cs, sn, disp, c, rows)
		if local != nil {
			local[c] = u
		}
	}
	for _, ref := range sol.onMember[m] {
		at := 6 * int(ref.i)
		f := &dst[ref.c]
		*f = [6]float64{}
		copy(f[:rows], sol.fem[ref.c][at:at+rows])
		endForcesCol(f, k, cs, sn, disp, int(ref.c), rows)
	}
}

// endForcesCol adds to f[0:rows] the end forces k u of case c, u the local
// displacements of the global ones in disp: f[i] + k[i][0] u[0] + … +
// k[i][5] u[5], as endForcesEach adds them; and returns u.
func endForcesCol(f *[6]float64, k *[6][6]float64, cs, sn float64, disp *[6][]float64, c, rows int) [6]float64 {
	g0, g1, g2, g3, g4, g5 := disp[0][c], disp[1][c], disp[2][c], disp[3][c], disp[4][c], disp[5][c]
	// toLocal
	u0, u1, u2 := cs*g0+sn*g1, -sn*g0+cs*g1, g2
	u3, u4, u5 := cs*g3+sn*g4, -sn*g3+cs*g4, g5
	for i := range rows {
		ki := &k[i]
		f[i] = f[i] + ki[0]*u0 + ki[1]*u1 + ki[2]*u2 + ki[3]*u3 + ki[4]*u4 + ki[5]*u5
	}
	return [6]float64{u0, u1, u2, u3, u4, u5}
}

// CasesOn returns the cases whose loads act on member m, ascending; every
// other case leaves the member unloaded between its ends. The slice is the
// solution's own: do not modify it.
func (sol *Solution) CasesOn(m int) []int32 { return sol.casesOn[m] }

// StationsFrom fills dst[i] with the internal forces of member m in case c
// at xs[i], given the member's local end forces f in that case (from
// [Solution.EndForcesEach]): the values of [Solution.StationsTo], to the
// last bit, in a first-order solution ([Solution.Unloaded]; in second
// order they leave out N times the displacement, which
// [Solution.SecondFrom] adds). dst must have length len(xs).
func (sol *Solution) StationsFrom(dst []Forces, c, m int, f *[6]float64, xs []float64) {
	if len(dst) != len(xs) {
		panic("frame: StationsFrom: dst has the wrong length")
	}
	idx, _ := sol.loadsOn(c, m)
	if len(idx) == 0 {
		for i, x := range xs {
			dst[i] = Forces{N: -f[0], V: f[1], M: -f[2] + x*f[1]}
		}
		return
	}
	e := &sol.elems[m]
	loads := sol.model.Cases[c].MemberLoads
	for i, x := range xs {
		dst[i] = stationForces(f[0], f[1], f[2], x, e.l, e.c, e.s, loads, idx)
	}
}

// StartLoad returns the part of N and V of member m in case c that the
// point loads at its start carry: entry c of [Solution.StartLoadsTo].
func (sol *Solution) StartLoad(c, m int) Forces {
	var f Forces
	idx, _ := sol.loadsOn(c, m)
	if len(idx) == 0 {
		return f
	}
	e := &sol.elems[m]
	tol := 1e-9 * e.l // as stationForces
	loads := sol.model.Cases[c].MemberLoads
	for _, i := range idx {
		ld := &loads[i]
		if !ld.Point || ld.At > tol {
			continue
		}
		px, py := ld.Direction.local(ld.P, e.c, e.s)
		f.N -= px
		f.V += py
	}
	return f
}

// HasMomentLoads reports whether some case loads some member with a
// concentrated moment (see [Solution.MomentJumpsTo]).
func (sol *Solution) HasMomentLoads() bool { return sol.moments }

// DisplacementSums sets u[3*v+d] to the sum of direction d's displacement
// of node v over the cases cs, added in the order of cs: the sums of
// [Solution.Displacement] over them, to the last bit, except that a
// rotation that is free ([Solution.RotationFree]) sums to 0, not NaN. u
// must have length 3 × the number of nodes.
func (sol *Solution) DisplacementSums(u []float64, cs []int) {
	if len(u) != 3*len(sol.model.Nodes) {
		panic("frame: DisplacementSums: u has the wrong length")
	}
	sol.rowSums(u, cs)
}

// DeflectionsFrom fills dst[i] with the deflection of member m in case c
// at xs[i] relative to its chord, given the member's local end forces f in
// that case (from [Solution.EndForcesEach]): the values of
// [Solution.DeflectionsTo], to the last bit, in a first-order solution
// ([Solution.Unloaded]; in second order [Solution.SecondFrom] gives
// them). dst must have length len(xs).
func (sol *Solution) DeflectionsFrom(dst []float64, c, m int, f *[6]float64, xs []float64) {
	if len(dst) != len(xs) {
		panic("frame: DeflectionsFrom: dst has the wrong length")
	}
	idx, _ := sol.loadsOn(c, m)
	deflectionsTo(dst, f, &sol.elems[m], sol.model.Cases[c].MemberLoads, idx, xs)
}

// Unloaded reports whether a case that does not load member m leaves N
// and V constant along it and M linear, as [Solution.StationsFrom] and
// [Solution.DeflectionsFrom] assume: true but in a second-order solution
// ([Options.Axial]), where M also carries N times the member's
// displacement from its chord.
func (sol *Solution) Unloaded(m int) bool { return sol.elems[m].so == nil }
