package simulate_test

import (
	"fmt"
	"math"

	"solstand/battery"
	"solstand/simulate"
)

// One day without a battery: 100 Wh of PV in each hour from 08:00 to 16:00,
// a 50 Wh critical load every hour, a controller of 95 % efficiency. The
// daytime load is met directly; the night load goes unmet. (Demo figures.)
func ExampleRunDays() {
	var d simulate.Demand
	for h := 0; h < 24; h++ {
		d.CriticalWh[0][h] = 50
	}
	pv := make([]float64, 24)
	for h := 8; h < 16; h++ {
		pv[h] = 100
	}
	m := battery.Model{} // CapacityWh 0: no battery
	var led simulate.Ledger
	days := make([]simulate.Day, 1)
	simulate.RunDays(pv, 1, []int8{1}, &d, &simulate.Params{ControllerEfficiency: 0.95}, &m, &led, days, nil)
	fmt.Printf("served %.0f of %.0f Wh, unmet in %d hours, dumped %.1f Wh\n", led.LoadServedWh, led.DemandWh, days[0].UnmetHours, led.DumpedWh)
	fmt.Println("ledger closes:", led.Check() == nil)
	// Output:
	// served 400 of 1200 Wh, unmet in 16 hours, dumped 378.9 Wh
	// ledger closes: true
}

// Summarise turns day records into loss-of-load figures.
func ExampleSummarise() {
	days := []simulate.Day{
		{Month: 1, DemandWh: 1000, ServedCriticalWh: 1000, SOCMin: 0.7, SOCMax: 1, SOCEnd: 0.9, DischargeWh: 400},
		{Month: 1, DemandWh: 1000, ServedCriticalWh: 900, UnmetWh: 100, UnmetHours: 3, SOCMin: 0.5, SOCMax: 0.8, SOCEnd: 0.6, DischargeWh: 500},
		{Month: 1, DemandWh: 1000, ServedCriticalWh: 1000, SOCMin: 0.6, SOCMax: 1, SOCEnd: 0.95, DischargeWh: 300},
	}
	st := simulate.Summarise(days, 2400, 1)
	fmt.Printf("LOLP %.3f, %d unmet hours, recovered in %.0f day(s), %.2f full cycles\n", st.LOLP, st.UnmetHours, st.RecoveryDaysAfterWorstStreak, st.EquivalentFullCycles)
	// Output:
	// LOLP 0.033, 3 unmet hours, recovered in 1 day(s), 0.50 full cycles
}

// IsoReliability searches, for each storage, the smallest array-to-load
// ratio that meets a loss-of-load target (demo year of half-sine days).
func ExampleIsoReliability() {
	var d simulate.Demand
	for mo := 0; mo < 12; mo++ {
		for h := 0; h < 24; h++ {
			d.CriticalWh[mo][h] = 40
		}
	}
	dayMonth := make([]int8, 365)
	pv := make([]float64, 24*365)
	for i := range dayMonth {
		dayMonth[i] = int8(1 + i*12/365)
		k := 0.4 + 0.6*math.Abs(math.Sin(float64(i))) // a varying sky
		for h := 6; h < 18; h++ {
			pv[24*i+h] = k * math.Sin(math.Pi*(float64(h-6)+0.5)/12)
		}
	}
	in := &simulate.CurveInput{
		PVUnitWh: [][]float64{pv}, DayMonth: dayMonth, Demand: &d,
		Params:          simulate.Params{ControllerEfficiency: 0.95},
		BatteryTemplate: battery.Model{CapacityWh: 2000, EnergyWh: 2000, MinWh: 1000, ReconnectWh: 1000, KneeWh: 2000, ChargeEff: 0.9, DischargeEff: 0.95},
		DesignMonth:     6, DesignPVUnitWhDay: 7.6, DesignDemandWhDay: d.DailyWh(6),
	}
	curves, err := simulate.IsoReliability(in, []float64{0.01}, []float64{0, 2}, nil)
	if err != nil {
		fmt.Println(err)
		return
	}
	c := curves[0]
	fmt.Printf("target %.0f %%: %d point(s), unreachable at %v day(s) of storage\n", 100*c.TargetLOLP, len(c.Points), c.UnreachableStorageDays)
	// Output:
	// target 1 %: 1 point(s), unreachable at [0] day(s) of storage
}
