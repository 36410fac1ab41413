package main

import (
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"sync"
	"time"

	"github.com/urfave/cli/v2"

	"rockheat"
	"rockheat/report/expect"
	"rockheat/report/outfile"
	"rockheat/scenarios"
)

func regressCommand() *cli.Command {
	return &cli.Command{
		Name:         "regress",
		OnUsageError: commandUsageError,
		Usage:        "re-run scenarios and check their results against the expectations stored beside them",
		ArgsUsage: "DIR|FILE... (folders holding NAME.toml scenarios, or scenario files; each is checked " +
			"against NAME.expect.json beside it)",
		Flags: []cli.Flag{
			&cli.StringFlag{Name: "tolerance", Value: "exact", Usage: "exact (every figure bit for bit, on the same " +
				"version) or stat (every figure within the Monte Carlo error of two independent runs)"},
			&cli.StringFlag{Name: "alpha", Value: "1%", Usage: "with --tolerance stat: the probability that a clean check fails, " +
				"over every figure of every scenario checked, e.g. 1% or 0.01"},
			&cli.BoolFlag{Name: "update", Usage: "rewrite the expectations from new runs and print what moved"},
			&cli.StringFlag{Name: "junit", Usage: "also write a JUnit-style XML report, one test case per scenario, to `FILE`"},
			&cli.IntFlag{Name: "trials", Usage: "with --update: the trials of the expectations written",
				DefaultText: "the old expectation's, else the scenario's"},
			&cli.StringFlag{Name: "seed", Usage: "with --update: the seed of the expectations written",
				DefaultText: "the old expectation's, else the scenario's"},
		},
		Action: regress,
	}
}

// regressConfig holds the flags of a regress command.
type regressConfig struct {
	mode   expect.Mode
	alpha  float64
	update bool
	junit  string
	trials int     // with update: trials to write; 0 keeps them
	seed   *uint64 // with update: seed to write; nil keeps it
}

func regressFlags(c *cli.Context) (*regressConfig, error) {
	cfg := &regressConfig{update: c.Bool("update"), junit: c.String("junit")}
	mode, err := expect.ParseMode(c.String("tolerance"))
	if err != nil {
		return nil, usagef("--tolerance: %v", err)
	}
	cfg.mode = mode
	switch {
	case c.NArg() == 0:
		return nil, usagef("regress takes one or more folders of scenarios or scenario files, e.g. rockheat regress scenarios/")
	case cfg.update && (c.IsSet("tolerance") || c.IsSet("alpha")):
		return nil, usagef("--update writes the expectations and compares nothing; drop --tolerance and --alpha")
	case !cfg.update && (c.IsSet("trials") || c.IsSet("seed")):
		return nil, usagef("--trials and --seed go with --update; a check takes them from the expectation")
	case c.IsSet("alpha") && mode != expect.Statistical:
		return nil, usagef("--alpha goes with --tolerance stat")
	}
	if cfg.alpha, err = parseFraction(c.String("alpha")); err != nil {
		return nil, usagef("--alpha %q must be a percentage or fraction between 0 and 1, e.g. 1%% or 0.01", c.String("alpha"))
	}
	if c.IsSet("trials") {
		if cfg.trials = c.Int("trials"); cfg.trials <= 0 {
			return nil, usagef("--trials %d must be a positive number", cfg.trials)
		}
	}
	if c.IsSet("seed") {
		seed, err := parseSeed(c.String("seed"))
		if err != nil {
			return nil, err
		}
		cfg.seed = &seed
	}
	return cfg, nil
}

func regress(c *cli.Context) error {
	cfg, err := regressFlags(c)
	if err != nil {
		return err
	}
	paths, err := scenarioPaths(c.Args().Slice())
	if err != nil {
		return err
	}
	// The JUnit report is checked before any scenario runs, against the
	// scenarios and their expectations, which it may not replace.
	var set *outfile.Set
	var report *outfile.Target
	if cfg.junit != "" {
		var ins []outfile.Input
		for _, p := range paths {
			ins = append(ins, outfile.Input{Path: p, Role: "a scenario being checked"},
				outfile.Input{Path: expect.Path(p), Role: "the expectation of a scenario being checked"})
		}
		set = outfile.New(c.App.Writer, ins...)
		if report, err = set.Add("--junit", cfg.junit); err != nil {
			return usageError{err}
		}
		defer set.Abort() // after Commit, a no-op
	}
	rockheat.AdviseHugeHeap()
	cases := runCases(paths, cfg)
	var junit []expect.Case
	if cfg.update {
		junit, err = updateCases(c.App.Writer, c.App.ErrWriter, cases)
	} else {
		junit, err = checkCases(c.App.Writer, c.App.ErrWriter, cases, cfg)
	}
	if report != nil {
		werr := report.Write(func(w io.Writer) error { return expect.WriteJUnit(w, "rockheat regress", junit) })
		if werr == nil {
			werr = set.Commit()
		}
		if werr != nil {
			return errors.Join(err, werr)
		}
	}
	return err
}

// scenarioPaths lists the scenario files named by args: each folder's
// .toml files (not those of its sub-folders), and each file, once.
func scenarioPaths(args []string) ([]string, error) {
	var paths []string
	seen := map[string]bool{}
	add := func(p string) {
		if p = filepath.Clean(p); !seen[p] {
			seen[p] = true
			paths = append(paths, p)
		}
	}
	for _, arg := range args {
		fi, err := os.Stat(arg)
		switch {
		case err != nil:
			return nil, usagef("%s: no such scenario file or folder", arg)
		case fi.IsDir():
			entries, err := os.ReadDir(arg)
			if err != nil {
				return nil, usagef("reading the folder %s: %v", arg, err)
			}
			n := 0
			for _, e := range entries {
				if !e.IsDir() && strings.HasSuffix(e.Name(), ".toml") {
					add(filepath.Join(arg, e.Name()))
					n++
				}
			}
			if n == 0 {
				return nil, usagef("the folder %s holds no .toml scenario files", arg)
			}
		case !strings.HasSuffix(arg, ".toml"):
			return nil, usagef("%s is not a .toml scenario file; give scenario files NAME.toml (checked against NAME.expect.json) or folders of them", arg)
		default:
			add(arg)
		}
	}
	return paths, nil
}

// regressCase is one scenario of a regress command.
type regressCase struct {
	path string
	// exp is the stored expectation (nil if there is none, or, with
	// --update, if it could not be read: expErr says why).
	exp    *expect.Expectation
	expErr error
	// got records this run; err says why there is none.
	got     *expect.Expectation
	err     error
	seconds float64
}

// runCases runs every scenario on a small pool, each as rockheat run would
// with the expectation's trials and seed; the results do not depend on
// the pool or on the workers each run uses.
func runCases(paths []string, cfg *regressConfig) []*regressCase {
	cases := make([]*regressCase, len(paths))
	procs := runtime.GOMAXPROCS(0)
	jobs := min(len(paths), procs)
	workers := max(1, procs/max(jobs, 1))
	build := expect.CurrentBuild()
	next := make(chan int)
	var wg sync.WaitGroup
	for range jobs {
		wg.Go(func() {
			for i := range next {
				start := time.Now()
				cases[i] = runCase(paths[i], cfg, workers, build)
				cases[i].seconds = time.Since(start).Seconds()
			}
		})
	}
	for i := range paths {
		next <- i
	}
	close(next)
	wg.Wait()
	return cases
}

// runCase reads the scenario at path and its expectation, and runs it.
func runCase(path string, cfg *regressConfig, workers int, build expect.BuildInfo) *regressCase {
	rc := &regressCase{path: path}
	s, err := scenarios.LoadFile(path)
	if err != nil {
		var ps scenarios.Problems
		if errors.As(err, &ps) {
			err = fmt.Errorf("the scenario has %d problem(s):\n%w", len(ps), ps)
		}
		rc.err = err
		return rc
	}
	expPath := expect.Path(path)
	exp, err := expect.ReadFile(expPath)
	switch {
	case errors.Is(err, fs.ErrNotExist) && !cfg.update:
		rc.err = fmt.Errorf("no expectation %s beside it; write one with rockheat regress --update %s", filepath.Base(expPath), path)
		return rc
	case errors.Is(err, fs.ErrNotExist):
	case err != nil && !cfg.update:
		rc.err = fmt.Errorf("reading the expectation %v; correct it, or rewrite it with rockheat regress --update %s", err, path)
		return rc
	case err != nil:
		rc.expErr = err
	default:
		rc.exp = exp
	}
	trials, seed := s.Run.Trials, s.Run.Seed
	if rc.exp != nil {
		trials, seed = rc.exp.Trials, rc.exp.Seed
	}
	if cfg.trials > 0 {
		trials = cfg.trials
	}
	if cfg.seed != nil {
		seed = *cfg.seed
	}
	res, err := rockheat.Estimate(&s.Run, rockheat.Options{Trials: trials, Seed: &seed, Workers: workers})
	if err != nil {
		rc.err = fmt.Errorf("running it with %d trials, seed %d: %w", trials, seed, err)
		return rc
	}
	rc.got = expect.New(res, filepath.Base(path), s.Source, build)
	return rc
}

// errorCase reports a scenario that could not be checked on stderr and as
// a JUnit case.
func errorCase(stderr io.Writer, rc *regressCase) expect.Case {
	fmt.Fprintf(stderr, "%s: %v\n", rc.path, rc.err)
	msg, _, _ := strings.Cut(rc.err.Error(), "\n")
	return expect.Case{Name: rc.path, Seconds: rc.seconds, Error: msg, Detail: rc.err.Error()}
}
