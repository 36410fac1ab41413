package report

import (
	"bytes"
	"fmt"
	"image/color"
	"io"
	"math"
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
