// Package heatmodel holds the physics of rockheat: pure functions over
// columns of Monte Carlo trials, in SI units (m, m², K, kg/m³, J/(kg·K),
// s, J, W). It knows nothing of scenario files or the command line.
//
// The reservoir model is the volumetric heat-in-place method of Muffler &
// Cataldi (1978), as used in USGS Circular 790 (Muffler, ed., 1979) and
// Williams, Reed & Mariner (2008, USGS Open-File Report 2008-1296):
//
//	Q  = A·h·[(1 − φ)·ρr·cr + φ·ρf·cf]·(Tr − Tref)   heat in place, J
//	Qr = R·Q                                         recoverable heat, J
//	Pth = Qr / L                                     mean thermal power, W
//	Pe = η·Qr / (F·L)                                electric capacity, W
//
// with A area, h thickness, φ porosity, ρr and cr rock density and heat
// capacity, ρf and cf pore-fluid density and heat capacity, Tr reservoir
// and Tref reference temperature, R recovery factor, η conversion
// efficiency, F capacity factor and L plant life. Of the several equation
// sets that circulate as "the volumetric method" (Takahashi & Yoshida
// 2018), this is the one with a single bulk volumetric heat capacity and a
// heat-to-electricity conversion efficiency applied to recoverable heat.
package heatmodel
