package rockheat

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"rockheat/heatmodel"
)

// Geotherm is the temperature profile below the surface, given one of
// four ways: a Gradient; a surface HeatFlow into one rock of Conductivity
// and HeatProduction; Layers of given gradients; or Layers of rock
// (Conductivity, HeatProduction) under a surface HeatFlow. Field comments
// give the SI unit and, in brackets, the input's own unit. Every parameter
// may be sampled.
type Geotherm struct {
	Gradient       Quantity // K/m (°C/km), > 0
	HeatFlow       Quantity // W/m² (mW/m²), > 0, at the surface
	Conductivity   Quantity // W/(m·K), > 0, of one rock from the surface down
	HeatProduction Quantity // W/m³ (µW/m³), ≥ 0, radiogenic, of that rock; default 0
	Layers         []Layer
}

// Layer is one layer of a piecewise geotherm, from the bottom of the layer
// above (or the surface) down to Bottom; the last continues below its
// bottom. A layer has either a Gradient, or a Conductivity and a
// HeatProduction (under the Geotherm's HeatFlow, the heat flux continuous
// across layers).
type Layer struct {
	Bottom         Quantity // m (km), > 0, below the layer above's
	Gradient       Quantity // K/m (°C/km), > 0
	Conductivity   Quantity // W/(m·K), > 0
	HeatProduction Quantity // W/m³ (µW/m³), ≥ 0; default 0
}

// Units of geotherm inputs.
var (
	MilliwattPerM2  = Unit{"mW/m²", "mw_m2", DimHeatFlow, 1e-3, 0}
	WattPerMetreK   = Unit{"W/(m·K)", "w_mk", DimConductivity, 1, 0}
	MicrowattPerM3  = Unit{"µW/m³", "uw_m3", DimHeatProduction, 1e-6, 0}
	heatFlowRange   = Ranges{Domain{Lo: 0, Hi: 1000, LoOpen: true}, Domain{Lo: 20, Hi: 200}} // mW/m²; continents average 65 (Pollack et al. 1993)
	conductRange    = Ranges{Domain{Lo: 0, Hi: 20, LoOpen: true}, Domain{Lo: 0.5, Hi: 6}}    // W/(m·K); rocks 1–5 (docs/references.md §6)
	productionRange = Ranges{Domain{Lo: 0, Hi: 100}, Domain{Lo: 0, Hi: 10}}                  // µW/m³; granites 2–5 (from memory)
	layerDepthRange = Ranges{Domain{Lo: 0, Hi: 100, LoOpen: true}, Domain{Lo: 0, Hi: 30}}    // km
)

// mode returns the way g is given, or an error saying what is
// missing or doubled.
func (g *Geotherm) mode() (heatmodel.GeothermMode, error) {
	top := g.Gradient.Given() || g.Conductivity.Given() || g.HeatProduction.Given()
	switch {
	case len(g.Layers) > 0 && top:
		return 0, errBesideLayers
	case len(g.Layers) > 0:
		byGrad, byRock := 0, 0
		for _, l := range g.Layers {
			if l.Gradient.Given() {
				byGrad++
			}
			if l.Conductivity.Given() || l.HeatProduction.Given() {
				byRock++
			}
		}
		switch {
		case byGrad == len(g.Layers) && byRock == 0:
			if g.HeatFlow.Given() {
				return 0, errors.New("layers of given gradients take no heat flow; give each layer a conductivity instead, or drop the heat flow")
			}
			return heatmodel.GeothermLayers, nil
		case byRock == len(g.Layers) && byGrad == 0:
			if !g.HeatFlow.Given() {
				return 0, errors.New("layers of rock (conductivity, heat production) need the surface heat flow; give heat_flow_mw_m2")
			}
			return heatmodel.GeothermConductiveLayers, nil
		}
		return 0, errors.New("give every layer a gradient, or every layer a conductivity (and heat production), not a mix")
	case g.HeatFlow.Given() || g.Conductivity.Given() || g.HeatProduction.Given():
		if g.Gradient.Given() {
			return 0, errors.New("give either the gradient or the heat flow and conductivity, not both")
		}
		if !g.HeatFlow.Given() || !g.Conductivity.Given() {
			return 0, errors.New("a geotherm from heat flow needs both heat_flow_mw_m2 and conductivity_w_mk")
		}
		return heatmodel.GeothermHeatFlow, nil
	case g.Gradient.Given():
		return heatmodel.GeothermGradient, nil
	}
	return 0, errMissingGeotherm
}

var errBesideLayers = errors.New("is not used when [[layers]] give the geotherm; remove it or the layers (a layer's own gradient, conductivity and heat production go in the layer)")

var errMissingGeotherm = errors.New("missing: the geotherm; give gradient_c_per_km, heat_flow_mw_m2 with conductivity_w_mk, or [[layers]]")

// given reports whether any part of g is given.
func (g *Geotherm) given() bool {
	return len(g.Layers) > 0 || g.Gradient.Given() || g.HeatFlow.Given() || g.Conductivity.Given() || g.HeatProduction.Given()
}

// fields lists g's inputs, bound to the columns of c.
func (g *Geotherm) fields(c *heatmodel.GeothermColumns) []Field {
	if len(c.Layers) != len(g.Layers) {
		c.Layers = make([]heatmodel.LayerColumns, len(g.Layers))
	}
	c.HeatProduction = heatmodel.Const(0)
	fs := []Field{
		alternative(required(&g.Gradient, &c.Gradient, "gradient", CelsiusPerKm, "geothermal gradient", gradientRange)),
		alternative(required(&g.HeatFlow, &c.HeatFlow, "heat_flow", MilliwattPerM2, "surface heat flow", heatFlowRange)),
		alternative(required(&g.Conductivity, &c.Conductivity, "conductivity", WattPerMetreK, "rock thermal conductivity", conductRange)),
		alternative(required(&g.HeatProduction, &c.HeatProduction, "heat_production", MicrowattPerM3, "radiogenic heat production", productionRange)),
	}
	for i := range g.Layers {
		l, lc := &g.Layers[i], &c.Layers[i]
		lc.HeatProduction = heatmodel.Const(0)
		at := fmt.Sprintf("layers[%d].", i+1)
		fs = append(fs,
			alternative(required(&l.Bottom, &lc.Bottom, at+"bottom", Kilometre, fmt.Sprintf("bottom of layer %d", i+1), layerDepthRange)),
			alternative(required(&l.Gradient, &lc.Gradient, at+"gradient", CelsiusPerKm, fmt.Sprintf("gradient of layer %d", i+1), gradientRange)),
			alternative(required(&l.Conductivity, &lc.Conductivity, at+"conductivity", WattPerMetreK, fmt.Sprintf("conductivity of layer %d", i+1), conductRange)),
			alternative(required(&l.HeatProduction, &lc.HeatProduction, at+"heat_production", MicrowattPerM3, fmt.Sprintf("heat production of layer %d", i+1), productionRange)))
	}
	return fs
}

// fixed reports whether every given part of g is a single value.
func (g *Geotherm) fixed() bool {
	qs := []Quantity{g.Gradient, g.HeatFlow, g.Conductivity, g.HeatProduction}
	for _, l := range g.Layers {
		qs = append(qs, l.Bottom, l.Gradient, l.Conductivity, l.HeatProduction)
	}
	for _, q := range qs {
		if q.Given() && !q.IsFixed() {
			return false
		}
	}
	return true
}

// check reports a geotherm given in no way or in two, layers whose bottoms
// can cross, and layers no profile can have; it returns the geotherm's
// mode and whether it is sound.
func (g *Geotherm) check(p *problems, c *checked, anchor string) (heatmodel.GeothermMode, bool) {
	mode, err := g.mode()
	ok := err == nil
	switch {
	case err == errMissingGeotherm:
		p.add(&InputError{Input: anchor, Missing: true, Msg: err.Error()})
	case err == errBesideLayers:
		for _, q := range []*Quantity{&g.Gradient, &g.Conductivity, &g.HeatProduction} {
			if q.Given() {
				p.input(fieldOf(c.fields, q).label(), "%v", err)
			}
		}
	case err != nil && len(g.Layers) > 0:
		p.setting("layers", 0, "%v", err)
	case err != nil:
		p.input(anchor, "%v", err)
	}
	prev := 0.0
	for i := range g.Layers {
		lo, hi, given := c.span(&g.Layers[i].Bottom)
		if !given {
			if !g.Layers[i].Bottom.Given() {
				p.setting("layers", i+1, "needs bottom_km, the depth of the layer's base")
			}
			ok = false
			continue
		}
		if i > 0 && lo <= prev {
			p.setting("layers", i+1, "bottom reaches %g km, not below layer %d's, which reaches %g km: list layers from the surface down with bottoms that cannot cross", lo, i, prev)
			ok = false
		}
		prev = hi
	}
	return mode, ok
}

// hottest returns, in SI units, a profile at least as hot at every depth
// as any trial's: every parameter at the end of its range that makes the
// rock hotter (the highest gradients and heat flow, the lowest
// conductivities and heat productions) and, for layers, at each depth the
// hottest layer that can lie there (see layerEnvelope). No trial is
// hotter; the bound is reached when the layers' bottoms are fixed.
func (g *Geotherm) hottest(c *checked, mode heatmodel.GeothermMode) (heatmodel.Profile, bool) {
	hiOf := func(q *Quantity, u Unit) (float64, bool) {
		_, hi, ok := c.span(q)
		return u.ToSI(hi), ok
	}
	loOf := func(q *Quantity, u Unit) (float64, bool) {
		lo, _, ok := c.span(q)
		return u.ToSI(lo), ok
	}
	prodLo := func(q *Quantity) float64 { // a heat production not given is 0
		v, ok := loOf(q, MicrowattPerM3)
		if !ok {
			return 0
		}
		return v
	}
	switch mode {
	case heatmodel.GeothermGradient:
		gHi, ok := hiOf(&g.Gradient, CelsiusPerKm)
		if !ok {
			return heatmodel.Profile{}, false
		}
		return heatmodel.UniformProfile(gHi), true
	case heatmodel.GeothermHeatFlow:
		q, ok1 := hiOf(&g.HeatFlow, MilliwattPerM2)
		k, ok2 := loOf(&g.Conductivity, WattPerMetreK)
		if !ok1 || !ok2 {
			return heatmodel.Profile{}, false
		}
		return heatmodel.HomogeneousProfile(q, k, prodLo(&g.HeatProduction)), true
	}
	bottoms, eligible, ok := g.layerEnvelope(c)
	if !ok {
		return heatmodel.Profile{}, false
	}
	if mode == heatmodel.GeothermLayers {
		ls := make([]heatmodel.Layer, len(bottoms))
		for k, z := range bottoms {
			ls[k].Bottom = z
			for _, i := range eligible[k] {
				gr, ok := hiOf(&g.Layers[i].Gradient, CelsiusPerKm)
				if !ok {
					return heatmodel.Profile{}, false
				}
				ls[k].Gradient = max(ls[k].Gradient, gr)
			}
		}
		prof, err := heatmodel.NewProfile(ls)
		return prof, err == nil
	}
	q, ok := hiOf(&g.HeatFlow, MilliwattPerM2)
	if !ok {
		return heatmodel.Profile{}, false
	}
	ls := make([]heatmodel.ConductiveLayer, len(bottoms))
	for k, z := range bottoms {
		ls[k] = heatmodel.ConductiveLayer{Bottom: z, Conductivity: math.Inf(1), HeatProduction: math.Inf(1)}
		for _, i := range eligible[k] {
			kLo, ok := loOf(&g.Layers[i].Conductivity, WattPerMetreK)
			if !ok {
				return heatmodel.Profile{}, false
			}
			ls[k].Conductivity = min(ls[k].Conductivity, kLo)
			ls[k].HeatProduction = min(ls[k].HeatProduction, prodLo(&g.Layers[i].HeatProduction))
		}
	}
	prof, err := heatmodel.NewConductiveProfile(q, ls)
	return prof, err == nil
}

// shallowestPeak returns the shallowest depth, m, at which any trial's
// conductive geotherm can peak (heatmodel.Profile, PeakDepth): where the
// heat produced above it first equals the surface heat flow, with the
// lowest heat flow and, at each depth, the highest heat production any
// layer there can have. It is +Inf for a geotherm of gradients, or one
// without heat production, and ok false when a range is unknown.
func (g *Geotherm) shallowestPeak(c *checked, mode heatmodel.GeothermMode) (float64, bool) {
	if mode == heatmodel.GeothermGradient || mode == heatmodel.GeothermLayers {
		return math.Inf(1), true
	}
	qLo, _, ok := c.span(&g.HeatFlow)
	if !ok {
		return 0, false
	}
	q := MilliwattPerM2.ToSI(qLo)
	prodHi := func(a *Quantity) float64 { // a heat production not given is 0
		_, hi, ok := c.span(a)
		if !ok {
			return 0
		}
		return MicrowattPerM3.ToSI(hi)
	}
	if mode == heatmodel.GeothermHeatFlow {
		if a := prodHi(&g.HeatProduction); a > 0 {
			return q / a, true
		}
		return math.Inf(1), true
	}
	bottoms, eligible, ok := g.layerEnvelope(c)
	if !ok {
		return 0, false
	}
	top := 0.0
	for k, z := range bottoms {
		a := 0.0
		for _, i := range eligible[k] {
			a = max(a, prodHi(&g.Layers[i].HeatProduction))
		}
		if k == len(bottoms)-1 { // the last piece continues below
			z = math.Inf(1)
		}
		if a > 0 && q <= a*(z-top) {
			return top + q/a, true
		}
		q -= a * (z - top)
		top = z
	}
	return math.Inf(1), true
}

// checkPeak reports a geotherm that can peak above deepest, m, the deepest
// rock a trial uses, so that some trial would take rock below the peak,
// where the steady solution has heat flowing down and the temperature
// falling: not a physical geotherm. anchor names the input that sets the
// depth.
func (g *Geotherm) checkPeak(p *problems, c *checked, mode heatmodel.GeothermMode, deepest float64, anchor string) {
	if z, ok := g.shallowestPeak(c, mode); ok && z < deepest {
		p.input(anchor, "reaches %.4g km, but with the lowest heat flow and the highest heat production the geotherm can peak at %.4g km, where the heat produced above equals the surface heat flow, and falls below it; keep the rock above that depth, raise the heat flow or lower the heat production",
			deepest/1000, z/1000)
	}
}

// layerEnvelope splits depth at every end of the layers' bottom ranges
// and returns the bottoms of the pieces, m, and for each piece the layers
// that some trial can put there: layer i spans from the bottom of layer
// i−1 (the surface for the first) to its own bottom (without end for the
// last), so it can reach from the shallowest bottom above to its deepest
// own. A last piece 1 m long below every range holds the last layer
// alone, so that the profile continues below it with that layer.
func (g *Geotherm) layerEnvelope(c *checked) (bottoms []float64, eligible [][]int, ok bool) {
	n := len(g.Layers)
	lo, hi := make([]float64, n), make([]float64, n)
	for i := range g.Layers {
		l, h, given := c.span(&g.Layers[i].Bottom)
		if !given {
			return nil, nil, false
		}
		lo[i], hi[i] = Kilometre.ToSI(l), Kilometre.ToSI(h)
		bottoms = append(bottoms, lo[i], hi[i])
	}
	slices.Sort(bottoms)
	bottoms = slices.Compact(bottoms)
	bottoms = append(bottoms, bottoms[len(bottoms)-1]+1)
	top := 0.0 // of the piece
	for _, z := range bottoms {
		var in []int
		for i := range g.Layers {
			from := 0.0
			if i > 0 {
				from = lo[i-1]
			}
			if from <= top && (i == n-1 || z <= hi[i]) {
				in = append(in, i)
			}
		}
		eligible = append(eligible, in)
		top = z
	}
	return bottoms, eligible, true
}

// prepare prepares the geotherm columns of an evaluator for mode: a
// geotherm whose every part is fixed is built once, on the first batch.
func (g *Geotherm) prepare(c *heatmodel.GeothermColumns) (freeze bool) {
	mode, err := g.mode()
	if err != nil {
		panic("rockheat: a geotherm passed the checks but has no mode: " + err.Error())
	}
	c.Mode = mode
	return g.fixed()
}
