package main

import (
	"bytes"
	"go/parser"
	"go/token"
	"os"
	"path/filepath"
	"regexp"
	"slices"
	"strings"
	"testing"

	"github.com/urfave/cli/v2"
)

// TestUsageDoc checks the usage in the package documentation (main.go)
// against the commands and flags the app has, both ways, so that the one
// cannot drift from the other.
func TestUsageDoc(t *testing.T) {
	f, err := parser.ParseFile(token.NewFileSet(), "main.go", nil, parser.ParseComments|parser.PackageClauseOnly)
	if err != nil {
		t.Fatal(err)
	}
	doc := f.Doc.Text()
	var buf bytes.Buffer
	app := newApp(&buf, &buf)
	for _, cmd := range app.Commands {
		if !strings.Contains(doc, "rockheat "+cmd.Name) {
			t.Errorf("the usage does not show the command %s", cmd.Name)
		}
		for _, fl := range cmd.Flags {
			name := "--" + fl.Names()[0]
			if !usageOf(doc, cmd.Name, name) {
				t.Errorf("the usage of %s does not show %s", cmd.Name, name)
			}
		}
	}
	for _, m := range regexp.MustCompile(`(?m)^\s*rockheat (\w+)(.*(?:\n\s{10,}.*)*)`).FindAllStringSubmatch(doc, -1) {
		cmd := findCommand(app, m[1])
		if cmd == nil {
			if m[1] != "help" {
				t.Errorf("the usage shows a command %q the app does not have", m[1])
			}
			continue
		}
		for _, fl := range regexp.MustCompile(`--[a-z-]+`).FindAllString(m[2], -1) {
			if !slices.ContainsFunc(cmd.Flags, func(f cli.Flag) bool { return "--"+f.Names()[0] == fl }) {
				t.Errorf("the usage of %s shows %s, which it does not take", m[1], fl)
			}
		}
	}
}

// usageOf reports whether the usage lines of command cmd in doc show flag.
func usageOf(doc, cmd, flag string) bool {
	i := strings.Index(doc, "rockheat "+cmd)
	if i < 0 {
		return false
	}
	rest := doc[i+len("rockheat "+cmd):]
	if j := regexp.MustCompile(`\n\s*rockheat `).FindStringIndex(rest); j != nil {
		rest = rest[:j[0]]
	}
	return strings.Contains(rest, flag+" ") || strings.Contains(rest, flag+"]")
}

func findCommand(app *cli.App, name string) *cli.Command {
	for _, c := range app.Commands {
		if c.Name == name {
			return c
		}
	}
	return nil
}

// TestREADMECommands runs the commands of the README's "Using it" section,
// as a new user would type them, in a scratch folder (with fewer trials
// where a command asks for millions), and checks that each succeeds.
func TestREADMECommands(t *testing.T) {
	readme, err := os.ReadFile(filepath.Join("..", "..", "README.md"))
	if err != nil {
		t.Fatal(err)
	}
	sec := string(readme)
	i := strings.Index(sec, "## Using it")
	if i < 0 {
		t.Fatal("README has no \"## Using it\" section")
	}
	sec = sec[i:]
	block := regexp.MustCompile("(?s)```sh\n(.*?)```").FindStringSubmatch(sec)
	if block == nil {
		t.Fatal("the Using it section has no sh block")
	}
	t.Chdir(t.TempDir())
	n := 0
	for _, line := range strings.Split(block[1], "\n") {
		line = strings.TrimSpace(strings.SplitN(line, "#", 2)[0])
		if !strings.HasPrefix(line, "rockheat ") {
			continue
		}
		fields := strings.Fields(line)
		var stdout string
		if k := slices.Index(fields, ">"); k >= 0 {
			stdout, fields = fields[k+1], fields[:k]
		}
		for k, f := range fields {
			if (f == "--trials" || f == "--max-trials") && k+1 < len(fields) {
				fields[k+1] = "20000"
			}
		}
		var out, errw bytes.Buffer
		err := run(&out, &errw, fields)
		if code := exitCode(err); code != 0 {
			t.Errorf("%s: exit %d: %v\n%s", line, code, err, errw.String())
		}
		if stdout != "" {
			os.WriteFile(stdout, out.Bytes(), 0o644)
		}
		n++
	}
	if n < 8 {
		t.Errorf("ran only %d README commands", n)
	}
}
