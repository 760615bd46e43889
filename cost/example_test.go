package cost_test

import (
	"fmt"

	"solstand/cost"
)

// An invented demo budget over 20 years at a 5 % real discount rate.
func ExampleCompute() {
	lc, err := cost.Compute(cost.LifecycleInput{
		Capital: 10000, Installation: 2000, OMPerYear: 200, DiscountRate: 0.05, AnalysisYears: 20,
		Replacements: []cost.Replacement{
			{Name: "battery bank", LifeYears: 6, Cost: 3000},
			{Name: "controller", LifeYears: 10, Cost: 500},
		},
		ServedWhPerYear: 1e6,
	})
	if err != nil {
		fmt.Println(err)
		return
	}
	fmt.Printf("capital %.0f, O&M %.0f, replacements %.0f, salvage %.0f\n", lc.CapitalPW, lc.OMPW, lc.ReplacementsPW, lc.SalvagePW)
	fmt.Printf("net present cost %.0f, %.3f per kWh\n", lc.NetPresentCost, lc.LevelisedCostPerKWh)
	// Output:
	// capital 12000, O&M 2492, replacements 5463, salvage 754
	// net present cost 19201, 1.541 per kWh
}

func ExampleTotal() {
	items := []cost.Item{
		{Category: "array", Name: "module", Unit: "each", Quantity: 4, UnitPrice: 180},
		{Category: "wiring", Name: "cable 10 mm²", Unit: "m", Quantity: 30, UnitPrice: 1.2},
	}
	fmt.Printf("%.2f\n", cost.Total(items))
	// Output: 756.00
}

func ExampleUniformSeriesPresentWorth() {
	fmt.Printf("%.4f\n", cost.UniformSeriesPresentWorth(0.10, 5))
	// Output: 3.7908
}
