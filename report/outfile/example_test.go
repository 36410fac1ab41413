package outfile_test

import (
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"rockheat/report/outfile"
)

// Example checks a run's outputs before the run, then writes them all or
// nothing.
func Example() {
	dir, err := os.MkdirTemp("", "outfile-example")
	if err != nil {
		panic(err)
	}
	defer os.RemoveAll(dir)
	scenario := filepath.Join(dir, "prospect.toml")
	if err := os.WriteFile(scenario, []byte("title = \"x\"\n"), 0o644); err != nil {
		panic(err)
	}
	show := func(err error) { fmt.Println(strings.ReplaceAll(err.Error(), dir, "DIR")) }

	set := outfile.New(os.Stdout, outfile.Input{Path: scenario, Role: "the scenario being run"})
	if _, err := set.Add("--out", scenario); err != nil {
		show(err)
	}
	report, err := set.Add("--out", "-")
	if err != nil {
		panic(err)
	}
	samples, err := set.Add("--samples", filepath.Join(dir, "trials.csv"))
	if err != nil {
		panic(err)
	}
	if _, err := set.Add("--summary", filepath.Join(dir, "trials.csv")); err != nil {
		show(err)
	}

	// ... the run ...
	text := func(s string) func(io.Writer) error {
		return func(w io.Writer) error { _, err := io.WriteString(w, s); return err }
	}
	if err := samples.Write(text("trial,x\n1,2\n")); err != nil {
		set.Abort()
		panic(err)
	}
	if err := report.Write(text("P50 = 42\n")); err != nil {
		set.Abort()
		panic(err)
	}
	if err := set.Commit(); err != nil { // prints the report, then puts trials.csv in place
		panic(err)
	}
	b, _ := os.ReadFile(filepath.Join(dir, "trials.csv"))
	fmt.Print(string(b))
	// Output:
	// --out DIR/prospect.toml is the scenario being run; choose another file name
	// --summary DIR/trials.csv and --samples DIR/trials.csv are the same file; give each output its own file
	// P50 = 42
	// trial,x
	// 1,2
}
