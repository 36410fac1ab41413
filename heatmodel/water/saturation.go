package water

import (
	"fmt"
	"math"
)

// Region 4 of IAPWS R7-97(2012): the saturation line, from the quadratic
// saturation equation Eq. 29 in β = (p_s/1 MPa)^(1/4) and
// ϑ = T_s/1 K + n₉/(T_s/1 K − n₁₀), solved for p_s (Eq. 30) and for T_s
// (Eq. 31), with the coefficients of Table 34.

// r4n holds n₁ … n₁₀ of Table 34 of IAPWS R7-97(2012); r4n[0] is unused.
var r4n = [11]float64{
	0,
	0.11670521452767e4,
	-0.72421316703206e6,
	-0.17073846940092e2,
	0.12020824702470e5,
	-0.32325550322333e7,
	0.14915108613530e2,
	-0.48232657361591e4,
	0.40511340542057e6,
	-0.23855557567849,
	0.65017534844798e3,
}

// saturationPressure evaluates Eq. 30 without range checks; T in K, result
// in Pa.
func saturationPressure(T float64) float64 {
	n := &r4n
	th := T + n[9]/(T-n[10])
	A := (th+n[1])*th + n[2]
	B := (n[3]*th+n[4])*th + n[5]
	C := (n[6]*th+n[7])*th + n[8]
	r := 2 * C / (-B + math.Sqrt(B*B-4*A*C))
	r *= r
	return r * r * 1e6
}

// saturationTemperature evaluates Eq. 31 without range checks; p in Pa,
// result in K.
func saturationTemperature(p float64) float64 {
	n := &r4n
	beta := math.Sqrt(math.Sqrt(p / 1e6))
	E := (beta+n[3])*beta + n[6]
	F := (n[1]*beta+n[4])*beta + n[7]
	G := (n[2]*beta+n[5])*beta + n[8]
	D := 2 * G / (-F - math.Sqrt(F*F-4*E*G))
	nd := n[10] + D
	return (nd - math.Sqrt(nd*nd-4*(n[9]+n[10]*D))) / 2
}

// minSaturationPressure and maxSaturationPressure are Eq. 30 at 273.15 K
// and at the critical temperature, the ends of the saturation line as
// computed: 611.2127 Pa (the release rounds it to 611.213 Pa) and
// 22.064 MPa + 0.3 Pa.
var (
	minSaturationPressure = saturationPressure(MinTemperature)
	maxSaturationPressure = saturationPressure(CriticalTemperature)
)

// SaturationPressure returns the saturation pressure p_s in Pa at
// temperature T in K, from Eq. 30 of IF97. Constraint:
// 273.15 K ≤ T ≤ 647.096 K (the critical temperature).
func SaturationPressure(T float64) (float64, error) {
	if !(T >= MinTemperature && T <= CriticalTemperature) {
		return 0, fmt.Errorf("water: saturation temperature T=%.6g K is outside the saturation line of IF97, "+
			"273.15 K ≤ T ≤ 647.096 K; give the temperature in K (0 °C = 273.15 K) within that range", T)
	}
	return saturationPressure(T), nil
}

// SaturationTemperature returns the saturation temperature T_s in K at
// pressure p in Pa, from Eq. 31 of IF97. Constraint:
// 611.213 Pa ≤ p ≤ 22.064 MPa (the critical pressure). The limits are
// taken as Eq. 30 computes them at 273.15 K and 647.096 K (611.2127 Pa and
// 22.064 MPa + 0.3 Pa), so that every p_s(T) is accepted.
func SaturationTemperature(p float64) (float64, error) {
	if !(p >= minSaturationPressure && p <= maxSaturationPressure) {
		return 0, fmt.Errorf("water: saturation pressure p=%.6g Pa is outside the saturation line of IF97, "+
			"611.213 Pa ≤ p ≤ 22.064 MPa; give the absolute pressure in Pa (1 MPa = 1e6 Pa) within that range", p)
	}
	return saturationTemperature(p), nil
}

// SaturatedLiquid returns the state of saturated liquid at temperature T in
// K, from region 1 at p = p_s(T). Constraint: 273.15 K ≤ T ≤ 623.15 K (the
// region 1 limit; nearer the critical point saturated liquid lies in
// region 3).
func SaturatedLiquid(T float64) (State, error) {
	if err := checkSaturated(T, "liquid"); err != nil {
		return State{}, err
	}
	return region1(saturationPressure(T), T), nil
}

// SaturatedVapour returns the state of saturated vapour at temperature T in
// K, from region 2 at p = p_s(T). Constraint: 273.15 K ≤ T ≤ 623.15 K (the
// region 2 limit; nearer the critical point saturated vapour lies in
// region 3).
func SaturatedVapour(T float64) (State, error) {
	if err := checkSaturated(T, "vapour"); err != nil {
		return State{}, err
	}
	return region2(saturationPressure(T), T), nil
}

func checkSaturated(T float64, phase string) error {
	if !(T >= MinTemperature && T <= Region1MaxTemperature) {
		return fmt.Errorf("water: saturated %s at T=%.6g K is outside 273.15 K ≤ T ≤ 623.15 K, where IF97 regions 1 and 2 meet "+
			"the saturation line (above 623.15 K it lies in region 3, which rockheat does not implement); "+
			"give the temperature in K within that range", phase, T)
	}
	return nil
}
