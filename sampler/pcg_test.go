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

// TestUniformsSameAsOpen01: uniforms, two draws at a time, gives the
// values of open01 drawn one at a time from math/rand/v2's PCG, for even
// and odd lengths, and leaves the stream where they would.
func TestUniformsSameAsOpen01(t *testing.T) {
	t.Parallel()
	for _, n := range []int{0, 1, 2, 3, 7, 1000, 1001} {
		ref := rand.NewPCG(11, uint64(n))
		want := make([]float64, n)
		for i := range want {
			want[i] = (float64(ref.Uint64()>>11) + 0.5) * 0x1p-53 // open01's formula
		}
		p, got := newPCG(11, uint64(n)), make([]float64, n)
		uniforms(p, got)
		for i := range got {
			if got[i] != want[i] {
				t.Fatalf("n %d: value %d is %v, open01 of math/rand/v2's PCG gives %v", n, i, got[i], want[i])
			}
		}
		if p.Uint64() != ref.Uint64() {
			t.Fatalf("n %d: the stream parts after the values", n)
		}
	}
}
