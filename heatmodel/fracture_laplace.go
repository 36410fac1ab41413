package heatmodel

import (
	"math"
	"math/cmplx"
)

// This file inverts the Laplace transforms of the parallel-fracture model
// (fracture.go) in dimensionless form. With t_D = α·t/D² and
// λ = 2·k·L/(ρw·cw·q·D), and g(s) = √s·tanh √s, the outlet cooling ratio
// R = (T0 − T_out)/(T0 − T_in) and the heat mined M = ∫_0^t_D (1 − R) dt_D
// have the transforms (Gringarten, Witherspoon & Ohnishi 1975)
//
//	R(s) = e^(−λ·g(s)) / s,    M(s) = (1 − e^(−λ·g(s))) / s².
//
// g is meromorphic, with poles at s = −(n + ½)²π² on the negative real axis
// (tanh's poles), so e^(−λg) has essential singularities there, which grow
// with λ. Two methods share the work:
//
//   - λ ≤ gwoTalbotMax: the fixed Talbot contour of Abate & Valkó (2004,
//     "Multi-precision Laplace transform inversion") with talbotM nodes. Its contour wraps the negative axis, and
//     the terms near the poles grow like e^(5λ·|s|·t/(M·π)) against the
//     e^(−|s|·t) of the kernel, so in double precision it holds only for
//     λ below about M/2 (with M = 32, measured against mpmath: errors
//     4e-12 at λ = 15, 1.7e-10 at 20, 1e-7 at 30).
//   - λ > gwoTalbotMax: the Bromwich line Re s = σ through the saddle point
//     of e^(s·t_D − λg(s)) (where t_D = λ·g'(σ)), by the trapezoid rule
//     (the Fourier-series form of the Bromwich integral, its abscissa
//     chosen at the saddle point: common practice). On that line the
//     integrand is bounded and, for large λ, Gaussian about the saddle (the
//     central-limit form of a sharp thermal front), so a few dozen nodes
//     suffice.
//
// Accuracy, measured against mpmath.invertlaplace in 30–330 digits on
// λ = 0.01–200, t_D/λ = 0.01–10 (testdata/fracture_gwo_table.csv,
// TestFractureTable): R and 1 − R within 1.3e-11 absolute and M within
// 6.4e-12 of itself on the Talbot contour; 5e-15 and 1.1e-15 on the saddle
// line. The two methods agree to 1.2e-11 for λ = 5–15 and t_D/λ =
// 0.01–20 (TestFractureInversionsAgree), and for λ = 100–1e7 the saddle line
// matches the second-order Edgeworth expansion of the front to its
// O(λ^(−3/2)) (TestFractureNarrowSpacing).
//
// Cost per inversion (R and M together): about 2 µs on the Talbot contour
// (32 nodes); on the saddle line, 3–50 nodes for λ ≥ 100 but up to about
// 200 near the front (t_D ≈ λ) for λ just above 15 (some 10–20 µs), as
// the tail of the integrand decays only as e^(−λ·√(ω/2)).

const (
	talbotM       = 32 // nodes of the fixed Talbot contour
	gwoTalbotMax  = 15 // λ up to which the Talbot contour is used
	gwoMu0        = math.Pi * math.Pi / 4
	gwoTrapLogEps = 37    // −ln of the trapezoid rule's aliasing error, ≈ ln 1e16
	gwoTailTol    = 1e-14 // the saddle line's integrand below which its tail is dropped
)

// talbotNodes holds the fixed Talbot contour of talbotM nodes: node k at
// s = r·σ_k, σ_0 = 1, σ_k = θ_k·(cot θ_k + i), θ_k = kπ/M, with
// r = 2M/(5t); with the weights
// γ_k = e^(r·t·σ_k)·(1 + i·θ_k·(1 + cot²θ_k) − i·cot θ_k) (½e^(r·t) for
// k = 0), f(t) ≈ (r/M)·Σ Re[γ_k·F(r·σ_k)]. For F = φ/s and F = (1 − φ)/s²
// the powers of r cancel into aR = γ/σ and aM = γ/σ²; √σ_k is kept for
// √s = √r·√σ_k.
var talbotNodes = func() (c struct {
	sqrtSigma, aR, aM [talbotM]complex128
}) {
	const m = talbotM
	for k := range m {
		sigma, gamma := complex(1, 0), complex(0.5*math.Exp(2.0*m/5), 0)
		if k > 0 {
			th := float64(k) * math.Pi / m
			cot := math.Cos(th) / math.Sin(th)
			sigma = complex(th*cot, th)
			gamma = cmplx.Exp(2.0*m/5*sigma) * complex(1, th+(th*cot-1)*cot)
		}
		c.sqrtSigma[k] = cmplx.Sqrt(sigma)
		c.aR[k] = gamma / sigma
		c.aM[k] = gamma / (sigma * sigma)
	}
	return c
}()

// gwoExponent returns −λ·g(s) = −λ·w·tanh w for w = √s with Re w ≥ 0.
// With e = e^(−2·Re w) ≤ 1 and 2y = 2·Im w,
// tanh w = (1 − e² + 2i·e·sin 2y)/(1 + 2e·cos 2y + e²), which has no
// overflow.
func gwoExponent(lambda float64, w complex128) complex128 {
	e := math.Exp(-2 * real(w))
	sin, cos := math.Sincos(2 * imag(w))
	d := 1 / (1 + e*(2*cos+e))
	th := complex((1-e*e)*d, 2*e*sin*d)
	return complex(-lambda, 0) * w * th
}

// expAndOneMinus returns e^z and 1 − e^z, the latter without cancellation
// for small |z|: with z = x + iy, 1 − e^z = −(expm1(x)·cos y − 2·sin²(y/2))
// − i·e^x·sin y.
func expAndOneMinus(z complex128) (ez, oneMinus complex128) {
	x, y := real(z), imag(z)
	if math.Abs(x) > 0.5 {
		ex := math.Exp(x)
		sin, cos := math.Sincos(y)
		ez = complex(ex*cos, ex*sin)
		return ez, 1 - ez
	}
	em1 := math.Expm1(x)
	sh, ch := math.Sincos(y / 2)
	sin, cos := 2*sh*ch, 1-2*sh*sh
	ex := 1 + em1
	return complex(ex*cos, ex*sin), complex(-(em1*cos - 2*sh*sh), -ex*sin)
}

// gwoInvert returns the outlet cooling ratio R(t_D), its complement
// Q = 1 − R, and the heat mined M(t_D) = ∫_0^t_D Q dt_D of the
// parallel-fracture model for λ > 0 and t_D ≥ 0 (all dimensionless). On
// the saddle line Q is computed on its own after the front (σ < 0), so
// that it keeps some relative accuracy as it falls below the absolute
// error of R. R(0) = 0 and M(0) = 0; for t_D = +Inf, R = 1 and M = λ.
func gwoInvert(lambda, td float64) (r, q, m float64) {
	switch {
	case td == 0:
		return 0, 1, 0
	case math.IsInf(td, 1):
		return 1, 0, lambda
	case lambda <= gwoTalbotMax:
		r, q, m = gwoTalbot(lambda, td)
	default:
		r, q, m = gwoSaddle(lambda, td)
	}
	// R and Q are fractions, and M grows at most as t_D and to λ: clamp the
	// inversion's last-digit noise into those bounds.
	return min(max(r, 0), 1), min(max(q, 0), 1), min(max(m, 0), td, lambda)
}

// gwoTalbot inverts R and M at t_D on the fixed Talbot contour, and
// returns Q = 1 − R.
func gwoTalbot(lambda, td float64) (r, q, m float64) {
	sr := math.Sqrt(2.0 * talbotM / (5 * td)) // √r
	var sumR, sumM float64
	for k := range talbotM {
		phi, one := expAndOneMinus(gwoExponent(lambda, complex(sr, 0)*talbotNodes.sqrtSigma[k]))
		sumR += real(talbotNodes.aR[k] * phi)
		sumM += real(talbotNodes.aM[k] * one)
	}
	r = sumR / talbotM
	return r, 1 - r, sumM * 5 * td / (2 * talbotM * talbotM)
}

// gwoSaddle inverts R, Q = 1 − R and M at t_D by the trapezoid rule on
// the Bromwich line Re s = σ near the saddle point s* of
// e^(s·t_D − λ·g(s)).
//
// σ is kept at least 1.5 standard widths 1/√K″ (K″ = −λ·g″(s*)) from the
// pole at s = 0, on the positive side unless the saddle lies clearly to the
// left, and no further left than −μ0/2 (μ0 = π²/4, the first pole of g).
// Left of 0 the line integral is R − 1 and ∫R − (t_D − λ): the residue at
// s = 0 is added back. The step h keeps the trapezoid rule's aliasing
// error, e^(−2π·d/h) with d the distance from σ to the nearest singularity,
// below 1e-16, and resolves the Gaussian about the saddle (h ≤ 0.5/√K″ at
// σ).
func gwoSaddle(lambda, td float64) (r, q, m float64) {
	s0 := gwoSaddlePoint(td / lambda)
	width := func(s float64) float64 { // 1/√K″ at s
		_, g2 := gwoSlope(s)
		return 1 / math.Sqrt(-lambda*g2)
	}
	sigma := max(s0, 1.5*width(s0))
	if s0 <= -1.5*width(s0) {
		sigma = max(s0, -gwoMu0/2)
	}
	d := sigma
	if sigma < 0 {
		d = min(-sigma, gwoMu0+sigma)
	}
	h := min(2*math.Pi*d/gwoTrapLogEps, 0.5*width(sigma))
	var sumR, sumI float64 // Σ Re[e^(s·t_D − λg)/s], Σ Re[e^(s·t_D − λg)/s²]
	small := 0
	for j := 0; small < 3; j++ {
		s := complex(sigma, float64(j)*h)
		e := cmplx.Exp(s*complex(td, 0) + gwoExponent(lambda, cmplx.Sqrt(s)))
		inv := 1 / s
		tr, ti := real(e*inv), real(e*inv*inv)
		if j == 0 {
			tr, ti = tr/2, ti/2
		}
		sumR += tr
		sumI += ti
		if abs := cmplx.Abs(s); cmplx.Abs(e) < gwoTailTol*min(abs, abs*abs) {
			small++
		} else {
			small = 0
		}
		if j > 1e5 {
			panic("heatmodel: fracture-flow inversion did not converge")
		}
	}
	i1, i2 := h/math.Pi*sumR, h/math.Pi*sumI
	if sigma < 0 { // i1 = R − 1 = −Q, i2 = ∫R − (t_D − λ)
		return 1 + i1, -i1, lambda - i2
	}
	return i1, 1 - i1, td - i2
}

// gwoSaddlePoint returns the real s* > −μ0 with g'(s*) = theta > 0: the
// saddle point of e^(s·t_D − λ·g(s)) for t_D = θ·λ. g' falls from +Inf at
// −μ0 through 1 at 0 to 0 at +Inf and is convex, so safeguarded Newton
// steps converge. Only the efficiency of gwoSaddle depends on its accuracy.
func gwoSaddlePoint(theta float64) float64 {
	if theta == 1 {
		return 0
	}
	lo, hi := -gwoMu0, math.Inf(1)
	s := 0.0
	if theta < 1 {
		lo = 0
		s = 1 / (4 * theta * theta) // g' ≈ 1/(2√s) for large s
		if theta > 0.3 {
			s = 0
		}
	} else {
		hi = 0
		s = -gwoMu0 + math.Sqrt(2*gwoMu0/theta) // g' ≈ 2μ0/(s + μ0)² near the pole
		s = min(max(s, -gwoMu0*0.999), -1e-3)
	}
	for range 60 {
		g1, g2 := gwoSlope(s)
		if g1 > theta {
			lo = s
		} else {
			hi = s
		}
		next := s - (g1-theta)/g2
		if !(next > lo && next < hi) {
			if math.IsInf(hi, 1) {
				next = 2*s + 1
			} else {
				next = (lo + hi) / 2
			}
		}
		if math.Abs(next-s) <= 1e-9*(1+math.Abs(s)) {
			return next
		}
		s = next
	}
	return s
}

// gwoSlope returns g'(s) and g″(s) for real s > −μ0, g(s) = √s·tanh √s
// (for s < 0, g = −y·tan y with y = √−s).
func gwoSlope(s float64) (g1, g2 float64) {
	switch {
	case math.Abs(s) < 1e-3: // g = s − s²/3 + 2s³/15 − 17s⁴/315 + …
		return 1 - 2*s/3 + 2*s*s/5 - 68*s*s*s/315, -2.0/3 + 4*s/5 - 68*s*s/105
	case s > 0:
		w := math.Sqrt(s)
		t := math.Tanh(w)
		sech2 := 1 - t*t
		return (t + w*sech2) / (2 * w), (w*sech2 - 2*w*w*t*sech2 - t) / (4 * w * w * w)
	default:
		y := math.Sqrt(-s)
		t := math.Tan(y)
		sec2 := 1 + t*t
		return (t + y*sec2) / (2 * y), -(y*sec2 + 2*y*y*t*sec2 - t) / (4 * y * y * y)
	}
}
