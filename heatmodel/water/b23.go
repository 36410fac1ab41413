package water

import "math"

// r23n holds n₁ … n₅ of Table 1 of IAPWS R7-97(2012), the boundary between
// regions 2 and 3; r23n[0] is unused.
var r23n = [6]float64{
	0,
	0.34805185628969e3,
	-0.11671859879975e1,
	0.10192970039326e-2,
	0.57254459862746e3,
	0.13918839778870e2,
}

// B23Pressure returns the pressure in Pa of the boundary between IF97
// regions 2 and 3 at temperature T in K (Eq. 5). The boundary spans
// 623.15 K ≤ T ≤ 863.15 K (16.529 MPa ≤ p ≤ 100 MPa); outside that the
// quadratic is evaluated as it stands and has no meaning.
func B23Pressure(T float64) float64 {
	return ((r23n[3]*T+r23n[2])*T + r23n[1]) * 1e6
}

// B23Temperature returns the temperature in K of the boundary between IF97
// regions 2 and 3 at pressure p in Pa (Eq. 6), the inverse of B23Pressure.
// The boundary spans 16.529 MPa ≤ p ≤ 100 MPa; outside that the formula has
// no meaning, and below 13.92 MPa it returns NaN.
func B23Temperature(p float64) float64 {
	return r23n[4] + math.Sqrt((p/1e6-r23n[5])/r23n[3])
}
