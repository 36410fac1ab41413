package main

import (
	"errors"
	"fmt"
	"io"
	"math"
	"regexp"
	"slices"
	"strconv"
	"strings"

	"github.com/urfave/cli/v2"

	"rockheat"
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
	app := newApp(stdout, stderr)
	args, err := flagsFirst(args, boolFlags(app))
	if err != nil {
		return err
	}
	return app.Run(args)
}

// boolFlags returns the names of the commands' flags that take no value.
func boolFlags(app *cli.App) map[string]bool {
	names := map[string]bool{}
	for _, c := range app.Commands {
		for _, f := range c.Flags {
			if b, ok := f.(*cli.BoolFlag); ok {
				for _, n := range b.Names() {
					names[n] = true
				}
			}
		}
	}
	return names
}

// newApp returns the command line app, writing to stdout and stderr.
func newApp(stdout, stderr io.Writer) *cli.App {
	return &cli.App{
		Name:      "rockheat",
		Usage:     "probabilistic heat-in-place and power estimates for geothermal prospects",
		Version:   versionText(),
		Writer:    stdout,
		ErrWriter: stderr,
		// Errors are printed once, by main, with their exit code.
		ExitErrHandler: func(*cli.Context, error) {},
		OnUsageError: func(c *cli.Context, err error, isSubcommand bool) error {
			return usageError{err}
		},
		Commands: []*cli.Command{runCommand(), portfolioCommand(), validateCommand(), examplesCommand(), regressCommand()},
		Action: func(c *cli.Context) error {
			if c.NArg() > 0 {
				return usagef("unknown command %q; the commands are run, portfolio, validate, examples and regress (see rockheat --help)", c.Args().First())
			}
			return cli.ShowAppHelp(c)
		},
	}
}

// versionText is the version --version prints: the module version and the
// VCS revision of the build.
func versionText() string {
	v, rev := report.Version()
	if rev == "" {
		return v + " (no VCS revision recorded; build with -buildvcs=true)"
	}
	return v + " (revision " + rev + ")"
}

// flagsFirst moves the flags of a command in front of its arguments, so
// that "rockheat run demo --trials 10" works as users expect (urfave/cli
// stops reading flags at the first argument). A flag takes a value, given
// as "--flag value" or "--flag=value", unless it is named in bools;
// "--" ends the flags.
func flagsFirst(args []string, bools map[string]bool) ([]string, error) {
	if len(args) < 3 {
		return args, nil
	}
	out := append([]string{}, args[:2]...)
	var flags, rest []string
	for i := 2; i < len(args); i++ {
		a := args[i]
		switch {
		case a == "--":
			rest = append(rest, args[i:]...)
			i = len(args)
		case a == "-h" || a == "--help":
			// Help for the command, whatever else is given.
			return append(out, "--help"), nil
		case bools[strings.TrimLeft(a, "-")] || strings.Contains(a, "=") && strings.HasPrefix(a, "-"):
			flags = append(flags, a)
		case strings.HasPrefix(a, "-") && len(a) > 1 && !isNumber(a):
			if i+1 == len(args) || strings.HasPrefix(args[i+1], "--") {
				return nil, usagef("%s needs a value, e.g. %s; see rockheat %s --help", dashes(a), flagExample(a), args[1])
			}
			flags = append(flags, a, args[i+1])
			i++
		default:
			rest = append(rest, a)
		}
	}
	return append(append(out, flags...), rest...), nil
}

// dashes writes a flag with two dashes, as the help does.
func dashes(flag string) string { return "--" + strings.TrimLeft(flag, "-") }

// flagExample is an example of flag with a value.
func flagExample(flag string) string {
	ex := map[string]string{"trials": "100000", "seed": "12345", "workers": "2", "format": "json", "out": "report.html",
		"plots": "charts", "samples": "trials.csv", "precision": "0.5%", "max-trials": "10000000", "target": "120",
		"tolerance": "stat", "junit": "report.xml", "alpha": "1%"}
	name := strings.TrimLeft(flag, "-")
	if v, ok := ex[name]; ok {
		return "--" + name + " " + v
	}
	return "--" + name + " VALUE"
}

// parsePrecision reads a relative precision given as a percentage
// ("0.5%") or a fraction ("0.005").
func parsePrecision(s string) (float64, error) {
	v, err := parseFraction(s)
	if err != nil {
		return 0, usagef("--precision %q must be a percentage or fraction between 0 and 1, e.g. 0.5%% or 0.005", s)
	}
	return v, nil
}

// parseFraction reads a fraction in (0, 1) given as a percentage ("1%")
// or as a fraction ("0.01").
func parseFraction(s string) (float64, error) {
	t, scale := strings.TrimSpace(s), 1.0
	if strings.HasSuffix(t, "%") {
		t, scale = strings.TrimSpace(strings.TrimSuffix(t, "%")), 0.01
	}
	v, err := strconv.ParseFloat(t, 64)
	if v *= scale; err != nil || !(v > 0 && v < 1) {
		return 0, fmt.Errorf("%q is not a fraction in (0, 1)", s)
	}
	return v, nil
}

// parseSeed reads the --seed flag: a whole number from 0 to 2^64 − 1.
func parseSeed(s string) (uint64, error) {
	seed, err := strconv.ParseUint(strings.TrimSpace(s), 10, 64)
	switch {
	case errors.Is(err, strconv.ErrRange):
		return 0, usagef("--seed %s is larger than the largest seed, %d", s, uint64(math.MaxUint64))
	case err != nil:
		return 0, usagef("--seed %q must be a whole number from 0 to %d", s, uint64(math.MaxUint64))
	}
	return seed, nil
}

func isNumber(s string) bool {
	_, err := strconv.ParseFloat(s, 64)
	return err == nil
}

// commandUsageError turns a flag error of a command into a usage error
// (exit status 2) with a pointer to the help.
func commandUsageError(c *cli.Context, err error, _ bool) error {
	if m := invalidValueRE.FindStringSubmatch(err.Error()); m != nil {
		what := "a whole number"
		for _, f := range c.Command.Flags {
			if _, ok := f.(*cli.StringFlag); ok && slices.Contains(f.Names(), m[2]) {
				what = "a value"
			}
		}
		return usagef("--%s %q must be %s, e.g. %s; see rockheat %s --help", m[2], m[1], what, flagExample(m[2]), c.Command.Name)
	}
	return usagef("%v; see rockheat %s --help", err, c.Command.Name)
}

var invalidValueRE = regexp.MustCompile(`invalid value "([^"]*)" for flag -+([a-z-]+)`)

// load reads a scenario; a file that cannot be read is a usage error.
func load(arg string) (*scenarios.Scenario, error) {
	s, err := scenarios.Load(arg)
	var ps scenarios.Problems
	if err != nil && !errors.As(err, &ps) {
		return nil, usageError{fmt.Errorf("%w (give a scenario file, or the name of a bundled example: rockheat examples lists them)", err)}
	}
	return s, err
}
