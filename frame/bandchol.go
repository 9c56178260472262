package frame

import "math"

// bandCholesky overwrites a, a symmetric positive definite matrix in
// upper band storage (n equations, kb superdiagonals, row-major, kb + 1
// a row: entry (i, i+j) at a[i*(kb+1)+j]), with its upper Cholesky factor
// U, a = UᵀU, and reports whether it is positive definite: false as soon
// as a pivot is not positive (a is then left partly overwritten). It is
// LAPACK's unblocked dpbtf2 in row-major order: row i is scaled by its
// pivot's square root and its outer product taken from the rows below
// it, one row at a time, each row's update a contiguous y −= a·x (by
// subScaled, four at a time with AVX where the processor has it). A row's
// update stops at its last entry that is not zero (a stiffness ordered
// by reverse Cuthill–McKee is a profile: a fifth of the band is zeros at
// the rows' ends, and stays zero): the numbers are those of the whole
// band, zeros but for their sign.
func bandCholesky(a []float64, n, kb int) bool {
	w := kb + 1
	_ = a[n*w-1]
	// pivot takes row i's pivot and scales the row, m entries right of
	// the diagonal.
	pivot := func(i, m int) bool {
		row := a[i*w : i*w+m+1]
		d := row[0]
		if !(d > 0) {
			return false
		}
		d = math.Sqrt(d)
		row[0] = d
		r := 1 / d
		for j := 1; j <= m; j++ {
			row[j] *= r
		}
		return true
	}
	// reach returns how many entries right of row i's diagonal, of at
	// most m, reach its last one that is not zero.
	reach := func(i, m int) int {
		row := a[i*w : i*w+m+1]
		for m > 0 && row[m] == 0 {
			m--
		}
		return m
	}
	i := 0
	// Two rows at a time: row i, row i+1 updated by it, row i+1; then the
	// rows below updated by both at once, row i's term first (the numbers
	// of one row at a time). Row i+1 is taken at least as far as row i
	// reaches.
	for ; i+1 < n; i += 2 {
		m := reach(i, min(kb, n-1-i))
		if !pivot(i, m) {
			return false
		}
		ri := a[i*w : i*w+m+1]
		if m > 0 {
			if v := ri[1]; v != 0 {
				subScaled(a[(i+1)*w:(i+1)*w+m], ri[1:m+1], v)
			}
		}
		m1 := max(reach(i+1, min(kb, n-2-i)), m-1)
		if !pivot(i+1, m1) {
			return false
		}
		r1 := a[(i+1)*w : (i+1)*w+m1+1]
		// Row i+j, j from 2: row i's term U[i][i+j] on columns i+j up to
		// i+m, row i+1's U[i+1][i+j] on columns i+j up to i+1+m1.
		for j := 2; j <= m1+1; j++ {
			y := a[(i+j)*w : (i+j)*w+m1-j+2]
			v1 := r1[j-1]
			if j > m {
				if v1 != 0 {
					subScaled(y, r1[j-1:m1+1], v1)
				}
				continue
			}
			v0 := ri[j]
			both := m - j + 1 // columns both rows reach
			switch {
			case v0 != 0 && v1 != 0:
				subScaled2(y[:both], ri[j:m+1], r1[j-1:j-1+both], v0, v1)
				if len(y)-both <= 3 {
					// Row i+1's last few: subScaled's numbers, without
					// its call (one entry when both rows reach the band's
					// end).
					x := r1[j-1 : m1+1]
					for k := both; k < len(y); k++ {
						y[k] -= v1 * x[k]
					}
				} else {
					subScaled(y[both:], r1[j-1+both:m1+1], v1)
				}
			case v0 != 0:
				subScaled(y[:both], ri[j:m+1], v0)
			case v1 != 0:
				subScaled(y, r1[j-1:m1+1], v1)
			}
		}
	}
	if i < n {
		return pivot(i, 0)
	}
	return true
}

// subScaled2Go sets y to (y − a·x) − b·z, len(x), len(z) ≥ len(y).
func subScaled2Go(y, x, z []float64, a, b float64) {
	x, z = x[:len(y)], z[:len(y)]
	for k := range y {
		y[k] = y[k] - a*x[k] - b*z[k]
	}
}

// subScaledGo sets y to y − a·x, len(x) == len(y).
func subScaledGo(y, x []float64, a float64) {
	x = x[:len(y)]
	k := 0
	for ; k+4 <= len(y); k += 4 {
		y0, y1, y2, y3 := y[k]-a*x[k], y[k+1]-a*x[k+1], y[k+2]-a*x[k+2], y[k+3]-a*x[k+3]
		y[k], y[k+1], y[k+2], y[k+3] = y0, y1, y2, y3
	}
	for ; k < len(y); k++ {
		y[k] -= a * x[k]
	}
}

// Blocked band Cholesky factorization, for checks of definiteness only.
//
// definiteBlock is the rows factored as one block by bandDefinite, whose
// outer product then updates the rows below at once; definitePad is how
// many numbers its band storage adds to each row (definiteStride).
const (
	definiteBlock = 8
	definitePad   = definiteBlock + 3
)

// definiteStride returns the row stride of the band storage bandDefinite
// factors for kb superdiagonals: each row's kb + 1 numbers (entry
// (i, i+j) at a[i·stride+j]), then definiteBlock − 1 zeros, which stand
// for the entries right of the band, then 4 numbers of scratch.
func definiteStride(kb int) int { return kb + 1 + definitePad }

// definiteLen returns the length of the band storage bandDefinite
// factors for n equations and kb superdiagonals: n rows of
// definiteStride(kb) and 3 of scratch.
func definiteLen(n, kb int) int { return (n + 3) * definiteStride(kb) }

// bandDefinite reports whether a, a symmetric matrix of n equations and
// kb superdiagonals in the band storage of definiteStride (its zeros
// zero, and of definiteLen(n, kb) numbers), is positive definite, by its
// upper Cholesky factorization, blocked: definiteBlock rows at a time
// are pivoted and scaled one by one (each row's outer product taken from
// the block's rows below it, to where it reaches, as bandCholesky), then
// the block's outer product, of rank definiteBlock, is taken at once
// from the rows below it that the block reaches, four rows at a time by
// rankUpdate4. A row's outer product stops at its last entry that is not
// zero, as in bandCholesky. a is overwritten with the factor (partly
// when false); its rounding is not bandCholesky's (the sums are taken
// in another order, with fused multiply-adds where the processor has
// them), so only the answer is for use.
func bandDefinite(a []float64, n, kb int) bool {
	if len(a) != definiteLen(n, kb) {
		panic("frame: bandDefinite: storage of the wrong length")
	}
	for lo := 0; lo < n; lo += definiteBlock {
		if !definiteStep(a, kb, lo, min(lo+definiteBlock, n), n-1) {
			return false
		}
	}
	return true
}

// definiteStep is one step of bandDefinite: rows lo to hi − 1 pivoted
// and scaled, and their outer product taken from the rows below them;
// false when a pivot is not positive. Rows and columns are counted from
// a's first row, last is the matrix's last row so counted, and a holds
// the rows up to the last the step reaches, hi + kb + 2 (or last + 3).
func definiteStep(a []float64, kb, lo, hi, last int) bool {
	ld := definiteStride(kb)
	// l is the distance between entries (i, c) and (i+1, c): entry
	// (i, c) is at a[i·l + c].
	l := ld - 1
	end := lo // the last column the block's rows reach
	for r := lo; r < hi; r++ {
		m := min(kb, last-r)
		row := a[r*ld : r*ld+m+1]
		for m > 0 && row[m] == 0 {
			m--
		}
		d := row[0]
		if !(d > 0) {
			return false
		}
		d = math.Sqrt(d)
		row[0] = d
		s := 1 / d
		for j := 1; j <= m; j++ {
			row[j] *= s
		}
		end = max(end, r+m)
		for t := r + 1; t < hi && t <= r+m; t++ {
			if v := row[t-r]; v != 0 {
				subScaled(a[t*ld:t*ld+r+m-t+1], row[t-r:m+1], v)
			}
		}
	}
	// Rows hi to end, each from its diagonal to column end, less the
	// block's outer product, four rows at a time from column t (the
	// entries left of a row's diagonal that a tile takes are the scratch
	// at the end of the row above it, and the rows past end only such).
	// A row of the block that does not reach column c has zeros there,
	// in its band or in the zeros after it (c − r < kb + definiteBlock).
	for t := hi; t <= end; t += 4 {
		rankUpdate4(a[t*l+t:], a[lo*l+t:], l, hi-lo, end-t+1)
	}
	return true
}

// rankUpdate4Go is rankUpdate4 in Go.
func rankUpdate4Go(y, x []float64, l, nb, cols int) {
	for c := range cols {
		s0, s1, s2, s3 := y[c], y[l+c], y[2*l+c], y[3*l+c]
		for r := range nb {
			v := x[r*l+c]
			u := x[r*l : r*l+4]
			s0 -= u[0] * v
			s1 -= u[1] * v
			s2 -= u[2] * v
			s3 -= u[3] * v
		}
		y[c], y[l+c], y[2*l+c], y[3*l+c] = s0, s1, s2, s3
	}
}

// rankUpdate4Rows is rankUpdate4 a row of y at a time, two rows of x at a
// time (subScaled2, as bandCholesky): for processors without AVX-512.
func rankUpdate4Rows(y, x []float64, l, nb, cols int) {
	for t := range 4 {
		yt := y[t*l : t*l+cols]
		r := 0
		for ; r+1 < nb; r += 2 {
			subScaled2(yt, x[r*l:r*l+cols], x[(r+1)*l:(r+1)*l+cols], x[r*l+t], x[(r+1)*l+t])
		}
		if r < nb {
			subScaled(yt, x[r*l:r*l+cols], x[r*l+t])
		}
	}
}
