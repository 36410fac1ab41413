package expect

import (
	"fmt"
	"io"
	"math"
	"text/tabwriter"
)

// WriteDrifts writes the checks that did not hold as a table of scenario,
// figure, expected, got and allowed, under a heading line.
func WriteDrifts(w io.Writer, rows []Row) error {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "scenario\tfigure\texpected\tgot\tallowed")
	for _, r := range rows {
		fmt.Fprintf(tw, "%s\t%s\t%s\t%s\t%s\n", r.Scenario, r.Figure, orMissing(r.Expected), orMissing(r.Got), r.Allowed())
	}
	return tw.Flush()
}

// Row is a check of one scenario, for WriteDrifts.
type Row struct {
	Scenario string
	Check
}

// WriteMoves writes the figures that moved as a table of figure, old, new
// and relative change, each line indented by indent.
func WriteMoves(w io.Writer, indent string, ms []Move) error {
	tw := tabwriter.NewWriter(w, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "%sfigure\told\tnew\tchange\n", indent)
	for _, m := range ms {
		change := "—"
		if !math.IsNaN(m.Rel) {
			change = fmt.Sprintf("%+.3g %%", 100*m.Rel)
		}
		fmt.Fprintf(tw, "%s%s\t%s\t%s\t%s\n", indent, m.Figure, orMissing(m.Old), orMissing(m.New), change)
	}
	return tw.Flush()
}
