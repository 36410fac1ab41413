package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"rockheat/scenarios"
)

// scenarioFile writes the demo scenario with the replacements old → new
// applied into dir, and returns its path.
func scenarioFile(t *testing.T, dir, name string, edits ...string) string {
	t.Helper()
	ex, err := scenarios.LookupExample("demo")
	if err != nil {
		t.Fatal(err)
	}
	text := string(ex.Text)
	for i := 0; i+1 < len(edits); i += 2 {
		if !strings.Contains(text, edits[i]) {
			t.Fatalf("the demo has no %q to replace", edits[i])
		}
		text = strings.Replace(text, edits[i], edits[i+1], 1)
	}
	path := filepath.Join(dir, name)
	if err := os.WriteFile(path, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

// TestCommandLine runs the command line on the classes of bad input and
// the Unix conventions a user expects, and checks the exit status and what
// is said (table of cases; each said otherwise, or panicked or ran, before).
func TestCommandLine(t *testing.T) {
	dir := t.TempDir()
	hotRock, err := scenarios.LookupExample("hot-rock-demo")
	if err != nil {
		t.Fatal(err)
	}
	hot := filepath.Join(dir, "hot.toml")
	os.WriteFile(hot, []byte(strings.Replace(string(hotRock.Text), "min_useful_temp_c = 150", "min_useful_temp_c = 900", 1)), 0o644)
	manyYears := filepath.Join(dir, "years.toml")
	os.WriteFile(manyYears, []byte(strings.Replace(string(hotRock.Text), "report_years = [0, 10, 20, 30]",
		"report_years = ["+yearList(1000)+"]", 1)), 0o644)
	f := func(name string, edits ...string) string { return scenarioFile(t, dir, name, edits...) }
	cases := []struct {
		name string
		args []string
		code int
		want string // in stdout or stderr
	}{
		{"version", []string{"--version"}, 0, "rockheat version"},
		{"help after a scenario", []string{"run", "demo", "--help"}, 0, "rockheat run - run a scenario"},
		{"help topic", []string{"help", "run"}, 0, "rockheat run - run a scenario"},
		{"help shows defaults", []string{"run", "--help"}, 0, "(default: from the file, else 100000)"},
		{"help shows workers default", []string{"run", "--help"}, 0, "(default: one per CPU)"},
		{"flag without value", []string{"run", "demo", "--trials"}, 2, "--trials needs a value, e.g. --trials 100000"},
		{"flag with text", []string{"run", "demo", "--trials", "many"}, 2, `--trials "many" must be a whole number`},
		{"seed too large", []string{"run", "demo", "--seed", "18446744073709551616"}, 2, "larger than the largest seed, 18446744073709551615"},
		{"regress seed too large", []string{"regress", f("seed.toml"), "--update", "--seed", "18446744073709551616"}, 2, "larger than the largest seed, 18446744073709551615"},
		{"cap below first round", []string{"run", "demo", "--precision", "0.5%", "--max-trials", "10"}, 2,
			"--max-trials: the trial cap 10 is below the first round of 100000 trials"},
		{"trials as a float", []string{"validate", f("float.toml", "trials = 100000", "trials = 1e5")}, 2,
			"run.trials: must be a whole number, e.g. 100000"},
		{"quoted number", []string{"validate", f("quoted.toml", "rock_density_kg_m3 = 2650", `rock_density_kg_m3 = "2650"`)}, 2,
			"is text; write 2650 without quotes"},
		{"overflowing area", []string{"run", f("huge.toml", `area_km2 = { dist = "triangular", min = 3, mode = 6, max = 14 }`, "area_km2 = 1e308")}, 2,
			"area_km2: = 1e+308 is outside the valid range (0, 1e+06]"},
		{"vanishing life", []string{"run", f("life.toml", "life_years = 30", "life_years = 1e-300")}, 2, "life_years: = 1e-300 is outside the valid range"},
		{"large prospect warns", []string{"validate", f("large.toml", `area_km2 = { dist = "triangular", min = 3, mode = 6, max = 14 }`, "area_km2 = 100000")}, 0,
			"warning: " + filepath.Join(dir, "large.toml")},
		{"IF97 template temperature", []string{"run", f("if97.toml", "[model]", "[model]\nfluid = \"if97\"", "fluid_density_kg_m3 = 850          # liquid water near 235 °C\n", "depth_m = 1500\n",
			"fluid_heat_capacity_j_kgk = 4600\n", ""), "--trials", "2000"}, 0, "IAPWS-IF97"},
		{"IF97 too deep", []string{"validate", f("deep.toml", "[model]", "[model]\nfluid = \"if97\"", "fluid_density_kg_m3 = 850          # liquid water near 235 °C\n", "depth_m = 20000\n",
			"fluid_heat_capacity_j_kgk = 4600\n", "")}, 2, "at 10186 m a cold water column reaches 100 MPa"},
		{"no useful heat", []string{"validate", hot}, 2, "no trial has useful heat"},
		{"fracture method", []string{"run", "fracture-flow", "--trials", "2000"}, 0, "parallel fractures of spacing S and flow path L"},
		{"JUnit report onto a scenario", []string{"regress", f("reg.toml"), "--junit", filepath.Join(dir, "reg.toml")}, 2,
			"--junit " + filepath.Join(dir, "reg.toml") + " is a scenario being checked"},
		{"JUnit report into no folder", []string{"regress", f("reg2.toml"), "--junit", filepath.Join(dir, "none", "r.xml")}, 2,
			"the folder " + filepath.Join(dir, "none") + " does not exist"},
		{"too many report years", []string{"validate", manyYears}, 2, "more than the 100 a report can show"},
		{"title on two lines", []string{"validate", f("title.toml", `title = "Vellmar Ridge (invented demo prospect)"`, `title = "Vellmar\nRidge"`)}, 2,
			"title: holds a control character"},
		{"every file's problems", []string{"validate", f("bad1.toml", "life_years = 30", "life_years = -1"), filepath.Join(dir, "none.toml")}, 2,
			"bad1.toml"},
		{"and the missing file", []string{"validate", f("bad2.toml", "life_years = 30", "life_years = -1"), filepath.Join(dir, "none.toml")}, 2,
			"none.toml"},
		{"not a scenario file", []string{"validate", "/dev/zero"}, 2, "larger than 1048576 bytes"},
		{"portfolio", []string{"portfolio", "licence-demo", "--trials", "3000", "--target", "100"}, 0, "Chance that the risked total reaches 100 MWe"},
		{"portfolio bad target", []string{"portfolio", "licence-demo", "--target", "lots"}, 2, "--target \"lots\" must be a capacity"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			var out, errw bytes.Buffer
			err := run(&out, &errw, append([]string{"rockheat"}, c.args...))
			if err != nil {
				errw.WriteString("rockheat: " + err.Error() + "\n")
			}
			if code := exitCode(err); code != c.code {
				t.Errorf("exit %d, want %d; stderr:\n%s", code, c.code, errw.String())
			}
			if all := out.String() + errw.String(); !strings.Contains(all, c.want) {
				t.Errorf("output lacks %q:\n%s", c.want, all)
			}
		})
	}
}

// yearList returns "0, 1, …, n−1".
func yearList(n int) string {
	var b strings.Builder
	for i := range n {
		if i > 0 {
			b.WriteString(", ")
		}
		b.WriteString(strconv.Itoa(i))
	}
	return b.String()
}
