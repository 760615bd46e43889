// Package battery holds the battery bank of a stand-alone PV system: the
// built-in chemistry figures, the bank sizing for days of autonomy, the
// state-of-charge model the simulation steps, ageing by rainflow counting and
// Miner's rule, and the battery safety cautions.
//
// Every built-in number is marked where it is defined: "common practice" (a
// trade figure without a citable source), "from memory" (recalled, not read
// from the source) or the standard that gives it. The package prints nothing,
// holds no mutable global state and never panics on input.
package battery

import (
	"fmt"
	"math"
)

// Kind names a battery chemistry.
type Kind string

// The built-in chemistries.
const (
	Flooded Kind = "flooded" // vented (flooded) lead-acid
	AGM     Kind = "agm"     // valve-regulated lead-acid, absorbed glass mat
	Gel     Kind = "gel"     // valve-regulated lead-acid, gelled electrolyte
	LiFePO4 Kind = "lifepo4" // lithium iron phosphate
)

// Kinds lists the built-in chemistries in a fixed order.
func Kinds() []Kind { return []Kind{Flooded, AGM, Gel, LiFePO4} }

// Valid reports whether k is one of the built-in chemistries.
func (k Kind) Valid() bool {
	switch k {
	case Flooded, AGM, Gel, LiFePO4:
		return true
	}
	return false
}

// IsLeadAcid reports whether k is one of the lead-acid kinds.
func (k Kind) IsLeadAcid() bool { return k == Flooded || k == AGM || k == Gel }

// CyclePoint is one point of a cycle-life curve: the number of cycles to end
// of life when every cycle goes to the depth of discharge DoD (fraction 0..1).
type CyclePoint struct {
	DoD    float64 `json:"dod"`
	Cycles float64 `json:"cycles"`
}

// Chemistry holds the figures of one battery chemistry. All fractions are
// 0..1. The efficiencies are energy (Wh) efficiencies of one direction, since
// the state-of-charge Model counts energy; their product is the round trip.
type Chemistry struct {
	Kind Kind `json:"kind"`

	MaxDoD                float64 `json:"max_dod"`                  // recommended maximum depth of discharge
	ChargeEfficiency      float64 `json:"charge_efficiency"`        // stored / accepted at the terminals
	DischargeEfficiency   float64 `json:"discharge_efficiency"`     // delivered at the terminals / stored decrease
	SelfDischargePerMonth float64 `json:"self_discharge_per_month"` // fraction of stored energy lost per month at 25 °C

	CycleLife         []CyclePoint `json:"cycle_life"`          // cycles to end of life against depth of discharge
	CalendarLifeYears float64      `json:"calendar_life_years"` // life at 25 °C with light cycling

	// Charge and discharge rates as multiples of the capacity in Ah per hour
	// (C-rates). ChargeMinC and ChargeMaxC bound the recommended charge
	// current window; DischargeMaxC is the highest recommended continuous
	// discharge rate; DischargeMinC is 0 for every built-in chemistry (no lower
	// limit), kept for custom data.
	ChargeMinC    float64 `json:"charge_min_c"`
	ChargeMaxC    float64 `json:"charge_max_c"`
	DischargeMinC float64 `json:"discharge_min_c"`
	DischargeMaxC float64 `json:"discharge_max_c"`

	// Temperature limits of the cell for charging and discharging, °C.
	ChargeMinTempC    float64 `json:"charge_min_temp_c"`
	ChargeMaxTempC    float64 `json:"charge_max_temp_c"`
	DischargeMinTempC float64 `json:"discharge_min_temp_c"`
	DischargeMaxTempC float64 `json:"discharge_max_temp_c"`

	// Voltages per cell at 25 °C; EqualisationVPerCell is 0 where the
	// chemistry is not equalised. TempCompMVPerCellPerC is the charge-voltage
	// temperature compensation in mV per cell per kelvin (negative: lower
	// voltage when warmer); 0 where none is used.
	CellV                 float64 `json:"cell_v"`
	AbsorptionVPerCell    float64 `json:"absorption_v_per_cell"`
	FloatVPerCell         float64 `json:"float_v_per_cell"`
	EqualisationVPerCell  float64 `json:"equalisation_v_per_cell"`
	TempCompMVPerCellPerC float64 `json:"temp_comp_mv_per_cell_per_c"`

	// AcceptanceKneeSOC is the state of charge above which charge acceptance
	// tapers (lead-acid about 0.85, LiFePO4 about 0.95).
	AcceptanceKneeSOC float64 `json:"acceptance_knee_soc"`

	LeadAcid bool `json:"lead_acid"` // lead-acid electrolyte: freezes, gasses hydrogen
	Vented   bool `json:"vented"`    // vented (flooded) cells: water loss, more gas

	PeukertExponent float64 `json:"peukert_exponent"` // default Peukert exponent for the kind
}

// Defaults returns the built-in figures of chemistry k. Every figure is
// marked beside its value: "common practice", "from memory", or the standard
// it comes from. The cycle-life curves are typical of data sheets of each
// kind (from memory); a project should override them with its block's data
// sheet. IEC 61427-1 defines how PV storage batteries are tested (cycling at
// low state of charge) but prescribes none of these values; IEEE 1013 gives
// the sizing practice (depth of discharge, autonomy) that Size follows.
func Defaults(k Kind) (Chemistry, error) {
	switch k {
	case Flooded:
		return Chemistry{
			Kind:                  Flooded,
			MaxDoD:                0.5,  // common practice for deep-cycle flooded banks in PV
			ChargeEfficiency:      0.85, // from memory: Wh round trip about 0.80 for flooded lead-acid
			DischargeEfficiency:   0.95, // from memory
			SelfDischargePerMonth: 0.05, // from memory: 3–5 %/month at 25 °C (antimony grids)
			CycleLife: []CyclePoint{ // from memory: typical deep-cycle flooded data sheet
				{DoD: 0.2, Cycles: 3000}, {DoD: 0.5, Cycles: 1500}, {DoD: 0.8, Cycles: 800}, {DoD: 1.0, Cycles: 500},
			},
			CalendarLifeYears:     12,   // from memory: tubular-plate flooded, 25 °C
			ChargeMinC:            0.05, // common practice: C/20 at least, so the bank can be fully recharged
			ChargeMaxC:            0.2,  // common practice: C/5 at most
			DischargeMaxC:         0.25, // from memory
			ChargeMinTempC:        -20,  // from memory
			ChargeMaxTempC:        50,   // from memory
			DischargeMinTempC:     -20,  // from memory
			DischargeMaxTempC:     50,   // from memory
			CellV:                 2.0,  // common practice: nominal lead-acid cell
			AbsorptionVPerCell:    2.45, // from memory: 2.40–2.47 V/cell
			FloatVPerCell:         2.25, // from memory: 2.23–2.27 V/cell
			EqualisationVPerCell:  2.55, // from memory: 2.50–2.60 V/cell, vented cells only
			TempCompMVPerCellPerC: -5,   // common practice: −3 to −5 mV/cell/K
			AcceptanceKneeSOC:     0.85, // common practice: acceptance tapers above 80–90 %
			LeadAcid:              true,
			Vented:                true,
			PeukertExponent:       1.25, // from memory: 1.2–1.3 for flooded
		}, nil
	case AGM:
		return Chemistry{
			Kind:                  AGM,
			MaxDoD:                0.5,  // common practice
			ChargeEfficiency:      0.90, // from memory
			DischargeEfficiency:   0.95, // from memory
			SelfDischargePerMonth: 0.03, // from memory: 1–3 %/month at 25 °C
			CycleLife: []CyclePoint{ // from memory: typical AGM data sheet
				{DoD: 0.2, Cycles: 2000}, {DoD: 0.5, Cycles: 800}, {DoD: 0.8, Cycles: 450}, {DoD: 1.0, Cycles: 300},
			},
			CalendarLifeYears:     8,    // from memory: AGM design life at 25 °C
			ChargeMinC:            0.05, // common practice: C/20
			ChargeMaxC:            0.2,  // common practice: C/5
			DischargeMaxC:         0.5,  // from memory
			ChargeMinTempC:        -20,  // from memory
			ChargeMaxTempC:        50,   // from memory
			DischargeMinTempC:     -20,  // from memory
			DischargeMaxTempC:     50,   // from memory
			CellV:                 2.0,  // common practice
			AbsorptionVPerCell:    2.40, // from memory: 2.35–2.45 V/cell
			FloatVPerCell:         2.27, // from memory: 2.25–2.30 V/cell
			EqualisationVPerCell:  0,    // valve-regulated: not equalised (common practice)
			TempCompMVPerCellPerC: -4,   // common practice: −3 to −5 mV/cell/K
			AcceptanceKneeSOC:     0.85, // common practice
			LeadAcid:              true,
			Vented:                false,
			PeukertExponent:       1.10, // from memory: 1.05–1.15
		}, nil
	case Gel:
		return Chemistry{
			Kind:                  Gel,
			MaxDoD:                0.5,  // common practice
			ChargeEfficiency:      0.88, // from memory
			DischargeEfficiency:   0.95, // from memory
			SelfDischargePerMonth: 0.03, // from memory: 1–3 %/month at 25 °C
			CycleLife: []CyclePoint{ // from memory: typical tubular gel data sheet
				{DoD: 0.2, Cycles: 3000}, {DoD: 0.5, Cycles: 1200}, {DoD: 0.8, Cycles: 700}, {DoD: 1.0, Cycles: 500},
			},
			CalendarLifeYears:     12,   // from memory: tubular gel design life at 20–25 °C
			ChargeMinC:            0.05, // common practice: C/20
			ChargeMaxC:            0.2,  // common practice: C/5
			DischargeMaxC:         0.25, // from memory
			ChargeMinTempC:        -20,  // from memory
			ChargeMaxTempC:        45,   // from memory
			DischargeMinTempC:     -20,  // from memory
			DischargeMaxTempC:     50,   // from memory
			CellV:                 2.0,  // common practice
			AbsorptionVPerCell:    2.35, // from memory: 2.33–2.40 V/cell
			FloatVPerCell:         2.25, // from memory: 2.23–2.27 V/cell
			EqualisationVPerCell:  0,    // valve-regulated: not equalised (common practice)
			TempCompMVPerCellPerC: -4,   // common practice
			AcceptanceKneeSOC:     0.85, // common practice
			LeadAcid:              true,
			Vented:                false,
			PeukertExponent:       1.12, // from memory: 1.1–1.15
		}, nil
	case LiFePO4:
		return Chemistry{
			Kind:                  LiFePO4,
			MaxDoD:                0.8,  // common practice: 80–90 % for long life
			ChargeEfficiency:      0.97, // from memory: Wh round trip about 0.95
			DischargeEfficiency:   0.98, // from memory
			SelfDischargePerMonth: 0.03, // from memory: cells 1–3 %/month, plus the BMS draw
			CycleLife: []CyclePoint{ // from memory: typical LiFePO4 data sheet
				{DoD: 0.2, Cycles: 15000}, {DoD: 0.5, Cycles: 6000}, {DoD: 0.8, Cycles: 4000}, {DoD: 1.0, Cycles: 3000},
			},
			CalendarLifeYears:     15,   // from memory
			ChargeMinC:            0,    // no lower limit: no sulphation, full charge not required (common practice)
			ChargeMaxC:            0.5,  // from memory: typical recommended charge rate
			DischargeMaxC:         1.0,  // from memory
			ChargeMinTempC:        0,    // common practice: LiFePO4 is not charged below 0 °C
			ChargeMaxTempC:        45,   // from memory
			DischargeMinTempC:     -20,  // from memory
			DischargeMaxTempC:     60,   // from memory
			CellV:                 3.2,  // common practice: nominal LiFePO4 cell
			AbsorptionVPerCell:    3.55, // from memory: 3.45–3.65 V/cell
			FloatVPerCell:         3.40, // from memory: 3.35–3.45 V/cell
			EqualisationVPerCell:  0,    // never equalised (common practice)
			TempCompMVPerCellPerC: 0,    // no temperature compensation (common practice)
			AcceptanceKneeSOC:     0.95, // common practice: constant-current almost to full
			LeadAcid:              false,
			Vented:                false,
			PeukertExponent:       1.05, // from memory: 1.02–1.07
		}, nil
	}
	return Chemistry{}, fmt.Errorf("battery chemistry %q: unknown (want flooded, agm, gel or lifepo4)", string(k))
}

// Validate checks that the figures of c are usable by Size and the Model.
func (c Chemistry) Validate() error {
	frac := func(name string, v float64, zeroOK bool) error {
		if math.IsNaN(v) || v < 0 || v > 1 || (!zeroOK && v == 0) {
			return fmt.Errorf("battery chemistry %s: %v is not a fraction in (0, 1]", name, v)
		}
		return nil
	}
	for _, e := range []error{
		frac("max_dod", c.MaxDoD, false),
		frac("charge_efficiency", c.ChargeEfficiency, false),
		frac("discharge_efficiency", c.DischargeEfficiency, false),
		frac("self_discharge_per_month", c.SelfDischargePerMonth, true),
		frac("acceptance_knee_soc", c.AcceptanceKneeSOC, true),
	} {
		if e != nil {
			return e
		}
	}
	for i, p := range c.CycleLife {
		if !(p.DoD > 0 && p.DoD <= 1) || !(p.Cycles > 0) || math.IsInf(p.Cycles, 0) {
			return fmt.Errorf("battery chemistry cycle_life[%d]: want 0 < dod ≤ 1 and cycles > 0, got dod %v cycles %v", i, p.DoD, p.Cycles)
		}
	}
	if math.IsNaN(c.CalendarLifeYears) || c.CalendarLifeYears < 0 {
		return fmt.Errorf("battery chemistry calendar_life_years: %v is negative", c.CalendarLifeYears)
	}
	if math.IsNaN(c.PeukertExponent) || (c.PeukertExponent != 0 && (c.PeukertExponent < 1 || c.PeukertExponent > 2)) {
		return fmt.Errorf("battery chemistry peukert_exponent: %v is outside 1..2", c.PeukertExponent)
	}
	return nil
}

// FreezingPointC returns the temperature at which the electrolyte of a
// lead-acid battery at state of charge soc (0..1, clamped) freezes, and true.
// The points are common practice, from memory (SOURCES.md): −57 °C fully
// charged, −25 °C at 50 %, −7 °C fully discharged, interpolated linearly in
// state of charge. For LiFePO4 (and any kind that is not lead-acid) the
// electrolyte does not freeze in the range of outdoor temperatures; the
// function returns −Inf and false.
func FreezingPointC(k Kind, soc float64) (tempC float64, freezes bool) {
	if !k.IsLeadAcid() {
		return math.Inf(-1), false
	}
	if math.IsNaN(soc) {
		soc = 0 // the worst case: a discharged bank freezes first
	}
	return interpolate(freezingTable[:], clamp(soc, 0, 1)), true
}

// freezingTable maps state of charge to freezing point in °C (common
// practice, from memory, SOURCES.md).
var freezingTable = [...]point{{0, -7}, {0.5, -25}, {1, -57}}

// ieee485 is the IEEE 485 table of cell-size correction factors for vented
// lead-acid cells against electrolyte temperature (°F converted to °C, 0.1 K
// rounding as printed). Values from memory; SOURCES.md lists 25 °C 1.00,
// 15.6 °C 1.11, 10 °C 1.19, 4.4 °C 1.30 (±1 %).
var ieee485 = [...]point{
	{-3.9, 1.520}, {-1.1, 1.430}, {1.7, 1.350}, {4.4, 1.300}, {7.2, 1.250},
	{10.0, 1.190}, {12.8, 1.150}, {15.6, 1.110}, {18.3, 1.080}, {21.1, 1.040},
	{23.9, 1.011}, {25.0, 1.000}, {26.7, 0.980}, {29.4, 0.960}, {32.2, 0.940},
	{35.0, 0.930}, {37.8, 0.910}, {40.6, 0.890}, {43.3, 0.880}, {46.1, 0.870},
	{48.9, 0.860}, {51.7, 0.850},
}

// lfpTemp maps cell temperature to the fraction of the 25 °C capacity a
// LiFePO4 battery delivers (from memory, typical data sheets; no credit
// above 25 °C).
var lfpTemp = [...]point{{-30, 0.55}, {-20, 0.70}, {-10, 0.80}, {0, 0.90}, {10, 0.96}, {25, 1.0}}

// TemperatureFactor returns the capacity available at tempC as a fraction of
// the capacity at 25 °C.
//
// Lead-acid (all three kinds): 1/F, with F the cell-size correction factor of
// IEEE 485 (table of correction factors for vented lead-acid, used here for
// valve-regulated cells as well), interpolated linearly in temperature.
// Below the table's lowest entry (−3.9 °C) F is extrapolated with the slope of
// its two coldest entries, down to −40 °C; above 51.7 °C it is held. The
// result exceeds 1 above 25 °C; Size does not credit that.
//
// LiFePO4: a common-practice curve (from memory, typical data sheets): 0.70
// at −20 °C, 0.80 at −10 °C, 0.90 at 0 °C, 0.96 at 10 °C, 1.0 from 25 °C up;
// held outside −30..25 °C.
//
// A kind that is not built in is treated as lead-acid (the larger correction).
func TemperatureFactor(k Kind, tempC float64) float64 {
	if math.IsNaN(tempC) {
		return math.NaN()
	}
	if k == LiFePO4 {
		return interpolate(lfpTemp[:], tempC)
	}
	t := math.Max(tempC, -40)
	var f float64
	if t < ieee485[0].x {
		a, b := ieee485[0], ieee485[1]
		f = a.y + (t-a.x)*(b.y-a.y)/(b.x-a.x)
	} else {
		f = interpolate(ieee485[:], t)
	}
	return 1 / f
}

// PeukertCapacityAh returns the capacity a battery rated ratedAh at a
// discharge of ratedHours delivers when discharged at constant current over
// dischargeHours, by Peukert's law (Peukert 1897), I^k·t = constant, in the
// usual textbook form: C_T = C_H · (T/H)^(1 − 1/k). A longer discharge than
// the rating gives more, a shorter one less. It returns NaN on inputs that are
// not positive (exponent must be ≥ 1).
func PeukertCapacityAh(ratedAh, ratedHours, dischargeHours, exponent float64) float64 {
	if !(ratedAh > 0) || !(ratedHours > 0) || !(dischargeHours > 0) || !(exponent >= 1) ||
		math.IsInf(ratedHours, 0) || math.IsInf(dischargeHours, 0) || math.IsInf(exponent, 0) {
		return math.NaN()
	}
	return ratedAh * math.Pow(dischargeHours/ratedHours, 1-1/exponent)
}

// point is one (x, y) entry of a piecewise-linear table.
type point struct{ x, y float64 }

// interpolate evaluates the piecewise-linear table tab (x ascending) at x,
// holding the end values outside it.
func interpolate(tab []point, x float64) float64 {
	if x <= tab[0].x {
		return tab[0].y
	}
	for i := 1; i < len(tab); i++ {
		if x <= tab[i].x {
			a, b := tab[i-1], tab[i]
			return a.y + (x-a.x)*(b.y-a.y)/(b.x-a.x)
		}
	}
	return tab[len(tab)-1].y
}

func clamp(v, lo, hi float64) float64 {
	if v < lo {
		return lo
	}
	if v > hi {
		return hi
	}
	return v
}
