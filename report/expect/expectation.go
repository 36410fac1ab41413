package expect

import (
	"crypto/sha256"
	"encoding/hex"
	"encoding/json"
	"fmt"
	"math"
	"runtime"
	"runtime/debug"
	"strconv"
	"strings"

	"rockheat"
	"rockheat/stats"
)

// Format names the layout of the expectation files this package writes
// and reads.
const Format = "rockheat-expectation/1"

// Suffix replaces ".toml" in a scenario's file name to name its
// expectation.
const Suffix = ".expect.json"

// Expectation is what one run of a scenario reported, with the settings
// needed to run it again. See the package documentation for its layout.
type Expectation struct {
	Format string `json:"format"`
	Title  string `json:"title"`
	Kind   string `json:"kind"`
	// Scenario is the scenario's file name; ScenarioSHA256 is the SHA-256
	// of its bytes, in hex (Hash).
	Scenario       string    `json:"scenario"`
	ScenarioSHA256 string    `json:"scenario_sha256"`
	WrittenBy      BuildInfo `json:"written_by"`
	Trials         int       `json:"trials"`
	Seed           uint64    `json:"seed"`
	Sampling       string    `json:"sampling"` // "lhs" or "random"
	// Confidence is the level of the confidence intervals, in (0, 1).
	Confidence float64 `json:"confidence"`
	// Percentiles is "exact" (from every trial) or "sketch" (from
	// quantile sketches of relative error SketchRelErr).
	Percentiles    string   `json:"percentiles"`
	SketchRelErr   float64  `json:"sketch_relative_error,omitempty"`
	ZeroHeatTrials int      `json:"zero_heat_trials"`
	Outputs        []Output `json:"outputs"`
}

// Output holds the figures of one model output, in its report unit.
type Output struct {
	Name string `json:"name"` // e.g. "heat_in_place"
	Unit string `json:"unit"` // e.g. "J", "MWe"
	// P90, P50 and P10 are exceedance percentiles (P90 is the 10th
	// percentile).
	P90  Number `json:"p90"`
	P50  Number `json:"p50"`
	P10  Number `json:"p10"`
	Mean Number `json:"mean"`
	SD   Number `json:"sd"`
	Min  Number `json:"min"`
	Max  Number `json:"max"`
	// The confidence intervals, [lo, hi], at the expectation's level.
	P90CI  Interval `json:"p90_ci"`
	P50CI  Interval `json:"p50_ci"`
	P10CI  Interval `json:"p10_ci"`
	MeanCI Interval `json:"mean_ci"`
}

// Interval is a confidence interval [lo, hi].
type Interval [2]Number

// UnmarshalJSON reads a pair of figures, and nothing else.
func (iv *Interval) UnmarshalJSON(b []byte) error {
	var list []Number
	if err := json.Unmarshal(b, &list); err != nil {
		return fmt.Errorf("an interval is a pair of figures [\"lo\", \"hi\"], not %s", b)
	}
	if len(list) != 2 {
		return fmt.Errorf("an interval is a pair of figures [\"lo\", \"hi\"], not %d of them", len(list))
	}
	*iv = Interval{list[0], list[1]}
	return nil
}

// Number is a float64 written as the shortest decimal that reads back as
// the same value (strconv.FormatFloat(x, 'g', -1, 64)): "NaN", "+Inf" and
// "-Inf" for the special values.
type Number string

// Num returns x as a Number.
func Num(x float64) Number { return Number(strconv.FormatFloat(x, 'g', -1, 64)) }

// Float returns the value of n, or an error if n is not a number.
func (n Number) Float() (float64, error) {
	if n == "" {
		return 0, fmt.Errorf("missing")
	}
	x, err := strconv.ParseFloat(string(n), 64)
	if err != nil {
		return 0, fmt.Errorf("%q is not a number", string(n))
	}
	return x, nil
}

// value returns the value of a Number known to be valid (checked by Read,
// or made by Num); NaN otherwise.
func (n Number) value() float64 {
	x, err := n.Float()
	if err != nil {
		return math.NaN()
	}
	return x
}

// BuildInfo identifies the rockheat that wrote an expectation.
type BuildInfo struct {
	Module   string `json:"module"`             // module path, "rockheat"
	Version  string `json:"version"`            // module version, "(devel)" if none
	Revision string `json:"revision,omitempty"` // VCS revision, if known
	Modified bool   `json:"modified,omitempty"` // built from a modified checkout
	Go       string `json:"go,omitempty"`       // Go toolchain version
	Platform string `json:"platform,omitempty"` // GOOS/GOARCH
}

// String describes b in one line, e.g. "rockheat (devel) rev 7d1c355 (modified), go1.26.8 linux/amd64".
func (b BuildInfo) String() string {
	s := b.Module + " " + b.Version
	if b.Revision != "" {
		s += " rev " + b.Revision[:min(len(b.Revision), 12)]
	}
	if b.Modified {
		s += " (modified)"
	}
	if b.Go != "" || b.Platform != "" {
		s += ", " + strings.TrimSpace(b.Go+" "+b.Platform)
	}
	return s
}

// CurrentBuild returns the BuildInfo of the running program, from
// runtime/debug.ReadBuildInfo.
func CurrentBuild() BuildInfo {
	b := BuildInfo{Module: "rockheat", Version: "(devel)", Go: runtime.Version(), Platform: runtime.GOOS + "/" + runtime.GOARCH}
	bi, ok := debug.ReadBuildInfo()
	if !ok {
		return b
	}
	if bi.Main.Path != "" {
		b.Module = bi.Main.Path
	}
	if bi.Main.Version != "" {
		b.Version = bi.Main.Version
	}
	for _, s := range bi.Settings {
		switch s.Key {
		case "vcs.revision":
			b.Revision = s.Value
		case "vcs.modified":
			b.Modified = s.Value == "true"
		}
	}
	return b
}

// Hash returns the SHA-256 of src in hex.
func Hash(src []byte) string {
	h := sha256.Sum256(src)
	return hex.EncodeToString(h[:])
}

// Path returns the path of the expectation of the scenario at path:
// NAME.toml gives NAME.expect.json beside it (any other name gets the
// suffix appended).
func Path(scenario string) string {
	return strings.TrimSuffix(scenario, ".toml") + Suffix
}

// New records the result res of the scenario file named scenario (its file
// name, without folders) whose bytes are src, as written by by.
func New(res *rockheat.Result, scenario string, src []byte, by BuildInfo) *Expectation {
	e := &Expectation{Format: Format, Title: res.Title, Kind: res.Kind.String(), Scenario: scenario,
		ScenarioSHA256: Hash(src), WrittenBy: by, Trials: res.Trials, Seed: res.Seed,
		Sampling: res.Sampling.String(), Confidence: res.Confidence, Percentiles: "exact",
		ZeroHeatTrials: res.ZeroHeatTrials}
	if res.Streaming {
		e.Percentiles, e.SketchRelErr = "sketch", res.SketchRelErr
	}
	for _, o := range res.Outputs {
		e.Outputs = append(e.Outputs, output(o))
	}
	return e
}

func output(o rockheat.Output) Output {
	s := o.Summary
	iv := func(i stats.Interval) Interval { return Interval{Num(i.Lo), Num(i.Hi)} }
	return Output{Name: o.Spec.Name, Unit: o.Spec.Unit, P90: Num(s.P90), P50: Num(s.P50), P10: Num(s.P10),
		Mean: Num(s.Mean), SD: Num(s.SD), Min: Num(s.Min), Max: Num(s.Max),
		P90CI: iv(s.P90CI), P50CI: iv(s.P50CI), P10CI: iv(s.P10CI), MeanCI: iv(s.MeanCI)}
}
