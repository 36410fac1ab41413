package report

import (
	"fmt"
	"image/color"
	"io"
	"math"
	"sort"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"

	"rockheat"
)

// inputs returns "1 input" or "n inputs".
func inputs(n int) string {
	if n == 1 {
		return "1 input"
	}
	return fmt.Sprintf("%d inputs", n)
}

// swing is one bar of a tornado chart, in the chart unit.
type swing struct {
	input     string
	low, high float64
}

// TornadoSVG writes, as an SVG document, the tornado chart of the output
// of r named output: for each of the (at most TornadoInputs) inputs with
// the widest swings |SwingHigh − SwingLow|, widest at the top, the output
// with that input at its P90 (10th percentile, the low value) and P10
// (90th percentile, the high value) and every other sampled input at its
// median. Bars run from a vertical reference line at the output with
// every sampled input at its median (Sensitivity.Base), or at its P50 when
// that is not finite; the caption says which. It returns an error naming
// the outputs there are when r has none named output, and an error when
// the output has no swings to draw (see HasTornado).
func TornadoSVG(w io.Writer, r *rockheat.Result, output string) error {
	ch, err := tornadoChart(r, output)
	if err != nil {
		return err
	}
	return ch.writeSVG(w)
}

// HasTornado reports whether the output of r named output has a tornado
// chart (TornadoSVG): some sampled input that moves it, in a run of at
// least 3 trials.
func HasTornado(r *rockheat.Result, output string) bool {
	_, err := tornadoChart(r, output)
	return err == nil
}

func tornadoChart(r *rockheat.Result, output string) (chart, error) {
	o, err := findOutput(r, output)
	if err != nil {
		return chart{}, err
	}
	var sens *rockheat.Sensitivity
	for i := range r.Sensitivity {
		if r.Sensitivity[i].Output == output {
			sens = &r.Sensitivity[i]
		}
	}
	long, short, scale := outputUnit(r, o)
	ref, refName := o.Summary.P50/scale, "P50"
	if sens != nil && finite(sens.Base) {
		ref, refName = sens.Base/scale, "all inputs at median"
	}
	var bars []swing
	still := 0 // inputs that do not move the output
	if sens != nil {
		for _, f := range sens.Influences {
			switch {
			case !finite(f.SwingLow) || !finite(f.SwingHigh):
			case f.SwingLow == f.SwingHigh:
				still++
			default:
				bars = append(bars, swing{f.Input, f.SwingLow / scale, f.SwingHigh / scale})
			}
		}
	}
	if len(bars) == 0 || !finite(ref) {
		return chart{}, fmt.Errorf("output %q has no input swings to draw: the scenario needs at least one input that is given as a distribution and moves the output, and the run at least 3 trials", output)
	}
	sort.SliceStable(bars, func(i, j int) bool {
		return math.Abs(bars[i].high-bars[i].low) > math.Abs(bars[j].high-bars[j].low)
	})
	more := max(0, len(bars)-TornadoInputs) // counted before the cut
	bars = bars[:len(bars)-more]
	n := len(bars)

	p := newPlot(chartTitle(r.Title, "What moves the "+o.Spec.Doc))
	p.X.Label.Text = o.Spec.Doc + ", " + long
	p.X.Tick.Marker = niceTicks{7}
	names := make([]string, n)
	lo, hi := ref, ref
	for i, b := range bars {
		names[n-1-i] = b.input // widest on top
		lo, hi = math.Min(lo, math.Min(b.low, b.high)), math.Max(hi, math.Max(b.low, b.high))
	}
	p.NominalY(names...)
	p.Y.Min, p.Y.Max = -0.6, float64(n)-0.05 // room on top for the P50 label
	p.X.Min, p.X.Max = padRange(lo, hi, 0.14)
	p.Add(grid(true, false))
	p.Add(&tornado{bars: bars, ref: ref, refLabel: refName + "  " + fig(ref) + " " + short})

	caption := []string{
		"Each bar: the output with one input at its own 10th percentile (low) or 90th percentile (high), every other input at its median.",
		refLine(refName) + " Inputs ranked by the width of their swing; figures in " + short + ".",
	}
	switch {
	case more > 0 && still > 0:
		caption = append(caption, fmt.Sprintf("Not shown: %s with smaller swings and %s with no effect on this output.", inputs(more), inputs(still)))
	case more > 0:
		caption = append(caption, fmt.Sprintf("Not shown: %s with smaller swings.", inputs(more)))
	case still > 0:
		caption = append(caption, fmt.Sprintf("Not shown: %s with no effect on this output.", inputs(still)))
	}
	legend := []swatch{{color: lowColor, text: "input low (its 10th percentile)"}, {color: highColor, text: "input high (its 90th percentile)"}}
	height := 2.3*vg.Inch + vg.Length(n)*0.36*vg.Inch
	return chart{p, 7 * vg.Inch, height, footerHeight(len(caption), true), footer(runNote(r), caption, legend)}, nil
}

// tornado draws the bars of a tornado chart; bars[0] is the top row.
type tornado struct {
	bars     []swing
	ref      float64
	refLabel string
}

// Plot implements plot.Plotter.
func (t *tornado) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	n := len(t.bars)
	x0 := trX(t.ref)
	for i, b := range t.bars {
		row := float64(n - 1 - i)
		y1, y2 := trY(row-0.32), trY(row+0.32)
		sides := []struct {
			v   float64
			col color.Color
		}{{b.low, lowColor}, {b.high, highColor}}
		// The longer side first, so that a shorter one on the same side
		// of the line stays in view on top of it.
		if math.Abs(b.high-t.ref) > math.Abs(b.low-t.ref) {
			sides[0], sides[1] = sides[1], sides[0]
		}
		for _, s := range sides {
			x := trX(s.v)
			c.FillPolygon(s.col, []vg.Point{{X: x0, Y: y1}, {X: x, Y: y1}, {X: x, Y: y2}, {X: x0, Y: y2}})
		}
		sty := textStyle(8, inkColor)
		sty.YAlign = draw.YCenter
		gap, mid := vg.Points(3), (y1+y2)/2
		at := func(v float64, txt string) {
			if v < t.ref {
				sty.XAlign = draw.XRight
				c.FillText(sty, vg.Point{X: trX(v) - gap, Y: mid}, txt)
			} else {
				sty.XAlign = draw.XLeft
				c.FillText(sty, vg.Point{X: trX(v) + gap, Y: mid}, txt)
			}
		}
		if (b.low < t.ref) != (b.high < t.ref) {
			at(b.low, fig(b.low))
			at(b.high, fig(b.high))
		} else {
			// Both on one side of the line: one label at the outer end.
			at(sides[0].v, fig(b.low)+" → "+fig(b.high))
		}
	}
	c.StrokeLine2(draw.LineStyle{Color: curveColor, Width: vg.Points(1.5)}, x0, c.Min.Y, x0, c.Max.Y)
	sty := textStyle(9, curveColor)
	sty.XAlign, sty.YAlign = draw.XCenter, draw.YBottom
	label(&c, sty, vg.Point{X: x0, Y: c.Max.Y + vg.Points(2)}, t.refLabel)
}

// refLine explains the tornado chart's reference line.
func refLine(name string) string {
	if name == "P50" {
		return "The line is the output's P50, a stand-in for the all-medians value."
	}
	return "The line is the output with every input at its median."
}
