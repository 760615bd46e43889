package weather

import (
	"errors"
	"fmt"
	"math"
)

// Location is the site a weather file describes.
type Location struct {
	Name         string  // city or site name, as the file gives it
	LatitudeDeg  float64 // degrees, north positive
	LongitudeDeg float64 // degrees, east positive
	UTCOffsetH   float64 // local standard time minus UTC, hours
	ElevationM   float64 // metres above sea level
	Known        bool    // false when the file gives no coordinates (CSV)
}

// Hour is one hour of a weather year. Hour h covers h:00 to h+1:00 local
// standard time. Irradiation values are energies over the hour, which for a
// one-hour interval equal the hour's mean irradiance in W/m².
type Hour struct {
	Month   int     // 1..12
	Day     int     // 1..31
	Hour    int     // 0..23, the interval Hour:00 to Hour+1:00
	GHIWhM2 float64 // global horizontal irradiation over the hour
	DNIWhM2 float64 // direct normal irradiation over the hour (0 when the file has none)
	DHIWhM2 float64 // diffuse horizontal irradiation over the hour (0 when the file has none)
	TempC   float64 // air (dry-bulb) temperature, °C (0 when the file has none)
	Filled  bool    // true when any of the values was filled in a gap
}

// Day is one day of a daily weather year.
type Day struct {
	Month       int     // 1..12
	Day         int     // 1..31
	GHIKWhM2Day float64 // global horizontal irradiation over the day, kWh/m²
	TempC       float64 // the day's mean air temperature, °C (0 when the file has none)
	Filled      bool    // true when any of the values was filled in a gap
}

// Series is one weather year read from a file.
type Series struct {
	Location Location
	// Hourly holds the 8760 hours of a 365-day year in order (1 January
	// hour 0 first) for hourly sources; a leap year's 29 February is
	// dropped and counted in Notes. Nil for daily sources.
	Hourly []Hour
	// Daily holds the 365 days in order for daily sources; nil otherwise.
	Daily []Day
	// FilledHours counts the hours in which at least one value was filled
	// in a short gap from the month's mean hourly profile.
	FilledHours int
	// FilledDays counts the days of a daily source in which at least one
	// value was filled from the month's mean.
	FilledDays int
	// HasTempC is true when the file carries air temperature.
	HasTempC bool
	// HasBeamDiffuse is true when the file carries direct normal and
	// diffuse horizontal irradiation (always for EPW).
	HasBeamDiffuse bool
	// Notes says what was done to the data: interval convention, leap day,
	// gaps filled, time zone.
	Notes []string
	// Source is "epw", "csv-hourly" or "csv-daily".
	Source string
}

// Limits of the checks, and of gap filling.
const (
	// MaxIrradianceWM2 is the largest hourly mean irradiance accepted
	// (global, direct normal or diffuse).
	MaxIrradianceWM2 = 1500.0
	// MinTempC and MaxTempC bound the accepted air temperature.
	MinTempC = -90.0
	MaxTempC = 60.0
	// MaxGapHours is the longest run of missing hours that is filled.
	MaxGapHours = 6
	// MaxGapDays is the longest run of missing days of a daily file that
	// is filled.
	MaxGapDays = 2
)

// Errors a reader wraps; test them with errors.Is.
var (
	// ErrFormat marks a file that does not follow the format.
	ErrFormat = errors.New("bad format")
	// ErrOutOfRange marks a value outside its physical range.
	ErrOutOfRange = errors.New("value out of range")
	// ErrLongGap marks a run of missing data too long to fill.
	ErrLongGap = errors.New("gap too long to fill")
)

// ParseError is an error at a place in a weather file, after the model of
// encoding/csv's ParseError. Line is 1-based (0 when the error belongs to
// the file as a whole); Column is the 1-based field number (0 when the error
// belongs to the whole line).
type ParseError struct {
	File   string
	Line   int
	Column int
	Err    error
}

// Error formats the error as "file:line:col: message".
func (e *ParseError) Error() string {
	switch {
	case e.Line <= 0:
		return fmt.Sprintf("%s: %v", e.File, e.Err)
	case e.Column <= 0:
		return fmt.Sprintf("%s:%d: %v", e.File, e.Line, e.Err)
	default:
		return fmt.Sprintf("%s:%d:%d: %v", e.File, e.Line, e.Column, e.Err)
	}
}

// Unwrap returns the underlying error.
func (e *ParseError) Unwrap() error { return e.Err }

// MonthlyMeans returns, for each month, the mean daily global horizontal
// irradiation (kWh/m²/day) and the mean air temperature (°C). The
// temperatures are NaN when the file has none (HasTempC false).
func (s Series) MonthlyMeans() (ghiKWhM2Day [12]float64, tempC [12]float64, err error) {
	var sumG, sumT [12]float64
	var nDays, nT [12]int
	switch {
	case len(s.Hourly) == HoursPerYear:
		for _, h := range s.Hourly {
			if h.Month < 1 || h.Month > 12 {
				return ghiKWhM2Day, tempC, fmt.Errorf("weather: hour with month %d", h.Month)
			}
			m := h.Month - 1
			sumG[m] += h.GHIWhM2
			sumT[m] += h.TempC
			nT[m]++
		}
		for m := range 12 {
			nDays[m] = daysInMonth[m]
		}
	case len(s.Daily) == DaysPerYear:
		for _, d := range s.Daily {
			if d.Month < 1 || d.Month > 12 {
				return ghiKWhM2Day, tempC, fmt.Errorf("weather: day with month %d", d.Month)
			}
			m := d.Month - 1
			sumG[m] += d.GHIKWhM2Day * 1000
			sumT[m] += d.TempC
			nT[m]++
			nDays[m]++
		}
	default:
		return ghiKWhM2Day, tempC, fmt.Errorf("weather: series holds %d hours and %d days, want %d hours or %d days",
			len(s.Hourly), len(s.Daily), HoursPerYear, DaysPerYear)
	}
	for m := range 12 {
		if nDays[m] == 0 || nT[m] == 0 {
			return ghiKWhM2Day, tempC, fmt.Errorf("weather: no data in month %d", m+1)
		}
		ghiKWhM2Day[m] = sumG[m] / float64(nDays[m]) / 1000
		if s.HasTempC {
			tempC[m] = sumT[m] / float64(nT[m])
		} else {
			tempC[m] = math.NaN()
		}
	}
	return ghiKWhM2Day, tempC, nil
}

// DailyGHIWhM2 returns the global horizontal irradiation of each of the 365
// days (Wh/m²/day), day 0 being 1 January, or nil when the series is empty.
func (s Series) DailyGHIWhM2() []float64 {
	switch {
	case len(s.Hourly) == HoursPerYear:
		out := make([]float64, DaysPerYear)
		for i, h := range s.Hourly {
			out[i/24] += h.GHIWhM2
		}
		return out
	case len(s.Daily) == DaysPerYear:
		out := make([]float64, DaysPerYear)
		for i, d := range s.Daily {
			out[i] = d.GHIKWhM2Day * 1000
		}
		return out
	}
	return nil
}

// DailyTempC returns the mean air temperature of each of the 365 days (°C),
// or nil when the file has no temperature.
func (s Series) DailyTempC() []float64 {
	if !s.HasTempC {
		return nil
	}
	switch {
	case len(s.Hourly) == HoursPerYear:
		out := make([]float64, DaysPerYear)
		for i, h := range s.Hourly {
			out[i/24] += h.TempC / 24
		}
		return out
	case len(s.Daily) == DaysPerYear:
		out := make([]float64, DaysPerYear)
		for i, d := range s.Daily {
			out[i] = d.TempC
		}
		return out
	}
	return nil
}

func (s Series) hourly(get func(Hour) float64) []float64 {
	if len(s.Hourly) != HoursPerYear {
		return nil
	}
	out := make([]float64, HoursPerYear)
	for i, h := range s.Hourly {
		out[i] = get(h)
	}
	return out
}

// HourlyGHIWhM2 returns the 8760 hourly global horizontal irradiation values
// (Wh/m² over each hour), or nil for a daily source.
func (s Series) HourlyGHIWhM2() []float64 {
	return s.hourly(func(h Hour) float64 { return h.GHIWhM2 })
}

// HourlyDNIWhM2 returns the 8760 hourly direct normal irradiation values,
// or nil for a daily source or a file without them (HasBeamDiffuse false).
func (s Series) HourlyDNIWhM2() []float64 {
	if !s.HasBeamDiffuse {
		return nil
	}
	return s.hourly(func(h Hour) float64 { return h.DNIWhM2 })
}

// HourlyDHIWhM2 returns the 8760 hourly diffuse horizontal irradiation
// values, or nil for a daily source or a file without them.
func (s Series) HourlyDHIWhM2() []float64 {
	if !s.HasBeamDiffuse {
		return nil
	}
	return s.hourly(func(h Hour) float64 { return h.DHIWhM2 })
}

// HourlyTempC returns the 8760 hourly air temperatures (°C), or nil for a
// daily source or a file without temperature.
func (s Series) HourlyTempC() []float64 {
	if !s.HasTempC {
		return nil
	}
	return s.hourly(func(h Hour) float64 { return h.TempC })
}

// grid is one quantity over the slots of a year (8760 hours or 365 days)
// while a file is read: the value and whether it is present.
type grid struct {
	name    string // the quantity, for messages
	val     []float64
	present []bool
}

func newGrid(name string, n int) grid {
	return grid{name: name, val: make([]float64, n), present: make([]bool, n)}
}

// slotLabel names slot i of an hourly (perDay 24) or daily (perDay 1) year.
func slotLabel(i, perDay int) string {
	m, d := DayOfYearMonth(i / perDay)
	if perDay == 1 {
		return fmt.Sprintf("%02d-%02d", m, d)
	}
	return fmt.Sprintf("%02d-%02d %02d:00", m, d, i%perDay)
}

// fillGaps fills runs of missing slots no longer than maxGap with the mean
// of the present slots of the same month (and, for hourly data, the same
// hour), marking filled slots in filled. It returns the number of gaps
// filled and a description of the first few. A longer run is an ErrLongGap
// naming its range. perDay is 24 for hourly grids and 1 for daily ones.
func fillGaps(g grid, perDay, maxGap int, filled []bool) (gaps int, desc []string, err error) {
	n := len(g.val)
	keys := 12 * perDay
	sum := make([]float64, keys)
	cnt := make([]int, keys)
	key := func(i int) int {
		m, _ := DayOfYearMonth(i / perDay)
		return (m-1)*perDay + i%perDay
	}
	for i := range n {
		if g.present[i] {
			k := key(i)
			sum[k] += g.val[i]
			cnt[k]++
		}
	}
	unit := "hours"
	if perDay == 1 {
		unit = "days"
	}
	for i := 0; i < n; {
		if g.present[i] {
			i++
			continue
		}
		j := i
		for j < n && !g.present[j] {
			j++
		}
		run := j - i
		if run > maxGap {
			return gaps, desc, fmt.Errorf("%w: %s missing for %d %s from %s to %s (at most %d are filled)",
				ErrLongGap, g.name, run, unit, slotLabel(i, perDay), slotLabel(j-1, perDay), maxGap)
		}
		for k := i; k < j; k++ {
			c := cnt[key(k)]
			if c == 0 {
				m, _ := DayOfYearMonth(k / perDay)
				return gaps, desc, fmt.Errorf("%w: %s missing at %s and never present at that time in month %d to fill from",
					ErrLongGap, g.name, slotLabel(k, perDay), m)
			}
			g.val[k] = sum[key(k)] / float64(c)
			filled[k] = true
		}
		gaps++
		if len(desc) < 10 {
			desc = append(desc, fmt.Sprintf("%s %s to %s", g.name, slotLabel(i, perDay), slotLabel(j-1, perDay)))
		}
		i = j
	}
	return gaps, desc, nil
}

// fillAll fills every grid and returns the count of filled slots and notes.
func fillAll(grids []grid, perDay, maxGap int) (filled []bool, count int, notes []string, err error) {
	n := len(grids[0].val)
	filled = make([]bool, n)
	total := 0
	var desc []string
	for _, g := range grids {
		gaps, d, err := fillGaps(g, perDay, maxGap, filled)
		if err != nil {
			return nil, 0, nil, err
		}
		total += gaps
		desc = append(desc, d...)
	}
	for _, f := range filled {
		if f {
			count++
		}
	}
	if count > 0 {
		unit, from := "hours", "the month's mean hourly profile"
		if perDay == 1 {
			unit, from = "days", "the month's mean"
		}
		note := fmt.Sprintf("filled %d %s in %d short gaps from %s: %v", count, unit, total, from, desc)
		if len(desc) < total {
			note += fmt.Sprintf(" and %d more", total-len(desc))
		}
		notes = append(notes, note)
	}
	return filled, count, notes, nil
}

func checkIrradiance(v float64) error {
	if math.IsNaN(v) || v < 0 || v > MaxIrradianceWM2 {
		return fmt.Errorf("%w: irradiance %g W/m² outside 0..%g", ErrOutOfRange, v, MaxIrradianceWM2)
	}
	return nil
}

func checkTemp(v float64) error {
	if math.IsNaN(v) || v < MinTempC || v > MaxTempC {
		return fmt.Errorf("%w: temperature %g °C outside %g..%g", ErrOutOfRange, v, MinTempC, MaxTempC)
	}
	return nil
}
