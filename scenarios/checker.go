package scenarios

import (
	"fmt"
	"slices"
	"sort"
	"strings"
)

// checker collects the problems of one file.
type checker struct {
	path     string
	lines    map[string]int  // dotted key → line
	problems Problems        // in the order found
	bad      map[string]bool // inputs whose value could not be read
	order    []string        // the model's input names, in report order
}

func (c *checker) add(key, format string, args ...any) {
	c.problems = append(c.problems, Problem{File: c.path, Line: c.lines[key], Key: key, Msg: fmt.Sprintf(format, args...)})
}

// sort orders the problems as a reader meets the file's parts: settings,
// layers, unknown inputs, the inputs in the model's order, then
// correlations.
func (c *checker) sort() {
	rank := func(p Problem) (int, int) {
		switch {
		case strings.HasPrefix(p.Key, "inputs."):
			name, _, _ := strings.Cut(strings.TrimPrefix(p.Key, "inputs."), ".")
			if i := slices.Index(c.order, name); i >= 0 {
				return 3, i
			}
			return 2, 0
		case strings.HasPrefix(p.Key, "layers"):
			return 1, 0
		case strings.HasPrefix(p.Key, "correlations"):
			return 4, 0
		}
		return 0, 0
	}
	sort.SliceStable(c.problems, func(i, j int) bool {
		a, ai := rank(c.problems[i])
		b, bi := rank(c.problems[j])
		return a < b || (a == b && ai < bi)
	})
}
