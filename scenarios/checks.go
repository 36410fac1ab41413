package scenarios

import (
	"fmt"
	"math"
	"strings"

	"rockheat/heatmodel"
	"rockheat/sampler"
)

// modelSettings checks the [model] options that depend on the kind, and
// the [[layers]] list.
func (c *checker) modelSettings(s *Scenario, r *raw) {
	m := &s.Model
	if m.Kind == KindHotRock && m.Conversion == ConversionExergy {
		c.add("model.conversion", "= \"exergy\" applies to kind \"reservoir\" (it needs the produced fluid's state); use \"efficiency\" for kind \"hot-rock\"")
	}
	if r.Model.ReportYears != nil && m.Kind != KindHotRock {
		c.add("model.report_years", "applies to kind \"hot-rock\" only; remove it")
	}
	if m.Kind == KindHotRock {
		m.ReportYears = append([]float64(nil), DefaultReportYears...)
		if r.Model.ReportYears != nil {
			m.ReportYears = r.Model.ReportYears
			for i, y := range m.ReportYears {
				if math.IsNaN(y) || math.IsInf(y, 0) || y < 0 || (i > 0 && y <= m.ReportYears[i-1]) {
					c.add("model.report_years", "= %v must list increasing times ≥ 0 in years, e.g. [0, 10, 20, 30]", m.ReportYears)
					break
				}
			}
			if len(m.ReportYears) == 0 {
				c.add("model.report_years", "is empty; list the years to report the power at, e.g. [0, 10, 20, 30]")
			}
		}
	}
	if len(r.Layers) == 0 {
		return
	}
	if m.Kind != KindHotRock {
		c.add("layers", "[[layers]] apply to kind \"hot-rock\" only; remove them")
		return
	}
	m.Layered = true
	for i, l := range r.Layers {
		key := fmt.Sprintf("layers[%d]", i+1)
		if l.BottomKm == nil || l.GradientCPerKm == nil {
			c.add(key, "each layer needs bottom_km and gradient_c_per_km, e.g. { bottom_km = 2.5, gradient_c_per_km = 35 }")
			continue
		}
		m.Layers = append(m.Layers, Layer{BottomKm: *l.BottomKm, GradientCPerKm: *l.GradientCPerKm})
	}
	if len(m.Layers) == len(r.Layers) {
		if _, err := m.Geotherm(); err != nil {
			for _, e := range unjoin(err) {
				msg := strings.TrimPrefix(e.Error(), "heatmodel: ")
				msg = strings.NewReplacer(" m ", " km ", " m:", " km:", "K/m", "°C/km").Replace(kmText(msg))
				c.add("layers", "%s", msg)
			}
		}
	}
	if _, ok := r.Inputs["gradient_c_per_km"]; ok {
		c.add("inputs.gradient_c_per_km", "is not used when [[layers]] give the geotherm; remove it or the layers")
		delete(r.Inputs, "gradient_c_per_km")
	}
}

// Geotherm returns the layered geotherm of m in SI units (depths m,
// gradients K/m), or an error from heatmodel.NewProfile.
func (m Model) Geotherm() (heatmodel.Profile, error) {
	hl := make([]heatmodel.Layer, len(m.Layers))
	for i, l := range m.Layers {
		hl[i] = heatmodel.Layer{Bottom: l.BottomKm * 1000, Gradient: l.GradientCPerKm / 1000}
	}
	return heatmodel.NewProfile(hl)
}

// kmText rewrites the metre and K/m figures of a heatmodel layer message
// in the km and °C/km of the scenario file.
func kmText(msg string) string {
	var out []string
	words := strings.Fields(msg)
	for i, w := range words {
		if i+1 < len(words) {
			var v float64
			if _, err := fmt.Sscan(w, &v); err == nil {
				switch strings.TrimRight(words[i+1], ":,;") {
				case "m":
					w = fmt.Sprintf("%g", v/1000)
				case "K/m":
					w = fmt.Sprintf("%g", v*1000)
				}
			}
		}
		out = append(out, w)
	}
	return strings.Join(out, " ")
}

func unjoin(err error) []error {
	if j, ok := err.(interface{ Unwrap() []error }); ok {
		return j.Unwrap()
	}
	return []error{err}
}

// crossChecks checks what involves several inputs: exactly one way to a
// pressure, states IF97 region 1 can represent, and a hot-rock column
// that holds useful heat in at least some trials.
func (c *checker) crossChecks(s *Scenario) {
	bounds := func(key string) (lo, hi float64, ok bool) {
		in, ok := s.Input(key)
		if !ok {
			return 0, 0, false
		}
		lo, hi = in.Dist.Support()
		return lo, hi, true
	}
	m := s.Model
	if m.Kind == KindReservoir && m.Fluid == FluidIF97 {
		_, hasP := s.Input("reservoir_pressure_mpa")
		_, hasZ := s.Input("depth_m")
		switch {
		case hasP && hasZ:
			c.add("inputs.depth_m", "give either reservoir_pressure_mpa or depth_m (for a hydrostatic pressure), not both")
		case !hasP && !hasZ:
			c.lines["inputs.reservoir_pressure_mpa"] = c.lines["inputs"]
			c.add("inputs.reservoir_pressure_mpa", "fluid = \"if97\" needs the fluid pressure: add reservoir_pressure_mpa, or depth_m for a hydrostatic pressure")
		}
	}
	if m.Fluid == FluidIF97 || m.Conversion == ConversionExergy {
		tkey := "reservoir_temp_c"
		if m.Kind == KindHotRock {
			tkey = "fluid_temp_c"
		}
		if _, hi, ok := bounds(tkey); ok && hi > if97MaxTempC {
			c.add("inputs."+tkey, "reaches %g °C, above the %d °C limit of IAPWS-IF97 region 1 (liquid water) that fluid = \"if97\" and conversion = \"exergy\" use; keep it at or below %d °C", hi, if97MaxTempC, if97MaxTempC)
		}
		for _, pkey := range []string{"reservoir_pressure_mpa", "fluid_pressure_mpa"} {
			if _, hi, ok := bounds(pkey); ok && hi > if97MaxPressureM {
				c.add("inputs."+pkey, "reaches %g MPa, above the %d MPa limit of IAPWS-IF97 region 1; keep it at or below %d MPa", hi, if97MaxPressureM, if97MaxPressureM)
			}
		}
	}
	if m.Kind == KindHotRock {
		c.hotRockColumn(s, bounds)
	}
}

// hotRockColumn reports a hot-rock scenario in which no trial can hold
// useful heat: the minimum useful temperature is reached, even in the
// hottest case, only below the maximum depth.
func (c *checker) hotRockColumn(s *Scenario, bounds func(string) (float64, float64, bool)) {
	_, tsHi, _ := bounds("surface_temp_c")
	tmLo, _, _ := bounds("min_useful_temp_c")
	topLo, _, _ := bounds("top_depth_km")
	_, zMax, _ := bounds("max_depth_km")
	var prof heatmodel.Profile
	if s.Model.Layered {
		p, err := s.Model.Geotherm()
		if err != nil {
			return // reported with the layers
		}
		prof = p
	} else {
		_, gHi, _ := bounds("gradient_c_per_km")
		prof = heatmodel.UniformProfile(gHi / 1000)
	}
	z1 := math.Max(prof.Depth(tmLo-tsHi)/1000, topLo) // km, shallowest possible
	if z1 >= zMax {
		c.add("inputs.max_depth_km", "reaches at most %g km, but even the hottest trial reaches min_useful_temp_c only at %.3g km: no trial has useful heat; drill deeper, or lower min_useful_temp_c", zMax, z1)
	}
}

// correlations checks [[correlations]] and builds the target matrix of
// the sampled inputs.
func (c *checker) correlations(s *Scenario, r *raw) {
	if len(r.Correlations) == 0 {
		return
	}
	var sampled []string
	isSampled := map[string]bool{}
	for _, in := range s.Inputs {
		if !in.Fixed {
			sampled = append(sampled, in.Key.Name)
			isSampled[in.Key.Name] = true
		}
	}
	var pairs []sampler.Pair
	for i, cr := range r.Correlations {
		key := fmt.Sprintf("correlations[%d]", i+1)
		if len(cr.Inputs) != 2 || cr.Rank == nil {
			c.add(key, "each correlation needs inputs = [\"a\", \"b\"] (two sampled inputs) and rank = a number in [-1, 1]")
			continue
		}
		bad := false
		for _, name := range cr.Inputs {
			if _, known := s.Input(name); !known {
				c.add(key, "%q is not an input of this scenario%s", name, suggest(name, sampled))
				bad = true
			} else if !isSampled[name] {
				c.add(key, "%q is a fixed value; only inputs with a distribution can be correlated", name)
				bad = true
			}
		}
		if !bad {
			pairs = append(pairs, sampler.Pair{A: cr.Inputs[0], B: cr.Inputs[1], Rank: *cr.Rank})
			s.Correlations = append(s.Correlations, Correlation{Inputs: [2]string{cr.Inputs[0], cr.Inputs[1]}, Rank: *cr.Rank})
		}
	}
	if len(c.problems) > 0 {
		return
	}
	corr, err := sampler.BuildCorrelation(sampled, pairs)
	if err != nil {
		for _, e := range unjoin(err) {
			c.add("correlations", "%v", e)
		}
		return
	}
	s.Correlation = corr
}
