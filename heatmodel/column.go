package heatmodel

// Column is one input over a batch of trials: either the same value for
// every trial (Values nil) or one value per trial.
type Column struct {
	Const  float64
	Values []float64
}

// Const returns a Column holding v for every trial.
func Const(v float64) Column { return Column{Const: v} }

// Vary returns a Column holding one value per trial.
func Vary(v []float64) Column { return Column{Values: v} }

// At returns the value of trial i.
func (c Column) At(i int) float64 {
	if c.Values == nil {
		return c.Const
	}
	return c.Values[i]
}

// Scale returns a column with every value multiplied by f, writing into
// buf (of at least n values) when c varies.
func (c Column) Scale(f float64, buf []float64) Column {
	if c.Values == nil {
		return Const(c.Const * f)
	}
	out := buf[:len(c.Values)]
	for i, v := range c.Values {
		out[i] = v * f
	}
	return Vary(out)
}

// Shift returns a column with d added to every value, writing into buf
// when c varies.
func (c Column) Shift(d float64, buf []float64) Column {
	if c.Values == nil {
		return Const(c.Const + d)
	}
	out := buf[:len(c.Values)]
	for i, v := range c.Values {
		out[i] = v + d
	}
	return Vary(out)
}

// Map returns a column with f applied to every value, writing into buf
// when c varies.
func (c Column) Map(f func(float64) float64, buf []float64) Column {
	if c.Values == nil {
		return Const(f(c.Const))
	}
	out := buf[:len(c.Values)]
	for i, v := range c.Values {
		out[i] = f(v)
	}
	return Vary(out)
}

// Affine returns a column with every value v mapped to v·scale + offset,
// writing into buf when c varies. Either operation is skipped when it is
// the identity (scale 1 or offset 0), so that a pure scaling or a pure
// shift rounds once, exactly as Scale or Shift would.
func (c Column) Affine(scale, offset float64, buf []float64) Column {
	switch {
	case scale == 1 && offset == 0:
		return c
	case offset == 0:
		return c.Scale(scale, buf)
	case scale == 1:
		return c.Shift(offset, buf)
	}
	if c.Values == nil {
		return Const(c.Const*scale + offset)
	}
	out := buf[:len(c.Values)]
	for i, v := range c.Values {
		out[i] = v*scale + offset
	}
	return Vary(out)
}
