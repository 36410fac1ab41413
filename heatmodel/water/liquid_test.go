package water

import (
	"errors"
	"math"
	"testing"
)

// TestLiquidOrSaturated: the state is Liquid's where the water is liquid
// and SaturatedLiquid's where Liquid calls it steam, bit for bit, and the
// errors elsewhere are Liquid's.
func TestLiquidOrSaturated(t *testing.T) {
	t.Parallel()
	for _, T := range []float64{273.16, 300, 373.15, 450, 520, 600, 623.15} {
		for _, p := range []float64{1e3, 1e5, 1e6, 3e6, 1e7, 5e7, 1e8} {
			st, sat, err := LiquidOrSaturated(p, T)
			want, werr := Liquid(p, T)
			var se *StateError
			if errors.As(werr, &se) && se.Region == 2 {
				want, werr = SaturatedLiquid(T)
				if !sat {
					t.Errorf("p = %g, T = %g: steam side not reported as saturated", p, T)
				}
			} else if sat {
				t.Errorf("p = %g, T = %g: reported saturated, but Liquid gave %v", p, T, werr)
			}
			if (err == nil) != (werr == nil) || st != want {
				t.Errorf("p = %g, T = %g: %+v, %v; want %+v, %v", p, T, st, err, want, werr)
			}
		}
	}
	if _, _, err := LiquidOrSaturated(1e6, 700); err == nil {
		t.Error("T = 700 K, above region 1: no error")
	}
}

// TestLiquidOrSaturatedDensityCp: the density and heat capacity are those
// of LiquidOrSaturated's State, bit for bit, with the same saturated flag
// and the same errors, on a grid across region 1 and both sides of
// saturation, at its edges, and at 20 000 reservoir-like states.
func TestLiquidOrSaturatedDensityCp(t *testing.T) {
	t.Parallel()
	ps, Ts := benchStates(20_000)
	for _, T := range []float64{273.15, 273.16, 300, 373.15, 450, 520, 600, 623.15, 623.16, 700} {
		for _, p := range []float64{0, 1e3, 1e5, 1e6, 3e6, 1e7, 5e7, 1e8, 1.0001e8} {
			ps, Ts = append(ps, p), append(Ts, T)
		}
	}
	for i, p := range ps {
		T := Ts[i]
		rho, cp, sat, err := LiquidOrSaturatedDensityCp(p, T)
		st, wsat, werr := LiquidOrSaturated(p, T)
		switch {
		case (err == nil) != (werr == nil) || (err != nil && err.Error() != werr.Error()):
			t.Fatalf("p = %g, T = %g: error %v, LiquidOrSaturated %v", p, T, err, werr)
		case err == nil && (!sameBits(rho, st.Density) || !sameBits(cp, st.Cp) || sat != wsat):
			t.Fatalf("p = %g, T = %g: %v, %v, %v; LiquidOrSaturated %v, %v, %v", p, T, rho, cp, sat, st.Density, st.Cp, wsat)
		}
	}
}

// TestLiquidOrSaturatedDensityCps: the column form gives, state by state,
// LiquidOrSaturatedDensityCp's density and heat capacity bit for bit, two
// at a time or one (odd lengths), with its results written over its
// inputs or not, counts the saturated states, and stops at the first
// state outside region 1 with its index and LiquidOrSaturatedDensityCp's
// error, whether it is the first or second of a pair, or the last.
func TestLiquidOrSaturatedDensityCps(t *testing.T) {
	t.Parallel()
	p, T := benchStates(2001)
	for i := 0; i < len(p); i += 7 {
		p[i] = 1e5 // below the saturation pressure above 372.8 K: saturated liquid there
	}
	wantSat := 0
	for i := range p {
		if _, _, sat, _ := LiquidOrSaturatedDensityCp(p[i], T[i]); sat {
			wantSat++
		}
	}
	for _, alias := range []bool{false, true} {
		rho, cp := make([]float64, len(p)), make([]float64, len(p))
		pIn, TIn := p, T
		if alias {
			copy(rho, p)
			copy(cp, T)
			pIn, TIn = rho, cp
		}
		sat, bad, err := LiquidOrSaturatedDensityCps(pIn, TIn, rho, cp)
		if err != nil || bad != -1 || sat != wantSat || wantSat < 100 {
			t.Fatalf("alias %v: saturated %d, bad %d, %v; want %d (at least 100), -1, nil", alias, sat, bad, err, wantSat)
		}
		for i := range p {
			r, c, _, _ := LiquidOrSaturatedDensityCp(p[i], T[i])
			if !sameBits(rho[i], r) || !sameBits(cp[i], c) {
				t.Fatalf("alias %v, state %d (p = %g, T = %g): %v, %v; want %v, %v", alias, i, p[i], T[i], rho[i], cp[i], r, c)
			}
		}
	}
	for _, at := range []int{4, 7, 10} {
		q := append([]float64(nil), p[:11]...)
		q[at] = 2e8 // above IF97's 100 MPa
		_, wantErr := Liquid(q[at], T[at])
		_, bad, err := LiquidOrSaturatedDensityCps(q, T, make([]float64, 11), make([]float64, 11))
		if bad != at || err == nil || err.Error() != wantErr.Error() {
			t.Errorf("bad state at %d: got bad %d, %v; want %v", at, bad, err, wantErr)
		}
	}
}

// sameBits reports whether a and b have the same bits.
func sameBits(a, b float64) bool { return math.Float64bits(a) == math.Float64bits(b) }
