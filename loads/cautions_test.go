package loads

import (
	"fmt"
	"slices"
	"testing"

	"solstand/caution"
	"solstand/schema"
)

// Thresholds are common practice (AutoVoltage and the sensible daily
// energy per voltage, as documented).
func TestAutoVoltage(t *testing.T) {
	tests := []struct{ wh, v float64 }{
		{0, 12}, {1500, 12}, {1501, 24}, {5000, 24}, {5001, 48}, {80000, 48},
	}
	for _, tt := range tests {
		if got := AutoVoltage(tt.wh); got != tt.v {
			t.Errorf("AutoVoltage(%g) = %g, want %g", tt.wh, got, tt.v)
		}
	}
}

func codes(cs []caution.Caution) []string {
	var out []string
	for _, c := range cs {
		out = append(out, c.Code)
	}
	return out
}

func TestCautions(t *testing.T) {
	// energy entry: E Wh/day at 1000 W over the whole day.
	dc := func(wh float64) []schema.Load {
		return []schema.Load{{Name: "heater", PowerW: 1000, EnergyWhDay: f64(wh)}}
	}
	tests := []struct {
		name    string
		loads   []schema.Load
		systemV float64
		want    []string
	}{
		{"12 V at 2 kWh", dc(2000), 12, nil},
		{"12 V above 2 kWh", dc(2100), 12, []string{"demand-high-for-voltage"}},
		{"24 V at 6 kWh", dc(6000), 24, nil},
		{"24 V above 6 kWh", dc(6100), 24, []string{"demand-high-for-voltage"}},
		{"48 V above 30 kWh", []schema.Load{{Name: "x", Quantity: f64(2), PowerW: 1000, EnergyWhDay: f64(15500)}}, 48, []string{"demand-high-for-voltage"}},
		{"voltage unknown", dc(6100), 0, nil},
		{"critical on AC", []schema.Load{{Name: "vaccine fridge", Circuit: "ac", PowerW: 60, DutyCycle: f64(0.4), Priority: "critical"}}, 24, []string{"critical-load-on-inverter"}},
		// mixedInventory: surge 2340 W > 2 × 840 W; the fridge is a critical AC load.
		{"motor surge", mixedInventory(), 48, []string{"critical-load-on-inverter", "motor-start-surge"}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			p, err := Build(tt.loads)
			if err != nil {
				t.Fatal(err)
			}
			cs := Cautions(p, tt.systemV)
			if got := codes(cs); !slices.Equal(got, tt.want) {
				t.Errorf("codes = %v, want %v", got, tt.want)
			}
			for _, c := range cs {
				if c.Message == "" || c.Severity.Rank() > 2 {
					t.Errorf("bad caution %+v", c)
				}
			}
		})
	}
}

// Example shows the demand of a small cabin: lights by hours per day, a
// radio in two clock windows with standby, a refrigerator from a meter
// reading and a water pump on weekdays in the dry months.
func ExampleBuild() {
	q := func(v float64) *float64 { return &v }
	inventory := []schema.Load{
		{Name: "LED lights", Quantity: q(6), PowerW: 7, HoursPerDay: q(4), Spread: "evening"},
		{Name: "radio", PowerW: 10, StandbyW: 0.5, Windows: []string{"06:00-07:30", "19:00-22:00"}, Priority: "critical"},
		{Name: "refrigerator", Circuit: "ac", PowerW: 80, EnergyWhDay: q(600), SurgeFactor: q(5)},
		{Name: "water pump", Circuit: "ac", PowerW: 400, Windows: []string{"10:00-11:30"}, DaysPerWeek: q(5), Months: []int{6, 7, 8, 9}},
	}
	p, err := Build(inventory)
	if err != nil {
		fmt.Println(err)
		return
	}
	inv, err := SizeInverter(p, schema.Inverter{RatingsW: []float64{300, 600, 1000, 1500}})
	if err != nil {
		fmt.Println(err)
		return
	}
	dc := DCDemand(p, inv, nil)
	fmt.Printf("January: %.0f Wh/day at the appliances, %.0f Wh/day from the battery\n", p.DailyWh(1), dc.DailyWh[0])
	fmt.Printf("July:    %.0f Wh/day at the appliances, %.0f Wh/day from the battery\n", p.DailyWh(7), dc.DailyWh[6])
	fmt.Printf("peak %.0f W, surge %.0f W, inverter %.0f W (surge %.0f W)\n", p.PeakW, p.SurgeACW, inv.ContinuousW, inv.SurgeW)
	fmt.Printf("system voltage %g V\n", AutoVoltage(dc.DailyWh[6]))
	// Output:
	// January: 823 Wh/day at the appliances, 1224 Wh/day from the battery
	// July:    1251 Wh/day at the appliances, 1672 Wh/day from the battery
	// peak 480 W, surge 800 W, inverter 600 W (surge 1200 W)
	// system voltage 24 V
}

func TestInverterCautions(t *testing.T) {
	// mixedInventory needs 1170 W by surge without a list (see TestSizeInverter).
	p, _ := Build(mixedInventory())
	s, _ := SizeInverter(p, schema.Inverter{})
	if got := codes(InverterCautions(p, s, DCDemand(p, s, nil))); !slices.Equal(got, []string{"inverter-sized-by-surge"}) {
		t.Errorf("mixed: %v", got)
	}
	// A 5 W phone charger for 2 h (10 Wh) through a 1000 W inverter idling
	// at 10 W all day (240 Wh): loss above delivery.
	p, _ = Build([]schema.Load{{Name: "charger", Circuit: "ac", PowerW: 5, Windows: []string{"20:00-22:00"}}})
	s, _ = SizeInverter(p, schema.Inverter{RatingsW: []float64{1000}})
	if got := codes(InverterCautions(p, s, DCDemand(p, s, nil))); !slices.Equal(got, []string{"inverter-loss-above-delivery"}) {
		t.Errorf("charger: %v", got)
	}
	// No AC loads: nothing.
	p, _ = Build([]schema.Load{{Name: "lamp", PowerW: 5, HoursPerDay: f64(2)}})
	if got := InverterCautions(p, InverterSizing{}, DCSide{}); got != nil {
		t.Errorf("DC only: %v", got)
	}
}
