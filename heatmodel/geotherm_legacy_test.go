package heatmodel

import (
	"math"
	"math/rand/v2"
	"testing"
)

// legacyProfile is the gradient-layer Profile as it was before conductive
// layers were added, kept verbatim (renamed) so that TestProfileLegacy can
// check that gradient profiles give bit-identical results.
type legacyProfile struct {
	g      float64
	layers []Layer
	rise   []float64
}

func legacyNew(layers []Layer) legacyProfile {
	p := legacyProfile{layers: append([]Layer(nil), layers...), rise: make([]float64, len(layers))}
	top := 0.0
	for k, l := range p.layers[:len(p.layers)-1] {
		p.rise[k+1] = p.rise[k] + l.Gradient*(l.Bottom-top)
		top = l.Bottom
	}
	return p
}

func (p legacyProfile) Rise(z float64) float64 {
	if p.layers == nil {
		return p.g * z
	}
	top := 0.0
	last := len(p.layers) - 1
	for k, l := range p.layers {
		if z <= l.Bottom || k == last {
			return p.rise[k] + l.Gradient*(z-top)
		}
		top = l.Bottom
	}
	panic("unreachable")
}

func (p legacyProfile) Depth(rise float64) float64 {
	if rise <= 0 {
		return 0
	}
	if p.layers == nil {
		return rise / p.g
	}
	top := 0.0
	last := len(p.layers) - 1
	for k, l := range p.layers {
		if k == last || rise <= p.rise[k]+l.Gradient*(l.Bottom-top) {
			return top + (rise-p.rise[k])/l.Gradient
		}
		top = l.Bottom
	}
	panic("unreachable")
}

func (p legacyProfile) excess(d, a, b float64) float64 {
	if p.layers == nil {
		return (p.g*a - d + p.g*b - d) / 2 * (b - a)
	}
	sum, top := 0.0, 0.0
	last := len(p.layers) - 1
	for k, l := range p.layers {
		bottom := l.Bottom
		if k == last {
			bottom = math.Inf(1)
		}
		if lo, hi := max(a, top), min(b, bottom); hi > lo {
			elo := p.rise[k] + l.Gradient*(lo-top) - d
			ehi := p.rise[k] + l.Gradient*(hi-top) - d
			sum += (elo + ehi) / 2 * (hi - lo)
		}
		if bottom >= b {
			break
		}
		top = bottom
	}
	return sum
}

// TestProfileLegacy checks that uniform and gradient-layer profiles give
// the same Rise, Depth and excess integral, bit for bit, as the
// piecewise-linear Profile they generalise, on random layers, depths and
// rises (including layer boundaries and points below the last layer).
func TestProfileLegacy(t *testing.T) {
	t.Parallel()
	rnd := rand.New(rand.NewPCG(4, 1))
	for trial := range 300 {
		var p Profile
		var old legacyProfile
		var bottoms []float64
		if trial%5 == 0 {
			g := 0.01 + 0.05*rnd.Float64()
			p, old = UniformProfile(g), legacyProfile{g: g}
		} else {
			layers := make([]Layer, 1+rnd.IntN(5))
			bottom := 0.0
			for i := range layers {
				bottom += 100 + 3000*rnd.Float64()
				layers[i] = Layer{Bottom: bottom, Gradient: 0.005 + 0.06*rnd.Float64()}
				bottoms = append(bottoms, bottom)
			}
			p, old = mustProfile(t, layers), legacyNew(layers)
		}
		zs := append([]float64{0}, bottoms...)
		for range 30 {
			zs = append(zs, 20000*rnd.Float64())
		}
		for _, z := range zs {
			if a, b := p.Rise(z), old.Rise(z); a != b {
				t.Errorf("trial %d: Rise(%.17g m) = %.17g, before %.17g K", trial, z, a, b)
			}
			r := old.Rise(z)
			for _, rr := range []float64{r, r * 0.7, r + 1} {
				if a, b := p.Depth(rr), old.Depth(rr); a != b {
					t.Errorf("trial %d: Depth(%.17g K) = %.17g, before %.17g m", trial, rr, a, b)
				}
			}
		}
		for range 20 {
			a := zs[rnd.IntN(len(zs))]
			b := a + 10000*rnd.Float64()
			d := 200 * rnd.Float64()
			if x, y := p.excess(d, a, b), old.excess(d, a, b); x != y {
				t.Errorf("trial %d: excess(%g, %g, %g) = %.17g, before %.17g K·m", trial, d, a, b, x, y)
			}
		}
	}
}
