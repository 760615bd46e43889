package array_test

import (
	"fmt"
	"time"

	"solstand/array"
)

// The sun at the instant of the Reda & Andreas (2004) example.
func ExampleSunAt() {
	at := time.Date(2003, 10, 17, 12, 30, 30, 0, time.FixedZone("UTC-7", -7*3600))
	p := array.SunAt(39.742476, -105.1786, at)
	fmt.Printf("zenith %.2f°, azimuth %.2f°\n", p.ZenithDeg, p.AzimuthDeg)
	fmt.Printf("incidence on a 30° south-facing roof %.1f°\n", array.IncidenceDeg(p, 30, 180))
	// Output:
	// zenith 50.11°, azimuth 194.34°
	// incidence on a 30° south-facing roof 22.0°
}

// The monthly resource of a demo site at 43° N on a plane tilted 60° south.
func ExampleMonthlyResource() {
	ghi := [12]float64{1.5, 2.4, 3.5, 4.6, 5.5, 6.1, 6.2, 5.4, 4.2, 2.9, 1.7, 1.3}
	months, err := array.MonthlyResource(43, ghi, array.Plane{TiltDeg: 60, AzimuthDeg: 180, AlbedoFraction: 0.2})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, m := range []array.MonthResource{months[0], months[5], months[11]} {
		fmt.Printf("month %2d day %3d H0 %5.2f GHI %.2f KT %.3f Hd/H %.3f POA %.2f\n",
			m.Month, m.DayOfYear, m.ExtraterrestrialKWhM2Day, m.GHIKWhM2Day, m.ClearnessIndex, m.DiffuseFraction, m.POAKWhM2Day)
	}
	// Output:
	// month  1 day  17 H0  3.71 GHI 1.50 KT 0.404 Hd/H 0.496 POA 2.74
	// month  6 day 162 H0 11.60 GHI 6.10 KT 0.526 Hd/H 0.405 POA 4.40
	// month 12 day 344 H0  3.35 GHI 1.30 KT 0.388 Hd/H 0.515 POA 2.48
}

// Strings of a demo 60-cell module on a 150 V MPPT controller and a 48 V bank.
func ExampleLayoutStrings() {
	m := array.Module{PmaxW: 300, VocV: 39.8, IscA: 9.7, VmpV: 32.5, ImpA: 9.23,
		TempCoeffPmaxPctPerC: -0.40, TempCoeffVocPctPerC: -0.30, TempCoeffIscPctPerC: 0.05, NOCTC: 45}
	c := array.Controller{Kind: array.MPPT, MaxPVVoltageV: 150, EfficiencyFraction: 0.97, RatingsA: []float64{30, 45, 60, 80}}
	l, err := array.LayoutStrings(m, c, 48, 57.6, -20, 70, 2300)
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%d in series × %d strings = %d modules, Voc at −20 °C %.1f V, Vmp at 70 °C %.1f V\n",
		l.ModulesSeries, l.Strings, l.Modules, l.VocColdV, l.VmpHotV)
	for _, k := range l.Cautions {
		fmt.Println(k.Severity, k.Code)
	}
	s, _ := array.SizeController(c, l, m, float64(l.Modules)*m.PmaxW, 57.6)
	fmt.Printf("controller %d × %.0f A (asks %.1f A)\n", s.Units, s.RatedA, s.RequiredA)
	// Output:
	// 3 in series × 3 strings = 9 modules, Voc at −20 °C 135.5 V, Vmp at 70 °C 77.8 V
	// info pv-string-fuses
	// controller 1 × 60 A (asks 58.6 A)
}

// Hourly irradiation on the plane for one day.
func ExampleHourlyPOA() {
	site := array.HourlySite{LatDeg: 43, LonDeg: -89.4, UTCOffsetH: -6, Model: array.HDKR,
		Plane: array.Plane{TiltDeg: 45, AzimuthDeg: 180, AlbedoFraction: 0.2}}
	var out [24]float64
	array.HourlyPOA(site, 105, 5000, &out)
	for h := 10; h < 14; h++ {
		fmt.Printf("%02d:00 %.0f Wh/m²\n", h, out[h])
	}
	// Output:
	// 10:00 652 Wh/m²
	// 11:00 717 Wh/m²
	// 12:00 715 Wh/m²
	// 13:00 645 Wh/m²
}

// The array power for 1.2 kWh/day in a month with 3.1 peak sun hours.
func ExampleRequiredArrayW() {
	a, err := array.RequiredArrayW(1200, 3.1, array.SizingChain{
		TemperatureFactor: 0.92, Derates: array.DefaultDerates(), ControllerFactor: 0.97,
		BatteryShareFraction: 0.6, BatteryChargeEfficiency: 0.85,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%.0f W (overall factor %.3f)\n", a.RequiredW, a.OverallFactor)
	// Output:
	// 542 W (overall factor 0.714)
}
