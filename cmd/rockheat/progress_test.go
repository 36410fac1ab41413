package main

import (
	"bytes"
	"strings"
	"testing"
	"time"
)

// TestProgress checks the progress line: silent in the first second and
// on a non-terminal writer, then trials done, share, rate and time left,
// and cleared at the end.
func TestProgress(t *testing.T) {
	var buf bytes.Buffer
	if p := newProgress(&buf); p != nil {
		t.Fatal("a bytes.Buffer is not a terminal, yet progress is on")
	}
	p := &progress{w: &buf, start: time.Now(), last: time.Now()}
	p.update(10, 100)
	if buf.Len() != 0 {
		t.Fatalf("progress shown within the first second: %q", buf.String())
	}
	p.start = time.Now().Add(-2 * time.Second)
	p.last = p.start
	p.update(50, 100)
	line := buf.String()
	for _, want := range []string{"50 of 100 trials", "(50%)", "trials/s", "left"} {
		if !strings.Contains(line, want) {
			t.Errorf("progress line %q lacks %q", line, want)
		}
	}
	buf.Reset()
	p.clear()
	if !strings.HasPrefix(buf.String(), "\r") || strings.TrimSpace(buf.String()) != "" {
		t.Errorf("clear wrote %q", buf.String())
	}
}
