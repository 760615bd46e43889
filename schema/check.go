package schema

import (
	"fmt"
	"math"
	"time"
)

// MaxGHIKWhM2Day bounds monthly mean daily horizontal irradiation. Outside
// the atmosphere the daily total on a horizontal surface peaks at about
// 13.5 kWh/m², at a pole at its summer solstice (Duffie & Beckman (2013)
// eq. 1.10.3: 24 h × 1367 W/m² × 1.033 × sin 23.45°); the atmosphere takes
// well over a tenth of that from any monthly mean at the ground, even on the
// clearest polar plateaus (from memory), so no monthly mean reaches 12.
const MaxGHIKWhM2Day = 12.0

// Check checks the physical sense of a decoded document with its defaults
// applied. It reports every problem found in one pass.
func Check(p *Project) Problems {
	var ps Problems
	add := func(path, msg string) { ps = append(ps, Problem{Path: path, Message: msg}) }
	num := func(path string, v *float64, lo, hi float64, loOpen bool) {
		if v == nil {
			return
		}
		checkRange(add, path, *v, lo, hi, loOpen)
	}

	if p.Name == "" {
		add("name", "must not be empty")
	}
	s := &p.Site
	checkRange(add, "site.latitude_deg", s.LatitudeDeg, -90, 90, false)
	checkRange(add, "site.longitude_deg", s.LongitudeDeg, -180, 180, false)
	checkRange(add, "site.elevation_m", s.ElevationM, -450, 9000, false)
	num("site.utc_offset_h", s.UTCOffsetH, -12, 14, false)
	num("site.ground_albedo", s.AlbedoFrac, 0, 1, false)
	haveWeather := s.WeatherFile != ""
	monthly(add, "site.ghi_kwh_m2_day", s.GHIKWhM2Day, 0, MaxGHIKWhM2Day, !haveWeather, "kWh/m²/day (more than the Earth receives)")
	monthly(add, "site.air_temp_c", s.AirTempC, -70, 60, !haveWeather, "°C")
	monthly(add, "site.air_temp_min_c", s.AirTempMinC, -80, 60, false, "°C")
	monthly(add, "site.air_temp_max_c", s.AirTempMaxC, -70, 65, false, "°C")
	if len(s.AirTempMinC) == 12 && len(s.AirTempMaxC) == 12 {
		for m := range 12 {
			if s.AirTempMinC[m] > s.AirTempMaxC[m] {
				add(fmt.Sprintf("site.air_temp_min_c[%d]", m), fmt.Sprintf("daily minimum %g °C is above the daily maximum %g °C", s.AirTempMinC[m], s.AirTempMaxC[m]))
			}
		}
	}
	num("site.record_low_c", s.RecordLowC, -90, 40, false)
	num("site.record_high_c", s.RecordHighC, -40, 65, false)
	if s.RecordLowC != nil && s.RecordHighC != nil && *s.RecordLowC > *s.RecordHighC {
		add("site.record_low_c", fmt.Sprintf("record low %g °C is above the record high %g °C", *s.RecordLowC, *s.RecordHighC))
	}
	if len(s.Horizon) > MaxHorizonPoints {
		add("site.horizon", fmt.Sprintf("has %d points; the limit is %d", len(s.Horizon), MaxHorizonPoints))
	}
	for i, h := range s.Horizon {
		checkRange(add, fmt.Sprintf("site.horizon[%d].azimuth_deg", i), h.AzimuthDeg, 0, 360, false)
		checkRange(add, fmt.Sprintf("site.horizon[%d].elevation_deg", i), h.ElevationDeg, 0, 90, false)
	}

	if len(p.Loads) == 0 {
		add("loads", "must list at least one load")
	}
	// A load with more windows than MaxWindows is reported, and only its
	// first MaxWindows are checked: the overlap check is pairwise.
	loads, copied := p.Loads, false
	for i := range p.Loads {
		if n := len(p.Loads[i].Windows); n > MaxWindows {
			add(fmt.Sprintf("loads[%d].windows", i), fmt.Sprintf("has %d windows; the limit is %d", n, MaxWindows))
			if !copied {
				loads, copied = append([]Load(nil), p.Loads...), true
			}
			loads[i].Windows = loads[i].Windows[:MaxWindows]
		}
	}
	validateLoads(loads, add)
	hasAC := false
	for _, l := range p.Loads {
		if l.Circuit == "ac" {
			hasAC = true
		}
	}

	if v := p.System.NominalV; v.Set && !v.IsAuto {
		switch v.Value {
		case 12, 24, 36, 48:
		default:
			add("system.nominal_v", fmt.Sprintf("must be 12, 24, 36, 48 or \"auto\", got %g", v.Value))
		}
	}

	a := &p.Array
	m := &a.Module
	pos := func(path string, v float64) {
		if !(v > 0) || math.IsInf(v, 0) {
			add(path, fmt.Sprintf("must be greater than 0, got %g", v))
		}
	}
	pos("array.module.pmax_w", m.PmaxW)
	pos("array.module.voc_v", m.VocV)
	pos("array.module.isc_a", m.IscA)
	pos("array.module.vmp_v", m.VmpV)
	pos("array.module.imp_a", m.ImpA)
	if m.VmpV > 0 && m.VocV > 0 && m.VmpV >= m.VocV {
		add("array.module.vmp_v", fmt.Sprintf("must be below voc_v (%g V), got %g V", m.VocV, m.VmpV))
	}
	if m.ImpA > 0 && m.IscA > 0 && m.ImpA > m.IscA {
		add("array.module.imp_a", fmt.Sprintf("must not exceed isc_a (%g A), got %g A", m.IscA, m.ImpA))
	}
	if m.VmpV > 0 && m.ImpA > 0 && m.PmaxW > 0 {
		if r := m.VmpV * m.ImpA / m.PmaxW; r < 0.95 || r > 1.05 {
			add("array.module.pmax_w", fmt.Sprintf("%g W differs from vmp_v × imp_a = %.1f W by more than 5 %%; check the datasheet", m.PmaxW, m.VmpV*m.ImpA))
		}
	}
	num("array.module.temp_coeff_pmax_pct_per_c", m.TempCoeffPmaxPctPerC, -1, 0, false)
	num("array.module.temp_coeff_voc_pct_per_c", m.TempCoeffVocPctPerC, -1, 0, false)
	num("array.module.temp_coeff_isc_pct_per_c", m.TempCoeffIscPctPerC, -0.1, 0.2, false)
	num("array.module.noct_c", m.NOCTC, 25, 75, false)
	num("array.module.max_series_fuse_a", m.MaxSeriesFuseA, 0, 1000, true)
	num("array.module.max_system_v", m.MaxSystemV, 0, 2000, true)
	if a.TiltDeg.Set && !a.TiltDeg.IsAuto {
		checkRange(add, "array.tilt_deg", a.TiltDeg.Value, 0, 90, false)
	}
	num("array.azimuth_deg", a.AzimuthDeg, 0, 360, false)
	for _, d := range []struct {
		path string
		v    *float64
	}{{"array.soiling_loss", a.SoilingLoss}, {"array.mismatch_loss", a.MismatchLoss}, {"array.wiring_loss", a.WiringLoss}, {"array.tolerance_loss", a.ToleranceLoss}} {
		if d.v != nil && (*d.v < 0 || *d.v >= 0.5) {
			add(d.path, fmt.Sprintf("must be a loss fraction from 0 to below 0.5, got %g", *d.v))
		}
	}
	num("array.ageing_loss_per_year", a.AgeingLossPerYear, 0, 0.05, false)
	num("array.design_age_years", a.DesignAgeYears, 0, 40, false)

	c := &p.Controller
	num("controller.max_pv_voltage_v", c.MaxPVVoltageV, 0, 2000, true)
	num("controller.min_mppt_voltage_v", c.MinMPPTVoltageV, 0, 2000, true)
	num("controller.efficiency", c.EfficiencyFraction, 0.5, 1, false)
	num("controller.life_years", c.LifeYears, 0, 50, true)
	for i, r := range c.RatingsA {
		if !(r > 0) {
			add(fmt.Sprintf("controller.ratings_a[%d]", i), fmt.Sprintf("must be greater than 0, got %g", r))
		}
	}

	b := &p.Battery
	pos("battery.block.nominal_v", b.Block.NominalV)
	pos("battery.block.capacity_ah", b.Block.CapacityAh)
	num("battery.block.rated_hours", b.Block.RatedHours, 0, 1000, true)
	num("battery.block.internal_resistance_mohm", b.Block.InternalResMOhm, 0, 10000, true)
	num("battery.block.max_charge_a", b.Block.MaxChargeA, 0, 1e5, true)
	num("battery.block.max_discharge_a", b.Block.MaxDischargeA, 0, 1e5, true)
	num("battery.block.peukert_exponent", b.Block.PeukertExponent, 1, 1.6, false)
	num("battery.max_dod", b.MaxDoD, 0, 1, true)
	num("battery.autonomy_days", b.AutonomyDays, 0, 30, true)
	num("battery.temperature_c", b.TempC, -50, 60, false)
	num("battery.room_volume_m3", b.RoomVolumeM3, 0, 1e6, true)
	num("battery.initial_soc", b.InitialSOC, 0, 1, true)
	num("battery.reconnect_soc", b.ReconnectSOC, 0, 1, true)
	num("battery.noncritical_cutoff_soc", b.NonCritical, 0, 1, false)
	if b.MaxDoD != nil && b.ReconnectSOC != nil && *b.ReconnectSOC <= 1-*b.MaxDoD {
		add("battery.reconnect_soc", fmt.Sprintf("must be above the cut-off state of charge 1 − max_dod = %g, got %g", 1-*b.MaxDoD, *b.ReconnectSOC))
	}
	if v := p.System.NominalV; v.Set && !v.IsAuto && b.Block.NominalV > 0 {
		n := math.Round(v.Value / b.Block.NominalV)
		if n < 1 || math.Abs(n*b.Block.NominalV-v.Value)/v.Value > 0.1 {
			add("battery.block.nominal_v", fmt.Sprintf("%g V blocks cannot make a %g V bank in series", b.Block.NominalV, v.Value))
		}
	}
	if o := b.Overrides; o != nil {
		num("battery.chemistry_overrides.charge_efficiency", o.ChargeEfficiency, 0.5, 1, false)
		num("battery.chemistry_overrides.discharge_efficiency", o.DischargeEfficiency, 0.5, 1, false)
		num("battery.chemistry_overrides.self_discharge_per_month", o.SelfDischargePerMonth, 0, 0.5, false)
		num("battery.chemistry_overrides.calendar_life_years", o.CalendarLifeYears, 0, 50, true)
		num("battery.chemistry_overrides.charge_min_temp_c", o.ChargeMinTempC, -40, 20, false)
		for i, cp := range o.CycleLife {
			checkRange(add, fmt.Sprintf("battery.chemistry_overrides.cycle_life[%d].dod", i), cp.DoD, 0, 1, true)
			if !(cp.Cycles > 0) {
				add(fmt.Sprintf("battery.chemistry_overrides.cycle_life[%d].cycles", i), fmt.Sprintf("must be greater than 0, got %g", cp.Cycles))
			}
			if i > 0 && cp.DoD <= o.CycleLife[i-1].DoD {
				add(fmt.Sprintf("battery.chemistry_overrides.cycle_life[%d].dod", i), "points must be in increasing depth of discharge")
			}
		}
	}

	if hasAC && p.Inverter == nil {
		add("inverter", "is required: the inventory has AC loads")
	}
	if inv := p.Inverter; inv != nil {
		for i, r := range inv.RatingsW {
			if !(r > 0) {
				add(fmt.Sprintf("inverter.ratings_w[%d]", i), fmt.Sprintf("must be greater than 0, got %g", r))
			}
		}
		num("inverter.surge_ratio", inv.SurgeRatio, 1, 10, false)
		num("inverter.margin", inv.Margin, 1, 3, false)
		num("inverter.idle_w", inv.IdleW, 0, 1000, false)
		num("inverter.standby_w", inv.StandbyW, 0, 1000, false)
		num("inverter.wake_threshold_w", inv.WakeThresholdW, 0, 10000, false)
		num("inverter.life_years", inv.LifeYears, 0, 50, true)
		for i, e := range inv.EfficiencyCurve {
			checkRange(add, fmt.Sprintf("inverter.efficiency_curve[%d].load_fraction", i), e.LoadFraction, 0, 2, true)
			checkRange(add, fmt.Sprintf("inverter.efficiency_curve[%d].efficiency", i), e.Efficiency, 0, 1, true)
			if i > 0 && e.LoadFraction <= inv.EfficiencyCurve[i-1].LoadFraction {
				add(fmt.Sprintf("inverter.efficiency_curve[%d].load_fraction", i), "points must be in increasing load fraction")
			}
		}
	}

	w := &p.Wiring
	if w.CableClass != nil && *w.CableClass != 2 && *w.CableClass != 5 {
		add("wiring.cable_class", fmt.Sprintf("must be 2 or 5, got %d", *w.CableClass))
	}
	for _, l := range []struct {
		path string
		v    *float64
	}{{"wiring.pv_string_m", w.PVStringM}, {"wiring.array_to_controller_m", w.ArrayToCtrlM}, {"wiring.controller_to_battery_m", w.CtrlToBatteryM}, {"wiring.battery_to_inverter_m", w.BatteryToInvM}, {"wiring.battery_to_dc_panel_m", w.BatteryToPanelM}} {
		num(l.path, l.v, 0, 2000, false)
	}
	num("wiring.pv_max_drop_pct", w.PVDropPct, 0, 20, true)
	num("wiring.battery_max_drop_pct", w.BatteryDropPct, 0, 20, true)
	num("wiring.branch_max_drop_pct", w.BranchDropPct, 0, 20, true)
	names := map[string]bool{}
	for _, l := range p.Loads {
		if l.Circuit == "dc" {
			names[l.Name] = true
		}
	}
	for i, br := range w.Branches {
		path := fmt.Sprintf("wiring.dc_branches[%d]", i)
		if br.Name == "" {
			add(path+".name", "must not be empty")
		}
		checkRange(add, path+".length_m", br.LengthM, 0, 2000, true)
		num(path+".current_a", br.CurrentA, 0, 1000, true)
		if br.CurrentA == nil && len(br.Loads) == 0 {
			add(path, "needs loads or current_a")
		}
		for j, n := range br.Loads {
			if !names[n] {
				add(fmt.Sprintf("%s.loads[%d]", path, j), fmt.Sprintf("no DC load is named %q", n))
			}
		}
	}

	k := &p.Costs
	for _, c := range []struct {
		path string
		v    *float64
	}{{"costs.module_each", k.ModuleEach}, {"costs.controller_each", k.ControllerEach}, {"costs.battery_block_each", k.BatteryBlockEach}, {"costs.inverter_each", k.InverterEach}, {"costs.fuse_each", k.FuseEach}, {"costs.breaker_each", k.BreakerEach}, {"costs.combiner_each", k.CombinerEach}, {"costs.cable_per_m_per_mm2", k.CablePerMPerMM2}, {"costs.mounting_per_module", k.MountingPerModule}, {"costs.installation", k.Installation}, {"costs.om_per_year", k.OMPerYear}} {
		if c.v != nil && (*c.v < 0 || math.IsInf(*c.v, 0)) {
			add(c.path, fmt.Sprintf("must not be negative, got %g", *c.v))
		}
	}
	num("costs.discount_rate", k.DiscountRate, 0, 0.5, false)
	num("costs.analysis_years", k.AnalysisYears, 1, 60, false)

	sim := &p.Simulation
	if sim.Years != nil && (*sim.Years < 1 || *sim.Years > 1000) {
		add("simulation.years", fmt.Sprintf("must be from 1 to 1000, got %d", *sim.Years))
	}
	num("simulation.lag_one_correlation", sim.LagOneCorrelation, -0.95, 0.95, false)
	num("simulation.daily_swing_c", sim.DailySwingC, 0, 40, false)
	num("simulation.target_lolp", sim.TargetLOLP, 0, 1, true)
	if sim.TargetLOLP != nil && *sim.TargetLOLP >= 1 {
		add("simulation.target_lolp", fmt.Sprintf("must be below 1, got %g", *sim.TargetLOLP))
	}
	if sim.CloudyStreakDays != nil && (*sim.CloudyStreakDays < 1 || *sim.CloudyStreakDays > 60) {
		add("simulation.cloudy_streak_days", fmt.Sprintf("must be from 1 to 60, got %d", *sim.CloudyStreakDays))
	}
	num("simulation.cloudy_streak_fraction", sim.CloudyStreakFrac, 0, 1, false)

	if d := p.Output.Date; d != "" {
		if _, err := time.Parse("2006-01-02", d); err != nil {
			add("output.date", fmt.Sprintf("must be a date YYYY-MM-DD, got %q", d))
		}
	}
	return ps
}

func checkRange(add func(string, string), path string, v, lo, hi float64, loOpen bool) {
	switch {
	case math.IsNaN(v) || math.IsInf(v, 0):
		add(path, fmt.Sprintf("must be a finite number, got %g", v))
	case loOpen && lo == 0 && v <= 0:
		add(path, fmt.Sprintf("must be greater than 0, got %g", v))
	case loOpen && v <= lo:
		add(path, fmt.Sprintf("must be greater than %g, got %g", lo, v))
	case v < lo:
		add(path, fmt.Sprintf("must be at least %g, got %g", lo, v))
	case v > hi:
		add(path, fmt.Sprintf("must be at most %g, got %g", hi, v))
	}
}

func monthly(add func(string, string), path string, v []float64, lo, hi float64, required bool, unit string) {
	if len(v) == 0 {
		if required {
			add(path, "is required (12 monthly values, January to December) unless a weather file is given")
		}
		return
	}
	if len(v) != 12 {
		add(path, fmt.Sprintf("must have 12 monthly values, January to December, got %d", len(v)))
		return
	}
	for i, x := range v {
		if x < lo || x > hi || math.IsNaN(x) {
			add(fmt.Sprintf("%s[%d]", path, i), fmt.Sprintf("must be from %g to %g %s, got %g", lo, hi, unit, x))
		}
	}
}
