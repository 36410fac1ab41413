package water

import "math"

// Region 2 of IAPWS R7-97(2012): the basic equation for steam, Eq. 15, a
// dimensionless Gibbs free energy γ = γ° + γʳ with the ideal-gas part
//
//	γ°(π, τ) = ln π + Σ n°ᵢ τ^J°ᵢ                       (Eq. 16, Table 10)
//
// and the residual part
//
//	γʳ(π, τ) = Σ nᵢ π^Iᵢ (τ − 0.5)^Jᵢ                    (Eq. 17, Table 11),
//
// π = p/1 MPa, τ = 540 K/T, with the property relations of Table 12. The
// supplementary equation for the metastable-vapour region is not used.

const (
	r2PStar = 1e6   // Pa, reducing pressure p*
	r2TStar = 540.0 // K, reducing temperature T*
)

// r2Ideal holds J° and n° of Table 10 of IAPWS R7-97(2012), i = 1 … 9.
var r2Ideal = [9]struct {
	J int
	n float64
}{
	{0, -0.96927686500217e1},
	{1, 0.10086655968018e2},
	{-5, -0.56087911283020e-2},
	{-4, 0.71452738081455e-1},
	{-3, -0.40710498223928},
	{-2, 0.14240819171444e1},
	{-1, -0.43839511319450e1},
	{2, -0.28408632460772},
	{3, 0.21268463753307e-1},
}

// r2Terms holds I, J and n of Table 11 of IAPWS R7-97(2012), i = 1 … 43.
var r2Terms = [43]struct {
	I, J int
	n    float64
}{
	{1, 0, -0.17731742473213e-2},
	{1, 1, -0.17834862292358e-1},
	{1, 2, -0.45996013696365e-1},
	{1, 3, -0.57581259083432e-1},
	{1, 6, -0.50325278727930e-1},
	{2, 1, -0.33032641670203e-4},
	{2, 2, -0.18948987516315e-3},
	{2, 4, -0.39392777243355e-2},
	{2, 7, -0.43797295650573e-1},
	{2, 36, -0.26674547914087e-4},
	{3, 0, 0.20481737692309e-7},
	{3, 1, 0.43870667284435e-6},
	{3, 3, -0.32277677238570e-4},
	{3, 6, -0.15033924542148e-2},
	{3, 35, -0.40668253562649e-1},
	{4, 1, -0.78847309559367e-9},
	{4, 2, 0.12790717852285e-7},
	{4, 3, 0.48225372718507e-6},
	{5, 7, 0.22922076337661e-5},
	{6, 3, -0.16714766451061e-10},
	{6, 16, -0.21171472321355e-2},
	{6, 35, -0.23895741934104e2},
	{7, 0, -0.59059564324270e-17},
	{7, 11, -0.12621808899101e-5},
	{7, 25, -0.38946842435739e-1},
	{8, 8, 0.11256211360459e-10},
	{8, 36, -0.82311340897998e1},
	{9, 13, 0.19809712802088e-7},
	{10, 4, 0.10406965210174e-18},
	{10, 10, -0.10234747095929e-12},
	{10, 14, -0.10018179379511e-8},
	{16, 29, -0.80882908646985e-10},
	{16, 50, 0.10693031879409},
	{18, 57, -0.33662250574171},
	{20, 20, 0.89185845355421e-24},
	{20, 35, 0.30629316876232e-12},
	{20, 48, -0.42002467698208e-5},
	{21, 21, -0.59056029685639e-25},
	{22, 53, 0.37826947613457e-5},
	{23, 39, -0.12768608934681e-14},
	{24, 26, 0.73087610595061e-28},
	{24, 40, 0.55414715350778e-16},
	{24, 58, -0.94369707241210e-6},
}

const (
	r2MaxI = 24 // largest I in Table 11
	r2MaxJ = 58 // largest J in Table 11
)

var r2 = func() []gibbsTerm {
	var I, J []int
	var n []float64
	for _, t := range r2Terms {
		I, J, n = append(I, t.I), append(J, t.J), append(n, t.n)
	}
	return makeTerms(I, J, n)
}()

// residual2 returns the sums Σ nᵢ π^Iᵢ y^Jᵢ weighted by 1, I, I(I−1), J,
// J(J−1) and IJ, with y = τ − 0.5: γʳ, π·γʳπ, π²·γʳππ, y·γʳτ, y²·γʳττ and
// π·y·γʳπτ.
func residual2(pi, y float64) (s, sI, sII, sJ, sJJ, sIJ float64) {
	// Power tables built by running products kept in registers.
	var pp [r2MaxI + 1]float64
	for k, v := 0, 1.0; k <= r2MaxI; k++ {
		pp[k] = v
		v *= pi
	}
	var py [r2MaxJ + 1]float64
	for k, v := 0, 1.0; k <= r2MaxJ; k++ {
		py[k] = v
		v *= y
	}
	for k := range r2 {
		t := &r2[k]
		v := pp[t.i] * py[t.j]
		s += t.n * v
		sI += t.nI * v
		sII += t.nII * v
		sJ += t.nJ * v
		sJJ += t.nJJ * v
		sIJ += t.nIJ * v
	}
	return
}

// region2 evaluates region 2 without checking the range of validity.
func region2(p, T float64) State {
	pi := p / r2PStar
	tau := r2TStar / T

	// Ideal-gas part (Table 13): γ°, τ·γ°τ and τ²·γ°ττ.
	var g0, tg0t, ttg0tt float64
	for _, t := range r2Ideal {
		v := t.n * powi(tau, t.J)
		fj := float64(t.J)
		g0 += v
		tg0t += fj * v
		ttg0tt += fj * (fj - 1) * v
	}
	g0 += math.Log(pi)

	y := tau - 0.5
	gr, pgrp, ppgrpp, sJ, sJJ, sIJ := residual2(pi, y)
	// Residual derivatives (Table 14), scaled by powers of τ and π.
	tgrt := tau * sJ / y
	ttgrtt := tau * tau * sJJ / (y * y)
	ptgrpt := tau * sIJ / y

	RT := GasConstant * T
	v := RT / p * (1 + pgrp)
	tgt := tg0t + tgrt
	ttgtt := ttg0tt + ttgrtt
	num := 1 + 2*pgrp + pgrp*pgrp
	d := 1 + pgrp - ptgrpt
	den := (1 - ppgrpp) + d*d/ttgtt
	return State{
		Region:         2,
		Pressure:       p,
		Temperature:    T,
		Density:        1 / v,
		SpecificVolume: v,
		Enthalpy:       RT * tgt,
		InternalEnergy: RT * (tgt - 1 - pgrp),
		Entropy:        GasConstant * (tgt - g0 - gr),
		Cp:             -GasConstant * ttgtt,
		SoundSpeed:     sqrt(RT * num / den),
	}
}

// powi returns x^n for a small integer n.
func powi(x float64, n int) float64 {
	if n < 0 {
		x, n = 1/x, -n
	}
	r := 1.0
	for ; n > 0; n-- {
		r *= x
	}
	return r
}

// sqrt is math.Sqrt; named so that the property relations read as written.
func sqrt(x float64) float64 { return math.Sqrt(x) }

// Region2 returns the state of steam at pressure p in Pa and temperature T
// in K from the region 2 basic equation of IF97. Its range of validity is
// 273.15 K ≤ T ≤ 1073.15 K with 0 < p ≤ p_s(T) up to 623.15 K, p ≤ p_B23(T)
// from 623.15 K to 863.15 K and p ≤ 100 MPa above; a state outside it gives
// a *StateError naming the region it lies in.
func Region2(p, T float64) (State, error) {
	r, err := RegionOf(p, T)
	switch {
	case err != nil:
		return State{}, err
	case r == 1:
		return State{}, stateErr(p, T, 1,
			"is compressed liquid, outside IF97 region 2 (steam): p is above the saturation pressure p_s(T) = %s; use Region1, Liquid or At",
			fmtPressure(saturationPressure(T)))
	case r == 3:
		return State{}, region3Err(p, T)
	case r == 5:
		return State{}, region5Err(p, T)
	}
	return region2(p, T), nil
}
