package sampler

import "math"

// hermiteTable tabulates a smooth, increasing quantile function x(p) at
// equal steps of p, with its slope dx/dp, for piecewise-cubic Hermite
// interpolation between the nodes: the error in a step of length h is at
// most h⁴·max|x⁗|/384 (the Hermite remainder; e.g. Burden & Faires,
// Numerical Analysis, §3.4), and the result never leaves the step's two
// node values, so the table is monotone as x is.
type hermiteTable struct {
	lo, step, inv float64 // the first node's p, the step and its inverse
	node          []hermiteNode
}

type hermiteNode struct{ x, hs float64 } // x(p) and step·dx/dp at a node

// newHermiteTable tabulates f, which returns x(p) and dx/dp, at cells+1
// equal steps of p from lo to hi. It returns false when the nodes do not
// increase strictly or a slope is not finite and positive.
func newHermiteTable(lo, hi float64, cells int, f func(p float64) (x, slope float64)) (hermiteTable, bool) {
	step := (hi - lo) / float64(cells)
	t := hermiteTable{lo: lo, step: step, inv: 1 / step, node: make([]hermiteNode, cells+1)}
	for k := range t.node {
		x, s := f(lo + float64(k)*step)
		if !(s > 0 && s < math.Inf(1)) || (k > 0 && !(x > t.node[k-1].x)) {
			return hermiteTable{}, false
		}
		t.node[k] = hermiteNode{x: x, hs: step * s}
	}
	return t, true
}

// at returns the interpolated x(p) for p in the table's range. The cubic
// is written in powers of u, the fraction of the step, with coefficients
// from the two nodes' values and scaled slopes (a = h·s₀, b = h·s₁,
// d = x₁ − x₀): x₀ + u·(a + u·((3d − 2a − b) + u·(a + b − 2d))), the
// Hermite cubic of the two nodes (Burden & Faires, §3.4) in Horner's
// form: fewer operations and a shorter chain than its basis functions.
func (t *hermiteTable) at(p float64) float64 {
	v := (p - t.lo) * t.inv
	k := min(int(v), len(t.node)-2)
	u := v - float64(k)
	n0, n1 := t.node[k], t.node[k+1]
	d, a, b := n1.x-n0.x, n0.hs, n1.hs
	x := n0.x + u*(a+u*((3*d-2*a-b)+u*(a+b-2*d)))
	return clamp(x, n0.x, n1.x)
}

// clamp returns min(max(x, lo), hi), with the same bits for every x
// (NaN and signed zeros included), but with the built-in min and max,
// which cost a few instructions more than a comparison, only at or
// beyond the limits.
func clamp(x, lo, hi float64) float64 {
	if !(x > lo) {
		x = max(x, lo)
	}
	if !(x < hi) {
		x = min(x, hi)
	}
	return x
}
