package frame

// The solves of the Lanczos iteration of [Buckling]: each member's own
// degrees of freedom eliminated and recovered from one packed block of
// its numbers, and the band substitutions of several columns at once,
// each row formed from the rows it reads with the columns' sums held in
// registers. Every column's arithmetic is that of the column alone, in
// the order of bandSolveVec's vector updates.

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
	switch {
	case b.n == 0:
	case k == 1:
		bandSolveVec(b.u, b.n, b.kb, x[:b.n])
	default:
		bandSolveRows(b.u, b.lt, b.n, b.kb, x[:b.n*k], k, b.first)
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
	for i := range ni {
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
	for i := range ni {
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

// transposeBand returns the upper band factor u (n equations, kb
// superdiagonals, row-major) by columns: column i's entries above the
// diagonal, U[i−d][i] at [i(kb+1)+d] for d from 1 up, so that the forward
// substitution reads each row's terms one after another.
func transposeBand(u []float64, n, kb int) []float64 {
	w := kb + 1
	lt := make([]float64, n*w)
	for i := range n {
		lt[i*w] = u[i*w]
		for d := 1; d <= min(kb, i); d++ {
			lt[i*w+d] = u[(i-d)*w+d]
		}
	}
	return lt
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
// superdiagonals), lt its transposeBand and first its firstRows: each row formed at once from
// the rows it reads, eight, four, two or one column at a time in
// registers, each column's terms in the order of bandSolveVec's (x − v·y
// is x + (−v)·y to the bit; a zero term inside the band changes no sum
// but the sign of a zero).
func bandSolveRows(u, lt []float64, n, kb int, x []float64, k int, first []int32) {
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
					v := lt[i*w+i-r]
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
					v := lt[i*w+i-r]
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
					v := lt[i*w+i-r]
					z := x[r*k+c : r*k+c+2 : r*k+c+2]
					s0 -= v * z[0]
					s1 -= v * z[1]
				}
				y[0], y[1] = s0*d, s1*d
				c += 2
			default:
				s := x[i*k+c]
				for r := lo; r < i; r++ {
					s -= lt[i*w+i-r] * x[r*k+c]
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
