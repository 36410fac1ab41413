// Package report renders a rockheat Result as text, JSON or CSV, and
// writes files whole: to a temporary file first, renamed into place
// only when complete.
package report
