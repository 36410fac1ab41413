package scenarios

import (
	"fmt"
	"io"
	"os"

	"rockheat"
)

// Defaults of the [run] table that differ from a rockheat.Run's.
const (
	// DefaultSeed is the seed of a file that gives none. Runs are never
	// seeded from the clock.
	DefaultSeed = 1
)

// Scenario is a checked scenario file, ready to run.
type Scenario struct {
	// Run is the run the file describes, checked as rockheat.Estimate
	// checks it.
	Run rockheat.Run
	// Path is the file's path as given; Source is its text.
	Path   string
	Source []byte
	// Warnings are the file's inputs that lie outside the ranges common in
	// practice: worth a second look, but no reason not to run.
	Warnings Problems
}

// Input returns the quantity of the input named name (e.g. "area_km2") in
// the scenario, and whether the file gives it.
func (s *Scenario) Input(name string) (rockheat.Quantity, bool) {
	for _, f := range s.Run.Model.Fields() {
		if f.Name() == name && f.Q.Given() {
			return *f.Q, true
		}
	}
	return rockheat.Quantity{}, false
}

// InputCount returns the number of inputs the scenario's model takes in its
// settings and has a value for: given in the file, or defaulted.
func (s *Scenario) InputCount() int {
	n := 0
	for _, f := range s.Run.Model.Fields() {
		if f.Q.Given() || f.Need == rockheat.Defaulted {
			n++
		}
	}
	return n
}

// MaxFileSize is the largest scenario file rockheat reads, in bytes: a
// scenario is a page of text, so a larger file is not one.
const MaxFileSize = 1 << 20

// LoadFile reads and checks the scenario file at path.
func LoadFile(path string) (*Scenario, error) {
	src, err := readLimited(path)
	if err != nil {
		return nil, err
	}
	return Parse(path, src)
}

// readLimited reads the file at path, refusing one over MaxFileSize bytes
// or one that is not a regular file.
func readLimited(path string) ([]byte, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("reading scenario: %w", err)
	}
	defer f.Close()
	if fi, err := f.Stat(); err == nil && fi.IsDir() {
		return nil, fmt.Errorf("reading scenario: %s is a folder, not a scenario file", path)
	}
	src, err := io.ReadAll(io.LimitReader(f, MaxFileSize+1))
	if err != nil {
		return nil, fmt.Errorf("reading scenario: %w", err)
	}
	if len(src) > MaxFileSize {
		return nil, fmt.Errorf("reading scenario: %s is larger than %d bytes, too large for a scenario file; give the scenario's TOML file", path, MaxFileSize)
	}
	return src, nil
}
