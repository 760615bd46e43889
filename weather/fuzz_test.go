package weather

import (
	"strings"
	"testing"
)

// shortEPW is a well-formed header with two records: it fails for lack of a
// year, which lets the fuzzer start from the record parser.
func shortEPW() string {
	full := writeEPW(epwSpec{year: 2023})
	lines := strings.SplitAfter(full, "\n")
	return strings.Join(lines[:10], "")
}

func FuzzReadEPW(f *testing.F) {
	f.Add(shortEPW())
	f.Add(writeEPW(epwSpec{year: 2024, leap: true}))
	f.Add("LOCATION,a,b,c,d,0,1,2,3,4\n1\n2\n3\n4\n5\n6\nDATA PERIODS,1,1\n2023,1,1,1,0,x,20,0,0,0,0,0,0,100,9999,50\n")
	f.Fuzz(func(t *testing.T, text string) {
		s, err := ReadEPW(strings.NewReader(text), "fuzz.epw")
		if err == nil {
			if len(s.Hourly) != HoursPerYear {
				t.Fatalf("accepted with %d hours", len(s.Hourly))
			}
			if _, _, err := s.MonthlyMeans(); err != nil {
				t.Fatalf("accepted series has no means: %v", err)
			}
		}
	})
}

func FuzzReadCSV(f *testing.F) {
	f.Add("date,hour,ghi_w_m2,temp_c\n2023-01-01,0,0,5\n")
	f.Add("time,ghi_wh_m2\n2023-01-01T00:00:00-03:00,0\n2023-01-01T01:00:00-02:00,NA\n")
	f.Add("date,ghi_kwh_m2_day\n2023-02-29,5\n")
	f.Add(writeCSV(csvSpec{layout: "daily", year: 2023}))
	f.Fuzz(func(t *testing.T, text string) {
		s, err := ReadCSV(strings.NewReader(text), "fuzz.csv")
		if err == nil {
			if len(s.Hourly) != HoursPerYear && len(s.Daily) != DaysPerYear {
				t.Fatalf("accepted with %d hours and %d days", len(s.Hourly), len(s.Daily))
			}
			if _, _, err := s.MonthlyMeans(); err != nil {
				t.Fatalf("accepted series has no means: %v", err)
			}
		}
	})
}
