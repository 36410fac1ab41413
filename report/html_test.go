package report

import (
	"bytes"
	"html/template"
	"io"
	"strings"
	"testing"

	"rockheat"
)

// inlineSVGs returns the <svg>…</svg> elements of an HTML page.
func inlineSVGs(page string) []string {
	var out []string
	for {
		i := strings.Index(page, "<svg")
		if i < 0 {
			return out
		}
		j := strings.Index(page[i:], "</svg>")
		if j < 0 {
			return append(out, page[i:])
		}
		out = append(out, page[i:i+j+len("</svg>")])
		page = page[i+j+len("</svg>"):]
	}
}

// noActiveContent fails the test if page holds a script or loads
// anything from outside itself.
func noActiveContent(t *testing.T, page string) {
	t.Helper()
	low := strings.ToLower(page)
	for _, bad := range []string{"<script", "src=", "href=", "<link", "@import", "url(", "<iframe", "<object", "<embed",
		"javascript:", " onload=", " onerror=", " onclick="} {
		if strings.Contains(low, bad) {
			t.Errorf("page contains %q: it must have no script and no outside resource", bad)
		}
	}
}

func TestHTML(t *testing.T) {
	t.Parallel()
	for _, tc := range []struct {
		name string
		res  func(testing.TB) *rockheat.Result
		svgs int // exceedance and tornado of 2 headline outputs, and a decline
	}{{"demo", demoResult, 4}, {"hot-rock", hotRockResult, 5}} {
		t.Run(tc.name, func(t *testing.T) {
			t.Parallel()
			r := tc.res(t)
			var b, txt bytes.Buffer
			if err := HTML(&b, r); err != nil {
				t.Fatal(err)
			}
			if err := Text(&txt, r); err != nil {
				t.Fatal(err)
			}
			page := b.String()
			if !strings.HasPrefix(page, "<!DOCTYPE html>") || !strings.HasSuffix(strings.TrimSpace(page), "</html>") {
				t.Errorf("page is not a whole HTML document")
			}
			for _, want := range []string{Caution, Convention, r.Title} {
				if !strings.Contains(page, template.HTMLEscapeString(want)) {
					t.Errorf("page lacks %q", want)
				}
			}
			if !strings.Contains(page, `<div class="caution">`) {
				t.Errorf("the caution is not in its box")
			}
			// Same figures as the text report's table: heat rows in one
			// energy unit, from the largest median.
			_, eScale := heatUnit(r)
			for _, o := range r.Outputs {
				scale := 1.0
				if o.Spec.Unit == "J" {
					scale = eScale
				}
				p50 := fig(o.Summary.P50 / scale)
				cell := `<td class="n">` + template.HTMLEscapeString(p50) + `</td>`
				if !strings.Contains(page, cell) {
					t.Errorf("%s: no table cell %s with its P50", o.Spec.Name, cell)
				}
				if o.Spec.Group == "" && !strings.Contains(txt.String(), p50) {
					t.Errorf("%s: P50 %s is not the text report's figure", o.Spec.Name, p50)
				}
			}
			for _, in := range r.Inputs {
				if !strings.Contains(page, "<code>"+template.HTMLEscapeString(in.Key)+"</code></td><td>"+template.HTMLEscapeString(in.Unit)) {
					t.Errorf("inputs table lacks %s (%s)", in.Key, in.Unit)
				}
			}
			noActiveContent(t, page)
			svgs := inlineSVGs(page)
			if len(svgs) != tc.svgs {
				t.Errorf("%d inline SVG charts, want %d", len(svgs), tc.svgs)
			}
			for _, s := range svgs {
				parseSVG(t, s)
			}
			if strings.Contains(page, "<?xml") {
				t.Errorf("an XML prolog was left inside the HTML")
			}
		})
	}
}

func TestHTMLEscapes(t *testing.T) {
	t.Parallel()
	r := *demoResult(t)
	r.Title = `Vellmar <b>Ridge</b> & "Sons" <script>alert(1)</script>`
	r.Warnings = append(append([]string(nil), r.Warnings...), `check <img src=x onerror=alert(1)> the ranges`)
	r.Inputs = append([]rockheat.Input(nil), r.Inputs...)
	r.Inputs[0].Dist = `<i>uniform</i>`
	var b bytes.Buffer
	if err := HTML(&b, &r); err != nil {
		t.Fatal(err)
	}
	page := b.String()
	for _, bad := range []string{"<b>Ridge", "<i>uniform", "<img"} {
		if strings.Contains(page, bad) {
			t.Errorf("markup %q from the result reached the page unescaped", bad)
		}
	}
	for _, want := range []string{"&lt;b&gt;Ridge&lt;/b&gt;", "&lt;i&gt;uniform&lt;/i&gt;", "&lt;img src=x"} {
		if !strings.Contains(page, want) {
			t.Errorf("page lacks the escaped text %q", want)
		}
	}
	if strings.Contains(strings.ToLower(page), "<script") {
		t.Errorf("the title's <script> reached the page unescaped")
	}
	// The page's own text carries the title; the charts leave it out, so
	// that a script the chart typeface lacks still reads (see
	// TestHTMLNonLatinTitle).
	for _, s := range inlineSVGs(page) {
		if _, ok := findText(parseSVG(t, s), r.Title); ok {
			t.Errorf("a chart carries the title, which the page already shows")
		}
	}
}

// TestHTMLNonLatinTitle: a title in a non-Latin script reaches the page as
// text, in its heading and its <title>, not only inside the charts.
func TestHTMLNonLatinTitle(t *testing.T) {
	t.Parallel()
	r := *demoResult(t)
	r.Title = "Гора Вельмар 火山 (invented)"
	var b bytes.Buffer
	if err := HTML(&b, &r); err != nil {
		t.Fatal(err)
	}
	for _, want := range []string{"<h1>" + r.Title + "</h1>", "<title>" + r.Title + " · rockheat</title>"} {
		if !strings.Contains(b.String(), want) {
			t.Errorf("page lacks %q", want)
		}
	}
}

// TestChartTitleShortened: a title longer than a chart can hold is cut with
// an ellipsis at maxTitleRunes, never clipped at both ends by the renderer.
func TestChartTitleShortened(t *testing.T) {
	t.Parallel()
	r := *demoResult(t)
	r.Title = strings.Repeat("Very long invented prospect name ", 5)
	var b bytes.Buffer
	if err := ExceedanceSVG(&b, &r, "heat_in_place"); err != nil {
		t.Fatal(err)
	}
	want := string([]rune(r.Title)[:maxTitleRunes-1]) + "…"
	if _, ok := findText(parseSVG(t, b.String()), want); !ok {
		t.Errorf("no shortened title %q in the chart", want)
	}
}

func TestHTMLWithoutCharts(t *testing.T) {
	t.Parallel()
	// A result with no sensitivities (e.g. every input fixed) still gives
	// a page, with a note in place of each tornado chart.
	r := *demoResult(t)
	r.Sensitivity = nil
	var b bytes.Buffer
	if err := HTML(&b, &r); err != nil {
		t.Fatal(err)
	}
	page := b.String()
	if n := strings.Count(page, "No tornado chart:"); n != 2 {
		t.Errorf("%d notes in place of tornado charts, want 2", n)
	}
	if n := len(inlineSVGs(page)); n != 2 {
		t.Errorf("%d charts, want the 2 exceedance charts", n)
	}
	if strings.Contains(page, "<h2>Sensitivity</h2>") {
		t.Errorf("page has a sensitivity section with no sensitivities")
	}
}

func BenchmarkHTML(b *testing.B) {
	r := hotRockResult(b)
	for b.Loop() {
		if err := HTML(io.Discard, r); err != nil {
			b.Fatal(err)
		}
	}
}
