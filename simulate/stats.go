package simulate

import (
	"math"
	"slices"
)

// FullSOC is the state of charge at which the battery counts as full again
// when the recovery after a streak is measured (0.99: a lead-acid bank
// tapers its acceptance near full, so exactly 1 is rarely reached).
const FullSOC = 0.99

// HalfSOC is the threshold of Stats.DaysBelowHalf.
const HalfSOC = 0.5

// MonthStats are the figures of one calendar month across all simulated
// years (all zero for a month with no days).
type MonthStats struct {
	Month         int     `json:"month"`
	Days          int     `json:"days"`
	LOLP          float64 `json:"loss_of_load_probability"` // UnmetWh / DemandWh
	PVAvailableWh float64 `json:"pv_available_wh"`
	DemandWh      float64 `json:"demand_wh"`
	UnmetWh       float64 `json:"unmet_wh"`
	DumpedWh      float64 `json:"dumped_wh"`
	UnmetHours    int     `json:"unmet_hours"`
	UnmetDays     int     `json:"unmet_days"`
	SOCMin        float64 `json:"soc_min"`
	SOCMean       float64 `json:"soc_mean"`
	DaysBelowHalf int     `json:"days_below_half"`
	ThroughputWh  float64 `json:"throughput_wh"`
}

// YearStats are the figures of one simulated year.
type YearStats struct {
	Year                 int     `json:"year"` // 1-based
	Days                 int     `json:"days"`
	LOLP                 float64 `json:"loss_of_load_probability"`
	DemandWh             float64 `json:"demand_wh"`
	UnmetWh              float64 `json:"unmet_wh"`
	DumpedWh             float64 `json:"dumped_wh"`
	UnmetHours           int     `json:"unmet_hours"`
	UnmetDays            int     `json:"unmet_days"`
	SOCMin               float64 `json:"soc_min"`
	ThroughputWh         float64 `json:"throughput_wh"`
	EquivalentFullCycles float64 `json:"equivalent_full_cycles"`
}

// Stats are the loss-of-load and battery figures over the days of one or
// many simulated years.
type Stats struct {
	Years    int     `json:"years"`
	Days     int     `json:"days"`
	LOLP     float64 `json:"loss_of_load_probability"` // UnmetWh / DemandWh over all days (0 without demand)
	DemandWh float64 `json:"demand_wh"`
	UnmetWh  float64 `json:"unmet_wh"`
	DumpedWh float64 `json:"dumped_wh"`
	// DumpedFraction is DumpedWh over the PV available: a sign of
	// over-sizing when large.
	DumpedFraction float64 `json:"dumped_fraction"`

	UnmetHours          int `json:"unmet_hours"`
	UnmetDays           int `json:"unmet_days"` // days with at least one unmet hour
	LongestUnmetRunDays int `json:"longest_unmet_run_days"`

	// SOCP5, SOCP50 and SOCP95 are percentiles of the end-of-day state of
	// charge (linear interpolation between order statistics).
	SOCP5         float64 `json:"soc_p5"`
	SOCP50        float64 `json:"soc_p50"`
	SOCP95        float64 `json:"soc_p95"`
	SOCMin        float64 `json:"soc_min"`  // lowest hour-end state of charge
	SOCMean       float64 `json:"soc_mean"` // mean of all hour-end values
	DaysBelowHalf int     `json:"days_below_half"`

	// RecoveryDaysAfterWorstStreak is the number of days from the last day
	// of the longest run of days with unmet load (the first such run when
	// several are equally long; without unmet days, from the day of the
	// lowest state of charge) to the first later day whose highest state of
	// charge reaches FullSOC. -1 when it never recovers within the days
	// given, or when there is no battery.
	RecoveryDaysAfterWorstStreak float64 `json:"recovery_days_after_worst_streak"`

	// ThroughputWh is the energy the battery delivered at its terminals.
	// EquivalentFullCycles is ThroughputWh / capacityWh as passed to
	// Summarise: solstand passes the model's CapacityWh (nameplate times
	// temperature factor), the base on which cycle-life curves state the
	// depth of discharge.
	ThroughputWh         float64 `json:"throughput_wh"`
	EquivalentFullCycles float64 `json:"equivalent_full_cycles"`

	Monthly [12]MonthStats `json:"monthly"`
	Yearly  []YearStats    `json:"yearly"`
}

// Summarise computes the Stats of days, the consecutive days of one or many
// years as Run wrote them (the battery carried over from day to day).
// capacityWh is the base of the equivalent full cycles (see Stats). The
// days are split into years equal runs (any remainder goes to the last
// year); years < 1 counts as 1.
func Summarise(days []Day, capacityWh float64, years int) Stats {
	if years < 1 {
		years = 1
	}
	st := Stats{Years: years, Days: len(days), RecoveryDaysAfterWorstStreak: -1}
	for i := range st.Monthly {
		st.Monthly[i].Month = i + 1
		st.Monthly[i].SOCMin = math.Inf(1)
	}
	if len(days) == 0 {
		for i := range st.Monthly {
			st.Monthly[i].SOCMin = 0
		}
		return st
	}
	cycles := func(wh float64) float64 {
		if capacityWh > 0 {
			return wh / capacityWh
		}
		return 0
	}

	var pvAvail, socSum float64
	var monthSOC [12]float64
	ends := make([]float64, len(days))
	st.SOCMin = math.Inf(1)
	run, longest, longestEnd := 0, 0, -1
	lowest, lowestDay := math.Inf(1), -1
	for i := range days {
		d := &days[i]
		pvAvail += d.PVAvailableWh
		st.DemandWh += d.DemandWh
		st.UnmetWh += d.UnmetWh
		st.DumpedWh += d.DumpedWh
		st.UnmetHours += int(d.UnmetHours)
		st.ThroughputWh += d.DischargeWh
		socSum += d.SOCMean
		ends[i] = d.SOCEnd
		if d.SOCMin < st.SOCMin {
			st.SOCMin = d.SOCMin
		}
		if d.SOCMin < lowest {
			lowest, lowestDay = d.SOCMin, i
		}
		if d.SOCMin < HalfSOC {
			st.DaysBelowHalf++
		}
		if d.UnmetHours > 0 {
			st.UnmetDays++
			run++
			if run > longest {
				longest, longestEnd = run, i
			}
		} else {
			run = 0
		}
		if mo := int(d.Month) - 1; mo >= 0 && mo < 12 {
			ms := &st.Monthly[mo]
			ms.Days++
			ms.PVAvailableWh += d.PVAvailableWh
			ms.DemandWh += d.DemandWh
			ms.UnmetWh += d.UnmetWh
			ms.DumpedWh += d.DumpedWh
			ms.UnmetHours += int(d.UnmetHours)
			if d.UnmetHours > 0 {
				ms.UnmetDays++
			}
			ms.SOCMin = math.Min(ms.SOCMin, d.SOCMin)
			monthSOC[mo] += d.SOCMean
			if d.SOCMin < HalfSOC {
				ms.DaysBelowHalf++
			}
			ms.ThroughputWh += d.DischargeWh
		}
	}
	st.LOLP = ratio(st.UnmetWh, st.DemandWh)
	st.DumpedFraction = ratio(st.DumpedWh, pvAvail)
	st.SOCMean = socSum / float64(len(days))
	st.LongestUnmetRunDays = longest
	st.EquivalentFullCycles = cycles(st.ThroughputWh)
	for i := range st.Monthly {
		ms := &st.Monthly[i]
		ms.LOLP = ratio(ms.UnmetWh, ms.DemandWh)
		if ms.Days > 0 {
			ms.SOCMean = monthSOC[i] / float64(ms.Days)
		} else {
			ms.SOCMin = 0
		}
	}

	slices.Sort(ends)
	st.SOCP5 = percentile(ends, 0.05)
	st.SOCP50 = percentile(ends, 0.50)
	st.SOCP95 = percentile(ends, 0.95)

	from := longestEnd
	if from < 0 {
		from = lowestDay
	}
	if capacityWh > 0 && from >= 0 {
		for j := from + 1; j < len(days); j++ {
			if days[j].SOCMax >= FullSOC {
				st.RecoveryDaysAfterWorstStreak = float64(j - from)
				break
			}
		}
	}

	per := len(days) / years
	st.Yearly = make([]YearStats, years)
	for y := 0; y < years; y++ {
		lo, hi := y*per, (y+1)*per
		if y == years-1 {
			hi = len(days)
		}
		ys := YearStats{Year: y + 1, Days: hi - lo, SOCMin: math.Inf(1)}
		for i := lo; i < hi; i++ {
			d := &days[i]
			ys.DemandWh += d.DemandWh
			ys.UnmetWh += d.UnmetWh
			ys.DumpedWh += d.DumpedWh
			ys.UnmetHours += int(d.UnmetHours)
			if d.UnmetHours > 0 {
				ys.UnmetDays++
			}
			ys.SOCMin = math.Min(ys.SOCMin, d.SOCMin)
			ys.ThroughputWh += d.DischargeWh
		}
		if ys.Days == 0 {
			ys.SOCMin = 0
		}
		ys.LOLP = ratio(ys.UnmetWh, ys.DemandWh)
		ys.EquivalentFullCycles = cycles(ys.ThroughputWh)
		st.Yearly[y] = ys
	}
	return st
}

// ratio returns a/b, 0 when b is not positive.
func ratio(a, b float64) float64 {
	if b > 0 {
		return a / b
	}
	return 0
}

// percentile returns the q-quantile of sorted by linear interpolation
// between order statistics (Hyndman & Fan 1996, definition 7; the default of
// common spreadsheet PERCENTILE functions); 0 for no values.
func percentile(sorted []float64, q float64) float64 {
	n := len(sorted)
	if n == 0 {
		return 0
	}
	pos := q * float64(n-1)
	i := int(pos)
	if i >= n-1 {
		return sorted[n-1]
	}
	f := pos - float64(i)
	return sorted[i] + f*(sorted[i+1]-sorted[i])
}
