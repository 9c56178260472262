package frame

// StartForcesAndDisplacementsEach fills ends as [Solution.StartForcesEach]
// and disp as [Solution.DisplacementsEach] do, to the last bit, in one
// pass over the displacement rows of member m's ends: a second-order
// member's envelope needs both, and the rows (every case of six
// directions) are then read once rather than twice. ends and disp must
// have the length of the model's cases. Nothing is mutated but ends and
// disp.
func (sol *Solution) StartForcesAndDisplacementsEach(ends, disp [][6]float64, m int) {
	nc := len(sol.model.Cases)
	if len(ends) != nc || len(disp) != nc {
		panic("frame: StartForcesAndDisplacementsEach: ends or disp has the wrong length")
	}
	e := &sol.elems[m]
	rows := sol.endRows(m)
	if useAVX && nc >= 4 {
		sol.endForcesLanes(ends, disp, m, 3, &rows)
		return
	}
	clear(ends)
	// The fixed-end forces of the cases that load the member, then k u,
	// in the order of endForcesEach.
	for _, ref := range sol.onMember[m] {
		at := 6 * int(ref.i)
		copy(ends[ref.c][:3], sol.fem[ref.c][at:at+3])
	}
	r0, r1, r2, r3, r4, r5 := rows[0][:nc], rows[1][:nc], rows[2][:nc], rows[3][:nc], rows[4][:nc], rows[5][:nc]
	k0, k1, k2 := &e.k[0], &e.k[1], &e.k[2]
	cs, sn := e.c, e.s
	for c := range ends {
		g0, g1, g2, g3, g4, g5 := r0[c], r1[c], r2[c], r3[c], r4[c], r5[c]
		// toLocal
		u0, u1, u2 := cs*g0+sn*g1, -sn*g0+cs*g1, g2
		u3, u4, u5 := cs*g3+sn*g4, -sn*g3+cs*g4, g5
		disp[c] = [6]float64{u0, u1, u2, u3, u4, u5}
		f := &ends[c]
		f[0] = f[0] + k0[0]*u0 + k0[1]*u1 + k0[2]*u2 + k0[3]*u3 + k0[4]*u4 + k0[5]*u5
		f[1] = f[1] + k1[0]*u0 + k1[1]*u1 + k1[2]*u2 + k1[3]*u3 + k1[4]*u4 + k1[5]*u5
		f[2] = f[2] + k2[0]*u0 + k2[1]*u1 + k2[2]*u2 + k2[3]*u3 + k2[4]*u4 + k2[5]*u5
	}
}
