package frame

import "math"

// StartLoadsTo fills dst[c] with the part of the internal forces N and V of
// member m, in case c, that the point loads at its start carry: the loads
// at x = 0 (within the station tolerance, 1e-9 of the length). [Solution.At]
// and [Solution.StationsTo] give at a point load the value on the start
// side of it, which at x = 0 is the node's side, outside the member; adding
// dst[c] to their value at x = 0 gives the value just inside the member.
// M is continuous and its entry is zero. dst must have the length of the
// model's cases. Nothing is mutated but dst.
func (sol *Solution) StartLoadsTo(dst []Forces, m int) {
	if len(dst) != len(sol.model.Cases) {
		panic("frame: StartLoadsTo: dst has the wrong length")
	}
	e := &sol.elems[m]
	tol := 1e-9 * e.l // as stationForces
	for c := range dst {
		dst[c] = Forces{}
		idx, _ := sol.loadsOn(c, m)
		loads := sol.model.Cases[c].MemberLoads
		for _, i := range idx {
			ld := &loads[i]
			if !ld.Point || ld.At > tol {
				continue
			}
			px, py := ld.Direction.local(ld.P, e.c, e.s)
			dst[c].N -= px
			dst[c].V += py
		}
	}
}

// MomentJumpsTo fills dst[c*len(xs)+i] with the change of the bending
// moment of member m in case c across the interior station xs[i] (more
// than 1e-9 of the length from either end): minus the concentrated
// moments exactly there (within that tolerance), whose value
// [Solution.StationsTo] gives from before them. It reports whether any is
// not zero; when none is, dst may be left as it was. dst must have length
// len(xs) × the number of cases. Nothing is mutated but dst.
func (sol *Solution) MomentJumpsTo(dst []float64, m int, xs []float64) bool {
	if len(dst) != len(sol.model.Cases)*len(xs) {
		panic("frame: MomentJumpsTo: dst has the wrong length")
	}
	if !sol.moments {
		return false // dst is not read
	}
	clear(dst)
	e := &sol.elems[m]
	tol := 1e-9 * e.l // as stationForces
	found := false
	for c := range sol.model.Cases {
		idx, _ := sol.loadsOn(c, m)
		loads := sol.model.Cases[c].MemberLoads
		for _, i := range idx {
			ld := &loads[i]
			if !ld.Moment || ld.M == 0 || ld.At <= tol || ld.At >= e.l-tol {
				continue
			}
			for k, x := range xs {
				if x > tol && x < e.l-tol && math.Abs(x-ld.At) <= tol {
					dst[c*len(xs)+k] -= ld.M
					found = true
				}
			}
		}
	}
	return found
}
