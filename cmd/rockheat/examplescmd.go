package main

import (
	"fmt"

	"github.com/urfave/cli/v2"

	"rockheat/scenarios"
)

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
				fmt.Fprintln(c.App.Writer, "\nPortfolios:")
				for _, name := range scenarios.BundledPortfolios() {
					fmt.Fprintf(c.App.Writer, "%-16s rockheat portfolio %s\n", name, name)
				}
				fmt.Fprintln(c.App.Writer, "\nrockheat examples NAME > my-prospect.toml   copies one to edit; rockheat run NAME (or portfolio NAME) runs it.")
				return nil
			case 1:
				if text, err := scenarios.PortfolioText(c.Args().First()); err == nil {
					_, err = c.App.Writer.Write(text)
					return err
				}
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
