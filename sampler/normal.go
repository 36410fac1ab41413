package sampler

import (
	"math"

	"gonum.org/v1/gonum/mathext"
	"gonum.org/v1/gonum/stat/distuv"
)

// normal is a normal distribution whose quantile comes from
// normalQuantile; its CDF is gonum's.
type normal struct{ mu, sigma float64 }

func (n normal) CDF(x float64) float64 { return distuv.Normal{Mu: n.mu, Sigma: n.sigma}.CDF(x) }

func (n normal) Quantile(p float64) float64 { return n.mu + n.sigma*normalQuantile(p) }

// The standard normal quantile is tabulated for p in [normalLo, 1/2]
// (and, by symmetry, [1/2, 1 − normalLo]: 15/16 of all draws) in
// normalCells steps. With h = (1/2 − 1/32)/4096 = 1.1·10⁻⁴ and
// |z⁗| ≤ 2.1·10⁶ there (z⁗ = z(7 + 6z²)/φ(z)⁴ at p = 1/32, its largest
// in the range), the Hermite remainder h⁴·|z⁗|/384 is below 10⁻¹².
// The tails, p in [2^−20, 1/32) and its mirror, have a table per binade
// (tailTable) of normalTailCells steps: in [P, 2P], h = P/512 and, as
// φ(z) ≥ p·|z| in the lower tail (Mills' ratio; docs/references.md §9),
// |z⁗| ≤ (7 + 6z²)/(p⁴·|z|³) ≤ 9/(p⁴·|z|) for |z| ≥ 1.86, so
// the remainder is below 9/(512⁴·384·1.86) = 1.8·10⁻¹³.
// TestNormalQuantileTable checks both tables against gonum's
// mathext.NormalQuantile to 10⁻¹². Beyond them (p below 2^−20 = 9.5·10⁻⁷
// or above its mirror), gonum's function (Wichura's algorithm AS 241) is
// used as it is.
const (
	normalLo        = 1.0 / 32
	normalCells     = 4096
	normalTailCells = 512
)

// normalSlope returns z = Φ⁻¹(p) and its slope dz/dp = 1/φ(z).
func normalSlope(p float64) (float64, float64) {
	z := mathext.NormalQuantile(p)
	return z, math.Sqrt(2*math.Pi) * math.Exp(z*z/2)
}

// normalTable and normalTail are the standard normal quantile's tables.
var normalTable, normalTail = func() (hermiteTable, tailTable) {
	t, ok := newHermiteTable(normalLo, 0.5, normalCells, normalSlope)
	tail, tailOK := newTailTable(normalTailCells, normalSlope)
	if !ok || !tailOK {
		panic("sampler: the normal quantile table does not increase")
	}
	return t, tail
}()

// normalQuantile returns the standard normal quantile Φ⁻¹(p) (within
// 10⁻¹² of mathext.NormalQuantile; see normalCells).
func normalQuantile(p float64) float64 {
	switch {
	case p >= normalLo && p <= 0.5:
		return normalTable.at(p)
	case p > 0.5 && p <= 1-normalLo:
		return -normalTable.at(1 - p) // 1 − p is exact for p in [1/2, 1]
	case p < normalLo:
		if z, ok := normalTail.at(p); ok {
			return z
		}
	case p < 1:
		if z, ok := normalTail.at(1 - p); ok {
			return -z
		}
	}
	return mathext.NormalQuantile(p)
}
