package main

import (
	"bytes"
	"errors"
	"io/fs"
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"strings"
	"syscall"
	"testing"
	"time"
)

// TestMain runs the command itself when the tests start this test binary
// as a child process (ROCKHEAT_RUN_MAIN=1), to test interrupts.
func TestMain(m *testing.M) {
	if os.Getenv("ROCKHEAT_RUN_MAIN") == "1" {
		main()
		return
	}
	os.Exit(m.Run())
}

// inScenarioDir makes a fresh current folder holding s.toml (a copy of
// testdata/small.toml) and the files of spec (see build).
func inScenarioDir(t *testing.T, spec ...string) {
	t.Helper()
	src, err := os.ReadFile(filepath.Join("..", "..", "testdata", "small.toml"))
	if err != nil {
		t.Fatal(err)
	}
	t.Chdir(t.TempDir())
	if err := os.WriteFile("s.toml", src, 0o644); err != nil {
		t.Fatal(err)
	}
	build(t, spec...)
}

// build makes the files of spec in the current folder: "file NAME [MODE]"
// (content "old NAME"), "dir NAME", "link NAME TARGET", "hard NAME
// TARGET" or "fifo NAME".
func build(t *testing.T, spec ...string) {
	t.Helper()
	for _, s := range spec {
		f := strings.Fields(s)
		var err error
		switch f[0] {
		case "file":
			mode := os.FileMode(0o644)
			if len(f) == 3 {
				var m uint64
				m, err = strconv.ParseUint(f[2], 8, 32)
				mode = os.FileMode(m)
			}
			if err == nil {
				err = os.WriteFile(f[1], []byte("old "+f[1]), 0o644)
			}
			if err == nil {
				err = os.Chmod(f[1], mode)
			}
		case "dir":
			err = os.Mkdir(f[1], 0o755)
		case "link":
			err = os.Symlink(f[2], f[1])
		case "hard":
			err = os.Link(f[2], f[1])
		case "fifo":
			err = syscall.Mkfifo(f[1], 0o644)
		default:
			t.Fatalf("bad spec %q", s)
		}
		if err != nil {
			t.Fatalf("%s: %v", s, err)
		}
	}
}

// snapshot describes every file under the current folder: name, type,
// mode, content or link, one line each.
func snapshot(t *testing.T) string {
	t.Helper()
	var b strings.Builder
	filepath.WalkDir(".", func(path string, d fs.DirEntry, err error) error {
		if err != nil {
			t.Fatal(err)
		}
		fi, err := os.Lstat(path)
		if err != nil {
			t.Fatal(err)
		}
		b.WriteString(path + " " + fi.Mode().String())
		switch {
		case fi.Mode()&fs.ModeSymlink != 0:
			l, _ := os.Readlink(path)
			b.WriteString(" -> " + l)
		case fi.Mode().IsRegular():
			c, _ := os.ReadFile(path)
			b.WriteString(" " + strings.ReplaceAll(string(c[:min(len(c), 40)]), "\n", `\n`))
		}
		b.WriteString("\n")
		return nil
	})
	return b.String()
}

// TestOutputRefused: an output path that is an input, that two outputs
// share, or that cannot be written is a usage error (exit 2) with a
// message naming the path and the fix, found before the run, and nothing
// is written. Every case asks for more trials than a run may take, so an
// error from the run itself would show that the paths were checked too
// late.
func TestOutputRefused(t *testing.T) {
	for _, c := range []struct {
		name  string
		files []string
		args  string
		want  string
	}{
		{"the scenario", nil, "--out s.toml", "--out s.toml is the scenario being run; choose another file name"},
		{"the scenario spelled otherwise", nil, "--samples ./s.toml", "--samples ./s.toml is the scenario being run (s.toml); choose another file name"},
		{"a link to the scenario", []string{"link l.toml s.toml"}, "--out l.toml", "--out l.toml is the scenario being run (s.toml); choose another file name"},
		{"a hard link of the scenario", []string{"hard h.toml s.toml"}, "--out h.toml", "--out h.toml is the scenario being run (s.toml); choose another file name"},
		{"two outputs in one file", nil, "--samples x.csv --out x.csv", "--samples x.csv and --out x.csv are the same file; give each output its own file"},
		{"two outputs to standard output", nil, "--samples -", "--samples - and --out - both write to standard output; give one of them a file name"},
		{"a chart's name in the plots folder", []string{"dir charts"}, "--plots charts --out charts/decline.svg",
			"--out charts/decline.svg has the name of a chart that --plots charts writes; choose another file name or another --plots folder"},
		{"the plots folder as the report", nil, "--plots charts --out charts", "--plots charts is also --out charts; choose another folder"},
		{"a read-only file", []string{"file ro.txt 0444"}, "--out ro.txt",
			"--out ro.txt is read-only (mode 0444); make it writable (chmod u+w ro.txt) or choose another file name"},
		{"a read-only chart", []string{"dir charts", "file charts/exceedance-heat_in_place.svg 0444"}, "--plots charts",
			"--plots charts/exceedance-heat_in_place.svg is read-only (mode 0444); make it writable (chmod u+w charts/exceedance-heat_in_place.svg) or choose another file name"},
		{"a folder as the report", []string{"dir d"}, "--out d", "--out d is a folder, not a file; give the name of a file, e.g. d/NAME"},
		{"a missing folder", nil, "--samples no/x.csv",
			"--samples no/x.csv: the folder no does not exist; create it (mkdir -p no) or choose another path"},
		{"a file as the plots folder", nil, "--plots s.toml", "--plots s.toml is a file, not a folder; give a folder name (a missing folder is created)"},
	} {
		t.Run(c.name, func(t *testing.T) {
			inScenarioDir(t, c.files...)
			before := snapshot(t)
			var stdout, stderr bytes.Buffer
			err := run(&stdout, &stderr, append([]string{"rockheat", "run", "s.toml", "--trials", "20000000000"}, strings.Fields(c.args)...))
			if code := exitCode(err); code != exitBadInput || err.Error() != c.want {
				t.Errorf("exit %d, error:\n %v\nwant exit 2, error:\n %s", code, err, c.want)
			}
			if after := snapshot(t); after != before || stdout.Len() > 0 {
				t.Errorf("files before:\n%s\nafter:\n%s\nstdout: %d bytes", before, after, stdout.Len())
			}
		})
	}
}

// TestOutputKinds: a replaced file keeps its mode (a new one gets 0644,
// whatever the umask: 077 here), a symbolic link is written through and
// stays, a FIFO is written directly, and - is standard output. File kinds
// and modes are POSIX's; the rules are rockheat's (README).
func TestOutputKinds(t *testing.T) {
	old := syscall.Umask(0o077)
	defer syscall.Umask(old)
	const report = "Brannoch Flats (invented test prospect)" // the report's first line
	for _, c := range []struct {
		name   string
		files  []string
		args   string
		stdout string // the start of standard output
		file   string // the file that must hold the report
		mode   fs.FileMode
		link   string // a symbolic link that must remain
		fifo   bool   // read the report from the FIFO f
	}{
		{"a replaced file keeps its mode", []string{"file out.txt 0600"}, "--out out.txt", "", "out.txt", 0o600, "", false},
		{"a new file", nil, "--out out.txt", "", "out.txt", 0o644, "", false},
		{"a link is written through", []string{"file real.txt 0640", "link l.txt real.txt"}, "--out l.txt", "", "real.txt", 0o640, "l.txt", false},
		{"a link to a new file", []string{"link l.txt real.txt"}, "--out l.txt", "", "real.txt", 0o644, "l.txt", false},
		{"a FIFO", []string{"fifo f"}, "--out f", "", "", 0, "", true},
		{"samples to standard output", nil, "--samples - --out out.txt", "trial,", "out.txt", 0o644, "", false},
		{"the report to standard output", nil, "--out -", report, "", 0, "", false},
	} {
		t.Run(c.name, func(t *testing.T) {
			inScenarioDir(t, c.files...)
			fifo := make(chan string, 1)
			if c.fifo {
				go func() {
					b, _ := os.ReadFile("f")
					fifo <- string(b)
				}()
			}
			var stdout, stderr bytes.Buffer
			args := append([]string{"rockheat", "run", "s.toml", "--trials", "500"}, strings.Fields(c.args)...)
			if err := run(&stdout, &stderr, args); err != nil {
				t.Fatal(err)
			}
			if !strings.HasPrefix(stdout.String(), c.stdout) || c.stdout == "" && stdout.Len() > 0 {
				t.Errorf("stdout starts %.40q, want %q", stdout.String(), c.stdout)
			}
			if _, err := os.Lstat("-"); err == nil {
				t.Error("a file called - was written")
			}
			if c.file != "" {
				b, err := os.ReadFile(c.file)
				mode := fs.FileMode(0)
				if fi, serr := os.Stat(c.file); serr == nil {
					mode = fi.Mode()
				}
				if err != nil || !strings.HasPrefix(string(b), report) || mode != c.mode {
					t.Errorf("%s: %.40q, mode %v (%v); want the report, mode %v", c.file, b, mode, err, c.mode)
				}
			}
			if c.link != "" {
				if fi, err := os.Lstat(c.link); err != nil || fi.Mode()&fs.ModeSymlink == 0 {
					t.Errorf("%s is no longer a symbolic link (%v)", c.link, err)
				}
			}
			if c.fifo {
				if fi, err := os.Lstat("f"); err != nil || fi.Mode()&fs.ModeNamedPipe == 0 {
					t.Fatalf("the FIFO was replaced (%v)", err)
				}
				if got := <-fifo; !strings.HasPrefix(got, report) {
					t.Errorf("the FIFO read %.40q", got)
				}
			}
		})
	}
}

// TestAllOrNothing: when one output fails (here --samples to a FIFO whose
// reader has gone: a broken pipe) the run fails (exit 1) and leaves the
// folder as it was: the replaced report restored, the new plots folder
// removed, no temporary file. When the run is stopped by SIGINT or
// SIGTERM while writing, the same holds, and the exit status is 128 +
// the signal's number, as a shell reports a process a signal ended.
func TestAllOrNothing(t *testing.T) {
	for _, c := range []struct {
		name string
		sig  syscall.Signal // 0: the FIFO's reader closes it at once
		code int
	}{
		{"broken pipe", 0, exitFailure},
		{"SIGINT", syscall.SIGINT, 130},
		{"SIGTERM", syscall.SIGTERM, 143},
	} {
		t.Run(c.name, func(t *testing.T) {
			inScenarioDir(t, "file out.txt 0600", "fifo f")
			before := snapshot(t)
			args := []string{"run", "s.toml", "--trials", "2000", "--out", "out.txt", "--samples", "f", "--plots", "charts"}
			var code int
			var stderr string
			if c.sig == 0 {
				go func() {
					if f, err := os.Open("f"); err == nil {
						f.Close()
					}
				}()
				var so, se bytes.Buffer
				err := run(&so, &se, append([]string{"rockheat"}, args...))
				code, stderr = exitCode(err), se.String()+errString(err)
			} else {
				code, stderr = interrupted(t, c.sig, args)
			}
			if code != c.code {
				t.Errorf("exit %d, want %d; stderr:\n%s", code, c.code, stderr)
			}
			if after := snapshot(t); after != before {
				t.Errorf("files before:\n%s\nafter:\n%s", before, after)
			}
		})
	}
}

func errString(err error) string {
	if err == nil {
		return ""
	}
	return err.Error()
}

// interrupted runs rockheat with args as a child process in the current
// folder, sends it sig once it has begun writing (the report's
// temporary file exists; it then waits for a reader of the FIFO f, which
// never comes) and returns its exit status and standard error.
func interrupted(t *testing.T, sig syscall.Signal, args []string) (int, string) {
	t.Helper()
	cmd := exec.Command(os.Args[0], args...)
	cmd.Env = append(os.Environ(), "ROCKHEAT_RUN_MAIN=1")
	var stderr bytes.Buffer
	cmd.Stderr = &stderr
	if err := cmd.Start(); err != nil {
		t.Fatal(err)
	}
	done := make(chan error, 1)
	go func() { done <- cmd.Wait() }()
	guard := time.AfterFunc(time.Minute, func() { cmd.Process.Kill() }) // against a hang, not a timing check
	defer guard.Stop()
	for {
		if tmp, _ := filepath.Glob(".out.txt.tmp-*"); len(tmp) > 0 {
			break
		}
		select {
		case err := <-done:
			t.Fatalf("rockheat ended (%v) before it began writing; stderr:\n%s", err, stderr.String())
		case <-time.After(5 * time.Millisecond):
		}
	}
	if err := cmd.Process.Signal(sig); err != nil {
		t.Fatal(err)
	}
	<-done
	return cmd.ProcessState.ExitCode(), stderr.String()
}

// TestPlotsSkipUnmovedOutputs: with one sampled input, the conversion
// efficiency, heat in place moves with no input, so it has no tornado
// chart; --plots writes the others (electric capacity's tornado among
// them) rather than failing the run.
func TestPlotsSkipUnmovedOutputs(t *testing.T) {
	dir := t.TempDir()
	path := scenarioFile(t, dir, "one.toml",
		`area_km2 = { dist = "triangular", min = 3, mode = 6, max = 14 }`, "area_km2 = 6",
		`thickness_m = { dist = "uniform", min = 800, max = 1600 }`, "thickness_m = 1200",
		`reservoir_temp_c = { dist = "normal", mean = 235, sd = 12, min = 200 }`, "reservoir_temp_c = 235",
		`porosity = { dist = "pert", min = 0.02, mode = 0.06, max = 0.12 }`, "porosity = 0.06",
		`rock_heat_capacity_j_kgk = { dist = "uniform", min = 850, max = 1000 }`, "rock_heat_capacity_j_kgk = 900",
		`recovery_factor = { dist = "uniform", min = 0.08, max = 0.20 }`, "recovery_factor = 0.14")
	plots := filepath.Join(dir, "plots")
	var out, errw bytes.Buffer
	if err := run(&out, &errw, []string{"rockheat", "run", path, "--trials", "2000", "--plots", plots, "--out", filepath.Join(dir, "r.txt")}); err != nil {
		t.Fatalf("%v\n%s", err, errw.String())
	}
	if _, err := os.Stat(filepath.Join(plots, "tornado-heat_in_place.svg")); !errors.Is(err, fs.ErrNotExist) {
		t.Errorf("a tornado chart of heat in place, which no input moves (%v)", err)
	}
	for _, name := range []string{"tornado-electric_power.svg", "exceedance-heat_in_place.svg"} {
		if _, err := os.Stat(filepath.Join(plots, name)); err != nil {
			t.Errorf("%s: %v", name, err)
		}
	}
}
