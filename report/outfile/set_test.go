package outfile

import (
	"io"
	"os"
	"strings"
	"testing"
)

// addStep adds one output: a file (or "-"), or with folder a folder of
// charts named by chartPatterns.
type addStep struct {
	flag, path string
	folder     bool
}

var chartPatterns = []string{"exceedance-*.svg", "tornado-*.svg", "decline.svg"}

// TestAdd checks what Add and AddFolder accept and refuse, and the
// message of each refusal. Every step but the last must be accepted; the
// last gives want ("" when it is accepted too). The rules are this
// package's own (see doc.go); the file kinds and modes are POSIX's.
func TestAdd(t *testing.T) {
	scenario := []string{"file s.toml"}
	cases := []struct {
		name   string
		files  []string
		inputs []string // each "the scenario being run"
		stdout string   // a file to give New as its standard output
		steps  []addStep
		want   string
	}{
		// An output that is an input.
		{"output is the scenario", scenario, []string{"s.toml"}, "",
			[]addStep{{"--out", "s.toml", false}},
			"--out s.toml is the scenario being run; choose another file name"},
		{"scenario spelled otherwise", append([]string{"dir x"}, scenario...), []string{"s.toml"}, "",
			[]addStep{{"--samples", "./x/../s.toml", false}},
			"--samples ./x/../s.toml is the scenario being run (s.toml); choose another file name"},
		{"symbolic link to the scenario", append([]string{"link l.toml s.toml"}, scenario...), []string{"s.toml"}, "",
			[]addStep{{"--out", "l.toml", false}},
			"--out l.toml is the scenario being run (s.toml); choose another file name"},
		{"scenario given through a link", append([]string{"link l.toml s.toml"}, scenario...), []string{"l.toml"}, "",
			[]addStep{{"--out", "s.toml", false}},
			"--out s.toml is the scenario being run (l.toml); choose another file name"},
		{"hard link to the scenario", append(scenario, "hard h.toml s.toml"), []string{"s.toml"}, "",
			[]addStep{{"--out", "h.toml", false}},
			"--out h.toml is the scenario being run (s.toml); choose another file name"},
		{"scenario through a linked folder", []string{"dir real", "file real/s.toml", "link alias real"}, []string{"real/s.toml"}, "",
			[]addStep{{"--out", "alias/s.toml", false}},
			"--out alias/s.toml is the scenario being run (real/s.toml); choose another file name"},

		// Two outputs in one file.
		{"same file twice", nil, nil, "",
			[]addStep{{"--samples", "x.csv", false}, {"--out", "x.csv", false}},
			"--out x.csv and --samples x.csv are the same file; give each output its own file"},
		{"same file spelled otherwise", nil, nil, "",
			[]addStep{{"--samples", "x.csv", false}, {"--out", "./x.csv", false}},
			"--out ./x.csv and --samples x.csv are the same file; give each output its own file"},
		{"link to the other new file", []string{"link l.csv x.csv"}, nil, "",
			[]addStep{{"--samples", "x.csv", false}, {"--out", "l.csv", false}},
			"--out l.csv and --samples x.csv are the same file; give each output its own file"},
		{"hard links of one file", []string{"file a.csv", "hard b.csv a.csv"}, nil, "",
			[]addStep{{"--samples", "a.csv", false}, {"--out", "b.csv", false}},
			"--out b.csv and --samples a.csv are the same file; give each output its own file"},
		{"null device twice", nil, nil, "",
			[]addStep{{"--out", os.DevNull, false}, {"--samples", os.DevNull, false}}, ""},
		{"null device and a file", nil, nil, "",
			[]addStep{{"--out", os.DevNull, false}, {"--samples", "x.csv", false}, {"--junit", "x.csv", false}},
			"--junit x.csv and --samples x.csv are the same file; give each output its own file"},
		{"standard output twice", nil, nil, "",
			[]addStep{{"--out", "-", false}, {"--samples", "-", false}},
			"--samples - and --out - both write to standard output; give one of them a file name"},
		{"file that standard output goes to", []string{"file o.txt"}, nil, "o.txt",
			[]addStep{{"--out", "-", false}, {"--samples", "o.txt", false}},
			"--samples o.txt and standard output (--out -) are the same file; give each output its own file"},

		{"file that standard output goes to, given first", []string{"file o.txt"}, nil, "o.txt",
			[]addStep{{"--samples", "o.txt", false}, {"--out", "-", false}},
			"--samples o.txt and standard output (--out -) are the same file; give each output its own file"},

		// Outputs and a folder of charts.
		{"chart name in the plots folder", nil, nil, "",
			[]addStep{{"--plots", "plots", true}, {"--out", "plots/decline.svg", false}},
			"--out plots/decline.svg has the name of a chart that --plots plots writes; choose another file name or another --plots folder"},
		{"chart name, folder given last", []string{"dir plots"}, nil, "",
			[]addStep{{"--out", "plots/tornado-x.svg", false}, {"--plots", "plots", true}},
			"--out plots/tornado-x.svg has the name of a chart that --plots plots writes; choose another file name or another --plots folder"},
		{"output is the plots folder", nil, nil, "",
			[]addStep{{"--plots", "plots", true}, {"--out", "plots", false}},
			"--out plots is the --plots folder; choose another file name"},
		{"plots folder is an output", nil, nil, "",
			[]addStep{{"--out", "plots", false}, {"--plots", "plots", true}},
			"--plots plots is also --out plots; choose another folder"},
		{"chart over the scenario", []string{"dir plots", "file plots/decline.svg"}, []string{"plots/decline.svg"}, "",
			[]addStep{{"--plots", "plots", true}},
			"--plots plots would write a chart over plots/decline.svg, the scenario being run; choose another folder"},
		{"chart is a hard link of an output", []string{"dir plots", "file r.html", "hard plots/exceedance-a.svg r.html"}, nil, "",
			[]addStep{{"--out", "r.html", false}, {"--plots", "plots", true}},
			"--plots plots/exceedance-a.svg and --out r.html are the same file; give each output its own file"},

		// Files that cannot be written.
		{"read-only file", []string{"file ro.txt 0444"}, nil, "",
			[]addStep{{"--out", "ro.txt", false}},
			"--out ro.txt is read-only (mode 0444); make it writable (chmod u+w ro.txt) or choose another file name"},
		{"link to a read-only file", []string{"file ro.txt 0400", "link l.txt ro.txt"}, nil, "",
			[]addStep{{"--out", "l.txt", false}},
			"--out l.txt is read-only (mode 0400); make it writable (chmod u+w l.txt) or choose another file name"},
		{"read-only chart", []string{"dir plots", "file plots/decline.svg 0444"}, nil, "",
			[]addStep{{"--plots", "plots", true}},
			"--plots plots/decline.svg is read-only (mode 0444); make it writable (chmod u+w plots/decline.svg) or choose another file name"},
		{"chart name taken by a folder", []string{"dir plots", "dir plots/decline.svg"}, nil, "",
			[]addStep{{"--plots", "plots", true}},
			"--plots plots/decline.svg is a folder, not a file; give the name of a file, e.g. plots/decline.svg/NAME"},
		{"folder as output", []string{"dir d"}, nil, "",
			[]addStep{{"--out", "d", false}},
			"--out d is a folder, not a file; give the name of a file, e.g. d/NAME"},
		{"missing folder", nil, nil, "",
			[]addStep{{"--out", "no/x.txt", false}},
			"--out no/x.txt: the folder no does not exist; create it (mkdir -p no) or choose another path"},
		{"file as folder", []string{"file f"}, nil, "",
			[]addStep{{"--samples", "f/x.csv", false}},
			"--samples f/x.csv: f is not a folder; choose another path"},
		{"read-only folder", []string{"dir ro 0555"}, nil, "",
			[]addStep{{"--out", "ro/x.txt", false}},
			"--out ro/x.txt: the folder ro is read-only (mode 0555); make it writable (chmod u+w ro) or write elsewhere"},
		{"writable file in a read-only folder", []string{"dir ro", "file ro/x.txt", "chmod ro 0555"}, nil, "",
			[]addStep{{"--out", "ro/x.txt", false}},
			"--out ro/x.txt: the folder ro is read-only (mode 0555); make it writable (chmod u+w ro) or write elsewhere"},
		{"socket", []string{"sock so"}, nil, "",
			[]addStep{{"--out", "so", false}},
			"--out so is a socket, not a file; choose another file name"},
		{"plots folder is a file", []string{"file p"}, nil, "",
			[]addStep{{"--plots", "p", true}},
			"--plots p is a file, not a folder; give a folder name (a missing folder is created)"},
		{"plots to standard output", nil, nil, "",
			[]addStep{{"--plots", "-", true}},
			"--plots -: charts go into a folder, not to standard output; give a folder name"},
		{"plots folder in a missing folder", nil, nil, "",
			[]addStep{{"--plots", "a/b", true}},
			"--plots a/b: the folder a does not exist; create it (mkdir -p a) or choose another path"},
		{"plots folder in a read-only folder", []string{"dir ro 0555"}, nil, "",
			[]addStep{{"--plots", "ro/plots", true}},
			"--plots ro/plots: the folder ro is read-only (mode 0555); make it writable (chmod u+w ro) or write elsewhere"},

		// Accepted.
		{"every kind of output", append([]string{"file old.csv 0600", "link l.html r.html", "fifo f", "dir plots"}, scenario...),
			[]string{"s.toml"}, "",
			[]addStep{{"--out", "-", false}, {"--samples", "old.csv", false}, {"--x", "l.html", false}, {"--y", "f", false},
				{"--plots", "plots", true}, {"--z", "plots/report.html", false}, {"--w", "/dev/null", false}}, ""},
		{"new plots folder", nil, nil, "", []addStep{{"--plots", "new", true}}, ""},
		{"plots folder with old charts", []string{"dir plots", "file plots/decline.svg", "file plots/notes.txt 0444"}, nil, "",
			[]addStep{{"--plots", "plots", true}}, ""},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			t.Chdir(t.TempDir())
			build(t, c.files...)
			var stdout io.Writer = io.Discard
			if c.stdout != "" {
				f, err := os.OpenFile(c.stdout, os.O_WRONLY, 0)
				if err != nil {
					t.Fatal(err)
				}
				defer f.Close()
				stdout = f
			}
			var inputs []Input
			for _, in := range c.inputs {
				inputs = append(inputs, Input{Path: in, Role: "the scenario being run"})
			}
			s := New(stdout, inputs...)
			for i, st := range c.steps {
				var err error
				if st.folder {
					_, err = s.AddFolder(st.flag, st.path, chartPatterns...)
				} else {
					_, err = s.Add(st.flag, st.path)
				}
				got := ""
				if err != nil {
					got = err.Error()
				}
				want := ""
				if i == len(c.steps)-1 {
					want = c.want
				}
				if got != want {
					t.Fatalf("step %d (%s %s):\n got: %s\nwant: %s", i, st.flag, st.path, got, want)
				}
			}
		})
	}
}

// TestDirect checks which outputs are written in place rather than
// replaced: standard output, character devices and FIFOs (POSIX file
// types), never a regular file or a link to one.
func TestDirect(t *testing.T) {
	t.Chdir(t.TempDir())
	build(t, "file r.txt", "link l.txt r.txt", "fifo f", "link lf f")
	for _, c := range []struct {
		path   string
		direct bool
	}{
		{"-", true}, {"/dev/null", true}, {"f", true}, {"lf", true}, {"r.txt", false}, {"l.txt", false}, {"new.txt", false},
	} {
		tg, err := New(io.Discard).Add("--out", c.path)
		if err != nil {
			t.Fatalf("%s: %v", c.path, err)
		}
		if got := tg.stdout || tg.direct(); got != c.direct {
			t.Errorf("%s: written directly %v, want %v", c.path, got, c.direct)
		}
		if c.path == "l.txt" && !strings.HasSuffix(tg.path, "/r.txt") {
			t.Errorf("l.txt leads to %s, want …/r.txt", tg.path)
		}
	}
}
