package heatmodel

// GeothermMode says how a batch's geotherms are given.
type GeothermMode int

const (
	// GeothermGradient is a uniform gradient per trial (Gradient).
	GeothermGradient GeothermMode = iota
	// GeothermHeatFlow is one rock from the surface down under a surface
	// heat flow, per trial (HeatFlow, Conductivity, HeatProduction).
	GeothermHeatFlow
	// GeothermLayers is layers of given gradients (Layers: Bottom,
	// Gradient).
	GeothermLayers
	// GeothermConductiveLayers is layers of rock under a surface heat flow
	// (HeatFlow; Layers: Bottom, Conductivity, HeatProduction).
	GeothermConductiveLayers
)

// LayerColumns are one layer's parameters over a batch, in SI units.
type LayerColumns struct {
	Bottom         Column // m
	Gradient       Column // K/m, GeothermLayers
	Conductivity   Column // W/(m·K), GeothermConductiveLayers
	HeatProduction Column // W/m³, GeothermConductiveLayers
}

// GeothermColumns is the geotherm of each trial of a batch, in SI units,
// of the shape Mode says; Fixed, when not zero, is every trial's profile
// (a geotherm whose parameters are all fixed, built once). At builds a
// layered profile in a scratch Profile of its own, so a GeothermColumns is
// not safe for concurrent use: give each goroutine its own.
type GeothermColumns struct {
	Mode                                   GeothermMode
	Fixed                                  Profile
	Gradient                               Column // K/m
	HeatFlow, Conductivity, HeatProduction Column // W/m², W/(m·K), W/m³
	Layers                                 []LayerColumns

	scratch Profile
	lay     []Layer
	clay    []ConductiveLayer
}

// At returns the profile of trial i. A layered profile is rebuilt in the
// scratch profile and is valid until the next call. It returns an error
// for parameters no profile can have (layers out of order), as a joined
// *LayerError.
func (g *GeothermColumns) At(i int) (Profile, error) {
	if !g.Fixed.IsZero() {
		return g.Fixed, nil
	}
	switch g.Mode {
	case GeothermHeatFlow:
		return HomogeneousProfile(g.HeatFlow.At(i), g.Conductivity.At(i), g.HeatProduction.At(i)), nil
	case GeothermLayers:
		g.lay = g.lay[:0]
		for _, l := range g.Layers {
			g.lay = append(g.lay, Layer{Bottom: l.Bottom.At(i), Gradient: l.Gradient.At(i)})
		}
		err := g.scratch.SetLayers(g.lay)
		return g.scratch, err
	case GeothermConductiveLayers:
		g.clay = g.clay[:0]
		for _, l := range g.Layers {
			g.clay = append(g.clay, ConductiveLayer{Bottom: l.Bottom.At(i), Conductivity: l.Conductivity.At(i), HeatProduction: l.HeatProduction.At(i)})
		}
		err := g.scratch.SetConductive(g.HeatFlow.At(i), g.clay)
		return g.scratch, err
	}
	return UniformProfile(g.Gradient.At(i)), nil
}

// Freeze builds into Fixed the one profile of a g whose every parameter is
// the same for all trials (Const columns), copied so that At's scratch
// cannot change it.
func (g *GeothermColumns) Freeze() error {
	p, err := g.At(0)
	if err != nil {
		return err
	}
	if p.segs != nil {
		p.segs = append([]segment(nil), p.segs...)
	}
	g.Fixed = p
	return nil
}
