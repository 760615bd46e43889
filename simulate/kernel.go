// Package simulate runs the energy balance of a stand-alone PV system: an
// hourly kernel over precomputed PV and demand series, statistics over many
// simulated years, and the reliability (isoreliability) sizing curves.
package simulate

import (
	"errors"
	"fmt"
	"math"

	"solstand/battery"
)

// HoursPerDay is the number of hourly steps in one simulated day.
const HoursPerDay = 24

// ledgerRelTol is the relative tolerance to which the ledger identities
// must close (CONTRACT.md).
const ledgerRelTol = 1e-9

// Demand is the DC-side load of the mean day of each calendar month, by
// clock hour: index [month−1][hour], hour h covering h:00–(h+1):00.
// Inverter losses are already included in CriticalWh and NonCriticalWh;
// InverterLossWh is the part of that demand which is inverter loss, used
// only to report the inverter-loss share of what was served.
type Demand struct {
	CriticalWh     [12][24]float64
	NonCriticalWh  [12][24]float64
	InverterLossWh [12][24]float64
}

// DailyWh returns the DC-side demand (critical plus non-critical) of the
// mean day of month (1..12); 0 for a month out of range.
func (d *Demand) DailyWh(month int) float64 {
	if d == nil || month < 1 || month > 12 {
		return 0
	}
	s := 0.0
	for h := 0; h < HoursPerDay; h++ {
		s += d.CriticalWh[month-1][h] + d.NonCriticalWh[month-1][h]
	}
	return s
}

// Params are the controller figures the kernel needs.
type Params struct {
	// ControllerEfficiency is the fraction of the PV input the charge
	// controller passes on (clamped to 0..1; 0 or NaN: nothing passes).
	ControllerEfficiency float64
	// ControllerMaxOutWh is the largest controller output in one hourly
	// step; 0 (or negative, NaN) = unlimited.
	ControllerMaxOutWh float64
}

// Ledger is the energy ledger of CONTRACT.md over one or many RunDays calls,
// all DC-side, in Wh.
type Ledger struct {
	PVAvailableWh  float64 `json:"pv_available_wh"`
	LoadServedWh   float64 `json:"load_served_wh"`
	UnmetWh        float64 `json:"unmet_wh"`
	DumpedWh       float64 `json:"dumped_wh"`
	LossesWh       float64 `json:"losses_wh"`
	BatteryStartWh float64 `json:"battery_start_wh"`
	BatteryEndWh   float64 `json:"battery_end_wh"`
	DemandWh       float64 `json:"demand_wh"`
}

// Check verifies both identities of the ledger to 1e-9 relative:
// PVAvailable + BatteryStart = LoadServed + Losses + Dumped + BatteryEnd,
// and LoadServed + Unmet = Demand. It also rejects non-finite entries.
func (l Ledger) Check() error {
	for _, v := range [...]float64{l.PVAvailableWh, l.LoadServedWh, l.UnmetWh, l.DumpedWh, l.LossesWh, l.BatteryStartWh, l.BatteryEndWh, l.DemandWh} {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return errors.New("ledger: non-finite entry")
		}
	}
	in := l.PVAvailableWh + l.BatteryStartWh
	out := l.LoadServedWh + l.LossesWh + l.DumpedWh + l.BatteryEndWh
	if !closes(in, out) {
		return fmt.Errorf("ledger: energy does not close: pv available + battery start = %.12g Wh, served + losses + dumped + battery end = %.12g Wh", in, out)
	}
	if !closes(l.LoadServedWh+l.UnmetWh, l.DemandWh) {
		return fmt.Errorf("ledger: demand does not close: served + unmet = %.12g Wh, demand = %.12g Wh", l.LoadServedWh+l.UnmetWh, l.DemandWh)
	}
	return nil
}

// Plus returns the ledger of two independent runs taken together (every
// entry summed); both identities carry over to the sum.
func (l Ledger) Plus(o Ledger) Ledger {
	return Ledger{
		PVAvailableWh:  l.PVAvailableWh + o.PVAvailableWh,
		LoadServedWh:   l.LoadServedWh + o.LoadServedWh,
		UnmetWh:        l.UnmetWh + o.UnmetWh,
		DumpedWh:       l.DumpedWh + o.DumpedWh,
		LossesWh:       l.LossesWh + o.LossesWh,
		BatteryStartWh: l.BatteryStartWh + o.BatteryStartWh,
		BatteryEndWh:   l.BatteryEndWh + o.BatteryEndWh,
		DemandWh:       l.DemandWh + o.DemandWh,
	}
}

// closes reports whether a and b agree to ledgerRelTol relative.
func closes(a, b float64) bool {
	scale := max(math.Abs(a), math.Abs(b))
	return math.Abs(a-b) <= ledgerRelTol*scale
}

// Day is the summary of one simulated day (24 hourly steps). Energies in Wh,
// DC side; states of charge are fractions of the battery's CapacityWh at
// the end of each hour (0 when there is no battery).
type Day struct {
	Month int8 // 1..12

	PVAvailableWh float64 // array DC output before the controller
	// PVUsedWh is the energy the controller drew from the array
	// (output / efficiency); PVAvailableWh − PVUsedWh is dumped.
	PVUsedWh            float64
	DemandWh            float64
	ServedCriticalWh    float64 // direct from PV plus from the battery
	ServedNonCriticalWh float64
	UnmetWh             float64
	DumpedWh            float64 // PV not drawn: battery full, loads met, or clipped by the controller
	// InverterLossWh is the inverter-loss share of what was served: each
	// hour's InverterLossWh times the served fraction of that hour's demand.
	InverterLossWh   float64
	ControllerLossWh float64 // drawn − output
	BatteryLossWh    float64 // charge + discharge + self-discharge losses
	SOCMin           float64
	SOCMax           float64
	SOCEnd           float64
	SOCMean          float64 // mean of the 24 hour-end values
	ChargeWh         float64 // accepted by the battery at its terminals
	DischargeWh      float64 // delivered by the battery at its terminals
	UnmetHours       int16   // hours with unmet load (above 1e-9 of the hour's demand)
}

// ServedWh is the load served on the day (critical plus non-critical).
func (d *Day) ServedWh() float64 { return d.ServedCriticalWh + d.ServedNonCriticalWh }

// RunDays simulates len(dayMonth) days of 24 hourly steps and returns the
// number of days simulated.
//
// pvUnitWh holds 24 values per day: the array's DC output per unit of
// scale in each hour (pv_available = scale × pvUnitWh[h]; negative and NaN
// values count as 0). dayMonth[d] is the calendar month (1..12) of day d,
// which selects the demand of that month's mean day. RunDays updates m (the
// battery) and led in place, writes one Day per day into days and, when soc
// is not nil, the state of charge at the end of each hour into soc.
//
// In each hour the controller passes out = min(drawn × efficiency,
// ControllerMaxOutWh); the output serves critical loads first, then
// non-critical ones, and the surplus is offered to m.Charge. The controller
// draws from the array only what it passes on (drawn = output / efficiency);
// the rest of the available PV, including what the output limit clips, is
// dumped. The remaining load is asked from m.Discharge, then
// m.SelfDischarge(1) applies. Losses = controller loss + battery charge,
// discharge and self-discharge losses. A battery whose figures are all
// finite, with both efficiencies above 0, is stepped by an inline copy of
// these three methods with the same results bit for bit; any other battery
// through the methods themselves.
//
// A zero Ledger starts afresh (BatteryStartWh is set to m.EnergyWh); a
// ledger carried over from an earlier RunDays call continues it, which requires m to
// be the same battery carried over too.
//
// RunDays never panics on input and does not allocate. It stops early (and
// says so by the count it returns) at the first month out of 1..12, or when
// pvUnitWh, days or a non-nil soc is too short; with a nil d, p, m or led it
// does nothing.
func RunDays(pvUnitWh []float64, scale float64, dayMonth []int8, d *Demand, p *Params, m *battery.Model, led *Ledger, days []Day, soc []float32) int {
	return runDays(pvUnitWh, scale, dayMonth, d, p, m, led, days, soc, true)
}

// runDays is RunDays; with inline false it steps every battery through its
// methods (dayByCalls), which TestRunDaysInlineMatchesMethods compares the
// inline steps with.
func runDays(pvUnitWh []float64, scale float64, dayMonth []int8, d *Demand, p *Params, m *battery.Model, led *Ledger, days []Day, soc []float32, inline bool) int {
	if d == nil || p == nil || m == nil || led == nil {
		return 0
	}
	n := len(dayMonth)
	n = min(n, len(pvUnitWh)/HoursPerDay, len(days))
	writeSOC := soc != nil
	if writeSOC {
		n = min(n, len(soc)/HoursPerDay)
	}

	c := controllerOf(p)
	invEff := c.invEff
	scale = sanitiseScale(scale)

	// Flat per-month, per-hour tables, sanitised once per call.
	var tb demandTables
	tb.fill(d)

	if led.isZero() {
		led.BatteryStartWh = m.EnergyWh
	}
	k, fast := fastBatteryOf(m)
	fast = fast && inline
	st := stateOf(m)
	capWh := m.CapacityWh
	done := 0
	// Per day: the PV split (call-free), the battery's 24 steps (inline, or
	// through the methods), then the records and sums (call-free).
	var sp daySplit
	var bh batteryHours
	var hSOC [HoursPerDay]float64
	for di := 0; di < n; di++ {
		mo := dayMonth[di]
		if mo < 1 || mo > 12 {
			break
		}
		pvDay := pvUnitWh[di*HoursPerDay : di*HoursPerDay+HoursPerDay]
		cDay, nDay := tb.day(mo)
		fDay := (*[HoursPerDay]float64)(tb.invFrac[int(mo-1)*HoursPerDay:])
		sp.fill(pvDay, scale, cDay, nDay, c)
		if fast {
			k.day(&st, &sp, cDay, nDay, &bh)
		} else {
			dayByCalls(m, &sp, cDay, nDay, &bh)
		}

		var pvAvail, pvUsed, servedC, servedN, invLoss, outSum, batLoss, chg, dis, socSum float64
		socMin, socMax := math.Inf(1), math.Inf(-1)
		var unmetHours int16
		for h := 0; h < HoursPerDay; h++ {
			pv := scale * pvDay[h]
			if !(pv > 0 && pv <= math.MaxFloat64) { // NaN, negative, +Inf
				pv = 0
			}
			// The controller's output: the direct share of both loads, then
			// what the battery accepted (all 0 without PV); it drew
			// output / efficiency from the array.
			out := sp.sc[h] + sp.sn[h] + bh.acc[h]
			used := out * invEff
			if used > pv {
				used = pv
			}
			bc, bn := bh.bc[h], bh.bn[h]
			sc, sn := sp.sc[h]+bc, sp.sn[h]+bn
			hd := cDay[h] + nDay[h]
			served := sc + sn
			if u := hd - served; u > ledgerRelTol*hd {
				unmetHours++
			}
			pvAvail += pv
			pvUsed += used
			outSum += out
			servedC += sc
			servedN += sn
			invLoss += fDay[h] * served
			batLoss += bh.loss[h]
			chg += bh.acc[h]
			dis += bc + bn
			s := 0.0
			if capWh > 0 { // battery.Model.SOC
				s = bh.e[h] / capWh
			}
			hSOC[h] = s
			socSum += s
			if s < socMin {
				socMin = s
			}
			if s > socMax {
				socMax = s
			}
		}
		if writeSOC {
			out := soc[di*HoursPerDay : di*HoursPerDay+HoursPerDay]
			for h, s := range hSOC {
				out[h] = float32(s)
			}
		}
		demand := tb.dayDemand[mo-1]
		unmet := demand - (servedC + servedN)
		dumped := pvAvail - pvUsed
		ctrlLoss := pvUsed - outSum
		days[di] = Day{
			Month:               mo,
			PVAvailableWh:       pvAvail,
			PVUsedWh:            pvUsed,
			DemandWh:            demand,
			ServedCriticalWh:    servedC,
			ServedNonCriticalWh: servedN,
			UnmetWh:             unmet,
			DumpedWh:            dumped,
			InverterLossWh:      invLoss,
			ControllerLossWh:    ctrlLoss,
			BatteryLossWh:       batLoss,
			SOCMin:              socMin,
			SOCMax:              socMax,
			SOCEnd:              hSOC[HoursPerDay-1],
			SOCMean:             socSum / HoursPerDay,
			ChargeWh:            chg,
			DischargeWh:         dis,
			UnmetHours:          unmetHours,
		}
		led.PVAvailableWh += pvAvail
		led.LoadServedWh += servedC + servedN
		led.UnmetWh += unmet
		led.DumpedWh += dumped
		led.LossesWh += ctrlLoss + batLoss
		led.DemandWh += demand
		done++
	}
	if fast {
		st.store(m)
	}
	led.BatteryEndWh = m.EnergyWh
	return done
}

// controller holds the sanitised controller figures of Params.
type controller struct {
	eff    float64 // 0..1
	invEff float64 // 1 / eff, 0 when eff is 0
	maxOut float64 // +Inf when unlimited
}

// controllerOf sanitises p as RunDays documents it.
func controllerOf(p *Params) controller {
	eff := p.ControllerEfficiency
	if !(eff > 0) {
		eff = 0
	} else if eff > 1 {
		eff = 1
	}
	invEff := 0.0
	if eff > 0 {
		invEff = 1 / eff
	}
	maxOut := p.ControllerMaxOutWh
	if !(maxOut > 0) {
		maxOut = math.Inf(1)
	}
	return controller{eff: eff, invEff: invEff, maxOut: maxOut}
}

// sanitiseScale maps a negative, NaN or infinite PV scale to 0.
func sanitiseScale(scale float64) float64 {
	if !(scale > 0) || math.IsInf(scale, 0) {
		return 0
	}
	return scale
}

// demandTables are the demand of Demand as flat per-month, per-hour tables
// (index (month−1)·24 + hour), negative, NaN and infinite values as 0, with
// the inverter-loss fraction of each hour's demand and each month's daily
// demand.
type demandTables struct {
	crit, nonc, invFrac [12 * HoursPerDay]float64
	dayDemand           [12]float64
}

// fill builds the tables of d.
func (t *demandTables) fill(d *Demand) {
	*t = demandTables{}
	for mo := 0; mo < 12; mo++ {
		for h := 0; h < HoursPerDay; h++ {
			i := mo*HoursPerDay + h
			c, nc, inv := d.CriticalWh[mo][h], d.NonCriticalWh[mo][h], d.InverterLossWh[mo][h]
			if !(c > 0) || math.IsInf(c, 0) {
				c = 0
			}
			if !(nc > 0) || math.IsInf(nc, 0) {
				nc = 0
			}
			t.crit[i], t.nonc[i] = c, nc
			t.dayDemand[mo] += c + nc
			if dem := c + nc; dem > 0 && inv > 0 && !math.IsInf(inv, 0) {
				t.invFrac[i] = min(inv, dem) / dem
			}
		}
	}
}

// totals are the load sums of one or many runTotals calls, in Wh.
type totals struct {
	servedWh, unmetWh, demandWh float64
}

// daySplit is one day of RunDays's split of the PV output: by hour, what
// the controller output serves of the critical and the non-critical load
// directly, and the surplus it offers to the battery. It depends on the
// array scale but not on the battery.
type daySplit struct {
	sc, sn, rem [HoursPerDay]float64
}

// fill splits one day: pvDay the PV per unit of scale, cDay and nDay the
// sanitised demand (demandTables), with RunDays's arithmetic.
func (s *daySplit) fill(pvDay []float64, scale float64, cDay, nDay *[HoursPerDay]float64, c controller) {
	pvDay = pvDay[:HoursPerDay]
	eff, maxOut := c.eff, c.maxOut
	for h := 0; h < HoursPerDay; h++ {
		pv := scale * pvDay[h]
		if !(pv > 0 && pv <= math.MaxFloat64) { // NaN, negative, +Inf
			pv = 0
		}
		var sc, sn, rem float64
		if pv > 0 && eff > 0 {
			dc, dn := cDay[h], nDay[h]
			avail := min(pv*eff, maxOut)
			sc = min(dc, avail)
			sn = min(dn, avail-sc)
			rem = avail - (sc + sn)
		}
		s.sc[h], s.sn[h], s.rem[h] = sc, sn, rem
	}
}

// day returns the sanitised demand of month mo (1..12) by hour.
func (t *demandTables) day(mo int8) (c, n *[HoursPerDay]float64) {
	base := int(mo-1) * HoursPerDay
	return (*[HoursPerDay]float64)(t.crit[base : base+HoursPerDay]), (*[HoursPerDay]float64)(t.nonc[base : base+HoursPerDay])
}

// runTotals is RunDays without the day records, for callers that need only
// the served, unmet and demand sums (the LOLP of the sizing curves): it
// steps m through the same hourly balance with the same arithmetic, so m
// ends in the same state and t.servedWh, t.unmetWh and t.demandWh grow by
// exactly the LoadServedWh, UnmetWh and DemandWh RunDays would add to its
// ledger. tb are the tables of the demand (demandTables.fill) and c the
// controller (controllerOf); it returns the number of days simulated,
// stopping at the first month out of 1..12 or when pvUnitWh is too short.
//
// Each day's PV split (daySplit) is made first; a battery that
// fastBatteryOf accepts is then stepped inline (fastBattery.day), any
// other through its methods (dayByCalls), as in RunDays, here without
// the hourly records.
func runTotals(pvUnitWh []float64, scale float64, dayMonth []int8, tb *demandTables, c controller, m *battery.Model, t *totals) int {
	scale = sanitiseScale(scale)
	n := min(len(dayMonth), len(pvUnitWh)/HoursPerDay)
	k, fast := fastBatteryOf(m)
	st := stateOf(m)
	var sp daySplit
	done := 0
	for di := 0; di < n; di++ {
		mo := dayMonth[di]
		if mo < 1 || mo > 12 {
			break
		}
		cDay, nDay := tb.day(mo)
		sp.fill(pvUnitWh[di*HoursPerDay:], scale, cDay, nDay, c)
		var servedC, servedN float64
		if fast {
			servedC, servedN = k.day(&st, &sp, cDay, nDay, nil)
		} else {
			servedC, servedN = dayByCalls(m, &sp, cDay, nDay, nil)
		}
		t.add(servedC, servedN, tb.dayDemand[mo-1])
		done++
	}
	if fast {
		st.store(m)
	}
	return done
}

// add adds one day: served from both loads, and the demand, as RunDays
// adds them to its ledger.
func (t *totals) add(servedC, servedN, demand float64) {
	t.servedWh += servedC + servedN
	t.unmetWh += demand - (servedC + servedN)
	t.demandWh += demand
}

// batteryHours is what the battery did in each hour of one day, as
// RunDays records it: accepted charge (only a positive Charge counts), what
// Discharge delivered to the critical and the non-critical load, the
// hour's battery loss (charge + discharge + self-discharge, in that order
// of summation) and the stored energy at the end of the hour.
type batteryHours struct {
	acc, bc, bn, loss, e [HoursPerDay]float64
}

// dayByCalls steps m through one day of split sp with the battery.Model
// methods, as RunDays calls them, and returns the load served from PV
// and battery together; when rec is not nil it records each hour there.
func dayByCalls(m *battery.Model, sp *daySplit, cDay, nDay *[HoursPerDay]float64, rec *batteryHours) (servedC, servedN float64) {
	for h := 0; h < HoursPerDay; h++ {
		sc, sn := sp.sc[h], sp.sn[h]
		var acc, bc, bn, loss float64
		if rem := sp.rem[h]; rem > 0 {
			if a, l := m.Charge(rem, 1); a > 0 {
				acc, loss = a, l
			}
		}
		if rc, rn := cDay[h]-sc, nDay[h]-sn; rc > 0 || rn > 0 {
			var l float64
			bc, bn, l = m.Discharge(rc, rn, 1)
			sc += bc
			sn += bn
			loss += l
		}
		loss += m.SelfDischarge(1)
		if rec != nil {
			rec.acc[h], rec.bc[h], rec.bn[h], rec.loss[h], rec.e[h] = acc, bc, bn, loss, m.EnergyWh
		}
		servedC += sc
		servedN += sn
	}
	return servedC, servedN
}

// fastBattery holds the figures of a battery.Model, and the per-step
// constants its methods derive from them, for fastBattery.day.
type fastBattery struct {
	full, minWh, reconnectWh, ncMinWh, ncReconnectWh float64
	chargeEff, dischargeEff                          float64
	maxChargeW, maxDischargeLimit                    float64 // limit: MaxDischargeW × 1 h, +Inf when unlimited
	span, kneeLevel, tauLimited                      float64 // CapacityWh − KneeWh; CapacityWh − span; span / (MaxChargeW × ChargeEff)
	decayLimited                                     float64 // e^(−1 h / tauLimited)
	floorN                                           float64 // max(MinWh, NonCriticalMinWh)
	minEps, ncMinEps                                 float64 // MinWh + ε, NonCriticalMinWh + ε, ε = 1e-12 × CapacityWh
	hiEps                                            float64 // max(minEps, ncMinEps): above it, with both flags off, flags changes nothing
	selfFrac                                         float64 // min(1, SelfDischargePerHour); 0: none
}

// fastBatteryOf returns the fastBattery of m, and whether fastBattery.day
// may step it: every figure finite and both efficiencies above 0.
func fastBatteryOf(m *battery.Model) (fastBattery, bool) {
	for _, v := range [...]float64{m.CapacityWh, m.MinWh, m.ReconnectWh, m.NonCriticalMinWh, m.NonCriticalReconnectWh,
		m.ChargeEff, m.DischargeEff, m.SelfDischargePerHour, m.MaxChargeW, m.MaxDischargeW, m.KneeWh} {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fastBattery{}, false
		}
	}
	if !(m.ChargeEff > 0) || !(m.DischargeEff > 0) {
		return fastBattery{}, false
	}
	eps := 1e-12 * m.CapacityWh
	k := fastBattery{
		full: m.CapacityWh, minWh: m.MinWh, reconnectWh: m.ReconnectWh,
		ncMinWh: m.NonCriticalMinWh, ncReconnectWh: m.NonCriticalReconnectWh,
		chargeEff: m.ChargeEff, dischargeEff: m.DischargeEff,
		maxChargeW: m.MaxChargeW, maxDischargeLimit: math.Inf(1),
		span:   m.CapacityWh - m.KneeWh,
		floorN: max(m.MinWh, m.NonCriticalMinWh),
		minEps: m.MinWh + eps, ncMinEps: m.NonCriticalMinWh + eps,
	}
	k.kneeLevel = k.full - k.span
	k.hiEps = max(k.minEps, k.ncMinEps)
	if m.MaxChargeW > 0 {
		k.tauLimited = k.span / (m.MaxChargeW * m.ChargeEff)
		k.decayLimited = math.Exp(-1.0 / k.tauLimited)
	}
	if m.MaxDischargeW > 0 {
		k.maxDischargeLimit = m.MaxDischargeW
	}
	if m.SelfDischargePerHour > 0 {
		k.selfFrac = min(1, m.SelfDischargePerHour)
	}
	return k, true
}

// fastState is the state of a battery.Model: stored energy and flags.
type fastState struct {
	e          float64
	disc, shed bool
}

func stateOf(m *battery.Model) fastState {
	return fastState{e: m.EnergyWh, disc: m.Disconnected, shed: m.NonCriticalShed}
}

func (st fastState) store(m *battery.Model) {
	m.EnergyWh, m.Disconnected, m.NonCriticalShed = st.e, st.disc, st.shed
}

// flags is battery.Model's disconnect logic (updateFlags) on energy e.
func (k *fastBattery) flags(e float64, disc, shed bool) (bool, bool) {
	if e <= k.minEps {
		disc = true
	} else if disc && e >= k.reconnectWh {
		disc = false
	}
	if k.ncMinWh > 0 {
		if e <= k.ncMinEps || disc {
			shed = true
		} else if shed && e >= k.ncReconnectWh {
			shed = false
		}
	} else {
		shed = disc
	}
	return disc, shed
}

// day is dayByCalls for a battery that fastBatteryOf accepts, in state st:
// the one-hour steps of battery.Model's Charge, Discharge and
// SelfDischarge written out inline, with the same floating-point
// operations in the same order (only products by 1 h and quotients x / x
// = 1 are left out, which are exact), on the state held in registers.
// When rec is not nil, day also records each hour there as dayByCalls
// does (the accepted energy and the losses the methods would return);
// RunDays records, runTotals does not. TestRunDaysInlineMatchesMethods
// checks the records and the end state bit for bit against the methods,
// TestRunTotalsMatchesRunDays runTotals against RunDays.
func (k *fastBattery) day(st *fastState, sp *daySplit, cDay, nDay *[HoursPerDay]float64, rec *batteryHours) (servedC, servedN float64) {
	e, disc, shed := st.e, st.disc, st.shed
	full, ceff, deff, minWh, span := k.full, k.chargeEff, k.dischargeEff, k.minWh, k.span
	limited := k.maxChargeW > 0
	if rec != nil {
		*rec = batteryHours{}
	}
	for h := 0; h < HoursPerDay; h++ {
		sc, sn := sp.sc[h], sp.sn[h]
		if rem := sp.rem[h]; rem > 0 {
			// Charge(rem, 1).
			e0 := e
			if !(full-e0 > 0) {
				if disc || shed || !(e > k.hiEps) {
					disc, shed = k.flags(e, disc, shed)
				}
			} else {
				p, ref := rem, rem
				if limited {
					p = min(p, k.maxChargeW)
					ref = k.maxChargeW
				}
				rate := p * ceff
				en := e0
				if span <= 0 {
					en = min(full, e0+rate)
				} else {
					tLeft := 1.0
					ek := k.kneeLevel // p / ref = 1
					if limited {
						ek = full - (p/ref)*span
					}
					if en < ek {
						if dt := (ek - en) / rate; dt >= tLeft {
							en += rate
							tLeft = 0
						} else {
							en = ek
							tLeft -= dt
						}
					}
					if tLeft > 0 {
						// e^(−tLeft/τ); at the charge limit over the whole
						// hour, the decay of fastBatteryOf.
						decay := k.decayLimited
						if !limited || tLeft != 1 {
							tau := k.tauLimited
							if !limited {
								tau = span / (ref * ceff)
							}
							decay = math.Exp(-tLeft / tau)
						}
						en = full - (full-en)*decay
					}
					if en > full { // min(en, full), likewise for NaN
						en = full
					}
				}
				if inc := en - e0; inc > 0 {
					// Rounding guard: accepted inc / ChargeEff at most rem.
					// Its fix en = e0 + rem × ChargeEff is what the linear
					// step without a charge limit has just computed, so that
					// case, where the test goes either way by rounding, skips
					// it.
					if alt := e0 + rem*ceff; en != alt && inc/ceff > rem {
						en = alt
					}
					e = en
					if disc || shed || !(e > k.hiEps) {
						disc, shed = k.flags(e, disc, shed)
					}
					if rec != nil {
						// Charge's accepted energy and loss; RunDays
						// counts a positive charge only.
						if a := min(inc/ceff, rem); a > 0 {
							rec.acc[h], rec.loss[h] = a, a-(e-e0)
						}
					}
				}
			}
		}
		if rc, rn := cDay[h]-sc, nDay[h]-sn; rc > 0 || rn > 0 {
			// Discharge(rc, rn, 1).
			if !(rc > 0) {
				rc = 0
			}
			if !(rn > 0) {
				rn = 0
			}
			if disc || shed || !(e > k.hiEps) {
				disc, shed = k.flags(e, disc, shed)
			}
			if !disc {
				e0, limit := e, k.maxDischargeLimit
				// min(rc, min(avail, limit)) written as a branch that is
				// nearly always taken the same way, which keeps the stored
				// energy out of the quotient below.
				bc := rc
				if avail := (e0 - minWh) * deff; !(rc <= avail && rc <= limit) {
					bc = min(rc, min(avail, limit))
				}
				if !(bc > 0) {
					bc = 0
				}
				bn := 0.0
				if !shed && rn > 0 {
					if availN := (e0 - bc/deff - k.floorN) * deff; availN > 0 {
						bn = rn
						if !(rn <= availN && rn <= limit-bc) {
							bn = min(rn, min(availN, limit-bc))
						}
						if !(bn > 0) {
							bn = 0
						}
					}
				}
				en := e0 - (bc+bn)/deff
				if en < minWh {
					en = minWh
				}
				e = en
				if disc || shed || !(e > k.hiEps) {
					disc, shed = k.flags(e, disc, shed)
				}
				if rec != nil {
					rec.bc[h], rec.bn[h] = bc, bn
					rec.loss[h] += (e0 - e) - (bc + bn)
				}
				sc += bc
				sn += bn
			}
		}
		// SelfDischarge(1).
		if k.selfFrac > 0 && e > 0 {
			e0 := e
			e -= e * k.selfFrac
			if disc || shed || !(e > k.hiEps) {
				disc, shed = k.flags(e, disc, shed)
			}
			if rec != nil {
				rec.loss[h] += e0 - e
			}
		}
		if rec != nil {
			rec.e[h] = e
		}
		servedC += sc
		servedN += sn
	}
	st.e, st.disc, st.shed = e, disc, shed
	return servedC, servedN
}

// isZero reports whether no RunDays call has written to the ledger yet.
func (l *Ledger) isZero() bool { return *l == Ledger{} }
