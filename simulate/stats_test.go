package simulate

import (
	"math"
	"testing"
)

// mkDay is a hand-built day record for the statistics tests (invented
// figures; every expected value below is arithmetic on them).
func mkDay(month int8, demand, unmet float64, unmetHours int16, socMin, socMax, socEnd, discharge float64) Day {
	return Day{Month: month, DemandWh: demand, ServedCriticalWh: demand - unmet, UnmetWh: unmet, UnmetHours: unmetHours,
		SOCMin: socMin, SOCMax: socMax, SOCEnd: socEnd, SOCMean: (socMin + socMax) / 2, DischargeWh: discharge,
		PVAvailableWh: 2 * demand, DumpedWh: 0.1 * demand}
}

func TestSummariseHandBuilt(t *testing.T) {
	days := []Day{
		mkDay(1, 100, 0, 0, 0.8, 1.0, 0.9, 50),   // 0
		mkDay(1, 100, 10, 2, 0.4, 0.6, 0.45, 60), // 1 unmet, below half
		mkDay(1, 100, 20, 3, 0.3, 0.5, 0.35, 70), // 2 unmet, below half
		mkDay(2, 100, 30, 4, 0.3, 0.4, 0.30, 40), // 3 unmet, below half: end of the longest run (3 days)
		mkDay(2, 100, 0, 0, 0.5, 0.8, 0.70, 30),  // 4
		mkDay(2, 100, 0, 0, 0.7, 0.99, 0.95, 20), // 5 full again: 2 days after day 3
		mkDay(3, 100, 5, 1, 0.6, 0.9, 0.80, 10),  // 6 unmet (run of 1)
		mkDay(3, 100, 0, 0, 0.8, 1.0, 1.00, 10),  // 7
	}
	st := Summarise(days, 1000, 2)
	tests := []struct {
		name      string
		got, want float64
	}{
		{"demand", st.DemandWh, 800},
		{"unmet", st.UnmetWh, 65},
		{"lolp", st.LOLP, 65.0 / 800},
		{"dumped", st.DumpedWh, 80},
		{"dumped fraction", st.DumpedFraction, 80.0 / 1600},
		{"unmet hours", float64(st.UnmetHours), 10},
		{"unmet days", float64(st.UnmetDays), 4},
		{"longest run", float64(st.LongestUnmetRunDays), 3},
		{"soc min", st.SOCMin, 0.3},
		{"days below half", float64(st.DaysBelowHalf), 3},
		{"recovery", st.RecoveryDaysAfterWorstStreak, 2},
		{"throughput", st.ThroughputWh, 290},
		{"cycles", st.EquivalentFullCycles, 0.29},
		// ends sorted: .30 .35 .45 .70 .80 .90 .95 1.00; median at position 3.5
		{"soc p50", st.SOCP50, (0.70 + 0.80) / 2},
		// p5 at position 0.35: .30 + 0.35 × .05
		{"soc p5", st.SOCP5, 0.30 + 0.35*0.05},
		// p95 at position 6.65: .95 + 0.65 × .05
		{"soc p95", st.SOCP95, 0.95 + 0.65*0.05},
		{"soc mean", st.SOCMean, (0.9 + 0.5 + 0.4 + 0.35 + 0.65 + 0.845 + 0.75 + 0.9) / 8},
		{"jan unmet", st.Monthly[0].UnmetWh, 30},
		{"jan lolp", st.Monthly[0].LOLP, 30.0 / 300},
		{"feb days", float64(st.Monthly[1].Days), 3},
		{"feb soc min", st.Monthly[1].SOCMin, 0.3},
		{"mar unmet days", float64(st.Monthly[2].UnmetDays), 1},
		{"apr days", float64(st.Monthly[3].Days), 0},
		{"year 1 unmet", st.Yearly[0].UnmetWh, 60},
		{"year 2 unmet", st.Yearly[1].UnmetWh, 5},
		{"year 2 soc min", st.Yearly[1].SOCMin, 0.5},
		{"year 1 cycles", st.Yearly[0].EquivalentFullCycles, 0.22},
	}
	for _, tc := range tests {
		if math.Abs(tc.got-tc.want) > 1e-12 {
			t.Errorf("%s = %g, want %g", tc.name, tc.got, tc.want)
		}
	}
	if len(st.Yearly) != 2 || st.Years != 2 || st.Days != 8 {
		t.Fatalf("years %d, yearly %d, days %d", st.Years, len(st.Yearly), st.Days)
	}
}

func TestSummariseEdgeCases(t *testing.T) {
	tests := []struct {
		name     string
		days     []Day
		capWh    float64
		years    int
		recovery float64
	}{
		{"empty", nil, 1000, 3, -1},
		{"never recovers", []Day{mkDay(5, 100, 50, 5, 0.2, 0.4, 0.3, 10), mkDay(5, 100, 0, 0, 0.3, 0.9, 0.8, 10)}, 1000, 1, -1},
		// no unmet days: counted from the day of the lowest SOC (day 1) to day 2
		{"no unmet days", []Day{mkDay(5, 100, 0, 0, 0.6, 1, 0.9, 10), mkDay(5, 100, 0, 0, 0.5, 0.8, 0.8, 10), mkDay(5, 100, 0, 0, 0.7, 1, 1, 10)}, 1000, 0, 1},
		{"no battery", []Day{mkDay(5, 100, 50, 5, 0, 0, 0, 0)}, 0, 1, -1},
		{"more years than days", []Day{mkDay(5, 100, 0, 0, 0.6, 1, 0.9, 10)}, 1000, 4, -1},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			st := Summarise(tc.days, tc.capWh, tc.years)
			if st.RecoveryDaysAfterWorstStreak != tc.recovery {
				t.Fatalf("recovery %g, want %g", st.RecoveryDaysAfterWorstStreak, tc.recovery)
			}
			for _, v := range []float64{st.LOLP, st.SOCMin, st.SOCMean, st.SOCP5, st.SOCP95, st.EquivalentFullCycles} {
				if math.IsNaN(v) || math.IsInf(v, 0) {
					t.Fatalf("non-finite figure in %+v", st)
				}
			}
			for _, m := range st.Monthly {
				if math.IsInf(m.SOCMin, 0) || math.IsNaN(m.SOCMean) {
					t.Fatalf("non-finite month figure %+v", m)
				}
			}
			n := 0
			for _, y := range st.Yearly {
				n += y.Days
				if math.IsInf(y.SOCMin, 0) {
					t.Fatalf("non-finite year figure %+v", y)
				}
			}
			if n != len(tc.days) {
				t.Fatalf("years hold %d days, want %d", n, len(tc.days))
			}
		})
	}
}

// TestSummariseAgreesWithLedger: on a simulated run the statistics and the
// ledger give the same LOLP and totals.
func TestSummariseAgreesWithLedger(t *testing.T) {
	m := demoBattery(3000)
	led, days := simulateYears(t, 3, 800, m, Params{ControllerEfficiency: 0.95})
	st := Summarise(days, 3000, 3)
	if !closes(st.UnmetWh, led.UnmetWh) || !closes(st.DemandWh, led.DemandWh) || !closes(st.DumpedWh, led.DumpedWh) {
		t.Fatalf("stats %g/%g/%g, ledger %g/%g/%g", st.UnmetWh, st.DemandWh, st.DumpedWh, led.UnmetWh, led.DemandWh, led.DumpedWh)
	}
	var y float64
	for _, ys := range st.Yearly {
		y += ys.UnmetWh
	}
	var mo float64
	for _, ms := range st.Monthly {
		mo += ms.UnmetWh
	}
	if !closes(y, st.UnmetWh) || !closes(mo, st.UnmetWh) {
		t.Fatalf("yearly %g, monthly %g, total %g", y, mo, st.UnmetWh)
	}
}
