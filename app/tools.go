package app

import (
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"time"

	"solstand/array"
	"solstand/caution"
	"solstand/report"
	"solstand/weather"
	"solstand/wiring"
)

// SunOptions are the options of `solstand sun`.
type SunOptions struct {
	LatDeg, LonDeg float64
	At             string // RFC 3339 with an offset
	SolarTime      bool   // read the clock reading of At as local apparent solar time
	TiltDeg        *float64
	AzimuthDeg     *float64
	Path           bool // the sun-path table (21st of each month)
	JSON           bool
}

type sunJSON struct {
	ZenithDeg         float64  `json:"zenith_deg"`
	AzimuthDeg        float64  `json:"azimuth_deg"`
	ElevationDeg      float64  `json:"elevation_deg"`
	DeclinationDeg    float64  `json:"declination_deg"`
	HourAngleDeg      float64  `json:"hour_angle_deg"`
	EquationOfTimeMin float64  `json:"equation_of_time_min"`
	SolarTimeH        float64  `json:"solar_time_h"`
	IncidenceDeg      *float64 `json:"incidence_deg,omitempty"`
}

type sunPathJSON struct {
	LatitudeDeg float64             `json:"latitude_deg"`
	Note        string              `json:"note"`
	Rows        []report.SunPathRow `json:"rows"`
}

// Sun prints the sun's position at one instant, or the sun-path table.
func Sun(opt SunOptions, stdout io.Writer) error {
	if opt.LatDeg < -90 || opt.LatDeg > 90 || math.IsNaN(opt.LatDeg) {
		return fail(ExitUsage, "--lat must be from -90 to 90, got %g", opt.LatDeg)
	}
	if opt.LonDeg < -180 || opt.LonDeg > 180 || math.IsNaN(opt.LonDeg) {
		return fail(ExitUsage, "--lon must be from -180 to 180, got %g", opt.LonDeg)
	}
	if opt.Path {
		var rows []report.SunPathRow
		for _, r := range array.SunPath(opt.LatDeg) {
			rows = append(rows, report.SunPathRow{Month: r.Month, SolarHour: r.Hour, ElevationDeg: r.ElevationDeg, AzimuthDeg: r.AzimuthDeg})
		}
		if opt.JSON {
			return writeJSON(stdout, sunPathJSON{opt.LatDeg, "21st of each month, whole hours of local apparent solar time while the sun is up; azimuth clockwise from true north", rows})
		}
		fmt.Fprintf(stdout, "Sun path at latitude %g° (21st of each month, local apparent solar time; azimuth clockwise from north)\nmonth  hour  elevation°  azimuth°\n", opt.LatDeg)
		for _, r := range rows {
			fmt.Fprintf(stdout, "%5d  %4d  %10.1f  %8.1f\n", r.Month, r.SolarHour, r.ElevationDeg, r.AzimuthDeg)
		}
		return nil
	}
	if opt.At == "" {
		return fail(ExitUsage, "--at is required (RFC 3339 with an offset, e.g. 2026-02-13T09:30:00-06:00), or use --path")
	}
	t, err := time.Parse(time.RFC3339, opt.At)
	if err != nil {
		return fail(ExitUsage, "--at: %v (use RFC 3339 with an offset, e.g. 2026-02-13T09:30:00-06:00)", err)
	}
	var pos array.SunPosition
	if opt.SolarTime {
		solarH := float64(t.Hour()) + float64(t.Minute())/60 + float64(t.Second())/3600
		pos = array.SunAtSolarTime(opt.LatDeg, t.YearDay(), solarH)
	} else {
		pos = array.SunAt(opt.LatDeg, opt.LonDeg, t)
	}
	out := sunJSON{pos.ZenithDeg, pos.AzimuthDeg, pos.ElevationDeg, pos.DeclinationDeg, pos.HourAngleDeg, pos.EquationOfTimeMin, pos.SolarTimeH, nil}
	if (opt.TiltDeg == nil) != (opt.AzimuthDeg == nil) {
		return fail(ExitUsage, "--tilt and --azimuth go together")
	}
	if opt.TiltDeg != nil {
		if *opt.TiltDeg < 0 || *opt.TiltDeg > 180 {
			return fail(ExitUsage, "--tilt must be from 0 to 180, got %g", *opt.TiltDeg)
		}
		inc := array.IncidenceDeg(pos, *opt.TiltDeg, *opt.AzimuthDeg)
		out.IncidenceDeg = &inc
	}
	if opt.JSON {
		return writeJSON(stdout, out)
	}
	fmt.Fprintf(stdout, "zenith %.3f°  elevation %.3f°  azimuth %.3f° (clockwise from north)\ndeclination %.3f°  hour angle %.3f°  equation of time %.2f min  solar time %.3f h\n",
		out.ZenithDeg, out.ElevationDeg, out.AzimuthDeg, out.DeclinationDeg, out.HourAngleDeg, out.EquationOfTimeMin, out.SolarTimeH)
	if out.IncidenceDeg != nil {
		fmt.Fprintf(stdout, "incidence on the surface %.3f°\n", *out.IncidenceDeg)
	}
	return nil
}

// ResourceOptions are the options of `solstand resource`.
type ResourceOptions struct {
	LatDeg, LonDeg float64
	GHI            string // 12 comma-separated monthly means, kWh/m²/day
	Weather        string // or a weather file
	TiltDeg        float64
	AzimuthDeg     *float64 // default: towards the equator
	Albedo         float64
	JSON           bool
}

// Resource prints the monthly solar resource table for a site and a plane.
func Resource(opt ResourceOptions, stdout, stderr io.Writer) error {
	var ghi [12]float64
	lat := opt.LatDeg
	switch {
	case opt.GHI != "" && opt.Weather != "":
		return fail(ExitUsage, "give --ghi or --weather, not both")
	case opt.GHI != "":
		parts := strings.Split(opt.GHI, ",")
		if len(parts) != 12 {
			return fail(ExitUsage, "--ghi needs 12 comma-separated monthly means (kWh/m²/day), got %d", len(parts))
		}
		for i, s := range parts {
			v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
			if err != nil || v < 0 || v > 12 {
				return fail(ExitUsage, "--ghi value %d (%q) must be a number from 0 to 12 kWh/m²/day", i+1, s)
			}
			ghi[i] = v
		}
	case opt.Weather != "":
		s, err := weather.ReadFile(opt.Weather)
		if err != nil {
			return fail(ExitFailed, "weather file: %w", err)
		}
		g, _, err := s.MonthlyMeans()
		if err != nil {
			return fail(ExitFailed, "weather file: %w", err)
		}
		ghi = g
		if math.IsNaN(lat) && s.Location.Known {
			lat = s.Location.LatitudeDeg
		}
	default:
		return fail(ExitUsage, "give --ghi (12 monthly means) or --weather FILE")
	}
	if math.IsNaN(lat) || lat < -90 || lat > 90 {
		return fail(ExitUsage, "--lat must be from -90 to 90")
	}
	az := 180.0
	if lat < 0 {
		az = 0
	}
	if opt.AzimuthDeg != nil {
		az = *opt.AzimuthDeg
	}
	if opt.TiltDeg < 0 || opt.TiltDeg > 90 {
		return fail(ExitUsage, "--tilt must be from 0 to 90, got %g", opt.TiltDeg)
	}
	if az < 0 || az > 360 {
		return fail(ExitUsage, "--azimuth must be from 0 to 360, got %g", az)
	}
	if opt.Albedo < 0 || opt.Albedo > 1 {
		return fail(ExitUsage, "--albedo must be from 0 to 1, got %g", opt.Albedo)
	}
	months, err := array.MonthlyResource(lat, ghi, array.Plane{TiltDeg: opt.TiltDeg, AzimuthDeg: az, AlbedoFraction: opt.Albedo})
	if err != nil {
		return fail(ExitFailed, "%w", err)
	}
	rows := make([]report.ResourceMonth, 12)
	for i, m := range months {
		rows[i] = report.ResourceMonth{Month: m.Month, DayOfYear: m.DayOfYear, ExtraterrestrialKWhM2Day: m.ExtraterrestrialKWhM2Day,
			GHIKWhM2Day: m.GHIKWhM2Day, ClearnessIndex: m.ClearnessIndex, DiffuseFraction: m.DiffuseFraction, BeamRatio: m.BeamRatio, POAKWhM2Day: m.POAKWhM2Day}
	}
	if opt.JSON {
		return writeJSON(stdout, struct {
			LatitudeDeg float64                `json:"latitude_deg"`
			TiltDeg     float64                `json:"tilt_deg"`
			AzimuthDeg  float64                `json:"azimuth_deg"`
			Albedo      float64                `json:"albedo"`
			Months      []report.ResourceMonth `json:"months"`
		}{lat, opt.TiltDeg, az, opt.Albedo, rows})
	}
	fmt.Fprintf(stdout, "Monthly resource at latitude %g°, plane tilt %g° azimuth %g°, albedo %g (kWh/m²/day)\nmonth  day  extraterr.  GHI   K_T    diffuse  R_b    plane\n", lat, opt.TiltDeg, az, opt.Albedo)
	for _, r := range rows {
		fmt.Fprintf(stdout, "%5d  %3d  %10.2f  %4.2f  %.3f  %.3f    %5.2f  %5.2f\n", r.Month, r.DayOfYear, r.ExtraterrestrialKWhM2Day, r.GHIKWhM2Day, r.ClearnessIndex, r.DiffuseFraction, r.BeamRatio, r.POAKWhM2Day)
	}
	return nil
}

// WireOptions are the options of `solstand wire`.
type WireOptions struct {
	CurrentA, LengthM, VoltageV, MaxDropPct float64
	Standard                                string
	Class                                   int
	ConductorTempC                          float64
	JSON                                    bool
}

type wireJSON struct {
	Standard           string            `json:"standard"`
	Size               string            `json:"size"`
	AreaMM2            float64           `json:"area_mm2"`
	ResistanceOhmPerKm float64           `json:"resistance_ohm_per_km"`
	AmpacityA          float64           `json:"ampacity_a"`
	Runs               int               `json:"runs"`
	DropV              float64           `json:"drop_v"`
	DropPct            float64           `json:"drop_pct"`
	LimitedBy          string            `json:"limited_by"`
	Cautions           []caution.Caution `json:"cautions"`
	CodesNote          string            `json:"codes_note"`
}

// Wire prints the smallest conductor that meets the drop and the current.
func Wire(opt WireOptions, stdout io.Writer) error {
	std, err := wiring.ParseStandard(opt.Standard)
	if err != nil {
		return fail(ExitUsage, "--standard: %v", err)
	}
	c := wiring.Circuit{Name: "circuit", CurrentA: opt.CurrentA, OneWayLengthM: opt.LengthM, VoltageV: opt.VoltageV,
		MaxDropPct: opt.MaxDropPct, Standard: std, Class: opt.Class, ConductorTempC: opt.ConductorTempC}
	ch, err := wiring.Select(c)
	if err != nil {
		if errors.Is(err, wiring.ErrNoSize) {
			return fail(ExitFailed, "%w", err)
		}
		return fail(ExitUsage, "%w", err)
	}
	out := wireJSON{string(std), ch.Size.Label, ch.Size.AreaMM2, ch.ResistanceOhmPerKm, ch.AmpacityA, ch.Runs, ch.DropV, ch.DropPct, ch.LimitedBy, wiring.SelectCautions(ch), caution.CodesNote}
	if opt.JSON {
		return writeJSON(stdout, out)
	}
	fmt.Fprintf(stdout, "%s (%.2f mm², %.4g Ω/km): drop %.3f V = %.2f %% over %g m one way at %g A; limited by %s\n",
		out.Size, out.AreaMM2, out.ResistanceOhmPerKm, out.DropV, out.DropPct, opt.LengthM, opt.CurrentA, out.LimitedBy)
	for _, c := range out.Cautions {
		fmt.Fprintf(stdout, "%s: %s\n", c.Severity, c.Message)
	}
	fmt.Fprintln(stdout, out.CodesNote)
	return nil
}
