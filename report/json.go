package report

import (
	"bytes"
	"encoding/json"
	"io"
	"math"

	"rockheat"
	"rockheat/heatmodel"
	"rockheat/stats"
)

// jsonFigures is one output in the JSON contract.
type jsonFigures struct {
	Unit string  `json:"unit"`
	P90  float64 `json:"p90"`
	P50  float64 `json:"p50"`
	P10  float64 `json:"p10"`
	Mean float64 `json:"mean"`
	SD   float64 `json:"sd"`
	Min  float64 `json:"min"`
	Max  float64 `json:"max"`
	CI   jsonCI  `json:"ci"`
}

// jsonCI holds the confidence intervals of the percentiles at the level
// asked; an interval the run is too short to give is null. Coverage is
// what each interval's order statistics achieve.
type jsonCI struct {
	Level    float64      `json:"level"`
	P90      *[2]float64  `json:"p90"`
	P50      *[2]float64  `json:"p50"`
	P10      *[2]float64  `json:"p10"`
	Coverage jsonCoverage `json:"coverage"`
}

type jsonCoverage struct {
	P90 float64 `json:"p90"`
	P50 float64 `json:"p50"`
	P10 float64 `json:"p10"`
}

// object is a JSON object whose keys keep their order.
type object struct {
	keys   []string
	values []any
}

func (o object) MarshalJSON() ([]byte, error) {
	var b bytes.Buffer
	b.WriteByte('{')
	for i, k := range o.keys {
		if i > 0 {
			b.WriteByte(',')
		}
		kb, _ := json.Marshal(k)
		b.Write(kb)
		b.WriteByte(':')
		v, err := json.Marshal(o.values[i])
		if err != nil {
			return nil, err
		}
		b.Write(v)
	}
	b.WriteByte('}')
	return b.Bytes(), nil
}

// yearFigures is one point of a group of outputs reported over time.
type yearFigures struct {
	Year float64 `json:"year"`
	jsonFigures
}

// outputsObject lays out the outputs in model order; outputs of a group
// (the hot-rock power at each report year) become one list under the
// group's name, each entry with its year.
func outputsObject(outs []rockheat.Output, level float64) object {
	var o object
	for i := 0; i < len(outs); i++ {
		out := outs[i]
		if g := out.Spec.Group; g != "" {
			var list []yearFigures
			for ; i < len(outs) && outs[i].Spec.Group == g; i++ {
				list = append(list, yearFigures{outs[i].Spec.Year, figures(outs[i], level)})
			}
			i--
			o.keys = append(o.keys, g)
			o.values = append(o.values, list)
			continue
		}
		o.keys = append(o.keys, out.Spec.Name)
		o.values = append(o.values, figures(out, level))
	}
	return o
}

func figures(o rockheat.Output, level float64) jsonFigures {
	s := o.Summary
	iv := func(i stats.Interval) *[2]float64 {
		if !i.OK() {
			return nil
		}
		return &[2]float64{i.Lo, i.Hi}
	}
	return jsonFigures{Unit: o.Spec.Unit, P90: s.P90, P50: s.P50, P10: s.P10, Mean: s.Mean, SD: finiteOr0(s.SD), Min: s.Min, Max: s.Max,
		CI: jsonCI{Level: level, P90: iv(s.P90CI), P50: iv(s.P50CI), P10: iv(s.P10CI),
			Coverage: jsonCoverage{s.P90CI.Coverage, s.P50CI.Coverage, s.P10CI.Coverage}}}
}

func finiteOr0(x float64) float64 {
	if math.IsNaN(x) || math.IsInf(x, 0) {
		return 0
	}
	return x
}

type jsonInput struct {
	Key          string `json:"key"`
	Unit         string `json:"unit"`
	Distribution string `json:"distribution"`
}

type jsonInfluence struct {
	Input           string  `json:"input"`
	RankCorrelation float64 `json:"rank_correlation"`
	VarianceShare   float64 `json:"variance_share"`
	SwingLow        float64 `json:"swing_low"`
	SwingHigh       float64 `json:"swing_high"`
}

func sensitivityObject(sens []rockheat.Sensitivity) object {
	var o object
	for _, s := range sens {
		list := make([]jsonInfluence, len(s.Influences))
		for j, f := range s.Influences {
			list[j] = jsonInfluence{f.Input, f.RankCorrelation, f.VarianceShare, finiteOr0(f.SwingLow), finiteOr0(f.SwingHigh)}
		}
		o.keys = append(o.keys, s.Output)
		o.values = append(o.values, list)
	}
	return o
}

type jsonCorrelation struct {
	Inputs [2]string `json:"inputs"`
	Rank   float64   `json:"rank"`
}

type jsonMethod struct {
	Percentiles       string  `json:"percentiles"`
	SketchRelErr      float64 `json:"sketch_relative_error,omitempty"`
	LHSPerBatch       bool    `json:"lhs_per_batch,omitempty"`
	SensitivityTrials int     `json:"sensitivity_trials"`
}

type jsonPrecision struct {
	Target    float64 `json:"target"`
	Converged bool    `json:"converged"`
}

type jsonResult struct {
	Title          string            `json:"title"`
	Kind           string            `json:"kind"`
	Fluid          string            `json:"fluid"`
	Conversion     string            `json:"conversion"`
	Trials         int               `json:"trials"`
	Seed           uint64            `json:"seed"`
	Sampling       string            `json:"sampling"`
	Convention     string            `json:"convention"`
	Outputs        object            `json:"outputs"`
	ZeroHeatTrials int               `json:"zero_heat_trials"`
	Sensitivity    object            `json:"sensitivity"`
	Method         jsonMethod        `json:"method"`
	Precision      *jsonPrecision    `json:"precision,omitempty"`
	Inputs         []jsonInput       `json:"inputs"`
	Correlations   []jsonCorrelation `json:"correlations"`
	Warnings       []string          `json:"warnings"`
	Caution        string            `json:"caution"`
	Decline        string            `json:"decline,omitempty"`
	Compared       *jsonCompared     `json:"compared_decline,omitempty"`
}

// jsonCompared is the run with the other decline model.
type jsonCompared struct {
	Decline string `json:"decline"`
	Outputs object `json:"outputs"`
}

// JSON writes r in the JSON contract: title, kind, trials, seed,
// sampling, outputs (an object keyed by output name in model order, each
// with unit, p90, p50, p10, mean, sd, min, max and confidence intervals,
// an interval null when the run is too short to give it, with the
// coverage asked and achieved), zero_heat_trials, sensitivity, the method
// (percentiles exact or from a sketch, and its relative error), for a
// hot-rock run its decline and, when asked, compared_decline (the other
// decline on the same draws), inputs, warnings and the caution.
func JSON(w io.Writer, r *rockheat.Result) error {
	jr := jsonResult{Title: r.Title, Kind: r.Kind.String(), Fluid: r.Fluid.String(), Conversion: r.Conversion.String(), Trials: r.Trials, Seed: r.Seed, Sampling: r.Sampling.String(),
		Convention: Convention, Outputs: outputsObject(r.Outputs, r.Confidence), ZeroHeatTrials: r.ZeroHeatTrials,
		Sensitivity: sensitivityObject(r.Sensitivity),
		Method:      jsonMethod{Percentiles: "exact", LHSPerBatch: r.PerBatch, SensitivityTrials: r.SensitivityN},
		Warnings:    append([]string{}, r.Warnings...), Caution: Caution}
	jr.Correlations = []jsonCorrelation{}
	for _, c := range r.Correlations {
		jr.Correlations = append(jr.Correlations, jsonCorrelation{c.Inputs, c.Rank})
	}
	if r.Streaming {
		jr.Method.Percentiles = "sketch"
		jr.Method.SketchRelErr = r.SketchRelErr
	}
	if r.Precision > 0 {
		jr.Precision = &jsonPrecision{Target: r.Precision, Converged: r.Converged}
	}
	if r.Kind == heatmodel.KindHotRock {
		jr.Decline = r.Decline.String()
	}
	if c := r.Comparison; c != nil {
		jr.Compared = &jsonCompared{Decline: c.Decline.String(), Outputs: outputsObject(c.Outputs, c.Confidence)}
	}
	for _, in := range r.Inputs {
		jr.Inputs = append(jr.Inputs, jsonInput{Key: in.Key, Unit: in.Unit, Distribution: in.Dist})
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(jr)
}
