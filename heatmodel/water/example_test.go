package water_test

import (
	"fmt"

	"rockheat/heatmodel/water"
)

// Saturated liquid at 250 °C, the pore fluid of a hot liquid-dominated
// reservoir. Density and c_p agree with 798.89 kg/m³ and 4.865 kJ/(kg·K)
// (docs/references.md §2, derived from IF97); python3-iapws gives the same four
// figures.
func ExampleSaturatedLiquid() {
	liq, err := water.SaturatedLiquid(250 + 273.15)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("p_s = %.4f MPa\n", liq.Pressure/1e6)
	fmt.Printf("density = %.2f kg/m³\n", liq.Density)
	fmt.Printf("c_p = %.3f kJ/(kg·K)\n", liq.Cp/1e3)
	fmt.Printf("h = %.2f kJ/kg\n", liq.Enthalpy/1e3)
	// Output:
	// p_s = 3.9759 MPa
	// density = 798.89 kg/m³
	// c_p = 4.865 kJ/(kg·K)
	// h = 1085.69 kJ/kg
}

// Liquid refuses a reservoir state that is steam and says how to fix it.
func ExampleLiquid() {
	st, err := water.Liquid(20e6, 200+273.15) // 20 MPa, 200 °C: compressed liquid
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("region %d: density = %.2f kg/m³, c_p = %.1f J/(kg·K)\n", st.Region, st.Density, st.Cp)

	_, err = water.Liquid(1e6, 200+273.15) // 1 MPa, 200 °C: steam
	fmt.Println(err)
	// Output:
	// region 1: density = 877.97 kg/m³, c_p = 4398.2 J/(kg·K)
	// water: state p=1 MPa, T=473.15 K is steam, not liquid: p is below the saturation pressure p_s(T) = 1.55467 MPa (at this p water boils at T_s(p) = 453.036 K); raise the reservoir pressure above p_s(T), or use a liquid state with T below T_s(p)
}
