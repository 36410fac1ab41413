package sampler

import (
	"math"
	"math/rand/v2"
	"sort"
	"testing"

	"gonum.org/v1/gonum/mathext"
	"gonum.org/v1/gonum/stat/distuv"
)

// refPERT is the PERT quantile as first written (a verbatim copy of the
// table and search that PERT replaced: math.Pow and a binary search per
// draw). The tests hold PERT.Quantile to its bits.
type refPERT struct {
	min, max float64
	lo, hi   refHalfTable
}

type refHalfTable struct {
	a       float64
	t, x, s []float64 // t = F(x)^(1/a) at the nodes, x, and dx/dt
}

func newRefHalfTable(a, b float64) refHalfTable {
	ref := distuv.Beta{Alpha: a, Beta: b}
	xm := ref.Quantile(0.5)
	h := refHalfTable{a: a, t: make([]float64, pertNodes+1), x: make([]float64, pertNodes+1), s: make([]float64, pertNodes+1)}
	for k := range h.x {
		x := xm * (1 - math.Cos(math.Pi/2*float64(k)/pertNodes))
		f := mathext.RegIncBeta(a, b, x)
		t := math.Pow(f, 1/a)
		h.x[k], h.t[k] = x, t
		// dx/dt = (dx/dF)·(dF/dt) = a·t^(a−1) / pdf(x).
		if pdf := ref.Prob(x); pdf > 0 {
			h.s[k] = a * math.Pow(t, a-1) / pdf
		}
	}
	// At x = 0, F ≈ x^a / (a·B(a, b)), so dx/dt → (a·B(a, b))^(1/a).
	h.x[0], h.t[0] = 0, 0
	h.s[0] = math.Pow(a*math.Exp(mathext.Lbeta(a, b)), 1/a)
	return h
}

// quantile returns the p-quantile, p in [0, 1/2].
func (h *refHalfTable) quantile(p float64) float64 {
	if p <= 0 {
		return 0
	}
	t := math.Pow(p, 1/h.a)
	k := sort.SearchFloat64s(h.t, t) - 1
	k = max(0, min(k, pertNodes-1))
	d := h.t[k+1] - h.t[k]
	if d <= 0 {
		return h.x[k]
	}
	u := (t - h.t[k]) / d
	u2, u3 := u*u, u*u*u
	x := (2*u3-3*u2+1)*h.x[k] + (u3-2*u2+u)*d*h.s[k] + (-2*u3+3*u2)*h.x[k+1] + (u3-u2)*d*h.s[k+1]
	return math.Min(math.Max(x, h.x[k]), h.x[k+1])
}

func newRefPERT(min, mode, max float64) refPERT {
	r := max - min
	alpha, beta := 1+4*(mode-min)/r, 1+4*(max-mode)/r
	return refPERT{min: min, max: max, lo: newRefHalfTable(alpha, beta), hi: newRefHalfTable(beta, alpha)}
}

func (d refPERT) Quantile(p float64) float64 {
	if p <= 0.5 {
		return d.min + (d.max-d.min)*d.lo.quantile(p)
	}
	if p >= 1 {
		return d.max
	}
	return d.max - (d.max-d.min)*d.hi.quantile(1-p)
}

// sameBits reports whether a and b are the same float64, or both NaN.
func sameBits(a, b float64) bool {
	return math.Float64bits(a) == math.Float64bits(b) || (math.IsNaN(a) && math.IsNaN(b))
}

// pertIdentityShapes are symmetric, skewed both ways, with the mode at
// either limit, with α = 2 or β = 2 (square-root route of the power), and
// off the unit interval.
var pertIdentityShapes = []struct{ min, mode, max float64 }{
	{0, 0.5, 1}, {0.02, 0.06, 0.12}, {0, 0, 1}, {0, 1, 1}, {0, 0.25, 1}, {0, 0.75, 1},
	{100, 101, 300}, {-5, 3, 4}, {0, 1e-9, 1}, {2.5e6, 2.6e6, 9e6}, {-1e-3, 0, 1e-3},
}

// nudge returns the values within n ulps of p.
func nudge(p float64, n int) []float64 {
	out := []float64{p}
	lo, hi := p, p
	for range n {
		lo, hi = math.Nextafter(lo, math.Inf(-1)), math.Nextafter(hi, math.Inf(1))
		out = append(out, lo, hi)
	}
	return out
}

// pertProbes returns the probabilities at which PERT is compared with
// refPERT: a dense grid, random p near 0, 1/2 and 1, the p whose t falls
// on or next to every node and every bucket edge of both halves, and the
// special values.
func pertProbes(d PERT) []float64 {
	rng := rand.New(rand.NewPCG(5, 5))
	var ps []float64
	for i := range 100001 {
		ps = append(ps, float64(i)/100000)
	}
	for range 20000 {
		e := math.Ldexp(1, -rng.IntN(60)) * rng.Float64()
		ps = append(ps, e, 0.5-e, 0.5+e, 1-e, rng.Float64())
	}
	for _, h := range []*halfTable{&d.tab.lo, &d.tab.hi} {
		var ts []float64
		for k := range pertNodes + 1 {
			ts = append(ts, h.node[k].t)
		}
		for b := range pertBuckets {
			ts = append(ts, float64(b)/h.scale)
		}
		for _, t := range ts {
			for _, q := range nudge(math.Pow(t, h.a), 3) {
				ps = append(ps, q, 1-q)
			}
		}
	}
	special := []float64{0, math.Copysign(0, -1), -1, 1, 2, math.Inf(1), math.Inf(-1), math.NaN(),
		0x1p-1074, 0x1p-1060, 0x1p-1030, 0x1p-200}
	special = append(special, nudge(0x1p-1022, 2)...)
	special = append(special, nudge(0.5, 3)...)
	special = append(special, nudge(1, 3)...)
	return append(ps, special...)
}

// viaT is d's quantile through its t-tables alone, as before the direct
// tables of the middle existed.
func viaT(d PERT, p float64) float64 {
	if p <= 0.5 {
		return d.min + d.width*d.tab.lo.quantileT(p)
	}
	if p >= 1 {
		return d.max
	}
	return d.max - d.width*d.tab.hi.quantileT(1-p)
}

// TestPERTQuantileIdentical holds the t-table route (viaT, which PERT
// takes in its tails) to the bits of the plain algorithm (refPERT) at
// every probe of pertProbes, for every shape.
func TestPERTQuantileIdentical(t *testing.T) {
	t.Parallel()
	for _, c := range pertIdentityShapes {
		d, err := NewPERT(c.min, c.mode, c.max)
		check(t, err)
		if d.tab.lo.start == nil || d.tab.hi.start == nil {
			t.Errorf("pert(%g, %g, %g): no bucket index built; the fast search is not tested", c.min, c.mode, c.max)
		}
		ref := newRefPERT(c.min, c.mode, c.max)
		bad := 0
		for _, p := range pertProbes(d) {
			if got, want := viaT(d, p), ref.Quantile(p); !sameBits(got, want) {
				if bad++; bad <= 5 {
					t.Errorf("pert(%g, %g, %g): Quantile(%v) = %v, plain algorithm %v", c.min, c.mode, c.max, p, got, want)
				}
			}
		}
	}
}

// TestPERTIndexFallback checks that the binary search kept for tables
// whose t do not increase gives the plain algorithm's cell: the index of
// a table is removed and quantile compared again.
func TestPERTIndexFallback(t *testing.T) {
	t.Parallel()
	d, err := NewPERT(0.02, 0.06, 0.12)
	check(t, err)
	ref := newRefPERT(0.02, 0.06, 0.12)
	tabs := *d.tab
	tabs.lo.start, tabs.hi.start = nil, nil
	plain := PERT{min: d.min, mode: d.mode, max: d.max, width: d.width, tab: &tabs}
	for _, p := range pertProbes(d)[:50000] {
		if got, want := viaT(plain, p), ref.Quantile(p); !sameBits(got, want) {
			t.Fatalf("without index: Quantile(%v) = %v, plain algorithm %v", p, got, want)
		}
	}
}

// TestPowRoute holds powRoute to math.Pow's bits for exponents in (0, 1]
// (those of every PERT shape, 1/α with 1 ≤ α ≤ 5, and others, near 1/2
// and 1 included) and bases over [2⁻¹⁰²², 1).
func TestPowRoute(t *testing.T) {
	t.Parallel()
	rng := rand.New(rand.NewPCG(6, 6))
	ys := []float64{1, 0.5, 0.25, 1.0 / 3, 0.2, 0.75, 1 / 2.6, 1 / 1.4}
	ys = append(ys, nudge(0.5, 4)...)
	ys = append(ys, nudge(1, 4)[1:]...) // y below 1 only; above 1 is not a route
	for range 200 {
		ys = append(ys, 1/(1+4*rng.Float64()), rng.Float64())
	}
	xs := []float64{0x1p-1022, 0.5, 0.25, math.Nextafter(1, 0), math.Nextafter(0.5, 1), 1e-300, 1e-20}
	for range 2000 {
		xs = append(xs, math.Ldexp(0.5+rng.Float64()/2, -rng.IntN(1022)), rng.Float64()/2)
	}
	for _, y := range ys {
		r, ry := powRouteFor(y)
		if y > 0 && y <= 1 && r == powGeneral {
			t.Errorf("y = %v takes no special route", y)
		}
		for _, x := range xs {
			if x < 0x1p-1022 || x >= 1 {
				continue
			}
			if got, want := r.of(x, ry), math.Pow(x, y); !sameBits(got, want) {
				t.Fatalf("route %d: Pow(%v, %v) = %v, math.Pow %v", r, x, y, got, want)
			}
		}
	}
}

// TestBetaDensityMatchesGonum: the direct table's density is gonum's
// distuv.Beta.Prob, bit for bit, at shapes of PERT halves and at x across
// [0, 1] including its ends.
func TestBetaDensityMatchesGonum(t *testing.T) {
	t.Parallel()
	for _, sh := range [][2]float64{{1, 1}, {1.8, 3.4}, {3, 3}, {1.04, 4.96}, {4.9, 1.1}, {2.5, 1}} {
		ref := distuv.Beta{Alpha: sh[0], Beta: sh[1]}
		d := newBetaDensity(ref)
		for i := 0; i <= 1000; i++ {
			x := float64(i) / 1000
			if got, want := d.prob(x), ref.Prob(x); math.Float64bits(got) != math.Float64bits(want) {
				t.Errorf("Beta(%g, %g) at %g: %v, gonum %v", sh[0], sh[1], x, got, want)
			}
		}
	}
}
