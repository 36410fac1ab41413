package main

import (
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"

	"github.com/urfave/cli/v2"

	"rockheat"
	"rockheat/heatmodel"
	"rockheat/report"
	"rockheat/report/outfile"
)

// trialFlags are the flags that set how a run's trials are drawn, shared
// by run and portfolio.
func trialFlags() []cli.Flag {
	return []cli.Flag{
		&cli.IntFlag{Name: "trials", Usage: "number of trials (overrides the file's [run] trials); with --precision, the first round",
			DefaultText: fmt.Sprintf("from the file, else %d", rockheat.DefaultTrials)},
		&cli.StringFlag{Name: "seed", Usage: "random seed, a whole number from 0 to 18446744073709551615 (overrides the file's [run] seed)",
			DefaultText: "from the file, else 1"},
		&cli.IntFlag{Name: "workers", Usage: "goroutines to use; the results do not depend on it", DefaultText: "one per CPU"},
	}
}

// outputFlags are the flags that say where a report goes.
func outputFlags(charts string) []cli.Flag {
	return []cli.Flag{
		&cli.StringFlag{Name: "format", Value: "text", Usage: "output format: text, json, csv or html (a self-contained page with charts)"},
		&cli.StringFlag{Name: "out", Usage: "write the report to `FILE` (whole, via a temporary file; - is standard output)",
			DefaultText: "standard output"},
		&cli.StringFlag{Name: "plots", Usage: "also write SVG charts (" + charts + ") into `DIR` (created if missing)"},
		&cli.StringFlag{Name: "samples", Usage: "also write every trial's inputs and outputs to this CSV `FILE` (- is standard output)"},
	}
}

// trialOptions reads the trial flags of c.
func trialOptions(c *cli.Context) (rockheat.Options, error) {
	opt := rockheat.Options{Workers: c.Int("workers"), KeepSamples: c.String("samples") != ""}
	if c.IsSet("trials") {
		if c.Int("trials") <= 0 {
			return opt, usagef("--trials %d must be a positive number of trials, e.g. --trials 100000", c.Int("trials"))
		}
		opt.Trials = c.Int("trials")
	}
	if c.IsSet("workers") && c.Int("workers") <= 0 {
		return opt, usagef("--workers %d must be at least 1", c.Int("workers"))
	}
	if c.IsSet("seed") {
		seed, err := parseSeed(c.String("seed"))
		if err != nil {
			return opt, err
		}
		opt.Seed = &seed
	}
	return opt, nil
}

var runFormats = map[string]func(io.Writer, *rockheat.Result) error{
	"text": report.Text, "json": report.JSON, "csv": report.CSV, "html": report.HTML,
}

func runCommand() *cli.Command {
	flags := append(outputFlags("exceedance curves, tornado charts, hot-rock decline"), trialFlags()...)
	flags = append(flags,
		&cli.StringFlag{Name: "precision", Usage: "run round after round (each doubling the trials, the first of --trials) until every P90/P50/P10 is known to this relative `FRACTION` (95% interval half-width), e.g. 0.5% or 0.005"},
		&cli.IntFlag{Name: "max-trials", Usage: "trial cap for --precision, at least the first round", DefaultText: strconv.Itoa(rockheat.DefaultMaxTrials)},
		&cli.BoolFlag{Name: "compare-declines", Usage: "for a hot-rock scenario with decline = \"fractures\": also run the exponential decline on the same draws, and show both"},
	)
	return &cli.Command{
		Name:         "run",
		OnUsageError: commandUsageError,
		Usage:        "run a scenario and print its P90/P50/P10 summary",
		ArgsUsage:    "SCENARIO (a .toml file, or the name of a bundled example such as demo)",
		Flags:        flags,
		Action: func(c *cli.Context) error {
			if c.NArg() != 1 {
				return usagef("run takes one scenario, got %d; e.g. rockheat run demo", c.NArg())
			}
			render, ok := runFormats[c.String("format")]
			if !ok {
				return usagef("--format %q is not text, json, csv or html", c.String("format"))
			}
			opt, err := trialOptions(c)
			if err != nil {
				return err
			}
			if err := precisionOptions(c, &opt); err != nil {
				return err
			}
			// The heap is advised (a page fault for 2 MB of the run's
			// memory, not 4 kB) while the scenario is read: its collection
			// takes a few milliseconds that the other core can spend.
			advised := make(chan struct{})
			go func() { rockheat.AdviseHugeHeap(); close(advised) }()
			s, err := load(c.Args().First())
			if err != nil {
				return err
			}
			outs, err := planOutputs(c, runInputs(c.Args().First()))
			if err != nil {
				return err
			}
			defer outs.close()
			prog := newProgress(c.App.ErrWriter)
			if prog != nil {
				opt.Progress = prog.update
			}
			<-advised
			estimate := rockheat.Estimate
			if c.Bool("compare-declines") {
				estimate = rockheat.CompareDeclines
			}
			res, err := estimate(&s.Run, opt)
			prog.clear()
			if err != nil {
				return flagError(err)
			}
			return outs.write(res.Samples, func(dir *outfile.Folder) error { return writePlots(dir, res) },
				func(w io.Writer) error { return render(w, res) })
		},
	}
}

// precisionOptions reads --precision and --max-trials.
func precisionOptions(c *cli.Context, opt *rockheat.Options) error {
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
	return nil
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
// tornado chart of every output, and the decline of a hot-rock run. Their
// names match chartPatterns.
func writePlots(dir *outfile.Folder, res *rockheat.Result) error {
	for _, o := range res.Outputs {
		name := o.Spec.Name
		if err := writeChart(dir, "exceedance-"+name+".svg", func(w io.Writer) error {
			return report.ExceedanceSVG(w, res, name)
		}); err != nil {
			return err
		}
		if report.HasTornado(res, name) { // an output no sampled input moves has none
			if err := writeChart(dir, "tornado-"+name+".svg", func(w io.Writer) error {
				return report.TornadoSVG(w, res, name)
			}); err != nil {
				return err
			}
		}
	}
	if res.Kind == heatmodel.KindHotRock {
		return writeChart(dir, "decline.svg", func(w io.Writer) error { return report.DeclineSVG(w, res) })
	}
	return nil
}
