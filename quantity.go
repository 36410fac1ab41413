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

// Domain is the physically possible range of an input, [Lo, Hi] in the
// input's own unit, with LoOpen and HiOpen excluding the limit itself (a
// continuous distribution may reach an open limit, which it does with
// probability zero).
type Domain struct {
	Lo, Hi         float64
	LoOpen, HiOpen bool
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
	lo, hi := fmt.Sprintf("%g", d.Lo), fmt.Sprintf("%g", d.Hi)
	if math.IsInf(d.Lo, -1) {
		lo, l = "−∞", "("
	}
	if math.IsInf(d.Hi, 1) {
		hi, r = "∞", ")"
	}
	return l + lo + ", " + hi + r
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
	return Domain{Lo: lo, Hi: hi, LoOpen: d.LoOpen, HiOpen: d.HiOpen}
}

var inf = math.Inf(1)

// Domains of rockheat's inputs, in their own units.
var (
	positive    = Domain{Lo: 0, Hi: inf, LoOpen: true}
	nonNegative = Domain{Lo: 0, Hi: inf}
	fraction    = Domain{Lo: 0, Hi: 1, LoOpen: true}
	porosity    = Domain{Lo: 0, Hi: 1, HiOpen: true}
	aboveZeroK  = Domain{Lo: -celsiusZero, Hi: inf, LoOpen: true} // °C
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
	// Domain is the physically possible range, in Unit.
	Domain Domain
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
func required(q *Quantity, dst *heatmodel.Column, base string, u Unit, doc string, d Domain) Field {
	return Field{Base: base, Unit: u, Doc: doc, Domain: d, Q: q, dst: dst}
}

func defaulted(f Field, v float64) Field { f.Need, f.Default = Defaulted, v; return f }

func alternative(f Field) Field { f.Need = Alternative; return f }
