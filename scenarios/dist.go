package scenarios

import (
	"errors"
	"fmt"
	"maps"
	"math"
	"slices"
	"sort"
	"strconv"
	"strings"

	"rockheat/sampler"
)

// distNames lists the distributions of distParams, quoted, for messages.
func distNames() string {
	var names []string
	for _, n := range slices.Sorted(maps.Keys(distParams)) {
		names = append(names, strconv.Quote(n))
	}
	return strings.Join(names, ", ")
}

// distParams lists the parameters of each distribution: required, then optional.
var distParams = map[string][2][]string{
	"uniform":    {{"min", "max"}, nil},
	"triangular": {{"min", "mode", "max"}, nil},
	"pert":       {{"min", "mode", "max"}, nil},
	"normal":     {{"mean", "sd"}, {"min", "max"}},
	"lognormal":  {nil, {"mean", "sd", "p90", "p10", "min", "max"}},
}

// distribution reads the value of input name: a plain number (a fixed
// value) or a table naming a distribution and its parameters.
func (c *checker) distribution(name string, v any) (sampler.Distribution, bool) {
	key := "inputs." + name
	if strings.HasPrefix(name, "layers[") {
		key = name
	}
	if x, ok := number(v); ok {
		return sampler.Fixed{Value: x}, true
	}
	if text, ok := v.(string); ok {
		if _, err := strconv.ParseFloat(strings.TrimSpace(text), 64); err == nil {
			c.add(key, "= %q is text; write %s without quotes", text, strings.TrimSpace(text))
			return nil, false
		}
	}
	tbl, ok := v.(map[string]any)
	if !ok {
		c.add(key, "= %v is neither a number nor a distribution table; write e.g. %s = 0.1 or %s = { dist = \"uniform\", min = 0.05, max = 0.15 }", v, name, name)
		return nil, false
	}
	dname, _ := tbl["dist"].(string)
	params, known := distParams[dname]
	if !known {
		c.add(key, "dist = %v is not a distribution rockheat knows; use one of %s", quoteAny(tbl["dist"]), distNames())
		return nil, false
	}
	vals, ok := c.params(key, dname, params, tbl)
	if !ok {
		return nil, false
	}
	d, err := build(dname, vals)
	if err != nil {
		c.add(key, "%s: %v", dname, err)
		return nil, false
	}
	if t, ok := d.(sampler.Truncated); ok {
		d = t.WithLabel(label(dname, params, vals))
	}
	return d, true
}

// params reads the parameters of a distribution table.
func (c *checker) params(key, dname string, params [2][]string, tbl map[string]any) (map[string]float64, bool) {
	all := append(append([]string{}, params[0]...), params[1]...)
	var pnames []string
	for p := range tbl {
		pnames = append(pnames, p)
	}
	sort.Strings(pnames)
	vals := map[string]float64{}
	bad := false
	for _, p := range pnames {
		if p == "dist" {
			continue
		}
		if !slices.Contains(all, p) {
			c.add(key+"."+p, "is not a parameter of a %s distribution%s; it takes %s", dname, suggest(p, all), strings.Join(all, ", "))
			bad = true
			continue
		}
		x, ok := number(tbl[p])
		text, isText := tbl[p].(string)
		_, numErr := strconv.ParseFloat(strings.TrimSpace(text), 64)
		switch {
		case isText && numErr == nil:
			c.add(key+"."+p, "= %q is text; write %s without quotes", text, strings.TrimSpace(text))
			bad = true
		case !ok:
			c.add(key+"."+p, "= %v must be a number", quoteAny(tbl[p]))
			bad = true
		case math.IsNaN(x) || math.IsInf(x, 0):
			c.add(key+"."+p, "= %v is not a finite number", x)
			bad = true
		default:
			vals[p] = x
		}
	}
	for _, p := range params[0] {
		if _, ok := vals[p]; !ok && !bad {
			c.add(key, "a %s distribution needs %s; add %s = ...", dname, strings.Join(params[0], ", "), p)
			bad = true
		}
	}
	return vals, !bad
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

// build returns the distribution name with the parameters v.
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
		return buildLogNormal(v, lo, hi)
	}
	panic("scenarios: unknown distribution " + name)
}

func buildLogNormal(v map[string]float64, lo, hi float64) (sampler.Distribution, error) {
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
