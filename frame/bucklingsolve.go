package frame

// The solves of the Lanczos iteration of [Buckling]: each member's own
// degrees of freedom eliminated and recovered from one packed block of
// its numbers, and the band substitutions of several columns at once,
// each row formed from the rows it reads with the columns' sums held in
// registers. Every column's arithmetic is that of the column alone, in
// the order of bandSolveVec's vector updates.

// solveScratch is the memory of one solveK for k columns.
type solveScratch struct {
	t, l, s []float64
}

func (sc *solveScratch) grow(k int) {
	if len(sc.l) < 6*k {
		sc.t = make([]float64, maxOwn*k)
		sc.l = make([]float64, 6*k)
		sc.s = make([]float64, k)
	}
}

// solveK overwrites each of the k columns of x (b.size rows, row-major)
// with K⁻¹ times it: each member's own degrees of freedom eliminated,
// the band factor, and them recovered. Each column's arithmetic is the
// same whatever k.
func (b *Buckling) solveK(x []float64, k int) {
	var sc solveScratch
	sc.grow(k)
	t, l, s := sc.t, sc.l[:6*k], sc.s[:k]
	for m := range b.mems {
		p := &b.mems[m]
		ni := p.ni
		if ni == 0 {
			continue
		}
		inv, kin, _, _ := p.parts()
		xo := x[p.off*k : (p.off+ni)*k]
		// t = inv · x_own, l = −kinᵀ t, x_own = t.
		tt := t[:ni*k]
		clear(tt)
		for i := range ni {
			ti := tt[i*k : (i+1)*k]
			for q, a := range inv[i*ni : (i+1)*ni] {
				xq := xo[q*k : (q+1)*k]
				for c := range ti {
					ti[c] += a * xq[c]
				}
			}
		}
		clear(l)
		for i := range ni {
			ti := tt[i*k : (i+1)*k]
			for j := range 6 {
				a := kin[6*i+j]
				lj := l[j*k : (j+1)*k]
				for c := range lj {
					lj[c] -= a * ti[c]
				}
			}
		}
		copy(xo, tt)
		p.addGlobalCols(x, l, k)
	}
	switch {
	case b.n == 0:
	case k == 1:
		bandSolveVec(b.u, b.n, b.kb, x[:b.n])
	default:
		bandSolveRows(b.u, b.n, b.kb, x[:b.n*k], k, b.first)
	}
	for m := range b.mems {
		p := &b.mems[m]
		ni := p.ni
		if ni == 0 {
			continue
		}
		_, _, w, _ := p.parts()
		xo := x[p.off*k : (p.off+ni)*k]
		p.localCols(l, x, k)
		// x_own −= w · l.
		for i := range ni {
			clear(s)
			for j, a := range w[6*i : 6*i+6] {
				lj := l[j*k : (j+1)*k]
				for c := range s {
					s[c] += a * lj[c]
				}
			}
			xi := xo[i*k : (i+1)*k]
			for c := range xi {
				xi[c] -= s[c]
			}
		}
	}
}

// localCols sets l (6 rows of k) to the member's node degrees of freedom
// of every column of the block x in local axes, as local for each.
func (p *pencil) localCols(l, x []float64, k int) {
	for n := 0; n < 6; n += 3 {
		var g [3][]float64
		for i := range 3 {
			if e := p.gdof[n+i]; e >= 0 {
				g[i] = x[e*k : (e+1)*k]
			}
		}
		l0, l1, l2 := l[n*k:(n+1)*k], l[(n+1)*k:(n+2)*k], l[(n+2)*k:(n+3)*k]
		for c := range k {
			var g0, g1, g2 float64
			if g[0] != nil {
				g0 = g[0][c]
			}
			if g[1] != nil {
				g1 = g[1][c]
			}
			if g[2] != nil {
				g2 = g[2][c]
			}
			l0[c] = p.c*g0 + p.s*g1
			l1[c] = -p.s*g0 + p.c*g1
			l2[c] = g2
		}
	}
}

// addGlobalCols adds the local node forces l (6 rows of k), turned to
// global axes, to every column of the block y, as addGlobal for each.
func (p *pencil) addGlobalCols(y, l []float64, k int) {
	for n := 0; n < 6; n += 3 {
		l0, l1, l2 := l[n*k:(n+1)*k], l[(n+1)*k:(n+2)*k], l[(n+2)*k:(n+3)*k]
		if e := p.gdof[n]; e >= 0 {
			ye := y[e*k : (e+1)*k]
			for c := range ye {
				ye[c] += p.c*l0[c] - p.s*l1[c]
			}
		}
		if e := p.gdof[n+1]; e >= 0 {
			ye := y[e*k : (e+1)*k]
			for c := range ye {
				ye[c] += p.s*l0[c] + p.c*l1[c]
			}
		}
		if e := p.gdof[n+2]; e >= 0 {
			ye := y[e*k : (e+1)*k]
			for c := range ye {
				ye[c] += l2[c]
			}
		}
	}
}

// firstRows returns, for each column i of the upper band factor u (n
// equations, kb superdiagonals), the first row whose entry in it is not
// zero: the forward substitution of row i reads no row above it.
func firstRows(u []float64, n, kb int) []int32 {
	w := kb + 1
	first := make([]int32, n)
	for i := range n {
		f := i
		for k := max(0, i-kb); k < i; k++ {
			if u[k*w+i-k] != 0 {
				f = k
				break
			}
		}
		first[i] = int32(f)
	}
	return first
}

// bandSolveRows overwrites the k columns of x (n rows, row-major) with
// U⁻¹ U⁻ᵀ x, u an upper band Cholesky factor (row-major, kb
// superdiagonals) and first its firstRows: each row formed at once from
// the rows it reads, eight, four, two or one column at a time in
// registers, each column's terms in the order of bandSolveVec's (x − v·y
// is x + (−v)·y to the bit; a zero term inside the band changes no sum
// but the sign of a zero).
func bandSolveRows(u []float64, n, kb int, x []float64, k int, first []int32) {
	w := kb + 1
	for i := range n {
		d := 1 / u[i*w]
		lo := int(first[i])
		for c := 0; c < k; {
			switch {
			case c+8 <= k:
				y := x[i*k+c : i*k+c+8 : i*k+c+8]
				s0, s1, s2, s3, s4, s5, s6, s7 := y[0], y[1], y[2], y[3], y[4], y[5], y[6], y[7]
				for r := lo; r < i; r++ {
					v := u[r*w+i-r]
					z := x[r*k+c : r*k+c+8 : r*k+c+8]
					s0 -= v * z[0]
					s1 -= v * z[1]
					s2 -= v * z[2]
					s3 -= v * z[3]
					s4 -= v * z[4]
					s5 -= v * z[5]
					s6 -= v * z[6]
					s7 -= v * z[7]
				}
				y[0], y[1], y[2], y[3], y[4], y[5], y[6], y[7] = s0*d, s1*d, s2*d, s3*d, s4*d, s5*d, s6*d, s7*d
				c += 8
			case c+4 <= k:
				y := x[i*k+c : i*k+c+4 : i*k+c+4]
				s0, s1, s2, s3 := y[0], y[1], y[2], y[3]
				for r := lo; r < i; r++ {
					v := u[r*w+i-r]
					z := x[r*k+c : r*k+c+4 : r*k+c+4]
					s0 -= v * z[0]
					s1 -= v * z[1]
					s2 -= v * z[2]
					s3 -= v * z[3]
				}
				y[0], y[1], y[2], y[3] = s0*d, s1*d, s2*d, s3*d
				c += 4
			case c+2 <= k:
				y := x[i*k+c : i*k+c+2 : i*k+c+2]
				s0, s1 := y[0], y[1]
				for r := lo; r < i; r++ {
					v := u[r*w+i-r]
					z := x[r*k+c : r*k+c+2 : r*k+c+2]
					s0 -= v * z[0]
					s1 -= v * z[1]
				}
				y[0], y[1] = s0*d, s1*d
				c += 2
			default:
				s := x[i*k+c]
				for r := lo; r < i; r++ {
					s -= u[r*w+i-r] * x[r*k+c]
				}
				x[i*k+c] = s * d
				c++
			}
		}
	}
	for i := n - 1; i >= 0; i-- {
		d := 1 / u[i*w]
		row := u[i*w+1 : i*w+min(w, n-i)]
		for c := 0; c < k; {
			switch {
			case c+8 <= k:
				y := x[i*k+c : i*k+c+8 : i*k+c+8]
				s0, s1, s2, s3, s4, s5, s6, s7 := y[0], y[1], y[2], y[3], y[4], y[5], y[6], y[7]
				for j, v := range row {
					z := x[(i+1+j)*k+c : (i+1+j)*k+c+8 : (i+1+j)*k+c+8]
					s0 -= v * z[0]
					s1 -= v * z[1]
					s2 -= v * z[2]
					s3 -= v * z[3]
					s4 -= v * z[4]
					s5 -= v * z[5]
					s6 -= v * z[6]
					s7 -= v * z[7]
				}
				y[0], y[1], y[2], y[3], y[4], y[5], y[6], y[7] = s0*d, s1*d, s2*d, s3*d, s4*d, s5*d, s6*d, s7*d
				c += 8
			case c+4 <= k:
				y := x[i*k+c : i*k+c+4 : i*k+c+4]
				s0, s1, s2, s3 := y[0], y[1], y[2], y[3]
				for j, v := range row {
					z := x[(i+1+j)*k+c : (i+1+j)*k+c+4 : (i+1+j)*k+c+4]
					s0 -= v * z[0]
					s1 -= v * z[1]
					s2 -= v * z[2]
					s3 -= v * z[3]
				}
				y[0], y[1], y[2], y[3] = s0*d, s1*d, s2*d, s3*d
				c += 4
			case c+2 <= k:
				y := x[i*k+c : i*k+c+2 : i*k+c+2]
				s0, s1 := y[0], y[1]
				for j, v := range row {
					z := x[(i+1+j)*k+c : (i+1+j)*k+c+2 : (i+1+j)*k+c+2]
					s0 -= v * z[0]
					s1 -= v * z[1]
				}
				y[0], y[1] = s0*d, s1*d
				c += 2
			default:
				s := x[i*k+c]
				for j, v := range row {
					s -= v * x[(i+1+j)*k+c]
				}
				x[i*k+c] = s * d
				c++
			}
		}
	}
}
