package rockheat

import (
	"math/rand/v2"
	"testing"

	"rockheat/heatmodel"
	"rockheat/sampler"
)

// layeredHotRock is a hot-rock model built in Go, every input fixed but
// the layers of its geotherm.
func layeredHotRock(layers []Layer) *HotRock {
	return &HotRock{
		Area: Fixed(3, SquareKilometre), SurfaceTemp: Fixed(10, Celsius), Geotherm: Geotherm{Layers: layers},
		MinUsefulTemp: Fixed(120, Celsius), MaxDepth: Fixed(6, Kilometre),
		RockDensity: Fixed(2650, KgPerCubicMetre), RockHeatCapacity: Fixed(900, JPerKgK),
		FlowPerArea: Fixed(0.5, FlowPerKm2), FluidDensity: Fixed(1000, KgPerCubicMetre), FluidHeatCapacity: Fixed(4180, JPerKgK),
		ConversionEfficiency: Fixed(0.11, Fraction), CapacityFactor: Fixed(0.9, Fraction), Life: Fixed(30, Year),
	}
}

// TestHottestBoundsEveryTrial draws layered geotherms, of gradients and of
// conductive layers, with uncertain bottoms, gradients, conductivities and
// heat productions, and checks that Geotherm.hottest is at least as hot as
// every one of them at every depth to 12 km: the bound the checks rely on
// to refuse only scenarios that no trial can run.
func TestHottestBoundsEveryTrial(t *testing.T) {
	t.Parallel()
	u := func(lo, hi float64) sampler.Distribution {
		d, err := sampler.NewUniform(lo, hi)
		if err != nil {
			t.Fatal(err)
		}
		return d
	}
	cases := []struct {
		name   string
		layers []Layer
		mode   heatmodel.GeothermMode
	}{
		{"gradients", []Layer{
			{Bottom: Uncertain(u(1, 3), Kilometre), Gradient: Uncertain(u(20, 60), CelsiusPerKm)},
			{Bottom: Uncertain(u(3.5, 6), Kilometre), Gradient: Uncertain(u(15, 25), CelsiusPerKm)},
			{Bottom: Fixed(9, Kilometre), Gradient: Uncertain(u(30, 45), CelsiusPerKm)},
		}, heatmodel.GeothermLayers},
		{"conductive", []Layer{
			{Bottom: Uncertain(u(0.5, 2), Kilometre), Conductivity: Uncertain(u(1.5, 2.5), WattPerMetreK), HeatProduction: Fixed(1, MicrowattPerM3)},
			{Bottom: Uncertain(u(3, 5), Kilometre), Conductivity: Uncertain(u(2.5, 3.5), WattPerMetreK), HeatProduction: Uncertain(u(2, 4), MicrowattPerM3)},
		}, heatmodel.GeothermConductiveLayers},
	}
	rng := rand.New(rand.NewPCG(3, 4))
	for _, c := range cases {
		m := layeredHotRock(c.layers)
		if c.mode == heatmodel.GeothermConductiveLayers {
			m.HeatFlow = Uncertain(u(70, 90), MilliwattPerM2)
		}
		chk, err := (&Run{Title: c.name, Model: m}).resolve()
		if err != nil {
			t.Fatal(err)
		}
		env, ok := m.Geotherm.hottest(chk, c.mode)
		if !ok {
			t.Fatalf("%s: no bound", c.name)
		}
		at := func(q *Quantity) float64 { // a draw within q's range, SI
			lo, hi, ok := chk.span(q)
			if !ok {
				t.Fatalf("%s: an input has no range", c.name)
			}
			return q.Unit.ToSI(lo + rng.Float64()*(hi-lo))
		}
		for range 2000 {
			var prof heatmodel.Profile
			if c.mode == heatmodel.GeothermLayers {
				var ls []heatmodel.Layer
				for i := range m.Layers {
					l := &m.Layers[i]
					ls = append(ls, heatmodel.Layer{Bottom: at(&l.Bottom), Gradient: at(&l.Gradient)})
				}
				prof, err = heatmodel.NewProfile(ls)
			} else {
				var ls []heatmodel.ConductiveLayer
				for i := range m.Layers {
					l := &m.Layers[i]
					ls = append(ls, heatmodel.ConductiveLayer{Bottom: at(&l.Bottom), Conductivity: at(&l.Conductivity), HeatProduction: at(&l.HeatProduction)})
				}
				prof, err = heatmodel.NewConductiveProfile(at(&m.HeatFlow), ls)
			}
			if err != nil {
				t.Fatal(err)
			}
			for z := 0.0; z <= 12000; z += 250 {
				if r, b := prof.Rise(z), env.Rise(z); r > b*(1+1e-12) {
					t.Fatalf("%s: a trial rises %g K at %g m, above the bound's %g K", c.name, r, z, b)
				}
			}
		}
	}
}
