// Package report renders a rockheat Result as text, JSON, CSV, SVG charts
// (exceedance curves, tornado charts, hot-rock decline) and a
// self-contained HTML page, and writes files whole: to a temporary file
// first, renamed into place only when complete.
package report
