package heatmodel

import (
	"encoding/csv"
	"fmt"
	"io"
	"math"
	"os"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/integrate/quad"
)

// baseFracture is a parallel-fracture case with round dimensionless
// groups, worked by hand:
//
//	α  = k/(ρr·cr) = 2.5/(2500·1000)              = 1e-6 m²/s
//	q  = Q/(N·H) = 0.01/(10·200)                  = 5e-6 m²/s per fracture and metre of height
//	λ  = 2·k·L/(ρw·cw·q·D) = 2·2.5·400/(4e6·5e-6·10) = 2000/200 = 10
//	D²/α = 100/1e-6                               = 1e8 s
//	V  = N·L·2D·H = 10·400·20·200                 = 1.6e7 m³
//	τ  = ρr·cr·V/(ρw·cw·Q) = 2.5e6·1.6e7/(4e6·0.01) = 1e9 s (= λ·D²/α)
//	P0 = ρw·cw·Q·(T0 − T_in) = 4e6·0.01·100       = 4e6 W
//	E0 = N·L·2D·H·ρr·cr·(T0 − T_in) = 1.6e7·2.5e6·100 = 4e15 J (= P0·τ)
func baseFracture() FractureFlow {
	return FractureFlow{
		Fractures: 10, HalfSpacing: 10, Length: 400, Height: 200, Flow: 0.01,
		RockConductivity: 2.5, RockDensity: 2500, RockHeatCapacity: 1000,
		WaterDensity: 1000, WaterHeatCapacity: 4000,
		RockTemp: 200 + zeroCelsius, InjectionTemp: 100 + zeroCelsius,
	}
}

// TestFractureScales checks the dimensionless groups and scales of
// baseFracture against the hand values, and that the initial power is the
// exponential heat-mining model's E0/τ (Armstead & Tester 1987), as both
// models share the heat in place and the time constant.
func TestFractureScales(t *testing.T) {
	t.Parallel()
	f := baseFracture()
	for _, c := range []struct {
		what      string
		got, want float64
	}{
		{"SpacingNumber", f.SpacingNumber(), 10},
		{"TimeConstant (s)", f.TimeConstant(), 1e9},
		{"InitialPower (W)", f.InitialPower(), 4e6},
		{"HeatInPlace (J)", f.HeatInPlace(), 4e15},
		{"Power(0) (W)", f.Power(0), 4e6},
		{"E0/τ (W)", HeatMiningPower(f.HeatInPlace(), f.TimeConstant(), 0), f.InitialPower()},
		{"Power(1e-3 τ) (W)", f.Power(1e6), 4e6},
		{"OutletTemp(0) (K)", f.OutletTemp(0), 200 + zeroCelsius},
		{"OutletTemp(+Inf) (K)", f.OutletTemp(math.Inf(1)), 100 + zeroCelsius},
		{"HeatMined(+Inf) (J)", f.HeatMined(math.Inf(1)), f.HeatInPlace()},
	} {
		if !scalar.EqualWithinRel(c.got, c.want, 1e-13) {
			t.Errorf("%s = %.15g, want %.15g", c.what, c.got, c.want)
		}
	}
}

// TestFractureSingle checks wide spacing against the closed form for a
// single fracture in a half-space of rock (Gringarten, Witherspoon &
// Ohnishi 1975, the D → ∞ limit of their transform, whose inverse is
// L⁻¹[e^(−a√p)/p] = erfc(a/(2√t))):
//
//	R(t) = erfc(a/√t),  a = k·L/(ρw·cw·q·√α)
//
// and the heat mined, P0·(t − ∫_0^t R dt), with
// ∫_0^t erfc(a/√u) du = (t + 2a²)·erfc(a/√t) − 2a·√(t/π)·e^(−a²/t)
// (differentiate to check). With baseFracture's values and D = 10 km,
// a = 2.5·400/(4e6·5e-6·1e-3) = 5e4 s^½; at t ≤ 10a² = 2.5e10 s the
// conduction has reached 2√(αt) ≤ 316 m ≪ D, and tanh(D·√(p/α)) = 1 to
// double precision where the inversion samples it.
func TestFractureSingle(t *testing.T) {
	t.Parallel()
	f := baseFracture()
	f.HalfSpacing = 1e4
	const a = 5e4 // s^½
	for _, u := range []float64{0.05, 0.1, 0.3, 1, 3, 10} {
		tt := u * a * a
		want := math.Erfc(a / math.Sqrt(tt))
		if got := f.OutletRatio(tt); !scalar.EqualWithinAbs(got, want, 2e-11) {
			t.Errorf("t = %g a²: R = %.15g, erfc %.15g", u, got, want)
		}
		intR := (tt+2*a*a)*math.Erfc(a/math.Sqrt(tt)) - 2*a*math.Sqrt(tt/math.Pi)*math.Exp(-a*a/tt)
		mined := f.InitialPower() * (tt - intR)
		if got := f.HeatMined(tt); !scalar.EqualWithinRel(got, mined, 1e-10) {
			t.Errorf("t = %g a²: heat mined %.15g J, closed form %.15g", u, got, mined)
		}
	}
}

// TestFractureTable checks the finite-spacing solution against
// testdata/fracture_gwo_table.csv, written by testdata/gen_fracture_table.py
// with mpmath.invertlaplace (fixed Talbot in 30–330 digits, Debian
// python3-mpmath 1.2.1), an independent arbitrary-precision inversion of
// the same transforms, on a grid of λ = 0.01–200 and t/τ = 0.01–10. Each
// row is evaluated through the public methods: the half-spacing is set to
// D = 100 m/λ so that baseFracture's SpacingNumber is the row's λ, and the
// time to t = t_D·D²/α.
func TestFractureTable(t *testing.T) {
	t.Parallel()
	rows := readFractureTable(t)
	if len(rows) < 300 {
		t.Fatalf("fracture_gwo_table.csv has %d rows, want ≥ 300", len(rows))
	}
	for _, row := range rows {
		lam, td, wantR, wantQ, wantM := row[0], row[2], row[3], row[4], row[5]
		f := baseFracture()
		f.HalfSpacing = 100 / lam
		tc := f.HalfSpacing * f.HalfSpacing / 1e-6 // D²/α, s
		if !scalar.EqualWithinRel(f.SpacingNumber(), lam, 1e-14) {
			t.Fatalf("SpacingNumber %.17g, want %g", f.SpacingNumber(), lam)
		}
		tt := td * tc
		if r := f.OutletRatio(tt); !scalar.EqualWithinAbs(r, wantR, fractureAbsTol) {
			t.Errorf("λ %g, t/τ %g: R = %.15g, mpmath %.15g (error %.2g)", lam, row[1], r, wantR, r-wantR)
		}
		p, e := f.PowerAndHeatMined(tt)
		if q := p / f.InitialPower(); !scalar.EqualWithinAbs(q, wantQ, fractureAbsTol) {
			t.Errorf("λ %g, t/τ %g: P/P0 = 1 − R = %.15g, mpmath %.15g (error %.2g)", lam, row[1], q, wantQ, q-wantQ)
		}
		if m := e / (f.InitialPower() * tc); !scalar.EqualWithinRel(m, wantM, fractureRelTol) {
			t.Errorf("λ %g, t/τ %g: M = %.15g, mpmath %.15g (error %.2g)", lam, row[1], m, wantM, m-wantM)
		}
		wantT := f.RockTemp - (f.RockTemp-f.InjectionTemp)*wantR
		if got := f.OutletTemp(tt); !scalar.EqualWithinAbs(got, wantT, 100*fractureAbsTol) {
			t.Errorf("λ %g, t/τ %g: T_out = %.15g K, mpmath %.15g", lam, row[1], got, wantT)
		}
	}
}

// The accuracy of the fracture-flow inversion against mpmath: R and 1 − R
// to fractureAbsTol, M to fractureRelTol of itself. (Measured worst:
// 1.3e-11 and 6.4e-12 on the Talbot contour, λ ≤ 15; 5e-15 and 1e-15 on
// the saddle line.)
const (
	fractureAbsTol = 2e-11
	fractureRelTol = 1e-11
)

// readFractureTable reads the numeric rows (λ, θ, t_D, R, Q, M) of
// testdata/fracture_gwo_table.csv.
func readFractureTable(t *testing.T) [][6]float64 {
	t.Helper()
	fh, err := os.Open("testdata/fracture_gwo_table.csv")
	if err != nil {
		t.Fatal(err)
	}
	defer fh.Close()
	r := csv.NewReader(fh)
	r.Comment = '#'
	if head, err := r.Read(); err != nil || strings.Join(head, ",") != "lambda,theta,t_D,R,Q,M" {
		t.Fatalf("table header %v, %v", head, err)
	}
	var rows [][6]float64
	for {
		rec, err := r.Read()
		if err == io.EOF {
			return rows
		}
		if err != nil {
			t.Fatal(err)
		}
		var row [6]float64
		for i := range row {
			if row[i], err = strconv.ParseFloat(rec[i], 64); err != nil {
				t.Fatal(err)
			}
		}
		rows = append(rows, row)
	}
}

// TestFractureInversionsAgree checks the two inversion methods against each
// other where both hold (λ = 5–15): the fixed Talbot contour and the
// saddle-point Bromwich line are independent numerical routes to the same
// inverse.
func TestFractureInversionsAgree(t *testing.T) {
	t.Parallel()
	for _, lam := range []float64{5, 7, 9.5, 12, 15} {
		for th := 0.01; th < 20; th *= 1.07 {
			r1, _, m1 := gwoTalbot(lam, lam*th)
			r2, _, m2 := gwoSaddle(lam, lam*th)
			if !scalar.EqualWithinAbs(r1, r2, 2e-11) || !scalar.EqualWithinAbs(m1, m2, 2e-11*max(1, m2)) {
				t.Errorf("λ %g, t/τ %.4g: Talbot R %.15g, M %.15g; saddle line R %.15g, M %.15g", lam, th, r1, m1, r2, m2)
			}
		}
	}
}

// TestFractureEnergyBalance checks that the power integrates to the heat in
// place, ∫_0^∞ P dt = A·H·ρr·cr·(T0 − T_in) (energy conservation), and to
// HeatMined at intermediate times, by Gauss–Legendre quadrature of Power
// (gonum integrate/quad.Fixed, 8 nodes on each of 400 intervals growing
// geometrically from 1e-10 of the end, to follow the early erfc-like
// drop) up to t_D = max(8λ, 40), well past the front, when 1 − R < 1e-15
// (it falls about as e^(−π²·t_D/4) at late times: 7.6e-10 at t_D = 16 for
// λ = 2, by mpmath). HeatMined is inverted from its own transform, so this
// also checks the two inversions against each other. Cases span both
// methods (λ = 0.3, 2, 10 by Talbot; 40 by the saddle line).
func TestFractureEnergyBalance(t *testing.T) {
	t.Parallel()
	for _, lam := range []float64{0.3, 2, 10, 40} {
		f := baseFracture()
		f.HalfSpacing = 100 / lam
		tc := f.HalfSpacing * f.HalfSpacing / 1e-6
		end := max(8*lam, 40) * tc // s
		const n = 400
		edge := func(i int) float64 { return end * math.Pow(1e-10, float64(n-i)/n) }
		total := quad.Fixed(f.Power, 0, edge(0), 8, quad.Legendre{}, 0)
		for i := range n {
			total += quad.Fixed(f.Power, edge(i), edge(i+1), 8, quad.Legendre{}, 0)
			if i == n/2 || i == 3*n/4 || i == 7*n/8 {
				if got := f.HeatMined(edge(i + 1)); !scalar.EqualWithinRel(got, total, 1e-10) {
					t.Errorf("λ %g: HeatMined(%g s) = %.13g J, ∫P dt = %.13g J", lam, edge(i+1), got, total)
				}
			}
		}
		// Power is within P0·2e-11 of the truth (TestFractureTable), so the
		// integral within P0·end·2e-11.
		if e0 := f.HeatInPlace(); !scalar.EqualWithinAbs(total, e0, 2e-11*f.InitialPower()*end) {
			t.Errorf("λ %g: ∫P dt to %g s = %.13g J, heat in place %.13g J", lam, end, total, e0)
		}
	}
}

// TestFractureNarrowSpacing checks the narrow-spacing limit: more and more
// closely spaced fractures in the same rock volume and flow (N·s, D/s, so
// τ is fixed and λ = τ·α/D² grows as s²). The rock then keeps up with the
// water and a thermal front reaches the producer at τ: the outlet stays at
// T0 before and falls to T_in after, and the power stays at P0 until τ.
//
// The front's shape follows from the cumulants of the dimensionless
// transit time X, whose Laplace transform is e^(−λ·g(s)) with
// g(s) = √s·tanh √s = s − s²/3 + 2s³/15 − 17s⁴/315 + … (the series of
// tanh): the cumulant function λ·(u + u²/3 + 2u³/15 + 17u⁴/315 + …) gives
// mean λ, variance σ² = 2λ/3, skewness γ = 0.8λ/σ³ = 1.4697/√λ and
// excess kurtosis κ = (408/315)·λ/σ⁴ = 2.9143/λ. R(t) = P(X ≤ t_D) is then
// the Edgeworth expansion (a standard result of statistics, e.g. Kendall &
// Stuart, "The Advanced Theory of Statistics", vol. 1, from memory) with
// z = (t_D − λ)/σ:
//
//	R ≈ Φ(z) − φ(z)·[γ/6·He2(z) + κ/24·He3(z) + γ²/72·He5(z)],
//
// with Hermite polynomials He2 = z² − 1, He3 = z³ − 3z, He5 = z⁵ − 10z³ +
// 15z, in error by O(λ^(−3/2)). The heat not yet mined at τ is
// E0·σ·E[Z⁺]/λ with E[Z⁺] = (1 − κ/24 + γ²/24)/√(2π) from the same
// expansion (half-moments of z·He4 and z·He6: −1 and 3 over √(2π)), that
// is E0·(1 − 11/(350λ))/√(3πλ), in error by O(λ^(−2)).
func TestFractureNarrowSpacing(t *testing.T) {
	t.Parallel()
	for _, s := range []float64{math.Sqrt(10), 10, 100, 1000} {
		f := baseFracture()
		f.Fractures *= s
		f.HalfSpacing /= s
		lam, tau := f.SpacingNumber(), f.TimeConstant()
		if !scalar.EqualWithinRel(tau, 1e9, 1e-13) || !scalar.EqualWithinRel(lam, 10*s*s, 1e-12) {
			t.Fatalf("s %g: τ %g s, λ %g", s, tau, lam)
		}
		sd := math.Sqrt(2 * lam / 3)
		g, k := 0.8*lam/(sd*sd*sd), (408.0/315)*lam/(sd*sd*sd*sd)
		for _, z := range []float64{-3, -1, 0, 0.5, 1, 3} {
			phi := math.Exp(-z*z/2) / math.Sqrt(2*math.Pi)
			he2, he3, he5 := z*z-1, z*z*z-3*z, z*z*z*z*z-10*z*z*z+15*z
			want := 0.5*math.Erfc(-z/math.Sqrt2) - phi*(g/6*he2+k/24*he3+g*g/72*he5)
			tt := tau * (1 + z*sd/lam)
			// The expansion's error, plus the inversion's (TestFractureTable).
			if got := f.OutletRatio(tt); !scalar.EqualWithinAbs(got, want, 0.05*math.Pow(lam, -1.5)+2e-11) {
				t.Errorf("λ %g, z %g: R = %.10g, Edgeworth %.10g (difference·λ^1.5 %.3g)", lam, z, got, want, (got-want)*math.Pow(lam, 1.5))
			}
		}
		deficit := 1 - f.HeatMined(tau)/f.HeatInPlace()
		want := (1 - 11/(350*lam)) / math.Sqrt(3*math.Pi*lam)
		if !scalar.EqualWithinAbs(deficit, want, 0.1/(lam*lam)*want+2e-11) {
			t.Errorf("λ %g: heat not mined by τ %.10g of E0, want %.10g (relative difference·λ² %.3g)", lam, deficit, want, (deficit/want-1)*lam*lam)
		}
		if p := f.Power(0.5 * tau); !scalar.EqualWithinRel(p, f.InitialPower(), 1e-12) {
			t.Errorf("λ %g: P(τ/2) = %g W, want P0 = %g W", lam, p, f.InitialPower())
		}
	}
}

// TestFractureValidate checks that every bad field is reported by Validate
// and makes the methods panic, and that negative or NaN times panic.
func TestFractureValidate(t *testing.T) {
	t.Parallel()
	if err := baseFracture().Validate(); err != nil {
		t.Fatalf("baseFracture: %v", err)
	}
	nan, inf := math.NaN(), math.Inf(1)
	cases := []struct {
		name string
		set  func(*FractureFlow)
		want []string
	}{
		{"spacing 0", func(f *FractureFlow) { f.HalfSpacing = 0 }, []string{"HalfSpacing 0 m"}},
		{"spacing negative", func(f *FractureFlow) { f.HalfSpacing = -5 }, []string{"HalfSpacing -5 m"}},
		{"fractures NaN", func(f *FractureFlow) { f.Fractures = nan }, []string{"Fractures NaN"}},
		{"flow infinite", func(f *FractureFlow) { f.Flow = inf }, []string{"Flow +Inf m³/s"}},
		{"length, height", func(f *FractureFlow) { f.Length, f.Height = 0, -1 }, []string{"Length 0 m", "Height -1 m"}},
		{"rock", func(f *FractureFlow) { f.RockConductivity, f.RockDensity, f.RockHeatCapacity = 0, 0, 0 },
			[]string{"RockConductivity 0 W/(m·K)", "RockDensity 0 kg/m³", "RockHeatCapacity 0 J/(kg·K)"}},
		{"water", func(f *FractureFlow) { f.WaterDensity, f.WaterHeatCapacity = -1, nan }, []string{"WaterDensity -1", "WaterHeatCapacity NaN"}},
		{"temperatures", func(f *FractureFlow) { f.RockTemp, f.InjectionTemp = nan, inf }, []string{"RockTemp NaN K", "InjectionTemp +Inf K"}},
	}
	for _, c := range cases {
		f := baseFracture()
		c.set(&f)
		err := f.Validate()
		if err == nil {
			t.Errorf("%s: no error", c.name)
			continue
		}
		for _, w := range c.want {
			if !strings.Contains(err.Error(), w) {
				t.Errorf("%s: error %q does not name %q", c.name, err, w)
			}
		}
		if n := len(unjoinErrors(err)); n != len(c.want) {
			t.Errorf("%s: %d problems reported, want %d", c.name, n, len(c.want))
		}
		mustPanic(t, c.name+": Power", func() { f.Power(1e8) })
		mustPanic(t, c.name+": TimeConstant", func() { f.TimeConstant() })
	}
	f := baseFracture()
	mustPanic(t, "negative time", func() { f.OutletRatio(-1) })
	mustPanic(t, "NaN time", func() { f.HeatMined(nan) })
}

func mustPanic(t *testing.T, what string, fn func()) {
	t.Helper()
	defer func() {
		if recover() == nil {
			t.Errorf("%s did not panic", what)
		}
	}()
	fn()
}

// BenchmarkFractureFlow measures one PowerAndHeatMined call (one inversion
// of both transforms) at five report times, 10–50 years, for half-spacings
// giving λ = 0.3 to 300 around baseFracture's τ = 31.7 years.
func BenchmarkFractureFlow(b *testing.B) {
	const year = 365.25 * 86400
	for _, lam := range []float64{0.3, 3, 10, 15, 16, 20, 30, 100, 300} {
		b.Run(fmt.Sprintf("lambda=%g", lam), func(b *testing.B) {
			f := baseFracture()
			f.Fractures *= math.Sqrt(lam / 10)
			f.HalfSpacing /= math.Sqrt(lam / 10)
			sink := 0.0
			for b.Loop() {
				for _, yr := range []float64{10, 20, 30, 40, 50} {
					p, e := f.PowerAndHeatMined(yr * year)
					sink += p + e
				}
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(5*b.N), "ns/call")
			_ = sink
		})
	}
}

// ExampleFractureFlow evaluates ten fractures 20 m apart (baseFracture:
// λ = 10, τ = 1e9 s = 31.7 years, P0 = 4 MW).
func ExampleFractureFlow() {
	const year = 365.25 * 86400 // s
	f := FractureFlow{
		Fractures: 10, HalfSpacing: 10, Length: 400, Height: 200, Flow: 0.01,
		RockConductivity: 2.5, RockDensity: 2500, RockHeatCapacity: 1000,
		WaterDensity: 1000, WaterHeatCapacity: 4000,
		RockTemp: 473.15, InjectionTemp: 373.15,
	}
	fmt.Printf("spacing number %.4g, time constant %.2f yr\n", f.SpacingNumber(), f.TimeConstant()/year)
	for _, yr := range []float64{0, 10, 30, 50} {
		p, e := f.PowerAndHeatMined(yr * year)
		fmt.Printf("%2.0f yr: outlet %.2f °C, %.3f MWth, %.4f of the heat in place mined\n",
			yr, f.OutletTemp(yr*year)-273.15, p/1e6, e/f.HeatInPlace())
	}
	// Output:
	// spacing number 10, time constant 31.69 yr
	//  0 yr: outlet 200.00 °C, 4.000 MWth, 0.0000 of the heat in place mined
	// 10 yr: outlet 199.98 °C, 3.999 MWth, 0.3156 of the heat in place mined
	// 30 yr: outlet 155.20 °C, 2.208 MWth, 0.8701 of the heat in place mined
	// 50 yr: outlet 102.21 °C, 0.088 MWth, 0.9971 of the heat in place mined
}
