#include "textflag.h"

// func triangularPairs(ps []float64, k *[6]float64) int
//
// Triangular.Quantiles two values at a time with SSE2 (baseline on
// amd64), each lane with the scalar formula's operations in its order:
// min + √((p·ba)·ca) for p < f, else max − √(((1 − p)·ba)·bc), with
// k = {f, ba, ca, bc, min, max}; MULPD, SUBPD, ADDPD and SQRTPD round each
// lane as their scalar forms do. It stops before the first pair holding
// a p below 0 or above 1 and returns how many values it replaced (even);
// an odd last value is left too.
TEXT ·triangularPairs(SB), NOSPLIT, $0-40
	MOVQ ps_base+0(FP), SI
	MOVQ ps_len+8(FP), CX
	MOVQ k+24(FP), DI
	SHRQ $1, CX
	XORQ AX, AX
	TESTQ CX, CX
	JZ   done
	MOVSD 0(DI), X8
	UNPCKLPD X8, X8         // f
	MOVSD 8(DI), X9
	UNPCKLPD X9, X9         // ba
	MOVSD 16(DI), X10
	UNPCKLPD X10, X10       // ca
	MOVSD 24(DI), X11
	UNPCKLPD X11, X11       // bc
	MOVSD 32(DI), X12
	UNPCKLPD X12, X12       // min
	MOVSD 40(DI), X13
	UNPCKLPD X13, X13       // max
	MOVQ $0x3ff0000000000000, DX
	MOVQ DX, X14
	UNPCKLPD X14, X14       // 1
	XORPD X15, X15          // 0
loop:
	MOVUPD (SI), X0         // p
	MOVAPD X0, X1
	CMPPD X15, X1, $1       // p < 0
	MOVAPD X14, X2
	CMPPD X0, X2, $1        // 1 < p
	ORPD X2, X1
	MOVMSKPD X1, DX
	TESTL DX, DX
	JNZ  done               // a p out of range: left to the caller
	MOVAPD X0, X1
	CMPPD X8, X1, $1        // mask: p < f
	MOVAPD X0, X2
	MULPD X9, X2
	MULPD X10, X2           // (p·ba)·ca
	MOVAPD X14, X3
	SUBPD X0, X3
	MULPD X9, X3
	MULPD X11, X3           // ((1 − p)·ba)·bc
	ANDPD X1, X2
	MOVAPD X1, X4
	ANDNPD X3, X4
	ORPD X4, X2             // the argument of each lane's branch
	SQRTPD X2, X2
	MOVAPD X12, X5
	ADDPD X2, X5            // min + r
	MOVAPD X13, X6
	SUBPD X2, X6            // max − r
	ANDPD X1, X5
	ANDNPD X6, X1
	ORPD X5, X1
	MOVUPD X1, (SI)
	ADDQ $16, SI
	ADDQ $2, AX
	DECQ CX
	JNZ  loop
done:
	MOVQ AX, ret+32(FP)
	RET
