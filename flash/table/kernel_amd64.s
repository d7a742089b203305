#include "textflag.h"

// func evalVec(wx, wy *[4]float64, d0, d1 *float64, e0, e1 *float32, out *[maxProps]float64)
//
// The bicubic sums of eval for the six properties of a cell, four
// products at a time. wx and wy are the Hermite bases in x and η (value
// and derivative weights of the cell's first node, then of its second);
// d0 and d1 point at node (i, j) and (i+1, j) of the float64 data (a node
// is 12 float64, 96 bytes; node (i, j+1) follows), e0 and e1 at the same
// nodes of the float32 data (12 float32, 48 bytes).
//
// The weights of corner (a, b) in the order of the node data (f, fx, fy,
// fxy) are X_a ⊙ Y_b with X_0 = (wx0, wx1, wx0, wx1), X_1 = (wx2, wx3,
// wx2, wx3), Y_0 = (wy0, wy0, wy1, wy1), Y_1 = (wy2, wy2, wy3, wy3). They
// are built from single-element loads: the bases were just stored one
// element at a time, and a wider load would wait for them.
TEXT ·evalVec(SB), NOSPLIT, $0-56
	MOVQ wx+0(FP), AX
	MOVQ wy+8(FP), R8
	MOVQ d0+16(FP), BX
	MOVQ d1+24(FP), CX
	MOVQ e0+32(FP), DX
	MOVQ e1+40(FP), SI
	MOVQ out+48(FP), DI
	VBROADCASTSD 0(AX), Y10
	VBROADCASTSD 8(AX), Y11
	VBLENDPD $10, Y11, Y10, Y12 // X_0
	VBROADCASTSD 16(AX), Y10
	VBROADCASTSD 24(AX), Y11
	VBLENDPD $10, Y11, Y10, Y13 // X_1
	VBROADCASTSD 0(R8), Y10
	VBROADCASTSD 8(R8), Y11
	VBLENDPD $12, Y11, Y10, Y14 // Y_0
	VBROADCASTSD 16(R8), Y10
	VBROADCASTSD 24(R8), Y11
	VBLENDPD $12, Y11, Y10, Y15 // Y_1
	VMULPD Y14, Y12, Y0 // (i, j)
	VMULPD Y15, Y12, Y1 // (i, j+1)
	VMULPD Y14, Y13, Y2 // (i+1, j)
	VMULPD Y15, Y13, Y3 // (i+1, j+1)

	VMULPD 0(BX), Y0, Y4
	VFMADD231PD 96(BX), Y1, Y4
	VFMADD231PD 0(CX), Y2, Y4
	VFMADD231PD 96(CX), Y3, Y4

	VMULPD 32(BX), Y0, Y5
	VFMADD231PD 128(BX), Y1, Y5
	VFMADD231PD 32(CX), Y2, Y5
	VFMADD231PD 128(CX), Y3, Y5

	VMULPD 64(BX), Y0, Y6
	VFMADD231PD 160(BX), Y1, Y6
	VFMADD231PD 64(CX), Y2, Y6
	VFMADD231PD 160(CX), Y3, Y6

	VCVTPS2PD 0(DX), Y10
	VMULPD Y10, Y0, Y7
	VCVTPS2PD 48(DX), Y11
	VFMADD231PD Y11, Y1, Y7
	VCVTPS2PD 0(SI), Y12
	VFMADD231PD Y12, Y2, Y7
	VCVTPS2PD 48(SI), Y13
	VFMADD231PD Y13, Y3, Y7

	VCVTPS2PD 16(DX), Y10
	VMULPD Y10, Y0, Y8
	VCVTPS2PD 64(DX), Y11
	VFMADD231PD Y11, Y1, Y8
	VCVTPS2PD 16(SI), Y12
	VFMADD231PD Y12, Y2, Y8
	VCVTPS2PD 64(SI), Y13
	VFMADD231PD Y13, Y3, Y8

	VCVTPS2PD 32(DX), Y10
	VMULPD Y10, Y0, Y9
	VCVTPS2PD 80(DX), Y11
	VFMADD231PD Y11, Y1, Y9
	VCVTPS2PD 32(SI), Y12
	VFMADD231PD Y12, Y2, Y9
	VCVTPS2PD 80(SI), Y13
	VFMADD231PD Y13, Y3, Y9

	// Horizontal sums, two accumulators at a time.
	VHADDPD Y5, Y4, Y4
	VEXTRACTF128 $1, Y4, X5
	VADDPD X5, X4, X4
	VMOVUPD X4, 0(DI)
	VHADDPD Y7, Y6, Y6
	VEXTRACTF128 $1, Y6, X7
	VADDPD X7, X6, X6
	VMOVUPD X6, 16(DI)
	VHADDPD Y9, Y8, Y8
	VEXTRACTF128 $1, Y8, X9
	VADDPD X9, X8, X8
	VMOVUPD X8, 32(DI)
	VZEROUPPER
	RET

// func cpuid(leaf, sub uint32) (a, b, c, d uint32)
TEXT ·cpuid(SB), NOSPLIT, $0-24
	MOVL leaf+0(FP), AX
	MOVL sub+4(FP), CX
	CPUID
	MOVL AX, a+8(FP)
	MOVL BX, b+12(FP)
	MOVL CX, c+16(FP)
	MOVL DX, d+20(FP)
	RET

// func xgetbv() (eax uint32)
TEXT ·xgetbv(SB), NOSPLIT, $0-4
	MOVL $0, CX
	XGETBV
	MOVL AX, eax+0(FP)
	RET
