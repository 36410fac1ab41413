package heatmodel

import (
	"fmt"
	"math"
)

// Profile is the shape of a steady conductive geotherm below the surface:
// the rise of the rock temperature above the surface temperature as a
// function of depth. The surface temperature is not part of it, so one
// Profile serves trials of different surface temperatures:
// T(z) = Ts + p.Rise(z).
//
// Within each layer the rise is quadratic in the depth z' below the
// layer's top (steady one-dimensional conduction with uniform
// conductivity k and radiogenic heat production A; Turcotte & Schubert,
// "Geodynamics", ch. 4):
//
//	T(z) = T_top + (q_top/k)·z' − A·z'²/(2k)
//	q(z) = q_top − A·z'
//
// with q the upward heat flow, continuous across layer boundaries. A
// layer given by its gradient (Layer) is the linear case A = 0, with
// q_top/k replaced by the gradient. Below the bottom of the last layer the
// last layer continues without end.
//
// A Profile is built by UniformProfile (one gradient), NewProfile (layers
// of given gradients), HomogeneousProfile (one rock under a surface heat
// flow) or NewConductiveProfile (layers of rock under a surface heat
// flow); SetLayers and SetConductive rebuild one in place. The zero
// Profile has no shape (IsZero); HotRock reads it as "no fixed geotherm
// given".
//
// At the depth where the heat produced above it equals the surface heat
// flow, the heat flow falls to zero and the temperature is highest
// (PeakDepth); below it the steady solution has heat flowing down and the
// temperature falling. That is not a physical geotherm (the heat flow from
// below is taken as negative): callers should keep depths above PeakDepth.
// A last layer with heat production always has such a depth, at
// q_top/A below its top.
type Profile struct {
	// g, c and k shape a profile of one layer from the surface (segs nil):
	// Rise(z) = g·z − c·z², with g in K/m, c in K/m² and conductivity k
	// in W/(m·K) (0 when not known: a profile from a gradient).
	g, c, k float64
	segs    []segment // layered profile, tops increasing from 0
}

// segment is one layer of a Profile, from top down to bottom (the last
// continues below its bottom): Rise(z) = rise + grad·z' − curv·z'² with
// z' = z − top.
type segment struct {
	top, bottom float64 // m
	rise        float64 // K, the rise at top
	grad        float64 // K/m, the gradient just below top: q_top/k
	curv        float64 // K/m², A/(2k); 0 for a linear layer
	k           float64 // W/(m·K), conductivity; 0 for a layer given by its gradient
	riseMax     float64 // K, the largest rise within the segment; +Inf if unbounded
}

// at returns the rise at depth z, K.
func (s *segment) at(z float64) float64 {
	zp := z - s.top
	if s.curv == 0 {
		return s.rise + s.grad*zp
	}
	return s.rise + s.grad*zp - s.curv*zp*zp
}

// depth returns the shallowest depth within s (or below it, for the last
// segment) at which the rise reaches r > s.rise, m, or +Inf if it never
// does. The quadratic root is taken in the form 2Δ/(g + √(g² − 4cΔ)),
// which has no cancellation for small c.
func (s *segment) depth(r float64) float64 {
	if !(r <= s.riseMax) {
		return math.Inf(1)
	}
	dr := r - s.rise
	if s.curv == 0 {
		return s.top + dr/s.grad
	}
	disc := max(s.grad*s.grad-4*s.curv*dr, 0)
	return s.top + 2*dr/(s.grad+math.Sqrt(disc))
}

// excess returns ∫_lo^hi (rise − d) dz over a part [lo, hi] of s, K·m:
// the trapezoid rule, exact for a straight line, plus its error term for
// the quadratic, c·h³/6 with h = hi − lo, so the sum is exact.
func (s *segment) excess(d, lo, hi float64) float64 {
	elo, ehi := s.at(lo)-d, s.at(hi)-d
	sum := (elo + ehi) / 2 * (hi - lo)
	if s.curv != 0 {
		h := hi - lo
		sum += s.curv * h * h * h / 6
	}
	return sum
}

// gradient returns dRise/dz at depth z, K/m.
func (s *segment) gradient(z float64) float64 {
	return s.grad - 2*s.curv*(z-s.top)
}

// peak returns the depth of the temperature maximum within s (or below it,
// for the last segment), m, or +Inf if there is none.
func (s *segment) peak(last bool) float64 {
	switch {
	case s.grad <= 0:
		return s.top
	case s.curv > 0:
		if zp := s.grad / (2 * s.curv); last || zp < s.bottom-s.top {
			return s.top + zp
		}
	}
	return math.Inf(1)
}

// setRiseMax sets s.riseMax from the shape of s.
func (s *segment) setRiseMax(last bool) {
	switch zp := s.peak(last); {
	case !math.IsInf(zp, 1):
		s.riseMax = s.at(zp)
	case last:
		s.riseMax = math.Inf(1)
	default:
		s.riseMax = s.at(s.bottom)
	}
}

// one returns the single segment of a profile of one layer.
func (p *Profile) one() segment {
	s := segment{bottom: math.Inf(1), grad: p.g, curv: p.c, k: p.k}
	s.setRiseMax(true)
	return s
}

// find returns the segment holding depth z: the first whose bottom is at
// or below z, else the last.
func (p *Profile) find(z float64) *segment {
	last := len(p.segs) - 1
	for i := range p.segs[:last] {
		if z <= p.segs[i].bottom {
			return &p.segs[i]
		}
	}
	return &p.segs[last]
}

// UniformProfile returns the profile of a single gradient g, K/m, with
// constraint g > 0: Rise(z) = g·z. It panics if g ≤ 0 or is NaN; a
// scenario's gradient range must be checked before sampling.
func UniformProfile(g float64) Profile {
	if !(g > 0) {
		panic(fmt.Sprintf("heatmodel: UniformProfile with gradient %g K/m, want > 0", g))
	}
	return Profile{g: g}
}

// HomogeneousProfile returns the profile of one rock, of conductivity k,
// W/(m·K), and radiogenic heat production a, W/m³, from the surface down,
// under the surface heat flow q0, W/m²: Rise(z) = (q0/k)·z − a·z²/(2k)
// (Turcotte & Schubert, "Geodynamics", ch. 4). Constraints: q0 and k
// finite and > 0, a finite and ≥ 0. It does not allocate, for use per
// trial, and panics on a bad value; a scenario's ranges must be checked
// before sampling.
func HomogeneousProfile(q0, k, a float64) Profile {
	if !(q0 > 0) || math.IsInf(q0, 1) || !(k > 0) || math.IsInf(k, 1) || !(a >= 0) || math.IsInf(a, 1) {
		panic(fmt.Sprintf("heatmodel: HomogeneousProfile with heat flow %g W/m², conductivity %g W/(m·K), heat production %g W/m³; want finite, > 0, > 0, ≥ 0", q0, k, a))
	}
	return Profile{g: q0 / k, c: a / (2 * k), k: k}
}

// IsZero reports whether p is the zero Profile, which has no shape.
func (p Profile) IsZero() bool { return p.segs == nil && p.g == 0 }

// Rise returns the rise of the rock temperature above the surface
// temperature at depth z, K, for z ≥ 0 m. At a layer boundary it belongs
// to the layer above; the rise is continuous there.
func (p Profile) Rise(z float64) float64 {
	if p.segs == nil {
		if p.c == 0 {
			return p.g * z
		}
		return p.g*z - p.c*z*z
	}
	return p.find(z).at(z)
}

// Temperature returns the rock temperature at depth z ≥ 0 m, K, under a
// surface at ts, K: ts + p.Rise(z).
func (p Profile) Temperature(ts, z float64) float64 { return ts + p.Rise(z) }

// Depth returns the shallowest depth, m, at which the rock temperature has
// risen by rise, K, above the surface temperature: the inverse of Rise
// above PeakDepth. It is 0 for rise ≤ 0 (the surface is already that hot)
// and +Inf when the rise is never reached, because it exceeds the rise at
// PeakDepth, where the heat flow falls to zero.
func (p Profile) Depth(rise float64) float64 {
	if rise <= 0 {
		return 0
	}
	if p.segs == nil {
		if p.c == 0 {
			return uniformDepth(p.g, rise)
		}
		s := p.one()
		return s.depth(rise)
	}
	last := len(p.segs) - 1
	for i := range p.segs {
		if s := &p.segs[i]; i == last || rise <= s.riseMax {
			return s.depth(rise)
		}
	}
	panic("unreachable")
}

// uniformDepth is Depth for a uniform gradient g, K/m, and rise > 0, K.
func uniformDepth(g, rise float64) float64 { return rise / g }

// uniformExcess is excess for a uniform gradient g, K/m: the trapezoid of
// the linear rise less d over [a, b], K·m.
func uniformExcess(g, d, a, b float64) float64 { return (g*a - d + g*b - d) / 2 * (b - a) }

// excess returns ∫_a^b (Rise(z) − d) dz, K·m, for 0 ≤ a ≤ b, integrating
// each layer's polynomial exactly.
func (p Profile) excess(d, a, b float64) float64 {
	if p.segs == nil {
		if p.c == 0 {
			return uniformExcess(p.g, d, a, b)
		}
		s := p.one()
		return s.excess(d, a, b)
	}
	sum := 0.0
	last := len(p.segs) - 1
	for i := range p.segs {
		s := &p.segs[i]
		bottom := s.bottom
		if i == last {
			bottom = math.Inf(1)
		}
		if lo, hi := max(a, s.top), min(b, bottom); hi > lo {
			sum += s.excess(d, lo, hi)
		}
		if bottom >= b {
			break
		}
	}
	return sum
}

// MeanRise returns the mean of Rise over the depths a to b, m, K: the
// exact (1/(b − a))·∫_a^b Rise(z) dz, and Rise(a) if a = b. It gives a
// reservoir's mean temperature over its thickness, Ts + MeanRise. It
// panics unless 0 ≤ a ≤ b.
func (p Profile) MeanRise(a, b float64) float64 {
	if !(0 <= a && a <= b) {
		panic(fmt.Sprintf("heatmodel: MeanRise over depths %g to %g m, want 0 ≤ a ≤ b", a, b))
	}
	if a == b {
		return p.Rise(a)
	}
	return p.excess(0, a, b) / (b - a)
}

// Gradient returns the temperature gradient dT/dz at depth z ≥ 0 m, K/m.
// At a layer boundary it is the gradient at the bottom of the layer above.
func (p Profile) Gradient(z float64) float64 {
	if p.segs == nil {
		return p.g - 2*p.c*z
	}
	return p.find(z).gradient(z)
}

// HeatFlow returns the upward conductive heat flow q = k·dT/dz at depth
// z ≥ 0 m, W/m²: the surface heat flow less the heat produced above z. It
// is continuous across layer boundaries. It is NaN for a profile built
// from gradients (UniformProfile, NewProfile), whose conductivity is not
// known.
func (p Profile) HeatFlow(z float64) float64 {
	if p.segs == nil {
		if p.k == 0 {
			return math.NaN()
		}
		return p.k * (p.g - 2*p.c*z)
	}
	s := p.find(z)
	if s.k == 0 {
		return math.NaN()
	}
	return s.k * s.gradient(z)
}

// PeakDepth returns the depth of the temperature maximum, m: where the
// heat flow falls to zero because the heat produced above it equals the
// surface heat flow. It is +Inf when the heat flow stays positive at all
// depths (no heat production in the last layer, and less above than the
// surface heat flow). For one homogeneous rock it is q0/a.
func (p Profile) PeakDepth() float64 {
	if p.segs == nil {
		if p.c == 0 {
			return math.Inf(1)
		}
		s := p.one()
		return s.peak(true)
	}
	last := len(p.segs) - 1
	for i := range p.segs {
		if zp := p.segs[i].peak(i == last); !math.IsInf(zp, 1) {
			return zp
		}
	}
	return math.Inf(1)
}
