package scenarios

import (
	"fmt"
	"strings"
)

// Problem is one thing wrong with a scenario file.
type Problem struct {
	File string // path of the scenario file as given
	Line int    // 1-based line where the key stands, 0 if unknown
	Key  string // dotted key, e.g. "inputs.porosity"; "" for the whole file
	Msg  string // what is wrong and how to fix it
}

func (p Problem) Error() string {
	var b strings.Builder
	b.WriteString(p.File)
	if p.Line > 0 {
		fmt.Fprintf(&b, ":%d", p.Line)
	}
	b.WriteString(": ")
	if p.Key != "" {
		b.WriteString(p.Key)
		b.WriteString(": ")
	}
	b.WriteString(p.Msg)
	return b.String()
}

// Problems is every problem found in a scenario file. Load returns it as
// its error when the file cannot be run.
type Problems []Problem

func (ps Problems) Error() string {
	lines := make([]string, len(ps))
	for i, p := range ps {
		lines[i] = p.Error()
	}
	return strings.Join(lines, "\n")
}
