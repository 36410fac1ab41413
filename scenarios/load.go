package scenarios

import (
	"errors"
	"fmt"
	"math"
	"os"
	"regexp"
	"sort"
	"strings"

	"github.com/BurntSushi/toml"
	"gonum.org/v1/gonum/mat"

	"rockheat/sampler"
)

// Model kinds.
const (
	// KindReservoir is the volumetric heat in place of a reservoir block.
	KindReservoir = "reservoir"
	// KindHotRock is the heat above a minimum useful temperature in a
	// conductive rock column, mined by a circulated water flow.
	KindHotRock = "hot-rock"
)

// Fluid property sources.
const (
	// FluidFixed takes fluid density and heat capacity from the inputs.
	FluidFixed = "fixed"
	// FluidIF97 takes them from IAPWS-IF97 at the fluid's temperature and
	// pressure.
	FluidIF97 = "if97"
)

// Conversion routes from recoverable heat to electric capacity.
const (
	// ConversionEfficiency multiplies recoverable heat by a conversion efficiency.
	ConversionEfficiency = "efficiency"
	// ConversionExergy multiplies the available work of the produced
	// fluid by a utilization efficiency (USGS Circular 790).
	ConversionExergy = "exergy"
)

// DefaultReportYears are the times of a hot-rock run's power decline
// figures when [model] report_years is not given.
var DefaultReportYears = []float64{0, 10, 20, 30}

// Limits of IAPWS-IF97 region 1 (compressed liquid) used with fluid = "if97".
const (
	if97MaxTempC     = 350 // 623.15 K
	if97MaxPressureM = 100 // MPa
)

// Defaults of the [run] table.
const (
	DefaultTrials = 100000
	// DefaultSeed is the seed of a file that gives none. Runs are never
	// seeded from the clock unless the user asks (--seed random).
	DefaultSeed = 1
	// MaxTrials bounds [run] trials: 10^10 trials would take hours on a
	// laptop even in bounded-memory mode.
	MaxTrials = 10_000_000_000
)

// Model holds the [model] settings.
type Model struct {
	Kind       string // KindReservoir or KindHotRock
	Fluid      string // FluidFixed or FluidIF97
	Conversion string // ConversionEfficiency or ConversionExergy
	// Layered is true when [[layers]] give a piecewise geotherm (hot-rock);
	// Layers then lists them from the surface down.
	Layered bool
	Layers  []Layer
	// ReportYears are the times, years, of the hot-rock power figures.
	ReportYears []float64
}

// Layer is one [[layers]] entry: down to BottomKm the rock temperature
// rises at GradientCPerKm.
type Layer struct {
	BottomKm       float64 // km below the surface
	GradientCPerKm float64 // °C/km
	Line           int
}

// Correlation is one [[correlations]] entry: the target Spearman rank
// correlation of two sampled inputs.
type Correlation struct {
	Inputs [2]string
	Rank   float64
	Line   int
}

// Input is one entry of [inputs], in the units named by its key.
type Input struct {
	Key  Key
	Dist sampler.Distribution
	// Fixed is true for a plain number (and for an optional key left out);
	// Dist is then a sampler.Fixed.
	Fixed bool
	// Given is false for an optional key left out of the file.
	Given bool
	Line  int
}

// Scenario is a checked scenario, ready to run.
type Scenario struct {
	Path     string
	Title    string
	Trials   int
	Seed     uint64
	Sampling sampler.Method
	Model    Model
	// Inputs lists every input of the model, in the order of KindsFor.
	Inputs []Input
	// Correlations lists the [[correlations]] entries.
	Correlations []Correlation
	// Correlation is the target rank correlation matrix of the sampled
	// (not fixed) inputs, in their order in Inputs; nil if none is given.
	Correlation *mat.SymDense
	// Source is the file's text.
	Source []byte
}

// Input returns the input with the given key, and whether there is one.
func (s *Scenario) Input(key string) (Input, bool) {
	for _, in := range s.Inputs {
		if in.Key.Name == key {
			return in, true
		}
	}
	return Input{}, false
}

// LoadFile reads and checks the scenario file at path.
func LoadFile(path string) (*Scenario, error) {
	src, err := os.ReadFile(path)
	if err != nil {
		return nil, fmt.Errorf("reading scenario: %w", err)
	}
	return Parse(path, src)
}

// raw is the file as decoded; pointers tell given from left out.
type raw struct {
	Title string `toml:"title"`
	Run   struct {
		Trials   *int64  `toml:"trials"`
		Seed     *int64  `toml:"seed"`
		Sampling *string `toml:"sampling"`
	} `toml:"run"`
	Model struct {
		Kind        *string   `toml:"kind"`
		Fluid       *string   `toml:"fluid"`
		Conversion  *string   `toml:"conversion"`
		ReportYears []float64 `toml:"report_years"`
	} `toml:"model"`
	Inputs map[string]any `toml:"inputs"`
	Layers []struct {
		BottomKm       *float64 `toml:"bottom_km"`
		GradientCPerKm *float64 `toml:"gradient_c_per_km"`
	} `toml:"layers"`
	Correlations []struct {
		Inputs []string `toml:"inputs"`
		Rank   *float64 `toml:"rank"`
	} `toml:"correlations"`
}

// Parse checks the scenario text src, read from path (used in messages).
// It returns every problem found, as Problems.
func Parse(path string, src []byte) (*Scenario, error) {
	var r raw
	md, err := toml.Decode(string(src), &r)
	if err != nil {
		return nil, Problems{syntaxProblem(path, err)}
	}
	c := &checker{path: path, lines: indexLines(src)}
	for _, k := range md.Undecoded() {
		key := k.String()
		if len(k) > 2 && k[0] == "inputs" {
			continue // parameters of a distribution table, checked in input
		}
		c.add(key, "unknown key%s; remove it or correct its spelling", suggest(key, knownTopKeys))
	}
	s := &Scenario{Path: path, Title: strings.TrimSpace(r.Title), Source: src}
	if s.Title == "" {
		c.add("title", "missing; give the prospect a title, e.g. title = \"Example prospect\"")
	}

	s.Trials = DefaultTrials
	if r.Run.Trials != nil {
		t := *r.Run.Trials
		switch {
		case t <= 0:
			c.add("run.trials", "= %d must be a positive number of trials (the default is %d)", t, DefaultTrials)
		case t > MaxTrials:
			c.add("run.trials", "= %d is more than the %d a run can hold; use fewer trials, or --precision to stop when the percentiles are settled", t, int64(MaxTrials))
		default:
			s.Trials = int(t)
		}
	}
	s.Seed = DefaultSeed
	if r.Run.Seed != nil {
		if *r.Run.Seed < 0 {
			c.add("run.seed", "= %d must be a whole number ≥ 0", *r.Run.Seed)
		} else {
			s.Seed = uint64(*r.Run.Seed)
		}
	}
	s.Sampling = sampler.LatinHypercube
	if r.Run.Sampling != nil {
		switch *r.Run.Sampling {
		case "lhs":
		case "random":
			s.Sampling = sampler.Random
		default:
			c.add("run.sampling", "= %q is not a sampling method; use \"lhs\" (Latin hypercube, the default) or \"random\"", *r.Run.Sampling)
		}
	}

	s.Model = Model{Kind: KindReservoir, Fluid: FluidFixed, Conversion: ConversionEfficiency}
	c.choice("model.kind", r.Model.Kind, &s.Model.Kind, []string{KindReservoir, KindHotRock})
	c.choice("model.fluid", r.Model.Fluid, &s.Model.Fluid, []string{FluidFixed, FluidIF97})
	c.choice("model.conversion", r.Model.Conversion, &s.Model.Conversion, []string{ConversionEfficiency, ConversionExergy})
	c.modelSettings(s, &r)

	keys := KeysFor(s.Model)
	known := map[string]bool{}
	for _, k := range keys {
		known[k.Name] = true
	}
	var names []string
	for name := range r.Inputs {
		names = append(names, name)
	}
	sort.Strings(names)
	for _, name := range names {
		if !known[name] {
			valid := make([]string, len(keys))
			for i, k := range keys {
				valid[i] = k.Name
			}
			c.add("inputs."+name, "unknown input for model kind %q%s; the inputs it takes are %s", s.Model.Kind, suggest(name, valid), strings.Join(valid, ", "))
		}
	}
	for _, k := range keys {
		v, ok := r.Inputs[k.Name]
		if !ok {
			if k.Optional {
				continue
			}
			if k.Required {
				c.lines["inputs."+k.Name] = c.lines["inputs"]
				c.add("inputs."+k.Name, "missing: the %s (%s) is required; add %s = <number>, or a distribution such as { dist = \"uniform\", min = ..., max = ... }", k.Doc, k.Unit, k.Name)
				continue
			}
			s.Inputs = append(s.Inputs, Input{Key: k, Dist: sampler.Fixed{Value: k.Default}, Fixed: true})
			continue
		}
		in, ok := c.input(k, v)
		if ok {
			s.Inputs = append(s.Inputs, in)
		}
	}
	if len(c.problems) == 0 {
		c.crossChecks(s)
	}
	if len(c.problems) == 0 {
		c.correlations(s, &r)
	}
	if len(c.problems) > 0 {
		return nil, c.problems
	}
	return s, nil
}

var knownTopKeys = []string{"title", "run.trials", "run.seed", "run.sampling", "model.kind", "model.fluid",
	"model.conversion", "model.report_years", "layers", "correlations"}

type checker struct {
	path     string
	lines    map[string]int
	problems Problems
}

func (c *checker) add(key, format string, args ...any) {
	c.problems = append(c.problems, Problem{File: c.path, Line: c.lines[key], Key: key, Msg: fmt.Sprintf(format, args...)})
}

func (c *checker) choice(key string, v *string, dst *string, valid []string) {
	if v == nil {
		return
	}
	for _, ok := range valid {
		if *v == ok {
			*dst = *v
			return
		}
	}
	q := make([]string, len(valid))
	for i, s := range valid {
		q[i] = fmt.Sprintf("%q", s)
	}
	c.add(key, "= %q is not one of %s", *v, strings.Join(q, ", "))
}

// distParams lists the parameters of each distribution: required, then optional.
var distParams = map[string][2][]string{
	"uniform":    {{"min", "max"}, nil},
	"triangular": {{"min", "mode", "max"}, nil},
	"pert":       {{"min", "mode", "max"}, nil},
	"normal":     {{"mean", "sd"}, {"min", "max"}},
	"lognormal":  {nil, {"mean", "sd", "p90", "p10", "min", "max"}},
}

// input checks one [inputs] entry against its key.
func (c *checker) input(k Key, v any) (Input, bool) {
	key := "inputs." + k.Name
	in := Input{Key: k, Given: true, Line: c.lines[key]}
	if x, ok := number(v); ok {
		if err := checkFixed(k, x); err != nil {
			c.add(key, "%v", err)
			return in, false
		}
		in.Dist, in.Fixed = sampler.Fixed{Value: x}, true
		return in, true
	}
	tbl, ok := v.(map[string]any)
	if !ok {
		c.add(key, "= %v is neither a number nor a distribution table; write e.g. %s = 0.1 or %s = { dist = \"uniform\", min = 0.05, max = 0.15 }", v, k.Name, k.Name)
		return in, false
	}
	name, _ := tbl["dist"].(string)
	params, known := distParams[name]
	if !known {
		c.add(key, "dist = %v is not a distribution rockheat knows; use one of \"uniform\", \"triangular\", \"pert\", \"normal\", \"lognormal\"", quoteAny(tbl["dist"]))
		return in, false
	}
	allowed := map[string]bool{"dist": true}
	for _, p := range append(append([]string{}, params[0]...), params[1]...) {
		allowed[p] = true
	}
	vals := map[string]float64{}
	bad := false
	var pnames []string
	for p := range tbl {
		pnames = append(pnames, p)
	}
	sort.Strings(pnames)
	for _, p := range pnames {
		if !allowed[p] {
			var list []string
			for _, a := range append(append([]string{}, params[0]...), params[1]...) {
				list = append(list, a)
			}
			c.add(key+"."+p, "is not a parameter of a %s distribution%s; it takes %s", name, suggest(p, list), strings.Join(list, ", "))
			bad = true
			continue
		}
		if p == "dist" {
			continue
		}
		x, ok := number(tbl[p])
		if !ok {
			c.add(key+"."+p, "= %v must be a number", quoteAny(tbl[p]))
			bad = true
			continue
		}
		if math.IsNaN(x) || math.IsInf(x, 0) {
			c.add(key+"."+p, "= %v is not a finite number", x)
			bad = true
			continue
		}
		vals[p] = x
	}
	for _, p := range params[0] {
		if _, ok := vals[p]; !ok && !bad {
			c.add(key, "a %s distribution needs %s; add %s = ...", name, strings.Join(params[0], ", "), p)
			bad = true
		}
	}
	if bad {
		return in, false
	}
	d, err := build(name, vals)
	if err != nil {
		c.add(key, "%s: %v", name, err)
		return in, false
	}
	d, err = fitDomain(k, d, name, vals)
	if err != nil {
		c.add(key, "%v", err)
		return in, false
	}
	if t, ok := d.(sampler.Truncated); ok {
		d = t.WithLabel(label(name, params, vals))
	}
	in.Dist = d
	return in, true
}

// label describes a distribution by the parameters the file gives, in
// the order of distParams.
func label(name string, params [2][]string, vals map[string]float64) string {
	var parts []string
	for _, p := range append(append([]string{}, params[0]...), params[1]...) {
		if v, ok := vals[p]; ok {
			parts = append(parts, fmt.Sprintf("%s %g", p, v))
		}
	}
	return name + "(" + strings.Join(parts, ", ") + ")"
}

func build(name string, v map[string]float64) (sampler.Distribution, error) {
	lo, hi := math.Inf(-1), math.Inf(1)
	if x, ok := v["min"]; ok {
		lo = x
	}
	if x, ok := v["max"]; ok {
		hi = x
	}
	switch name {
	case "uniform":
		return sampler.NewUniform(v["min"], v["max"])
	case "triangular":
		return sampler.NewTriangular(v["min"], v["mode"], v["max"])
	case "pert":
		return sampler.NewPERT(v["min"], v["mode"], v["max"])
	case "normal":
		return sampler.NewNormal(v["mean"], v["sd"], lo, hi)
	case "lognormal":
		_, hasMean := v["mean"]
		_, hasSD := v["sd"]
		_, has90 := v["p90"]
		_, has10 := v["p10"]
		var mu, sigma float64
		var err error
		switch {
		case hasMean && hasSD && !has90 && !has10:
			mu, sigma, err = sampler.LogNormalParams(v["mean"], v["sd"])
		case has90 && has10 && !hasMean && !hasSD:
			mu, sigma, err = sampler.LogNormalFromExceedance(v["p90"], v["p10"])
		default:
			return nil, errors.New("give either mean and sd (of the variable itself) or p90 and p10, not a mix")
		}
		if err != nil {
			return nil, err
		}
		if math.IsInf(lo, -1) {
			lo = 0
		}
		return sampler.NewLogNormal(mu, sigma, lo, hi)
	}
	panic("scenarios: unknown distribution " + name)
}

// tailMass is the largest probability a distribution with an unbounded tail
// may put outside an input's physical domain; within it, the tail is cut
// at the domain limit (the draws change by less than that probability).
const tailMass = 1e-6

// fitDomain checks that d stays in k's physical domain, truncating an
// unbounded normal or lognormal tail that reaches past it with negligible
// probability.
func fitDomain(k Key, d sampler.Distribution, name string, v map[string]float64) (sampler.Distribution, error) {
	lo, hi := d.Support()
	if (k.LoOpen && !isUnbounded(name) && lo == k.Lo) || (k.HiOpen && !isUnbounded(name) && hi == k.Hi) {
		return nil, fmt.Errorf("%s reaches the limit %s of %s, which it must stay inside; keep min and max strictly within it", d, rangeText(k), k.Doc)
	}
	if lo >= k.Lo && hi <= k.Hi {
		return d, nil
	}
	if !isUnbounded(name) {
		return nil, fmt.Errorf("%s reaches [%g, %g], outside the valid range %s of %s; keep min and max within it", d, lo, hi, rangeText(k), k.Doc)
	}
	mass := d.Outside(k.Lo, k.Hi)
	if mass > tailMass {
		fix := ""
		if lo < k.Lo {
			fix = fmt.Sprintf("min = %g", k.Lo)
		}
		if hi > k.Hi {
			if fix != "" {
				fix += " and "
			}
			fix += fmt.Sprintf("max = %g", k.Hi)
		}
		return nil, fmt.Errorf("%s puts %.3g%% of draws outside the valid range %s of %s; add %s to truncate it, or narrow the distribution", d, 100*mass, rangeText(k), k.Doc, fix)
	}
	cut := map[string]float64{}
	for p, x := range v {
		cut[p] = x
	}
	if lo < k.Lo {
		cut["min"] = k.Lo
	}
	if hi > k.Hi {
		cut["max"] = k.Hi
	}
	return build(name, cut)
}

func isUnbounded(name string) bool { return name == "normal" || name == "lognormal" }

func checkFixed(k Key, x float64) error {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return fmt.Errorf("= %v is not a finite number", x)
	}
	lowOK := x > k.Lo || (!k.LoOpen && x == k.Lo)
	highOK := x < k.Hi || (!k.HiOpen && x == k.Hi)
	if !lowOK || !highOK {
		return fmt.Errorf("= %g is outside the valid range %s of %s (%s)", x, rangeText(k), k.Doc, k.Unit)
	}
	return nil
}

func rangeText(k Key) string {
	l, r := "[", "]"
	if k.LoOpen {
		l = "("
	}
	if k.HiOpen {
		r = ")"
	}
	hi := fmt.Sprintf("%g", k.Hi)
	if math.IsInf(k.Hi, 1) {
		hi, r = "∞", ")"
	}
	return fmt.Sprintf("%s%g, %s%s", l, k.Lo, hi, r)
}

func number(v any) (float64, bool) {
	switch x := v.(type) {
	case int64:
		return float64(x), true
	case float64:
		return x, true
	}
	return 0, false
}

func quoteAny(v any) string {
	if s, ok := v.(string); ok {
		return fmt.Sprintf("%q", s)
	}
	if v == nil {
		return "(missing)"
	}
	return fmt.Sprint(v)
}

func syntaxProblem(path string, err error) Problem {
	var pe toml.ParseError
	if errors.As(err, &pe) {
		return Problem{File: path, Line: pe.Position.Line, Msg: "TOML syntax: " + pe.Message + "; see https://toml.io for the syntax"}
	}
	msg := err.Error()
	line := 0
	if m := lineRE.FindStringSubmatch(msg); m != nil {
		fmt.Sscan(m[1], &line)
	}
	msg = strings.TrimPrefix(msg, "toml: ")
	return Problem{File: path, Line: line, Msg: msg}
}

var lineRE = regexp.MustCompile(`line (\d+)`)

// indexLines maps dotted keys to the line where they are written, for
// messages. It understands [table] headers and key = value lines, and the
// keys of one-line inline tables.
func indexLines(src []byte) map[string]int {
	lines := map[string]int{}
	table := ""
	for i, l := range strings.Split(string(src), "\n") {
		l = strings.TrimSpace(l)
		if l == "" || l[0] == '#' {
			continue
		}
		if m := headerRE.FindStringSubmatch(l); m != nil {
			table = strings.TrimSpace(m[1])
			if _, ok := lines[table]; !ok {
				lines[table] = i + 1
			}
			continue
		}
		if m := keyRE.FindStringSubmatch(l); m != nil {
			key := m[1]
			if table != "" {
				key = table + "." + key
			}
			if _, ok := lines[key]; !ok {
				lines[key] = i + 1
			}
			if j := strings.Index(l, "{"); j >= 0 {
				for _, sm := range innerRE.FindAllStringSubmatch(l[j:], -1) {
					if _, ok := lines[key+"."+sm[1]]; !ok {
						lines[key+"."+sm[1]] = i + 1
					}
				}
			}
		}
	}
	return lines
}

var (
	headerRE = regexp.MustCompile(`^\[\[?\s*([A-Za-z0-9_.\- ]+?)\s*\]\]?`)
	keyRE    = regexp.MustCompile(`^([A-Za-z0-9_\-]+)\s*=`)
	innerRE  = regexp.MustCompile(`[{,]\s*([A-Za-z0-9_\-]+)\s*=`)
)

// suggest returns ` (did you mean "x"?)` for the nearest valid name within
// a small edit distance, or "".
func suggest(name string, valid []string) string {
	base := name
	if i := strings.LastIndex(name, "."); i >= 0 {
		base = name[i+1:]
	}
	best, bestD := "", 3
	for _, v := range valid {
		vb := v
		if i := strings.LastIndex(v, "."); i >= 0 {
			vb = v[i+1:]
		}
		if d := editDistance(base, vb); d < bestD {
			best, bestD = v, d
		}
	}
	if best == "" {
		return ""
	}
	return fmt.Sprintf(" (did you mean %q?)", best)
}

func editDistance(a, b string) int {
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			cost := 1
			if a[i-1] == b[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(b)]
}
