package loads

import (
	"strings"
	"testing"

	"solstand/schema"
)

func ep(frac, eff float64) schema.EfficiencyPoint {
	return schema.EfficiencyPoint{LoadFraction: frac, Efficiency: eff}
}

// Interpolation of the default curve (common practice figures; the
// interpolated values are hand arithmetic).
func TestEfficiency(t *testing.T) {
	shuffled := []schema.EfficiencyPoint{ep(1.0, 0.92), ep(0.05, 0.70), ep(0.5, 0.93), ep(0.1, 0.82), ep(0.25, 0.90)}
	tests := []struct {
		name  string
		curve []schema.EfficiencyPoint
		frac  float64
		want  float64
	}{
		{"at a point", nil, 0.25, 0.90},
		{"below the first point clamps", nil, 0.01, 0.70},
		{"zero load clamps", nil, 0, 0.70},
		{"above full load clamps", nil, 2, 0.92},
		{"between 0.05 and 0.1", nil, 0.075, 0.76},  // 0.70 + 0.5 × 0.12
		{"between 0.25 and 0.5", nil, 0.375, 0.915}, // 0.90 + 0.5 × 0.03
		{"between 0.5 and 1", nil, 0.75, 0.925},     // 0.93 − 0.5 × 0.01
		{"unsorted curve", shuffled, 0.075, 0.76},
		{"one point", []schema.EfficiencyPoint{ep(0.5, 0.9)}, 0.1, 0.9},
	}
	for _, tt := range tests {
		if got := Efficiency(tt.curve, tt.frac); !near(got, tt.want, 1e-12) {
			t.Errorf("%s: Efficiency(%g) = %g, want %g", tt.name, tt.frac, got, tt.want)
		}
	}
	if shuffled[0].LoadFraction != 1.0 {
		t.Error("Efficiency reordered its argument")
	}
}

func TestCheckEfficiencyCurve(t *testing.T) {
	tests := []struct {
		curve []schema.EfficiencyPoint
		want  string
	}{
		{nil, ""},
		{DefaultEfficiencyCurve(), ""},
		{[]schema.EfficiencyPoint{ep(0.5, 0)}, "efficiency_curve[0].efficiency"},
		{[]schema.EfficiencyPoint{ep(0.5, 1.2)}, "efficiency_curve[0].efficiency"},
		{[]schema.EfficiencyPoint{ep(-0.1, 0.9)}, "efficiency_curve[0].load_fraction"},
		{[]schema.EfficiencyPoint{ep(0.5, 0.9), ep(0.5, 0.8)}, "efficiency_curve[1].load_fraction: repeats"},
	}
	for _, tt := range tests {
		err := CheckEfficiencyCurve(tt.curve)
		if (tt.want == "") != (err == nil) || (err != nil && !strings.Contains(err.Error(), tt.want)) {
			t.Errorf("CheckEfficiencyCurve(%v) = %v, want %q", tt.curve, err, tt.want)
		}
	}
}

// Inverter choice for mixedInventory: peak AC 840 W, surge 2340 W (see
// TestBuildPeakAndSurge). Required continuous 1.25 × 840 = 1050 W (margin:
// common practice).
func TestSizeInverter(t *testing.T) {
	p, err := Build(mixedInventory())
	if err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name     string
		inv      schema.Inverter
		cont     float64
		surge    float64
		idle     float64
		fromList bool
		bySurge  bool
		wantErr  string
	}{
		// No list: max(1050, 2340 / 2 = 1170) = 1170 W; surge 2 × 1170.
		{name: "required figure", cont: 1170, surge: 2340, idle: 11.7, bySurge: true},
		// Ratio 3: 2340 / 3 = 780 < 1050, the continuous figure stands.
		{name: "required figure, ratio 3", inv: schema.Inverter{SurgeRatio: f64(3)}, cont: 1050, surge: 3150, idle: 10.5},
		// 1200 ≥ 1050 and 2 × 1200 = 2400 ≥ 2340: 1200 W.
		{name: "from list", inv: schema.Inverter{RatingsW: []float64{3000, 500, 1200, 1000, 1500}}, cont: 1200, surge: 2400, idle: 12, fromList: true},
		// Ratio 1.5: 1200 → 1800, 1500 → 2250 fall short of 2340; 3000 → 4500.
		{name: "surge skips ratings", inv: schema.Inverter{RatingsW: []float64{500, 1000, 1200, 1500, 3000}, SurgeRatio: f64(1.5), IdleW: f64(25)},
			cont: 3000, surge: 4500, idle: 25, fromList: true, bySurge: true},
		// Margin 1.5: 1260 W needed, so 1500.
		{name: "margin", inv: schema.Inverter{RatingsW: []float64{1200, 1500}, Margin: f64(1.5)}, cont: 1500, surge: 3000, idle: 15, fromList: true},
		{name: "continuous fails", inv: schema.Inverter{RatingsW: []float64{500, 1000}}, wantErr: "no rating reaches the continuous 1050 W"},
		{name: "surge fails", inv: schema.Inverter{RatingsW: []float64{1200}, SurgeRatio: f64(1.5)}, wantErr: "no rating starts the surge of 2340 W"},
		{name: "bad margin", inv: schema.Inverter{Margin: f64(0.8)}, wantErr: "inverter.margin"},
		{name: "bad rating", inv: schema.Inverter{RatingsW: []float64{-1, 2000}}, wantErr: "inverter.ratings_w"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			s, err := SizeInverter(p, tt.inv)
			if tt.wantErr != "" {
				if err == nil || !strings.Contains(err.Error(), tt.wantErr) {
					t.Fatalf("err = %v, want %q", err, tt.wantErr)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			if !s.Needed || !near(s.RequiredSurgeW, 2340, 1e-12) ||
				!near(s.ContinuousW, tt.cont, 1e-12) || !near(s.SurgeW, tt.surge, 1e-12) || !near(s.IdleW, tt.idle, 1e-12) ||
				s.FromList != tt.fromList || s.SizedBySurge != tt.bySurge {
				t.Errorf("got %+v", s)
			}
			if tt.inv.Margin == nil && !near(s.RequiredContinuousW, 1050, 1e-12) {
				t.Errorf("RequiredContinuousW = %g", s.RequiredContinuousW)
			}
		})
	}
	// No AC loads: no inverter.
	dc, _ := Build([]schema.Load{{Name: "lamp", PowerW: 10, HoursPerDay: f64(2)}})
	if s, err := SizeInverter(dc, schema.Inverter{RatingsW: []float64{1}}); err != nil || s.Needed || s.ContinuousW != 0 {
		t.Errorf("DC only: %+v, %v", s, err)
	}
}

// DC-side demand, hand arithmetic with the default curve (common practice
// figures): one AC load of 100 W over 18:00-20:00 through a 1000 W
// inverter (part load 0.1 → η 0.82) with 1 % idle = 10 W, plus a DC load of
// 20 W over 18:00-19:00.
func TestDCDemand(t *testing.T) {
	inv := []schema.Load{
		{Name: "tv", Circuit: "ac", PowerW: 100, Windows: []string{"18:00-20:00"}},
		{Name: "lamp", PowerW: 20, Windows: []string{"18:00-19:00"}, Priority: "critical"},
	}
	p, err := Build(inv)
	if err != nil {
		t.Fatal(err)
	}
	always, err := SizeInverter(p, schema.Inverter{RatingsW: []float64{1000}})
	if err != nil {
		t.Fatal(err)
	}
	sleepy, err := SizeInverter(p, schema.Inverter{RatingsW: []float64{1000}, WakeThresholdW: f64(5), StandbyW: f64(1)})
	if err != nil {
		t.Fatal(err)
	}
	tests := []struct {
		name                  string
		s                     InverterSizing
		hour                  int
		crit, non, loss, appl float64
		daily                 float64
	}{
		// Hour 18: critical = lamp 20 + idle 10 = 30; non-critical tv
		// 100/0.82 = 121.95; loss 121.95 − 100 + 10 = 31.95.
		// Day: 20 + 2 × 100/0.82 + 24 × 10 = 503.90 Wh.
		{"always on, loaded hour", always, 18, 30, 100 / 0.82, 100/0.82 - 100 + 10, 120, 20 + 200/0.82 + 240},
		// Hour 3: only idle, 10 Wh, counted as critical.
		{"always on, empty hour", always, 3, 10, 0, 10, 0, 20 + 200/0.82 + 240},
		// Standby 1 W in the 22 empty hours, idle 10 W in 18 and 19:
		// 20 + 243.90 + 2 × 10 + 22 × 1 = 305.90 Wh.
		{"wake threshold, empty hour", sleepy, 3, 1, 0, 1, 0, 20 + 200/0.82 + 20 + 22},
		{"wake threshold, loaded hour", sleepy, 19, 10, 100 / 0.82, 100/0.82 - 100 + 10, 100, 20 + 200/0.82 + 20 + 22},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			d := DCDemand(p, tt.s, nil)
			for m := range 12 {
				h := tt.hour
				if !near(d.CriticalWh[m][h], tt.crit, 1e-12) || !near(d.NonCriticalWh[m][h], tt.non, 1e-12) ||
					!near(d.InverterLossWh[m][h], tt.loss, 1e-12) ||
					!near(d.ApplianceCriticalWh[m][h]+d.ApplianceNonCriticalWh[m][h], tt.appl, 1e-12) {
					t.Fatalf("month %d hour %d: crit %g non %g loss %g", m+1, h, d.CriticalWh[m][h], d.NonCriticalWh[m][h], d.InverterLossWh[m][h])
				}
				if !near(d.DailyWh[m], tt.daily, 1e-12) {
					t.Fatalf("DailyWh[%d] = %g, want %g", m, d.DailyWh[m], tt.daily)
				}
			}
		})
	}
}

// AC loads in some months only: the inverter is off (no idle) in the
// others; with no AC loads at all the DC side equals the appliance side.
func TestDCDemandMonths(t *testing.T) {
	p, err := Build([]schema.Load{
		{Name: "fan", Circuit: "ac", PowerW: 50, Windows: []string{"12:00-14:00"}, Months: []int{6, 7}},
		{Name: "lamp", PowerW: 10, HoursPerDay: f64(4)},
	})
	if err != nil {
		t.Fatal(err)
	}
	s, err := SizeInverter(p, schema.Inverter{RatingsW: []float64{500}, IdleW: f64(4)})
	if err != nil {
		t.Fatal(err)
	}
	d := DCDemand(p, s, nil)
	// January: lamp 40 Wh only.
	if !near(d.DailyWh[0], 40, 1e-12) || d.InverterLossDailyWh[0] != 0 {
		t.Errorf("January: %g Wh, loss %g", d.DailyWh[0], d.InverterLossDailyWh[0])
	}
	// June: 50 W at part load 0.1 → η 0.82; 40 + 100/0.82 + 24 × 4 Wh.
	if want := 40 + 100/0.82 + 96; !near(d.DailyWh[5], want, 1e-12) {
		t.Errorf("June: %g Wh, want %g", d.DailyWh[5], want)
	}

	dcOnly, _ := Build([]schema.Load{{Name: "lamp", PowerW: 10, HoursPerDay: f64(4)}})
	d = DCDemand(dcOnly, InverterSizing{}, nil)
	if !near(d.DailyWh[0], 40, 1e-12) || d.InverterLossDailyWh[0] != 0 {
		t.Errorf("DC only: %g Wh, loss %g", d.DailyWh[0], d.InverterLossDailyWh[0])
	}
}

// A custom curve is used as given (and sorted); a bad one falls back to
// the default.
func TestDCDemandCurve(t *testing.T) {
	p, _ := Build([]schema.Load{{Name: "tv", Circuit: "ac", PowerW: 100, Windows: []string{"18:00-19:00"}}})
	s := InverterSizing{Needed: true, ContinuousW: 1000}
	flat := []schema.EfficiencyPoint{ep(1, 0.8), ep(0, 0.8)}
	if d := DCDemand(p, s, flat); !near(d.DailyWh[0], 125, 1e-12) { // 100 / 0.8
		t.Errorf("flat curve: %g", d.DailyWh[0])
	}
	bad := []schema.EfficiencyPoint{ep(0.1, 0)}
	if d := DCDemand(p, s, bad); !near(d.DailyWh[0], 100/0.82, 1e-12) {
		t.Errorf("bad curve: %g", d.DailyWh[0])
	}
}

func BenchmarkDCDemand(b *testing.B) {
	p, err := Build(mixedInventory())
	if err != nil {
		b.Fatal(err)
	}
	s, _ := SizeInverter(p, schema.Inverter{})
	for b.Loop() {
		_ = DCDemand(p, s, nil)
	}
}
