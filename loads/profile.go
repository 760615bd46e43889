// Package loads turns the appliance inventory of a project into the hourly
// demand of each month, the peak coincident and surge power, the inverter
// rating and the energy drawn from the DC bus.
//
// # How daily use is spread over the clock
//
// Every entry is reduced to a table of 24 fractions run[h], the part of
// clock hour h (h:00 to h+1:00) in which one unit runs at its full running
// power, on a day of use:
//
//   - hours_per_day H over a spread window of L hours: H/L of each minute of
//     the window (uniform), so an hour fully inside the window gets H/L and
//     an hour half inside gets H/(2L);
//   - windows alone: the exact minutes of the windows (18:30-19:15 gives 0.5
//     in hour 18 and 0.25 in hour 19);
//   - energy_wh_day E: E/power_w equivalent full-power hours, spread
//     uniformly over the minutes of its windows, or over all 24 hours;
//   - duty_cycle d: d of each minute of its windows, or of all 24 hours.
//
// The sum of run[h] is the equivalent full-power hours per day of use
// (Row.HoursPerDay). The rest of the day of use, 24 − HoursPerDay hours, the
// unit draws its standby power (Row.StandbyHours).
//
// # Days per week and months
//
// The hourly tables describe the mean day of each month: the energy of a
// day of use is multiplied by days_per_week/7. Standby is counted on days
// of use only — on other days the appliance is taken to be switched off at
// the wall — so that the per-entry energy is the plain workbook formula
// quantity × (power × hours + standby × standby hours) × days/7. A phantom
// load that stays on all week is entered as its own line (power_w = the
// standby power, windows ["00:00-24:00"]). In a month not listed in months
// the entry draws nothing at all.
//
// # Peak and surge
//
// An entry can run in clock hour h when its windows (or spread window)
// touch that hour; an energy_wh_day or duty_cycle entry without windows can
// run in every hour. The coincident power of an hour of a month is the
// running power of all units of every entry that can run in that hour, plus
// the standby power of the entries that cannot; the peak is the largest of
// these over the 12 × 24 hours. Days per week are ignored for the peak (any
// day may be a day of use for all).
//
// The surge the inverter must start is the peak AC running power plus the
// largest surge increment of one AC unit (its starting power minus its
// running power): motors are taken to start one at a time, with every other
// load already running.
package loads

import (
	"errors"
	"fmt"
	"math"
	"strings"

	"solstand/schema"
)

// Row is one inventory line, with what the workbook needs to show it as live
// formulas.
type Row struct {
	Index    int    // position in the project's loads list
	Name     string // as given
	Circuit  string // "ac" or "dc"
	Critical bool   // priority "critical"
	// Quantity is the number of identical units.
	Quantity float64
	// PowerW is the running power of one unit.
	PowerW float64
	// StandbyW is the standby power of one unit outside its running time.
	StandbyW float64
	// HoursPerDay is the equivalent full-power running hours per day of use.
	HoursPerDay float64
	// StandbyHours is 24 − HoursPerDay: the hours of a day of use at standby.
	StandbyHours float64
	// DaysPerWeek is the number of days of use per week.
	DaysPerWeek float64
	// Months marks the months (January = 0) in which the entry runs.
	Months [12]bool
	// EnergyWhDay is quantity × (power × hours + standby × standby hours) ×
	// days/7: the energy of the mean day of a month in which it runs.
	EnergyWhDay float64
	// SurgeW is the starting power of one unit.
	SurgeW float64
	// Use tells how the daily use was entered: "hours", "windows", "energy"
	// or "duty".
	Use string
	// RunHourFrac is the fraction of each clock hour one unit runs at full
	// power on a day of use; it sums to HoursPerDay.
	RunHourFrac [24]float64
	// CanRun marks the clock hours the entry can run in (for the peak).
	CanRun [24]bool
}

// Profile is the demand of the whole inventory on the appliance side.
type Profile struct {
	Rows []Row
	// Appliance-side energy drawn in each clock hour of the mean day of each
	// month, Wh (days per week applied as days/7). Index [month-1][hour].
	ACWh, DCWh, CriticalACWh, CriticalDCWh [12][24]float64
	// ACDailyWh and DCDailyWh are the day sums of ACWh and DCWh.
	ACDailyWh, DCDailyWh [12]float64
	// PeakACW, PeakDCW and PeakW are the largest coincident power of the AC
	// loads, of the DC loads and of all loads (see the package comment).
	PeakACW, PeakDCW, PeakW float64
	// SurgeACW is the largest short-time power the inverter must start:
	// PeakACW plus the largest surge increment of one AC unit.
	SurgeACW float64
	// HasAC is true when any entry is on the AC circuit.
	HasAC bool
}

// DailyWh is the appliance-side energy of the mean day of month m
// (1..12), AC and DC together; 0 for a month outside 1..12.
func (p Profile) DailyWh(month int) float64 {
	if month < 1 || month > 12 {
		return 0
	}
	return p.ACDailyWh[month-1] + p.DCDailyWh[month-1]
}

// MaxDailyWh is the largest appliance-side daily energy over the months.
func (p Profile) MaxDailyWh() float64 {
	m := 0.0
	for i := range 12 {
		m = max(m, p.ACDailyWh[i]+p.DCDailyWh[i])
	}
	return m
}

// Build computes the profile of an inventory. It expects the document after
// schema defaults, but reads absent optional values as their defaults
// (quantity 1, circuit dc, spread_window evening, days_per_week 7, all
// months, surge factor 1, priority normal). The first entry it cannot
// compute gives an error wrapped with the JSON path ("loads[2].windows[0]:
// ..."); schema validation reports all of them at once.
func Build(loads []schema.Load) (Profile, error) {
	var p Profile
	p.Rows = make([]Row, 0, len(loads))
	for i := range loads {
		r, err := buildRow(i, &loads[i])
		if err != nil {
			return Profile{}, fmt.Errorf("loads[%d]%w", i, err)
		}
		p.Rows = append(p.Rows, r)
	}

	var acRun, dcRun [12][24]float64
	maxIncr := 0.0
	for i := range p.Rows {
		r := &p.Rows[i]
		ac := r.Circuit == "ac"
		if ac {
			p.HasAC = true
			maxIncr = max(maxIncr, r.SurgeW-r.PowerW)
		}
		f := r.DaysPerWeek / 7
		var whH, coincH [24]float64
		for h := range 24 {
			run := r.RunHourFrac[h]
			whH[h] = r.Quantity * f * (r.PowerW*run + r.StandbyW*(1-run))
			coincH[h] = r.Quantity * r.StandbyW
			if r.CanRun[h] {
				coincH[h] = r.Quantity * r.PowerW
			}
		}
		for m := range 12 {
			if !r.Months[m] {
				continue
			}
			for h := range 24 {
				wh, coincident := whH[h], coincH[h]
				if ac {
					p.ACWh[m][h] += wh
					acRun[m][h] += coincident
					if r.Critical {
						p.CriticalACWh[m][h] += wh
					}
				} else {
					p.DCWh[m][h] += wh
					dcRun[m][h] += coincident
					if r.Critical {
						p.CriticalDCWh[m][h] += wh
					}
				}
			}
		}
	}
	for m := range 12 {
		for h := range 24 {
			p.ACDailyWh[m] += p.ACWh[m][h]
			p.DCDailyWh[m] += p.DCWh[m][h]
			p.PeakACW = max(p.PeakACW, acRun[m][h])
			p.PeakDCW = max(p.PeakDCW, dcRun[m][h])
			p.PeakW = max(p.PeakW, acRun[m][h]+dcRun[m][h])
		}
	}
	if p.HasAC {
		p.SurgeACW = p.PeakACW + maxIncr
	}
	return p, nil
}

// finitePos reports whether v is a finite number above 0.
func finitePos(v float64) bool { return v > 0 && !math.IsInf(v, 0) }

// pathErr is an error at a sub-path of one load ("." + key).
func pathErr(key, format string, a ...any) error {
	return fmt.Errorf(".%s: %s", key, fmt.Sprintf(format, a...))
}

// buildRow computes one entry. Its errors start with the sub-path of the
// load (".power_w: ..."), or with ": " for the entry as a whole.
func buildRow(i int, l *schema.Load) (Row, error) {
	r := Row{Index: i, Name: l.Name, Quantity: 1, Circuit: "dc", DaysPerWeek: 7, StandbyW: l.StandbyW, PowerW: l.PowerW}
	if strings.TrimSpace(l.Name) == "" {
		return r, pathErr("name", "must not be empty")
	}
	if l.Quantity != nil {
		q := *l.Quantity
		if !finitePos(q) || q != math.Trunc(q) {
			return r, pathErr("quantity", "must be a whole number of at least 1, got %g", q)
		}
		r.Quantity = q
	}
	switch l.Circuit {
	case "":
	case "ac", "dc":
		r.Circuit = l.Circuit
	default:
		return r, pathErr("circuit", "must be \"ac\" or \"dc\", got %q", l.Circuit)
	}
	switch l.Priority {
	case "", "normal":
	case "critical":
		r.Critical = true
	default:
		return r, pathErr("priority", "must be \"critical\" or \"normal\", got %q", l.Priority)
	}
	if !finitePos(l.PowerW) {
		return r, pathErr("power_w", "must be greater than 0, got %g", l.PowerW)
	}
	if !(l.StandbyW >= 0) || math.IsInf(l.StandbyW, 0) {
		return r, pathErr("standby_w", "must not be negative, got %g", l.StandbyW)
	}
	if l.DaysPerWeek != nil {
		d := *l.DaysPerWeek
		if !finitePos(d) || d > 7 {
			return r, pathErr("days_per_week", "must be greater than 0 and at most 7, got %g", d)
		}
		r.DaysPerWeek = d
	}
	if len(l.Months) == 0 {
		for m := range 12 {
			r.Months[m] = true
		}
	}
	for j, m := range l.Months {
		if m < 1 || m > 12 {
			return r, pathErr(fmt.Sprintf("months[%d]", j), "must be a month 1..12, got %d", m)
		}
		r.Months[m-1] = true
	}
	r.SurgeW = l.PowerW
	switch {
	case l.SurgeW != nil:
		if !finitePos(*l.SurgeW) || *l.SurgeW < l.PowerW {
			return r, pathErr("surge_w", "must be at least power_w (%g W), got %g", l.PowerW, *l.SurgeW)
		}
		r.SurgeW = *l.SurgeW
	case l.SurgeFactor != nil:
		if !(*l.SurgeFactor >= 1) || math.IsInf(*l.SurgeFactor, 0) {
			return r, pathErr("surge_factor", "must be at least 1, got %g", *l.SurgeFactor)
		}
		r.SurgeW = *l.SurgeFactor * l.PowerW
	}
	if err := spreadUse(&r, l); err != nil {
		return r, err
	}
	r.StandbyHours = 24 - r.HoursPerDay
	r.EnergyWhDay = r.Quantity * (r.PowerW*r.HoursPerDay + r.StandbyW*r.StandbyHours) * r.DaysPerWeek / 7
	return r, nil
}

// coverage adds to cov the fraction of each clock hour a window covers and
// returns the window's length in minutes.
func coverage(cov *[24]float64, startMin, endMin int) int {
	for _, seg := range schema.WindowSegments(startMin, endMin) {
		for h := seg[0] / 60; h < 24 && h*60 < seg[1]; h++ {
			lo, hi := max(seg[0], h*60), min(seg[1], h*60+60)
			if hi > lo {
				cov[h] += float64(hi-lo) / 60
			}
		}
	}
	return schema.WindowMinutes(startMin, endMin)
}

// windowsCoverage is the combined hourly coverage of an entry's windows and
// their total length in hours; an error for a malformed window or an
// overlap (a coverage above one hour in an hour).
func windowsCoverage(ws []string) ([24]float64, float64, error) {
	var cov [24]float64
	total := 0
	for j, s := range ws {
		a, b, err := schema.ParseWindow(s)
		if err != nil {
			return cov, 0, pathErr(fmt.Sprintf("windows[%d]", j), "%v", err)
		}
		total += coverage(&cov, a, b)
		for h := range 24 {
			if cov[h] > 1+1e-9 {
				return cov, 0, pathErr(fmt.Sprintf("windows[%d]", j), "overlaps another window of the same entry")
			}
		}
	}
	return cov, float64(total) / 60, nil
}

// errUse is the error for an entry with none or several ways of daily use.
var errUse = errors.New("give exactly one way of daily use: hours_per_day (with spread_window), windows, energy_wh_day or duty_cycle (windows may go with energy_wh_day or duty_cycle)")

// spreadUse fills RunHourFrac, CanRun, HoursPerDay and Use.
func spreadUse(r *Row, l *schema.Load) error {
	hasH, hasW := l.HoursPerDay != nil, len(l.Windows) > 0
	hasE, hasD := l.EnergyWhDay != nil, l.DutyCycle != nil
	n := 0
	for _, b := range []bool{hasH, hasE, hasD} {
		if b {
			n++
		}
	}
	if n > 1 || (n == 0 && !hasW) || (hasH && hasW) {
		return fmt.Errorf(": %w", errUse)
	}

	// The window the running time is spread over, and its length in hours.
	var cov [24]float64
	var lengthH float64
	switch {
	case hasW:
		var err error
		cov, lengthH, err = windowsCoverage(l.Windows)
		if err != nil {
			return err
		}
	case hasH:
		a, b, err := schema.ParseSpread(l.Spread)
		if err != nil {
			return pathErr("spread_window", "%v", err)
		}
		lengthH = float64(coverage(&cov, a, b)) / 60
	default:
		lengthH = float64(coverage(&cov, 0, schema.MinutesPerDay)) / 60
	}

	// Equivalent full-power hours per day of use.
	var hours float64
	switch {
	case hasH:
		r.Use = "hours"
		hours = *l.HoursPerDay
		if !finitePos(hours) || hours > 24 {
			return pathErr("hours_per_day", "must be greater than 0 and at most 24, got %g", hours)
		}
		if hours > lengthH+1e-9 {
			return pathErr("hours_per_day", "is %g h but its spread_window is only %g h long", hours, lengthH)
		}
	case hasE:
		r.Use = "energy"
		e := *l.EnergyWhDay
		if !finitePos(e) {
			return pathErr("energy_wh_day", "must be greater than 0, got %g", e)
		}
		hours = e / r.PowerW
		if hours > lengthH*(1+1e-12) {
			return pathErr("energy_wh_day", "must not exceed power_w × %g h = %g Wh, got %g", lengthH, r.PowerW*lengthH, e)
		}
	case hasD:
		r.Use = "duty"
		d := *l.DutyCycle
		if !finitePos(d) || d > 1 {
			return pathErr("duty_cycle", "must be greater than 0 and at most 1, got %g", d)
		}
		hours = d * lengthH
	default:
		r.Use = "windows"
		hours = lengthH
	}
	share := hours / lengthH // fraction of each covered minute spent running
	for h := range 24 {
		r.RunHourFrac[h] = share * cov[h]
		r.CanRun[h] = cov[h] > 0
	}
	r.HoursPerDay = hours
	return nil
}
