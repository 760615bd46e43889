package weather

import (
	"errors"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// The checks in this file compare the readers with the invented year the
// tests write themselves (helpers_test.go); the expected values are
// computed here from that year, not taken from outside.

func checkMeans(t *testing.T, s Series, wantTemp bool) {
	t.Helper()
	ghi, temp, err := s.MonthlyMeans()
	if err != nil {
		t.Fatal(err)
	}
	wantG, wantT := expectedMeans()
	for m := range 12 {
		// Exact up to floating-point summation order.
		if !relClose(ghi[m], wantG[m], 1e-12) {
			t.Errorf("month %d: ghi %.15g kWh/m²/day, want %.15g", m+1, ghi[m], wantG[m])
		}
		if wantTemp && !relClose(temp[m], wantT[m], 1e-12) {
			t.Errorf("month %d: temp %.15g °C, want %.15g", m+1, temp[m], wantT[m])
		}
	}
}

func TestReadEPW(t *testing.T) {
	tests := []struct {
		name string
		spec epwSpec
	}{
		{"common year", epwSpec{year: 2023}},
		{"leap year", epwSpec{year: 2024, leap: true}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			s, err := ReadEPW(strings.NewReader(writeEPW(tc.spec)), "site.epw")
			if err != nil {
				t.Fatal(err)
			}
			if s.Source != "epw" || len(s.Hourly) != HoursPerYear || s.Daily != nil || s.FilledHours != 0 {
				t.Fatalf("source %q, %d hours, %d days, %d filled", s.Source, len(s.Hourly), len(s.Daily), s.FilledHours)
			}
			want := Location{Name: "Testville, Nowhere, Invented", LatitudeDeg: testLat, LongitudeDeg: testLon,
				UTCOffsetH: testTZ, ElevationM: testElev, Known: true}
			if s.Location != want {
				t.Errorf("location %+v, want %+v", s.Location, want)
			}
			checkMeans(t, s, true)
			// EPW record hour 1 (hour-ending, EnergyPlus Auxiliary
			// Programs) is the interval 00:00–01:00, our hour 0.
			h := s.Hourly[40*24+9]
			if h.Month != 2 || h.Day != 10 || h.Hour != 9 ||
				h.GHIWhM2 != testGHI(40, 9) || h.DNIWhM2 != testDNI(40, 9) || h.DHIWhM2 != testDHI(40, 9) || h.TempC != testTemp(40, 9) {
				t.Errorf("hour %+v, want 02-10 09:00 with the written values", h)
			}
			notes := strings.Join(s.Notes, "; ")
			if tc.spec.leap != strings.Contains(notes, "dropped 24 records of 29 February") {
				t.Errorf("notes %q", notes)
			}
			if got := len(s.HourlyGHIWhM2()); got != HoursPerYear {
				t.Errorf("HourlyGHIWhM2: %d values", got)
			}
			if len(s.HourlyTempC()) != HoursPerYear || len(s.HourlyDNIWhM2()) != HoursPerYear || len(s.HourlyDHIWhM2()) != HoursPerYear {
				t.Error("hourly accessors do not give 8760 values")
			}
		})
	}
}

func TestReadCSV(t *testing.T) {
	tests := []struct {
		name   string
		spec   csvSpec
		source string
	}{
		{"time and W/m²", csvSpec{layout: "time", ghiCol: "ghi_w_m2", year: 2023}, "csv-hourly"},
		{"date hour and Wh/m²", csvSpec{layout: "date-hour", ghiCol: "ghi_wh_m2", year: 2023}, "csv-hourly"},
		{"daily", csvSpec{layout: "daily", year: 2023}, "csv-daily"},
		{"leap hourly", csvSpec{layout: "date-hour", ghiCol: "ghi_w_m2", year: 2024, leap: true}, "csv-hourly"},
		{"leap daily", csvSpec{layout: "daily", year: 2024, leap: true}, "csv-daily"},
	}
	var daily, hourly []float64
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			s, err := ReadCSV(strings.NewReader(writeCSV(tc.spec)), "site.csv")
			if err != nil {
				t.Fatal(err)
			}
			if s.Source != tc.source || !s.HasTempC || s.HasBeamDiffuse || s.Location.Known {
				t.Fatalf("source %q temp %v beam %v known %v", s.Source, s.HasTempC, s.HasBeamDiffuse, s.Location.Known)
			}
			checkMeans(t, s, true)
			if tc.spec.layout == "time" && s.Location.UTCOffsetH != -3 {
				t.Errorf("offset %g h, want -3", s.Location.UTCOffsetH)
			}
			if tc.spec.leap != strings.Contains(strings.Join(s.Notes, ";"), "29 February") {
				t.Errorf("notes %q", s.Notes)
			}
			d := s.DailyGHIWhM2()
			if len(d) != DaysPerYear {
				t.Fatalf("DailyGHIWhM2: %d values", len(d))
			}
			if tc.source == "csv-daily" {
				daily = d
				if s.HourlyGHIWhM2() != nil || s.HourlyTempC() != nil {
					t.Error("a daily source gives hourly values")
				}
			} else {
				hourly = d
			}
		})
	}
	// Daily and hourly files of the same data agree day by day.
	for i := range daily {
		if !relClose(daily[i], hourly[i], 1e-12) {
			t.Fatalf("day %d: daily file %g Wh/m², hourly file %g", i, daily[i], hourly[i])
		}
	}
}

func TestReadCSVTimeZones(t *testing.T) {
	// Rows in summer carry a daylight-saving offset one hour ahead; they
	// are converted to the standard offset, so the data lands where the
	// plain file puts it.
	spec := csvSpec{layout: "time", ghiCol: "ghi_w_m2", year: 2023, edit: func(d, h int, c []string) bool {
		if d >= 100 && d < 250 {
			m, day := DayOfYearMonth(d)
			// The same instant written one hour later at offset −02:00.
			c[0] = strings.Replace(c[0], "-03:00", "-02:00", 1)
			hh := h + 1
			if hh == 24 {
				m, day = DayOfYearMonth(d + 1)
				hh = 0
			}
			c[0] = "2023-" + two(m) + "-" + two(day) + "T" + two(hh) + ":00:00-02:00"
		}
		return true
	}}
	s, err := ReadCSV(strings.NewReader(writeCSV(spec)), "dst.csv")
	if err != nil {
		t.Fatal(err)
	}
	if s.Location.UTCOffsetH != -3 {
		t.Errorf("offset %g h, want -3", s.Location.UTCOffsetH)
	}
	checkMeans(t, s, true)
	if !strings.Contains(strings.Join(s.Notes, ";"), "2 different UTC offsets") {
		t.Errorf("notes %q", s.Notes)
	}
}

func two(n int) string { return string([]byte{byte('0' + n/10), byte('0' + n%10)}) }

func TestDamagedValues(t *testing.T) {
	// Day 61 is 3 March.
	const day, hour = 61, 10
	epw := func(col int, v string) string {
		return writeEPW(epwSpec{year: 2023, edit: func(d, h int, f []string) bool {
			if d == day && h == hour {
				f[col] = v
			}
			return true
		}})
	}
	hcsv := csvSpec{layout: "date-hour", ghiCol: "ghi_w_m2", year: 2023}
	dcsv := csvSpec{layout: "daily", year: 2023}
	csvWith := func(spec csvSpec, col int, v string) string {
		spec.edit = func(d, h int, c []string) bool {
			if d == day && (h == hour || spec.layout == "daily") {
				c[col] = v
			}
			return true
		}
		return writeCSV(spec)
	}
	tests := []struct {
		name       string
		epw        bool
		text       string
		line, col  int
		want       error
		msgContain string
	}{
		{"epw negative ghi", true, epw(13, "-5"), epwLine(day, hour, false), 14, ErrOutOfRange, "global horizontal"},
		{"epw ghi too high", true, epw(13, "1600"), epwLine(day, hour, false), 14, ErrOutOfRange, "1600"},
		{"epw dni not a number", true, epw(14, "12x"), epwLine(day, hour, false), 15, ErrFormat, "direct normal"},
		{"epw temperature too high", true, epw(6, "75.0"), epwLine(day, hour, false), 7, ErrOutOfRange, "temperature"},
		{"epw temperature too low", true, epw(6, "-95.0"), epwLine(day, hour, false), 7, ErrOutOfRange, "temperature"},
		{"epw bad hour", true, epw(3, "25"), epwLine(day, hour, false), 4, ErrFormat, "hour 25"},
		{"epw bad day", true, epw(2, "32"), epwLine(day, hour, false), 3, ErrFormat, "day 32"},
		{"epw NaN", true, epw(13, "NaN"), epwLine(day, hour, false), 14, ErrFormat, "not a number"},
		{"csv ghi too high", false, csvWith(hcsv, 2, "2000"), csvLine(hcsv, day, hour), 3, ErrOutOfRange, "ghi_w_m2"},
		{"csv temp too low", false, csvWith(hcsv, 3, "-100"), csvLine(hcsv, day, hour), 4, ErrOutOfRange, "temp_c"},
		{"csv temp infinite", false, csvWith(hcsv, 3, "+Inf"), csvLine(hcsv, day, hour), 4, ErrOutOfRange, "temp_c"},
		{"csv bad hour", false, csvWith(hcsv, 1, "24"), csvLine(hcsv, day, hour), 2, ErrFormat, "hour"},
		{"csv bad date", false, csvWith(hcsv, 0, "2023-13-01"), csvLine(hcsv, day, hour), 1, ErrFormat, "date"},
		{"csv daily ghi too high", false, csvWith(dcsv, 1, "40"), csvLine(dcsv, day, 0), 2, ErrOutOfRange, "ghi_kwh_m2_day"},
		{"csv daily text", false, csvWith(dcsv, 1, "sunny"), csvLine(dcsv, day, 0), 2, ErrFormat, "ghi_kwh_m2_day"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			var err error
			if tc.epw {
				_, err = ReadEPW(strings.NewReader(tc.text), "damaged.epw")
			} else {
				_, err = ReadCSV(strings.NewReader(tc.text), "damaged.csv")
			}
			var pe *ParseError
			if !errors.As(err, &pe) {
				t.Fatalf("error %v, want a *ParseError", err)
			}
			if pe.Line != tc.line || pe.Column != tc.col || !errors.Is(err, tc.want) {
				t.Errorf("error %q at %d:%d, want %v at %d:%d", err, pe.Line, pe.Column, tc.want, tc.line, tc.col)
			}
			if !strings.HasPrefix(err.Error(), pe.File+":") || !strings.Contains(err.Error(), tc.msgContain) {
				t.Errorf("message %q, want file prefix and %q", err, tc.msgContain)
			}
		})
	}
}

func TestGapsFilled(t *testing.T) {
	// 3 March (day 61): GHI missing 09:00–12:59 (4 hours), temperature
	// missing 10:00–11:59 (2 hours): 4 hours touched.
	missing := func(d, h int) bool { return d == 61 && h >= 9 && h <= 12 }
	missingT := func(d, h int) bool { return d == 61 && h >= 10 && h <= 11 }
	epw := writeEPW(epwSpec{year: 2023, edit: func(d, h int, f []string) bool {
		if missing(d, h) {
			f[13] = "9999"
		}
		if missingT(d, h) {
			f[6] = "99.9"
		}
		return true
	}})
	// The CSV loses GHI in the same hours as empty cells and NA, and the
	// two temperature hours as whole missing rows (so GHI there too).
	spec := csvSpec{layout: "time", ghiCol: "ghi_w_m2", year: 2023, edit: func(d, h int, c []string) bool {
		if missingT(d, h) {
			return false
		}
		if missing(d, h) {
			c[1] = []string{"", "NA"}[h%2]
		}
		return true
	}}
	tests := []struct {
		name  string
		read  func() (Series, error)
		count int
	}{
		{"epw", func() (Series, error) { return ReadEPW(strings.NewReader(epw), "gaps.epw") }, 4},
		{"csv", func() (Series, error) { return ReadCSV(strings.NewReader(writeCSV(spec)), "gaps.csv") }, 4},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			s, err := tc.read()
			if err != nil {
				t.Fatal(err)
			}
			if s.FilledHours != tc.count {
				t.Errorf("FilledHours %d, want %d", s.FilledHours, tc.count)
			}
			for h := range 24 {
				got := s.Hourly[61*24+h]
				if got.Filled != missing(61, h) {
					t.Errorf("hour %d: Filled %v", h, got.Filled)
				}
				if !missing(61, h) {
					continue
				}
				// The fill is the mean of March's other days at that
				// hour (computed here from the invented year).
				var sum float64
				for d := 59; d < 90; d++ {
					if d != 61 {
						sum += testGHI(d, h)
					}
				}
				if want := sum / 30; !relClose(got.GHIWhM2, want, 1e-12) {
					t.Errorf("hour %d: filled GHI %g, want March mean %g", h, got.GHIWhM2, want)
				}
			}
			if !strings.Contains(strings.Join(s.Notes, ";"), "filled 4 hours") {
				t.Errorf("notes %q", s.Notes)
			}
			if c := s.Cautions(); len(c) != 1 || c[0].Code != "weather-gaps-filled" {
				t.Errorf("cautions %+v", c)
			}
		})
	}
}

func TestLongGapRefused(t *testing.T) {
	tests := []struct {
		name string
		read func() (Series, error)
		want string
	}{
		{"epw missing codes", func() (Series, error) {
			return ReadEPW(strings.NewReader(writeEPW(epwSpec{year: 2023, edit: func(d, h int, f []string) bool {
				if d == 62 && h >= 5 && h <= 11 {
					f[15] = "9999"
				}
				return true
			}})), "long.epw")
		}, "diffuse horizontal irradiation missing for 7 hours from 03-04 05:00 to 03-04 11:00"},
		{"epw missing records across midnight", func() (Series, error) {
			return ReadEPW(strings.NewReader(writeEPW(epwSpec{year: 2023, edit: func(d, h int, f []string) bool {
				return !(d == 62 && h >= 20 || d == 63 && h < 3)
			}})), "long.epw")
		}, "missing for 7 hours from 03-04 20:00 to 03-05 02:00"},
		{"csv missing rows", func() (Series, error) {
			return ReadCSV(strings.NewReader(writeCSV(csvSpec{layout: "date-hour", ghiCol: "ghi_w_m2", year: 2023,
				edit: func(d, h int, c []string) bool { return d != 200 }})), "long.csv")
		}, "missing for 24 hours from 07-20 00:00 to 07-20 23:00"},
		{"csv daily missing days", func() (Series, error) {
			return ReadCSV(strings.NewReader(writeCSV(csvSpec{layout: "daily", year: 2023,
				edit: func(d, h int, c []string) bool { return d < 300 || d > 302 }})), "long.csv")
		}, "missing for 3 days from 10-28 to 10-30"},
		{"half a year", func() (Series, error) {
			return ReadCSV(strings.NewReader(writeCSV(csvSpec{layout: "daily", year: 2023,
				edit: func(d, h int, c []string) bool { return d < 180 }})), "half.csv")
		}, "from 06-30 to 12-31"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			_, err := tc.read()
			if !errors.Is(err, ErrLongGap) || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %v, want ErrLongGap with %q", err, tc.want)
			}
		})
	}
}

func TestDailyGapFilled(t *testing.T) {
	s, err := ReadCSV(strings.NewReader(writeCSV(csvSpec{layout: "daily", year: 2023,
		edit: func(d, h int, c []string) bool { return d != 100 && d != 101 }})), "short.csv")
	if err != nil {
		t.Fatal(err)
	}
	if s.FilledDays != 2 || !s.Daily[100].Filled || !s.Daily[101].Filled || s.Daily[102].Filled {
		t.Errorf("FilledDays %d, flags %v %v %v", s.FilledDays, s.Daily[100].Filled, s.Daily[101].Filled, s.Daily[102].Filled)
	}
}

func TestFormatErrors(t *testing.T) {
	good := writeEPW(epwSpec{year: 2023})
	lines := strings.SplitAfter(good, "\n")
	tests := []struct {
		name string
		epw  bool
		text string
		want string
	}{
		{"empty epw", true, "", "fewer than 8 header lines"},
		{"no LOCATION", true, "PLACE,x\n" + strings.Join(lines[1:], ""), "LOCATION"},
		{"bad latitude", true, strings.Replace(good, "12.3456", "95", 1), "latitude 95"},
		{"sub-hourly", true, strings.Replace(good, "DATA PERIODS,1,1,", "DATA PERIODS,1,4,", 1), "4 records per hour"},
		{"short record", true, strings.Join(lines[:8], "") + "2023,1,1,1,60\n", "5 fields"},
		{"duplicate record", true, strings.Join(lines[:9], "") + lines[8] + strings.Join(lines[9:], ""), "second record for 01-01 00:00"},
		{"empty csv", false, "", "empty file"},
		{"no ghi column", false, "date,hour,temp_c\n2023-01-01,0,5\n", "no irradiation column"},
		{"two ghi columns", false, "date,hour,ghi_w_m2,ghi_wh_m2\n", "both"},
		{"no time column", false, "ghi_w_m2\n1\n", "no time or date column"},
		{"hourly without hour", false, "date,ghi_w_m2\n2023-01-01,0\n", "needs an hour column"},
		{"daily with hour", false, "date,hour,ghi_kwh_m2_day\n", "no hour column"},
		{"time off the hour", false, "time,ghi_w_m2\n2023-01-01T00:30:00Z,0\n", "whole hour"},
		{"time without offset", false, "time,ghi_w_m2\n2023-01-01T00:00:00,0\n", "RFC 3339"},
		{"ragged row", false, "date,hour,ghi_w_m2\n2023-01-01,0\n", "wrong number of fields"},
		{"duplicate column", false, "date,hour,ghi_w_m2,hour\n", "appears twice"},
		{"duplicate row", false, "date,hour,ghi_w_m2\n2023-01-01,0,0\n2023-01-01,0,0\n", "second row for 01-01 00:00"},
		{"header only", false, "date,hour,ghi_w_m2\n", "no data rows"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			var err error
			if tc.epw {
				_, err = ReadEPW(strings.NewReader(tc.text), "f.epw")
			} else {
				_, err = ReadCSV(strings.NewReader(tc.text), "f.csv")
			}
			if err == nil || !strings.Contains(err.Error(), tc.want) {
				t.Errorf("error %v, want one with %q", err, tc.want)
			}
		})
	}
}

func TestReadCSVOptionalColumns(t *testing.T) {
	var b strings.Builder
	b.WriteString("\xef\xbb\xbf# invented test file\nDate,Hour,GHI_Wh_m2,DNI_W_M2,dhi_w_m2,note\n")
	for d := range DaysPerYear {
		m, day := DayOfYearMonth(d)
		for h := range 24 {
			b.WriteString("2023-" + two(m) + "-" + two(day) + "," + fmtNum(float64(h)) + "," +
				fmtNum(testGHI(d, h)) + "," + fmtNum(testDNI(d, h)) + "," + fmtNum(testDHI(d, h)) + ",\"a, b\"\n")
		}
	}
	s, err := ReadCSV(strings.NewReader(b.String()), "opt.csv")
	if err != nil {
		t.Fatal(err)
	}
	if s.HasTempC || !s.HasBeamDiffuse || s.HourlyTempC() != nil || s.DailyTempC() != nil {
		t.Fatalf("temp %v beam %v", s.HasTempC, s.HasBeamDiffuse)
	}
	checkMeans(t, s, false)
	if _, temp, _ := s.MonthlyMeans(); !math.IsNaN(temp[0]) {
		t.Errorf("temperature %g without a temperature column, want NaN", temp[0])
	}
	if got := s.HourlyDNIWhM2()[100*24+12]; got != testDNI(100, 12) {
		t.Errorf("DNI %g, want %g", got, testDNI(100, 12))
	}
}

func TestReadFile(t *testing.T) {
	dir := t.TempDir()
	files := map[string]string{
		"site.EPW": writeEPW(epwSpec{year: 2023}),
		"site.csv": writeCSV(csvSpec{layout: "daily", year: 2023}),
		"site.txt": "nothing",
	}
	for name, text := range files {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(text), 0o600); err != nil {
			t.Fatal(err)
		}
	}
	tests := []struct {
		file, source string
		wantErr      bool
	}{
		{"site.EPW", "epw", false},
		{"site.csv", "csv-daily", false},
		{"site.txt", "", true},
		{"absent.csv", "", true},
	}
	for _, tc := range tests {
		s, err := ReadFile(filepath.Join(dir, tc.file))
		if (err != nil) != tc.wantErr || s.Source != tc.source {
			t.Errorf("%s: source %q error %v", tc.file, s.Source, err)
		}
		if err != nil && !strings.Contains(err.Error(), tc.file) {
			t.Errorf("%s: error %q does not name the file", tc.file, err)
		}
	}
}

func TestDailyTempC(t *testing.T) {
	s, err := ReadEPW(strings.NewReader(writeEPW(epwSpec{year: 2023})), "t.epw")
	if err != nil {
		t.Fatal(err)
	}
	dt := s.DailyTempC()
	var want float64
	for h := range 24 {
		want += testTemp(10, h) / 24
	}
	if len(dt) != DaysPerYear || !relClose(dt[10], want, 1e-12) {
		t.Errorf("DailyTempC[10] = %v, want %g", dt[10], want)
	}
}

func TestMonthlyMeansEmpty(t *testing.T) {
	if _, _, err := (Series{}).MonthlyMeans(); err == nil {
		t.Error("empty series gives no error")
	}
	if (Series{}).DailyGHIWhM2() != nil || (Series{}).HourlyGHIWhM2() != nil {
		t.Error("empty series gives values")
	}
}

func BenchmarkReadEPW(b *testing.B) {
	text := writeEPW(epwSpec{year: 2023})
	b.ReportAllocs()
	for b.Loop() {
		if _, err := ReadEPW(strings.NewReader(text), "bench.epw"); err != nil {
			b.Fatal(err)
		}
	}
}
