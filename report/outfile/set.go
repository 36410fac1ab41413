package outfile

import (
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"sync"
)

// Stdout is the path that means standard output.
const Stdout = "-"

// Input is a file the run reads, which no output may overwrite.
type Input struct {
	Path string // as the user gave it
	// Role says what the file is, for messages: "the scenario being run"
	// gives "--out s.toml is the scenario being run; choose another file
	// name".
	Role string
}

// Set is the outputs of one run. Its methods may be called from several
// goroutines; Abort in particular may be called at any time.
type Set struct {
	stdout io.Writer
	// stdoutFile is where standard output leads when it is a file.
	stdoutFile place
	inputs     []Input
	inPlaces   []place

	mu      sync.Mutex
	state   state
	targets []*Target
	folders []*Folder
}

type state int

const (
	open state = iota
	committed
	aborted
)

// Target is one output of a Set: a file, or standard output.
type Target struct {
	set  *Set
	flag string
	place
	stdout bool
	folder *Folder // the folder it was added to, or nil

	written bool
	write   func(io.Writer) error // a direct target's content, written by Commit
	tmp     string                // the temporary file, until renamed
	backup  string                // a hard link to the replaced file, until Commit ends
	placed  bool                  // renamed into place by Commit
}

// Folder is a folder of outputs of a Set (charts), whose file names
// match its patterns.
type Folder struct {
	set  *Set
	flag string
	place
	patterns []string
	existing []place // files in it now whose names match a pattern
	created  bool    // made by this run
}

// New returns an empty Set whose standard output is stdout, for a run
// that reads inputs.
func New(stdout io.Writer, inputs ...Input) *Set {
	s := &Set{stdout: stdout, inputs: inputs}
	for _, in := range inputs {
		p, err := resolve(in.Path)
		if err != nil {
			abs, _ := filepath.Abs(in.Path)
			p = place{spelled: in.Path, path: abs}
		}
		s.inPlaces = append(s.inPlaces, p)
	}
	if f, ok := stdout.(*os.File); ok {
		if fi, err := f.Stat(); err == nil && fi.Mode().IsRegular() {
			s.stdoutFile = place{spelled: "standard output", info: fi}
		}
	}
	return s
}

// Add checks the output given to the command-line flag (e.g. "--out")
// as path, and adds it to s. Path "-" (Stdout) is standard output. The
// error says what is wrong and how to fix it.
func (s *Set) Add(flag, path string) (*Target, error) {
	t := &Target{set: s, flag: flag, place: place{spelled: path}, stdout: path == Stdout}
	if !t.stdout {
		p, err := resolve(path)
		if err != nil {
			return nil, s.unreachable(flag+" "+path, path, err)
		}
		t.place = p
	}
	s.mu.Lock()
	defer s.mu.Unlock()
	if err := s.check(t); err != nil {
		return nil, err
	}
	s.targets = append(s.targets, t)
	return t, nil
}

// unreachable explains why the output what, at path, cannot be reached:
// a chart name in a folder this run is to create, or a folder missing.
func (s *Set) unreachable(what, path string, err error) error {
	if d, derr := resolve(filepath.Dir(path)); derr == nil {
		p := place{path: filepath.Join(d.path, filepath.Base(path))}
		s.mu.Lock()
		defer s.mu.Unlock()
		for _, f := range s.folders {
			if f.holds(p) {
				return chartClash(what, f)
			}
		}
	}
	return resolveError(what, err)
}

// resolveError explains why the folder of an output cannot be reached.
func resolveError(what string, err error) error {
	var fm folderMissing
	if errors.As(err, &fm) {
		if ferr := checkFolder(what, fm.dir); ferr != nil {
			return ferr
		}
	}
	return fmt.Errorf("%s: %w", what, err)
}

// AddFolder checks the folder dir given to the flag (e.g. "--plots"),
// whose files will be named by the patterns (as filepath.Match, e.g.
// "tornado-*.svg"), and adds it to s. A missing folder is created when
// its first file is written, and removed again if the run fails; its
// parent must exist. Every file in dir whose name matches a pattern is
// checked now as if it were added, so that a chart that cannot be
// written is found before the run.
func (s *Set) AddFolder(flag, dir string, patterns ...string) (*Folder, error) {
	if dir == Stdout {
		return nil, fmt.Errorf("%s -: charts go into a folder, not to standard output; give a folder name", flag)
	}
	for _, pat := range patterns {
		if _, err := filepath.Match(pat, ""); err != nil {
			panic("outfile: bad pattern " + pat)
		}
	}
	what := flag + " " + dir
	p, err := resolve(dir)
	if err != nil {
		return nil, resolveError(what, err)
	}
	f := &Folder{set: s, flag: flag, place: p, patterns: patterns}
	switch {
	case p.info == nil:
		err = checkFolder(what, folderOf(p))
	case !p.info.IsDir():
		err = fmt.Errorf("%s is a file, not a folder; give a folder name (a missing folder is created)", what)
	default:
		err = checkFolder(what, dir)
	}
	if err != nil {
		return nil, err
	}
	s.mu.Lock()
	defer s.mu.Unlock()
	if err := s.checkFolder(f); err != nil {
		return nil, err
	}
	s.folders = append(s.folders, f)
	return f, nil
}

// Add checks the file called name in f, which must match one of f's
// patterns, and adds it to f's Set.
func (f *Folder) Add(name string) (*Target, error) {
	if !f.matches(name) || filepath.Base(name) != name {
		panic(fmt.Sprintf("outfile: %q matches no pattern of folder %s", name, f.spelled))
	}
	t := &Target{set: f.set, flag: f.flag, folder: f, place: place{
		spelled: filepath.Join(f.spelled, name), path: filepath.Join(f.path, name)}}
	f.set.mu.Lock()
	exists := f.info != nil || f.created
	f.set.mu.Unlock()
	if exists {
		p, err := resolve(t.spelled)
		if err != nil {
			return nil, resolveError(f.flag+" "+t.spelled, err)
		}
		t.place = p
	}
	f.set.mu.Lock()
	defer f.set.mu.Unlock()
	if err := f.set.check(t); err != nil {
		return nil, err
	}
	f.set.targets = append(f.set.targets, t)
	return t, nil
}

// matches reports whether a file called name would be one of f's.
func (f *Folder) matches(name string) bool {
	for _, pat := range f.patterns {
		if ok, _ := filepath.Match(pat, name); ok {
			return true
		}
	}
	return false
}

// holds reports whether p is, or would be, a file of f.
func (f *Folder) holds(p place) bool {
	if p.path != "" && filepath.Dir(p.path) == f.path && f.matches(filepath.Base(p.path)) {
		return true
	}
	for _, e := range f.existing {
		if p.same(e) {
			return true
		}
	}
	return false
}

// check checks a new target t against the file it leads to and against
// every input, output and folder of s. s.mu is held.
func (s *Set) check(t *Target) error {
	what := t.flag + " " + t.spelled
	if s.state != open {
		panic("outfile: Add after Commit or Abort")
	}
	if !t.stdout && !t.inNewFolder() {
		if err := checkFile(what, t.place); err != nil {
			return err
		}
	}
	for i, in := range s.inPlaces {
		if t.same(in) {
			return inputClash(what, t.spelled, s.inputs[i])
		}
	}
	for _, u := range s.targets {
		if !t.stdout && !u.stdout && t.discards() && u.discards() {
			continue // e.g. --out /dev/null --samples /dev/null, to time a run
		}
		switch {
		case t.stdout && u.stdout:
			return fmt.Errorf("%s - and %s - both write to standard output; give one of them a file name", t.flag, u.flag)
		case t.same(u.place):
			return fmt.Errorf("%s and %s %s are the same file; give each output its own file", what, u.flag, u.spelled)
		case u.stdout && t.same(s.stdoutFile):
			return fmt.Errorf("%s and standard output (%s -) are the same file; give each output its own file", what, u.flag)
		case t.stdout && u.same(s.stdoutFile):
			return fmt.Errorf("%s %s and standard output (%s -) are the same file; give each output its own file", u.flag, u.spelled, t.flag)
		}
	}
	for _, f := range s.folders {
		if f == t.folder {
			continue
		}
		if t.same(f.place) {
			return fmt.Errorf("%s is the %s folder; choose another file name", what, f.flag)
		}
		if f.holds(t.place) {
			return chartClash(what, f)
		}
	}
	return nil
}

// checkFolder checks a new folder f against every input and output of s,
// and checks the files now in it that would be its outputs. s.mu is
// held.
func (s *Set) checkFolder(f *Folder) error {
	if s.state != open {
		panic("outfile: AddFolder after Commit or Abort")
	}
	what := f.flag + " " + f.spelled
	for _, u := range s.targets {
		if u.same(f.place) {
			return fmt.Errorf("%s is also %s %s; choose another folder", what, u.flag, u.spelled)
		}
		if f.holds(u.place) {
			return chartClash(u.flag+" "+u.spelled, f)
		}
	}
	for i, in := range s.inPlaces {
		if f.holds(in) {
			return fmt.Errorf("%s would write a chart over %s, %s; choose another folder", what, in.spelled, s.inputs[i].Role)
		}
	}
	if f.info == nil {
		return nil
	}
	entries, err := os.ReadDir(f.path)
	if err != nil {
		return fmt.Errorf("%s: %w", what, err)
	}
	for _, e := range entries {
		if !f.matches(e.Name()) {
			continue
		}
		name := filepath.Join(f.spelled, e.Name())
		p, err := resolve(name)
		if err != nil {
			return resolveError(f.flag+" "+name, err)
		}
		if err := s.check(&Target{flag: f.flag, place: p, folder: f}); err != nil {
			return err
		}
		f.existing = append(f.existing, p)
	}
	return nil
}

// inNewFolder reports whether t goes into a folder this run is yet to
// create. s.mu is held.
func (t *Target) inNewFolder() bool {
	return t.folder != nil && t.folder.info == nil && !t.folder.created
}

// inputClash says that the output what, spelled as the user gave it, is
// the input in.
func inputClash(what, spelled string, in Input) error {
	if spelled != in.Path {
		return fmt.Errorf("%s is %s (%s); choose another file name", what, in.Role, in.Path)
	}
	return fmt.Errorf("%s is %s; choose another file name", what, in.Role)
}

func chartClash(what string, f *Folder) error {
	return fmt.Errorf("%s has the name of a chart that %s %s writes; choose another file name or another %s folder", what, f.flag, f.spelled, f.flag)
}
