package heatmodel

import (
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/integrate"
	"gonum.org/v1/gonum/unit"
)

const (
	secondsPerYear = 365.25 * 86400 // s, Julian year (DEVELOPERS.md convention)
	zeroCelsius    = 273.15         // K
)

// derivedHotRock is the hot-rock case of docs/references.md §8 over 1 km²:
// Ts = 15 °C, G = 30 K/km, Tmin = 120 °C, z2 = 6 km, ρr·cr = 2600·900,
// ρw·cw = 1000·4180, V̇/A = 0.5 m³/s per km² = 5e-7 m/s, L = 30 yr,
// η = 0.12, F = 0.9, reporting P at 0 and 30 yr.
func derivedHotRock() HotRock {
	return HotRock{
		Area: Const(1e6), SurfaceTemp: Const(15 + zeroCelsius), Gradient: Const(0.03),
		MinTemp: Const(120 + zeroCelsius), TopDepth: Const(0), MaxDepth: Const(6000),
		RockDensity: Const(2600), RockHeatCapacity: Const(900),
		Flux: Const(0.5 / 1e6), WaterDensity: Const(1000), WaterHeatCapacity: Const(4180),
		ConversionEfficiency: Const(0.12), CapacityFactor: Const(0.9), Life: Const(30 * secondsPerYear),
		ReportTimes: []float64{0, 30 * secondsPerYear},
	}
}

func newHotRockOutputs(n, times int) HotRockOutputs {
	col := func() []float64 {
		c := make([]float64, n)
		for i := range c {
			c[i] = math.NaN() // so that an output left unwritten shows
		}
		return c
	}
	out := HotRockOutputs{HeatInPlace: col(), TimeConstant: col(), InitialPower: col(), Recovered: col(),
		MeanPower: col(), ElectricPower: col(), PowerAt: make([][]float64, times)}
	for k := range out.PowerAt {
		out.PowerAt[k] = col()
	}
	return out
}

func mustProfile(t testing.TB, layers []Layer) Profile {
	t.Helper()
	p, err := NewProfile(layers)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// TestHotRockDerivedCheck checks Evaluate against the hot-rock values of
// docs/references.md §8, derived from the exponential heat-mining formulas
// (Armstead & Tester 1987, "Heat Mining"; renewable-energy textbooks), per
// m² and times the 1e6 m² of derivedHotRock. By hand:
//
//	z1   = (120 − 15) K / 0.03 K/m            = 3500 m;  z2 − z1 = 2500 m
//	E0/A = 2600·900·0.03·2500²/2 = 2.34e6·93750 = 2.19375e11 J/m²
//	τ    = 2.34e6·2500 / (5e-7·4.18e6) = 5.85e9/2.09 = 2.7990431e9 s
//	     = 2.7990431e9 / 3.15576e7 s/yr       = 88.696 yr
//	P0   = 2.19375e11 / 2.7990431e9           = 78.375 W/m²
//	L/τ  = 30·3.15576e7 / 2.7990431e9         = 0.33823274
//	P(30 yr) = 78.375·e^(−0.33823274) = 78.375·0.71302932 = 55.884 W/m²
//	Er/A = 2.19375e11·(1 − 0.71302932)        = 6.2954193e10 J/m²
//	Pth/A = 6.2954193e10 / 9.46728e8 s        = 66.496600 W/m²
//	Pe/A = 0.12·66.496600/0.9                 = 8.8662133 W/m²
//
// The "equal layers" case gives the same geotherm as three layers of
// 30 K/km (bottoms 1, 3.5 and 5 km; the last continues to 6 km), so it must
// give the same results (the layered integral reduces to the uniform one).
func TestHotRockDerivedCheck(t *testing.T) {
	t.Parallel()
	equal := mustProfile(t, []Layer{{1000, 0.03}, {3500, 0.03}, {5000, 0.03}})
	cases := []struct {
		name     string
		geotherm Profile
	}{
		{"uniform", Profile{}},
		{"equal layers", equal},
	}
	for _, c := range cases {
		h := derivedHotRock()
		h.Geotherm = c.geotherm
		if c.name == "equal layers" {
			h.Gradient = Const(math.NaN()) // must not be read
		}
		out := newHotRockOutputs(1, 2)
		if z := h.Evaluate(1, out); z != 0 {
			t.Errorf("%s: %d zero-heat trials, want 0", c.name, z)
		}
		for _, x := range []struct {
			what      string
			got, want float64
			tol       float64 // relative, half a unit of the hand value's last digit
		}{
			{"E0 (J)", out.HeatInPlace[0], 2.19375e17, 1e-12},
			{"τ (s)", out.TimeConstant[0], 2.7990431e9, 2e-8},
			{"τ (yr)", out.TimeConstant[0] / secondsPerYear, 88.696, 6e-6},
			{"P0 (W)", out.InitialPower[0], 78.375e6, 1e-12},
			{"P(0) (W)", out.PowerAt[0][0], 78.375e6, 1e-12},
			{"P(30 yr) (W)", out.PowerAt[1][0], 55.884e6, 1e-5},
			{"recovered (J)", out.Recovered[0], 6.2954193e16, 1e-8},
			{"mean power (W)", out.MeanPower[0], 66.496600e6, 1e-8},
			{"electric power (W)", out.ElectricPower[0], 8.8662133e6, 1e-8},
		} {
			if !scalar.EqualWithinRel(x.got, x.want, x.tol) {
				t.Errorf("%s: %s = %.9g, want %.9g", c.name, x.what, x.got, x.want)
			}
		}
	}
}

// TestHotRockPerTrialColumns checks that each trial uses its own surface
// temperature and gradient. Hand values (uniform-gradient formula of the
// heat-mining model, ρr·cr = 2.34e6 J/(m³·K), Tmin = 120 °C, z2 = 6 km):
//
//	Ts = 15 °C, G = 30 K/km: z1 = 3500 m, E0/A = 2.34e6·0.03·2500²/2 = 2.19375e11
//	Ts = 25 °C, G = 30 K/km: z1 = 9500/3 m, E0/A = 2.34e6·0.03·(8500/3)²/2 = 2.34e6·120416.67 = 2.81775e11
//	Ts = 15 °C, G = 35 K/km: z1 = 3000 m, E0/A = 2.34e6·0.035·3000²/2 = 3.6855e11
func TestHotRockPerTrialColumns(t *testing.T) {
	t.Parallel()
	h := derivedHotRock()
	h.Area = Const(1)
	h.SurfaceTemp = Vary([]float64{15 + zeroCelsius, 25 + zeroCelsius, 15 + zeroCelsius})
	h.Gradient = Vary([]float64{0.03, 0.03, 0.035})
	want := []float64{2.19375e11, 2.81775e11, 3.6855e11}
	out := newHotRockOutputs(3, 2)
	h.Evaluate(3, out)
	for i, w := range want {
		if !scalar.EqualWithinRel(out.HeatInPlace[i], w, 1e-9) {
			t.Errorf("trial %d: E0 = %.9g J, want %.9g", i, out.HeatInPlace[i], w)
		}
	}
}

// uniformColumns returns a maker of columns of n values drawn uniformly
// on [lo, hi) from rnd, for trials of random inputs.
func uniformColumns(n int, rnd *rand.Rand) func(lo, hi float64) Column {
	return func(lo, hi float64) Column {
		v := make([]float64, n)
		for i := range v {
			v[i] = lo + (hi-lo)*rnd.Float64()
		}
		return Vary(v)
	}
}

// TestHeatMiningPowerPoints checks P(t) = (E0/τ)·e^(−t/τ) (Armstead &
// Tester 1987, docs/references.md) at points with analytic values: P(0) =
// E0/τ exactly (the shortcut that skips the exponential must give the
// same bits as the formula), P(τ) = E0/(e·τ), P(2τ) = E0/(e²·τ).
func TestHeatMiningPowerPoints(t *testing.T) {
	t.Parallel()
	rnd := rand.New(rand.NewPCG(3, 4))
	if p := HeatMiningPower(1, 0, 0); !math.IsNaN(p) {
		t.Errorf("P(0) with τ = 0 is %v, want NaN as the formula gives", p)
	}
	for range 100 {
		e0, tau := 1e12+1e18*rnd.Float64(), 1e7+1e10*rnd.Float64()
		if got, want := HeatMiningPower(e0, tau, 0), e0/tau*math.Exp(-0/tau); got != want {
			t.Fatalf("P(0) = %v, want E0/τ·e^0 = %v bit for bit (E0 %g, τ %g)", got, want, e0, tau)
		}
		for k, want := range []float64{e0 / tau / math.E, e0 / tau / (math.E * math.E)} {
			if got := HeatMiningPower(e0, tau, float64(k+1)*tau); !scalar.EqualWithinRel(got, want, 1e-14) {
				t.Fatalf("P(%dτ) = %v, want %v (E0 %g, τ %g)", k+1, got, want, e0, tau)
			}
		}
	}
}

// TestHeatMiningEnergyBalance checks that the power decline integrates to
// the heat mined, ∫_0^L P(t) dt = E0·(1 − e^(−L/τ)) (the exponential
// heat-mining model, Armstead & Tester 1987), by Simpson's rule
// (gonum integrate.Simpsons) over 2001 points of the model's own P(t):
// first of the scalar helpers, then of Evaluate's PowerAt against its
// Recovered, for random trials (seeded). Simpson's error bound
// (L/180)·h⁴·max|P⁗| with h = L/2000 and L ≤ 3τ is below 1e-12 of E0.
func TestHeatMiningEnergyBalance(t *testing.T) {
	t.Parallel()
	const points = 2001
	grid := func(life float64) []float64 {
		x := make([]float64, points)
		for k := range x {
			x[k] = life * float64(k) / (points - 1)
		}
		return x
	}
	cases := []struct{ e0, tau, life float64 }{
		{2.19375e17, 2.7990431e9, 30 * secondsPerYear},
		{1, 1, 3},
		{5e15, 1e8, 1e7},
		{5e15, 1e8, 3e8},
	}
	for _, c := range cases {
		x := grid(c.life)
		f := make([]float64, points)
		for k, t := range x {
			f[k] = HeatMiningPower(c.e0, c.tau, t)
		}
		got, want := integrate.Simpsons(x, f), HeatMined(c.e0, c.tau, c.life)
		if !scalar.EqualWithinRel(got, want, 1e-9) {
			t.Errorf("e0 %g, τ %g s, L %g s: ∫P dt = %.12g, HeatMined = %.12g", c.e0, c.tau, c.life, got, want)
		}
	}

	const n = 20
	u := uniformColumns(n, rand.New(rand.NewPCG(1, 2)))
	const life = 30 * secondsPerYear
	h := HotRock{
		Area: u(1e6, 5e6), SurfaceTemp: u(280, 300), Gradient: u(0.025, 0.06),
		MinTemp: u(340, 390), TopDepth: u(0, 2000), MaxDepth: u(5000, 7000),
		RockDensity: u(2500, 2900), RockHeatCapacity: u(800, 1000),
		Flux: u(1e-7, 3e-6), WaterDensity: Const(1000), WaterHeatCapacity: Const(4180),
		ConversionEfficiency: Const(0.1), CapacityFactor: Const(1), Life: Const(life),
		ReportTimes: grid(life),
	}
	out := newHotRockOutputs(n, points)
	if z := h.Evaluate(n, out); z != 0 {
		t.Fatalf("%d zero-heat trials, want 0 (every z1 < 3.6 km < z2)", z)
	}
	p := make([]float64, points)
	for i := range n {
		for k := range p {
			p[k] = out.PowerAt[k][i]
		}
		got := integrate.Simpsons(h.ReportTimes, p)
		if !scalar.EqualWithinRel(got, out.Recovered[i], 1e-9) {
			t.Errorf("trial %d: ∫PowerAt dt = %.12g J, Recovered = %.12g J", i, got, out.Recovered[i])
		}
		if !scalar.EqualWithinRel(out.MeanPower[i]*life, got, 1e-9) {
			t.Errorf("trial %d: MeanPower·L = %.12g J, ∫PowerAt dt = %.12g J", i, out.MeanPower[i]*life, got)
		}
	}
}

// TestUsefulHeatLayered checks UsefulHeat and UsefulTop on layered
// profiles against the piecewise integral ∫_{z1}^{z2} (T − Tmin) dz worked
// by hand (exact for straight segments: mean of the end excesses times the
// length), times ρr·cr = 2600·900 = 2.34e6 J/(m³·K).
//
// "two layers, z1 in the first": 0–2 km at 40 K/km, then 25 K/km;
// Ts = 25 °C, Tmin = 100 °C, z2 = 5 km. T(2 km) = 105 °C, so
// z1 = 75/0.04 = 1875 m; excess 0 at 1875 m, 5 K at 2 km, 5 + 75 = 80 K at
// 5 km: ∫ = 0.04·125²/2 + (5 + 80)/2·3000 = 312.5 + 127500 = 127812.5 K·m;
// E0/A = 2.990812500e11 J/m².
//
// "two layers, z1 in the second": the same with Ts = 15 °C: T(2 km) = 95 °C,
// z1 = 2000 + 5/0.025 = 2200 m; ∫ = 0.025·2800²/2 = 98000 K·m;
// E0/A = 2.2932e11 J/m².
//
// "below the last layer": 0–1 km 50 K/km, 1–3 km 20 K/km, 3–4 km 40 K/km,
// continuing at 40 K/km; Ts = 10 °C, Tmin = 80 °C, z2 = 5 km. T = 60, 100,
// 140, 180 °C at 1, 3, 4, 5 km; z1 = 1000 + 20/0.02 = 2000 m; excesses 0,
// 20, 60, 100 K at 2, 3, 4, 5 km: ∫ = 10000 + 40000 + 80000 = 130000 K·m;
// E0/A = 3.042e11 J/m².
//
// "top depth inside the first": the first case with TopDepth 1950 m:
// excess 3 K at 1950 m; ∫ = (3 + 5)/2·50 + 127500 = 127700 K·m;
// E0/A = 2.988180e11 J/m².
func TestUsefulHeatLayered(t *testing.T) {
	t.Parallel()
	two := mustProfile(t, []Layer{{2000, 0.04}, {3000, 0.025}})
	three := mustProfile(t, []Layer{{1000, 0.05}, {3000, 0.02}, {4000, 0.04}})
	cases := []struct {
		name                string
		p                   Profile
		tsC, tminC, top, z2 float64
		z1, e0              float64
	}{
		{"two layers, z1 in the first", two, 25, 100, 0, 5000, 1875, 2.9908125e11},
		{"two layers, z1 in the second", two, 15, 100, 0, 5000, 2200, 2.2932e11},
		{"below the last layer", three, 10, 80, 0, 5000, 2000, 3.042e11},
		{"top depth inside the first", two, 25, 100, 1950, 5000, 1950, 2.98818e11},
	}
	for _, c := range cases {
		ts, tmin := c.tsC+zeroCelsius, c.tminC+zeroCelsius
		z1 := UsefulTop(c.p, ts, tmin, c.top)
		if !scalar.EqualWithinAbs(z1, c.z1, 1e-9) {
			t.Errorf("%s: z1 = %.12g m, want %g", c.name, z1, c.z1)
		}
		// UsefulHeat is given the top depth, not z1: it must move z1 down by itself.
		if got := UsefulHeat(c.p, ts, tmin, c.top, c.z2, 2600, 900); !scalar.EqualWithinRel(got, c.e0, 1e-12) {
			t.Errorf("%s: E0/A = %.12g J/m², want %.12g", c.name, got, c.e0)
		}
	}
}

// TestProfileEqualLayers checks that a layered profile of equal gradients
// is the uniform one (T = Ts + G·z, the heat-mining model's geotherm):
// Rise, Depth and UsefulHeat agree at depths within, at the bottom of and
// below the layers, and Depth inverts Rise.
func TestProfileEqualLayers(t *testing.T) {
	t.Parallel()
	const g = 0.03
	uni := UniformProfile(g)
	lay := mustProfile(t, []Layer{{1000, g}, {2500, g}, {4000, g}})
	for _, z := range []float64{0, 400, 1000, 2499, 2500, 3700, 4000, 4001, 9000} {
		if a, b := uni.Rise(z), lay.Rise(z); !scalar.EqualWithinAbsOrRel(a, b, 1e-12, 1e-12) || !scalar.EqualWithinRel(a, g*z, 1e-15) {
			t.Errorf("Rise(%g m): uniform %.15g K, layered %.15g K, want G·z = %.15g K", z, a, b, g*z)
		}
		if d := lay.Depth(lay.Rise(z)); !scalar.EqualWithinAbs(d, z, 1e-9) {
			t.Errorf("layered Depth(Rise(%g m)) = %.15g m", z, d)
		}
		if tt := lay.Temperature(288.15, z); !scalar.EqualWithinAbs(tt, 288.15+g*z, 1e-9) {
			t.Errorf("Temperature(288.15 K, %g m) = %.15g K, want %.15g", z, tt, 288.15+g*z)
		}
	}
	for _, c := range []struct{ ts, tmin, top, z2 float64 }{
		{288.15, 393.15, 0, 6000},    // z1 3500 m, in the third layer
		{288.15, 303.15, 0, 3000},    // z1 500 m, in the first layer
		{288.15, 453.15, 0, 8000},    // z1 5500 m, below the layers
		{288.15, 393.15, 3900, 6000}, // top depth below z1
		{298.15, 288.15, 0, 2000},    // Tmin below Ts: z1 at the surface
	} {
		a := UsefulHeat(uni, c.ts, c.tmin, c.top, c.z2, 2600, 900)
		b := UsefulHeat(lay, c.ts, c.tmin, c.top, c.z2, 2600, 900)
		if !scalar.EqualWithinRel(a, b, 1e-12) {
			t.Errorf("%+v: uniform E0/A %.15g, layered %.15g J/m²", c, a, b)
		}
		if a, b := UsefulTop(uni, c.ts, c.tmin, c.top), UsefulTop(lay, c.ts, c.tmin, c.top); !scalar.EqualWithinAbs(a, b, 1e-9) {
			t.Errorf("%+v: uniform z1 %.15g, layered %.15g m", c, a, b)
		}
	}
}

// TestTimeConstantDimensions checks τ = ρr·cr·(z2 − z1)/(q·ρw·cw) of the
// heat-mining model (Armstead & Tester 1987) for dimension and value, with
// rule-of-thumb properties: rock 2700 kg/m³, granite 800–850 J/(kg·K),
// water 1000 kg/m³ and 4200 J/(kg·K) (common practice); 1 km of rock,
// 1 m³/s per km² = 1e-6 m/s. The quantities are carried through gonum/unit,
// which must find a time. By hand:
//
//	kg/m³ · J/(kg·K) · m / (m/s · kg/m³ · J/(kg·K)) = s
//	cr = 850: τ = 2700·850·1000 / (1e-6·1000·4200) = 2.295e9/4.2 = 5.4642857e8 s (17.315 yr)
//	cr = 800: τ = 2700·800·1000 / 4.2           = 2.16e9/4.2  = 5.1428571e8 s (16.297 yr)
func TestTimeConstantDimensions(t *testing.T) {
	t.Parallel()
	density := unit.Dimensions{unit.MassDim: 1, unit.LengthDim: -3}
	heatCapacity := unit.Dimensions{unit.LengthDim: 2, unit.TimeDim: -2, unit.TemperatureDim: -1} // J/(kg·K)
	flux := unit.Dimensions{unit.LengthDim: 1, unit.TimeDim: -1}
	cases := []struct {
		cr, tau, years float64
	}{
		{850, 5.4642857e8, 17.315},
		{800, 5.1428571e8, 16.297},
	}
	for _, c := range cases {
		got := TimeConstant(2000, 3000, 2700, c.cr, 1e-6, 1000, 4200)
		dim := unit.New(2700, density).Mul(unit.New(c.cr, heatCapacity)).Mul(unit.Metre * 1000).
			Div(unit.New(1e-6, flux).Mul(unit.New(1000, density)).Mul(unit.New(4200, heatCapacity)))
		if !unit.DimensionsMatch(dim, unit.Second) {
			t.Errorf("cr %g: τ has dimensions %v, want s", c.cr, dim.Dimensions())
		}
		if !scalar.EqualWithinRel(got, dim.Value(), 1e-12) {
			t.Errorf("cr %g: TimeConstant = %.12g s, unit arithmetic %.12g s", c.cr, got, dim.Value())
		}
		if !scalar.EqualWithinRel(got, c.tau, 1e-8) || !scalar.EqualWithinRel(got/secondsPerYear, c.years, 3e-5) {
			t.Errorf("cr %g: τ = %.9g s (%.5g yr), want %.9g s (%g yr)", c.cr, got, got/secondsPerYear, c.tau, c.years)
		}
	}
}

// TestHotRockTopAndZero checks the top depth and the zero-heat trials on
// the docs/references.md §8 case (uniform-gradient formulas of the heat-mining
// model, per m² times 1e6 m²). By hand, ρr·cr = 2.34e6, G = 0.03 K/m:
//
//	top 4000 m (below z1 = 3500 m): excess at 4 km = 0.03·500 = 15 K;
//	  E0/A = 2.34e6·(15·2000 + 0.03·2000²/2) = 2.34e6·90000 = 2.106e11 J/m²;
//	  τ = 2.34e6·2000/2.09 = 2.23923445e9 s
//	top 1000 m (above z1): E0/A = 2.19375e11 J/m², τ = 2.7990431e9 s as in §8
//	Tmin 10 °C < Ts = 15 °C, z2 = 3 km: z1 = 0;
//	  E0/A = 2.34e6·(5·3000 + 0.03·3000²/2) = 2.34e6·150000 = 3.51e11 J/m²;
//	  τ = 2.34e6·3000/2.09 = 3.35885167e9 s
//	top = z2, top > z2, or Tmin 250 °C above T(z2) = 195 °C: no heat
func TestHotRockTopAndZero(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name           string
		tminC, top, z2 float64
		e0, tau        float64 // 0 for a zero-heat trial
	}{
		{"top below z1", 120, 4000, 6000, 2.106e17, 2.23923445e9},
		{"top above z1", 120, 1000, 6000, 2.19375e17, 2.7990431e9},
		{"Tmin below Ts", 10, 0, 3000, 3.51e17, 3.35885167e9},
		{"top at z2", 120, 6000, 6000, 0, 0},
		{"top below z2", 120, 7000, 6000, 0, 0},
		{"Tmin too hot", 250, 0, 6000, 0, 0},
	}
	n := len(cases)
	tmin, top, z2 := make([]float64, n), make([]float64, n), make([]float64, n)
	wantZero := 0
	for i, c := range cases {
		tmin[i], top[i], z2[i] = c.tminC+zeroCelsius, c.top, c.z2
		if c.e0 == 0 {
			wantZero++
		}
	}
	h := derivedHotRock()
	h.MinTemp, h.TopDepth, h.MaxDepth = Vary(tmin), Vary(top), Vary(z2)
	out := newHotRockOutputs(n, 2)
	if z := h.Evaluate(n, out); z != wantZero {
		t.Errorf("zero-heat trials = %d, want %d", z, wantZero)
	}
	for i, c := range cases {
		if c.e0 == 0 {
			for _, x := range []struct {
				what string
				got  float64
			}{
				{"E0", out.HeatInPlace[i]}, {"τ", out.TimeConstant[i]}, {"P0", out.InitialPower[i]},
				{"P(0)", out.PowerAt[0][i]}, {"P(30 yr)", out.PowerAt[1][i]}, {"recovered", out.Recovered[i]},
				{"mean power", out.MeanPower[i]}, {"electric power", out.ElectricPower[i]},
			} {
				if x.got != 0 {
					t.Errorf("%s: %s = %g, want 0", c.name, x.what, x.got)
				}
			}
			continue
		}
		if !scalar.EqualWithinRel(out.HeatInPlace[i], c.e0, 1e-12) {
			t.Errorf("%s: E0 = %.12g J, want %.12g", c.name, out.HeatInPlace[i], c.e0)
		}
		if !scalar.EqualWithinRel(out.TimeConstant[i], c.tau, 2e-8) {
			t.Errorf("%s: τ = %.12g s, want %.9g", c.name, out.TimeConstant[i], c.tau)
		}
	}
}

// TestNewProfileErrors checks that bad layers are reported, every one,
// naming the layer, and that good layers are accepted.
func TestNewProfileErrors(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name   string
		layers []Layer
		want   []string // substrings of the error; nil for no error
	}{
		{"one layer", []Layer{{1000, 0.03}}, nil},
		{"three layers", []Layer{{1000, 0.05}, {3000, 0.02}, {4000, 0.04}}, nil},
		{"no layers", nil, []string{"no layers"}},
		{"out of order", []Layer{{2000, 0.03}, {1500, 0.02}}, []string{"layer 2", "1500", "increasing"}},
		{"equal bottoms", []Layer{{2000, 0.03}, {2000, 0.02}}, []string{"layer 2", "increasing"}},
		{"zero gradient", []Layer{{2000, 0.03}, {3000, 0}}, []string{"layer 2", "gradient 0"}},
		{"negative gradient", []Layer{{2000, -0.01}}, []string{"layer 1", "gradient -0.01"}},
		{"NaN gradient", []Layer{{2000, math.NaN()}}, []string{"layer 1", "gradient NaN"}},
		{"surface bottom", []Layer{{0, 0.03}}, []string{"layer 1", "not below the surface"}},
		{"infinite bottom", []Layer{{math.Inf(1), 0.03}}, []string{"layer 1", "not a finite depth"}},
		{"all reported", []Layer{{2000, 0.03}, {1000, 0.02}, {3000, -1}}, []string{"layer 2", "layer 3", "gradient -1"}},
	}
	for _, c := range cases {
		_, err := NewProfile(c.layers)
		if c.want == nil {
			if err != nil {
				t.Errorf("%s: unexpected error %v", c.name, err)
			}
			continue
		}
		if err == nil {
			t.Errorf("%s: no error, want one containing %q", c.name, c.want)
			continue
		}
		for _, w := range c.want {
			if !strings.Contains(err.Error(), w) {
				t.Errorf("%s: error %q does not contain %q", c.name, err, w)
			}
		}
	}
}

// TestUniformProfilePanics checks that a non-positive gradient, a
// programmer's error once the scenario is checked, panics.
func TestUniformProfilePanics(t *testing.T) {
	t.Parallel()
	for _, g := range []float64{0, -0.02, math.NaN()} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("UniformProfile(%g) did not panic", g)
				}
			}()
			UniformProfile(g)
		}()
	}
}

// ExampleHotRock_Evaluate evaluates the hot-rock case of docs/references.md §8 over
// 1 km² (derived from the exponential heat-mining formulas).
func ExampleHotRock_Evaluate() {
	const year = 365.25 * 86400 // s
	h := HotRock{
		Area: Const(1e6), SurfaceTemp: Const(288.15), Gradient: Const(0.03),
		MinTemp: Const(393.15), TopDepth: Const(0), MaxDepth: Const(6000),
		RockDensity: Const(2600), RockHeatCapacity: Const(900),
		Flux: Const(0.5e-6), WaterDensity: Const(1000), WaterHeatCapacity: Const(4180),
		ConversionEfficiency: Const(0.12), CapacityFactor: Const(0.9), Life: Const(30 * year),
		ReportTimes: []float64{30 * year},
	}
	out := HotRockOutputs{
		HeatInPlace: make([]float64, 1), TimeConstant: make([]float64, 1), InitialPower: make([]float64, 1),
		PowerAt: [][]float64{make([]float64, 1)}, Recovered: make([]float64, 1),
		MeanPower: make([]float64, 1), ElectricPower: make([]float64, 1),
	}
	h.Evaluate(1, out)
	fmt.Printf("heat in place  %.6g J\n", out.HeatInPlace[0])
	fmt.Printf("time constant  %.3f yr\n", out.TimeConstant[0]/year)
	fmt.Printf("initial power  %.3f MWth\n", out.InitialPower[0]/1e6)
	fmt.Printf("after 30 yr    %.3f MWth\n", out.PowerAt[0][0]/1e6)
	fmt.Printf("mean power     %.3f MWth\n", out.MeanPower[0]/1e6)
	fmt.Printf("electric       %.3f MWe\n", out.ElectricPower[0]/1e6)
	// Output:
	// heat in place  2.19375e+17 J
	// time constant  88.696 yr
	// initial power  78.375 MWth
	// after 30 yr    55.884 MWth
	// mean power     66.497 MWth
	// electric       8.866 MWe
}

func BenchmarkHotRock(b *testing.B) {
	const n = 1 << 16
	v := func(x float64) Column { return benchColumn(n, x) }
	layered := mustProfile(b, []Layer{{1500, 0.04}, {3000, 0.028}, {5000, 0.025}})
	for _, bc := range []struct {
		name     string
		geotherm Profile
	}{
		{"uniform", Profile{}},
		{"layered", layered},
	} {
		b.Run(bc.name, func(b *testing.B) {
			h := HotRock{
				Area: v(2e6), SurfaceTemp: v(285), Gradient: v(0.03), Geotherm: bc.geotherm,
				MinTemp: v(380), TopDepth: Const(0), MaxDepth: v(6000),
				RockDensity: v(2650), RockHeatCapacity: v(900),
				Flux: v(5e-7), WaterDensity: Const(1000), WaterHeatCapacity: Const(4180),
				ConversionEfficiency: v(0.12), CapacityFactor: Const(0.9), Life: Const(30 * secondsPerYear),
				ReportTimes: []float64{0, 10 * secondsPerYear, 20 * secondsPerYear, 30 * secondsPerYear},
			}
			out := newHotRockOutputs(n, len(h.ReportTimes))
			for b.Loop() {
				h.Evaluate(n, out)
			}
			b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*n), "ns/trial")
		})
	}
}

// TestHotRockPowerAtZero: at a report time of 0 the power is the initial
// power bit for bit, for both declines (P(0) = E0/τ for the exponential
// model; Q(0) = 1 for the fractures, docs/references.md), since a run
// summarises the power at year 0 as a copy of the initial power.
func TestHotRockPowerAtZero(t *testing.T) {
	t.Parallel()
	const n = 50
	u := uniformColumns(n, rand.New(rand.NewPCG(5, 6)))
	for _, d := range []Decline{DeclineExponential, DeclineFractures} {
		h := HotRock{
			Area: u(1e6, 5e6), SurfaceTemp: u(280, 300), Gradient: u(0.025, 0.06),
			MinTemp: u(340, 390), TopDepth: Const(0), MaxDepth: u(5000, 7000),
			RockDensity: u(2500, 2900), RockHeatCapacity: u(800, 1000),
			Flux: u(1e-7, 3e-6), WaterDensity: Const(1000), WaterHeatCapacity: Const(4180),
			ConversionEfficiency: Const(0.1), CapacityFactor: Const(1), Life: Const(30 * secondsPerYear),
			ReportTimes: []float64{0, 10 * secondsPerYear}, Decline: d,
			FractureSpacing: u(50, 200), FlowPath: Const(800), RockConductivity: Const(2.8),
		}
		out := newHotRockOutputs(n, len(h.ReportTimes))
		h.Evaluate(n, out)
		for i := range n {
			if out.PowerAt[0][i] != out.InitialPower[i] || out.InitialPower[i] == 0 {
				t.Fatalf("%v decline, trial %d: P(0) = %v W, initial power %v W", d, i, out.PowerAt[0][i], out.InitialPower[i])
			}
		}
	}
}

// TestHotRockFractureMapping checks how Evaluate maps a hot-rock trial onto
// the parallel-fracture model, field by field, by hand for the case of
// derivedHotRock with spacing S = 200 m, flow path L = 800 m and rock
// conductivity k = 2.8 W/(m·K): the column reaches 120 °C at z1 = 3500 m
// and is mined to z2 = 6000 m, so H = 2500 m and the rock starts at its
// mean, T0 = 15 + 0.03·(3500 + 6000)/2 = 157.5 °C; 1 km² holds
// N = A/(L·S) = 6.25 fractures, D = S/2 = 100 m, sharing Q = 0.5 m³/s, so
// q = Q/(N·H) = 3.2e-5 m²/s per fracture per metre of height and the
// spacing number is λ = 2kL/(ρw·cw·q·D) = 0.33493 (docs/references.md §11).
// The powers at the report times and the heat mined over the life are
// those of that FractureFlow.
func TestHotRockFractureMapping(t *testing.T) {
	h := derivedHotRock()
	h.Decline = DeclineFractures
	h.FractureSpacing, h.FlowPath, h.RockConductivity = Const(200), Const(800), Const(2.8)
	h.ReportTimes = []float64{0, 10 * secondsPerYear, 30 * secondsPerYear}
	out := newHotRockOutputs(1, len(h.ReportTimes))
	h.Evaluate(1, out)
	hand := FractureFlow{Fractures: 6.25, HalfSpacing: 100, Length: 800, Height: 2500, Flow: 0.5,
		RockConductivity: 2.8, RockDensity: 2600, RockHeatCapacity: 900, WaterDensity: 1000, WaterHeatCapacity: 4180,
		RockTemp: 157.5 + zeroCelsius, InjectionTemp: 120 + zeroCelsius}
	lambda := 2 * 2.8 * 800 / (1000 * 4180 * 3.2e-5 * 100)
	if got := hand.SpacingNumber(); !scalar.EqualWithinRel(got, lambda, 1e-12) || !scalar.EqualWithinRel(lambda, 0.33493, 1e-4) {
		t.Errorf("spacing number %v, by hand %v (0.33493)", got, lambda)
	}
	for k, tm := range h.ReportTimes {
		if want := hand.Power(tm); !scalar.EqualWithinRel(out.PowerAt[k][0], want, 1e-12) {
			t.Errorf("P(%g yr) = %g W, the hand-mapped fractures give %g W", tm/secondsPerYear, out.PowerAt[k][0], want)
		}
	}
	if want := hand.HeatMined(30 * secondsPerYear); !scalar.EqualWithinRel(out.Recovered[0], want, 1e-12) {
		t.Errorf("heat mined %g J, the hand-mapped fractures give %g J", out.Recovered[0], want)
	}
}
