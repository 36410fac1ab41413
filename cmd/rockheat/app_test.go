package main

import (
	"bytes"
	"encoding/json"
	"flag"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
)

var update = flag.Bool("update", false, "rewrite the golden files in testdata/golden")

// TestGolden runs the command line on stored scenarios and compares
// stdout, stderr and the exit code with golden files
// (../../testdata/golden/NAME.out). Run with -update after a deliberate
// change of output, and review the diff.
func TestGolden(t *testing.T) {
	cases := []struct {
		name string
		args string
	}{
		{"run-small-text", "run ../../testdata/small.toml"},
		{"run-small-json", "run ../../testdata/small.toml --format json"},
		{"run-small-csv", "run ../../testdata/small.toml --format csv --trials 3000 --seed 5"},
		{"validate-typo", "validate ../../testdata/bad-typo.toml"},
		{"validate-ranges", "validate ../../testdata/bad-ranges.toml"},
		{"validate-syntax", "validate ../../testdata/bad-syntax.toml"},
		{"validate-ok", "validate ../../testdata/small.toml"},
		{"run-bad", "run ../../testdata/bad-ranges.toml"},
		{"run-missing-file", "run ../../testdata/nonesuch.toml"},
		{"usage-format", "run ../../testdata/small.toml --format xml"},
		{"usage-no-scenario", "run"},
		{"usage-unknown-flag", "run ../../testdata/small.toml --trails 5"},
		{"usage-unknown-command", "simulate demo"},
		{"run-hotrock-json", "run hot-rock-demo --format json --trials 3000"},
		{"run-correlated-text", "run ../../testdata/correlated.toml"},
		{"validate-hotrock", "validate ../../testdata/bad-hotrock.toml"},
		{"examples-list", "examples"},
		{"examples-unknown", "examples nonesuch"},
		{"run-one-trial-text", "run ../../testdata/small.toml --trials 1"},
		{"portfolio-text", "portfolio licence-demo --trials 20000 --target 100"},
		{"portfolio-json", "portfolio licence-demo --trials 5000 --format json"},
		{"run-one-trial-csv", "run ../../testdata/small.toml --trials 1 --format csv"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			var stdout, stderr bytes.Buffer
			err := run(&stdout, &stderr, append([]string{"rockheat"}, strings.Fields(c.args)...))
			if err != nil {
				stderr.WriteString("rockheat: " + err.Error() + "\n")
			}
			got := "$ rockheat " + c.args + "\n--- stdout\n" + stdout.String() + "--- stderr\n" + stderr.String() +
				"--- exit " + strconv.Itoa(exitCode(err)) + "\n"
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

// diff returns the first differing lines of want and got.
func diff(want, got string) string {
	w, g := strings.Split(want, "\n"), strings.Split(got, "\n")
	var b strings.Builder
	shown := 0
	for i := 0; i < max(len(w), len(g)) && shown < 10; i++ {
		var wl, gl string
		if i < len(w) {
			wl = w[i]
		}
		if i < len(g) {
			gl = g[i]
		}
		if wl != gl {
			b.WriteString("line " + strconv.Itoa(i+1) + ":\n  want: " + wl + "\n  got:  " + gl + "\n")
			shown++
		}
	}
	return b.String()
}

// TestExitCodes checks the documented exit status: 0 ok, 1 run failure,
// 2 bad usage or bad scenario.
func TestExitCodes(t *testing.T) {
	for _, c := range []struct {
		args string
		code int
	}{
		{"run demo --trials 2000", 0},
		{"validate ../../testdata/bad-typo.toml", 2},
		{"run ../../testdata/bad-syntax.toml", 2},
		{"run demo --trials -5", 2},
		{"run demo --samples /nonexistent-dir/x.csv --trials 100", 2}, // found before the run
		{"run ../../testdata/nonesuch.toml", 2},
		{"run demo --trials 20000000000", 2},
		{"run demo --trials 3000000 --samples x.csv", 2},
	} {
		var out, errw bytes.Buffer
		err := run(&out, &errw, append([]string{"rockheat"}, strings.Fields(c.args)...))
		if got := exitCode(err); got != c.code {
			t.Errorf("%s: exit %d (%v), want %d", c.args, got, err, c.code)
		}
	}
}

// TestJSONDeterministicAcrossWorkers: same seed, identical JSON for 1, 2
// and 8 workers (the run spans several batches).
func TestJSONDeterministicAcrossWorkers(t *testing.T) {
	var first string
	for _, w := range []string{"1", "2", "8"} {
		var out, errw bytes.Buffer
		if err := run(&out, &errw, []string{"rockheat", "run", "demo", "--format", "json", "--trials", "150000", "--workers", w}); err != nil {
			t.Fatal(err)
		}
		if first == "" {
			first = out.String()
			var v map[string]any
			if err := json.Unmarshal(out.Bytes(), &v); err != nil {
				t.Fatalf("invalid JSON: %v", err)
			}
			continue
		}
		if out.String() != first {
			t.Errorf("workers %s: JSON differs from workers 1", w)
		}
	}
}

// TestPlotsAndOut checks --plots (one exceedance and one tornado chart per
// output, SVG) and --out (the report written whole to a file).
func TestPlotsAndOut(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "report.html")
	var so, se bytes.Buffer
	if err := run(&so, &se, []string{"rockheat", "run", "hot-rock-demo", "--trials", "2000", "--plots", filepath.Join(dir, "plots"), "--format", "html", "--out", out}); err != nil {
		t.Fatal(err)
	}
	if so.Len() != 0 {
		t.Errorf("stdout holds %d bytes with --out", so.Len())
	}
	page, err := os.ReadFile(out)
	if err != nil || !strings.Contains(string(page), "<svg") || !strings.Contains(string(page), "not a reserves") {
		t.Fatalf("report.html: %v, %d bytes", err, len(page))
	}
	for _, name := range []string{"exceedance-heat_in_place.svg", "tornado-electric_power.svg", "exceedance-thermal_power_at_30_years.svg", "decline.svg"} {
		b, err := os.ReadFile(filepath.Join(dir, "plots", name))
		if err != nil || !bytes.Contains(b, []byte("<svg")) {
			t.Errorf("%s: %v", name, err)
		}
	}
}

// TestSamplesFile checks --samples: one header row of input keys and
// output names, one row a trial, written whole (no temporary file left).
func TestSamplesFile(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "trials.csv")
	var out, errw bytes.Buffer
	if err := run(&out, &errw, []string{"rockheat", "run", "demo", "--trials", "500", "--samples", path}); err != nil {
		t.Fatal(err)
	}
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(strings.TrimSpace(string(data)), "\n")
	if len(lines) != 501 {
		t.Fatalf("%d lines, want 1 header + 500 trials", len(lines))
	}
	for _, col := range []string{"trial", "area_km2", "porosity", "life_years", "heat_in_place", "electric_power"} {
		if !strings.Contains(lines[0], col) {
			t.Errorf("header %q lacks %q", lines[0], col)
		}
	}
	entries, _ := os.ReadDir(dir)
	if len(entries) != 1 {
		t.Errorf("directory holds %d files, want only trials.csv", len(entries))
	}
}
