//go:build amd64 && !purego

package frame

// subScaledAVX is subScaledGo for n = len(y) numbers, four at a time
// with AVX, each product rounded and then subtracted (no fused
// multiply-add): the same numbers as subScaledGo.
//
//go:noescape
func subScaledAVX(y, x *float64, n int, a float64)

// subScaled sets y to y − a·x, len(x) ≥ len(y).
func subScaled(y, x []float64, a float64) {
	if len(y) == 0 {
		return
	}
	_ = x[len(y)-1]
	if useAVX {
		subScaledAVX(&y[0], &x[0], len(y), a)
		return
	}
	subScaledGo(y, x[:len(y)], a)
}

// subScaled2AVX is subScaled2Go for n = len(y) numbers, four at a time
// with AVX, in the same order of operations.
//
//go:noescape
func subScaled2AVX(y, x, z *float64, n int, a, b float64)

// subScaled2 sets y to (y − a·x) − b·z, len(x), len(z) ≥ len(y).
func subScaled2(y, x, z []float64, a, b float64) {
	if len(y) == 0 {
		return
	}
	_, _ = x[len(y)-1], z[len(y)-1]
	if useAVX {
		subScaled2AVX(&y[0], &x[0], &z[0], len(y), a, b)
		return
	}
	subScaled2Go(y, x, z, a, b)
}

// lanes1 sets a[j] to the sum of v[t]·z[t] over the t < n (a multiple of
// 4) with t mod 4 = j, in the order of t, with AVX.
//
//go:noescape
func lanes1(v, z *float64, n int, a *[4]float64)

// lanes4 sets dst[c], c < 4, to (dst[c] − ((s₀ + s₁) + (s₂ + s₃)))·d, sⱼ
// the sum of v[t]·z[t·zstride/8 + c] over the t < n with t mod 4 = j in
// the order of t, with AVX (zstride in bytes).
//
//go:noescape
func lanes4(dst, z *float64, zstride int, v *float64, n int, d float64)

// rankUpdate4AVX512 is rankUpdate4 for nb ≥ 1 and cols ≥ 1, eight
// columns at a time with AVX-512, each sum's terms in the order of r by
// fused multiply-adds, l in numbers.
//
//go:noescape
func rankUpdate4AVX512(y, x *float64, l, nb, cols int)

// rankUpdate4 subtracts from y[t·l + c], t < 4 and c < cols, the sum over
// r < nb of x[r·l + t]·x[r·l + c]: four rows of a band matrix (entry
// (i, c) at i·l + c) less the outer product of nb rows above them, x
// from the column of y's first row.
func rankUpdate4(y, x []float64, l, nb, cols int) {
	if cols <= 0 || nb <= 0 {
		return
	}
	_, _ = y[3*l+cols-1], x[(nb-1)*l+max(cols, 4)-1]
	switch {
	case useAVX512:
		rankUpdate4AVX512(&y[0], &x[0], l, nb, cols)
	case useAVX:
		rankUpdate4Rows(y, x, l, nb, cols)
	default:
		rankUpdate4Go(y, x, l, nb, cols)
	}
}
