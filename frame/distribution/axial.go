package distribution

// The members are axially rigid in moment distribution. Their axial strain,
// which the stiffness solver includes, changes the end moments; to first
// order the change is what the frame gives when the elongations that the
// axial forces cause are imposed on it. The axial forces are found by
// statics from the distributed end moments; the joints' movements follow
// from the elongations, along the columns from the supports up and along
// each beam line from the support that holds it; the chord rotations they
// give the members are distributed like those of a sway, with the sway
// corrections. Where an axial force is not found by statics (a column or
// beam between two supports that hold it in its direction), it is taken as
// zero in the estimate and the member is named in Result.Indeterminate.

// axialStrain sets the two terms of the effect of axial strain in case c,
// whose end moments are mom, in res, using psi as scratch.
func (d *distributor) axialStrain(res *Result, c int, mom, psi []float64) error {
	nm := len(d.st.mo.Members)
	from := c
	for term := range 2 {
		d.st.axialRotations(psi, from, mom)
		m, _, err := d.solve(-1, psi)
		if err != nil {
			return err
		}
		copy(res.axial[(2*c+term)*2*nm:], m)
		// The next term: the axial forces this one causes, with no loads.
		from, mom = -1, m
	}
	return nil
}

// indeterminate returns the members whose axial force statics does not
// give: those axialRotations takes as carrying none.
func (st *structure) indeterminate() []int {
	psi := make([]float64, len(st.mo.Members))
	return st.axialRotations(psi, -1, make([]float64, 2*len(st.mo.Members)))
}

// axialRotations sets psi[m] to the chord rotation of member m caused by
// the elongations of the members under the axial forces of case c (c < 0:
// no loads) with end moments mom. It returns the members whose axial force
// statics does not give (taken as zero).
func (st *structure) axialRotations(psi []float64, c int, mom []float64) []int {
	mo := st.mo
	nm, nn := len(mo.Members), len(mo.Nodes)
	// net[2*v+d] is the force along d (0 X, 1 Y) that node v must get from
	// the axial forces of the members not yet solved for: the node's load
	// less what the other member ends take from it.
	net := make([]float64, 2*nn)
	for v := range mo.Nodes {
		net[2*v], net[2*v+1] = st.nodeForce(c, v)
	}
	loads := make([]memberLoads, nm)
	axial := make([]bool, nm) // member's axial force is an unknown of the statics
	for m, mem := range mo.Members {
		r := st.loads(c, m)
		loads[m] = r
		if side := st.cantTip[m]; side >= 0 {
			// The cantilever's root takes the cantilever's loads and its tip's.
			root, tip := mem.Start, mem.End
			if side == 0 {
				root, tip = mem.End, mem.Start
			}
			fx, fy := st.nodeForce(c, tip)
			net[2*root] += r.gx + fx
			net[2*root+1] += r.gy + fy
			continue
		}
		axial[m] = true
		// Transverse forces the joints exert on the ends (local y is
		// (−s, c)), by statics from the end moments.
		fe := -(mom[2*m] + mom[2*m+1] + r.q1) / st.l[m]
		fs := -fe - r.q0
		for side, f := range [2]float64{fs, fe} {
			v := mem.Start
			if side == 1 {
				v = mem.End
			}
			net[2*v] -= -st.s[m] * f
			net[2*v+1] -= st.c[m] * f
		}
	}
	// nStart[m] is the axial force (tension positive) at the start of m.
	nStart := make([]float64, nm)
	known := make([]bool, nm)
	held := func(v, d int) bool { return mo.Nodes[v].Support.Restrained(d) }
	// dir is the direction along which member m carries its axial force,
	// and dirCos the cosine of its axis with that direction (±1).
	dir := func(m int) int {
		if st.s[m] == 0 {
			return 0
		}
		return 1
	}
	dirCos := func(m int) float64 { return st.c[m] + st.s[m] }
	// Peel: a node not held along d with a single unknown member along d
	// gives that member's axial force by its equilibrium.
	unknown := make([]int, 2*nn)
	for m, mem := range mo.Members {
		if axial[m] {
			d := dir(m)
			unknown[2*mem.Start+d]++
			unknown[2*mem.End+d]++
		}
	}
	var queue []int // 2*v+d
	for v := range mo.Nodes {
		for d := range 2 {
			if unknown[2*v+d] == 1 && !held(v, d) {
				queue = append(queue, 2*v+d)
			}
		}
	}
	for len(queue) > 0 {
		vd := queue[0]
		queue = queue[1:]
		if unknown[vd] != 1 {
			continue
		}
		v, d := vd/2, vd%2
		m, side := -1, 0
		for _, e := range st.ends[v] {
			if k := e / 2; axial[k] && !known[k] && dir(k) == d {
				m, side = k, e%2
			}
		}
		r := &loads[m]
		// The node exerts cos·f along d on the member end, f its local x
		// force; the ends and the axial loads are in equilibrium along x.
		f := net[vd] / dirCos(m)
		fs, fe := f, -f-r.a0
		if side == 1 {
			fs, fe = -f-r.a0, f
		}
		nStart[m], known[m] = -fs, true
		mem := mo.Members[m]
		for _, x := range [2]struct {
			v int
			f float64
		}{{mem.Start, fs}, {mem.End, fe}} {
			w := 2*x.v + d
			net[w] -= dirCos(m) * x.f
			unknown[w]--
			if unknown[w] == 1 && !held(x.v, d) {
				queue = append(queue, w)
			}
		}
	}
	var indeterminate []int
	elong := make([]float64, nm)
	for m := range mo.Members {
		if !axial[m] {
			continue
		}
		if !known[m] {
			indeterminate = append(indeterminate, m)
			continue
		}
		// ∫ N dξ over the member, N(ξ) = N(0) − ∫0^ξ a, over EA.
		r := &loads[m]
		sec := mo.Sections[mo.Members[m].Section]
		elong[m] = (nStart[m]*st.l[m] - st.l[m]*r.a0 + r.a1) / (sec.E * sec.A)
	}
	// Movements of the joints: zero at a support holding the direction (or
	// at the first joint reached in a part that none holds: a beam line
	// free to sway, whose movement the sway corrections find), and from
	// joint to joint the elongation along the member.
	move := make([]float64, 2*nn)
	seen := make([]bool, 2*nn)
	walk := func(start int) {
		stack := []int{start}
		seen[start] = true
		for len(stack) > 0 {
			vd := stack[len(stack)-1]
			stack = stack[:len(stack)-1]
			v, d := vd/2, vd%2
			for _, e := range st.ends[v] {
				m := e / 2
				if !axial[m] || dir(m) != d {
					continue
				}
				mem := mo.Members[m]
				w, delta := mem.End, dirCos(m)*elong[m]
				if e%2 == 1 {
					w, delta = mem.Start, -delta
				}
				if wd := 2*w + d; !seen[wd] {
					seen[wd] = true
					move[wd] = move[vd] + delta
					stack = append(stack, wd)
				}
			}
		}
	}
	for v := range mo.Nodes {
		for d := range 2 {
			if held(v, d) && !seen[2*v+d] {
				walk(2*v + d)
			}
		}
	}
	for vd := range move {
		if !seen[vd] {
			walk(vd)
		}
	}
	for m, mem := range mo.Members {
		psi[m] = 0
		if axial[m] {
			a, b := 2*mem.Start, 2*mem.End
			psi[m] = st.chordRotation(m, move[a], move[a+1], move[b], move[b+1])
		}
	}
	return indeterminate
}
