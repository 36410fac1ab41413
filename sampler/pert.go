package sampler

import (
	"fmt"
	"math"
	"sort"
	"sync"

	"gonum.org/v1/gonum/mathext"
	"gonum.org/v1/gonum/stat/distuv"
)

// pertNodes is the number of cells of each half of the PERT quantile table.
const pertNodes = 2048

// PERT is the beta-PERT distribution with lower limit min, most likely
// value mode and upper limit max: a beta distribution on [min, max] with
// shape parameters α = 1 + 4·(mode − min)/(max − min) and
// β = 1 + 4·(max − mode)/(max − min) (Malcolm et al. 1959; Vose 2008,
// "Risk Analysis", §9.1.6), whose mean is (min + 4·mode + max)/6.
//
// The beta quantile has no closed form and gonum's inversion costs about
// 2 µs, too slow for millions of draws. PERT therefore tabulates the exact
// CDF (regularised incomplete beta function) once, and inverts it by cubic
// Hermite interpolation with the exact density in the slopes. Each half of
// the distribution is tabulated from its own end, against t = F^(1/α)
// (lower half) or t = (1 − F)^(1/β) (upper half), in which the quantile is
// smooth right up to the limit. The error is below 1e-12 of (max − min)
// (checked against distuv.Beta.Quantile in the tests). For p in
// [2^−20, 1 − 2^−20], direct tables in p take over (see directLo): equal
// steps in the middle, p in [1/32, 31/32], and a table per binade of p in
// the tails, so that a draw there costs a cell look-up and the cubic. A
// draw in the far tails, one in a million, costs a power and a look-up in
// a search index of the nodes (the node a binary search would find). The
// tables are built once by NewPERT and shared by the copies of a PERT.
type PERT struct {
	min, mode, max float64
	alpha, beta    float64
	width          float64     // max − min
	tab            *pertTables // immutable once built
}

// pertTables holds the two halves of a PERT quantile table.
type pertTables struct {
	lo, hi halfTable // lower half: Beta(α, β); upper: 1 − X ~ Beta(β, α)
}

// halfTable inverts the CDF of Beta(a, b) for p ≤ 1/2.
type halfTable struct {
	a float64
	// node[k] holds t = F(x)^(1/a), x and dx/dt at the k-th node, for
	// k ≤ pertNodes.
	node []pertNode
	// start indexes node by t for quantileT, in place of a binary search:
	// start[c] is the first node whose t lies in search cell c or above
	// (searchCell). Nil if the nodes' t do not increase.
	start   []int32
	cellInv float64 // search cells per unit of t
	// direct tabulates the middle of the half, p in [directLo, 1/2], on
	// equal steps of p, and tail the tail below it, p in [2^−20, directLo)
	// (see tabulateDirect); without nodes when not used.
	direct hermiteTable
	tail   tailTable
}

// The direct table of a half: directCells equal steps of p from directLo
// to 1/2, where the quantile is smooth enough for a cubic Hermite piece
// per step to stay within 1e-12 of the range (checked against gonum's
// Beta quantile in TestPERTQuantileTable). Below directLo, a tail table
// (tailTable) of pertTailCells steps per binade of p takes over, down to
// p = 2^−20: near 0 the quantile is x ≈ c·p^r with r = 1/α in [1/5, 1],
// whose Hermite remainder in a binade [P, 2P] of steps h = P/256 is at
// most h⁴·|x⁗|/384 ≤ x(2P)·|r(r−1)(r−2)(r−3)|/(256⁴·384) ≤ 6.1·10⁻¹³·x,
// x being at most 1/2 of the range there. Below 2^−20 the t-table serves,
// whose variable t = p^(1/α) keeps the tail smooth.
const (
	directLo      = 1.0 / 32
	directCells   = 8192
	pertTailCells = 256
)

type pertNode struct{ t, x, s float64 }

func newHalfTable(a, b float64) halfTable {
	ref := distuv.Beta{Alpha: a, Beta: b}
	xm := ref.Quantile(0.5)
	h := halfTable{a: a, node: make([]pertNode, pertNodes+1)}
	for k := range pertNodes + 1 {
		x := xm * (1 - math.Cos(math.Pi/2*float64(k)/pertNodes))
		f := mathext.RegIncBeta(a, b, x)
		t := math.Pow(f, 1/a)
		n := pertNode{t: t, x: x}
		// dx/dt = (dx/dF)·(dF/dt) = a·t^(a−1) / pdf(x).
		if pdf := ref.Prob(x); pdf > 0 {
			n.s = a * math.Pow(t, a-1) / pdf
		}
		h.node[k] = n
	}
	// At x = 0, F ≈ x^a / (a·B(a, b)), so dx/dt → (a·B(a, b))^(1/a).
	h.node[0] = pertNode{t: 0, x: 0, s: math.Pow(a*math.Exp(mathext.Lbeta(a, b)), 1/a)}
	h.indexNodes()
	h.tabulateDirect(ref)
	return h
}

// searchCells is the number of cells of t in a half table's search index.
const searchCells = 8192

// indexNodes builds start, the search index of the nodes by t, if their t
// increase (as they do, F being increasing, unless rounding says
// otherwise; quantileT then searches the whole table).
func (h *halfTable) indexNodes() {
	last := h.node[len(h.node)-1].t
	for k := 1; k < len(h.node); k++ {
		if !(h.node[k].t > h.node[k-1].t) {
			return
		}
	}
	h.cellInv = searchCells / last
	h.start = make([]int32, searchCells+1)
	k := 0
	for c := range h.start {
		for k < len(h.node) && h.searchCell(h.node[k].t) < c {
			k++
		}
		h.start[c] = int32(k)
	}
}

// searchCell returns the search cell of t ≥ 0, the last for t past the
// table (or NaN): a function that does not decrease with t, so that a
// node in a lower cell than t has a lower t.
func (h *halfTable) searchCell(t float64) int {
	c := t * h.cellInv
	if !(c < searchCells) {
		return searchCells
	}
	return int(c)
}

// above returns the first node whose t is at least t (or len(node)): what
// a binary search of the nodes gives, found from the search index and a
// short walk. Every node before start[c], c the cell of t, lies in a lower
// cell and so has a lower t, and node start[c+1] has a higher one.
func (h *halfTable) above(t float64) int {
	if h.start == nil {
		return sort.Search(len(h.node), func(i int) bool { return h.node[i].t >= t })
	}
	k := int(h.start[h.searchCell(t)])
	for k < len(h.node) && h.node[k].t < t {
		k++
	}
	return k
}

// tabulateDirect builds the direct and tail tables: at each step p_k the
// quantile x from the t-table and its slope dx/dp = 1/pdf(x) (ref is the
// half's beta distribution). A table whose nodes do not increase is left
// out, and the tail table with the direct one.
func (h *halfTable) tabulateDirect(ref distuv.Beta) {
	density := newBetaDensity(ref)
	f := func(p float64) (float64, float64) {
		x := h.quantileT(p)
		return x, 1 / density.prob(x)
	}
	d, ok := newHermiteTable(directLo, 0.5, directCells, f)
	if !ok {
		return
	}
	h.direct = d
	h.tail, _ = newTailTable(pertTailCells, f)
}

// quantile returns the p-quantile, p in [0, 1/2]: from the direct or the
// tail table in their ranges, else from the t-table.
func (h *halfTable) quantile(p float64) float64 {
	if h.direct.node != nil {
		if p >= directLo {
			return h.direct.at(p)
		}
		if x, ok := h.tail.at(p); ok {
			return x
		}
	}
	return h.quantileT(p)
}

// quantileT returns the p-quantile, p in [0, 1/2], from the t-table:
// t = p^(1/a), then the cubic on the cell of the nodes that holds t.
func (h *halfTable) quantileT(p float64) float64 {
	if p <= 0 {
		return 0
	}
	t := math.Pow(p, 1/h.a)
	return h.cell(h.above(t)-1, t)
}

// cell evaluates the cubic Hermite interpolant of cell k (clamped to the
// table) at t.
func (h *halfTable) cell(k int, t float64) float64 {
	k = max(0, min(k, pertNodes-1))
	n0, n1 := h.node[k], h.node[k+1]
	d := n1.t - n0.t
	if d <= 0 {
		return n0.x
	}
	u := (t - n0.t) / d
	u2, u3 := u*u, u*u*u
	x := (2*u3-3*u2+1)*n0.x + (u3-2*u2+u)*d*n0.s + (-2*u3+3*u2)*n1.x + (u3-u2)*d*n1.s
	return clamp(x, n0.x, n1.x)
}

// NewPERT returns the beta-PERT distribution on [min, max] with the given
// mode. Constraints: min < max, min ≤ mode ≤ max.
func NewPERT(min, mode, max float64) (PERT, error) {
	if err := checkMinModeMax(min, mode, max); err != nil {
		return PERT{}, err
	}
	r := max - min
	p := PERT{min: min, mode: mode, max: max, width: r,
		alpha: 1 + 4*(mode-min)/r, beta: 1 + 4*(max-mode)/r}
	// The halves are independent: the upper one is built on a second
	// goroutine (each takes some 3 ms, mostly incomplete beta functions).
	p.tab = new(pertTables)
	var wg sync.WaitGroup
	wg.Go(func() { p.tab.hi = newHalfTable(p.beta, p.alpha) })
	p.tab.lo = newHalfTable(p.alpha, p.beta)
	wg.Wait()
	return p, nil
}

// Quantile returns the p-quantile of the PERT distribution.
func (d PERT) Quantile(p float64) float64 {
	if p <= 0.5 {
		return d.min + d.width*d.tab.lo.quantile(p)
	}
	if p >= 1 {
		return d.max
	}
	return d.max - d.width*d.tab.hi.quantile(1-p)
}

// CDF returns P(X ≤ x), the regularised incomplete beta function.
func (d PERT) CDF(x float64) float64 {
	u := (x - d.min) / (d.max - d.min)
	switch {
	case u <= 0:
		return 0
	case u >= 1:
		return 1
	}
	return mathext.RegIncBeta(d.alpha, d.beta, u)
}

// Mean returns (min + 4·mode + max)/6.
func (d PERT) Mean() float64 { return (d.min + 4*d.mode + d.max) / 6 }

// Shape returns the beta shape parameters α and β.
func (d PERT) Shape() (alpha, beta float64) { return d.alpha, d.beta }

// Support returns (min, max).
func (d PERT) Support() (lo, hi float64) { return d.min, d.max }

// Outside returns the probability of a draw outside [lo, hi].
func (d PERT) Outside(lo, hi float64) float64 { return outside(d.CDF, lo, hi) }

func (d PERT) String() string {
	return fmt.Sprintf("pert(min %g, mode %g, max %g)", d.min, d.mode, d.max)
}

// betaDensity is distuv.Beta.Prob with its log-normaliser computed once
// (the same expression in the same order, so bit for bit the same value):
// building a direct table calls it thousands of times.
type betaDensity struct {
	a, b, logNorm float64
}

func newBetaDensity(d distuv.Beta) betaDensity {
	lab, _ := math.Lgamma(d.Alpha + d.Beta)
	la, _ := math.Lgamma(d.Alpha)
	lb, _ := math.Lgamma(d.Beta)
	return betaDensity{a: d.Alpha, b: d.Beta, logNorm: lab - la - lb}
}

// prob returns the density at x in [0, 1].
func (d betaDensity) prob(x float64) float64 {
	if x < 0 || x > 1 {
		return 0
	}
	var lx, l1mx float64
	if d.a != 1 {
		lx = (d.a - 1) * math.Log(x)
	}
	if d.b != 1 {
		l1mx = (d.b - 1) * math.Log(1-x)
	}
	return math.Exp(d.logNorm + lx + l1mx)
}
