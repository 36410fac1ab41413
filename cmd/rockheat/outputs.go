package main

import (
	"fmt"
	"io"
	"os"
	"os/signal"
	"sync"
	"syscall"

	"github.com/urfave/cli/v2"

	"rockheat"
	"rockheat/report"
	"rockheat/report/outfile"
)

// chartPatterns match the names writePlots and writePortfolioPlots give
// their charts; no other output may have one of them in the --plots
// folder.
var chartPatterns = []string{"exceedance-*.svg", "tornado-*.svg", "decline.svg", "portfolio-*.svg"}

// outputs are the files and standard output a run writes, checked before
// the run starts and written all or nothing after it.
type outputs struct {
	set     *outfile.Set
	report  *outfile.Target
	samples *outfile.Target // nil without --samples
	plots   *outfile.Folder // nil without --plots
	stop    func()          // ends the interrupt handling
}

// runInputs lists the files a run of the scenario arg reads: the
// scenario file, unless arg names a bundled example (the rule of
// scenarios.Load).
func runInputs(arg string) []outfile.Input {
	if fi, err := os.Stat(arg); err == nil && !fi.IsDir() {
		return []outfile.Input{{Path: arg, Role: "the scenario being run"}}
	}
	return nil
}

// planOutputs checks the --out, --samples and --plots paths of c against
// the run's inputs and one another; a path that cannot be written is a
// usage error. From then until close, an interrupt removes what the run
// has written and exits.
func planOutputs(c *cli.Context, inputs []outfile.Input) (*outputs, error) {
	o := &outputs{set: outfile.New(c.App.Writer, inputs...)}
	out := c.String("out")
	if out == "" {
		out = outfile.Stdout
	}
	var err error
	if o.report, err = o.set.Add("--out", out); err != nil {
		return nil, usageError{err}
	}
	if path := c.String("samples"); path != "" {
		if o.samples, err = o.set.Add("--samples", path); err != nil {
			return nil, usageError{err}
		}
	}
	if dir := c.String("plots"); dir != "" {
		if o.plots, err = o.set.AddFolder("--plots", dir, chartPatterns...); err != nil {
			return nil, usageError{err}
		}
	}
	o.stop = onInterrupt(o.set, c.App.ErrWriter)
	return o, nil
}

// write writes every output of a run, all or nothing: its kept trials
// (samples, nil unless --samples asked for them), its charts (plots) and
// its report (render).
func (o *outputs) write(samples *rockheat.Samples, plots func(*outfile.Folder) error, render func(io.Writer) error) error {
	return o.commit(func() error {
		if o.samples != nil {
			if err := o.samples.Write(func(w io.Writer) error { return report.SamplesCSV(w, samples) }); err != nil {
				return err
			}
		}
		if o.plots != nil {
			if err := plots(o.plots); err != nil {
				return err
			}
		}
		return o.report.Write(render)
	})
}

// commit runs each, which writes the outputs, and puts them in place if
// it succeeds, or takes them all back if not.
func (o *outputs) commit(each func() error) error {
	if err := each(); err != nil {
		o.set.Abort()
		return err
	}
	return o.set.Commit()
}

// close takes back anything written but not committed, and ends the
// interrupt handling.
func (o *outputs) close() {
	o.set.Abort()
	o.stop()
}

// writeChart writes the chart called name into dir.
func writeChart(dir *outfile.Folder, name string, write func(io.Writer) error) error {
	t, err := dir.Add(name)
	if err != nil {
		return err
	}
	return t.Write(write)
}

// onInterrupt handles SIGINT and SIGTERM until stop is called: it takes
// back set (temporary files, files already put in place, a folder the
// run created) and exits with status 128 + the signal's number (130 for
// SIGINT, 143 for SIGTERM), as shells report a process the signal ended.
//
// Once a signal is caught, stop does not return: the handler ends the
// process with the signal's status, which the run's own error (its
// outputs, aborted under it, fail) must not forestall with another.
func onInterrupt(set *outfile.Set, stderr io.Writer) (stop func()) {
	sigs := make(chan os.Signal, 1)
	var mu sync.Mutex // held by the handler from the signal to the exit
	stopped := false
	signal.Notify(sigs, os.Interrupt, syscall.SIGTERM)
	go func() {
		sig, ok := <-sigs
		mu.Lock()
		if !ok || stopped {
			mu.Unlock()
			return
		}
		err := set.Abort()
		fmt.Fprintf(stderr, "\nrockheat: stopped by %v; the files this run had begun are removed and existing files are as they were\n", sig)
		if err != nil {
			fmt.Fprintln(stderr, "rockheat:", err)
		}
		os.Exit(128 + int(sig.(syscall.Signal)))
	}()
	return func() {
		mu.Lock() // blocks for good once the handler has a signal: it exits the process
		stopped = true
		mu.Unlock()
		signal.Stop(sigs)
		close(sigs)
	}
}
