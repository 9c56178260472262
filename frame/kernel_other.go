//go:build !amd64 || purego

package frame

// useAVX is false: the pure-Go substitution everywhere.
var useAVX = false

func combine32(dst, base *float64, rows *int32, negs *float64, n int, d float64) {
	panic("frame: combine32 without AVX")
}

func unpack32(dst, src *float64, s float64) float64 {
	panic("frame: unpack32 without AVX")
}

func hasAVX() bool { return false }
