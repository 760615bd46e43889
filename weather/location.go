package weather

import (
	"fmt"
	"math"

	"solstand/caution"
)

// earthRadiusKm is the mean radius of the Earth (IUGG mean radius R1,
// 6371.0 km).
const earthRadiusKm = 6371.0

// DefaultSiteMismatchKm is the distance between a weather file's location
// and the project's site beyond which CheckLocation cautions.
const DefaultSiteMismatchKm = 5.0

// DistanceKm returns the great-circle distance between two points on a
// sphere of the Earth's mean radius, by the haversine formula (Sinnott
// (1984), "Virtues of the Haversine", Sky and Telescope 68(2) 159).
func DistanceKm(lat1Deg, lon1Deg, lat2Deg, lon2Deg float64) float64 {
	const rad = math.Pi / 180
	p1, p2 := lat1Deg*rad, lat2Deg*rad
	dp := (lat2Deg - lat1Deg) * rad
	dl := (lon2Deg - lon1Deg) * rad
	a := math.Sin(dp/2)*math.Sin(dp/2) + math.Cos(p1)*math.Cos(p2)*math.Sin(dl/2)*math.Sin(dl/2)
	return 2 * earthRadiusKm * math.Asin(math.Sqrt(min(1, a)))
}

// CheckLocation compares a weather file's location with the project's site
// and returns a caution (code weather-site-mismatch, warning) when the two
// are more than limitKm apart; limitKm ≤ 0 means DefaultSiteMismatchKm. A
// file without coordinates gives an info caution (weather-site-unknown)
// instead, since the match cannot be checked.
func CheckLocation(file Location, latDeg, lonDeg, limitKm float64) []caution.Caution {
	if limitKm <= 0 {
		limitKm = DefaultSiteMismatchKm
	}
	if !file.Known {
		return []caution.Caution{{Code: "weather-site-unknown", Severity: caution.Info,
			Message: "the weather file gives no coordinates; check that it belongs to the project's site"}}
	}
	d := DistanceKm(file.LatitudeDeg, file.LongitudeDeg, latDeg, lonDeg)
	if d <= limitKm {
		return nil
	}
	name := file.Name
	if name == "" {
		name = "the weather file's site"
	}
	return []caution.Caution{{Code: "weather-site-mismatch", Severity: caution.Warning,
		Message: fmt.Sprintf("%s (%.4f°, %.4f°) lies %.0f km from the project's site (%.4f°, %.4f°); the weather may not represent the site",
			name, file.LatitudeDeg, file.LongitudeDeg, d, latDeg, lonDeg)}}
}

// Cautions returns the cautions the series itself calls for: filled gaps
// (info, weather-gaps-filled).
func (s Series) Cautions() []caution.Caution {
	var out []caution.Caution
	if s.FilledHours > 0 {
		out = append(out, caution.Caution{Code: "weather-gaps-filled", Severity: caution.Info,
			Message: fmt.Sprintf("%d hours of the weather file were missing and filled from the month's mean hourly profile", s.FilledHours)})
	}
	if s.FilledDays > 0 {
		out = append(out, caution.Caution{Code: "weather-gaps-filled", Severity: caution.Info,
			Message: fmt.Sprintf("%d days of the weather file were missing and filled from the month's mean", s.FilledDays)})
	}
	return out
}
