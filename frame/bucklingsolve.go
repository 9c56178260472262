package frame

// The solves of the Lanczos iteration of [Buckling]: each member's own
// degrees of freedom eliminated and recovered from its packed numbers,
// four columns at a time, and the band substitutions of all the columns
// at once (bucklingband.go). Every column's arithmetic is that of the
// column alone, whatever the number of columns solved with it.

// solveK overwrites each of the k columns of x (b.size rows, row-major)
// with K⁻¹ times it: each member's own degrees of freedom eliminated,
// the band factor, and them recovered. Each column's arithmetic is the
// same whatever k: four columns at a time, then one.
func (b *Buckling) solveK(x []float64, k int) {
	for m := range b.mems {
		p := &b.mems[m]
		if p.ni == 0 {
			continue
		}
		c := 0
		for ; c+4 <= k; c += 4 {
			p.eliminate4(x, k, c)
		}
		for ; c < k; c++ {
			p.eliminate1(x, k, c)
		}
	}
	if b.n > 0 {
		bandSolveLanes(b.u, b.lt, b.n, b.kb, x[:b.n*k], k, b.first, b.last)
	}
	for m := range b.mems {
		p := &b.mems[m]
		if p.ni == 0 {
			continue
		}
		c := 0
		for ; c+4 <= k; c += 4 {
			p.recover4(x, k, c)
		}
		for ; c < k; c++ {
			p.recover1(x, k, c)
		}
	}
}

// eliminate4 eliminates the member's own degrees of freedom from columns
// c to c+3 of the block x (k columns): t = K_oo⁻¹ x_o takes x_o's place,
// and −K_noᵀ t, turned to global axes, is added at its nodes.
func (p *pencil) eliminate4(x []float64, k, c int) {
	ni := p.ni
	inv, kin, _, _ := p.parts()
	var xv, t [maxOwn][4]float64
	for q := range ni {
		copy(xv[q][:], x[(p.off+q)*k+c:(p.off+q)*k+c+4])
	}
	// Two rows at a time: eight independent sums.
	i := 0
	for ; i+1 < ni; i += 2 {
		var s, u [4]float64
		ri, ru := inv[i*ni:(i+1)*ni], inv[(i+1)*ni:(i+2)*ni]
		for q := range ni {
			a, b := ri[q], ru[q]
			xq := &xv[q]
			s[0] += a * xq[0]
			s[1] += a * xq[1]
			s[2] += a * xq[2]
			s[3] += a * xq[3]
			u[0] += b * xq[0]
			u[1] += b * xq[1]
			u[2] += b * xq[2]
			u[3] += b * xq[3]
		}
		t[i], t[i+1] = s, u
	}
	for ; i < ni; i++ {
		var s [4]float64
		for q, a := range inv[i*ni : (i+1)*ni] {
			s[0] += a * xv[q][0]
			s[1] += a * xv[q][1]
			s[2] += a * xv[q][2]
			s[3] += a * xv[q][3]
		}
		t[i] = s
	}
	var l [6][4]float64
	for i := range ni {
		ti := &t[i]
		for j, a := range kin[6*i : 6*i+6] {
			l[j][0] -= a * ti[0]
			l[j][1] -= a * ti[1]
			l[j][2] -= a * ti[2]
			l[j][3] -= a * ti[3]
		}
		copy(x[(p.off+i)*k+c:(p.off+i)*k+c+4], ti[:])
	}
	for n := 0; n < 6; n += 3 {
		for cc := range 4 {
			g := [3]float64{p.c*l[n][cc] - p.s*l[n+1][cc], p.s*l[n][cc] + p.c*l[n+1][cc], l[n+2][cc]}
			for i := range 3 {
				if e := p.gdof[n+i]; e >= 0 {
					x[e*k+c+cc] += g[i]
				}
			}
		}
	}
}

// eliminate1 is eliminate4 for column c alone.
func (p *pencil) eliminate1(x []float64, k, c int) {
	ni := p.ni
	inv, kin, _, _ := p.parts()
	var xv, t [maxOwn]float64
	for q := range ni {
		xv[q] = x[(p.off+q)*k+c]
	}
	for i := range ni {
		s := 0.0
		for q, a := range inv[i*ni : (i+1)*ni] {
			s += a * xv[q]
		}
		t[i] = s
	}
	var l [6]float64
	for i := range ni {
		ti := t[i]
		for j, a := range kin[6*i : 6*i+6] {
			l[j] -= a * ti
		}
		x[(p.off+i)*k+c] = ti
	}
	p.addGlobal(x, &l, c, k)
}

// recover4 recovers the member's own degrees of freedom in columns c to
// c+3 of the block x (k columns): x_o −= K_oo⁻¹ K_on u_n, u_n its nodes'
// displacements in local axes.
func (p *pencil) recover4(x []float64, k, c int) {
	ni := p.ni
	_, _, w, _ := p.parts()
	l := p.local4(x, k, c)
	i := 0
	for ; i+1 < ni; i += 2 {
		var s, u [4]float64
		wi, wu := w[6*i:6*i+6], w[6*i+6:6*i+12]
		for j := range 6 {
			a, b := wi[j], wu[j]
			lj := &l[j]
			s[0] += a * lj[0]
			s[1] += a * lj[1]
			s[2] += a * lj[2]
			s[3] += a * lj[3]
			u[0] += b * lj[0]
			u[1] += b * lj[1]
			u[2] += b * lj[2]
			u[3] += b * lj[3]
		}
		xi := x[(p.off+i)*k+c : (p.off+i)*k+c+4]
		xi[0] -= s[0]
		xi[1] -= s[1]
		xi[2] -= s[2]
		xi[3] -= s[3]
		xu := x[(p.off+i+1)*k+c : (p.off+i+1)*k+c+4]
		xu[0] -= u[0]
		xu[1] -= u[1]
		xu[2] -= u[2]
		xu[3] -= u[3]
	}
	for ; i < ni; i++ {
		var s [4]float64
		for j, a := range w[6*i : 6*i+6] {
			s[0] += a * l[j][0]
			s[1] += a * l[j][1]
			s[2] += a * l[j][2]
			s[3] += a * l[j][3]
		}
		xi := x[(p.off+i)*k+c : (p.off+i)*k+c+4]
		xi[0] -= s[0]
		xi[1] -= s[1]
		xi[2] -= s[2]
		xi[3] -= s[3]
	}
}

// recover1 is recover4 for column c alone.
func (p *pencil) recover1(x []float64, k, c int) {
	ni := p.ni
	_, _, w, _ := p.parts()
	l := p.local(x, c, k)
	for i := range ni {
		s := 0.0
		for j, a := range w[6*i : 6*i+6] {
			s += a * l[j]
		}
		x[(p.off+i)*k+c] -= s
	}
}

// reorthogonalize makes r K-orthogonal to each of qs in turn (modified
// Gram–Schmidt: r −= (pᵀr) q, pᵀr taken after the previous q's), and w
// = K r alike (w −= (pᵀr) p), ps[i] = K qs[i]. Each q's update and the
// next q's product are one pass over the vectors; each product is summed
// by four partial sums, (s₀ + s₁) + (s₂ + s₃), sⱼ over the entries i
// with i mod 4 = j.
func reorthogonalize(r, w []float64, qs, ps [][]float64) {
	if len(qs) == 0 {
		return
	}
	s := dot4(ps[0], r)
	for q := range qs {
		var next []float64
		if q+1 < len(qs) {
			next = ps[q+1]
		}
		s = updateDot(r, w, qs[q], ps[q], next, -s)
	}
}

// dot4 returns xᵀy by four partial sums (see reorthogonalize).
func dot4(x, y []float64) float64 {
	y = y[:len(x)]
	var s0, s1, s2, s3 float64
	i := 0
	for ; i+4 <= len(x); i += 4 {
		s0 += x[i] * y[i]
		s1 += x[i+1] * y[i+1]
		s2 += x[i+2] * y[i+2]
		s3 += x[i+3] * y[i+3]
	}
	for ; i < len(x); i++ {
		switch i & 3 {
		case 0:
			s0 += x[i] * y[i]
		case 1:
			s1 += x[i] * y[i]
		default:
			s2 += x[i] * y[i]
		}
	}
	return (s0 + s1) + (s2 + s3)
}

// updateDot sets r to r + a·q and w to w + a·p, and returns nextᵀr of
// the new r as dot4 would (0 when next is nil).
func updateDot(r, w, q, p, next []float64, a float64) float64 {
	n := len(r)
	w, q, p = w[:n], q[:n], p[:n]
	if next == nil {
		axpy(r, a, q)
		axpy(w, a, p)
		return 0
	}
	next = next[:n]
	var s0, s1, s2, s3 float64
	i := 0
	for ; i+4 <= n; i += 4 {
		r0, r1, r2, r3 := r[i]+a*q[i], r[i+1]+a*q[i+1], r[i+2]+a*q[i+2], r[i+3]+a*q[i+3]
		r[i], r[i+1], r[i+2], r[i+3] = r0, r1, r2, r3
		w0, w1, w2, w3 := w[i]+a*p[i], w[i+1]+a*p[i+1], w[i+2]+a*p[i+2], w[i+3]+a*p[i+3]
		w[i], w[i+1], w[i+2], w[i+3] = w0, w1, w2, w3
		s0 += next[i] * r0
		s1 += next[i+1] * r1
		s2 += next[i+2] * r2
		s3 += next[i+3] * r3
	}
	for ; i < n; i++ {
		r[i] += a * q[i]
		w[i] += a * p[i]
		switch i & 3 {
		case 0:
			s0 += next[i] * r[i]
		case 1:
			s1 += next[i] * r[i]
		default:
			s2 += next[i] * r[i]
		}
	}
	return (s0 + s1) + (s2 + s3)
}

// local4 is pencil.local for columns c to c+3 of the block x (k
// columns): the member's node degrees of freedom in local axes, one row a
// degree of freedom, one entry a column.
func (p *pencil) local4(x []float64, k, c int) [6][4]float64 {
	var l [6][4]float64
	for n := 0; n < 6; n += 3 {
		var g [3][4]float64
		for i := range 3 {
			if e := p.gdof[n+i]; e >= 0 {
				copy(g[i][:], x[e*k+c:e*k+c+4])
			}
		}
		for cc := range 4 {
			l[n][cc] = p.c*g[0][cc] + p.s*g[1][cc]
			l[n+1][cc] = -p.s*g[0][cc] + p.c*g[1][cc]
			l[n+2][cc] = g[2][cc]
		}
	}
	return l
}
