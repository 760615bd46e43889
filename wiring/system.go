package wiring

import (
	"errors"
	"fmt"
	"math"
	"sort"

	"solstand/caution"
)

// Branch is one DC load branch fed from the DC panel.
type Branch struct {
	Name string `json:"name"`
	// CurrentA is the running current of the loads on the branch.
	CurrentA      float64 `json:"current_a"`
	OneWayLengthM float64 `json:"one_way_length_m"`
}

// SystemCircuits holds what DesignSystem needs for the standard set of
// circuits of a stand-alone system: PV string → combiner, combiner →
// controller, controller → battery, battery → inverter, battery → DC panel
// and the DC branches. A circuit whose one-way length is 0 is left out
// (the inverter circuit also when InverterContinuousW is 0; the DC panel
// feeder also when it carries no current).
type SystemCircuits struct {
	Standard Standard `json:"standard"`
	// Class is the IEC 60228 conductor class, 2 or 5 (ignored for NEC).
	Class int `json:"class,omitempty"`
	// ConductorTempC is the conductor temperature for the drop (0 = table
	// temperature: 20 °C IEC, 75 °C NEC).
	ConductorTempC float64 `json:"conductor_temp_c,omitempty"`
	// MaxParallelRuns lets a circuit that no single conductor can serve use
	// up to this many conductors in parallel per pole (0 or 1: none).
	MaxParallelRuns int `json:"max_parallel_runs,omitempty"`

	// PV array.
	ModuleIscA float64 `json:"module_isc_a"`
	// ModuleImpA is the current the PV drop is computed at (0 = ModuleIscA).
	ModuleImpA           float64 `json:"module_imp_a,omitempty"`
	ModuleMaxSeriesFuseA float64 `json:"module_max_series_fuse_a"`
	// Strings is the number of parallel strings of the whole array.
	Strings int `json:"strings"`
	// Controllers is the number of charge controllers, each fed by its own
	// share of the strings (0 = 1).
	Controllers int `json:"controllers,omitempty"`
	// PVOperatingV is the voltage of the PV circuits in operation (string
	// Vmp with an MPPT controller, about the battery voltage with PWM); the
	// PV drop is a percentage of it.
	PVOperatingV float64 `json:"pv_operating_v"`
	// PVMaxV is the highest PV circuit voltage (string Voc at the record low
	// temperature), for the touch-voltage and arc-fault cautions.
	PVMaxV                   float64 `json:"pv_max_v"`
	PVStringOneWayM          float64 `json:"pv_string_one_way_m"`
	ArrayToControllerOneWayM float64 `json:"array_to_controller_one_way_m"`
	PVMaxDropPct             float64 `json:"pv_max_drop_pct"`

	// Controller output, battery side.
	// ControllerRatedA is the output current rating of one controller.
	ControllerRatedA           float64 `json:"controller_rated_a"`
	ControllerToBatteryOneWayM float64 `json:"controller_to_battery_one_way_m"`

	// Battery bank.
	BatteryNominalV float64 `json:"battery_nominal_v"`
	BlocksSeries    int     `json:"blocks_series"`
	BatteryStrings  int     `json:"battery_strings"`
	// BlockInternalResistanceOhm is the internal resistance of one block
	// from its datasheet (0 = unknown).
	BlockInternalResistanceOhm float64 `json:"block_internal_resistance_ohm,omitempty"`
	// BatteryMaxDropPct limits the drop between battery and controller and
	// between battery and inverter.
	BatteryMaxDropPct float64 `json:"battery_max_drop_pct"`

	// Inverter (leave InverterContinuousW 0 where there are no AC loads).
	InverterContinuousW float64 `json:"inverter_continuous_w,omitempty"`
	// InverterEfficiency is the efficiency at rated power, 0..1.
	InverterEfficiency float64 `json:"inverter_efficiency,omitempty"`
	// LowVoltageDisconnectV is the battery voltage at which the inverter
	// (or the load disconnect) cuts out.
	LowVoltageDisconnectV    float64 `json:"low_voltage_disconnect_v,omitempty"`
	BatteryToInverterOneWayM float64 `json:"battery_to_inverter_one_way_m,omitempty"`

	// DC loads.
	// DCPanelCurrentA is the running current of all DC loads together
	// (0 = the sum of the branches).
	DCPanelCurrentA         float64 `json:"dc_panel_current_a,omitempty"`
	BatteryToDCPanelOneWayM float64 `json:"battery_to_dc_panel_one_way_m,omitempty"`
	// DCPanelMaxDropPct limits the feeder drop (0 = BatteryMaxDropPct).
	DCPanelMaxDropPct float64  `json:"dc_panel_max_drop_pct,omitempty"`
	Branches          []Branch `json:"branches,omitempty"`
	BranchMaxDropPct  float64  `json:"branch_max_drop_pct,omitempty"`
}

// Kinds of protective device (ProtectionItem.Kind).
const (
	KindFuse       = "fuse"
	KindBreaker    = "breaker"
	KindStringFuse = "string fuse"
)

// ProtectionItem is one kind of protective device of the design.
type ProtectionItem struct {
	// Circuit is the name of the circuit it protects.
	Circuit string `json:"circuit"`
	// Kind is KindFuse, KindBreaker or KindStringFuse; all are DC-rated.
	Kind    string  `json:"kind"`
	RatingA float64 `json:"rating_a"`
	// Count is how many of them the design needs.
	Count int `json:"count"`
	// InterruptingA is the smallest interrupting (breaking) rating the
	// device needs: the bank's short-circuit current for devices on the
	// battery side (0 where the internal resistance is unknown); for PV
	// devices the maximum current 1.25 · Isc · strings of the array part
	// behind one controller (NEC 690.8(A)(1)).
	InterruptingA float64 `json:"interrupting_a"`
	Note          string  `json:"note,omitempty"`
}

// Design is the conductor and protection design of a system.
type Design struct {
	Circuits   []Choice         `json:"circuits"`
	Protection []ProtectionItem `json:"protection"`
	// BankShortCircuitA is the prospective short-circuit current of the
	// battery bank (BatteryShortCircuitA); 0 where the internal resistance
	// is unknown.
	BankShortCircuitA float64           `json:"bank_short_circuit_a"`
	Cautions          []caution.Caution `json:"cautions"`
}

// CableRun is the total conductor length of one size in a design.
type CableRun struct {
	Label   string  `json:"label"`
	AreaMM2 float64 `json:"area_mm2"`
	// ConductorLengthM is the length of single conductor, both poles and
	// all parallel runs and identical circuits counted: 2 · one-way length ·
	// runs · count, summed.
	ConductorLengthM float64 `json:"conductor_length_m"`
}

// CableRuns sums the conductor length of each size of a design, smallest
// size first, for the materials list.
func (d Design) CableRuns() []CableRun {
	idx := map[string]int{}
	var out []CableRun
	for _, c := range d.Circuits {
		n := c.Circuit.Count
		if n == 0 {
			n = 1
		}
		l := 2 * c.Circuit.OneWayLengthM * float64(c.Runs) * float64(n)
		i, ok := idx[c.Size.Label]
		if !ok {
			idx[c.Size.Label] = len(out)
			out = append(out, CableRun{Label: c.Size.Label, AreaMM2: c.Size.AreaMM2})
			i = len(out) - 1
		}
		out[i].ConductorLengthM += l
	}
	sort.SliceStable(out, func(a, b int) bool { return out[a].AreaMM2 < out[b].AreaMM2 })
	return out
}

// Circuit names used by DesignSystem.
const (
	CircuitPVString       = "PV string → combiner"
	CircuitArray          = "combiner → controller"
	CircuitControllerBatt = "controller → battery"
	CircuitInverter       = "battery → inverter"
	CircuitDCPanel        = "battery → DC panel"
	circuitBranchPrefix   = "DC branch: "
)

type namedValue struct {
	name string
	v    float64
}

func checkPos(name string, v float64) error {
	if !finite(v) || v <= 0 {
		return fmt.Errorf("wiring: %s = %v: must be positive", name, v)
	}
	return nil
}

func checkNonNeg(name string, v float64) error {
	if !finite(v) || v < 0 {
		return fmt.Errorf("wiring: %s = %v: must not be negative", name, v)
	}
	return nil
}

func validateSystem(in SystemCircuits) error {
	if in.Standard != IEC && in.Standard != NEC {
		return fmt.Errorf("wiring: standard %q: want iec or nec", in.Standard)
	}
	if in.Standard == IEC && in.Class != 2 && in.Class != 5 {
		return fmt.Errorf("wiring: class %d: want IEC 60228 class 2 or 5", in.Class)
	}
	if in.Strings < 0 || in.Controllers < 0 || in.BlocksSeries < 0 || in.BatteryStrings < 0 || in.MaxParallelRuns < 0 {
		return errors.New("wiring: counts (strings, controllers, blocks, battery strings, parallel runs) must not be negative")
	}
	for _, f := range []namedValue{
		{"pv_string_one_way_m", in.PVStringOneWayM}, {"array_to_controller_one_way_m", in.ArrayToControllerOneWayM},
		{"controller_to_battery_one_way_m", in.ControllerToBatteryOneWayM}, {"battery_to_inverter_one_way_m", in.BatteryToInverterOneWayM},
		{"battery_to_dc_panel_one_way_m", in.BatteryToDCPanelOneWayM}, {"inverter_continuous_w", in.InverterContinuousW},
		{"dc_panel_current_a", in.DCPanelCurrentA}, {"block_internal_resistance_ohm", in.BlockInternalResistanceOhm},
		{"module_imp_a", in.ModuleImpA}, {"pv_max_v", in.PVMaxV}, {"dc_panel_max_drop_pct", in.DCPanelMaxDropPct},
	} {
		if err := checkNonNeg(f.name, f.v); err != nil {
			return err
		}
	}
	if !finite(in.ConductorTempC) {
		return fmt.Errorf("wiring: conductor_temp_c = %v: must be finite", in.ConductorTempC)
	}
	if err := checkPos("battery_nominal_v", in.BatteryNominalV); err != nil {
		return err
	}
	pv := in.PVStringOneWayM > 0 || in.ArrayToControllerOneWayM > 0
	if pv {
		if in.Strings < 1 {
			return errors.New("wiring: strings must be at least 1 where PV circuits are given")
		}
		for _, f := range []namedValue{{"module_isc_a", in.ModuleIscA}, {"pv_operating_v", in.PVOperatingV}, {"pv_max_drop_pct", in.PVMaxDropPct}} {
			if err := checkPos(f.name, f.v); err != nil {
				return err
			}
		}
		if in.Strings >= 2 {
			if err := checkPos("module_max_series_fuse_a", in.ModuleMaxSeriesFuseA); err != nil {
				return err
			}
		}
	}
	battery := in.ControllerToBatteryOneWayM > 0 || (in.InverterContinuousW > 0 && in.BatteryToInverterOneWayM > 0) || in.BatteryToDCPanelOneWayM > 0
	if battery {
		if err := checkPos("battery_max_drop_pct", in.BatteryMaxDropPct); err != nil {
			return err
		}
	}
	if in.ControllerToBatteryOneWayM > 0 {
		if err := checkPos("controller_rated_a", in.ControllerRatedA); err != nil {
			return err
		}
	}
	if in.InverterContinuousW > 0 && in.BatteryToInverterOneWayM > 0 {
		if err := checkPos("inverter_efficiency", in.InverterEfficiency); err != nil {
			return err
		}
		if in.InverterEfficiency > 1 {
			return fmt.Errorf("wiring: inverter_efficiency = %v: must not exceed 1", in.InverterEfficiency)
		}
		if err := checkPos("low_voltage_disconnect_v", in.LowVoltageDisconnectV); err != nil {
			return err
		}
	}
	for i, b := range in.Branches {
		if err := checkPos(fmt.Sprintf("branches[%d].current_a", i), b.CurrentA); err != nil {
			return err
		}
		if err := checkPos(fmt.Sprintf("branches[%d].one_way_length_m", i), b.OneWayLengthM); err != nil {
			return err
		}
	}
	if len(in.Branches) > 0 {
		if err := checkPos("branch_max_drop_pct", in.BranchMaxDropPct); err != nil {
			return err
		}
	}
	return nil
}

// sizeFor selects the conductor of c (trying up to maxRuns parallel runs)
// whose protection limit is at least minLimitA; rating, when not nil,
// picks the protective rating for a limit and returns an error when none
// fits, and the conductor is upsized until one does.
func sizeFor(c Circuit, std Standard, maxRuns int, rating func(limitA float64) (float64, error)) (Choice, float64, error) {
	if maxRuns < 1 {
		maxRuns = 1
	}
	var lastErr error
	for runs := 1; runs <= maxRuns; runs++ {
		c.ParallelRuns = runs
		minArea := 0.0
		for {
			ch, err := selectFrom(c, minArea)
			if err != nil {
				lastErr = err
				break
			}
			if rating == nil {
				return ch, 0, nil
			}
			r, err := rating(ProtectionLimitA(ch.Size, std) * float64(ch.Runs))
			if err == nil {
				return ch, r, nil
			}
			lastErr = err
			minArea = math.Nextafter(ch.Size.AreaMM2, math.Inf(1))
		}
	}
	return Choice{}, 0, lastErr
}

// DesignSystem sizes the conductors and protective devices of the standard
// circuits of a stand-alone system:
//
//   - PV string → combiner (one per string): conductors for 1.5625 · Isc
//     (NEC 690.8(A)(1) and (B)); string fuses where StringFusesRequired or
//     StringFusesRequiredByCurrent says so, from StringFuseA;
//   - combiner → controller (one per controller): conductors for 1.5625 ·
//     Isc · strings; a DC breaker that doubles as the array disconnect;
//   - controller → battery: 1.25 × the controller's rated output (NEC
//     690.8(B)); a fuse at the battery;
//   - battery → inverter: InverterBatteryCurrentA; a fuse at the battery
//     terminal;
//   - battery → DC panel and each DC branch: 1.25 × the running current
//     (continuous loads, NEC 210.19(A), 215.2(A)); a fuse at the battery for
//     the feeder and a breaker in the panel for each branch.
//
// The voltage drop is computed at the operating current (Imp for PV, the
// controller rating, the inverter input without the 1.25, the running
// current); ampacity is checked against the design current. Each rating is
// the smallest standard one between the design current and what the
// conductor may carry (SelectProtection, ProtectionLimitA); where none fits,
// the conductor is upsized. Battery-side devices carry the bank's
// short-circuit current as their interrupting requirement.
func DesignSystem(in SystemCircuits) (Design, error) {
	if err := validateSystem(in); err != nil {
		return Design{}, err
	}
	std := in.Standard
	var d Design
	var cs []caution.Caution
	add := func(code string, sev caution.Severity, msg string) {
		cs = append(cs, caution.Caution{Code: code, Severity: sev, Message: msg})
	}
	base := func(name string, designA, dropA, lengthM, voltV, dropPct float64, count int) Circuit {
		return Circuit{Name: name, CurrentA: designA, DropCurrentA: dropA, OneWayLengthM: lengthM, VoltageV: voltV,
			MaxDropPct: dropPct, Standard: std, Class: in.Class, ConductorTempC: in.ConductorTempC, Count: count}
	}
	protect := func(designA float64) func(float64) (float64, error) {
		return func(limitA float64) (float64, error) { return SelectProtection(designA, limitA, std) }
	}

	// Bank short-circuit current.
	if in.BlockInternalResistanceOhm > 0 && in.BlocksSeries > 0 && in.BatteryStrings > 0 {
		d.BankShortCircuitA = BatteryShortCircuitA(in.BatteryNominalV, BankResistanceOhm(in.BlockInternalResistanceOhm, in.BlocksSeries, in.BatteryStrings))
		add("battery-short-circuit", caution.Warning, fmt.Sprintf(
			"The battery bank can deliver about %.0f A into a short circuit (nominal voltage over internal resistance, cables left out). Every fuse and breaker on the battery side needs a DC interrupting rating at least this high; the battery fuse goes as close to the terminal as practical.", d.BankShortCircuitA))
	} else {
		add("battery-short-circuit-unknown", caution.Warning,
			"The battery's internal resistance is not given, so its short-circuit current is unknown. Take it (or the internal resistance) from the block datasheet and choose battery-side fuses and breakers with a DC interrupting rating above it; the battery fuse goes as close to the terminal as practical.")
	}

	controllers := in.Controllers
	if controllers == 0 {
		controllers = 1
	}
	imp := in.ModuleImpA
	if imp == 0 {
		imp = in.ModuleIscA
	}
	perCtrl := 0
	if in.Strings > 0 {
		perCtrl = (in.Strings + controllers - 1) / controllers
	}
	pvIsc := 0.0 // array short-circuit current per controller, for PV interrupting ratings
	if perCtrl > 0 {
		pvIsc, _ = PVCircuitCurrentA(in.ModuleIscA, perCtrl)
	}

	// PV strings.
	if in.PVStringOneWayM > 0 {
		_, designA := PVCircuitCurrentA(in.ModuleIscA, 1)
		c := base(CircuitPVString, designA, imp, in.PVStringOneWayM, in.PVOperatingV, in.PVMaxDropPct, in.Strings)
		need := perCtrl >= 2 && (StringFusesRequired(perCtrl) || StringFusesRequiredByCurrent(perCtrl, in.ModuleIscA, in.ModuleMaxSeriesFuseA))
		var rating func(float64) (float64, error)
		fuseA := 0.0
		if need {
			f, err := StringFuseA(in.ModuleIscA, in.ModuleMaxSeriesFuseA, std)
			if err != nil {
				add("string-fuse-unavailable", caution.Danger, fmt.Sprintf(
					"No standard fuse rating lies between 1.56 × Isc (%.3g A) and the module's maximum series fuse (%.3g A): choose another module or fewer strings per combiner. %v", StringFuseFactor*in.ModuleIscA, in.ModuleMaxSeriesFuseA, err))
			} else {
				fuseA = f
				rating = func(limitA float64) (float64, error) {
					if limitA < fuseA {
						return 0, fmt.Errorf("wiring: string fuse %g A above the conductor's %.4g A", fuseA, limitA)
					}
					return fuseA, nil
				}
			}
		}
		ch, _, err := sizeFor(c, std, in.MaxParallelRuns, rating)
		if err != nil {
			return Design{}, err
		}
		d.Circuits = append(d.Circuits, ch)
		if fuseA > 0 {
			d.Protection = append(d.Protection, ProtectionItem{Circuit: CircuitPVString, Kind: KindStringFuse, RatingA: fuseA, Count: in.Strings,
				InterruptingA: pvIsc, Note: "one in each string, in each ungrounded conductor (double the count where both poles are ungrounded); PV-rated DC fuses"})
		}
	}

	// Array to controller.
	if in.ArrayToControllerOneWayM > 0 {
		_, designA := PVCircuitCurrentA(in.ModuleIscA, perCtrl)
		c := base(CircuitArray, designA, imp*float64(perCtrl), in.ArrayToControllerOneWayM, in.PVOperatingV, in.PVMaxDropPct, controllers)
		ch, r, err := sizeFor(c, std, in.MaxParallelRuns, protect(designA))
		if err != nil {
			return Design{}, err
		}
		d.Circuits = append(d.Circuits, ch)
		d.Protection = append(d.Protection, ProtectionItem{Circuit: CircuitArray, Kind: KindBreaker, RatingA: r, Count: controllers,
			InterruptingA: pvIsc, Note: "DC-rated for the PV voltage; doubles as the array disconnect at the controller"})
	}

	// Controller to battery.
	if in.ControllerToBatteryOneWayM > 0 {
		designA := ContinuousFactor * in.ControllerRatedA
		c := base(CircuitControllerBatt, designA, in.ControllerRatedA, in.ControllerToBatteryOneWayM, in.BatteryNominalV, in.BatteryMaxDropPct, controllers)
		ch, r, err := sizeFor(c, std, in.MaxParallelRuns, protect(designA))
		if err != nil {
			return Design{}, err
		}
		d.Circuits = append(d.Circuits, ch)
		d.Protection = append(d.Protection, ProtectionItem{Circuit: CircuitControllerBatt, Kind: KindFuse, RatingA: r, Count: controllers,
			InterruptingA: d.BankShortCircuitA, Note: "at the battery end, close to the terminal or the battery bus"})
	}

	// Battery to inverter.
	if in.InverterContinuousW > 0 && in.BatteryToInverterOneWayM > 0 {
		designA := InverterBatteryCurrentA(in.InverterContinuousW, in.LowVoltageDisconnectV, in.InverterEfficiency)
		c := base(CircuitInverter, designA, designA/ContinuousFactor, in.BatteryToInverterOneWayM, in.LowVoltageDisconnectV, in.BatteryMaxDropPct, 1)
		ch, r, err := sizeFor(c, std, in.MaxParallelRuns, protect(designA))
		if err != nil {
			return Design{}, err
		}
		d.Circuits = append(d.Circuits, ch)
		d.Protection = append(d.Protection, ProtectionItem{Circuit: CircuitInverter, Kind: KindFuse, RatingA: r, Count: 1,
			InterruptingA: d.BankShortCircuitA, Note: "at the battery terminal; a time-delay type that passes the inverter's surge; with a disconnect switch beside it"})
	}

	// DC panel and branches.
	panelA := in.DCPanelCurrentA
	if panelA == 0 {
		for _, b := range in.Branches {
			panelA += b.CurrentA
		}
	}
	if in.BatteryToDCPanelOneWayM > 0 && panelA > 0 {
		dropPct := in.DCPanelMaxDropPct
		if dropPct == 0 {
			dropPct = in.BatteryMaxDropPct
		}
		designA := ContinuousFactor * panelA
		c := base(CircuitDCPanel, designA, panelA, in.BatteryToDCPanelOneWayM, in.BatteryNominalV, dropPct, 1)
		ch, r, err := sizeFor(c, std, in.MaxParallelRuns, protect(designA))
		if err != nil {
			return Design{}, err
		}
		d.Circuits = append(d.Circuits, ch)
		d.Protection = append(d.Protection, ProtectionItem{Circuit: CircuitDCPanel, Kind: KindFuse, RatingA: r, Count: 1,
			InterruptingA: d.BankShortCircuitA, Note: "at the battery terminal"})
	}
	for _, b := range in.Branches {
		name := circuitBranchPrefix + b.Name
		designA := ContinuousFactor * b.CurrentA
		c := base(name, designA, b.CurrentA, b.OneWayLengthM, in.BatteryNominalV, in.BranchMaxDropPct, 1)
		ch, r, err := sizeFor(c, std, in.MaxParallelRuns, protect(designA))
		if err != nil {
			return Design{}, err
		}
		d.Circuits = append(d.Circuits, ch)
		d.Protection = append(d.Protection, ProtectionItem{Circuit: name, Kind: KindBreaker, RatingA: r, Count: 1,
			InterruptingA: d.BankShortCircuitA, Note: "in the DC panel"})
	}

	for _, ch := range d.Circuits {
		if ch.Runs > 1 {
			cs = append(cs, parallelCaution(ch))
		}
	}

	// Voltage cautions.
	maxV := math.Max(in.PVMaxV, in.BatteryNominalV)
	if maxV > 60 {
		add("dc-not-touch-safe", caution.Warning, fmt.Sprintf(
			"DC circuits reach %.0f V, above the 60 V usually taken as touch-safe (common practice): enclose live parts, use finger-safe terminals and label the circuits.", maxV))
	}
	if std == NEC && in.PVMaxV >= 80 {
		add("pv-arc-fault", caution.Warning, fmt.Sprintf(
			"PV DC circuits reach %.0f V: at 80 V or more NEC 690.11 asks for listed DC arc-fault protection.", in.PVMaxV))
	}
	if in.PVMaxV > 0 && in.PVMaxV < in.PVOperatingV {
		add("pv-max-voltage-low", caution.Warning, "The highest PV voltage given is below the operating voltage: check the string's open-circuit voltage at the record low temperature.")
	}

	// Standing cautions.
	cs = append(cs, ampacityCaution)
	add("wiring-disconnects", caution.Info, "Provide a DC disconnect for the array, for the battery and for the inverter, each able to break its circuit's current, lockable and labelled.")
	add("equipment-grounding", caution.Info, "Bond module frames, racking, enclosures and the inverter chassis with an equipment grounding conductor to the grounding electrode, as the local code requires.")
	add("terminal-covers", caution.Info, "Fit insulating covers on battery terminals and busbars, and keep tools away from the bank: a short circuit across a battery terminal can melt metal.")
	d.Cautions = cs
	return d, nil
}

// ampacityCaution is the standing caution on the simplified ampacities.
var ampacityCaution = caution.Caution{Code: "ampacity-simplified", Severity: caution.Info,
	Message: "Conductor ampacities here come from a simplified table (one installation method, 30 °C ambient, no grouping): the local code's tables, the installation method and derating govern."}

func parallelCaution(ch Choice) caution.Caution {
	return caution.Caution{Code: "parallel-conductors", Severity: caution.Warning, Message: fmt.Sprintf(
		"%s uses %d conductors in parallel per pole: they must be of equal length, size and termination, and grouping lowers their ampacity. Some codes allow parallel conductors only from a minimum size (NEC 310.10(G): 1/0 AWG).", ch.Circuit.Name, ch.Runs)}
}

// SelectCautions lists the cautions that go with a single conductor choice
// (as from Select, for the wire command): always the note that the
// ampacities are simplified and the local code governs, and a warning
// where conductors run in parallel.
func SelectCautions(ch Choice) []caution.Caution {
	out := []caution.Caution{ampacityCaution}
	if ch.Runs > 1 {
		out = append(out, parallelCaution(ch))
	}
	return out
}
