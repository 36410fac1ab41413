package main

import (
	"fmt"
	"io"
	"os"
	"time"
)

// progress reports a run's progress on a terminal: trials done, rate and
// time left, on one line rewritten in place. It stays silent for the
// first second, and altogether when w is not a terminal, so that CI logs
// stay clean.
type progress struct {
	w           io.Writer
	start, last time.Time
	shown       bool
}

// newProgress returns a progress reporter on w, or nil if w is not a
// terminal.
func newProgress(w io.Writer) *progress {
	f, ok := w.(*os.File)
	if !ok {
		return nil
	}
	if fi, err := f.Stat(); err != nil || fi.Mode()&os.ModeCharDevice == 0 {
		return nil
	}
	now := time.Now()
	return &progress{w: w, start: now, last: now}
}

// update is an Options.Progress callback.
func (p *progress) update(done, total int) {
	now := time.Now()
	el := now.Sub(p.start)
	if el < time.Second || (now.Sub(p.last) < 250*time.Millisecond && done < total) {
		return
	}
	p.last, p.shown = now, true
	rate := float64(done) / el.Seconds()
	eta := time.Duration(float64(total-done)/rate) * time.Second
	fmt.Fprintf(p.w, "\r%d of %d trials (%.0f%%), %.3g trials/s, about %s left   ",
		done, total, 100*float64(done)/float64(total), rate, eta.Round(time.Second))
}

// clear removes the progress line, if one was shown.
func (p *progress) clear() {
	if p != nil && p.shown {
		fmt.Fprintf(p.w, "\r%80s\r", "")
	}
}
