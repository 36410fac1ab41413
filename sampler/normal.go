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
// in the range), the Hermite remainder h⁴·|z⁗|/384 is below 10⁻¹²;
// TestNormalQuantileTable checks the table against gonum's
// mathext.NormalQuantile to that bound. Outside, gonum's function (Wichura's
// algorithm AS 241) is used as it is.
const (
	normalLo    = 1.0 / 32
	normalCells = 4096
)

// normalTable is the standard normal quantile's table; its slopes are
// dz/dp = 1/φ(z).
var normalTable = func() hermiteTable {
	t, ok := newHermiteTable(normalLo, 0.5, normalCells, func(p float64) (float64, float64) {
		z := mathext.NormalQuantile(p)
		return z, math.Sqrt(2*math.Pi) * math.Exp(z*z/2)
	})
	if !ok {
		panic("sampler: the normal quantile table does not increase")
	}
	return t
}()

// normalQuantile returns the standard normal quantile Φ⁻¹(p) (within
// 10⁻¹² of mathext.NormalQuantile; see normalCells).
func normalQuantile(p float64) float64 {
	switch {
	case p >= normalLo && p <= 0.5:
		return normalTable.at(p)
	case p > 0.5 && p <= 1-normalLo:
		return -normalTable.at(1 - p) // 1 − p is exact for p in [1/2, 1]
	}
	return mathext.NormalQuantile(p)
}
