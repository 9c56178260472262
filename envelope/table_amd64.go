//go:build amd64 && !purego

package envelope

// momentRowsAVX forms four stations' rows of a second-order member's
// table of moments (table.go) with AVX, the stations in the four lanes of
// one register: for each unit u of nu, at each lane's station,
//
//	mm = (a[u] + x·v[u]) + n·((((0 + w1·d1) + w2·d2) + w4·d4) + w5·d5)
//
// with d = d[u], each product rounded and then added (no fused
// multiply-add), the same operations in the same order as the pure-Go
// loop, so the same numbers to the last bit. It stores mm at rows[l][u]
// for lane l, and sets out[l] to the sum of the lane's mm over the
// units, in their order from +0, and out[4+l] to their largest size, NaN
// left out (+0 for none).
//
//go:noescape
func momentRowsAVX(rows *[4]*float64, a, v *float64, d *[6]float64, nu int, p *momentLanes, out *[8]float64)

// signSumsAVX classifies the units' M at four stations (rows[l][u] for
// lane l, the table formed by momentRowsAVX) as classify and the sums of
// scanFolded do, one station to a lane, unit after unit: out[0..2] are
// the sums of n, v and M over the units whose M is above c's nz, out[3..5]
// those over the units of neither sign (round-off, NaN included), each
// in the order of the units from +0 (+0 added for the others, which
// leaves such a sum as it is); out[6] and out[7] the largest size of M of
// each sign (+0 for none) and out[8] and out[9] how many units are of
// each.
//
//go:noescape
func signSumsAVX(rows *[4]*float64, n, v *float64, nu int, c *signConsts, out *[10][4]float64)

// listReachingAVX is listReaching over the first n units of mv (n a
// multiple of 4), four units compared at once, and those of a group that
// reach a threshold listed at once, in their order, from the lanes set
// (lt, lanes): it returns how many units it listed in r0 and in r1, which
// hold at least n + 4 entries (a group writes four, of which those listed
// count).
//
//go:noescape
func listReachingAVX(mv *float64, n int, t0, t1 float64, r0, r1 *int32, lt *laneTable) (n0, n1 int)

// firstSignsAVX forms four stations' rows of a first-order member's
// table of moments (table.go) with AVX, the stations in the four lanes of
// one register, and classifies them as signSumsAVX does, in the same pass:
// for each unit u of nu, at each lane's station c.x[l],
//
//	mm = a[u] + x·v[u]
//
// the product rounded and then added (no fused multiply-add), as the
// pure-Go loop of scanFolded, so the same numbers to the last bit. It
// stores mm at rows[l][u]; out[0..9] are what signSumsAVX gives for the
// lane's row (with c's round-off), and out[10] the sum of the lane's mm
// over the units, in their order from +0.
//
//go:noescape
func firstSignsAVX(rows *[4]*float64, a, v, n *float64, nu int, c *firstConsts, out *[11][4]float64)

// foldSignsAVX classifies the units that do not load a first-order
// member for N (lane 0, by the values x[0]) and for V (lane 1, by x[1])
// as classify and the sums of foldCase.fold do, both at once, unit after
// unit: out[0..2] are the sums of n, v and a over the units whose value
// is above the lane's nz, out[3..5] those over the units of neither sign
// (round-off, NaN included), each in the order of the units from +0 (+0
// added for the others, which leaves such a sum as it is); out[6] and
// out[7] the largest size of each sign (+0 for none), out[8] and out[9]
// how many units are of each, and out[10] the sum of every unit's value,
// in their order from +0.
//
//go:noescape
func foldSignsAVX(x *[2]*float64, n, v, a *float64, nu int, c *foldConsts, out *[11][2]float64)

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

// useAVX is whether the AVX kernels of this package are used (the
// tables of moments of momentRowsAVX and firstSignsAVX, and the others);
// the tests turn it off to compare with the pure-Go loops. Not where the compiler fuses a product and a sum into one
// multiply-add (goFuses): the kernels round each product, so their
// numbers would no longer be those of the pure-Go loops, nor those of
// frame's stations.
var useAVX = hasAVX() && !goFuses

// largestFirstAVX is largestFirst's pass over cnt units that do not load
// the member (ends, n, v and a from the first of them), with AVX: it sets
// n, v and a, and raises big (see bigConsts) as largestFirst's plain
// comparisons raise its sizes, NaN left out (VMAXPD keeps the running
// largest unless the new size is larger).
//
//go:noescape
func largestFirstAVX(ends *[6]float64, n, v, a *float64, cnt int, c *bigConsts, big *[4]float64)

// classify3AVX is rowScan.classify's pass for the three effects at once
// (rowScan.classify3), with AVX: a unit's three components in three lanes
// of one register, each effect's sums of the positive units and of the
// round-off ones a register of three chains of additions, in the order
// of the units from +0 (+0 added for the other units, which leaves such a
// sum as it is), so the same numbers to the last bit. It lists in l0, l1
// and l2 the units that reach each effect's thresholds and returns how
// many; out: the sums, of all the units too, and the counts.
//
//go:noescape
func classify3AVX(units *[3]float64, nu int, c *class3Consts, l0, l1, l2 *int32, out *class3Out) (k0, k1, k2 int)

// largestSignsAVX is the pass of largestSizes over a patterned case's
// units with AVX, a unit's three components in three lanes of one
// register: out[0] the largest value of each component, out[1] the
// smallest, each of them and +0, NaN left out, and out[2] a lane of all
// ones for a component with some NaN.
//
//go:noescape
func largestSignsAVX(units *[3]float64, nu int, out *[3][4]float64)
