package report

import (
	"bytes"
	"encoding/xml"
	"fmt"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"
	"sync"
	"testing"

	"rockheat"
	"rockheat/scenarios"
)

// hotRockScenario is an invented hot-rock prospect with twelve sampled
// inputs, more than a tornado chart shows.
const hotRockScenario = `
title = "Korrin Plateau hot rock (invented test prospect)"
[run]
trials = 2000
seed = 7
[model]
kind = "hot-rock"
report_years = [0, 5, 10, 20, 30]
[inputs]
area_km2 = { dist = "triangular", min = 1, mode = 2, max = 4 }
surface_temp_c = { dist = "uniform", min = 8, max = 14 }
gradient_c_per_km = { dist = "pert", min = 28, mode = 35, max = 45 }
min_useful_temp_c = { dist = "uniform", min = 110, max = 140 }
top_depth_km = { dist = "uniform", min = 2.5, max = 3.5 }
max_depth_km = { dist = "uniform", min = 5, max = 6 }
rock_density_kg_m3 = { dist = "uniform", min = 2600, max = 2750 }
rock_heat_capacity_j_kgk = { dist = "uniform", min = 800, max = 1000 }
flow_per_area_m3_s_km2 = { dist = "triangular", min = 0.2, mode = 0.4, max = 0.8 }
fluid_density_kg_m3 = { dist = "uniform", min = 900, max = 960 }
fluid_heat_capacity_j_kgk = { dist = "uniform", min = 4200, max = 4400 }
conversion_efficiency = { dist = "uniform", min = 0.08, max = 0.13 }
capacity_factor = 0.9
life_years = 30
`

// Results shared by the tests, read only: copy one before changing it.
var (
	demoRun = sync.OnceValues(func() (*rockheat.Result, error) {
		ex, err := scenarios.LookupExample("demo")
		if err != nil {
			return nil, err
		}
		s, err := scenarios.Parse("example demo", ex.Text)
		if err != nil {
			return nil, err
		}
		return rockheat.Estimate(&s.Run, rockheat.Options{Trials: 2000, KeepSamples: true})
	})
	hotRockRun = sync.OnceValues(func() (*rockheat.Result, error) {
		s, err := scenarios.Parse("korrin.toml", []byte(hotRockScenario))
		if err != nil {
			return nil, err
		}
		return rockheat.Estimate(&s.Run, rockheat.Options{})
	})
)

func demoResult(t testing.TB) *rockheat.Result {
	t.Helper()
	r, err := demoRun()
	if err != nil {
		t.Fatalf("running the demo scenario: %v", err)
	}
	return r
}

func hotRockResult(t testing.TB) *rockheat.Result {
	t.Helper()
	r, err := hotRockRun()
	if err != nil {
		t.Fatalf("running the hot-rock test scenario: %v", err)
	}
	return r
}

// svgText is one <text> element of an SVG document: its content and its
// y attribute, which grows downwards on the page.
type svgText struct {
	s string
	y float64
}

// parseSVG reads doc with encoding/xml to the end, failing the test on
// any syntax error or a root element other than <svg>, and returns the
// text elements.
func parseSVG(t *testing.T, doc string) []svgText {
	t.Helper()
	d := xml.NewDecoder(strings.NewReader(doc))
	var (
		texts []svgText
		cur   *svgText
		root  string
	)
	for {
		tok, err := d.Token()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("SVG is not well-formed XML: %v", err)
		}
		switch tk := tok.(type) {
		case xml.StartElement:
			if root == "" {
				root = tk.Name.Local
			}
			if tk.Name.Local == "text" {
				cur = &svgText{}
				for _, a := range tk.Attr {
					if a.Name.Local == "y" {
						if cur.y, err = strconv.ParseFloat(a.Value, 64); err != nil {
							t.Fatalf("text y attribute %q: %v", a.Value, err)
						}
					}
				}
			}
		case xml.CharData:
			if cur != nil {
				cur.s += string(tk)
			}
		case xml.EndElement:
			if tk.Name.Local == "text" && cur != nil {
				texts = append(texts, *cur)
				cur = nil
			}
		}
	}
	if root != "svg" {
		t.Fatalf("root element is <%s>, want <svg>", root)
	}
	return texts
}

// findText returns the text element whose content is s.
func findText(texts []svgText, s string) (svgText, bool) {
	for _, x := range texts {
		if x.s == s {
			return x, true
		}
	}
	return svgText{}, false
}

// figUnit is the unit and scale the figures of output o of r are shown in,
// in tables and charts alike: for energies one EJ/PJ/TJ for the whole
// report, the one energyUnit picks for the largest heat median (the text
// table's unit), so that 0.3568 EJ in a table is not 356.8 PJ on a chart.
func figUnit(r *rockheat.Result, o rockheat.Output) (string, float64) {
	if o.Spec.Unit != "J" {
		return o.Spec.Unit, 1
	}
	var big float64
	for _, x := range r.Outputs {
		if x.Spec.Unit == "J" {
			big = math.Max(big, math.Abs(x.Summary.P50))
		}
	}
	name, scale := energyUnit(big)
	return strings.Fields(name)[0], scale
}

// TestTornadoCaptionCounts: the caption counts the inputs left off the
// chart before the list is cut to TornadoInputs bars, in the singular for
// one input.
func TestTornadoCaptionCounts(t *testing.T) {
	t.Parallel()
	r := *demoResult(t)
	r.Sensitivity = append([]rockheat.Sensitivity(nil), r.Sensitivity...)
	for j := range r.Sensitivity {
		if r.Sensitivity[j].Output != "electric_power" {
			continue
		}
		s := &r.Sensitivity[j]
		infl := append([]rockheat.Influence(nil), s.Influences...)
		moving := 0
		for _, f := range infl {
			if f.SwingLow != f.SwingHigh {
				moving++
			}
		}
		// Add inputs until TornadoInputs + 2 move the output, and one that
		// does not.
		for k := 0; moving < TornadoInputs+2; k++ {
			f := rockheat.Influence{SwingLow: s.Base * 0.999, SwingHigh: s.Base * 1.001}
			f.Input = fmt.Sprintf("extra_%d", k)
			infl = append(infl, f)
			moving++
		}
		still := rockheat.Influence{SwingLow: s.Base, SwingHigh: s.Base}
		still.Input = "inert"
		s.Influences = append(infl, still)
	}
	var b bytes.Buffer
	if err := TornadoSVG(&b, &r, "electric_power"); err != nil {
		t.Fatal(err)
	}
	want := "Not shown: 2 inputs with smaller swings and 1 input with no effect on this output."
	if _, ok := findText(parseSVG(t, b.String()), want); !ok {
		t.Errorf("no caption %q", want)
	}
}

func TestExceedanceSVG(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name string
		res  func(testing.TB) *rockheat.Result
	}{{"demo", demoResult}, {"hot-rock", hotRockResult}} {
		r := tc.res(t)
		for _, o := range r.Outputs {
			t.Run(tc.name+"/"+o.Spec.Name, func(t *testing.T) {
				t.Parallel()
				var b bytes.Buffer
				if err := ExceedanceSVG(&b, r, o.Spec.Name); err != nil {
					t.Fatal(err)
				}
				texts := parseSVG(t, b.String())
				unit, scale := figUnit(r, o)
				s := o.Summary
				// The exceedance convention (common practice; Convention):
				// P90 is exceeded with probability 0.9, so it sits highest
				// on a chart whose y axis is the probability of exceeding.
				var ys []float64
				for _, p := range []struct {
					name string
					v    float64
				}{{"P90", s.P90}, {"P50", s.P50}, {"P10", s.P10}} {
					want := p.name + "  " + fig(p.v/scale) + " " + unit
					x, ok := findText(texts, want)
					if !ok {
						t.Fatalf("no label %q in the SVG", want)
					}
					ys = append(ys, x.y)
				}
				if !(ys[0] < ys[1] && ys[1] < ys[2]) {
					t.Errorf("label heights (SVG y, down is +) P90 %g, P50 %g, P10 %g: want P90 above P50 above P10", ys[0], ys[1], ys[2])
				}
				if !strings.Contains(b.String(), ">mean  "+fig(s.Mean/scale)+" "+unit) {
					t.Errorf("no mean label with %s %s", fig(s.Mean/scale), unit)
				}
				// The mean's label sits at the top of the chart, above the
				// P90 label (the highest point label), off the curve.
				for _, x := range texts {
					if strings.HasPrefix(x.s, "mean  ") && !(x.y < ys[0]) {
						t.Errorf("mean label at SVG y %g, not above the P90 label at %g", x.y, ys[0])
					}
				}
				for _, want := range []string{r.Title, "Probability of exceeding: " + o.Spec.Doc, "Estimates, not a reserves statement."} {
					if _, ok := findText(texts, want); !ok {
						t.Errorf("no text %q in the SVG", want)
					}
				}
			})
		}
	}
}

func TestCurvePoints(t *testing.T) {
	t.Parallel()
	r := demoResult(t)
	for _, o := range r.Outputs {
		_, scale := figUnit(r, o)
		pts, err := curvePoints(o.Curve, scale)
		if err != nil {
			t.Fatal(err)
		}
		// The curve passes through the summary's percentiles, computed
		// apart by stats.Summarize with the same type-7 estimator
		// (Hyndman & Fan 1996): P90 is exceeded with probability 0.9.
		s := o.Summary
		for _, p := range []struct {
			y, v float64
		}{{90, s.P90}, {50, s.P50}, {10, s.P10}, {100, s.Min}, {0, s.Max}} {
			found := false
			for _, pt := range pts {
				if math.Abs(pt.Y-p.y) < 1e-9 {
					found = true
					if math.Abs(pt.X-p.v/scale) > 1e-12*math.Abs(p.v/scale) {
						t.Errorf("%s: curve at %g%% exceedance is %g, want %g", o.Spec.Name, p.y, pt.X, p.v/scale)
					}
				}
			}
			if !found {
				t.Errorf("%s: no curve point at %g%% exceedance", o.Spec.Name, p.y)
			}
		}
		for k := 1; k < len(pts); k++ {
			if pts[k].Y >= pts[k-1].Y || pts[k].X < pts[k-1].X {
				t.Fatalf("%s: curve not a falling exceedance curve at point %d: %v after %v", o.Spec.Name, k, pts[k], pts[k-1])
			}
		}
	}
}

func TestMeanExceedanceLabel(t *testing.T) {
	t.Parallel()
	r := demoResult(t)
	for j, name := range r.Samples.Names {
		o, err := findOutput(r, name)
		if err != nil {
			continue // an input column
		}
		// The fraction of trials above the mean, counted directly: the
		// empirical probability of exceeding it (definition).
		above := 0
		for _, v := range r.Samples.Columns[j] {
			if v > o.Summary.Mean {
				above++
			}
		}
		want := 100 * float64(above) / float64(len(r.Samples.Columns[j]))
		var b bytes.Buffer
		if err := ExceedanceSVG(&b, r, name); err != nil {
			t.Fatal(err)
		}
		var got float64
		found := false
		for _, x := range parseSVG(t, b.String()) {
			if i := strings.Index(x.s, "(exceeded by "); strings.HasPrefix(x.s, "mean") && i >= 0 {
				pct := strings.TrimSuffix(x.s[i+len("(exceeded by "):], "%)")
				if got, err = strconv.ParseFloat(pct, 64); err != nil {
					t.Fatalf("%s: mean label %q: %v", name, x.s, err)
				}
				found = true
			}
		}
		// The label rounds to 1 % and reads a curve with points 1 % apart.
		if !found || math.Abs(got-want) > 1.5 {
			t.Errorf("%s: mean label says exceeded by %g%% (found %v); %.2f%% of trials exceed the mean", name, got, found, want)
		}
	}
}

func TestExceedance(t *testing.T) {
	t.Parallel()
	// The quantiles of the standard uniform distribution are q itself, so
	// the probability of exceeding x is its survival function 1 − x on
	// [0, 1], 1 below and 0 above (analytic).
	curve := make([]float64, rockheat.CurvePoints)
	for k := range curve {
		curve[k] = float64(k) / float64(rockheat.CurvePoints-1)
	}
	for _, tc := range []struct{ x, want float64 }{
		{-1, 1}, {0, 1}, {0.005, 0.995}, {0.255, 0.745}, {0.5, 0.5}, {0.999, 0.001}, {1, 0}, {3, 0},
	} {
		if got := exceedance(curve, tc.x); math.Abs(got-tc.want) > 1e-12 {
			t.Errorf("exceedance(uniform curve, %g) = %g, want %g", tc.x, got, tc.want)
		}
	}
}

func TestNiceTicks(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct{ lo, hi float64 }{
		{0, 1}, {2.18, 13.07}, {-3.5, 4.2}, {1e-4, 7e-4}, {40, 310}, {0.95, 0.96}, {1234, 98765},
	} {
		const n = 7
		var labelled []float64
		step := math.Inf(1)
		var prev float64
		for i, tk := range (niceTicks{n}).Ticks(tc.lo, tc.hi) {
			if tk.Value < tc.lo || tk.Value > tc.hi {
				t.Errorf("[%g, %g]: tick %g outside the range", tc.lo, tc.hi, tk.Value)
			}
			if i > 0 {
				step = math.Min(step, tk.Value-prev)
			}
			prev = tk.Value
			if tk.Label == "" {
				continue
			}
			v, err := strconv.ParseFloat(tk.Label, 64)
			if err != nil || math.Abs(v-tk.Value) > 1e-9*math.Max(1, math.Abs(tk.Value)) {
				t.Errorf("[%g, %g]: tick %g labelled %q", tc.lo, tc.hi, tk.Value, tk.Label)
			}
			labelled = append(labelled, v)
		}
		// Round steps: 1, 2, 2.5 or 5 times a power of ten between
		// labels (common practice for axes), about n of them.
		if len(labelled) < n/2 || len(labelled) > 2*n+1 {
			t.Errorf("[%g, %g]: %d labelled ticks, want about %d", tc.lo, tc.hi, len(labelled), n)
			continue
		}
		d := labelled[1] - labelled[0]
		m := d / math.Pow(10, math.Floor(math.Log10(d)+1e-9))
		round := false
		for _, r := range []float64{1, 2, 2.5, 5} {
			round = round || math.Abs(m-r) < 1e-6
		}
		if !round {
			t.Errorf("[%g, %g]: labels %g apart, not a round step", tc.lo, tc.hi, d)
		}
		if math.Abs(step-d/2) > 1e-9*d {
			t.Errorf("[%g, %g]: smallest tick gap %g, want half the label step %g", tc.lo, tc.hi, step, d/2)
		}
	}
}

func TestChartUnknownOutput(t *testing.T) {
	t.Parallel()
	r := demoResult(t)
	for _, tc := range []struct {
		name string
		draw func(io.Writer, *rockheat.Result, string) error
	}{{"ExceedanceSVG", ExceedanceSVG}, {"TornadoSVG", TornadoSVG}} {
		var b bytes.Buffer
		err := tc.draw(&b, r, "heat_in_plaice")
		if err == nil {
			t.Fatalf("%s with an unknown output: no error", tc.name)
		}
		msg := err.Error()
		if !strings.Contains(msg, `"heat_in_plaice"`) {
			t.Errorf("%s error %q does not name the unknown output", tc.name, msg)
		}
		for _, o := range r.Outputs {
			if !strings.Contains(msg, o.Spec.Name) {
				t.Errorf("%s error %q does not list the output %s", tc.name, msg, o.Spec.Name)
			}
		}
	}
}

func TestTornadoSVG(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name   string
		res    func(testing.TB) *rockheat.Result
		output string
		// absent are inputs that do not enter the output: the volumetric
		// heat in place Q = A·h·[(1−φ)·ρr·cr + φ·ρf·cf]·(Tr − Tref) has no
		// recovery factor or efficiency (Muffler & Cataldi 1978), and the
		// heat in a hot-rock column E0 = A·ρr·cr·∫(T − Tmin)dz no water
		// flow or efficiency (Armstead & Tester 1987).
		absent []string
	}{
		{"demo", demoResult, "heat_in_place", []string{"recovery_factor", "conversion_efficiency"}},
		{"demo", demoResult, "electric_power", nil},
		{"hot-rock", hotRockResult, "electric_power", nil},
		{"hot-rock", hotRockResult, "heat_in_place", []string{"flow_per_area_m3_s_km2", "conversion_efficiency"}},
	} {
		t.Run(tc.name+"/"+tc.output, func(t *testing.T) {
			t.Parallel()
			r := tc.res(t)
			var b bytes.Buffer
			if err := TornadoSVG(&b, r, tc.output); err != nil {
				t.Fatal(err)
			}
			texts := parseSVG(t, b.String())
			o, _ := findOutput(r, tc.output)
			var infl []rockheat.Influence
			for _, s := range r.Sensitivity {
				if s.Output == tc.output {
					infl = append(infl, s.Influences...)
				}
			}
			// Expected rows: inputs that move the output, by swing width.
			var moving []rockheat.Influence
			for _, f := range infl {
				if f.SwingLow != f.SwingHigh {
					moving = append(moving, f)
				}
			}
			sort.SliceStable(moving, func(i, j int) bool {
				return math.Abs(moving[i].SwingHigh-moving[i].SwingLow) > math.Abs(moving[j].SwingHigh-moving[j].SwingLow)
			})
			shown := moving[:min(len(moving), TornadoInputs)]
			prev := math.Inf(-1)
			for _, f := range shown {
				x, ok := findText(texts, f.Input)
				if !ok {
					t.Fatalf("input %s (swing %g → %g) has no row", f.Input, f.SwingLow, f.SwingHigh)
				}
				if x.y <= prev {
					t.Errorf("row %s is not below the row of a wider swing", f.Input)
				}
				prev = x.y
			}
			for _, f := range moving[len(shown):] {
				if _, ok := findText(texts, f.Input); ok {
					t.Errorf("input %s has a row beyond the %d widest swings", f.Input, TornadoInputs)
				}
			}
			for _, in := range tc.absent {
				if _, ok := findText(texts, in); ok {
					t.Errorf("input %s, which does not enter %s, has a row", in, tc.output)
				}
			}
			unit, scale := figUnit(r, o)
			base := sensitivityOf(r, tc.output).Base
			want := "all inputs at median  " + fig(base/scale) + " " + unit
			if _, ok := findText(texts, want); !ok {
				t.Errorf("no reference label %q", want)
			}
			caption := false
			for _, x := range texts {
				caption = caption || strings.HasPrefix(x.s, "The line is the output with every input at its median")
			}
			if !caption {
				t.Errorf("caption does not say what the reference line is")
			}
		})
	}
	hot := hotRockResult(t)
	if n := len(sensitivityOf(hot, "electric_power").Influences); n <= TornadoInputs {
		t.Errorf("the hot-rock test scenario has %d sampled inputs; it needs more than %d to test the cut", n, TornadoInputs)
	}
}

func TestTornadoNoSensitivity(t *testing.T) {
	t.Parallel()
	r := *demoResult(t)
	r.Sensitivity = nil
	err := TornadoSVG(io.Discard, &r, "electric_power")
	if err == nil || !strings.Contains(err.Error(), "distribution") {
		t.Errorf("TornadoSVG without sensitivities: error %v, want one saying an input must be a distribution", err)
	}
}

func TestDeclineSVG(t *testing.T) {
	t.Parallel()
	err := DeclineSVG(io.Discard, demoResult(t))
	if err == nil || !strings.Contains(err.Error(), "hot-rock") {
		t.Errorf("DeclineSVG of a reservoir result: error %v, want one saying only hot-rock results have a decline", err)
	}

	r := hotRockResult(t)
	var b bytes.Buffer
	if err := DeclineSVG(&b, r); err != nil {
		t.Fatal(err)
	}
	texts := parseSVG(t, b.String())
	outs := declineOutputs(r)
	if len(outs) != 5 {
		t.Fatalf("%d outputs of group %s, want one per report year [0, 5, 10, 20, 30]", len(outs), rockheat.DeclineGroup)
	}
	last := outs[len(outs)-1].Summary
	var ys []float64
	for _, p := range []struct {
		name string
		v    float64
	}{{"P10", last.P10}, {"P50", last.P50}, {"P90", last.P90}} {
		x, ok := findText(texts, p.name+"  "+fig(p.v))
		if !ok {
			t.Fatalf("no end label %q", p.name+"  "+fig(p.v))
		}
		ys = append(ys, x.y)
	}
	// The exceedance convention (common practice): P10 ≥ P50 ≥ P90, so on
	// a power axis the P10 line ends highest.
	if !(ys[0] < ys[1] && ys[1] < ys[2]) {
		t.Errorf("end label heights P10 %g, P50 %g, P90 %g: want P10 above P50 above P90", ys[0], ys[1], ys[2])
	}
	if _, ok := findText(texts, "thermal power, MWth"); !ok {
		t.Errorf("no axis label %q", "thermal power, MWth")
	}
}

func TestSVGEscapesText(t *testing.T) {
	t.Parallel()
	r := *demoResult(t)
	r.Title = `Vellmar <b>Ridge</b> & "Sons" <script>alert(1)</script>`
	for _, tc := range []struct {
		name string
		draw func(io.Writer) error
	}{
		{"exceedance", func(w io.Writer) error { return ExceedanceSVG(w, &r, "heat_in_place") }},
		{"tornado", func(w io.Writer) error { return TornadoSVG(w, &r, "heat_in_place") }},
	} {
		var b bytes.Buffer
		if err := tc.draw(&b); err != nil {
			t.Fatal(err)
		}
		doc := b.String()
		if strings.Contains(doc, "<b>") || strings.Contains(doc, "<script") {
			t.Errorf("%s: the title's markup reached the SVG unescaped", tc.name)
		}
		if _, ok := findText(parseSVG(t, doc), r.Title); !ok {
			t.Errorf("%s: the title does not read back from the parsed SVG", tc.name)
		}
	}
}

func BenchmarkExceedanceSVG(b *testing.B) {
	r := demoResult(b)
	for b.Loop() {
		if err := ExceedanceSVG(io.Discard, r, "heat_in_place"); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkTornadoSVG(b *testing.B) {
	r := hotRockResult(b)
	for b.Loop() {
		if err := TornadoSVG(io.Discard, r, "electric_power"); err != nil {
			b.Fatal(err)
		}
	}
}

func sensitivityOf(r *rockheat.Result, output string) rockheat.Sensitivity {
	for _, s := range r.Sensitivity {
		if s.Output == output {
			return s
		}
	}
	panic("no sensitivity for " + output)
}
