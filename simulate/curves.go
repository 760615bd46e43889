package simulate

import (
	"errors"
	"fmt"
	"math"
	"runtime"
	"sync"

	"solstand/battery"
)

// Defaults of the array-to-load range searched by IsoReliability and of its
// bisection tolerance.
const (
	DefaultArrayToLoadMin       = 0.1
	DefaultArrayToLoadMax       = 5.0
	DefaultArrayToLoadTolerance = 0.002
)

// CurveInput is what the reliability sizing of Egido & Lorenzo (1992) needs:
// the PV series of every simulated year (the same weather for every
// configuration), the demand, the controller and a battery template.
//
// A configuration is a pair (C_A, C_S). The array-to-load ratio C_A is the
// mean daily PV available in the design month at the configuration's scale
// over the daily DC demand of the design month, so the scale is
// C_A × DesignDemandWhDay / DesignPVUnitWhDay. The storage C_S (days) is
// the usable battery energy over the daily DC demand of the design month.
type CurveInput struct {
	PVUnitWh [][]float64 // per year, 24 × len(DayMonth) values each
	DayMonth []int8      // month (1..12) of each day of the year
	Demand   *Demand
	Params   Params

	// BatteryTemplate gives the shape of the bank: efficiencies,
	// self-discharge, and the ratios of its energy thresholds and power
	// limits to its usable energy (CapacityWh − MinWh). For a storage of C_S
	// days every energy field (CapacityWh, EnergyWh, MinWh, ReconnectWh,
	// NonCriticalMinWh, NonCriticalReconnectWh, KneeWh) and both power limits
	// (MaxChargeW, MaxDischargeW: a bank of more strings takes and gives
	// proportionally more current) are multiplied by
	// C_S × DesignDemandWhDay / (CapacityWh − MinWh), so the template may be
	// of any size; its state of charge is the starting one of year 1.
	BatteryTemplate battery.Model

	DesignMonth       int     // 1..12, for the record
	DesignPVUnitWhDay float64 // mean daily PV available per unit of scale in the design month
	DesignDemandWhDay float64 // daily DC demand of the design month

	// ArrayCostPerCA and StorageCostPerCS price a configuration as
	// ArrayCostPerCA × C_A + StorageCostPerCS × C_S (0 and 0: no costs).
	ArrayCostPerCA, StorageCostPerCS float64

	Workers int // goroutines; 0 = runtime.NumCPU()

	// ArrayToLoadMin, ArrayToLoadMax bound the C_A searched by
	// IsoReliability (0: DefaultArrayToLoadMin, DefaultArrayToLoadMax);
	// ArrayToLoadTolerance is the width at which its bisection stops
	// (0: DefaultArrayToLoadTolerance).
	ArrayToLoadMin, ArrayToLoadMax, ArrayToLoadTolerance float64
}

// CurvePoint is one point of an isoreliability curve.
type CurvePoint struct {
	StorageDays float64 `json:"storage_days"`  // C_S
	ArrayToLoad float64 `json:"array_to_load"` // C_A, the smallest found that meets the target
	LOLP        float64 `json:"loss_of_load_probability"`
	Cost        float64 `json:"cost"` // 0 without costs
	// AtRangeMin is set when the target is already met at the bottom of the
	// searched C_A range: the true smallest C_A may lie below it.
	AtRangeMin bool `json:"at_range_min,omitempty"`
}

// Curve is the isoreliability curve of one loss-of-load target.
type Curve struct {
	TargetLOLP float64      `json:"target_loss_of_load_probability"`
	Points     []CurvePoint `json:"points"`
	Cheapest   int          `json:"cheapest"` // index into Points; -1 without costs or points
	// UnreachableStorageDays lists the storages at which the target is not
	// met even at ArrayToLoadMax; they have no point.
	UnreachableStorageDays []float64 `json:"unreachable_storage_days,omitempty"`
	ArrayToLoadMax         float64   `json:"array_to_load_max"`
}

// validate checks the input and returns the effective worker count.
func (in *CurveInput) validate() (int, error) {
	if in == nil {
		return 0, errors.New("curves: no input")
	}
	if in.Demand == nil {
		return 0, errors.New("curves: no demand")
	}
	if len(in.PVUnitWh) == 0 {
		return 0, errors.New("curves: no PV years")
	}
	if len(in.DayMonth) == 0 {
		return 0, errors.New("curves: no days")
	}
	for i, mo := range in.DayMonth {
		if mo < 1 || mo > 12 {
			return 0, fmt.Errorf("curves: day_month[%d] = %d, want 1..12", i, mo)
		}
	}
	want := HoursPerDay * len(in.DayMonth)
	for y, pv := range in.PVUnitWh {
		if len(pv) != want {
			return 0, fmt.Errorf("curves: pv_unit_wh[%d] has %d values, want %d", y, len(pv), want)
		}
	}
	if !finitePositive(in.DesignPVUnitWhDay) {
		return 0, fmt.Errorf("curves: design PV per unit %g Wh/day, want > 0", in.DesignPVUnitWhDay)
	}
	if !finitePositive(in.DesignDemandWhDay) {
		return 0, fmt.Errorf("curves: design demand %g Wh/day, want > 0", in.DesignDemandWhDay)
	}
	if !finitePositive(in.BatteryTemplate.CapacityWh - in.BatteryTemplate.MinWh) {
		return 0, errors.New("curves: battery template has no usable energy (capacity_wh − min_wh ≤ 0)")
	}
	if !(in.ArrayCostPerCA >= 0) || !(in.StorageCostPerCS >= 0) || math.IsInf(in.ArrayCostPerCA, 0) || math.IsInf(in.StorageCostPerCS, 0) {
		return 0, errors.New("curves: costs must be finite and ≥ 0")
	}
	w := in.Workers
	if w <= 0 {
		w = runtime.NumCPU()
	}
	return max(w, 1), nil
}

func finitePositive(v float64) bool { return v > 0 && !math.IsInf(v, 0) }

// ArrayScale returns the scale of pvUnitWh that gives array-to-load ratio
// ca (Egido & Lorenzo 1992: C_A = scale × DesignPVUnitWhDay /
// DesignDemandWhDay).
func (in *CurveInput) ArrayScale(ca float64) float64 {
	return ca * in.DesignDemandWhDay / in.DesignPVUnitWhDay
}

// Battery returns the template scaled to a storage of cs days (Egido &
// Lorenzo 1992: C_S = usable energy / DesignDemandWhDay); see
// BatteryTemplate for what scales.
func (in *CurveInput) Battery(cs float64) battery.Model {
	t := in.BatteryTemplate
	k := 0.0
	if u := t.CapacityWh - t.MinWh; u > 0 && cs > 0 && !math.IsInf(cs, 0) {
		k = cs * in.DesignDemandWhDay / u
	}
	t.CapacityWh *= k
	t.EnergyWh *= k
	t.MinWh *= k
	t.ReconnectWh *= k
	t.NonCriticalMinWh *= k
	t.NonCriticalReconnectWh *= k
	t.KneeWh *= k
	t.MaxChargeW *= k
	t.MaxDischargeW *= k
	return t
}

// lolpRunner evaluates configurations; one per goroutine. It needs no day
// records: runTotals keeps only the sums the LOLP is made of, over demand
// tables built once.
type lolpRunner struct {
	in   *CurveInput
	tb   demandTables
	ctrl controller

	// For column: the PV split of one year at one scale, and one battery
	// per storage.
	split []daySplit
	ms    []battery.Model
	ks    []fastBattery
	fast  []bool
	sts   []fastState
	ts    []totals
}

func newRunner(in *CurveInput) *lolpRunner {
	r := &lolpRunner{in: in, ctrl: controllerOf(&in.Params)}
	r.tb.fill(in.Demand)
	return r
}

// lolp simulates every year in turn, the battery carried over from year to
// year, and returns unmet / demand.
func (r *lolpRunner) lolp(ca, cs float64) float64 {
	l, _ := r.lolpUpTo(ca, cs, math.Inf(1))
	return l
}

// lolpUpTo is lolp with an early stop: every year has the same demand (the
// same days and months), so once the unmet energy exceeds limit × the
// demand of all years the LOLP is known to exceed limit, and lolpUpTo
// returns that lower bound with exact = false.
func (r *lolpRunner) lolpUpTo(ca, cs, limit float64) (lolp float64, exact bool) {
	in := r.in
	m := in.Battery(cs)
	scale := in.ArrayScale(ca)
	var t totals
	years := float64(len(in.PVUnitWh))
	for y, pv := range in.PVUnitWh {
		runTotals(pv, scale, in.DayMonth, &r.tb, r.ctrl, &m, &t)
		if total := t.demandWh / float64(y+1) * years; y+1 < len(in.PVUnitWh) && t.unmetWh > limit*total*(1+1e-9) {
			return t.unmetWh / total, false
		}
	}
	return ratio(t.unmetWh, t.demandWh), true
}

// column returns in lolps[i] the lolp of array-to-load ca at storage
// cs[i], for every i, with exactly the arithmetic of lolp: each year's PV
// split between loads and battery (which does not depend on the battery)
// is made once for the whole column.
func (r *lolpRunner) column(ca float64, cs []float64, lolps []float64) {
	in := r.in
	scale := sanitiseScale(in.ArrayScale(ca))
	r.ms, r.ks, r.fast, r.sts, r.ts = r.ms[:0], r.ks[:0], r.fast[:0], r.sts[:0], r.ts[:0]
	for _, c := range cs {
		m := in.Battery(c)
		k, ok := fastBatteryOf(&m)
		r.ms, r.ks, r.fast, r.sts, r.ts = append(r.ms, m), append(r.ks, k), append(r.fast, ok), append(r.sts, stateOf(&m)), append(r.ts, totals{})
	}
	nd := len(in.DayMonth)
	if cap(r.split) < nd {
		r.split = make([]daySplit, nd)
	}
	split := r.split[:nd]
	for _, pv := range in.PVUnitWh {
		for di, mo := range in.DayMonth {
			cDay, nDay := r.tb.day(mo)
			split[di].fill(pv[di*HoursPerDay:], scale, cDay, nDay, r.ctrl)
		}
		for i := range r.ms {
			k, st, m, t := &r.ks[i], &r.sts[i], &r.ms[i], &r.ts[i]
			for di, mo := range in.DayMonth {
				cDay, nDay := r.tb.day(mo)
				var servedC, servedN float64
				if r.fast[i] {
					servedC, servedN = k.day(st, &split[di], cDay, nDay, nil)
				} else {
					servedC, servedN = dayByCalls(m, &split[di], cDay, nDay, nil)
				}
				t.add(servedC, servedN, r.tb.dayDemand[mo-1])
			}
		}
	}
	for i, t := range r.ts {
		lolps[i] = ratio(t.unmetWh, t.demandWh)
	}
}

// checkAxis rejects non-finite or negative grid values.
func checkAxis(name string, v []float64) error {
	for i, x := range v {
		if !(x >= 0) || math.IsInf(x, 0) {
			return fmt.Errorf("curves: %s[%d] = %g, want finite ≥ 0", name, i, x)
		}
	}
	return nil
}

// LOLPGrid returns the loss-of-load probability (unmet / demand over all
// years) of every configuration, indexed [storage][array]: the LOLP surface
// behind the isoreliability curves of Egido & Lorenzo (1992). The
// configurations run on in.Workers goroutines; the result does not depend
// on their number.
func LOLPGrid(in *CurveInput, arrayToLoad, storageDays []float64) ([][]float64, error) {
	return LOLPGridProgress(in, arrayToLoad, storageDays, nil)
}

// LOLPGridProgress is LOLPGrid with a progress callback, called from the
// caller's goroutine after each configuration with the number done and the
// total (nil: none).
func LOLPGridProgress(in *CurveInput, arrayToLoad, storageDays []float64, progress func(done, total int)) ([][]float64, error) {
	workers, err := in.validate()
	if err != nil {
		return nil, err
	}
	if err := checkAxis("array_to_load", arrayToLoad); err != nil {
		return nil, err
	}
	if err := checkAxis("storage_days", storageDays); err != nil {
		return nil, err
	}
	na := len(arrayToLoad)
	out := make([][]float64, len(storageDays))
	flat := make([]float64, len(storageDays)*na)
	for i := range out {
		out[i] = flat[i*na : (i+1)*na]
	}
	total := len(flat)
	if total == 0 {
		return out, nil
	}
	// A job is a run of storages at one array-to-load ratio (column shares
	// the PV split among them): whole columns, unless there are too few of
	// them to keep every worker busy.
	ns := len(storageDays)
	chunks := min(ns, (2*workers+na-1)/na)
	per := (ns + chunks - 1) / chunks
	type job struct{ j, i0, i1 int }
	jobs := make(chan job, na*chunks)
	for j := 0; j < na; j++ {
		for i0 := 0; i0 < ns; i0 += per {
			jobs <- job{j, i0, min(i0+per, ns)}
		}
	}
	close(jobs)
	workers = min(workers, len(jobs))
	doneCh := make(chan struct{}, total)
	var wg sync.WaitGroup
	for w := 0; w < workers; w++ {
		wg.Add(1)
		go func() {
			defer wg.Done()
			r := newRunner(in)
			col := make([]float64, per)
			for jb := range jobs {
				c := col[:jb.i1-jb.i0]
				r.column(arrayToLoad[jb.j], storageDays[jb.i0:jb.i1], c)
				for i, l := range c {
					flat[(jb.i0+i)*na+jb.j] = l
					doneCh <- struct{}{}
				}
			}
		}()
	}
	go func() { wg.Wait(); close(doneCh) }()
	done := 0
	for range doneCh {
		done++
		if progress != nil {
			progress(done, total)
		}
	}
	return out, nil
}

// IsoReliability returns, for each target loss-of-load probability, the
// isoreliability curve of Egido & Lorenzo (1992): for every storage C_S in
// storageDays the smallest array-to-load ratio C_A in
// [ArrayToLoadMin, ArrayToLoadMax] whose LOLP is at most the target, found
// by bisection to ArrayToLoadTolerance on the assumption that LOLP falls as
// the array grows. LOLP is simulated, not smooth: the disconnect
// hysteresis and the acceptance taper can make it wobble by a few per cent
// of its value within a tolerance step, so the point is the upper end of a
// bracket (lower end misses the target, upper end meets it) of width ≤
// ArrayToLoadTolerance, not a guaranteed global smallest. A storage at
// which the target is not met even at ArrayToLoadMax gets no point and is
// listed in UnreachableStorageDays. With costs, Cheapest marks the
// least-cost point of each curve.
//
// Every evaluation runs the years in turn with the battery carried over and
// stops early once the unmet energy exceeds the target share of all years'
// demand (such points only need to be known to miss); the LOLP reported
// for each point is that of the full run.
//
// Storages run on in.Workers goroutines; progress (nil: none) is called
// from the caller's goroutine after each storage and target with the
// number done and the total.
func IsoReliability(in *CurveInput, targets, storageDays []float64, progress func(done, total int)) ([]Curve, error) {
	workers, err := in.validate()
	if err != nil {
		return nil, err
	}
	if err := checkAxis("storage_days", storageDays); err != nil {
		return nil, err
	}
	for i, t := range targets {
		if !(t >= 0 && t <= 1) {
			return nil, fmt.Errorf("curves: targets[%d] = %g, want 0..1", i, t)
		}
	}
	lo, hi, tol := in.ArrayToLoadMin, in.ArrayToLoadMax, in.ArrayToLoadTolerance
	if lo == 0 {
		lo = DefaultArrayToLoadMin
	}
	if hi == 0 {
		hi = DefaultArrayToLoadMax
	}
	if tol == 0 {
		tol = DefaultArrayToLoadTolerance
	}
	if !(lo > 0) || !(hi > lo) || math.IsInf(hi, 0) || !(tol > 0) {
		return nil, fmt.Errorf("curves: array-to-load range [%g, %g] with tolerance %g, want 0 < min < max and tolerance > 0", lo, hi, tol)
	}

	ns, nt := len(storageDays), len(targets)
	type result struct {
		point CurvePoint
		ok    bool
	}
	res := make([]result, ns*nt) // [storage][target]
	total := ns * nt
	if total > 0 {
		workers = min(workers, ns)
		jobs := make(chan int, ns)
		for i := 0; i < ns; i++ {
			jobs <- i
		}
		close(jobs)
		doneCh := make(chan int, total)
		var wg sync.WaitGroup
		for w := 0; w < workers; w++ {
			wg.Add(1)
			go func() {
				defer wg.Done()
				r := newRunner(in)
				for i := range jobs {
					cs := storageDays[i]
					s := &searcher{lolp: func(ca, limit float64) (float64, bool) { return r.lolpUpTo(ca, cs, limit) }}
					for j, t := range targets {
						ca, l, ok, atMin := s.smallest(t, lo, hi, tol)
						res[i*nt+j] = result{CurvePoint{StorageDays: cs, ArrayToLoad: ca, LOLP: l, AtRangeMin: atMin}, ok}
						doneCh <- 1
					}
				}
			}()
		}
		go func() { wg.Wait(); close(doneCh) }()
		done := 0
		for range doneCh {
			done++
			if progress != nil {
				progress(done, total)
			}
		}
	}

	costs := in.ArrayCostPerCA > 0 || in.StorageCostPerCS > 0
	curves := make([]Curve, nt)
	for j, t := range targets {
		c := Curve{TargetLOLP: t, Cheapest: -1, ArrayToLoadMax: hi, Points: []CurvePoint{}}
		for i := 0; i < ns; i++ {
			r := res[i*nt+j]
			if !r.ok {
				c.UnreachableStorageDays = append(c.UnreachableStorageDays, storageDays[i])
				continue
			}
			p := r.point
			if costs {
				p.Cost = in.ArrayCostPerCA*p.ArrayToLoad + in.StorageCostPerCS*p.StorageDays
				if c.Cheapest < 0 || p.Cost < c.Points[c.Cheapest].Cost {
					c.Cheapest = len(c.Points)
				}
			}
			c.Points = append(c.Points, p)
		}
		curves[j] = c
	}
	return curves, nil
}

// searcher finds the smallest C_A meeting a LOLP target by bisection,
// remembering every evaluation so that later targets at the same storage
// start from the tightest bracket already known. An evaluation stopped
// early holds a lower bound of the LOLP (exact false).
type searcher struct {
	lolp  func(ca, limit float64) (float64, bool)
	ca    []float64
	l     []float64
	exact []bool
}

// eval returns the LOLP at ca, or a lower bound above target.
func (s *searcher) eval(ca, target float64) float64 {
	for i, x := range s.ca {
		if x == ca && (s.exact[i] || s.l[i] > target) {
			return s.l[i]
		}
	}
	v, ex := s.lolp(ca, target)
	s.ca = append(s.ca, ca)
	s.l = append(s.l, v)
	s.exact = append(s.exact, ex)
	return v
}

// smallest returns the C_A found, its LOLP, whether the target is met
// within [lo, hi], and whether it is met already at lo.
func (s *searcher) smallest(target, lo, hi, tol float64) (ca, lolp float64, ok, atMin bool) {
	lHi := s.eval(hi, target)
	if lHi > target {
		return 0, 0, false, false
	}
	if lLo := s.eval(lo, target); lLo <= target {
		return lo, lLo, true, true
	}
	// Tighten the bracket (a fails, b meets) from earlier evaluations.
	a, b, lb := lo, hi, lHi
	for i, x := range s.ca {
		if x > a && x < b && (s.exact[i] || s.l[i] > target) {
			if s.l[i] > target {
				a = x
			} else {
				b, lb = x, s.l[i]
			}
		}
	}
	for b-a > tol {
		mid := 0.5 * (a + b)
		if v := s.eval(mid, target); v <= target {
			b, lb = mid, v
		} else {
			a = mid
		}
	}
	return b, lb, true, false
}
