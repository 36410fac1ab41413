package report

import (
	"bytes"
	"fmt"
	"html"
	"html/template"
	"io"
	"strings"

	"rockheat"
)

// HTML writes r as one self-contained HTML page, with inline CSS and
// inline SVG charts and no script or outside resource: the title and the
// run, the P90/P50/P10 and mean of every output with the confidence
// interval of each percentile, the percentile convention, for the
// headline outputs (heat in place, electric capacity) the exceedance and
// tornado charts and the sensitivity table, for a hot-rock result the
// thermal power at each report year as a table and a chart, the inputs,
// the method, any warnings and the caution. All text is HTML-escaped.
// Nothing is written if the page cannot be built.
func HTML(w io.Writer, r *rockheat.Result) error {
	var b bytes.Buffer
	if err := pageTemplate.Execute(&b, newPage(r)); err != nil {
		return fmt.Errorf("rendering the HTML report: %w", err)
	}
	_, err := b.WriteTo(w)
	return err
}

// page is what the HTML template shows.
type page struct {
	Title, Path, Model, Run string
	Level                   string // confidence level, e.g. "95%"
	Rows                    []figureRow
	Convention, Caution     string
	Notes                   []string
	Charts                  []chartSection
	Decline                 *declineSection
	Sensitivity             []sensSection
	SensNotes               []string
	Inputs                  []rockheat.Input
	Correlations            []string
	Method                  string
	Warnings                []string
	Prov                    provenance
}

// chartSection holds the charts of one headline output; a chart that
// cannot be drawn is replaced by a note saying why.
type chartSection struct {
	Doc                  string
	Exceedance, Tornado  template.HTML
	ExceedNote, TornNote string
}

// declineSection is the thermal power at each report year.
type declineSection struct {
	Unit     string
	Compared string // heading of the compared decline's column, if any
	Rows     []yearRow
	Chart    template.HTML
	Note     string
}

type yearRow struct{ Year, P90, P50, P10, Compared string }

func newPage(r *rockheat.Result) *page {
	pg := &page{
		Title:      r.Title,
		Path:       r.Path,
		Model:      modelLine(r),
		Run:        runLine(r),
		Level:      fmt.Sprintf("%.0f%%", 100*r.Confidence),
		Convention: Convention,
		Caution:    Caution,
		Inputs:     r.Inputs,
		Method:     methodText(r),
		Warnings:   r.Warnings,
		Prov: newProvenance(r.Seed, r.Trials, samplingName(r.Sampling),
			[]fileHash{{Path: r.Path, SHA256: r.SourceSHA256}}),
	}

	pg.Rows = figureRows(r, notDecline)
	pg.Notes = append(pg.Notes, runNotes(r)...)

	// The charts leave the prospect's title to the page's own text, which
	// any script renders, rather than to the chart typeface.
	untitled := *r
	untitled.Title = ""
	cr := &untitled
	for _, o := range r.Outputs {
		if !headline[o.Spec.Name] {
			continue
		}
		cs := chartSection{Doc: o.Spec.Doc}
		var err error
		if cs.Exceedance, err = inlineSVG(o.Spec.Doc+": probability of exceeding", func(w io.Writer) error { return ExceedanceSVG(w, cr, o.Spec.Name) }); err != nil {
			cs.ExceedNote = "No exceedance chart: " + err.Error()
		}
		if cs.Tornado, err = inlineSVG(o.Spec.Doc+": tornado chart of the input swings", func(w io.Writer) error { return TornadoSVG(w, cr, o.Spec.Name) }); err != nil {
			cs.TornNote = "No tornado chart: " + err.Error()
		}
		pg.Charts = append(pg.Charts, cs)
	}

	if outs := declineOutputs(r); len(outs) > 0 {
		d := &declineSection{Unit: outs[0].Spec.Unit}
		alt := comparedDecline(r)
		if alt != nil {
			d.Compared = "P50, " + r.Comparison.Decline.String() + " decline"
		}
		for i, o := range outs {
			s := o.Summary
			row := yearRow{Year: fmt.Sprintf("%g", o.Spec.Year), P90: fig(s.P90), P50: fig(s.P50), P10: fig(s.P10)}
			if d.Compared != "" {
				row.Compared = fig(alt[i].Summary.P50)
			}
			d.Rows = append(d.Rows, row)
		}
		var err error
		if d.Chart, err = inlineSVG("thermal power decline", func(w io.Writer) error { return DeclineSVG(w, cr) }); err != nil {
			d.Note = "No decline chart: " + err.Error()
		}
		pg.Decline = d
	}

	pg.Sensitivity = sensSections(r)
	pg.SensNotes = sensNotes(r)
	pg.Correlations = correlationLines(r)
	return pg
}

// inlineSVG renders a chart with draw and returns it for inlining in
// HTML: the <svg> element without the XML prolog, labelled for screen
// readers with label. The text in the SVG is escaped by vgsvg.
func inlineSVG(label string, draw func(w io.Writer) error) (template.HTML, error) {
	var b strings.Builder
	if err := draw(&b); err != nil {
		return "", err
	}
	s := b.String()
	i := strings.Index(s, "<svg")
	if i < 0 {
		return "", fmt.Errorf("the chart renderer wrote no <svg> element")
	}
	s = `<svg role="img" aria-label="` + html.EscapeString(label) + `"` + s[i+len("<svg"):]
	return template.HTML(s), nil
}

var pageTemplate = template.Must(template.New("page").Parse(styleHTML + provenanceHTML + `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>{{.Title}} · rockheat</title>
{{template "style"}}
</head>
<body>
<main>
<h1>{{.Title}}</h1>
<p class="run">Scenario {{.Path}} · {{.Model}}</p>
<p class="run">{{.Run}}</p>

<div class="caution"><strong>Caution.</strong> {{.Caution}}</div>

<h2>Estimates</h2>
<table>
<tr><th>output</th><th class="n">P90 (low)</th><th class="n">P50 (best)</th><th class="n">P10 (high)</th><th class="n">mean</th><th>unit</th></tr>
{{range .Rows}}<tr class="fig"><td>{{.Doc}}</td><td class="n">{{.P90}}</td><td class="n">{{.P50}}</td><td class="n">{{.P10}}</td><td class="n">{{.Mean}}</td><td>{{.Unit}}</td></tr>
<tr class="ci"><td></td><td class="n">{{.P90CI}}</td><td class="n">{{.P50CI}}</td><td class="n">{{.P10CI}}</td><td></td><td></td></tr>
{{end}}</table>
<p class="note">Ranges in brackets are {{.Level}} distribution-free confidence intervals of each percentile (order statistics, binomial; Hahn &amp; Meeker 1991): how far the figure could move with more trials.</p>
<p class="convention">{{.Convention}}</p>
{{range .Notes}}<p class="note">{{.}}</p>
{{end}}
{{with .Decline}}
<h2>Thermal power decline</h2>
<table>
<tr><th class="n">year</th><th class="n">P90 (low)</th><th class="n">P50 (best)</th><th class="n">P10 (high)</th>{{if .Compared}}<th class="n">{{.Compared}}</th>{{end}}</tr>
{{range .Rows}}<tr><td class="n">{{.Year}}</td><td class="n">{{.P90}}</td><td class="n">{{.P50}}</td><td class="n">{{.P10}}</td>{{if .Compared}}<td class="n">{{.Compared}}</td>{{end}}</tr>
{{end}}</table>
<p class="note">Thermal power in {{.Unit}} at each report year.</p>
{{if .Chart}}<figure>{{.Chart}}</figure>{{else}}<p class="note">{{.Note}}</p>{{end}}
{{end}}
{{if .Charts}}<p class="note">The page charts the headline outputs, heat in place and electric capacity; <code>rockheat run --plots DIR</code> writes the exceedance curve and tornado chart of every output as SVG files.</p>{{end}}
{{range .Charts}}
<h2>Charts: {{.Doc}}</h2>
<div class="charts">
{{if .Exceedance}}<figure>{{.Exceedance}}</figure>{{else}}<p class="note">{{.ExceedNote}}</p>{{end}}
{{if .Tornado}}<figure>{{.Tornado}}</figure>{{else}}<p class="note">{{.TornNote}}</p>{{end}}
</div>
{{end}}
{{if .Sensitivity}}
<h2>Sensitivity</h2>
{{range .Sensitivity}}
<h3>What drives the {{.Doc}}</h3>
<table>
<tr><th>input</th><th class="n">rank correlation</th><th>share of variance</th><th class="n">input low → high, {{.Unit}}</th></tr>
{{range .Rows}}<tr><td><code>{{.Input}}</code></td><td class="n">{{.Rho}}</td><td><span class="barbox"><span class="bar" style="width: {{.Bar}}%"></span></span> {{.Percent}}</td><td class="n">{{.Low}} → {{.High}}</td></tr>
{{end}}</table>
{{end}}
<p class="note">Spearman rank correlation of each input with the output; share of variance is its square over the sum of squares. Input low → high: the output with that input at its own 10th and 90th percentile and every other input at its median.</p>
{{range .SensNotes}}<p class="note">{{.}}</p>
{{end}}{{end}}
<h2>Inputs</h2>
<table>
<tr><th>key</th><th>unit</th><th>distribution</th><th>what it is</th></tr>
{{range .Inputs}}<tr><td><code>{{.Key}}</code></td><td>{{.Unit}}</td><td>{{.Dist}}</td><td>{{.Doc}}</td></tr>
{{end}}</table>
{{range .Correlations}}<p class="note">{{.}}</p>
{{end}}
{{if .Method}}<h2>Method</h2>
<p>{{.Method}}</p>
{{end}}
{{if .Warnings}}<h2>Warnings</h2>
{{range .Warnings}}<p class="warning">{{.}}</p>
{{end}}{{end}}
{{template "provenance" .Prov}}
</main>
</body>
</html>
`))

// styleHTML is the style sheet of rockheat's pages, for screen and for
// print on A4 or Letter: no chart or table split over a page.
const styleHTML = `{{define "style"}}<style>
:root { --ink: #242a30; --soft: #5c646c; --rule: #d9dde1; --band: #f4f6f7; --accent: #1d5b79; }
body { margin: 0; color: var(--ink); background: #fff; font: 15px/1.45 "Liberation Sans", Arial, Helvetica, sans-serif; }
main { max-width: 60rem; margin: 0 auto; padding: 1.5rem 1.25rem 3rem; }
h1 { font-size: 1.6rem; margin: 0 0 .25rem; }
h2 { font-size: 1.2rem; margin: 2.2rem 0 .6rem; padding-bottom: .2rem; border-bottom: 2px solid var(--accent); }
h3 { font-size: 1rem; margin: 1.4rem 0 .4rem; }
.run { color: var(--soft); margin: 0; }
.caution { border: 2px solid #b8860b; background: #fff8e1; padding: .7rem 1rem; margin: 1.2rem 0; }
.caution strong { color: #7a5600; }
.warning { border-left: 4px solid #a83a1c; background: #fdf0ec; padding: .4rem .8rem; margin: .5rem 0; }
table { border-collapse: collapse; margin: .4rem 0 .8rem; font-variant-numeric: tabular-nums; }
th, td { padding: .25rem .6rem; border-bottom: 1px solid var(--rule); vertical-align: top; }
th { text-align: left; background: var(--band); font-weight: 600; }
td.n, th.n { text-align: right; white-space: nowrap; }
tr.ci td { color: var(--soft); font-size: .82rem; border-bottom: 1px solid var(--rule); padding-top: 0; }
tr.fig td { border-bottom: none; }
.note { color: var(--soft); font-size: .9rem; margin: .3rem 0; }
.convention { font-size: .92rem; }
figure { margin: 1rem 0; }
figure svg { max-width: 100%; height: auto; display: block; border: 1px solid var(--rule); }
svg text { font-family: "Liberation Sans", Arial, Helvetica, sans-serif !important; }
.bar { display: inline-block; height: .7rem; background: #4a9ca6; vertical-align: middle; }
.barbox { display: inline-block; width: 8rem; background: var(--band); }
code { font-size: .9em; }
table.prov th { width: 8rem; }
code.hash { font-size: .78em; word-break: break-all; }
@page { margin: 14mm 12mm; }
@media print {
  body { font-size: 10.5pt; }
  main { max-width: none; padding: 0; }
  figure, table, .caution, .warning { break-inside: avoid; page-break-inside: avoid; }
  h2, h3 { break-after: avoid; page-break-after: avoid; }
  figure svg { max-width: 100%; border: none; }
}
</style>{{end}}`
