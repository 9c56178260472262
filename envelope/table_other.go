//go:build !amd64 || purego

package envelope

// useAVX is false: the pure-Go table of moments everywhere.
var useAVX = false

func momentRowsAVX(rows *[4]*float64, a, v *float64, d *[6]float64, nu int, p *momentLanes, out *[8]float64) {
	panic("envelope: momentRowsAVX without AVX")
}
