package frame

// The band substitutions of the Lanczos iteration of [Buckling]: each
// row of U⁻ᵀ and then of U⁻¹ formed at once as its value less a sum of
// the rows it reads times the factor's terms, the sum split by the
// term's place modulo 4 into four partial sums added as (s₀ + s₁) +
// (s₂ + s₃). The partial sums are independent, so the processor keeps
// four in flight (with AVX, four columns of each in one register); every
// column's numbers are the same whether it is solved alone or with
// others, on one processor or two. The sums are in another order than
// bandSolveVec's: the results differ from its by rounding only.

// transposeBand returns the upper band factor u (n equations, kb
// superdiagonals, row-major) by columns: column i's entries above the
// diagonal, U[r][i] for r from i − kb up to i − 1 at [i(kb+1) + r − i + kb],
// so that the forward substitution reads each row's terms one after
// another, in the order of the rows they multiply.
func transposeBand(u []float64, n, kb int) []float64 {
	w := kb + 1
	lt := make([]float64, n*w)
	for i := range n {
		for r := max(0, i-kb); r < i; r++ {
			lt[i*w+r-i+kb] = u[r*w+i-r]
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

// lastCols returns, for each row i of the upper band factor u (n
// equations, kb superdiagonals), how many entries right of the diagonal
// reach its last one that is not zero: the back substitution of row i
// reads no row below that.
func lastCols(u []float64, n, kb int) []int32 {
	w := kb + 1
	last := make([]int32, n)
	for i := range n {
		m := min(kb, n-1-i)
		for m > 0 && u[i*w+m] == 0 {
			m--
		}
		last[i] = int32(m)
	}
	return last
}

// bandSolveLanes overwrites the k columns of x (n rows, row-major) with
// U⁻¹ U⁻ᵀ x, u an upper band Cholesky factor (row-major, kb
// superdiagonals), lt its transposeBand, first its firstRows and last
// its lastCols. The terms left out, before first and after last, are
// the factor's zeros: their products, ±0, would leave each partial sum
// as it is (a partial sum starts at +0 and is never −0), so the numbers
// are those of the whole band.
func bandSolveLanes(u, lt []float64, n, kb int, x []float64, k int, first, last []int32) {
	w := kb + 1
	for i := range n {
		lo := int(first[i])
		v := lt[i*w+lo-i+kb : i*w+kb]
		rowLanes(x, i*k, lo*k, k, v, 1/u[i*w])
	}
	for i := n - 1; i >= 0; i-- {
		m := int(last[i])
		rowLanes(x, i*k, (i+1)*k, k, u[i*w+1:i*w+1+m], 1/u[i*w])
	}
}

// rowLanes sets the k numbers of x from at to (x − Σₜ v[t]·x[from+t·k : +k])·d,
// the sum by four partial sums (see above).
func rowLanes(x []float64, at, from, k int, v []float64, d float64) {
	nt := len(v)
	if nt > 0 {
		_ = x[from+(nt-1)*k+k-1]
	}
	_ = x[at+k-1]
	c := 0
	if useAVX {
		if k == 1 && nt >= 4 {
			var a [4]float64
			q := nt &^ 3
			lanes1(&v[0], &x[from], q, &a)
			for t := q; t < nt; t++ {
				a[t&3] += v[t] * x[from+t]
			}
			x[at] = (x[at] - ((a[0] + a[1]) + (a[2] + a[3]))) * d
			return
		}
		for ; c+4 <= k; c += 4 {
			var z *float64
			var vp *float64
			if nt > 0 {
				z, vp = &x[from+c], &v[0]
			}
			lanes4(&x[at+c], z, 8*k, vp, nt, d)
		}
	}
	for ; c < k; c++ {
		var a [4]float64
		for t, vt := range v {
			a[t&3] += vt * x[from+t*k+c]
		}
		x[at+c] = (x[at+c] - ((a[0] + a[1]) + (a[2] + a[3]))) * d
	}
}
