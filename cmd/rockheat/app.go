package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strconv"
	"strings"

	"github.com/urfave/cli/v2"

	"rockheat"
	"rockheat/heatmodel"
	"rockheat/report"
	"rockheat/scenarios"
)

// Exit codes.
const (
	exitOK       = 0
	exitFailure  = 1 // the run failed
	exitBadInput = 2 // bad usage or a bad scenario
)

// usageError marks an error in the command line.
type usageError struct{ error }

func usagef(format string, args ...any) error { return usageError{fmt.Errorf(format, args...)} }

func exitCode(err error) int {
	var ue usageError
	var ps scenarios.Problems
	var ie rockheat.InputErrors
	switch {
	case err == nil:
		return exitOK
	case errors.As(err, &ue), errors.As(err, &ps), errors.As(err, &ie):
		return exitBadInput
	}
	return exitFailure
}

// run builds the command line app on the given writers and runs it with
// args (args[0] is the program name).
func run(stdout, stderr io.Writer, args []string) error {
	app := &cli.App{
		Name:      "rockheat",
		Usage:     "probabilistic heat-in-place and power estimates for geothermal prospects",
		Writer:    stdout,
		ErrWriter: stderr,
		// Errors are printed once, by main, with their exit code.
		ExitErrHandler: func(*cli.Context, error) {},
		OnUsageError: func(c *cli.Context, err error, isSubcommand bool) error {
			return usageError{err}
		},
		Commands: []*cli.Command{runCommand(), validateCommand(), examplesCommand(), regressCommand()},
		Action: func(c *cli.Context) error {
			if c.NArg() > 0 {
				return usagef("unknown command %q; the commands are run, validate, examples and regress (see rockheat --help)", c.Args().First())
			}
			return cli.ShowAppHelp(c)
		},
	}
	return app.Run(flagsFirst(args))
}

// flagsFirst moves the flags of a command in front of its arguments, so
// that "rockheat run demo --trials 10" works as users expect (urfave/cli
// stops reading flags at the first argument). Every flag of rockheat's
// commands takes a value, given as "--flag value" or "--flag=value";
// "--" ends the flags.
func flagsFirst(args []string) []string {
	if len(args) < 3 {
		return args
	}
	out := append([]string{}, args[:2]...)
	var flags, rest []string
	for i := 2; i < len(args); i++ {
		a := args[i]
		switch {
		case a == "--":
			rest = append(rest, args[i:]...)
			i = len(args)
		case a == "-h" || a == "--help" || a == "--update" || strings.Contains(a, "=") && strings.HasPrefix(a, "-"):
			flags = append(flags, a)
		case strings.HasPrefix(a, "-") && len(a) > 1 && !isNumber(a):
			flags = append(flags, a)
			if i+1 < len(args) {
				flags = append(flags, args[i+1])
				i++
			}
		default:
			rest = append(rest, a)
		}
	}
	return append(append(out, flags...), rest...)
}

// parsePrecision reads a relative precision given as a percentage
// ("0.5%") or a fraction ("0.005").
func parsePrecision(s string) (float64, error) {
	t := strings.TrimSpace(s)
	scale := 1.0
	if strings.HasSuffix(t, "%") {
		t, scale = strings.TrimSpace(strings.TrimSuffix(t, "%")), 0.01
	}
	v, err := strconv.ParseFloat(t, 64)
	v *= scale
	if err != nil || !(v > 0 && v < 1) {
		return 0, usagef("--precision %q must be a percentage or fraction between 0 and 1, e.g. 0.5%% or 0.005", s)
	}
	return v, nil
}

func isNumber(s string) bool {
	_, err := strconv.ParseFloat(s, 64)
	return err == nil
}

// commandUsageError turns a flag error of a command into a usage error
// (exit status 2) with a pointer to the help.
func commandUsageError(c *cli.Context, err error, _ bool) error {
	return usagef("%v; see rockheat %s --help", err, c.Command.Name)
}

func runCommand() *cli.Command {
	return &cli.Command{
		Name:         "run",
		OnUsageError: commandUsageError,
		Usage:        "run a scenario and print its P90/P50/P10 summary",
		ArgsUsage:    "SCENARIO (a .toml file, or the name of a bundled example such as demo)",
		Flags: []cli.Flag{
			&cli.StringFlag{Name: "format", Value: "text", Usage: "output format: text, json, csv or html (a self-contained page with charts)"},
			&cli.StringFlag{Name: "out", Usage: "write the report to `FILE` (whole, via a temporary file) instead of standard output"},
			&cli.StringFlag{Name: "plots", Usage: "also write SVG charts (exceedance curves, tornado charts, hot-rock decline) into `DIR`"},
			&cli.StringFlag{Name: "samples", Usage: "also write every trial's inputs and outputs to this CSV `FILE`"},
			&cli.IntFlag{Name: "trials", Usage: "number of trials (overrides [run] trials)"},
			&cli.StringFlag{Name: "seed", Usage: "random seed, a whole number ≥ 0 (overrides [run] seed)"},
			&cli.IntFlag{Name: "workers", Usage: "goroutines to use (default: one per CPU); results do not depend on it"},
			&cli.StringFlag{Name: "precision", Usage: "run until every P90/P50/P10 is known to this relative `FRACTION` (95% interval half-width), e.g. 0.5% or 0.005"},
			&cli.IntFlag{Name: "max-trials", Usage: "trial cap for --precision (default 100000000)"},
		},
		Action: func(c *cli.Context) error {
			if c.NArg() != 1 {
				return usagef("run takes one scenario, got %d; e.g. rockheat run demo", c.NArg())
			}
			format := c.String("format")
			render, ok := map[string]func(io.Writer, *rockheat.Result) error{
				"text": report.Text, "json": report.JSON, "csv": report.CSV, "html": report.HTML,
			}[format]
			if !ok {
				return usagef("--format %q is not text, json, csv or html", format)
			}
			opt := rockheat.Options{Workers: c.Int("workers"), KeepSamples: c.String("samples") != ""}
			if c.IsSet("trials") {
				if c.Int("trials") <= 0 {
					return usagef("--trials %d must be a positive number", c.Int("trials"))
				}
				opt.Trials = c.Int("trials")
			}
			if c.IsSet("workers") && c.Int("workers") <= 0 {
				return usagef("--workers %d must be at least 1", c.Int("workers"))
			}
			if c.IsSet("seed") {
				seed, err := strconv.ParseUint(strings.TrimSpace(c.String("seed")), 10, 64)
				if err != nil {
					return usagef("--seed %q must be a whole number ≥ 0", c.String("seed"))
				}
				opt.Seed = &seed
			}
			if c.IsSet("precision") {
				p, err := parsePrecision(c.String("precision"))
				if err != nil {
					return err
				}
				opt.Precision = p
			}
			if c.IsSet("max-trials") {
				if c.Int("max-trials") <= 0 || !c.IsSet("precision") {
					return usagef("--max-trials must be a positive number and goes with --precision")
				}
				opt.MaxTrials = c.Int("max-trials")
			}
			s, err := load(c.Args().First())
			if err != nil {
				return err
			}
			prog := newProgress(c.App.ErrWriter)
			if prog != nil {
				opt.Progress = prog.update
			}
			res, err := rockheat.Estimate(&s.Run, opt)
			prog.clear()
			if err != nil {
				return flagError(err)
			}
			if path := c.String("samples"); path != "" {
				if err := report.WriteFile(path, func(w io.Writer) error { return report.SamplesCSV(w, res.Samples) }); err != nil {
					return err
				}
			}
			if dir := c.String("plots"); dir != "" {
				if err := writePlots(dir, res); err != nil {
					return err
				}
			}
			if path := c.String("out"); path != "" {
				return report.WriteFile(path, func(w io.Writer) error { return render(w, res) })
			}
			return render(c.App.Writer, res)
		},
	}
}

// optionFlags names the flag of each rockheat.Options field.
var optionFlags = map[string]string{"Trials": "--trials", "MaxTrials": "--max-trials", "KeepSamples": "--samples",
	"Precision": "--precision", "Workers": "--workers", "Seed": "--seed"}

// flagError words an option error of the library in the command's flags,
// as a usage error; other errors pass through.
func flagError(err error) error {
	var oe *rockheat.OptionError
	if !errors.As(err, &oe) {
		return err
	}
	var flags []string
	for _, o := range oe.Options {
		if f, ok := optionFlags[o]; ok {
			flags = append(flags, f)
		}
	}
	if len(flags) == 0 {
		return usageError{errors.New(oe.Msg)}
	}
	return usagef("%s: %s", strings.Join(flags, " with "), oe.Msg)
}

// writePlots writes the charts of res into dir: the exceedance curve and
// tornado chart of every output, and the decline of a hot-rock run.
func writePlots(dir string, res *rockheat.Result) error {
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return fmt.Errorf("creating the plot directory: %w", err)
	}
	for _, o := range res.Outputs {
		name := o.Spec.Name
		if err := report.WriteFile(filepath.Join(dir, "exceedance-"+name+".svg"), func(w io.Writer) error {
			return report.ExceedanceSVG(w, res, name)
		}); err != nil {
			return err
		}
		if len(res.Sensitivity) > 0 {
			if err := report.WriteFile(filepath.Join(dir, "tornado-"+name+".svg"), func(w io.Writer) error {
				return report.TornadoSVG(w, res, name)
			}); err != nil {
				return err
			}
		}
	}
	if res.Kind == heatmodel.KindHotRock {
		return report.WriteFile(filepath.Join(dir, "decline.svg"), func(w io.Writer) error { return report.DeclineSVG(w, res) })
	}
	return nil
}

// load reads a scenario; a file that cannot be read is a usage error.
func load(arg string) (*scenarios.Scenario, error) {
	s, err := scenarios.Load(arg)
	var ps scenarios.Problems
	if err != nil && !errors.As(err, &ps) {
		return nil, usageError{fmt.Errorf("%w (give a scenario file, or the name of a bundled example: rockheat examples lists them)", err)}
	}
	return s, err
}

func validateCommand() *cli.Command {
	return &cli.Command{
		Name:         "validate",
		OnUsageError: commandUsageError,
		Usage:        "check scenario files and report every problem, without running",
		ArgsUsage:    "SCENARIO...",
		Action: func(c *cli.Context) error {
			if c.NArg() == 0 {
				return usagef("validate takes one or more scenario files, e.g. rockheat validate my-prospect.toml")
			}
			var all scenarios.Problems
			var errs []error
			for _, arg := range c.Args().Slice() {
				s, err := load(arg)
				var ps scenarios.Problems
				switch {
				case errors.As(err, &ps):
					all = append(all, ps...)
				case err != nil:
					errs = append(errs, err)
				default:
					fmt.Fprintf(c.App.Writer, "%s: ok (%s, %d inputs, %d trials)\n", s.Path, s.Run.Model.Kind(), s.InputCount(), s.Run.Trials)
				}
			}
			if len(errs) > 0 {
				return errors.Join(errs...)
			}
			if len(all) > 0 {
				return fmt.Errorf("%d problem(s):\n%w", len(all), all)
			}
			return nil
		},
	}
}

func examplesCommand() *cli.Command {
	return &cli.Command{
		Name:         "examples",
		OnUsageError: commandUsageError,
		Usage:        "list the bundled example scenarios, or print one as a template",
		ArgsUsage:    "[NAME]",
		Action: func(c *cli.Context) error {
			switch c.NArg() {
			case 0:
				for _, ex := range scenarios.Examples() {
					fmt.Fprintf(c.App.Writer, "%-16s %s\n", ex.Name, ex.Description)
				}
				fmt.Fprintln(c.App.Writer, "\nrockheat examples NAME > my-prospect.toml   copies one to edit; rockheat run NAME runs it.")
				return nil
			case 1:
				ex, err := scenarios.LookupExample(c.Args().First())
				if err != nil {
					return usageError{err}
				}
				_, err = c.App.Writer.Write(ex.Text)
				return err
			}
			return usagef("examples takes at most one name")
		},
	}
}
