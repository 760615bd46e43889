package array

import (
	"errors"
	"fmt"
	"math"
	"sort"
)

// ExtraterrestrialDailyWhM2 is the daily extraterrestrial irradiation on a
// horizontal surface, H₀ in Wh/m², at latitude latDeg on day of year
// dayOfYear, with solar constant gscWM2 (use SolarConstantWM2), by Duffie &
// Beckman (2013) eq. 1.10.3 with Spencer's (1971) declination. It is 0 in
// polar night.
func ExtraterrestrialDailyWhM2(latDeg float64, dayOfYear int, gscWM2 float64) float64 {
	phi := latDeg * deg
	delta := spencerDeclinationRad(dayAngleRad(float64(dayOfYear)))
	return extraterrestrialWhM2(phi, delta, dayOfYear, gscWM2)
}

// eccentricity is the orbital correction 1 + 0.033 cos(360 n/365) of Duffie
// & Beckman (2013) eq. 1.4.1a.
func eccentricity(dayOfYear int) float64 {
	return 1 + 0.033*math.Cos(2*math.Pi*float64(dayOfYear)/365)
}

func extraterrestrialWhM2(phi, delta float64, dayOfYear int, gsc float64) float64 {
	ws := sunsetRad(phi, delta)
	if ws == 0 {
		return 0
	}
	h := 24 / math.Pi * gsc * eccentricity(dayOfYear) *
		(math.Cos(phi)*math.Cos(delta)*math.Sin(ws) + ws*math.Sin(phi)*math.Sin(delta))
	return math.Max(0, h)
}

// ErbsMonthlyDiffuseFraction is the monthly mean diffuse fraction H̄d/H̄ of
// Erbs, Klein & Duffie (1982), Duffie & Beckman (2013) eq. 2.12.1, for
// monthly clearness index kt and sunset hour angle wsDeg (the two branches
// split at ωs = 81.4°). The correlation was fitted for 0.3 ≤ K̄T ≤ 0.8; the
// result is clamped to 0–1.
func ErbsMonthlyDiffuseFraction(kt, wsDeg float64) float64 {
	var f float64
	if wsDeg <= 81.4 {
		f = 1.391 - 3.560*kt + 4.189*kt*kt - 2.137*kt*kt*kt
	} else {
		f = 1.311 - 3.022*kt + 3.427*kt*kt - 1.821*kt*kt*kt
	}
	return clamp01(f)
}

// ErbsDailyDiffuseFraction is the daily diffuse fraction Hd/H of Erbs, Klein
// & Duffie (1982), Duffie & Beckman (2013) eq. 2.11.1, for daily clearness
// index kt and sunset hour angle wsDeg.
func ErbsDailyDiffuseFraction(kt, wsDeg float64) float64 {
	var f float64
	if wsDeg <= 81.4 {
		if kt < 0.715 {
			f = 1 - 0.2727*kt + 2.4495*kt*kt - 11.9514*kt*kt*kt + 9.3879*kt*kt*kt*kt
		} else {
			f = 0.143
		}
	} else {
		if kt < 0.722 {
			f = 1 + 0.2832*kt - 2.5557*kt*kt + 0.8448*kt*kt*kt
		} else {
			f = 0.175
		}
	}
	return clamp01(f)
}

// ErbsHourlyDiffuseFraction is the hourly diffuse fraction I_d/I of Erbs,
// Klein & Duffie (1982), Duffie & Beckman (2013) eq. 2.10.1, for hourly
// clearness index kt.
func ErbsHourlyDiffuseFraction(kt float64) float64 {
	switch {
	case kt <= 0.22:
		return clamp01(1 - 0.09*kt)
	case kt <= 0.80:
		return clamp01(0.9511 - 0.1604*kt + 4.388*kt*kt - 16.638*kt*kt*kt + 12.336*kt*kt*kt*kt)
	}
	return 0.165
}

func clamp01(x float64) float64 {
	if x < 0 || math.IsNaN(x) {
		return 0
	}
	if x > 1 {
		return 1
	}
	return x
}

// KleinBeamRatio is Klein's (1977) monthly mean beam ratio R̄b for a surface
// of slope tiltDeg facing the equator (south in the northern hemisphere,
// north in the southern), on day of year dayOfYear at latitude latDeg, in the
// closed form of Duffie & Beckman (2013) eq. 2.19.3 (with φ + β for the
// southern hemisphere, eq. 2.19.3b). It is 0 when the sun does not rise.
func KleinBeamRatio(latDeg, tiltDeg float64, dayOfYear int) float64 {
	phi := latDeg * deg
	beta := tiltDeg * deg
	delta := spencerDeclinationRad(dayAngleRad(float64(dayOfYear)))
	pb := phi - beta
	if latDeg < 0 {
		pb = phi + beta
	}
	ws := sunsetRad(phi, delta)
	if ws == 0 {
		return 0
	}
	wsp := math.Min(ws, sunsetRad(pb, delta))
	num := math.Cos(pb)*math.Cos(delta)*math.Sin(wsp) + wsp*math.Sin(pb)*math.Sin(delta)
	den := math.Cos(phi)*math.Cos(delta)*math.Sin(ws) + ws*math.Sin(phi)*math.Sin(delta)
	if den <= 0 {
		return 0
	}
	return math.Max(0, num/den)
}

// HorizonPoint is one point of a surveyed horizon: the elevation of the skyline
// at an azimuth (clockwise from north).
type HorizonPoint struct {
	AzimuthDeg, ElevationDeg float64
}

// Horizon is a surveyed skyline, points sorted by azimuth. An empty Horizon
// is a flat, open horizon at 0°.
type Horizon []HorizonPoint

// Validate checks that azimuths lie in [0, 360), are strictly increasing and
// that elevations lie in [0, 90].
func (h Horizon) Validate() error {
	for i, p := range h {
		if math.IsNaN(p.AzimuthDeg) || p.AzimuthDeg < 0 || p.AzimuthDeg >= 360 {
			return fmt.Errorf("horizon[%d]: azimuth_deg %g outside [0, 360)", i, p.AzimuthDeg)
		}
		if math.IsNaN(p.ElevationDeg) || p.ElevationDeg < 0 || p.ElevationDeg > 90 {
			return fmt.Errorf("horizon[%d]: elevation_deg %g outside [0, 90]", i, p.ElevationDeg)
		}
		if i > 0 && p.AzimuthDeg <= h[i-1].AzimuthDeg {
			return fmt.Errorf("horizon[%d]: azimuth_deg %g not above the previous point's %g", i, p.AzimuthDeg, h[i-1].AzimuthDeg)
		}
	}
	return nil
}

// ElevationAtDeg is the skyline elevation at azimuthDeg, by linear
// interpolation between the surveyed points, wrapping around 360°. An empty
// horizon gives 0; a single point gives its elevation everywhere.
func (h Horizon) ElevationAtDeg(azimuthDeg float64) float64 {
	n := len(h)
	switch n {
	case 0:
		return 0
	case 1:
		return h[0].ElevationDeg
	}
	a := math.Mod(azimuthDeg, 360)
	if a < 0 {
		a += 360
	}
	i := sort.Search(n, func(k int) bool { return h[k].AzimuthDeg > a })
	var p0, p1 HorizonPoint
	if i == 0 || i == n {
		p0, p1 = h[n-1], h[0]
		p1.AzimuthDeg += 360
		if a < p0.AzimuthDeg {
			a += 360
		}
	} else {
		p0, p1 = h[i-1], h[i]
	}
	span := p1.AzimuthDeg - p0.AzimuthDeg
	if span <= 0 {
		return p0.ElevationDeg
	}
	f := (a - p0.AzimuthDeg) / span
	return p0.ElevationDeg + f*(p1.ElevationDeg-p0.ElevationDeg)
}

// Plane is the plane of the array: slope from horizontal, azimuth of the
// surface's outward normal (clockwise from north, 180 = facing south), the
// ground's reflectance and an optional surveyed horizon.
type Plane struct {
	TiltDeg, AzimuthDeg, AlbedoFraction float64
	Horizon                             Horizon
}

func (p Plane) validate() error {
	if math.IsNaN(p.TiltDeg) || p.TiltDeg < 0 || p.TiltDeg > 180 {
		return fmt.Errorf("tilt_deg %g outside [0, 180]", p.TiltDeg)
	}
	if math.IsNaN(p.AzimuthDeg) || math.IsInf(p.AzimuthDeg, 0) {
		return fmt.Errorf("azimuth_deg %g is not a number", p.AzimuthDeg)
	}
	if math.IsNaN(p.AlbedoFraction) || p.AlbedoFraction < 0 || p.AlbedoFraction > 1 {
		return fmt.Errorf("albedo %g outside [0, 1]", p.AlbedoFraction)
	}
	if err := p.Horizon.Validate(); err != nil {
		return err
	}
	return nil
}

func (p Plane) normal() (e, n, u float64) {
	sb, cb := math.Sincos(p.TiltDeg * deg)
	sg, cg := math.Sincos(p.AzimuthDeg * deg)
	return sb * sg, sb * cg, cb
}

// MonthResource is the mean day of one month: extraterrestrial and horizontal
// irradiation, clearness index, diffuse fraction, irradiation on the plane of
// the array, and the monthly beam ratio used.
type MonthResource struct {
	Month, DayOfYear         int
	ExtraterrestrialKWhM2Day float64
	GHIKWhM2Day              float64
	ClearnessIndex           float64
	DiffuseFraction          float64
	POAKWhM2Day              float64
	// BeamRatio is R̄b, the ratio of the day's beam on the plane to that on
	// the horizontal, with the horizon's shading included.
	BeamRatio float64
}

// beamSteps is the number of steps across the day used to integrate the
// beam ratio.
const beamSteps = 720

// ErrGHIAboveExtraterrestrial is wrapped by MonthlyResource when a month's horizontal
// irradiation exceeds its extraterrestrial irradiation.
var ErrGHIAboveExtraterrestrial = errors.New("horizontal irradiation exceeds the extraterrestrial irradiation")

// monthSky holds the sun geometry of a representative day sampled for the
// beam-ratio integral.
type monthSky struct {
	h0WhM2 float64
	ws     float64
	// sun vectors at each step, with the horizon mask applied (zeros where
	// the sun is behind the skyline); horizontal sum of cos θz unmasked.
	e, n, u  [beamSteps]float64
	visible  [beamSteps]bool
	sumCosZ  float64
	anyHoriz bool
}

func newMonthSky(phi float64, dayOfYear int, hz Horizon) *monthSky {
	delta := spencerDeclinationRad(dayAngleRad(float64(dayOfYear)))
	s := &monthSky{ws: sunsetRad(phi, delta)}
	s.h0WhM2 = extraterrestrialWhM2(phi, delta, dayOfYear, SolarConstantWM2)
	if s.ws == 0 {
		return s
	}
	step := 2 * s.ws / beamSteps
	for i := 0; i < beamSteps; i++ {
		w := -s.ws + (float64(i)+0.5)*step
		e, n, u := sunVector(phi, delta, w)
		if u <= 0 {
			continue
		}
		s.e[i], s.n[i], s.u[i] = e, n, u
		s.sumCosZ += u
		vis := true
		if len(hz) > 0 {
			s.anyHoriz = true
			az := math.Atan2(e, n) * rad
			el := math.Asin(math.Min(1, u)) * rad
			vis = el > hz.ElevationAtDeg(az)
		}
		s.visible[i] = vis
	}
	return s
}

// beamRatio integrates Klein's (1977) R̄b numerically for a plane with unit
// normal (ne, nn, nu): Σ max(0, cos θ)·visible / Σ cos θz over the day.
func (s *monthSky) beamRatio(ne, nn, nu float64) float64 {
	if s.sumCosZ <= 0 {
		return 0
	}
	var sum float64
	for i := 0; i < beamSteps; i++ {
		if !s.visible[i] {
			continue
		}
		c := s.e[i]*ne + s.n[i]*nn + s.u[i]*nu
		if c > 0 {
			sum += c
		}
	}
	return sum / s.sumCosZ
}

// monthPOA is the isotropic-sky irradiation on the plane (Liu & Jordan 1962,
// Duffie & Beckman 2013 eq. 2.19.1) for horizontal irradiation ghi, diffuse
// fraction fd and beam ratio rb.
func monthPOA(ghi, fd, rb, tiltDeg, albedo float64) float64 {
	cb := math.Cos(tiltDeg * deg)
	return ghi*(1-fd)*rb + ghi*fd*(1+cb)/2 + ghi*albedo*(1-cb)/2
}

// monthBasics computes H₀, K̄T and H̄d/H̄ for one month.
func monthBasics(sky *monthSky, ghi float64) (kt, fd float64, err error) {
	if sky.h0WhM2 < 50 { // less than 0.05 kWh/m²/day: twilight or polar night
		return 0, 1, nil // whatever arrives is diffuse
	}
	kt = ghi * 1000 / sky.h0WhM2
	if kt > 1 {
		return 0, 0, fmt.Errorf("%w (%.3f > %.3f kWh/m²/day)", ErrGHIAboveExtraterrestrial, ghi, sky.h0WhM2/1000)
	}
	return kt, ErbsMonthlyDiffuseFraction(kt, sky.ws*rad), nil
}

// MonthlyResource is the mean daily solar resource of each month at latitude
// latDeg for monthly mean daily horizontal irradiation ghiKWhM2Day on plane
// p. For each month it takes Klein's (1977) representative day, the
// extraterrestrial irradiation H₀ (Duffie & Beckman 2013 eq. 1.10.3), the
// clearness index K̄T = H̄/H̄₀, the diffuse fraction of Erbs, Klein & Duffie
// (1982) (Duffie & Beckman eq. 2.12.1) and the isotropic-sky irradiation on
// the plane of Liu & Jordan (1962) (Duffie & Beckman eq. 2.19.1) with ground
// reflection at the plane's albedo.
//
// The beam ratio R̄b is Klein's (1977) ratio of the day's extraterrestrial
// beam on the plane to that on the horizontal, integrated numerically over
// the representative day (720 steps between sunrise and sunset). For a plane
// facing the equator without a horizon this equals Klein's closed form
// (KleinBeamRatio, Duffie & Beckman eq. 2.19.3); for any other azimuth it is
// the same ratio, which Klein & Theilacker (1981) also evaluate (they further
// weight it by the hourly beam distribution, which this function does not).
// A horizon removes the beam for the steps the sun is behind the skyline;
// the diffuse and reflected parts are not reduced by it.
//
// Months whose representative day has (almost) no extraterrestrial
// irradiation are treated as all-diffuse.
func MonthlyResource(latDeg float64, ghiKWhM2Day [12]float64, p Plane) ([12]MonthResource, error) {
	var out [12]MonthResource
	if math.IsNaN(latDeg) || latDeg < -90 || latDeg > 90 {
		return out, fmt.Errorf("latitude %g outside [-90, 90]", latDeg)
	}
	if err := p.validate(); err != nil {
		return out, fmt.Errorf("plane: %w", err)
	}
	phi := latDeg * deg
	ne, nn, nu := p.normal()
	for m := 1; m <= 12; m++ {
		ghi := ghiKWhM2Day[m-1]
		if math.IsNaN(ghi) || ghi < 0 || math.IsInf(ghi, 0) {
			return out, fmt.Errorf("month %d: ghi %g is not a non-negative number", m, ghi)
		}
		n := RepresentativeDay(m)
		sky := newMonthSky(phi, n, p.Horizon)
		kt, fd, err := monthBasics(sky, ghi)
		if err != nil {
			return out, fmt.Errorf("month %d: %w", m, err)
		}
		rb := sky.beamRatio(ne, nn, nu)
		out[m-1] = MonthResource{
			Month: m, DayOfYear: n,
			ExtraterrestrialKWhM2Day: sky.h0WhM2 / 1000,
			GHIKWhM2Day:              ghi,
			ClearnessIndex:           kt,
			DiffuseFraction:          fd,
			POAKWhM2Day:              monthPOA(ghi, fd, rb, p.TiltDeg, p.AlbedoFraction),
			BeamRatio:                rb,
		}
	}
	return out, nil
}

// DesignMonth is the month (1–12) with the highest ratio of daily demand to
// plane-of-array irradiation, the month that sizes a stand-alone array
// (IEEE 1562; Sandia 1995 handbook). Months with no demand are ignored; a
// month with demand but no irradiation wins outright (the first such month).
// With no demand in any month it returns the month of least irradiation.
func DesignMonth(demandWhDay [12]float64, poa [12]float64) int {
	best, bestRatio := 0, -1.0
	for i := 0; i < 12; i++ {
		d := demandWhDay[i]
		if !(d > 0) {
			continue
		}
		if !(poa[i] > 0) {
			return i + 1
		}
		if r := d / poa[i]; r > bestRatio {
			best, bestRatio = i+1, r
		}
	}
	if best > 0 {
		return best
	}
	best = 1
	for i := 1; i < 12; i++ {
		if poa[i] < poa[best-1] {
			best = i + 1
		}
	}
	return best
}

// OptimiseTilt is the tilt (0–90°, to 0.01°) that minimises the worst
// month's ratio of demand to plane-of-array irradiation for a plane facing
// azimuthDeg with ground albedo and horizon h, and the design month at that
// tilt. The resource is that of MonthlyResource. The search takes 1° steps
// from 0° to 90°, then a golden-section refinement within ±1° of the best
// step. When no month has any demand, every month counts equally (the tilt
// that maximises the poorest month).
func OptimiseTilt(latDeg float64, ghiKWhM2Day [12]float64, demandWhDay [12]float64, azimuthDeg, albedo float64, h Horizon) (tiltDeg float64, designMonth int, err error) {
	p := Plane{TiltDeg: 0, AzimuthDeg: azimuthDeg, AlbedoFraction: albedo, Horizon: h}
	if math.IsNaN(latDeg) || latDeg < -90 || latDeg > 90 {
		return 0, 0, fmt.Errorf("optimise tilt: latitude %g outside [-90, 90]", latDeg)
	}
	if err := p.validate(); err != nil {
		return 0, 0, fmt.Errorf("optimise tilt: plane: %w", err)
	}
	demand := demandWhDay
	anyDemand := false
	for i, d := range demand {
		if math.IsNaN(d) || d < 0 || math.IsInf(d, 0) {
			return 0, 0, fmt.Errorf("optimise tilt: month %d: demand %g is not a non-negative number", i+1, d)
		}
		if d > 0 {
			anyDemand = true
		}
	}
	if !anyDemand {
		for i := range demand {
			demand[i] = 1
		}
	}
	phi := latDeg * deg
	var skies [12]*monthSky
	var kts, fds [12]float64
	for m := 1; m <= 12; m++ {
		ghi := ghiKWhM2Day[m-1]
		if math.IsNaN(ghi) || ghi < 0 || math.IsInf(ghi, 0) {
			return 0, 0, fmt.Errorf("optimise tilt: month %d: ghi %g is not a non-negative number", m, ghi)
		}
		skies[m-1] = newMonthSky(phi, RepresentativeDay(m), h)
		kts[m-1], fds[m-1], err = monthBasics(skies[m-1], ghi)
		if err != nil {
			return 0, 0, fmt.Errorf("optimise tilt: month %d: %w", m, err)
		}
	}
	poaAt := func(tilt float64) [12]float64 {
		q := p
		q.TiltDeg = tilt
		ne, nn, nu := q.normal()
		var poa [12]float64
		for i := 0; i < 12; i++ {
			rb := skies[i].beamRatio(ne, nn, nu)
			poa[i] = monthPOA(ghiKWhM2Day[i], fds[i], rb, tilt, albedo)
		}
		return poa
	}
	worst := func(tilt float64) float64 {
		poa := poaAt(tilt)
		w := 0.0
		for i := 0; i < 12; i++ {
			if demand[i] <= 0 {
				continue
			}
			if poa[i] <= 0 {
				return math.Inf(1)
			}
			w = math.Max(w, demand[i]/poa[i])
		}
		return w
	}
	bestT, bestW := 0.0, math.Inf(1)
	for t := 0; t <= 90; t++ {
		if w := worst(float64(t)); w < bestW {
			bestT, bestW = float64(t), w
		}
	}
	if math.IsInf(bestW, 1) {
		dm := DesignMonth(demand, poaAt(bestT))
		return 0, dm, fmt.Errorf("optimise tilt: month %d has demand but no irradiation at any tilt", dm)
	}
	// golden-section refinement on [bestT-1, bestT+1] ∩ [0, 90]
	lo, hi := math.Max(0, bestT-1), math.Min(90, bestT+1)
	g := (math.Sqrt(5) - 1) / 2
	a, b := hi-g*(hi-lo), lo+g*(hi-lo)
	fa, fb := worst(a), worst(b)
	for hi-lo > 0.005 {
		if fa <= fb {
			hi, b, fb = b, a, fa
			a = hi - g*(hi-lo)
			fa = worst(a)
		} else {
			lo, a, fa = a, b, fb
			b = lo + g*(hi-lo)
			fb = worst(b)
		}
	}
	if t := (lo + hi) / 2; worst(t) < bestW {
		bestT = t
	}
	bestT = math.Round(bestT*100) / 100
	return bestT, DesignMonth(demand, poaAt(bestT)), nil
}
