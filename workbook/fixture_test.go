package workbook

import (
	"math"

	"solstand/caution"
	"solstand/report"
)

// fixtureReport is a demo scenario (a small rural health post; every number is
// invented for the demo). The result fields are not typed in: fillSizing
// computes them from the inputs with the same definitions the workbook's
// formulas use, so the fixture is self-consistent.
func fixtureReport() *report.Report {
	all := [12]bool{true, true, true, true, true, true, true, true, true, true, true, true}
	dry := [12]bool{false, false, false, true, true, true, true, true, true, true, false, false}
	r := &report.Report{
		Tool:        "solstand",
		ToolVersion: "0.0.0-test",
		Project:     "Demo health post",
		Client:      "Demo district",
		PreparedBy:  "Demo engineer",
		Date:        "2026-03-14",
		Paper:       "a4",
		Site: report.Site{
			Name: "Demo hill village", LatitudeDeg: -12.5, LongitudeDeg: 34.2, ElevationM: 900, UTCOffsetH: 2, Albedo: 0.2,
			AirTempC:   [12]float64{24, 24, 23, 22, 20, 18, 18, 20, 23, 26, 26, 25},
			RecordLowC: 4, RecordHighC: 38,
		},
		Demand: report.Demand{
			Rows: []report.LoadRow{
				{Name: "Vaccine refrigerator", Circuit: "dc", Critical: true, Quantity: 1, PowerW: 60, HoursPerDay: 10, DaysPerWeek: 7, Months: all, SurgeW: 120},
				{Name: "LED lights", Circuit: "dc", Critical: true, Quantity: 6, PowerW: 9, HoursPerDay: 6, DaysPerWeek: 7, Months: all},
				{Name: "Laptop", Circuit: "ac", Quantity: 1, PowerW: 45, HoursPerDay: 4, StandbyW: 2, StandbyHours: 20, DaysPerWeek: 5, Months: all},
				{Name: "Water pump", Circuit: "ac", Quantity: 1, PowerW: 300, HoursPerDay: 1, DaysPerWeek: 7, Months: dry, SurgeW: 900},
			},
			PeakW: 459, PeakACW: 345, PeakDCW: 114, SurgeW: 900,
		},
		Resource: report.Resource{
			GHIKWhM2Day:   [12]float64{5.6, 5.5, 5.4, 5.3, 5.0, 4.7, 4.9, 5.5, 6.2, 6.5, 6.1, 5.7},
			POAKWhM2Day:   [12]float64{5.1, 5.2, 5.5, 5.8, 5.9, 5.8, 5.9, 6.2, 6.5, 6.3, 5.6, 5.1},
			Source:        "monthly means in the project",
			Transposition: "isotropic sky",
		},
		Array: report.Array{
			Module: report.Module{Name: "Demo 200 W module", PmaxW: 200, VocV: 24.5, IscA: 10.8, VmpV: 20.4, ImpA: 9.8,
				TempCoeffPmaxPctPerC: -0.4, TempCoeffVocPctPerC: -0.3, NOCTC: 45, MaxSeriesFuseA: 20},
			TiltDeg: 15, AzimuthDeg: 0,
			Derates: []report.Derate{
				{Name: "soiling", Loss: 0.05, Source: "common practice"},
				{Name: "mismatch", Loss: 0.02, Source: "common practice"},
				{Name: "wiring", Loss: 0.03, Source: "computed"},
			},
			TemperatureFactor: 0.91, ControllerFactor: 0.97, BatteryPathFactor: 0.93, ShareThroughBattery: 0.6,
			DesignCellTempC: 47, ModulesSeries: 2, VocColdV: 52.1, VmpHotV: 36.2, MaxCellTempC: 68,
		},
		Battery: report.Battery{
			Chemistry: "lead-acid (vented)", BlockName: "Demo 12 V block", BlockV: 12, BlockAh: 200, RatedHours: 20,
			NominalV: 24, AutonomyDays: 3, MaxDoD: 0.5, TempC: 20, TempFactor: 0.96, RateFactor: 1.04,
			DischargeEfficiency: 0.95, ChargeEfficiency: 0.85, PeukertExponent: 1.2,
			CycleLife:         []report.CyclePoint{{DoD: 0.2, Cycles: 3000}, {DoD: 0.5, Cycles: 1200}, {DoD: 0.8, Cycles: 600}},
			CalendarLifeYears: 8, CycleLifeYears: 9.5, ExpectedLifeYears: 8, EquivalentFullCyclesPerYear: 110,
			ReplacementYears: []float64{8, 16}, ShortCircuitA: 4200, VentilationM3H: 1.2, ChargeRateC: 0.06,
		},
		Controller: report.Controller{Kind: "mppt", Efficiency: 0.97, ChargeV: 28.8, MaxPVVoltageV: 100, Margin: 1.25,
			RatingsA: []float64{20, 30, 40, 60}, LifeYears: 12},
		Inverter: &report.Inverter{Margin: 1.25, SurgeRatio: 2, IdleW: 8, RatingsW: []float64{300, 500, 800, 1200}, LifeYears: 10, FromList: true},
		Cautions: []caution.Caution{
			{Code: "battery-short-circuit", Severity: caution.Danger, Message: "The bank can deliver about 4200 A into a short circuit: fit a fuse rated for it at the battery."},
			{Code: "battery-ventilation", Severity: caution.Warning, Message: "Vented lead-acid batteries release hydrogen: ventilate the battery room."},
			{Code: "design-aid", Severity: caution.Info, Message: "Check every rating against the datasheets of the parts bought."},
		},
		CodesNote: caution.CodesNote,
		Methods: []report.Method{
			{Topic: "stand-alone sizing", Method: "design month, days of autonomy", Source: "IEEE 1562; Sandia (1995)"},
			{Topic: "cell temperature", Method: "NOCT model", Source: "Duffie & Beckman §23.3"},
		},
		Notes: []string{"Ground albedo 0.2 assumed."},
		Wiring: report.Wiring{Standard: "iec",
			Circuits: []report.Circuit{{Name: "Array to controller", CurrentA: 16.9, LengthM: 15, VoltageV: 40.8, MaxDropPct: 3, Size: "6 mm²",
				AreaMM2: 6, ResistanceOhmPerKm: 3.08, AmpacityA: 44, DropV: 1.56, DropPct: 3.8, LimitedBy: "drop"}},
			Protection: []report.Protection{{Circuit: "Battery", Kind: "fuse", RatingA: 80, Count: 1, InterruptingA: 10000}},
		},
		Materials: report.Materials{Currency: "USD", Items: []report.Item{
			{Category: "array", Name: "PV module 200 W", Unit: "pcs", Quantity: 6, UnitPrice: 90, Priced: true},
			{Category: "battery", Name: "Battery block 12 V 200 Ah", Unit: "pcs", Quantity: 4, UnitPrice: 260, Priced: true},
			{Category: "wiring", Name: "Cable 6 mm²", Unit: "m", Quantity: 30, Priced: false},
		}},
	}
	for i := range r.Resource.Months {
		r.Resource.Months[i] = report.ResourceMonth{Month: i + 1, DayOfYear: []int{17, 47, 75, 105, 135, 162, 198, 228, 258, 288, 318, 344}[i],
			GHIKWhM2Day: r.Resource.GHIKWhM2Day[i], POAKWhM2Day: r.Resource.POAKWhM2Day[i], AirTempC: r.Site.AirTempC[i]}
	}
	fillSizing(r)
	fillSimulation(r, 365)
	for m := 1; m <= 12; m++ {
		for h := 6; h <= 18; h += 2 {
			r.SunPath = append(r.SunPath, report.SunPathRow{Month: m, SolarHour: h, ElevationDeg: 70 - math.Abs(float64(h-12))*11, AzimuthDeg: float64(h) * 15})
		}
	}
	r.Curves = []report.Curve{{TargetLOLP: 0.01, Cheapest: 1, Points: []report.CurvePoint{
		{StorageDays: 2, ArrayToLoad: 1.6, LOLP: 0.01}, {StorageDays: 3, ArrayToLoad: 1.35, LOLP: 0.01}, {StorageDays: 5, ArrayToLoad: 1.2, LOLP: 0.01}}}}
	return r
}

// fillSizing computes the result fields of r from its inputs with the
// definitions of the workbook (demand, design month, array, battery,
// controller, inverter, materials, lifecycle).
func fillSizing(r *report.Report) {
	d := &r.Demand
	eff := 0.9 // demo inverter efficiency at part load
	for m := 0; m < 12; m++ {
		var ac, dc float64
		for i := range d.Rows {
			l := &d.Rows[i]
			l.EnergyWhDay = l.Quantity * (l.PowerW*l.HoursPerDay + l.StandbyW*l.StandbyHours)
			if !l.Months[m] {
				continue
			}
			e := l.EnergyWhDay * l.DaysPerWeek / 7
			if l.Circuit == "ac" {
				ac += e
			} else {
				dc += e
			}
		}
		d.ACDailyWh[m], d.DCDailyWh[m] = ac, dc
		d.InverterEffectiveEff[m] = eff
		d.InverterDailyWh[m] = ac/eff - ac
		d.DailyWh[m] = dc + ac/eff
	}
	best := -1.0
	for m := 0; m < 12; m++ {
		if ratio := d.DailyWh[m] / r.Resource.POAKWhM2Day[m]; ratio > best {
			best, r.DesignMonth = ratio, m+1
		}
	}
	dm := r.DesignMonth - 1
	a := &r.Array
	a.DerateFactor = 1
	for _, x := range a.Derates {
		a.DerateFactor *= 1 - x.Loss
	}
	a.DesignPSH = r.Resource.POAKWhM2Day[dm]
	a.RequiredW = d.DailyWh[dm] / (a.DesignPSH * a.TemperatureFactor * a.DerateFactor * a.ControllerFactor * a.BatteryPathFactor)
	a.Strings = int(math.Max(1, math.Ceil(a.RequiredW/(a.Module.PmaxW*float64(a.ModulesSeries)))))
	a.Modules = a.Strings * a.ModulesSeries
	a.RatedW = float64(a.Modules) * a.Module.PmaxW
	for m := 0; m < 12; m++ {
		a.MonthlyYieldWhDay[m] = a.RatedW * r.Resource.POAKWhM2Day[m] * a.TemperatureFactor * a.DerateFactor * a.ControllerFactor
	}
	bt := &r.Battery
	bt.RequiredWh = d.DailyWh[dm] * bt.AutonomyDays / (bt.MaxDoD * bt.TempFactor * bt.RateFactor * bt.DischargeEfficiency)
	bt.RequiredAh = bt.RequiredWh / bt.NominalV
	bt.BlocksSeries = int(math.Max(1, math.Round(bt.NominalV/bt.BlockV)))
	bt.Strings = int(math.Max(1, math.Ceil(bt.RequiredAh/bt.BlockAh)))
	bt.Blocks = bt.BlocksSeries * bt.Strings
	bt.CapacityAh = float64(bt.Strings) * bt.BlockAh
	bt.CapacityWh = bt.CapacityAh * bt.NominalV
	bt.UsableWh = bt.CapacityWh * bt.MaxDoD
	c := &r.Controller
	if c.Kind == "pwm" {
		c.RequiredA = 1.25 * a.Module.IscA * float64(a.Strings) * c.Margin
	} else {
		c.RequiredA = a.RatedW / c.ChargeV * c.Margin
	}
	c.Units, c.RatedA = pickRating(c.RequiredA, c.RatingsA)
	if inv := r.Inverter; inv != nil {
		inv.RequiredContinuousW = d.PeakACW * inv.Margin
		inv.ContinuousW = math.Ceil(inv.RequiredContinuousW)
		for _, v := range sortedCopy(inv.RatingsW) {
			if v >= inv.RequiredContinuousW {
				inv.ContinuousW = v
				break
			}
		}
		inv.RequiredSurgeW = d.SurgeW
		inv.SurgeW = inv.ContinuousW * inv.SurgeRatio
	}
	mt := &r.Materials
	mt.Total, mt.Unpriced = 0, 0
	for _, it := range mt.Items {
		mt.Total += it.Quantity * it.UnitPrice
		if !it.Priced {
			mt.Unpriced++
		}
	}
	lc := &report.Lifecycle{Currency: mt.Currency, DiscountRate: 0.06, AnalysisYears: 20, Capital: mt.Total, Installation: 400, OMPerYear: 120,
		SalvagePW: 50, ServedKWhPerYear: 0.365 * d.DailyWh[dm]}
	for _, y := range bt.ReplacementYears {
		row := report.LifecycleRow{Year: int(y), Item: "battery bank", Cost: 1040}
		row.PresentWorth = row.Cost * math.Pow(1+lc.DiscountRate, -y)
		lc.Rows = append(lc.Rows, row)
		lc.ReplacementsPW += row.PresentWorth
	}
	lc.CapitalPW = lc.Capital + lc.Installation
	lc.OMPW = lc.OMPerYear * (1 - math.Pow(1+lc.DiscountRate, -lc.AnalysisYears)) / lc.DiscountRate
	lc.NetPresentCost = lc.CapitalPW + lc.OMPW + lc.ReplacementsPW - lc.SalvagePW
	lc.LevelisedCostPerKWh = lc.NetPresentCost * capitalRecovery(lc.DiscountRate, lc.AnalysisYears) / lc.ServedKWhPerYear
	r.Lifecycle = lc
}

// pickRating is the smallest listed rating ≥ required, else several equal
// units of the smallest rating that covers the share of one; no list: rounded up.
func pickRating(required float64, list []float64) (int, float64) {
	if len(list) == 0 {
		return 1, math.Ceil(required)
	}
	s := sortedCopy(list)
	units := 1
	if s[len(s)-1] < required {
		units = int(math.Ceil(required / s[len(s)-1]))
	}
	per := required / float64(units)
	for _, v := range s {
		if v >= per {
			return units, v
		}
	}
	return units, s[len(s)-1]
}

func sortedCopy(v []float64) []float64 {
	s := append([]float64(nil), v...)
	for i := 1; i < len(s); i++ {
		for j := i; j > 0 && s[j] < s[j-1]; j-- {
			s[j], s[j-1] = s[j-1], s[j]
		}
	}
	return s
}

// fillSimulation adds demo simulation values with days daily rows (a smooth
// invented pattern; the workbook writes them as values).
func fillSimulation(r *report.Report, days int) {
	s := &r.Simulation
	s.Years, s.Seed = 1, 42
	s.FirstYear = make([]report.DayRow, days)
	for i := range s.FirstYear {
		doy := i%365 + 1
		m := monthOfDay(doy)
		soc := 0.75 + 0.2*math.Sin(float64(i)/9)
		unmet := 0.0
		if i%97 == 50 {
			unmet = 120
		}
		dem := r.Demand.DailyWh[m-1]
		s.FirstYear[i] = report.DayRow{Day: doy, Month: m, PVAvailableWh: dem * 1.3, PVUsedWh: dem * 1.1, DemandWh: dem,
			ServedCriticalWh: dem * 0.6, ServedNonCriticalWh: dem*0.4 - unmet, UnmetWh: unmet, DumpedWh: dem * 0.2, LossesWh: dem * 0.1,
			SOCMin: soc - 0.1, SOCMax: soc + 0.05, SOCEnd: soc}
	}
	for m := 1; m <= 12; m++ {
		s.Monthly = append(s.Monthly, report.MonthStats{Month: m, DemandWh: 30 * r.Demand.DailyWh[m-1], MinSOC: 0.5, MeanSOC: 0.8})
	}
	s.Yearly = []report.YearStats{{Year: 1, MinSOC: 0.5}}
	s.Stress = []report.StressTest{{Name: "cloudy week", Description: "Seven days at a tenth of the design-month irradiation.", MinSOC: 0.45, RecoveryDays: 6}}
	s.MinSOC, s.MeanSOC = 0.5, 0.8
	s.FirstYearHourlySOC = make([]float32, 8760)
	s.FirstYearHourlyPVWh = make([]float32, 8760)
	s.FirstYearHourlyLoadWh = make([]float32, 8760)
	for h := range s.FirstYearHourlySOC {
		s.FirstYearHourlySOC[h] = float32(0.75 + 0.2*math.Sin(float64(h)/200))
		s.FirstYearHourlyPVWh[h] = float32(math.Max(0, 500*math.Sin(float64(h%24-6)/12*math.Pi)))
		s.FirstYearHourlyLoadWh[h] = 60
	}
}
