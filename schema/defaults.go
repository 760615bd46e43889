package schema

import "math"

// The defaults of the project document, in one place. Each is shown by
// `solstand validate --show-defaults`; those marked common practice are
// trade rules of thumb, not figures from a standard.
const (
	DefaultAlbedo            = 0.2   // bare ground, grass (common practice)
	DefaultRecordMarginC     = 15.0  // record low/high beyond the coldest/warmest monthly mean (common practice, when no record is given)
	DefaultAutonomyDays      = 3.0   // common practice for a home; clinics and telecom use 5–7
	DefaultSoilingLoss       = 0.03  // common practice
	DefaultMismatchLoss      = 0.02  // common practice
	DefaultWiringLoss        = 0.02  // common practice
	DefaultToleranceLoss     = 0.0   // common practice for positive-tolerance modules
	DefaultAgeingLossPerYear = 0.005 // common practice for crystalline silicon
	DefaultTempCoeffPmax     = -0.40 // %/°C, crystalline silicon (common practice)
	DefaultTempCoeffVoc      = -0.30 // %/°C, crystalline silicon (common practice)
	DefaultTempCoeffIsc      = 0.05  // %/°C, crystalline silicon (common practice)
	DefaultNOCTC             = 45.0  // °C (common practice)
	DefaultMaxSeriesFuseA    = 15.0  // A (common practice for 60/72-cell modules)
	DefaultMaxSystemV        = 1000.0
	DefaultMPPTEfficiency    = 0.97
	DefaultPWMEfficiency     = 0.99
	DefaultMPPTMaxPVV        = 150.0
	DefaultControllerLife    = 10.0
	DefaultInverterLife      = 10.0
	DefaultInverterMargin    = 1.25 // common practice
	DefaultInverterSurge     = 2.0  // surge rating / continuous rating (common practice)
	DefaultYears             = 20
	DefaultSeed              = 1
	DefaultLagOne            = 0.3 // common practice
	DefaultDailySwingC       = 10.0
	DefaultStreakFraction    = 0.25
	DefaultDiscountRate      = 0.05
	DefaultAnalysisYears     = 20.0
	DefaultCableClass        = 5
	DefaultPVStringM         = 10.0
	DefaultArrayToCtrlM      = 15.0
	DefaultCtrlToBatteryM    = 2.0
	DefaultBatteryToInvM     = 2.0
	DefaultBatteryToPanelM   = 5.0
	DefaultPVDropPct         = 3.0 // common practice
	DefaultBatteryDropPct    = 1.5 // common practice
	DefaultBranchDropPct     = 3.0 // common practice
	DefaultPaper             = "a4"
	DefaultDate              = "2026-01-01"
	DefaultSpreadWindow      = "evening"
)

func f(v float64) *float64 { return &v }

func setF(p **float64, v float64) {
	if *p == nil {
		*p = f(v)
	}
}

// ApplyDefaults fills every field left out of the document with its
// default. It is the one place defaults are applied; it never overwrites a
// value the document gives. Chemistry-dependent battery figures (maximum
// depth of discharge, rated hours, efficiencies) are filled by
// ApplyChemistryDefaults, which the engine calls with the built-in data.
func ApplyDefaults(p *Project) {
	s := &p.Site
	if s.UTCOffsetH == nil && !s.LocationFromWeather {
		s.UTCOffsetH = f(math.Round(s.LongitudeDeg / 15))
	}
	setF(&s.AlbedoFrac, DefaultAlbedo)
	if len(s.AirTempC) == 12 {
		lo, hi := minMax(s.AirTempC)
		if len(s.AirTempMinC) == 12 {
			lo, _ = minMax(s.AirTempMinC)
		}
		if len(s.AirTempMaxC) == 12 {
			_, hi = minMax(s.AirTempMaxC)
		}
		setF(&s.RecordLowC, lo-DefaultRecordMarginC)
		setF(&s.RecordHighC, hi+DefaultRecordMarginC)
	}

	for i := range p.Loads {
		l := &p.Loads[i]
		setF(&l.Quantity, 1)
		if l.Circuit == "" {
			l.Circuit = "dc"
		}
		if l.HoursPerDay != nil && l.Spread == "" {
			l.Spread = DefaultSpreadWindow
		}
		setF(&l.DaysPerWeek, 7)
		if l.SurgeW == nil {
			setF(&l.SurgeFactor, 1)
		}
		if l.Priority == "" {
			l.Priority = "normal"
		}
	}

	if !p.System.NominalV.Set {
		p.System.NominalV = Automatic("auto")
	}

	a := &p.Array
	if !a.TiltDeg.Set {
		a.TiltDeg = Automatic("optimise")
	}
	if a.AzimuthDeg == nil && !s.LocationFromWeather {
		if s.LatitudeDeg >= 0 {
			a.AzimuthDeg = f(180)
		} else {
			a.AzimuthDeg = f(0)
		}
	}
	if a.Transposition == "" {
		a.Transposition = "hdkr"
	}
	setF(&a.SoilingLoss, DefaultSoilingLoss)
	setF(&a.MismatchLoss, DefaultMismatchLoss)
	setF(&a.WiringLoss, DefaultWiringLoss)
	setF(&a.ToleranceLoss, DefaultToleranceLoss)
	setF(&a.AgeingLossPerYear, DefaultAgeingLossPerYear)
	setF(&a.DesignAgeYears, 0)
	m := &a.Module
	setF(&m.TempCoeffPmaxPctPerC, DefaultTempCoeffPmax)
	setF(&m.TempCoeffIscPctPerC, DefaultTempCoeffIsc)
	setF(&m.NOCTC, DefaultNOCTC)
	setF(&m.MaxSeriesFuseA, DefaultMaxSeriesFuseA)
	setF(&m.MaxSystemV, DefaultMaxSystemV)
	// TempCoeffVocPctPerC stays nil when absent: the NEC 690.7 table is the fallback.

	c := &p.Controller
	if c.Kind == "" {
		c.Kind = "mppt"
	}
	if c.Kind == "pwm" {
		setF(&c.EfficiencyFraction, DefaultPWMEfficiency)
	} else {
		setF(&c.EfficiencyFraction, DefaultMPPTEfficiency)
		setF(&c.MaxPVVoltageV, DefaultMPPTMaxPVV)
	}
	setF(&c.LifeYears, DefaultControllerLife)

	b := &p.Battery
	setF(&b.AutonomyDays, DefaultAutonomyDays)
	if b.Indoors == nil {
		t := true
		b.Indoors = &t
	}
	if b.TempC == nil {
		if *b.Indoors {
			t := 20.0
			if len(s.AirTempC) == 12 {
				lo, _ := minMax(s.AirTempC)
				t = math.Max(math.Min(lo, 20), 10)
			}
			b.TempC = f(t)
		} else if len(s.AirTempC) == 12 {
			lo, _ := minMax(s.AirTempC)
			b.TempC = f(lo)
		}
	}
	setF(&b.InitialSOC, 1)

	if p.Inverter != nil {
		inv := p.Inverter
		setF(&inv.SurgeRatio, DefaultInverterSurge)
		setF(&inv.Margin, DefaultInverterMargin)
		setF(&inv.LifeYears, DefaultInverterLife)
		if len(inv.EfficiencyCurve) == 0 {
			inv.EfficiencyCurve = []EfficiencyPoint{{0.05, 0.70}, {0.1, 0.82}, {0.25, 0.90}, {0.5, 0.93}, {1.0, 0.92}}
		}
	}

	w := &p.Wiring
	if w.Standard == "" {
		w.Standard = "iec"
	}
	if w.CableClass == nil {
		c := DefaultCableClass
		w.CableClass = &c
	}
	setF(&w.PVStringM, DefaultPVStringM)
	setF(&w.ArrayToCtrlM, DefaultArrayToCtrlM)
	setF(&w.CtrlToBatteryM, DefaultCtrlToBatteryM)
	setF(&w.BatteryToInvM, DefaultBatteryToInvM)
	setF(&w.BatteryToPanelM, DefaultBatteryToPanelM)
	setF(&w.PVDropPct, DefaultPVDropPct)
	setF(&w.BatteryDropPct, DefaultBatteryDropPct)
	setF(&w.BranchDropPct, DefaultBranchDropPct)

	k := &p.Costs
	if k.Currency == "" {
		k.Currency = "USD"
	}
	setF(&k.DiscountRate, DefaultDiscountRate)
	setF(&k.AnalysisYears, DefaultAnalysisYears)

	sim := &p.Simulation
	if sim.Years == nil {
		y := DefaultYears
		sim.Years = &y
	}
	if sim.Seed == nil {
		sd := uint64(DefaultSeed)
		sim.Seed = &sd
	}
	setF(&sim.LagOneCorrelation, DefaultLagOne)
	setF(&sim.DailySwingC, DefaultDailySwingC)
	setF(&sim.CloudyStreakFrac, DefaultStreakFraction)
	if sim.CloudyStreakDays == nil {
		// clamped so that a bad autonomy_days is reported once, as itself
		d := int(math.Min(math.Max(math.Ceil(*b.AutonomyDays), 1), 60))
		sim.CloudyStreakDays = &d
	}

	o := &p.Output
	if o.Paper == "" {
		o.Paper = DefaultPaper
	}
	if o.Hourly == nil {
		h := false
		o.Hourly = &h
	}
}

// ChemistryFigures are the built-in figures of a battery chemistry that
// ApplyChemistryDefaults writes into the document.
type ChemistryFigures struct {
	MaxDoD, ChargeEfficiency, DischargeEfficiency, SelfDischargePerMonth, CalendarLifeYears, ChargeMinTempC, RatedHours, PeukertExponent float64
	CycleLife                                                                                                                            []CyclePoint
}

// ApplyChemistryDefaults fills the battery figures that depend on the
// chemistry, from the built-in data the engine passes in.
func ApplyChemistryDefaults(p *Project, c ChemistryFigures) {
	b := &p.Battery
	setF(&b.MaxDoD, c.MaxDoD)
	setF(&b.Block.RatedHours, c.RatedHours)
	setF(&b.Block.PeukertExponent, c.PeukertExponent)
	if b.Overrides == nil {
		b.Overrides = &Chemistry{}
	}
	o := b.Overrides
	setF(&o.ChargeEfficiency, c.ChargeEfficiency)
	setF(&o.DischargeEfficiency, c.DischargeEfficiency)
	setF(&o.SelfDischargePerMonth, c.SelfDischargePerMonth)
	setF(&o.CalendarLifeYears, c.CalendarLifeYears)
	setF(&o.ChargeMinTempC, c.ChargeMinTempC)
	if len(o.CycleLife) == 0 {
		o.CycleLife = append([]CyclePoint(nil), c.CycleLife...)
	}
	setF(&b.ReconnectSOC, math.Min(1, 1-*b.MaxDoD+0.10))
	setF(&b.NonCritical, math.Min(1, 1-*b.MaxDoD+0.15))
}

func minMax(v []float64) (lo, hi float64) {
	lo, hi = math.Inf(1), math.Inf(-1)
	for _, x := range v {
		lo = math.Min(lo, x)
		hi = math.Max(hi, x)
	}
	return lo, hi
}
