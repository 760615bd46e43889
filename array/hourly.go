package array

import (
	"fmt"
	"math"
)

// Transposition selects the sky model that carries horizontal irradiation
// onto the plane of the array.
type Transposition int

const (
	// IsotropicSky is the isotropic diffuse model of Liu & Jordan (1963),
	// Duffie & Beckman (2013) eq. 2.15.1.
	IsotropicSky Transposition = iota
	// HDKR is the Hay–Davies–Klucher–Reindl anisotropic model, Duffie &
	// Beckman (2013) eq. 2.16.7.
	HDKR
)

// String names the model.
func (t Transposition) String() string {
	switch t {
	case IsotropicSky:
		return "isotropic"
	case HDKR:
		return "hdkr"
	}
	return fmt.Sprintf("Transposition(%d)", int(t))
}

// HourlySite is what the hourly plane-of-array model needs: the site
// (longitude east positive, the UTC offset of its standard clock in hours),
// the plane and the sky model.
type HourlySite struct {
	LatDeg, LonDeg, UTCOffsetH float64
	Plane                      Plane
	Model                      Transposition
}

// Validate checks the site's numbers.
func (s HourlySite) Validate() error {
	if math.IsNaN(s.LatDeg) || s.LatDeg < -90 || s.LatDeg > 90 {
		return fmt.Errorf("latitude %g outside [-90, 90]", s.LatDeg)
	}
	if math.IsNaN(s.LonDeg) || s.LonDeg < -180 || s.LonDeg > 360 {
		return fmt.Errorf("longitude %g outside [-180, 360]", s.LonDeg)
	}
	if math.IsNaN(s.UTCOffsetH) || math.Abs(s.UTCOffsetH) > 14 {
		return fmt.Errorf("utc offset %g h outside [-14, 14]", s.UTCOffsetH)
	}
	if s.Model != IsotropicSky && s.Model != HDKR {
		return fmt.Errorf("unknown transposition model %d", int(s.Model))
	}
	if err := s.Plane.validate(); err != nil {
		return fmt.Errorf("plane: %w", err)
	}
	return nil
}

// cprAB is the pair a, b of Collares-Pereira & Rabl (1979), Duffie & Beckman
// (2013) eqs. 2.13.2b–c.
func cprAB(ws float64) (a, b float64) {
	s := math.Sin(ws - 60*deg)
	return 0.409 + 0.5016*s, 0.6609 - 0.4767*s
}

// CollaresPereiraRablRt is r_t, the ratio of hourly to daily total
// horizontal irradiation for the hour centred on hour angle hourAngleDeg on a
// day with sunset hour angle wsDeg, by Collares-Pereira & Rabl (1979), Duffie
// & Beckman (2013) eq. 2.13.2. It is 0 outside the day.
func CollaresPereiraRablRt(hourAngleDeg, wsDeg float64) float64 {
	w, ws := hourAngleDeg*deg, wsDeg*deg
	d := math.Sin(ws) - ws*math.Cos(ws)
	if d <= 0 || math.Cos(w) <= math.Cos(ws) {
		return 0
	}
	a, b := cprAB(ws)
	return math.Pi / 24 * (a + b*math.Cos(w)) * (math.Cos(w) - math.Cos(ws)) / d
}

// LiuJordanRd is r_d, the ratio of hourly to daily diffuse horizontal
// irradiation for the hour centred on hour angle hourAngleDeg on a day with
// sunset hour angle wsDeg, by Liu & Jordan (1960), Duffie & Beckman (2013)
// eq. 2.13.1. It is 0 outside the day.
func LiuJordanRd(hourAngleDeg, wsDeg float64) float64 {
	w, ws := hourAngleDeg*deg, wsDeg*deg
	d := math.Sin(ws) - ws*math.Cos(ws)
	if d <= 0 || math.Cos(w) <= math.Cos(ws) {
		return 0
	}
	return math.Pi / 24 * (math.Cos(w) - math.Cos(ws)) / d
}

// subSteps is the number of sub-hourly steps used per clock hour.
const subSteps = 6

// maxBeamRatio bounds the hourly beam ratio R_b near sunrise and sunset,
// where it is the ratio of two small numbers; a numerical guard of ours.
const maxBeamRatio = 10.0

// hourGeom is the geometry of one clock hour integrated over sub-steps.
type hourGeom struct {
	i0Wh   float64 // extraterrestrial horizontal irradiation in the hour, Wh/m²
	cosZ   float64 // Σ cos θz over sub-steps with the sun up
	cosT   float64 // Σ max(0, cos θ) over sub-steps with the sun up and visible
	weight float64 // Σ Collares-Pereira & Rabl weight over sub-steps
}

func dayGeometry(s *HourlySite, dayOfYear int, g *[24]hourGeom) {
	*g = [24]hourGeom{}
	phi := s.LatDeg * deg
	b := dayAngleRad(float64(dayOfYear))
	delta := spencerDeclinationRad(b)
	eot := spencerEquationOfTimeMin(b)
	ws := sunsetRad(phi, delta)
	if ws == 0 {
		return
	}
	cws := math.Cos(ws)
	a, bb := cprAB(ws)
	ne, nn, nu := s.Plane.normal()
	gon := SolarConstantWM2 * eccentricity(dayOfYear)
	corr := (s.LonDeg-15*s.UTCOffsetH)/15 + eot/60 // solar − clock, hours
	dt := 1.0 / subSteps
	hz := s.Plane.Horizon
	sp, cp := math.Sincos(phi)
	sd, cd := math.Sincos(delta)
	for h := 0; h < 24; h++ {
		for k := 0; k < subSteps; k++ {
			solar := float64(h) + (float64(k)+0.5)*dt + corr
			w := math.Mod((solar-12)*15, 360)
			if w > 180 {
				w -= 360
			} else if w <= -180 {
				w += 360
			}
			so, cw := math.Sincos(w * deg)
			u := cp*cd*cw + sp*sd // eq. 1.6.5; see sunVector
			if u <= 0 {
				continue
			}
			e := -cd * so
			n := sd*cp - cd*cw*sp
			if cw > cws {
				g[h].weight += (a + bb*cw) * (cw - cws)
			}
			g[h].cosZ += u
			g[h].i0Wh += gon * u * dt
			c := e*ne + n*nn + u*nu
			if c <= 0 {
				continue
			}
			if len(hz) > 0 {
				az := math.Atan2(e, n) * rad
				if math.Asin(math.Min(1, u))*rad <= hz.ElevationAtDeg(az) {
					continue
				}
			}
			g[h].cosT += c
		}
	}
}

// transpose carries one hour's horizontal irradiation ghiWh onto the plane.
// The beam/diffuse split is Erbs et al. (1982), Duffie & Beckman (2013)
// eq. 2.10.1; isotropic sky is Duffie & Beckman eq. 2.15.1 and HDKR eq.
// 2.16.7.
func transpose(s *HourlySite, g *hourGeom, ghiWh float64) float64 {
	if !(ghiWh > 0) {
		return 0
	}
	beta := s.Plane.TiltDeg * deg
	cb := math.Cos(beta)
	ground := ghiWh * s.Plane.AlbedoFraction * (1 - cb) / 2
	if g.cosZ <= 0 || g.i0Wh <= 0 {
		return ghiWh*(1+cb)/2 + ground // no sun in the hour: all diffuse
	}
	kt := math.Min(1, ghiWh/g.i0Wh)
	fd := ErbsHourlyDiffuseFraction(kt)
	id := ghiWh * fd
	ib := ghiWh - id
	rb := math.Min(maxBeamRatio, g.cosT/g.cosZ)
	if s.Model == HDKR {
		ai := math.Min(1, ib/g.i0Wh)
		f := math.Sqrt(ib / ghiWh)
		sh := math.Sin(beta / 2)
		return (ib+id*ai)*rb + id*(1-ai)*(1+cb)/2*(1+f*sh*sh*sh) + ground
	}
	return ib*rb + id*(1+cb)/2 + ground
}

// HourlyPOA splits the day's horizontal irradiation ghiDayWhM2 (Wh/m²) on
// day of year dayOfYear into clock hours and carries each hour onto the
// plane: out[h] is the irradiation in Wh/m² on the plane in clock hour h of
// local standard time (h:00 to h+1:00). It does not allocate.
//
// The daily total is split by the r_t of Collares-Pereira & Rabl (1979)
// (Duffie & Beckman 2013 eq. 2.13.2), evaluated at six sub-steps in each hour
// and renormalised so the hours sum exactly to the day; each hour's diffuse
// fraction is Erbs et al. (1982) (eq. 2.10.1) on the hourly clearness index,
// and the plane's irradiation is the isotropic sky (eq. 2.15.1) or HDKR
// (eq. 2.16.7) with the beam ratio integrated over the sub-steps. The horizon
// removes the beam for sub-steps the sun is behind the skyline. In polar
// night (no sunrise) every hour is 0. Invalid input gives all zeros.
func HourlyPOA(s HourlySite, dayOfYear int, ghiDayWhM2 float64, out *[24]float64) {
	HourlyIrradiation(&s, dayOfYear, ghiDayWhM2, nil, out)
}

// HourlyIrradiation is HourlyPOA that also returns the horizontal hourly
// irradiation in ghiOut; either output may be nil. It does not allocate.
func HourlyIrradiation(s *HourlySite, dayOfYear int, ghiDayWhM2 float64, ghiOut, poaOut *[24]float64) {
	var local [24]float64
	ghi := &local
	if ghiOut != nil {
		ghi = ghiOut
		*ghi = [24]float64{}
	}
	if poaOut != nil {
		*poaOut = [24]float64{}
	}
	if !(ghiDayWhM2 > 0) || math.IsInf(ghiDayWhM2, 0) || !siteOK(s) {
		return
	}
	var g [24]hourGeom
	dayGeometry(s, dayOfYear, &g)
	var total float64
	for h := range g {
		total += g[h].weight
	}
	if total <= 0 {
		return
	}
	for h := range g {
		ghi[h] = ghiDayWhM2 * g[h].weight / total
	}
	if poaOut != nil {
		for h := range g {
			poaOut[h] = transpose(s, &g[h], ghi[h])
		}
	}
}

// HourlyPOAFromGHI carries measured hourly horizontal irradiation ghiWhM2
// (Wh/m² in each clock hour of local standard time, e.g. from a weather file)
// onto the plane, with the diffuse split and transposition of HourlyPOA. An
// hour with irradiation but no sun above the horizon (clock or file offsets)
// is taken as all diffuse. It does not allocate.
func HourlyPOAFromGHI(s *HourlySite, dayOfYear int, ghiWhM2 *[24]float64, out *[24]float64) {
	*out = [24]float64{}
	if !siteOK(s) {
		return
	}
	var g [24]hourGeom
	dayGeometry(s, dayOfYear, &g)
	for h := range g {
		v := ghiWhM2[h]
		if v > 0 && !math.IsInf(v, 0) {
			out[h] = transpose(s, &g[h], v)
		}
	}
}

func siteOK(s *HourlySite) bool {
	p := s.Plane
	return !(math.IsNaN(s.LatDeg) || s.LatDeg < -90 || s.LatDeg > 90 ||
		math.IsNaN(s.LonDeg) || math.IsInf(s.LonDeg, 0) ||
		math.IsNaN(s.UTCOffsetH) || math.IsInf(s.UTCOffsetH, 0) ||
		math.IsNaN(p.TiltDeg) || p.TiltDeg < 0 || p.TiltDeg > 180 ||
		math.IsNaN(p.AzimuthDeg) || math.IsInf(p.AzimuthDeg, 0) ||
		math.IsNaN(p.AlbedoFraction) || p.AlbedoFraction < 0 || p.AlbedoFraction > 1)
}
