package array

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"solstand/caution"
)

// ControllerKind is the charge controller's way of loading the array.
type ControllerKind int

const (
	// MPPT controllers track the array's maximum power point and convert it
	// down to battery voltage.
	MPPT ControllerKind = iota
	// PWM controllers connect the array to the battery, so the array works
	// at battery voltage.
	PWM
)

// String is "mppt" or "pwm", as in CONTRACT.md.
func (k ControllerKind) String() string {
	switch k {
	case MPPT:
		return "mppt"
	case PWM:
		return "pwm"
	}
	return fmt.Sprintf("ControllerKind(%d)", int(k))
}

// Controller is a charge controller. MaxPVVoltageV is the highest array
// voltage it survives; MinMPPTVoltageV the lowest at which an MPPT unit
// tracks (0 if not stated); EfficiencyFraction the conversion (MPPT) or
// switch (PWM) efficiency; MaxOutputA the output current limit of the
// controllers in service together (0 = no limit); RatingsA the catalogue of
// output-current ratings to choose from.
type Controller struct {
	Kind                                                           ControllerKind
	MaxPVVoltageV, MinMPPTVoltageV, EfficiencyFraction, MaxOutputA float64
	RatingsA                                                       []float64
}

// Derates are the array's loss fractions (0–1), each applied as a factor
// (1 − loss); ageing is per year of service.
type Derates struct {
	SoilingLoss, MismatchLoss, WiringLoss, ToleranceLoss, AgeingLossPerYear float64
}

// DefaultDerates are the derates used when a project gives none: soiling 5 %,
// mismatch 2 %, DC wiring 3 %, module tolerance 2 % and ageing 0.5 % per
// year (all common practice).
func DefaultDerates() Derates {
	return Derates{SoilingLoss: 0.05, MismatchLoss: 0.02, WiringLoss: 0.03, ToleranceLoss: 0.02, AgeingLossPerYear: 0.005}
}

// Validate checks every loss lies in [0, 1).
func (d Derates) Validate() error {
	for _, l := range []struct {
		name string
		v    float64
	}{{"soiling_loss", d.SoilingLoss}, {"mismatch_loss", d.MismatchLoss}, {"wiring_loss", d.WiringLoss}, {"tolerance_loss", d.ToleranceLoss}, {"ageing_loss_per_year", d.AgeingLossPerYear}} {
		if math.IsNaN(l.v) || l.v < 0 || l.v >= 1 {
			return fmt.Errorf("derates: %s %g outside [0, 1)", l.name, l.v)
		}
	}
	return nil
}

// AgeingFactor is 1 − ageing × years (linear degradation), never below 0.
func (d Derates) AgeingFactor(years float64) float64 {
	return math.Max(0, 1-d.AgeingLossPerYear*math.Max(0, years))
}

// Factor is the product of (1 − loss) over soiling, mismatch, wiring and
// tolerance, times the ageing factor after years of service.
func (d Derates) Factor(years float64) float64 {
	f := (1 - d.SoilingLoss) * (1 - d.MismatchLoss) * (1 - d.WiringLoss) * (1 - d.ToleranceLoss) * d.AgeingFactor(years)
	return math.Max(0, f)
}

// MPPTHeadroomV is the margin by which an MPPT controller's input must exceed
// the battery charging voltage to charge (common practice: about 5 V).
const MPPTHeadroomV = 5.0

// PWMHeadroomFraction is the margin by which the string's hot Vmp should
// exceed the charging voltage under PWM before a warning is raised; a margin
// of our own choosing that covers cable and controller drops.
const PWMHeadroomFraction = 0.05

// StringLayout is the array's arrangement: modules in series per string,
// strings in parallel, their product, and the string's open-circuit voltage
// at the record low and maximum-power voltage at the hottest cell.
type StringLayout struct {
	ModulesSeries, Strings, Modules int
	VocColdV, VmpHotV               float64
	Cautions                        []caution.Caution
}

// ErrVoltageWindow is wrapped by LayoutStrings when no series count keeps the
// string's cold open-circuit voltage under the controller's limit.
var ErrVoltageWindow = errors.New("no series count fits the controller's voltage limit")

// moduleVocCold is one module's Voc at the record low: by its coefficient
// when the datasheet gives one, else by NEC Table 690.7(A).
func moduleVocCold(m Module, recordLowC float64) float64 {
	if m.TempCoeffVocPctPerC != 0 {
		return math.Max(m.VocV, VocAtTempV(m, recordLowC))
	}
	return m.VocV * NEC690_7Factor(recordLowC)
}

// moduleNominalV is the battery voltage one module suits under PWM: 12 V per
// 36 cells, i.e. per about 17.5 V of Vmp (common practice).
func moduleNominalV(m Module) float64 {
	return 12 * math.Max(1, math.Round(m.VmpV/17.5))
}

// LayoutStrings arranges modules m into strings for controller c, battery
// nominal voltage nominalV and charging voltage chargeV, record low ambient
// recordLowC (the cell at dawn) and highest cell temperature maxCellC, to
// reach at least requiredW of rated power.
//
// Cold Voc uses the module's Voc coefficient, or NEC Table 690.7(A) when the
// coefficient is zero (NEC 690.7(A)). MPPT: the series count lies between
// the hot-Vmp minimum (the larger of MinMPPTVoltageV and chargeV +
// MPPTHeadroomV) and the cold-Voc maximum (the controller's MaxPVVoltageV and
// the module's MaxSystemV); among those, the count that needs the fewest
// modules wins, ties to the higher voltage. PWM: modules in series so their
// nominal voltage (12 V per 36 cells) matches the battery's. Strings =
// ceil(requiredW / (series × Pmax)), at least 1.
//
// Cautions: a string whose cold Voc exceeds the controller's limit is
// danger (it destroys the controller; the layout is then returned with
// ErrVoltageWindow); a hot Vmp below what the controller needs to charge is
// a warning; three or more strings in parallel need a fuse in each string
// (common practice) is info.
func LayoutStrings(m Module, c Controller, nominalV, chargeV, recordLowC, maxCellC float64, requiredW float64) (StringLayout, error) {
	var l StringLayout
	if err := m.Validate(); err != nil {
		return l, fmt.Errorf("layout strings: %w", err)
	}
	for _, v := range []struct {
		name string
		v    float64
	}{{"nominal voltage", nominalV}, {"charge voltage", chargeV}} {
		if !(v.v > 0) || math.IsInf(v.v, 0) {
			return l, fmt.Errorf("layout strings: %s %g must be positive", v.name, v.v)
		}
	}
	if math.IsNaN(recordLowC) || math.IsNaN(maxCellC) || recordLowC > maxCellC {
		return l, fmt.Errorf("layout strings: record low %g °C must not exceed the hottest cell %g °C", recordLowC, maxCellC)
	}
	if math.IsNaN(requiredW) || requiredW < 0 || math.IsInf(requiredW, 0) {
		return l, fmt.Errorf("layout strings: required power %g W must be a non-negative number", requiredW)
	}
	vocCold := moduleVocCold(m, recordLowC)
	vmpHot := VmpAtTempV(m, maxCellC)
	if !(vmpHot > 0) {
		return l, fmt.Errorf("layout strings: Vmp at %g °C is not positive", maxCellC)
	}
	maxV := math.Inf(1)
	if c.MaxPVVoltageV > 0 {
		maxV = c.MaxPVVoltageV
	}
	if m.MaxSystemV > 0 {
		maxV = math.Min(maxV, m.MaxSystemV)
	}
	stringsFor := func(n int) int {
		s := int(math.Ceil(requiredW/(float64(n)*m.PmaxW) - 1e-9))
		if s < 1 {
			s = 1
		}
		return s
	}
	var series int
	var windowErr error
	switch c.Kind {
	case MPPT:
		if !(c.MaxPVVoltageV > 0) {
			return l, fmt.Errorf("layout strings: MPPT controller needs max_pv_voltage_v")
		}
		minV := math.Max(c.MinMPPTVoltageV, chargeV+MPPTHeadroomV)
		nMin := int(math.Ceil(minV/vmpHot - 1e-9))
		if nMin < 1 {
			nMin = 1
		}
		nMax := int(math.Floor(maxV/vocCold + 1e-9))
		switch {
		case nMax < 1:
			series = 1
			windowErr = ErrVoltageWindow
		case nMin > nMax:
			series = nMax
		default:
			best := -1
			for n := nMin; n <= nMax; n++ {
				if best < 0 || n*stringsFor(n) <= best*stringsFor(best) {
					best = n
				}
			}
			series = best
		}
	case PWM:
		series = int(math.Round(nominalV / moduleNominalV(m)))
		if series < 1 {
			series = 1
		}
		if !math.IsInf(maxV, 1) && float64(series)*vocCold > maxV {
			windowErr = ErrVoltageWindow
		}
	default:
		return l, fmt.Errorf("layout strings: unknown controller kind %d", int(c.Kind))
	}
	l.ModulesSeries = series
	l.Strings = stringsFor(series)
	l.Modules = l.ModulesSeries * l.Strings
	l.VocColdV = float64(series) * vocCold
	l.VmpHotV = float64(series) * vmpHot
	l.Cautions = CheckStringVoltages(m, c, series, l.Strings, chargeV, recordLowC, maxCellC)
	if windowErr != nil {
		return l, fmt.Errorf("layout strings: %w: one module's cold Voc is %.1f V, the limit %.1f V", windowErr, vocCold, maxV)
	}
	return l, nil
}

// CheckStringVoltages lists the cautions of a given layout (series modules
// per string, strings in parallel) on controller c at charging voltage
// chargeV, record low recordLowC and hottest cell maxCellC; see
// LayoutStrings.
func CheckStringVoltages(m Module, c Controller, series, strings int, chargeV, recordLowC, maxCellC float64) []caution.Caution {
	var out []caution.Caution
	vocCold := float64(series) * moduleVocCold(m, recordLowC)
	vmpHot := float64(series) * VmpAtTempV(m, maxCellC)
	if c.MaxPVVoltageV > 0 && vocCold > c.MaxPVVoltageV {
		out = append(out, caution.Caution{Code: "pv-voc-over-controller-limit", Severity: caution.Danger,
			Message: fmt.Sprintf("String open-circuit voltage reaches %.1f V at %.0f °C, above the controller's %.0f V limit: this destroys the controller. Use fewer modules in series.", vocCold, recordLowC, c.MaxPVVoltageV)})
	}
	if m.MaxSystemV > 0 && vocCold > m.MaxSystemV {
		out = append(out, caution.Caution{Code: "pv-voc-over-module-rating", Severity: caution.Danger,
			Message: fmt.Sprintf("String open-circuit voltage reaches %.1f V at %.0f °C, above the module's %.0f V maximum system voltage.", vocCold, recordLowC, m.MaxSystemV)})
	}
	switch c.Kind {
	case MPPT:
		need := math.Max(c.MinMPPTVoltageV, chargeV+MPPTHeadroomV)
		if vmpHot < need {
			out = append(out, caution.Caution{Code: "pv-vmp-hot-below-mppt-window", Severity: caution.Warning,
				Message: fmt.Sprintf("String maximum-power voltage falls to %.1f V with cells at %.0f °C, below the %.1f V the controller needs to charge: output drops on hot days.", vmpHot, maxCellC, need)})
		}
	case PWM:
		if vmpHot < chargeV*(1+PWMHeadroomFraction) {
			out = append(out, caution.Caution{Code: "pv-vmp-hot-near-charge-voltage", Severity: caution.Warning,
				Message: fmt.Sprintf("String maximum-power voltage falls to %.1f V with cells at %.0f °C, close to the %.1f V charging voltage: the PWM controller cannot finish charging on hot days.", vmpHot, maxCellC, chargeV)})
		}
	}
	if strings >= 3 {
		msg := "Three or more strings in parallel: fit a fuse in each string"
		if m.MaxSeriesFuseA > 0 {
			msg += fmt.Sprintf(", rated at least %.1f A (1.56 × Isc, NEC 690.8) and not above the module's %.0f A series fuse rating", 1.5625*m.IscA, m.MaxSeriesFuseA)
		}
		out = append(out, caution.Caution{Code: "pv-string-fuses", Severity: caution.Info, Message: msg + "."})
	}
	return out
}

// SizingChain is every factor between the design month's DC demand and the
// array's rated power.
type SizingChain struct {
	// TemperatureFactor is 1 + γ(T_c − 25) at the design month's daytime
	// cell temperature (see TemperatureFactor).
	TemperatureFactor float64
	// Derates and AgeYears give Derates.Factor(AgeYears).
	Derates  Derates
	AgeYears float64
	// ControllerFactor is the MPPT tracker efficiency, or for PWM the
	// fraction of maximum power delivered at battery voltage (PWMFactor)
	// times the switch efficiency.
	ControllerFactor float64
	// BatteryShareFraction is the share of the daily energy that passes
	// through the battery (night loads), and BatteryChargeEfficiency the
	// round-trip efficiency of that path.
	BatteryShareFraction, BatteryChargeEfficiency float64
}

// ArraySizing is the result of RequiredArrayW: the power and each factor of
// the chain, for display.
type ArraySizing struct {
	RequiredW                                                        float64
	DemandWhDay, PeakSunHoursH                                       float64
	TemperatureFactor                                                float64
	SoilingFactor, MismatchFactor, WiringFactor, ToleranceFactor     float64
	AgeingFactor, ControllerFactor, BatteryPathFactor, OverallFactor float64
}

// TemperatureFactor is the power factor 1 + γ(T_c − 25) of module m at cell
// temperature cellTempC, never below 0.
func TemperatureFactor(m Module, cellTempC float64) float64 {
	return math.Max(0, 1+m.TempCoeffPmaxPctPerC/100*(cellTempC-STCCellTempC))
}

// PWMFactor is the fraction of the maximum power a string of series modules
// m delivers when a PWM controller holds it at battery voltage batteryV, for
// irradiance poaWM2 and cell temperature cellTempC (ModuleCurrentAtVoltageA
// against ModuleMPPW).
func PWMFactor(m Module, poaWM2, cellTempC, batteryV float64, series int) float64 {
	if series < 1 {
		return 0
	}
	mpp := ModuleMPPW(m, poaWM2, cellTempC)
	if mpp <= 0 {
		return 0
	}
	v := batteryV / float64(series)
	return math.Min(1, v*ModuleCurrentAtVoltageA(m, poaWM2, cellTempC, v)/mpp)
}

// RequiredArrayW is the rated (STC) array power that covers designDemandWhDay
// of DC energy per day in the design month with poaKWhM2Day on the plane,
// the stand-alone sizing of IEEE 1562 and the Sandia (1995) handbook:
//
//	P = E / (PSH × f_temp × f_soiling × f_mismatch × f_wiring × f_tolerance × f_ageing × f_controller × f_battery)
//
// where PSH is the peak sun hours (kWh/m²/day at 1 kW/m²) and
// f_battery = 1 / ((1 − s) + s/η) for the share s of energy that passes
// through the battery at charge-path efficiency η.
func RequiredArrayW(designDemandWhDay, poaKWhM2Day float64, chain SizingChain) (ArraySizing, error) {
	var a ArraySizing
	if math.IsNaN(designDemandWhDay) || designDemandWhDay < 0 || math.IsInf(designDemandWhDay, 0) {
		return a, fmt.Errorf("array sizing: demand %g Wh/day must be a non-negative number", designDemandWhDay)
	}
	if err := chain.Derates.Validate(); err != nil {
		return a, fmt.Errorf("array sizing: %w", err)
	}
	if !(chain.TemperatureFactor > 0) || !(chain.ControllerFactor > 0) || chain.ControllerFactor > 1 {
		return a, fmt.Errorf("array sizing: temperature factor %g and controller factor %g must be positive (controller at most 1)", chain.TemperatureFactor, chain.ControllerFactor)
	}
	s, eta := chain.BatteryShareFraction, chain.BatteryChargeEfficiency
	if math.IsNaN(s) || s < 0 || s > 1 {
		return a, fmt.Errorf("array sizing: battery share %g outside [0, 1]", s)
	}
	if s > 0 && (!(eta > 0) || eta > 1) {
		return a, fmt.Errorf("array sizing: battery charge efficiency %g outside (0, 1]", eta)
	}
	d := chain.Derates
	a.DemandWhDay = designDemandWhDay
	a.PeakSunHoursH = poaKWhM2Day
	a.TemperatureFactor = chain.TemperatureFactor
	a.SoilingFactor = 1 - d.SoilingLoss
	a.MismatchFactor = 1 - d.MismatchLoss
	a.WiringFactor = 1 - d.WiringLoss
	a.ToleranceFactor = 1 - d.ToleranceLoss
	a.AgeingFactor = d.AgeingFactor(chain.AgeYears)
	a.ControllerFactor = chain.ControllerFactor
	a.BatteryPathFactor = 1
	if s > 0 {
		a.BatteryPathFactor = 1 / ((1 - s) + s/eta)
	}
	a.OverallFactor = a.TemperatureFactor * a.SoilingFactor * a.MismatchFactor * a.WiringFactor *
		a.ToleranceFactor * a.AgeingFactor * a.ControllerFactor * a.BatteryPathFactor
	if designDemandWhDay == 0 {
		return a, nil
	}
	if !(poaKWhM2Day > 0) || math.IsInf(poaKWhM2Day, 0) || !(a.OverallFactor > 0) {
		return a, fmt.Errorf("array sizing: demand of %g Wh/day cannot be met with %g kWh/m²/day on the plane and an overall factor of %g", designDemandWhDay, poaKWhM2Day, a.OverallFactor)
	}
	a.RequiredW = designDemandWhDay / (poaKWhM2Day * a.OverallFactor)
	return a, nil
}

// ControllerSizing is the controller rating chosen: the current the method
// asks for, the rating of each unit, and how many units work in parallel.
type ControllerSizing struct {
	RequiredA, RatedA float64
	Units             int
}

// ControllerMarginFactor is the margin on MPPT output current (common
// practice: 1.25).
const ControllerMarginFactor = 1.25

// SizeController picks the controller rating. MPPT: required output current
// = arrayW / chargeV × ControllerMarginFactor (common practice). PWM:
// required = 1.25 × Isc × strings (NEC 690.8(A)(1), maximum circuit current)
// × 1.25 (NEC 690.8(B), continuous duty). The smallest rating in RatingsA
// (or MaxOutputA, when no list is given) that covers it is chosen; when none
// does, the fewest units in parallel of the smallest rating that together
// cover it. With no ratings at all, RatedA is RequiredA rounded up to a whole
// ampere. Units in parallel need the array split between them.
func SizeController(c Controller, layout StringLayout, m Module, arrayW, chargeV float64) (ControllerSizing, error) {
	var s ControllerSizing
	switch c.Kind {
	case MPPT:
		if !(chargeV > 0) || math.IsNaN(arrayW) || arrayW < 0 || math.IsInf(arrayW, 0) {
			return s, fmt.Errorf("size controller: array %g W and charge voltage %g V must be positive numbers", arrayW, chargeV)
		}
		s.RequiredA = arrayW / chargeV * ControllerMarginFactor
	case PWM:
		if layout.Strings < 0 || !(m.IscA > 0) {
			return s, fmt.Errorf("size controller: %d strings of modules with Isc %g A", layout.Strings, m.IscA)
		}
		s.RequiredA = 1.25 * m.IscA * float64(layout.Strings) * 1.25
	default:
		return s, fmt.Errorf("size controller: unknown controller kind %d", int(c.Kind))
	}
	ratings := make([]float64, 0, len(c.RatingsA)+1)
	for _, r := range c.RatingsA {
		if r > 0 && !math.IsInf(r, 0) {
			ratings = append(ratings, r)
		}
	}
	if len(ratings) == 0 && c.MaxOutputA > 0 {
		ratings = append(ratings, c.MaxOutputA)
	}
	if len(ratings) == 0 {
		s.RatedA = math.Ceil(s.RequiredA - 1e-9)
		s.Units = 1
		return s, nil
	}
	sort.Float64s(ratings)
	largest := ratings[len(ratings)-1]
	s.Units = int(math.Ceil(s.RequiredA/largest - 1e-9))
	if s.Units < 1 {
		s.Units = 1
	}
	for _, r := range ratings {
		if float64(s.Units)*r >= s.RequiredA-1e-9 {
			s.RatedA = r
			break
		}
	}
	return s, nil
}

// ArrayDCPowerW is the DC power the controller delivers to the battery bus
// from the array of layout at irradiance poaWM2 on the plane, cell
// temperature cellTempC, battery voltage batteryV and array derate factor
// derate (e.g. Derates.Factor). MPPT: maximum power × tracker efficiency,
// limited by MaxOutputA × batteryV. PWM: battery voltage × module current at
// battery voltage per series module × strings (ModuleCurrentAtVoltageA) ×
// switch efficiency, limited the same way. A zero EfficiencyFraction counts
// as 1. Cheap and allocation-free.
func ArrayDCPowerW(m Module, c Controller, layout StringLayout, poaWM2, cellTempC, batteryV float64, derate float64) float64 {
	if !(poaWM2 > 0) || layout.ModulesSeries < 1 || layout.Strings < 1 || !(derate > 0) {
		return 0
	}
	eff := c.EfficiencyFraction
	if !(eff > 0) {
		eff = 1
	}
	var p float64
	switch c.Kind {
	case MPPT:
		p = ModuleMPPW(m, poaWM2, cellTempC) * float64(layout.ModulesSeries*layout.Strings) * derate * eff
	case PWM:
		if !(batteryV > 0) {
			return 0
		}
		v := batteryV / float64(layout.ModulesSeries)
		p = batteryV * ModuleCurrentAtVoltageA(m, poaWM2, cellTempC, v) * float64(layout.Strings) * derate * eff
	}
	if c.MaxOutputA > 0 && batteryV > 0 {
		p = math.Min(p, c.MaxOutputA*batteryV)
	}
	return math.Max(0, p)
}

// ArrayMPPW is the array's power at its maximum power point after derate,
// before the controller: what an ideal tracker would draw. Comparing it with
// ArrayDCPowerW for a PWM controller shows the energy PWM leaves behind.
func ArrayMPPW(m Module, layout StringLayout, poaWM2, cellTempC, derate float64) float64 {
	if layout.ModulesSeries < 1 || layout.Strings < 1 || !(derate > 0) {
		return 0
	}
	return ModuleMPPW(m, poaWM2, cellTempC) * float64(layout.ModulesSeries*layout.Strings) * derate
}
