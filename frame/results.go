package frame

import (
	"math"
	"sync"
)

// endsPool holds the end forces of every case of a member (stationsTo's
// scratch), one slice per caller at a time.
var endsPool = sync.Pool{New: func() any { return new([][6]float64) }}

// Model returns the model that was solved.
func (sol *Solution) Model() *Model { return sol.model }

// Info returns the size of the system that was solved.
func (sol *Solution) Info() Info {
	return Info{Equations: sol.dofs, Bandwidth: sol.band, Columns: len(sol.model.Cases)}
}

// Cond returns the estimated condition number (1-norm) of the stiffness
// matrix scaled to unit diagonal, S K S with S = diag(1/√K[i][i]): LAPACK's
// estimate of ‖(SKS)⁻¹‖₁ times ‖SKS‖₁. The results may have lost about
// log10 of it of their 16 significant digits. It is 1 when there was
// nothing to solve, NaN when [Options.SkipCondition] left it unestimated.
func (sol *Solution) Cond() float64 { return sol.cond }

// Displacement returns the global displacements (ux, uy, rz) of node v in
// case c. Where the rotation of v is free ([Solution.RotationFree]) there is
// no one rotation of the node, and rz is NaN.
func (sol *Solution) Displacement(c, v int) (ux, uy, rz float64) {
	rz = sol.u(c, 3*v+2)
	if sol.released[v] {
		rz = math.NaN()
	}
	return sol.u(c, 3*v), sol.u(c, 3*v+1), rz
}

// DisplacementsTo sets dst[c] to the displacements (ux, uy, rz) of node v
// in every case c, as [Solution.Displacement] gives them, reading each
// direction's values of every case together. dst must have one entry per
// case.
func (sol *Solution) DisplacementsTo(dst [][3]float64, v int) {
	if len(dst) != len(sol.model.Cases) {
		panic("frame: DisplacementsTo: dst has the wrong length")
	}
	// Where all three directions are solved (no support, settlement or
	// free rotation), each case's three values are written at once, in
	// one pass over dst rather than three.
	if r0, r1, r2 := sol.solvedRow(3*v), sol.solvedRow(3*v+1), sol.solvedRow(3*v+2); r0 != nil && r1 != nil && r2 != nil && !sol.released[v] {
		r0, r1, r2 = r0[:len(dst)], r1[:len(dst)], r2[:len(dst)]
		for c := range dst {
			dst[c] = [3]float64{r0[c], r1[c], r2[c]}
		}
		return
	}
	for d := range 3 {
		sol.componentTo(dst, v, d)
	}
}

// solvedRow returns every case's value of displacement component i
// (3 × node + direction) where it is solved for, else nil.
func (sol *Solution) solvedRow(i int) []float64 {
	nc := len(sol.model.Cases)
	if e := sol.dof[i]; e >= 0 {
		return sol.x[e*nc : (e+1)*nc]
	}
	return nil
}

// DisplacementTo sets dst[c][d] to the displacement of node v in
// direction d (0 ux, 1 uy, 2 rz) in every case c, as
// [Solution.DisplacementsTo] sets it, and leaves the other two directions
// of dst as they are: a caller that needs one direction (such as a
// column's drift, from ux) reads a third of the displacements. dst must
// have one entry per case.
func (sol *Solution) DisplacementTo(dst [][3]float64, v, d int) {
	if len(dst) != len(sol.model.Cases) {
		panic("frame: DisplacementTo: dst has the wrong length")
	}
	if d < 0 || d > 2 {
		panic("frame: DisplacementTo: direction out of range")
	}
	sol.componentTo(dst, v, d)
}

// componentTo sets dst[c][d] to node v's displacement in direction d in
// every case c, reading the values of every case together.
func (sol *Solution) componentTo(dst [][3]float64, v, d int) {
	nc := len(sol.model.Cases)
	var row []float64 // every case's value, nil for zero
	switch e := sol.dof[3*v+d]; {
	case d == 2 && sol.released[v]:
		for c := range dst {
			dst[c][d] = math.NaN()
		}
		return
	case e >= 0:
		row = sol.x[e*nc : (e+1)*nc]
	case e < -1:
		row = sol.imposed[(-2-e)*nc : (-1-e)*nc]
	}
	if row == nil {
		for c := range dst {
			dst[c][d] = 0
		}
		return
	}
	for c, x := range row {
		dst[c][d] = x
	}
}

// RotationFree reports whether the rotation of node v is free: every member
// end there is released and no support holds it. No member carries moment
// there, so the rotation carries nothing and is not solved for; each member
// end turns on its own (see the member's deflection), and
// [Solution.Displacement] gives NaN for it.
func (sol *Solution) RotationFree(v int) bool { return sol.released[v] }

// EndForces returns the local forces the nodes exert on member m in case c:
// start axial, transverse, moment; end axial, transverse, moment.
func (sol *Solution) EndForces(c, m int) [6]float64 {
	var f [6]float64
	sol.endForcesTo(&f, c, m)
	return f
}

// endForcesTo computes f = k u + f_fixed in local axes.
func (sol *Solution) endForcesTo(f *[6]float64, c, m int) {
	mem := sol.model.Members[m]
	e := &sol.elems[m]
	var ug, ul [6]float64
	for d := range 3 {
		ug[d], ug[3+d] = sol.u(c, 3*mem.Start+d), sol.u(c, 3*mem.End+d)
	}
	e.toLocal(&ul, &ug)
	*f = [6]float64{}
	if _, fem := sol.loadsOn(c, m); fem != nil {
		*f = *fem
	}
	for i := range 6 {
		v := f[i]
		for j := range 6 {
			v += e.k[i][j] * ul[j]
		}
		f[i] = v
	}
}

// Reaction returns the global reaction (Fx, Fy, M) at node v in case c:
// where the support holds the node, the sum of the end forces of the
// members meeting there, less the loads applied at the node; where a
// spring holds it, −k times the node's displacement. Other components are
// zero.
func (sol *Solution) Reaction(c, v int) (fx, fy, m float64) {
	mo := sol.model
	nd := &mo.Nodes[v]
	s := nd.Support
	if !nd.Supported() {
		return 0, 0, 0
	}
	r := sol.nodeSum(c, v)
	for _, nl := range mo.Cases[c].NodeLoads {
		if nl.Node == v {
			r[0] -= nl.Fx
			r[1] -= nl.Fy
			r[2] -= nl.M
		}
	}
	for d := range 3 {
		switch {
		case s.Restrained(d):
		case nd.Springs[d] > 0:
			r[d] = -nd.Springs[d] * sol.u(c, 3*v+d)
		default:
			r[d] = 0
		}
	}
	return r[0], r[1], r[2]
}

// nodeSum returns the sum of the global end forces that node v exerts on
// the members meeting there.
func (sol *Solution) nodeSum(c, v int) [3]float64 {
	var r [3]float64
	for _, m32 := range sol.atNode[v] {
		m := int(m32)
		var f, g [6]float64
		sol.endForcesTo(&f, c, m)
		sol.elems[m].toGlobal(&g, &f)
		mem := sol.model.Members[m]
		if mem.Start == v {
			r[0], r[1], r[2] = r[0]+g[0], r[1]+g[1], r[2]+g[2]
		}
		if mem.End == v {
			r[0], r[1], r[2] = r[0]+g[3], r[1]+g[4], r[2]+g[5]
		}
	}
	return r
}

// At returns the internal forces of member m in case c at distance x from
// its start. Values come from the end forces and the member's own loads by
// statics, never by interpolation. At a point load the value just before the
// load is returned.
func (sol *Solution) At(c, m int, x float64) Forces {
	var f [6]float64
	sol.endForcesTo(&f, c, m)
	e := &sol.elems[m]
	idx, _ := sol.loadsOn(c, m)
	out := stationForces(f[0], f[1], f[2], x, e.l, e.c, e.s, sol.model.Cases[c].MemberLoads, idx)
	if e.so != nil {
		row := []Forces{out}
		sol.secondTo(row, nil, c, m, []float64{x})
		out = row[0]
	}
	return out
}

// StationsTo fills dst with the internal forces of member m at the
// distances xs from its start, in every case: dst[c*len(xs)+i] holds case
// c at xs[i]. dst must have length len(xs) × the number of cases.
func (sol *Solution) StationsTo(dst []Forces, m int, xs []float64) {
	if len(dst) != len(sol.model.Cases)*len(xs) {
		panic("frame: StationsTo: dst has the wrong length")
	}
	sol.stationsTo(dst, nil, m, xs)
}

// StationsAndDeflectionsTo is [Solution.StationsTo] that also fills defl
// with the deflections of the member relative to its chord, as
// [Solution.DeflectionsTo] does, computing each case's end forces once for
// both. dst and defl must both have length len(xs) × the number of cases.
func (sol *Solution) StationsAndDeflectionsTo(dst []Forces, defl []float64, m int, xs []float64) {
	n := len(sol.model.Cases) * len(xs)
	if len(dst) != n || len(defl) != n {
		panic("frame: StationsAndDeflectionsTo: dst or defl has the wrong length")
	}
	sol.stationsTo(dst, defl, m, xs)
}

// stationsTo fills dst with the forces and, when defl is not nil, defl with
// the deflections of member m at xs in every case.
func (sol *Solution) stationsTo(dst []Forces, defl []float64, m int, xs []float64) {
	e := &sol.elems[m]
	var w [][6]float64 // second order: the shape's weights at xs
	if e.so != nil {
		w = e.weights(xs)
	}
	// Every case's end forces at once, from the contiguous displacement
	// rows of the member's ends (endForcesEach: endForcesTo's to the last
	// bit), rather than case by case from values a row apart.
	nc := len(sol.model.Cases)
	held := endsPool.Get().(*[][6]float64)
	if cap(*held) < nc {
		*held = make([][6]float64, nc)
	}
	ends := (*held)[:nc]
	defer endsPool.Put(held)
	sol.endForcesEach(ends, m, 6)
	for c := range nc {
		f := &ends[c]
		idx, _ := sol.loadsOn(c, m)
		row := dst[c*len(xs) : (c+1)*len(xs)]
		loads := sol.model.Cases[c].MemberLoads
		if defl != nil {
			deflectionsTo(defl[c*len(xs):(c+1)*len(xs)], f, e, loads, idx, xs)
		}
		if len(idx) == 0 {
			// Unloaded in this case: N and V are constant, M linear.
			for i, x := range xs {
				row[i] = Forces{N: -f[0], V: f[1], M: -f[2] + x*f[1]}
			}
		} else {
			for i, x := range xs {
				row[i] = stationForces(f[0], f[1], f[2], x, e.l, e.c, e.s, loads, idx)
			}
		}
		if e.so != nil {
			var d []float64
			if defl != nil {
				d = defl[c*len(xs) : (c+1)*len(xs)]
			}
			sol.secondWith(w, row, d, c, m, xs)
		}
	}
}

// u returns global displacement component i (3*node+d) in case c: solved,
// imposed, or zero where a support holds it.
func (sol *Solution) u(c, i int) float64 {
	if e := sol.dof[i]; e >= 0 {
		return sol.x[e*len(sol.model.Cases)+c]
	} else if e < -1 {
		return sol.imposed[(-2-e)*len(sol.model.Cases)+c]
	}
	return 0
}
