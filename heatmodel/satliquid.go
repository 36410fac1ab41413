package heatmodel

import (
	"sync"

	"rockheat/heatmodel/water"
)

// satLiquidCells is the number of equal steps of temperature of the
// saturated-liquid table, from water.MinTemperature to
// water.Region1MaxTemperature: 0.085 K each.
const satLiquidCells = 4096

// satLiquidTable tabulates the specific enthalpy, J/kg, and entropy,
// J/(kg·K), of saturated liquid water, water.SaturatedLiquid (IAPWS-IF97
// region 1 at the saturation pressure of Eq. 30), for the exergy route,
// which needs them in every trial: a look-up and two cubics instead of a
// saturation pressure and a region 1 evaluation. Each step holds, in
// Horner form in u, its fraction of the step, the cubic through the four
// nearest nodes (Lagrange interpolation; the first and last steps take
// the four nodes at their end). Against water.SaturatedLiquid the error
// is below 2·10⁻⁶ J/kg and 3·10⁻⁹ J/(kg·K) over the whole range
// (TestSatLiquidTable, at 200 000 temperatures), largest near 623 K:
// about 10⁻¹¹ of the available work of fluid at 100 °C or more, far below
// the uncertainty of IF97 itself.
type satLiquidTable struct {
	lo, inv float64 // the first node's temperature, K, and steps per K
	h, s    []cubic // by step
}

// cubic is c0 + u·(c1 + u·(c2 + u·c3)).
type cubic [4]float64

func (c *cubic) at(u float64) float64 { return c[0] + u*(c[1]+u*(c[2]+u*c[3])) }

// satLiquid is the table, built on first use (some 0.5 ms).
var satLiquid = sync.OnceValue(func() *satLiquidTable {
	lo, hi := water.MinTemperature, water.Region1MaxTemperature
	step := (hi - lo) / satLiquidCells
	h, s := make([]float64, satLiquidCells+1), make([]float64, satLiquidCells+1)
	for k := range h {
		st, err := water.SaturatedLiquid(min(lo+float64(k)*step, hi))
		if err != nil {
			panic("heatmodel: saturated liquid off its own range: " + err.Error())
		}
		h[k], s[k] = st.Enthalpy, st.Entropy
	}
	return &satLiquidTable{lo: lo, inv: 1 / step, h: lagrangeCubics(h), s: lagrangeCubics(s)}
})

// lagrangeCubics returns, for each step k between the nodes f[k] and
// f[k+1] (equally spaced), the cubic in u = its fraction of the step
// through the nodes k−1 … k+2, or the four nearest the end for the first
// and last steps.
func lagrangeCubics(f []float64) []cubic {
	cells := make([]cubic, len(f)-1)
	for k := range cells {
		a := min(max(k-1, 0), len(f)-4) // the first of the four nodes
		for i := range 4 {
			// The basis polynomial of node a+i, at u_i = a+i−k, as
			// coefficients in u: Π_{j≠i} (u − u_j)/(u_i − u_j).
			ui := float64(a + i - k)
			poly, den := cubic{1}, 1.0
			for j := range 4 {
				if j == i {
					continue
				}
				uj := float64(a + j - k)
				for d := 3; d >= 1; d-- {
					poly[d] = poly[d-1] - uj*poly[d]
				}
				poly[0] *= -uj
				den *= ui - uj
			}
			for d := range poly {
				cells[k][d] += f[a+i] * poly[d] / den
			}
		}
	}
	return cells
}

// saturatedLiquidHS returns the enthalpy, J/kg, and entropy, J/(kg·K), of
// saturated liquid at temperature T in K, from the table; outside its
// range, the error of water.SaturatedLiquid.
func saturatedLiquidHS(T float64) (h, s float64, err error) {
	if !(T >= water.MinTemperature && T <= water.Region1MaxTemperature) {
		_, err := water.SaturatedLiquid(T)
		return 0, 0, err
	}
	t := satLiquid()
	v := (T - t.lo) * t.inv
	k := min(int(v), len(t.h)-1)
	u := v - float64(k)
	return t.h[k].at(u), t.s[k].at(u), nil
}
