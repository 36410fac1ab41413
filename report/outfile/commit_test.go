package outfile

import (
	"bytes"
	"errors"
	"io"
	"io/fs"
	"os"
	"strings"
	"syscall"
	"testing"
)

// content writes "new NAME", the content every test output gets.
func content(name string) func(io.Writer) error {
	return func(w io.Writer) error {
		_, err := io.WriteString(w, "new "+name)
		return err
	}
}

// TestCommit writes one output of every kind and checks where each went
// and its mode: a replaced file keeps its mode, a new file gets 0644 and
// a new folder 0755 whatever the umask (set to 077 here), a symbolic link
// stays and its file is written, a FIFO and standard output are written
// directly, and nothing hidden is left behind. File kinds and modes are
// POSIX's; the modes kept and given are this package's rules.
func TestCommit(t *testing.T) {
	t.Chdir(t.TempDir())
	old := syscall.Umask(0o077)
	defer syscall.Umask(old)
	build(t, "file s.toml", "file old.csv 0600", "file real.html 0640", "link l.html real.html", "fifo f")

	var stdout bytes.Buffer
	s := New(&stdout, Input{"s.toml", "the scenario being run"})
	add := func(flag, path string) *Target {
		tg, err := s.Add(flag, path)
		if err != nil {
			t.Fatal(err)
		}
		return tg
	}
	outs := map[*Target]string{add("--out", "-"): "-", add("--samples", "old.csv"): "old.csv",
		add("--x", "l.html"): "l.html", add("--y", "f"): "f", add("--z", "new.txt"): "new.txt"}
	plots, err := s.AddFolder("--plots", "plots", chartPatterns...)
	if err != nil {
		t.Fatal(err)
	}
	for _, name := range []string{"decline.svg", "exceedance-a.svg"} {
		tg, err := plots.Add(name)
		if err != nil {
			t.Fatal(err)
		}
		outs[tg] = "plots/" + name
	}
	fifo := make(chan string)
	go func() {
		b, _ := os.ReadFile("f") // waits for Commit to open the FIFO
		fifo <- string(b)
	}()
	for tg, name := range outs {
		if err := tg.Write(content(name)); err != nil {
			t.Fatal(err)
		}
	}
	if err := s.Commit(); err != nil {
		t.Fatal(err)
	}

	if got := <-fifo; got != "new f" {
		t.Errorf("the FIFO read %q", got)
	}
	if got := stdout.String(); got != "new -" {
		t.Errorf("standard output holds %q", got)
	}
	for _, c := range []struct {
		path, content string
		mode          fs.FileMode
	}{
		{"old.csv", "new old.csv", 0o600},
		{"real.html", "new l.html", 0o640},
		{"new.txt", "new new.txt", 0o644},
		{"plots/decline.svg", "new plots/decline.svg", 0o644},
		{"plots/exceedance-a.svg", "new plots/exceedance-a.svg", 0o644},
		{"s.toml", "old s.toml", 0o644},
	} {
		b, err := os.ReadFile(c.path)
		fi, serr := os.Stat(c.path)
		if err != nil || serr != nil || string(b) != c.content || fi.Mode() != c.mode {
			t.Errorf("%s: %q, mode %v (%v, %v); want %q, mode %v", c.path, b, fi.Mode(), err, serr, c.content, c.mode)
		}
	}
	if fi, err := os.Lstat("l.html"); err != nil || fi.Mode()&fs.ModeSymlink == 0 {
		t.Errorf("l.html is no longer a symbolic link (%v)", err)
	}
	if fi, err := os.Lstat("f"); err != nil || fi.Mode()&fs.ModeNamedPipe == 0 {
		t.Errorf("the FIFO was replaced (%v)", err)
	}
	if fi, err := os.Stat("plots"); err != nil || fi.Mode() != fs.ModeDir|0o755 {
		t.Errorf("plots: %v (%v), want a folder of mode 0755", fi.Mode(), err)
	}
	if h := hidden(t, "."); len(h) > 0 {
		t.Errorf("left behind: %v", h)
	}
}

// TestFailureTakesBack makes one output fail in each way it can and
// checks that the run leaves the folder as it found it: the replaced
// file restored with its content and mode, new files and the new plots
// folder removed, no temporary file or backup left. All or nothing is
// this package's rule.
func TestFailureTakesBack(t *testing.T) {
	cases := []struct {
		name    string
		failing string // the output whose content fails to be written
		device  bool   // add --d /dev/full, whose writes fail
		before  func() // done between the writes and Commit
		abort   bool   // Abort instead of Commit
		commit  bool   // Commit, not Abort, after the failed write
		want    string // in the error
	}{
		{name: "a later file fails", failing: "c.txt", want: "writing --c c.txt: disk on fire"},
		{name: "a chart fails", failing: "plots/decline.svg", want: "writing --plots plots/decline.svg: disk on fire"},
		{name: "a rename fails", before: func() { os.MkdirAll("c.txt/x", 0o755) }, want: "putting --c c.txt in place"},
		{name: "a device fails", device: true, want: "writing --d /dev/full: write /dev/full: no space left on device"},
		{name: "aborted", abort: true, want: "the run was stopped"},
		{name: "Commit after a failed write", failing: "c.txt", commit: true, want: "the run was stopped"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			t.Chdir(t.TempDir())
			build(t, "file a.txt 0600")
			s := New(io.Discard)
			var order []*Target
			var names []string
			for _, fp := range [][2]string{{"--a", "a.txt"}, {"--b", "b.txt"}, {"--c", "c.txt"}} {
				tg, err := s.Add(fp[0], fp[1])
				if err != nil {
					t.Fatal(err)
				}
				order, names = append(order, tg), append(names, fp[1])
			}
			plots, err := s.AddFolder("--plots", "plots", chartPatterns...)
			if err != nil {
				t.Fatal(err)
			}
			tg, err := plots.Add("decline.svg")
			if err != nil {
				t.Fatal(err)
			}
			order, names = append(order, tg), append(names, "plots/decline.svg")
			if c.device {
				tg, err := s.Add("--d", "/dev/full")
				if err != nil {
					t.Skip(err) // no /dev/full here
				}
				if !tg.direct() {
					t.Fatal("/dev/full is not written directly; stopping before it is replaced")
				}
				order, names = append(order, tg), append(names, "/dev/full")
			}

			err = nil
			for i, tg := range order {
				fn := content(names[i])
				if names[i] == c.failing {
					fn = func(w io.Writer) error { io.WriteString(w, "partial"); return errors.New("disk on fire") }
				}
				if err = tg.Write(fn); err != nil {
					if c.commit {
						err = s.Commit() // the failed write took the set back: refused
					} else {
						s.Abort()
					}
					break
				}
			}
			if err == nil {
				if c.before != nil {
					c.before()
				}
				if c.abort {
					if aerr := s.Abort(); aerr != nil {
						t.Fatal(aerr)
					}
				}
				err = s.Commit()
			}
			if err == nil || !strings.Contains(err.Error(), c.want) {
				t.Fatalf("error %v, want one with %q", err, c.want)
			}
			if b, err := os.ReadFile("a.txt"); string(b) != "old a.txt" {
				t.Errorf("a.txt holds %q (%v), want its old content", b, err)
			}
			if fi, err := os.Stat("a.txt"); err != nil || fi.Mode() != 0o600 {
				t.Errorf("a.txt: mode %v (%v), want 0600", fi.Mode(), err)
			}
			for _, gone := range []string{"b.txt", "plots"} {
				if _, err := os.Lstat(gone); !errors.Is(err, fs.ErrNotExist) {
					t.Errorf("%s is there after the failure (%v)", gone, err)
				}
			}
			if fi, err := os.Lstat("c.txt"); err == nil && fi.Mode().IsRegular() {
				t.Errorf("c.txt was written")
			}
			if h := hidden(t, "."); len(h) > 0 {
				t.Errorf("left behind: %v", h)
			}
		})
	}
}

// TestAbortWhileWriting: Abort from another goroutine (as on an
// interrupt) while an output is being written removes its temporary file
// at once, and Commit then refuses.
func TestAbortWhileWriting(t *testing.T) {
	t.Chdir(t.TempDir())
	s := New(io.Discard)
	tg, err := s.Add("--out", "x.txt")
	if err != nil {
		t.Fatal(err)
	}
	started, release, done := make(chan bool), make(chan bool), make(chan error)
	go func() {
		done <- tg.Write(func(w io.Writer) error {
			started <- true
			<-release
			_, err := io.WriteString(w, "late")
			return err
		})
	}()
	<-started
	if h := hidden(t, "."); len(h) != 1 || !strings.HasPrefix(h[0], ".x.txt.tmp-") {
		t.Fatalf("while writing, hidden files %v, want one .x.txt.tmp-*", h)
	}
	if err := s.Abort(); err != nil {
		t.Fatal(err)
	}
	if h := hidden(t, "."); len(h) > 0 {
		t.Errorf("after Abort: %v", h)
	}
	close(release)
	<-done
	if err := s.Commit(); err == nil {
		t.Error("Commit after Abort succeeded")
	}
	if _, err := os.Lstat("x.txt"); !errors.Is(err, fs.ErrNotExist) {
		t.Errorf("x.txt exists after Abort (%v)", err)
	}
	if h := hidden(t, "."); len(h) > 0 {
		t.Errorf("left behind: %v", h)
	}
}
