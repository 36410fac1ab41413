package rockheat

import (
	"errors"
	"math"
	"slices"
	"strings"
	"testing"

	"rockheat/heatmodel"
	"rockheat/sampler"
)

// goReservoir is a complete reservoir model built in Go, with the area in
// its own unit (a zero Unit: km²) and the rest in named units.
func goReservoir(t *testing.T) *Reservoir {
	t.Helper()
	area, err := sampler.NewTriangular(3, 6, 14)
	if err != nil {
		t.Fatal(err)
	}
	return &Reservoir{
		Area: Quantity{Dist: area}, Thickness: Fixed(1000, Metre), ReservoirTemp: Fixed(230, Celsius),
		Porosity: Fixed(0.05, Fraction), RockDensity: Fixed(2650, KgPerCubicMetre), RockHeatCapacity: Fixed(900, JPerKgK),
		FluidDensity: Fixed(850, KgPerCubicMetre), FluidHeatCapacity: Fixed(4600, JPerKgK),
		RecoveryFactor: Fixed(0.15, Fraction), ConversionEfficiency: Fixed(0.11, Fraction),
		CapacityFactor: Fixed(0.9, Fraction), Life: Fixed(30, Year),
	}
}

// inputErrors returns the InputErrors of err, failing if it has none.
func inputErrors(t *testing.T, err error) InputErrors {
	t.Helper()
	var es InputErrors
	if !errors.As(err, &es) {
		t.Fatalf("err = %v, want InputErrors", err)
	}
	return es
}

// TestMissingInputIsAnError is the defect of a map of inputs read by key:
// a Go caller who leaves out the thickness got heat in place 0 and no
// error. Estimate must refuse the run and name the input.
func TestMissingInputIsAnError(t *testing.T) {
	t.Parallel()
	m := goReservoir(t)
	m.Thickness = Quantity{}
	res, err := Estimate(&Run{Title: "missing thickness", Trials: 100, Model: m}, Options{})
	if res != nil {
		t.Fatalf("Estimate ran a model without a thickness: P50 heat %g", res.Outputs[0].Summary.P50)
	}
	es := inputErrors(t, err)
	if len(es) != 1 || es[0].Input != "thickness_m" || !es[0].Missing || !strings.Contains(es[0].Msg, "reservoir thickness (m) is required") {
		t.Errorf("errors = %v, want one: thickness_m missing", es)
	}
}

// TestValidateProblems checks each kind of problem a Go caller can make,
// one at a time, by the input or setting it names and a phrase of its fix.
func TestValidateProblems(t *testing.T) {
	t.Parallel()
	normal := func(mean, sd float64) sampler.Distribution {
		d, err := sampler.NewNormal(mean, sd, -inf, inf)
		if err != nil {
			t.Fatal(err)
		}
		return d
	}
	cases := []struct {
		name  string
		edit  func(r *Run, m *Reservoir)
		where string // Input or Setting at fault
		want  string
	}{
		{"value outside its domain", func(_ *Run, m *Reservoir) { m.Porosity = Fixed(1.2, Fraction) },
			"porosity", "outside the valid range [0, 1)"},
		{"wrong dimension", func(_ *Run, m *Reservoir) { m.Area = Fixed(5, Celsius) },
			"area_c", "a unit of temperature; give it in a unit of area such as km²"},
		{"tail beyond the domain", func(_ *Run, m *Reservoir) { m.RecoveryFactor = Quantity{Dist: normal(0.1, 0.1)} },
			"recovery_factor", "add min = 0 to truncate it"},
		{"no model", func(r *Run, _ *Reservoir) { r.Model = nil }, "model", "set Model"},
		{"title on two lines", func(r *Run, _ *Reservoir) { r.Title = "Vellmar\nRidge" }, "title", "control character (U+000A)"},
		{"title reversed", func(r *Run, _ *Reservoir) { r.Title = "Vellmar \u202eegdiR" }, "title", "bidirectional control character (U+202E)"},
		{"title too long", func(r *Run, _ *Reservoir) { r.Title = strings.Repeat("x", 201) }, "title", "more than the 200"},
		{"negative trials", func(r *Run, _ *Reservoir) { r.Trials = -5 }, "trials", "positive number of trials"},
		{"correlated fixed input", func(r *Run, _ *Reservoir) {
			r.Correlations = []Correlation{{Inputs: [2]string{"area_km2", "porosity"}, Rank: 0.5}}
		}, "correlations", "only inputs with a distribution can be correlated"},
		{"correlated unknown input", func(r *Run, _ *Reservoir) {
			r.Correlations = []Correlation{{Inputs: [2]string{"area_km2", "volume"}, Rank: 0.5}}
		}, "correlations", `"volume" is not an input of this run`},
		{"IF97 without a pressure", func(_ *Run, m *Reservoir) { m.Fluid = heatmodel.FluidIF97 },
			"reservoir_pressure_mpa", "needs the fluid pressure"},
		{"IF97 wide temperature tail", func(_ *Run, m *Reservoir) {
			m.Fluid, m.Depth, m.ReservoirTemp = heatmodel.FluidIF97, Fixed(2000, Metre), Quantity{Dist: normal(235, 60)}
		}, "reservoir_temp_c", "add max = 350 to truncate it"},
		{"IF97 depth beyond 100 MPa", func(_ *Run, m *Reservoir) {
			m.Fluid, m.Depth = heatmodel.FluidIF97, Fixed(20000, Metre)
		}, "depth_m", "at 10186 m a cold water column reaches 100 MPa"},
		{"IF97 reservoir middle beyond 100 MPa", func(_ *Run, m *Reservoir) {
			m.Fluid, m.ReservoirTemp = heatmodel.FluidIF97, Quantity{}
			m.SurfaceTemp, m.TopDepth, m.Gradient = Fixed(10, Celsius), Fixed(9800, Metre), Fixed(10, CelsiusPerKm)
		}, "top_depth_m", "hydrostatic at the reservoir's middle, which reaches 10300 m; at 10186 m a cold water column reaches 100 MPa"},
		{"no trial holds heat", func(_ *Run, m *Reservoir) {
			m.ReservoirTemp, m.ReferenceTemp = Fixed(30, Celsius), Fixed(40, Celsius)
		}, "reservoir_temp_c", "no trial holds heat"},
		{"plant life too short", func(_ *Run, m *Reservoir) { m.Life = Fixed(1e-300, Year) },
			"life_years", "outside the valid range [0.00273785, 10000]"},
		{"area overflowing", func(_ *Run, m *Reservoir) { m.Area = Fixed(1e308, SquareKilometre) },
			"area_km2", "outside the valid range (0, 1e+06]"},
		{"IF97 above 350 °C", func(_ *Run, m *Reservoir) {
			m.Fluid, m.Depth, m.ReservoirTemp = heatmodel.FluidIF97, Fixed(2000, Metre), Fixed(380, Celsius)
		}, "reservoir_temp_c", "350 °C is the limit of IAPWS-IF97 region 1"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			m := goReservoir(t)
			r := &Run{Title: c.name, Trials: 100, Model: m}
			c.edit(r, m)
			es := inputErrors(t, r.Validate())
			for _, e := range es {
				if (e.Input == c.where || e.Setting == c.where) && strings.Contains(e.Msg, c.want) {
					return
				}
			}
			t.Errorf("errors = %v, want one at %s saying %q", es, c.where, c.want)
		})
	}
}

// TestTypicalRangeWarns: a value inside the valid range but far outside
// common practice (a 10⁵ km² prospect, a 2000-year plant life) runs, with a
// warning that names the input, and the IF97 template temperature
// normal(235, 12) with min 200 is cut at 350 °C silently (its tail beyond is
// Φ(−9.6) ≈ 4e-22, below the 1e-6 tail rule).
func TestTypicalRangeWarns(t *testing.T) {
	t.Parallel()
	m := goReservoir(t)
	m.Area, m.Life = Fixed(1e5, SquareKilometre), Fixed(2000, Year)
	d, err := sampler.NewNormal(235, 12, 200, inf)
	if err != nil {
		t.Fatal(err)
	}
	m.Fluid, m.Depth, m.ReservoirTemp = heatmodel.FluidIF97, Fixed(2000, Metre), Quantity{Dist: d}
	res, err := Estimate(&Run{Title: "large", Trials: 50, Model: m}, Options{})
	if err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"area_km2: is 100000 km², outside the range [0, 5000] km²", "life_years: is 2000 years, outside the range [5, 100] years"} {
		found := false
		for _, w := range res.Warnings {
			found = found || strings.Contains(w, want)
		}
		if !found {
			t.Errorf("warnings %q lack %q", res.Warnings, want)
		}
	}
	if hi := res.Outputs[0].Summary.Max; !(hi > 0) {
		t.Errorf("max heat %g", hi)
	}
}

// TestTailTruncatedToDomain: a normal whose tail crosses a physical limit
// with negligible probability (< 1e-6, the stated tail rule) is cut at the
// valid range's
// limit, so no draw leaves the domain; the caller's quantity is unchanged.
func TestTailTruncatedToDomain(t *testing.T) {
	t.Parallel()
	m := goReservoir(t)
	d, err := sampler.NewNormal(0.5, 0.08, -inf, inf) // P(X < 0) = Φ(−6.25) ≈ 2e-10
	if err != nil {
		t.Fatal(err)
	}
	m.CapacityFactor = Quantity{Dist: d}
	c, err := (&Run{Title: "tail", Model: m}).resolve()
	if err != nil {
		t.Fatal(err)
	}
	in := c.inputs[c.byQ[&m.CapacityFactor]]
	if lo, hi := in.dist.Support(); lo != 0.01 || hi != 1 {
		t.Errorf("support = [%g, %g], want the valid range [0.01, 1]", lo, hi)
	}
	if lo, _ := m.CapacityFactor.Dist.Support(); lo != -inf {
		t.Errorf("the caller's distribution was changed: lower limit %g", lo)
	}
}

// TestUnitsConvert: the same reservoir with its area in m² and its
// temperatures in K gives the same heat in place as in km² and °C, since
// 1 km² = 10⁶ m² and T(K) = T(°C) + 273.15 (SI definitions); and the
// inputs are named in the units given.
func TestUnitsConvert(t *testing.T) {
	t.Parallel()
	km := goReservoir(t)
	si := goReservoir(t)
	si.Area = Fixed(6e6, SquareMetre)
	km.Area = Fixed(6, SquareKilometre)
	si.ReservoirTemp = Fixed(230+273.15, Kelvin)
	si.ReferenceTemp = Fixed(15+273.15, Kelvin)
	var heat [2]float64
	for i, m := range []*Reservoir{km, si} {
		res, err := Estimate(&Run{Title: "units", Trials: 10, Model: m}, Options{})
		if err != nil {
			t.Fatal(err)
		}
		heat[i] = res.Outputs[0].Summary.P50
		if i == 1 && (res.Inputs[0].Key != "area_m2" || res.Inputs[2].Key != "reservoir_temp_k") {
			t.Errorf("inputs named %s, %s; want area_m2, reservoir_temp_k", res.Inputs[0].Key, res.Inputs[2].Key)
		}
	}
	// Q = A·h·ρC·ΔT = 6e6 m² · 1000 m · (0.95·2650·900 + 0.05·850·4600) J/(m³·K) · 215 K, by hand:
	// ρC = 2265750 + 195500 = 2461250 J/(m³·K); Q = 6e9 · 2461250 · 215 = 1.47675e16 · 215 = 3.1750125e18 J.
	for i, h := range heat {
		if d := h/3.1750125e18 - 1; d > 1e-12 || d < -1e-12 {
			t.Errorf("case %d: heat in place %.10g J, want 3.1750125e18", i, h)
		}
	}
}

// overflowModel is a model whose one output is its input x, except that
// it overflows to +Inf for x above Limit (0.999 when zero): a stand-in for
// physics that leaves the floating-point range.
type overflowModel struct {
	X     Quantity
	Limit float64
}

func (*overflowModel) Kind() heatmodel.Kind { return heatmodel.KindReservoir }
func (*overflowModel) Settings() (heatmodel.FluidSource, heatmodel.Conversion) {
	return heatmodel.FluidFixed, heatmodel.ConversionEfficiency
}
func (m *overflowModel) Fields() []Field { return m.fields(&overflowEval{}) }
func (m *overflowModel) fields(e *overflowEval) []Field {
	return []Field{required(&m.X, &e.x, "x", Fraction, "a fraction", recoveryRange)}
}
func (*overflowModel) outputs() []OutputSpec {
	return []OutputSpec{{Name: "heat_in_place", Unit: "J", Doc: "x", Scale: 1}}
}
func (*overflowModel) check(*problems, *checked) {}
func (m *overflowModel) newEvaluator() evaluator {
	e := &overflowEval{limit: m.Limit}
	e.dst = dsts(m.fields(e))
	return e
}

type overflowEval struct {
	evalBase
	x     heatmodel.Column
	limit float64 // 0.999 when zero
}

func (e *overflowEval) evaluate(n int, out [][]float64) (int, error) {
	limit := e.limit
	if limit == 0 {
		limit = 0.999
	}
	for i := range n {
		out[0][i] = e.x.At(i)
		if out[0][i] > limit {
			out[0][i] = inf
		}
	}
	return 0, nil
}

// TestNonFiniteOutputFailsTheRun: a trial whose output is not finite fails
// the run, naming the trial and its inputs, and the same trial whatever the
// number of workers (the lowest one): in the first batch and in the second,
// the two a selecting run draws first (TestFailingTrialPlacement places
// the failures batch by batch).
func TestNonFiniteOutputFailsTheRun(t *testing.T) {
	t.Parallel()
	u, err := sampler.NewUniform(0.5, 1)
	if err != nil {
		t.Fatal(err)
	}
	for _, c := range []struct {
		limit       float64
		batch       int    // of the first failing trial
		inputPrefix string // of its input
	}{{0.999, 0, "x = 0.999"}, {0.99998, 1, "x = 0.99998"}} {
		var msgs []string
		for _, w := range []int{1, 2, 5} {
			run := &Run{Title: "overflow", Trials: 400000, Seed: 3, Sampling: sampler.Random,
				Model: &overflowModel{X: Quantity{Dist: u}, Limit: c.limit}}
			_, err := Estimate(run, Options{Workers: w})
			var te *TrialError
			if !errors.As(err, &te) {
				t.Fatalf("limit %g, %d workers: err = %v, want a TrialError", c.limit, w, err)
			}
			if te.Output != "heat_in_place" || !strings.HasPrefix(te.Inputs[0], c.inputPrefix) {
				t.Errorf("limit %g, %d workers: %v", c.limit, w, te)
			}
			if b := (te.Trial - 1) / sampler.BatchSize; b != c.batch {
				t.Fatalf("limit %g: trial %d is in batch %d, not %d; choose another limit", c.limit, te.Trial, b, c.batch)
			}
			msgs = append(msgs, te.Error())
		}
		if msgs[0] != msgs[1] || msgs[0] != msgs[2] {
			t.Errorf("limit %g: the error depends on the workers:\n%s", c.limit, strings.Join(msgs, "\n"))
		}
	}
}

// failAtModel is overflowModel with its output +Inf where the draw x is
// one of the values in fail, and x elsewhere.
type failAtModel struct {
	overflowModel
	fail map[float64]bool
}

func (m *failAtModel) newEvaluator() evaluator {
	e := &overflowEval{limit: math.Inf(1)}
	e.dst = dsts(m.fields(e))
	return &failAtEval{e, m.fail}
}

type failAtEval struct {
	*overflowEval
	fail map[float64]bool
}

func (e *failAtEval) evaluate(n int, out [][]float64) (int, error) {
	z, err := e.overflowEval.evaluate(n, out)
	for i, v := range out[0][:n] {
		if e.fail[v] {
			out[0][i] = inf
		}
	}
	return z, err
}

// TestFailingTrialPlacement: however the failing trials fall among the
// batches — in batch 0 (the sensitivity sample) or batch 1 (a selecting
// run's pilot) alone, in both, in later batches, in a pilot and later —
// a run reports the lowest failing trial, at any number of workers, in a
// selecting run (400 000 trials) and in one that keeps its outputs
// (200 000). The failing trials are chosen by index: their draws are
// found from the plan the run makes.
func TestFailingTrialPlacement(t *testing.T) {
	t.Parallel()
	u, err := sampler.NewUniform(0.5, 1)
	if err != nil {
		t.Fatal(err)
	}
	const bs = sampler.BatchSize
	for _, trials := range []int{400_000, 200_000} {
		plan := sampler.NewPlan([]sampler.Distribution{u}, sampler.Config{Trials: trials, Seed: 3, Method: sampler.Random})
		draw := func(trial int) float64 { // 0-based
			col := [][]float64{make([]float64, bs)}
			if err := plan.Fill(trial/bs, col); err != nil {
				t.Fatal(err)
			}
			return col[0][trial%bs]
		}
		for _, failing := range [][]int{{40000}, {bs + 10}, {bs + 10, 40000}, {3*bs + 7}, {2*bs + 5, 3*bs + 7},
			{bs + 10, 2*bs + 1}, {2 * bs, 17}} {
			fail := map[float64]bool{}
			for _, k := range failing {
				fail[draw(k)] = true
			}
			want := slices.Min(failing) + 1
			for _, w := range []int{1, 2, 3, 5} {
				run := &Run{Title: "placement", Trials: trials, Seed: 3, Sampling: sampler.Random,
					Model: &failAtModel{overflowModel{X: Quantity{Dist: u}}, fail}}
				_, err := Estimate(run, Options{Workers: w})
				var te *TrialError
				if !errors.As(err, &te) || te.Trial != want {
					t.Errorf("%d trials, failing %v, %d workers: err = %v, want trial %d", trials, failing, w, err, want)
				}
			}
		}
	}
}

// TestReportYearsBounded: a hot-rock run may report the power at no more
// than MaxReportYears years (report_years = [0 … 99999] ran for 31 s and
// wrote 36 691 charts).
func TestReportYearsBounded(t *testing.T) {
	t.Parallel()
	years := make([]float64, 100000)
	for i := range years {
		years[i] = float64(i)
	}
	err := (&Run{Title: "years", Model: &HotRock{ReportYears: years}}).Validate()
	for _, e := range inputErrors(t, err) {
		if e.Setting == "report_years" && strings.Contains(e.Msg, "more than the 100 a report can show") {
			return
		}
	}
	t.Errorf("errors %v lack the report-years bound", err)
}

// kmModel is overflowModel with its input a length given in km: its one
// output is the length in m, +Inf beyond 999.9 m.
type kmModel struct{ X Quantity }

func (*kmModel) Kind() heatmodel.Kind { return heatmodel.KindReservoir }
func (*kmModel) Settings() (heatmodel.FluidSource, heatmodel.Conversion) {
	return heatmodel.FluidFixed, heatmodel.ConversionEfficiency
}
func (m *kmModel) Fields() []Field { return m.fields(&overflowEval{}) }
func (m *kmModel) fields(e *overflowEval) []Field {
	return []Field{required(&m.X, &e.x, "x", Kilometre, "a length", depthRange)}
}
func (*kmModel) outputs() []OutputSpec {
	return []OutputSpec{{Name: "heat_in_place", Unit: "J", Doc: "x", Scale: 1}}
}
func (*kmModel) check(*problems, *checked) {}
func (m *kmModel) newEvaluator() evaluator {
	e := &overflowEval{limit: 999.9}
	e.dst = dsts(m.fields(e))
	return e
}

// TestTrialErrorInUnits: a batch outside the sensitivity sample converts
// its draws to SI in place; a failing trial there still reports its
// inputs in the units they were given (km, not m), drawn again.
func TestTrialErrorInUnits(t *testing.T) {
	t.Parallel()
	u, err := sampler.NewUniform(0.5, 1)
	if err != nil {
		t.Fatal(err)
	}
	c, err := (&Run{Title: "km", Trials: 300_000, Seed: 3, Sampling: sampler.Random, Model: &kmModel{X: Quantity{Dist: u, Unit: Kilometre}}}).resolve()
	if err != nil {
		t.Fatal(err)
	}
	s, err := resolveOptions(c, Options{Workers: 1})
	if err != nil {
		t.Fatal(err)
	}
	r := newRun(c, s)
	_, _, err = r.newWorker(0).batch(2, nil) // trials 131 073 …: neither kept nor in the sensitivity sample
	var te *TrialError
	if !errors.As(err, &te) {
		t.Fatalf("err = %v, want a TrialError", err)
	}
	if te.Trial <= 2*sampler.BatchSize || !strings.HasPrefix(te.Inputs[0], "x_km = 0.9999") {
		t.Errorf("trial %d, inputs %v; want a trial of batch 2 and x_km = 0.9999…", te.Trial, te.Inputs)
	}
}
