package battery

import "math"

// hoursPerMonth is the mean length of a month, 8760 h / 12.
const hoursPerMonth = 8760.0 / 12

// Model is the state-of-charge model the simulation steps: energy counting in
// Wh at the battery terminals, with separate charge and discharge
// efficiencies, a charge-acceptance limit, self-discharge, a low-voltage
// disconnect with reconnect hysteresis and an optional higher threshold for
// shedding non-critical loads.
//
// Every method is cheap: pointer receiver, no allocation, no interface call.
// Every call keeps the energy identity to float rounding:
//
//	Charge:        ΔEnergyWh = acceptedWh − lossWh
//	Discharge:     ΔEnergyWh = −(deliveredCriticalWh + deliveredNonCriticalWh + lossWh)
//	SelfDischarge: ΔEnergyWh = −lossWh
type Model struct {
	// CapacityWh is the installed nameplate energy (Sizing.CapacityWh) times
	// the temperature factor used in the sizing (Sizing.TempFactor): the
	// energy the bank holds when full at its temperature.
	CapacityWh float64
	EnergyWh   float64 // stored energy now
	MinWh      float64 // low-voltage disconnect: CapacityWh × (1 − MaxDoD)
	// ReconnectWh is the hysteresis: after a disconnect, loads come back
	// when EnergyWh ≥ ReconnectWh (≥ MinWh).
	ReconnectWh float64
	// NonCriticalMinWh is the threshold below which non-critical loads are
	// shed (0 = off); they come back at NonCriticalReconnectWh, which lies
	// above it by the same margin as ReconnectWh above MinWh.
	NonCriticalMinWh       float64
	NonCriticalReconnectWh float64
	ChargeEff              float64 // stored / accepted
	DischargeEff           float64 // delivered / stored decrease
	SelfDischargePerHour   float64 // fraction of stored energy per hour
	MaxChargeW             float64 // largest accepted power at the terminals, 0 = unlimited
	MaxDischargeW          float64 // largest delivered power at the terminals, 0 = unlimited
	// KneeWh: above this stored energy the acceptance limit falls linearly
	// to zero at CapacityWh (KneeWh ≥ CapacityWh: no taper).
	KneeWh          float64
	Disconnected    bool // the low-voltage disconnect has tripped
	NonCriticalShed bool // non-critical loads are shed
}

// NewModel builds the Model of bank s. initialSOC is the state of charge at
// the start; reconnectSOC the state of charge at which loads reconnect after a
// low-voltage disconnect (at or below the cut-off 1 − MaxDoD: no
// hysteresis); nonCriticalMinSOC the state of charge below which
// non-critical loads are shed (at or below the cut-off: off). All SOC values
// are fractions of CapacityWh and are clamped to 0..1.
//
// The charge and discharge power limits come from the block's MaxChargeA and
// MaxDischargeA times the strings at the bank voltage (unlimited where the
// block gives none). The chemistry's recommended C-rate window is a sizing
// check (CheckCharge), not a limit of the model. Self-discharge per hour is
// 1 − (1 − monthly)^(1/730), a month being 730 h.
func NewModel(chem Chemistry, s Sizing, blk Block, initialSOC, reconnectSOC, nonCriticalMinSOC float64) Model {
	tf := s.TempFactor
	if !(tf > 0) || math.IsInf(tf, 0) {
		tf = 1
	}
	capWh := s.CapacityWh * tf
	if !(capWh > 0) || math.IsInf(capWh, 0) {
		capWh = 0
	}
	dod := s.MaxDoD
	if dod == 0 {
		dod = chem.MaxDoD
	}
	dod = clamp0(dod)
	m := Model{
		CapacityWh:   capWh,
		EnergyWh:     capWh * clamp0(initialSOC),
		MinWh:        capWh * (1 - dod),
		ChargeEff:    clamp0(chem.ChargeEfficiency),
		DischargeEff: clamp0(chem.DischargeEfficiency),
	}
	m.ReconnectWh = math.Max(m.MinWh, capWh*clamp0(reconnectSOC))
	if nc := capWh * clamp0(nonCriticalMinSOC); nc > m.MinWh {
		m.NonCriticalMinWh = nc
		m.NonCriticalReconnectWh = math.Min(capWh, nc+(m.ReconnectWh-m.MinWh))
	}
	if sd := clamp0(chem.SelfDischargePerMonth); sd > 0 {
		m.SelfDischargePerHour = 1 - math.Pow(1-sd, 1/hoursPerMonth)
	}
	v := s.SystemV
	if !(v > 0) {
		v = blk.NominalV * float64(s.BlocksSeries)
	}
	if blk.MaxChargeA > 0 && s.Strings > 0 && v > 0 {
		m.MaxChargeW = blk.MaxChargeA * float64(s.Strings) * v
	}
	if blk.MaxDischargeA > 0 && s.Strings > 0 && v > 0 {
		m.MaxDischargeW = blk.MaxDischargeA * float64(s.Strings) * v
	}
	m.KneeWh = capWh
	if k := chem.AcceptanceKneeSOC; k > 0 && k < 1 {
		m.KneeWh = capWh * k
	}
	m.updateFlags()
	return m
}

// clamp0 clamps v to 0..1, NaN to 0.
func clamp0(v float64) float64 {
	if !(v > 0) {
		return 0
	}
	if v > 1 {
		return 1
	}
	return v
}

// updateFlags trips or resets the disconnects from the stored energy.
func (m *Model) updateFlags() {
	eps := 1e-12 * m.CapacityWh
	if m.EnergyWh <= m.MinWh+eps {
		m.Disconnected = true
	} else if m.Disconnected && m.EnergyWh >= m.ReconnectWh {
		m.Disconnected = false
	}
	if m.NonCriticalMinWh > 0 {
		if m.EnergyWh <= m.NonCriticalMinWh+eps || m.Disconnected {
			m.NonCriticalShed = true
		} else if m.NonCriticalShed && m.EnergyWh >= m.NonCriticalReconnectWh {
			m.NonCriticalShed = false
		}
	} else {
		m.NonCriticalShed = m.Disconnected
	}
}

// SOC returns the state of charge, EnergyWh / CapacityWh (0 for an empty
// model).
func (m *Model) SOC() float64 {
	if !(m.CapacityWh > 0) {
		return 0
	}
	return m.EnergyWh / m.CapacityWh
}

// Charge offers offeredWh of DC energy at the battery terminals over one step
// of the given hours. It returns the energy taken from the offer (accepted,
// at the terminals) and the loss inside the battery (accepted − stored
// increase); the rest of the offer is not taken.
//
// The acceptance limit is MaxChargeW (unlimited: the offered power) up to
// KneeWh, then falls linearly to zero at CapacityWh. Within the step the
// stored energy follows dE/dt = ChargeEff · min(P, limit(E)) exactly: linear
// while the offer P is below the limit, then an exponential approach to full,
// so the result does not depend on the step length.
func (m *Model) Charge(offeredWh, hours float64) (acceptedWh, lossWh float64) {
	if !(offeredWh > 0) || !(hours > 0) || !(m.ChargeEff > 0) || math.IsInf(offeredWh, 0) || math.IsInf(hours, 0) {
		return 0, 0
	}
	e0, full := m.EnergyWh, m.CapacityWh
	if !(full-e0 > 0) {
		m.updateFlags()
		return 0, 0
	}
	p := offeredWh / hours
	ref := p
	if m.MaxChargeW > 0 {
		p = min(p, m.MaxChargeW)
		ref = m.MaxChargeW
	}
	rate := p * m.ChargeEff
	e := e0
	if span := full - m.KneeWh; span <= 0 {
		e = min(full, e0+rate*hours)
	} else {
		t := hours
		if ek := full - (p/ref)*span; e < ek { // below ek the offer is under the limit
			if dt := (ek - e) / rate; dt >= t {
				e += rate * t
				t = 0
			} else {
				e = ek
				t -= dt
			}
		}
		if t > 0 {
			tau := span / (ref * m.ChargeEff)
			e = full - (full-e)*math.Exp(-t/tau)
		}
		e = min(e, full)
	}
	inc := e - e0
	if !(inc > 0) {
		return 0, 0
	}
	acceptedWh = inc / m.ChargeEff
	if acceptedWh > offeredWh { // rounding guard
		acceptedWh = offeredWh
		e = e0 + offeredWh*m.ChargeEff
	}
	m.EnergyWh = e
	lossWh = acceptedWh - (e - e0)
	m.updateFlags()
	return acceptedWh, lossWh
}

// Discharge asks the bank for criticalWh and nonCriticalWh at the terminals
// over one step of the given hours. Critical loads are served first, down to
// MinWh; non-critical loads only from the energy above NonCriticalMinWh (and
// MinWh), and not while shed. Both share MaxDischargeW. Once the stored energy
// reaches MinWh the disconnect trips and nothing is delivered until EnergyWh
// is back at ReconnectWh (likewise for non-critical loads at
// NonCriticalMinWh / NonCriticalReconnectWh). It returns what it delivers to
// each and the internal loss (stored decrease − delivered).
func (m *Model) Discharge(criticalWh, nonCriticalWh, hours float64) (deliveredCriticalWh, deliveredNonCriticalWh, lossWh float64) {
	if !(criticalWh > 0) {
		criticalWh = 0
	}
	if !(nonCriticalWh > 0) {
		nonCriticalWh = 0
	}
	if !(hours > 0) || !(m.DischargeEff > 0) {
		return 0, 0, 0
	}
	m.updateFlags()
	if m.Disconnected {
		return 0, 0, 0
	}
	e0, eff := m.EnergyWh, m.DischargeEff
	limit := math.Inf(1)
	if m.MaxDischargeW > 0 && !math.IsInf(hours, 0) {
		limit = m.MaxDischargeW * hours
	}
	avail := (e0 - m.MinWh) * eff
	dc := min(criticalWh, min(avail, limit))
	if !(dc > 0) {
		dc = 0
	}
	dn := 0.0
	if !m.NonCriticalShed && nonCriticalWh > 0 {
		floor := max(m.MinWh, m.NonCriticalMinWh)
		if availN := (e0 - dc/eff - floor) * eff; availN > 0 {
			dn = min(nonCriticalWh, min(availN, limit-dc))
			if !(dn > 0) {
				dn = 0
			}
		}
	}
	delivered := dc + dn
	e := e0 - delivered/eff
	if e < m.MinWh {
		e = m.MinWh
	}
	m.EnergyWh = e
	lossWh = (e0 - e) - delivered
	m.updateFlags()
	return dc, dn, lossWh
}

// SelfDischarge removes the self-discharge of a step of the given hours,
// EnergyWh × SelfDischargePerHour × hours (at most all of it), and returns
// it as the loss.
func (m *Model) SelfDischarge(hours float64) (lossWh float64) {
	if !(hours > 0) || !(m.SelfDischargePerHour > 0) || !(m.EnergyWh > 0) {
		return 0
	}
	f := min(1, m.SelfDischargePerHour*hours)
	e0 := m.EnergyWh
	m.EnergyWh = e0 - e0*f
	m.updateFlags()
	return e0 - m.EnergyWh
}
