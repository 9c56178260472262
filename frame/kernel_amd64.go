//go:build amd64 && !purego

package frame

// combine32 is combine for one row of a packed block of 32 columns, four
// at a time with AVX: dst[c] = (dst[c] + Σ negs[t]·base[32·rows[t]+c]) · d
// for c from 0 to 31, each product rounded and then added, in the order
// of t (no fused multiply-add), so that every sum is the pure-Go one to
// the last bit.
//
//go:noescape
func combine32(dst, base *float64, rows *int32, negs *float64, n int, d float64)

// combine64 is combine32 for a block of 64 columns, eight at a time with
// AVX-512: the same products and sums, in the same order, for each column.
//
//go:noescape
func combine64(dst, base *float64, rows *int32, negs *float64, n int, d float64)

// combine32c is combine32 for rows read that follow each other, from
// src on (src+32·t for the t-th): the same products and sums in the same
// order, without a list of the rows to read.
//
//go:noescape
func combine32c(dst, src *float64, negs *float64, n int, d float64)

// combine64c is combine64 for rows read that follow each other, as
// combine32c is combine32's.
//
//go:noescape
func combine64c(dst, src *float64, negs *float64, n int, d float64)

// combine64x2 adds to two rows of a block of 64 columns the terms of the
// same rows read, which follow each other from src on:
// dst0[c] += Σ negs0[t]·src[64·t+c] and dst1[c] += Σ negs1[t]·src[64·t+c]
// for c from 0 to 63, each product rounded and then added, in the order
// of t, as combine64c adds them (without its last product by d): each
// value read serves both rows.
//
//go:noescape
func combine64x2(dst0, dst1, src, negs0, negs1 *float64, n int)

// unpack32 sets dst[c] = src[c]·s for c from 0 to 31 and returns the
// sum of every dst[c] − dst[c]: 0 when all are finite numbers, NaN when
// some is not (see unpackRow).
//
//go:noescape
func unpack32(dst, src *float64, s float64) (nonFinite float64)

// cpuid and xgetbv are the instructions of those names.
func cpuid(eaxArg, ecxArg uint32) (eax, ebx, ecx, edx uint32)
func xgetbv() (eax, edx uint32)

// hasAVX reports whether the processor and the operating system support
// AVX: the processor's flags for AVX and OSXSAVE, and the operating
// system saving the YMM registers (XCR0 bits 1 and 2).
func hasAVX() bool {
	_, _, ecx, _ := cpuid(1, 0)
	if ecx&(1<<27) == 0 || ecx&(1<<28) == 0 {
		return false
	}
	eax, _ := xgetbv()
	return eax&6 == 6
}

// hasAVX512 reports whether the processor and the operating system
// support AVX-512 (its foundation): the processor's flag (CPUID leaf 7)
// with AVX's, and the operating system saving the opmask and the upper
// ZMM registers (XCR0 bits 5 to 7).
func hasAVX512() bool {
	if !hasAVX() {
		return false
	}
	if max, _, _, _ := cpuid(0, 0); max < 7 {
		return false
	}
	_, ebx, _, _ := cpuid(7, 0)
	if ebx&(1<<16) == 0 {
		return false
	}
	eax, _ := xgetbv()
	return eax&0xe6 == 0xe6
}

// useAVX512 is whether bandSolve, with useAVX, substitutes blocks of 64
// columns by combine64; the tests turn it off to check the blocks of 32.
var useAVX512 = hasAVX512()

// useAVX is whether bandSolve uses combine32; the tests turn it off to
// check the pure-Go path, which other processors take.
var useAVX = hasAVX()
