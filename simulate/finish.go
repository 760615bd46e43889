package simulate

import (
	"fmt"
	"math"
	"sort"

	"solstand/array"
	"solstand/caution"
	"solstand/cost"
	"solstand/report"
	"solstand/weather"
	"solstand/wiring"
)

// Loss-of-load targets of the curves (beside the project's own target).
var defaultTargets = [...]float64{0.1, 0.01, 0.001}

// curves computes the isoreliability curves when a target is set or asked for.
func (d *run) curves() error {
	target := d.p.Simulation.TargetLOLP
	if target == nil && !d.opt.Curves {
		return nil
	}
	E := d.dc.DailyWh[d.dm-1]
	pvDay := 0.0
	first := weather.FirstDayOfMonth(d.dm)
	n := weather.DaysInMonth(d.dm)
	for _, pv := range d.pvYears {
		pvDay += sumF(pv[first*24 : (first+n)*24])
	}
	pvDay /= float64(len(d.pvYears) * n)
	in := &CurveInput{PVUnitWh: d.pvYears, DayMonth: d.dayMonth, Demand: &d.demand, Params: d.params,
		BatteryTemplate: d.model, DesignMonth: d.dm, DesignPVUnitWhDay: pvDay, DesignDemandWhDay: E}
	in.Params.ControllerMaxOutWh = 0 // the controller grows with the array
	// Costs: the array at C_A = 1 is ratedW / C_A(design); storage at C_S = 1
	// is one day's demand of usable energy.
	k := &d.p.Costs
	caDesign := pvDay / E
	if k.ModuleEach != nil && k.BatteryBlockEach != nil && caDesign > 0 {
		perModule := *k.ModuleEach
		if k.MountingPerModule != nil {
			perModule += *k.MountingPerModule
		}
		in.ArrayCostPerCA = float64(d.layout.Modules) / caDesign * perModule
		usablePerBlockWh := d.block.NominalV * d.block.CapacityAh * d.bsz.MaxDoD * d.bsz.TempFactor
		if usablePerBlockWh > 0 {
			in.StorageCostPerCS = E / usablePerBlockWh * *k.BatteryBlockEach
		}
	}
	targets := append([]float64(nil), defaultTargets[:]...)
	if target != nil {
		targets = append(targets, *target)
	}
	sort.Sort(sort.Reverse(sort.Float64Slice(targets)))
	targets = uniq(targets)
	storage := []float64{1, 1.5, 2, 3, 4, 5, 6, 7, 8, 10}
	if target != nil {
		// The storage of the bank the stated autonomy asks for, the floor of
		// the reliability sizing, is a point of every curve.
		storage = append(storage, *d.p.Battery.AutonomyDays/(d.bsz.RateFactor*d.bsz.DischargeEfficiency))
		sort.Float64s(storage)
		storage = uniq(storage)
	}
	curves, err := IsoReliability(in, targets, storage, d.opt.Progress)
	if err != nil {
		return fmt.Errorf("reliability curves: %w", err)
	}
	d.designCA = caDesign
	usableDesign := d.model.CapacityWh - d.model.MinWh
	for _, c := range curves {
		rc := report.Curve{TargetLOLP: c.TargetLOLP, Cheapest: c.Cheapest}
		for _, pt := range c.Points {
			rc.Points = append(rc.Points, report.CurvePoint{
				StorageDays: pt.StorageDays, ArrayToLoad: pt.ArrayToLoad,
				ArrayW:     pt.ArrayToLoad / caDesign * d.r.Array.RatedW,
				CapacityWh: pt.StorageDays * E / usableDesign * d.model.CapacityWh / d.bsz.TempFactor,
				LOLP:       pt.LOLP, Cost: pt.Cost,
			})
		}
		d.r.Curves = append(d.r.Curves, rc)
		if target != nil && c.TargetLOLP == *target {
			d.target = &rc
		}
	}
	return nil
}

// maxResizeRounds bounds the reliability sizing's rounds of sizing and
// simulating again.
const maxResizeRounds = 6

// reliability sizes for the project's loss-of-load target: on the
// target's isoreliability curve (Egido & Lorenzo 1992) it takes the
// least-cost point (without prices, the one with the least storage) whose
// storage is at least the days of autonomy the project asks for — the
// stated autonomy stays a floor — then sizes the array and the bank for it
// and simulates again, adding a string at a time until the simulation
// meets the target.
func (d *run) reliability() error {
	t := d.p.Simulation.TargetLOLP
	if t == nil || d.target == nil {
		return nil
	}
	c := d.target
	b := &d.r.Battery
	rateEff := d.bsz.RateFactor * d.bsz.DischargeEfficiency
	floor := b.AutonomyDays / rateEff // storage C_S of the bank the autonomy days ask for
	best := -1
	for i, pt := range c.Points {
		if pt.StorageDays < floor-1e-9 {
			continue
		}
		if best < 0 || (c.Cheapest >= 0 && pt.Cost < c.Points[best].Cost) {
			best = i
		}
	}
	if best < 0 || d.designCA <= 0 {
		d.caution(caution.Caution{Code: "lolp-target-unreachable", Severity: caution.Warning,
			Message: fmt.Sprintf("No array of up to %.1f times the design-month load meets the loss-of-load target %.3g %% with %.1f to 10 days of storage; the design is sized by the rules alone.", DefaultArrayToLoadMax, 100**t, floor)})
		return nil
	}
	pt := c.Points[best]
	ruleLOLP, ruleW, ruleAh, ruleDays := d.r.Simulation.LOLP, d.r.Array.RatedW, b.CapacityAh, b.AutonomyDays
	days := math.Max(ruleDays, pt.StorageDays*rateEff)
	factor := pt.ArrayToLoad / d.designCA * d.r.Array.RatedW / (d.r.Array.RequiredW / d.reliabilityFactor)
	*d.p.Battery.AutonomyDays = days
	for round := 0; ; round++ {
		d.cautions, d.r.Notes = d.cautions[:d.cautionsBeforeSize], d.r.Notes[:d.notesBeforeSize]
		d.reliabilityFactor = factor
		if err := d.size(); err != nil {
			return err
		}
		if err := d.simulate(); err != nil {
			return err
		}
		if d.r.Simulation.LOLP <= *t || round == maxResizeRounds-1 {
			break
		}
		// One more string than the rounding gave.
		a := d.r.Array
		factor *= float64(a.Strings+1) * float64(a.ModulesSeries) * a.Module.PmaxW / (a.RequiredW)
	}
	how := "of least cost"
	if c.Cheapest < 0 {
		how = "with the least storage (no prices for modules and blocks)"
	}
	d.note("Reliability sizing for the loss-of-load target %.3g %%: the point %s on its curve with at least the stated autonomy — %.2f days of storage, array-to-load ratio %.2f. The rules alone gave %.0f W of array and %.0f Ah (%.1f days of autonomy), %.3g %% loss of load in simulation; the design is now %.0f W and %.0f Ah (%.2f days), %.3g %%. The array chain carries a reliability factor of %.3f.",
		100**t, how, pt.StorageDays, pt.ArrayToLoad, ruleW, ruleAh, ruleDays, 100*ruleLOLP, d.r.Array.RatedW, b.CapacityAh, b.AutonomyDays, 100*d.r.Simulation.LOLP, d.reliabilityFactor)
	if d.r.Simulation.LOLP > *t {
		d.caution(caution.Caution{Code: "lolp-target-missed", Severity: caution.Warning,
			Message: fmt.Sprintf("After %d rounds of sizing the simulation still loses %.3g %% of the load, above the target %.3g %%.", maxResizeRounds, 100*d.r.Simulation.LOLP, 100**t)})
	}
	return nil
}

// wiring sizes the conductors and the protection.
func (d *run) wiring() error {
	w := &d.p.Wiring
	std := wiring.Standard(w.Standard)
	in := wiring.SystemCircuits{
		Standard: std, Class: *w.CableClass, MaxParallelRuns: 4,
		ModuleIscA: d.module.IscA, ModuleImpA: d.module.ImpA, ModuleMaxSeriesFuseA: d.module.MaxSeriesFuseA,
		Strings: d.layout.Strings, Controllers: d.r.Controller.Units,
		PVOperatingV: d.module.VmpV * float64(d.layout.ModulesSeries), PVMaxV: d.layout.VocColdV,
		PVStringOneWayM: *w.PVStringM, ArrayToControllerOneWayM: *w.ArrayToCtrlM, PVMaxDropPct: *w.PVDropPct,
		ControllerRatedA: d.r.Controller.RatedA, ControllerToBatteryOneWayM: *w.CtrlToBatteryM,
		BatteryNominalV: d.systemV, BlocksSeries: d.bsz.BlocksSeries, BatteryStrings: d.bsz.Strings,
		BlockInternalResistanceOhm: d.block.InternalResistanceMOhm / 1000, BatteryMaxDropPct: *w.BatteryDropPct,
		BatteryToDCPanelOneWayM: *w.BatteryToPanelM, BranchMaxDropPct: *w.BranchDropPct,
	}
	if d.ctrl.Kind == array.PWM {
		in.PVOperatingV = d.chargingV()
	}
	if d.r.Inverter != nil {
		in.InverterContinuousW = d.r.Inverter.ContinuousW
		in.InverterEfficiency = 0.92
		if c := d.p.Inverter.EfficiencyCurve; len(c) > 0 {
			in.InverterEfficiency = c[len(c)-1].Efficiency
		}
		in.LowVoltageDisconnectV = d.systemV * (1 - 0.1*d.bsz.MaxDoD) // about 10.8 V for 12 V lead-acid at 100 % DoD (common practice)
		in.BatteryToInverterOneWayM = *w.BatteryToInvM
	}
	dcA := 0.0
	power := map[string]float64{}
	for _, row := range d.profile.Rows {
		if row.Circuit == "dc" {
			power[row.Name] += row.Quantity * row.PowerW
			dcA += row.Quantity * row.PowerW / d.systemV
		}
	}
	in.DCPanelCurrentA = dcA
	for _, br := range w.Branches {
		a := 0.0
		if br.CurrentA != nil {
			a = *br.CurrentA
		} else {
			for _, n := range br.Loads {
				a += power[n] / d.systemV
			}
		}
		in.Branches = append(in.Branches, wiring.Branch{Name: br.Name, CurrentA: a, OneWayLengthM: br.LengthM})
	}
	des, err := wiring.DesignSystem(in)
	if err != nil {
		return fmt.Errorf("wiring: %w", err)
	}
	rw := &d.r.Wiring
	rw.Standard = string(std)
	for _, c := range des.Circuits {
		rw.Circuits = append(rw.Circuits, report.Circuit{Name: c.Circuit.Name, CurrentA: c.Circuit.CurrentA, LengthM: c.Circuit.OneWayLengthM,
			VoltageV: c.Circuit.VoltageV, MaxDropPct: c.Circuit.MaxDropPct, Size: runsLabel(c), AreaMM2: c.Size.AreaMM2,
			ResistanceOhmPerKm: c.ResistanceOhmPerKm, AmpacityA: c.AmpacityA, DropV: c.DropV, DropPct: c.DropPct, LimitedBy: c.LimitedBy})
	}
	for _, p := range des.Protection {
		rw.Protection = append(rw.Protection, report.Protection{Circuit: p.Circuit, Kind: p.Kind, RatingA: p.RatingA, Count: p.Count, InterruptingA: p.InterruptingA, Note: p.Note})
	}
	if des.BankShortCircuitA > 0 {
		d.r.Battery.ShortCircuitA = des.BankShortCircuitA
	}
	d.caution(des.Cautions...)
	d.cableRuns = des.CableRuns()
	return nil
}

func runsLabel(c wiring.Choice) string {
	if c.Runs > 1 {
		return fmt.Sprintf("%d × %s", c.Runs, c.Size.Label)
	}
	return c.Size.Label
}

// costs builds the materials list and the lifecycle cost from the
// project's prices (no default prices exist).
func (d *run) costs() error {
	k := &d.p.Costs
	mat := &d.r.Materials
	mat.Currency = k.Currency
	add := func(cat, name, unit string, qty float64, price *float64) {
		if qty <= 0 {
			return
		}
		it := report.Item{Category: cat, Name: name, Unit: unit, Quantity: qty}
		if price != nil {
			it.UnitPrice, it.Priced = *price, true
		} else {
			mat.Unpriced++
		}
		mat.Items = append(mat.Items, it)
	}
	modName := d.p.Array.Module.Name
	if modName == "" {
		modName = fmt.Sprintf("PV module %.0f W", d.module.PmaxW)
	}
	add("array", modName, "pcs", float64(d.layout.Modules), k.ModuleEach)
	add("array", "Mounting per module", "pcs", float64(d.layout.Modules), k.MountingPerModule)
	if d.layout.Strings > 1 {
		add("array", "Combiner box", "pcs", 1, k.CombinerEach)
	}
	add("controller", fmt.Sprintf("%s charge controller %.0f A", d.r.Controller.Kind, d.r.Controller.RatedA), "pcs", float64(d.r.Controller.Units), k.ControllerEach)
	blk := d.p.Battery.Block.Name
	if blk == "" {
		blk = fmt.Sprintf("Battery block %g V %g Ah", d.block.NominalV, d.block.CapacityAh)
	}
	add("battery", blk, "pcs", float64(d.bsz.Blocks), k.BatteryBlockEach)
	if d.r.Inverter != nil {
		add("inverter", fmt.Sprintf("Inverter %.0f W", d.r.Inverter.ContinuousW), "pcs", 1, k.InverterEach)
	}
	for _, p := range d.r.Wiring.Protection {
		price := k.FuseEach
		if p.Kind == wiring.KindBreaker {
			price = k.BreakerEach
		}
		add("protection", fmt.Sprintf("%s %.0f A (%s)", p.Kind, p.RatingA, p.Circuit), "pcs", float64(p.Count), price)
	}
	for _, c := range d.cableRuns {
		var price *float64
		if k.CablePerMPerMM2 != nil {
			v := *k.CablePerMPerMM2 * c.AreaMM2
			price = &v
		}
		add("cable", "Copper conductor "+c.Label, "m", math.Ceil(c.ConductorLengthM), price)
	}
	items := make([]cost.Item, len(mat.Items))
	for i, it := range mat.Items {
		items[i] = cost.Item{Category: it.Category, Name: it.Name, Unit: it.Unit, Quantity: it.Quantity, UnitPrice: it.UnitPrice}
	}
	mat.Total = cost.Total(items)
	if mat.Unpriced > 0 {
		d.note("Materials: %d items have no price in the project and count as 0 in the budget.", mat.Unpriced)
	}
	if mat.Total <= 0 {
		return nil
	}

	in := cost.LifecycleInput{Capital: mat.Total, DiscountRate: *k.DiscountRate, AnalysisYears: *k.AnalysisYears,
		ServedWhPerYear: d.r.Simulation.Ledger.LoadServedWh / float64(d.r.Simulation.Years)}
	if k.Installation != nil {
		in.Installation = *k.Installation
	}
	if k.OMPerYear != nil {
		in.OMPerYear = *k.OMPerYear
	}
	catCost := func(cat string) float64 {
		s := 0.0
		for _, it := range mat.Items {
			if it.Category == cat {
				s += it.Quantity * it.UnitPrice
			}
		}
		return s
	}
	if c := catCost("battery"); c > 0 && d.r.Battery.ExpectedLifeYears > 0 {
		in.Replacements = append(in.Replacements, cost.Replacement{Name: "battery bank", LifeYears: math.Max(0.25, d.r.Battery.ExpectedLifeYears), Cost: c})
	}
	if c := catCost("controller"); c > 0 {
		in.Replacements = append(in.Replacements, cost.Replacement{Name: "charge controller", LifeYears: d.r.Controller.LifeYears, Cost: c})
	}
	if c := catCost("inverter"); c > 0 && d.r.Inverter != nil {
		in.Replacements = append(in.Replacements, cost.Replacement{Name: "inverter", LifeYears: d.r.Inverter.LifeYears, Cost: c})
	}
	lc, err := cost.Compute(in)
	if err != nil {
		return fmt.Errorf("lifecycle cost: %w", err)
	}
	r := &report.Lifecycle{Currency: k.Currency, DiscountRate: in.DiscountRate, AnalysisYears: in.AnalysisYears, Capital: in.Capital,
		Installation: in.Installation, OMPerYear: in.OMPerYear, CapitalPW: lc.CapitalPW, OMPW: lc.OMPW, ReplacementsPW: lc.ReplacementsPW,
		SalvagePW: lc.SalvagePW, NetPresentCost: lc.NetPresentCost, ServedKWhPerYear: in.ServedWhPerYear / 1000, LevelisedCostPerKWh: lc.LevelisedCostPerKWh}
	for _, row := range lc.Rows {
		r.Rows = append(r.Rows, report.LifecycleRow{Year: row.Year, Item: row.Item, Cost: row.Cost, PresentWorth: row.PresentWorth})
	}
	d.r.Lifecycle = r
	return nil
}

// finish adds the standing cautions, orders them and names the methods.
func (d *run) finish() {
	d.caution(caution.Caution{Code: "codes-and-practitioner", Severity: caution.Info, Message: caution.CodesNote})
	if d.r.Simulation.LOLP > 0.05 {
		d.caution(caution.Caution{Code: "lolp-high", Severity: caution.Warning,
			Message: fmt.Sprintf("In simulation the design leaves %.1f %% of the load unserved (%d days with unmet load over %d years). Critical loads may go dark: enlarge the array or the bank.", 100*d.r.Simulation.LOLP, d.r.Simulation.UnmetDays, d.r.Simulation.Years)})
	}
	if s := d.r.Simulation.Ledger; s.PVAvailableWh > 0 && s.DumpedWh/s.PVAvailableWh > 0.5 {
		d.caution(caution.Caution{Code: "pv-much-dumped", Severity: caution.Info,
			Message: fmt.Sprintf("%.0f %% of the PV energy is dumped because the bank is full: a sign of over-sizing outside the design month (or room for daytime loads).", 100*s.DumpedWh/s.PVAvailableWh)})
	}
	// One caution per code: where two parts of the design raise the same
	// code (the battery and the wiring both warn of the short-circuit
	// current), the more severe, then the first, stands.
	sort.SliceStable(d.cautions, func(i, j int) bool { return d.cautions[i].Severity.Rank() < d.cautions[j].Severity.Rank() })
	seen := map[string]bool{}
	var out []caution.Caution
	for _, c := range d.cautions {
		if seen[c.Code] {
			continue
		}
		seen[c.Code] = true
		out = append(out, c)
	}
	d.r.Cautions = out
	d.r.Methods = methods()
}

func uniq(v []float64) []float64 {
	var out []float64
	for i, x := range v {
		if i == 0 || x != v[i-1] {
			out = append(out, x)
		}
	}
	return out
}

func methods() []report.Method {
	return []report.Method{
		{Topic: "Declination, equation of time", Method: "Spencer (1971) Fourier series", Source: "Duffie & Beckman, Solar Engineering of Thermal Processes, ch. 1"},
		{Topic: "Sun position at an instant", Method: "solar time, hour angle, zenith and azimuth (Meeus ch. 25 for the instant); refraction by Sæmundsson", Source: "Duffie & Beckman ch. 1; checked against Reda & Andreas (2004), NREL/TP-560-34302"},
		{Topic: "Representative day of each month", Method: "Klein (1977)", Source: "Duffie & Beckman Table 1.6.1"},
		{Topic: "Extraterrestrial irradiation", Method: "daily and hourly H₀", Source: "Duffie & Beckman §1.10"},
		{Topic: "Monthly diffuse fraction", Method: "Erbs, Klein & Duffie (1982)", Source: "Duffie & Beckman §2.12"},
		{Topic: "Monthly irradiation on the array", Method: "isotropic sky (Liu & Jordan 1962) with Klein's average beam ratio (1977), integrated over the day for any azimuth and the horizon profile", Source: "Duffie & Beckman §2.19–2.20"},
		{Topic: "Daily to hourly", Method: "Collares-Pereira & Rabl (1979) r_t; Erbs et al. (1982) hourly diffuse fraction", Source: "Duffie & Beckman §2.10, §2.13"},
		{Topic: "Hourly irradiance on the array", Method: "isotropic or Hay–Davies–Klucher–Reindl", Source: "Duffie & Beckman §2.16"},
		{Topic: "Synthetic daily weather", Method: "Bendt, Collares-Pereira & Rabl (1981) distribution of daily clearness with a Gaussian AR(1) day-to-day persistence", Source: "Duffie & Beckman §2.11"},
		{Topic: "Cell temperature", Method: "NOCT model", Source: "Duffie & Beckman §23.3; IEC 61215 NOCT conditions"},
		{Topic: "Module rating", Method: "STC: 1000 W/m², 25 °C cell, AM1.5", Source: "IEC 60904-3"},
		{Topic: "PWM operating point", Method: "explicit I–V curve from datasheet points (Borowy & Salameh 1996)", Source: "Borowy & Salameh (1996)"},
		{Topic: "Stand-alone sizing", Method: "design month, days of autonomy, derates", Source: "IEEE 1562; IEEE 1013; Sandia, Stand-Alone Photovoltaic Systems: A Handbook of Recommended Design Practices (1995)"},
		{Topic: "Reliability sizing", Method: "loss-of-load probability; isoreliability curves of array against storage", Source: "Egido & Lorenzo (1992), Solar Energy 49(4)"},
		{Topic: "Battery temperature correction", Method: "cell-size correction factors", Source: "IEEE 485"},
		{Topic: "Battery rate effect", Method: "Peukert (1897)", Source: "Peukert (1897)"},
		{Topic: "Battery cycle counting", Method: "rainflow, Miner's rule", Source: "ASTM E1049-85 §5.4.4; Miner (1945)"},
		{Topic: "Battery room ventilation", Method: "Q = 0.05 · n · I_gas · C_rt · 10⁻³ m³/h", Source: "IEC 62485-2"},
		{Topic: "PV voltage at the record low", Method: "module temperature coefficient, or the crystalline-silicon factor table", Source: "NEC 690.7 and Table 690.7(A)"},
		{Topic: "PV circuit current", Method: "1.25 · I_sc, conductors and fuses at 1.25 of that", Source: "NEC 690.8"},
		{Topic: "Conductor resistance (mm²)", Method: "class 2 and class 5 copper at 20 °C", Source: "IEC 60228"},
		{Topic: "Conductor resistance (AWG)", Method: "copper at 75 °C", Source: "NEC Chapter 9, Table 8"},
		{Topic: "Fuse and breaker ratings", Method: "standard ratings", Source: "NEC 240.6(A); IEC 60269-1"},
		{Topic: "Weather files", Method: "EnergyPlus Weather (EPW) format", Source: "EnergyPlus Auxiliary Programs, weather data chapter"},
		{Topic: "Lifecycle cost", Method: "present worth of replacements and running costs, salvage, levelised cost", Source: "Duffie & Beckman ch. 11"},
	}
}
