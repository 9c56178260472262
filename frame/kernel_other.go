//go:build !amd64 || purego

package frame

// useAVX and useAVX512 are false: the pure-Go substitution everywhere.
var useAVX, useAVX512 = false, false

func combine64(dst, base *float64, rows *int32, negs *float64, n int, d float64) {
	panic("frame: combine64 without AVX-512")
}

func combine32(dst, base *float64, rows *int32, negs *float64, n int, d float64) {
	panic("frame: combine32 without AVX")
}

func combine32c(dst, src *float64, negs *float64, n int, d float64) {
	panic("frame: combine32c without AVX")
}

func combine64c(dst, src *float64, negs *float64, n int, d float64) {
	panic("frame: combine64c without AVX")
}

func combine64x2(dst0, dst1, src, negs0, negs1 *float64, n int) {
	panic("frame: combine64x2 without AVX-512")
}

func unpack32(dst, src *float64, s float64) float64 {
	panic("frame: unpack32 without AVX")
}

func hasAVX() bool { return false }

func hasAVX512() bool { return false }
