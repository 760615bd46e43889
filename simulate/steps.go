package simulate

import (
	"fmt"
	"math"

	"solstand/array"
	"solstand/battery"
	"solstand/report"
	"solstand/weather"
)

// pvHours fills out (24 values) with the array's DC output per hour, before
// the controller, for a day given as 24 hourly plane irradiations (Wh/m² =
// mean W/m²) and the month's air temperature profile. tempC may be nil.
func (d *run) pvHours(month0 int, poaH *[24]float64, tempC []float64, out []float64, mppOut []float64) {
	derate := d.derates.Factor(*d.p.Array.DesignAgeYears)
	pwm := d.ctrl
	pwm.EfficiencyFraction, pwm.MaxOutputA = 1, 0
	operV := d.chargingV()
	for h := range 24 {
		g := poaH[h]
		if !(g > 0) {
			out[h] = 0
			if mppOut != nil {
				mppOut[h] = 0
			}
			continue
		}
		air := d.airTempC(month0, h)
		if tempC != nil {
			air = tempC[h]
		}
		cell := array.CellTempC(air, g, d.module.NOCTC)
		mpp := array.ArrayMPPW(d.module, d.layout, g, cell, derate)
		if d.ctrl.Kind == array.PWM {
			out[h] = array.ArrayDCPowerW(d.module, pwm, d.layout, g, cell, operV, derate)
		} else {
			out[h] = mpp
		}
		if mppOut != nil {
			mppOut[h] = mpp
		}
	}
}

// meanDayPV is the PV of the mean day of a month (representative day, the
// month's mean irradiation), scaled by ghiFraction.
func (d *run) meanDayPV(month0 int, ghiFraction float64, out []float64) {
	hs := d.hourlySite()
	var ghiH, poaH [24]float64
	mr := d.months[month0]
	array.HourlyIrradiation(&hs, mr.DayOfYear, mr.GHIKWhM2Day*1000*ghiFraction, &ghiH, &poaH)
	d.pvHours(month0, &poaH, nil, out, nil)
}

// simulate runs the design through the synthetic years, the stress tests
// and the measured year.
func (d *run) simulate() error {
	years := *d.p.Simulation.Years
	seed := *d.p.Simulation.Seed
	var h0 [12]float64
	for m := range 12 {
		h0[m] = d.months[m].ExtraterrestrialKWhM2Day
	}
	kt, err := weather.MonthlyClearness(d.ghi, h0)
	if err != nil {
		return fmt.Errorf("synthetic weather: %w", err)
	}
	daily, err := weather.DailyClearness(kt, weather.SyntheticOptions{Years: years, Seed: seed,
		LagOneCorrelation: *d.p.Simulation.LagOneCorrelation, FlatOutsideRange: true})
	if err != nil {
		return fmt.Errorf("synthetic weather: %w", err)
	}
	d.dayMonth = make([]int8, 365)
	for i := range d.dayMonth {
		m, _ := weather.DayOfYearMonth(i)
		d.dayMonth[i] = int8(m)
	}
	hs := d.hourlySite()
	d.pvYears = make([][]float64, years)
	var ghiH, poaH [24]float64
	var mppYear1 []float64
	if d.ctrl.Kind == array.PWM {
		mppYear1 = make([]float64, 8760)
	}
	for y := range years {
		pv := make([]float64, 8760)
		for di := range 365 {
			m0 := int(d.dayMonth[di]) - 1
			ghiDay := 0.0
			if kt[m0] > 0 {
				ghiDay = daily[y*365+di] / kt[m0] * d.ghi[m0] * 1000
			}
			array.HourlyIrradiation(&hs, di+1, ghiDay, &ghiH, &poaH)
			var mpp []float64
			if y == 0 && mppYear1 != nil {
				mpp = mppYear1[di*24 : di*24+24]
			}
			d.pvHours(m0, &poaH, nil, pv[di*24:di*24+24], mpp)
		}
		d.pvYears[y] = pv
	}

	// The synthetic years, one after the other with the same bank.
	days := make([]Day, years*365)
	soc := make([]float32, years*8760)
	m := d.model
	var led Ledger
	for y := range years {
		RunDays(d.pvYears[y], 1, d.dayMonth, &d.demand, &d.params, &m, &led, days[y*365:(y+1)*365], soc[y*8760:(y+1)*8760])
		if d.opt.Progress != nil {
			d.opt.Progress(y+1, years)
		}
	}
	if err := led.Check(); err != nil {
		return fmt.Errorf("simulation ledger: %w", err)
	}
	st := Summarise(days, d.model.CapacityWh, years)
	s := &d.r.Simulation
	*s = report.Simulation{
		Years: years, Seed: seed, LOLP: st.LOLP, DemandWh: led.DemandWh, UnmetWh: led.UnmetWh,
		MinSOC: st.SOCMin, MeanSOC: st.SOCMean, SOCP5: st.SOCP5, SOCP50: st.SOCP50,
		UnmetHours: st.UnmetHours, UnmetDays: st.UnmetDays, LongestUnmetRunDays: st.LongestUnmetRunDays,
		DaysBelowHalf: st.DaysBelowHalf, DumpedWh: st.DumpedWh, RecoveryDays: st.RecoveryDaysAfterWorstStreak,
		ThroughputWh: st.ThroughputWh, EquivalentFullCycles: st.EquivalentFullCycles,
		Ledger: report.LedgerTotals{PVAvailableWh: led.PVAvailableWh, LoadServedWh: led.LoadServedWh, UnmetWh: led.UnmetWh,
			DumpedWh: led.DumpedWh, LossesWh: led.LossesWh, BatteryStartWh: led.BatteryStartWh, BatteryEndWh: led.BatteryEndWh},
	}
	if t := d.p.Simulation.TargetLOLP; t != nil {
		s.TargetLOLP = *t
	}
	for _, ms := range st.Monthly {
		s.Monthly = append(s.Monthly, report.MonthStats{Month: ms.Month, DemandWh: ms.DemandWh, UnmetWh: ms.UnmetWh, LOLP: ms.LOLP,
			DumpedWh: ms.DumpedWh, PVWh: ms.PVAvailableWh, MinSOC: ms.SOCMin, MeanSOC: ms.SOCMean, UnmetDays: ms.UnmetDays})
	}
	for _, ys := range st.Yearly {
		s.Yearly = append(s.Yearly, report.YearStats{Year: ys.Year, LOLP: ys.LOLP, UnmetWh: ys.UnmetWh, DumpedWh: ys.DumpedWh, MinSOC: ys.SOCMin})
	}
	for i, dy := range days[:365] {
		s.FirstYear = append(s.FirstYear, report.DayRow{Day: i + 1, Month: int(dy.Month), PVAvailableWh: dy.PVAvailableWh,
			PVUsedWh: dy.PVUsedWh, DemandWh: dy.DemandWh, ServedCriticalWh: dy.ServedCriticalWh, ServedNonCriticalWh: dy.ServedNonCriticalWh,
			UnmetWh: dy.UnmetWh, DumpedWh: dy.DumpedWh, LossesWh: dy.ControllerLossWh + dy.BatteryLossWh,
			SOCMin: dy.SOCMin, SOCMax: dy.SOCMax, SOCEnd: dy.SOCEnd})
	}
	if d.r.Hourly {
		s.FirstYearHourlySOC = append([]float32(nil), soc[:8760]...)
		s.FirstYearHourlyPVWh = make([]float32, 8760)
		s.FirstYearHourlyLoadWh = make([]float32, 8760)
		for i := range 8760 {
			m0 := int(d.dayMonth[i/24]) - 1
			s.FirstYearHourlyPVWh[i] = float32(d.pvYears[0][i])
			s.FirstYearHourlyLoadWh[i] = float32(d.demand.CriticalWh[m0][i%24] + d.demand.NonCriticalWh[m0][i%24])
		}
	}
	if mppYear1 != nil {
		sum := 0.0
		for i := range 8760 {
			sum += mppYear1[i] - d.pvYears[0][i]
		}
		d.r.Array.PWMLossVsMPPTWhYear = sum
		d.note("PWM controller: the array works at battery voltage and leaves %.0f kWh a year (%.0f %% of its maximum-power energy) behind that an MPPT controller would use.",
			sum/1000, 100*sum/math.Max(1, sumF(mppYear1)))
	}

	// Expected yield per day of each month at the controller output (mean day).
	out := make([]float64, 24)
	for m0 := range 12 {
		d.meanDayPV(m0, 1, out)
		d.r.Array.MonthlyYieldWhDay[m0] = sumF(out) * d.ctrl.EfficiencyFraction
	}

	// Life from the cycling of the whole run.
	soc64 := make([]float64, len(soc))
	for i, v := range soc {
		soc64[i] = float64(v)
	}
	life := battery.EstimateLife(d.chem, soc64, float64(years))
	b := &d.r.Battery
	b.CycleLifeYears, b.ExpectedLifeYears = finiteOr(life.CycleLifeYears, 999), finiteOr(life.ExpectedLifeYears, 999)
	b.EquivalentFullCyclesPerYear = life.EquivalentFullCyclesPerYear
	b.ReplacementYears = battery.ReplacementYears(b.ExpectedLifeYears, *d.p.Costs.AnalysisYears)

	d.stress(days, years)
	return d.measured()
}

// stress runs the stress tests the trade asks for, each from a full bank:
// the design month's worst synthetic sequence twice over, and a cloudy
// streak at a fraction of the design month's mean irradiation; each followed
// by 30 mean days of the design month to see the recovery.
func (d *run) stress(days []Day, years int) {
	dm0 := d.dm - 1
	first := weather.FirstDayOfMonth(d.dm)
	n := weather.DaysInMonth(d.dm)
	worstY, worstPV := 0, math.Inf(1)
	for y := range years {
		sum := 0.0
		for di := first; di < first+n; di++ {
			sum += days[y*365+di].PVAvailableWh
		}
		if sum < worstPV {
			worstY, worstPV = y, sum
		}
	}
	const recover = 30
	mean := make([]float64, 24)
	d.meanDayPV(dm0, 1, mean)

	runStress := func(name, desc string, pv []float64, stressDays int) report.StressTest {
		total := len(pv) / 24
		months := make([]int8, total)
		for i := range months {
			months[i] = int8(d.dm)
		}
		dd := make([]Day, total)
		m := d.model
		m.EnergyWh = m.CapacityWh
		var led Ledger
		RunDays(pv, 1, months, &d.demand, &d.params, &m, &led, dd, nil)
		t := report.StressTest{Name: name, Description: desc, MinSOC: 1, UnmetWh: led.UnmetWh, RecoveryDays: -1}
		for i, x := range dd {
			t.MinSOC = math.Min(t.MinSOC, x.SOCMin)
			if i >= stressDays && t.RecoveryDays < 0 && x.SOCMax >= FullSOC {
				t.RecoveryDays = float64(i - stressDays + 1)
			}
		}
		return t
	}
	var pv []float64
	for range 2 {
		pv = append(pv, d.pvYears[worstY][first*24:(first+n)*24]...)
	}
	for range recover {
		pv = append(pv, mean...)
	}
	d.r.Simulation.Stress = append(d.r.Simulation.Stress, runStress("worst design month",
		fmt.Sprintf("the worst synthetic %s (year %d) twice in a row from a full bank, then %d mean days", monthName(d.dm), worstY+1, recover), pv, 2*n))

	streak := *d.p.Simulation.CloudyStreakDays
	frac := *d.p.Simulation.CloudyStreakFrac
	cloudy := make([]float64, 24)
	d.meanDayPV(dm0, frac, cloudy)
	pv = pv[:0]
	for range streak {
		pv = append(pv, cloudy...)
	}
	for range recover {
		pv = append(pv, mean...)
	}
	d.r.Simulation.Stress = append(d.r.Simulation.Stress, runStress("cloudy streak",
		fmt.Sprintf("%d days at %.0f %% of %s's mean irradiation from a full bank, then %d mean days", streak, 100*frac, monthName(d.dm), recover), pv, streak))
}

// measured runs the weather file's year beside the synthetic ones.
func (d *run) measured() error {
	w := d.opt.Weather
	if w == nil {
		return nil
	}
	hs := d.hourlySite()
	pv := make([]float64, 8760)
	var ghiH, poaH [24]float64
	hourly := w.HourlyGHIWhM2()
	temps := w.HourlyTempC()
	dailyG := w.DailyGHIWhM2()
	for di := range 365 {
		m0 := int(d.dayMonth[di]) - 1
		var tC []float64
		if temps != nil {
			tC = temps[di*24 : di*24+24]
		}
		if hourly != nil {
			copy(ghiH[:], hourly[di*24:di*24+24])
			array.HourlyPOAFromGHI(&hs, di+1, &ghiH, &poaH)
		} else {
			array.HourlyIrradiation(&hs, di+1, dailyG[di], &ghiH, &poaH)
		}
		d.pvHours(m0, &poaH, tC, pv[di*24:di*24+24], nil)
	}
	days := make([]Day, 365)
	m := d.model
	var led Ledger
	RunDays(pv, 1, d.dayMonth, &d.demand, &d.params, &m, &led, days, nil)
	if err := led.Check(); err != nil {
		return fmt.Errorf("measured-year ledger: %w", err)
	}
	st := Summarise(days, d.model.CapacityWh, 1)
	d.r.Simulation.Measured = &report.MeasuredYear{Source: d.p.Site.WeatherFile, LOLP: st.LOLP, UnmetWh: st.UnmetWh, MinSOC: st.SOCMin, DumpedWh: st.DumpedWh}
	return nil
}

func sumF(v []float64) float64 {
	s := 0.0
	for _, x := range v {
		s += x
	}
	return s
}

func finiteOr(v, alt float64) float64 {
	if math.IsInf(v, 0) || math.IsNaN(v) {
		return alt
	}
	return v
}

func monthName(m int) string { return report.MonthName(m) }
