package schema

import (
	"math"
	"strings"
	"testing"
)

func vlF(v float64) *float64 { return &v }

type gotProblem struct{ path, msg string }

func collectLoadProblems(loads []Load) []gotProblem {
	var out []gotProblem
	validateLoads(loads, func(path, msg string) { out = append(out, gotProblem{path, msg}) })
	return out
}

// A valid entry for each way of entering daily use.
func validLoads() []Load {
	return []Load{
		{Name: "lights", Quantity: vlF(4), Circuit: "dc", PowerW: 9, HoursPerDay: vlF(5), Spread: "evening", DaysPerWeek: vlF(7), SurgeFactor: vlF(1), Priority: "normal"},
		{Name: "radio", PowerW: 12, Windows: []string{"06:00-08:00", "18:00-22:30"}, StandbyW: 0.5, Priority: "critical"},
		{Name: "fridge", Circuit: "ac", PowerW: 90, EnergyWhDay: vlF(700), SurgeW: vlF(450)},
		{Name: "freezer", Circuit: "ac", PowerW: 120, DutyCycle: vlF(0.35), Windows: []string{"21:00-06:00"}, SurgeFactor: vlF(5)},
		{Name: "fan", PowerW: 40, Windows: []string{"12:00-16:00"}, Months: []int{11, 12, 1, 2}, DaysPerWeek: vlF(5)},
		{Name: "pump", Circuit: "ac", PowerW: 750, EnergyWhDay: vlF(1500), Windows: []string{"10:00-14:00"}},
	}
}

func TestValidateLoadsValid(t *testing.T) {
	if ps := collectLoadProblems(validLoads()); len(ps) != 0 {
		t.Fatalf("valid inventory: %v", ps)
	}
	// nil pointers everywhere (before defaults) must not crash and are fine.
	if ps := collectLoadProblems([]Load{{Name: "x", PowerW: 1, Windows: []string{"00:00-24:00"}}}); len(ps) != 0 {
		t.Fatalf("bare entry: %v", ps)
	}
	if ps := collectLoadProblems(nil); len(ps) != 0 {
		t.Fatalf("no loads: %v", ps)
	}
}

func TestValidateLoadsProblems(t *testing.T) {
	base := func(mod func(l *Load)) []Load {
		l := Load{Name: "lamp", Quantity: vlF(1), Circuit: "dc", PowerW: 60, HoursPerDay: vlF(3), Spread: "evening", DaysPerWeek: vlF(7), SurgeFactor: vlF(1), Priority: "normal"}
		mod(&l)
		return []Load{validLoads()[0], l}
	}
	type want struct{ path, msg string }
	tests := []struct {
		name  string
		loads []Load
		want  []want
	}{
		{"negative power", base(func(l *Load) { l.PowerW = -60 }),
			[]want{{"loads[1].power_w", "must be greater than 0, got -60"}}},
		{"zero power", base(func(l *Load) { l.PowerW = 0 }),
			[]want{{"loads[1].power_w", "must be greater than 0, got 0"}}},
		{"fractional quantity", base(func(l *Load) { l.Quantity = vlF(1.5) }),
			[]want{{"loads[1].quantity", "whole number of at least 1, got 1.5"}}},
		{"zero quantity", base(func(l *Load) { l.Quantity = vlF(0) }),
			[]want{{"loads[1].quantity", "got 0"}}},
		{"empty name", base(func(l *Load) { l.Name = "  " }),
			[]want{{"loads[1].name", "must not be empty"}}},
		{"unknown circuit", base(func(l *Load) { l.Circuit = "AC" }),
			[]want{{"loads[1].circuit", `must be "ac" or "dc", got "AC"`}}},
		{"unknown priority", base(func(l *Load) { l.Priority = "high" }),
			[]want{{"loads[1].priority", `must be "critical" or "normal", got "high"`}}},
		{"negative standby", base(func(l *Load) { l.StandbyW = -1 }),
			[]want{{"loads[1].standby_w", "must not be negative, got -1"}}},
		{"hours above 24", base(func(l *Load) { l.HoursPerDay = vlF(25); l.Spread = "allday" }),
			[]want{{"loads[1].hours_per_day", "at most 24, got 25"}}},
		{"hours zero", base(func(l *Load) { l.HoursPerDay = vlF(0) }),
			[]want{{"loads[1].hours_per_day", "greater than 0"}}},
		// evening is 18:00-23:00, 5 h
		{"hours longer than spread", base(func(l *Load) { l.HoursPerDay = vlF(6) }),
			[]want{{"loads[1].hours_per_day", `is 6 h but its spread_window "evening" is only 5 h long`}}},
		{"hours longer than clock spread", base(func(l *Load) { l.HoursPerDay = vlF(3); l.Spread = "17:30-19:00" }),
			[]want{{"loads[1].hours_per_day", "only 1.5 h long"}}},
		{"bad spread", base(func(l *Load) { l.Spread = "dusk" }),
			[]want{{"loads[1].spread_window", `got "dusk"`}}},
		{"malformed window", base(func(l *Load) { l.HoursPerDay = nil; l.Windows = []string{"18:00-22:00", "25:00-26:00"} }),
			[]want{{"loads[1].windows[1]", "hour must be 00..23"}}},
		{"overlapping windows", base(func(l *Load) { l.HoursPerDay = nil; l.Windows = []string{"18:00-22:00", "21:00-23:00"} }),
			[]want{{"loads[1].windows[1]", "overlaps windows[0] (18:00-22:00) by 60 min"}}},
		{"overlap across midnight", base(func(l *Load) { l.HoursPerDay = nil; l.Windows = []string{"22:00-02:00", "01:00-03:00"} }),
			[]want{{"loads[1].windows[1]", "overlaps windows[0]"}}},
		// 60 W × 24 h = 1440 Wh
		{"energy above power all day", base(func(l *Load) { l.HoursPerDay = nil; l.EnergyWhDay = vlF(2000) }),
			[]want{{"loads[1].energy_wh_day", "must not exceed power_w × 24 h = 1440 Wh (the running power all day), got 2000"}}},
		// 60 W × 2 h = 120 Wh
		{"energy above power over windows", base(func(l *Load) { l.HoursPerDay = nil; l.EnergyWhDay = vlF(200); l.Windows = []string{"18:00-20:00"} }),
			[]want{{"loads[1].energy_wh_day", "the 2 h of its windows = 120 Wh, got 200"}}},
		{"energy zero", base(func(l *Load) { l.HoursPerDay = nil; l.EnergyWhDay = vlF(0) }),
			[]want{{"loads[1].energy_wh_day", "must be greater than 0"}}},
		{"duty above 1", base(func(l *Load) { l.HoursPerDay = nil; l.DutyCycle = vlF(1.2) }),
			[]want{{"loads[1].duty_cycle", "at most 1, got 1.2"}}},
		{"duty zero", base(func(l *Load) { l.HoursPerDay = nil; l.DutyCycle = vlF(0) }),
			[]want{{"loads[1].duty_cycle", "greater than 0"}}},
		{"days above 7", base(func(l *Load) { l.DaysPerWeek = vlF(8) }),
			[]want{{"loads[1].days_per_week", "at most 7, got 8"}}},
		{"days zero", base(func(l *Load) { l.DaysPerWeek = vlF(0) }),
			[]want{{"loads[1].days_per_week", "greater than 0"}}},
		{"month 13 and repeated", base(func(l *Load) { l.Months = []int{1, 13, 1, 0} }),
			[]want{{"loads[1].months[1]", "must be a month 1..12, got 13"}, {"loads[1].months[2]", "repeats month 1"}, {"loads[1].months[3]", "got 0"}}},
		{"empty months", base(func(l *Load) { l.Months = []int{} }),
			[]want{{"loads[1].months", "at least one month"}}},
		{"surge factor below 1", base(func(l *Load) { l.SurgeFactor = vlF(0.5) }),
			[]want{{"loads[1].surge_factor", "at least 1"}}},
		{"both surges", base(func(l *Load) { l.SurgeW = vlF(300) }),
			[]want{{"loads[1].surge_w", "give surge_factor or surge_w, not both"}}},
		{"surge W below running", base(func(l *Load) { l.SurgeFactor = nil; l.SurgeW = vlF(30) }),
			[]want{{"loads[1].surge_w", "at least power_w (60 W), got 30"}}},
		{"no use", base(func(l *Load) { l.HoursPerDay = nil }),
			[]want{{"loads[1]", "give its daily use"}}},
		{"hours and windows", base(func(l *Load) { l.Windows = []string{"18:00-19:00"} }),
			[]want{{"loads[1]", "more than one way of daily use (hours_per_day, windows)"}}},
		{"hours and energy", base(func(l *Load) { l.EnergyWhDay = vlF(100) }),
			[]want{{"loads[1]", "(hours_per_day, energy_wh_day)"}}},
		{"energy and duty", base(func(l *Load) { l.HoursPerDay = nil; l.EnergyWhDay = vlF(100); l.DutyCycle = vlF(0.5) }),
			[]want{{"loads[1]", "(energy_wh_day, duty_cycle)"}}},
		{"NaN power", base(func(l *Load) { l.PowerW = math.NaN() }),
			[]want{{"loads[1].power_w", "got NaN"}}},
		{"infinite hours", base(func(l *Load) { l.HoursPerDay = vlF(math.Inf(1)) }),
			[]want{{"loads[1].hours_per_day", "got +Inf"}}},
		{"several at once", base(func(l *Load) { l.PowerW = -5; l.Quantity = vlF(2.5); l.Priority = "x" }),
			[]want{{"loads[1].quantity", "2.5"}, {"loads[1].power_w", "got -5"}, {"loads[1].priority", `"x"`}}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			got := collectLoadProblems(tt.loads)
			if len(got) != len(tt.want) {
				t.Fatalf("got %d problems %v, want %d %v", len(got), got, len(tt.want), tt.want)
			}
			for i, w := range tt.want {
				if got[i].path != w.path || !strings.Contains(got[i].msg, w.msg) {
					t.Errorf("problem %d = %s: %s; want %s: …%s…", i, got[i].path, got[i].msg, w.path, w.msg)
				}
			}
		})
	}
}
