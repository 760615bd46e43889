package loads

import (
	"fmt"

	"solstand/caution"
)

// Daily energy a stand-alone system at a nominal voltage sensibly serves
// (common practice): above these the currents grow large, cables heavy and
// a higher system voltage is the better design.
const (
	MaxSensibleWhDay12V = 2000.0
	MaxSensibleWhDay24V = 6000.0
	MaxSensibleWhDay48V = 30000.0
)

// AutoVoltage is the nominal system voltage chosen by daily energy (common
// practice): 12 V up to 1500 Wh/day, 24 V up to 5000 Wh/day, 48 V above.
func AutoVoltage(dailyWh float64) float64 {
	switch {
	case dailyWh <= 1500:
		return 12
	case dailyWh <= 5000:
		return 24
	default:
		return 48
	}
}

// Cautions are the design cautions of a profile at a nominal system
// voltage (0 = not yet known: the voltage checks are skipped):
//
//   - demand-high-for-voltage (warning): the largest daily energy of any
//     month is above what a stand-alone system at that voltage sensibly
//     serves (common practice: 2 kWh/day at 12 V, 6 kWh/day at 24 V,
//     30 kWh/day at 48 V);
//   - critical-load-on-inverter (info): a critical load is on the AC
//     circuit, so an inverter fault drops it;
//   - motor-start-surge (info): the surge to start, Profile.SurgeACW, is
//     above twice the peak AC load, so the surge rather than the running
//     load may set the inverter.
func Cautions(p Profile, systemV float64) []caution.Caution {
	var out []caution.Caution
	if daily := p.MaxDailyWh(); systemV > 0 {
		limit := 0.0
		switch {
		case systemV <= 12:
			limit = MaxSensibleWhDay12V
		case systemV <= 24:
			limit = MaxSensibleWhDay24V
		case systemV <= 48:
			limit = MaxSensibleWhDay48V
		}
		if limit > 0 && daily > limit {
			next := "a higher system voltage"
			if v := AutoVoltage(daily); v > systemV {
				next = fmt.Sprintf("a %g V system", v)
			}
			out = append(out, caution.Caution{
				Code:     "demand-high-for-voltage",
				Severity: caution.Warning,
				Message: fmt.Sprintf("The loads draw up to %.0f Wh/day, more than a %g V stand-alone system sensibly serves (about %.0f Wh/day); consider %s, or trimming the loads.",
					daily, systemV, limit, next),
			})
		}
	}
	var critAC []string
	for _, r := range p.Rows {
		if r.Critical && r.Circuit == "ac" {
			critAC = append(critAC, r.Name)
		}
	}
	if len(critAC) > 0 {
		out = append(out, caution.Caution{
			Code:     "critical-load-on-inverter",
			Severity: caution.Info,
			Message: fmt.Sprintf("Critical load(s) on the AC circuit depend on the inverter: %s. An inverter fault drops them; prefer DC versions or keep a spare inverter.",
				joinNames(critAC)),
		})
	}
	if p.HasAC && p.SurgeACW > 2*p.PeakACW {
		out = append(out, caution.Caution{
			Code:     "motor-start-surge",
			Severity: caution.Info,
			Message: fmt.Sprintf("Starting the largest AC motor needs %.0f W, more than twice the peak running AC load of %.0f W; check the inverter's surge rating and duration against the motor's starting current.",
				p.SurgeACW, p.PeakACW),
		})
	}
	return out
}

// joinNames lists up to five names, then "and n more".
func joinNames(names []string) string {
	const show = 5
	s := ""
	for i, n := range names {
		if i == show {
			return fmt.Sprintf("%s and %d more", s, len(names)-show)
		}
		if i > 0 {
			s += ", "
		}
		s += n
	}
	return s
}

// InverterCautions are the cautions of the inverter chosen for a profile
// and the DC-side demand through it:
//
//   - inverter-sized-by-surge (info): the surge, not the continuous load,
//     set the rating; a motor with a soft starter, or an inverter with a
//     higher surge ratio, may allow a smaller one;
//   - inverter-loss-above-delivery (warning): in some month the inverter's
//     conversion loss and idle consumption are more than the AC loads
//     receive, the sign of a small load on a large or always-on inverter
//     (a wake threshold, or moving small loads to DC, helps).
func InverterCautions(p Profile, s InverterSizing, d DCSide) []caution.Caution {
	if !s.Needed {
		return nil
	}
	var out []caution.Caution
	if s.SizedBySurge {
		out = append(out, caution.Caution{
			Code:     "inverter-sized-by-surge",
			Severity: caution.Info,
			Message: fmt.Sprintf("The starting surge of %.0f W, not the %.0f W continuous load, sets the inverter at %.0f W; a soft starter on the motor or an inverter with a higher surge ratio may allow a smaller one.",
				s.RequiredSurgeW, s.RequiredContinuousW, s.ContinuousW),
		})
	}
	worst, month := 0.0, 0
	for m := range 12 {
		if p.ACDailyWh[m] <= 0 {
			continue
		}
		if r := d.InverterLossDailyWh[m] / p.ACDailyWh[m]; r > worst {
			worst, month = r, m+1
		}
	}
	if worst > 1 {
		out = append(out, caution.Caution{
			Code:     "inverter-loss-above-delivery",
			Severity: caution.Warning,
			Message: fmt.Sprintf("In month %d the inverter loses %.0f Wh/day, more than the %.0f Wh/day the AC loads receive; consider a wake threshold (standby mode), a smaller inverter, or DC versions of the small loads.",
				month, d.InverterLossDailyWh[month-1], p.ACDailyWh[month-1]),
		})
	}
	return out
}
