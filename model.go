package rockheat

import (
	"slices"
	"strings"

	"rockheat/heatmodel"
)

// Model is the physics of a run with its typed inputs: *Reservoir,
// *HotRock or *PowerDensity. Each input is a Quantity field; Fields lists those the model
// takes in its current settings.
type Model interface {
	// Kind returns the model kind.
	Kind() heatmodel.Kind
	// Fields returns the inputs the model takes, in the order reports
	// list them.
	Fields() []Field
	// Settings returns the fluid property source and, for a model with a
	// choice of route, the conversion route.
	Settings() (heatmodel.FluidSource, heatmodel.Conversion)

	outputs() []OutputSpec
	check(p *problems, c *checked)
	newEvaluator() evaluator
}

// evaluator evaluates batches of one model on one goroutine. Before each
// batch the caller sets the SI column of every given field at the
// pointers columns returns (in the order of the model's Fields).
type evaluator interface {
	columns() []*heatmodel.Column
	// evaluate fills out (one slice per output, SI units) for n trials
	// and returns the number of trials without heat.
	evaluate(n int, out [][]float64) (zeroHeat int, err error)
	// saturated returns, and resets, the count of trials whose IF97
	// fluid state was taken at saturation.
	saturated() int
}

// evalBase holds what every evaluator has: its fluid scratch and the
// pointers to its input columns.
type evalBase struct {
	fs  heatmodel.FluidScratch
	dst []*heatmodel.Column
}

func (e *evalBase) columns() []*heatmodel.Column { return e.dst }

func (e *evalBase) saturated() int {
	n := e.fs.Saturated
	e.fs.Saturated = 0
	return n
}

// dsts returns the column pointers of fields.
func dsts(fields []Field) []*heatmodel.Column {
	d := make([]*heatmodel.Column, len(fields))
	for i, f := range fields {
		d[i] = f.dst
	}
	return d
}

// OutputSpec names one model output and its unit in reports.
type OutputSpec struct {
	Name  string  // JSON key, e.g. "heat_in_place"
	Unit  string  // unit of reported values: "J", "MWth", "MWe", "years"
	Doc   string  // a few words for the text report
	Scale float64 // reported value = SI value / Scale − Offset
	// Offset shifts the reported value (celsiusZero for a temperature in
	// °C).
	Offset float64
	// Group, if not empty, gathers outputs reported as one list, each at
	// its Year (DeclineGroup: the hot-rock power at each report year).
	Group string
	Year  float64
	// DependsOn lists the Field.Base names of the inputs the output's
	// formula uses: only they are ranked in its sensitivity.
	DependsOn []string
	// Mirror, if not empty, names an earlier output that this one equals
	// in every trial, bit for bit (the hot-rock power at year 0 is the
	// initial power): a run summarises that one and copies its figures.
	Mirror string
}

// dependsOn reports whether the output of s depends on the input of base
// ("layers" stands for every layer's inputs).
func (s OutputSpec) dependsOn(base string) bool {
	if strings.HasPrefix(base, "layers[") {
		base = "layers"
	}
	return slices.Contains(s.DependsOn, base)
}

// geothermInputs are the bases of every way to give a geotherm (see
// Geotherm): the temperatures of a reservoir or hot-rock column depend on
// all of them.
var geothermInputs = []string{"surface_temp", "top_depth", "gradient", "heat_flow", "conductivity",
	"heat_production", "layers"}

// DeclineGroup is the OutputSpec.Group of the hot-rock thermal power at
// each report year, and its key in JSON.
const DeclineGroup = "thermal_power_at"
