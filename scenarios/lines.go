package scenarios

import (
	"fmt"
	"regexp"
	"strings"
)

// indexLines maps dotted keys to the line where they are written, for
// messages. It understands [table] headers and key = value lines, and the
// keys of one-line inline tables.
func indexLines(src []byte) map[string]int {
	lines := map[string]int{}
	table, entry := "", "" // entry: "layers[2]" within the second [[layers]]
	count := map[string]int{}
	for i, l := range strings.Split(string(src), "\n") {
		l = strings.TrimSpace(l)
		if l == "" || l[0] == '#' {
			continue
		}
		if m := headerRE.FindStringSubmatch(l); m != nil {
			table, entry = strings.TrimSpace(m[1]), ""
			if _, ok := lines[table]; !ok {
				lines[table] = i + 1
			}
			if strings.HasPrefix(l, "[[") {
				count[table]++
				entry = fmt.Sprintf("%s[%d]", table, count[table])
				lines[entry] = i + 1
			}
			continue
		}
		if m := keyRE.FindStringSubmatch(l); m != nil {
			key := m[1]
			if entry != "" {
				lines[entry+"."+key] = i + 1
			}
			if table != "" {
				key = table + "." + key
			}
			if _, ok := lines[key]; !ok {
				lines[key] = i + 1
			}
			if j := strings.Index(l, "{"); j >= 0 {
				for _, sm := range innerRE.FindAllStringSubmatch(l[j:], -1) {
					if _, ok := lines[key+"."+sm[1]]; !ok {
						lines[key+"."+sm[1]] = i + 1
					}
				}
			}
		}
	}
	return lines
}

var (
	headerRE = regexp.MustCompile(`^\[\[?\s*([A-Za-z0-9_.\- ]+?)\s*\]\]?`)
	keyRE    = regexp.MustCompile(`^([A-Za-z0-9_\-]+)\s*=`)
	innerRE  = regexp.MustCompile(`[{,]\s*([A-Za-z0-9_\-]+)\s*=`)
)
