#include "textflag.h"

// func reportUnitPairs(x []float64, inv, off float64) bool
//
// toReportUnit's conversion, x[i] = x[i]·inv − off, two values at a time
// with SSE2 (baseline on amd64): MULPD and SUBPD round each lane as the
// scalar multiplication and subtraction do. It returns whether any
// result is infinite or NaN (a sum of v − v, NaN once one is). An odd
// last value is left to the caller.
TEXT ·reportUnitPairs(SB), NOSPLIT, $0-41
	MOVQ x_base+0(FP), SI
	MOVQ x_len+8(FP), CX
	MOVSD inv+24(FP), X8
	UNPCKLPD X8, X8
	MOVSD off+32(FP), X9
	UNPCKLPD X9, X9
	XORPD X10, X10
	SHRQ $1, CX
	JZ   done
loop:
	MOVUPD (SI), X0
	MULPD X8, X0
	SUBPD X9, X0
	MOVUPD X0, (SI)
	MOVAPD X0, X1
	SUBPD X0, X1            // v − v: 0, or NaN for ±Inf and NaN
	ADDPD X1, X10
	ADDQ $16, SI
	DECQ CX
	JNZ  loop
done:
	CMPPD X10, X10, $3      // unordered: a lane that is NaN
	MOVMSKPD X10, AX
	TESTL AX, AX
	SETNE ret+40(FP)
	RET

// func nonFinitePairs(x []float64) bool
//
// Whether any of the leading even number of values of x is infinite or
// NaN (a sum of v − v), two at a time; x is not written.
TEXT ·nonFinitePairs(SB), NOSPLIT, $0-25
	MOVQ x_base+0(FP), SI
	MOVQ x_len+8(FP), CX
	XORPD X10, X10
	SHRQ $1, CX
	JZ   done
loop:
	MOVUPD (SI), X0
	MOVAPD X0, X1
	SUBPD X0, X1
	ADDPD X1, X10
	ADDQ $16, SI
	DECQ CX
	JNZ  loop
done:
	CMPPD X10, X10, $3
	MOVMSKPD X10, AX
	TESTL AX, AX
	SETNE ret+24(FP)
	RET
