package scenarios

import (
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"regexp"
	"sort"
	"strconv"
	"strings"

	"github.com/BurntSushi/toml"

	"rockheat"
	"rockheat/heatmodel"
	"rockheat/sampler"
)

// rawRun is the [run] table that scenario and portfolio files share.
type rawRun struct {
	Trials   *int64  `toml:"trials"`
	Seed     *int64  `toml:"seed"`
	Sampling *string `toml:"sampling"`
}

// raw is the file as decoded; pointers tell given from left out.
type raw struct {
	Title string `toml:"title"`
	Run   rawRun `toml:"run"`
	Model struct {
		Kind        *string   `toml:"kind"`
		Fluid       *string   `toml:"fluid"`
		Conversion  *string   `toml:"conversion"`
		Decline     *string   `toml:"decline"`
		ReportYears []float64 `toml:"report_years"`
	} `toml:"model"`
	Inputs       map[string]any   `toml:"inputs"`
	Layers       []map[string]any `toml:"layers"`
	Correlations []struct {
		Inputs []string `toml:"inputs"`
		Rank   *float64 `toml:"rank"`
	} `toml:"correlations"`
}

var knownTopKeys = []string{"title", "run.trials", "run.seed", "run.sampling", "model.kind", "model.fluid",
	"model.conversion", "model.decline", "model.report_years", "layers", "correlations"}

// Parse checks the scenario text src, read from path (used in messages).
// It returns every problem found, as Problems.
func Parse(path string, src []byte) (*Scenario, error) {
	var r raw
	md, err := toml.Decode(string(src), &r)
	if err != nil {
		return nil, Problems{syntaxProblem(path, src, err)}
	}
	c := &checker{path: path, lines: indexLines(src), bad: map[string]bool{}}
	for _, k := range md.Undecoded() {
		key := k.String()
		if len(k) > 2 && k[0] == "inputs" || len(k) > 1 && k[0] == "layers" {
			continue // parameters of a distribution table, and layer keys: checked where they are read
		}
		c.add(key, "unknown key%s; remove it or correct its spelling", suggest(key, knownTopKeys))
	}
	s := &Scenario{Path: path, Source: src}
	run := &s.Run
	run.Path, run.Title = path, strings.TrimSpace(r.Title)
	sum := sha256.Sum256(src)
	run.SourceSHA256 = hex.EncodeToString(sum[:])
	if run.Title == "" {
		c.add("title", "missing; give the prospect a title, e.g. title = \"Example prospect\"")
	}
	c.runSettings(run, &r)
	run.Model = c.model(&r)
	c.inputs(run.Model, r.Inputs)
	c.correlationEntries(run, &r)
	s.Warnings = c.validate(run)
	if len(c.problems) > 0 {
		c.sort()
		return nil, c.problems
	}
	return s, nil
}

// runSettings reads the [run] table.
func (c *checker) runSettings(run *rockheat.Run, r *raw) {
	run.Trials, run.Seed, run.Sampling = c.runTable(r.Run)
}

// runTable reads the trials, seed and sampling of a [run] table, with
// their defaults.
func (c *checker) runTable(r rawRun) (trials int, seed uint64, method sampler.Method) {
	trials = rockheat.DefaultTrials
	if r.Trials != nil {
		if t := *r.Trials; t <= 0 {
			c.add("run.trials", "= %d must be a positive number of trials (the default is %d)", t, rockheat.DefaultTrials)
		} else {
			trials = int(min(t, rockheat.MaxTrials+1)) // above the limit: reported by Validate
		}
	}
	seed = DefaultSeed
	if r.Seed != nil {
		if *r.Seed < 0 {
			c.add("run.seed", "= %d must be a whole number ≥ 0", *r.Seed)
		} else {
			seed = uint64(*r.Seed)
		}
	}
	method = sampler.LatinHypercube
	if r.Sampling != nil {
		switch *r.Sampling {
		case "lhs":
		case "random":
			method = sampler.Random
		default:
			c.add("run.sampling", "= %q is not a sampling method; use \"lhs\" (Latin hypercube, the default) or \"random\"", *r.Sampling)
		}
	}
	return trials, seed, method
}

// model reads the [model] table and the [[layers]] list.
func (c *checker) model(r *raw) rockheat.Model {
	kind := choice(c, "model.kind", r.Model.Kind, heatmodel.Kinds, heatmodel.KindReservoir)
	fluid := choice(c, "model.fluid", r.Model.Fluid, heatmodel.FluidSources, heatmodel.FluidFixed)
	conv := choice(c, "model.conversion", r.Model.Conversion, heatmodel.Conversions, heatmodel.ConversionEfficiency)
	decline := choice(c, "model.decline", r.Model.Decline, heatmodel.Declines, heatmodel.DeclineExponential)
	if kind != heatmodel.KindHotRock {
		if r.Model.ReportYears != nil {
			c.add("model.report_years", "applies to kind \"hot-rock\" only; remove it")
		}
		if r.Model.Decline != nil {
			c.add("model.decline", "applies to kind \"hot-rock\" only (the drawdown of a mined block); remove it")
		}
	}
	switch kind {
	case heatmodel.KindPowerDensity:
		if r.Model.Fluid != nil || r.Model.Conversion != nil {
			c.add("model", "kind \"power-density\" takes no fluid or conversion: it scales an area by the power density of analogous fields; remove them")
		}
		if len(r.Layers) > 0 {
			c.add("layers", "[[layers]] do not apply to kind \"power-density\"; remove them")
		}
		return &rockheat.PowerDensity{}
	case heatmodel.KindReservoir:
		m := &rockheat.Reservoir{Fluid: fluid, Conversion: conv}
		m.Layers = c.layers(r.Layers)
		return m
	}
	if conv == heatmodel.ConversionExergy {
		c.add("model.conversion", "= \"exergy\" applies to kind \"reservoir\" (it needs the produced fluid's state); use \"efficiency\" for kind \"hot-rock\"")
	}
	m := &rockheat.HotRock{Fluid: fluid, ReportYears: r.Model.ReportYears, Decline: decline}
	if r.Model.ReportYears != nil && len(r.Model.ReportYears) == 0 {
		m.ReportYears = []float64{} // reported as empty by Validate
	}
	m.Layers = c.layers(r.Layers)
	return m
}

// layerKeys are the keys of a [[layers]] entry.
var layerKeys = []string{"bottom_km", "gradient_c_per_km", "conductivity_w_mk", "heat_production_uw_m3"}

// layers reads the [[layers]] list: each entry's values are numbers or
// distribution tables, like inputs.
func (c *checker) layers(raw []map[string]any) []rockheat.Layer {
	var out []rockheat.Layer
	for i, entry := range raw {
		var l rockheat.Layer
		dst := map[string]*rockheat.Quantity{"bottom_km": &l.Bottom, "gradient_c_per_km": &l.Gradient,
			"conductivity_w_mk": &l.Conductivity, "heat_production_uw_m3": &l.HeatProduction}
		keys := make([]string, 0, len(entry))
		for k := range entry {
			keys = append(keys, k)
		}
		sort.Strings(keys)
		for _, k := range keys {
			key := fmt.Sprintf("layers[%d].%s", i+1, k)
			q, ok := dst[k]
			if !ok {
				c.add(key, "unknown key of a layer%s; a layer takes %s", suggest(k, layerKeys), strings.Join(layerKeys, ", "))
				continue
			}
			if d, ok := c.distribution(key, entry[k]); ok {
				*q = rockheat.Quantity{Dist: d}
			} else {
				c.bad[key] = true
			}
		}
		out = append(out, l)
	}
	return out
}

// choice reads the value of a closed set at key, or returns def.
func choice[T fmt.Stringer](c *checker, key string, v *string, valid []T, def T) T {
	if v == nil {
		return def
	}
	q := make([]string, len(valid))
	for i, x := range valid {
		if x.String() == *v {
			return x
		}
		q[i] = fmt.Sprintf("%q", x.String())
	}
	c.add(key, "= %q is not one of %s", *v, strings.Join(q, ", "))
	return def
}

// inputs reads the [inputs] table into the model's quantities.
func (c *checker) inputs(m rockheat.Model, in map[string]any) {
	fields := m.Fields()
	byName := map[string]rockheat.Field{}
	names := make([]string, len(fields))
	for i, f := range fields {
		byName[f.Name()] = f
		names[i] = f.Name()
	}
	c.order = names
	var keys []string
	for name := range in {
		keys = append(keys, name)
	}
	sort.Strings(keys)
	for _, name := range keys {
		f, ok := byName[name]
		if !ok {
			c.add("inputs."+name, "unknown input for model kind %q%s; the inputs it takes are %s", m.Kind(), suggest(name, names), strings.Join(names, ", "))
			continue
		}
		if d, ok := c.distribution(name, in[name]); ok {
			*f.Q = rockheat.Quantity{Dist: d}
		} else {
			c.bad[name] = true
		}
	}
}

// correlationEntries reads the [[correlations]] list.
func (c *checker) correlationEntries(run *rockheat.Run, r *raw) {
	for i, cr := range r.Correlations {
		if len(cr.Inputs) != 2 || cr.Rank == nil {
			c.add(fmt.Sprintf("correlations[%d]", i+1), "each correlation needs inputs = [\"a\", \"b\"] (two sampled inputs) and rank = a number in [-1, 1]")
			continue
		}
		run.Correlations = append(run.Correlations, rockheat.Correlation{Inputs: [2]string{cr.Inputs[0], cr.Inputs[1]}, Rank: *cr.Rank})
	}
}

// validate checks the run as rockheat.Estimate will, and words its
// problems for the file: keys, lines, and fixes in TOML.
func (c *checker) validate(run *rockheat.Run) (warnings Problems) {
	ws, err := run.Check()
	for _, w := range ws {
		warnings = append(warnings, Problem{File: c.path, Line: c.lines["inputs."+w.Input], Key: "inputs." + w.Input, Msg: w.Msg})
	}
	var es rockheat.InputErrors
	if !errors.As(err, &es) {
		return warnings
	}
	for _, e := range es {
		if e.Input == "" {
			key := settingKey[e.Setting]
			if e.Index > 0 {
				key = fmt.Sprintf("%s[%d]", key, e.Index)
			}
			msg := e.Msg
			if e.Unknown != "" {
				msg += suggest(e.Unknown, c.order)
			}
			c.add(key, "%s", msg)
			continue
		}
		if c.bad[e.Input] {
			continue // reported as written
		}
		key := "inputs." + e.Input
		if strings.HasPrefix(e.Input, "layers[") {
			key = e.Input
		}
		msg := e.Msg
		if e.Missing {
			if _, ok := c.lines[key]; !ok {
				c.lines[key] = c.lines["inputs"]
			}
			if strings.HasPrefix(msg, "missing:") {
				msg += fmt.Sprintf("; add %s = <number>, or a distribution such as { dist = \"uniform\", min = ..., max = ... }", e.Input)
			}
		}
		c.add(key, "%s", msg)
	}
	return warnings
}

// settingKey maps the settings of rockheat.InputError to file keys.
var settingKey = map[string]string{"title": "title", "model": "model", "trials": "run.trials", "correlations": "correlations",
	"layers": "layers", "report_years": "model.report_years"}

func syntaxProblem(path string, src []byte, err error) Problem {
	var pe toml.ParseError
	if errors.As(err, &pe) {
		return Problem{File: path, Line: pe.Position.Line, Msg: "TOML syntax: " + pe.Message + "; see https://toml.io for the syntax"}
	}
	msg := err.Error()
	line := 0
	if m := lineRE.FindStringSubmatch(msg); m != nil {
		fmt.Sscan(m[1], &line)
	}
	if m := typeRE.FindStringSubmatch(msg); m != nil {
		return Problem{File: path, Line: line, Key: m[1], Msg: typeMessage(m[1], m[2], valueAt(src, line))}
	}
	msg = strings.TrimPrefix(msg, "toml: ")
	return Problem{File: path, Line: line, Msg: msg}
}

// typeMessage says what the value of key must be, in the trade's words
// rather than Go's: dest is the decoder's destination type, value the text
// after the key's "=".
func typeMessage(key, dest, value string) string {
	what := map[string]string{"integer": "a whole number", "string": "text in double quotes",
		"float": "a number", "slice": "a list in brackets"}[dest]
	if what == "" {
		what = "a value of another type"
	}
	if unq, err := strconv.Unquote(value); err == nil && dest != "string" {
		if _, err := strconv.ParseFloat(unq, 64); err == nil {
			return fmt.Sprintf("is text; write %s without quotes", unq)
		}
	}
	msg := "must be " + what
	if ex, ok := typeExamples[key]; ok {
		msg += ", e.g. " + ex
	}
	return msg
}

var typeExamples = map[string]string{
	"title": `"Example prospect"`, "run.trials": "100000", "run.seed": "12345", "run.sampling": `"lhs"`,
	"model.kind": `"reservoir"`, "model.fluid": `"if97"`, "model.conversion": `"exergy"`,
	"model.report_years":  "[0, 10, 20, 30]",
	"correlations.inputs": `["porosity", "rock_density_kg_m3"]`, "correlations.rank": "-0.5",
}

// valueAt returns the text after "=" on line (1-based) of src, trimmed of
// a trailing comment.
func valueAt(src []byte, line int) string {
	lines := strings.Split(string(src), "\n")
	if line < 1 || line > len(lines) {
		return ""
	}
	_, v, _ := strings.Cut(lines[line-1], "=")
	if i := strings.Index(v, " #"); i >= 0 {
		v = v[:i]
	}
	return strings.TrimSpace(v)
}

var (
	lineRE = regexp.MustCompile(`line (\d+)`)
	typeRE = regexp.MustCompile(`\(last key "([^"]+)"\): incompatible types: TOML value has type \w+; destination has type (\w+)`)
)
