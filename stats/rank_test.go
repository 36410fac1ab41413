package stats

import (
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"gonum.org/v1/gonum/stat"
)

func TestRanks(t *testing.T) {
	t.Parallel()
	negZero := math.Copysign(0, -1)
	for _, tc := range []struct {
		name string
		x    []float64
		want []float64
	}{
		{"distinct", []float64{3, 1, 2}, []float64{3, 1, 2}},
		{"tie pair", []float64{10, 20, 20, 30}, []float64{1, 2.5, 2.5, 4}},
		{"all equal", []float64{5, 5, 5}, []float64{2, 2, 2}},
		{"signed zeros tie", []float64{0, negZero, -1}, []float64{2.5, 2.5, 1}},
		{"infinities", []float64{math.Inf(1), 0, math.Inf(-1)}, []float64{3, 2, 1}},
		{"empty", nil, []float64{}},
	} {
		if got := Ranks(tc.x); !slices.Equal(got, tc.want) {
			t.Errorf("%s: Ranks(%v) = %v, want %v", tc.name, tc.x, got, tc.want)
		}
	}
}

// TestRanksDefinition checks Ranks against the definition of the average
// rank, #{x_j < x_i} + (#{x_j = x_i} + 1)/2, on tied data, for the
// comparison-sort (small n) and radix-sort paths.
func TestRanksDefinition(t *testing.T) {
	t.Parallel()
	for _, n := range []int{100, 3000} {
		x := normal(n, 0, 3, uint64(n))
		for i := range x {
			x[i] = math.Round(x[i]) // many ties
		}
		got := Ranks(x)
		for i, xi := range x {
			less, eq := 0, 0
			for _, xj := range x {
				if xj < xi {
					less++
				} else if xj == xi {
					eq++
				}
			}
			if want := float64(less) + float64(eq+1)/2; got[i] != want {
				t.Fatalf("n=%d: rank of x[%d] = %v is %v, want %v", n, i, xi, got[i], want)
			}
		}
	}
}

// TestSpearmanReference checks Spearman against gonum's stat.Correlation
// of the ranks (tied data), against Spearman's (1904) formula
// 1 − 6Σd²/(n(n²−1)) for untied data, and the limiting cases ±1 and 0.
func TestSpearmanReference(t *testing.T) {
	t.Parallel()
	for _, n := range []int{10, 700, 5000} {
		x, y := normal(n, 0, 1, uint64(n)), normal(n, 0, 1, uint64(n+1))
		for i := range y {
			y[i] = math.Round(4 * (x[i] + y[i])) // correlated, tied
		}
		if got, want := Spearman(x, y), stat.Correlation(Ranks(x), Ranks(y), nil); !within(got, want, 1e-12) {
			t.Errorf("n=%d: Spearman %v, gonum correlation of ranks %v", n, got, want)
		}
		z := normal(n, 0, 1, uint64(n+2)) // untied
		rx, rz := Ranks(x), Ranks(z)
		var d2 float64
		for i := range rx {
			d2 += (rx[i] - rz[i]) * (rx[i] - rz[i])
		}
		nf := float64(n)
		if got, want := Spearman(x, z), 1-6*d2/(nf*(nf*nf-1)); !within(got, want, 1e-12) {
			t.Errorf("n=%d: Spearman %v, Spearman's formula %v", n, got, want)
		}
		neg := make([]float64, n)
		for i := range x {
			neg[i] = -math.Exp(x[i])
		}
		if got := Spearman(x, neg); got != -1 {
			t.Errorf("n=%d: Spearman with a decreasing transform %v, want −1", n, got)
		}
		if got := Spearman(x, x); got != 1 {
			t.Errorf("n=%d: Spearman with itself %v, want 1", n, got)
		}
		if got := Spearman(x, make([]float64, n)); got != 0 {
			t.Errorf("n=%d: Spearman with a constant %v, want 0", n, got)
		}
	}
}

// bivariate returns n draws of a standard bivariate normal pair with
// Pearson correlation rho.
func bivariate(n int, rho float64, stream uint64) (x, y []float64) {
	rng := rand.New(rand.NewPCG(stream, 11))
	x, y = make([]float64, n), make([]float64, n)
	c := math.Sqrt(1 - rho*rho)
	for i := range x {
		z1, z2 := rng.NormFloat64(), rng.NormFloat64()
		x[i], y[i] = z1, rho*z1+c*z2
	}
	return x, y
}

// spearmanNormal is the population Spearman coefficient of a bivariate
// normal with Pearson correlation rho, (6/π)·asin(rho/2) (Pearson 1907;
// Kruskal 1958).
func spearmanNormal(rho float64) float64 { return 6 / math.Pi * math.Asin(rho/2) }

// spearmanTol is 4 standard errors of a sample Spearman coefficient near
// rs at size n, from the Fisher transform with var(atanh r_s) ≈ 1.06/(n−3)
// (Fieller, Hartley & Pearson 1957; from memory), mapped back by the
// derivative 1 − rs².
func spearmanTol(rs float64, n int) float64 {
	return 4 * math.Sqrt(1.06/float64(n-3)) * (1 - rs*rs)
}

// TestSpearmanBivariateNormal checks the sample coefficient against the
// population value (6/π)·asin(ρ/2) over several streams.
func TestSpearmanBivariateNormal(t *testing.T) {
	t.Parallel()
	const n = 200000
	for _, rho := range []float64{0.3, 0.8, -0.6} {
		want := spearmanNormal(rho)
		for stream := range uint64(3) {
			x, y := bivariate(n, rho, stream)
			if got := Spearman(x, y); !within(got, want, spearmanTol(want, n)) {
				t.Errorf("rho=%g stream %d: Spearman %.5f, (6/π)asin(ρ/2) = %.5f ± %.5f", rho, stream, got, want, spearmanTol(want, n))
			}
		}
	}
}

// TestRankSensitivity: for Y = a·X1 + X2 with independent normals, (X_i, Y)
// is bivariate normal with Pearson ρ1 = aσ1/σY, ρ2 = σ2/σY, so the
// expected Spearman coefficients are (6/π)asin(ρ_i/2) (Pearson 1907) and
// the expected shares follow from them; they differ from the analytic
// variance shares a²σ1²/σY² and σ2²/σY² by the curvature of asin, which the
// test computes. X3 has no effect: its coefficient is within 4 null
// standard errors 1/√(n−1) (common practice) of 0.
func TestRankSensitivity(t *testing.T) {
	t.Parallel()
	const n, a, s1, s2 = 100000, 2.0, 1.0, 1.5
	x1, x2, x3 := normal(n, 0, s1, 21), normal(n, 0, s2, 22), normal(n, 5, 1, 23)
	y := make([]float64, n)
	for i := range y {
		y[i] = a*x1[i] + x2[i]
	}
	sy := math.Hypot(a*s1, s2)
	r1, r2 := spearmanNormal(a*s1/sy), spearmanNormal(s2/sy)
	t1, t2, t3 := spearmanTol(r1, n), spearmanTol(r2, n), 4/math.Sqrt(n-1)
	// Expected share of X1 and its range over the tolerance box.
	share := func(r1, r2, r3 float64) float64 { return r1 * r1 / (r1*r1 + r2*r2 + r3*r3) }
	lo, hi := share(r1-t1, r2+t2, t3), share(r1+t1, r2-t2, 0)
	analytic := a * a * s1 * s1 / (sy * sy)

	got := RankSensitivity([]string{"X3", "X2", "X1"}, [][]float64{x3, x2, x1}, y)
	if got[0].Input != "X1" || got[1].Input != "X2" || got[2].Input != "X3" {
		t.Fatalf("order %v, want X1, X2, X3", got)
	}
	if !within(got[0].RankCorrelation, r1, t1) || !within(got[1].RankCorrelation, r2, t2) || !within(got[2].RankCorrelation, 0, t3) {
		t.Errorf("rank correlations %v, want %.4f ± %.4f, %.4f ± %.4f, 0 ± %.4f", got, r1, t1, r2, t2, t3)
	}
	if s := got[0].VarianceShare; s < lo || s > hi || !within(s, analytic, math.Abs(share(r1, r2, 0)-analytic)+(hi-lo)) {
		t.Errorf("X1 share %.4f, expected [%.4f, %.4f], analytic %.4f", s, lo, hi, analytic)
	}
	if s := got[2].VarianceShare; s > t3*t3/((r1-t1)*(r1-t1)+(r2-t2)*(r2-t2)) {
		t.Errorf("X3 share %g above its bound", s)
	}
	var sum float64
	for _, in := range got {
		sum += in.VarianceShare
	}
	if !within(sum, 1, 1e-12) {
		t.Errorf("shares sum to %v", sum)
	}

	// A monotone transform of an input leaves its ranks, hence its rank
	// correlation and share, unchanged exactly.
	e1, c1 := make([]float64, n), make([]float64, n)
	for i, v := range x1 {
		e1[i], c1[i] = math.Exp(v), v*v*v
	}
	for _, tr := range [][]float64{e1, c1} {
		g := RankSensitivity([]string{"X3", "X2", "X1"}, [][]float64{x3, x2, tr}, y)
		if !slices.Equal(g, got) {
			t.Errorf("transformed X1 gives %v, want %v", g, got)
		}
	}

	// The correlations are Spearman's, computed from average ranks.
	for _, f := range got {
		x := map[string][]float64{"X1": x1, "X2": x2, "X3": x3}[f.Input]
		if r := Spearman(x, y); r != f.RankCorrelation {
			t.Errorf("%s: rank correlation %v, Spearman %v", f.Input, f.RankCorrelation, r)
		}
	}
}

// TestRankSensitivityConstant: constant inputs get r = 0 and share 0, and
// ties in |r| are ordered by name.
func TestRankSensitivityConstant(t *testing.T) {
	t.Parallel()
	x := normal(1000, 0, 1, 31)
	c := make([]float64, len(x))
	got := RankSensitivity([]string{"zeta", "beta", "alpha"}, [][]float64{c, c, x}, x)
	want := []Influence{{"alpha", 1, 1}, {"beta", 0, 0}, {"zeta", 0, 0}}
	if !slices.Equal(got, want) {
		t.Errorf("got %v, want %v", got, want)
	}
	if got := RankSensitivity([]string{"a"}, [][]float64{c}, c); got[0] != (Influence{"a", 0, 0}) {
		t.Errorf("all constant: %v", got)
	}
}

func TestCorrelateRanksPanics(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name   string
		rx, ry []float64
	}{
		{"lengths", []float64{1, 2}, []float64{1}},
		{"not half-integer", []float64{1.2, 2}, []float64{1, 2}},
		{"out of range", []float64{0, 3}, []float64{1, 2}},
	} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("%s: no panic", tc.name)
				}
			}()
			CorrelateRanks(tc.rx, tc.ry)
		}()
	}
}

// TestDoubledRanks checks DoubledRanks against Ranks (twice its values)
// and CorrelateDoubledRanks against CorrelateRanks (identical bits), with
// ties, both zeros and both sort paths, reusing one scratch.
func TestDoubledRanks(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(7, 8))
	var s RankScratch
	for _, n := range []int{1, 3, 100, 5000, 70000} {
		x, y := make([]float64, n), make([]float64, n)
		for i := range x {
			x[i] = float64(rng.IntN(50)) - 25 // ties, and zeros
			if i%7 == 0 {
				x[i] = math.Copysign(0, -1)
			}
			y[i] = x[i]*0.5 + rng.NormFloat64()
		}
		dx, dy := make([]int32, n), make([]int32, n)
		DoubledRanks(x, dx, &s)
		DoubledRanks(y, dy, &s)
		rx, ry := Ranks(x), Ranks(y)
		for i := range rx {
			if float64(dx[i]) != 2*rx[i] {
				t.Fatalf("n = %d: doubled rank %d of %v, rank %v", n, dx[i], x[i], rx[i])
			}
		}
		if a, b := CorrelateDoubledRanks(dx, dy), CorrelateRanks(rx, ry); math.Float64bits(a) != math.Float64bits(b) {
			t.Errorf("n = %d: %v from doubled ranks, %v from ranks", n, a, b)
		}
	}
}

// TestDoubledRanksNearTies: values that agree in all but their last bits
// (which DoubledRanks sorts apart after its one-word sort), exact ties in
// large groups, and both zeros, in random order, against Ranks.
func TestDoubledRanksNearTies(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(9, 10))
	var s RankScratch
	for _, n := range []int{2, 600, 70000} {
		x := make([]float64, n)
		for i := range x {
			switch rng.IntN(4) {
			case 0:
				x[i] = 1 + float64(rng.IntN(40))*0x1p-52 // near ties, and ties
			case 1:
				x[i] = -3 - float64(rng.IntN(40))*0x1p-51
			case 2:
				x[i] = math.Copysign(0, float64(rng.IntN(2))-0.5)
			default:
				x[i] = rng.NormFloat64()
			}
		}
		d := make([]int32, n)
		DoubledRanks(x, d, &s)
		for i, r := range Ranks(x) {
			if float64(d[i]) != 2*r {
				t.Fatalf("n = %d: doubled rank %d of %v, rank %v", n, d[i], x[i], r)
			}
		}
	}
}

// TestCorrelateDoubledRanksPaths checks both accumulations of
// CorrelateDoubledRanks, in int64 below 2^20 values and in 128 bits from
// there, against gonum's stat.Correlation (Pearson) of the same ranks, to
// 1e-9: gonum sums in floating point, with rounding errors growing with n
// (about n·ε ≈ 2e-10 at worst here), where the ranks' sums are exact; and
// that equal and reversed ranks give exactly ±1.
func TestCorrelateDoubledRanksPaths(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(21, 22))
	for _, n := range []int{1<<20 - 1, 1<<20 + 1} {
		x, y := make([]float64, n), make([]float64, n)
		for i := range x {
			x[i] = rng.NormFloat64()
			y[i] = x[i] + rng.NormFloat64()
		}
		var s RankScratch
		dx, dy := make([]int32, n), make([]int32, n)
		DoubledRanks(x, dx, &s)
		DoubledRanks(y, dy, &s)
		fx, fy := make([]float64, n), make([]float64, n)
		for i := range dx {
			fx[i], fy[i] = float64(dx[i]), float64(dy[i])
		}
		got, want := CorrelateDoubledRanks(dx, dy), stat.Correlation(fx, fy, nil)
		if math.Abs(got-want) > 1e-9 {
			t.Errorf("n = %d: %v, gonum %v", n, got, want)
		}
		if r := CorrelateDoubledRanks(dx, dx); r != 1 {
			t.Errorf("n = %d: equal ranks give %v", n, r)
		}
		rev := slices.Clone(dx)
		for i := range rev {
			rev[i] = int32(2*n+2) - dx[i]
		}
		if r := CorrelateDoubledRanks(dx, rev); r != -1 {
			t.Errorf("n = %d: reversed ranks give %v", n, r)
		}
	}
}
