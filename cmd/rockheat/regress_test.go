package main

import (
	"bytes"
	"encoding/json"
	"encoding/xml"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"rockheat/report/expect"
	"rockheat/scenarios"
)

// rockheatCLI runs rockheat with args and returns its stdout, stderr (with the
// error main would print) and exit status.
func rockheatCLI(args ...string) (stdout, stderr string, code int) {
	var so, se bytes.Buffer
	err := run(&so, &se, append([]string{"rockheat"}, args...))
	if err != nil {
		se.WriteString("rockheat: " + err.Error() + "\n")
	}
	return so.String(), se.String(), exitCode(err)
}

// copyScenario copies the scenario at src, and its expectation if there is
// one, into dir, and returns the copy's path.
func copyScenario(t *testing.T, dir, src string) string {
	t.Helper()
	dst := filepath.Join(dir, filepath.Base(src))
	for _, p := range [][2]string{{src, dst}, {expect.Path(src), expect.Path(dst)}} {
		b, err := os.ReadFile(p[0])
		if os.IsNotExist(err) && p[0] != src {
			continue
		}
		if err != nil {
			t.Fatal(err)
		}
		if err := os.WriteFile(p[1], b, 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return dst
}

// editFile replaces old with new in the file at path; old must be there.
func editFile(t *testing.T, path, old, new string) {
	t.Helper()
	b, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	if !bytes.Contains(b, []byte(old)) {
		t.Fatalf("%s has no %q", path, old)
	}
	if err := os.WriteFile(path, bytes.Replace(b, []byte(old), []byte(new), 1), 0o644); err != nil {
		t.Fatal(err)
	}
}

// editJSON rewrites the expectation at path through edit.
func editJSON(t *testing.T, path string, edit func(e *expect.Expectation)) {
	t.Helper()
	e, err := expect.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	edit(e)
	if err := expect.WriteFile(path, e); err != nil {
		t.Fatal(err)
	}
}

const examples = "../../scenarios/examples"

// TestRegressGolden compares the output of regress with golden files, as
// TestGolden does (run with -update to rewrite them).
func TestRegressGolden(t *testing.T) {
	for _, c := range []struct{ name, args string }{
		{"regress-small", "regress ../../testdata/small.toml"},
		{"regress-missing", "regress ../../testdata/correlated.toml"},
		{"usage-regress-no-args", "regress"},
		{"usage-regress-trials", "regress ../../testdata/small.toml --trials 10"},
	} {
		t.Run(c.name, func(t *testing.T) {
			so, se, code := rockheatCLI(strings.Fields(c.args)...)
			got := "$ rockheat " + c.args + "\n--- stdout\n" + so + "--- stderr\n" + se + "--- exit " + strconv.Itoa(code) + "\n"
			path := filepath.Join("..", "..", "testdata", "golden", c.name+".out")
			if *update {
				if err := os.WriteFile(path, []byte(got), 0o644); err != nil {
					t.Fatal(err)
				}
				return
			}
			want, err := os.ReadFile(path)
			if err != nil {
				t.Fatalf("%v (run go test ./cmd/rockheat -update to create it)", err)
			}
			if got != string(want) {
				t.Errorf("output differs from %s:\n%s", path, diff(string(want), got))
			}
		})
	}
}

// TestLibraryExpectations: every bundled example has an expectation beside
// it, written for the file as it is, at the file's own trials and seed (so
// that rockheat run NAME reproduces it).
func TestLibraryExpectations(t *testing.T) {
	paths, err := filepath.Glob(filepath.Join(examples, "*.toml"))
	if err != nil || len(paths) < 8 {
		t.Fatalf("%d examples (%v), want at least 8", len(paths), err)
	}
	for _, p := range paths {
		s, err := scenarios.LoadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		e, err := expect.ReadFile(expect.Path(p))
		switch {
		case err != nil:
			t.Errorf("%v (write it with go run ./cmd/rockheat regress --update %s, and review it)", err, p)
		case e.ScenarioSHA256 != expect.Hash(s.Source) || e.Scenario != filepath.Base(p):
			t.Errorf("%s: the expectation is of another version of the file; rewrite it with rockheat regress --update", p)
		case e.Trials != s.Run.Trials || e.Seed != s.Run.Seed:
			t.Errorf("%s: expectation at %d trials, seed %d; the file says %d, %d", p, e.Trials, e.Seed, s.Run.Trials, s.Run.Seed)
		}
	}
}

// TestRegressMatchesRun: the figures regress records are those rockheat run
// prints for the same scenario, trials and seed.
func TestRegressMatchesRun(t *testing.T) {
	path := copyScenario(t, t.TempDir(), "../../testdata/correlated.toml")
	if _, se, code := rockheatCLI("regress", "--update", path, "--trials", "4000", "--seed", "77"); code != 0 {
		t.Fatalf("exit %d: %s", code, se)
	}
	e, err := expect.ReadFile(expect.Path(path))
	if err != nil {
		t.Fatal(err)
	}
	so, se, code := rockheatCLI("run", path, "--format", "json", "--trials", "4000", "--seed", "77")
	if code != 0 {
		t.Fatalf("run: exit %d: %s", code, se)
	}
	var res struct {
		ZeroHeat int                       `json:"zero_heat_trials"`
		Outputs  map[string]map[string]any `json:"outputs"`
	}
	if err := json.Unmarshal([]byte(so), &res); err != nil {
		t.Fatal(err)
	}
	for _, o := range e.Outputs {
		figs := res.Outputs[o.Name]
		ci, _ := figs["ci"].(map[string]any)
		for _, c := range []struct {
			name string
			rec  expect.Number
			run  any
		}{{"p90", o.P90, figs["p90"]}, {"p50", o.P50, figs["p50"]}, {"p10", o.P10, figs["p10"]}, {"mean", o.Mean, figs["mean"]},
			{"sd", o.SD, figs["sd"]}, {"min", o.Min, figs["min"]}, {"max", o.Max, figs["max"]},
			{"p50_ci.lo", o.P50CI[0], index(ci["p50"], 0)}, {"p10_ci.hi", o.P10CI[1], index(ci["p10"], 1)}} {
			x, err := c.rec.Float()
			if v, ok := c.run.(float64); err != nil || !ok || v != x {
				t.Errorf("%s.%s: regress %s, run %v", o.Name, c.name, c.rec, c.run)
			}
		}
	}
	if res.ZeroHeat != e.ZeroHeatTrials {
		t.Errorf("zero-heat trials: regress %d, run %d", e.ZeroHeatTrials, res.ZeroHeat)
	}
}

func index(v any, i int) any {
	if l, ok := v.([]any); ok && len(l) > i {
		return l[i]
	}
	return nil
}

// TestRegressShiftedInput copies the volcanic example with its stored
// expectation and moves the mode of its area by +5 % (7 → 7.35 km², PERT):
// at the stored trial count both modes must report the heat figures as
// drifted. With the expectation's hash left as it was, the check says the
// scenario changed; with the hash of the shifted file (what a change of
// the code, rather than of the file, looks like), it says the results
// drifted.
func TestRegressShiftedInput(t *testing.T) {
	path := copyScenario(t, t.TempDir(), filepath.Join(examples, "volcanic-high-t.toml"))
	editFile(t, path, `area_km2 = { dist = "pert", min = 4, mode = 7, max = 12 }`, `area_km2 = { dist = "pert", min = 4, mode = 7.35, max = 12 }`)
	so, _, code := rockheatCLI("regress", path)
	if code != 1 || !strings.Contains(so, "scenario changed since the expectation was written") {
		t.Errorf("edited scenario: exit %d:\n%s", code, so)
	}
	src, _ := os.ReadFile(path)
	editJSON(t, expect.Path(path), func(e *expect.Expectation) { e.ScenarioSHA256 = expect.Hash(src) })
	for _, mode := range []string{"exact", "stat"} {
		so, _, code := rockheatCLI("regress", "--tolerance", mode, path)
		if code != 1 || strings.Contains(so, "scenario changed") || !strings.Contains(so, "results drifted") {
			t.Errorf("%s: exit %d:\n%s", mode, code, so)
		}
		for _, fig := range []string{"heat_in_place.p50", "heat_in_place.mean"} {
			if !strings.Contains(so, fig) {
				t.Errorf("%s: %s not reported as drifted:\n%s", mode, fig, so)
			}
		}
	}
}

// TestRegressOtherSeed writes an expectation at one seed and relabels it
// with another: the figures of the other seed differ in every bit but lie
// within the Monte Carlo error, so exact mode fails and statistical mode
// passes.
func TestRegressOtherSeed(t *testing.T) {
	path := copyScenario(t, t.TempDir(), filepath.Join(examples, "sediment-direct.toml"))
	os.Remove(expect.Path(path))
	if _, se, code := rockheatCLI("regress", "--update", path, "--seed", "11"); code != 0 {
		t.Fatalf("exit %d: %s", code, se)
	}
	editJSON(t, expect.Path(path), func(e *expect.Expectation) { e.Seed = 12 })
	if so, _, code := rockheatCLI("regress", path); code != 1 || !strings.Contains(so, "heat_in_place.p50") {
		t.Errorf("exact: exit %d, want 1 with heat_in_place.p50 drifted:\n%s", code, so)
	}
	if so, se, code := rockheatCLI("regress", path, "--tolerance", "stat"); code != 0 || !strings.Contains(so, "1 held") {
		t.Errorf("stat: exit %d, want 0:\n%s%s", code, so, se)
	}
}

// TestRegressBrokenExpectation: a truncated, edited or foreign expectation
// is exit status 2 with a message naming the file and the fix, never a
// panic.
func TestRegressBrokenExpectation(t *testing.T) {
	good, err := os.ReadFile(expect.Path(filepath.Join(examples, "demo.toml")))
	if err != nil {
		t.Fatal(err)
	}
	text := string(good)
	for _, c := range []struct{ name, text, want string }{
		{"truncated", text[:len(text)/3], "ends early"},
		{"empty", "", "empty file"},
		{"edited figure", strings.Replace(text, `"p50": "`, `"p50": "about `, 1), "is not a number"},
		{"unknown key", strings.Replace(text, `"seed"`, `"sede"`, 1), `unknown key "sede"`},
		{"not an expectation", `{"title": "x"}`, "format"},
		{"a report instead", `[1, 2]`, "JSON"},
	} {
		t.Run(c.name, func(t *testing.T) {
			path := copyScenario(t, t.TempDir(), filepath.Join(examples, "demo.toml"))
			if err := os.WriteFile(expect.Path(path), []byte(c.text), 0o644); err != nil {
				t.Fatal(err)
			}
			_, se, code := rockheatCLI("regress", path)
			if code != 2 || !strings.Contains(se, expect.Path(path)) || !strings.Contains(se, c.want) || !strings.Contains(se, "--update "+path) {
				t.Errorf("exit %d, stderr:\n%s", code, se)
			}
		})
	}
}

// TestRegressUpdate: --update writes a new expectation, leaves an
// unchanged one alone, and rewrites one whose figures moved, listing them
// with the relative change; no temporary file is left behind.
func TestRegressUpdate(t *testing.T) {
	dir := t.TempDir()
	path := copyScenario(t, dir, "../../testdata/small.toml")
	steps := []struct {
		edit func()
		want []string
	}{
		{func() { os.Remove(expect.Path(path)) }, []string{"wrote", "new", "1 new"}},
		{func() {}, []string{"expectation unchanged", "1 unchanged"}},
		{func() {
			editJSON(t, expect.Path(path), func(e *expect.Expectation) { e.Outputs[0].P50 = "1e15"; e.WrittenBy.Version = "v0.0.1" })
		}, []string{"rewrote", "1 figure(s) moved", "heat_in_place.p50", "1e15", "%", "1 rewritten"}},
	}
	for i, s := range steps {
		s.edit()
		so, se, code := rockheatCLI("regress", path, "--update")
		if code != 0 {
			t.Fatalf("step %d: exit %d: %s", i, code, se)
		}
		for _, w := range s.want {
			if !strings.Contains(so, w) {
				t.Errorf("step %d: output lacks %q:\n%s", i, w, so)
			}
		}
	}
	if _, _, code := rockheatCLI("regress", path); code != 0 {
		t.Errorf("check after --update: exit %d", code)
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 2 {
		t.Errorf("%d files in the folder, want the scenario and its expectation", len(entries))
	}
}

// TestRegressJUnit checks a folder of three scenarios (one holds, one
// drifted, one without expectation) and reads the JUnit report back.
func TestRegressJUnit(t *testing.T) {
	dir := t.TempDir()
	copyScenario(t, dir, filepath.Join(examples, "demo.toml"))
	drift := copyScenario(t, dir, filepath.Join(examples, "small-exergy.toml"))
	copyScenario(t, dir, "../../testdata/correlated.toml")
	editJSON(t, expect.Path(drift), func(e *expect.Expectation) { e.ZeroHeatTrials = 3 })
	report := filepath.Join(t.TempDir(), "regress.xml")
	so, _, code := rockheatCLI("regress", dir, "--junit", report)
	if code != 2 || !strings.Contains(so, "1 held, 1 drifted, 0 changed, 1 could not be checked") {
		t.Errorf("exit %d, want 2 (a missing expectation):\n%s", code, so)
	}
	b, err := os.ReadFile(report)
	if err != nil {
		t.Fatal(err)
	}
	var doc struct {
		Tests, Failures, Errors int `xml:",attr"`
		Cases                   []struct {
			Name    string `xml:"name,attr"`
			Failure *struct {
				Text string `xml:",chardata"`
			} `xml:"failure"`
			Error *struct {
				Message string `xml:"message,attr"`
			} `xml:"error"`
		} `xml:"testsuite>testcase"`
	}
	if err := xml.Unmarshal(b, &doc); err != nil {
		t.Fatalf("%v\n%s", err, b)
	}
	byName := map[string]int{}
	for i, c := range doc.Cases {
		byName[filepath.Base(c.Name)] = i
	}
	cs := doc.Cases
	switch {
	case len(cs) != 3:
		t.Fatalf("%d test cases, want 3:\n%s", len(cs), b)
	case cs[byName["demo.toml"]].Failure != nil || cs[byName["demo.toml"]].Error != nil:
		t.Errorf("demo.toml should pass:\n%s", b)
	case cs[byName["small-exergy.toml"]].Failure == nil || !strings.Contains(cs[byName["small-exergy.toml"]].Failure.Text, "zero_heat_trials"):
		t.Errorf("small-exergy.toml should fail with its table:\n%s", b)
	case cs[byName["correlated.toml"]].Error == nil || !strings.Contains(cs[byName["correlated.toml"]].Error.Message, "--update"):
		t.Errorf("correlated.toml should be an error with the --update hint:\n%s", b)
	}
}

// TestRegressUsage checks the exit status of bad command lines.
func TestRegressUsage(t *testing.T) {
	dir := t.TempDir()
	for _, args := range []string{
		"regress",
		"regress " + dir,
		"regress ../../testdata/nonesuch.toml",
		"regress ../../testdata/golden/run-bad.out",
		"regress ../../testdata/small.toml --tolerance loose",
		"regress ../../testdata/small.toml --alpha 1%",
		"regress ../../testdata/small.toml --tolerance stat --alpha 0",
		"regress ../../testdata/small.toml --seed 3",
		"regress ../../testdata/small.toml --update --tolerance stat",
		"regress ../../testdata/small.toml --update --trials -1",
		"regress ../../testdata/bad-ranges.toml",
	} {
		if _, se, code := rockheatCLI(strings.Fields(args)...); code != 2 {
			t.Errorf("%s: exit %d, want 2 (%s)", args, code, se)
		}
	}
}

// BenchmarkRegressLibrary checks the bundled library in exact mode, as
// .ci/run does.
func BenchmarkRegressLibrary(b *testing.B) {
	for b.Loop() {
		if _, se, code := rockheatCLI("regress", examples); code != 0 {
			b.Fatalf("exit %d: %s", code, se)
		}
	}
}
