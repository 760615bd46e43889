package battery_test

import (
	"fmt"

	"solstand/battery"
)

// A cabin's 24 V flooded lead-acid bank: 2.4 kWh a day in the design month,
// three days of autonomy, the bank in a shed at 10 °C.
func ExampleSize() {
	chem, err := battery.Defaults(battery.Flooded)
	if err != nil {
		fmt.Println(err)
		return
	}
	s, err := battery.Size(battery.SizingInput{
		DailyDemandWh: 2400,
		AutonomyDays:  3,
		SystemV:       24,
		TempC:         10,
		Chem:          chem,
		Block:         battery.Block{NominalV: 6, CapacityAh: 225, RatedHours: 20},
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("required %.0f Ah (temperature factor %.3f)\n", s.RequiredAh, s.TempFactor)
	fmt.Printf("%d × %d blocks: %.0f Ah, %.0f Wh, usable %.0f Wh\n", s.BlocksSeries, s.Strings, s.CapacityAh, s.CapacityWh, s.UsableWh)
	for _, c := range s.Cautions {
		fmt.Println(c.Code)
	}
	// Output:
	// required 752 Ah (temperature factor 0.840)
	// 4 × 4 blocks: 900 Ah, 21600 Wh, usable 9076 Wh
	// battery-many-strings
}

// Stepping the state-of-charge model through one hour of sun and one of load.
func ExampleModel() {
	chem, _ := battery.Defaults(battery.AGM)
	s := battery.Sizing{CapacityWh: 2400, CapacityAh: 200, TempFactor: 1, MaxDoD: 0.5, SystemV: 12, BlocksSeries: 1, Strings: 2}
	m := battery.NewModel(chem, s, battery.Block{NominalV: 12, CapacityAh: 100}, 0.6, 0.7, 0)
	acc, loss := m.Charge(300, 1)
	fmt.Printf("charged: accepted %.0f Wh, lost %.0f Wh, SOC %.3f\n", acc, loss, m.SOC())
	crit, non, loss := m.Discharge(190, 0, 1)
	fmt.Printf("discharged: %.0f + %.0f Wh, lost %.0f Wh, SOC %.3f\n", crit, non, loss, m.SOC())
	// Output:
	// charged: accepted 300 Wh, lost 30 Wh, SOC 0.713
	// discharged: 190 + 0 Wh, lost 10 Wh, SOC 0.629
}

// Rainflow counting of the ASTM E1049-85 example history.
func ExampleRainflow() {
	for _, c := range battery.Rainflow([]float64{-2, 1, -3, 5, -1, 3, -4, 4, -2}) {
		fmt.Printf("range %g count %g\n", c.Range, c.Count)
	}
	// Output:
	// range 3 count 0.5
	// range 4 count 0.5
	// range 4 count 1
	// range 8 count 0.5
	// range 9 count 0.5
	// range 8 count 0.5
	// range 6 count 0.5
}
