package sampler

import (
	"fmt"
	"math"

	"gonum.org/v1/gonum/stat/distuv"
)

// Distribution is a one-variable distribution sampled by inverse CDF.
//
// Quantile returns the value x with P(X ≤ x) = p for p in [0, 1].
// Support returns the smallest and largest values Quantile can return
// (±Inf for an unbounded tail). Prob returns the probability that a draw
// falls below lo or above hi, used to check a distribution against the
// physical domain of the quantity it describes.
type Distribution interface {
	distuv.Quantiler
	Support() (lo, hi float64)
	Outside(lo, hi float64) float64
	String() string
}

// check reports a parameter problem as an error; every constructor
// validates before any gonum constructor sees the values, since they are
// user input.
func finite(name string, v float64) error {
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return fmt.Errorf("%s = %v is not a finite number; give a plain number", name, v)
	}
	return nil
}

// Fixed is a degenerate distribution: every draw is Value.
type Fixed struct{ Value float64 }

// Quantile returns f.Value for every p.
func (f Fixed) Quantile(p float64) float64 { return f.Value }

// Support returns (f.Value, f.Value).
func (f Fixed) Support() (lo, hi float64) { return f.Value, f.Value }

// Outside returns 1 if f.Value lies outside [lo, hi], else 0.
func (f Fixed) Outside(lo, hi float64) float64 {
	if f.Value < lo || f.Value > hi {
		return 1
	}
	return 0
}

func (f Fixed) String() string { return fmt.Sprintf("fixed %g", f.Value) }

// Uniform is the continuous uniform distribution on [Min, Max].
type Uniform struct{ d distuv.Uniform }

// NewUniform returns the uniform distribution on [min, max].
// Constraints: min < max, both finite.
func NewUniform(min, max float64) (Uniform, error) {
	if err := firstErr(finite("min", min), finite("max", max)); err != nil {
		return Uniform{}, err
	}
	if !(min < max) {
		return Uniform{}, fmt.Errorf("min = %g must be less than max = %g; swap them, or give a plain number for a fixed value", min, max)
	}
	return Uniform{distuv.Uniform{Min: min, Max: max}}, nil
}

// Quantile returns the p-quantile, Min + p·(Max − Min).
func (u Uniform) Quantile(p float64) float64 { return u.d.Min + p*(u.d.Max-u.d.Min) }

// Support returns (Min, Max).
func (u Uniform) Support() (lo, hi float64) { return u.d.Min, u.d.Max }

// Outside returns the probability of a draw outside [lo, hi].
func (u Uniform) Outside(lo, hi float64) float64 { return outside(u.d.CDF, lo, hi) }

func (u Uniform) String() string { return fmt.Sprintf("uniform(min %g, max %g)", u.d.Min, u.d.Max) }

// Triangular is the triangular distribution with lower limit Min, mode Mode
// and upper limit Max.
type Triangular struct {
	min, mode, max float64
	// Constants of the quantile, which distuv.Triangle.Quantile computes
	// on every call: the CDF at the mode, max − min, mode − min and
	// max − mode.
	f, ba, ca, bc float64
	d             *distuv.Triangle // for the CDF
}

// NewTriangular returns the triangular distribution on [min, max] with the
// given mode. Constraints: min < max and min ≤ mode ≤ max.
func NewTriangular(min, mode, max float64) (Triangular, error) {
	if err := checkMinModeMax(min, mode, max); err != nil {
		return Triangular{}, err
	}
	tri := distuv.NewTriangle(min, max, mode, nil)
	return Triangular{min: min, mode: mode, max: max,
		f: (mode - min) / (max - min), ba: max - min, ca: mode - min, bc: max - mode,
		d: &tri}, nil
}

// Quantile returns the p-quantile: min + √(p·(max − min)·(mode − min))
// below the mode, max − √((1 − p)·(max − min)·(max − mode)) above it. It
// returns the same bits as gonum's distuv.Triangle.Quantile (the same
// operations in the same order, with the constants computed once), and
// like it panics if p is outside [0, 1].
func (t Triangular) Quantile(p float64) float64 {
	if p < 0 || p > 1 {
		panic(fmt.Sprintf("sampler: triangular quantile of p = %g outside [0, 1]", p))
	}
	return t.at(p)
}

// at is Quantile without the check of p, small enough to inline.
func (t Triangular) at(p float64) float64 {
	if p < t.f {
		return t.min + math.Sqrt(p*t.ba*t.ca)
	}
	return t.max - math.Sqrt((1-p)*t.ba*t.bc)
}

// Support returns (Min, Max).
func (t Triangular) Support() (lo, hi float64) { return t.min, t.max }

// Outside returns the probability of a draw outside [lo, hi].
func (t Triangular) Outside(lo, hi float64) float64 { return outside(t.d.CDF, lo, hi) }

func (t Triangular) String() string {
	return fmt.Sprintf("triangular(min %g, mode %g, max %g)", t.min, t.mode, t.max)
}

// Truncated restricts a continuous distribution with CDF and Quantile to
// [Lo, Hi] by inverse-CDF mapping: Quantile(p) = Q(F(Lo) + p·(F(Hi) − F(Lo))).
// It is exact, and keeps Latin hypercube strata equal in probability.
type Truncated struct {
	base   cdfQuantiler
	lo, hi float64
	flo    float64 // F(lo)
	width  float64 // F(hi) − F(lo)
	name   string
	label  string // replaces String's text when set
}

// WithLabel returns t described by label in String, e.g. the parameters
// the user gave rather than the derived ones.
func (t Truncated) WithLabel(label string) Truncated {
	t.label = label
	return t
}

type cdfQuantiler interface {
	CDF(x float64) float64
	Quantile(p float64) float64
}

func newTruncated(base cdfQuantiler, lo, hi float64, name string) (Truncated, error) {
	if !(lo < hi) {
		return Truncated{}, fmt.Errorf("truncation min = %g must be less than max = %g", lo, hi)
	}
	flo, fhi := 0.0, 1.0
	if !math.IsInf(lo, -1) {
		flo = base.CDF(lo)
	}
	if !math.IsInf(hi, 1) {
		fhi = base.CDF(hi)
	}
	if fhi-flo < 1e-9 {
		return Truncated{}, fmt.Errorf("truncation to [%g, %g] keeps a probability of only %.3g of %s; move the limits towards the centre of the distribution", lo, hi, fhi-flo, name)
	}
	return Truncated{base: base, lo: lo, hi: hi, flo: flo, width: fhi - flo, name: name}, nil
}

// Quantile returns the p-quantile of the truncated distribution.
func (t Truncated) Quantile(p float64) float64 {
	x := t.base.Quantile(t.flo + p*t.width)
	// Guard against rounding just past a limit.
	return clamp(x, t.lo, t.hi)
}

// CDF returns P(X ≤ x) of the truncated distribution.
func (t Truncated) CDF(x float64) float64 {
	switch {
	case x <= t.lo:
		return 0
	case x >= t.hi:
		return 1
	}
	return (t.base.CDF(x) - t.flo) / t.width
}

// Support returns the truncation limits.
func (t Truncated) Support() (lo, hi float64) { return t.lo, t.hi }

// Outside returns the probability of a draw outside [lo, hi].
func (t Truncated) Outside(lo, hi float64) float64 { return outside(t.CDF, lo, hi) }

func (t Truncated) String() string {
	if t.label != "" {
		return t.label
	}
	s := t.name
	if !math.IsInf(t.lo, -1) {
		s += fmt.Sprintf(" min %g", t.lo)
	}
	if !math.IsInf(t.hi, 1) {
		s += fmt.Sprintf(" max %g", t.hi)
	}
	return s
}

// NewNormal returns the normal distribution with the given mean and
// standard deviation sd, truncated to [lo, hi] (use ±Inf for no limit).
// Constraints: sd > 0, lo < hi.
func NewNormal(mean, sd, lo, hi float64) (Truncated, error) {
	if err := firstErr(finite("mean", mean), finite("sd", sd), notNaN("min", lo), notNaN("max", hi)); err != nil {
		return Truncated{}, err
	}
	if !(sd > 0) {
		return Truncated{}, fmt.Errorf("sd = %g must be > 0; for a fixed value give a plain number", sd)
	}
	return newTruncated(normal{mu: mean, sigma: sd}, lo, hi, fmt.Sprintf("normal(mean %g, sd %g)", mean, sd))
}

// z90 is the standard normal 0.9 quantile, Φ⁻¹(0.9).
var z90 = distuv.UnitNormal.Quantile(0.9)

// LogNormalParams returns μ and σ of ln X for a lognormal variable X with
// arithmetic mean and standard deviation sd (of X itself):
// σ² = ln(1 + sd²/mean²), μ = ln(mean) − σ²/2. Constraints: mean > 0, sd > 0.
func LogNormalParams(mean, sd float64) (mu, sigma float64, err error) {
	if err := firstErr(finite("mean", mean), finite("sd", sd)); err != nil {
		return 0, 0, err
	}
	if !(mean > 0) || !(sd > 0) {
		return 0, 0, fmt.Errorf("a lognormal needs mean > 0 and sd > 0 (got mean = %g, sd = %g)", mean, sd)
	}
	s2 := math.Log1p(sd * sd / (mean * mean))
	return math.Log(mean) - s2/2, math.Sqrt(s2), nil
}

// LogNormalFromExceedance returns μ and σ of ln X for a lognormal variable
// whose P90 (low value, exceeded with 90 % probability: the 10th
// percentile) and P10 (high value, the 90th percentile) are given.
// Constraints: 0 < p90 < p10.
func LogNormalFromExceedance(p90, p10 float64) (mu, sigma float64, err error) {
	if err := firstErr(finite("p90", p90), finite("p10", p10)); err != nil {
		return 0, 0, err
	}
	if !(p90 > 0) || !(p10 > p90) {
		return 0, 0, fmt.Errorf("a lognormal needs 0 < p90 < p10 (got p90 = %g, p10 = %g); p90 is the low value, exceeded with 90%% probability", p90, p10)
	}
	lo, hi := math.Log(p90), math.Log(p10)
	return (lo + hi) / 2, (hi - lo) / (2 * z90), nil
}

// NewLogNormal returns the lognormal distribution with ln X ~ N(mu, sigma²),
// truncated to [lo, hi] (use 0 and +Inf for no limit).
// Constraints: sigma > 0, 0 ≤ lo < hi.
func NewLogNormal(mu, sigma, lo, hi float64) (Truncated, error) {
	if err := firstErr(finite("mu", mu), finite("sigma", sigma), notNaN("min", lo), notNaN("max", hi)); err != nil {
		return Truncated{}, err
	}
	if !(sigma > 0) {
		return Truncated{}, fmt.Errorf("lognormal sigma = %g must be > 0", sigma)
	}
	if lo < 0 {
		lo = 0
	}
	name := fmt.Sprintf("lognormal(median %.4g, sigma of ln %.4g)", math.Exp(mu), sigma)
	return newTruncated(logNormal{distuv.LogNormal{Mu: mu, Sigma: sigma}, normal{mu: mu, sigma: sigma}}, lo, hi, name)
}

// logNormal samples by exp(μ + σ·Φ⁻¹(p)), with Φ⁻¹ from normalQuantile
// (within 1e-12 of gonum's), which is faster than distuv.LogNormal's
// Quantile; CDF is distuv's.
type logNormal struct {
	ln distuv.LogNormal
	n  normal
}

func (l logNormal) CDF(x float64) float64 {
	if x <= 0 {
		return 0
	}
	return l.ln.CDF(x)
}
func (l logNormal) Quantile(p float64) float64 { return math.Exp(l.n.Quantile(p)) }

func outside(cdf func(float64) float64, lo, hi float64) float64 {
	return cdf(math.Nextafter(lo, math.Inf(-1))) + (1 - cdf(hi))
}

// checkMinModeMax checks the parameters of a three-point distribution:
// finite, min < max, min ≤ mode ≤ max.
func checkMinModeMax(min, mode, max float64) error {
	if err := firstErr(finite("min", min), finite("mode", mode), finite("max", max)); err != nil {
		return err
	}
	if !(min < max) {
		return fmt.Errorf("min = %g must be less than max = %g", min, max)
	}
	if mode < min || mode > max {
		return fmt.Errorf("mode = %g lies outside [min, max] = [%g, %g]; put the most likely value between the limits", mode, min, max)
	}
	return nil
}

func notNaN(name string, v float64) error {
	if math.IsNaN(v) {
		return fmt.Errorf("%s is NaN; give a number", name)
	}
	return nil
}

func firstErr(errs ...error) error {
	for _, e := range errs {
		if e != nil {
			return e
		}
	}
	return nil
}

var (
	_ Distribution = Fixed{}
	_ Distribution = Uniform{}
	_ Distribution = Triangular{}
	_ Distribution = Truncated{}
	_ Distribution = PERT{}
)

// Restrict returns t truncated further, to [max(lo, t.lo), min(hi, t.hi)],
// with its description kept. It computes the new limits' probabilities
// from the same base distribution, exactly as a distribution built with
// those limits would. It returns an error if the range is empty or keeps
// almost no probability.
func (t Truncated) Restrict(lo, hi float64) (Truncated, error) {
	r, err := newTruncated(t.base, math.Max(lo, t.lo), math.Min(hi, t.hi), t.name)
	if err != nil {
		return Truncated{}, err
	}
	r.label = t.label
	return r, nil
}

// Quantiles replaces every p in ps by f.Value.
func (f Fixed) Quantiles(ps []float64) {
	for i := range ps {
		ps[i] = f.Value
	}
}

// Quantiles replaces every p in ps by Quantile(p).
func (u Uniform) Quantiles(ps []float64) {
	for i, p := range ps {
		ps[i] = u.Quantile(p)
	}
}

// Quantiles replaces every p in ps by Quantile(p), panicking as it does,
// with the same bits: on amd64 two at a time (triangularPairs, whose
// lanes take at's operations in at's order), the rest with the formula
// written into the loop (at) rather than called.
func (t Triangular) Quantiles(ps []float64) {
	k := [6]float64{t.f, t.ba, t.ca, t.bc, t.min, t.max}
	done := triangularPairs(ps, &k)
	for i, p := range ps[done:] {
		if p < 0 || p > 1 {
			t.Quantile(p) // panics
		}
		ps[done+i] = t.at(p)
	}
}

// Quantiles replaces every p in ps by Quantile(p). A normal or lognormal
// base, the common cases, has its formula written into the loop rather
// than called through the interface: the same operations, the same bits.
func (t Truncated) Quantiles(ps []float64) {
	switch b := t.base.(type) {
	case normal:
		for i, p := range ps {
			x := b.mu + b.sigma*normalQuantile(t.flo+p*t.width)
			ps[i] = clamp(x, t.lo, t.hi)
		}
		return
	case logNormal:
		n := b.n
		for i, p := range ps {
			x := math.Exp(n.mu + n.sigma*normalQuantile(t.flo+p*t.width))
			ps[i] = clamp(x, t.lo, t.hi)
		}
		return
	}
	for i, p := range ps {
		ps[i] = t.Quantile(p)
	}
}

// Quantiles replaces every p in ps by Quantile(p), with the same bits,
// going straight to a direct table for the middle of the distribution;
// Quantile takes the rest, through the tail tables (halfTable.quantile).
func (d PERT) Quantiles(ps []float64) {
	lo, hi := &d.tab.lo.direct, &d.tab.hi.direct
	if lo.node == nil || hi.node == nil {
		for i, p := range ps {
			ps[i] = d.Quantile(p)
		}
		return
	}
	for i, p := range ps {
		switch {
		case p >= directLo && p <= 0.5:
			ps[i] = d.min + d.width*lo.at(p)
		case p > 0.5 && p <= 1-directLo: // 1 − p ≥ directLo, exactly
			ps[i] = d.max - d.width*hi.at(1-p)
		default:
			ps[i] = d.Quantile(p)
		}
	}
}

var (
	_ SliceQuantiler = Fixed{}
	_ SliceQuantiler = Uniform{}
	_ SliceQuantiler = Triangular{}
	_ SliceQuantiler = Truncated{}
	_ SliceQuantiler = PERT{}
)
