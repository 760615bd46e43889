package weather

import (
	"fmt"
	"math"
)

// BendtKMin is the smallest daily clearness index of the Bendt distribution.
const BendtKMin = 0.05

// bendtKMax is k_max of Bendt, Collares-Pereira & Rabl (1981) as given in
// Duffie & Beckman (2013) §2.11.
func bendtKMax(meanKT float64) float64 {
	d := meanKT - 0.75
	d2 := d * d
	d4 := d2 * d2
	return 0.6313 + 0.267*meanKT - 11.9*d4*d4
}

// truncExpMean is the mean of the density proportional to exp(u·x) on
// [0, 1]: 1/(1 − e^(−u)) − 1/u, with its series 1/2 + u/12 − u³/720 near 0.
func truncExpMean(u float64) float64 {
	if math.Abs(u) < 1e-4 {
		return 0.5 + u/12 - u*u*u/720
	}
	return -1/math.Expm1(-u) - 1/u
}

// bendtParams holds the distribution of one month in scaled form: the
// clearness index is kMin + (kMax − kMin)·x with x on [0, 1] and density
// proportional to exp(u·x), u = γ(kMax − kMin).
type bendtParams struct {
	kMin, kMax, u float64
	// Constants of u kept for speed: eNegU = e^(−u) and oneMinus =
	// 1 − e^(−u) when u > 0; expm1U = e^u − 1 when u < 0.
	eNegU, oneMinus, expm1U float64
}

func newBendt(meanKT float64) (bendtParams, error) {
	kMax := bendtKMax(meanKT)
	if math.IsNaN(meanKT) || !(meanKT > BendtKMin) || !(meanKT < kMax) {
		return bendtParams{}, fmt.Errorf("mean clearness index %g outside the range of the Bendt distribution (above k_min = %g and below k_max = %.4f)",
			meanKT, BendtKMin, kMax)
	}
	t := (meanKT - BendtKMin) / (kMax - BendtKMin) // target mean of x, in (0, 1)
	// truncExpMean rises monotonically from 0 (u → −∞) to 1 (u → +∞);
	// bracket the root and bisect.
	lo, hi := -1.0, 1.0
	for truncExpMean(lo) > t && lo > -1e9 {
		lo *= 2
	}
	for truncExpMean(hi) < t && hi < 1e9 {
		hi *= 2
	}
	for range 200 {
		mid := 0.5 * (lo + hi)
		if truncExpMean(mid) < t {
			lo = mid
		} else {
			hi = mid
		}
		if hi-lo <= 1e-13*math.Max(1, math.Abs(mid)) {
			break
		}
	}
	u := 0.5 * (lo + hi)
	return bendtParams{kMin: BendtKMin, kMax: kMax, u: u,
		eNegU: math.Exp(-u), oneMinus: -math.Expm1(-u), expm1U: math.Expm1(u)}, nil
}

// cdf returns F(k) = (e^(γ k_min) − e^(γ k)) / (e^(γ k_min) − e^(γ k_max)),
// written in the scaled variable so it neither overflows nor cancels.
func (b bendtParams) cdf(kt float64) float64 {
	x := (kt - b.kMin) / (b.kMax - b.kMin)
	switch {
	case !(x > 0):
		return 0
	case x >= 1:
		return 1
	case math.Abs(b.u) < 1e-12:
		return x
	case b.u > 0:
		return math.Exp(b.u*(x-1)) * math.Expm1(-b.u*x) / math.Expm1(-b.u)
	default:
		return math.Expm1(b.u*x) / math.Expm1(b.u)
	}
}

// quantile inverts cdf.
func (b bendtParams) quantile(p float64) float64 {
	k, _ := b.quantileDensity(p)
	return k
}

// quantileDensity returns the clearness index of probability p and the
// probability density there. The density needs no further exponential: for
// u > 0, e^(u(x−1)) = p + (1 − p) e^(−u); for u < 0, e^(ux) = 1 + p (e^u − 1).
func (b bendtParams) quantileDensity(p float64) (k, density float64) {
	w := b.kMax - b.kMin
	var x, fx float64
	switch {
	case math.IsNaN(p):
		return math.NaN(), math.NaN()
	case p <= 0:
		return b.kMin, b.densityX(0) / w
	case p >= 1:
		return b.kMax, b.densityX(1) / w
	case math.Abs(b.u) < 1e-12:
		x, fx = p, 1
	case b.u > 0:
		e := p + (1-p)*b.eNegU
		x = 1 + math.Log(e)/b.u
		fx = b.u * e / b.oneMinus
	default:
		e := 1 + p*b.expm1U
		x = math.Log(e) / b.u
		fx = b.u * e / b.expm1U
	}
	x = min(1, max(0, x))
	return b.kMin + w*x, fx / w
}

// densityX is the density of the scaled variable x at 0 or 1.
func (b bendtParams) densityX(x float64) float64 {
	switch {
	case math.Abs(b.u) < 1e-12:
		return 1
	case b.u > 0:
		return b.u * math.Exp(b.u*(x-1)) / b.oneMinus
	default:
		return b.u * math.Exp(b.u*x) / b.expm1U
	}
}

// BendtGamma returns the parameter γ and the bounds k_min, k_max of the
// distribution of daily clearness index for a month of mean clearness index
// meanKT, after Bendt, Collares-Pereira & Rabl (1981), "The frequency
// distribution of daily insolation values", Solar Energy 27, 1–5, as given in
// Duffie & Beckman (2013) §2.11: k_min = 0.05, k_max = 0.6313 + 0.267 K̄T −
// 11.9 (K̄T − 0.75)⁸, and γ the root of
//
//	K̄T = [(k_min − 1/γ) e^(γ k_min) − (k_max − 1/γ) e^(γ k_max)] / [e^(γ k_min) − e^(γ k_max)],
//
// found by bisection (the right side rises monotonically with γ). The
// cumulative distribution is then F(k) = (e^(γ k_min) − e^(γ k)) /
// (e^(γ k_min) − e^(γ k_max)). γ is 0 (a uniform distribution) when K̄T is
// the midpoint of k_min and k_max. meanKT must lie strictly between k_min and
// k_max, which holds for about 0.1 < K̄T < 0.86; otherwise an error.
func BendtGamma(meanKT float64) (gamma, kMin, kMax float64, err error) {
	b, err := newBendt(meanKT)
	if err != nil {
		return 0, 0, 0, fmt.Errorf("weather: %w", err)
	}
	return b.u / (b.kMax - b.kMin), b.kMin, b.kMax, nil
}

// BendtValid reports whether meanKT lies in the range where the Bendt
// distribution is defined (k_min < K̄T < k_max).
func BendtValid(meanKT float64) bool {
	_, err := newBendt(meanKT)
	return err == nil
}

// BendtCDF returns the probability that a day of a month with mean clearness
// index meanKT has a clearness index at most kt, by the distribution of
// Bendt, Collares-Pereira & Rabl (1981) (Duffie & Beckman (2013) §2.11; see
// BendtGamma). It is 0 below k_min and 1 above k_max, and NaN when meanKT is
// outside the distribution's range.
func BendtCDF(kt, meanKT float64) float64 {
	b, err := newBendt(meanKT)
	if err != nil || math.IsNaN(kt) {
		return math.NaN()
	}
	return b.cdf(kt)
}

// BendtQuantile returns the daily clearness index whose cumulative
// probability is p (0..1, clamped) in a month of mean clearness index
// meanKT, the inverse of BendtCDF: k = ln(e^(γ k_min) − p (e^(γ k_min) −
// e^(γ k_max)))/γ (Bendt, Collares-Pereira & Rabl (1981); Duffie & Beckman
// (2013) §2.11). It is NaN when meanKT is outside the distribution's range
// or p is NaN.
func BendtQuantile(p, meanKT float64) float64 {
	b, err := newBendt(meanKT)
	if err != nil || math.IsNaN(p) {
		return math.NaN()
	}
	return b.quantile(p)
}
