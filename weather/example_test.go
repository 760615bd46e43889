package weather_test

import (
	"fmt"
	"strings"

	"solstand/weather"
)

func ExampleReadCSV() {
	// A daily file for an invented site: 5 kWh/m² and 20 °C every day.
	var b strings.Builder
	b.WriteString("date,ghi_kwh_m2_day,temp_c\n")
	for d := range weather.DaysPerYear {
		m, day := weather.DayOfYearMonth(d)
		if d == 100 {
			continue // one missing day, filled from the month's mean
		}
		fmt.Fprintf(&b, "2023-%02d-%02d,5,20\n", m, day)
	}
	s, err := weather.ReadCSV(strings.NewReader(b.String()), "site.csv")
	if err != nil {
		fmt.Println(err)
		return
	}
	ghi, temp, _ := s.MonthlyMeans()
	fmt.Println(s.Source, s.FilledDays)
	fmt.Printf("April: %.1f kWh/m²/day, %.1f °C\n", ghi[3], temp[3])
	// Output:
	// csv-daily 1
	// April: 5.0 kWh/m²/day, 20.0 °C
}

func ExampleDailyClearness() {
	meanKT := [12]float64{0.45, 0.5, 0.55, 0.58, 0.6, 0.62, 0.65, 0.6, 0.55, 0.5, 0.45, 0.35}
	k, err := weather.DailyClearness(meanKT, weather.SyntheticOptions{Years: 20, Seed: 1})
	if err != nil {
		fmt.Println(err)
		return
	}
	// Every month of every year keeps its mean.
	first := 7*weather.DaysPerYear + weather.FirstDayOfMonth(7)
	sum := 0.0
	for _, v := range k[first : first+weather.DaysInMonth(7)] {
		sum += v
	}
	fmt.Println(len(k))
	fmt.Printf("July of year 8: mean %.4f\n", sum/31)
	// Output:
	// 7300
	// July of year 8: mean 0.6500
}

func ExampleHourlyAirTempC() {
	for _, h := range []int{5, 10, 14, 20} {
		fmt.Printf("%02d:00 %.1f °C\n", h, weather.HourlyAirTempC(25, 10, h))
	}
	// Output:
	// 05:00 20.0 °C
	// 10:00 25.0 °C
	// 14:00 29.9 °C
	// 20:00 27.0 °C
}
