package report

import "solstand/caution"

// Summary is the `size --json` document of CONTRACT.md: all energies in
// Wh, powers in W, irradiation in kWh/m²/day, months 1–12, fractions 0–1.
type Summary struct {
	Tool        string            `json:"tool"`
	ToolVersion string            `json:"tool_version"`
	Project     string            `json:"project"`
	DesignMonth int               `json:"design_month"`
	Demand      SummaryDemand     `json:"demand"`
	Resource    SummaryResource   `json:"resource"`
	Array       SummaryArray      `json:"array"`
	Battery     SummaryBattery    `json:"battery"`
	Controller  SummaryController `json:"controller"`
	Inverter    *SummaryInverter  `json:"inverter,omitempty"`
	Simulation  SummarySimulation `json:"simulation"`
	Wiring      Wiring            `json:"wiring"`
	Lifecycle   *Lifecycle        `json:"lifecycle,omitempty"`
	Cautions    []caution.Caution `json:"cautions"`
	CodesNote   string            `json:"codes_note"`
	Notes       []string          `json:"notes,omitempty"`
}

// SummaryDemand is `demand.*`.
type SummaryDemand struct {
	DailyWh [12]float64 `json:"daily_wh"`
	PeakW   float64     `json:"peak_w"`
	SurgeW  float64     `json:"surge_w"`
}

// SummaryResource is `resource.*`.
type SummaryResource struct {
	GHIKWhM2Day [12]float64 `json:"ghi_kwh_m2_day"`
	POAKWhM2Day [12]float64 `json:"poa_kwh_m2_day"`
}

// SummaryArray is `array.*`.
type SummaryArray struct {
	RequiredW     float64 `json:"required_w"`
	RatedW        float64 `json:"rated_w"`
	Modules       int     `json:"modules"`
	ModulesSeries int     `json:"modules_series"`
	Strings       int     `json:"strings"`
	TiltDeg       float64 `json:"tilt_deg"`
	AzimuthDeg    float64 `json:"azimuth_deg"`
}

// SummaryBattery is `battery.*`.
type SummaryBattery struct {
	RequiredAh        float64 `json:"required_ah"`
	CapacityAh        float64 `json:"capacity_ah"`
	CapacityWh        float64 `json:"capacity_wh"`
	UsableWh          float64 `json:"usable_wh"`
	NominalV          float64 `json:"nominal_v"`
	AutonomyDays      float64 `json:"autonomy_days"`
	MaxDoD            float64 `json:"max_dod"`
	BlocksSeries      int     `json:"blocks_series"`
	Strings           int     `json:"strings"`
	Chemistry         string  `json:"chemistry"`
	ExpectedLifeYears float64 `json:"expected_life_years"`
}

// SummaryController is `controller.*`.
type SummaryController struct {
	Kind   string  `json:"kind"`
	RatedA float64 `json:"rated_a"`
	Units  int     `json:"units"`
}

// SummaryInverter is `inverter.*`.
type SummaryInverter struct {
	ContinuousW float64 `json:"continuous_w"`
	SurgeW      float64 `json:"surge_w"`
}

// SummarySimulation is `simulation.*`.
type SummarySimulation struct {
	Years                int           `json:"years"`
	Seed                 uint64        `json:"seed"`
	LOLP                 float64       `json:"loss_of_load_probability"`
	DemandWh             float64       `json:"demand_wh"`
	UnmetWh              float64       `json:"unmet_wh"`
	MinSOC               float64       `json:"min_soc"`
	MeanSOC              float64       `json:"mean_soc"`
	UnmetDays            int           `json:"unmet_days"`
	LongestUnmetRunDays  int           `json:"longest_unmet_run_days"`
	DumpedWh             float64       `json:"dumped_wh"`
	EquivalentFullCycles float64       `json:"equivalent_full_cycles"`
	Ledger               LedgerTotals  `json:"ledger"`
	Monthly              []MonthStats  `json:"monthly"`
	Stress               []StressTest  `json:"stress_tests"`
	Measured             *MeasuredYear `json:"measured_year,omitempty"`
}

// Summarise builds the `size --json` summary from a Report.
func Summarise(r *Report) Summary {
	s := Summary{
		Tool: r.Tool, ToolVersion: r.ToolVersion, Project: r.Project,
		DesignMonth: r.DesignMonth,
		Demand:      SummaryDemand{DailyWh: r.Demand.DailyWh, PeakW: r.Demand.PeakW, SurgeW: r.Demand.SurgeW},
		Resource:    SummaryResource{GHIKWhM2Day: r.Resource.GHIKWhM2Day, POAKWhM2Day: r.Resource.POAKWhM2Day},
		Array: SummaryArray{
			RequiredW: r.Array.RequiredW, RatedW: r.Array.RatedW, Modules: r.Array.Modules,
			ModulesSeries: r.Array.ModulesSeries, Strings: r.Array.Strings,
			TiltDeg: r.Array.TiltDeg, AzimuthDeg: r.Array.AzimuthDeg,
		},
		Battery: SummaryBattery{
			RequiredAh: r.Battery.RequiredAh, CapacityAh: r.Battery.CapacityAh, CapacityWh: r.Battery.CapacityWh,
			UsableWh: r.Battery.UsableWh, NominalV: r.Battery.NominalV, AutonomyDays: r.Battery.AutonomyDays,
			MaxDoD: r.Battery.MaxDoD, BlocksSeries: r.Battery.BlocksSeries, Strings: r.Battery.Strings,
			Chemistry: r.Battery.Chemistry, ExpectedLifeYears: r.Battery.ExpectedLifeYears,
		},
		Controller: SummaryController{Kind: r.Controller.Kind, RatedA: r.Controller.RatedA, Units: r.Controller.Units},
		Simulation: SummarySimulation{
			Years: r.Simulation.Years, Seed: r.Simulation.Seed, LOLP: r.Simulation.LOLP,
			DemandWh: r.Simulation.DemandWh, UnmetWh: r.Simulation.UnmetWh,
			MinSOC: r.Simulation.MinSOC, MeanSOC: r.Simulation.MeanSOC,
			UnmetDays: r.Simulation.UnmetDays, LongestUnmetRunDays: r.Simulation.LongestUnmetRunDays,
			DumpedWh: r.Simulation.DumpedWh, EquivalentFullCycles: r.Simulation.EquivalentFullCycles,
			Ledger: r.Simulation.Ledger, Monthly: r.Simulation.Monthly, Stress: r.Simulation.Stress,
			Measured: r.Simulation.Measured,
		},
		Wiring:    r.Wiring,
		Lifecycle: r.Lifecycle,
		Cautions:  r.Cautions,
		CodesNote: r.CodesNote,
		Notes:     r.Notes,
	}
	if r.Inverter != nil {
		s.Inverter = &SummaryInverter{ContinuousW: r.Inverter.ContinuousW, SurgeW: r.Inverter.SurgeW}
	}
	return s
}
