package battery

import (
	"fmt"
	"math"

	"solstand/caution"
)

// Site is where the bank stands, as far as safety is concerned.
type Site struct {
	Indoors      bool    // in a room people enter
	RoomVolumeM3 float64 // volume of that room, m³ (0: not given)
	RecordLowC   float64 // record low air temperature at the site, °C
	BatteryTempC float64 // temperature where the bank stands in the coldest month, °C
}

// Gas currents of IEC 62485-2 (Table 1, from memory) in mA per Ah of rated
// capacity, for lead-acid cells with antimony below 3 % in the positive grid.
// Stand-alone PV banks are charged to absorption (boost) voltage most days,
// so the boost-charge values are the ones used for the room.
const (
	GasCurrentVentedFloatMAPerAh = 5.0  // IEC 62485-2, vented, float charge (from memory)
	GasCurrentVentedBoostMAPerAh = 20.0 // IEC 62485-2, vented, boost charge (from memory)
	GasCurrentVRLAFloatMAPerAh   = 1.0  // IEC 62485-2, valve-regulated, float charge (from memory)
	GasCurrentVRLABoostMAPerAh   = 8.0  // IEC 62485-2, valve-regulated, boost charge (from memory)
)

// VentilationM3PerH returns the air flow a battery room needs to keep the
// hydrogen from charging well below its lower explosive limit, by IEC 62485-2
// : Q = 0.05 · n · I_gas · C_rt · 10⁻³ m³/h, with n the number of cells,
// I_gas the gas current in mA per Ah (see the GasCurrent constants) and C_rt
// the rated capacity of each cell in Ah. For a bank of parallel strings,
// n · C_rt is the same whether n counts all cells and C_rt is one string's
// Ah, or n counts one string's cells and C_rt is the Ah of all strings. The
// factor 0.05 m³/Ah is the standard's
// v · q · s = 24 · 0.42·10⁻³ · 5 (from memory). It returns 0 on inputs that are not
// positive.
func VentilationM3PerH(cells int, gasCurrentMAPerAh, capacityAh float64) float64 {
	if cells <= 0 || !(gasCurrentMAPerAh > 0) || !(capacityAh > 0) {
		return 0
	}
	return 0.05 * float64(cells) * gasCurrentMAPerAh * capacityAh * 1e-3
}

// VentilationOpeningCm2 returns the free area of each of the inlet and the
// outlet a room ventilated naturally needs for air flow q (m³/h), by
// IEC 62485-2 (from memory): A = 28 · Q cm².
func VentilationOpeningCm2(qM3PerH float64) float64 {
	if !(qM3PerH > 0) {
		return 0
	}
	return 28 * qM3PerH
}

// Short-circuit current per Ah of one string when the block data sheet gives
// no internal resistance: a rough figure (common practice, from memory) of
// about 10 × C for lead-acid and 20 × C for LiFePO4, where C is the string's
// Ah. The data-sheet value, where given, replaces it.
const (
	shortCircuitPerAhLeadAcid = 10.0
	shortCircuitPerAhLithium  = 20.0
)

// ShortCircuitA returns the prospective short-circuit current of the bank at
// its terminals, A: per string, the string voltage over the string's internal
// resistance, V_block · series / (series · R_block) = V_block / R_block, times
// the strings (cables and connections neglected, which is the worst case).
// Without a data-sheet internal resistance it uses the rule of thumb above
// and returns estimated = true.
func ShortCircuitA(chem Chemistry, s Sizing, blk Block) (amps float64, estimated bool) {
	strings := float64(s.Strings)
	if strings < 1 {
		strings = 1
	}
	if blk.InternalResistanceMOhm > 0 && blk.NominalV > 0 {
		series := float64(s.BlocksSeries)
		if series < 1 {
			series = 1
		}
		rString := series * blk.InternalResistanceMOhm * 1e-3
		return blk.NominalV * series / rString * strings, false
	}
	perAh := shortCircuitPerAhLeadAcid
	if !chem.LeadAcid {
		perAh = shortCircuitPerAhLithium
	}
	return perAh * blk.CapacityAh * strings, true
}

// Cautions returns the safety cautions of bank s at site: always the
// short-circuit current with the fuse it needs, insulated tools and not
// mixing blocks; for lead-acid the acid protection, the hydrogen ventilation
// (IEC 62485-2) where it stands indoors and electrolyte freezing at the record
// low at maximum depth of discharge; for LiFePO4 the battery-management
// system, the protection against charging below 0 °C and the fire separation.
func Cautions(chem Chemistry, s Sizing, blk Block, site Site) []caution.Caution {
	var out []caution.Caution
	add := func(code string, sev caution.Severity, msg string) {
		out = append(out, caution.Caution{Code: code, Severity: sev, Message: msg})
	}

	isc, est := ShortCircuitA(chem, s, blk)
	how := "from the block's internal resistance"
	if est {
		how = "a rough estimate; the block data sheet gives the true value"
	}
	add("battery-short-circuit", caution.Danger, fmt.Sprintf(
		"The bank can deliver about %s A into a short circuit (%s). Put a fuse or breaker rated for DC with an interrupting "+
			"rating of at least that current next to the battery terminal, in every string, before any other connection.",
		roundSig(isc), how))
	add("battery-insulated-tools", caution.Warning,
		"Work on the bank with insulated tools, remove rings and watches, and cover the terminals: a dropped spanner across "+
			"two terminals welds and burns.")
	add("battery-no-mixing", caution.Warning,
		"Do not mix old and new blocks, different makes, types or capacities in one bank: the weakest block is overcharged and "+
			"over-discharged and fails early, taking the bank with it.")

	if chem.LeadAcid {
		add("battery-acid-protection", caution.Warning,
			"Lead-acid electrolyte is sulphuric acid: wear eye protection and acid-resistant gloves when working on the bank, keep "+
				"clean water or an eye-wash bottle at hand, and keep the bank in a tray or on an acid-resistant floor.")
		gas, mode := GasCurrentVRLABoostMAPerAh, "valve-regulated"
		if chem.Vented {
			gas, mode = GasCurrentVentedBoostMAPerAh, "vented"
		}
		cells := cellsPerString(chem, s, blk)
		q := VentilationM3PerH(cells, gas, s.CapacityAh)
		if site.Indoors {
			msg := fmt.Sprintf(
				"Charging lead-acid cells gives off hydrogen, which explodes in air above 4 %%. The room needs a ventilation air flow of "+
					"at least %.2f m³/h (IEC 62485-2: Q = 0.05 · n · I_gas · C_rt · 10⁻³ with n = %d cells per string, I_gas = %.0f mA/Ah for %s cells "+
					"on boost charge, C_rt = %s Ah over all strings); by natural ventilation, an inlet low and an outlet high of at least %.0f cm² free area each. "+
					"No sparks, flames or switching contacts near the cell tops.",
				q, cells, gas, mode, roundSig(s.CapacityAh), VentilationOpeningCm2(q))
			if site.RoomVolumeM3 > 0 {
				msg += fmt.Sprintf(" For a %.0f m³ room that is %.2f air changes per hour.", site.RoomVolumeM3, q/site.RoomVolumeM3)
			}
			add("battery-hydrogen-ventilation", caution.Danger, msg)
		} else {
			add("battery-hydrogen-enclosure", caution.Warning, fmt.Sprintf(
				"Charging lead-acid cells gives off hydrogen: the enclosure needs openings low and high (an air flow of at least %.2f m³/h "+
					"by IEC 62485-2), and no sparks or switching contacts inside it.", q))
		}
		dod := s.MaxDoD
		if dod == 0 {
			dod = chem.MaxDoD
		}
		if fp, ok := FreezingPointC(chem.Kind, 1-dod); ok && !math.IsNaN(site.RecordLowC) {
			if site.RecordLowC <= fp {
				add("battery-electrolyte-freezing", caution.Danger, fmt.Sprintf(
					"At the record low of %.0f °C the electrolyte of a bank discharged to its %.0f %% depth-of-discharge limit freezes "+
						"(near %.0f °C, common practice) and can split the cases. Keep the bank warmer (insulated or buried enclosure, "+
						"indoors), or keep it charged with a smaller depth of discharge.", site.RecordLowC, dod*100, fp))
			}
		}
	}

	if chem.Kind == LiFePO4 || (!chem.LeadAcid && chem.Kind != "") {
		add("battery-bms-required", caution.Danger,
			"A lithium bank needs a battery-management system that watches every cell's voltage and temperature and disconnects "+
				"charge and discharge outside their limits; the charge controller and inverter must obey it.")
		low := math.Min(site.RecordLowC, site.BatteryTempC)
		if !math.IsNaN(low) && low < chem.ChargeMinTempC {
			add("battery-cold-charging", caution.Danger, fmt.Sprintf(
				"The bank can reach %.0f °C, below the %.0f °C at which LiFePO4 cells may be charged: charging them colder plates "+
					"lithium metal and can lead to internal short circuits. Use a BMS with a low-temperature charge cut-off, or a "+
					"heated, insulated enclosure that keeps the cells above %.0f °C while they charge.", low, chem.ChargeMinTempC, chem.ChargeMinTempC))
		}
		add("battery-thermal-runaway", caution.Warning,
			"A lithium cell that is damaged, overcharged or overheated can go into thermal runaway and burn with toxic gas. Mount "+
				"the bank on a non-combustible surface, away from escape routes and sleeping areas, with the fire separation local "+
				"codes require, and keep a suitable extinguisher nearby.")
	}

	if hot := site.BatteryTempC; hot > 30 && !math.IsNaN(hot) {
		add("battery-hot-location", caution.Info, fmt.Sprintf(
			"The bank stands at %.0f °C: battery life shortens markedly above 25 °C (for lead-acid roughly half for each 8–10 K, "+
				"common practice, from memory). Shade and ventilate the enclosure.", hot))
	}
	return out
}

// cellsPerString returns the cells of one string: the bank voltage over the
// chemistry's cell voltage.
func cellsPerString(chem Chemistry, s Sizing, blk Block) int {
	v := blk.NominalV * float64(s.BlocksSeries)
	if !(v > 0) {
		v = s.SystemV
	}
	if !(chem.CellV > 0) || !(v > 0) {
		return 0
	}
	return int(math.Round(v / chem.CellV))
}

// roundSig formats v with three significant figures, without exponent.
func roundSig(v float64) string {
	if v == 0 || math.IsNaN(v) || math.IsInf(v, 0) {
		return fmt.Sprint(v)
	}
	d := math.Ceil(math.Log10(math.Abs(v)))
	p := math.Pow(10, 3-d)
	r := math.Round(v*p) / p
	if d >= 3 {
		return fmt.Sprintf("%.0f", r)
	}
	return fmt.Sprintf("%.*f", int(3-d), r)
}
