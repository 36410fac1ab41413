package rockheat_test

import (
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"rockheat"
	"rockheat/heatmodel"
	"rockheat/report/expect"
)

var updateREADME = flag.Bool("update-readme", false, "rewrite the README's generated input tables")

// inputTables returns the README's input tables, one per model setting,
// generated from the models' fields: each key's unit, valid range (an
// error outside), common-practice range (a warning outside), default and
// meaning.
func inputTables() map[string]string {
	models := map[string]rockheat.Model{
		"reservoir":             &rockheat.Reservoir{},
		"reservoir-if97-exergy": &rockheat.Reservoir{Fluid: heatmodel.FluidIF97, Conversion: heatmodel.ConversionExergy},
		"hot-rock":              &rockheat.HotRock{},
		"hot-rock-if97":         &rockheat.HotRock{Fluid: heatmodel.FluidIF97},
		"power-density":         &rockheat.PowerDensity{},
	}
	tables := map[string]string{}
	for name, m := range models {
		var b strings.Builder
		b.WriteString("| key | unit | valid range | common range | meaning |\n|---|---|---|---|---|\n")
		for _, f := range m.Fields() {
			doc := f.Doc
			switch f.Need {
			case rockheat.Defaulted:
				doc += fmt.Sprintf("; default %g", f.Default)
			case rockheat.Alternative:
				doc += "; see below"
			}
			valid := f.Valid.String()
			if f.Valid.Why != "" {
				valid += "*"
			}
			fmt.Fprintf(&b, "| `%s` | %s | %s | %s | %s |\n", f.Name(), f.Unit.Symbol, valid, f.Typical, doc)
		}
		tables[name] = b.String()
	}
	return tables
}

var tableRE = regexp.MustCompile(`(?s)<!-- inputs:([a-z0-9-]+) -->\n(.*?)<!-- end -->`)

// TestREADMEInputTables checks that the README's input tables are the ones
// the code has (go test -run TestREADMEInputTables -update-readme rewrites
// them), so that the documented ranges are the ones enforced.
func TestREADMEInputTables(t *testing.T) {
	src, err := os.ReadFile("README.md")
	if err != nil {
		t.Fatal(err)
	}
	want := inputTables()
	found := map[string]bool{}
	out := tableRE.ReplaceAllStringFunc(string(src), func(block string) string {
		m := tableRE.FindStringSubmatch(block)
		found[m[1]] = true
		if m[2] != want[m[1]] && !*updateREADME {
			t.Errorf("README table %s differs from the code; run go test -run TestREADMEInputTables -update-readme .\nwant:\n%s", m[1], want[m[1]])
		}
		return "<!-- inputs:" + m[1] + " -->\n" + want[m[1]] + "<!-- end -->"
	})
	for name := range want {
		if !found[name] {
			t.Errorf("README has no table <!-- inputs:%s -->", name)
		}
	}
	if *updateREADME {
		if err := os.WriteFile("README.md", []byte(out), 0o644); err != nil {
			t.Fatal(err)
		}
	}
}

// TestREADMERegressFigures: the README's count of the figures a
// statistical check of the bundled library compares, and its Bonferroni
// z at the default 1 % (expect.BonferroniZ), are those of the library's
// expectation files, so they cannot go stale as examples are added.
func TestREADMERegressFigures(t *testing.T) {
	src, err := os.ReadFile("README.md")
	if err != nil {
		t.Fatal(err)
	}
	m := regexp.MustCompile(`For the bundled library, m = (\d+) and z = ([\d.]+)\.`).FindStringSubmatch(string(src))
	if m == nil {
		t.Fatal(`the README no longer says "For the bundled library, m = … and z = …."`)
	}
	paths, err := filepath.Glob("scenarios/examples/*" + expect.Suffix)
	if err != nil || len(paths) == 0 {
		t.Fatalf("no expectation files (%v)", err)
	}
	figures := 0
	for _, p := range paths {
		e, err := expect.ReadFile(p)
		if err != nil {
			t.Fatal(err)
		}
		figures += expect.StatFigures(e)
	}
	if got, want := m[1], strconv.Itoa(figures); got != want {
		t.Errorf("README: m = %s, the library compares %s figures", got, want)
	}
	if got, want := m[2], fmt.Sprintf("%.2f", expect.BonferroniZ(0.01, figures)); got != want {
		t.Errorf("README: z = %s, want %s", got, want)
	}
}
