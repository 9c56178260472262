//go:build !amd64 || purego

package envelope

// useAVX is false: the pure-Go table of moments everywhere.
var useAVX = false

func momentRowsAVX(rows *[4]*float64, a, v *float64, d *[6]float64, nu int, p *momentLanes, out *[8]float64) {
	panic("envelope: momentRowsAVX without AVX")
}

func signSumsAVX(rows *[4]*float64, n, v *float64, nu int, c *signConsts, out *[10][4]float64) {
	panic("envelope: signSumsAVX without AVX")
}

func listReachingAVX(mv *float64, n int, t0, t1 float64, r0, r1 *int32, lt *laneTable) (n0, n1 int) {
	panic("envelope: listReachingAVX without AVX")
}

func firstSignsAVX(rows *[4]*float64, a, v, n *float64, nu int, c *firstConsts, out *[11][4]float64) {
	panic("envelope: firstSignsAVX without AVX")
}

func foldSignsAVX(x *[2]*float64, n, v, a *float64, nu int, c *foldConsts, out *[11][2]float64) {
	panic("envelope: foldSignsAVX without AVX")
}

func largestFirstAVX(ends *[6]float64, n, v, a *float64, cnt int, c *bigConsts, big *[4]float64) {
	panic("envelope: largestFirstAVX without AVX")
}

func classify3AVX(units *[3]float64, nu int, c *class3Consts, l0, l1, l2 *int32, out *class3Out) (k0, k1, k2 int) {
	panic("envelope: classify3AVX without AVX")
}

func largestSignsAVX(units *[3]float64, nu int, out *[3][4]float64) {
	panic("envelope: largestSignsAVX without AVX")
}
