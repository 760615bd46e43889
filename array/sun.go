// Package array holds the solar side of solstand: sun geometry, the monthly
// and hourly solar resource on the plane of the array, the photovoltaic
// module, string and charge-controller models, derates and array sizing.
//
// Angles are degrees at every boundary; azimuths are measured clockwise from
// true north (0 N, 90 E, 180 S, 270 W) for the sun and for surfaces, in both
// hemispheres. Radians appear only inside functions.
package array

import (
	"math"
	"time"
)

const (
	deg = math.Pi / 180
	rad = 180 / math.Pi
)

// SolarConstantWM2 is the solar constant used for extraterrestrial
// irradiation: 1367 W/m², the value of Duffie & Beckman (2006, 3rd ed.) §1.2
// and the one the Erbs and Collares-Pereira & Rabl correlations were fitted
// with. (Duffie & Beckman 2013, 4th ed., use 1361 W/m², 0.5 % less.)
const SolarConstantWM2 = 1367.0

// dayAngleRad is the day angle B = 2π(n − 1)/365 of Spencer (1971), as in
// Duffie & Beckman (2013) eq. 1.4.2; n may be fractional.
func dayAngleRad(n float64) float64 { return 2 * math.Pi * (n - 1) / 365 }

// spencerDeclinationRad is Spencer's (1971) Fourier series for the
// declination, Duffie & Beckman (2013) eq. 1.6.1b, for day angle b.
func spencerDeclinationRad(b float64) float64 {
	return 0.006918 - 0.399912*math.Cos(b) + 0.070257*math.Sin(b) -
		0.006758*math.Cos(2*b) + 0.000907*math.Sin(2*b) -
		0.002697*math.Cos(3*b) + 0.00148*math.Sin(3*b)
}

// spencerEquationOfTimeMin is Spencer's (1971) equation of time in minutes,
// as given by Iqbal (1983) and Duffie & Beckman (2013) eq. 1.5.3.
func spencerEquationOfTimeMin(b float64) float64 {
	return 229.2 * (0.000075 + 0.001868*math.Cos(b) - 0.032077*math.Sin(b) -
		0.014615*math.Cos(2*b) - 0.04089*math.Sin(2*b))
}

// DeclinationDeg is the solar declination on day of year dayOfYear (1–366),
// by Spencer's (1971) Fourier series, Duffie & Beckman (2013) eq. 1.6.1b
// (error below about 0.035°).
func DeclinationDeg(dayOfYear int) float64 {
	return spencerDeclinationRad(dayAngleRad(float64(dayOfYear))) * rad
}

// DeclinationCooperDeg is the solar declination by Cooper (1969),
// δ = 23.45° sin(360° (284 + n)/365), Duffie & Beckman (2013) eq. 1.6.1a.
func DeclinationCooperDeg(dayOfYear int) float64 {
	return 23.45 * math.Sin(2*math.Pi*(284+float64(dayOfYear))/365)
}

// EquationOfTimeMin is the equation of time (apparent minus mean solar time)
// in minutes on day of year dayOfYear, by Spencer (1971) as given in Duffie &
// Beckman (2013) eq. 1.5.3.
func EquationOfTimeMin(dayOfYear int) float64 {
	return spencerEquationOfTimeMin(dayAngleRad(float64(dayOfYear)))
}

// representativeDays are Klein's (1977) mean days of the months, Duffie &
// Beckman (2013) Table 1.6.1, as days of a non-leap year.
var representativeDays = [12]int{17, 47, 75, 105, 135, 162, 198, 228, 258, 288, 318, 344}

// RepresentativeDay is Klein's (1977) recommended average day of month
// (1–12) as day of year, Duffie & Beckman (2013) Table 1.6.1: the day whose
// extraterrestrial irradiation is closest to the month's mean. Months outside
// 1–12 are wrapped onto that range.
func RepresentativeDay(month int) int {
	m := ((month-1)%12+12)%12 + 1
	return representativeDays[m-1]
}

// SunsetHourAngleDeg is the sunset hour angle ωs = arccos(−tan φ tan δ),
// Duffie & Beckman (2013) eq. 1.6.10, for latitude latDeg and declination
// declDeg. It is 0 in polar night and 180 under the midnight sun.
func SunsetHourAngleDeg(latDeg, declDeg float64) float64 {
	return sunsetRad(latDeg*deg, declDeg*deg) * rad
}

func sunsetRad(phi, delta float64) float64 {
	x := -math.Tan(phi) * math.Tan(delta)
	switch {
	case x >= 1 || math.IsNaN(x):
		return 0
	case x <= -1:
		return math.Pi
	}
	return math.Acos(x)
}

// SunPosition is the sun seen from a site at one instant. ElevationDeg and
// ZenithDeg are apparent (refraction applied, see Refraction); TrueElevationDeg
// is the geometric elevation without refraction. AzimuthDeg is clockwise from
// true north. HourAngleDeg is negative in the morning. SolarTimeH is local
// apparent solar time in hours (0–24).
type SunPosition struct {
	ZenithDeg, AzimuthDeg, ElevationDeg, DeclinationDeg, HourAngleDeg, EquationOfTimeMin, SolarTimeH float64
	// TrueElevationDeg is the geometric elevation, before refraction.
	TrueElevationDeg float64
}

// RefractionDeg is the atmospheric refraction to add to a true (geometric)
// sun elevation trueElevDeg, by Sæmundsson (1986) as given in Meeus (1998)
// eq. 16.4, R = 1.02′ / tan(h + 10.3/(h + 5.11)), for 1010 hPa and 10 °C.
// It is zero for true elevations below −1°, where the sun is well below the
// horizon.
func RefractionDeg(trueElevDeg float64) float64 {
	if trueElevDeg < -1 || math.IsNaN(trueElevDeg) {
		return 0
	}
	h := trueElevDeg + 10.3/(trueElevDeg+5.11)
	return math.Max(0, 1.02/math.Tan(h*deg)/60)
}

// sunVector is the unit vector towards the sun in (east, north, up)
// coordinates for latitude phi, declination delta and hour angle omega
// (radians); its up component is cos θz of Duffie & Beckman (2013) eq. 1.6.5.
func sunVector(phi, delta, omega float64) (e, n, u float64) {
	sp, cp := math.Sincos(phi)
	sd, cd := math.Sincos(delta)
	so, co := math.Sincos(omega)
	u = cp*cd*co + sp*sd
	e = -cd * so
	n = sd*cp - cd*co*sp
	return e, n, u
}

// position assembles a SunPosition from latitude, declination and hour angle
// in radians (Duffie & Beckman 2013 eqs. 1.6.5 and 1.6.6, written with
// atan2 so the azimuth is clockwise from north in both hemispheres).
func position(phi, delta, omega, eotMin, solarTimeH float64) SunPosition {
	e, n, u := sunVector(phi, delta, omega)
	u = math.Max(-1, math.Min(1, u))
	trueElev := math.Asin(u) * rad
	az := math.Atan2(e, n) * rad
	if az < 0 {
		az += 360
	}
	if math.Abs(e) < 1e-15 && math.Abs(n) < 1e-15 {
		az = 180 // sun at the zenith or nadir: any azimuth; report south
	}
	elev := trueElev + RefractionDeg(trueElev)
	return SunPosition{
		ZenithDeg:         90 - elev,
		AzimuthDeg:        az,
		ElevationDeg:      elev,
		DeclinationDeg:    delta * rad,
		HourAngleDeg:      omega * rad,
		EquationOfTimeMin: eotMin,
		SolarTimeH:        solarTimeH,
		TrueElevationDeg:  trueElev,
	}
}

// SunAt is the sun's position at latitude latDeg and longitude lonDeg (east
// positive) at the instant t; the zone of t only fixes the instant.
// Declination and equation of time come from the low-accuracy solar
// coordinates of Meeus (1998) ch. 25 (eqs. 25.2–25.8) and the equation of
// time of Meeus (1998) eq. 28.3, both good to about 0.01°; apparent solar time
// is universal time + longitude/15° + equation of time (Duffie & Beckman 2013
// eq. 1.5.2 written for east-positive longitude); zenith and azimuth follow
// Duffie & Beckman eqs. 1.6.5–1.6.6 and the elevation is corrected for
// refraction by Sæmundsson's formula (see RefractionDeg). Against the Reda &
// Andreas (2004) example it agrees to about 0.02°. (Spencer's 1971 series of
// DeclinationDeg is kept for the day-based monthly and hourly methods that
// were fitted with it; at a given instant it can be 0.2° off.)
func SunAt(latDeg, lonDeg float64, t time.Time) SunPosition {
	u := t.UTC()
	hUTC := float64(u.Hour()) + float64(u.Minute())/60 + (float64(u.Second())+float64(u.Nanosecond())/1e9)/3600
	jd := float64(u.Unix())/86400 + float64(u.Nanosecond())/86400e9 + 2440587.5
	delta, eot := meeusSun(jd)
	solar := math.Mod(hUTC+lonDeg/15+eot/60, 24)
	if solar < 0 {
		solar += 24
	}
	omega := (solar - 12) * 15 * deg
	return position(latDeg*deg, delta, omega, eot, solar)
}

// meeusSun returns the sun's apparent declination (radians) and the equation
// of time (minutes) at Julian day jd, by Meeus (1998) ch. 25 (low accuracy,
// eqs. 25.2–25.8) and eq. 28.3.
func meeusSun(jd float64) (delta, eotMin float64) {
	T := (jd - 2451545) / 36525
	l0 := math.Mod(280.46646+T*(36000.76983+0.0003032*T), 360) * deg
	m := math.Mod(357.52911+T*(35999.05029-0.0001537*T), 360) * deg
	e := 0.016708634 - T*(0.000042037+0.0000001267*T)
	c := ((1.914602-T*(0.004817+0.000014*T))*math.Sin(m) +
		(0.019993-0.000101*T)*math.Sin(2*m) + 0.000289*math.Sin(3*m)) * deg
	omegaN := (125.04 - 1934.136*T) * deg
	lambda := l0 + c - (0.00569+0.00478*math.Sin(omegaN))*deg
	eps0 := 23 + (26+(21.448-T*(46.8150+T*(0.00059-0.001813*T)))/60)/60
	eps := (eps0 + 0.00256*math.Cos(omegaN)) * deg
	delta = math.Asin(math.Sin(eps) * math.Sin(lambda))
	y := math.Tan(eps/2) * math.Tan(eps/2)
	E := y*math.Sin(2*l0) - 2*e*math.Sin(m) + 4*e*y*math.Sin(m)*math.Cos(2*l0) -
		0.5*y*y*math.Sin(4*l0) - 1.25*e*e*math.Sin(2*m)
	return delta, 4 * E * rad
}

// SunFromHourAngle is the sun's position at latitude latDeg for declination
// declDeg and hour angle hourAngleDeg (negative before solar noon), by Duffie
// & Beckman (2013) eqs. 1.6.5–1.6.6 with refraction as in SunAt; the equation
// of time is left 0. Use it to reproduce worked examples that fix the
// declination.
func SunFromHourAngle(latDeg, declDeg, hourAngleDeg float64) SunPosition {
	return position(latDeg*deg, declDeg*deg, hourAngleDeg*deg, 0, 12+hourAngleDeg/15)
}

// SunAtSolarTime is the sun's position at latitude latDeg on day of year
// dayOfYear at local apparent solar time solarTimeH (hours, 12 = solar noon),
// by Spencer's (1971) declination and Duffie & Beckman (2013) eqs.
// 1.6.5–1.6.6, with refraction as in SunAt.
func SunAtSolarTime(latDeg float64, dayOfYear int, solarTimeH float64) SunPosition {
	b := dayAngleRad(float64(dayOfYear))
	omega := (solarTimeH - 12) * 15 * deg
	return position(latDeg*deg, spencerDeclinationRad(b), omega, spencerEquationOfTimeMin(b), solarTimeH)
}

// IncidenceDeg is the angle of incidence of the sun's beam on a surface of
// slope tiltDeg whose outward normal faces surfaceAzimuthDeg (clockwise from
// north), by Duffie & Beckman (2013) eq. 1.6.3,
// cos θ = cos θz cos β + sin θz sin β cos(γs − γ). An angle above 90° means
// the sun is behind the surface. It uses the sun's apparent zenith.
func IncidenceDeg(sun SunPosition, tiltDeg, surfaceAzimuthDeg float64) float64 {
	sz, cz := math.Sincos(sun.ZenithDeg * deg)
	sb, cb := math.Sincos(tiltDeg * deg)
	c := cz*cb + sz*sb*math.Cos((sun.AzimuthDeg-surfaceAzimuthDeg)*deg)
	return math.Acos(math.Max(-1, math.Min(1, c))) * rad
}

// SunPathRow is the sun at one whole hour of local apparent solar time on the
// 21st of a month.
type SunPathRow struct {
	Month        int
	Hour         int // local apparent solar hour, 0–23
	ElevationDeg float64
	AzimuthDeg   float64
}

// day21 is the day of year of the 21st of each month in a non-leap year.
var day21 = [12]int{21, 52, 80, 111, 141, 172, 202, 233, 264, 294, 325, 355}

// SunPath is the sun-path table for latitude latDeg: apparent elevation and
// azimuth at each whole solar hour on the 21st of each month while the sun is
// up (apparent elevation above 0°), from SunAtSolarTime.
func SunPath(latDeg float64) []SunPathRow {
	rows := make([]SunPathRow, 0, 12*16)
	for m := 1; m <= 12; m++ {
		for h := 0; h < 24; h++ {
			p := SunAtSolarTime(latDeg, day21[m-1], float64(h))
			if p.ElevationDeg > 0 {
				rows = append(rows, SunPathRow{Month: m, Hour: h, ElevationDeg: p.ElevationDeg, AzimuthDeg: p.AzimuthDeg})
			}
		}
	}
	return rows
}
