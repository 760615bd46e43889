// Package schema defines the project document a practitioner writes, its
// JSON Schema, the defaults applied to it and its validation.
//
// The document is decoded strictly: an unknown key is an error. Every
// default is applied in one place (ApplyDefaults) so that
// `solstand validate --show-defaults` can show the document as the engine
// sees it.
package schema

// Project is the whole project document.
type Project struct {
	Schema     string     `json:"$schema,omitempty" jsonschema:"description=URI or path of this document's JSON Schema (ignored)"`
	Name       string     `json:"name" jsonschema:"description=Project name shown on every sheet"`
	Client     string     `json:"client,omitempty" jsonschema:"description=Who the design is for"`
	PreparedBy string     `json:"prepared_by,omitempty" jsonschema:"description=Who prepared the design"`
	Site       Site       `json:"site"`
	Loads      []Load     `json:"loads" jsonschema:"description=The appliance inventory"`
	System     System     `json:"system,omitempty"`
	Array      Array      `json:"array"`
	Controller Controller `json:"controller,omitempty"`
	Battery    Battery    `json:"battery"`
	Inverter   *Inverter  `json:"inverter,omitempty" jsonschema:"description=Needed where any load is AC"`
	Wiring     Wiring     `json:"wiring,omitempty"`
	Costs      Costs      `json:"costs,omitempty"`
	Simulation Simulation `json:"simulation,omitempty"`
	Output     Output     `json:"output,omitempty"`
}

// Site is where the system stands and its climate.
type Site struct {
	Name         string  `json:"name" jsonschema:"description=Site name"`
	LatitudeDeg  float64 `json:"latitude_deg" jsonschema:"description=Latitude in degrees (north positive); may be left out when a weather file gives the location,minimum=-90,maximum=90"`
	LongitudeDeg float64 `json:"longitude_deg" jsonschema:"description=Longitude in degrees (east positive); may be left out when a weather file gives the location,minimum=-180,maximum=180"`
	// LocationFromWeather is set when the document gives no location and
	// the weather file's is used; ApplyDefaults then leaves the defaults
	// that depend on the location for the engine to fill once it is known.
	LocationFromWeather bool     `json:"-"`
	ElevationM          float64  `json:"elevation_m,omitempty" jsonschema:"description=Elevation above sea level in metres"`
	UTCOffsetH          *float64 `json:"utc_offset_h,omitempty" jsonschema:"description=Standard time zone offset from UTC in hours (default: longitude / 15 rounded)"`
	AlbedoFrac          *float64 `json:"ground_albedo,omitempty" jsonschema:"description=Ground reflectance 0..1 (default 0.2; fresh snow 0.7-0.9)"`
	// GHIKWhM2Day holds the monthly means of daily global horizontal irradiation.
	GHIKWhM2Day []float64 `json:"ghi_kwh_m2_day,omitempty" jsonschema:"description=Monthly means of daily global horizontal irradiation January..December in kWh/m²/day (12 values; or give a weather file)"`
	AirTempC    []float64 `json:"air_temp_c,omitempty" jsonschema:"description=Monthly mean air temperature January..December in °C (12 values)"`
	AirTempMinC []float64 `json:"air_temp_min_c,omitempty" jsonschema:"description=Monthly mean of the daily minimum air temperature in °C (12 values; optional)"`
	AirTempMaxC []float64 `json:"air_temp_max_c,omitempty" jsonschema:"description=Monthly mean of the daily maximum air temperature in °C (12 values; optional)"`
	RecordLowC  *float64  `json:"record_low_c,omitempty" jsonschema:"description=Record low air temperature in °C (string voltage and freezing checks; default: coldest monthly mean − 15)"`
	RecordHighC *float64  `json:"record_high_c,omitempty" jsonschema:"description=Record high air temperature in °C (default: warmest monthly mean + 15)"`
	// Horizon is an optional site survey of the skyline.
	Horizon     []HorizonPoint `json:"horizon,omitempty" jsonschema:"description=Skyline from a site survey: points of azimuth and elevation; the beam is blocked when the sun is behind it"`
	WeatherFile string         `json:"weather_file,omitempty" jsonschema:"description=Path of an EPW or CSV weather file relative to this document (the --weather flag overrides it)"`
}

// HorizonPoint is one surveyed point of the skyline.
type HorizonPoint struct {
	AzimuthDeg   float64 `json:"azimuth_deg" jsonschema:"description=Azimuth clockwise from true north in degrees,minimum=0,maximum=360"`
	ElevationDeg float64 `json:"elevation_deg" jsonschema:"description=Elevation of the skyline in degrees,minimum=0,maximum=90"`
}

// Load is one line of the appliance inventory.
type Load struct {
	Name     string   `json:"name" jsonschema:"description=Appliance name"`
	Quantity *float64 `json:"quantity,omitempty" jsonschema:"description=How many (a whole number; default 1)"`
	Circuit  string   `json:"circuit,omitempty" jsonschema:"description=Supply side: ac (through the inverter) or dc (default dc),enum=ac,enum=dc"`
	PowerW   float64  `json:"power_w" jsonschema:"description=Running power of one unit in W"`
	// Daily use: one of hours_per_day, windows, energy_wh_day, duty_cycle.
	HoursPerDay *float64 `json:"hours_per_day,omitempty" jsonschema:"description=Hours of use per day; spread over 'spread_window'"`
	Spread      string   `json:"spread_window,omitempty" jsonschema:"description=Window over which hours_per_day is spread: 'daytime' (08:00-17:00)\\, 'evening' (18:00-23:00)\\, 'night' (18:00-06:00)\\, 'allday' or a clock window like '17:30-22:00' (default evening)"`
	Windows     []string `json:"windows,omitempty" jsonschema:"description=Clock windows of use such as '18:00-22:30' or '21:00-06:00' (across midnight)"`
	EnergyWhDay *float64 `json:"energy_wh_day,omitempty" jsonschema:"description=Measured energy per day of one unit in Wh (e.g. from a plug-in meter); spread over the windows or all day"`
	DutyCycle   *float64 `json:"duty_cycle,omitempty" jsonschema:"description=Fraction of time running within its windows (or all day)\\, e.g. 0.35 for a compressor"`
	StandbyW    float64  `json:"standby_w,omitempty" jsonschema:"description=Standby power of one unit outside its windows in W"`
	DaysPerWeek *float64 `json:"days_per_week,omitempty" jsonschema:"description=Days of use per week (default 7)"`
	Months      []int    `json:"months,omitempty" jsonschema:"description=Months in which it runs\\, 1..12 (default all)"`
	SurgeFactor *float64 `json:"surge_factor,omitempty" jsonschema:"description=Starting power as a multiple of running power (common practice 3-7 for motors and compressors; default 1)"`
	SurgeW      *float64 `json:"surge_w,omitempty" jsonschema:"description=Starting power of one unit in W (instead of surge_factor)"`
	Priority    string   `json:"priority,omitempty" jsonschema:"description=critical loads are served first and never shed; normal loads are shed below the non-critical cut-off (default normal),enum=critical,enum=normal"`
}

// System holds choices that span the whole system.
type System struct {
	NominalV Auto `json:"nominal_v,omitempty" jsonschema:"description=Nominal DC system voltage: 12\\, 24\\, 48 or 'auto' (by daily energy: up to 1.5 kWh/day 12 V\\, up to 5 kWh/day 24 V\\, above 48 V; common practice)"`
}

// Module is the datasheet of one PV module at STC.
type Module struct {
	Name                 string   `json:"name,omitempty" jsonschema:"description=Module name as it should appear in the parts list"`
	PmaxW                float64  `json:"pmax_w" jsonschema:"description=Rated power at STC in W"`
	VocV                 float64  `json:"voc_v" jsonschema:"description=Open-circuit voltage at STC in V"`
	IscA                 float64  `json:"isc_a" jsonschema:"description=Short-circuit current at STC in A"`
	VmpV                 float64  `json:"vmp_v" jsonschema:"description=Voltage at maximum power at STC in V"`
	ImpA                 float64  `json:"imp_a" jsonschema:"description=Current at maximum power at STC in A"`
	TempCoeffPmaxPctPerC *float64 `json:"temp_coeff_pmax_pct_per_c,omitempty" jsonschema:"description=Temperature coefficient of Pmax in %/°C (default -0.40)"`
	TempCoeffVocPctPerC  *float64 `json:"temp_coeff_voc_pct_per_c,omitempty" jsonschema:"description=Temperature coefficient of Voc in %/°C (default -0.30; absent => NEC 690.7 table factors)"`
	TempCoeffIscPctPerC  *float64 `json:"temp_coeff_isc_pct_per_c,omitempty" jsonschema:"description=Temperature coefficient of Isc in %/°C (default 0.05)"`
	NOCTC                *float64 `json:"noct_c,omitempty" jsonschema:"description=Nominal operating cell temperature in °C (default 45)"`
	MaxSeriesFuseA       *float64 `json:"max_series_fuse_a,omitempty" jsonschema:"description=Maximum series fuse rating in A (default 15)"`
	MaxSystemV           *float64 `json:"max_system_v,omitempty" jsonschema:"description=Maximum system voltage in V (default 1000)"`
}

// Array is the PV array: module, orientation and derates.
type Array struct {
	Module        Module   `json:"module"`
	TiltDeg       Auto     `json:"tilt_deg,omitempty" jsonschema:"description=Tilt from horizontal in degrees\\, or 'optimise' for the tilt that best serves the worst month (default optimise)"`
	AzimuthDeg    *float64 `json:"azimuth_deg,omitempty" jsonschema:"description=Azimuth the array faces\\, clockwise from true north (180 = south; default: towards the equator)"`
	Transposition string   `json:"transposition,omitempty" jsonschema:"description=Sky model for the hourly simulation (default hdkr),enum=isotropic,enum=hdkr"`
	// Derates, each a loss fraction.
	SoilingLoss       *float64 `json:"soiling_loss,omitempty" jsonschema:"description=Loss fraction from dust and dirt (default 0.03; common practice)"`
	MismatchLoss      *float64 `json:"mismatch_loss,omitempty" jsonschema:"description=Loss fraction from module mismatch (default 0.02; common practice)"`
	WiringLoss        *float64 `json:"wiring_loss,omitempty" jsonschema:"description=Loss fraction in DC wiring (default 0.02; common practice)"`
	ToleranceLoss     *float64 `json:"tolerance_loss,omitempty" jsonschema:"description=Loss fraction from the module power tolerance (default 0.00; common practice)"`
	AgeingLossPerYear *float64 `json:"ageing_loss_per_year,omitempty" jsonschema:"description=Loss fraction of rated power per year of age (default 0.005; common practice)"`
	DesignAgeYears    *float64 `json:"design_age_years,omitempty" jsonschema:"description=Age of the array the sizing is made for\\, in years (default 0)"`
	ModuleCost        *float64 `json:"-"`
}

// Controller is the charge controller.
type Controller struct {
	Kind               string    `json:"kind,omitempty" jsonschema:"description=mppt or pwm (default mppt),enum=mppt,enum=pwm"`
	MaxPVVoltageV      *float64  `json:"max_pv_voltage_v,omitempty" jsonschema:"description=Maximum PV input voltage in V (default 150 for MPPT; 50 for PWM at 12/24 V\\, 100 at 48 V)"`
	MinMPPTVoltageV    *float64  `json:"min_mppt_voltage_v,omitempty" jsonschema:"description=Lowest PV voltage at which an MPPT controller still charges\\, in V (default: charging voltage + 5 V)"`
	EfficiencyFraction *float64  `json:"efficiency,omitempty" jsonschema:"description=Conversion efficiency 0..1 (default 0.97 MPPT\\, 0.99 PWM)"`
	RatingsA           []float64 `json:"ratings_a,omitempty" jsonschema:"description=Output-current ratings on offer in A; the smallest that fits is chosen\\, or several in parallel"`
	LifeYears          *float64  `json:"life_years,omitempty" jsonschema:"description=Service life in years (default 10)"`
}

// Battery is the battery bank.
type Battery struct {
	Chemistry    string     `json:"chemistry" jsonschema:"description=flooded\\, agm\\, gel or lifepo4,enum=flooded,enum=agm,enum=gel,enum=lifepo4"`
	Block        Block      `json:"block"`
	MaxDoD       *float64   `json:"max_dod,omitempty" jsonschema:"description=Maximum depth of discharge 0..1 (default by chemistry)"`
	AutonomyDays *float64   `json:"autonomy_days,omitempty" jsonschema:"description=Days the bank alone carries the design-month load (default 3)"`
	TempC        *float64   `json:"temperature_c,omitempty" jsonschema:"description=Temperature where the bank stands in the coldest month\\, in °C (default: indoors the coldest monthly mean air temperature held between 10 and 20 °C\\, outdoors the coldest monthly mean)"`
	Indoors      *bool      `json:"indoors,omitempty" jsonschema:"description=The bank stands in a room people enter (default true)"`
	RoomVolumeM3 *float64   `json:"room_volume_m3,omitempty" jsonschema:"description=Volume of the battery room in m³ (for the ventilation check)"`
	InitialSOC   *float64   `json:"initial_soc,omitempty" jsonschema:"description=State of charge at the start of the simulation 0..1 (default 1)"`
	ReconnectSOC *float64   `json:"reconnect_soc,omitempty" jsonschema:"description=State of charge at which loads reconnect after a low-voltage disconnect (default: cut-off + 0.10)"`
	NonCritical  *float64   `json:"noncritical_cutoff_soc,omitempty" jsonschema:"description=State of charge below which normal (non-critical) loads are shed (default: cut-off + 0.15)"`
	Overrides    *Chemistry `json:"chemistry_overrides,omitempty" jsonschema:"description=Override any built-in figure of the chemistry"`
}

// Block is the datasheet of one battery block (cell or monobloc).
type Block struct {
	Name            string   `json:"name,omitempty"`
	NominalV        float64  `json:"nominal_v" jsonschema:"description=Nominal voltage of one block in V"`
	CapacityAh      float64  `json:"capacity_ah" jsonschema:"description=Rated capacity of one block in Ah at rated_hours"`
	RatedHours      *float64 `json:"rated_hours,omitempty" jsonschema:"description=Discharge time of the rated capacity in h (default 20 lead-acid\\, 5 lithium)"`
	InternalResMOhm *float64 `json:"internal_resistance_mohm,omitempty" jsonschema:"description=Internal resistance of one block in mΩ (for the short-circuit current)"`
	MaxChargeA      *float64 `json:"max_charge_a,omitempty" jsonschema:"description=Maximum charge current of one block in A"`
	MaxDischargeA   *float64 `json:"max_discharge_a,omitempty" jsonschema:"description=Maximum discharge current of one block in A"`
	PeukertExponent *float64 `json:"peukert_exponent,omitempty" jsonschema:"description=Peukert exponent (default by chemistry)"`
}

// Chemistry overrides built-in chemistry figures.
type Chemistry struct {
	ChargeEfficiency      *float64     `json:"charge_efficiency,omitempty" jsonschema:"description=Charge efficiency 0..1"`
	DischargeEfficiency   *float64     `json:"discharge_efficiency,omitempty" jsonschema:"description=Discharge efficiency 0..1"`
	SelfDischargePerMonth *float64     `json:"self_discharge_per_month,omitempty" jsonschema:"description=Self-discharge as a fraction of stored energy per month"`
	CalendarLifeYears     *float64     `json:"calendar_life_years,omitempty" jsonschema:"description=Calendar life in years"`
	CycleLife             []CyclePoint `json:"cycle_life,omitempty" jsonschema:"description=Cycles to end of life against depth of discharge"`
	ChargeMinTempC        *float64     `json:"charge_min_temp_c,omitempty" jsonschema:"description=Lowest temperature at which the bank may be charged in °C"`
}

// CyclePoint is one point of a cycle-life curve.
type CyclePoint struct {
	DoD    float64 `json:"dod" jsonschema:"description=Depth of discharge 0..1"`
	Cycles float64 `json:"cycles" jsonschema:"description=Cycles to end of life"`
}

// EfficiencyPoint is one point of the inverter efficiency curve.
type EfficiencyPoint struct {
	LoadFraction float64 `json:"load_fraction" jsonschema:"description=Output power as a fraction of the continuous rating"`
	Efficiency   float64 `json:"efficiency" jsonschema:"description=Efficiency 0..1 at that load"`
}

// Inverter is the DC-to-AC inverter.
type Inverter struct {
	RatingsW        []float64         `json:"ratings_w,omitempty" jsonschema:"description=Continuous ratings on offer in W; the smallest that fits is chosen"`
	SurgeRatio      *float64          `json:"surge_ratio,omitempty" jsonschema:"description=Surge rating as a multiple of the continuous rating (default 2)"`
	Margin          *float64          `json:"margin,omitempty" jsonschema:"description=Continuous rating over the peak AC load (default 1.25; common practice)"`
	EfficiencyCurve []EfficiencyPoint `json:"efficiency_curve,omitempty" jsonschema:"description=Efficiency against load fraction (default 0.05:0.70 0.1:0.82 0.25:0.90 0.5:0.93 1.0:0.92)"`
	IdleW           *float64          `json:"idle_w,omitempty" jsonschema:"description=Consumption with no load in W (default 1 % of the rating)"`
	StandbyW        *float64          `json:"standby_w,omitempty" jsonschema:"description=Consumption in search/standby mode in W (only with wake_threshold_w)"`
	WakeThresholdW  *float64          `json:"wake_threshold_w,omitempty" jsonschema:"description=Load below which the inverter sleeps in standby mode in W (absent: always on)"`
	LifeYears       *float64          `json:"life_years,omitempty" jsonschema:"description=Service life in years (default 10)"`
}

// Wiring holds circuit lengths and limits.
type Wiring struct {
	Standard        string     `json:"standard,omitempty" jsonschema:"description=Conductor sizes and fuse ratings: iec (mm²) or nec (AWG) (default iec),enum=iec,enum=nec"`
	CableClass      *int       `json:"cable_class,omitempty" jsonschema:"description=IEC 60228 conductor class 2 (stranded) or 5 (flexible) (default 5)"`
	PVStringM       *float64   `json:"pv_string_m,omitempty" jsonschema:"description=One-way length from strings to combiner in m (default 10)"`
	ArrayToCtrlM    *float64   `json:"array_to_controller_m,omitempty" jsonschema:"description=One-way length from combiner/array to controller in m (default 15)"`
	CtrlToBatteryM  *float64   `json:"controller_to_battery_m,omitempty" jsonschema:"description=One-way length from controller to battery in m (default 2)"`
	BatteryToInvM   *float64   `json:"battery_to_inverter_m,omitempty" jsonschema:"description=One-way length from battery to inverter in m (default 2)"`
	BatteryToPanelM *float64   `json:"battery_to_dc_panel_m,omitempty" jsonschema:"description=One-way length from battery to the DC load panel in m (default 5)"`
	PVDropPct       *float64   `json:"pv_max_drop_pct,omitempty" jsonschema:"description=Maximum voltage drop on PV circuits in % (default 3; common practice)"`
	BatteryDropPct  *float64   `json:"battery_max_drop_pct,omitempty" jsonschema:"description=Maximum voltage drop between battery and inverter/controller in % (default 1.5; common practice)"`
	BranchDropPct   *float64   `json:"branch_max_drop_pct,omitempty" jsonschema:"description=Maximum voltage drop on DC branches in % (default 3; common practice)"`
	Branches        []DCBranch `json:"dc_branches,omitempty" jsonschema:"description=DC load branches from the DC panel"`
}

// DCBranch is one DC branch circuit.
type DCBranch struct {
	Name     string   `json:"name"`
	LengthM  float64  `json:"length_m" jsonschema:"description=One-way length in m"`
	Loads    []string `json:"loads,omitempty" jsonschema:"description=Names of the DC loads on this branch (their running current sets the design current)"`
	CurrentA *float64 `json:"current_a,omitempty" jsonschema:"description=Design current in A (instead of loads)"`
}

// Costs holds unit prices and the economic frame. No default prices exist:
// a price not given is left out of the budget and said so.
type Costs struct {
	Currency          string   `json:"currency,omitempty" jsonschema:"description=Currency code or symbol (default USD)"`
	ModuleEach        *float64 `json:"module_each,omitempty" jsonschema:"description=Price of one PV module"`
	ControllerEach    *float64 `json:"controller_each,omitempty" jsonschema:"description=Price of one charge controller"`
	BatteryBlockEach  *float64 `json:"battery_block_each,omitempty" jsonschema:"description=Price of one battery block"`
	InverterEach      *float64 `json:"inverter_each,omitempty" jsonschema:"description=Price of the inverter"`
	FuseEach          *float64 `json:"fuse_each,omitempty" jsonschema:"description=A fuse with its holder"`
	BreakerEach       *float64 `json:"breaker_each,omitempty" jsonschema:"description=A DC breaker or disconnect"`
	CombinerEach      *float64 `json:"combiner_each,omitempty" jsonschema:"description=Price of a PV combiner box (where strings are paralleled)"`
	CablePerMPerMM2   *float64 `json:"cable_per_m_per_mm2,omitempty" jsonschema:"description=Cable price per metre and per mm² of cross-section (a simple copper-based price)"`
	MountingPerModule *float64 `json:"mounting_per_module,omitempty" jsonschema:"description=Mounting structure price per module"`
	Installation      *float64 `json:"installation,omitempty" jsonschema:"description=Installation labour and transport\\, lump sum"`
	OMPerYear         *float64 `json:"om_per_year,omitempty" jsonschema:"description=Operation and maintenance per year"`
	DiscountRate      *float64 `json:"discount_rate,omitempty" jsonschema:"description=Real discount rate per year 0..1 (default 0.05)"`
	AnalysisYears     *float64 `json:"analysis_years,omitempty" jsonschema:"description=Analysis period in years (default 20)"`
}

// Simulation holds the options of the day-by-day simulation.
type Simulation struct {
	Years             *int     `json:"years,omitempty" jsonschema:"description=Synthetic years simulated (default 20)"`
	Seed              *uint64  `json:"seed,omitempty" jsonschema:"description=Seed of the synthetic weather (default 1)"`
	LagOneCorrelation *float64 `json:"lag_one_correlation,omitempty" jsonschema:"description=Day-to-day persistence of clearness (default 0.3; common practice)"`
	DailySwingC       *float64 `json:"daily_swing_c,omitempty" jsonschema:"description=Air temperature swing from the daily minimum to maximum in °C where no monthly min/max are given (default 10)"`
	TargetLOLP        *float64 `json:"target_lolp,omitempty" jsonschema:"description=Loss-of-load probability to size for (e.g. 0.01); absent: the rule-based sizing stands"`
	CloudyStreakDays  *int     `json:"cloudy_streak_days,omitempty" jsonschema:"description=Length of the stress-test cloudy streak in days (default: autonomy days rounded up)"`
	CloudyStreakFrac  *float64 `json:"cloudy_streak_fraction,omitempty" jsonschema:"description=Irradiation during the streak as a fraction of the month's mean (default 0.25)"`
}

// Output holds options of the workbook.
type Output struct {
	Paper  string `json:"paper,omitempty" jsonschema:"description=Paper size for printing: a4 or letter (default a4),enum=a4,enum=letter"`
	Date   string `json:"date,omitempty" jsonschema:"description=Document date YYYY-MM-DD written into the workbook (default: the date of SOURCE_DATE_EPOCH where set\\, else 2026-01-01\\, so that output repeats)"`
	Hourly *bool  `json:"hourly,omitempty" jsonschema:"description=Add the hourly sheet of the first simulated year (default false)"`
}
