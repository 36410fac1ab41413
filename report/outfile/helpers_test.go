package outfile

import (
	"net"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"syscall"
	"testing"
)

// build makes the files of spec in the current folder. Each entry is
// "file NAME [MODE]" (content "old NAME"), "dir NAME [MODE]",
// "chmod NAME MODE", "link NAME TARGET", "hard NAME TARGET", "fifo NAME"
// or "sock NAME".
// Modes are octal; folders are given back mode 0755 at the end of the
// test so that they can be removed.
func build(t *testing.T, spec ...string) {
	t.Helper()
	for _, s := range spec {
		f := strings.Fields(s)
		mode := func(def os.FileMode) os.FileMode {
			if len(f) < 3 {
				return def
			}
			m, err := strconv.ParseUint(f[2], 8, 32)
			if err != nil {
				t.Fatal(err)
			}
			return os.FileMode(m)
		}
		var err error
		switch f[0] {
		case "file":
			if err = os.WriteFile(f[1], []byte("old "+f[1]), 0o644); err == nil {
				err = os.Chmod(f[1], mode(0o644))
			}
		case "dir":
			if err = os.Mkdir(f[1], 0o755); err == nil {
				err = os.Chmod(f[1], mode(0o755))
				abs, _ := filepath.Abs(f[1])
				t.Cleanup(func() { os.Chmod(abs, 0o755) })
			}
		case "chmod":
			err = os.Chmod(f[1], mode(0))
		case "link":
			err = os.Symlink(f[2], f[1])
		case "hard":
			err = os.Link(f[2], f[1])
		case "fifo":
			err = syscall.Mkfifo(f[1], 0o644)
		case "sock":
			var l net.Listener
			if l, err = net.Listen("unix", f[1]); err == nil {
				t.Cleanup(func() { l.Close() })
			}
		default:
			t.Fatalf("bad spec %q", s)
		}
		if err != nil {
			t.Fatalf("%s: %v", s, err)
		}
	}
}

// hidden lists the names starting with "." in dir and its sub-folders:
// temporary files and backups left behind.
func hidden(t *testing.T, dir string) []string {
	t.Helper()
	var found []string
	filepath.WalkDir(dir, func(path string, d os.DirEntry, err error) error {
		if err == nil && strings.HasPrefix(d.Name(), ".") && path != dir {
			found = append(found, path)
		}
		return nil
	})
	return found
}
