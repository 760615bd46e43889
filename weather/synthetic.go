package weather

import (
	"fmt"
	"math"
	"math/rand/v2"

	"gonum.org/v1/gonum/stat/distuv"
)

// DefaultLagOneCorrelation is the day-to-day correlation of daily clearness
// used when SyntheticOptions leaves it 0 (common practice: about 0.3).
const DefaultLagOneCorrelation = 0.3

// MaxSyntheticYears bounds SyntheticOptions.Years.
const MaxSyntheticYears = 10000

// pcgStream is the second PCG word; the first is the seed.
const pcgStream = 0x9e3779b97f4a7c15

// SyntheticOptions controls DailyClearness.
type SyntheticOptions struct {
	// Years is the number of 365-day years drawn (1..MaxSyntheticYears).
	Years int
	// Seed fixes the random sequence: the same seed gives the same numbers.
	Seed uint64
	// LagOneCorrelation is the target lag-1 autocorrelation of the daily
	// clearness values (their departures from the monthly means), in
	// (−1, 1); 0 means DefaultLagOneCorrelation (common practice: 0.3).
	LagOneCorrelation float64
	// Independent draws independent days (no persistence), ignoring
	// LagOneCorrelation.
	Independent bool
	// MultiplicativeRescale holds each month to its mean by multiplying
	// its days by one factor and clamping to [k_min, k_max] instead of by
	// the default shift in the Gaussian variable. The clamping leaves a
	// few per cent of days exactly at k_max (about 5 % for K̄T 0.5–0.65,
	// measured in the tests), a spike the Bendt distribution does not have.
	MultiplicativeRescale bool
	// FlatOutsideRange gives every day of a month whose mean clearness
	// index lies outside the range of the Bendt distribution (see
	// BendtValid) that mean, instead of refusing the input.
	FlatOutsideRange bool
}

// DailyClearness returns Years×365 daily clearness indices, day 0 being 1
// January of the first year, drawn month by month from the distribution of
// Bendt, Collares-Pereira & Rabl (1981) (Duffie & Beckman (2013) §2.11) for
// that month's mean clearness index meanKT[month-1].
//
// Persistence from day to day comes from a Gaussian AR(1) process z_d =
// φ z_(d−1) + √(1 − φ²) ε_d (ε standard normal), mapped by the standard
// normal CDF to a probability Φ(z_d) and then by BendtQuantile to a
// clearness index (a Gaussian-copula transform; the process runs on across
// month and year boundaries).
//
// Each month of each year is then held to its mean meanKT exactly, by one
// shift δ of the Gaussian variable for the whole month, k_d =
// BendtQuantile(Φ(z_d + δ)), δ solved by safeguarded Newton steps. The shift
// keeps every value inside (k_min, k_max) and the shape of the distribution
// intact. With MultiplicativeRescale the month is instead multiplied by one
// factor and clamped to [k_min, k_max], the factor solved so the clamped
// values have the mean (the fixed point of repeated multiplicative
// rescaling and clamping); that leaves a spike of days at k_max.
//
// Holding each month to its mean lowers the day-to-day correlation, so φ is
// raised above the target ρ = LagOneCorrelation by the bias of Marriott &
// Pope (1954) (see gaussianLagOne); the lag-1 autocorrelation of the daily
// departures from the monthly means then comes out within about 0.01 of ρ
// (measured in the tests).
//
// A month with meanKT = 0 (polar night: no extraterrestrial irradiation)
// gets 0 on every day. A month outside the range of the distribution is an
// error unless FlatOutsideRange is set. The random numbers come from
// math/rand/v2's PCG seeded with (Seed, a fixed constant): the same inputs
// give the same numbers on every platform.
func DailyClearness(meanKT [12]float64, opt SyntheticOptions) ([]float64, error) {
	if opt.Years < 1 || opt.Years > MaxSyntheticYears {
		return nil, fmt.Errorf("weather: synthetic years %d outside 1..%d", opt.Years, MaxSyntheticYears)
	}
	rho := opt.LagOneCorrelation
	if rho == 0 {
		rho = DefaultLagOneCorrelation
	}
	if opt.Independent {
		rho = 0
	}
	if math.IsNaN(rho) || rho <= -1 || rho >= 1 {
		return nil, fmt.Errorf("weather: lag-one correlation %g outside (-1, 1)", opt.LagOneCorrelation)
	}
	const (
		kindZero = iota
		kindFlat
		kindBendt
	)
	var kind [12]int
	var dist [12]bendtParams
	for m, kt := range meanKT {
		switch b, err := newBendt(kt); {
		case kt == 0:
			kind[m] = kindZero
		case err == nil:
			kind[m], dist[m] = kindBendt, b
		case opt.FlatOutsideRange && kt > 0 && kt < 1:
			kind[m] = kindFlat
		default:
			return nil, fmt.Errorf("weather: month %d: %w", m+1, err)
		}
	}

	rho = gaussianLagOne(rho)
	rng := rand.New(rand.NewPCG(opt.Seed, pcgStream))
	innov := math.Sqrt(1 - rho*rho)
	out := make([]float64, opt.Years*DaysPerYear)
	z := rng.NormFloat64()
	var zs [31]float64
	for y := range opt.Years {
		for m := range 12 {
			first := y*DaysPerYear + firstDay[m]
			days := out[first : first+daysInMonth[m]]
			for i := range days {
				if y != 0 || m != 0 || i != 0 {
					z = rho*z + innov*rng.NormFloat64()
				}
				zs[i] = z
			}
			switch kind[m] {
			case kindFlat:
				for i := range days {
					days[i] = meanKT[m]
				}
			case kindBendt:
				if opt.MultiplicativeRescale {
					for i := range days {
						days[i] = dist[m].quantile(normalCDF(zs[i]))
					}
					rescaleMean(days, meanKT[m], dist[m].kMin, dist[m].kMax)
				} else {
					shiftToMean(days, zs[:len(days)], meanKT[m], dist[m])
				}
			}
		}
	}
	return out, nil
}

// normalCDF is the standard normal cumulative distribution Φ(z), from
// gonum's distuv (0.5·erfc(−z/√2)).
func normalCDF(z float64) float64 { return distuv.UnitNormal.CDF(z) }

// shiftToMean sets days[i] = quantile(Φ(zs[i] + δ)) with the one δ that
// makes the mean of days equal target. The mean rises monotonically with δ,
// from k_min to k_max; Newton steps (derivative Σ φ(z+δ)/f(k) / n) kept
// inside a shrinking bracket, with bisection when a step leaves it.
func shiftToMean(days, zs []float64, target float64, b bendtParams) {
	n := float64(len(days))
	eval := func(delta float64) (g, dg float64) {
		for i, z := range zs {
			zz := z + delta
			k, f := b.quantileDensity(normalCDF(zz))
			days[i] = k
			g += k
			if f > 0 {
				dg += math.Exp(-zz*zz/2) / f
			}
		}
		return g/n - target, dg / (n * math.Sqrt(2*math.Pi))
	}
	// Start from the shift that brings the month's mean z back to 0.
	zMean := 0.0
	for _, z := range zs {
		zMean += z / n
	}
	lo, hi, delta := -40.0, 40.0, -zMean
	for range 100 {
		g, dg := eval(delta)
		if math.Abs(g) <= 1e-14 {
			return
		}
		if g < 0 {
			lo = delta
		} else {
			hi = delta
		}
		next := delta - g/dg
		if !(dg > 0) || !(next > lo && next < hi) {
			next = 0.5 * (lo + hi)
		}
		if next == delta {
			return
		}
		delta = next
	}
}

// gaussianLagOne returns the AR(1) coefficient of the Gaussian process that
// gives the daily values a lag-1 autocorrelation of target once each month
// is held to its mean. Holding a block of n days to a fixed mean lowers the
// lag-1 autocorrelation as removing the sample mean does, by about
// (1 + 3ρ)/n (Marriott & Pope (1954), "Bias in the estimation of
// autocorrelations", Biometrika 41, 390–402); so ρ solves
// ρ − (1 + 3ρ)/n = target with n = 365/12.
func gaussianLagOne(target float64) float64 {
	if target == 0 {
		return 0
	}
	const n = float64(DaysPerYear) / 12
	rho := (target + 1/n) / (1 - 3/n)
	return min(0.99, max(-0.99, rho))
}

// rescaleMean multiplies every value of k (all in [lo, hi], lo > 0) by one
// factor c and clamps to [lo, hi], choosing c so the mean of the result is
// target (lo < target < hi). The clamped sum S(c) is piecewise linear and
// non-decreasing in c, so Newton steps on it settle on the exact c within a
// few steps; bisection is the fallback.
func rescaleMean(k []float64, target, lo, hi float64) {
	n := float64(len(k))
	want := n * target
	sum := func(c float64) (s, free float64, nLo, nHi int) {
		for _, v := range k {
			switch cv := c * v; {
			case cv <= lo:
				s += lo
				nLo++
			case cv >= hi:
				s += hi
				nHi++
			default:
				s += cv
				free += v
			}
		}
		return s, free, nLo, nHi
	}
	c := 1.0
	solved := false
	for range 50 {
		s, free, nLo, nHi := sum(c)
		if math.Abs(s-want) <= 1e-13*want {
			solved = true
			break
		}
		if free <= 0 {
			break
		}
		next := (want - float64(nLo)*lo - float64(nHi)*hi) / free
		if !(next > 0) || math.IsInf(next, 0) {
			break
		}
		c = next
	}
	if !solved {
		minV := math.Inf(1)
		for _, v := range k {
			minV = min(minV, v)
		}
		a, b := 0.0, hi/minV
		for range 200 {
			c = 0.5 * (a + b)
			if s, _, _, _ := sum(c); s < want {
				a = c
			} else {
				b = c
			}
		}
	}
	for i, v := range k {
		k[i] = min(hi, max(lo, c*v))
	}
}
