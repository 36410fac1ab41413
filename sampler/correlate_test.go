package sampler

import (
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"gonum.org/v1/gonum/mat"
	"gonum.org/v1/gonum/stat"
	"gonum.org/v1/gonum/stat/distuv"
)

// ranks returns the ranks 1…n of x, ties sharing their mean rank.
func ranks(x []float64) []float64 {
	idx := make([]int, len(x))
	for i := range idx {
		idx[i] = i
	}
	slices.SortStableFunc(idx, func(a, b int) int { return cmpFloat(x[a], x[b]) })
	r := make([]float64, len(x))
	for lo := 0; lo < len(idx); {
		hi := lo + 1
		for hi < len(idx) && x[idx[hi]] == x[idx[lo]] {
			hi++
		}
		mean := float64(lo+hi+1) / 2 // mean of ranks lo+1 … hi
		for _, i := range idx[lo:hi] {
			r[i] = mean
		}
		lo = hi
	}
	return r
}

func cmpFloat(a, b float64) int {
	switch {
	case a < b:
		return -1
	case a > b:
		return 1
	}
	return 0
}

// spearman is Spearman's rank correlation: the Pearson correlation of the
// ranks (Spearman 1904; the definition).
func spearman(x, y []float64) float64 {
	return stat.Correlation(ranks(x), ranks(y), nil)
}

// marginal draws n values of one input's marginal distribution.
type marginal func(n int, rng *rand.Rand) []float64

func uniformDraws(n int, rng *rand.Rand) []float64 {
	d := distuv.Uniform{Min: 2, Max: 5, Src: rng}
	x := make([]float64, n)
	for i := range x {
		x[i] = d.Rand()
	}
	return x
}

// logNormalDraws is exp of a normal draw, a lognormal skewed to the right.
func logNormalDraws(n int, rng *rand.Rand) []float64 {
	d := distuv.Normal{Mu: 1, Sigma: 0.8, Src: rng}
	x := make([]float64, n)
	for i := range x {
		x[i] = math.Exp(d.Rand())
	}
	return x
}

func triangularDraws(n int, rng *rand.Rand) []float64 {
	d := distuv.NewTriangle(150, 320, 200, rng)
	x := make([]float64, n)
	for i := range x {
		x[i] = d.Rand()
	}
	return x
}

func clone(cols [][]float64) [][]float64 {
	c := make([][]float64, len(cols))
	for j, col := range cols {
		c[j] = slices.Clone(col)
	}
	return c
}

func mustBuild(t testing.TB, names []string, pairs []Pair) *mat.SymDense {
	t.Helper()
	c, err := BuildCorrelation(names, pairs)
	if err != nil {
		t.Fatalf("BuildCorrelation: %v", err)
	}
	return c
}

// TestImanConoverSpearman checks the achieved Spearman rank correlation
// against the target for n = 10,000, over three seeds, with inputs of
// different marginals given in random order or sorted (as strata in order
// would be).
//
// Two tolerances are checked for each pair with target ρ:
//   - |ρₛ − (6/π)·asin(ρ/2)| ≤ 3·SE, SE = (1 − ρ²)/√(n − 1). The scores T
//     are close to multivariate normal with Pearson correlation exactly ρ,
//     and a bivariate normal with correlation ρ has Spearman correlation
//     (6/π)·asin(ρ/2) (Pearson 1907, from memory); SE is the standard error
//     of Spearman's rho at n (from memory), an upper bound here since T's
//     Pearson correlation has no sampling error.
//   - |ρₛ − ρ| ≤ 0.03: the method's bias, |ρ − (6/π)·asin(ρ/2)| ≤ 0.018
//     (largest near |ρ| = 0.59; derived from the formula above), plus 3·SE
//     ≤ 0.01 at n = 10,000.
func TestImanConoverSpearman(t *testing.T) {
	t.Parallel()
	const n = 10000
	for _, tc := range []struct {
		name      string
		inputs    []string
		marginals []marginal
		pairs     []Pair
		sorted    bool // columns given sorted ascending instead of in draw order
	}{
		{
			name:      "two inputs at -0.6",
			inputs:    []string{"porosity", "area"},
			marginals: []marginal{uniformDraws, logNormalDraws},
			pairs:     []Pair{{"porosity", "area", -0.6}},
		},
		{
			name:      "two inputs at 0.8",
			inputs:    []string{"temperature", "thickness"},
			marginals: []marginal{triangularDraws, uniformDraws},
			pairs:     []Pair{{"thickness", "temperature", 0.8}},
		},
		{
			name:      "three inputs",
			inputs:    []string{"a", "b", "c"},
			marginals: []marginal{uniformDraws, logNormalDraws, triangularDraws},
			// Positive definite: det = 1 + 2(0.5)(0.2)(−0.3) − 0.25 − 0.04 − 0.09 = 0.56.
			pairs: []Pair{{"a", "b", 0.5}, {"b", "c", 0.2}, {"a", "c", -0.3}},
		},
		{
			name:      "four sorted inputs, two pairs unspecified",
			inputs:    []string{"a", "b", "c", "d"},
			marginals: []marginal{logNormalDraws, triangularDraws, uniformDraws, logNormalDraws},
			pairs:     []Pair{{"a", "b", 0.7}, {"c", "d", -0.4}, {"a", "d", 0.3}, {"b", "d", 0.6}},
			sorted:    true,
		},
	} {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			target := mustBuild(t, tc.inputs, tc.pairs)
			for seed := uint64(1); seed <= 3; seed++ {
				rng := rand.New(rand.NewPCG(seed, 2))
				cols := make([][]float64, len(tc.marginals))
				for j, draw := range tc.marginals {
					cols[j] = draw(n, rng)
					if tc.sorted {
						slices.Sort(cols[j])
					}
				}
				if err := ImanConover(cols, target, rng); err != nil {
					t.Fatalf("seed %d: %v", seed, err)
				}
				for i := range cols {
					for j := i + 1; j < len(cols); j++ {
						rho := target.At(i, j)
						got := spearman(cols[i], cols[j])
						se := (1 - rho*rho) / math.Sqrt(n-1)
						want := 6 / math.Pi * math.Asin(rho/2)
						if math.Abs(got-want) > 3*se {
							t.Errorf("seed %d, %s–%s: Spearman %.4f, want (6/π)·asin(ρ/2) = %.4f ± %.4f (target ρ = %g)",
								seed, tc.inputs[i], tc.inputs[j], got, want, 3*se, rho)
						}
						if math.Abs(got-rho) > 0.03 {
							t.Errorf("seed %d, %s–%s: Spearman %.4f, want target %g ± 0.03", seed, tc.inputs[i], tc.inputs[j], got, rho)
						}
					}
				}
			}
		})
	}
}

// TestImanConoverIdentity checks that an identity target (no pair given)
// removes even a perfect rank correlation in the input: the columns start
// sorted (Spearman 1 between any two) and must end with |ρₛ| within 3
// standard errors of 0, SE = 1/√(n − 1) (from memory).
func TestImanConoverIdentity(t *testing.T) {
	t.Parallel()
	const n = 10000
	rng := rand.New(rand.NewPCG(1, 2))
	cols := [][]float64{uniformDraws(n, rng), logNormalDraws(n, rng), triangularDraws(n, rng)}
	for _, col := range cols {
		slices.Sort(col)
	}
	if got := spearman(cols[0], cols[1]); got != 1 {
		t.Fatalf("sorted columns: Spearman %g before, want 1", got)
	}
	target := mustBuild(t, []string{"a", "b", "c"}, nil)
	if err := ImanConover(cols, target, rng); err != nil {
		t.Fatal(err)
	}
	tol := 3 / math.Sqrt(n-1)
	for i := range cols {
		for j := i + 1; j < len(cols); j++ {
			if got := spearman(cols[i], cols[j]); math.Abs(got) > tol {
				t.Errorf("columns %d, %d: Spearman %.4f, want 0 ± %.4f", i, j, got, tol)
			}
		}
	}
}

// TestImanConoverMarginals checks that each column ends as a permutation
// of its own values, bit for bit (the method only reorders: Iman & Conover
// 1982), including runs too short for the scores' correlation to be
// corrected (n ≤ k), tied values, and columns too short to rearrange.
func TestImanConoverMarginals(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name string
		n, k int
		ties bool
	}{
		{name: "n=5000 k=4", n: 5000, k: 4},
		{name: "n=5000 k=3 with ties", n: 5000, k: 3, ties: true},
		{name: "n=4 k=4", n: 4, k: 4},
		{name: "n=3 k=5", n: 3, k: 5},
		{name: "n=2 k=2", n: 2, k: 2},
		{name: "n=1 k=3", n: 1, k: 3},
		{name: "n=100 k=1", n: 100, k: 1},
	} {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			rng := rand.New(rand.NewPCG(1, 2))
			draws := []marginal{uniformDraws, logNormalDraws, triangularDraws}
			cols := make([][]float64, tc.k)
			names := make([]string, tc.k)
			var pairs []Pair
			for j := range cols {
				cols[j] = draws[j%len(draws)](tc.n, rng)
				if tc.ties {
					for i := range cols[j] {
						cols[j][i] = math.Round(cols[j][i])
					}
				}
				names[j] = fmt.Sprintf("x%d", j)
				if j > 0 {
					pairs = append(pairs, Pair{names[j-1], names[j], 0.4})
				}
			}
			before := clone(cols)
			if err := ImanConover(cols, mustBuild(t, names, pairs), rng); err != nil {
				t.Fatal(err)
			}
			for j := range cols {
				a, b := slices.Clone(before[j]), slices.Clone(cols[j])
				slices.Sort(a)
				slices.Sort(b)
				for i := range a {
					if math.Float64bits(a[i]) != math.Float64bits(b[i]) {
						t.Fatalf("column %d: sorted value %d is %v after, %v before", j, i, b[i], a[i])
					}
				}
			}
		})
	}
}

// TestImanConoverDeterministic checks that the result depends only on the
// rng's state and the values of each column: the same seed gives the same
// output bit for bit, whatever order the columns' values came in; another
// seed gives another arrangement.
func TestImanConoverDeterministic(t *testing.T) {
	t.Parallel()
	const n = 2000
	draw := rand.New(rand.NewPCG(1, 2))
	cols := [][]float64{uniformDraws(n, draw), logNormalDraws(n, draw), triangularDraws(n, draw)}
	target := mustBuild(t, []string{"a", "b", "c"}, []Pair{{"a", "b", 0.5}, {"b", "c", -0.5}})
	run := func(in [][]float64, seed uint64) [][]float64 {
		out := clone(in)
		if err := ImanConover(out, target, rand.New(rand.NewPCG(seed, 2))); err != nil {
			t.Fatal(err)
		}
		return out
	}
	shuffled := clone(cols)
	for _, col := range shuffled {
		draw.Shuffle(n, func(a, b int) { col[a], col[b] = col[b], col[a] })
	}
	first := run(cols, 7)
	for _, tc := range []struct {
		name string
		in   [][]float64
		seed uint64
		same bool
	}{
		{name: "same seed", in: cols, seed: 7, same: true},
		{name: "same seed, values shuffled first", in: shuffled, seed: 7, same: true},
		{name: "other seed", in: cols, seed: 8, same: false},
	} {
		got := run(tc.in, tc.seed)
		same := true
		for j := range got {
			for i := range got[j] {
				if math.Float64bits(got[j][i]) != math.Float64bits(first[j][i]) {
					same = false
				}
			}
		}
		if same != tc.same {
			t.Errorf("%s: output identical to first run = %v, want %v", tc.name, same, tc.same)
		}
	}
}

// TestImanConoverBadTarget checks that a target that is not positive
// definite is an error, not a silent result, and leaves the columns as
// they were.
func TestImanConoverBadTarget(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(1, 2))
	cols := [][]float64{uniformDraws(100, rng), uniformDraws(100, rng), uniformDraws(100, rng)}
	before := clone(cols)
	// det = 1 + 2(0.9)(0.9)(−0.9) − 3(0.81) < 0 (Sylvester's criterion).
	bad := mat.NewSymDense(3, []float64{1, 0.9, -0.9, 0.9, 1, 0.9, -0.9, 0.9, 1})
	if err := ImanConover(cols, bad, rng); err == nil || !strings.Contains(err.Error(), "not positive definite") {
		t.Errorf("error %v, want one saying the target is not positive definite", err)
	}
	for j := range cols {
		if !slices.Equal(cols[j], before[j]) {
			t.Errorf("column %d changed", j)
		}
	}
}

// TestImanConoverMisuse checks the panics for programming errors.
func TestImanConoverMisuse(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name   string
		cols   [][]float64
		target *mat.SymDense
	}{
		{"target too small", [][]float64{{1, 2}, {3, 4}, {5, 6}}, mat.NewSymDense(2, []float64{1, 0, 0, 1})},
		{"ragged columns", [][]float64{{1, 2, 3}, {3, 4}}, mat.NewSymDense(2, []float64{1, 0, 0, 1})},
	} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("%s: no panic", tc.name)
				}
			}()
			_ = ImanConover(tc.cols, tc.target, rand.New(rand.NewPCG(1, 2)))
		}()
	}
}

// TestBuildCorrelation checks the layout: names give the column order,
// pairs in either order fill both symmetric places, the diagonal is 1 and
// pairs not given are 0 (the definition of a correlation matrix).
func TestBuildCorrelation(t *testing.T) {
	t.Parallel()
	names := []string{"area", "thickness", "temperature", "porosity"}
	c := mustBuild(t, names, []Pair{
		{"temperature", "area", 0.4},
		{"thickness", "porosity", -0.25},
	})
	want := [][]float64{
		{1, 0, 0.4, 0},
		{0, 1, 0, -0.25},
		{0.4, 0, 1, 0},
		{0, -0.25, 0, 1},
	}
	for i := range want {
		for j := range want[i] {
			if got := c.At(i, j); got != want[i][j] {
				t.Errorf("c[%d][%d] = %g, want %g", i, j, got, want[i][j])
			}
		}
	}
	if c, err := BuildCorrelation(nil, nil); c != nil || err != nil {
		t.Errorf("no inputs: got %v, %v; want nil, nil", c, err)
	}
}

// TestBuildCorrelationErrors checks that each kind of bad user input is
// reported, naming the inputs, and that several problems are reported
// together. The non-positive-definite cases follow Sylvester's criterion
// (a 3×3 correlation matrix with off-diagonal a, b, d is positive definite
// iff 1 + 2abd − a² − b² − d² > 0) and the eigenvalues of the k×k matrix
// with every off-diagonal ρ, 1 + (k−1)ρ and 1 − ρ (a textbook result).
func TestBuildCorrelationErrors(t *testing.T) {
	t.Parallel()
	names := []string{"a", "b", "c", "d"}
	for _, tc := range []struct {
		name  string
		pairs []Pair
		want  []string // substrings of the error
	}{
		{
			name:  "inconsistent triple",
			pairs: []Pair{{"a", "b", 0.9}, {"b", "c", 0.9}, {"a", "c", -0.9}},
			// det = 1 − 1.458 − 2.43 < 0.
			want: []string{`"a"–"b" 0.9`, `"b"–"c" 0.9`, `"a"–"c" -0.9`, "cannot hold together", "weaken"},
		},
		{
			name:  "triple with an unspecified pair",
			pairs: []Pair{{"a", "b", 0.8}, {"b", "c", 0.8}},
			// det = 1 − 0.64 − 0.64 < 0, with ρ(a, c) = 0.
			want: []string{`"a"–"b" 0.8`, `"b"–"c" 0.8`, `"a"–"c" 0`, "not given counts as 0"},
		},
		{
			name: "four inputs, every triple consistent",
			// Every 3×3 is positive definite (−0.34 > −1/2) but the 4×4
			// is not: smallest eigenvalue 1 + 3(−0.34) = −0.02.
			pairs: []Pair{{"a", "b", -0.34}, {"a", "c", -0.34}, {"a", "d", -0.34},
				{"b", "c", -0.34}, {"b", "d", -0.34}, {"c", "d", -0.34}},
			want: []string{"smallest eigenvalue -0.02", `"a"–"b" -0.34`, `"c"–"d" -0.34`, "weaken"},
		},
		{
			name:  "rank of 1",
			pairs: []Pair{{"a", "b", 1}},
			want:  []string{`"a"–"b" 1: ±1 would make`, "below 1"},
		},
		{
			name:  "rank 1.5",
			pairs: []Pair{{"a", "b", 1.5}},
			want:  []string{`"a"–"b" = 1.5 is outside [-1, 1]`},
		},
		{
			name:  "rank NaN",
			pairs: []Pair{{"c", "d", math.NaN()}},
			want:  []string{`"c"–"d" is NaN`},
		},
		{
			name:  "unknown name",
			pairs: []Pair{{"a", "depth", 0.3}},
			want:  []string{`unknown input "depth"`, `the sampled inputs are "a", "b", "c", "d"`},
		},
		{
			name:  "duplicate pair, reversed, same value",
			pairs: []Pair{{"a", "b", 0.3}, {"b", "a", 0.3}},
			want:  []string{`"b"–"a" is given more than once (0.3, then 0.3)`},
		},
		{
			name:  "duplicate pair, other value",
			pairs: []Pair{{"a", "b", 0.3}, {"a", "b", 0.5}},
			want:  []string{`"a"–"b" is given more than once (0.3, then 0.5)`},
		},
		{
			name:  "self pair",
			pairs: []Pair{{"c", "c", 0.5}},
			want:  []string{`"c"–"c": an input is paired with itself`},
		},
		{
			name:  "several at once",
			pairs: []Pair{{"x", "y", 0.2}, {"b", "b", 0.1}, {"c", "d", -2}, {"a", "b", 0.5}},
			want:  []string{`unknown inputs "x" and "y"`, `"b"–"b": an input is paired`, `"c"–"d" = -2 is outside`},
		},
	} {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			c, err := BuildCorrelation(names, tc.pairs)
			if err == nil {
				t.Fatalf("no error; want one containing %q", tc.want)
			}
			if c != nil {
				t.Errorf("got a matrix along with the error")
			}
			for _, w := range tc.want {
				if !strings.Contains(err.Error(), w) {
					t.Errorf("error %q\ndoes not contain %q", err, w)
				}
			}
		})
	}
}

func ExampleBuildCorrelation() {
	names := []string{"porosity", "permeability", "temperature"}
	_, err := BuildCorrelation(names, []Pair{
		{"porosity", "permeability", 0.9},
		{"permeability", "temperature", 0.9},
		{"porosity", "temperature", -0.9},
	})
	fmt.Println(err)
	// Output:
	// rank correlations cannot hold together (a set of rank correlations must form a positive-definite matrix): "porosity"–"permeability" 0.9, "permeability"–"temperature" 0.9, "porosity"–"temperature" -0.9; weaken one or more correlations of each triple (a correlation not given counts as 0)
}

func ExampleImanConover() {
	rng := rand.New(rand.NewPCG(1, 2))
	const n = 1000
	area := make([]float64, n)        // m²
	recovery := make([]float64, n)    // dimensionless
	temperature := make([]float64, n) // K
	for i := range n {
		area[i] = 1e6 * (5 + 10*rng.Float64())
		recovery[i] = 0.08 + 0.12*rng.Float64()
		temperature[i] = 480 + 60*rng.NormFloat64()
	}
	target, err := BuildCorrelation([]string{"area", "recovery", "temperature"},
		[]Pair{{"area", "temperature", 0.5}, {"recovery", "temperature", -0.3}})
	if err != nil {
		fmt.Println(err)
		return
	}
	if err := ImanConover([][]float64{area, recovery, temperature}, target, rng); err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("area–temperature %.2f, recovery–temperature %.2f, area–recovery %.2f\n",
		spearman(area, temperature), spearman(recovery, temperature), spearman(area, recovery))
	// Output:
	// area–temperature 0.49, recovery–temperature -0.29, area–recovery -0.00
}

// BenchmarkImanConover rearranges one batch of k inputs.
func BenchmarkImanConover(b *testing.B) {
	for _, size := range []struct{ n, k int }{{1024, 10}, {65536, 10}, {65536, 15}} {
		b.Run(fmt.Sprintf("n=%d/k=%d", size.n, size.k), func(b *testing.B) {
			rng := rand.New(rand.NewPCG(1, 2))
			cols := make([][]float64, size.k)
			names := make([]string, size.k)
			var pairs []Pair
			for j := range cols {
				cols[j] = logNormalDraws(size.n, rng)
				names[j] = fmt.Sprintf("x%d", j)
				for i := range j {
					pairs = append(pairs, Pair{names[i], names[j], 0.3})
				}
			}
			target := mustBuild(b, names, pairs)
			b.ReportAllocs()
			for b.Loop() {
				if err := ImanConover(cols, target, rng); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}

// BenchmarkImanConoverPair rearranges one batch of two inputs, the
// common case of a scenario with one rank correlation.
func BenchmarkImanConoverPair(b *testing.B) {
	rng := rand.New(rand.NewPCG(1, 2))
	cols := [][]float64{logNormalDraws(65536, rng), logNormalDraws(65536, rng)}
	target := mustBuild(b, []string{"x", "y"}, []Pair{{"x", "y", 0.5}})
	b.ReportAllocs()
	for b.Loop() {
		if err := ImanConover(cols, target, rng); err != nil {
			b.Fatal(err)
		}
	}
}
