// Package report renders a rockheat Result as text, JSON, CSV, SVG charts
// (exceedance curves, tornado charts, hot-rock decline) and a
// self-contained HTML page. Writing them to files safely is the job of
// report/outfile.
package report
