package cost

import (
	"math"
	"testing"
)

// FuzzCompute checks that Compute never panics and that, whenever it
// succeeds, the rows add up to the net present cost.
func FuzzCompute(f *testing.F) {
	f.Add(10000.0, 2000.0, 200.0, 0.05, 20.0, 6.0, 3000.0, 1e6)
	f.Add(0.0, 0.0, 0.0, 0.0, 1.0, 0.25, 0.0, 0.0)
	f.Add(math.NaN(), -1.0, math.Inf(1), -1.0, 0.5, 0.0, -1.0, -1.0)
	f.Fuzz(func(t *testing.T, capital, inst, om, d, years, life, repCost, wh float64) {
		lc, err := Compute(LifecycleInput{Capital: capital, Installation: inst, OMPerYear: om, DiscountRate: d,
			AnalysisYears: years, Replacements: []Replacement{{"x", life, repCost}}, ServedWhPerYear: wh})
		if err != nil {
			return
		}
		sum := 0.0
		for _, r := range lc.Rows {
			sum += r.PresentWorth
		}
		if !finite(lc.NetPresentCost) {
			return // huge inputs may overflow; no panic is the point
		}
		if math.Abs(sum-lc.NetPresentCost) > 1e-9*math.Max(1, math.Abs(lc.NetPresentCost)) {
			t.Fatalf("rows %v, NPC %v", sum, lc.NetPresentCost)
		}
	})
}
