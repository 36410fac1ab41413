package report

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"sort"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"rockheat"
)

// DeclineSVG writes, as an SVG document, the thermal power decline of a
// hot-rock result: the P90, P50 and P10 of the thermal power (MWth) at
// each report year, outputs of group rockheat.DeclineGroup, with the band from
// P90 to P10 shaded. It returns an error when r has no such outputs (a
// reservoir result).
func DeclineSVG(w io.Writer, r *rockheat.Result) error {
	ch, err := declineChart(r)
	if err != nil {
		return err
	}
	return ch.writeSVG(w)
}

func declineChart(r *rockheat.Result) (chart, error) {
	outs := declineOutputs(r)
	if len(outs) == 0 {
		return chart{}, fmt.Errorf("this %s result has no thermal power decline (outputs of group %q); only hot-rock scenarios report the power at each year", r.Kind, rockheat.DeclineGroup)
	}
	unit := outs[0].Spec.Unit
	p90, p50, p10 := make(plotter.XYs, len(outs)), make(plotter.XYs, len(outs)), make(plotter.XYs, len(outs))
	top := 0.0
	for i, o := range outs {
		s := o.Summary
		if !finite(s.P90) || !finite(s.P50) || !finite(s.P10) {
			return chart{}, fmt.Errorf("output %q has a non-finite P90, P50 or P10; check the warnings of the run", o.Spec.Name)
		}
		y := o.Spec.Year
		p90[i], p50[i], p10[i] = plotter.XY{X: y, Y: s.P90}, plotter.XY{X: y, Y: s.P50}, plotter.XY{X: y, Y: s.P10}
		top = math.Max(top, math.Max(s.P90, s.P10))
	}
	p := newPlot(chartTitle(r.Title, "Thermal power decline"))
	p.X.Label.Text = "years from the start of production"
	p.Y.Label.Text = "thermal power, " + unit
	p.Y.Tick.Marker = niceTicks{6}
	first, last := outs[0].Spec.Year, outs[len(outs)-1].Spec.Year
	span := last - first
	if span == 0 {
		span = 1
	}
	p.X.Min, p.X.Max = first-0.03*span, last+0.16*span
	p.Y.Min, p.Y.Max = 0, math.Max(top*1.08, 1e-9)
	p.Add(grid(true, true))

	band := make(plotter.XYs, 0, 2*len(outs))
	band = append(band, p10...)
	for i := len(p90) - 1; i >= 0; i-- {
		band = append(band, p90[i])
	}
	poly, err := plotter.NewPolygon(band)
	if err != nil {
		return chart{}, fmt.Errorf("drawing the decline band: %w", err)
	}
	poly.Color, poly.LineStyle.Width = bandFill, 0
	p.Add(poly)
	ends := &endLabels{}
	for _, c := range []struct {
		xy    plotter.XYs
		name  string
		col   color.Color
		width float64
		dash  bool
	}{{p10, "P10", pctColor, 1.2, true}, {p90, "P90", pctColor, 1.2, true}, {p50, "P50", curveColor, 2.2, false}} {
		// Lines before labels, labels in one plotter that keeps them apart.
		l, s, err := plotter.NewLinePoints(c.xy)
		if err != nil {
			return chart{}, fmt.Errorf("drawing the decline %s: %w", c.name, err)
		}
		l.Color, l.Width = c.col, vg.Points(c.width)
		if c.dash {
			l.Dashes = []vg.Length{vg.Points(4), vg.Points(2)}
		}
		s.Color, s.Radius, s.Shape = c.col, vg.Points(2.5), draw.CircleGlyph{}
		p.Add(l, s)
		end := c.xy[len(c.xy)-1]
		ends.labels = append(ends.labels, endLabel{x: end.X, y: end.Y, text: c.name + "  " + fig(end.Y), color: c.col})
	}
	caption := []string{"Band: from the P90 (exceeded by 90% of trials) to the P10 (exceeded by 10%) of the thermal power at each report year, " + unit + "."}
	if alt := comparedDecline(r); alt != nil {
		pts := make(plotter.XYs, len(alt))
		for i, o := range alt {
			pts[i] = plotter.XY{X: o.Spec.Year, Y: o.Summary.P50}
			top = math.Max(top, o.Summary.P50)
		}
		l, err := plotter.NewLine(pts)
		if err != nil {
			return chart{}, fmt.Errorf("drawing the compared decline: %w", err)
		}
		l.Color, l.Width, l.Dashes = meanColor, vg.Points(2), []vg.Length{vg.Points(2), vg.Points(2)}
		p.Add(l)
		end := pts[len(pts)-1]
		ends.labels = append(ends.labels, endLabel{x: end.X, y: end.Y, text: "P50 " + r.Comparison.Decline.String() + "  " + fig(end.Y), color: meanColor})
		p.Y.Max = math.Max(top*1.08, 1e-9)
		caption = append(caption, fmt.Sprintf("Solid: the %s decline; dotted green: the P50 with the %s decline, on the same draws.", r.Decline, r.Comparison.Decline))
	}
	p.Add(ends)
	return chart{p, 7 * vg.Inch, 4.4 * vg.Inch, footerHeight(len(caption), false), footer(runNote(r), caption, nil)}, nil
}

// declineOutputs returns the outputs of group rockheat.DeclineGroup, by
// year; none for a nil r.
func declineOutputs(r *rockheat.Result) []rockheat.Output {
	if r == nil {
		return nil
	}
	var outs []rockheat.Output
	for _, o := range r.Outputs {
		if o.Spec.Group == rockheat.DeclineGroup {
			outs = append(outs, o)
		}
	}
	sort.SliceStable(outs, func(i, j int) bool { return outs[i].Spec.Year < outs[j].Spec.Year })
	return outs
}

// comparedDecline returns the thermal power at each report year of r's
// comparison (CompareDeclines), year by year beside declineOutputs(r), or
// nil when r has none to show beside its own.
func comparedDecline(r *rockheat.Result) []rockheat.Output {
	alt := declineOutputs(r.Comparison)
	if len(alt) == 0 || len(alt) != len(declineOutputs(r)) {
		return nil
	}
	return alt
}

// endLabel labels the end of a line, to its right.
type endLabel struct {
	x, y  float64
	text  string
	color color.Color
}

// endLabels draws end labels, moved apart vertically so none overlap.
type endLabels struct{ labels []endLabel }

// Plot implements plot.Plotter.
func (e *endLabels) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	ls := append([]endLabel(nil), e.labels...)
	sort.SliceStable(ls, func(i, j int) bool { return ls[i].y < ls[j].y })
	const gap = 11 // points between label centres
	ys := make([]vg.Length, len(ls))
	for i, l := range ls {
		ys[i] = trY(l.y)
		if i > 0 && ys[i] < ys[i-1]+vg.Points(gap) {
			ys[i] = ys[i-1] + vg.Points(gap)
		}
	}
	for i, l := range ls {
		sty := textStyle(9, l.color)
		sty.YAlign = draw.YCenter
		label(&c, sty, vg.Point{X: trX(l.x) + vg.Points(6), Y: ys[i]}, l.text)
	}
}
