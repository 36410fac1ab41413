package water

// Region 1 of IAPWS R7-97(2012): the basic equation for compressed liquid,
// Eq. 7, a dimensionless Gibbs free energy
//
//	γ(π, τ) = g/(RT) = Σ nᵢ (7.1 − π)^Iᵢ (τ − 1.222)^Jᵢ,  π = p/16.53 MPa, τ = 1386 K/T,
//
// with the coefficients of Table 2 and the property relations of Table 3.

const (
	r1PStar = 16.53e6 // Pa, reducing pressure p*
	r1TStar = 1386.0  // K, reducing temperature T*
)

// r1Terms holds I, J and n of Table 2 of IAPWS R7-97(2012), i = 1 … 34.
var r1Terms = [34]struct {
	I, J int
	n    float64
}{
	{0, -2, 0.14632971213167},
	{0, -1, -0.84548187169114},
	{0, 0, -0.37563603672040e1},
	{0, 1, 0.33855169168385e1},
	{0, 2, -0.95791963387872},
	{0, 3, 0.15772038513228},
	{0, 4, -0.16616417199501e-1},
	{0, 5, 0.81214629983568e-3},
	{1, -9, 0.28319080123804e-3},
	{1, -7, -0.60706301565874e-3},
	{1, -1, -0.18990068218419e-1},
	{1, 0, -0.32529748770505e-1},
	{1, 1, -0.21841717175414e-1},
	{1, 3, -0.52838357969930e-4},
	{2, -3, -0.47184321073267e-3},
	{2, 0, -0.30001780793026e-3},
	{2, 1, 0.47661393906987e-4},
	{2, 3, -0.44141845330846e-5},
	{2, 17, -0.72694996297594e-15},
	{3, -4, -0.31679644845054e-4},
	{3, 0, -0.28270797985312e-5},
	{3, 6, -0.85205128120103e-9},
	{4, -5, -0.22425281908000e-5},
	{4, -2, -0.65171222895601e-6},
	{4, 10, -0.14341729937924e-12},
	{5, -8, -0.40516996860117e-6},
	{8, -11, -0.12734301741641e-8},
	{8, -6, -0.17424871230634e-9},
	{21, -29, -0.68762131295531e-18},
	{23, -31, 0.14478307828521e-19},
	{29, -38, 0.26335781662795e-22},
	{30, -39, -0.11947622640071e-22},
	{31, -40, 0.18228094581404e-23},
	{32, -41, -0.93537087292458e-25},
}

const (
	r1MaxI = 32 // largest I in Table 2
	r1MinJ = -41
	r1MaxJ = 17
)

// gibbsTerm is one term n·x^I·y^J of a Gibbs equation with the products of
// n and the exponents that its derivatives need.
type gibbsTerm struct {
	i, j                     int // I and J
	n, nI, nII, nJ, nJJ, nIJ float64
}

func makeTerms(I, J []int, n []float64) []gibbsTerm {
	t := make([]gibbsTerm, len(n))
	for k := range n {
		fi, fj := float64(I[k]), float64(J[k])
		t[k] = gibbsTerm{i: I[k], j: J[k], n: n[k], nI: n[k] * fi, nII: n[k] * fi * (fi - 1),
			nJ: n[k] * fj, nJJ: n[k] * fj * (fj - 1), nIJ: n[k] * fi * fj}
	}
	return t
}

var r1 = func() []gibbsTerm {
	var I, J []int
	var n []float64
	for _, t := range r1Terms {
		I, J, n = append(I, t.I), append(J, t.J), append(n, t.n)
	}
	return makeTerms(I, J, n)
}()

// r1Powers holds x^I for I = 0 … r1MaxI and y^J for J = r1MinJ … r1MaxJ.
type r1Powers struct {
	x [r1MaxI + 1]float64
	y [r1MaxJ - r1MinJ + 1]float64 // y[J − r1MinJ] = y^J
}

// powers1 fills pw with the powers of x, y and iy = 1/y that region 1's
// terms take (powers1Pair, for one state).
func powers1(x, y, iy float64, pw *r1Powers) {
	var spare r1Powers
	powers1Pair(x, y, iy, pw, x, y, iy, &spare)
}

// powers1Pair fills pa with the powers of xa, ya and iya = 1/ya, and pb
// with those of xb, yb and iyb, that region 1's terms take. Each power is
// a running product, x^k = x^(k−1)·x, kept in registers (a loop that reads
// back the previous entry is several times slower); the two chains of 1/y,
// odd and even powers, run side by side. A chain of 32 products is bound
// by the latency of a multiplication, so the two states' chains run in
// the same loops, where the processor overlaps them: two states cost
// little more than one, and each gets the same bits as alone.
func powers1Pair(xa, ya, iya float64, pa *r1Powers, xb, yb, iyb float64, pb *r1Powers) {
	for k, v, w := 0, 1.0, 1.0; k <= r1MaxI; k++ {
		pa.x[k], pb.x[k] = v, w
		v *= xa
		w *= xb
	}
	for k, v, w := 0, 1.0, 1.0; k <= r1MaxJ; k++ {
		pa.y[k-r1MinJ], pb.y[k-r1MinJ] = v, w
		v *= ya
		w *= yb
	}
	iya2, iyb2 := iya*iya, iyb*iyb
	for k, ea, oa, eb, ob := 2, iya2, iya, iyb2, iyb; k <= -r1MinJ; k += 2 {
		pa.y[-r1MinJ-k+1], pa.y[-r1MinJ-k] = oa, ea
		pb.y[-r1MinJ-k+1], pb.y[-r1MinJ-k] = ob, eb
		oa *= iya2
		ea *= iya2
		ob *= iyb2
		eb *= iyb2
		if k == -r1MinJ-1 {
			pa.y[0], pb.y[0] = oa, ob // y^r1MinJ, the odd power left over
		}
	}
}

// gibbs1 returns the sums of Σ nᵢ x^Iᵢ y^Jᵢ weighted by 1, I, I(I−1), J,
// J(J−1) and IJ, with x = 7.1 − π, y = τ − 1.222 and iy = 1/y; the
// derivatives of γ follow by dividing by powers of x and y.
func gibbs1(x, y, iy float64) (s, sI, sII, sJ, sJJ, sIJ float64) {
	var pw r1Powers
	powers1(x, y, iy, &pw)
	for k := range r1 {
		t, v := pw.term(k)
		s += t.n * v
		sI += t.nI * v
		sII += t.nII * v
		sJ += t.nJ * v
		sJJ += t.nJJ * v
		sIJ += t.nIJ * v
	}
	return
}

// gibbs1IJJ is gibbs1's sums weighted by I and by J(J−1) alone, the same
// bits (the same terms added in the same order), at two thirds of the
// cost: what the density and the isobaric heat capacity need; for two
// states a and b at once (see powers1Pair), each with its own bits.
func gibbs1IJJ(xa, ya, iya, xb, yb, iyb float64) (sIa, sJJa, sIb, sJJb float64) {
	var pa, pb r1Powers
	powers1Pair(xa, ya, iya, &pa, xb, yb, iyb, &pb)
	for k := range r1 {
		t, va := pa.term(k)
		_, vb := pb.term(k)
		sIa += t.nI * va
		sJJa += t.nJJ * va
		sIb += t.nI * vb
		sJJb += t.nJJ * vb
	}
	return
}

// term returns region 1's term k and x^I·y^J for it.
func (pw *r1Powers) term(k int) (*gibbsTerm, float64) {
	t := &r1[k]
	return t, pw.x[t.i] * pw.y[t.j-r1MinJ]
}

// region1 evaluates region 1 without checking the range of validity.
func region1(p, T float64) State {
	pi := p * (1 / r1PStar)
	tau := r1TStar / T
	x := 7.1 - pi
	y := tau - 1.222
	ix, iy := 1/x, 1/y
	s, sI, sII, sJ, sJJ, sIJ := gibbs1(x, y, iy)
	// Derivatives of γ (Table 4): d/dπ brings −I/x, d/dτ brings J/y.
	g := s
	gp := -sI * ix
	gpp := sII * ix * ix
	gt := sJ * iy
	gtt := sJJ * iy * iy
	gpt := -sIJ * ix * iy

	RT := GasConstant * T
	v := (GasConstant / r1PStar) * T * gp // v = RT·π·γπ/p = RT·γπ/p*
	d := gp - tau*gpt
	tt := tau * tau
	return State{
		Region:         1,
		Pressure:       p,
		Temperature:    T,
		Density:        1 / v,
		SpecificVolume: v,
		Enthalpy:       RT * tau * gt,
		InternalEnergy: RT * (tau*gt - pi*gp),
		Entropy:        GasConstant * (tau*gt - g),
		Cp:             -GasConstant * tt * gtt,
		SoundSpeed:     sqrt(RT * gp * gp / (d*d/(tt*gtt) - gpp)),
	}
}

// region1DensityCp is region1's density, kg/m³, and isobaric heat
// capacity, J/(kg·K), alone: the same expressions, so the same bits, from
// the only two sums they need.
func region1DensityCp(p, T float64) (rho, cp float64) {
	rho, cp, _, _ = region1DensityCpPair(p, T, p, T)
	return rho, cp
}

// region1DensityCpPair is region1DensityCp of two states, (pa, Ta) and
// (pb, Tb), at little more than the cost of one (see powers1Pair), each
// with the same bits as alone.
func region1DensityCpPair(pa, Ta, pb, Tb float64) (rhoA, cpA, rhoB, cpB float64) {
	xa, ya, taua := region1Vars(pa, Ta)
	xb, yb, taub := region1Vars(pb, Tb)
	iya, iyb := 1/ya, 1/yb
	sIa, sJJa, sIb, sJJb := gibbs1IJJ(xa, ya, iya, xb, yb, iyb)
	rhoA, cpA = region1FromSums(Ta, taua, 1/xa, iya, sIa, sJJa)
	rhoB, cpB = region1FromSums(Tb, taub, 1/xb, iyb, sIb, sJJb)
	return
}

// region1Vars returns region 1's variables at (p, T): x = 7.1 − π,
// y = τ − 1.222 and τ.
func region1Vars(p, T float64) (x, y, tau float64) {
	pi := p * (1 / r1PStar)
	tau = r1TStar / T
	return 7.1 - pi, tau - 1.222, tau
}

// region1FromSums returns the density and isobaric heat capacity from
// gibbs1IJJ's sums at (T, τ), ix = 1/x and iy = 1/y.
func region1FromSums(T, tau, ix, iy, sI, sJJ float64) (rho, cp float64) {
	gp := -sI * ix
	gtt := sJJ * iy * iy
	v := (GasConstant / r1PStar) * T * gp
	tt := tau * tau
	return 1 / v, -GasConstant * tt * gtt
}

// Region1 returns the state of compressed liquid water at pressure p in Pa
// and temperature T in K from the region 1 equation of IF97. Its range of
// validity is 273.15 K ≤ T ≤ 623.15 K and p_s(T) ≤ p ≤ 100 MPa; a state
// outside it gives a *StateError naming the region it lies in.
func Region1(p, T float64) (State, error) {
	if err := checkDomain(p, T); err != nil {
		return State{}, err
	}
	if T > Region1MaxTemperature {
		return State{}, aboveRegion1Err(p, T, "keep T ≤ 623.15 K for liquid, or use At or Region2 for steam")
	}
	if ps := saturationPressure(T); p < ps {
		return State{}, stateErr(p, T, 2,
			"is steam, outside IF97 region 1 (liquid): p is below the saturation pressure p_s(T) = %s; use Region2 or At", fmtPressure(ps))
	}
	return region1(p, T), nil
}

// aboveRegion1Err is the error for a state above 623.15 K, the highest
// temperature of region 1, given to a function for liquid; fix says what to
// do.
func aboveRegion1Err(p, T float64, fix string) error {
	r, _ := RegionOf(p, T)
	switch r {
	case 2:
		return stateErr(p, T, 2, "is steam (IF97 region 2): above 623.15 K, the highest temperature of region 1, "+
			"there is no liquid in IF97 regions 1 and 2; %s", fix)
	case 3:
		return stateErr(p, T, 3, "lies in IF97 region 3 (near-critical fluid above 623.15 K), which rockheat does not implement; %s", fix)
	}
	return stateErr(p, T, 5, "lies in IF97 region 5 (T > 1073.15 K), which rockheat does not implement; %s", fix)
}
