package water

import (
	"math"
	"strconv"
	"testing"
)

// checkPublished fails unless got agrees with a value published to nine
// significant digits, want, to within half a unit of its ninth digit
// (relative error ≤ 5e-9, so within the 1e-8 asked for).
func checkPublished(t *testing.T, name string, got, want float64) {
	t.Helper()
	unit := math.Pow(10, math.Floor(math.Log10(math.Abs(want)))-8)
	if d := math.Abs(got - want); !(d <= 0.5*unit*(1+1e-9)) {
		t.Errorf("%s = %.12g, want %.9g (off by %.3g units of the 9th digit, relative %.3g)",
			name, got, want, d/unit, d/math.Abs(want))
	}
}

// Source: IAPWS R7-97(2012), Table 5, "Thermodynamic property values
// calculated from Eq. (7) for selected temperatures and pressures", as
// listed in docs/references.md §7. Units there are m³/kg, kJ/kg, kJ/(kg·K), m/s.
var table5 = []struct {
	T, pMPa           float64
	v, h, u, s, cp, w float64
}{
	{300, 3, 0.100215168e-2, 0.115331273e3, 0.112324818e3, 0.392294792, 0.417301218e1, 0.150773921e4},
	{300, 80, 0.971180894e-3, 0.184142828e3, 0.106448356e3, 0.368563852, 0.401008987e1, 0.163469054e4},
	{500, 3, 0.120241800e-2, 0.975542239e3, 0.971934985e3, 0.258041912e1, 0.465580682e1, 0.124071337e4},
}

func TestRegion1Table5(t *testing.T) {
	t.Parallel()
	for _, c := range table5 {
		p := c.pMPa * 1e6
		for _, f := range []struct {
			name string
			fn   func(p, T float64) (State, error)
		}{{"Region1", Region1}, {"Liquid", Liquid}, {"At", At}} {
			st, err := f.fn(p, c.T)
			if err != nil {
				t.Errorf("%s(%g Pa, %g K): %v", f.name, p, c.T, err)
				continue
			}
			if st.Region != 1 {
				t.Errorf("%s(%g Pa, %g K).Region = %d, want 1", f.name, p, c.T, st.Region)
			}
			checkState(t, f.name, st, c.v, c.h, c.u, c.s, c.cp, c.w)
		}
	}
}

// Source: IAPWS R7-97(2012), Table 15, "Thermodynamic property values
// calculated from Eq. (15) for selected temperatures and pressures", as
// listed in docs/references.md §7.
var table15 = []struct {
	T, pMPa           float64
	v, h, u, s, cp, w float64
}{
	{300, 0.0035, 0.394913866e2, 0.254991145e4, 0.241169160e4, 0.852238967e1, 0.191300162e1, 0.427920172e3},
	{700, 0.0035, 0.923015898e2, 0.333568375e4, 0.301262819e4, 0.101749996e2, 0.208141274e1, 0.644289068e3},
	{700, 30, 0.542946619e-2, 0.263149474e4, 0.246861076e4, 0.517540298e1, 0.103505092e2, 0.480386523e3},
}

func TestRegion2Table15(t *testing.T) {
	t.Parallel()
	for _, c := range table15 {
		p := c.pMPa * 1e6
		for _, f := range []struct {
			name string
			fn   func(p, T float64) (State, error)
		}{{"Region2", Region2}, {"At", At}} {
			st, err := f.fn(p, c.T)
			if err != nil {
				t.Errorf("%s(%g Pa, %g K): %v", f.name, p, c.T, err)
				continue
			}
			if st.Region != 2 {
				t.Errorf("%s(%g Pa, %g K).Region = %d, want 2", f.name, p, c.T, st.Region)
			}
			checkState(t, f.name, st, c.v, c.h, c.u, c.s, c.cp, c.w)
		}
	}
}

// checkState compares st with published values in the release's units
// (m³/kg, kJ/kg, kJ/(kg·K), m/s).
func checkState(t *testing.T, fn string, st State, v, h, u, s, cp, w float64) {
	t.Helper()
	at := func(q string) string {
		return fn + "(" + fmtPressure(st.Pressure) + ", " + fmtK(st.Temperature) + ")." + q
	}
	checkPublished(t, at("SpecificVolume"), st.SpecificVolume, v)
	checkPublished(t, at("Enthalpy/1e3"), st.Enthalpy/1e3, h)
	checkPublished(t, at("InternalEnergy/1e3"), st.InternalEnergy/1e3, u)
	checkPublished(t, at("Entropy/1e3"), st.Entropy/1e3, s)
	checkPublished(t, at("Cp/1e3"), st.Cp/1e3, cp)
	checkPublished(t, at("SoundSpeed"), st.SoundSpeed, w)
	if math.Abs(st.Density*st.SpecificVolume-1) > 1e-15 {
		t.Errorf("%s: Density·SpecificVolume = %.17g, want 1", fn, st.Density*st.SpecificVolume)
	}
}

func fmtK(T float64) string { return strconv.FormatFloat(T, 'g', -1, 64) + " K" }

// Source: IAPWS R7-97(2012), Table 35, "Saturation pressures calculated
// from Eq. (30)", as listed in docs/references.md §7 (MPa).
func TestSaturationPressureTable35(t *testing.T) {
	t.Parallel()
	for _, c := range []struct{ T, psMPa float64 }{
		{300, 0.353658941e-2},
		{500, 0.263889776e1},
		{600, 0.123443146e2},
	} {
		ps, err := SaturationPressure(c.T)
		if err != nil {
			t.Errorf("SaturationPressure(%g K): %v", c.T, err)
			continue
		}
		checkPublished(t, "SaturationPressure("+fmtK(c.T)+")/1e6", ps/1e6, c.psMPa)
	}
}

// Source: IAPWS R7-97(2012), Table 36, "Saturation temperatures calculated
// from Eq. (31)", as listed in docs/references.md §7 (K).
func TestSaturationTemperatureTable36(t *testing.T) {
	t.Parallel()
	for _, c := range []struct{ pMPa, Ts float64 }{
		{0.1, 0.372755919e3},
		{1, 0.453035632e3},
		{10, 0.584149488e3},
	} {
		Ts, err := SaturationTemperature(c.pMPa * 1e6)
		if err != nil {
			t.Errorf("SaturationTemperature(%g MPa): %v", c.pMPa, err)
			continue
		}
		checkPublished(t, "SaturationTemperature("+fmtPressure(c.pMPa*1e6)+")", Ts, c.Ts)
	}
}

// Source: IAPWS R7-97(2012), Section 4, the computer-program verification
// of Eqs. 5 and 6: T = 0.623 150 000e3 K and p = 0.165 291 643e2 MPa
// correspond to each other on the B23 line.
func TestB23Section4(t *testing.T) {
	t.Parallel()
	checkPublished(t, "B23Pressure(623.15 K)/1e6", B23Pressure(0.62315e3)/1e6, 0.165291643e2)
	checkPublished(t, "B23Temperature(16.5291643 MPa)", B23Temperature(0.165291643e2*1e6), 0.623150000e3)
}
