package report

import (
	"encoding/csv"
	"io"
	"strconv"

	"rockheat"
	"rockheat/stats"
)

func num(x float64) string { return strconv.FormatFloat(x, 'g', 10, 64) }

// CSV writes the summary figures of r as a flat table, one row per output:
// output, unit, p90, p50, p10, mean, sd, min, max, the confidence level
// asked (ci_level), the interval bounds of each percentile (empty where the
// run is too short to give one at that level) and the coverage each
// interval achieves.
func CSV(w io.Writer, r *rockheat.Result) error {
	cw := csv.NewWriter(w)
	cw.Write([]string{"output", "unit", "p90", "p50", "p10", "mean", "sd", "min", "max",
		"ci_level", "p90_lo", "p90_hi", "p50_lo", "p50_hi", "p10_lo", "p10_hi",
		"p90_coverage", "p50_coverage", "p10_coverage"})
	for _, o := range r.Outputs {
		s := o.Summary
		row := []string{o.Spec.Name, o.Spec.Unit, num(s.P90), num(s.P50), num(s.P10), num(s.Mean), num(finiteOr0(s.SD)), num(s.Min), num(s.Max),
			num(r.Confidence)}
		for _, iv := range []stats.Interval{s.P90CI, s.P50CI, s.P10CI} {
			if iv.OK() {
				row = append(row, num(iv.Lo), num(iv.Hi))
			} else {
				row = append(row, "", "")
			}
		}
		cw.Write(append(row, num(s.P90CI.Coverage), num(s.P50CI.Coverage), num(s.P10CI.Coverage)))
	}
	cw.Flush()
	return cw.Error()
}

// SamplesCSV writes every trial of s, one row a trial, with a header of
// the input keys and output names.
func SamplesCSV(w io.Writer, s *rockheat.Samples) error {
	cw := csv.NewWriter(w)
	if err := cw.Write(append([]string{"trial"}, s.Names...)); err != nil {
		return err
	}
	n := 0
	for _, c := range s.Columns {
		if c != nil {
			n = len(c)
			break
		}
	}
	row := make([]string, len(s.Names)+1)
	for i := 0; i < n; i++ {
		row[0] = strconv.Itoa(i + 1)
		for j := range s.Names {
			row[j+1] = strconv.FormatFloat(s.Value(j, i), 'g', -1, 64)
		}
		if err := cw.Write(row); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}
