// Package water gives thermodynamic properties of water and steam from the
// IAPWS Industrial Formulation 1997, IAPWS R7-97(2012) ("Revised Release on
// the IAPWS Industrial Formulation 1997 for the Thermodynamic Properties of
// Water and Steam", IAPWS, 2012), for the fluid side of geothermal models.
//
// Implemented are
//   - region 1, compressed liquid: 273.15 K ≤ T ≤ 623.15 K, p_s(T) ≤ p ≤ 100 MPa
//     (basic equation, Eq. 7);
//   - region 2, steam: 273.15 K ≤ T ≤ 1073.15 K, 0 < p ≤ p_s(T) below 623.15 K and
//     p ≤ p_B23(T) above it (basic equation, Eq. 15; not the metastable-vapour
//     equation);
//   - region 4, the saturation line in both directions, p_s(T) and T_s(p)
//     (Eqs. 30 and 31);
//   - the boundary between regions 2 and 3, p_B23(T) and T_B23(p) (Eqs. 5 and 6).
//
// Region 3 (near-critical fluid above 623.15 K and p_B23) and region 5 (steam
// above 1073.15 K) are not implemented: a state there, or outside the range of
// validity of IF97, gives a *StateError that says so, never a number.
//
// Units are SI throughout: pressure in Pa, temperature in K, density in kg/m³,
// specific volume in m³/kg, specific enthalpy and internal energy in J/kg,
// specific entropy and isobaric heat capacity in J/(kg·K), speed of sound in
// m/s. The standard's MPa and kJ are converted inside.
//
// Liquid is the entry point for reservoir models: one call per Monte Carlo
// trial, region 1 only, with an error that says so when the state is steam.
// The functions are safe for concurrent use; they keep no state.
package water
