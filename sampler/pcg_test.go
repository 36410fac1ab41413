package sampler

import (
	"math/rand/v2"
	"testing"
)

// TestPCGSameAsRandPCG holds the sampler's generator to math/rand/v2's PCG
// (docs/references.md §9), the reference it copies: for many seeds, the
// same draws whether taken one at a time (Uint64), two at once (next and
// next2 from one state), or by the look-ahead states taking one or two
// of them, mixed in a pseudo-random order, and the same state after them.
func TestPCGSameAsRandPCG(t *testing.T) {
	t.Parallel()
	for seed := range uint64(50) {
		s1, s2 := seed*0x9e3779b97f4a7c15, ^seed
		ref, p := rand.NewPCG(s1, s2), newPCG(s1, s2)
		var got, want []uint64
		for k := range 20_000 {
			switch (k ^ int(seed)) % 3 {
			case 0:
				got = append(got, p.Uint64())
			case 1:
				s1, s2 := p.next(), p.next2()
				*p = s2
				got = append(got, s1.out(), s2.out())
			case 2:
				a, b := p.next(), p.next2()
				if k%2 == 0 {
					*p = a
					got = append(got, a.out())
				} else {
					*p = b
					got = append(got, a.out(), b.out())
				}
			}
			for len(want) < len(got) {
				want = append(want, ref.Uint64())
			}
		}
		for i := range got {
			if got[i] != want[i] {
				t.Fatalf("seed %d: draw %d is %#x, math/rand/v2's PCG gives %#x", seed, i, got[i], want[i])
			}
		}
		if p.Uint64() != ref.Uint64() {
			t.Fatalf("seed %d: the states part after %d draws", seed, len(got))
		}
	}
}
