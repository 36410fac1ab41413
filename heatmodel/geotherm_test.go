package heatmodel

import (
	"errors"
	"fmt"
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
	"gonum.org/v1/gonum/integrate/quad"
)

func mustConductive(t testing.TB, q0 float64, layers []ConductiveLayer) Profile {
	t.Helper()
	p, err := NewConductiveProfile(q0, layers)
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// TestConductiveProfileHand checks conductive profiles against the steady
// conduction geotherm with uniform heat production per layer,
// T = T_top + (q_top/k)·z' − A·z'²/(2k), q = q_top − A·z' (Turcotte &
// Schubert, "Geodynamics", ch. 4), worked by hand.
//
// "one rock": q0 = 65 mW/m², k = 2.5 W/(m·K), A = 1 µW/m³ (with
// T0 = 10 °C): q0/k = 0.026 K/m, A/(2k) = 2e-7 K/m², so
//
//	Rise(5 km)  = 0.026·5000 − 2e-7·5000²  = 130 − 5   = 125 K (T = 135 °C)
//	Rise(10 km) = 260 − 20                 = 240 K (T = 250 °C)
//	q(5 km)     = 0.065 − 1e-6·5000        = 0.060 W/m²
//	Depth(125 K) = 2·125/(0.026 + √(0.026² − 4·2e-7·125)) = 250/(0.026 + 0.024) = 5000 m
//	mean over 0–5 km = 0.013·5000 − 2e-7·5000²/3 = 65 − 5/3 = 63.333333 K
//	peak at q0/A = 65 km, rise 0.026²/(4·2e-7) = 845 K
//
// "two layers": q0 = 70 mW/m²; 0–2 km k = 2.5, A = 2 µW/m³; then k = 3,
// A = 0.5 µW/m³. Layer 1: 0.028 K/m, 4e-7 K/m²: Rise(2 km) = 56 − 1.6 =
// 54.4 K, q(2 km) = 0.07 − 0.004 = 0.066 W/m². Layer 2: 0.066/3 = 0.022 K/m,
// 0.5e-6/6 = 8.3333e-8 K/m²: Rise(5 km) = 54.4 + 66 − 0.75 = 119.65 K,
// q(5 km) = 0.066 − 1.5e-3 = 0.0645 W/m²; Rise(1 km) = 28 − 0.4 = 27.6 K.
// ∫(Rise − 30) over 1–5 km: layer 1, 1–2 km: 0.014·3e6 − (4e-7/3)·7e9 −
// 30·1000 = 42000 − 933.333 − 30000 = 11066.667 K·m; layer 2:
// 24.4·3000 + 0.011·9e6 − (8.3333e-8/3)·2.7e10 = 73200 + 99000 − 750 =
// 171450 K·m; total 182516.667 K·m; mean rise over 1–5 km
// (182516.667 + 30·4000)/4000 = 75.629167 K. Depth(54.4 K) = 2000 m, the
// boundary; Depth(90 K) in layer 2: 8.3333e-8·z'² − 0.022·z' + 35.6 = 0,
// z' = 71.2/(0.022 + √(4.84e-4 − 1.18667e-5)) = 71.2/0.0437286 =
// 1628.2 m, so 3628 m.
func TestConductiveProfileHand(t *testing.T) {
	t.Parallel()
	one := HomogeneousProfile(0.065, 2.5, 1e-6)
	oneLayer := mustConductive(t, 0.065, []ConductiveLayer{{Bottom: 3000, Conductivity: 2.5, HeatProduction: 1e-6}})
	two := mustConductive(t, 0.07, []ConductiveLayer{{2000, 2.5, 2e-6}, {6000, 3, 0.5e-6}})
	type point struct{ z, rise, q float64 }
	cases := []struct {
		name       string
		p          Profile
		points     []point
		depthOf    [2]float64 // rise, depth
		a, b, d    float64    // excess ∫_a^b (Rise − d) dz
		excess     float64
		mean, peak float64
	}{
		{"one rock", one, []point{{0, 0, 0.065}, {5000, 125, 0.060}, {10000, 240, 0.055}},
			[2]float64{125, 5000}, 0, 5000, 0, 0.013*5000*5000 - 2e-7*5000*5000*5000/3, 65 - 5.0/3, 65000},
		{"one layer", oneLayer, []point{{0, 0, 0.065}, {5000, 125, 0.060}, {10000, 240, 0.055}},
			[2]float64{125, 5000}, 0, 5000, 0, 0.013*5000*5000 - 2e-7*5000*5000*5000/3, 65 - 5.0/3, 65000},
		{"two layers", two, []point{{1000, 27.6, 0.068}, {2000, 54.4, 0.066}, {5000, 119.65, 0.0645}},
			[2]float64{54.4, 2000}, 1000, 5000, 30, 182516.666666666667, 75.629166666666667, 0.066/0.5e-6 + 2000},
	}
	for _, c := range cases {
		for _, pt := range c.points {
			if got := c.p.Rise(pt.z); !scalar.EqualWithinAbs(got, pt.rise, 1e-11) {
				t.Errorf("%s: Rise(%g m) = %.15g K, want %g", c.name, pt.z, got, pt.rise)
			}
			if got := c.p.HeatFlow(pt.z); !scalar.EqualWithinAbs(got, pt.q, 1e-15) {
				t.Errorf("%s: HeatFlow(%g m) = %.15g W/m², want %g", c.name, pt.z, got, pt.q)
			}
		}
		if got := c.p.Depth(c.depthOf[0]); !scalar.EqualWithinAbs(got, c.depthOf[1], 1e-9) {
			t.Errorf("%s: Depth(%g K) = %.15g m, want %g", c.name, c.depthOf[0], got, c.depthOf[1])
		}
		if got := c.p.excess(c.d, c.a, c.b); !scalar.EqualWithinRel(got, c.excess, 1e-12) {
			t.Errorf("%s: ∫(Rise − %g) over %g–%g m = %.15g K·m, want %.15g", c.name, c.d, c.a, c.b, got, c.excess)
		}
		if got := c.p.MeanRise(c.a, c.b); !scalar.EqualWithinRel(got, c.mean, 1e-12) {
			t.Errorf("%s: MeanRise(%g, %g m) = %.15g K, want %.15g", c.name, c.a, c.b, got, c.mean)
		}
		if got := c.p.PeakDepth(); !scalar.EqualWithinRel(got, c.peak, 1e-12) {
			t.Errorf("%s: PeakDepth = %.15g m, want %g", c.name, got, c.peak)
		}
	}
	if got := one.Rise(65000); !scalar.EqualWithinRel(got, 845, 1e-12) {
		t.Errorf("one rock: Rise at the peak = %.15g K, want 845", got)
	}
	if got := one.Temperature(10, 5000); !scalar.EqualWithinAbs(got, 135, 1e-11) {
		t.Errorf("one rock: T(5 km) = %.15g °C under 10 °C, want 135", got)
	}
}

// TestProfilePeak checks the temperature maximum where the heat flow falls
// to zero, worked by hand. q0 = 30 mW/m²; 0–10 km k = 2.5, A = 5 µW/m³;
// then k = 3, A = 0: 0.012 K/m, 1e-6 K/m²; q = 0 at 0.03/5e-6 = 6 km,
// rise 0.012·6000 − 1e-6·6000² = 72 − 36 = 36 K; Depth(20 K) =
// 40/(0.012 + √(1.44e-4 − 8e-5)) = 40/0.02 = 2000 m; rises above 36 K are
// never reached. Below 10 km, q = 0.03 − 0.05 = −0.02 W/m²: the rise falls.
func TestProfilePeak(t *testing.T) {
	t.Parallel()
	p := mustConductive(t, 0.03, []ConductiveLayer{{10000, 2.5, 5e-6}, {20000, 3, 0}})
	if got := p.PeakDepth(); !scalar.EqualWithinRel(got, 6000, 1e-14) {
		t.Errorf("PeakDepth = %.15g m, want 6000", got)
	}
	if got := p.Rise(6000); !scalar.EqualWithinRel(got, 36, 1e-14) {
		t.Errorf("Rise(6 km) = %.15g K, want 36", got)
	}
	if got := p.Depth(20); !scalar.EqualWithinAbs(got, 2000, 1e-9) {
		t.Errorf("Depth(20 K) = %.15g m, want 2000", got)
	}
	for _, r := range []float64{36.000001, 40, 1000} {
		if got := p.Depth(r); !math.IsInf(got, 1) {
			t.Errorf("Depth(%g K) = %g m, want +Inf (above the 36 K peak)", r, got)
		}
	}
	if got := p.HeatFlow(15000); !scalar.EqualWithinAbs(got, -0.02, 1e-15) {
		t.Errorf("HeatFlow(15 km) = %.15g W/m², want −0.02", got)
	}
	if a, b := p.Rise(12000), p.Rise(14000); !(b < a) {
		t.Errorf("Rise(12 km) = %g K, Rise(14 km) = %g K: want falling below the peak", a, b)
	}
	for _, q := range []Profile{UniformProfile(0.03), mustProfile(t, []Layer{{1000, 0.02}}),
		mustConductive(t, 0.06, []ConductiveLayer{{5000, 2, 3e-6}, {9000, 3, 0}})} {
		if got := q.PeakDepth(); !math.IsInf(got, 1) {
			t.Errorf("PeakDepth = %g m, want +Inf (heat flow positive everywhere)", got)
		}
	}
}

// TestConductiveNoHeatProduction checks that without heat production a
// conductive profile is the gradient profile of q0/k in each layer
// (Fourier's law, q = k·dT/dz), bit for bit.
func TestConductiveNoHeatProduction(t *testing.T) {
	t.Parallel()
	q0 := 0.065 // a variable, so that q0/k is rounded as at run time
	hom := HomogeneousProfile(q0, 2.5, 0)
	uni := UniformProfile(q0 / 2.5)
	con := mustConductive(t, q0, []ConductiveLayer{{1500, 2.1, 0}, {4000, 3.2, 0}, {6000, 2.7, 0}})
	lay := mustProfile(t, []Layer{{1500, q0 / 2.1}, {4000, q0 / 3.2}, {6000, q0 / 2.7}})
	for _, z := range []float64{0, 700, 1500, 2600, 4000, 5999, 6000, 8000, 12000} {
		if a, b := hom.Rise(z), uni.Rise(z); a != b {
			t.Errorf("Rise(%g m): homogeneous %.17g, uniform %.17g K", z, a, b)
		}
		if a, b := con.Rise(z), lay.Rise(z); a != b {
			t.Errorf("Rise(%g m): conductive %.17g, gradient layers %.17g K", z, a, b)
		}
		if r := uni.Rise(z); hom.Depth(r) != uni.Depth(r) || con.Depth(r) != lay.Depth(r) {
			t.Errorf("Depth(%g K) differs between conductive and gradient profiles", r)
		}
		if q := con.HeatFlow(z); !scalar.EqualWithinRel(q, q0, 1e-15) {
			t.Errorf("HeatFlow(%g m) = %.17g W/m², want q0 = %g", z, q, q0)
		}
	}
	for _, ab := range [][2]float64{{0, 6000}, {1000, 5000}, {3000, 9000}} {
		if x, y := con.excess(40, ab[0], ab[1]), lay.excess(40, ab[0], ab[1]); x != y {
			t.Errorf("excess over %v m: conductive %.17g, gradient layers %.17g K·m", ab, x, y)
		}
	}
}

// TestHeatFlowContinuity checks that the heat flow is continuous across
// layer boundaries and falls by the heat produced above, q(z) = q0 −
// ∫_0^z A dz (energy conservation in steady conduction; Turcotte &
// Schubert, ch. 4), while the gradient jumps by the conductivity ratio.
func TestHeatFlowContinuity(t *testing.T) {
	t.Parallel()
	rnd := rand.New(rand.NewPCG(1, 1))
	for trial := range 50 {
		q0, layers := randomConductive(rnd)
		p := mustConductive(t, q0, layers)
		produced, top := 0.0, 0.0
		for i, l := range layers[:len(layers)-1] {
			produced += l.HeatProduction * (l.Bottom - top)
			top = l.Bottom
			// 1 mm either side, q changes by the heat produced in 1 mm of
			// the layer above or below; no jump at the boundary.
			const eps = 1e-3 // m
			above, at, below := p.HeatFlow(l.Bottom-eps), p.HeatFlow(l.Bottom), p.HeatFlow(l.Bottom+eps)
			want := q0 - produced
			wantAbove, wantBelow := want+l.HeatProduction*eps, want-layers[i+1].HeatProduction*eps
			if !scalar.EqualWithinAbs(at, want, 1e-15) || !scalar.EqualWithinAbs(above, wantAbove, 1e-15) || !scalar.EqualWithinAbs(below, wantBelow, 1e-15) {
				t.Errorf("trial %d, bottom of layer %d at %g m: q above %.15g, at %.15g, below %.15g W/m², want %.15g, %.15g, %.15g",
					trial, i+1, l.Bottom, above, at, below, wantAbove, want, wantBelow)
			}
			ga, gb := p.Gradient(l.Bottom), p.Gradient(l.Bottom+eps)
			if !scalar.EqualWithinRel(ga*l.Conductivity, want, 1e-14) || !scalar.EqualWithinRel(gb*layers[i+1].Conductivity, wantBelow, 1e-14) {
				t.Errorf("trial %d, layer %d: k·dT/dz above %.15g, below %.15g W/m², want %.15g, %.15g",
					trial, i+1, ga*l.Conductivity, gb*layers[i+1].Conductivity, want, wantBelow)
			}
		}
	}
}

// randomConductive returns a surface heat flow, W/m², and 1 to 4 layers of
// crustal conductivities and heat productions (common practice: 1.5–4
// W/(m·K), 0–3 µW/m³, heat flow 40–120 mW/m²).
func randomConductive(rnd *rand.Rand) (float64, []ConductiveLayer) {
	n := 1 + rnd.IntN(4)
	layers := make([]ConductiveLayer, n)
	bottom := 0.0
	for i := range layers {
		bottom += 300 + 4000*rnd.Float64()
		layers[i] = ConductiveLayer{Bottom: bottom, Conductivity: 1.5 + 2.5*rnd.Float64(), HeatProduction: 3e-6 * rnd.Float64()}
	}
	return 0.04 + 0.08*rnd.Float64(), layers
}

// TestDepthInvertsRise checks Depth(Rise(z)) = z and Rise(Depth(r)) = r
// above the peak, on random conductive profiles, and that Depth is +Inf
// above the peak's rise.
func TestDepthInvertsRise(t *testing.T) {
	t.Parallel()
	rnd := rand.New(rand.NewPCG(2, 1))
	for trial := range 200 {
		q0, layers := randomConductive(rnd)
		p := mustConductive(t, q0, layers)
		peak := p.PeakDepth()
		zmax := min(0.95*peak, 20000)
		for range 20 {
			z := zmax * rnd.Float64()
			if d := p.Depth(p.Rise(z)); !scalar.EqualWithinAbs(d, z, 1e-8) {
				t.Errorf("trial %d: Depth(Rise(%.12g m)) = %.12g m", trial, z, d)
			}
			r := p.Rise(zmax) * rnd.Float64()
			if got := p.Rise(p.Depth(r)); !scalar.EqualWithinAbs(got, r, 1e-10) {
				t.Errorf("trial %d: Rise(Depth(%.12g K)) = %.12g K", trial, r, got)
			}
		}
		if !math.IsInf(peak, 1) {
			if d := p.Depth(p.Rise(peak) * (1 + 1e-9)); !math.IsInf(d, 1) {
				t.Errorf("trial %d: Depth above the peak rise %g K = %g m, want +Inf", trial, p.Rise(peak), d)
			}
		}
	}
}

// TestProfileIntegralQuadrature checks the exact excess integral and
// MeanRise against Gauss–Legendre quadrature of Rise (gonum
// integrate/quad.Fixed, 8 nodes per layer piece, exact for polynomials to
// degree 15), on random conductive and gradient profiles.
func TestProfileIntegralQuadrature(t *testing.T) {
	t.Parallel()
	rnd := rand.New(rand.NewPCG(3, 1))
	for trial := range 100 {
		q0, layers := randomConductive(rnd)
		p := mustConductive(t, q0, layers)
		if trial%4 == 3 {
			gl := make([]Layer, len(layers))
			for i, l := range layers {
				gl[i] = Layer{Bottom: l.Bottom, Gradient: 0.015 + 0.04*rnd.Float64()}
			}
			p = mustProfile(t, gl)
		}
		a := 8000 * rnd.Float64()
		b := a + 8000*rnd.Float64()
		d := 100 * rnd.Float64()
		edges := []float64{a}
		for _, l := range layers {
			if l.Bottom > a && l.Bottom < b {
				edges = append(edges, l.Bottom)
			}
		}
		edges = append(edges, b)
		want := 0.0
		for i := range edges[:len(edges)-1] {
			want += quad.Fixed(func(z float64) float64 { return p.Rise(z) - d }, edges[i], edges[i+1], 8, quad.Legendre{}, 0)
		}
		if got := p.excess(d, a, b); !scalar.EqualWithinAbsOrRel(got, want, 1e-9, 1e-12) {
			t.Errorf("trial %d: ∫(Rise − %g) over %g–%g m = %.15g, quadrature %.15g K·m", trial, d, a, b, got, want)
		}
		mean := (want + d*(b-a)) / (b - a)
		if got := p.MeanRise(a, b); !scalar.EqualWithinRel(got, mean, 1e-12) {
			t.Errorf("trial %d: MeanRise(%g, %g m) = %.15g, quadrature %.15g K", trial, a, b, got, mean)
		}
	}
	p := HomogeneousProfile(0.065, 2.5, 1e-6)
	if got := p.MeanRise(3000, 3000); got != p.Rise(3000) {
		t.Errorf("MeanRise(3 km, 3 km) = %g, want Rise(3 km) = %g", got, p.Rise(3000))
	}
}

// TestExponentialHeatProduction checks many thin layers against the
// geotherm of heat production decaying with depth, A = A0·e^(−z/hr)
// (Turcotte & Schubert, "Geodynamics", ch. 4):
//
//	T(z) = T0 + qm·z/k + (A0·hr²/k)·(1 − e^(−z/hr)),  qm = q0 − A0·hr
//
// With T0 = 10 °C, q0 = 65 mW/m², k = 2.5 W/(m·K), A0 = 2.5 µW/m³,
// hr = 10 km: qm = 0.065 − 0.025 = 0.040 W/m², A0·hr²/k = 100 K, so
// T(5 km) = 10 + 80 + 100·(1 − e^(−0.5)) = 90 + 39.346934 = 129.346934 °C
// and T(10 km) = 10 + 160 + 100·(1 − e^(−1)) = 233.212056 °C. Each layer
// of thickness h carries the mean heat production of its depths, so the
// heat flow is exact at the boundaries and linear between; the
// temperature then exceeds the exact one by (h²/12)·∫q″dz/k =
// h²·(A(0) − A(z))/(12k) to leading order, the error of the trapezoid rule.
func TestExponentialHeatProduction(t *testing.T) {
	t.Parallel()
	const (
		t0, q0, k, a0, hr = 10.0, 0.065, 2.5, 2.5e-6, 10000.0
		h                 = 100.0 // m
	)
	var layers []ConductiveLayer
	for top := 0.0; top < 20000; top += h {
		mean := a0 * hr * (math.Exp(-top/hr) - math.Exp(-(top+h)/hr)) / h
		layers = append(layers, ConductiveLayer{Bottom: top + h, Conductivity: k, HeatProduction: mean})
	}
	p := mustConductive(t, q0, layers)
	exact := func(z float64) float64 {
		return t0 + (q0-a0*hr)*z/k + a0*hr*hr/k*(-math.Expm1(-z/hr))
	}
	for _, c := range []struct{ z, hand float64 }{{5000, 129.346934}, {10000, 233.212056}, {2550, 0}} {
		if c.hand != 0 && !scalar.EqualWithinAbs(exact(c.z), c.hand, 1e-6) {
			t.Errorf("formula T(%g m) = %.9g °C, hand value %.9g", c.z, exact(c.z), c.hand)
		}
		got, want := p.Temperature(t0, c.z), exact(c.z)
		lead := h * h * (a0 - a0*math.Exp(-c.z/hr)) / (12 * k)
		if !scalar.EqualWithinAbs(got-want, lead, 0.05*lead) {
			t.Errorf("T(%g m) = %.12g °C, exact %.12g: difference %.4g K, want %.4g (leading-order error)", c.z, got, want, got-want, lead)
		}
		// q = q0 − A0·hr·(1 − e^(−z/hr)): exact at layer boundaries, and off
		// by at most h²/8·max|q''| = h²·A0/(8·hr) between them (linear
		// interpolation).
		tol := 1e-14
		if math.Mod(c.z, h) != 0 {
			tol = h * h * a0 / (8 * hr)
		}
		if q, wq := p.HeatFlow(c.z), q0-a0*hr*(-math.Expm1(-c.z/hr)); !scalar.EqualWithinAbs(q, wq, tol) {
			t.Errorf("HeatFlow(%g m) = %.12g W/m², exact %.12g", c.z, q, wq)
		}
	}
}

// TestProfileLayerErrors checks that every problem of the layers is
// reported as a *LayerError with the layer, field and SI value, and that
// good layers are accepted.
func TestProfileLayerErrors(t *testing.T) {
	t.Parallel()
	inf, nan := math.Inf(1), math.NaN()
	type want = layerWant
	cases := []struct {
		name   string
		q0     float64
		layers []ConductiveLayer
		want   []want
		none   bool // ErrNoLayers
	}{
		{"good", 0.065, []ConductiveLayer{{2000, 2.5, 1e-6}, {9000, 3, 0}}, nil, false},
		{"no layers", 0.065, nil, nil, true},
		{"no layers, no heat flow", 0, nil, []want{{0, FieldHeatFlow, 0}}, true},
		{"heat flow", -0.01, []ConductiveLayer{{2000, 2.5, 0}}, []want{{0, FieldHeatFlow, -0.01}}, false},
		{"heat flow infinite", inf, []ConductiveLayer{{2000, 2.5, 0}}, []want{{0, FieldHeatFlow, inf}}, false},
		{"conductivity", 0.065, []ConductiveLayer{{2000, 0, 0}, {3000, -1, 0}}, []want{{1, FieldConductivity, 0}, {2, FieldConductivity, -1}}, false},
		{"heat production", 0.065, []ConductiveLayer{{2000, 2, -1e-6}, {3000, 2, nan}}, []want{{1, FieldHeatProduction, -1e-6}, {2, FieldHeatProduction, nan}}, false},
		{"bottoms", 0.065, []ConductiveLayer{{0, 2, 0}, {-5, 2, 0}, {inf, 2, 0}}, []want{{1, FieldBottom, 0}, {2, FieldBottom, -5}, {3, FieldBottom, inf}}, false},
		{"all", 0, []ConductiveLayer{{3000, 0, 0}, {2000, 2, -1}}, []want{{0, FieldHeatFlow, 0}, {1, FieldConductivity, 0}, {2, FieldBottom, 2000}, {2, FieldHeatProduction, -1}}, false},
	}
	for _, c := range cases {
		_, err := NewConductiveProfile(c.q0, c.layers)
		if c.want == nil && !c.none {
			if err != nil {
				t.Errorf("%s: unexpected error %v", c.name, err)
			}
			continue
		}
		if err == nil {
			t.Errorf("%s: no error", c.name)
			continue
		}
		if got := errors.Is(err, ErrNoLayers); got != c.none {
			t.Errorf("%s: errors.Is(err, ErrNoLayers) = %t, want %t", c.name, got, c.none)
		}
		checkLayerErrors(t, c.name, err, c.want)
	}
	_, err := NewProfile([]Layer{{2000, 0.03}, {1000, 0}, {nan, 0.02}})
	checkLayerErrors(t, "gradient layers", err, []want{{2, FieldBottom, 1000}, {2, FieldGradient, 0}, {3, FieldBottom, nan}})
	if _, err := NewProfile(nil); !errors.Is(err, ErrNoLayers) {
		t.Errorf("NewProfile(nil) = %v, want ErrNoLayers", err)
	}
}

// layerWant is an expected *LayerError.
type layerWant struct {
	layer int
	field LayerField
	value float64
}

// checkLayerErrors checks that the joined err holds exactly the
// *LayerErrors of want, in order, each with a readable message naming the
// layer, the value with its SI unit, and the reason.
func checkLayerErrors(t *testing.T, name string, err error, want []layerWant) {
	t.Helper()
	var got []*LayerError
	for _, e := range unjoinErrors(err) {
		if le, ok := e.(*LayerError); ok {
			got = append(got, le)
		}
	}
	if len(got) != len(want) {
		t.Errorf("%s: %d layer errors %v, want %d", name, len(got), err, len(want))
		return
	}
	for i, w := range want {
		g := got[i]
		sameValue := g.Value == w.value || (math.IsNaN(g.Value) && math.IsNaN(w.value))
		if g.Layer != w.layer || g.Field != w.field || !sameValue || g.Reason == "" {
			t.Errorf("%s: error %d = %+v, want layer %d, field %s, value %g", name, i, *g, w.layer, w.field, w.value)
		}
		msg := g.Error()
		where := fmt.Sprintf("layer %d:", w.layer)
		if w.layer == 0 {
			where = "surface heat flow"
		}
		for _, s := range []string{where, fmt.Sprintf("%g %s", w.value, w.field.Unit()), g.Reason} {
			if !strings.Contains(msg, s) {
				t.Errorf("%s: message %q does not contain %q", name, msg, s)
			}
		}
	}
}

func unjoinErrors(err error) []error {
	if j, ok := err.(interface{ Unwrap() []error }); ok {
		return j.Unwrap()
	}
	return []error{err}
}

// TestHomogeneousProfilePanics checks that bad values, a programmer's
// error once the scenario is checked, panic.
func TestHomogeneousProfilePanics(t *testing.T) {
	t.Parallel()
	inf, nan := math.Inf(1), math.NaN()
	for _, v := range [][3]float64{{0, 2.5, 0}, {0.06, 0, 0}, {0.06, 2.5, -1e-6}, {nan, 2.5, 0}, {0.06, inf, 0}, {0.06, 2.5, nan}} {
		func() {
			defer func() {
				if recover() == nil {
					t.Errorf("HomogeneousProfile%v did not panic", v)
				}
			}()
			HomogeneousProfile(v[0], v[1], v[2])
		}()
	}
}

// TestSetConductiveReuse checks that rebuilding a profile in place gives
// the profile of the constructor, leaves it unchanged on error, and does
// not allocate once its storage is large enough (testing.AllocsPerRun).
func TestSetConductiveReuse(t *testing.T) {
	layers := []ConductiveLayer{{1500, 2.1, 2e-6}, {4000, 3.2, 1e-6}, {6000, 2.7, 0.5e-6}}
	var p Profile
	if err := p.SetConductive(0.07, layers); err != nil {
		t.Fatal(err)
	}
	want := mustConductive(t, 0.08, layers)
	if err := p.SetConductive(0.08, layers); err != nil {
		t.Fatal(err)
	}
	for _, z := range []float64{0, 1000, 1500, 3000, 7000} {
		if a, b := p.Rise(z), want.Rise(z); a != b {
			t.Errorf("rebuilt Rise(%g m) = %g, constructor %g K", z, a, b)
		}
	}
	if err := p.SetConductive(-1, layers); err == nil {
		t.Error("SetConductive(−1 W/m²) gave no error")
	}
	if a, b := p.Rise(3000), want.Rise(3000); a != b {
		t.Errorf("after a failed rebuild Rise(3 km) = %g, want %g K unchanged", a, b)
	}
	gl := []Layer{{1500, 0.03}, {4000, 0.025}, {6000, 0.02}}
	allocs := testing.AllocsPerRun(100, func() {
		layers[1].HeatProduction += 1e-9
		if p.SetConductive(0.08, layers) != nil {
			t.Fatal("rebuild failed")
		}
		gl[0].Gradient += 1e-6
		if p.SetLayers(gl) != nil {
			t.Fatal("rebuild failed")
		}
	})
	if allocs != 0 {
		t.Errorf("SetConductive and SetLayers allocate %g times per rebuild, want 0", allocs)
	}
}

func BenchmarkProfile(b *testing.B) {
	layers := []ConductiveLayer{{1500, 2.1, 2e-6}, {4000, 3.2, 1e-6}, {6000, 2.7, 0.5e-6}}
	var p Profile
	b.Run("SetConductive", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			if err := p.SetConductive(0.07, layers); err != nil {
				b.Fatal(err)
			}
		}
	})
	sink := 0.0
	b.Run("RiseDepthMean", func(b *testing.B) {
		b.ReportAllocs()
		for b.Loop() {
			z := p.Depth(110)
			sink += p.Rise(z) + p.MeanRise(z, 6000)
		}
	})
	_ = sink
}

// ExampleNewConductiveProfile builds the geotherm of two layers of
// radiogenic rock under a surface heat flow of 70 mW/m² (the hand values
// of TestConductiveProfileHand).
func ExampleNewConductiveProfile() {
	p, err := NewConductiveProfile(0.070, []ConductiveLayer{
		{Bottom: 2000, Conductivity: 2.5, HeatProduction: 2e-6},
		{Bottom: 6000, Conductivity: 3.0, HeatProduction: 0.5e-6},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	const ts = 10 // °C
	fmt.Printf("T(5 km)        %.2f °C\n", p.Temperature(ts, 5000))
	fmt.Printf("q(5 km)        %.1f mW/m²\n", 1000*p.HeatFlow(5000))
	fmt.Printf("100 °C at      %.0f m\n", p.Depth(100-ts))
	fmt.Printf("mean T 1–5 km  %.4f °C\n", ts+p.MeanRise(1000, 5000))

	_, err = NewConductiveProfile(0.070, []ConductiveLayer{{Bottom: 2000, Conductivity: 0}})
	fmt.Println(err)
	// Output:
	// T(5 km)        129.65 °C
	// q(5 km)        64.5 mW/m²
	// 100 °C at      3628 m
	// mean T 1–5 km  85.6292 °C
	// heatmodel: layer 1: conductivity 0 W/(m·K) is not finite and > 0: give the rock's thermal conductivity, > 0
}
