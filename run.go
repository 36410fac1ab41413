package rockheat

import (
	"math"

	"rockheat/sampler"
)

// Run describes a run: the model with its typed inputs, how many trials to
// draw and how. Build one in Go, or read one from a scenario file with
// package scenarios; Estimate validates it either way, with the same
// errors.
type Run struct {
	// Title names the prospect in reports.
	Title string
	// Path is where the run was read from (a scenario file), shown in
	// reports; empty for a run built in Go.
	Path string
	// SourceSHA256 is the hex SHA-256 of the scenario file the run was
	// read from, for the reproducibility record; empty for a run built in
	// Go.
	SourceSHA256 string
	// Trials is the number of trials, 1 … MaxTrials; 0 means
	// DefaultTrials.
	Trials int
	// Seed seeds every random stream of the run.
	Seed uint64
	// Sampling is the sampling scheme.
	Sampling sampler.Method
	// Model is the physics and its inputs: *Reservoir, *HotRock or
	// *PowerDensity.
	Model Model
	// Correlations are target rank correlations between sampled inputs,
	// named as Field.Name names them in the unit given (e.g. "area_km2").
	Correlations []Correlation
}

// Correlation is a target Spearman rank correlation, in [−1, 1], between
// two sampled inputs of a run.
type Correlation struct {
	Inputs [2]string
	Rank   float64
}

// Run defaults and limits.
const (
	// DefaultTrials is the number of trials of a Run that gives none.
	DefaultTrials = 100_000
	// MaxTrials bounds the trials of a run: 10^10 trials would take hours
	// on a laptop even in bounded-memory mode (on a 32-bit system, the
	// largest int, about 2.1·10^9).
	MaxTrials = min(10_000_000_000, math.MaxInt)
)
