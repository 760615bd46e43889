package battery

import (
	"math"
	"testing"
)

// countByRange sums the counts of cycles per range (rounded to 1e-9).
func countByRange(cs []Cycle) map[float64]float64 {
	out := map[float64]float64{}
	for _, c := range cs {
		out[math.Round(c.Range*1e9)/1e9] += c.Count
	}
	return out
}

func TestRainflowASTM(t *testing.T) {
	// ASTM E1049-85 §5.4.4 worked example (SOURCES.md): history −2, 1, −3, 5,
	// −1, 3, −4, 4, −2 gives ranges 3 (½), 4 (1½), 6 (½), 8 (1), 9 (½).
	got := countByRange(Rainflow([]float64{-2, 1, -3, 5, -1, 3, -4, 4, -2}))
	want := map[float64]float64{3: 0.5, 4: 1.5, 6: 0.5, 8: 1, 9: 0.5}
	if len(got) != len(want) {
		t.Fatalf("ranges %v, want %v", got, want)
	}
	for r, n := range want {
		if got[r] != n {
			t.Errorf("range %v: count %v, want %v (all: %v)", r, got[r], n, got)
		}
	}
}

func TestRainflowSimple(t *testing.T) {
	tests := []struct {
		name   string
		series []float64
		want   map[float64]float64
	}{
		{"empty", nil, map[float64]float64{}},
		{"one point", []float64{0.5}, map[float64]float64{}},
		{"constant", []float64{1, 1, 1}, map[float64]float64{}},
		// A single fall is one half cycle of its range.
		{"monotone", []float64{1, 0.9, 0.7, 0.4}, map[float64]float64{0.6: 0.5}},
		// Intermediate points on a slope, repeats and NaN are not turning points.
		{"plateaus", []float64{1, 1, 0.5, math.NaN(), 0.5, 0.2, 0.6, 1}, map[float64]float64{0.8: 1}},
		// A small cycle inside a large one is counted as a full cycle
		// (own count by the §5.4.4 steps): 0, 10, 4, 6, 0 → 2 (1), 10 (½ + ½).
		{"nested", []float64{0, 10, 4, 6, 0}, map[float64]float64{2: 1, 10: 1}},
	}
	for _, tt := range tests {
		got := countByRange(Rainflow(tt.series))
		if len(got) != len(tt.want) {
			t.Errorf("%s: %v, want %v", tt.name, got, tt.want)
			continue
		}
		for r, n := range tt.want {
			if got[r] != n {
				t.Errorf("%s: range %v count %v, want %v", tt.name, r, got[r], n)
			}
		}
	}
}

func FuzzRainflow(f *testing.F) {
	f.Add(-2.0, 1.0, -3.0, 5.0, -1.0, 3.0)
	f.Add(0.0, 0.0, 0.0, 1.0, 1.0, 0.0)
	f.Fuzz(func(t *testing.T, a, b, c, d, e, g float64) {
		series := []float64{a, b, c, d, e, g}
		lo, hi := math.Inf(1), math.Inf(-1)
		for _, v := range series {
			if !math.IsNaN(v) && !math.IsInf(v, 0) {
				lo, hi = math.Min(lo, v), math.Max(hi, v)
			}
		}
		for _, cy := range Rainflow(series) {
			if cy.Count != 0.5 && cy.Count != 1 {
				t.Fatalf("count %v", cy.Count)
			}
			if !(cy.Range >= 0) || cy.Range > (hi-lo)*(1+1e-12) {
				t.Fatalf("range %v outside 0..%v", cy.Range, hi-lo)
			}
		}
	})
}

func TestCyclesToFailure(t *testing.T) {
	curve := []CyclePoint{{0.2, 3000}, {0.5, 1500}, {0.8, 800}, {1.0, 500}}
	shuffled := []CyclePoint{{0.8, 800}, {0.2, 3000}, {1.0, 500}, {0.5, 1500}, {0, 10}}
	tests := []struct {
		name  string
		curve []CyclePoint
		dod   float64
		want  float64
	}{
		{"at a point", curve, 0.5, 1500},
		{"at the end", curve, 1.0, 500},
		// Own computation of the log-log interpolation:
		// 1500 × (0.65/0.5)^(ln(800/1500)/ln(0.8/0.5)) = 1056.0808.
		{"between", curve, 0.65, 1056.0808402620687},
		{"unsorted, with a bad point", shuffled, 0.65, 1056.0808402620687},
		// Extrapolated below the curve with the first segment's slope:
		// 3000 × (0.1/0.2)^(ln(1500/3000)/ln(0.5/0.2)) (own computation).
		{"below", curve, 0.1, 3000 * math.Pow(0.5, math.Log(0.5)/math.Log(2.5))},
		// One point: constant throughput, 1000 cycles × 0.5 = 500 at DoD 0.25 → 2000.
		{"one point", []CyclePoint{{0.5, 1000}}, 0.25, 2000},
		{"empty", nil, 0.5, math.Inf(1)},
		{"no depth", curve, 0, math.Inf(1)},
	}
	for _, tt := range tests {
		got := CyclesToFailure(tt.curve, tt.dod)
		if math.IsInf(tt.want, 1) {
			if !math.IsInf(got, 1) {
				t.Errorf("%s: %v, want +Inf", tt.name, got)
			}
			continue
		}
		if math.Abs(got-tt.want) > 1e-9*tt.want {
			t.Errorf("%s: %v, want %v", tt.name, got, tt.want)
		}
	}
}

// dailyCycles returns a state-of-charge trace of n cycles from 1 down to
// 1 − dod and back, one sample at each turning point.
func dailyCycles(n int, dod float64) []float64 {
	out := []float64{1}
	for i := 0; i < n; i++ {
		out = append(out, 1-dod, 1)
	}
	return out
}

func TestEstimateLifeMiner(t *testing.T) {
	chem := mustDefaults(t, Flooded) // curve 0.2: 3000, 0.5: 1500, 0.8: 800, 1.0: 500; calendar 12 years
	tests := []struct {
		name                           string
		series                         []float64
		years                          float64
		damagePerYear, expected, efcPY float64
	}{
		// Own computation by Miner's rule: 365 cycles of DoD 0.5 per year at 1500
		// cycles to failure: 365/1500 = 0.24333 per year → 4.1096 years (< 12
		// calendar); 365 × 0.5 = 182.5 equivalent full cycles per year.
		{"daily 50 %", dailyCycles(365, 0.5), 1, 365.0 / 1500, 1500.0 / 365, 182.5},
		// Two years of the same daily cycles: the same rates.
		{"two years", dailyCycles(730, 0.5), 2, 365.0 / 1500, 1500.0 / 365, 182.5},
		// 100 cycles at 0.8 then 300 at 0.2 in one year: 100/800 + 300/3000 =
		// 0.225 → 4.444 years; throughput 80 + 60 = 140 full cycles.
		{"mixed", append(dailyCycles(100, 0.8), dailyCycles(300, 0.2)[1:]...), 1, 0.225, 1 / 0.225, 140},
		// Shallow cycles: 365 × 0.2 cycles per year: 365/3000 = 0.12167 → 8.22
		// years; still shorter than the 12-year calendar life.
		{"daily 20 %", dailyCycles(365, 0.2), 1, 365.0 / 3000, 3000.0 / 365, 73},
		// Almost no cycling: calendar life decides.
		{"idle", []float64{1, 0.98, 1}, 1, 1.0 / CyclesToFailure(chem.CycleLife, 0.02), 12, 0.02},
	}
	for _, tt := range tests {
		l := EstimateLife(chem, tt.series, tt.years)
		if math.Abs(l.CycleDamagePerYear-tt.damagePerYear) > 1e-9*tt.damagePerYear {
			t.Errorf("%s: damage/year %v, want %v", tt.name, l.CycleDamagePerYear, tt.damagePerYear)
		}
		if math.Abs(l.ExpectedLifeYears-tt.expected) > 1e-9*tt.expected {
			t.Errorf("%s: life %v, want %v", tt.name, l.ExpectedLifeYears, tt.expected)
		}
		if math.Abs(l.EquivalentFullCyclesPerYear-tt.efcPY) > 1e-9*tt.efcPY {
			t.Errorf("%s: full cycles/year %v, want %v", tt.name, l.EquivalentFullCyclesPerYear, tt.efcPY)
		}
		if l.CalendarLifeYears != 12 || l.ExpectedLifeYears != math.Min(l.CycleLifeYears, 12) {
			t.Errorf("%s: %+v", tt.name, l)
		}
	}
	// No simulated time: no cycle damage; no calendar life given: +Inf.
	c := chem
	c.CalendarLifeYears = 0
	if l := EstimateLife(c, dailyCycles(10, 0.5), 0); l.CycleDamagePerYear != 0 || !math.IsInf(l.ExpectedLifeYears, 1) {
		t.Errorf("no time: %+v", l)
	}
}

func TestReplacementYears(t *testing.T) {
	tests := []struct {
		life, period float64
		want         []float64
	}{
		{5, 20, []float64{5, 10, 15}}, // a bank ending with the period is not replaced
		{6, 20, []float64{6, 12, 18}},
		{25, 20, nil},
		{0, 20, nil},
		{math.Inf(1), 20, nil},
		{math.NaN(), 20, nil},
		{5, 0, nil},
	}
	for _, tt := range tests {
		got := ReplacementYears(tt.life, tt.period)
		if len(got) != len(tt.want) {
			t.Errorf("ReplacementYears(%v, %v) = %v, want %v", tt.life, tt.period, got, tt.want)
			continue
		}
		for i := range got {
			if math.Abs(got[i]-tt.want[i]) > 1e-12 {
				t.Errorf("ReplacementYears(%v, %v) = %v, want %v", tt.life, tt.period, got, tt.want)
			}
		}
	}
	if n := len(ReplacementYears(1e-9, 1e9)); n != maxReplacements {
		t.Errorf("unbounded schedule: %d entries", n)
	}
}
