package sampler

import (
	"cmp"
	"errors"
	"fmt"
	"math"
	"math/bits"
	"math/rand/v2"
	"slices"
	"strings"
	"sync"

	"gonum.org/v1/gonum/floats"
	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat/distuv"

	"rockheat/stats/radix"
)

// Pair is a target Spearman rank correlation between the sampled inputs
// named A and B. Rank is dimensionless, in [−1, 1]; the order of A and B
// does not matter.
type Pair struct {
	A, B string
	Rank float64
}

// maxTriples caps the number of inconsistent triples one error lists.
const maxTriples = 10

// BuildCorrelation returns the k×k target rank correlation matrix of the
// sampled inputs names (k = len(names), in column order) from the pairs
// the user gave: the diagonal is 1, each pair's Rank sits at its two
// symmetric places, and every pair not given is 0.
//
// The pairs are user input, so every problem is an error, and all of them
// are reported together (joined with errors.Join), each naming its inputs:
// an unknown name (the message lists the valid names), an input paired
// with itself, a pair given more than once (in either order), and a Rank
// that is NaN or outside [−1, 1]. Once every pair is valid, the matrix
// must be positive definite, since no set of inputs can have rank
// correlations that are not; when it is not, the error names the
// correlations that cannot hold together (a pair at ±1, each inconsistent
// triple, or else the pairs weighing most in the matrix's smallest
// eigenvector) and asks to weaken them. Deciding which inputs may be
// correlated at all (fixed values may not) is left to the caller.
//
// With no names (and so no valid pairs) it returns a nil matrix and no
// error. BuildCorrelation panics if names holds a name twice.
func BuildCorrelation(names []string, pairs []Pair) (*mat.SymDense, error) {
	k := len(names)
	index := make(map[string]int, k)
	for i, name := range names {
		if _, dup := index[name]; dup {
			panic(fmt.Sprintf("sampler: BuildCorrelation with input %q named twice", name))
		}
		index[name] = i
	}
	var errs []error
	given := make(map[[2]int]float64, len(pairs))
	for _, p := range pairs {
		label := fmt.Sprintf("rank correlation %s–%s", quote(p.A), quote(p.B))
		var unknown []string
		for _, name := range []string{p.A, p.B} {
			if _, ok := index[name]; !ok && !slices.Contains(unknown, name) {
				unknown = append(unknown, name)
			}
		}
		if len(unknown) > 0 {
			noun := "input"
			if len(unknown) > 1 {
				noun = "inputs"
			}
			errs = append(errs, fmt.Errorf("%s: unknown %s %s; %s",
				label, noun, strings.Join(quoteAll(unknown), " and "), validNames(names)))
			continue
		}
		if p.A == p.B {
			errs = append(errs, fmt.Errorf("%s: an input is paired with itself; its correlation with itself is always 1, so name two different inputs", label))
			continue
		}
		if math.IsNaN(p.Rank) {
			errs = append(errs, fmt.Errorf("%s is NaN; give a number in [-1, 1]", label))
			continue
		}
		if p.Rank < -1 || p.Rank > 1 {
			errs = append(errs, fmt.Errorf("%s = %g is outside [-1, 1]; give a number in [-1, 1]", label, p.Rank))
			continue
		}
		i, j := index[p.A], index[p.B]
		key := [2]int{min(i, j), max(i, j)}
		if first, dup := given[key]; dup {
			errs = append(errs, fmt.Errorf("%s is given more than once (%g, then %g); give each pair once", label, first, p.Rank))
			continue
		}
		given[key] = p.Rank
	}
	if len(errs) > 0 {
		return nil, errors.Join(errs...)
	}
	if k == 0 {
		return nil, nil
	}
	c := mat.NewSymDense(k, nil)
	for i := range k {
		c.SetSym(i, i, 1)
	}
	for key, r := range given {
		c.SetSym(key[0], key[1], r)
	}

	var chol mat.Cholesky
	if chol.Factorize(c) {
		return c, nil
	}
	return nil, notPositiveDefinite(names, c)
}

// notPositiveDefinite explains why the correlation matrix c of names is not
// positive definite. It looks for the smallest sub-matrices that are not:
// pairs at ±1, then triples; if every 2×2 and 3×3 principal sub-matrix is
// positive definite, it names the pairs contributing most to the quadratic
// form vᵀ·c·v of the eigenvector v of the smallest eigenvalue.
func notPositiveDefinite(names []string, c *mat.SymDense) error {
	k := len(names)
	const fix = "a set of rank correlations must form a positive-definite matrix"
	pair := func(i, j int) string {
		return fmt.Sprintf("%s–%s %g", quote(names[i]), quote(names[j]), c.At(i, j))
	}

	var errs []error
	for i := range k {
		for j := i + 1; j < k; j++ {
			if math.Abs(c.At(i, j)) >= 1 {
				errs = append(errs, fmt.Errorf("rank correlation %s: ±1 would make one input a copy of the other up to order, and the matrix singular (%s); use a magnitude below 1, such as 0.99",
					pair(i, j), fix))
			}
		}
	}
	if len(errs) > 0 {
		return errors.Join(errs...)
	}

	// A 3×3 correlation matrix with off-diagonal a, b, d (all |·| < 1 here) is
	// positive definite iff its determinant 1 + 2abd − a² − b² − d² is
	// positive (Sylvester's criterion; its 2×2 minors 1 − a² are positive).
	var triples []string
	more := 0
	for i := range k {
		for j := i + 1; j < k; j++ {
			for l := j + 1; l < k; l++ {
				a, b, d := c.At(i, j), c.At(j, l), c.At(i, l)
				if 1+2*a*b*d-a*a-b*b-d*d > 0 {
					continue
				}
				if len(triples) == maxTriples {
					more++
					continue
				}
				triples = append(triples, fmt.Sprintf("%s, %s, %s", pair(i, j), pair(j, l), pair(i, l)))
			}
		}
	}
	if len(triples) > 0 {
		msg := fmt.Sprintf("rank correlations cannot hold together (%s): %s",
			fix, strings.Join(triples, "; "))
		if more > 0 {
			msg += fmt.Sprintf("; and %d more such triples", more)
		}
		return errors.New(msg + "; weaken one or more correlations of each triple (a correlation not given counts as 0)")
	}

	var eig mat.EigenSym
	if !eig.Factorize(c, true) {
		return fmt.Errorf("rank correlations cannot hold together (%s); weaken the strongest ones", fix)
	}
	values := eig.Values(nil)
	var vecs mat.Dense
	eig.VectorsTo(&vecs)
	lo := 0 // index of the smallest eigenvalue
	for i, v := range values {
		if v < values[lo] {
			lo = i
		}
	}
	type term struct {
		i, j int
		w    float64
	}
	var terms []term
	for i := range k {
		for j := i + 1; j < k; j++ {
			// Contribution of pair (i, j) to vᵀ·c·v; the negative ones
			// pull the smallest eigenvalue below zero.
			w := 2 * c.At(i, j) * vecs.At(i, lo) * vecs.At(j, lo)
			if w < 0 {
				terms = append(terms, term{i, j, w})
			}
		}
	}
	slices.SortStableFunc(terms, func(x, y term) int { return cmp.Compare(x.w, y.w) })
	if len(terms) == 0 {
		return fmt.Errorf("rank correlations cannot hold together (%s; smallest eigenvalue %.3g); weaken the strongest ones", fix, values[lo])
	}
	var named []string
	for _, t := range terms {
		if len(named) == 6 || t.w > 0.1*terms[0].w {
			break
		}
		named = append(named, pair(t.i, t.j))
	}
	return fmt.Errorf("rank correlations cannot hold together (%s; smallest eigenvalue %.3g); the pairs contributing most are %s; weaken them",
		fix, values[lo], strings.Join(named, ", "))
}

func quote(s string) string { return fmt.Sprintf("%q", s) }

func quoteAll(s []string) []string {
	q := make([]string, len(s))
	for i, v := range s {
		q[i] = quote(v)
	}
	return q
}

func validNames(names []string) string {
	if len(names) == 0 {
		return "there are no sampled inputs (every input is fixed)"
	}
	return "the sampled inputs are " + strings.Join(quoteAll(names), ", ")
}

// ImanConover rearranges the sample columns in place so that their rank
// correlation matrix approaches target, by the method of Iman & Conover
// (1982, "A distribution-free approach to inducing rank correlation among
// input variables", Commun. Statist. – Simul. Comput. 11(3):311–334).
//
// cols[j] holds the n draws of input j; all columns must have the same
// length. target is the k×k rank correlation matrix with k = len(cols),
// usually built by BuildCorrelation; it must be positive definite (a
// positive-definite covariance matrix acts as its correlation matrix).
// Only the order of each column changes: each column ends as a
// permutation of its own values, so every input's marginal distribution
// is exactly kept. The result depends only on the values in each column
// (not on their order) and on rng, which is advanced; so it is
// deterministic for a given rng state, and it suits Latin hypercube and
// plain random draws alike.
//
// Method: a scores matrix S has k columns, each a random permutation
// (drawn from rng) of the van der Waerden scores Φ⁻¹(i/(n+1)), i = 1…n.
// With E the sample correlation matrix of S, E = Q·Qᵀ and target = P·Pᵀ
// their Cholesky factorisations, T = S·(Q⁻¹)ᵀ·Pᵀ has sample correlation
// exactly target (Iman & Conover's correction for the scores' chance
// correlation). Each column j is then reordered so that its
// ranks match those of T's column j.
//
// The rank correlation achieved is approximate. Its spread around the
// expected value shrinks as 1/√n (roughly (1−ρ²)/√(n−1) for Spearman's
// rho, less here since T's correlation is exact); and, since T is close to
// multivariate normal, the expected Spearman correlation is
// (6/π)·asin(ρ/2) for a target ρ (Pearson 1907), which is slightly smaller
// in magnitude: by at most 0.018, near |ρ| = 0.6.
//
// When the scores' correlation is singular (always so when n ≤ k) it
// cannot be corrected for; the scores are then used uncorrected, T = S·Pᵀ, which is as close
// as so few trials allow. Columns of fewer than two draws, or fewer than
// two columns, are left as they are.
//
// The cost is O(n·k² + k·n·log n) time and (k+5)·n words of scratch
// memory. ImanConover returns an error if target is not positive
// definite, and panics if its size is not k×k or the columns' lengths
// differ.
func ImanConover(cols [][]float64, target *mat.SymDense, rng *rand.Rand) error {
	k := len(cols)
	if k == 0 {
		return nil
	}
	if target.SymmetricDim() != k {
		panic(fmt.Sprintf("sampler: ImanConover with %d columns and a %d×%d target", k, target.SymmetricDim(), target.SymmetricDim()))
	}
	n := len(cols[0])
	for j, col := range cols {
		if len(col) != n {
			panic(fmt.Sprintf("sampler: ImanConover column %d has %d draws, column 0 has %d", j, len(col), n))
		}
	}
	var cholP mat.Cholesky
	if !cholP.Factorize(target) {
		return errors.New("sampler: target rank correlation matrix is not positive definite; build it with BuildCorrelation")
	}
	if k < 2 || n < 2 {
		return nil
	}

	sc := newICScratch(n, k)
	defer icScratches.Put(sc)
	scores := sc.scores
	s := make([][]float64, k)
	backing := sc.backing[:n*k]
	for j := range s {
		s[j] = backing[j*n : (j+1)*n : (j+1)*n]
		copy(s[j], scores)
		col := s[j]
		rng.Shuffle(n, func(a, b int) { col[a], col[b] = col[b], col[a] })
	}

	// Upper Cholesky factors: target = Uₚᵀ·Uₚ (Pᵀ = Uₚ), E = Uₑᵀ·Uₑ
	// (Q⁻ᵀ = Uₑ⁻¹). The transform is then T = S·M with M = Uₑ⁻¹·Uₚ,
	// upper triangular, so column j of T mixes score columns 0…j only.
	var up, ue mat.TriDense
	cholP.UTo(&up)
	m := mat.NewDense(k, k, nil)
	e := mat.NewSymDense(k, nil)
	ss := floats.Dot(scores, scores) // every column has the same sum of squares
	for i := range k {
		for j := i; j < k; j++ {
			e.SetSym(i, j, floats.Dot(s[i], s[j])/ss)
		}
	}
	var cholE mat.Cholesky
	if cholE.Factorize(e) {
		cholE.UTo(&ue)
		// Solve Uₑ·M = Uₚ by back substitution, column by column.
		for j := range k {
			for i := j; i >= 0; i-- {
				v := up.At(i, j)
				for l := i + 1; l <= j; l++ {
					v -= ue.At(i, l) * m.At(l, j)
				}
				m.Set(i, j, v/ue.At(i, i))
			}
		}
	} else {
		m.Copy(&up) // n ≤ k: no correction is possible
	}

	// Rank T's column by sorting keys that hold its values' order in the
	// high bits and the row in the low idxBits bits; the row's whole bytes
	// need not be sorted, since the keys start in row order and the sort
	// is stable. Values that agree in their top 64 − idxBits order bits (a
	// relative difference below about 2⁻³⁵ for n ≤ 2¹⁶) are ranked by
	// row, which is itself random.
	idxBits := bits.Len(uint(n - 1))
	rowMask := uint64(1)<<idxBits - 1
	t, keys, vals, buf := sc.t, sc.keys, sc.vals, sc.buf
	defer func() { sc.keys, sc.vals, sc.buf = keys, vals, buf }() // the sorts swap them round
	for j, col := range cols {
		clear(t)
		for i := 0; i <= j; i++ {
			floats.AddScaled(t, m.At(i, j), s[i])
		}
		for i, v := range t {
			keys[i] = radix.Key(v)&^rowMask | uint64(i)
		}
		keys, buf = sortInPlace(keys, buf, idxBits/8)
		sorted := true // a column drawn in stratum order needs no sort
		for i, v := range col {
			vals[i] = radix.Key(v)
			sorted = sorted && (i == 0 || vals[i-1] <= vals[i])
		}
		if !sorted {
			vals, buf = sortInPlace(vals, buf, 0)
		}
		for r, key := range keys {
			col[key&rowMask] = radix.Float(vals[r])
		}
	}
	return nil
}

// icScratch is the scratch memory of an ImanConover of n trials, kept
// for the next one in icScratches, with the n scores it starts from.
type icScratch struct {
	n               int
	scores          []float64 // van der Waerden scores, exactly antisymmetric so that their mean is 0
	backing, t      []float64
	keys, vals, buf []uint64
}

var icScratches sync.Pool // *icScratch

// newICScratch returns scratch for k columns of n trials, from
// icScratches when it has some; scores are computed again only for a new
// n.
func newICScratch(n, k int) *icScratch {
	sc, _ := icScratches.Get().(*icScratch)
	if sc == nil {
		sc = &icScratch{}
	}
	if sc.n != n {
		sc.n = n
		sc.scores = make([]float64, n)
		for i := range n / 2 {
			z := distuv.UnitNormal.Quantile(float64(i+1) / float64(n+1))
			sc.scores[i], sc.scores[n-1-i] = z, -z
		}
		sc.t = make([]float64, n)
		sc.keys, sc.vals, sc.buf = make([]uint64, n), make([]uint64, n), make([]uint64, n)
	}
	if len(sc.backing) < n*k {
		sc.backing = make([]float64, n*k)
	}
	return sc
}

// sortInPlace sorts x on its bytes from … 7 (radix.Sort) and returns it
// sorted with the other buffer as scratch, so that the two can swap roles.
func sortInPlace(x, buf []uint64, from int) (sorted, scratch []uint64) {
	sorted, _ = radix.Sort(x, buf, from, nil, nil)
	if &sorted[0] == &x[0] {
		return x, buf
	}
	return buf, x
}
