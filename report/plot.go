package report

import (
	"bytes"
	"fmt"
	"image/color"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"

	"gonum.org/v1/plot"
	"gonum.org/v1/plot/font"
	"gonum.org/v1/plot/plotter"
	"gonum.org/v1/plot/text"
	"gonum.org/v1/plot/vg"
	"gonum.org/v1/plot/vg/draw"
	"gonum.org/v1/plot/vg/vgsvg"

	"rockheat"
)

// TornadoInputs is the largest number of inputs a tornado chart shows.
const TornadoInputs = 8

// chartFootnote is printed under every chart.
const chartFootnote = "Estimates, not a reserves statement."

// The chart palette.
var (
	inkColor     = color.RGBA{0x24, 0x2a, 0x30, 0xff} // text and axes
	softInk      = color.RGBA{0x5c, 0x64, 0x6c, 0xff} // footnotes
	gridColor    = color.RGBA{0xe4, 0xe6, 0xe8, 0xff}
	curveColor   = color.RGBA{0x1d, 0x5b, 0x79, 0xff} // exceedance curve, P50 line
	curveFill    = color.NRGBA{0x1d, 0x5b, 0x79, 0x1c}
	pctColor     = color.RGBA{0xa8, 0x3a, 0x1c, 0xff} // P90/P50/P10 marks
	meanColor    = color.RGBA{0x3f, 0x73, 0x2b, 0xff}
	lowColor     = color.RGBA{0x4a, 0x9c, 0xa6, 0xff} // tornado: input at its low value
	highColor    = color.RGBA{0xd4, 0x8a, 0x2e, 0xff} // tornado: input at its high value
	bandFill     = color.NRGBA{0xa8, 0x3a, 0x1c, 0x26}
	labelBacking = color.NRGBA{0xff, 0xff, 0xff, 0xd0}
)

// sans is the chart typeface. Liberation Sans has the metrics of Arial,
// the fallback named in the SVG, so text fits where the font is absent.
var sans = font.Font{Typeface: "Liberation", Variant: "Sans"}

// textStyle returns a text style of the chart typeface, size points.
func textStyle(size vg.Length, c color.Color) text.Style {
	return text.Style{Color: c, Font: font.From(sans, size), Handler: plot.DefaultTextHandler}
}

// maxTitleRunes is the longest prospect title a chart shows in full; a
// longer one is shortened with an ellipsis rather than run off both sides.
const maxTitleRunes = 70

// chartTitle returns the title of a chart of r about subject: the
// prospect's title, shortened to maxTitleRunes, over the subject; the
// subject alone when r has no title (as in the HTML page, which shows the
// title in its own text).
func chartTitle(title, subject string) string {
	t := []rune(title)
	if len(t) == 0 {
		return subject
	}
	if len(t) > maxTitleRunes {
		t = append(t[:maxTitleRunes-1], '…')
	}
	return string(t) + "\n" + subject
}

// newPlot returns a plot with the chart typeface, colours and title.
func newPlot(title string) *plot.Plot {
	p := plot.New()
	p.Title.Text = title
	p.Title.TextStyle.Font = font.From(sans, 12)
	p.Title.TextStyle.Color = inkColor
	p.Title.Padding = vg.Points(10)
	for _, a := range []*plot.Axis{&p.X, &p.Y} {
		a.Color = inkColor
		a.Label.TextStyle.Font = font.From(sans, 10)
		a.Label.TextStyle.Color = inkColor
		a.Tick.Label.Font = font.From(sans, 9)
		a.Tick.Label.Color = inkColor
		a.Tick.Color = inkColor
	}
	return p
}

// grid returns light grid lines; vertical and horizontal say which.
func grid(vertical, horizontal bool) *plotter.Grid {
	g := plotter.NewGrid()
	g.Vertical.Color, g.Horizontal.Color = gridColor, gridColor
	g.Vertical.Width, g.Horizontal.Width = vg.Points(0.5), vg.Points(0.5)
	if !vertical {
		g.Vertical.Color = nil
	}
	if !horizontal {
		g.Horizontal.Color = nil
	}
	return g
}

// findOutput returns the output of r named name, or an error listing the
// outputs there are.
func findOutput(r *rockheat.Result, name string) (rockheat.Output, error) {
	var names []string
	for _, o := range r.Outputs {
		if o.Spec.Name == name {
			return o, nil
		}
		names = append(names, o.Spec.Name)
	}
	return rockheat.Output{}, fmt.Errorf("no output named %q in this %s result; the outputs are %s", name, r.Kind, strings.Join(names, ", "))
}

// niceTicks marks about n labelled ticks at round values (1, 2, 2.5 or
// 5 times a power of ten), with an unlabelled tick between each.
type niceTicks struct{ n int }

// Ticks implements plot.Ticker.
func (t niceTicks) Ticks(lo, hi float64) []plot.Tick {
	if !(hi > lo) || !finite(lo) || !finite(hi) {
		return nil
	}
	raw := (hi - lo) / float64(t.n)
	mag := math.Pow(10, math.Floor(math.Log10(raw)))
	step := 10 * mag
	for _, m := range []float64{1, 2, 2.5, 5} {
		if m*mag >= raw {
			step = m * mag
			break
		}
	}
	dec := max(0, -int(math.Floor(math.Log10(step)+1e-9)))
	if math.Abs(step/math.Pow(10, math.Floor(math.Log10(step)+1e-9))-2.5) < 1e-9 {
		dec++ // 0.25, 2.5: one more digit
	}
	var ticks []plot.Tick
	for i := math.Ceil(lo / step * 2); i*step/2 <= hi; i++ {
		v := i * step / 2
		tk := plot.Tick{Value: v}
		if math.Mod(i, 2) == 0 {
			if math.Abs(v) < step*1e-9 {
				v = 0 // no "-0"
			}
			tk.Label = strconv.FormatFloat(v, 'f', dec, 64)
		}
		ticks = append(ticks, tk)
	}
	return ticks
}

func finite(x float64) bool { return !math.IsNaN(x) && !math.IsInf(x, 0) }

// runNote is the right-hand footnote of a chart: what the run was.
func runNote(r *rockheat.Result) string {
	return runLine(r)
}

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

// padRange widens [lo, hi] by frac of its width on each side, or around
// a single value when lo = hi.
func padRange(lo, hi, frac float64) (float64, float64) {
	d := (hi - lo) * frac
	if d == 0 {
		d = math.Max(math.Abs(lo)*0.05, 1)
	}
	return lo - d, hi + d
}

// mark is one labelled point of markers.
type mark struct {
	x, y  float64 // data coordinates
	label string
	color color.Color
	glyph draw.GlyphDrawer
	// full draws a guide across the whole height, with the label at the
	// top; otherwise the guides run to the axes and the label sits above
	// and right of the point.
	full bool
}

// markers draws labelled points with dashed guides to the axes.
type markers struct{ marks []mark }

// Plot implements plot.Plotter.
func (m *markers) Plot(c draw.Canvas, p *plot.Plot) {
	trX, trY := p.Transforms(&c)
	for _, mk := range m.marks {
		pt := vg.Point{X: trX(mk.x), Y: trY(mk.y)}
		guide := draw.LineStyle{Color: mk.color, Width: vg.Points(0.8), Dashes: []vg.Length{vg.Points(3), vg.Points(2)}}
		if mk.full {
			guide.Dashes = []vg.Length{vg.Points(1), vg.Points(2)}
			c.StrokeLine2(guide, pt.X, c.Min.Y, pt.X, c.Max.Y)
		} else {
			c.StrokeLine2(guide, c.Min.X, pt.Y, pt.X, pt.Y)
			c.StrokeLine2(guide, pt.X, c.Min.Y, pt.X, pt.Y)
		}
		c.DrawGlyph(draw.GlyphStyle{Color: mk.color, Radius: vg.Points(3.5), Shape: mk.glyph}, pt)
	}
	for _, mk := range m.marks {
		pt := vg.Point{X: trX(mk.x), Y: trY(mk.y)}
		sty := textStyle(9, mk.color)
		gap := vg.Points(6)
		switch {
		case mk.full:
			// At the top, right of its guide: the exceedance curve lies left
			// of the mean above the mean's own probability, so nothing is
			// hidden there (a label beside the point hid the curve and the
			// P50 guide).
			sty.XAlign, sty.YAlign = draw.XLeft, draw.YTop
			pt = vg.Point{X: pt.X + gap/2, Y: c.Max.Y - gap/2}
		default:
			sty.XAlign, sty.YAlign = draw.XLeft, draw.YBottom
			pt = pt.Add(vg.Point{X: gap, Y: gap / 2})
		}
		label(&c, sty, pt, mk.label)
	}
}

// label draws txt at pt on a pale backing, moved inside c if it would
// cross an edge.
func label(c *draw.Canvas, sty text.Style, pt vg.Point, txt string) {
	rect := sty.Rectangle(txt).Add(pt)
	shift := vg.Point{}
	if d := rect.Max.X - c.Max.X; d > 0 {
		shift.X = -d
	}
	if d := c.Min.X - rect.Min.X; d > 0 {
		shift.X = d
	}
	if d := rect.Max.Y - c.Max.Y; d > 0 {
		shift.Y = -d
	}
	if d := c.Min.Y - rect.Min.Y; d > 0 {
		shift.Y = d
	}
	pt, rect = pt.Add(shift), rect.Add(shift)
	pad := vg.Points(1.5)
	c.FillPolygon(labelBacking, []vg.Point{
		{X: rect.Min.X - pad, Y: rect.Min.Y - pad}, {X: rect.Max.X + pad, Y: rect.Min.Y - pad},
		{X: rect.Max.X + pad, Y: rect.Max.Y + pad}, {X: rect.Min.X - pad, Y: rect.Max.Y + pad},
	})
	c.FillText(sty, pt, txt)
}

// swatch is a legend entry of a chart footer: a filled box and its text.
type swatch struct {
	color color.Color
	text  string
}

// footer returns a function drawing, in the strip under a chart, the
// legend entries, the caption lines, and the footnote with the run, note.
func footer(note string, caption []string, legend []swatch) func(c draw.Canvas) {
	return func(c draw.Canvas) {
		small := textStyle(8, softInk)
		left := c.Min.X + vg.Points(12)
		y := c.Max.Y - vg.Points(4)
		if len(legend) > 0 {
			x := left
			sty := textStyle(9, inkColor)
			sty.YAlign = draw.YTop
			for _, s := range legend {
				box := vg.Points(9)
				c.FillPolygon(s.color, []vg.Point{{X: x, Y: y}, {X: x + box, Y: y}, {X: x + box, Y: y - box}, {X: x, Y: y - box}})
				x += box + vg.Points(4)
				c.FillText(sty, vg.Point{X: x, Y: y + vg.Points(1)}, s.text)
				x += sty.Width(s.text) + vg.Points(16)
			}
			y -= vg.Points(14)
		}
		small.YAlign = draw.YTop
		for _, line := range caption {
			c.FillText(small, vg.Point{X: left, Y: y}, line)
			y -= vg.Points(10)
		}
		sty := textStyle(8, softInk)
		sty.YAlign = draw.YBottom
		c.FillText(sty, vg.Point{X: left, Y: c.Min.Y + vg.Points(5)}, chartFootnote)
		sty.XAlign = draw.XRight
		c.FillText(sty, vg.Point{X: c.Max.X - vg.Points(12), Y: c.Min.Y + vg.Points(5)}, note)
	}
}

// footerHeight is the height of a footer with n caption lines and,
// if legend, a legend row.
func footerHeight(n int, legend bool) vg.Length {
	h := vg.Points(22 + 10*float64(n))
	if legend {
		h += vg.Points(14)
	}
	return h
}

// svgFonts names fallbacks after the chart typeface in the SVG text.
var svgFonts = strings.NewReplacer("font-family:Liberation Sans;", "font-family:'Liberation Sans',Arial,Helvetica,sans-serif;")

// chart is a plot over a footer strip, ready to draw.
type chart struct {
	p                    *plot.Plot
	width, height, footH vg.Length
	foot                 func(c draw.Canvas)
}

// draw draws the chart on dc, which is width × height.
func (ch chart) draw(dc draw.Canvas) {
	dc.SetColor(color.White)
	dc.Fill(dc.Rectangle.Path())
	// A margin left and right keeps long tick labels off the edge.
	ch.p.Draw(draw.Crop(dc, vg.Points(8), -vg.Points(12), ch.footH, 0))
	ch.foot(draw.Crop(dc, 0, 0, 0, ch.footH-ch.height))
}

// writeSVG writes the chart to w as an SVG document.
func (ch chart) writeSVG(w io.Writer) error {
	cv := vgsvg.New(ch.width, ch.height)
	ch.draw(draw.New(cv))
	var b bytes.Buffer
	if _, err := cv.WriteTo(&b); err != nil {
		return err
	}
	_, err := io.WriteString(w, svgFonts.Replace(b.String()))
	return err
}

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

// refLine explains the tornado chart's reference line.
func refLine(name string) string {
	if name == "P50" {
		return "The line is the output's P50, a stand-in for the all-medians value."
	}
	return "The line is the output with every input at its median."
}
