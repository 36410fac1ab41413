package rockheat_test

import (
	"io/fs"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
)

// TestReferenceCitations checks that every citation "docs/references.md §N"
// in the code and tests points at a section the project's references file
// has, so that no check cites a source the project does not hold.
func TestReferenceCitations(t *testing.T) {
	t.Parallel()
	doc, err := os.ReadFile("docs/references.md")
	if err != nil {
		t.Fatal(err)
	}
	sections := map[string]bool{}
	for _, m := range regexp.MustCompile(`(?m)^## (§\d+) `).FindAllStringSubmatch(string(doc), -1) {
		sections[m[1]] = true
	}
	cite := regexp.MustCompile(`docs/references\.md\s+((?:§\d+(?:[/,]\s*)?)+)`)
	sect := regexp.MustCompile(`§\d+`)
	wrapped := regexp.MustCompile(`\n\s*//\s*`)
	n := 0
	err = filepath.WalkDir(".", func(path string, d fs.DirEntry, err error) error {
		if err != nil || d.IsDir() && strings.HasPrefix(d.Name(), ".") && path != "." {
			if err == nil {
				return filepath.SkipDir
			}
			return err
		}
		if d.IsDir() || !(strings.HasSuffix(path, ".go") || strings.HasSuffix(path, ".py")) {
			return nil
		}
		src, err := os.ReadFile(path)
		if err != nil {
			return err
		}
		text := wrapped.ReplaceAllString(string(src), " ") // citations may wrap, in indented comments too
		for _, m := range cite.FindAllStringSubmatch(text, -1) {
			for _, s := range sect.FindAllString(m[1], -1) {
				n++
				if !sections[s] {
					t.Errorf("%s cites docs/references.md %s, which has no such section", path, s)
				}
			}
		}
		return nil
	})
	if err != nil {
		t.Fatal(err)
	}
	if n < 10 {
		t.Errorf("found only %d citations of docs/references.md; the pattern may have broken", n)
	}
}
