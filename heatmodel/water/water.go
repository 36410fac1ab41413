package water

import (
	"fmt"
	"math"
)

// Equation and table numbers cited in this package are those of the
// release (from memory, apart from the verification Tables 5, 15, 35 and
// 36 and the B23 check value, listed in docs/references.md §7). Every
// coefficient table was checked against those verification values.

// Reference constants and region boundaries of IAPWS R7-97(2012), in SI
// units.
const (
	// GasConstant is the specific gas constant of ordinary water used by
	// IF97, in J/(kg·K) (the release's R = 0.461 526 kJ/(kg·K)).
	GasConstant = 461.526

	// CriticalTemperature is the critical temperature of water, in K.
	CriticalTemperature = 647.096

	// CriticalPressure is the critical pressure of water, in Pa (22.064 MPa).
	CriticalPressure = 22.064e6

	// CriticalDensity is the critical density of water, in kg/m³.
	CriticalDensity = 322.0

	// MinTemperature is the lowest temperature IF97 covers, in K (0 °C).
	MinTemperature = 273.15

	// MaxPressure is the highest pressure regions 1, 2 and 3 of IF97 cover,
	// in Pa (100 MPa).
	MaxPressure = 100e6

	// Region1MaxTemperature is the highest temperature of region 1, in K
	// (350 °C). Above it, liquid-like states lie in region 3.
	Region1MaxTemperature = 623.15

	// B23MaxTemperature is the temperature in K above which region 2
	// reaches up to MaxPressure; the B23 boundary spans 623.15 K to this.
	B23MaxTemperature = 863.15

	// Region2MaxTemperature is the highest temperature of region 2, in K
	// (800 °C). Above it lies region 5, which this package does not
	// implement.
	Region2MaxTemperature = 1073.15

	// Region5MaxTemperature is the highest temperature IF97 covers, in K
	// (2000 °C), in region 5 up to Region5MaxPressure.
	Region5MaxTemperature = 2273.15

	// Region5MaxPressure is the highest pressure of region 5, in Pa (50 MPa).
	Region5MaxPressure = 50e6

	// MinSaturationPressure is the saturation pressure at MinTemperature,
	// the lower end of the saturation line of IF97, in Pa (611.213 Pa as
	// given by the release; Eq. 30 at 273.15 K gives 611.2127 Pa, and
	// SaturationTemperature accepts pressures down to that).
	MinSaturationPressure = 611.213
)

// State is a thermodynamic state of water or steam.
type State struct {
	Region         int     // IF97 region the state was computed in: 1 (liquid) or 2 (steam)
	Pressure       float64 // Pa
	Temperature    float64 // K
	Density        float64 // kg/m³
	SpecificVolume float64 // m³/kg
	Enthalpy       float64 // specific enthalpy, J/kg
	InternalEnergy float64 // specific internal energy, J/kg
	Entropy        float64 // specific entropy, J/(kg·K)
	Cp             float64 // specific isobaric heat capacity, J/(kg·K)
	SoundSpeed     float64 // speed of sound, m/s
}

// StateError reports a pressure–temperature state that this package cannot
// evaluate in the way asked: outside the range of validity of IF97, in a
// region it does not implement (3 or 5), or on the wrong side of the
// saturation line for the function called.
type StateError struct {
	Pressure    float64 // Pa, as given
	Temperature float64 // K, as given
	// Region is the IF97 region the state lies in: 1 or 2 when the function
	// called does not cover it (e.g. Liquid on steam), 3 or 5 for the regions
	// not implemented, 0 outside the range of validity of IF97.
	Region int
	msg    string
}

// Error returns the message, which names the state, what is wrong and a fix.
func (e *StateError) Error() string { return e.msg }

func stateErr(p, T float64, region int, format string, args ...any) *StateError {
	prefix := fmt.Sprintf("water: state p=%s, T=%.6g K ", fmtPressure(p), T)
	return &StateError{Pressure: p, Temperature: T, Region: region, msg: prefix + fmt.Sprintf(format, args...)}
}

// fmtPressure formats a pressure in Pa as MPa with 6 significant digits.
func fmtPressure(p float64) string {
	return fmt.Sprintf("%.6g MPa", p/1e6)
}

// checkDomain returns an error for a state outside the range of validity of
// IF97 as a whole, and nil for one inside it.
func checkDomain(p, T float64) error {
	switch {
	case math.IsNaN(p) || math.IsInf(p, 0):
		return stateErr(p, T, 0, "has a pressure that is not a finite number; give the absolute pressure in Pa")
	case math.IsNaN(T) || math.IsInf(T, 0):
		return stateErr(p, T, 0, "has a temperature that is not a finite number; give the temperature in K")
	case p <= 0:
		return stateErr(p, T, 0, "has a pressure that is not positive; give the absolute pressure in Pa, > 0")
	case T < MinTemperature:
		return stateErr(p, T, 0, "is below 273.15 K, the lowest temperature of IF97 (ice or supercooled water); "+
			"give the temperature in K (0 °C = 273.15 K), ≥ 273.15 K")
	case T > Region5MaxTemperature:
		return stateErr(p, T, 0, "is above 2273.15 K, the highest temperature of IF97; give a temperature in K ≤ 2273.15 K")
	case T > Region2MaxTemperature && p > Region5MaxPressure:
		return stateErr(p, T, 0, "is outside IF97: above 1073.15 K it covers only p ≤ 50 MPa; lower the pressure or the temperature")
	case p > MaxPressure:
		return stateErr(p, T, 0, "is above 100 MPa, the highest pressure of IF97; give the pressure in Pa (1 MPa = 1e6 Pa), ≤ 100 MPa")
	}
	return nil
}

// region3Err is the error for a state in region 3, which lies above
// 623.15 K and above the B23 line.
func region3Err(p, T float64) error {
	return stateErr(p, T, 3, "lies in IF97 region 3 (near-critical fluid), which rockheat does not implement; "+
		"keep T ≤ 623.15 K for liquid, or p ≤ p_B23(T) = %s for steam at this temperature",
		fmtPressure(B23Pressure(T)))
}

// region5Err is the error for a state in region 5.
func region5Err(p, T float64) error {
	return stateErr(p, T, 5, "lies in IF97 region 5 (T > 1073.15 K), which rockheat does not implement; keep T ≤ 1073.15 K")
}

// RegionOf returns the IF97 region of the state (p, T), p in Pa and T in K:
// 1, 2, 3 or 5, or 0 with an error when the state is outside the range of
// validity of IF97. A state exactly on the saturation line, p = p_s(T), is
// given region 1. Only regions 1 and 2 can be evaluated by this package.
func RegionOf(p, T float64) (int, error) {
	if err := checkDomain(p, T); err != nil {
		return 0, err
	}
	switch {
	case T <= Region1MaxTemperature:
		if p >= saturationPressure(T) {
			return 1, nil
		}
		return 2, nil
	case T <= B23MaxTemperature:
		if p <= B23Pressure(T) {
			return 2, nil
		}
		return 3, nil
	case T <= Region2MaxTemperature:
		return 2, nil
	}
	return 5, nil
}

// At returns the state of water at pressure p in Pa and temperature T in K,
// choosing region 1 (liquid) or 2 (steam) from (p, T). A state exactly on
// the saturation line, p = p_s(T), is taken as liquid; use SaturatedVapour
// for the vapour there. A state in region 3 or 5, or outside the range of
// validity of IF97, gives a *StateError.
func At(p, T float64) (State, error) {
	r, err := RegionOf(p, T)
	if err != nil {
		return State{}, err
	}
	switch r {
	case 1:
		return region1(p, T), nil
	case 2:
		return region2(p, T), nil
	case 3:
		return State{}, region3Err(p, T)
	}
	return State{}, region5Err(p, T)
}
