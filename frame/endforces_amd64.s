//go:build amd64 && !purego

#include "textflag.h"

// ROW sets D to 0 + k[i][0]·u0 + … + k[i][5]·u5 (u in Y0 … Y5, k[i] at
// OFF(SI)), each product rounded, the sums in that order.
#define ROW(OFF, D) \
	VXORPD D, D, D \
	VBROADCASTSD (OFF+0)(SI), Y12 \
	VMULPD Y0, Y12, Y12 \
	VADDPD Y12, D, D \
	VBROADCASTSD (OFF+8)(SI), Y13 \
	VMULPD Y1, Y13, Y13 \
	VADDPD Y13, D, D \
	VBROADCASTSD (OFF+16)(SI), Y12 \
	VMULPD Y2, Y12, Y12 \
	VADDPD Y12, D, D \
	VBROADCASTSD (OFF+24)(SI), Y13 \
	VMULPD Y3, Y13, Y13 \
	VADDPD Y13, D, D \
	VBROADCASTSD (OFF+32)(SI), Y12 \
	VMULPD Y4, Y12, Y12 \
	VADDPD Y12, D, D \
	VBROADCASTSD (OFF+40)(SI), Y13 \
	VMULPD Y5, Y13, Y13 \
	VADDPD Y13, D, D

// PAIR stores A and B (four cases each) as the pairs dst[c][j], dst[c][j+1]
// of the four cases, OFF = 8j bytes into each case's 48.
#define PAIR(A, B, OFF) \
	VUNPCKLPD B, A, Y10 \
	VUNPCKHPD B, A, Y11 \
	VMOVUPD X10, (OFF)(DI) \
	VMOVUPD X11, (48+OFF)(DI) \
	VEXTRACTF128 $1, Y10, (96+OFF)(DI) \
	VEXTRACTF128 $1, Y11, (144+OFF)(DI)

// func endForces4(dst *[6]float64, r0, r1, r2, r3, r4, r5 *float64, n int, k *[6][6]float64, cs, sn float64, rows int, disp *[6]float64)
TEXT ·endForces4(SB), NOSPLIT, $0-104
	MOVQ dst+0(FP), DI
	MOVQ r0+8(FP), R8
	MOVQ r1+16(FP), R9
	MOVQ r2+24(FP), R10
	MOVQ r3+32(FP), R11
	MOVQ r4+40(FP), R12
	MOVQ r5+48(FP), R13
	MOVQ n+56(FP), CX
	MOVQ k+64(FP), SI
	VBROADCASTSD cs+72(FP), Y14
	VBROADCASTSD sn+80(FP), Y15
	MOVQ rows+88(FP), DX
	MOVQ disp+96(FP), BX
	XORQ AX, AX
	TESTQ CX, CX
	JE done

loop:
	// toLocal: u0 = cs·g0 + sn·g1, u1 = −sn·g0 + cs·g1 (as cs·g1 − sn·g0:
	// the same number), u2 = g2, and alike at the end.
	VMOVUPD (R8)(AX*1), Y6
	VMOVUPD (R9)(AX*1), Y7
	VMOVUPD (R10)(AX*1), Y2
	VMOVUPD (R11)(AX*1), Y8
	VMOVUPD (R12)(AX*1), Y9
	VMOVUPD (R13)(AX*1), Y5
	VMULPD Y6, Y14, Y0
	VMULPD Y7, Y15, Y10
	VADDPD Y10, Y0, Y0
	VMULPD Y7, Y14, Y1
	VMULPD Y6, Y15, Y11
	VSUBPD Y11, Y1, Y1
	VMULPD Y8, Y14, Y3
	VMULPD Y9, Y15, Y10
	VADDPD Y10, Y3, Y3
	VMULPD Y9, Y14, Y4
	VMULPD Y8, Y15, Y11
	VSUBPD Y11, Y4, Y4

	// The local displacements too, where disp is given.
	TESTQ BX, BX
	JE forces
	XCHGQ BX, DI
	PAIR(Y0, Y1, 0)
	PAIR(Y2, Y3, 16)
	PAIR(Y4, Y5, 32)
	XCHGQ BX, DI
	ADDQ $192, BX

forces:
	ROW(0, Y6)
	ROW(48, Y7)
	PAIR(Y6, Y7, 0)
	ROW(96, Y6)
	CMPQ DX, $3
	JE three
	ROW(144, Y7)
	PAIR(Y6, Y7, 16)
	ROW(192, Y6)
	ROW(240, Y7)
	PAIR(Y6, Y7, 32)
	JMP next

three:
	VXORPD Y7, Y7, Y7
	PAIR(Y6, Y7, 16)
	PAIR(Y7, Y7, 32)

next:
	ADDQ $32, AX
	ADDQ $192, DI
	DECQ CX
	JNZ loop

done:
	VZEROUPPER
	RET
