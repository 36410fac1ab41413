package sampler

import "math/bits"

// pcg is math/rand/v2's PCG, the same stream bit for bit: a 128-bit linear
// congruential state s ← a·s + c (mod 2^128) and the DXSM output of each
// new state (O'Neill 2014; docs/references.md §9). Written out here so
// that a loop can take two draws at the cost of one step of the state:
// the next two states are a·s + c and a²·s + (a + 1)·c, both from s, and
// so computed side by side instead of one after the other (the jump-ahead
// of an LCG, Brown 1994, "Random number generation with arbitrary
// strides", docs/references.md §9). A rand.PCG seeded (seed1, seed2)
// starts from s = seed1·2^64 + seed2, as newPCG does.
type pcg struct{ hi, lo uint64 }

// The multiplier a and increment c of rand.PCG, and for two steps at
// once a² and (a + 1)·c (mod 2^128), worked out by the compiler's exact
// constant arithmetic.
const (
	pcgMul  = 2549297995355413924<<64 | 4865540595714422341
	pcgInc  = 6364136223846793005<<64 | 1442695040888963407
	mod128  = 1 << 128
	pcgMul2 = pcgMul * pcgMul % mod128
	pcgInc2 = (pcgMul + 1) * pcgInc % mod128

	pcgMulHi, pcgMulLo   = pcgMul >> 64, pcgMul % (1 << 64)
	pcgIncHi, pcgIncLo   = pcgInc >> 64, pcgInc % (1 << 64)
	pcgMul2Hi, pcgMul2Lo = pcgMul2 >> 64, pcgMul2 % (1 << 64)
	pcgInc2Hi, pcgInc2Lo = pcgInc2 >> 64, pcgInc2 % (1 << 64)
)

// newPCG returns the generator of rand.NewPCG(seed1, seed2).
func newPCG(seed1, seed2 uint64) *pcg { return &pcg{seed1, seed2} }

// mulAdd returns m·s + c (mod 2^128), each as high and low words.
func mulAdd(sHi, sLo, mHi, mLo, cHi, cLo uint64) (hi, lo uint64) {
	hi, lo = bits.Mul64(sLo, mLo)
	hi += sHi*mLo + sLo*mHi
	lo, carry := bits.Add64(lo, cLo, 0)
	hi, _ = bits.Add64(hi, cHi, carry)
	return hi, lo
}

// dxsm returns the draw of state (hi, lo): rand.PCG's output function.
func dxsm(hi, lo uint64) uint64 {
	const cheapMul = 0xda942042e4dd58b5
	hi ^= hi >> 32
	hi *= cheapMul
	hi ^= hi >> 48
	return hi * (lo | 1)
}

// Uint64 returns the next draw, as rand.PCG.Uint64.
func (p *pcg) Uint64() uint64 {
	*p = p.next()
	return p.out()
}

// next returns the state one draw after p's.
func (p pcg) next() pcg {
	hi, lo := mulAdd(p.hi, p.lo, pcgMulHi, pcgMulLo, pcgIncHi, pcgIncLo)
	return pcg{hi, lo}
}

// next2 returns the state two draws after p's, in one step. A loop that
// takes s.next() and s.next2() from the same s has two draws for the
// wait of one step; keeping s in a local value, rather than behind a
// pointer, keeps it in registers.
func (p pcg) next2() pcg {
	hi, lo := mulAdd(p.hi, p.lo, pcgMul2Hi, pcgMul2Lo, pcgInc2Hi, pcgInc2Lo)
	return pcg{hi, lo}
}

// out returns the draw of state p, the one taken on reaching it.
func (p pcg) out() uint64 { return dxsm(p.hi, p.lo) }
