package scenarios

import (
	"fmt"
	"strings"
)

// suggest returns ` (did you mean "x"?)` for the nearest valid name within
// a small edit distance, or "".
func suggest(name string, valid []string) string {
	base := name
	if i := strings.LastIndex(name, "."); i >= 0 {
		base = name[i+1:]
	}
	best, bestD := "", 3
	for _, v := range valid {
		vb := v
		if i := strings.LastIndex(v, "."); i >= 0 {
			vb = v[i+1:]
		}
		if d := editDistance(base, vb); d < bestD {
			best, bestD = v, d
		}
	}
	if best == "" {
		return ""
	}
	return fmt.Sprintf(" (did you mean %q?)", best)
}

// editDistance returns the Levenshtein distance between a and b.
func editDistance(a, b string) int {
	prev := make([]int, len(b)+1)
	cur := make([]int, len(b)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(a); i++ {
		cur[0] = i
		for j := 1; j <= len(b); j++ {
			cost := 1
			if a[i-1] == b[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(b)]
}
