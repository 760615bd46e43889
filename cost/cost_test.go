package cost

import (
	"errors"
	"math"
	"testing"
)

func near(a, b, tol float64) bool { return math.Abs(a-b) <= tol }

func TestFactors(t *testing.T) {
	// Standard compound-interest table values, 4 decimals (from memory of
	// any engineering-economics text's interest tables; each also checked
	// by hand: 1.1^5 = 1.61051, 1.05^20 = 2.65330, 1.08^10 = 2.15892).
	tests := []struct {
		d, n        float64
		pf, pa, crf float64
		desc        string
	}{
		{0.10, 5, 0.6209, 3.7908, 0.2638, "10 %, 5 years"},
		{0.05, 20, 0.3769, 12.4622, 0.0802, "5 %, 20 years"},
		{0.08, 10, 0.4632, 6.7101, 0.1490, "8 %, 10 years"},
		{0, 20, 1, 20, 0.05, "0 %: P/A = n"},
	}
	for _, tt := range tests {
		if got := PresentWorthFactor(tt.d, tt.n); !near(got, tt.pf, 5e-5) {
			t.Errorf("%s: P/F = %v, want %v", tt.desc, got, tt.pf)
		}
		if got := UniformSeriesPresentWorth(tt.d, tt.n); !near(got, tt.pa, 5e-5) {
			t.Errorf("%s: P/A = %v, want %v", tt.desc, got, tt.pa)
		}
		if got := CapitalRecoveryFactor(tt.d, tt.n); !near(got, tt.crf, 5e-5) {
			t.Errorf("%s: A/P = %v, want %v", tt.desc, got, tt.crf)
		}
	}
}

func TestPresentWorthFactorEscalating(t *testing.T) {
	// Own checks of Duffie & Beckman (2013) eq. 11.5.1: i = 0 gives P/A;
	// i = d gives N/(1 + i); and for i = 2 %, d = 5 %, N = 3 the factor
	// equals the direct sum of the three discounted payments 1, 1.02 and
	// 1.02² (no printed value used).
	if got, want := PresentWorthFactorEscalating(0.05, 0, 20), UniformSeriesPresentWorth(0.05, 20); !near(got, want, 1e-12) {
		t.Errorf("i = 0: %v, want %v", got, want)
	}
	if got := PresentWorthFactorEscalating(0.04, 0.04, 10); !near(got, 10/1.04, 1e-12) {
		t.Errorf("i = d: %v", got)
	}
	// Direct sum of the three discounted payments, by hand.
	sum := 1/1.05 + 1.02/(1.05*1.05) + 1.02*1.02/(1.05*1.05*1.05)
	if got := PresentWorthFactorEscalating(0.05, 0.02, 3); !near(got, sum, 1e-12) {
		t.Errorf("i = 2 %%, d = 5 %%, N = 3: %v, want %v", got, sum)
	}
}

func TestTotal(t *testing.T) {
	// Invented demo prices; sums by hand: 4·180 + 1·150 + 6·210 + 30·1.2 = 2166.
	items := []Item{
		{"array", "module", "each", 4, 180},
		{"array", "controller", "each", 1, 150},
		{"battery", "block", "each", 6, 210},
		{"wiring", "cable 10 mm²", "m", 30, 1.2},
	}
	if got := Total(items); !near(got, 2166, 1e-9) {
		t.Errorf("Total = %v, want 2166", got)
	}
	cats := ByCategory(items)
	want := []CategoryTotal{{"array", 870}, {"battery", 1260}, {"wiring", 36}}
	if len(cats) != len(want) {
		t.Fatalf("ByCategory = %+v", cats)
	}
	sum := 0.0
	for i := range want {
		if cats[i].Category != want[i].Category || !near(cats[i].Total, want[i].Total, 1e-9) {
			t.Errorf("category %d: %+v, want %+v", i, cats[i], want[i])
		}
		sum += cats[i].Total
	}
	if !near(sum, Total(items), 1e-9) {
		t.Error("categories do not add up to the total")
	}
	if Total(nil) != 0 {
		t.Error("empty list: want 0")
	}
	if err := ValidateItems(items); err != nil {
		t.Error(err)
	}
	for _, bad := range []Item{{Quantity: -1}, {UnitPrice: math.NaN()}} {
		if ValidateItems([]Item{bad}) == nil {
			t.Errorf("ValidateItems(%+v): want error", bad)
		}
	}
}

// handCase: invented demo figures; the expected values below are a hand
// computation (calculator) at d = 5 %, N = 20:
//
//	P/A = 12.462210; O&M 200 · 12.462210 = 2492.442
//	battery (life 6, 3000): years 6, 12, 18: 2238.646 + 1670.512 + 1246.562
//	controller (life 10, 500): year 10 only (20 is the end): 306.957
//	replacements 5462.677
//	salvage: battery last at 18, (18 + 6 − 20)/6 = 2/3 of 3000 = 2000;
//	inverter (life 25, 1000) never replaced, (0 + 25 − 20)/25 = 0.2 → 200;
//	controller last at 10, 10 + 10 − 20 = 0 → none; 2200 · 1.05^−20 = 829.157
//	NPC = 12000 + 2492.442 + 5462.677 − 829.157 = 19125.962
//	LCOE = 19125.962 · 0.0802426 / 1000 kWh = 1.534717 per kWh
func handCase() LifecycleInput {
	return LifecycleInput{
		Capital: 10000, Installation: 2000, OMPerYear: 200, DiscountRate: 0.05, AnalysisYears: 20,
		Replacements: []Replacement{
			{"battery bank", 6, 3000},
			{"controller", 10, 500},
			{"inverter", 25, 1000},
		},
		ServedWhPerYear: 1e6,
	}
}

func TestComputeHandCase(t *testing.T) {
	lc, err := Compute(handCase())
	if err != nil {
		t.Fatal(err)
	}
	checks := []struct {
		name      string
		got, want float64
	}{
		{"capital", lc.CapitalPW, 12000},
		{"O&M", lc.OMPW, 2492.442},
		{"replacements", lc.ReplacementsPW, 5462.677},
		{"salvage", lc.SalvagePW, 829.157},
		{"NPC", lc.NetPresentCost, 19125.962},
	}
	for _, c := range checks {
		if !near(c.got, c.want, 1e-3) {
			t.Errorf("%s = %.4f, want %.3f", c.name, c.got, c.want)
		}
	}
	if !near(lc.LevelisedCostPerKWh, 1.534717, 1e-6) {
		t.Errorf("LCOE = %v, want 1.534717", lc.LevelisedCostPerKWh)
	}
	// The rows carry the same sum, are in year order, and hold the
	// replacement years of the hand case.
	sum := 0.0
	repYears := map[string][]int{}
	for i, r := range lc.Rows {
		sum += r.PresentWorth
		if i > 0 && r.Year < lc.Rows[i-1].Year {
			t.Errorf("rows out of order at %d", i)
		}
		switch r.Item {
		case "replacement: battery bank", "replacement: controller", "replacement: inverter":
			repYears[r.Item] = append(repYears[r.Item], r.Year)
		}
	}
	if !near(sum, lc.NetPresentCost, 1e-6) {
		t.Errorf("rows sum to %v, NPC %v", sum, lc.NetPresentCost)
	}
	if got := repYears["replacement: battery bank"]; len(got) != 3 || got[0] != 6 || got[1] != 12 || got[2] != 18 {
		t.Errorf("battery replaced in %v, want [6 12 18]", got)
	}
	if got := repYears["replacement: controller"]; len(got) != 1 || got[0] != 10 {
		t.Errorf("controller replaced in %v, want [10]", got)
	}
	if got := repYears["replacement: inverter"]; len(got) != 0 {
		t.Errorf("inverter replaced in %v, want none", got)
	}
	// 2 year-0 rows + 20 O&M + 4 replacements + 2 salvage rows.
	if len(lc.Rows) != 28 {
		t.Errorf("%d rows, want 28", len(lc.Rows))
	}
}

func TestComputeCases(t *testing.T) {
	tests := []struct {
		name               string
		in                 LifecycleInput
		npc, salvage, lcoe float64
	}{
		// d = 0: no discounting; 1000 + 10·50 = 1500; battery (life 4,
		// 100) at 4 and 8, last at 8, (8 + 4 − 10)/4 = 0.5 → salvage 50;
		// NPC = 1500 + 200 − 50 = 1650; LCOE = 1650 / 10 / 100 kWh = 1.65.
		{"no discount", LifecycleInput{Capital: 1000, OMPerYear: 50, AnalysisYears: 10,
			Replacements: []Replacement{{"battery", 4, 100}}, ServedWhPerYear: 100000}, 1650, 50, 1.65},
		// Life 7.5 over 20 years: replacements at 7.5 and 15 paid in years
		// 8 and 15; last at 15, (15 + 7.5 − 20)/7.5 = 1/3 → salvage 100 at
		// d = 0; NPC = 300 + 300 − 100 = 500. By hand.
		{"fractional life", LifecycleInput{AnalysisYears: 20, Replacements: []Replacement{{"b", 7.5, 300}}}, 500, 100, 0},
		// Life equal to the period: no replacement and no salvage.
		{"life = period", LifecycleInput{Capital: 10, DiscountRate: 0.1, AnalysisYears: 5, Replacements: []Replacement{{"b", 5, 99}}}, 10, 0, 0},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			lc, err := Compute(tt.in)
			if err != nil {
				t.Fatal(err)
			}
			if !near(lc.NetPresentCost, tt.npc, 1e-9) || !near(lc.SalvagePW, tt.salvage, 1e-9) || !near(lc.LevelisedCostPerKWh, tt.lcoe, 1e-12) {
				t.Errorf("NPC %v salvage %v LCOE %v; want %v %v %v", lc.NetPresentCost, lc.SalvagePW, lc.LevelisedCostPerKWh, tt.npc, tt.salvage, tt.lcoe)
			}
		})
	}
	lc, _ := Compute(LifecycleInput{AnalysisYears: 20, Replacements: []Replacement{{"b", 7.5, 300}}})
	var years []int
	for _, r := range lc.Rows {
		if r.Item == "replacement: b" {
			years = append(years, r.Year)
		}
	}
	if len(years) != 2 || years[0] != 8 || years[1] != 15 {
		t.Errorf("fractional life replaced in %v, want [8 15]", years)
	}
}

func TestComputeInvalid(t *testing.T) {
	ok := handCase()
	mod := func(f func(*LifecycleInput)) LifecycleInput {
		c := ok
		c.Replacements = append([]Replacement(nil), ok.Replacements...)
		f(&c)
		return c
	}
	tests := []struct {
		name string
		in   LifecycleInput
	}{
		{"negative capital", mod(func(c *LifecycleInput) { c.Capital = -1 })},
		{"NaN O&M", mod(func(c *LifecycleInput) { c.OMPerYear = math.NaN() })},
		{"rate −1", mod(func(c *LifecycleInput) { c.DiscountRate = -1 })},
		{"rate in percent", mod(func(c *LifecycleInput) { c.DiscountRate = 5 })},
		{"zero years", mod(func(c *LifecycleInput) { c.AnalysisYears = 0 })},
		{"fractional years", mod(func(c *LifecycleInput) { c.AnalysisYears = 20.5 })},
		{"too many years", mod(func(c *LifecycleInput) { c.AnalysisYears = 1000 })},
		{"zero life", mod(func(c *LifecycleInput) { c.Replacements[0].LifeYears = 0 })},
		{"negative cost", mod(func(c *LifecycleInput) { c.Replacements[1].Cost = -5 })},
		{"negative energy", mod(func(c *LifecycleInput) { c.ServedWhPerYear = -1 })},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			if _, err := Compute(tt.in); !errors.Is(err, ErrInvalid) {
				t.Errorf("want ErrInvalid, got %v", err)
			}
		})
	}
}

func BenchmarkCompute(b *testing.B) {
	in := handCase()
	for b.Loop() {
		if _, err := Compute(in); err != nil {
			b.Fatal(err)
		}
	}
}
