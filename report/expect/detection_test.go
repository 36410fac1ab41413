package expect

import (
	"strings"
	"testing"

	"rockheat/scenarios"
)

// example returns the bundled example name, parsed, with its text edited
// by replacing old with new (once; old must be there).
func example(t *testing.T, name, old, new string) *scenarios.Scenario {
	t.Helper()
	ex, err := scenarios.LookupExample(name)
	if err != nil {
		t.Fatal(err)
	}
	if old != "" && !strings.Contains(string(ex.Text), old) {
		t.Fatalf("example %s has no %q", name, old)
	}
	return parse(t, strings.Replace(string(ex.Text), old, new, 1))
}

// recordAt runs s with its own seed plus offset.
func recordAt(t *testing.T, s *scenarios.Scenario, offset uint64) *Expectation {
	t.Helper()
	e, err := record(s, s.Run.Seed+offset)
	if err != nil {
		t.Fatal(err)
	}
	return e
}

// libraryZ is the per-figure quantile for a family-wise level of 1 % over
// 500 figures, more than the bundled library's 448 (README).
var libraryZ = BonferroniZ(0.01, 500)

// TestShiftedAreaDetected shifts the area of an example at its own trial
// count and seed and checks that both modes see it. Heat in place is
// proportional to area (Q = A·h·ρc·ΔT), so scaling every area parameter by
// 1.05 scales every heat figure by 1.05; moving the PERT mode from 7 to
// 7.35 moves the area's mean, 7.33, by (0.35·4/6)/7.33 = 3.2 % (PERT mean
// (min + 4·mode + max)/6) and the heat mean with it, the inputs being
// independent of area except thickness.
func TestShiftedAreaDetected(t *testing.T) {
	if testing.Short() {
		t.Skip("runs three 40 000-trial estimates")
	}
	const area = `area_km2 = { dist = "pert", min = 4, mode = 7, max = 12 }`
	base := recordAt(t, example(t, "volcanic-high-t", "", ""), 0)
	for _, c := range []struct {
		name, shifted string
		must          []string // figures statistical mode must flag
	}{
		{"scale +5 %", `area_km2 = { dist = "pert", min = 4.2, mode = 7.35, max = 12.6 }`,
			[]string{"heat_in_place.p90", "heat_in_place.p50", "heat_in_place.p10", "heat_in_place.mean"}},
		{"mode +5 %", `area_km2 = { dist = "pert", min = 4, mode = 7.35, max = 12 }`,
			[]string{"heat_in_place.mean", "heat_in_place.p50"}},
	} {
		got := recordAt(t, example(t, "volcanic-high-t", area, c.shifted), 0)
		if d := Drifts(Compare(base, got, Tolerance{Mode: Exact})); len(d) == 0 {
			t.Errorf("%s: exact mode sees no drift", c.name)
		}
		flagged := map[string]bool{}
		for _, d := range Drifts(Compare(base, got, Tolerance{Mode: Statistical, Z: libraryZ})) {
			flagged[d.Figure] = true
		}
		for _, f := range c.must {
			if !flagged[f] {
				t.Errorf("%s: statistical mode does not flag %s (flagged %v)", c.name, f, flagged)
			}
		}
	}
}

// TestOtherSeedPassesStatistically runs every bundled example at its own
// seed and at another: exact mode must see the difference, statistical
// mode at the family-wise level of 1 % over the whole library must not.
func TestOtherSeedPassesStatistically(t *testing.T) {
	if testing.Short() {
		t.Skip("runs every example twice")
	}
	var pairs [][2]*Expectation
	m := 0
	for _, ex := range scenarios.Examples() {
		s := parse(t, string(ex.Text))
		a, b := recordAt(t, s, 0), recordAt(t, s, 1000)
		pairs = append(pairs, [2]*Expectation{a, b})
		m += StatFigures(a)
	}
	z := BonferroniZ(0.01, m)
	for _, p := range pairs {
		if len(Drifts(Compare(p[0], p[1], Tolerance{Mode: Exact}))) == 0 {
			t.Errorf("%s: another seed gives bit-identical figures", p[0].Title)
		}
		if d := Drifts(Compare(p[0], p[1], Tolerance{Mode: Statistical, Z: z})); len(d) > 0 {
			t.Errorf("%s: another seed drifts statistically (z = %.3f over %d figures): %v", p[0].Title, z, m, d)
		}
	}
}
