//go:build amd64 && !purego

package frame

// endForces4 sets dst[c] for c from 0 to 4n−1 to the local end forces of a
// member that no case loads, from the global displacements of its ends in
// every case (r0 … r5: start ux, uy, rz, end ux, uy, rz, 4n values each):
// u = toLocal(g), f[i] = 0 + k[i][0]·u0 + … + k[i][5]·u5, for i below rows
// (3 or 6; with 3, dst[c][3:6] are set to zero), four cases at a time with
// AVX, each product rounded and then added in that order (no fused
// multiply-add), so that every value is the pure-Go one to the last bit.
// Where disp is not nil, disp[c] is set to u as well.
//
//go:noescape
func endForces4(dst *[6]float64, r0, r1, r2, r3, r4, r5 *float64, n int, k *[6][6]float64, cs, sn float64, rows int, disp *[6]float64)
