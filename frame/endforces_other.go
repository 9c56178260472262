//go:build !amd64 || purego

package frame

func endForces4(dst *[6]float64, r0, r1, r2, r3, r4, r5 *float64, n int, k *[6][6]float64, cs, sn float64, rows int, disp *[6]float64) {
	panic("frame: endForces4 without AVX")
}
