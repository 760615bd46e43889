package loads

import (
	"math"
	"math/rand/v2"
	"strings"
	"testing"

	"solstand/schema"
)

func f64(v float64) *float64 { return &v }

func near(a, b, tol float64) bool { return math.Abs(a-b) <= tol*math.Max(1, math.Abs(b)) }

// All expected figures in these tests are hand arithmetic from the rules in
// the package comment (no outside source): Wh in an hour = quantity ×
// (power × running fraction of the hour + standby × the rest) × days/7.
func TestBuildOneEntry(t *testing.T) {
	tests := []struct {
		name  string
		load  schema.Load
		month int // 1..12 checked
		hours map[int]float64
		daily float64
		peak  float64
		row   Row // only HoursPerDay, StandbyHours, EnergyWhDay, SurgeW checked
	}{
		{
			// 4 × 9 W, 5 h spread over 'evening' 18:00-23:00 (5 h): full power
			// 18..22; 4 × 9 = 36 Wh each hour; 5 × 36 = 180 Wh/day.
			name:  "hours over evening",
			load:  schema.Load{Name: "lights", Quantity: f64(4), PowerW: 9, HoursPerDay: f64(5)},
			month: 1,
			hours: map[int]float64{17: 0, 18: 36, 22: 36, 23: 0},
			daily: 180, peak: 36,
			row: Row{HoursPerDay: 5, StandbyHours: 19, EnergyWhDay: 180, SurgeW: 9},
		},
		{
			// 100 W, 3 h over 'daytime' 08:00-17:00 (9 h): 3/9 of each hour
			// 8..16 = 33.33 Wh; 300 Wh/day. It can run in 8..16: peak 100 W.
			name:  "hours over daytime",
			load:  schema.Load{Name: "tool", PowerW: 100, HoursPerDay: f64(3), Spread: "daytime"},
			month: 6,
			hours: map[int]float64{7: 0, 8: 100.0 / 3, 16: 100.0 / 3, 17: 0},
			daily: 300, peak: 100,
			row: Row{HoursPerDay: 3, StandbyHours: 21, EnergyWhDay: 300, SurgeW: 100},
		},
		{
			// 2 h over the clock spread 17:30-19:30: 1 of every minute, so
			// hour 17 gets 0.5 × 50 = 25, hour 18 50, hour 19 25; 100 Wh/day.
			name:  "hours over a clock spread",
			load:  schema.Load{Name: "pump", PowerW: 50, HoursPerDay: f64(2), Spread: "17:30-19:30"},
			month: 3,
			hours: map[int]float64{17: 25, 18: 50, 19: 25, 20: 0},
			daily: 100, peak: 50,
			row: Row{HoursPerDay: 2, StandbyHours: 22, EnergyWhDay: 100, SurgeW: 50},
		},
		{
			// Partial hours: 18:30-19:15 at 60 W puts 0.5 h × 60 = 30 Wh in
			// hour 18 and 0.25 h × 60 = 15 Wh in hour 19; 45 Wh/day.
			name:  "partial hours",
			load:  schema.Load{Name: "light", PowerW: 60, Windows: []string{"18:30-19:15"}},
			month: 2,
			hours: map[int]float64{18: 30, 19: 15, 20: 0},
			daily: 45, peak: 60,
			row: Row{HoursPerDay: 0.75, StandbyHours: 23.25, EnergyWhDay: 45, SurgeW: 60},
		},
		{
			// Across midnight: 21:00-06:00 at 10 W, 10 Wh in each of 21, 22,
			// 23, 0..5; 9 h × 10 = 90 Wh/day.
			name:  "across midnight",
			load:  schema.Load{Name: "night light", PowerW: 10, Windows: []string{"21:00-06:00"}},
			month: 12,
			hours: map[int]float64{20: 0, 21: 10, 23: 10, 0: 10, 5: 10, 6: 0},
			daily: 90, peak: 10,
			row: Row{HoursPerDay: 9, StandbyHours: 15, EnergyWhDay: 90},
		},
		{
			// 'night' spread 18:00-06:00 is 12 h; 6 h over it = half of each
			// hour: 0.5 × 20 = 10 Wh in 18..23 and 0..5; 120 Wh/day.
			name:  "hours over night spread",
			load:  schema.Load{Name: "security", PowerW: 20, HoursPerDay: f64(6), Spread: "night"},
			month: 7,
			hours: map[int]float64{17: 0, 18: 10, 0: 10, 5: 10, 6: 0},
			daily: 120, peak: 20,
		},
		{
			// Metered 720 Wh/day at 100 W = 7.2 h over 24 h: 7.2/24 = 0.3 of
			// each hour, 30 Wh each hour; can run in every hour: peak 100 W.
			name:  "energy over the whole day",
			load:  schema.Load{Name: "fridge", PowerW: 100, EnergyWhDay: f64(720), SurgeFactor: f64(5)},
			month: 1,
			hours: map[int]float64{0: 30, 12: 30, 23: 30},
			daily: 720, peak: 100,
			row: Row{HoursPerDay: 7.2, StandbyHours: 16.8, EnergyWhDay: 720, SurgeW: 500},
		},
		{
			// 150 Wh/day at 100 W = 1.5 h over 10:00-13:00 (3 h): 0.5 of each
			// hour 10..12 = 50 Wh.
			name:  "energy over windows",
			load:  schema.Load{Name: "mill", PowerW: 100, EnergyWhDay: f64(150), Windows: []string{"10:00-13:00"}},
			month: 4,
			hours: map[int]float64{9: 0, 10: 50, 12: 50, 13: 0},
			daily: 150, peak: 100,
		},
		{
			// Duty cycle 0.35 of 120 W all day: 42 Wh each hour, 1008 Wh/day.
			name:  "duty cycle all day",
			load:  schema.Load{Name: "compressor", PowerW: 120, DutyCycle: f64(0.35)},
			month: 8,
			hours: map[int]float64{0: 42, 13: 42},
			daily: 1008, peak: 120,
			row: Row{HoursPerDay: 8.4, StandbyHours: 15.6, EnergyWhDay: 1008, SurgeW: 120},
		},
		{
			// Duty 0.35 over 21:00-06:00 (9 h): 42 Wh in each of 9 hours =
			// 378 Wh/day.
			name:  "duty cycle over windows",
			load:  schema.Load{Name: "compressor", PowerW: 120, DutyCycle: f64(0.35), Windows: []string{"21:00-06:00"}},
			month: 8,
			hours: map[int]float64{20: 0, 21: 42, 2: 42, 6: 0},
			daily: 378, peak: 120,
		},
		{
			// Standby: 12 W over 18:00-20:00 and 0.5 W the other 22 h:
			// 12 Wh in 18 and 19, 0.5 Wh elsewhere; 24 + 11 = 35 Wh/day. The
			// coincident power outside the window is the standby 0.5 W.
			name:  "standby outside windows",
			load:  schema.Load{Name: "radio", PowerW: 12, StandbyW: 0.5, Windows: []string{"18:00-20:00"}},
			month: 5,
			hours: map[int]float64{17: 0.5, 18: 12, 19: 12, 20: 0.5},
			daily: 35, peak: 12,
			row: Row{HoursPerDay: 2, StandbyHours: 22, EnergyWhDay: 35, SurgeW: 12},
		},
		{
			// Standby in a partly used hour: 18:30-19:00 at 12 W, 0.5 W
			// standby: hour 18 = 0.5 × 12 + 0.5 × 0.5 = 6.25 Wh.
			name:  "standby in a partial hour",
			load:  schema.Load{Name: "radio", PowerW: 12, StandbyW: 0.5, Windows: []string{"18:30-19:00"}},
			month: 5,
			hours: map[int]float64{18: 6.25, 19: 0.5},
			daily: 6 + 0.5*23.5, peak: 12,
		},
		{
			// 5 days a week, 40 W over 12:00-16:00: 40 × 5/7 = 28.571 Wh in
			// each of 12..15, 4 × 28.571 = 114.29 Wh/day; peak ignores days.
			name:  "days per week",
			load:  schema.Load{Name: "fan", PowerW: 40, Windows: []string{"12:00-16:00"}, DaysPerWeek: f64(5)},
			month: 1,
			hours: map[int]float64{12: 200.0 / 7, 15: 200.0 / 7, 16: 0},
			daily: 800.0 / 7, peak: 40,
			row: Row{HoursPerDay: 4, StandbyHours: 20, EnergyWhDay: 800.0 / 7, SurgeW: 40},
		},
		{
			// Standby on days of use only: 2 days a week, 10 W for 2 h and
			// 1 W standby the other 22 h: (20 + 22) × 2/7 = 12 Wh/day.
			name:  "standby and days per week",
			load:  schema.Load{Name: "tv", PowerW: 10, StandbyW: 1, Windows: []string{"20:00-22:00"}, DaysPerWeek: f64(2)},
			month: 1,
			hours: map[int]float64{20: 20.0 / 7, 0: 2.0 / 7},
			daily: 12, peak: 10,
		},
		{
			// Not a month of use: nothing at all, not even standby.
			name:  "outside its months",
			load:  schema.Load{Name: "heater", PowerW: 500, StandbyW: 2, Windows: []string{"06:00-08:00"}, Months: []int{6, 7, 8}},
			month: 1,
			hours: map[int]float64{6: 0, 0: 0},
			daily: 0, peak: 0,
		},
		{
			// In a month of use: 500 Wh in hours 6 and 7, 2 Wh standby in the
			// other 22 h: 1000 + 44 = 1044 Wh/day.
			name:  "inside its months",
			load:  schema.Load{Name: "heater", PowerW: 500, StandbyW: 2, Windows: []string{"06:00-08:00"}, Months: []int{6, 7, 8}},
			month: 7,
			hours: map[int]float64{6: 500, 7: 500, 0: 2},
			daily: 1044, peak: 500,
		},
		{
			// Two windows, 06:00-07:30 and 19:00-19:20 at 30 W: hour 6 30, hour
			// 7 15, hour 19 10; 1.5 h + 1/3 h = 11/6 h; 55 Wh/day.
			name:  "two windows",
			load:  schema.Load{Name: "light", PowerW: 30, Windows: []string{"06:00-07:30", "19:00-19:20"}},
			month: 10,
			hours: map[int]float64{6: 30, 7: 15, 19: 10, 8: 0},
			daily: 55, peak: 30,
		},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p, err := Build([]schema.Load{tt.load})
			if err != nil {
				t.Fatal(err)
			}
			m := tt.month - 1
			for h, want := range tt.hours {
				if got := p.DCWh[m][h]; !near(got, want, 1e-12) {
					t.Errorf("DCWh[%d][%d] = %g, want %g", m, h, got, want)
				}
			}
			if got := p.DCDailyWh[m]; !near(got, tt.daily, 1e-12) {
				t.Errorf("DCDailyWh[%d] = %g, want %g", m, got, tt.daily)
			}
			if !near(p.PeakDCW, tt.peak, 1e-12) && tt.peak > 0 {
				t.Errorf("PeakDCW = %g, want %g", p.PeakDCW, tt.peak)
			}
			if p.HasAC || p.PeakACW != 0 || p.ACDailyWh[m] != 0 || p.SurgeACW != 0 {
				t.Errorf("AC side not empty: %+v", p.ACDailyWh)
			}
			r := p.Rows[0]
			if tt.row.EnergyWhDay != 0 {
				if !near(r.HoursPerDay, tt.row.HoursPerDay, 1e-12) || !near(r.StandbyHours, tt.row.StandbyHours, 1e-12) ||
					!near(r.EnergyWhDay, tt.row.EnergyWhDay, 1e-12) || (tt.row.SurgeW != 0 && !near(r.SurgeW, tt.row.SurgeW, 1e-12)) {
					t.Errorf("row = hours %g standby h %g energy %g surge %g; want %+v", r.HoursPerDay, r.StandbyHours, r.EnergyWhDay, r.SurgeW, tt.row)
				}
			}
		})
	}
}

// Peak coincident power and surge of a mixed inventory (hand arithmetic):
// AC: fridge 90 W can run every hour (energy, no windows), surge_w 450;
// pump 750 W 10:00-14:00 with surge factor 3 (2250 W); TV 100 W
// 18:00-22:00. AC peak is hours 10..13: 90 + 750 = 840 W. Largest one-unit
// increment: pump 2250 − 750 = 1500 W; surge = 840 + 1500 = 2340 W.
// DC: 2 × 10 W lamps 18:00-23:00 = 20 W; whole peak hours 18..21 is 190 +
// 20 = 210 W < 840, so PeakW = 840 W (hours 10..13, no DC load then).
func mixedInventory() []schema.Load {
	return []schema.Load{
		{Name: "fridge", Circuit: "ac", PowerW: 90, EnergyWhDay: f64(720), SurgeW: f64(450), Priority: "critical"},
		{Name: "pump", Circuit: "ac", PowerW: 750, Windows: []string{"10:00-14:00"}, SurgeFactor: f64(3)},
		{Name: "tv", Circuit: "ac", PowerW: 100, Windows: []string{"18:00-22:00"}},
		{Name: "lamps", Quantity: f64(2), PowerW: 10, HoursPerDay: f64(5)},
	}
}

func TestBuildPeakAndSurge(t *testing.T) {
	p, err := Build(mixedInventory())
	if err != nil {
		t.Fatal(err)
	}
	checks := []struct {
		name      string
		got, want float64
	}{
		{"PeakACW", p.PeakACW, 840},
		{"PeakDCW", p.PeakDCW, 20},
		{"PeakW", p.PeakW, 840},
		{"SurgeACW", p.SurgeACW, 2340},
		// AC daily: fridge 720 + pump 4 × 750 = 3000 + tv 400 = 4120 Wh.
		{"ACDailyWh", p.ACDailyWh[0], 4120},
		// DC daily: 2 × 10 × 5 = 100 Wh.
		{"DCDailyWh", p.DCDailyWh[0], 100},
		// Critical AC in hour 0: fridge 720/24 = 30 Wh.
		{"CriticalACWh", p.CriticalACWh[0][0], 30},
		{"MaxDailyWh", p.MaxDailyWh(), 4220},
		{"DailyWh(3)", p.DailyWh(3), 4220},
	}
	for _, c := range checks {
		if !near(c.got, c.want, 1e-12) {
			t.Errorf("%s = %g, want %g", c.name, c.got, c.want)
		}
	}
	if !p.HasAC || !p.Rows[0].Critical || p.Rows[3].Circuit != "dc" {
		t.Errorf("flags: %+v", p.Rows)
	}
}

func TestBuildErrors(t *testing.T) {
	tests := []struct {
		name string
		load schema.Load
		want string
	}{
		{"power", schema.Load{Name: "a", PowerW: -60, HoursPerDay: f64(1)}, "loads[1].power_w: must be greater than 0, got -60"},
		{"quantity", schema.Load{Name: "a", Quantity: f64(1.5), PowerW: 1, HoursPerDay: f64(1)}, "loads[1].quantity:"},
		{"window", schema.Load{Name: "a", PowerW: 1, Windows: []string{"18:00-19:00", "7pm"}}, "loads[1].windows[1]:"},
		{"overlap", schema.Load{Name: "a", PowerW: 1, Windows: []string{"18:00-20:00", "19:00-21:00"}}, "loads[1].windows[1]: overlaps"},
		{"no use", schema.Load{Name: "a", PowerW: 1}, "loads[1]: give exactly one way"},
		{"two uses", schema.Load{Name: "a", PowerW: 1, HoursPerDay: f64(1), DutyCycle: f64(0.5)}, "loads[1]: give exactly one way"},
		{"hours and windows", schema.Load{Name: "a", PowerW: 1, HoursPerDay: f64(1), Windows: []string{"18:00-19:00"}}, "loads[1]: give exactly one way"},
		{"hours over spread", schema.Load{Name: "a", PowerW: 1, HoursPerDay: f64(6)}, "loads[1].hours_per_day: is 6 h but its spread_window is only 5 h"},
		{"energy over window", schema.Load{Name: "a", PowerW: 10, EnergyWhDay: f64(30), Windows: []string{"18:00-20:00"}}, "loads[1].energy_wh_day: must not exceed power_w × 2 h = 20 Wh"},
		{"energy over day", schema.Load{Name: "a", PowerW: 10, EnergyWhDay: f64(241)}, "loads[1].energy_wh_day: must not exceed power_w × 24 h = 240 Wh"},
		{"month", schema.Load{Name: "a", PowerW: 1, HoursPerDay: f64(1), Months: []int{0}}, "loads[1].months[0]:"},
		{"spread", schema.Load{Name: "a", PowerW: 1, HoursPerDay: f64(1), Spread: "dusk"}, "loads[1].spread_window:"},
		{"circuit", schema.Load{Name: "a", PowerW: 1, HoursPerDay: f64(1), Circuit: "x"}, "loads[1].circuit:"},
		{"surge", schema.Load{Name: "a", PowerW: 10, HoursPerDay: f64(1), SurgeW: f64(5)}, "loads[1].surge_w:"},
		{"NaN power", schema.Load{Name: "a", PowerW: math.NaN(), HoursPerDay: f64(1)}, "loads[1].power_w:"},
		{"Inf duty", schema.Load{Name: "a", PowerW: 1, DutyCycle: f64(math.Inf(1))}, "loads[1].duty_cycle:"},
	}
	ok := schema.Load{Name: "ok", PowerW: 5, HoursPerDay: f64(1)}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := Build([]schema.Load{ok, tt.load})
			if err == nil || !strings.Contains(err.Error(), tt.want) {
				t.Fatalf("err = %v, want one containing %q", err, tt.want)
			}
		})
	}
}

// randomInventory draws a valid inventory (fixed seed by the caller).
func randomInventory(rng *rand.Rand) []schema.Load {
	n := 1 + rng.IntN(12)
	out := make([]schema.Load, n)
	for i := range out {
		l := schema.Load{Name: "load", PowerW: 1 + rng.Float64()*1000}
		if rng.IntN(2) == 0 {
			l.Circuit = "ac"
		}
		if rng.IntN(3) == 0 {
			l.Priority = "critical"
		}
		if rng.IntN(2) == 0 {
			l.Quantity = f64(float64(1 + rng.IntN(6)))
		}
		if rng.IntN(2) == 0 {
			l.StandbyW = rng.Float64() * 5
		}
		if rng.IntN(2) == 0 {
			l.DaysPerWeek = f64(0.5 + rng.Float64()*6.5)
		}
		if rng.IntN(3) == 0 {
			for m := 1; m <= 12; m++ {
				if rng.IntN(2) == 0 {
					l.Months = append(l.Months, m)
				}
			}
			if len(l.Months) == 0 {
				l.Months = []int{1 + rng.IntN(12)}
			}
		}
		wins := randomWindows(rng)
		switch rng.IntN(5) {
		case 0:
			names := []string{"daytime", "evening", "night", "allday", "05:10-07:50"}
			lengths := []float64{9, 5, 12, 24, 160.0 / 60}
			k := rng.IntN(len(names))
			l.Spread = names[k]
			l.HoursPerDay = f64(lengths[k] * (0.01 + 0.99*rng.Float64()))
		case 1:
			l.Windows = wins
		case 2:
			l.EnergyWhDay = f64(l.PowerW * 24 * (0.01 + 0.99*rng.Float64()))
		case 3:
			l.Windows = wins
			l.EnergyWhDay = f64(l.PowerW * windowsHours(wins) * (0.01 + 0.99*rng.Float64()))
		default:
			l.DutyCycle = f64(0.01 + 0.99*rng.Float64())
			if rng.IntN(2) == 0 {
				l.Windows = wins
			}
		}
		out[i] = l
	}
	return out
}

// randomWindows draws 1..4 non-overlapping windows on 5-minute steps,
// turned by a random offset so that some run across midnight.
func randomWindows(rng *rand.Rand) []string {
	k := 1 + rng.IntN(4)
	picked := map[int]bool{}
	for len(picked) < 2*k {
		picked[rng.IntN(288)*5] = true
	}
	var b []int
	for m := 0; m < schema.MinutesPerDay; m += 5 {
		if picked[m] {
			b = append(b, m)
		}
	}
	off := rng.IntN(288) * 5
	var out []string
	for j := 0; j < len(b); j += 2 {
		s, e := (b[j]+off)%schema.MinutesPerDay, (b[j+1]+off)%schema.MinutesPerDay
		out = append(out, schema.FormatWindow(s, e))
	}
	return out
}

func windowsHours(ws []string) float64 {
	n := 0
	for _, w := range ws {
		a, b, _ := schema.ParseWindow(w)
		n += schema.WindowMinutes(a, b)
	}
	return float64(n) / 60
}

// Property: for any valid inventory the 12 × 24 tables sum to the daily
// totals, and those to the sum of the per-entry formula figures; the DC
// side closes (appliance energy + inverter loss = DC-side energy).
func TestTablesSumToDailyTotals(t *testing.T) {
	rng := rand.New(rand.NewPCG(20260101, 3))
	for trial := range 500 {
		inv := randomInventory(rng)
		p, err := Build(inv)
		if err != nil {
			t.Fatalf("trial %d: %v\n%+v", trial, err, inv)
		}
		for _, r := range p.Rows {
			sum := 0.0
			for _, v := range r.RunHourFrac {
				if v < 0 || v > 1+1e-12 {
					t.Fatalf("trial %d: run fraction %g", trial, v)
				}
				sum += v
			}
			if !near(sum, r.HoursPerDay, 1e-9) {
				t.Fatalf("trial %d %s: run fractions sum %g, HoursPerDay %g", trial, r.Use, sum, r.HoursPerDay)
			}
		}
		s, err := SizeInverter(p, schema.Inverter{})
		if err != nil {
			t.Fatal(err)
		}
		d := DCDemand(p, s, nil)
		for m := range 12 {
			var ac, dc, rows, dcSide, appl, loss float64
			for h := range 24 {
				ac += p.ACWh[m][h]
				dc += p.DCWh[m][h]
				dcSide += d.CriticalWh[m][h] + d.NonCriticalWh[m][h]
				appl += d.ApplianceCriticalWh[m][h] + d.ApplianceNonCriticalWh[m][h]
				loss += d.InverterLossWh[m][h]
				if p.ACWh[m][h] > p.PeakACW*(1+1e-12) || p.ACWh[m][h]+p.DCWh[m][h] > p.PeakW*(1+1e-12) {
					t.Fatalf("trial %d: hourly mean power above the peak", trial)
				}
			}
			for _, r := range p.Rows {
				if r.Months[m] {
					rows += r.EnergyWhDay
				}
			}
			if !near(ac, p.ACDailyWh[m], 1e-9) || !near(dc, p.DCDailyWh[m], 1e-9) || !near(ac+dc, rows, 1e-9) {
				t.Fatalf("trial %d month %d: ac %g/%g dc %g/%g rows %g", trial, m+1, ac, p.ACDailyWh[m], dc, p.DCDailyWh[m], rows)
			}
			if !near(dcSide, d.DailyWh[m], 1e-9) || !near(appl, ac+dc, 1e-9) || !near(appl+loss, dcSide, 1e-9) || !near(loss, d.InverterLossDailyWh[m], 1e-9) {
				t.Fatalf("trial %d month %d: dc side %g/%g appliance %g loss %g", trial, m+1, dcSide, d.DailyWh[m], appl, loss)
			}
			if !p.HasAC && loss != 0 {
				t.Fatalf("trial %d: inverter loss without AC loads", trial)
			}
		}
	}
}

func BenchmarkBuild(b *testing.B) {
	rng := rand.New(rand.NewPCG(1, 2))
	var inv []schema.Load
	for len(inv) < 200 {
		inv = append(inv, randomInventory(rng)...)
	}
	inv = inv[:200]
	b.ResetTimer()
	for b.Loop() {
		if _, err := Build(inv); err != nil {
			b.Fatal(err)
		}
	}
}
