package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"strconv"

	"github.com/urfave/cli/v2"

	"rockheat"
	"rockheat/report"
	"rockheat/report/outfile"
	"rockheat/scenarios"
)

var portfolioFormats = map[string]func(io.Writer, *rockheat.PortfolioResult) error{
	"text": report.PortfolioText, "json": report.PortfolioJSON, "csv": report.PortfolioCSV, "html": report.PortfolioHTML,
}

func portfolioCommand() *cli.Command {
	flags := append(outputFlags("the totals' exceedance curves with the target, the prospects' contributions"), trialFlags()...)
	flags = append(flags, &cli.StringFlag{Name: "target", Usage: "target total electric capacity, `MWE`: the report gives the chance that the risked total reaches it (overrides [run] target_mwe)"})
	return &cli.Command{
		Name:         "portfolio",
		OnUsageError: commandUsageError,
		Usage:        "run several prospects together and report unrisked and risked totals",
		ArgsUsage:    "PORTFOLIO (a .toml file, or the name of a bundled portfolio such as licence-demo)",
		Flags:        flags,
		Action: func(c *cli.Context) error {
			if c.NArg() != 1 {
				return usagef("portfolio takes one portfolio file, got %d; e.g. rockheat portfolio licence-demo", c.NArg())
			}
			render, ok := portfolioFormats[c.String("format")]
			if !ok {
				return usagef("--format %q is not text, json, csv or html", c.String("format"))
			}
			opt, err := trialOptions(c)
			if err != nil {
				return err
			}
			pf, err := loadPortfolio(c.Args().First())
			if err != nil {
				return err
			}
			if c.IsSet("target") {
				t, err := strconv.ParseFloat(c.String("target"), 64)
				if err != nil || !(t >= 0) {
					return usagef("--target %q must be a capacity ≥ 0 in MWe, e.g. --target 120", c.String("target"))
				}
				pf.Portfolio.TargetMWe = t
			}
			outs, err := planOutputs(c, portfolioInputs(c.Args().First(), pf))
			if err != nil {
				return err
			}
			defer outs.close()
			rockheat.AdviseHugeHeap()
			res, err := rockheat.EstimatePortfolio(&pf.Portfolio, opt)
			if err != nil {
				return flagError(err)
			}
			return outs.write(res.Samples, func(dir *outfile.Folder) error { return writePortfolioPlots(dir, res) },
				func(w io.Writer) error { return render(w, res) })
		},
	}
}

// writePortfolioPlots writes the charts of a portfolio run into dir.
func writePortfolioPlots(dir *outfile.Folder, res *rockheat.PortfolioResult) error {
	if err := writeChart(dir, "portfolio-exceedance.svg", func(w io.Writer) error { return report.PortfolioExceedanceSVG(w, res) }); err != nil {
		return err
	}
	return writeChart(dir, "portfolio-contributions.svg", func(w io.Writer) error { return report.PortfolioContributionSVG(w, res) })
}

// loadPortfolio reads a portfolio; a file that cannot be read is a usage
// error.
func loadPortfolio(arg string) (*scenarios.PortfolioFile, error) {
	pf, err := scenarios.LoadPortfolio(arg)
	var ps scenarios.Problems
	if err != nil && !errors.As(err, &ps) {
		return nil, usageError{fmt.Errorf("%w (give a portfolio file, or the name of a bundled portfolio: rockheat examples lists them)", err)}
	}
	return pf, err
}

// portfolioInputs lists the files a portfolio run reads: the portfolio
// file and its prospects' scenario files.
func portfolioInputs(arg string, pf *scenarios.PortfolioFile) []outfile.Input {
	var ins []outfile.Input
	if fi, err := os.Stat(arg); err == nil && !fi.IsDir() {
		ins = append(ins, outfile.Input{Path: arg, Role: "the portfolio being run"})
	}
	for _, s := range pf.Scenarios {
		if fi, err := os.Stat(s.Path); err == nil && !fi.IsDir() {
			ins = append(ins, outfile.Input{Path: s.Path, Role: "a scenario of the portfolio"})
		}
	}
	return ins
}
