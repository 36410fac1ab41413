package expect

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
	"regexp"

	"rockheat/report/outfile"
)

// MaxFileSize is the largest expectation file Read accepts, in bytes.
const MaxFileSize = 4 << 20

// Write writes e as indented JSON.
func Write(w io.Writer, e *Expectation) error {
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(e)
}

// WriteFile writes e to path whole (outfile.WriteFile: a temporary file,
// renamed into place when complete; a read-only file is refused).
func WriteFile(path string, e *Expectation) error {
	return outfile.WriteFile("expectation", path, func(w io.Writer) error { return Write(w, e) })
}

// ReadFile reads and checks the expectation file at path. A missing file
// gives an error that wraps fs.ErrNotExist.
func ReadFile(path string) (*Expectation, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	e, err := Read(f)
	if err != nil {
		return nil, fmt.Errorf("%s: %w", path, err)
	}
	return e, nil
}

// Read reads an expectation and checks it: one JSON object of the layout
// of Format, with no unknown keys, every figure a number and every setting
// in range. Its errors say what is wrong.
func Read(r io.Reader) (*Expectation, error) {
	src, err := io.ReadAll(io.LimitReader(r, MaxFileSize+1))
	if err != nil {
		return nil, err
	}
	if len(src) > MaxFileSize {
		return nil, fmt.Errorf("larger than %d bytes: not an expectation file", MaxFileSize)
	}
	dec := json.NewDecoder(bytes.NewReader(src))
	dec.DisallowUnknownFields()
	var e Expectation
	if err := dec.Decode(&e); err != nil {
		return nil, jsonProblem(src, err)
	}
	if _, err := dec.Token(); err != io.EOF {
		return nil, errors.New("more text after the expectation's closing brace")
	}
	if err := e.check(); err != nil {
		return nil, err
	}
	return &e, nil
}

// jsonProblem words a decoding error.
func jsonProblem(src []byte, err error) error {
	var se *json.SyntaxError
	var te *json.UnmarshalTypeError
	switch {
	case errors.Is(err, io.EOF) && len(bytes.TrimSpace(src)) == 0:
		return errors.New("empty file: not an expectation")
	case errors.Is(err, io.ErrUnexpectedEOF):
		return fmt.Errorf("the JSON ends early, after %d bytes (truncated?)", len(src))
	case errors.As(err, &se):
		return fmt.Errorf("line %d: JSON syntax: %v", lineOf(src, se.Offset), se)
	case errors.As(err, &te):
		return fmt.Errorf("line %d: key %q holds a JSON %s where %s belongs", lineOf(src, te.Offset), te.Field, te.Value, describeType(te))
	}
	if m := unknownField.FindStringSubmatch(err.Error()); m != nil {
		return fmt.Errorf("unknown key %s; the keys are those of the layout %s", m[1], Format)
	}
	return err
}

var unknownField = regexp.MustCompile(`unknown field (".*")`)

func describeType(te *json.UnmarshalTypeError) string {
	switch te.Type.Name() {
	case "Number":
		return "a figure written as a JSON string (\"1.5e+18\")"
	case "string":
		return "a string"
	case "int", "uint64":
		return "a whole number ≥ 0"
	case "float64":
		return "a number"
	}
	return "a " + te.Type.String()
}

// lineOf returns the 1-based line of byte offset off in src.
func lineOf(src []byte, off int64) int {
	off = min(max(off, 0), int64(len(src)))
	return bytes.Count(src[:off], []byte("\n")) + 1
}

var hexSHA256 = regexp.MustCompile(`^[0-9a-f]{64}$`)

// check reports the first problem of a decoded expectation.
func (e *Expectation) check() error {
	switch {
	case e.Format != Format:
		return fmt.Errorf("format %q is not %q: the file is not an expectation of this version of rockheat", e.Format, Format)
	case !hexSHA256.MatchString(e.ScenarioSHA256):
		return fmt.Errorf("scenario_sha256 %q is not a SHA-256 in hex (64 digits 0-9a-f)", e.ScenarioSHA256)
	case e.Trials < 1:
		return fmt.Errorf("trials %d must be at least 1", e.Trials)
	case e.Sampling != "lhs" && e.Sampling != "random":
		return fmt.Errorf("sampling %q is not \"lhs\" or \"random\"", e.Sampling)
	case !(e.Confidence > 0 && e.Confidence < 1):
		return fmt.Errorf("confidence %g is not a level in (0, 1)", e.Confidence)
	case e.Percentiles != "exact" && e.Percentiles != "sketch":
		return fmt.Errorf("percentiles %q is not \"exact\" or \"sketch\"", e.Percentiles)
	case !(e.SketchRelErr >= 0 && e.SketchRelErr < 1):
		return fmt.Errorf("sketch_relative_error %g is not a fraction in [0, 1)", e.SketchRelErr)
	case e.ZeroHeatTrials < 0 || e.ZeroHeatTrials > e.Trials:
		return fmt.Errorf("zero_heat_trials %d is outside 0 … %d (the trials)", e.ZeroHeatTrials, e.Trials)
	case len(e.Outputs) == 0:
		return errors.New("no outputs: the expectation records no figures")
	}
	seen := map[string]bool{}
	for i, o := range e.Outputs {
		if o.Name == "" || seen[o.Name] {
			return fmt.Errorf("outputs[%d]: name %q is empty or repeated", i, o.Name)
		}
		seen[o.Name] = true
		for _, f := range o.figures() {
			if _, err := f.Text.Float(); err != nil {
				return fmt.Errorf("output %s: %s: %v", o.Name, f.Name, err)
			}
		}
	}
	return nil
}

// SameRecord reports whether e and o record the same scenario, settings
// and figures, whoever wrote them.
func (e *Expectation) SameRecord(o *Expectation) bool {
	a, b := *e, *o
	a.WrittenBy, b.WrittenBy = BuildInfo{}, BuildInfo{}
	var ba, bb bytes.Buffer
	if Write(&ba, &a) != nil || Write(&bb, &b) != nil {
		return false
	}
	return bytes.Equal(ba.Bytes(), bb.Bytes())
}
