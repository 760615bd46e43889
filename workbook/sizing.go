package workbook

import (
	"fmt"
	"math"
	"strings"

	"github.com/xuri/excelize/v2"

	"solstand/report"
)

// The Inputs sheet: every editable input in one styled, unlocked cell with a
// validation and a note carrying its unit; each a workbook-scope defined name.
func (b *builder) inputsSheet() error {
	r := b.r
	g := newGrid(SheetInputs)
	g.width(1, 44)
	g.width(2, 14)
	g.width(3, 12)
	g.width(4, 70)
	g.text(1, 1, "Design inputs", b.st.title)
	g.text(1, 2, "Yellow cells are inputs: change them and every sizing result recalculates. Other sheets are protected (no password) against accidental edits.", b.st.note)
	g.freeze = 3
	g.headers(3, b.st.header, "Input", "Value", "Unit", "Note")
	row := 4
	section := func(t string) {
		row++
		g.text(1, row, t, b.st.subtitle)
		row++
	}
	var specs []struct {
		inputSpec
		row int
	}
	add := func(s inputSpec) {
		g.text(1, row, s.label, b.st.label)
		st := b.st.input
		if s.integer {
			st = b.st.inputInt
		}
		g.num(2, row, s.value, st)
		g.text(3, row, s.unit, b.st.text)
		g.text(4, row, s.note, b.st.textWrap)
		if s.name != "" {
			b.define(s.name, SheetInputs, 2, row)
		}
		specs = append(specs, struct {
			inputSpec
			row int
		}{s, row})
		row++
	}
	section("Battery bank")
	add(inputSpec{"autonomy_days", "Days of autonomy", r.Battery.AutonomyDays, "days", "Days the bank carries the design-month load without sun.", false, 0.1, 60})
	add(inputSpec{"max_dod", "Maximum depth of discharge", r.Battery.MaxDoD, "fraction", "Deepest allowed discharge, 0–1.", false, 0.05, 1})
	add(inputSpec{"system_v", "System (bank) voltage", r.Battery.NominalV, "V", "Nominal DC voltage of the bank.", false, 1, 2000})
	add(inputSpec{"block_v", "Block voltage", r.Battery.BlockV, "V", "Nominal voltage of one battery block.", false, 0.1, 2000})
	add(inputSpec{"block_ah", "Block capacity", r.Battery.BlockAh, "Ah", fmt.Sprintf("Capacity of one block at its %g h rate.", r.Battery.RatedHours), false, 0.1, 1e6})
	section("PV array")
	add(inputSpec{"module_pmax_w", "Module rated power (STC)", r.Array.Module.PmaxW, "W", "Rated power of one module at STC (IEC 60904-3).", false, 1, 5000})
	add(inputSpec{"module_isc_a", "Module short-circuit current (STC)", r.Array.Module.IscA, "A", "Isc of one module at STC.", false, 0.01, 1000})
	add(inputSpec{"modules_series", "Modules in series per string", float64(r.Array.ModulesSeries), "modules", "Set by the controller's voltage window; see the Array sheet.", true, 1, 1000})
	b.loc.lossCells = nil
	for i, d := range r.Array.Derates {
		name := fmt.Sprintf("derate_loss_%d", i+1)
		add(inputSpec{name, "Loss: " + d.Name, d.Loss, "fraction", "Fraction of array energy lost (" + d.Source + ").", false, 0, 0.95})
		b.loc.lossCells = append(b.loc.lossCells, name)
	}
	section("Charge controller")
	add(inputSpec{"controller_charge_v", "Battery charging voltage", r.Controller.ChargeV, "V", "Voltage the controller charges the bank at (MPPT output current = array power / this voltage).", false, 1, 2000})
	add(inputSpec{"controller_margin", "Controller current margin", r.Controller.Margin, "factor", "Safety factor on the controller current (NEC 690.8 uses 1.25).", false, 1, 3})
	if r.Inverter != nil {
		section("Inverter")
		add(inputSpec{"inverter_margin", "Inverter continuous margin", r.Inverter.Margin, "factor", "Factor on the largest coincident AC power.", false, 1, 5})
	}
	if r.Lifecycle != nil {
		section("Lifecycle cost")
		add(inputSpec{"discount_rate", "Discount rate (real)", r.Lifecycle.DiscountRate, "fraction per year", "Real discount rate for present worth.", false, 0, 0.5})
		add(inputSpec{"analysis_years", "Analysis period", r.Lifecycle.AnalysisYears, "years", "Years of the lifecycle cost analysis.", false, 1, 100})
	}
	if err := b.pageSetup(SheetInputs, false); err != nil {
		return err
	}
	for _, s := range specs {
		cell := cellName(2, s.row)
		if err := b.validate(SheetInputs, cell, s.integer, s.min, s.max, s.label, fmt.Sprintf("Unit: %s. Allowed: %g to %g.", s.unit, s.min, s.max)); err != nil {
			return err
		}
		if err := b.f.AddComment(SheetInputs, excelize.Comment{Cell: cell, Author: "solstand", Text: fmt.Sprintf("Unit: %s. %s", s.unit, s.note)}); err != nil {
			return err
		}
	}
	return g.flush(b.f)
}

// Loads columns.
const (
	lcName = iota + 1
	lcCircuit
	lcCritical
	lcQty
	lcPower
	lcHours
	lcStandbyW
	lcStandbyH
	lcDays
	lcMonth1 // 12 month flags
	lcEnergy = lcMonth1 + 12
	lcMean   = lcEnergy + 1
	lcSurge  = lcMean + 1
)

// loadsSheet writes one row per load (energy as formulas over unlocked
// inputs) and the monthly demand table.
func (b *builder) loadsSheet() error {
	r := b.r
	g := newGrid(SheetLoads)
	g.text(1, 1, "Loads", b.st.title)
	g.text(1, 2, "Energy on a day of use = quantity × (power × hours + standby power × standby hours); mean day = that × days per week / 7, in the months marked 1.", b.st.note)
	g.freeze = 3
	hs := []string{"Load", "Circuit (ac/dc)", "Critical", "Quantity", "Power per unit, W", "Hours per day of use, h", "Standby power, W", "Standby hours, h", "Days of use per week"}
	for m := 0; m < 12; m++ {
		hs = append(hs, monthNames[m]+" (1 = used)")
	}
	hs = append(hs, "Energy on a day of use, Wh", "Mean-day energy, Wh/day", "Surge per unit, W")
	g.headers(3, b.st.header, hs...)
	g.width(1, 30)
	for c := 2; c <= lcDays; c++ {
		g.width(c, 11)
	}
	for c := lcMonth1; c < lcMonth1+12; c++ {
		g.width(c, 6.5)
	}
	g.width(lcEnergy, 13)
	g.width(lcMean, 13)
	g.width(lcSurge, 11)
	first := 4
	n := len(r.Demand.Rows)
	for i, l := range r.Demand.Rows {
		row := first + i
		g.text(lcName, row, l.Name, b.st.inputText)
		g.text(lcCircuit, row, strings.ToLower(l.Circuit), b.st.inputText)
		crit := "no"
		if l.Critical {
			crit = "yes"
		}
		g.text(lcCritical, row, crit, b.st.text)
		g.num(lcQty, row, l.Quantity, b.st.input)
		g.num(lcPower, row, l.PowerW, b.st.input)
		g.num(lcHours, row, l.HoursPerDay, b.st.input)
		g.num(lcStandbyW, row, l.StandbyW, b.st.input)
		g.num(lcStandbyH, row, l.StandbyHours, b.st.input)
		g.num(lcDays, row, l.DaysPerWeek, b.st.input)
		for m := 0; m < 12; m++ {
			v := 0.0
			if l.Months[m] {
				v = 1
			}
			g.num(lcMonth1+m, row, v, b.st.inputInt)
		}
		e := l.Quantity * (l.PowerW*l.HoursPerDay + l.StandbyW*l.StandbyHours)
		rs := func(c int) string { return cellName(c, row) }
		g.formula(lcEnergy, row, fmt.Sprintf("%s*(%s*%s+%s*%s)", rs(lcQty), rs(lcPower), rs(lcHours), rs(lcStandbyW), rs(lcStandbyH)), e, b.st.calc)
		g.formula(lcMean, row, fmt.Sprintf("%s*%s/7", rs(lcEnergy), rs(lcDays)), e*l.DaysPerWeek/7, b.st.calc)
		g.num(lcSurge, row, l.SurgeW, b.st.value)
	}
	last := first + n - 1
	b.loc.loadsFirst, b.loc.loadsLast = first, last
	if n == 0 {
		b.loc.loadsFirst, b.loc.loadsLast = 0, 0
		g.text(1, first, "(no loads)", b.st.note)
		last = first
	}

	// Monthly demand table.
	mh := last + 3
	g.text(1, mh-1, "Monthly demand (mean day of each month)", b.st.subtitle)
	g.headers(mh, b.st.header, "Month", "Name", "AC loads, Wh/day", "DC loads, Wh/day",
		"Effective inverter efficiency at the design's part load (engine)", "Inverter loss and idle, Wh/day", "DC-side demand, Wh/day")
	b.loc.monthFirst = mh + 1
	for m := 0; m < 12; m++ {
		row := mh + 1 + m
		g.num(1, row, float64(m+1), b.st.valueInt)
		g.text(2, row, monthNames[m], b.st.text)
		sum := func(kind string) string {
			if n == 0 {
				return "0"
			}
			mc := colName(lcMonth1 + m)
			return fmt.Sprintf("SUMPRODUCT((%s=\"%s\")*%s*%s)",
				"$"+colName(lcCircuit)+"$"+fmt.Sprint(first)+":$"+colName(lcCircuit)+"$"+fmt.Sprint(last), kind,
				"$"+colName(lcMean)+"$"+fmt.Sprint(first)+":$"+colName(lcMean)+"$"+fmt.Sprint(last),
				mc+"$"+fmt.Sprint(first)+":"+mc+"$"+fmt.Sprint(last))
		}
		ac, dc := r.Demand.ACDailyWh[m], r.Demand.DCDailyWh[m]
		g.formula(3, row, sum("ac"), ac, b.st.calc)
		g.formula(4, row, sum("dc"), dc, b.st.calc)
		g.num(5, row, r.Demand.InverterEffectiveEff[m], b.st.valuePct)
		inv := r.Demand.InverterDailyWh[m]
		g.formula(6, row, fmt.Sprintf("IF(E%d>0,C%d/E%d-C%d,%s)", row, row, row, row, lit(inv)), inv, b.st.calc)
		g.formula(7, row, fmt.Sprintf("D%d+C%d+F%d", row, row, row), r.Demand.DailyWh[m], b.st.result)
	}
	g.text(1, mh+14, fmt.Sprintf("Largest coincident power: %.0f W (AC %.0f W, DC %.0f W); largest surge %.0f W.",
		r.Demand.PeakW, r.Demand.PeakACW, r.Demand.PeakDCW, r.Demand.SurgeW), b.st.note)

	if err := b.pageSetup(SheetLoads, true); err != nil {
		return err
	}
	if n > 0 {
		rng := func(c1, c2 int) string { return cellName(c1, first) + ":" + cellName(c2, last) }
		if err := b.validate(SheetLoads, rng(lcQty, lcQty), false, 0, 1e5, "Quantity", "Number of units, 0 or more."); err != nil {
			return err
		}
		if err := b.validate(SheetLoads, rng(lcPower, lcPower)+" "+rng(lcStandbyW, lcStandbyW), false, 0, 1e7, "Power", "Unit: W per unit, 0 or more."); err != nil {
			return err
		}
		if err := b.validate(SheetLoads, rng(lcHours, lcHours)+" "+rng(lcStandbyH, lcStandbyH), false, 0, 24, "Hours", "Unit: h per day, 0 to 24."); err != nil {
			return err
		}
		if err := b.validate(SheetLoads, rng(lcDays, lcDays), false, 0, 7, "Days per week", "Unit: days, 0 to 7."); err != nil {
			return err
		}
		if err := b.validate(SheetLoads, rng(lcMonth1, lcMonth1+11), true, 0, 1, "Month used", "1 = used in this month, 0 = not."); err != nil {
			return err
		}
		dv := excelize.NewDataValidation(true)
		dv.Sqref = rng(lcCircuit, lcCircuit)
		if err := dv.SetDropList([]string{"ac", "dc"}); err != nil {
			return err
		}
		if err := b.f.AddDataValidation(SheetLoads, dv); err != nil {
			return err
		}
		notes := []struct {
			col int
			txt string
		}{
			{lcQty, "Input. Number of identical units."},
			{lcPower, "Input. Unit: W per unit while running."},
			{lcHours, "Input. Unit: h per day of use (equivalent full-power hours)."},
			{lcStandbyW, "Input. Unit: W per unit while idle."},
			{lcStandbyH, "Input. Unit: h per day of use."},
			{lcDays, "Input. Unit: days per week, 0–7."},
			{lcMonth1, "Input. 1 = the load runs in this month, 0 = not (all month columns)."},
		}
		for _, nt := range notes {
			if err := b.f.AddComment(SheetLoads, excelize.Comment{Cell: cellName(nt.col, 3), Author: "solstand", Text: nt.txt}); err != nil {
				return err
			}
		}
	}
	return g.flush(b.f)
}

// resourceSheet writes the monthly resource table and its chart.
func (b *builder) resourceSheet() error {
	r := b.r
	g := newGrid(SheetResource)
	g.text(1, 1, "Solar resource", b.st.title)
	g.text(1, 2, fmt.Sprintf("Source: %s. Plane of array computed by the engine at tilt %.1f° and azimuth %.1f° (clockwise from north); transposition: %s.",
		orDash(r.Resource.Source), r.Array.TiltDeg, r.Array.AzimuthDeg, orDash(r.Resource.Transposition)), b.st.note)
	g.freeze = 4
	g.headers(4, b.st.header, "Month", "Name", "Representative day of year", "Extraterrestrial, kWh/m²/day", "Horizontal (GHI), kWh/m²/day",
		"Clearness index", "Diffuse fraction", "Beam ratio", "Plane of array, kWh/m²/day (engine)", "Air temperature, °C", "PV yield (engine), Wh/day")
	for c, w := range []float64{8, 7, 12, 14, 14, 10, 10, 10, 16, 12, 14} {
		g.width(c+1, w)
	}
	b.loc.resMonthFirst = 5
	for m := 0; m < 12; m++ {
		row := 5 + m
		rm := r.Resource.Months[m]
		g.num(1, row, float64(m+1), b.st.valueInt)
		g.text(2, row, monthNames[m], b.st.text)
		g.num(3, row, float64(rm.DayOfYear), b.st.valueInt)
		g.num(4, row, rm.ExtraterrestrialKWhM2Day, b.st.value)
		g.num(5, row, r.Resource.GHIKWhM2Day[m], b.st.value)
		g.num(6, row, rm.ClearnessIndex, b.st.value)
		g.num(7, row, rm.DiffuseFraction, b.st.value)
		g.num(8, row, rm.BeamRatio, b.st.value)
		g.num(9, row, r.Resource.POAKWhM2Day[m], b.st.value)
		g.num(10, row, r.Site.AirTempC[m], b.st.value)
		g.num(11, row, r.Array.MonthlyYieldWhDay[m], b.st.value)
	}
	if err := b.pageSetup(SheetResource, true); err != nil {
		return err
	}
	cats := rangeRef(SheetResource, 2, 5, 2, 16)
	if err := b.f.AddChart(SheetResource, "B19", &excelize.Chart{
		Type: excelize.Col,
		Series: []excelize.ChartSeries{
			{Name: sheetRef(SheetResource) + "$E$4", Categories: cats, Values: rangeRef(SheetResource, 5, 5, 5, 16), Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{"9DB4C0"}}},
			{Name: sheetRef(SheetResource) + "$I$4", Categories: cats, Values: rangeRef(SheetResource, 9, 5, 9, 16), Fill: excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{colAccent}}},
		},
		Title:     chartTitle("Daily irradiation, kWh/m²/day"),
		Legend:    excelize.ChartLegend{Position: "bottom"},
		Dimension: excelize.ChartDimension{Width: 640, Height: 300},
	}); err != nil {
		return err
	}
	return g.flush(b.f)
}

func orDash(s string) string {
	if strings.TrimSpace(s) == "" {
		return "—"
	}
	return s
}

// chainRow writes one step of a sizing chain: label, value or formula, unit, explanation.
type chainCell struct {
	label   string
	name    string  // defined name ("" none)
	formula string  // "" for a plain value
	value   float64 // value, or cached value of the formula
	style   int
	unit    string
	how     string
}

func (b *builder) chain(g *grid, sheet string, row int, cs []chainCell) int {
	for _, c := range cs {
		g.text(1, row, c.label, b.st.label)
		if c.formula != "" {
			v := c.value
			if c.style == b.st.result || c.style == b.st.resultInt {
				v = b.cached(v)
			}
			g.formula(2, row, c.formula, v, c.style)
		} else {
			g.num(2, row, c.value, c.style)
		}
		g.text(3, row, c.unit, b.st.text)
		g.text(4, row, c.how, b.st.textWrap)
		if c.name != "" {
			b.define(c.name, sheet, 2, row)
		}
		row++
	}
	return row
}

// arraySheet writes the design-month table, the array sizing chain as
// formulas, the string layout and the derates.
func (b *builder) arraySheet() error {
	r := b.r
	a := r.Array
	g := newGrid(SheetArray)
	g.text(1, 1, "PV array sizing", b.st.title)
	g.text(1, 2, "Method: design month and derated array sizing, IEEE 1562; Sandia Stand-Alone PV Handbook (1995). Green cells are live results; grey cells are engine values.", b.st.note)
	g.headers(3, b.st.header, "Step", "Value", "Unit", "How")
	g.width(1, 40)
	g.width(2, 14)
	g.width(3, 10)
	g.width(4, 52)
	g.width(5, 3)
	for c, w := range []float64{8, 16, 16, 16} {
		g.width(6+c, w)
	}
	// Design-month table, F..I.
	for i, h := range []string{"Month", "DC-side demand, Wh/day", "Plane of array, kWh/m²/day", "Demand / irradiation, Wh per kWh/m²"} {
		g.text(6+i, 3, h, b.st.header)
	}
	rf := 4
	b.loc.ratioFirst = rf
	for m := 0; m < 12; m++ {
		row := rf + m
		g.num(6, row, float64(m+1), b.st.valueInt)
		d := r.Demand.DailyWh[m]
		p := r.Resource.POAKWhM2Day[m]
		g.formula(7, row, ref(SheetLoads, 7, b.loc.monthFirst+m), d, b.st.calc)
		g.formula(8, row, ref(SheetResource, 9, b.loc.resMonthFirst+m), p, b.st.calc)
		ratio := 0.0
		if p > 0 {
			ratio = d / p
		} else if d > 0 {
			ratio = 1e300
		}
		g.formula(9, row, fmt.Sprintf("IF(H%d>0,G%d/H%d,IF(G%d>0,1E+300,0))", row, row, row, row), ratio, b.st.calc)
	}
	rl := rf + 11
	colR := func(c int) string { return fmt.Sprintf("$%s$%d:$%s$%d", colName(c), rf, colName(c), rl) }
	derate := "1"
	if len(b.loc.lossCells) > 0 {
		parts := make([]string, len(b.loc.lossCells))
		for i, n := range b.loc.lossCells {
			parts[i] = "(1-" + n + ")"
		}
		derate = strings.Join(parts, "*")
	}
	row := b.chain(g, SheetArray, 4, []chainCell{
		{"Design month", "design_month", fmt.Sprintf("INDEX(%s,MATCH(MAX(%s),%s,0))", colR(6), colR(9), colR(9)), float64(r.DesignMonth), b.st.resultInt, "month", "Month with the largest demand-to-irradiation ratio."},
		{"Daily demand in the design month", "daily_demand_wh", fmt.Sprintf("INDEX(%s,design_month)", colR(7)), r.Demand.DailyWh[clampMonth(r.DesignMonth)], b.st.result, "Wh/day", "DC-side energy per day, inverter losses included."},
		{"Plane-of-array irradiation in the design month", "design_poa_kwh_m2_day", fmt.Sprintf("INDEX(%s,design_month)", colR(8)), a.DesignPSH, b.st.calc, "h (kWh/m²/day)", "Peak sun hours on the array's plane."},
		{"Temperature factor (engine, design month)", "array_temperature_factor", "", a.TemperatureFactor, b.st.value, "factor", fmt.Sprintf("Module power at the design-month cell temperature (%.1f °C, NOCT model) over STC.", a.DesignCellTempC)},
		{"Derate factor", "array_derate_factor", derate, a.DerateFactor, b.st.calc, "factor", "Product of (1 − loss) over the losses on the Inputs sheet."},
		{"Controller factor (engine)", "array_controller_factor", "", a.ControllerFactor, b.st.value, "factor", "MPPT tracking efficiency, or the PWM operating-point factor."},
		{"Battery path factor (engine)", "array_battery_path_factor", "", a.BatteryPathFactor, b.st.value, "factor", fmt.Sprintf("1 − share through the battery (%.2f) × (1 − round-trip efficiency).", a.ShareThroughBattery)},
		{"Reliability factor (engine)", "array_reliability_factor", "", reliabilityFactor(a), b.st.value, "factor", "Sizing for the loss-of-load target: the simulated array over the rule-based one (1 without a target)."},
		{"Array power required", "array_required_w", "daily_demand_wh/(design_poa_kwh_m2_day*array_temperature_factor*array_derate_factor*array_controller_factor*array_battery_path_factor)*array_reliability_factor", a.RequiredW, b.st.result, "W", "Demand / (irradiation × all factors) × reliability factor, before rounding to whole modules."},
		{"Parallel strings", "array_strings", "MAX(1,CEILING(array_required_w/(module_pmax_w*modules_series),1))", float64(a.Strings), b.st.resultInt, "strings", "Whole strings of modules_series modules."},
		{"Modules", "array_modules", "array_strings*modules_series", float64(a.Modules), b.st.resultInt, "modules", ""},
		{"Array rated power", "array_rated_w", "array_strings*modules_series*module_pmax_w", a.RatedW, b.st.result, "W", "Installed rated power at STC."},
	})
	row++
	g.text(1, row, "String layout (engine values)", b.st.subtitle)
	row++
	row = b.chain(g, SheetArray, row, []chainCell{
		{"Tilt", "", "", a.TiltDeg, b.st.value, "°", tern(a.TiltOptimised, "Chosen by the engine to minimise the design ratio.", "As given in the project.")},
		{"Azimuth (clockwise from north)", "", "", a.AzimuthDeg, b.st.value, "°", "0 N, 90 E, 180 S, 270 W."},
		{"String open-circuit voltage at the record low", "", "", a.VocColdV, b.st.value, "V", fmt.Sprintf("At %.1f °C (NEC 690.7); must stay below the controller's %.0f V.", r.Site.RecordLowC, r.Controller.MaxPVVoltageV)},
		{"String maximum-power voltage at the hottest cell", "", "", a.VmpHotV, b.st.value, "V", fmt.Sprintf("At %.1f °C cell temperature.", a.MaxCellTempC)},
		{"Controller maximum PV voltage", "", "", r.Controller.MaxPVVoltageV, b.st.value, "V", ""},
		{"Design-month cell temperature", "", "", a.DesignCellTempC, b.st.value, "°C", "NOCT model, Duffie & Beckman §23.3."},
	})
	if a.PWMLossVsMPPTWhYear > 0 {
		row = b.chain(g, SheetArray, row, []chainCell{{"Energy a PWM controller loses against MPPT", "", "", a.PWMLossVsMPPTWhYear, b.st.value, "Wh/year", "Engine estimate."}})
	}
	row++
	g.text(1, row, "Module datasheet", b.st.subtitle)
	row++
	md := a.Module
	g.text(1, row, "Module", b.st.label)
	g.text(2, row, orDash(md.Name), b.st.text)
	row++
	row = b.chain(g, SheetArray, row, []chainCell{
		{"Rated power (STC)", "", "module_pmax_w", md.PmaxW, b.st.calc, "W", "Input cell on the Inputs sheet."},
		{"Open-circuit voltage", "", "", md.VocV, b.st.value, "V", ""},
		{"Short-circuit current", "", "", md.IscA, b.st.value, "A", ""},
		{"Maximum-power voltage", "", "", md.VmpV, b.st.value, "V", ""},
		{"Maximum-power current", "", "", md.ImpA, b.st.value, "A", ""},
		{"Power temperature coefficient", "", "", md.TempCoeffPmaxPctPerC, b.st.value, "%/°C", ""},
		{"Voc temperature coefficient", "", "", md.TempCoeffVocPctPerC, b.st.value, "%/°C", ""},
		{"NOCT", "", "", md.NOCTC, b.st.value, "°C", "IEC 61215 NOCT conditions."},
		{"Maximum series fuse", "", "", md.MaxSeriesFuseA, b.st.value, "A", ""},
	})
	row++
	g.text(1, row, "Losses", b.st.subtitle)
	row++
	g.headers(row, b.st.header, "Loss", "Fraction", "Source")
	row++
	for i, d := range a.Derates {
		g.text(1, row, d.Name, b.st.label)
		g.formula(2, row, b.loc.lossCells[i], d.Loss, b.st.calcPct)
		g.text(3, row, d.Source, b.st.text)
		row++
	}
	if err := b.pageSetup(SheetArray, true); err != nil {
		return err
	}
	return g.flush(b.f)
}

func clampMonth(m int) int {
	if m < 1 || m > 12 {
		return 0
	}
	return m - 1
}

func tern(c bool, a, b string) string {
	if c {
		return a
	}
	return b
}

// batterySheet writes the bank sizing chain as formulas, the layout and the
// life and replacement values.
func (b *builder) batterySheet() error {
	r := b.r
	bt := r.Battery
	g := newGrid(SheetBattery)
	g.text(1, 1, "Battery bank sizing", b.st.title)
	g.text(1, 2, "Method: days of autonomy over the allowed depth of discharge with temperature and rate corrections, IEEE 1013; IEEE 485 temperature factors; Peukert (1897) rate effect.", b.st.note)
	g.headers(3, b.st.header, "Step", "Value", "Unit", "How")
	g.width(1, 44)
	g.width(2, 14)
	g.width(3, 10)
	g.width(4, 60)
	row := b.chain(g, SheetBattery, 4, []chainCell{
		{"Daily demand in the design month", "", "daily_demand_wh", r.Demand.DailyWh[clampMonth(r.DesignMonth)], b.st.calc, "Wh/day", "From the Array sheet."},
		{"Days of autonomy", "", "autonomy_days", bt.AutonomyDays, b.st.calc, "days", "Input."},
		{"Maximum depth of discharge", "", "max_dod", bt.MaxDoD, b.st.calc, "fraction", "Input."},
		{"Temperature factor (engine)", "battery_temperature_factor", "", bt.TempFactor, b.st.value, "factor", fmt.Sprintf("Available capacity at %.1f °C over rated (IEEE 485 correction).", bt.TempC)},
		{"Rate factor at the design autonomy (engine)", "battery_rate_factor", "", bt.RateFactor, b.st.value, "factor", fmt.Sprintf("Capacity at the design discharge rate over the %g h rating (Peukert exponent %.2f).", bt.RatedHours, bt.PeukertExponent)},
		{"Discharge-path efficiency (engine)", "battery_discharge_efficiency", "", bt.DischargeEfficiency, b.st.value, "fraction", ""},
		{"System voltage", "", "system_v", bt.NominalV, b.st.calc, "V", "Input."},
		{"Energy required", "battery_required_wh", "daily_demand_wh*autonomy_days/(max_dod*battery_temperature_factor*battery_rate_factor*battery_discharge_efficiency)", bt.RequiredWh, b.st.result, "Wh", "Demand × autonomy / (depth of discharge × factors)."},
		{"Capacity required", "battery_required_ah", "daily_demand_wh*autonomy_days/(max_dod*battery_temperature_factor*battery_rate_factor*battery_discharge_efficiency)/system_v", bt.RequiredAh, b.st.result, "Ah", "Before rounding to whole blocks."},
		{"Blocks in series", "battery_blocks_series", "MAX(1,ROUND(system_v/block_v,0))", float64(bt.BlocksSeries), b.st.resultInt, "blocks", ""},
		{"Parallel strings", "battery_strings", "MAX(1,CEILING(battery_required_ah/block_ah,1))", float64(bt.Strings), b.st.resultInt, "strings", ""},
		{"Blocks", "battery_blocks", "battery_blocks_series*battery_strings", float64(bt.Blocks), b.st.resultInt, "blocks", ""},
		{"Bank capacity", "battery_capacity_ah", "battery_strings*block_ah", bt.CapacityAh, b.st.result, "Ah", "Strings × block capacity."},
		{"Bank energy", "battery_capacity_wh", "battery_capacity_ah*system_v", bt.CapacityWh, b.st.result, "Wh", "Capacity × system voltage."},
	})
	row++
	g.text(1, row, "Bank data (engine values)", b.st.subtitle)
	row++
	g.text(1, row, "Chemistry", b.st.label)
	g.text(2, row, bt.Chemistry, b.st.text)
	row++
	g.text(1, row, "Block", b.st.label)
	g.text(2, row, orDash(bt.BlockName), b.st.text)
	row++
	row = b.chain(g, SheetBattery, row, []chainCell{
		{"Usable energy (engine)", "", "", bt.UsableWh, b.st.value, "Wh", ""},
		{"Charge efficiency", "", "", bt.ChargeEfficiency, b.st.value, "fraction", ""},
		{"Array charge rate", "", "", bt.ChargeRateC, b.st.value, "C", "Array charge current / capacity."},
		{"Prospective short-circuit current", "", "", bt.ShortCircuitA, b.st.value, "A", "Protection must interrupt this."},
	})
	if bt.VentilationM3H > 0 {
		row = b.chain(g, SheetBattery, row, []chainCell{{"Ventilation air flow", "", "", bt.VentilationM3H, b.st.value, "m³/h", "IEC 62485-2."}})
	}
	row++
	g.text(1, row, "Life and replacements (simulation result for the design as written)", b.st.subtitle)
	row++
	row = b.chain(g, SheetBattery, row, []chainCell{
		{"Equivalent full cycles per year", "", "", bt.EquivalentFullCyclesPerYear, b.st.value, "cycles/year", "Simulation result for the design as written."},
		{"Cycle life", "", "", bt.CycleLifeYears, b.st.value, "years", "Rainflow counting (ASTM E1049-85) over the cycle-life curve."},
		{"Calendar life", "", "", bt.CalendarLifeYears, b.st.value, "years", ""},
		{"Expected life", "", "", bt.ExpectedLifeYears, b.st.value, "years", "The shorter of cycle and calendar life."},
	})
	g.text(1, row, "Replacement years", b.st.label)
	ys := make([]string, len(bt.ReplacementYears))
	for i, y := range bt.ReplacementYears {
		ys[i] = fmt.Sprintf("%g", math.Round(y*10)/10)
	}
	g.text(2, row, orDash(strings.Join(ys, ", ")), b.st.text)
	row += 2
	if len(bt.CycleLife) > 0 {
		g.text(1, row, "Cycle-life curve", b.st.subtitle)
		row++
		g.headers(row, b.st.header, "Depth of discharge", "Cycles")
		row++
		for _, p := range bt.CycleLife {
			g.num(1, row, p.DoD, b.st.valuePct)
			g.num(2, row, p.Cycles, b.st.valueInt)
			row++
		}
	}
	if err := b.pageSetup(SheetBattery, false); err != nil {
		return err
	}
	return g.flush(b.f)
}

// equipmentSheet writes the controller and inverter choice as formulas over
// their rating lists.
func (b *builder) equipmentSheet() error {
	r := b.r
	c := r.Controller
	g := newGrid(SheetEquipment)
	g.text(1, 1, "Charge controller and inverter", b.st.title)
	g.headers(3, b.st.header, "Step", "Value", "Unit", "How", "", "Controller ratings, A", "Inverter ratings, W")
	g.width(1, 44)
	g.width(2, 14)
	g.width(3, 10)
	g.width(4, 56)
	g.width(5, 3)
	g.width(6, 14)
	g.width(7, 14)
	for i, v := range c.RatingsA {
		g.num(6, 4+i, v, b.st.value)
	}
	if len(c.RatingsA) > 0 {
		b.names["controller_ratings_a"] = rangeRef(SheetEquipment, 6, 4, 6, 3+len(c.RatingsA))
	}
	kind := strings.ToLower(c.Kind)
	g.text(1, 4, "Controller type", b.st.label)
	g.text(2, 4, strings.ToUpper(kind), b.st.text)
	req := "array_rated_w/controller_charge_v*controller_margin"
	how := "MPPT: array rated power / charging voltage × margin."
	if kind == "pwm" {
		req = "1.25*module_isc_a*array_strings*controller_margin"
		how = "PWM: 1.25 × Isc × strings × margin (NEC 690.8)."
	}
	cs := []chainCell{
		{"Controller current required", "controller_required_a", req, c.RequiredA, b.st.result, "A", how},
	}
	if len(c.RatingsA) > 0 {
		rng := "controller_ratings_a"
		cs = append(cs,
			chainCell{"Units in parallel", "controller_units", fmt.Sprintf("IF(COUNTIF(%s,\">=\"&controller_required_a)>0,1,CEILING(controller_required_a/MAX(%s),1))", rng, rng), float64(c.Units), b.st.resultInt, "units", "One unit where a listed rating covers the current, else several equal units."},
			chainCell{"Controller rating (one unit)", "controller_rated_a", fmt.Sprintf("SMALL(%s,COUNTIF(%s,\"<\"&(controller_required_a/controller_units))+1)", rng, rng), c.RatedA, b.st.result, "A", "Smallest listed rating at least the current per unit."})
	} else {
		cs = append(cs,
			chainCell{"Units in parallel", "controller_units", "", float64(c.Units), b.st.valueInt, "units", ""},
			chainCell{"Controller rating (one unit)", "controller_rated_a", "ROUNDUP(controller_required_a/MAX(1,controller_units),0)", c.RatedA, b.st.result, "A", "No rating list in the project: the required current rounded up."})
	}
	cs = append(cs,
		chainCell{"Controller efficiency (engine)", "", "", c.Efficiency, b.st.value, "fraction", ""},
		chainCell{"Maximum PV input voltage", "", "", c.MaxPVVoltageV, b.st.value, "V", ""},
		chainCell{"Expected life", "", "", c.LifeYears, b.st.value, "years", ""})
	row := b.chain(g, SheetEquipment, 5, cs)
	if inv := r.Inverter; inv != nil {
		row++
		g.text(1, row, "Inverter", b.st.subtitle)
		row++
		for i, v := range inv.RatingsW {
			g.num(7, 4+i, v, b.st.value)
		}
		ics := []chainCell{
			{"Largest coincident AC power (engine)", "peak_ac_w", "", r.Demand.PeakACW, b.st.value, "W", "From the load schedule; coincidence is the engine's."},
			{"Continuous margin", "", "inverter_margin", inv.Margin, b.st.calc, "factor", "Input."},
			{"Continuous power required", "inverter_required_w", "peak_ac_w*inverter_margin", inv.RequiredContinuousW, b.st.result, "W", ""},
		}
		if len(inv.RatingsW) > 0 {
			b.names["inverter_ratings_w"] = rangeRef(SheetEquipment, 7, 4, 7, 3+len(inv.RatingsW))
			ics = append(ics, chainCell{"Inverter continuous rating", "inverter_continuous_w",
				"IF(COUNTIF(inverter_ratings_w,\">=\"&inverter_required_w)>0,SMALL(inverter_ratings_w,COUNTIF(inverter_ratings_w,\"<\"&inverter_required_w)+1),ROUNDUP(inverter_required_w,0))",
				inv.ContinuousW, b.st.result, "W", "Smallest listed rating at least the requirement, else the requirement rounded up."})
		} else {
			ics = append(ics, chainCell{"Inverter continuous rating", "inverter_continuous_w", "ROUNDUP(inverter_required_w,0)", inv.ContinuousW, b.st.result, "W", "No rating list in the project: the requirement rounded up."})
		}
		ics = append(ics,
			chainCell{"Surge power required (engine)", "", "", inv.RequiredSurgeW, b.st.value, "W", "Largest starting power with the other loads running."},
			chainCell{"Surge ratio", "", "", inv.SurgeRatio, b.st.value, "factor", "Surge over continuous rating of the unit."},
			chainCell{"Surge power of the unit", "", "", inv.SurgeW, b.st.value, "W", ""},
			chainCell{"Idle consumption", "", "", inv.IdleW, b.st.value, "W", ""},
			chainCell{"Expected life", "", "", inv.LifeYears, b.st.value, "years", ""})
		b.chain(g, SheetEquipment, row, ics)
	} else {
		g.text(1, row+1, "No AC loads: no inverter.", b.st.note)
	}
	if err := b.pageSetup(SheetEquipment, true); err != nil {
		return err
	}
	return g.flush(b.f)
}

// costSheet writes the parts list (quantity × unit price as formulas, prices
// are inputs) and the lifecycle cost as formulas over discount_rate.
func (b *builder) costSheet() error {
	r := b.r
	mt := r.Materials
	g := newGrid(SheetCost)
	g.text(1, 1, "Materials and cost", b.st.title)
	cur := mt.Currency
	if cur == "" {
		cur = "currency"
	}
	g.text(1, 2, "Unit prices are inputs (yellow); line totals and the lifecycle cost recalculate.", b.st.note)
	g.headers(3, b.st.header, "Category", "Item", "Unit", "Quantity", "Unit price, "+cur, "Line total, "+cur, "Priced in the project")
	for c, w := range []float64{16, 44, 8, 10, 14, 14, 12} {
		g.width(c+1, w)
	}
	g.freeze = 3
	row := 4
	first := row
	for _, it := range mt.Items {
		g.text(1, row, it.Category, b.st.text)
		g.text(2, row, it.Name, b.st.text)
		g.text(3, row, it.Unit, b.st.text)
		g.num(4, row, it.Quantity, b.st.value)
		g.num(5, row, it.UnitPrice, b.st.input)
		g.formula(6, row, fmt.Sprintf("D%d*E%d", row, row), it.Quantity*it.UnitPrice, b.st.calc)
		g.text(7, row, tern(it.Priced, "yes", "no"), b.st.text)
		row++
	}
	last := row - 1
	g.text(5, row, "Total", b.st.label)
	tot := "0"
	if last >= first {
		tot = fmt.Sprintf("SUM(F%d:F%d)", first, last)
	}
	g.formula(6, row, tot, mt.Total, b.st.result)
	b.define("materials_total", SheetCost, 6, row)
	if mt.Unpriced > 0 {
		g.text(2, row, fmt.Sprintf("%d item(s) without a price in the project.", mt.Unpriced), b.st.warning)
	}
	row += 2
	if lc := r.Lifecycle; lc != nil {
		g.text(1, row, "Lifecycle cost (present worth; "+orDash(lc.Currency)+")", b.st.subtitle)
		row++
		g.headers(row, b.st.header, "Year", "Event", "", "Cost", "Present-worth factor", "Present worth")
		row++
		rf := row
		for _, e := range lc.Rows {
			g.num(1, row, float64(e.Year), b.st.valueInt)
			g.text(2, row, e.Item, b.st.text)
			g.num(4, row, e.Cost, b.st.value)
			pwf := math.Pow(1+lc.DiscountRate, -float64(e.Year))
			g.formula(5, row, fmt.Sprintf("1/(1+discount_rate)^A%d", row), pwf, b.st.calc)
			g.formula(6, row, fmt.Sprintf("D%d*E%d", row, row), e.PresentWorth, b.st.calc)
			row++
		}
		rl := row - 1
		row++
		repl := "0"
		if rl >= rf {
			repl = fmt.Sprintf("SUM(F%d:F%d)", rf, rl)
		}
		crf := capitalRecovery(lc.DiscountRate, lc.AnalysisYears)
		row = b.chainAt(g, SheetCost, row, 2, []chainCell{
			capitalCell(lc.Capital, mt.Total, b.st.value, b.st.calc, cur),
			{"Installation", "", "", lc.Installation, b.st.value, cur, ""},
			{"Capital present worth", "capital_pw", fmt.Sprintf("B%d+B%d", row, row+1), lc.CapitalPW, b.st.calc, cur, "Spent in year 0."},
			{"Operation and maintenance per year", "om_per_year", "", lc.OMPerYear, b.st.value, cur + "/year", ""},
			{"O&M present worth", "om_pw", "om_per_year*IF(discount_rate=0,analysis_years,(1-(1+discount_rate)^(-analysis_years))/discount_rate)", lc.OMPW, b.st.calc, cur, "Uniform-series present-worth factor (engineering economics, e.g. Duffie & Beckman ch. 11)."},
			{"Replacements present worth", "replacements_pw", repl, lc.ReplacementsPW, b.st.calc, cur, "Sum of the events above."},
			{"Salvage present worth (engine)", "salvage_pw", "", lc.SalvagePW, b.st.value, cur, "Remaining value at the end of the analysis, discounted."},
			{"Net present cost", "net_present_cost", "capital_pw+om_pw+replacements_pw-salvage_pw", lc.NetPresentCost, b.st.result, cur, "Capital + O&M + replacements − salvage."},
			{"Energy served per year (simulation)", "served_kwh_per_year", "", lc.ServedKWhPerYear, b.st.value, "kWh/year", "Simulation result for the design as written."},
			{"Capital recovery factor", "capital_recovery_factor", "IF(discount_rate=0,1/analysis_years,discount_rate*(1+discount_rate)^analysis_years/((1+discount_rate)^analysis_years-1))", crf, b.st.calc, "1/year", ""},
			{"Levelised cost of energy", "levelised_cost_per_kwh", "IF(served_kwh_per_year>0,net_present_cost*capital_recovery_factor/served_kwh_per_year,0)", lc.LevelisedCostPerKWh, b.st.result, cur + "/kWh", "Net present cost × capital recovery factor / energy served per year."},
		})
	}
	_ = row
	if err := b.pageSetup(SheetCost, true); err != nil {
		return err
	}
	return g.flush(b.f)
}

// capitalRecovery is the capital recovery factor i(1+i)^n/((1+i)^n − 1), the
// uniform annual amount per unit of present worth (any engineering-economics
// text, e.g. Duffie & Beckman (2013) ch. 11).
func capitalRecovery(i, n float64) float64 {
	if n <= 0 {
		return 0
	}
	if i == 0 {
		return 1 / n
	}
	p := math.Pow(1+i, n)
	return i * p / (p - 1)
}

// chainAt is chain with the label in column labelCol−1 and value in labelCol.
func (b *builder) chainAt(g *grid, sheet string, row, valueCol int, cs []chainCell) int {
	for _, c := range cs {
		g.text(valueCol-1, row, c.label, b.st.label)
		if c.formula != "" {
			v := c.value
			if c.style == b.st.result {
				v = b.cached(v)
			}
			g.formula(valueCol, row, c.formula, v, c.style)
		} else {
			g.num(valueCol, row, c.value, c.style)
		}
		g.text(valueCol+1, row, c.unit, b.st.text)
		g.text(valueCol+2, row, c.how, b.st.textWrap)
		if c.name != "" {
			b.define(c.name, sheet, valueCol, row)
		}
		row++
	}
	return row
}

// capitalCell is the capital of the lifecycle table: a live reference to the
// materials total where the engine's capital is that total, else its value.
func capitalCell(capital, materials float64, valueStyle, calcStyle int, cur string) chainCell {
	if math.Abs(capital-materials) <= 1e-9*math.Max(1, math.Abs(materials)) {
		return chainCell{"Capital (equipment)", "", "materials_total", capital, calcStyle, cur, "The materials total above."}
	}
	return chainCell{"Capital (equipment)", "", "", capital, valueStyle, cur, "Engine value."}
}

// reliabilityFactor is the report's factor, 1 where none was set.
func reliabilityFactor(a report.Array) float64 {
	if a.ReliabilityFactor > 0 {
		return a.ReliabilityFactor
	}
	return 1
}
