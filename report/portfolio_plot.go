package report

import (
	"fmt"
	"io"
	"math"
	"sort"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"rockheat"
)

// portfolioNote is the footnote of a portfolio chart: what the run was.
func portfolioNote(r *rockheat.PortfolioResult) string {
	return fmt.Sprintf("%d prospects, %s", len(r.Prospects), trialsText(r.Trials, r.Sampling, r.Seed))
}

// PortfolioExceedanceSVG writes, as an SVG document, the exceedance curves
// of a portfolio's unrisked and risked total electric capacity on one
// chart, with the target capacity marked when the portfolio has one.
func PortfolioExceedanceSVG(w io.Writer, r *rockheat.PortfolioResult) error {
	ch, err := portfolioExceedanceChart(r)
	if err != nil {
		return err
	}
	return ch.writeSVG(w)
}

func portfolioExceedanceChart(r *rockheat.PortfolioResult) (chart, error) {
	const power = rockheat.PortfolioPower
	unr, risk := r.Unrisked[power], r.Risked[power]
	unit := unr.Spec.Unit
	p := newPlot(chartTitle(r.Title, "Probability of exceeding: total electric capacity"))
	p.X.Label.Text = "total electric capacity, net of shares, " + unit
	p.X.Tick.Marker = niceTicks{7}
	p.Y.Label.Text = "probability of exceeding (%)"
	var ticks []plot.Tick
	for y := 0; y <= 100; y += 10 {
		ticks = append(ticks, plot.Tick{Value: float64(y), Label: fmt.Sprint(y)})
	}
	p.Y.Tick.Marker = plot.ConstantTicks(ticks)
	p.Y.Min, p.Y.Max = 0, 100
	p.Add(grid(true, true))
	lo, hi := math.Inf(1), math.Inf(-1)
	var legend []swatch
	for _, c := range []struct {
		out  rockheat.Output
		name string
		dash bool
	}{{unr, "unrisked (every prospect succeeds)", false}, {risk, "risked (each prospect by its chance of success)", true}} {
		pts, err := curvePoints(c.out.Curve, 1)
		if err != nil {
			return chart{}, fmt.Errorf("the %s total %w", c.name, err)
		}
		l, err := plotter.NewLine(pts)
		if err != nil {
			return chart{}, err
		}
		l.Width = vg.Points(2)
		l.Color = curveColor
		if c.dash {
			l.Color = pctColor
			l.Dashes = []vg.Length{vg.Points(5), vg.Points(3)}
		}
		p.Add(l)
		legend = append(legend, swatch{l.Color, c.name})
		lo, hi = math.Min(lo, pts[0].X), math.Max(hi, pts[len(pts)-1].X) // the curve runs from the minimum to the maximum
	}
	var marks []mark
	caption := []string{"Totals add the prospects trial by trial; a risked total counts a failed prospect as zero."}
	if t := r.Target; t != nil {
		lo, hi = math.Min(lo, t.MWe), math.Max(hi, t.MWe)
		marks = append(marks, mark{x: t.MWe, y: 100 * t.Probability, label: fmt.Sprintf("target %g %s: reached in %.1f%% of trials (risked)", t.MWe, unit, 100*t.Probability),
			color: meanColor, glyph: draw.BoxGlyph{}, full: true})
	}
	p.X.Min, p.X.Max = padRange(lo, hi, 0.03)
	if len(marks) > 0 {
		p.Add(&markers{marks: marks})
	}
	return chart{p, 7 * vg.Inch, 4.6 * vg.Inch, footerHeight(len(caption), true), footer(portfolioNote(r), caption, legend)}, nil
}

// PortfolioContributionSVG writes, as an SVG document, a bar chart of each
// prospect's contribution to the risked mean total electric capacity (its
// chance × share × mean), largest on top.
func PortfolioContributionSVG(w io.Writer, r *rockheat.PortfolioResult) error {
	ch, err := portfolioContributionChart(r)
	if err != nil {
		return err
	}
	return ch.writeSVG(w)
}

func portfolioContributionChart(r *rockheat.PortfolioResult) (chart, error) {
	const power = rockheat.PortfolioPower
	type bar struct {
		name string
		v    float64
	}
	var bars []bar
	for _, pr := range r.Prospects {
		bars = append(bars, bar{pr.Name, pr.RiskedMean[power]})
	}
	sort.SliceStable(bars, func(i, j int) bool { return bars[i].v > bars[j].v })
	n := len(bars)
	names := make([]string, n)
	vals := make(plotter.Values, n)
	top := 0.0
	for i, b := range bars {
		names[n-1-i], vals[n-1-i] = b.name, b.v
		top = math.Max(top, b.v)
	}
	unit := r.Risked[power].Spec.Unit
	p := newPlot(chartTitle(r.Title, "Contributions to the risked mean electric capacity"))
	p.X.Label.Text = "risked mean electric capacity, net of share, " + unit
	p.X.Tick.Marker = niceTicks{6}
	p.Add(grid(true, false))
	hb, err := plotter.NewBarChart(vals, vg.Points(16))
	if err != nil {
		return chart{}, err
	}
	hb.Horizontal = true
	hb.Color, hb.LineStyle.Width = lowColor, 0
	p.Add(hb)
	p.NominalY(names...)
	p.X.Min, p.X.Max = 0, math.Max(top*1.12, 1e-9)
	caption := []string{fmt.Sprintf("Each bar: chance of success × share × mean electric capacity; together %s %s, the risked total's mean.", fig(r.Risked[power].Summary.Mean), unit)}
	height := vg.Length(1.6+0.35*float64(n)) * vg.Inch
	return chart{p, 7 * vg.Inch, height, footerHeight(len(caption), false), footer(portfolioNote(r), caption, nil)}, nil
}
