package battery

import (
	"math"
	"sort"
)

// Cycle is one cycle counted by Rainflow: its range (peak to valley), its
// mean and its count (1 for a full cycle, 0.5 for a half cycle).
type Cycle struct {
	Range, Mean, Count float64
}

// Rainflow counts the cycles of series by the rainflow method of ASTM
// E1049-85 (reapproved 2017), §5.4.4: the series is reduced to its peaks and
// valleys, and for each new point the most recent range X is compared with
// the previous range Y; when X ≥ Y, Y is counted as one cycle (its two points
// discarded) unless Y contains the starting point, in which case it is
// counted as a half cycle and its first point discarded. The ranges left at
// the end (the residue) are counted as half cycles. NaN values are skipped.
// Cycles come in the order they are counted.
func Rainflow(series []float64) []Cycle {
	stack := make([]float64, 0, 16)
	var out []Cycle
	push := func(p float64) {
		stack = append(stack, p)
		for len(stack) >= 3 {
			n := len(stack)
			x := math.Abs(stack[n-1] - stack[n-2])
			y := math.Abs(stack[n-2] - stack[n-3])
			if x < y {
				return
			}
			if n == 3 { // Y contains the starting point
				out = append(out, Cycle{Range: y, Mean: (stack[0] + stack[1]) / 2, Count: 0.5})
				stack = append(stack[:0], stack[1:]...)
			} else {
				out = append(out, Cycle{Range: y, Mean: (stack[n-3] + stack[n-2]) / 2, Count: 1})
				stack[n-3] = stack[n-1]
				stack = stack[:n-2]
			}
		}
	}
	// Reduce to peaks and valleys: keep a point only where the direction
	// reverses; the last point is kept as the end of the history.
	var last, dir float64 // dir: +1 rising, −1 falling, 0 unknown
	have := false
	for _, v := range series {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			continue
		}
		if !have {
			last, have = v, true
			continue
		}
		d := v - last
		if d == 0 {
			continue
		}
		s := math.Copysign(1, d)
		if dir != 0 && s != dir {
			push(last) // last was a turning point
		} else if dir == 0 {
			push(last) // the first point of the history
		}
		dir, last = s, v
	}
	if have {
		push(last)
	}
	for i := 0; i+1 < len(stack); i++ {
		out = append(out, Cycle{Range: math.Abs(stack[i+1] - stack[i]), Mean: (stack[i] + stack[i+1]) / 2, Count: 0.5})
	}
	return out
}

// CyclesToFailure returns the cycles to end of life at depth of discharge dod
// from a cycle-life curve, interpolated linearly in log(cycles) against
// log(DoD) between neighbouring points (a power law N = a·DoD^−b on each
// segment, the usual shape of data-sheet curves) and extrapolated with the
// end segment's slope outside the curve. A curve of one point is extended at
// constant energy throughput (N·DoD constant, common practice). Points with
// a DoD or cycle count that is not positive are ignored. It returns +Inf for
// dod ≤ 0 or an empty curve (no cycle limit known).
func CyclesToFailure(curve []CyclePoint, dod float64) float64 {
	if !(dod > 0) {
		return math.Inf(1)
	}
	pts := curve
	ok := true
	for i, p := range curve {
		if !(p.DoD > 0) || !(p.Cycles > 0) || math.IsInf(p.DoD, 0) || math.IsInf(p.Cycles, 0) || (i > 0 && !(p.DoD > curve[i-1].DoD)) {
			ok = false
			break
		}
	}
	if !ok {
		pts = make([]CyclePoint, 0, len(curve))
		for _, p := range curve {
			if p.DoD > 0 && p.Cycles > 0 && !math.IsInf(p.DoD, 0) && !math.IsInf(p.Cycles, 0) {
				pts = append(pts, p)
			}
		}
		sort.SliceStable(pts, func(i, j int) bool { return pts[i].DoD < pts[j].DoD })
		// Drop repeated DoD values, keeping the first.
		w := 0
		for i, p := range pts {
			if i > 0 && p.DoD == pts[w-1].DoD {
				continue
			}
			pts[w] = p
			w++
		}
		pts = pts[:w]
	}
	switch len(pts) {
	case 0:
		return math.Inf(1)
	case 1:
		return pts[0].Cycles * pts[0].DoD / dod
	}
	i := 1
	for i < len(pts)-1 && dod > pts[i].DoD {
		i++
	}
	a, b := pts[i-1], pts[i]
	slope := math.Log(b.Cycles/a.Cycles) / math.Log(b.DoD/a.DoD)
	return a.Cycles * math.Exp(slope*math.Log(dod/a.DoD))
}

// Life is the expected life of a bank.
type Life struct {
	CycleDamagePerYear          float64 // Miner's-rule damage per year from cycling (1 = end of life)
	CycleLifeYears              float64 // 1 / CycleDamagePerYear (+Inf without cycling)
	CalendarLifeYears           float64 // the chemistry's calendar life (+Inf where none is given)
	ExpectedLifeYears           float64 // min(CycleLifeYears, CalendarLifeYears)
	EquivalentFullCyclesPerYear float64 // Σ count × range per year: throughput in full cycles
}

// EstimateLife estimates the life of a bank from the state-of-charge trace
// of a simulation that covered simulatedYears: Rainflow (ASTM E1049-85
// §5.4.4) counts the cycles of socSeries, whose ranges are depths of
// discharge; each cycle's damage is count / CyclesToFailure(range), summed by
// Miner's rule (Miner 1945: failure when Σ n_i/N_i = 1).
//
// The cycle life is combined with the calendar life by taking whichever ends
// first: ExpectedLifeYears = min(cycle, calendar). Summing the two as damages
// (1/(1/a + 1/b)) would count twice: a data-sheet calendar (design) life is
// the life under float with the light cycling of such a duty, and a cycle-life
// curve is the life under cycling that already includes the ageing of the
// test's duration; the bank fails by the mechanism that dominates, which for
// PV duty is either corrosion over time (lightly cycled) or wear of the
// active material (deeply cycled) (common practice). A simulatedYears that is
// not positive gives no cycle damage.
func EstimateLife(chem Chemistry, socSeries []float64, simulatedYears float64) Life {
	var l Life
	var damage, throughput float64
	if simulatedYears > 0 && !math.IsInf(simulatedYears, 0) {
		for _, c := range Rainflow(socSeries) {
			if !(c.Range > 0) {
				continue
			}
			damage += c.Count / CyclesToFailure(chem.CycleLife, c.Range)
			throughput += c.Count * c.Range
		}
		l.CycleDamagePerYear = damage / simulatedYears
		l.EquivalentFullCyclesPerYear = throughput / simulatedYears
	}
	l.CycleLifeYears = math.Inf(1)
	if l.CycleDamagePerYear > 0 {
		l.CycleLifeYears = 1 / l.CycleDamagePerYear
	}
	l.CalendarLifeYears = math.Inf(1)
	if chem.CalendarLifeYears > 0 {
		l.CalendarLifeYears = chem.CalendarLifeYears
	}
	l.ExpectedLifeYears = math.Min(l.CycleLifeYears, l.CalendarLifeYears)
	return l
}

// maxReplacements bounds the schedule ReplacementYears returns.
const maxReplacements = 1000

// ReplacementYears returns the years, counted from the start of the period,
// at which the bank is replaced within an analysis of analysisYears: every
// lifeYears, strictly before the end of the period (a bank that ends with the
// period is not replaced). It returns nil for a life that is not positive and
// finite, and at most 1000 entries.
func ReplacementYears(lifeYears, analysisYears float64) []float64 {
	if !(lifeYears > 0) || math.IsInf(lifeYears, 0) || !(analysisYears > 0) {
		return nil
	}
	var out []float64
	for k := 1; k <= maxReplacements; k++ {
		y := float64(k) * lifeYears
		if y >= analysisYears*(1-1e-12) {
			break
		}
		out = append(out, y)
	}
	return out
}
