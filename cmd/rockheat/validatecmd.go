package main

import (
	"errors"
	"fmt"
	"strings"

	"github.com/urfave/cli/v2"

	"rockheat/scenarios"
)

func validateCommand() *cli.Command {
	return &cli.Command{
		Name:         "validate",
		OnUsageError: commandUsageError,
		Usage:        "check scenario files and report every problem of every file, without running",
		ArgsUsage:    "SCENARIO...",
		Action: func(c *cli.Context) error {
			if c.NArg() == 0 {
				return usagef("validate takes one or more scenario files, e.g. rockheat validate my-prospect.toml")
			}
			var all scenarios.Problems
			var unread []string
			for _, arg := range c.Args().Slice() {
				s, err := load(arg)
				var ps scenarios.Problems
				switch {
				case errors.As(err, &ps):
					all = append(all, ps...)
				case err != nil:
					unread = append(unread, err.Error())
				default:
					fmt.Fprintf(c.App.Writer, "%s: ok (%s, %d inputs, %d trials)\n", s.Path, s.Run.Model.Kind(), s.InputCount(), s.Run.Trials)
					for _, w := range s.Warnings {
						fmt.Fprintf(c.App.Writer, "  warning: %v\n", w)
					}
				}
			}
			// Every file's problems, then the files that could not be read.
			switch {
			case len(all) > 0 && len(unread) > 0:
				return fmt.Errorf("%d problem(s):\n%w\n%s", len(all), all, strings.Join(unread, "\n"))
			case len(all) > 0:
				return fmt.Errorf("%d problem(s):\n%w", len(all), all)
			case len(unread) > 0:
				return usageError{errors.New(strings.Join(unread, "\n"))}
			}
			return nil
		},
	}
}
