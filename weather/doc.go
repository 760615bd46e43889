// Package weather reads measured or typical weather years (EnergyPlus EPW
// files and plain CSV files), checks them, fills short gaps, and makes
// synthetic daily weather from monthly means.
//
// # Time convention
//
// Every hourly value belongs to an interval of one hour in local standard
// time (no daylight saving): Hour h covers h:00 to h+1:00, h = 0..23. Every
// year has 365 days: a record of 29 February is dropped (and counted in the
// series' Notes), so an hourly year always holds 8760 hours and a daily year
// 365 days, day 0 being 1 January.
//
// # EPW files
//
// ReadEPW follows the EnergyPlus Weather format (EnergyPlus Auxiliary
// Programs, weather data chapter): eight header lines, the first being
// LOCATION (city, region, country, source, WMO number, latitude in degrees
// north, longitude in degrees east, time zone in hours from UTC, elevation in
// metres), then one record an hour. EPW records are hour-ending: record hour 1
// is the interval 00:00–01:00, stored here as Hour 0. Radiation fields are
// energies over the hour in Wh/m² (missing code 9999), the dry-bulb
// temperature is in °C (missing code 99.9).
//
// # CSV files
//
// ReadCSV reads a plain comma-separated file with one header row. Lines
// starting with # are comments. Column names are case-insensitive; unknown
// columns are ignored. The timestamp is either
//
//   - a column time holding an RFC 3339 instant with its UTC offset
//     (2023-01-01T00:00:00-06:00), the start of the interval the row
//     describes; rows with different offsets (daylight saving) are all
//     converted to the smallest offset met, taken as the site's standard
//     time; or
//   - a column date (YYYY-MM-DD, local standard time) and, for hourly data,
//     a column hour (0..23), the interval hour:00 to hour+1:00.
//
// Hourly files carry global horizontal irradiation as ghi_w_m2 (the mean
// irradiance over the hour, W/m²) or ghi_wh_m2 (the energy over the hour,
// Wh/m²); for a one-hour interval the two numbers are the same. Optional
// dni_w_m2 / dni_wh_m2 and dhi_w_m2 / dhi_wh_m2 carry direct normal and
// diffuse horizontal values in the same way. Daily files carry
// ghi_kwh_m2_day (the day's total, kWh/m²) and no hour column. The column
// temp_c (air temperature, °C; the hour's or the day's mean) is optional. An
// empty cell, NA or NaN marks a missing value.
//
// # Checks and gaps
//
// Values out of physical range are refused with file, line and column:
// irradiance below 0 or above 1500 W/m² as an hourly mean (1500 Wh/m² in an
// hour; 36 kWh/m² in a day), air temperature outside −90..60 °C. Missing
// values and missing rows are gaps: up to MaxGapHours consecutive hours
// (MaxGapDays days in a daily file) are filled from the mean of that month at
// that hour (that month, for daily data) and counted in FilledHours
// (FilledDays); a longer gap is refused, naming its range.
package weather
