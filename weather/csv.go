package weather

import (
	"bufio"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"time"
)

// Quantities a CSV row may carry, in grid order.
const (
	qGHI = iota
	qDNI
	qDHI
	qTemp
	nQuantities
)

var quantityNames = [nQuantities]string{
	"global horizontal irradiation", "direct normal irradiation", "diffuse horizontal irradiation", "air temperature",
}

type csvRow struct {
	line    int
	t       time.Time // time column, when used
	month   int
	day     int
	hour    int
	val     [nQuantities]float64
	present [nQuantities]bool
}

// ReadCSV reads a plain CSV weather file of hourly or daily values.
//
// The file has one header row; lines starting with # are comments; column
// names are case-insensitive and unknown columns are ignored. The timestamp
// is a column time (RFC 3339 with its UTC offset: the start of the interval
// the row describes; differing offsets are converted to the smallest one
// met, taken as the site's standard time) or a column date (YYYY-MM-DD, local
// standard time) with, for hourly data, a column hour (0..23: the interval
// hour:00 to hour+1:00).
//
// Hourly files give global horizontal irradiation as ghi_w_m2 (the mean
// irradiance over the hour, W/m²) or ghi_wh_m2 (the energy over the hour,
// Wh/m²), and may give dni_w_m2 / dni_wh_m2 and dhi_w_m2 / dhi_wh_m2 in the
// same way. Daily files give ghi_kwh_m2_day (the day's total, kWh/m²) and no
// hour. The column temp_c (air temperature of the hour or the day's mean,
// °C) is optional. An empty cell, NA or NaN is a missing value. The rows
// must make up one 365-day year (29 February is dropped and counted in
// Notes), in any order and across a change of calendar year if need be; short
// gaps are filled, long gaps and out-of-range values refused (see the
// package documentation). name labels errors and notes (a file name).
func ReadCSV(r io.Reader, name string) (Series, error) {
	perr := func(line, col int, err error) error {
		return &ParseError{File: name, Line: line, Column: col, Err: err}
	}
	br := bufio.NewReader(r)
	if b, err := br.Peek(3); err == nil && string(b) == "\xef\xbb\xbf" {
		_, _ = br.Discard(3)
	}
	cr := csv.NewReader(br)
	cr.Comment = '#'
	cr.TrimLeadingSpace = true
	cr.ReuseRecord = true
	convert := func(err error) error {
		var ce *csv.ParseError
		if errors.As(err, &ce) {
			return perr(ce.Line, 0, fmt.Errorf("%w: %v", ErrFormat, ce.Err))
		}
		return fmt.Errorf("%s: %w", name, err)
	}

	header, err := cr.Read()
	if errors.Is(err, io.EOF) {
		return Series{}, perr(0, 0, fmt.Errorf("%w: empty file", ErrFormat))
	}
	if err != nil {
		return Series{}, convert(err)
	}
	header = append([]string(nil), header...) // ReuseRecord: keep a copy
	headerLine, _ := cr.FieldPos(0)
	col := map[string]int{}
	for i, h := range header {
		h = strings.ToLower(strings.TrimSpace(h))
		if h == "" {
			continue
		}
		if _, dup := col[h]; dup {
			return Series{}, perr(headerLine, i+1, fmt.Errorf("%w: column %q appears twice", ErrFormat, h))
		}
		col[h] = i
	}
	has := func(k string) bool { _, ok := col[k]; return ok }
	pick := func(q string, names ...string) (int, error) {
		found := -1
		for _, n := range names {
			if i, ok := col[n]; ok {
				if found >= 0 {
					return 0, perr(headerLine, i+1, fmt.Errorf("%w: both %s and %s given for %s", ErrFormat, header[found], n, q))
				}
				found = i
			}
		}
		return found, nil
	}

	daily := has("ghi_kwh_m2_day")
	var qcol [nQuantities]int
	var qmax [nQuantities]float64
	if daily {
		if has("ghi_w_m2") || has("ghi_wh_m2") {
			return Series{}, perr(headerLine, 0, fmt.Errorf("%w: both daily (ghi_kwh_m2_day) and hourly ghi columns", ErrFormat))
		}
		if has("hour") {
			return Series{}, perr(headerLine, col["hour"]+1, fmt.Errorf("%w: a daily file (ghi_kwh_m2_day) has no hour column", ErrFormat))
		}
		qcol = [nQuantities]int{col["ghi_kwh_m2_day"], -1, -1, -1}
		qmax[qGHI] = MaxIrradianceWM2 * 24 / 1000
	} else {
		for q, names := range [][]string{{"ghi_w_m2", "ghi_wh_m2"}, {"dni_w_m2", "dni_wh_m2"}, {"dhi_w_m2", "dhi_wh_m2"}} {
			i, err := pick(quantityNames[q], names...)
			if err != nil {
				return Series{}, err
			}
			qcol[q] = i
			qmax[q] = MaxIrradianceWM2
		}
		if qcol[qGHI] < 0 {
			return Series{}, perr(headerLine, 0, fmt.Errorf("%w: no irradiation column (ghi_w_m2, ghi_wh_m2 or ghi_kwh_m2_day)", ErrFormat))
		}
		if (qcol[qDNI] < 0) != (qcol[qDHI] < 0) {
			return Series{}, perr(headerLine, 0, fmt.Errorf("%w: direct normal and diffuse columns come together or not at all", ErrFormat))
		}
	}
	qcol[qTemp] = -1
	if i, ok := col["temp_c"]; ok {
		qcol[qTemp] = i
	}
	timeCol, dateCol, hourCol := -1, -1, -1
	switch {
	case has("time"):
		timeCol = col["time"]
		if has("date") || has("hour") {
			return Series{}, perr(headerLine, 0, fmt.Errorf("%w: give either time or date (and hour), not both", ErrFormat))
		}
	case has("date"):
		dateCol = col["date"]
		if !daily {
			if !has("hour") {
				return Series{}, perr(headerLine, 0, fmt.Errorf("%w: an hourly file with a date column needs an hour column", ErrFormat))
			}
			hourCol = col["hour"]
		}
	default:
		return Series{}, perr(headerLine, 0, fmt.Errorf("%w: no time or date column", ErrFormat))
	}

	var rows []csvRow
	minOffset, offsets := math.MaxInt, map[int]bool{}
	for {
		rec, err := cr.Read()
		if errors.Is(err, io.EOF) {
			break
		}
		if err != nil {
			return Series{}, convert(err)
		}
		line, _ := cr.FieldPos(0)
		if len(rows) >= maxRecordsInput {
			return Series{}, perr(line, 0, fmt.Errorf("%w: more than %d rows", ErrFormat, maxRecordsInput))
		}
		row := csvRow{line: line}
		field := func(i int) string { return strings.TrimSpace(rec[i]) }
		if timeCol >= 0 {
			t, err := time.Parse(time.RFC3339, field(timeCol))
			if err != nil {
				return Series{}, perr(line, timeCol+1, fmt.Errorf("%w: time %q is not RFC 3339 with an offset", ErrFormat, field(timeCol)))
			}
			if !daily && (t.Minute() != 0 || t.Second() != 0 || t.Nanosecond() != 0) {
				return Series{}, perr(line, timeCol+1, fmt.Errorf("%w: time %q is not on a whole hour (hourly rows start at h:00)", ErrFormat, field(timeCol)))
			}
			_, off := t.Zone()
			offsets[off] = true
			minOffset = min(minOffset, off)
			row.t = t
		} else {
			t, err := time.Parse(time.DateOnly, field(dateCol))
			if err != nil {
				return Series{}, perr(line, dateCol+1, fmt.Errorf("%w: date %q is not YYYY-MM-DD", ErrFormat, field(dateCol)))
			}
			row.month, row.day = int(t.Month()), t.Day()
			if hourCol >= 0 {
				h, err := strconv.Atoi(field(hourCol))
				if err != nil || h < 0 || h > 23 {
					return Series{}, perr(line, hourCol+1, fmt.Errorf("%w: hour %q is not a whole number 0..23", ErrFormat, field(hourCol)))
				}
				row.hour = h
			}
		}
		for q, c := range qcol {
			if c < 0 {
				continue
			}
			txt := field(c)
			switch strings.ToLower(txt) {
			case "", "na", "nan":
				continue
			}
			v, err := strconv.ParseFloat(txt, 64)
			if err != nil {
				return Series{}, perr(line, c+1, fmt.Errorf("%w: %s %q is not a number", ErrFormat, header[c], txt))
			}
			if q == qTemp {
				err = checkTemp(v)
			} else if math.IsNaN(v) || v < 0 || v > qmax[q] {
				err = fmt.Errorf("%w: %g outside 0..%g", ErrOutOfRange, v, qmax[q])
			}
			if err != nil {
				return Series{}, perr(line, c+1, fmt.Errorf("%s: %w", header[c], err))
			}
			row.val[q], row.present[q] = v, true
		}
		rows = append(rows, row)
	}
	if len(rows) == 0 {
		return Series{}, perr(0, 0, fmt.Errorf("%w: no data rows", ErrFormat))
	}

	s := Series{Source: "csv-hourly", HasTempC: qcol[qTemp] >= 0, HasBeamDiffuse: qcol[qDNI] >= 0}
	perDay, maxGap, slots := 24, MaxGapHours, HoursPerYear
	if daily {
		s.Source, perDay, maxGap, slots = "csv-daily", 1, MaxGapDays, DaysPerYear
	}
	if timeCol >= 0 {
		zone := time.FixedZone("", minOffset)
		for i := range rows {
			t := rows[i].t
			if !daily {
				t = t.In(zone)
			}
			rows[i].month, rows[i].day, rows[i].hour = int(t.Month()), t.Day(), t.Hour()
		}
		s.Location.UTCOffsetH = float64(minOffset) / 3600
		if !daily {
			s.Notes = append(s.Notes, fmt.Sprintf("times read at UTC%+g h (the smallest offset in the file) as local standard time", s.Location.UTCOffsetH))
		}
		if len(offsets) > 1 && !daily {
			s.Notes = append(s.Notes, fmt.Sprintf("times with %d different UTC offsets converted to standard time UTC%+g h", len(offsets), s.Location.UTCOffsetH))
		}
	}
	grids := make([]grid, nQuantities)
	for q := range grids {
		grids[q] = newGrid(quantityNames[q], slots)
	}
	leap := 0
	seen := make([]bool, slots)
	for _, row := range rows {
		if row.month == 2 && row.day == 29 {
			leap++
			continue
		}
		slot := dayIndex(row.month, row.day)*perDay + row.hour
		if seen[slot] {
			return Series{}, perr(row.line, 0, fmt.Errorf("%w: second row for %s", ErrFormat, slotLabel(slot, perDay)))
		}
		seen[slot] = true
		for q := range nQuantities {
			if row.present[q] {
				grids[q].val[slot], grids[q].present[slot] = row.val[q], true
			}
		}
	}
	use := []grid{grids[qGHI]}
	if s.HasBeamDiffuse {
		use = append(use, grids[qDNI], grids[qDHI])
	}
	if s.HasTempC {
		use = append(use, grids[qTemp])
	}
	filled, count, notes, err := fillAll(use, perDay, maxGap)
	if err != nil {
		return Series{}, perr(0, 0, err)
	}
	if daily {
		s.FilledDays = count
		s.Daily = make([]Day, DaysPerYear)
		for i := range s.Daily {
			m, d := DayOfYearMonth(i)
			s.Daily[i] = Day{Month: m, Day: d, GHIKWhM2Day: grids[qGHI].val[i], TempC: grids[qTemp].val[i], Filled: filled[i]}
		}
		s.Notes = append(s.Notes, "daily values: ghi_kwh_m2_day is the day's total")
	} else {
		s.FilledHours = count
		s.Hourly = make([]Hour, HoursPerYear)
		for i := range s.Hourly {
			m, d := DayOfYearMonth(i / 24)
			s.Hourly[i] = Hour{Month: m, Day: d, Hour: i % 24, GHIWhM2: grids[qGHI].val[i],
				DNIWhM2: grids[qDNI].val[i], DHIWhM2: grids[qDHI].val[i], TempC: grids[qTemp].val[i], Filled: filled[i]}
		}
		s.Notes = append(s.Notes, "hourly rows start their interval: a row at h:00 covers h:00 to h+1:00 local standard time")
	}
	if leap > 0 {
		s.Notes = append(s.Notes, fmt.Sprintf("dropped %d rows of 29 February so the year has 365 days", leap))
	}
	s.Notes = append(s.Notes, notes...)
	return s, nil
}
