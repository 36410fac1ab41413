// Command rockheat estimates the heat in place and the power capacity of a
// geothermal prospect from a scenario file of uncertain inputs, by Monte
// Carlo or Latin hypercube sampling, and reports P90/P50/P10 figures.
//
// Usage:
//
//	rockheat run SCENARIO [--format text|json|csv|html] [--out FILE] [--plots DIR] [--samples FILE]
//	                      [--trials N] [--seed S] [--workers W] [--precision FRACTION] [--max-trials N]
//	                      [--compare-declines]
//	rockheat portfolio PORTFOLIO [--target MWE] [--format text|json|csv|html] [--out FILE] [--plots DIR]
//	                      [--samples FILE] [--trials N] [--seed S] [--workers W]
//	rockheat validate SCENARIO...
//	rockheat examples [NAME]
//	rockheat regress DIR|FILE... [--tolerance exact|stat] [--alpha FRACTION] [--junit FILE]
//	                      [--update] [--trials N] [--seed S]
//	rockheat help [COMMAND]
//	rockheat --version
//
// SCENARIO is a TOML file or the name of a bundled example; PORTFOLIO a
// portfolio file or the name of a bundled portfolio. - as an output file
// means standard output. Exit status is 0 on success, 1 when a run fails,
// 2 for bad usage or a bad scenario, 130 or 143 when interrupted.
package main

import (
	"fmt"
	"os"
	"runtime/debug"
)

func main() {
	// The heap is almost all pointer-free columns of numbers, so a
	// collection costs little to mark: collect at half the live heap
	// rather than all of it, for a lower peak (the hot-rock demo at 10^6
	// trials: 88 → 77 MB, no slower). GOGC, if set, is the user's choice.
	if os.Getenv("GOGC") == "" {
		debug.SetGCPercent(50)
	}
	err := run(os.Stdout, os.Stderr, os.Args)
	if err != nil {
		fmt.Fprintln(os.Stderr, "rockheat:", err)
	}
	os.Exit(exitCode(err))
}
