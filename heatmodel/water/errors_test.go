package water

import (
	"errors"
	"math"
	"strings"
	"testing"
)

// Region limits from IAPWS R7-97(2012), its range of validity and Figure 1
// (section and figure numbers from memory): region 3 lies
// above 623.15 K and above p_B23(T), region 5 above 1073.15 K, and IF97 as
// a whole covers 273.15 K ≤ T ≤ 2273.15 K, 0 < p ≤ 100 MPa (50 MPa above
// 1073.15 K).
func TestStateErrors(t *testing.T) {
	t.Parallel()
	nan := math.NaN()
	for _, c := range []struct {
		name       string
		fn         func(p, T float64) (State, error)
		p, T       float64
		wantRegion int      // StateError.Region
		want       []string // parts of the message
	}{
		{"At", At, 25e6, 660, 3, []string{"p=25 MPa, T=660 K", "region 3", "does not implement", "p_B23(T) = "}},
		{"At", At, 70e6, 800, 3, []string{"region 3"}},
		{"At", At, 1e6, 1100, 5, []string{"region 5", "1073.15 K"}},
		{"At", At, 60e6, 1100, 0, []string{"50 MPa"}},
		{"At", At, 1e6, 2500, 0, []string{"2273.15 K"}},
		{"At", At, -1e5, 300, 0, []string{"not positive", "absolute pressure in Pa"}},
		{"At", At, 0, 300, 0, []string{"not positive"}},
		{"At", At, 1e5, 25, 0, []string{"below 273.15 K", "0 °C = 273.15 K"}},
		{"At", At, 1e5, 273.1, 0, []string{"below 273.15 K"}},
		{"At", At, 150e6, 300, 0, []string{"above 100 MPa"}},
		{"At", At, nan, 300, 0, []string{"pressure", "not a finite number"}},
		{"At", At, 1e5, math.Inf(1), 0, []string{"temperature", "not a finite number"}},
		{"Region1", Region1, 1e5, 400, 2, []string{"steam", "p_s(T) = 0.245", "Region2"}},
		{"Region1", Region1, 30e6, 630, 3, []string{"623.15 K", "region 3"}},
		{"Region1", Region1, 1e5, 250, 0, []string{"below 273.15 K"}},
		{"Region2", Region2, 1e6, 400, 1, []string{"compressed liquid", "Region1"}},
		{"Region2", Region2, 25e6, 660, 3, []string{"region 3"}},
		{"Region2", Region2, 1e6, 1200, 5, []string{"region 5"}},
		{"Liquid", Liquid, 1e6, 500, 2, []string{"steam, not liquid", "p_s(T) = 2.63", "T_s(p) = 453.036 K", "raise the reservoir pressure"}},
		{"Liquid", Liquid, 100, 300, 2, []string{"steam, not liquid", "611.213 Pa", "raise the reservoir pressure"}},
		{"Liquid", Liquid, 25e6, 660, 3, []string{"623.15 K", "region 3"}},
		{"Liquid", Liquid, 10e6, 660, 2, []string{"is steam (IF97 region 2)", "623.15 K"}},
		{"Liquid", Liquid, 1e6, 1100, 5, []string{"region 5", "350 °C"}},
		{"Liquid", Liquid, -5e6, 400, 0, []string{"not positive"}},
		{"Liquid", Liquid, 1e6, 200, 0, []string{"below 273.15 K"}},
		{"Liquid", Liquid, nan, 400, 0, []string{"not a finite number"}},
	} {
		st, err := c.fn(c.p, c.T)
		if err == nil {
			t.Errorf("%s(%g Pa, %g K) = %+v, want an error", c.name, c.p, c.T, st)
			continue
		}
		var se *StateError
		if !errors.As(err, &se) {
			t.Errorf("%s(%g Pa, %g K): error %T, want *StateError", c.name, c.p, c.T, err)
			continue
		}
		if se.Region != c.wantRegion {
			t.Errorf("%s(%g Pa, %g K): StateError.Region = %d, want %d (%v)", c.name, c.p, c.T, se.Region, c.wantRegion, err)
		}
		if !strings.HasPrefix(err.Error(), "water: ") {
			t.Errorf("%s(%g Pa, %g K): message %q does not start with the package name", c.name, c.p, c.T, err)
		}
		for _, w := range c.want {
			if !strings.Contains(err.Error(), w) {
				t.Errorf("%s(%g Pa, %g K): message %q lacks %q", c.name, c.p, c.T, err, w)
			}
		}
	}
}

// RegionOf agrees with the region boundaries of IAPWS R7-97(2012) on
// both sides of each: the saturation line (checked at p_s(500 K) = 2.63889776
// MPa, Table 35), the 623.15 K line, the B23 line (16.5291643 MPa at
// 623.15 K, Section 4; 92.4 MPa at 850 K, derived from Eq. 5), and 863.15 K
// and 1073.15 K.
func TestRegionOfBoundaries(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		p, T float64
		want int
	}{
		{2.639e6, 500, 1}, {2.638e6, 500, 2},
		{20e6, 623.15, 1}, {20e6, 623.16, 3},
		{16.52e6, 623.16, 2}, {16.54e6, 623.16, 3},
		{93e6, 850, 3}, {92e6, 850, 2}, {99.9e6, 863.2, 2},
		{1e6, 1073.15, 2}, {1e6, 1073.2, 5},
		{1e6, 2273.15, 5},
	} {
		got, err := RegionOf(c.p, c.T)
		if err != nil || got != c.want {
			t.Errorf("RegionOf(%g Pa, %g K) = %d, %v; want %d", c.p, c.T, got, err, c.want)
		}
	}
}

func TestSaturationErrors(t *testing.T) {
	t.Parallel()
	for _, c := range []struct {
		name string
		fn   func(float64) (float64, error)
		x    float64
		want string
	}{
		{"SaturationPressure", SaturationPressure, 273.14, "273.15 K ≤ T ≤ 647.096 K"},
		{"SaturationPressure", SaturationPressure, 650, "273.15 K ≤ T ≤ 647.096 K"},
		{"SaturationPressure", SaturationPressure, math.NaN(), "273.15 K ≤ T ≤ 647.096 K"},
		{"SaturationTemperature", SaturationTemperature, 600, "611.213 Pa ≤ p ≤ 22.064 MPa"},
		{"SaturationTemperature", SaturationTemperature, 23e6, "611.213 Pa ≤ p ≤ 22.064 MPa"},
		{"SaturatedLiquid", satP(SaturatedLiquid), 630, "623.15 K"},
		{"SaturatedVapour", satP(SaturatedVapour), 250, "273.15 K"},
	} {
		if v, err := c.fn(c.x); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s(%g) = %g, %v; want an error containing %q", c.name, c.x, v, err, c.want)
		}
	}
}

// satP adapts SaturatedLiquid and SaturatedVapour to the table above.
func satP(f func(float64) (State, error)) func(float64) (float64, error) {
	return func(T float64) (float64, error) {
		st, err := f(T)
		return st.Pressure, err
	}
}
