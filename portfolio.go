package rockheat

import (
	"rockheat/sampler"
)

// Portfolio is a set of prospects estimated together, trial by trial: in
// each trial every prospect draws its inputs, shared inputs take one draw
// for all the prospects that share them, prospects' outcomes may be rank
// correlated, and each prospect succeeds with its chance of success.
type Portfolio struct {
	Title string
	// Trials, Seed and Sampling replace each prospect's own; Trials 0
	// means DefaultTrials.
	Trials   int
	Seed     uint64
	Sampling sampler.Method
	// Prospects are the prospects, each with its own run.
	Prospects []Prospect
	// Shared lists inputs that take one draw in every trial for all the
	// prospects that share them.
	Shared []SharedInput
	// Correlations are target rank correlations between prospects'
	// outcomes (their electric capacity), induced by Iman–Conover on the
	// prospects' trials; a prospect's trials move as a whole, so its own
	// outputs stay consistent.
	Correlations []ProspectCorrelation
	// SuccessCorrelations are target rank correlations between the
	// prospects' success draws (prospects on one fault system succeed or
	// fail together).
	SuccessCorrelations []ProspectCorrelation
	// TargetMWe, if > 0, asks for the probability that the risked total
	// electric capacity reaches it, MWe.
	TargetMWe float64
}

// Prospect is one prospect of a portfolio.
type Prospect struct {
	// Name names the prospect in the portfolio, in reports and in
	// correlations.
	Name string
	// Run is the prospect's run; its trials, seed and sampling are
	// replaced by the portfolio's.
	Run *Run
	// Chance is the chance of success: the probability that the prospect
	// holds a producible resource, in [0, 1]. When Factors are given it is
	// their product: 0 takes the product, and a value given must equal it.
	Chance  float64
	Factors []ChanceFactor
	// Share is the working interest, in (0, 1]; 0 means 1. Totals are net
	// of it.
	Share float64
}

// ChanceFactor is one named component of a chance of success, such as the
// chance that the temperature, the permeability or the fluid is as
// assumed; a prospect's chance is their product.
type ChanceFactor struct {
	Name   string
	Chance float64 // in [0, 1]
}

// SharedInput is an input drawn once per trial for several prospects, e.g.
// one regional recovery factor. Input names it as the prospects' runs name
// it (e.g. "recovery_factor"); Prospects lists the prospects that share it,
// all that have the input if empty. Each trial's value is drawn from the
// distribution of the first listed prospect that has the input, and
// replaces the others' own draws.
type SharedInput struct {
	Input     string
	Prospects []string
}

// ProspectCorrelation is a target Spearman rank correlation, in [−1, 1],
// between two prospects of a portfolio.
type ProspectCorrelation struct {
	Prospects [2]string
	Rank      float64
}

// PortfolioOutputs are the outputs a portfolio adds up: the ones every
// model kind has.
var PortfolioOutputs = []string{"heat_in_place", "recoverable_heat", "thermal_power", "electric_power"}

// The places in PortfolioOutputs, and in a portfolio's per-output results,
// of the outputs that reports show and that targets are set on.
const (
	PortfolioHeat  = 0 // heat_in_place
	PortfolioPower = 3 // electric_power, in MWe
)
