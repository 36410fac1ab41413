package heatmodel

import (
	"math"
	"testing"

	"rockheat/heatmodel/water"
)

// TestSatLiquidTable holds the saturated-liquid table to the function it
// tabulates, water.SaturatedLiquid (IAPWS-IF97, itself checked against
// the release's verification tables in package water), at 200 000
// temperatures across its range, its nodes and both ends among them:
// within the stated 2·10⁻⁶ J/kg and 3·10⁻⁹ J/(kg·K); and the exergy
// fraction of fluid from 100 °C to 350 °C against a 15 °C dead state
// within 10⁻¹⁰ of the one from water.SaturatedLiquid. Outside the range
// it gives water.SaturatedLiquid's error.
func TestSatLiquidTable(t *testing.T) {
	t.Parallel()
	lo, hi := water.MinTemperature, water.Region1MaxTemperature
	dead, err := water.Liquid(Atmosphere, 288.15)
	if err != nil {
		t.Fatal(err)
	}
	var dh, ds, df float64
	const n = 200_000
	for i := 0; i <= n; i++ {
		T := lo + (hi-lo)*float64(i)/n
		if i%49 == 0 { // a node, and the float just above it
			k := math.Round((T - lo) / (hi - lo) * satLiquidCells)
			T = min(lo+k*(hi-lo)/satLiquidCells, hi)
		}
		want, err := water.SaturatedLiquid(T)
		if err != nil {
			t.Fatal(err)
		}
		h, s, err := saturatedLiquidHS(T)
		if err != nil {
			t.Fatalf("%.4f K: %v", T, err)
		}
		dh, ds = max(dh, math.Abs(h-want.Enthalpy)), max(ds, math.Abs(s-want.Entropy))
		if T >= 373.15 {
			got := ExergyFraction(h, s, dead.Enthalpy, dead.Entropy, 288.15)
			ref := ExergyFraction(want.Enthalpy, want.Entropy, dead.Enthalpy, dead.Entropy, 288.15)
			df = max(df, math.Abs(got-ref))
		}
	}
	if dh > 2e-6 || ds > 3e-9 || df > 1e-10 {
		t.Errorf("table against IF97: |Δh| ≤ %.3g J/kg, |Δs| ≤ %.3g J/(kg·K), |Δ(W/Qr)| ≤ %.3g; want ≤ 2e-6, 3e-9, 1e-10", dh, ds, df)
	}
	for _, T := range []float64{lo - 1e-9, hi + 1e-9, math.NaN()} {
		if _, _, err := saturatedLiquidHS(T); err == nil {
			t.Errorf("%v K: no error outside the table", T)
		}
	}
}

// BenchmarkSatLiquid measures a look-up in the table beside the function
// it tabulates.
func BenchmarkSatLiquid(b *testing.B) {
	Ts := make([]float64, 1024)
	for i := range Ts {
		Ts[i] = 373.15 + 250*float64((i*613)%1024)/1024
	}
	b.Run("table", func(b *testing.B) {
		i := 0
		for b.Loop() {
			h, _, _ := saturatedLiquidHS(Ts[i&1023])
			sinkH += h
			i++
		}
	})
	b.Run("if97", func(b *testing.B) {
		i := 0
		for b.Loop() {
			st, _ := water.SaturatedLiquid(Ts[i&1023])
			sinkH += st.Enthalpy
			i++
		}
	})
}

var sinkH float64
