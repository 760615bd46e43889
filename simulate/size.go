package simulate

import (
	"fmt"
	"math"

	"solstand/array"
	"solstand/battery"
	"solstand/report"
)

// designIrradianceWM2 is the plane irradiance at which the design month's
// cell temperature is taken for the temperature factor: the NOCT conditions
// of IEC 61215 (800 W/m²), with the month's mean daily maximum air
// temperature (common practice for a conservative daytime figure).
const designIrradianceWM2 = 800

// size makes the first, rule-based sizing: battery for autonomy, array for
// the design month after every derate, string layout, controller.
func (d *run) size() error {
	p := d.p
	m := &p.Array.Module
	d.module = array.Module{
		PmaxW: m.PmaxW, VocV: m.VocV, IscA: m.IscA, VmpV: m.VmpV, ImpA: m.ImpA,
		TempCoeffPmaxPctPerC: *m.TempCoeffPmaxPctPerC, TempCoeffIscPctPerC: *m.TempCoeffIscPctPerC,
		NOCTC: *m.NOCTC, MaxSeriesFuseA: *m.MaxSeriesFuseA, MaxSystemV: *m.MaxSystemV,
	}
	if m.TempCoeffVocPctPerC != nil {
		d.module.TempCoeffVocPctPerC = *m.TempCoeffVocPctPerC
	}
	c := &p.Controller
	d.ctrl = array.Controller{Kind: array.MPPT, EfficiencyFraction: *c.EfficiencyFraction, RatingsA: c.RatingsA}
	if c.Kind == "pwm" {
		d.ctrl.Kind = array.PWM
	}
	a := &p.Array
	d.derates = array.Derates{SoilingLoss: *a.SoilingLoss, MismatchLoss: *a.MismatchLoss, WiringLoss: *a.WiringLoss,
		ToleranceLoss: *a.ToleranceLoss, AgeingLossPerYear: *a.AgeingLossPerYear}

	// Battery.
	b := &p.Battery
	d.block = battery.Block{NominalV: b.Block.NominalV, CapacityAh: b.Block.CapacityAh, RatedHours: *b.Block.RatedHours}
	if v := b.Block.InternalResMOhm; v != nil {
		d.block.InternalResistanceMOhm = *v
	}
	if v := b.Block.MaxChargeA; v != nil {
		d.block.MaxChargeA = *v
	}
	if v := b.Block.MaxDischargeA; v != nil {
		d.block.MaxDischargeA = *v
	}
	batTemp := d.airC[argMin(d.airC[:])]
	if b.TempC != nil {
		batTemp = *b.TempC
	}
	E := d.dc.DailyWh[d.dm-1]
	bsz, err := battery.Size(battery.SizingInput{
		DailyDemandWh: E, AutonomyDays: *b.AutonomyDays, MaxDoD: *b.MaxDoD, SystemV: d.systemV,
		TempC: batTemp, DischargeEfficiency: d.chem.DischargeEfficiency, Chem: d.chem, Block: d.block,
	})
	if err != nil {
		return fmt.Errorf("battery: %w", err)
	}
	d.bsz = bsz
	d.systemV = bsz.SystemV // the bank's own nominal voltage (a 51.2 V LiFePO4 module on a 48 V system)
	d.caution(bsz.Cautions...)
	cells := math.Round(d.systemV / d.chem.CellV)
	d.chargeV = cells * d.chem.AbsorptionVPerCell
	d.ctrl.MaxPVVoltageV = defaultMaxPVV(c.MaxPVVoltageV, c.Kind, d.systemV)
	if c.MinMPPTVoltageV != nil {
		d.ctrl.MinMPPTVoltageV = *c.MinMPPTVoltageV
	} else if d.ctrl.Kind == array.MPPT {
		d.ctrl.MinMPPTVoltageV = d.chargeV + 5
	}

	// Array sizing chain.
	cellC := array.CellTempC(d.airMaxC[d.dm-1], designIrradianceWM2, d.module.NOCTC)
	share := d.batteryShare()
	chain := array.SizingChain{
		TemperatureFactor:       array.TemperatureFactor(d.module, cellC),
		Derates:                 d.derates,
		AgeYears:                *a.DesignAgeYears,
		ControllerFactor:        d.ctrl.EfficiencyFraction,
		BatteryShareFraction:    share,
		BatteryChargeEfficiency: d.chem.ChargeEfficiency * d.chem.DischargeEfficiency,
	}
	maxCellC := array.CellTempC(d.recordHighC, 1000, d.module.NOCTC)
	operV := d.chargingV()
	if d.ctrl.Kind == array.PWM {
		// The series count does not depend on the power: lay out first.
		pre, err := array.LayoutStrings(d.module, d.ctrl, d.systemV, d.chargeV, d.recordLowC, maxCellC, d.module.PmaxW)
		if err != nil {
			return fmt.Errorf("array: %w", err)
		}
		chain.ControllerFactor = array.PWMFactor(d.module, designIrradianceWM2, cellC, operV, pre.ModulesSeries) * d.ctrl.EfficiencyFraction
	}
	asz, err := array.RequiredArrayW(E, d.months[d.dm-1].POAKWhM2Day, chain)
	if err != nil {
		return fmt.Errorf("array: %w", err)
	}
	asz.RequiredW *= d.reliabilityFactor
	layout, err := array.LayoutStrings(d.module, d.ctrl, d.systemV, d.chargeV, d.recordLowC, maxCellC, asz.RequiredW)
	if err != nil {
		return fmt.Errorf("array: %w", err)
	}
	d.layout = layout
	d.caution(layout.Cautions...)
	ratedW := float64(layout.Modules) * d.module.PmaxW

	csz, err := array.SizeController(d.ctrl, layout, d.module, ratedW, d.chargeV)
	if err != nil {
		return fmt.Errorf("controller: %w", err)
	}

	// Charge current against the bank.
	var chargeA float64
	if d.ctrl.Kind == array.MPPT {
		chargeA = ratedW * d.ctrl.EfficiencyFraction / d.chargeV
	} else {
		chargeA = d.module.IscA * float64(layout.Strings)
	}
	chk := battery.CheckCharge(d.chem, bsz, d.block, chargeA)
	d.caution(chk.Cautions...)
	site := battery.Site{Indoors: *b.Indoors, RecordLowC: d.recordLowC, BatteryTempC: batTemp}
	if b.RoomVolumeM3 != nil {
		site.RoomVolumeM3 = *b.RoomVolumeM3
	}
	d.caution(battery.Cautions(d.chem, bsz, d.block, site)...)
	scA, _ := battery.ShortCircuitA(d.chem, bsz, d.block)

	// Report.
	ra := &d.r.Array
	ra.Module = report.Module{Name: m.Name, PmaxW: m.PmaxW, VocV: m.VocV, IscA: m.IscA, VmpV: m.VmpV, ImpA: m.ImpA,
		TempCoeffPmaxPctPerC: d.module.TempCoeffPmaxPctPerC, TempCoeffVocPctPerC: d.module.TempCoeffVocPctPerC,
		NOCTC: d.module.NOCTC, MaxSeriesFuseA: d.module.MaxSeriesFuseA}
	const src = "project, or the common-practice default"
	ra.Derates = []report.Derate{
		{Name: "Soiling", Loss: d.derates.SoilingLoss, Source: src},
		{Name: "Module mismatch", Loss: d.derates.MismatchLoss, Source: src},
		{Name: "DC wiring", Loss: d.derates.WiringLoss, Source: src},
		{Name: "Power tolerance", Loss: d.derates.ToleranceLoss, Source: src},
		{Name: fmt.Sprintf("Ageing over %g years", *a.DesignAgeYears), Loss: 1 - d.derates.AgeingFactor(*a.DesignAgeYears), Source: "ageing_loss_per_year × design_age_years"},
	}
	ra.DesignPSH = asz.PeakSunHoursH
	ra.TemperatureFactor = asz.TemperatureFactor
	ra.DerateFactor = asz.SoilingFactor * asz.MismatchFactor * asz.WiringFactor * asz.ToleranceFactor * asz.AgeingFactor
	ra.ControllerFactor = asz.ControllerFactor
	ra.BatteryPathFactor = asz.BatteryPathFactor
	ra.ShareThroughBattery = share
	ra.DesignCellTempC = cellC
	ra.RequiredW = asz.RequiredW
	ra.ReliabilityFactor = d.reliabilityFactor
	ra.RatedW = ratedW
	ra.Modules, ra.ModulesSeries, ra.Strings = layout.Modules, layout.ModulesSeries, layout.Strings
	ra.VocColdV, ra.VmpHotV, ra.MaxCellTempC = layout.VocColdV, layout.VmpHotV, maxCellC

	rb := &d.r.Battery
	*rb = report.Battery{
		Chemistry: string(d.chem.Kind), BlockName: b.Block.Name, BlockV: d.block.NominalV, BlockAh: d.block.CapacityAh,
		RatedHours: d.block.RatedHours, NominalV: d.systemV, AutonomyDays: *b.AutonomyDays, MaxDoD: bsz.MaxDoD,
		TempC: batTemp, TempFactor: bsz.TempFactor, RateFactor: bsz.RateFactor, DischargeEfficiency: bsz.DischargeEfficiency,
		ChargeEfficiency: d.chem.ChargeEfficiency, PeukertExponent: d.chem.PeukertExponent,
		RequiredAh: bsz.RequiredAh, RequiredWh: bsz.RequiredWh, BlocksSeries: bsz.BlocksSeries, Strings: bsz.Strings,
		Blocks: bsz.Blocks, CapacityAh: bsz.CapacityAh, CapacityWh: bsz.CapacityWh, UsableWh: bsz.UsableWh,
		ChargeRateC: chk.ChargeRateC, ShortCircuitA: scA, CalendarLifeYears: d.chem.CalendarLifeYears,
	}
	if d.chem.LeadAcid && *b.Indoors {
		gas := battery.GasCurrentVRLABoostMAPerAh
		if d.chem.Vented {
			gas = battery.GasCurrentVentedBoostMAPerAh
		}
		rb.VentilationM3H = battery.VentilationM3PerH(int(cells)*bsz.Strings, gas, d.block.CapacityAh)
	}
	for _, cp := range d.chem.CycleLife {
		rb.CycleLife = append(rb.CycleLife, report.CyclePoint{DoD: cp.DoD, Cycles: cp.Cycles})
	}

	rc := &d.r.Controller
	margin := array.ControllerMarginFactor
	if d.ctrl.Kind == array.PWM {
		margin = 1.25 * 1.25
	}
	*rc = report.Controller{Kind: d.ctrl.Kind.String(), Efficiency: d.ctrl.EfficiencyFraction, ChargeV: d.chargeV,
		MaxPVVoltageV: d.ctrl.MaxPVVoltageV, Margin: margin, RequiredA: csz.RequiredA, RatedA: csz.RatedA, Units: csz.Units,
		RatingsA: c.RatingsA, LifeYears: *c.LifeYears}
	if len(c.RatingsA) > 0 && csz.Units > 1 {
		d.note("Charge controller: no single listed rating carries %.1f A; %d units of %.0f A share the array.", csz.RequiredA, csz.Units, csz.RatedA)
	}

	// The battery model for the simulation.
	d.model = battery.NewModel(d.chem, bsz, d.block, *b.InitialSOC, *b.ReconnectSOC, *b.NonCritical)
	d.params = Params{ControllerEfficiency: d.ctrl.EfficiencyFraction}
	if csz.RatedA > 0 {
		d.params.ControllerMaxOutWh = csz.RatedA * float64(csz.Units) * d.chargeV
	}
	return nil
}

// batteryShare is the share of the design month's DC demand that must pass
// through the battery: the demand of each clock hour beyond what the mean
// day's PV (in the shape of the representative day's plane irradiation,
// scaled to the day's demand) covers directly.
func (d *run) batteryShare() float64 {
	hs := d.hourlySite()
	var ghiH, poaH [24]float64
	mr := d.months[d.dm-1]
	array.HourlyIrradiation(&hs, mr.DayOfYear, mr.GHIKWhM2Day*1000, &ghiH, &poaH)
	total := 0.0
	for _, v := range poaH {
		total += v
	}
	E := d.dc.DailyWh[d.dm-1]
	if total <= 0 || E <= 0 {
		return 1
	}
	direct := 0.0
	for h := range 24 {
		load := d.dc.CriticalWh[d.dm-1][h] + d.dc.NonCriticalWh[d.dm-1][h]
		direct += math.Min(load, E*poaH[h]/total)
	}
	return math.Max(0, math.Min(1, 1-direct/E))
}

// defaultMaxPVV is the controller's PV voltage limit: given, or the default
// of its kind (MPPT 150 V; PWM 50 V up to 24 V systems and 100 V at 48 V,
// common practice).
func defaultMaxPVV(v *float64, kind string, systemV float64) float64 {
	if v != nil {
		return *v
	}
	if kind == "pwm" {
		if systemV > 24 {
			return 100
		}
		return 50
	}
	return 150
}

func argMin(v []float64) int {
	k := 0
	for i := range v {
		if v[i] < v[k] {
			k = i
		}
	}
	return k
}

// chargingV is the mean battery voltage while charging, halfway between the
// nominal and the charging voltage (common practice): where a PWM controller
// holds the array.
func (d *run) chargingV() float64 { return (d.systemV + d.chargeV) / 2 }
