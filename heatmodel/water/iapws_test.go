package water

import (
	"encoding/csv"
	"io"
	"os"
	"strconv"
	"strings"
	"testing"

	"gonum.org/v1/gonum/floats/scalar"
)

// The tables read here were written by testdata/gen_iapws_table.py with
// Debian's python3-iapws 1.5.3-1, an independent implementation of IF97;
// the header of each file records the version and the command.

// readTable reads a CSV file of testdata with '#' comment lines and a
// header row, and returns the rows as maps from column name to field.
func readTable(t *testing.T, name string) []map[string]string {
	t.Helper()
	f, err := os.Open("testdata/" + name)
	if err != nil {
		t.Fatalf("opening table: %v", err)
	}
	defer f.Close()
	r := csv.NewReader(f)
	r.Comment = '#'
	header, err := r.Read()
	if err != nil {
		t.Fatalf("reading header of %s: %v", name, err)
	}
	var rows []map[string]string
	for {
		rec, err := r.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			t.Fatalf("reading %s: %v", name, err)
		}
		row := make(map[string]string, len(header))
		for i, h := range header {
			row[h] = rec[i]
		}
		rows = append(rows, row)
	}
	return rows
}

func field(t *testing.T, row map[string]string, col string) float64 {
	t.Helper()
	x, err := strconv.ParseFloat(strings.TrimSpace(row[col]), 64)
	if err != nil {
		t.Fatalf("column %s: %v", col, err)
	}
	return x
}

// iapwsRelTol is the relative tolerance against python3-iapws. Small
// values (entropy and enthalpy near 0 °C) are compared with an absolute
// tolerance instead, of the size relTol times the quantity's typical scale.
const iapwsRelTol = 1e-7

func checkIAPWS(t *testing.T, what string, got, want, scale float64) {
	t.Helper()
	if !scalar.EqualWithinAbsOrRel(got, want, iapwsRelTol*scale, iapwsRelTol) {
		t.Errorf("%s = %.12g, python3-iapws %.12g (relative %.3g)", what, got, want, (got-want)/want)
	}
}

// Typical scales of the properties, for the absolute part of the tolerance
// near zero: J/kg and J/(kg·K).
const (
	scaleH = 1e5
	scaleS = 1e3
)

func TestIAPWSGrid(t *testing.T) {
	t.Parallel()
	rows := readTable(t, "iapws97_grid.csv")
	if len(rows) < 300 {
		t.Fatalf("iapws97_grid.csv has %d rows, want at least 300", len(rows))
	}
	count := map[int]int{}
	for _, row := range rows {
		p, T := field(t, row, "p_Pa"), field(t, row, "T_K")
		region := int(field(t, row, "region"))
		count[region]++
		st, err := At(p, T)
		if err != nil {
			t.Errorf("At(%g Pa, %g K): %v", p, T, err)
			continue
		}
		if st.Region != region {
			t.Errorf("At(%g Pa, %g K).Region = %d, python3-iapws says %d", p, T, st.Region, region)
			continue
		}
		at := "At(" + fmtPressure(p) + ", " + fmtK(T) + ")."
		checkIAPWS(t, at+"Density", st.Density, field(t, row, "density"), 1)
		checkIAPWS(t, at+"Enthalpy", st.Enthalpy, field(t, row, "h"), scaleH)
		checkIAPWS(t, at+"Entropy", st.Entropy, field(t, row, "s"), scaleS)
		checkIAPWS(t, at+"Cp", st.Cp, field(t, row, "cp"), 1)
		checkIAPWS(t, at+"SoundSpeed", st.SoundSpeed, field(t, row, "w"), 1)
		checkIAPWS(t, at+"InternalEnergy", st.InternalEnergy, field(t, row, "u"), scaleH)

		// The region functions agree with At, and Liquid covers exactly
		// region 1.
		byRegion, err := Region1(p, T)
		if region == 2 {
			byRegion, err = Region2(p, T)
		}
		if err != nil || byRegion != st {
			t.Errorf("Region%d(%g Pa, %g K) = %+v, %v; At gives %+v", region, p, T, byRegion, err, st)
		}
		liq, err := Liquid(p, T)
		switch {
		case region == 1 && (err != nil || liq != st):
			t.Errorf("Liquid(%g Pa, %g K) = %+v, %v; want %+v", p, T, liq, err, st)
		case region == 2 && err == nil:
			t.Errorf("Liquid(%g Pa, %g K) on steam: no error", p, T)
		}
	}
	if count[1] < 100 || count[2] < 100 {
		t.Errorf("iapws97_grid.csv has %d region 1 and %d region 2 rows, want ≥ 100 of each", count[1], count[2])
	}
}

func TestIAPWSSaturation(t *testing.T) {
	t.Parallel()
	rows := readTable(t, "iapws97_saturation.csv")
	var nps, nts, nsat int
	for _, row := range rows {
		T, p := field(t, row, "T_K"), field(t, row, "p_Pa")
		switch row["kind"] {
		case "ps_of_T":
			nps++
			ps, err := SaturationPressure(T)
			if err != nil {
				t.Errorf("SaturationPressure(%g K): %v", T, err)
				continue
			}
			checkIAPWS(t, "SaturationPressure("+fmtK(T)+")", ps, p, 0)
			if row["liq_density"] == "" {
				continue
			}
			nsat++
			liq, err := SaturatedLiquid(T)
			if err != nil {
				t.Errorf("SaturatedLiquid(%g K): %v", T, err)
				continue
			}
			vap, err := SaturatedVapour(T)
			if err != nil {
				t.Errorf("SaturatedVapour(%g K): %v", T, err)
				continue
			}
			for _, c := range []struct {
				name  string
				st    State
				phase string
			}{{"SaturatedLiquid", liq, "liq_"}, {"SaturatedVapour", vap, "vap_"}} {
				at := c.name + "(" + fmtK(T) + ")."
				checkIAPWS(t, at+"Pressure", c.st.Pressure, p, 0)
				checkIAPWS(t, at+"Density", c.st.Density, field(t, row, c.phase+"density"), 0)
				checkIAPWS(t, at+"Enthalpy", c.st.Enthalpy, field(t, row, c.phase+"h"), scaleH)
				checkIAPWS(t, at+"Entropy", c.st.Entropy, field(t, row, c.phase+"s"), scaleS)
				checkIAPWS(t, at+"Cp", c.st.Cp, field(t, row, c.phase+"cp"), 0)
			}
		case "Ts_of_p":
			nts++
			Ts, err := SaturationTemperature(p)
			if err != nil {
				t.Errorf("SaturationTemperature(%g Pa): %v", p, err)
				continue
			}
			checkIAPWS(t, "SaturationTemperature("+fmtPressure(p)+")", Ts, T, 0)
		default:
			t.Fatalf("iapws97_saturation.csv: unknown kind %q", row["kind"])
		}
	}
	if nps < 20 || nts < 10 || nsat < 20 {
		t.Errorf("iapws97_saturation.csv has %d p_s, %d T_s and %d saturated-state rows; want ≥ 20, 10, 20", nps, nts, nsat)
	}
}
