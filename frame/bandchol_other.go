//go:build !amd64 || purego

package frame

// subScaled sets y to y − a·x, len(x) ≥ len(y).
func subScaled(y, x []float64, a float64) { subScaledGo(y, x[:len(y)], a) }

// subScaled2 sets y to (y − a·x) − b·z, len(x), len(z) ≥ len(y).
func subScaled2(y, x, z []float64, a, b float64) { subScaled2Go(y, x, z, a, b) }

func lanes1(v, z *float64, n int, a *[4]float64) { panic("frame: lanes1 without AVX") }

func lanes4(dst, z *float64, zstride int, v *float64, n int, d float64) {
	panic("frame: lanes4 without AVX")
}

// rankUpdate4 subtracts from y[t·l + c], t < 4 and c < cols, the sum over
// r < nb of x[r·l + t]·x[r·l + c]: four rows of a band matrix (entry
// (i, c) at i·l + c) less the outer product of nb rows above them, x
// from the column of y's first row.
func rankUpdate4(y, x []float64, l, nb, cols int) {
	if cols <= 0 || nb <= 0 {
		return
	}
	rankUpdate4Go(y, x, l, nb, cols)
}
