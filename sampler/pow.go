package sampler

import "math"

// powRoute is the branch that math.Pow(x, y) takes for a fixed exponent y
// in (0, 1] and any base x in [2⁻¹⁰²², 1) (normal, below one), so that a
// loop with a fixed y can take that branch directly and skip Pow's special
// cases, math.Modf, math.Frexp and math.Ldexp. Each route computes the same
// operations in the same order as Pow (Go 1.26 math/pow.go), so it returns
// the same bits; TestPowRoute checks this against math.Pow.
type powRoute uint8

const (
	// powGeneral calls math.Pow(x, y) itself.
	powGeneral powRoute = iota
	// powIdentity is y = 1: Pow returns x.
	powIdentity
	// powSqrt is y = 1/2: Pow returns math.Sqrt(x).
	powSqrt
	// powLow is 0 < y < 1/2: Pow returns Ldexp(Exp(y·Log(x)), 0), which
	// is Exp(y·Log(x)) itself.
	powLow
	// powHigh is 1/2 < y < 1: Pow returns Ldexp(Exp((y−1)·Log(x))·x₁, e)
	// with x = x₁·2^e, x₁ in [1/2, 1). Scaling by 2^e is exact when the
	// result is normal, and the result lies in [x, 1), so this is
	// Exp((y−1)·Log(x))·x rounded once, the product taken as is.
	powHigh
)

// powRouteFor returns the route of math.Pow for the exponent y, and the
// exponent that route takes: y − 1 for powHigh, otherwise y.
func powRouteFor(y float64) (powRoute, float64) {
	switch {
	case y == 1:
		return powIdentity, y
	case y == 0.5:
		return powSqrt, y
	case y > 0 && y < 0.5:
		return powLow, y
	case y > 0.5 && y < 1:
		return powHigh, y - 1 // exact (Sterbenz), as Pow's yf--
	}
	return powGeneral, y
}

// of returns math.Pow(x, y₀) for the exponent y₀ that gave the route r and
// its exponent y (see powRouteFor); x must lie in [2⁻¹⁰²², 1) except for
// powGeneral.
func (r powRoute) of(x, y float64) float64 {
	switch r {
	case powIdentity:
		return x
	case powSqrt:
		return math.Sqrt(x)
	case powLow:
		return math.Exp(y * math.Log(x))
	case powHigh:
		return math.Exp(y*math.Log(x)) * x
	}
	return math.Pow(x, y)
}
