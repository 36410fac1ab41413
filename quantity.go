package rockheat

import (
	"fmt"
	"math"

	"rockheat/heatmodel"
	"rockheat/sampler"
)

// Quantity is one uncertain input of a model: a distribution of its
// values, in Unit. The zero Quantity is an input not given. A zero Unit
// means the input's own unit, the one its name carries in scenario files
// (km² for the area, °C for temperatures; see Field).
type Quantity struct {
	Dist sampler.Distribution
	Unit Unit
}

// Fixed returns the Quantity of the single value v, in unit u.
func Fixed(v float64, u Unit) Quantity { return Quantity{Dist: sampler.Fixed{Value: v}, Unit: u} }

// Uncertain returns the Quantity distributed as d, in unit u.
func Uncertain(d sampler.Distribution, u Unit) Quantity { return Quantity{Dist: d, Unit: u} }

// Given reports whether q has a distribution.
func (q Quantity) Given() bool { return q.Dist != nil }

// IsFixed reports whether q is a single value.
func (q Quantity) IsFixed() bool {
	_, ok := q.Dist.(sampler.Fixed)
	return ok
}

// Need says whether a model input must be given.
type Need int

const (
	// Required inputs must be given.
	Required Need = iota
	// Defaulted inputs take Field.Default when not given.
	Defaulted
	// Alternative inputs stand in for one another (a pressure or a depth
	// for a hydrostatic pressure); the model says which combinations hold.
	Alternative
)

// Domain is a range of an input, [Lo, Hi] in the input's own unit, with
// LoOpen and HiOpen excluding the limit itself (a continuous distribution
// may reach an open limit, which it does with probability zero). Why, if
// not empty, says where a limit comes from.
type Domain struct {
	Lo, Hi         float64
	LoOpen, HiOpen bool
	Why            string
}

// Contains reports whether the single value x lies in d.
func (d Domain) Contains(x float64) bool {
	lowOK := x > d.Lo || (!d.LoOpen && x == d.Lo)
	highOK := x < d.Hi || (!d.HiOpen && x == d.Hi)
	return lowOK && highOK
}

// String writes d as an interval, e.g. "(0, ∞)" or "[0, 1)".
func (d Domain) String() string {
	l, r := "[", "]"
	if d.LoOpen {
		l = "("
	}
	if d.HiOpen {
		r = ")"
	}
	lo, hi := fmt.Sprintf("%.6g", d.Lo), fmt.Sprintf("%.6g", d.Hi)
	if math.IsInf(d.Lo, -1) {
		lo, l = "−∞", "("
	}
	if math.IsInf(d.Hi, 1) {
		hi, r = "∞", ")"
	}
	return l + lo + ", " + hi + r
}

// why returns "; " and the reason for d's limit, or "".
func (d Domain) why() string {
	if d.Why == "" {
		return ""
	}
	return "; " + d.Why
}

// in returns d expressed in unit to, d being in unit from.
func (d Domain) in(from, to Unit) Domain {
	if from == to {
		return d
	}
	conv := func(x float64) float64 {
		if math.IsInf(x, 0) {
			return x
		}
		return to.FromSI(from.ToSI(x))
	}
	lo, hi := conv(d.Lo), conv(d.Hi)
	if lo > hi { // a negative scale flips the range; rockheat's units have none
		lo, hi = hi, lo
	}
	return Domain{Lo: lo, Hi: hi, LoOpen: d.LoOpen, HiOpen: d.HiOpen, Why: d.Why}
}

// below returns d with its upper limit lowered to hi (closed), for the
// reason why, if hi is below d's.
func (d Domain) below(hi float64, why string) Domain {
	if hi < d.Hi {
		d.Hi, d.HiOpen, d.Why = hi, false, why
	}
	return d
}

var inf = math.Inf(1)

// Ranges are the ranges of one kind of input, in its own unit: the
// physically possible one (a value outside is an error) and the one of
// common practice (a value outside earns a warning to check it).
type Ranges struct {
	Valid, Typical Domain
}

// The ranges of rockheat's inputs. The valid ranges bound what is
// physically possible, generously, so that no run can overflow; the typical
// ranges are common practice for geothermal prospects (a warning outside
// asks to check the value and its unit, e.g. metres given as km).
var (
	areaRange        = Ranges{Domain{Lo: 0, Hi: 1e6, LoOpen: true}, Domain{Lo: 0, Hi: 5000}}             // km²; 10⁶ km² is a large country
	thicknessRange   = Ranges{Domain{Lo: 0, Hi: 20000, LoOpen: true}, Domain{Lo: 10, Hi: 5000}}          // m; 20 km is half the continental crust
	rockTempRange    = Ranges{Domain{Lo: -celsiusZero, Hi: 1500, LoOpen: true}, Domain{Lo: 20, Hi: 400}} // °C; 1500 °C melts any rock
	refTempRange     = Ranges{Domain{Lo: -celsiusZero, Hi: 1500, LoOpen: true}, Domain{Lo: -10, Hi: 80}}
	surfaceTempRange = Ranges{Domain{Lo: -100, Hi: 100}, Domain{Lo: -30, Hi: 40}} // °C; the Earth's surface spans −89 to 57 °C
	minTempRange     = Ranges{Domain{Lo: -celsiusZero, Hi: 1500, LoOpen: true}, Domain{Lo: 30, Hi: 300}}
	porosityRange    = Ranges{Domain{Lo: 0, Hi: 1, HiOpen: true}, Domain{Lo: 0, Hi: 0.4}}
	rockDensityRange = Ranges{Domain{Lo: 0, Hi: 20000, LoOpen: true}, Domain{Lo: 1500, Hi: 3500}} // kg/m³; the densest metals are 22 600
	rockHeatRange    = Ranges{Domain{Lo: 0, Hi: 10000, LoOpen: true}, Domain{Lo: 600, Hi: 1500}}  // J/(kg·K); water, the highest of common substances, 4186
	fluidDensRange   = Ranges{Domain{Lo: 0, Hi: 2000, LoOpen: true}, Domain{Lo: 300, Hi: 1300}}
	fluidHeatRange   = Ranges{Domain{Lo: 0, Hi: 100000, LoOpen: true}, Domain{Lo: 2000, Hi: 10000}} // near the critical point cp diverges
	pressureRange    = Ranges{Domain{Lo: 0, Hi: 1000, LoOpen: true}, Domain{Lo: 0.1, Hi: 100}}      // MPa
	depthRange       = Ranges{Domain{Lo: 0, Hi: 20000, LoOpen: true}, Domain{Lo: 0, Hi: 10000}}     // m; the deepest borehole is 12.3 km
	recoveryRange    = Ranges{Domain{Lo: 0, Hi: 1, LoOpen: true}, Domain{Lo: 0, Hi: 0.5}}
	efficiencyRange  = Ranges{Domain{Lo: 0, Hi: 1, LoOpen: true}, Domain{Lo: 0, Hi: 0.3}} // plants convert 5–20 % of heat
	utilizationRange = Ranges{Domain{Lo: 0, Hi: 1, LoOpen: true}, Domain{Lo: 0, Hi: 0.8}}
	capacityRange    = Ranges{Domain{Lo: 0.01, Hi: 1}, Domain{Lo: 0.5, Hi: 1}}
	lifeRange        = Ranges{Domain{Lo: 1.0 / 365.25, Hi: 10000}, Domain{Lo: 5, Hi: 100}}   // years; a day to ten millennia
	gradientRange    = Ranges{Domain{Lo: 0, Hi: 1000, LoOpen: true}, Domain{Lo: 5, Hi: 150}} // °C/km
	topDepthRange    = Ranges{Domain{Lo: 0, Hi: 30}, Domain{Lo: 0, Hi: 10}}                  // km
	maxDepthRange    = Ranges{Domain{Lo: 0, Hi: 30, LoOpen: true}, Domain{Lo: 1, Hi: 12}}    // km
	flowRange        = Ranges{Domain{Lo: 1e-6, Hi: 1000}, Domain{Lo: 0.01, Hi: 10}}          // m³/s per km²
)

// Field is one input a model takes in its current settings: its name,
// unit, meaning and valid range, and the model's Quantity for it.
type Field struct {
	// Base is the input's name without its unit, e.g. "area".
	Base string
	// Unit is the input's own unit, the one scenario files use.
	Unit Unit
	// Doc says what the quantity is, in a few words.
	Doc string
	// Ranges are the physically possible and the typical ranges, in Unit.
	Ranges
	// Need says whether the input must be given; Default is the value,
	// in Unit, of a Defaulted input that is not.
	Need    Need
	Default float64
	// Q is the model's quantity for the input.
	Q *Quantity

	dst *heatmodel.Column // where an evaluator takes the SI column
}

// Name returns the input's name in scenario files and reports: Base and
// the suffix of Unit, e.g. "area_km2".
func (f Field) Name() string { return nameIn(f.Base, f.Unit) }

// label returns the name of the input in the unit of its quantity.
func (f Field) label() string { return nameIn(f.Base, f.unit()) }

// unit returns the unit of f's quantity: its own, or f.Unit if it has none.
func (f Field) unit() Unit {
	if f.Q.Unit == (Unit{}) {
		return f.Unit
	}
	return f.Q.Unit
}

func nameIn(base string, u Unit) string {
	if u.Suffix == "" {
		return base
	}
	return base + "_" + u.Suffix
}

// required, defaulted and alternative return the Field of quantity q.
func required(q *Quantity, dst *heatmodel.Column, base string, u Unit, doc string, r Ranges) Field {
	return Field{Base: base, Unit: u, Doc: doc, Ranges: r, Q: q, dst: dst}
}

func defaulted(f Field, v float64) Field { f.Need, f.Default = Defaulted, v; return f }

func alternative(f Field) Field { f.Need = Alternative; return f }
