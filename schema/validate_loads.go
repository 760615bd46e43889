package schema

import (
	"fmt"
	"math"
	"strings"
)

// validateLoads reports every problem of the appliance inventory, one call
// of add each, with the JSON path of the offending value (such as
// "loads[2].power_w") and a message a practitioner can act on ("must be
// greater than 0, got -60").
//
// It runs on the document after ApplyDefaults, but reads an absent
// (nil) optional value as its default, so it never fails on nil pointers.
//
// Ways of entering daily use: hours_per_day (with spread_window), windows
// alone, energy_wh_day (alone or with windows), duty_cycle (alone or with
// windows). Exactly one of these must be given.
func validateLoads(loads []Load, add func(path, msg string)) {
	for i := range loads {
		validateLoad(fmt.Sprintf("loads[%d]", i), &loads[i], add)
	}
}

// loadNum formats a number for a message without trailing zeros.
func loadNum(v float64) string {
	return fmt.Sprintf("%g", v)
}

// loadPositive reports whether v is a finite number above 0.
func loadPositive(v float64) bool {
	return v > 0 && !math.IsInf(v, 0)
}

func validateLoad(p string, l *Load, add func(path, msg string)) {
	if strings.TrimSpace(l.Name) == "" {
		add(p+".name", "must not be empty")
	}
	if l.Quantity != nil {
		q := *l.Quantity
		if !loadPositive(q) || q != math.Trunc(q) {
			add(p+".quantity", "must be a whole number of at least 1, got "+loadNum(q))
		}
	}
	switch l.Circuit {
	case "", "ac", "dc":
	default:
		add(p+".circuit", fmt.Sprintf("must be \"ac\" or \"dc\", got %q", l.Circuit))
	}
	powerOK := loadPositive(l.PowerW)
	if !powerOK {
		add(p+".power_w", "must be greater than 0, got "+loadNum(l.PowerW))
	}
	switch l.Priority {
	case "", "critical", "normal":
	default:
		add(p+".priority", fmt.Sprintf("must be \"critical\" or \"normal\", got %q", l.Priority))
	}
	if l.StandbyW < 0 || math.IsNaN(l.StandbyW) || math.IsInf(l.StandbyW, 0) {
		add(p+".standby_w", "must not be negative, got "+loadNum(l.StandbyW))
	}
	if l.DaysPerWeek != nil {
		d := *l.DaysPerWeek
		if !loadPositive(d) || d > 7 {
			add(p+".days_per_week", "must be greater than 0 and at most 7, got "+loadNum(d))
		}
	}
	validateLoadMonths(p, l.Months, add)
	validateLoadSurge(p, l, powerOK, add)
	validateLoadUse(p, l, powerOK, add)
}

func validateLoadMonths(p string, months []int, add func(path, msg string)) {
	if months != nil && len(months) == 0 {
		add(p+".months", "must list at least one month 1..12 (leave it out for all months)")
		return
	}
	var seen [13]bool
	for j, m := range months {
		mp := fmt.Sprintf("%s.months[%d]", p, j)
		if m < 1 || m > 12 {
			add(mp, fmt.Sprintf("must be a month 1..12, got %d", m))
			continue
		}
		if seen[m] {
			add(mp, fmt.Sprintf("repeats month %d", m))
		}
		seen[m] = true
	}
}

func validateLoadSurge(p string, l *Load, powerOK bool, add func(path, msg string)) {
	if l.SurgeFactor != nil && l.SurgeW != nil {
		add(p+".surge_w", "give surge_factor or surge_w, not both")
	}
	if l.SurgeFactor != nil {
		f := *l.SurgeFactor
		if !(f >= 1) || math.IsInf(f, 0) {
			add(p+".surge_factor", "must be at least 1 (starting power is never below running power), got "+loadNum(f))
		}
	}
	if l.SurgeW != nil {
		w := *l.SurgeW
		switch {
		case !loadPositive(w):
			add(p+".surge_w", "must be greater than 0, got "+loadNum(w))
		case powerOK && w < l.PowerW:
			add(p+".surge_w", fmt.Sprintf("must be at least power_w (%s W), got %s", loadNum(l.PowerW), loadNum(w)))
		}
	}
}

// loadWindow is one parsed clock window with its index in windows[].
type loadWindow struct {
	idx        int
	start, end int
}

func validateLoadUse(p string, l *Load, powerOK bool, add func(path, msg string)) {
	hasH := l.HoursPerDay != nil
	hasW := len(l.Windows) > 0
	hasE := l.EnergyWhDay != nil
	hasD := l.DutyCycle != nil

	var given []string
	if hasH {
		given = append(given, "hours_per_day")
	}
	if hasE {
		given = append(given, "energy_wh_day")
	}
	if hasD {
		given = append(given, "duty_cycle")
	}
	switch {
	case len(given) == 0 && !hasW:
		add(p, "give its daily use: hours_per_day, windows, energy_wh_day or duty_cycle")
	case len(given) > 1 || (hasH && hasW):
		if hasH && hasW {
			given = append(given, "windows")
		}
		add(p, fmt.Sprintf("gives more than one way of daily use (%s); give one of hours_per_day, windows, energy_wh_day or duty_cycle (windows may go with energy_wh_day or duty_cycle)",
			strings.Join(given, ", ")))
	}

	// Windows: each well formed, none overlapping another.
	var wins []loadWindow
	for j, s := range l.Windows {
		a, b, err := ParseWindow(s)
		if err != nil {
			add(fmt.Sprintf("%s.windows[%d]", p, j), err.Error())
			continue
		}
		for _, w := range wins {
			if n := windowOverlapMin(w.start, w.end, a, b); n > 0 {
				add(fmt.Sprintf("%s.windows[%d]", p, j), fmt.Sprintf("overlaps windows[%d] (%s) by %d min; windows of one entry must not overlap",
					w.idx, l.Windows[w.idx], n))
			}
		}
		wins = append(wins, loadWindow{j, a, b})
	}
	winMin := 0
	for _, w := range wins {
		winMin += WindowMinutes(w.start, w.end)
	}
	winsOK := hasW && len(wins) == len(l.Windows)

	// spread_window: only meaningful with hours_per_day, but a malformed
	// value is reported wherever it is.
	spreadMin, spreadOK := 0, false
	if l.Spread != "" || hasH {
		a, b, err := ParseSpread(l.Spread)
		if err != nil {
			add(p+".spread_window", err.Error())
		} else {
			spreadMin, spreadOK = WindowMinutes(a, b), true
		}
	}

	if hasH {
		h := *l.HoursPerDay
		switch {
		case !loadPositive(h) || h > 24:
			add(p+".hours_per_day", "must be greater than 0 and at most 24, got "+loadNum(h))
		case spreadOK && h*60 > float64(spreadMin)+1e-9:
			name := l.Spread
			if name == "" {
				name = "evening"
			}
			add(p+".hours_per_day", fmt.Sprintf("is %s h but its spread_window %q is only %s h long; widen spread_window (e.g. 'allday')",
				loadNum(h), name, loadNum(float64(spreadMin)/60)))
		}
	}
	if hasE {
		e := *l.EnergyWhDay
		switch {
		case !loadPositive(e):
			add(p+".energy_wh_day", "must be greater than 0, got "+loadNum(e))
		case powerOK && e > l.PowerW*24*(1+1e-12):
			add(p+".energy_wh_day", fmt.Sprintf("must not exceed power_w × 24 h = %s Wh (the running power all day), got %s",
				loadNum(l.PowerW*24), loadNum(e)))
		case powerOK && winsOK && e > l.PowerW*float64(winMin)/60*(1+1e-12):
			add(p+".energy_wh_day", fmt.Sprintf("must not exceed power_w × the %s h of its windows = %s Wh, got %s",
				loadNum(float64(winMin)/60), loadNum(l.PowerW*float64(winMin)/60), loadNum(e)))
		}
	}
	if hasD {
		d := *l.DutyCycle
		if !loadPositive(d) || d > 1 {
			add(p+".duty_cycle", "must be greater than 0 and at most 1, got "+loadNum(d))
		}
	}
}
