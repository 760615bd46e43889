package weather

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
)

// EPW field positions (0-based) in a data record, from the EnergyPlus
// Auxiliary Programs weather data chapter.
const (
	epwYear   = 0
	epwMonth  = 1
	epwDay    = 2
	epwHour   = 3
	epwTemp   = 6  // dry-bulb temperature, °C, missing 99.9
	epwGHI    = 13 // global horizontal radiation, Wh/m², missing 9999
	epwDNI    = 14 // direct normal radiation, Wh/m², missing 9999
	epwDHI    = 15 // diffuse horizontal radiation, Wh/m², missing 9999
	epwFields = 16 // fewest fields a record must have to reach the diffuse field

	epwHeaderLines  = 8
	epwMissingRad   = 9999.0
	epwMissingTemp  = 99.9
	maxLineBytes    = 1 << 16
	maxRecordsInput = 2 * 8784 // more records than two leap years is not one year
)

// readLines calls fn for each line of r (without its line ending), with its
// 1-based number, stopping at the first error.
func readLines(r io.Reader, fn func(n int, line string) error) error {
	br := bufio.NewReaderSize(r, 1<<16)
	n := 0
	for {
		line, err := br.ReadString('\n')
		if len(line) > maxLineBytes {
			return &ParseError{Line: n + 1, Err: fmt.Errorf("%w: line longer than %d bytes", ErrFormat, maxLineBytes)}
		}
		if len(line) > 0 {
			n++
			line = strings.TrimRight(line, "\r\n")
			if ferr := fn(n, line); ferr != nil {
				return ferr
			}
		}
		if errors.Is(err, io.EOF) {
			return nil
		}
		if err != nil {
			return err
		}
	}
}

// ReadEPW reads an EnergyPlus Weather file (EnergyPlus Auxiliary Programs,
// weather data chapter): the LOCATION header (latitude, longitude, time
// zone, elevation), the seven further header lines, then hour-ending hourly
// records. Record hour 1 covers 00:00–01:00 local standard time and is stored
// as Hour 0. Global horizontal, direct normal and diffuse horizontal
// radiation (Wh/m², missing code 9999) and dry-bulb temperature (°C, missing
// code 99.9) are read; the other fields are ignored. Records of 29 February
// are dropped and counted in Notes. Short gaps are filled (see the package
// documentation); out-of-range values and long gaps are refused. name
// labels errors and notes (a file name).
func ReadEPW(r io.Reader, name string) (Series, error) {
	s := Series{Source: "epw", HasTempC: true, HasBeamDiffuse: true}
	ghi := newGrid("global horizontal irradiation", HoursPerYear)
	dni := newGrid("direct normal irradiation", HoursPerYear)
	dhi := newGrid("diffuse horizontal irradiation", HoursPerYear)
	tmp := newGrid("dry-bulb temperature", HoursPerYear)
	seen := make([]bool, HoursPerYear)
	leap, records := 0, 0
	years := map[int]bool{}
	sawLocation := false

	perr := func(line, col int, err error) error {
		return &ParseError{File: name, Line: line, Column: col, Err: err}
	}
	num := func(fields []string, line, col int, what string) (float64, error) {
		v, err := strconv.ParseFloat(strings.TrimSpace(fields[col]), 64)
		if err != nil || math.IsInf(v, 0) || math.IsNaN(v) {
			return 0, perr(line, col+1, fmt.Errorf("%w: %s %q is not a number", ErrFormat, what, fields[col]))
		}
		return v, nil
	}
	integer := func(fields []string, line, col int, what string) (int, error) {
		v, err := strconv.Atoi(strings.TrimSpace(fields[col]))
		if err != nil {
			return 0, perr(line, col+1, fmt.Errorf("%w: %s %q is not a whole number", ErrFormat, what, fields[col]))
		}
		return v, nil
	}

	err := readLines(r, func(n int, line string) error {
		fields := strings.Split(line, ",")
		if n == 1 {
			return readEPWLocation(fields, n, &s.Location, perr, num)
		}
		if n < epwHeaderLines {
			return nil
		}
		if n == epwHeaderLines {
			sawLocation = true
			if strings.EqualFold(strings.TrimSpace(fields[0]), "DATA PERIODS") && len(fields) > 2 {
				rph, err := integer(fields, n, 2, "records per hour")
				if err != nil {
					return err
				}
				if rph != 1 {
					return perr(n, 3, fmt.Errorf("%w: %d records per hour; only hourly EPW files are read", ErrFormat, rph))
				}
			}
			return nil
		}
		if strings.TrimSpace(line) == "" {
			return nil
		}
		records++
		if records > maxRecordsInput {
			return perr(n, 0, fmt.Errorf("%w: more than %d records", ErrFormat, maxRecordsInput))
		}
		if len(fields) < epwFields {
			return perr(n, 0, fmt.Errorf("%w: record has %d fields, want at least %d", ErrFormat, len(fields), epwFields))
		}
		year, err := integer(fields, n, epwYear, "year")
		if err != nil {
			return err
		}
		month, err := integer(fields, n, epwMonth, "month")
		if err != nil {
			return err
		}
		day, err := integer(fields, n, epwDay, "day")
		if err != nil {
			return err
		}
		hour, err := integer(fields, n, epwHour, "hour")
		if err != nil {
			return err
		}
		if month < 1 || month > 12 {
			return perr(n, epwMonth+1, fmt.Errorf("%w: month %d", ErrFormat, month))
		}
		if hour < 1 || hour > 24 {
			return perr(n, epwHour+1, fmt.Errorf("%w: hour %d outside 1..24 (EPW hours end the interval)", ErrFormat, hour))
		}
		if month == 2 && day == 29 {
			leap++
			return nil
		}
		d := dayIndex(month, day)
		if d < 0 {
			return perr(n, epwDay+1, fmt.Errorf("%w: day %d of month %d", ErrFormat, day, month))
		}
		years[year] = true
		slot := d*24 + hour - 1
		if seen[slot] {
			return perr(n, 0, fmt.Errorf("%w: second record for %s", ErrFormat, slotLabel(slot, 24)))
		}
		seen[slot] = true
		for _, f := range []struct {
			col  int
			g    grid
			temp bool
		}{{epwGHI, ghi, false}, {epwDNI, dni, false}, {epwDHI, dhi, false}, {epwTemp, tmp, true}} {
			v, err := num(fields, n, f.col, f.g.name)
			if err != nil {
				return err
			}
			if f.temp {
				if v >= epwMissingTemp {
					continue
				}
				err = checkTemp(v)
			} else {
				if v >= epwMissingRad {
					continue
				}
				err = checkIrradiance(v)
			}
			if err != nil {
				return perr(n, f.col+1, fmt.Errorf("%s: %w", f.g.name, err))
			}
			f.g.val[slot], f.g.present[slot] = v, true
		}
		return nil
	})
	if err != nil {
		var pe *ParseError
		if errors.As(err, &pe) && pe.File == "" {
			pe.File = name
		}
		if !errors.As(err, &pe) {
			err = fmt.Errorf("%s: %w", name, err)
		}
		return Series{}, err
	}
	if !sawLocation {
		return Series{}, perr(0, 0, fmt.Errorf("%w: fewer than %d header lines", ErrFormat, epwHeaderLines))
	}
	if records == 0 {
		return Series{}, perr(0, 0, fmt.Errorf("%w: no data records", ErrFormat))
	}
	filled, count, notes, err := fillAll([]grid{ghi, dni, dhi, tmp}, 24, MaxGapHours)
	if err != nil {
		return Series{}, perr(0, 0, err)
	}
	s.FilledHours = count
	s.Hourly = make([]Hour, HoursPerYear)
	for i := range s.Hourly {
		m, d := DayOfYearMonth(i / 24)
		s.Hourly[i] = Hour{Month: m, Day: d, Hour: i % 24,
			GHIWhM2: ghi.val[i], DNIWhM2: dni.val[i], DHIWhM2: dhi.val[i], TempC: tmp.val[i], Filled: filled[i]}
	}
	s.Notes = append(s.Notes, fmt.Sprintf("EPW records are hour-ending: record hour 1 (00:00–01:00 local standard time, UTC%+g h) is stored as hour 0", s.Location.UTCOffsetH))
	if leap > 0 {
		s.Notes = append(s.Notes, fmt.Sprintf("dropped %d records of 29 February so the year has 365 days", leap))
	}
	if len(years) > 1 {
		s.Notes = append(s.Notes, fmt.Sprintf("records come from %d different years (a typical year)", len(years)))
	}
	s.Notes = append(s.Notes, notes...)
	return s, nil
}

// readEPWLocation reads the LOCATION header line.
func readEPWLocation(fields []string, n int, loc *Location,
	perr func(line, col int, err error) error,
	num func(fields []string, line, col int, what string) (float64, error)) error {
	if !strings.EqualFold(strings.TrimSpace(fields[0]), "LOCATION") {
		return perr(n, 1, fmt.Errorf("%w: first line does not start with LOCATION", ErrFormat))
	}
	if len(fields) < 10 {
		return perr(n, 0, fmt.Errorf("%w: LOCATION has %d fields, want 10", ErrFormat, len(fields)))
	}
	var parts []string
	for _, f := range fields[1:4] {
		if f = strings.TrimSpace(f); f != "" && f != "-" {
			parts = append(parts, f)
		}
	}
	loc.Name = strings.Join(parts, ", ")
	checks := []struct {
		col      int
		what     string
		lo, hi   float64
		dst      *float64
		unitNote string
	}{
		{6, "latitude", -90, 90, &loc.LatitudeDeg, "°"},
		{7, "longitude", -180, 180, &loc.LongitudeDeg, "°"},
		{8, "time zone", -12, 14, &loc.UTCOffsetH, " h"},
		{9, "elevation", -500, 9000, &loc.ElevationM, " m"},
	}
	for _, c := range checks {
		v, err := num(fields, n, c.col, c.what)
		if err != nil {
			return err
		}
		if v < c.lo || v > c.hi {
			return perr(n, c.col+1, fmt.Errorf("%w: %s %g%s outside %g..%g", ErrOutOfRange, c.what, v, c.unitNote, c.lo, c.hi))
		}
		*c.dst = v
	}
	loc.Known = true
	return nil
}
