package report

import (
	"fmt"
	"io"
	"sort"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"rockheat"
)

// ExceedanceSVG writes, as an SVG document, the exceedance curve of the
// output of r named output: the probability (%) that the output exceeds
// each value, read from Output.Curve (point k is exceeded with probability
// 1 − k/100), with the P90, P50 and P10 marked and labelled, and the mean.
// Energies are drawn in EJ, PJ or TJ as their magnitude suits, other
// outputs in their report unit. It returns an error naming the outputs
// there are when r has none named output, and an error when the output
// has no finite curve.
func ExceedanceSVG(w io.Writer, r *rockheat.Result, output string) error {
	ch, err := exceedanceChart(r, output)
	if err != nil {
		return err
	}
	return ch.writeSVG(w)
}

func exceedanceChart(r *rockheat.Result, output string) (chart, error) {
	o, err := findOutput(r, output)
	if err != nil {
		return chart{}, err
	}
	if len(o.Curve) != rockheat.CurvePoints {
		return chart{}, fmt.Errorf("output %q has %d curve points, not %d: the result is incomplete; run the scenario again", output, len(o.Curve), rockheat.CurvePoints)
	}
	long, short, scale := outputUnit(r, o)
	s := o.Summary
	pts, err := curvePoints(o.Curve, scale)
	if err != nil {
		return chart{}, fmt.Errorf("output %q %w; check the warnings of the run", output, err)
	}
	for _, v := range []float64{s.P90, s.P50, s.P10, s.Mean} {
		if !finite(v) {
			return chart{}, fmt.Errorf("output %q has a non-finite summary; check the warnings of the run", output)
		}
	}

	p := newPlot(chartTitle(r.Title, "Probability of exceeding: "+o.Spec.Doc))
	p.X.Label.Text = o.Spec.Doc + ", " + long
	p.X.Tick.Marker = niceTicks{7}
	p.Y.Label.Text = "probability of exceeding (%)"
	lo, hi := pts[len(pts)-1].X, pts[0].X
	lo, hi = padRange(lo, hi, 0.03)
	p.X.Min, p.X.Max = lo, hi
	p.Y.Min, p.Y.Max = 0, 100
	var ticks []plot.Tick
	for y := 0; y <= 100; y += 10 {
		ticks = append(ticks, plot.Tick{Value: float64(y), Label: fmt.Sprint(y)})
	}
	p.Y.Tick.Marker = plot.ConstantTicks(ticks)
	p.Add(grid(true, true))

	line, err := plotter.NewLine(pts)
	if err != nil {
		return chart{}, fmt.Errorf("drawing the curve of %q: %w", output, err)
	}
	line.Color = curveColor
	line.Width = vg.Points(2)
	line.FillColor = curveFill
	p.Add(line)

	meanP := 100 * exceedance(o.Curve, s.Mean)
	p.Add(&markers{marks: []mark{
		{x: s.P90 / scale, y: 90, label: "P90  " + fig(s.P90/scale) + " " + short, color: pctColor, glyph: draw.CircleGlyph{}},
		{x: s.P50 / scale, y: 50, label: "P50  " + fig(s.P50/scale) + " " + short, color: pctColor, glyph: draw.CircleGlyph{}},
		{x: s.P10 / scale, y: 10, label: "P10  " + fig(s.P10/scale) + " " + short, color: pctColor, glyph: draw.CircleGlyph{}},
		{x: s.Mean / scale, y: meanP, label: fmt.Sprintf("mean  %s %s (exceeded by %.0f%%)", fig(s.Mean/scale), short, meanP),
			color: meanColor, glyph: draw.BoxGlyph{}, full: true},
	}})
	foot := []string{"P90 is exceeded by 90% of trials (the low estimate), P10 by 10% (the high estimate)."}
	return chart{p, 7 * vg.Inch, 4.6 * vg.Inch, footerHeight(len(foot), false), footer(runNote(r), foot, nil)}, nil
}

// curvePoints returns the points of an exceedance curve: x = curve[k] /
// scale, y = the probability in percent of exceeding it, 100·(1 − k/(n−1)).
func curvePoints(curve []float64, scale float64) (plotter.XYs, error) {
	pts := make(plotter.XYs, len(curve))
	for k, v := range curve {
		if !finite(v) {
			return nil, fmt.Errorf("has no finite values to draw (curve point %d is %g)", k, v)
		}
		pts[k] = plotter.XY{X: v / scale, Y: 100 * (1 - float64(k)/float64(len(curve)-1))}
	}
	return pts, nil
}

// exceedance returns the probability, in [0, 1], of exceeding x, read by
// linear interpolation from a curve of quantiles at 0, 1/(n−1), ..., 1.
func exceedance(curve []float64, x float64) float64 {
	n := len(curve)
	if x < curve[0] {
		return 1
	}
	if x >= curve[n-1] {
		return 0
	}
	k := sort.Search(n, func(i int) bool { return curve[i] > x }) - 1 // curve[k] ≤ x < curve[k+1]
	f := (x - curve[k]) / (curve[k+1] - curve[k])
	return 1 - (float64(k)+f)/float64(n-1)
}
