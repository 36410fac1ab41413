package main

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"strings"

	"rockheat/report/expect"
)

// checkCases compares every case with its expectation, prints what
// drifted and a summary, and returns the JUnit cases and the error that
// sets the exit status: 1 when a scenario drifted or changed, 2 when one
// could not be checked.
func checkCases(stdout, stderr io.Writer, cases []*regressCase, cfg *regressConfig) ([]expect.Case, error) {
	tol, family := tolerance(cases, cfg)
	var rows []expect.Row
	var junit []expect.Case
	var held, drifted, changed, failed int
	for _, rc := range cases {
		if rc.err != nil {
			failed++
			junit = append(junit, errorCase(stderr, rc))
			continue
		}
		drifts := expect.Drifts(expect.Compare(rc.exp, rc.got, tol))
		var notes []string
		if rc.exp.ScenarioSHA256 != rc.got.ScenarioSHA256 {
			changed++
			notes = append(notes, fmt.Sprintf("scenario changed since the expectation was written (SHA-256 %.12s…, the expectation's %.12s…); "+
				"review the change, then rewrite the expectation with rockheat regress --update %s", rc.got.ScenarioSHA256, rc.exp.ScenarioSHA256, rc.path))
		} else if len(drifts) > 0 {
			drifted++
		}
		if len(drifts) > 0 {
			notes = append(notes, fmt.Sprintf("results drifted: %d figure(s) outside what --tolerance %s allows", len(drifts), cfg.mode))
			if cfg.mode == expect.Exact && rc.exp.WrittenBy != rc.got.WrittenBy {
				notes = append(notes, fmt.Sprintf("the expectation was written by %s, this is %s; exact mode reproduces figures on one version and "+
					"platform only: --tolerance stat compares across them", rc.exp.WrittenBy, rc.got.WrittenBy))
			}
		}
		for _, n := range notes {
			fmt.Fprintf(stdout, "%s: %s\n", rc.path, n)
		}
		jc := expect.Case{Name: rc.path, Seconds: rc.seconds}
		if len(notes) == 0 {
			held++
		} else {
			var table bytes.Buffer
			var own []expect.Row
			for _, d := range drifts {
				own = append(own, expect.Row{Scenario: rc.path, Check: d})
			}
			rows = append(rows, own...)
			expect.WriteDrifts(&table, own)
			jc.Failure = notes[0]
			jc.Detail = strings.Join(notes, "\n") + "\n\n" + table.String()
		}
		junit = append(junit, jc)
	}
	if len(rows) > 0 {
		fmt.Fprintln(stdout)
		expect.WriteDrifts(stdout, rows)
		fmt.Fprintln(stdout)
	}
	fmt.Fprintf(stdout, "regress: %d scenario(s), %s: %d held, %d drifted, %d changed, %d could not be checked\n",
		len(cases), family, held, drifted, changed, failed)
	switch {
	case failed > 0:
		return junit, usageError{fmt.Errorf("%d of %d scenario(s) could not be checked", failed, len(cases))}
	case drifted+changed > 0:
		return junit, errors.New("results did not hold; see the table above")
	}
	return junit, nil
}

// tolerance returns the tolerance of a check of cases and a description of
// it: for Statistical, every figure of every case is tested at the
// Bonferroni level of cfg.alpha over all of them.
func tolerance(cases []*regressCase, cfg *regressConfig) (expect.Tolerance, string) {
	if cfg.mode == expect.Exact {
		return expect.Tolerance{Mode: expect.Exact}, "exact"
	}
	m := 0
	for _, rc := range cases {
		if rc.err == nil {
			m += expect.StatFigures(rc.exp)
		}
	}
	z := expect.BonferroniZ(cfg.alpha, max(m, 1))
	return expect.Tolerance{Mode: expect.Statistical, Z: z},
		fmt.Sprintf("stat (%d figures, family-wise false-alarm level %g %%, z = %.3f)", m, 100*cfg.alpha, z)
}

// updateCases writes the expectation of every case that ran, says what
// moved, and returns the JUnit cases and the error that sets the exit
// status: 2 when a scenario could not be run or written.
func updateCases(stdout, stderr io.Writer, cases []*regressCase) ([]expect.Case, error) {
	var junit []expect.Case
	var created, rewritten, same, failed int
	for _, rc := range cases {
		if rc.err == nil {
			rc.err = updateCase(stdout, rc, &created, &rewritten, &same)
		}
		if rc.err != nil {
			failed++
			junit = append(junit, errorCase(stderr, rc))
			continue
		}
		junit = append(junit, expect.Case{Name: rc.path, Seconds: rc.seconds})
	}
	fmt.Fprintf(stdout, "regress --update: %d scenario(s): %d new, %d rewritten, %d unchanged, %d could not be run\n",
		len(cases), created, rewritten, same, failed)
	if failed > 0 {
		return junit, usageError{fmt.Errorf("%d of %d scenario(s) could not be run", failed, len(cases))}
	}
	return junit, nil
}

// updateCase writes the expectation of one case unless it records the same
// as the stored one, and prints what moved.
func updateCase(stdout io.Writer, rc *regressCase, created, rewritten, same *int) error {
	path := expect.Path(rc.path)
	old, got := rc.exp, rc.got
	if old != nil && old.SameRecord(got) {
		*same++
		fmt.Fprintf(stdout, "%s: expectation unchanged\n", rc.path)
		return nil
	}
	if err := expect.WriteFile(path, got); err != nil {
		return err
	}
	if old == nil {
		*created++
		what := "new"
		if rc.expErr != nil {
			what = "replaces an unreadable one: " + rc.expErr.Error()
		}
		fmt.Fprintf(stdout, "%s: wrote %s (%s; %d trials, seed %d)\n", rc.path, path, what, got.Trials, got.Seed)
		return nil
	}
	*rewritten++
	moves := expect.Moves(old, got)
	fmt.Fprintf(stdout, "%s: rewrote %s (%d trials, seed %d): %d figure(s) moved", rc.path, path, got.Trials, got.Seed, len(moves))
	if old.ScenarioSHA256 != got.ScenarioSHA256 {
		fmt.Fprint(stdout, "; the scenario changed")
	}
	if old.Trials != got.Trials || old.Seed != got.Seed {
		fmt.Fprintf(stdout, "; was %d trials, seed %d", old.Trials, old.Seed)
	}
	fmt.Fprintln(stdout)
	if len(moves) > 0 {
		return expect.WriteMoves(stdout, "  ", moves)
	}
	return nil
}
