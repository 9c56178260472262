//go:build amd64 && !purego

#include "textflag.h"

// func momentRowsAVX(rows *[4]*float64, a, v *float64, d *[6]float64, nu int, p *momentLanes, out *[8]float64)
//
// p: x at 0, w1 at 32, w2 at 64, w4 at 96, w5 at 128 (four lanes each),
// n at 160, the mask of a size (every bit but the sign) at 168.
TEXT ·momentRowsAVX(SB), NOSPLIT, $0-56
	MOVQ rows+0(FP), AX
	MOVQ 0(AX), R8
	MOVQ 8(AX), R9
	MOVQ 16(AX), R10
	MOVQ 24(AX), R11
	MOVQ a+8(FP), SI
	MOVQ v+16(FP), DI
	MOVQ d+24(FP), DX
	MOVQ nu+32(FP), CX
	MOVQ p+40(FP), AX
	MOVQ out+48(FP), BX
	VMOVUPD 0(AX), Y1
	VMOVUPD 32(AX), Y2
	VMOVUPD 64(AX), Y3
	VMOVUPD 96(AX), Y4
	VMOVUPD 128(AX), Y5
	VBROADCASTSD 160(AX), Y0
	VBROADCASTSD 168(AX), Y14
	VXORPD Y15, Y15, Y15
	VXORPD Y6, Y6, Y6
	VXORPD Y7, Y7, Y7
	XORQ R12, R12
	TESTQ CX, CX
	JEQ done

loop:
	// sw = (((0 + w1·d1) + w2·d2) + w4·d4) + w5·d5
	VBROADCASTSD 8(DX), Y8
	VMULPD Y2, Y8, Y8
	VADDPD Y8, Y15, Y8
	VBROADCASTSD 16(DX), Y9
	VMULPD Y3, Y9, Y9
	VADDPD Y9, Y8, Y8
	VBROADCASTSD 32(DX), Y9
	VMULPD Y4, Y9, Y9
	VADDPD Y9, Y8, Y8
	VBROADCASTSD 40(DX), Y9
	VMULPD Y5, Y9, Y9
	VADDPD Y9, Y8, Y8
	// mm = (a + x·v) + n·sw
	VMULPD Y0, Y8, Y8
	VBROADCASTSD (DI)(R12*8), Y9
	VMULPD Y1, Y9, Y9
	VBROADCASTSD (SI)(R12*8), Y10
	VADDPD Y9, Y10, Y10
	VADDPD Y8, Y10, Y10
	// The sum, and the largest size: VMAXPD gives its second source
	// (the running largest) when the size is NaN.
	VADDPD Y10, Y6, Y6
	VANDPD Y14, Y10, Y11
	VMAXPD Y7, Y11, Y7
	// Each lane to its station's row.
	VMOVSD X10, (R8)(R12*8)
	VMOVHPD X10, (R9)(R12*8)
	VEXTRACTF128 $1, Y10, X11
	VMOVSD X11, (R10)(R12*8)
	VMOVHPD X11, (R11)(R12*8)
	ADDQ $48, DX
	INCQ R12
	CMPQ R12, CX
	JNE loop

done:
	VMOVUPD Y6, 0(BX)
	VMOVUPD Y7, 32(BX)
	VZEROUPPER
	RET

// func firstSignsAVX(rows *[4]*float64, a, v, n *float64, nu int, c *firstConsts, out *[11][4]float64)
//
// c: the stations x at 0, nz at 32, −nz at 64, ones at 96 (four lanes
// each). out: the positive units' sums of n, v
// and M, the round-off units' sums of the same, the largest size of the
// positive and of the negative units, the counts of each, and the sum of
// every unit's M.
TEXT ·firstSignsAVX(SB), NOSPLIT, $0-56
	MOVQ rows+0(FP), AX
	MOVQ 0(AX), R8
	MOVQ 8(AX), R9
	MOVQ 16(AX), R10
	MOVQ 24(AX), R11
	MOVQ a+8(FP), SI
	MOVQ v+16(FP), DI
	MOVQ n+24(FP), DX
	MOVQ nu+32(FP), CX
	MOVQ c+40(FP), AX
	MOVQ out+48(FP), BX
	VXORPD Y0, Y0, Y0
	VXORPD Y1, Y1, Y1
	VXORPD Y2, Y2, Y2
	VXORPD Y3, Y3, Y3
	VXORPD Y4, Y4, Y4
	VXORPD Y5, Y5, Y5
	VXORPD Y6, Y6, Y6
	VXORPD Y7, Y7, Y7
	VXORPD Y8, Y8, Y8
	VXORPD Y9, Y9, Y9
	VXORPD Y10, Y10, Y10
	XORQ R12, R12
	TESTQ CX, CX
	JEQ fdone

floop:
	// mm = a + x·v, the product rounded, then added; and the sum.
	// (v kept in Y14.)
	VBROADCASTSD (DI)(R12*8), Y14
	VMULPD 0(AX), Y14, Y15
	VBROADCASTSD (SI)(R12*8), Y11
	VADDPD Y15, Y11, Y11
	VADDPD Y11, Y10, Y10
	// Each lane to its station's row.
	VMOVSD X11, (R8)(R12*8)
	VMOVHPD X11, (R9)(R12*8)
	VEXTRACTF128 $1, Y11, X15
	VMOVSD X15, (R10)(R12*8)
	VMOVHPD X15, (R11)(R12*8)
	// P: M > nz; N: M < −nz (false for NaN).
	VCMPPD $0x1e, 32(AX), Y11, Y12
	VCMPPD $0x11, 64(AX), Y11, Y13
	// The positive units' sums: +0 added for the others.
	VBROADCASTSD (DX)(R12*8), Y15
	VANDPD Y12, Y15, Y15
	VADDPD Y15, Y0, Y0
	VANDPD Y12, Y14, Y15
	VADDPD Y15, Y1, Y1
	VANDPD Y12, Y11, Y15
	VADDPD Y15, Y2, Y2
	// The largest positive M (+0 for the others; VMAXPD gives its second
	// source, the running largest, for equal ones), and the smallest
	// negative one (the same, VMINPD), whose size is its negation.
	VMAXPD Y6, Y15, Y6
	VANDPD Y13, Y11, Y15
	VMINPD Y7, Y15, Y7
	// The counts.
	VANDPD 96(AX), Y12, Y15
	VADDPD Y15, Y8, Y8
	VANDPD 96(AX), Y13, Y15
	VADDPD Y15, Y9, Y9
	// The round-off units (neither P nor N), rare: their sums, in a
	// lane with one (fround), the others' +0 added.
	VORPD Y12, Y13, Y12
	VMOVMSKPD Y12, R13
	CMPQ R13, $15
	JNE fround

fnext:
	INCQ R12
	CMPQ R12, CX
	JNE floop

fdone:
	// The largest size of the negative M: 0 − the smallest (+0 for none).
	VXORPD Y15, Y15, Y15
	VSUBPD Y7, Y15, Y7
	VMOVUPD Y0, 0(BX)
	VMOVUPD Y1, 32(BX)
	VMOVUPD Y2, 64(BX)
	VMOVUPD Y3, 96(BX)
	VMOVUPD Y4, 128(BX)
	VMOVUPD Y5, 160(BX)
	VMOVUPD Y6, 192(BX)
	VMOVUPD Y7, 224(BX)
	VMOVUPD Y8, 256(BX)
	VMOVUPD Y9, 288(BX)
	VMOVUPD Y10, 320(BX)
	VZEROUPPER
	RET

fround:
	VBROADCASTSD (DX)(R12*8), Y14
	VANDNPD Y14, Y12, Y15
	VADDPD Y15, Y3, Y3
	VBROADCASTSD (DI)(R12*8), Y14
	VANDNPD Y14, Y12, Y15
	VADDPD Y15, Y4, Y4
	VANDNPD Y11, Y12, Y15
	VADDPD Y15, Y5, Y5
	JMP fnext

// func foldSignsAVX(x *[2]*float64, n, v, a *float64, nu int, c *foldConsts, out *[11][2]float64)
//
// c: nz at 0, −nz at 16, the mask of a size at 32, ones at 48 (two lanes
// each). out: the positive units' sums of n, v and a, the round-off
// units' sums of the same, the largest size of the positive and of the
// negative units, the counts of each, and the sum of every unit's value.
TEXT ·foldSignsAVX(SB), NOSPLIT, $0-56
	MOVQ x+0(FP), AX
	MOVQ 0(AX), R8
	MOVQ 8(AX), R9
	MOVQ n+8(FP), DX
	MOVQ v+16(FP), DI
	MOVQ a+24(FP), SI
	MOVQ nu+32(FP), CX
	MOVQ c+40(FP), AX
	MOVQ out+48(FP), BX
	VXORPD X0, X0, X0
	VXORPD X1, X1, X1
	VXORPD X2, X2, X2
	VXORPD X3, X3, X3
	VXORPD X4, X4, X4
	VXORPD X5, X5, X5
	VXORPD X6, X6, X6
	VXORPD X7, X7, X7
	VXORPD X8, X8, X8
	VXORPD X9, X9, X9
	VXORPD X10, X10, X10
	XORQ R12, R12
	TESTQ CX, CX
	JEQ gdone

gloop:
	// The two lanes' values of unit u, and their sum.
	VMOVSD (R8)(R12*8), X11
	VMOVHPD (R9)(R12*8), X11, X11
	VADDPD X11, X10, X10
	// P: value > nz; N: value < −nz (false for NaN).
	VCMPPD $0x1e, 0(AX), X11, X12
	VCMPPD $0x11, 16(AX), X11, X13
	// The positive units' sums: +0 added for the others.
	VMOVDDUP (DX)(R12*8), X14
	VANDPD X12, X14, X15
	VADDPD X15, X0, X0
	VMOVDDUP (DI)(R12*8), X14
	VANDPD X12, X14, X15
	VADDPD X15, X1, X1
	VMOVDDUP (SI)(R12*8), X14
	VANDPD X12, X14, X15
	VADDPD X15, X2, X2
	// The counts.
	VANDPD 48(AX), X12, X15
	VADDPD X15, X8, X8
	VANDPD 48(AX), X13, X15
	VADDPD X15, X9, X9
	// The largest sizes.
	VANDPD 32(AX), X11, X15
	VANDPD X12, X15, X14
	VMAXPD X6, X14, X6
	VANDPD X13, X15, X15
	VMAXPD X7, X15, X7
	// The round-off units (neither P nor N), rare: their sums, in a
	// lane with one (ground), the other's +0 added.
	VORPD X12, X13, X12
	VMOVMSKPD X12, R13
	CMPQ R13, $3
	JNE ground

gnext:
	INCQ R12
	CMPQ R12, CX
	JNE gloop

gdone:
	VMOVUPD X0, 0(BX)
	VMOVUPD X1, 16(BX)
	VMOVUPD X2, 32(BX)
	VMOVUPD X3, 48(BX)
	VMOVUPD X4, 64(BX)
	VMOVUPD X5, 80(BX)
	VMOVUPD X6, 96(BX)
	VMOVUPD X7, 112(BX)
	VMOVUPD X8, 128(BX)
	VMOVUPD X9, 144(BX)
	VMOVUPD X10, 160(BX)
	RET

ground:
	VMOVDDUP (DX)(R12*8), X14
	VANDNPD X14, X12, X15
	VADDPD X15, X3, X3
	VMOVDDUP (DI)(R12*8), X14
	VANDNPD X14, X12, X15
	VADDPD X15, X4, X4
	VMOVDDUP (SI)(R12*8), X14
	VANDNPD X14, X12, X15
	VADDPD X15, X5, X5
	JMP gnext

// func cpuid(eaxArg, ecxArg uint32) (eax, ebx, ecx, edx uint32)
TEXT ·cpuid(SB), NOSPLIT, $0-24
	MOVL eaxArg+0(FP), AX
	MOVL ecxArg+4(FP), CX
	CPUID
	MOVL AX, eax+8(FP)
	MOVL BX, ebx+12(FP)
	MOVL CX, ecx+16(FP)
	MOVL DX, edx+20(FP)
	RET

// func xgetbv() (eax, edx uint32)
TEXT ·xgetbv(SB), NOSPLIT, $0-8
	MOVL $0, CX
	XGETBV
	MOVL AX, eax+0(FP)
	MOVL DX, edx+4(FP)
	RET

// func signSumsAVX(rows *[4]*float64, n, v *float64, nu int, c *signConsts, out *[10][4]float64)
//
// c: nz at 0, −nz at 32, the mask of a size at 64, ones at 96 (four
// lanes each). out: the positive units' sums of n, v and M, the round-off
// units' sums of the same, the largest size of the positive and of the
// negative units, and the counts of each.
TEXT ·signSumsAVX(SB), NOSPLIT, $0-48
	MOVQ rows+0(FP), AX
	MOVQ 0(AX), R8
	MOVQ 8(AX), R9
	MOVQ 16(AX), R10
	MOVQ 24(AX), R11
	MOVQ n+8(FP), SI
	MOVQ v+16(FP), DI
	MOVQ nu+24(FP), CX
	MOVQ c+32(FP), AX
	MOVQ out+40(FP), BX
	VXORPD Y0, Y0, Y0
	VXORPD Y1, Y1, Y1
	VXORPD Y2, Y2, Y2
	VXORPD Y3, Y3, Y3
	VXORPD Y4, Y4, Y4
	VXORPD Y5, Y5, Y5
	VXORPD Y6, Y6, Y6
	VXORPD Y7, Y7, Y7
	VXORPD Y8, Y8, Y8
	VXORPD Y9, Y9, Y9
	XORQ R12, R12
	TESTQ CX, CX
	JEQ sdone

sloop:
	// The four stations' M of unit u.
	VMOVSD (R8)(R12*8), X10
	VMOVHPD (R9)(R12*8), X10, X10
	VMOVSD (R10)(R12*8), X11
	VMOVHPD (R11)(R12*8), X11, X11
	VINSERTF128 $1, X11, Y10, Y10
	// P: M > nz; N: M < −nz (false for NaN).
	VCMPPD $0x1e, 0(AX), Y10, Y11
	VCMPPD $0x11, 32(AX), Y10, Y12
	VBROADCASTSD (SI)(R12*8), Y13
	VBROADCASTSD (DI)(R12*8), Y14
	// The positive units' sums: +0 added for the others.
	VANDPD Y11, Y13, Y15
	VADDPD Y15, Y0, Y0
	VANDPD Y11, Y14, Y15
	VADDPD Y15, Y1, Y1
	VANDPD Y11, Y10, Y15
	VADDPD Y15, Y2, Y2
	// The counts.
	VANDPD 96(AX), Y11, Y15
	VADDPD Y15, Y8, Y8
	VANDPD 96(AX), Y12, Y15
	VADDPD Y15, Y9, Y9
	// The largest sizes.
	VANDPD 64(AX), Y10, Y15
	VANDPD Y11, Y15, Y11
	VMAXPD Y6, Y11, Y6
	VANDPD Y12, Y15, Y15
	VMAXPD Y7, Y15, Y7
	// The round-off units (neither P nor N), rare: their sums, in a
	// lane with one (sround), the others' +0 added.
	VCMPPD $0x1e, 0(AX), Y10, Y11
	VORPD Y11, Y12, Y11
	VMOVMSKPD Y11, R13
	CMPQ R13, $15
	JNE sround

snext:
	INCQ R12
	CMPQ R12, CX
	JNE sloop

sdone:
	VMOVUPD Y0, 0(BX)
	VMOVUPD Y1, 32(BX)
	VMOVUPD Y2, 64(BX)
	VMOVUPD Y3, 96(BX)
	VMOVUPD Y4, 128(BX)
	VMOVUPD Y5, 160(BX)
	VMOVUPD Y6, 192(BX)
	VMOVUPD Y7, 224(BX)
	VMOVUPD Y8, 256(BX)
	VMOVUPD Y9, 288(BX)
	VZEROUPPER
	RET

sround:
	VANDNPD Y13, Y11, Y15
	VADDPD Y15, Y3, Y3
	VANDNPD Y14, Y11, Y15
	VADDPD Y15, Y4, Y4
	VANDNPD Y10, Y11, Y15
	VADDPD Y15, Y5, Y5
	JMP snext

// func listReachingAVX(mv *float64, n int, t0, t1 float64, r0, r1 *int32, lt *laneTable) (n0, n1 int)
//
// lt: at 0, for each mask of four lanes, the lanes set, in order (four
// int32 each, 16 bytes a mask); at 256, how many are set (a byte each).
// A group of four units with some listed writes four indices at the end
// of each list, of which those listed count: the lists hold four entries
// more than the units.
TEXT ·listReachingAVX(SB), NOSPLIT, $0-72
	MOVQ mv+0(FP), SI
	MOVQ n+8(FP), CX
	VBROADCASTSD t0+16(FP), Y4
	VBROADCASTSD t1+24(FP), Y5
	VXORPD Y6, Y6, Y6
	VSUBPD Y5, Y6, Y5
	MOVQ r0+32(FP), DI
	MOVQ r1+40(FP), R8
	MOVQ lt+48(FP), R11
	XORQ R9, R9
	XORQ R10, R10
	XORQ R12, R12
	TESTQ CX, CX
	JEQ ldone

lloop:
	VMOVUPD (SI)(R12*8), Y0
	// M ≥ t0, and M ≤ −t1 (false for NaN).
	VCMPPD $0x1d, Y4, Y0, Y1
	VCMPPD $0x12, Y5, Y0, Y2
	VORPD Y1, Y2, Y3
	VMOVMSKPD Y3, AX
	TESTL AX, AX
	JNE lsome

lnext:
	ADDQ $4, R12
	CMPQ R12, CX
	JLT lloop

ldone:
	MOVQ R9, n0+56(FP)
	MOVQ R10, n1+64(FP)
	VZEROUPPER
	RET

lsome:
	// The group's first unit, in each lane.
	VMOVQ R12, X8
	VPSHUFD $0, X8, X8
	// To r0, the lanes where M ≥ t0, in order.
	VMOVMSKPD Y1, BX
	MOVQ BX, R13
	SHLQ $4, R13
	VMOVDQU (R11)(R13*1), X7
	VPADDD X8, X7, X7
	VMOVDQU X7, (DI)(R9*4)
	MOVBQZX 256(R11)(BX*1), BX
	ADDQ BX, R9
	// To r1, the lanes where M ≤ −t1.
	VMOVMSKPD Y2, BX
	MOVQ BX, R13
	SHLQ $4, R13
	VMOVDQU (R11)(R13*1), X7
	VPADDD X8, X7, X7
	VMOVDQU X7, (R8)(R10*4)
	MOVBQZX 256(R11)(BX*1), BX
	ADDQ BX, R10
	JMP lnext

// func largestFirstAVX(ends *[6]float64, n, v, a *float64, cnt int, c *bigConsts, big *[4]float64)
//
// c: the signs to flip (of g[0] and g[2]) at 0, the mask of a size (lanes
// 0 to 2; lane 3 cleared) at 32, the member's length l at 64. big: the
// largest sizes of N, V and M so far in lanes 0 to 2, and in lane 3 that
// of M again, which the sizes of M at the member's end raise.
TEXT ·largestFirstAVX(SB), NOSPLIT, $0-56
	MOVQ ends+0(FP), SI
	MOVQ n+8(FP), R8
	MOVQ v+16(FP), R9
	MOVQ a+24(FP), R10
	MOVQ cnt+32(FP), CX
	MOVQ c+40(FP), AX
	MOVQ big+48(FP), BX
	VMOVUPD 0(AX), Y8
	VMOVUPD 32(AX), Y9
	VMOVSD 64(AX), X10
	VMOVUPD 0(BX), Y6
	VMOVSD 24(BX), X7
	XORQ R12, R12
	TESTQ CX, CX
	JEQ bdone

bloop:
	// (x, y, z) = (−g[0], g[1], −g[2]), and g[3] in lane 3.
	VMOVUPD 0(SI), Y1
	VXORPD Y8, Y1, Y1
	VMOVSD X1, (R8)(R12*8)
	VMOVHPD X1, (R9)(R12*8)
	VEXTRACTF128 $1, Y1, X2
	VMOVSD X2, (R10)(R12*8)
	// Their sizes (lane 3 cleared: +0), the largest kept: VMAXPD gives
	// its second source, the running largest, unless the size is larger
	// (a NaN left out).
	VANDPD Y9, Y1, Y3
	VMAXPD Y6, Y3, Y6
	// M at the end: z + l·y, the product rounded, then added.
	VPERMILPD $1, X1, X4
	VMULSD X10, X4, X4
	VADDSD X4, X2, X4
	VANDPD X9, X4, X4
	VMAXSD X7, X4, X7
	ADDQ $48, SI
	INCQ R12
	CMPQ R12, CX
	JNE bloop

bdone:
	VMOVUPD Y6, 0(BX)
	VMOVSD X7, 24(BX)
	VZEROUPPER
	RET

// func classify3AVX(units *[3]float64, nu int, c *class3Consts, l0, l1, l2 *int32, out *class3Out) (k0, k1, k2 int)
//
// One unit at a time, its three components in lanes 0 to 2 (lane 3 +0):
// for each effect j the sums of the components of the units whose effect
// j is positive (lane q: component q), each a chain of its own in the
// order of the units. c: nz at 0, −nz at 32, the thresholds of the
// positive units at 64 and the negated ones of the negative units at 96,
// ones at 128, a lane per effect (lane 3: 0, 0, +Inf, −Inf, 0).
TEXT ·classify3AVX(SB), NOSPLIT, $0-80
	MOVQ units+0(FP), SI
	MOVQ nu+8(FP), CX
	MOVQ c+16(FP), AX
	MOVQ l0+24(FP), R8
	MOVQ l1+32(FP), R9
	MOVQ l2+40(FP), R10
	VXORPD Y0, Y0, Y0
	VXORPD Y1, Y1, Y1
	VXORPD Y2, Y2, Y2
	VXORPD Y3, Y3, Y3
	VXORPD Y4, Y4, Y4
	VXORPD Y5, Y5, Y5
	VXORPD Y6, Y6, Y6
	VXORPD Y7, Y7, Y7
	VXORPD Y8, Y8, Y8
	XORQ DI, DI
	XORQ R11, R11
	XORQ R12, R12
	XORQ R13, R13
	TESTQ CX, CX
	JEQ cdone

cloop:
	// The unit's components, lane 3 +0; their sums.
	VMOVUPD (SI), X9
	VMOVSD 16(SI), X12
	VINSERTF128 $1, X12, Y9, Y9
	VADDPD Y9, Y3, Y3
	// P: positive past the round-off; N: negative past it (false for
	// NaN).
	VCMPPD $0x1e, 0(AX), Y9, Y10
	VCMPPD $0x11, 32(AX), Y9, Y11
	// Listed for effect j: P and at least its threshold, or N and at
	// most its negated threshold.
	VCMPPD $0x1d, 64(AX), Y9, Y12
	VANDPD Y10, Y12, Y12
	VCMPPD $0x12, 96(AX), Y9, Y13
	VANDPD Y11, Y13, Y13
	VORPD Y12, Y13, Y12
	VMOVMSKPD Y12, DX
	MOVL DI, (R8)(R11*4)
	MOVL DI, (R9)(R12*4)
	MOVL DI, (R10)(R13*4)
	BTL $0, DX
	ADCQ $0, R11
	BTL $1, DX
	ADCQ $0, R12
	BTL $2, DX
	ADCQ $0, R13
	// The counts.
	VANDPD 128(AX), Y10, Y13
	VADDPD Y13, Y4, Y4
	VANDPD 128(AX), Y11, Y13
	VADDPD Y13, Y5, Y5
	// Effect j's P in every lane, the unit's components where it holds
	// (+0 elsewhere) to effect j's sums.
	VPERMILPD $0, Y10, Y12
	VPERM2F128 $0x00, Y12, Y12, Y13
	VANDPD Y9, Y13, Y13
	VADDPD Y13, Y0, Y0
	VPERM2F128 $0x11, Y12, Y12, Y13
	VANDPD Y9, Y13, Y13
	VADDPD Y13, Y2, Y2
	VPERMILPD $0xf, Y10, Y12
	VPERM2F128 $0x00, Y12, Y12, Y13
	VANDPD Y9, Y13, Y13
	VADDPD Y13, Y1, Y1
	// Round-off for some effect (neither P nor N): its sums, rare.
	VORPD Y10, Y11, Y12
	VMOVMSKPD Y12, DX
	ANDL $7, DX
	CMPL DX, $7
	JNE czero

cnext:
	ADDQ $24, SI
	INCQ DI
	CMPQ DI, CX
	JNE cloop

cdone:
	MOVQ out+48(FP), BX
	VMOVUPD Y0, 0(BX)
	VMOVUPD Y1, 32(BX)
	VMOVUPD Y2, 64(BX)
	VMOVUPD Y3, 96(BX)
	VMOVUPD Y4, 128(BX)
	VMOVUPD Y5, 160(BX)
	VMOVUPD Y6, 192(BX)
	VMOVUPD Y7, 224(BX)
	VMOVUPD Y8, 256(BX)
	MOVQ R11, k0+56(FP)
	MOVQ R12, k1+64(FP)
	MOVQ R13, k2+72(FP)
	VZEROUPPER
	RET

czero:
	// Effect j's round-off flag (not P|N) in every lane: the unit's
	// components where it holds (+0 elsewhere) to effect j's round-off
	// sums.
	VPERMILPD $0, Y12, Y13
	VPERM2F128 $0x00, Y13, Y13, Y14
	VANDNPD Y9, Y14, Y14
	VADDPD Y14, Y6, Y6
	VPERM2F128 $0x11, Y13, Y13, Y14
	VANDNPD Y9, Y14, Y14
	VADDPD Y14, Y8, Y8
	VPERMILPD $0xf, Y12, Y13
	VPERM2F128 $0x00, Y13, Y13, Y14
	VANDNPD Y9, Y14, Y14
	VADDPD Y14, Y7, Y7
	JMP cnext

// func largestSignsAVX(units *[3]float64, nu int, out *[3][4]float64)
//
// One unit at a time, its three components in lanes 0 to 2 (lane 3 +0):
// out[0] the largest of +0 and the units' values (VMAXPD gives its second
// source, the running largest, unless the value is larger: a NaN or −0
// left out), out[1] the smallest of +0 and them (VMINPD, likewise), out[2]
// all ones in a lane where some value is a NaN.
TEXT ·largestSignsAVX(SB), NOSPLIT, $0-24
	MOVQ units+0(FP), SI
	MOVQ nu+8(FP), CX
	MOVQ out+16(FP), BX
	VXORPD Y0, Y0, Y0
	VXORPD Y1, Y1, Y1
	VXORPD Y2, Y2, Y2
	TESTQ CX, CX
	JEQ gdone

gloop:
	VMOVUPD (SI), X9
	VMOVSD 16(SI), X12
	VINSERTF128 $1, X12, Y9, Y9
	VMAXPD Y0, Y9, Y0
	VMINPD Y1, Y9, Y1
	VCMPPD $3, Y9, Y9, Y10
	VORPD Y10, Y2, Y2
	ADDQ $24, SI
	DECQ CX
	JNE gloop

gdone:
	VMOVUPD Y0, 0(BX)
	VMOVUPD Y1, 32(BX)
	VMOVUPD Y2, 64(BX)
	VZEROUPPER
	RET
