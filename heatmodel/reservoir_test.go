package heatmodel

import (
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

const julianYear = 365.25 * 86400 // s

// TestReservoirHandCalculation checks the model against the Muffler &
// Cataldi (1978) formula evaluated by hand, for all-fixed inputs.
//
// Case "granite block": granite ρr = 2650 kg/m³, cr = 900 J/(kg·K)
// (Lorenz & Zimbelman 2014, Table 18.1), water ρf·cf = 1000·4180 (common
// practice), A = 10 km² = 1e7 m², h = 1000 m, φ = 0.1, Tr = 250 °C,
// Tref = 15 °C, R = 0.25, η = 0.12, F = 0.9, L = 30 years of 365.25 d:
//
//	ρC  = 0.9·2650·900 + 0.1·1000·4180 = 2 146 500 + 418 000 = 2 564 500 J/(m³·K)
//	Q   = 1e7 · 1e3 · 2 564 500 · 235  = 6.026575e18 J
//	Qr  = 0.25·Q                       = 1.50664375e18 J
//	L   = 30 · 365.25 · 86400          = 9.46728e8 s
//	Pth = Qr / L                       = 1.5914220e9 W
//	Pe  = 0.12·Qr / (0.9·L)            = 2.1218960e8 W
//
// Case "USGS chain": the derived check of docs/references.md §8 (formula of USGS
// Circular 790): ρC = 2.7 MJ/(m³·K) as a dry rock of 2700 kg/m³ and
// 1000 J/(kg·K), A = 10 km², Δz = 1 km, 250 → 15 °C: Q = 6.345e18 J,
// Qr = R·Q = 1.58625e18 J with R = 0.25.
func TestReservoirHandCalculation(t *testing.T) {
	t.Parallel()
	cases := []struct {
		name                                       string
		area, h, phi, rhoR, cR, rhoF, cF, tr, tref float64
		r, eta, f, life                            float64
		q, qr, pth, pe                             float64
	}{
		{"granite block", 1e7, 1000, 0.1, 2650, 900, 1000, 4180, 523.15, 288.15, 0.25, 0.12, 0.9, 30 * julianYear,
			6.026575e18, 1.50664375e18, 1.5914220e9, 2.1218960e8},
		{"USGS chain", 1e7, 1000, 0, 2700, 1000, 1000, 4180, 523.15, 288.15, 0.25, 0.1, 1, 30 * julianYear,
			6.345e18, 1.58625e18, 1.58625e18 / (30 * julianYear), 0.1 * 1.58625e18 / (30 * julianYear)},
	}
	for _, c := range cases {
		r := Reservoir{
			Area: Const(c.area), Thickness: Const(c.h), Porosity: Const(c.phi),
			RockDensity: Const(c.rhoR), RockHeatCapacity: Const(c.cR),
			FluidDensity: Const(c.rhoF), FluidHeatCapacity: Const(c.cF),
			ReservoirTemp: Const(c.tr), ReferenceTemp: Const(c.tref),
			RecoveryFactor: Const(c.r), ConversionEfficiency: Const(c.eta),
			CapacityFactor: Const(c.f), Life: Const(c.life),
		}
		out := newOutputs(1)
		if z := r.Evaluate(1, out); z != 0 {
			t.Errorf("%s: %d zero-heat trials, want 0", c.name, z)
		}
		for _, x := range []struct {
			what      string
			got, want float64
		}{
			{"heat in place", out.HeatInPlace[0], c.q},
			{"recoverable heat", out.RecoverableHeat[0], c.qr},
			{"thermal power", out.ThermalPower[0], c.pth},
			{"electric power", out.ElectricPower[0], c.pe},
		} {
			// The hand values carry 8 significant digits.
			if !scalar.EqualWithinRel(x.got, x.want, 1e-7) {
				t.Errorf("%s: %s = %.9g, want %.9g", c.name, x.what, x.got, x.want)
			}
		}
	}
}

func newOutputs(n int) ReservoirOutputs {
	return ReservoirOutputs{HeatInPlace: make([]float64, n), RecoverableHeat: make([]float64, n), ThermalPower: make([]float64, n),
		ElectricPower: make([]float64, n), PowerDensity: make([]float64, n)}
}

// TestReservoirZeroHeat checks that trials at or below the reference
// temperature give no heat and are counted, and that the others are
// unaffected by them (per-trial columns).
func TestReservoirZeroHeat(t *testing.T) {
	t.Parallel()
	temps := []float64{300, 288.15, 250, 400}
	r := Reservoir{
		Area: Const(1e6), Thickness: Const(100), Porosity: Const(0),
		RockDensity: Const(2650), RockHeatCapacity: Const(900),
		FluidDensity: Const(1000), FluidHeatCapacity: Const(4180),
		ReservoirTemp: Vary(temps), ReferenceTemp: Const(288.15),
		RecoveryFactor: Const(1), ConversionEfficiency: Const(1), CapacityFactor: Const(1), Life: Const(1),
	}
	out := newOutputs(len(temps))
	if z := r.Evaluate(len(temps), out); z != 2 {
		t.Fatalf("zero-heat trials = %d, want 2", z)
	}
	for i, tr := range temps {
		want := 0.0
		if tr > 288.15 {
			want = 1e6 * 100 * 2650 * 900 * (tr - 288.15)
		}
		if !scalar.EqualWithinRel(out.HeatInPlace[i], want, 1e-12) {
			t.Errorf("trial %d: Q = %g, want %g", i, out.HeatInPlace[i], want)
		}
	}
}

func BenchmarkReservoir(b *testing.B) {
	const n = 1 << 16
	v := func(x float64) Column { return benchColumn(n, x) }
	r := Reservoir{
		Area: v(6e6), Thickness: v(1200), Porosity: v(0.06), RockDensity: Const(2650), RockHeatCapacity: v(900),
		FluidDensity: Const(850), FluidHeatCapacity: Const(4600), ReservoirTemp: v(508), ReferenceTemp: Const(288.15),
		RecoveryFactor: v(0.14), ConversionEfficiency: v(0.11), CapacityFactor: Const(0.9), Life: Const(30 * julianYear),
	}
	out := newOutputs(n)
	for b.Loop() {
		r.Evaluate(n, out)
	}
	b.ReportMetric(float64(b.Elapsed().Nanoseconds())/float64(b.N*n), "ns/trial")
}

// benchColumn returns n values spread within 10 % above x, for benchmarks.
func benchColumn(n int, x float64) Column {
	c := make([]float64, n)
	for i := range c {
		c[i] = x * (1 + float64(i%97)/1000)
	}
	return Vary(c)
}

// TestReservoirChunks: Evaluate, which takes the trials in chunks of
// chunkTrials, gives for every trial exactly what the formula gives for
// that trial alone (Block.HeatInPlace, docs/references.md §1, and the
// power definitions of Evaluate), whichever columns are constant, across
// chunk boundaries and in a last, short chunk, and counts the trials
// without heat.
func TestReservoirChunks(t *testing.T) {
	const n = chunkTestTrials
	vary := func(x float64, step int) Column { return chunkTestColumn(x, step) }
	temps := vary(290, 13) // 290·(1 + k/100) K: every 13th trial at 290 K, some below the 291 K reference
	temps.Values[n-1] = 291
	for _, powerDensity := range []bool{true, false} {
		r := Reservoir{
			Area: vary(6e6, 7), Thickness: vary(1200, 11), ReservoirTemp: temps, ReferenceTemp: Const(291),
			Porosity: vary(0.06, 5), RockDensity: Const(2650), RockHeatCapacity: vary(900, 3),
			FluidDensity: Const(850), FluidHeatCapacity: vary(4600, 17), RecoveryFactor: vary(0.14, 19),
			ConversionEfficiency: Const(0.11), CapacityFactor: vary(0.9, 2), Life: Const(30 * julianYear),
		}
		out := newOutputs(n)
		if !powerDensity {
			out.PowerDensity = nil
		}
		zero := r.Evaluate(n, out)
		wantZero := 0
		for i := range n {
			b := Block{Area: r.Area.At(i), Thickness: r.Thickness.At(i), Porosity: r.Porosity.At(i),
				RockDensity: r.RockDensity.At(i), RockHeatCapacity: r.RockHeatCapacity.At(i),
				FluidDensity: r.FluidDensity.At(i), FluidHeatCapacity: r.FluidHeatCapacity.At(i),
				ReservoirTemp: r.ReservoirTemp.At(i), ReferenceTemp: r.ReferenceTemp.At(i)}
			q := b.HeatInPlace()
			if q == 0 {
				wantZero++
			}
			qr := r.RecoveryFactor.At(i) * q
			pe := r.ConversionEfficiency.At(i) * qr / (r.CapacityFactor.At(i) * r.Life.At(i))
			if out.HeatInPlace[i] != q || out.RecoverableHeat[i] != qr || out.ThermalPower[i] != qr/r.Life.At(i) ||
				out.ElectricPower[i] != pe {
				t.Fatalf("trial %d: got Q %g, Qr %g, Pt %g, Pe %g; want %g, %g, %g, %g", i,
					out.HeatInPlace[i], out.RecoverableHeat[i], out.ThermalPower[i], out.ElectricPower[i],
					q, qr, qr/r.Life.At(i), pe)
			}
			if powerDensity && out.PowerDensity[i] != pe/b.Area {
				t.Fatalf("trial %d: power density %g, want %g", i, out.PowerDensity[i], pe/b.Area)
			}
		}
		if zero != wantZero || wantZero < 2 {
			t.Errorf("zero-heat trials %d, want %d (and the test wants at least 2)", zero, wantZero)
		}
	}
}
