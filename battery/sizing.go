package battery

import (
	"fmt"
	"math"

	"solstand/caution"
)

// Block is the data sheet of one battery block (a cell or a monobloc). Zero
// in an optional field means "not given".
type Block struct {
	NominalV               float64 `json:"nominal_v"`                // nominal voltage of one block, V
	CapacityAh             float64 `json:"capacity_ah"`              // rated capacity at RatedHours, Ah
	RatedHours             float64 `json:"rated_hours"`              // discharge time of the rating, h (0: no rate correction)
	InternalResistanceMOhm float64 `json:"internal_resistance_mohm"` // of one block, mΩ (0: not given)
	MaxChargeA             float64 `json:"max_charge_a"`             // of one block, A (0: not given)
	MaxDischargeA          float64 `json:"max_discharge_a"`          // of one block, A (0: not given)
}

// SizingInput is what Size needs. Zero in MaxDoD or DischargeEfficiency
// takes the chemistry's figure; zero AutonomyHours takes AutonomyDays × 24.
type SizingInput struct {
	DailyDemandWh float64 // design-month DC-side energy per day taken from the bank, Wh
	AutonomyDays  float64 // days the bank alone carries the load
	MaxDoD        float64 // maximum depth of discharge, fraction (0: chemistry default)
	SystemV       float64 // nominal DC system voltage, V
	TempC         float64 // where the bank stands (the coldest month's temperature), °C
	AutonomyHours float64 // discharge duration for the rate factor, h (0: AutonomyDays × 24)
	// DischargeEfficiency of the discharge path from stored energy to the DC
	// bus, fraction (0: the chemistry's DischargeEfficiency).
	DischargeEfficiency float64
	// CreditLongDischarge lets the rate factor exceed 1 when the autonomy
	// discharge is longer than the block's rated hours. Off by default:
	// Peukert's law extrapolated far beyond the rating overstates the gain
	// (common practice is not to take credit for it).
	CreditLongDischarge bool
	Chem                Chemistry
	Block               Block
}

// Sizing is the bank Size lays out.
type Sizing struct {
	RequiredAh          float64 // capacity the method asks for, before rounding to whole blocks, Ah
	RequiredWh          float64 // RequiredAh × SystemV, Wh
	MaxDoD              float64 // depth of discharge used, fraction
	SystemV             float64 // nominal bank voltage, V
	DischargeEfficiency float64 // discharge-path efficiency used, fraction
	AutonomyHours       float64 // discharge duration used for the rate factor, h
	TempFactor          float64 // temperature factor in the divisor (≤ 1: no credit above 25 °C)
	RateFactor          float64 // rate factor in the divisor (≤ 1 unless CreditLongDischarge)

	BlocksSeries int // blocks in series per string
	Strings      int // strings in parallel
	Blocks       int // BlocksSeries × Strings

	CapacityAh float64 // installed, at the block's rated hours, Ah
	CapacityWh float64 // CapacityAh × SystemV, Wh
	// UsableWh = CapacityWh × MaxDoD × TempFactor: the energy above the
	// depth-of-discharge limit at the bank's temperature, before the rate
	// factor and the discharge efficiency.
	UsableWh float64
	Cautions []caution.Caution
}

// maxParallelStrings is the most strings in parallel before a caution
// (common practice: beyond three, current sharing becomes unequal and every
// string needs its own fuse).
const maxParallelStrings = 3

// Size lays out a battery bank for days of autonomy, the method of the
// stand-alone sizing practice (IEEE 1013; Sandia, Stand-Alone Photovoltaic
// Systems: A Handbook of Recommended Design Practices, 1995):
//
//	required_ah = E × days / (DoD × temp factor × rate factor × discharge efficiency) / V
//
// The temperature factor is TemperatureFactor at in.TempC (IEEE 485 for
// lead-acid), capped at 1. The rate factor is Peukert's (1897) ratio
// PeukertCapacityAh(1, rated hours, autonomy hours, k), capped at 1 unless
// CreditLongDischarge; it is 1 when the block gives no rated hours. Blocks in
// series = V / block V (an error unless whole); strings = ceil(required Ah /
// block Ah), at least 1. The chemistry must pass Chemistry.Validate.
func Size(in SizingInput) (Sizing, error) {
	var s Sizing
	if err := finite([]named{{"daily_demand_wh", in.DailyDemandWh}, {"autonomy_days", in.AutonomyDays},
		{"system_v", in.SystemV}, {"temp_c", in.TempC}}); err != nil {
		return s, err
	}
	if in.DailyDemandWh < 0 {
		return s, fmt.Errorf("battery sizing: daily demand %v Wh is negative", in.DailyDemandWh)
	}
	if !(in.AutonomyDays > 0) {
		return s, fmt.Errorf("battery sizing: autonomy %v days must be positive", in.AutonomyDays)
	}
	if !(in.SystemV > 0) {
		return s, fmt.Errorf("battery sizing: system voltage %v V must be positive", in.SystemV)
	}
	if err := in.Chem.Validate(); err != nil {
		return s, fmt.Errorf("battery sizing: %w", err)
	}
	b := in.Block
	if !(b.NominalV > 0) || math.IsInf(b.NominalV, 0) {
		return s, fmt.Errorf("battery sizing: block voltage %v V must be positive", b.NominalV)
	}
	if !(b.CapacityAh > 0) || math.IsInf(b.CapacityAh, 0) {
		return s, fmt.Errorf("battery sizing: block capacity %v Ah must be positive", b.CapacityAh)
	}
	if math.IsNaN(b.RatedHours) || b.RatedHours < 0 || math.IsInf(b.RatedHours, 0) {
		return s, fmt.Errorf("battery sizing: block rated hours %v must be positive (or 0 for none)", b.RatedHours)
	}
	dod := in.MaxDoD
	if dod == 0 {
		dod = in.Chem.MaxDoD
	}
	if !(dod > 0 && dod <= 1) {
		return s, fmt.Errorf("battery sizing: maximum depth of discharge %v is not in (0, 1]", dod)
	}
	eff := in.DischargeEfficiency
	if eff == 0 {
		eff = in.Chem.DischargeEfficiency
	}
	if !(eff > 0 && eff <= 1) {
		return s, fmt.Errorf("battery sizing: discharge efficiency %v is not in (0, 1]", eff)
	}
	hours := in.AutonomyHours
	if hours == 0 {
		hours = in.AutonomyDays * 24
	}
	if !(hours > 0) || math.IsInf(hours, 0) {
		return s, fmt.Errorf("battery sizing: autonomy hours %v must be positive", hours)
	}

	series := in.SystemV / b.NominalV
	n := math.Round(series)
	// Blocks whose nominal voltage is not a divisor of the system voltage
	// still make its bank when the string lands within 10 % of it (four
	// 3.2 V LiFePO4 cells for 12 V, a 51.2 V module for 48 V; common
	// practice); the bank's own nominal voltage is then used for energy.
	if n < 1 || math.Abs(series-n) > 0.1*n {
		return s, fmt.Errorf("battery sizing: system voltage %v V is not a whole number of %v V blocks", in.SystemV, b.NominalV)
	}
	in.SystemV = n * b.NominalV

	tf := math.Min(1, TemperatureFactor(in.Chem.Kind, in.TempC))
	rf := 1.0
	if b.RatedHours > 0 {
		k := in.Chem.PeukertExponent
		if k == 0 {
			k = 1
		}
		rf = PeukertCapacityAh(1, b.RatedHours, hours, k)
		if math.IsNaN(rf) {
			return s, fmt.Errorf("battery sizing: Peukert exponent %v must be ≥ 1", k)
		}
		if !in.CreditLongDischarge {
			rf = math.Min(rf, 1)
		}
	}

	s.MaxDoD, s.SystemV, s.DischargeEfficiency, s.AutonomyHours = dod, in.SystemV, eff, hours
	s.TempFactor, s.RateFactor = tf, rf
	s.RequiredWh = in.DailyDemandWh * in.AutonomyDays / (dod * tf * rf * eff)
	s.RequiredAh = s.RequiredWh / in.SystemV
	s.BlocksSeries = int(n)
	strings := math.Ceil(s.RequiredAh/b.CapacityAh - 1e-9)
	if strings < 1 {
		strings = 1
	}
	if strings > 1e6 {
		return s, fmt.Errorf("battery sizing: %v strings of %v Ah blocks is not a bank", strings, b.CapacityAh)
	}
	s.Strings = int(strings)
	s.Blocks = s.BlocksSeries * s.Strings
	s.CapacityAh = float64(s.Strings) * b.CapacityAh
	s.CapacityWh = s.CapacityAh * in.SystemV
	s.UsableWh = s.CapacityWh * dod * tf

	if s.Strings > maxParallelStrings {
		s.Cautions = append(s.Cautions, caution.Caution{
			Code:     "battery-many-strings",
			Severity: caution.Warning,
			Message: fmt.Sprintf("The bank has %d strings in parallel. Beyond %d, the strings share current unequally and age unevenly; "+
				"fuse every string and wire them with equal cable lengths, or choose larger blocks (common practice).", s.Strings, maxParallelStrings),
		})
	}
	if in.TempC < in.Chem.DischargeMinTempC && in.Chem.DischargeMinTempC != 0 {
		s.Cautions = append(s.Cautions, caution.Caution{
			Code:     "battery-too-cold",
			Severity: caution.Warning,
			Message: fmt.Sprintf("The bank stands at %.0f °C, below the %.0f °C discharge limit of %s cells; insulate or heat the enclosure.",
				in.TempC, in.Chem.DischargeMinTempC, in.Chem.Kind),
		})
	}
	if in.Chem.DischargeMaxTempC != 0 && in.TempC > in.Chem.DischargeMaxTempC {
		s.Cautions = append(s.Cautions, caution.Caution{
			Code:     "battery-too-hot",
			Severity: caution.Warning,
			Message: fmt.Sprintf("The bank stands at %.0f °C, above the %.0f °C limit of %s cells; shade and ventilate the enclosure.",
				in.TempC, in.Chem.DischargeMaxTempC, in.Chem.Kind),
		})
	}
	return s, nil
}

type named struct {
	name string
	v    float64
}

func finite(vs []named) error {
	for _, v := range vs {
		if math.IsNaN(v.v) || math.IsInf(v.v, 0) {
			return fmt.Errorf("battery sizing: %s is %v", v.name, v.v)
		}
	}
	return nil
}

// ChargeCheck is the result of CheckCharge.
type ChargeCheck struct {
	ChargeRateC float64 // the array's largest charge current over the bank capacity in Ah, 1/h
	Cautions    []caution.Caution
}

// CheckCharge compares the array's largest charge current maxArrayChargeA
// (A, at the bank) with the bank: against the chemistry's recommended window
// ChargeMinC..ChargeMaxC (common practice for lead-acid: C/20 to C/5, so the
// bank is fully recharged without overheating), and against the maximum
// charge current of the blocks (per string).
func CheckCharge(chem Chemistry, s Sizing, blk Block, maxArrayChargeA float64) ChargeCheck {
	var c ChargeCheck
	if !(s.CapacityAh > 0) || math.IsNaN(maxArrayChargeA) || maxArrayChargeA < 0 {
		return c
	}
	c.ChargeRateC = maxArrayChargeA / s.CapacityAh
	if chem.ChargeMinC > 0 && c.ChargeRateC < chem.ChargeMinC {
		c.Cautions = append(c.Cautions, caution.Caution{
			Code:     "battery-charge-rate-low",
			Severity: caution.Warning,
			Message: fmt.Sprintf("The array charges the bank at C/%.0f at most, below C/%.0f: a lead-acid bank that is not fully recharged sulphates "+
				"and loses capacity (common practice). Add array power or reduce the bank.", 1/c.ChargeRateC, 1/chem.ChargeMinC),
		})
	}
	if chem.ChargeMaxC > 0 && c.ChargeRateC > chem.ChargeMaxC {
		c.Cautions = append(c.Cautions, caution.Caution{
			Code:     "battery-charge-rate-high",
			Severity: caution.Warning,
			Message: fmt.Sprintf("The array can charge the bank at %.2fC, above the %.2fC the %s chemistry is recommended for; "+
				"limit the controller's charge current.", c.ChargeRateC, chem.ChargeMaxC, chem.Kind),
		})
	}
	if blk.MaxChargeA > 0 && s.Strings > 0 {
		perString := maxArrayChargeA / float64(s.Strings)
		if perString > blk.MaxChargeA {
			c.Cautions = append(c.Cautions, caution.Caution{
				Code:     "battery-charge-current-over-block",
				Severity: caution.Danger,
				Message: fmt.Sprintf("Each string may receive %.1f A of charge current, above the %.1f A maximum of the block; "+
					"set the controller's charge-current limit to %.1f A or less.", perString, blk.MaxChargeA, blk.MaxChargeA*float64(s.Strings)),
			})
		}
	}
	return c
}
