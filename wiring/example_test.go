package wiring_test

import (
	"fmt"

	"solstand/wiring"
)

// The case of `solstand wire --current 20 --length-m 10 --voltage 12
// --max-drop-pct 3 --standard iec`.
func ExampleSelect() {
	ch, err := wiring.Select(wiring.Circuit{
		Name: "battery → inverter", CurrentA: 20, OneWayLengthM: 10, VoltageV: 12, MaxDropPct: 3,
		Standard: wiring.IEC, Class: 2,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("%s, %.3f Ω/km, drop %.3f V (%.2f %%), limited by %s\n", ch.Size.Label, ch.ResistanceOhmPerKm, ch.DropV, ch.DropPct, ch.LimitedBy)
	// Output: 25 mm², 0.727 Ω/km, drop 0.291 V (2.42 %), limited by voltage drop
}

func ExampleSelectProtection() {
	r, err := wiring.SelectProtection(94.7, 112, wiring.NEC)
	fmt.Println(r, err)
	// Output: 100 <nil>
}

func ExampleStringFuseA() {
	r, err := wiring.StringFuseA(9, 15, wiring.NEC)
	fmt.Println(r, err)
	// Output: 15 <nil>
}

// A small invented 12 V cabin: one string straight to the controller, a
// 600 W inverter and one lighting branch.
func ExampleDesignSystem() {
	d, err := wiring.DesignSystem(wiring.SystemCircuits{
		Standard: wiring.IEC, Class: 5,
		ModuleIscA: 9.5, ModuleImpA: 9, ModuleMaxSeriesFuseA: 15, Strings: 1,
		PVOperatingV: 18, PVMaxV: 24, ArrayToControllerOneWayM: 8, PVMaxDropPct: 3,
		ControllerRatedA: 20, ControllerToBatteryOneWayM: 1.5,
		BatteryNominalV: 12, BlocksSeries: 1, BatteryStrings: 2, BlockInternalResistanceOhm: 0.006, BatteryMaxDropPct: 1.5,
		InverterContinuousW: 600, InverterEfficiency: 0.9, LowVoltageDisconnectV: 11, BatteryToInverterOneWayM: 1.5,
		BatteryToDCPanelOneWayM: 3, Branches: []wiring.Branch{{Name: "lights", CurrentA: 2, OneWayLengthM: 10}}, BranchMaxDropPct: 3,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	for _, c := range d.Circuits {
		fmt.Printf("%-22s %-8s drop %.2f %%\n", c.Circuit.Name, c.Size.Label, c.DropPct)
	}
	for _, p := range d.Protection {
		fmt.Printf("%-22s %s %g A ×%d\n", p.Circuit, p.Kind, p.RatingA, p.Count)
	}
	fmt.Printf("bank short circuit %.0f A\n", d.BankShortCircuitA)
	// Output:
	// combiner → controller  6 mm²    drop 2.64 %
	// controller → battery   10 mm²   drop 0.95 %
	// battery → inverter     25 mm²   drop 1.29 %
	// battery → DC panel     1.5 mm²  drop 1.33 %
	// DC branch: lights      2.5 mm²  drop 2.66 %
	// combiner → controller  breaker 16 A ×1
	// controller → battery   fuse 25 A ×1
	// battery → inverter     fuse 80 A ×1
	// battery → DC panel     fuse 4 A ×1
	// DC branch: lights      breaker 4 A ×1
	// bank short circuit 4000 A
}
