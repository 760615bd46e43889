// Package report holds the one value type that carries every result of a
// solstand design: the single source for the terminal summary, the --json
// summary and the workbook. It computes nothing; simulate fills it.
package report

import "solstand/caution"

// Report is every result of one design run.
type Report struct {
	Tool        string `json:"tool"`         // "solstand"
	ToolVersion string `json:"tool_version"` // version of the program that made it
	Project     string `json:"project"`      // project name
	Client      string `json:"client,omitempty"`
	PreparedBy  string `json:"prepared_by,omitempty"`
	Date        string `json:"date"`  // YYYY-MM-DD, fixed for repeatable output
	Paper       string `json:"paper"` // "a4" | "letter"
	Hourly      bool   `json:"-"`     // write the hourly sheet

	Site        Site              `json:"site"`
	DesignMonth int               `json:"design_month"` // 1..12
	Demand      Demand            `json:"demand"`
	Resource    Resource          `json:"resource"`
	Array       Array             `json:"array"`
	Battery     Battery           `json:"battery"`
	Controller  Controller        `json:"controller"`
	Inverter    *Inverter         `json:"inverter,omitempty"`
	Simulation  Simulation        `json:"simulation"`
	Wiring      Wiring            `json:"wiring"`
	Materials   Materials         `json:"materials"`
	Lifecycle   *Lifecycle        `json:"lifecycle,omitempty"`
	Curves      []Curve           `json:"curves,omitempty"`
	SunPath     []SunPathRow      `json:"sun_path,omitempty"`
	Cautions    []caution.Caution `json:"cautions"`
	CodesNote   string            `json:"codes_note"`
	Methods     []Method          `json:"methods"`
	Notes       []string          `json:"notes,omitempty"` // assumptions and defaults the run applied, in words
}

// Site echoes the site as the engine used it.
type Site struct {
	Name         string      `json:"name"`
	LatitudeDeg  float64     `json:"latitude_deg"`
	LongitudeDeg float64     `json:"longitude_deg"`
	ElevationM   float64     `json:"elevation_m"`
	UTCOffsetH   float64     `json:"utc_offset_h"`
	Albedo       float64     `json:"ground_albedo"`
	AirTempC     [12]float64 `json:"air_temp_c"`
	RecordLowC   float64     `json:"record_low_c"`
	RecordHighC  float64     `json:"record_high_c"`
	WeatherFile  string      `json:"weather_file,omitempty"`
}

// LoadRow is one inventory line with what the workbook needs to show it
// as live formulas.
type LoadRow struct {
	Name         string   `json:"name"`
	Circuit      string   `json:"circuit"` // "ac" | "dc"
	Critical     bool     `json:"critical"`
	Quantity     float64  `json:"quantity"`
	PowerW       float64  `json:"power_w"`
	HoursPerDay  float64  `json:"hours_per_day"` // equivalent full-power hours on a day of use
	StandbyW     float64  `json:"standby_w"`
	StandbyHours float64  `json:"standby_hours"`
	DaysPerWeek  float64  `json:"days_per_week"`
	Months       [12]bool `json:"months"`
	EnergyWhDay  float64  `json:"energy_wh_day"` // on a day of use, all units
	SurgeW       float64  `json:"surge_w"`       // starting power of one unit
}

// Demand is the load side.
type Demand struct {
	Rows            []LoadRow       `json:"-"`
	ACDailyWh       [12]float64     `json:"ac_daily_wh"` // at the appliances
	DCDailyWh       [12]float64     `json:"dc_loads_daily_wh"`
	InverterDailyWh [12]float64     `json:"inverter_loss_daily_wh"` // conversion loss and idle
	DailyWh         [12]float64     `json:"daily_wh"`               // DC-side energy per day (CONTRACT)
	HourlyDCSideWh  [12][24]float64 `json:"-"`                      // DC-side mean day of each month
	CriticalDailyWh [12]float64     `json:"critical_daily_wh"`
	PeakW           float64         `json:"peak_w"`
	PeakACW         float64         `json:"peak_ac_w"`
	PeakDCW         float64         `json:"peak_dc_w"`
	SurgeW          float64         `json:"surge_w"`
	// InverterEffectiveEff is, per month, AC energy / (AC energy + inverter energy): what the
	// workbook divides AC loads by.
	InverterEffectiveEff [12]float64 `json:"-"`
}

// Resource is the solar resource on the horizontal and on the array.
type Resource struct {
	Months        [12]ResourceMonth `json:"-"`
	GHIKWhM2Day   [12]float64       `json:"ghi_kwh_m2_day"`
	POAKWhM2Day   [12]float64       `json:"poa_kwh_m2_day"`
	Source        string            `json:"source"` // "monthly means in the project" | weather file name
	Transposition string            `json:"transposition"`
}

// ResourceMonth is one row of the monthly resource table.
type ResourceMonth struct {
	Month                    int     `json:"month"`
	DayOfYear                int     `json:"day_of_year"`
	ExtraterrestrialKWhM2Day float64 `json:"extraterrestrial_kwh_m2_day"`
	GHIKWhM2Day              float64 `json:"ghi_kwh_m2_day"`
	ClearnessIndex           float64 `json:"clearness_index"`
	DiffuseFraction          float64 `json:"diffuse_fraction"`
	BeamRatio                float64 `json:"beam_ratio"`
	POAKWhM2Day              float64 `json:"poa_kwh_m2_day"`
	AirTempC                 float64 `json:"air_temp_c,omitempty"`
}

// Module echoes the module datasheet.
type Module struct {
	Name                 string  `json:"name,omitempty"`
	PmaxW                float64 `json:"pmax_w"`
	VocV                 float64 `json:"voc_v"`
	IscA                 float64 `json:"isc_a"`
	VmpV                 float64 `json:"vmp_v"`
	ImpA                 float64 `json:"imp_a"`
	TempCoeffPmaxPctPerC float64 `json:"temp_coeff_pmax_pct_per_c"`
	TempCoeffVocPctPerC  float64 `json:"temp_coeff_voc_pct_per_c"`
	NOCTC                float64 `json:"noct_c"`
	MaxSeriesFuseA       float64 `json:"max_series_fuse_a"`
}

// Derate is one named factor of the array sizing chain.
type Derate struct {
	Name   string  `json:"name"`
	Loss   float64 `json:"loss"`   // fraction lost
	Source string  `json:"source"` // "common practice", "project", "computed"
}

// Array is the PV array.
type Array struct {
	Module        Module   `json:"module"`
	TiltDeg       float64  `json:"tilt_deg"`
	TiltOptimised bool     `json:"tilt_optimised"`
	AzimuthDeg    float64  `json:"azimuth_deg"`
	Derates       []Derate `json:"derates"`
	// The sizing chain: required_w = demand / (psh × temperature × derates × controller × battery path).
	DesignPSH           float64 `json:"design_psh_h"`        // POA of the design month, kWh/m²/day = h at 1 kW/m²
	TemperatureFactor   float64 `json:"temperature_factor"`  // module power at design-month cell temperature / STC
	DerateFactor        float64 `json:"derate_factor"`       // product of (1 − loss)
	ControllerFactor    float64 `json:"controller_factor"`   // MPPT efficiency, or PWM operating-point factor
	BatteryPathFactor   float64 `json:"battery_path_factor"` // 1 − share through battery × (1 − round-trip efficiency)
	ShareThroughBattery float64 `json:"share_through_battery"`
	// ReliabilityFactor multiplies the rule-based requirement where the
	// array is sized for a loss-of-load target (1 otherwise).
	ReliabilityFactor   float64     `json:"reliability_factor"`
	DesignCellTempC     float64     `json:"design_cell_temp_c"`
	RequiredW           float64     `json:"required_w"`
	RatedW              float64     `json:"rated_w"`
	Modules             int         `json:"modules"`
	ModulesSeries       int         `json:"modules_series"`
	Strings             int         `json:"strings"`
	VocColdV            float64     `json:"voc_cold_v"` // string Voc at the record low
	VmpHotV             float64     `json:"vmp_hot_v"`  // string Vmp at the hottest cell temperature
	MaxCellTempC        float64     `json:"max_cell_temp_c"`
	MonthlyYieldWhDay   [12]float64 `json:"yield_wh_day"` // expected DC energy per day delivered by the controller, each month
	PWMLossVsMPPTWhYear float64     `json:"pwm_loss_vs_mppt_wh_year,omitempty"`
}

// CyclePoint is one point of the cycle-life curve.
type CyclePoint struct {
	DoD    float64 `json:"dod"`
	Cycles float64 `json:"cycles"`
}

// Battery is the battery bank.
type Battery struct {
	Chemistry                   string       `json:"chemistry"`
	BlockName                   string       `json:"block_name,omitempty"`
	BlockV                      float64      `json:"block_v"`
	BlockAh                     float64      `json:"block_ah"`
	RatedHours                  float64      `json:"rated_hours"`
	NominalV                    float64      `json:"nominal_v"`
	AutonomyDays                float64      `json:"autonomy_days"`
	MaxDoD                      float64      `json:"max_dod"`
	TempC                       float64      `json:"temperature_c"`
	TempFactor                  float64      `json:"temperature_factor"`
	RateFactor                  float64      `json:"rate_factor"`
	DischargeEfficiency         float64      `json:"discharge_efficiency"`
	ChargeEfficiency            float64      `json:"charge_efficiency"`
	PeukertExponent             float64      `json:"peukert_exponent"`
	RequiredAh                  float64      `json:"required_ah"`
	RequiredWh                  float64      `json:"required_wh"`
	BlocksSeries                int          `json:"blocks_series"`
	Strings                     int          `json:"strings"`
	Blocks                      int          `json:"blocks"`
	CapacityAh                  float64      `json:"capacity_ah"`
	CapacityWh                  float64      `json:"capacity_wh"`
	UsableWh                    float64      `json:"usable_wh"`
	ChargeRateC                 float64      `json:"charge_rate_c"` // array charge current / capacity
	ShortCircuitA               float64      `json:"short_circuit_a"`
	VentilationM3H              float64      `json:"ventilation_m3_h,omitempty"`
	CycleLife                   []CyclePoint `json:"cycle_life"`
	CalendarLifeYears           float64      `json:"calendar_life_years"`
	CycleLifeYears              float64      `json:"cycle_life_years"`
	ExpectedLifeYears           float64      `json:"expected_life_years"`
	EquivalentFullCyclesPerYear float64      `json:"equivalent_full_cycles_per_year"`
	ReplacementYears            []float64    `json:"replacement_years"`
}

// Controller is the charge controller.
type Controller struct {
	Kind          string    `json:"kind"` // "mppt" | "pwm"
	Efficiency    float64   `json:"efficiency"`
	ChargeV       float64   `json:"charge_v"`
	MaxPVVoltageV float64   `json:"max_pv_voltage_v"`
	Margin        float64   `json:"margin"`
	RequiredA     float64   `json:"required_a"`
	RatedA        float64   `json:"rated_a"` // of one unit
	Units         int       `json:"units"`
	RatingsA      []float64 `json:"ratings_a,omitempty"`
	LifeYears     float64   `json:"life_years"`
}

// Inverter is the inverter, present where the project has AC loads.
type Inverter struct {
	RequiredContinuousW float64   `json:"required_continuous_w"`
	ContinuousW         float64   `json:"continuous_w"`
	RequiredSurgeW      float64   `json:"required_surge_w"`
	SurgeW              float64   `json:"surge_w"`
	Margin              float64   `json:"margin"`
	SurgeRatio          float64   `json:"surge_ratio"`
	IdleW               float64   `json:"idle_w"`
	FromList            bool      `json:"from_list"`
	RatingsW            []float64 `json:"ratings_w,omitempty"`
	LifeYears           float64   `json:"life_years"`
}

// LedgerTotals is the energy ledger of CONTRACT.md.
type LedgerTotals struct {
	PVAvailableWh  float64 `json:"pv_available_wh"`
	LoadServedWh   float64 `json:"load_served_wh"`
	UnmetWh        float64 `json:"unmet_wh"`
	DumpedWh       float64 `json:"dumped_wh"`
	LossesWh       float64 `json:"losses_wh"`
	BatteryStartWh float64 `json:"battery_start_wh"`
	BatteryEndWh   float64 `json:"battery_end_wh"`
}

// DayRow is one day of the daily balance sheet.
type DayRow struct {
	Day                 int     `json:"day"` // 1..365
	Month               int     `json:"month"`
	PVAvailableWh       float64 `json:"pv_available_wh"`
	PVUsedWh            float64 `json:"pv_used_wh"`
	DemandWh            float64 `json:"demand_wh"`
	ServedCriticalWh    float64 `json:"served_critical_wh"`
	ServedNonCriticalWh float64 `json:"served_noncritical_wh"`
	UnmetWh             float64 `json:"unmet_wh"`
	DumpedWh            float64 `json:"dumped_wh"`
	LossesWh            float64 `json:"losses_wh"`
	SOCMin              float64 `json:"soc_min"`
	SOCMax              float64 `json:"soc_max"`
	SOCEnd              float64 `json:"soc_end"`
}

// MonthStats is the reliability of one calendar month over all simulated years.
type MonthStats struct {
	Month     int     `json:"month"`
	DemandWh  float64 `json:"demand_wh"`
	UnmetWh   float64 `json:"unmet_wh"`
	LOLP      float64 `json:"loss_of_load_probability"`
	DumpedWh  float64 `json:"dumped_wh"`
	PVWh      float64 `json:"pv_available_wh"`
	MinSOC    float64 `json:"min_soc"`
	MeanSOC   float64 `json:"mean_soc"`
	UnmetDays int     `json:"unmet_days"`
}

// YearStats is one simulated year.
type YearStats struct {
	Year     int     `json:"year"`
	LOLP     float64 `json:"loss_of_load_probability"`
	UnmetWh  float64 `json:"unmet_wh"`
	DumpedWh float64 `json:"dumped_wh"`
	MinSOC   float64 `json:"min_soc"`
}

// StressTest is one of the stress runs the trade asks for.
type StressTest struct {
	Name         string  `json:"name"`
	Description  string  `json:"description"`
	MinSOC       float64 `json:"min_soc"`
	UnmetWh      float64 `json:"unmet_wh"`
	RecoveryDays float64 `json:"recovery_days"` // −1: not recovered within the run
}

// MeasuredYear is the result of running a weather file's year.
type MeasuredYear struct {
	Source   string  `json:"source"`
	LOLP     float64 `json:"loss_of_load_probability"`
	UnmetWh  float64 `json:"unmet_wh"`
	MinSOC   float64 `json:"min_soc"`
	DumpedWh float64 `json:"dumped_wh"`
}

// Simulation is the day-by-day check of the design.
type Simulation struct {
	Years                 int           `json:"years"`
	Seed                  uint64        `json:"seed"`
	LOLP                  float64       `json:"loss_of_load_probability"`
	TargetLOLP            float64       `json:"target_lolp,omitempty"`
	DemandWh              float64       `json:"demand_wh"`
	UnmetWh               float64       `json:"unmet_wh"`
	MinSOC                float64       `json:"min_soc"`
	MeanSOC               float64       `json:"mean_soc"`
	SOCP5                 float64       `json:"soc_p5"`
	SOCP50                float64       `json:"soc_p50"`
	UnmetHours            int           `json:"unmet_hours"`
	UnmetDays             int           `json:"unmet_days"`
	LongestUnmetRunDays   int           `json:"longest_unmet_run_days"`
	DaysBelowHalf         int           `json:"days_below_half"`
	DumpedWh              float64       `json:"dumped_wh"`
	RecoveryDays          float64       `json:"recovery_days"`
	ThroughputWh          float64       `json:"throughput_wh"`
	EquivalentFullCycles  float64       `json:"equivalent_full_cycles"`
	Ledger                LedgerTotals  `json:"ledger"`
	Monthly               []MonthStats  `json:"monthly"`
	Yearly                []YearStats   `json:"yearly"`
	Stress                []StressTest  `json:"stress_tests"`
	Measured              *MeasuredYear `json:"measured_year,omitempty"`
	FirstYear             []DayRow      `json:"-"` // daily balance of the first simulated year
	FirstYearHourlySOC    []float32     `json:"-"` // 8760 values, for the hourly sheet
	FirstYearHourlyPVWh   []float32     `json:"-"`
	FirstYearHourlyLoadWh []float32     `json:"-"`
}

// Circuit is one conductor choice.
type Circuit struct {
	Name               string  `json:"name"`
	CurrentA           float64 `json:"current_a"`
	LengthM            float64 `json:"length_m"`
	VoltageV           float64 `json:"voltage_v"`
	MaxDropPct         float64 `json:"max_drop_pct"`
	Size               string  `json:"size"`
	AreaMM2            float64 `json:"area_mm2"`
	ResistanceOhmPerKm float64 `json:"resistance_ohm_per_km"`
	AmpacityA          float64 `json:"ampacity_a"`
	DropV              float64 `json:"drop_v"`
	DropPct            float64 `json:"drop_pct"`
	LimitedBy          string  `json:"limited_by"`
}

// Protection is one fuse or breaker.
type Protection struct {
	Circuit       string  `json:"circuit"`
	Kind          string  `json:"kind"`
	RatingA       float64 `json:"rating_a"`
	Count         int     `json:"count"`
	InterruptingA float64 `json:"interrupting_a,omitempty"`
	Note          string  `json:"note,omitempty"`
}

// Wiring is the conductor and protection design.
type Wiring struct {
	Standard   string       `json:"standard"`
	Circuits   []Circuit    `json:"circuits"`
	Protection []Protection `json:"protection"`
}

// Item is one line of the materials list.
type Item struct {
	Category  string  `json:"category"`
	Name      string  `json:"name"`
	Unit      string  `json:"unit"`
	Quantity  float64 `json:"quantity"`
	UnitPrice float64 `json:"unit_price"`
	Priced    bool    `json:"priced"` // a price was given in the project
}

// Materials is the parts list.
type Materials struct {
	Currency string  `json:"currency"`
	Items    []Item  `json:"items"`
	Total    float64 `json:"total"`
	Unpriced int     `json:"unpriced"` // items without a price in the project
}

// LifecycleRow is one cost event of the lifecycle table.
type LifecycleRow struct {
	Year         int     `json:"year"`
	Item         string  `json:"item"`
	Cost         float64 `json:"cost"`
	PresentWorth float64 `json:"present_worth"`
}

// Lifecycle is the lifecycle cost.
type Lifecycle struct {
	Currency            string         `json:"currency"`
	DiscountRate        float64        `json:"discount_rate"`
	AnalysisYears       float64        `json:"analysis_years"`
	Capital             float64        `json:"capital"`
	Installation        float64        `json:"installation"`
	OMPerYear           float64        `json:"om_per_year"`
	Rows                []LifecycleRow `json:"rows"`
	CapitalPW           float64        `json:"capital_pw"`
	OMPW                float64        `json:"om_pw"`
	ReplacementsPW      float64        `json:"replacements_pw"`
	SalvagePW           float64        `json:"salvage_pw"`
	NetPresentCost      float64        `json:"net_present_cost"`
	ServedKWhPerYear    float64        `json:"served_kwh_per_year"`
	LevelisedCostPerKWh float64        `json:"levelised_cost_per_kwh"`
}

// CurvePoint is one point of an isoreliability curve.
type CurvePoint struct {
	StorageDays float64 `json:"storage_days"`
	ArrayToLoad float64 `json:"array_to_load"`
	ArrayW      float64 `json:"array_w"`
	CapacityWh  float64 `json:"capacity_wh"`
	LOLP        float64 `json:"loss_of_load_probability"`
	Cost        float64 `json:"cost,omitempty"`
}

// Curve is the isoreliability curve of one loss-of-load target (Egido & Lorenzo 1992).
type Curve struct {
	TargetLOLP float64      `json:"target_lolp"`
	Points     []CurvePoint `json:"points"`
	Cheapest   int          `json:"cheapest"` // index into Points, −1 without costs
}

// SunPathRow is one row of the sun-path table.
type SunPathRow struct {
	Month        int     `json:"month"`
	SolarHour    int     `json:"solar_hour"`
	ElevationDeg float64 `json:"elevation_deg"`
	AzimuthDeg   float64 `json:"azimuth_deg"`
}

// Method names one published method or source the run used.
type Method struct {
	Topic  string `json:"topic"`
	Method string `json:"method"`
	Source string `json:"source"`
}

var monthNames = [12]string{"January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December"}

// MonthName is the English name of month 1..12 ("" outside).
func MonthName(month int) string {
	if month < 1 || month > 12 {
		return ""
	}
	return monthNames[month-1]
}
