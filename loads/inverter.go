package loads

import (
	"fmt"
	"math"
	"slices"

	"solstand/schema"
)

// Inverter defaults (common practice).
const (
	// DefaultInverterMargin is the continuous rating over the peak AC load
	// (common practice 1.25).
	DefaultInverterMargin = 1.25
	// DefaultSurgeRatio is the surge rating of an inverter as a multiple of
	// its continuous rating (common practice 2).
	DefaultSurgeRatio = 2.0
	// DefaultIdleFraction is the no-load consumption as a fraction of the
	// continuous rating (common practice 1 %).
	DefaultIdleFraction = 0.01
)

// InverterSizing is the inverter the AC loads need, and its own
// consumption. It is the zero value (Needed false) when there are no AC
// loads.
type InverterSizing struct {
	// Needed is true when any load is AC.
	Needed bool
	// RequiredContinuousW is margin × peak AC running power.
	RequiredContinuousW float64
	// ContinuousW is the continuous rating chosen: the smallest of
	// inverter.ratings_w that fits both figures (FromList), or else the
	// larger of RequiredContinuousW and RequiredSurgeW / surge ratio, so
	// that an inverter of the usual surge ratio also starts the surge.
	ContinuousW float64
	// RequiredSurgeW is the surge the inverter must start (Profile.SurgeACW).
	RequiredSurgeW float64
	// SurgeW is the surge rating of the chosen inverter: surge ratio ×
	// ContinuousW.
	SurgeW float64
	// SurgeRatio is the surge rating over the continuous rating used.
	SurgeRatio float64
	// Margin is the continuous margin used over the peak AC load.
	Margin float64
	// IdleW is the consumption when on with no load.
	IdleW float64
	// StandbyW is the consumption in standby (search) mode; only used with
	// a wake threshold.
	StandbyW float64
	// WakeThresholdW is the AC load below which the inverter sleeps in
	// standby; 0 = always on.
	WakeThresholdW float64
	// FromList is true when ContinuousW was picked from inverter.ratings_w;
	// otherwise it is the required figure.
	FromList bool
	// SizedBySurge is true when the surge, not the continuous load, set the
	// rating.
	SizedBySurge bool
}

// SizeInverter sizes the inverter of a profile: a continuous rating of at
// least margin × the peak AC load (default margin 1.25, common practice)
// and a surge rating (surge_ratio × continuous, default 2, common practice)
// of at least Profile.SurgeACW. With inverter.ratings_w the smallest rating
// meeting both is chosen; a rating whose surge falls short is skipped. When
// none fits, the error says which figure failed. Idle consumption defaults
// to 1 % of the chosen rating (common practice); a standby power without a
// wake threshold is ignored, and a wake threshold without a standby power
// takes the idle power (no saving assumed).
//
// A zero schema.Inverter takes all defaults. With no AC loads the result is
// the zero value and no error.
func SizeInverter(p Profile, inv schema.Inverter) (InverterSizing, error) {
	if !p.HasAC {
		return InverterSizing{}, nil
	}
	s := InverterSizing{Needed: true, Margin: DefaultInverterMargin, SurgeRatio: DefaultSurgeRatio}
	if inv.Margin != nil {
		if !(*inv.Margin >= 1) || math.IsInf(*inv.Margin, 0) {
			return InverterSizing{}, fmt.Errorf("inverter.margin: must be at least 1, got %g", *inv.Margin)
		}
		s.Margin = *inv.Margin
	}
	if inv.SurgeRatio != nil {
		if !(*inv.SurgeRatio >= 1) || math.IsInf(*inv.SurgeRatio, 0) {
			return InverterSizing{}, fmt.Errorf("inverter.surge_ratio: must be at least 1, got %g", *inv.SurgeRatio)
		}
		s.SurgeRatio = *inv.SurgeRatio
	}
	s.RequiredContinuousW = s.Margin * p.PeakACW
	s.RequiredSurgeW = p.SurgeACW

	if len(inv.RatingsW) == 0 {
		s.ContinuousW = s.RequiredContinuousW
		if bySurge := s.RequiredSurgeW / s.SurgeRatio; bySurge > s.ContinuousW {
			s.ContinuousW = bySurge
			s.SizedBySurge = true
		}
	} else {
		ratings := slices.Clone(inv.RatingsW)
		slices.Sort(ratings)
		for j, r := range ratings {
			if !finitePos(r) {
				return InverterSizing{}, fmt.Errorf("inverter.ratings_w: must all be greater than 0, got %g", inv.RatingsW[j])
			}
		}
		largest := ratings[len(ratings)-1]
		if largest < s.RequiredContinuousW {
			return InverterSizing{}, fmt.Errorf("inverter.ratings_w: no rating reaches the continuous %.0f W (%g × peak AC load %.0f W); the largest is %g W",
				s.RequiredContinuousW, s.Margin, p.PeakACW, largest)
		}
		found, contOnly := false, 0.0
		for _, r := range ratings {
			if r < s.RequiredContinuousW {
				continue
			}
			if contOnly == 0 {
				contOnly = r
			}
			if s.SurgeRatio*r >= s.RequiredSurgeW {
				s.ContinuousW, found = r, true
				break
			}
		}
		if !found {
			return InverterSizing{}, fmt.Errorf("inverter.ratings_w: no rating starts the surge of %.0f W at surge_ratio %g (the largest, %g W, gives %.0f W)",
				s.RequiredSurgeW, s.SurgeRatio, largest, s.SurgeRatio*largest)
		}
		s.FromList = true
		s.SizedBySurge = s.ContinuousW > contOnly
	}
	s.SurgeW = s.SurgeRatio * s.ContinuousW

	s.IdleW = DefaultIdleFraction * s.ContinuousW
	if inv.IdleW != nil {
		if !(*inv.IdleW >= 0) || math.IsInf(*inv.IdleW, 0) {
			return InverterSizing{}, fmt.Errorf("inverter.idle_w: must not be negative, got %g", *inv.IdleW)
		}
		s.IdleW = *inv.IdleW
	}
	if inv.WakeThresholdW != nil {
		if !(*inv.WakeThresholdW >= 0) || math.IsInf(*inv.WakeThresholdW, 0) {
			return InverterSizing{}, fmt.Errorf("inverter.wake_threshold_w: must not be negative, got %g", *inv.WakeThresholdW)
		}
		s.WakeThresholdW = *inv.WakeThresholdW
		s.StandbyW = s.IdleW
		if inv.StandbyW != nil {
			if !(*inv.StandbyW >= 0) || math.IsInf(*inv.StandbyW, 0) {
				return InverterSizing{}, fmt.Errorf("inverter.standby_w: must not be negative, got %g", *inv.StandbyW)
			}
			s.StandbyW = *inv.StandbyW
		}
	}
	return s, nil
}

// DefaultEfficiencyCurve is the inverter efficiency against load fraction
// used when the project gives none: 0.05:0.70 0.1:0.82 0.25:0.90 0.5:0.93
// 1.0:0.92 (common practice: the shape of a small stand-alone sine-wave
// inverter, poor at light load). It returns a new slice each call.
func DefaultEfficiencyCurve() []schema.EfficiencyPoint {
	return []schema.EfficiencyPoint{
		{LoadFraction: 0.05, Efficiency: 0.70},
		{LoadFraction: 0.10, Efficiency: 0.82},
		{LoadFraction: 0.25, Efficiency: 0.90},
		{LoadFraction: 0.50, Efficiency: 0.93},
		{LoadFraction: 1.00, Efficiency: 0.92},
	}
}

// CheckEfficiencyCurve reports the first problem of an efficiency curve:
// load fractions must be finite, non-negative and distinct, efficiencies in
// (0, 1]. An empty curve is fine (the default is used).
func CheckEfficiencyCurve(curve []schema.EfficiencyPoint) error {
	seen := map[float64]bool{}
	for i, pt := range curve {
		if !(pt.LoadFraction >= 0) || math.IsInf(pt.LoadFraction, 0) {
			return fmt.Errorf("inverter.efficiency_curve[%d].load_fraction: must not be negative, got %g", i, pt.LoadFraction)
		}
		if seen[pt.LoadFraction] {
			return fmt.Errorf("inverter.efficiency_curve[%d].load_fraction: repeats %g", i, pt.LoadFraction)
		}
		seen[pt.LoadFraction] = true
		if !(pt.Efficiency > 0 && pt.Efficiency <= 1) {
			return fmt.Errorf("inverter.efficiency_curve[%d].efficiency: must be greater than 0 and at most 1, got %g", i, pt.Efficiency)
		}
	}
	return nil
}

// Efficiency is the inverter efficiency at a load fraction (output power
// over continuous rating), by linear interpolation between the points of
// the curve (in any order), held at the first and last point outside them.
// An empty curve means DefaultEfficiencyCurve.
func Efficiency(curve []schema.EfficiencyPoint, loadFraction float64) float64 {
	if len(curve) == 0 {
		curve = DefaultEfficiencyCurve()
	}
	if !slices.IsSortedFunc(curve, cmpPoint) {
		curve = slices.Clone(curve)
		slices.SortFunc(curve, cmpPoint)
	}
	return interp(curve, loadFraction)
}

func cmpPoint(a, b schema.EfficiencyPoint) int {
	switch {
	case a.LoadFraction < b.LoadFraction:
		return -1
	case a.LoadFraction > b.LoadFraction:
		return 1
	}
	return 0
}

// interp interpolates a sorted, non-empty curve.
func interp(curve []schema.EfficiencyPoint, x float64) float64 {
	if math.IsNaN(x) || x <= curve[0].LoadFraction {
		return curve[0].Efficiency
	}
	last := curve[len(curve)-1]
	if x >= last.LoadFraction {
		return last.Efficiency
	}
	for i := 1; i < len(curve); i++ {
		a, b := curve[i-1], curve[i]
		if x <= b.LoadFraction {
			t := (x - a.LoadFraction) / (b.LoadFraction - a.LoadFraction)
			return a.Efficiency + t*(b.Efficiency-a.Efficiency)
		}
	}
	return last.Efficiency
}

// DCSide is the demand seen from the DC bus (battery and controller side).
// Index [month-1][hour].
type DCSide struct {
	// CriticalWh and NonCriticalWh are the energy drawn from the DC bus in
	// each clock hour of each month's mean day, split by priority: DC loads
	// + AC loads / η(part load), with the inverter's own consumption counted
	// as critical.
	CriticalWh, NonCriticalWh [12][24]float64
	// ApplianceCriticalWh and ApplianceNonCriticalWh are what the appliances
	// receive.
	ApplianceCriticalWh, ApplianceNonCriticalWh [12][24]float64
	// InverterLossWh is the conversion loss plus idle or standby consumption.
	InverterLossWh [12][24]float64
	// DailyWh is the DC-side energy per day of each month (inverter losses
	// included): CONTRACT demand.daily_wh.
	DailyWh [12]float64
	// InverterLossDailyWh is the day sum of InverterLossWh.
	InverterLossDailyWh [12]float64
}

// DCDemand is the energy the loads draw from the DC bus, hour by hour:
// DC loads, plus each hour's AC energy divided by the inverter efficiency
// at that hour's part load, plus the inverter's idle consumption (or its
// standby consumption in an hour whose mean AC power is below the wake
// threshold).
//
// The part load of an hour is its mean AC power, ACWh[m][h] (Wh in one
// hour), over ContinuousW. The efficiency curve is read as the conversion
// efficiency of the power passed through; the idle consumption is added on
// top. The inverter is taken to be switched on all day in every month with
// any AC energy, and off in a month without; with no AC loads there is no
// inverter energy at all. An empty or unusable curve (see
// CheckEfficiencyCurve) means DefaultEfficiencyCurve; a ContinuousW of 0
// with AC loads present is read at full load.
func DCDemand(p Profile, inv InverterSizing, curve []schema.EfficiencyPoint) DCSide {
	if len(curve) == 0 || CheckEfficiencyCurve(curve) != nil {
		curve = DefaultEfficiencyCurve()
	} else {
		curve = slices.Clone(curve)
		slices.SortFunc(curve, cmpPoint)
	}
	var d DCSide
	for m := range 12 {
		inverterOn := p.HasAC && p.ACDailyWh[m] > 0
		for h := range 24 {
			acCrit := p.CriticalACWh[m][h]
			acNon := p.ACWh[m][h] - acCrit
			dcCrit := p.CriticalDCWh[m][h]
			dcNon := p.DCWh[m][h] - dcCrit
			d.ApplianceCriticalWh[m][h] = acCrit + dcCrit
			d.ApplianceNonCriticalWh[m][h] = acNon + dcNon
			d.CriticalWh[m][h] = dcCrit
			d.NonCriticalWh[m][h] = dcNon
			if !inverterOn {
				continue
			}
			acW := p.ACWh[m][h] // Wh in one hour = mean W
			frac := 1.0
			if inv.ContinuousW > 0 {
				frac = acW / inv.ContinuousW
			}
			eta := interp(curve, frac)
			own := inv.IdleW
			if inv.WakeThresholdW > 0 && acW < inv.WakeThresholdW {
				own = inv.StandbyW
			}
			d.CriticalWh[m][h] += acCrit/eta + own
			d.NonCriticalWh[m][h] += acNon / eta
			d.InverterLossWh[m][h] = acW/eta - acW + own
		}
		for h := range 24 {
			d.DailyWh[m] += d.CriticalWh[m][h] + d.NonCriticalWh[m][h]
			d.InverterLossDailyWh[m] += d.InverterLossWh[m][h]
		}
	}
	return d
}
