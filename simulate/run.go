package simulate

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"solstand/array"
	"solstand/battery"
	"solstand/caution"
	"solstand/loads"
	"solstand/report"
	"solstand/schema"
	"solstand/weather"
	"solstand/wiring"
)

// Options are the run-time choices of one design run, beside the project.
type Options struct {
	ToolVersion string
	Seed        *uint64         // overrides simulation.seed
	Years       *int            // overrides simulation.years
	Weather     *weather.Series // a measured or typical year, run beside the synthetic ones
	Curves      bool            // compute the isoreliability curves even without a target
	Hourly      bool            // keep the first year's hourly series for the hourly sheet (also output.hourly)
	// Progress is told how far the simulation has gone (may be nil).
	Progress func(done, total int)
}

// ResolveDefaults applies the document defaults and the built-in figures of
// the battery chemistry, so the project shows every figure the engine uses.
// It returns the chemistry with the project's overrides applied.
func ResolveDefaults(p *schema.Project) error {
	_, err := resolve(p)
	return err
}

func resolve(p *schema.Project) (battery.Chemistry, error) {
	schema.ApplyDefaults(p)
	chem, err := battery.Defaults(battery.Kind(p.Battery.Chemistry))
	if err != nil {
		return chem, fmt.Errorf("battery.chemistry: %w", err)
	}
	cl := make([]schema.CyclePoint, len(chem.CycleLife))
	for i, c := range chem.CycleLife {
		cl[i] = schema.CyclePoint{DoD: c.DoD, Cycles: c.Cycles}
	}
	rated := 20.0
	if !chem.LeadAcid {
		rated = 5
	}
	schema.ApplyChemistryDefaults(p, schema.ChemistryFigures{
		MaxDoD: chem.MaxDoD, ChargeEfficiency: chem.ChargeEfficiency, DischargeEfficiency: chem.DischargeEfficiency,
		SelfDischargePerMonth: chem.SelfDischargePerMonth, CalendarLifeYears: chem.CalendarLifeYears,
		ChargeMinTempC: chem.ChargeMinTempC, RatedHours: rated, PeukertExponent: chem.PeukertExponent, CycleLife: cl,
	})
	o := p.Battery.Overrides
	chem.MaxDoD = *p.Battery.MaxDoD
	chem.ChargeEfficiency = *o.ChargeEfficiency
	chem.DischargeEfficiency = *o.DischargeEfficiency
	chem.SelfDischargePerMonth = *o.SelfDischargePerMonth
	chem.CalendarLifeYears = *o.CalendarLifeYears
	chem.ChargeMinTempC = *o.ChargeMinTempC
	chem.PeukertExponent = *p.Battery.Block.PeukertExponent
	chem.CycleLife = chem.CycleLife[:0:0]
	for _, c := range o.CycleLife {
		chem.CycleLife = append(chem.CycleLife, battery.CyclePoint{DoD: c.DoD, Cycles: c.Cycles})
	}
	return chem, nil
}

// Run turns a checked project (schema.Decode) into the Report: demand,
// resource, design month, first sizing of array, controller, battery and
// inverter, the simulation through synthetic years (and a measured year
// where a weather file is given), stress tests, reliability curves, wiring,
// materials and lifecycle cost, and every caution the design triggers.
func Run(p *schema.Project, opt Options) (*report.Report, error) {
	chem, err := resolve(p)
	if err != nil {
		return nil, err
	}
	if opt.Seed != nil {
		p.Simulation.Seed = opt.Seed
	}
	if opt.Years != nil {
		p.Simulation.Years = opt.Years
	}
	r := &report.Report{
		Tool: "solstand", ToolVersion: opt.ToolVersion, Project: p.Name, Client: p.Client, PreparedBy: p.PreparedBy,
		Date: p.Output.Date, Paper: p.Output.Paper, Hourly: *p.Output.Hourly || opt.Hourly, CodesNote: caution.CodesNote,
	}
	if r.Date == "" {
		r.Date = schema.DefaultDate
	}
	d := &run{p: p, chem: chem, r: r, opt: opt}
	d.reliabilityFactor = 1
	steps := []func() error{d.climate, d.loadDemand, d.resource, d.mark, d.size, d.simulate, d.curves, d.reliability, d.wiring, d.costs}
	for _, s := range steps {
		if err := s(); err != nil {
			return nil, err
		}
	}
	d.finish()
	return r, nil
}

// run carries the intermediate results of one design run.
type run struct {
	p    *schema.Project
	chem battery.Chemistry
	r    *report.Report
	opt  Options

	ghi, airC, airMinC, airMaxC [12]float64
	haveMinMax                  bool
	recordLowC, recordHighC     float64

	profile   loads.Profile
	inv       loads.InverterSizing
	dc        loads.DCSide
	systemV   float64
	horizon   array.Horizon
	months    [12]array.MonthResource
	dm        int // design month 1..12
	module    array.Module
	ctrl      array.Controller
	layout    array.StringLayout
	derates   array.Derates
	bsz       battery.Sizing
	block     battery.Block
	chargeV   float64
	model     battery.Model
	demand    Demand
	params    Params
	pvYears   [][]float64
	dayMonth  []int8
	cautions  []caution.Caution
	cableRuns []wiring.CableRun

	// Reliability sizing.
	reliabilityFactor  float64       // multiplies the rule-based array requirement (1 without a target)
	target             *report.Curve // the curve of the project's loss-of-load target
	designCA           float64       // array-to-load ratio of the rule-based array
	cautionsBeforeSize int           // cautions and notes from before the sizing, kept when it is redone
	notesBeforeSize    int
}

// mark remembers what came before the sizing, which the reliability sizing redoes.
func (d *run) mark() error {
	d.cautionsBeforeSize, d.notesBeforeSize = len(d.cautions), len(d.r.Notes)
	return nil
}

func (d *run) caution(c ...caution.Caution) { d.cautions = append(d.cautions, c...) }

func (d *run) note(format string, a ...any) { d.r.Notes = append(d.r.Notes, fmt.Sprintf(format, a...)) }

// climate settles the monthly means: from the project, or from the weather file.
func (d *run) climate() error {
	s := &d.p.Site
	if w := d.opt.Weather; w != nil {
		g, t, err := w.MonthlyMeans()
		if err != nil {
			return fmt.Errorf("weather file: %w", err)
		}
		d.r.Resource.Source = "weather file " + s.WeatherFile
		if len(s.GHIKWhM2Day) == 12 {
			d.note("The weather file's monthly means replace the project's site.ghi_kwh_m2_day.")
		}
		s.GHIKWhM2Day = g[:]
		if w.HasTempC {
			s.AirTempC = t[:]
		} else if len(s.AirTempC) != 12 {
			return errors.New("the weather file has no air temperature and the project gives no site.air_temp_c")
		}
		if s.LocationFromWeather {
			if !w.Location.Known {
				return errors.New("site.latitude_deg: the project gives no location and the weather file has none (a CSV file carries no coordinates)")
			}
			s.LatitudeDeg, s.LongitudeDeg = w.Location.LatitudeDeg, w.Location.LongitudeDeg
			if s.UTCOffsetH == nil {
				s.UTCOffsetH = &w.Location.UTCOffsetH
			}
			if s.ElevationM == 0 {
				s.ElevationM = w.Location.ElevationM
			}
			s.LocationFromWeather = false
			d.note("The site's location (%.4f°, %.4f°, UTC%+g h) is taken from the weather file.", s.LatitudeDeg, s.LongitudeDeg, *s.UTCOffsetH)
		} else if w.Location.Known {
			d.caution(weather.CheckLocation(w.Location, s.LatitudeDeg, s.LongitudeDeg, 10)...)
		}
		schema.ApplyDefaults(d.p) // record low/high from the file's temperatures, and what depends on the location
		if w.FilledHours > 0 || w.FilledDays > 0 {
			d.note("Weather file: %d hours and %d days filled in short gaps from the month's mean profile.", w.FilledHours, w.FilledDays)
		}
		d.r.Notes = append(d.r.Notes, w.Notes...)
	} else {
		d.r.Resource.Source = "monthly means in the project"
	}
	copy(d.ghi[:], s.GHIKWhM2Day)
	copy(d.airC[:], s.AirTempC)
	if len(s.AirTempMinC) == 12 && len(s.AirTempMaxC) == 12 {
		copy(d.airMinC[:], s.AirTempMinC)
		copy(d.airMaxC[:], s.AirTempMaxC)
		d.haveMinMax = true
	} else {
		sw := *d.p.Simulation.DailySwingC
		for m := range 12 {
			d.airMinC[m], d.airMaxC[m] = d.airC[m]-sw/2, d.airC[m]+sw/2
		}
	}
	d.recordLowC, d.recordHighC = *s.RecordLowC, *s.RecordHighC
	for _, h := range s.Horizon {
		d.horizon = append(d.horizon, array.HorizonPoint{AzimuthDeg: h.AzimuthDeg, ElevationDeg: h.ElevationDeg})
	}
	sort.Slice(d.horizon, func(i, j int) bool { return d.horizon[i].AzimuthDeg < d.horizon[j].AzimuthDeg })
	d.r.Site = report.Site{
		Name: s.Name, LatitudeDeg: s.LatitudeDeg, LongitudeDeg: s.LongitudeDeg, ElevationM: s.ElevationM,
		UTCOffsetH: *s.UTCOffsetH, Albedo: *s.AlbedoFrac, AirTempC: d.airC, RecordLowC: d.recordLowC,
		RecordHighC: d.recordHighC, WeatherFile: s.WeatherFile,
	}
	return nil
}

// demand builds the load profile, chooses the system voltage and the inverter.
func (d *run) loadDemand() error {
	prof, err := loads.Build(d.p.Loads)
	if err != nil {
		return err
	}
	d.profile = prof
	var inv schema.Inverter
	if d.p.Inverter != nil {
		inv = *d.p.Inverter
	}
	if prof.HasAC {
		d.inv, err = loads.SizeInverter(prof, inv)
		if err != nil {
			return fmt.Errorf("inverter: %w", err)
		}
	}
	d.dc = loads.DCDemand(prof, d.inv, inv.EfficiencyCurve)
	maxDaily := 0.0
	for _, v := range d.dc.DailyWh {
		maxDaily = math.Max(maxDaily, v)
	}
	if maxDaily <= 0 {
		return errors.New("loads: the inventory draws no energy in any month")
	}
	if v := d.p.System.NominalV; v.IsAuto {
		byEnergy := loads.AutoVoltage(maxDaily)
		bv := d.p.Battery.Block.NominalV
		for _, cand := range []float64{12, 24, 48} {
			if cand < byEnergy {
				continue
			}
			if n := math.Round(cand / bv); n >= 1 && math.Abs(n*bv-cand)/cand <= 0.1 {
				d.systemV = cand
				break
			}
		}
		if d.systemV == 0 {
			return fmt.Errorf("battery.block.nominal_v: %g V blocks cannot make a bank of %g V or more, which %.0f Wh/day calls for; set system.nominal_v", bv, byEnergy, maxDaily)
		}
		d.note("System voltage %g V: the largest daily demand %.0f Wh/day calls for at least %g V (common practice: 12 V up to 1.5 kWh/day, 24 V up to 5 kWh/day, 48 V above), and %g V blocks make it.", d.systemV, maxDaily, byEnergy, bv)
	} else {
		d.systemV = v.Value
	}
	d.caution(loads.Cautions(prof, d.systemV)...)

	dm := &d.r.Demand
	for _, row := range prof.Rows {
		dm.Rows = append(dm.Rows, report.LoadRow{
			Name: row.Name, Circuit: row.Circuit, Critical: row.Critical, Quantity: row.Quantity, PowerW: row.PowerW,
			HoursPerDay: row.HoursPerDay, StandbyW: row.StandbyW, StandbyHours: row.StandbyHours, DaysPerWeek: row.DaysPerWeek,
			Months: row.Months, EnergyWhDay: row.EnergyWhDay, SurgeW: row.SurgeW,
		})
	}
	dm.ACDailyWh, dm.DCDailyWh = prof.ACDailyWh, prof.DCDailyWh
	dm.InverterDailyWh = d.dc.InverterLossDailyWh
	dm.DailyWh = d.dc.DailyWh
	dm.PeakW, dm.PeakACW, dm.PeakDCW, dm.SurgeW = prof.PeakW, prof.PeakACW, prof.PeakDCW, prof.SurgeACW
	for m := range 12 {
		for h := range 24 {
			dm.HourlyDCSideWh[m][h] = d.dc.CriticalWh[m][h] + d.dc.NonCriticalWh[m][h]
			dm.CriticalDailyWh[m] += d.dc.CriticalWh[m][h]
		}
		dm.InverterEffectiveEff[m] = 1
		if ac := prof.ACDailyWh[m]; ac > 0 {
			dm.InverterEffectiveEff[m] = ac / (ac + d.dc.InverterLossDailyWh[m])
		}
	}
	d.demand = Demand{CriticalWh: d.dc.CriticalWh, NonCriticalWh: d.dc.NonCriticalWh, InverterLossWh: d.dc.InverterLossWh}
	if prof.HasAC {
		r := d.inv
		d.r.Inverter = &report.Inverter{
			RequiredContinuousW: r.RequiredContinuousW, ContinuousW: r.ContinuousW, RequiredSurgeW: r.RequiredSurgeW,
			SurgeW: r.SurgeW, Margin: r.Margin, SurgeRatio: r.SurgeRatio, IdleW: r.IdleW, FromList: r.FromList,
			RatingsW: inv.RatingsW, LifeYears: *d.p.Inverter.LifeYears,
		}
		if !r.FromList {
			d.note("Inverter: no listed rating given or none fits; %.0f W continuous is the required figure.", r.ContinuousW)
		}
	}
	return nil
}

// minTiltDeg is the least tilt the optimiser chooses, so that rain runs off
// and cleans the modules (common practice).
const minTiltDeg = 10

// resource computes the monthly resource on the array's plane and the design month.
func (d *run) resource() error {
	s := &d.p.Site
	a := &d.p.Array
	az := *a.AzimuthDeg
	tilt := a.TiltDeg.Value
	if a.TiltDeg.IsAuto {
		t, _, err := array.OptimiseTilt(s.LatitudeDeg, d.ghi, d.dc.DailyWh, az, *s.AlbedoFrac, d.horizon)
		if err != nil {
			return fmt.Errorf("array.tilt_deg: %w", err)
		}
		tilt = t
		if tilt < minTiltDeg {
			d.note("The tilt that serves the worst month best is %.0f°; %g° is used so that rain washes the modules (common practice).", tilt, float64(minTiltDeg))
			tilt = minTiltDeg
		} else {
			d.note("Tilt %.0f° chosen to serve the worst month best (largest demand / plane-of-array irradiation), not the yearly total.", tilt)
		}
	}
	months, err := array.MonthlyResource(s.LatitudeDeg, d.ghi, array.Plane{TiltDeg: tilt, AzimuthDeg: az, AlbedoFraction: *s.AlbedoFrac, Horizon: d.horizon})
	if err != nil {
		return fmt.Errorf("resource: %w", err)
	}
	d.months = months
	var poa [12]float64
	res := &d.r.Resource
	for m, mr := range months {
		poa[m] = mr.POAKWhM2Day
		res.Months[m] = report.ResourceMonth{Month: mr.Month, DayOfYear: mr.DayOfYear, ExtraterrestrialKWhM2Day: mr.ExtraterrestrialKWhM2Day,
			GHIKWhM2Day: mr.GHIKWhM2Day, ClearnessIndex: mr.ClearnessIndex, DiffuseFraction: mr.DiffuseFraction,
			BeamRatio: mr.BeamRatio, POAKWhM2Day: mr.POAKWhM2Day, AirTempC: d.airC[m]}
	}
	res.GHIKWhM2Day, res.POAKWhM2Day = d.ghi, poa
	res.Transposition = a.Transposition
	d.dm = array.DesignMonth(d.dc.DailyWh, poa)
	if d.dm < 1 || d.dm > 12 {
		return errors.New("resource: no design month (no demand in any month?)")
	}
	if poa[d.dm-1] <= 0 {
		return fmt.Errorf("the array receives no sun in month %d, when the loads still draw %.0f Wh/day: a stand-alone PV system cannot serve them (polar night or a horizon that blocks the sun)", d.dm, d.dc.DailyWh[d.dm-1])
	}
	d.r.DesignMonth = d.dm
	d.r.Array.TiltDeg, d.r.Array.TiltOptimised, d.r.Array.AzimuthDeg = tilt, a.TiltDeg.IsAuto, az
	for _, row := range array.SunPath(s.LatitudeDeg) {
		d.r.SunPath = append(d.r.SunPath, report.SunPathRow{Month: row.Month, SolarHour: row.Hour, ElevationDeg: row.ElevationDeg, AzimuthDeg: row.AzimuthDeg})
	}
	return nil
}

func (d *run) hourlySite() array.HourlySite {
	s := &d.p.Site
	model := array.HDKR
	if d.p.Array.Transposition == "isotropic" {
		model = array.IsotropicSky
	}
	return array.HourlySite{LatDeg: s.LatitudeDeg, LonDeg: s.LongitudeDeg, UTCOffsetH: *s.UTCOffsetH,
		Plane: array.Plane{TiltDeg: d.r.Array.TiltDeg, AzimuthDeg: d.r.Array.AzimuthDeg, AlbedoFraction: *s.AlbedoFrac, Horizon: d.horizon},
		Model: model}
}

// airTempC is the air temperature of a clock hour of a month's mean day.
func (d *run) airTempC(month0, hour int) float64 {
	return weather.HourlyAirTempFromRangeC(d.airMinC[month0], d.airMaxC[month0], hour)
}
