package weather

import (
	"math"
	"strings"
	"testing"
)

func TestCalendar(t *testing.T) {
	// The Gregorian calendar of a common year (common practice).
	tests := []struct{ index, month, day int }{
		{0, 1, 1}, {30, 1, 31}, {31, 2, 1}, {58, 2, 28}, {59, 3, 1},
		{180, 6, 30}, {181, 7, 1}, {364, 12, 31}, {365, 1, 1}, {365*3 + 40, 2, 10}, {-1, 12, 31},
	}
	for _, tc := range tests {
		if m, d := DayOfYearMonth(tc.index); m != tc.month || d != tc.day {
			t.Errorf("DayOfYearMonth(%d) = %d, %d; want %d, %d", tc.index, m, d, tc.month, tc.day)
		}
	}
	total := 0
	for m := 1; m <= 12; m++ {
		if FirstDayOfMonth(m) != total {
			t.Errorf("FirstDayOfMonth(%d) = %d, want %d", m, FirstDayOfMonth(m), total)
		}
		total += DaysInMonth(m)
	}
	if total != 365 || DaysInMonth(2) != 28 || DaysInMonth(0) != 0 || DaysInMonth(13) != 0 || FirstDayOfMonth(13) != -1 {
		t.Errorf("calendar: %d days", total)
	}
	for i := range DaysPerYear {
		m, d := DayOfYearMonth(i)
		if dayIndex(m, d) != i {
			t.Fatalf("dayIndex(%d, %d) != %d", m, d, i)
		}
	}
	if dayIndex(2, 29) != -1 || dayIndex(4, 31) != -1 {
		t.Error("dayIndex accepts a day outside the 365-day calendar")
	}
}

func TestHourlyAirTempC(t *testing.T) {
	// The shape is our own (see HourlyAirTempC); these checks follow from
	// its definition.
	tests := []struct{ mean, swing float64 }{{20, 10}, {-5, 8}, {30, 0}}
	for _, tc := range tests {
		sum, coldest, warmest := 0.0, 0, 0
		for h := range 24 {
			v := HourlyAirTempC(tc.mean, tc.swing, h)
			sum += v
			if v < HourlyAirTempC(tc.mean, tc.swing, coldest) {
				coldest = h
			}
			if v > HourlyAirTempC(tc.mean, tc.swing, warmest) {
				warmest = h
			}
		}
		if math.Abs(sum/24-tc.mean) > 1e-12 {
			t.Errorf("mean %g: 24-hour mean %g", tc.mean, sum/24)
		}
		if tc.swing == 0 {
			continue
		}
		// The coldest hour ends or starts at 06:00, the warmest at 15:00.
		if (coldest != 5 && coldest != 6) || (warmest != 14 && warmest != 15) {
			t.Errorf("coldest hour %d, warmest %d", coldest, warmest)
		}
		// Mid-hour samples stay within 2 % of the full swing.
		got := HourlyAirTempC(tc.mean, tc.swing, warmest) - HourlyAirTempC(tc.mean, tc.swing, coldest)
		if got > tc.swing || got < 0.98*tc.swing {
			t.Errorf("hourly swing %g, want just under %g", got, tc.swing)
		}
	}
	if HourlyAirTempC(10, 5, 24) != HourlyAirTempC(10, 5, 0) || HourlyAirTempC(10, 5, -1) != HourlyAirTempC(10, 5, 23) {
		t.Error("hours are not taken modulo 24")
	}
	if HourlyAirTempFromRangeC(10, 20, 9) != HourlyAirTempC(15, 10, 9) {
		t.Error("range form differs from mean and swing")
	}
	// The shape is continuous at its joins (06:00 and 15:00).
	for _, at := range []float64{TempMinHour, TempMaxHour} {
		if d := math.Abs(tempShapeAt(at-1e-9) - tempShapeAt(at+1e-9)); d > 1e-8 {
			t.Errorf("shape jumps by %g at %g h", d, at)
		}
	}
}

func TestDistanceAndLocation(t *testing.T) {
	// One degree of latitude on a sphere of 6371 km: 2π·6371/360 =
	// 111.195 km (computed here).
	if d := DistanceKm(10, 20, 11, 20); math.Abs(d-2*math.Pi*6371/360) > 1e-9 {
		t.Errorf("one degree of latitude: %g km", d)
	}
	// A quarter of the equator: π/2 · 6371 km (computed here).
	if d := DistanceKm(0, 0, 0, 90); math.Abs(d-math.Pi/2*6371) > 1e-9 {
		t.Errorf("quarter equator: %g km", d)
	}
	file := Location{Name: "Testville", LatitudeDeg: testLat, LongitudeDeg: testLon, Known: true}
	tests := []struct {
		name     string
		file     Location
		lat, lon float64
		limit    float64
		code     string
	}{
		{"same site", file, testLat, testLon, 0, ""},
		{"3 km away", file, testLat + 0.027, testLon, 0, ""},
		{"20 km away", file, testLat + 0.18, testLon, 0, "weather-site-mismatch"},
		{"20 km with a 50 km limit", file, testLat + 0.18, testLon, 50, ""},
		{"no coordinates", Location{}, testLat, testLon, 0, "weather-site-unknown"},
	}
	for _, tc := range tests {
		c := CheckLocation(tc.file, tc.lat, tc.lon, tc.limit)
		code := ""
		if len(c) > 0 {
			code = c[0].Code
		}
		if code != tc.code {
			t.Errorf("%s: cautions %+v, want code %q", tc.name, c, tc.code)
		}
		if code == "weather-site-mismatch" && !strings.Contains(c[0].Message, "20 km") {
			t.Errorf("%s: message %q", tc.name, c[0].Message)
		}
	}
}

func TestParseErrorFormat(t *testing.T) {
	tests := []struct {
		e    ParseError
		want string
	}{
		{ParseError{File: "a.csv", Line: 3, Column: 2, Err: ErrFormat}, "a.csv:3:2: bad format"},
		{ParseError{File: "a.csv", Line: 3, Err: ErrFormat}, "a.csv:3: bad format"},
		{ParseError{File: "a.csv", Err: ErrFormat}, "a.csv: bad format"},
	}
	for _, tc := range tests {
		if got := tc.e.Error(); got != tc.want {
			t.Errorf("%q, want %q", got, tc.want)
		}
	}
}
