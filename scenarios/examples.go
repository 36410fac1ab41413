package scenarios

import (
	"embed"
	"fmt"
	"io/fs"
	"os"
	"path"
	"sort"
	"strings"

	"github.com/BurntSushi/toml"
)

//go:embed examples/*.toml
var examplesFS embed.FS

// Example is a bundled scenario: an invented prospect to run or copy.
type Example struct {
	Name  string // name to give `rockheat examples NAME`, e.g. "demo"
	Title string // the scenario's title
	// Description is the first line of the file's opening comment, which
	// says what the prospect represents; the title if the file opens with
	// no comment.
	Description string
	Text        []byte // the commented TOML file
}

// Examples returns the bundled example scenarios, sorted by name.
func Examples() []Example {
	entries, err := fs.ReadDir(examplesFS, "examples")
	if err != nil {
		panic(err) // embedded at build time
	}
	var out []Example
	for _, e := range entries {
		if ex, ok := readExample(strings.TrimSuffix(e.Name(), path.Ext(e.Name()))); ok {
			out = append(out, ex)
		}
	}
	sort.Slice(out, func(i, j int) bool { return out[i].Name < out[j].Name })
	return out
}

// readExample reads the bundled example called name, if there is one.
func readExample(name string) (Example, bool) {
	text, err := examplesFS.ReadFile("examples/" + name + ".toml")
	if err != nil {
		return Example{}, false
	}
	ex := Example{Name: name, Text: text}
	// Only the title: checking the example would build its
	// distributions' tables.
	var head struct {
		Title string `toml:"title"`
	}
	if _, err := toml.Decode(string(text), &head); err == nil {
		ex.Title = head.Title
	}
	ex.Description = describe(text, ex.Title)
	return ex, true
}

// describe returns the first line of the comment text opens with, without
// its "#", or title when text does not open with a comment.
func describe(text []byte, title string) string {
	first, _, _ := strings.Cut(string(text), "\n")
	first = strings.TrimSpace(first)
	if d := strings.TrimSpace(strings.TrimLeft(first, "#")); strings.HasPrefix(first, "#") && d != "" {
		return d
	}
	return title
}

// LookupExample returns the bundled example with the given name.
func LookupExample(name string) (Example, error) {
	if !strings.ContainsAny(name, "/.") {
		if ex, ok := readExample(name); ok {
			return ex, nil
		}
	}
	var names []string
	for _, ex := range Examples() {
		names = append(names, ex.Name)
	}
	return Example{}, fmt.Errorf("no bundled example named %q; the examples are %s", name, strings.Join(names, ", "))
}

// Load reads the scenario at arg: a file path, or the name of a bundled
// example when no such file exists and arg has no .toml suffix.
func Load(arg string) (*Scenario, error) {
	if bundledName(arg) {
		if ex, err := LookupExample(arg); err == nil {
			return Parse("example "+ex.Name, ex.Text)
		}
	}
	return LoadFile(arg)
}

// bundledName reports whether arg may name a bundled file: it is not a
// file here and looks like no path (no .toml suffix, no slash).
func bundledName(arg string) bool {
	if strings.HasSuffix(arg, ".toml") || strings.ContainsRune(arg, '/') {
		return false
	}
	_, err := os.Stat(arg)
	return err != nil
}
