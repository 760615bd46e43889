package weather

import (
	"fmt"
	"math"
)

// Hours of the daily temperature extremes in the shape of HourlyAirTempC
// (common practice: the minimum near sunrise, the maximum in mid-afternoon).
const (
	TempMinHour = 6.0
	TempMaxHour = 15.0
)

// tempShapeAt is the daily temperature shape at clock time t (hours, any
// real): −1/2 at TempMinHour, +1/2 at TempMaxHour, a half cosine rising over
// the 9 hours between them and a half cosine falling over the other 15.
func tempShapeAt(t float64) float64 {
	t = math.Mod(t-TempMinHour, 24)
	if t < 0 {
		t += 24
	}
	rise := TempMaxHour - TempMinHour
	if t <= rise {
		return -0.5 * math.Cos(math.Pi*t/rise)
	}
	return 0.5 * math.Cos(math.Pi*(t-rise)/(24-rise))
}

// tempShape is the shape at the middle of each hour, shifted so the 24
// values average to exactly 0. It is computed once and never written.
var tempShape = func() [24]float64 {
	var s [24]float64
	mean := 0.0
	for h := range s {
		s[h] = tempShapeAt(float64(h) + 0.5)
		mean += s[h] / 24
	}
	for h := range s {
		s[h] -= mean
	}
	return s
}()

// HourlyAirTempC returns the air temperature (°C) of hour 0..23 (the
// interval hour:00 to hour+1:00, local standard time; other values are
// taken modulo 24) on a day of mean temperature monthMeanC and daily swing
// (maximum minus minimum) dailySwingC.
//
// The daily shape is our own simple one (common practice places the minimum
// near sunrise and the maximum in mid-afternoon): a half cosine rising from
// the minimum at 06:00 to the maximum at 15:00 and a half cosine falling
// back over the 15 hours to 06:00, T(t) = mean − swing/2 · cos(π(t − 6)/9)
// for 6 ≤ t ≤ 15 and mean + swing/2 · cos(π(t − 15)/15) after, taken at
// the middle of each hour and shifted by a small constant so the 24 hourly
// values average to exactly monthMeanC.
func HourlyAirTempC(monthMeanC, dailySwingC float64, hour int) float64 {
	h := hour % 24
	if h < 0 {
		h += 24
	}
	return monthMeanC + dailySwingC*tempShape[h]
}

// HourlyAirTempFromRangeC returns the air temperature (°C) of hour 0..23 on
// a day with mean minimum minC and mean maximum maxC, by the shape of
// HourlyAirTempC with the day's mean taken as (minC + maxC)/2 and the swing
// maxC − minC (common practice).
func HourlyAirTempFromRangeC(minC, maxC float64, hour int) float64 {
	return HourlyAirTempC((minC+maxC)/2, maxC-minC, hour)
}

// MonthlyClearness returns the monthly mean clearness index K̄T = H̄/H̄₀ of
// each month from the monthly mean daily global horizontal irradiation and
// extraterrestrial irradiation (both kWh/m²/day; Duffie & Beckman (2013)
// eq. 2.9.1). A month with H̄₀ = 0 (polar night) gets 0, which
// DailyClearness takes as a month without sun. It is an error when an
// irradiation is negative or not finite, or H̄ > 0 where H̄₀ = 0.
func MonthlyClearness(ghiKWhM2Day, h0KWhM2Day [12]float64) ([12]float64, error) {
	var kt [12]float64
	for m := range 12 {
		g, h0 := ghiKWhM2Day[m], h0KWhM2Day[m]
		if !(g >= 0) || !(h0 >= 0) || math.IsInf(g, 0) || math.IsInf(h0, 0) {
			return kt, fmt.Errorf("weather: month %d: irradiation %g over extraterrestrial %g: not a pair of finite non-negative values", m+1, g, h0)
		}
		if h0 == 0 {
			if g > 0 {
				return kt, fmt.Errorf("weather: month %d: irradiation %g kWh/m²/day where the extraterrestrial irradiation is 0", m+1, g)
			}
			continue
		}
		kt[m] = g / h0
	}
	return kt, nil
}
