#include "textflag.h"

// func planeRow128Asm(acc *uint64, lp uint64, a int64, lq *uint32, c *int64, n int)
//
// For j = 0..n-1: the signed 128-bit product a*c[j] (one-operand IMULQ) is
// added to the accumulator pair at acc[2*(lp+lq[j])], acc[2*(lp+lq[j])+1]
// (low word first). The caller has checked that every index is in range.
TEXT ·planeRow128Asm(SB), NOSPLIT, $0-48
	MOVQ acc+0(FP), DI
	MOVQ lp+8(FP), R8
	MOVQ a+16(FP), R9
	MOVQ lq+24(FP), SI
	MOVQ c+32(FP), BX
	MOVQ n+40(FP), CX
	XORQ R10, R10
	TESTQ CX, CX
	JLE done

loop:
	MOVLQZX (SI)(R10*4), R11
	ADDQ R8, R11
	SHLQ $4, R11
	MOVQ (BX)(R10*8), AX
	IMULQ R9
	ADDQ AX, (DI)(R11*1)
	ADCQ DX, 8(DI)(R11*1)
	INCQ R10
	CMPQ R10, CX
	JLT loop

done:
	RET
