package battery

import (
	"math"
	"testing"
)

func TestDefaults(t *testing.T) {
	for _, k := range Kinds() {
		c, err := Defaults(k)
		if err != nil {
			t.Fatalf("Defaults(%q): %v", k, err)
		}
		if c.Kind != k {
			t.Errorf("Defaults(%q).Kind = %q", k, c.Kind)
		}
		if err := c.Validate(); err != nil {
			t.Errorf("Defaults(%q) does not validate: %v", k, err)
		}
		if c.LeadAcid != k.IsLeadAcid() {
			t.Errorf("Defaults(%q).LeadAcid = %v", k, c.LeadAcid)
		}
		// A cycle-life curve falls as the depth of discharge grows.
		for i := 1; i < len(c.CycleLife); i++ {
			if !(c.CycleLife[i].DoD > c.CycleLife[i-1].DoD && c.CycleLife[i].Cycles < c.CycleLife[i-1].Cycles) {
				t.Errorf("Defaults(%q).CycleLife not falling at %d: %v", k, i, c.CycleLife)
			}
		}
		if c.FloatVPerCell >= c.AbsorptionVPerCell {
			t.Errorf("Defaults(%q): float %v V ≥ absorption %v V", k, c.FloatVPerCell, c.AbsorptionVPerCell)
		}
	}
	lfp, _ := Defaults(LiFePO4)
	if lfp.ChargeMinTempC != 0 { // common practice (SOURCES.md): LiFePO4 is not charged below 0 °C
		t.Errorf("LiFePO4 ChargeMinTempC = %v, want 0", lfp.ChargeMinTempC)
	}
	fl, _ := Defaults(Flooded)
	if fl.ChargeMinC != 0.05 || fl.ChargeMaxC != 0.2 { // common practice (issue 5): C/20..C/5 for lead-acid
		t.Errorf("flooded charge window = %v..%v, want 0.05..0.2", fl.ChargeMinC, fl.ChargeMaxC)
	}
	if _, err := Defaults("nicad"); err == nil {
		t.Error("Defaults(nicad): no error")
	}
}

func TestValidateRejects(t *testing.T) {
	base, _ := Defaults(AGM)
	tests := []struct {
		name string
		edit func(*Chemistry)
	}{
		{"dod zero", func(c *Chemistry) { c.MaxDoD = 0 }},
		{"dod over one", func(c *Chemistry) { c.MaxDoD = 1.2 }},
		{"efficiency NaN", func(c *Chemistry) { c.ChargeEfficiency = math.NaN() }},
		{"self discharge negative", func(c *Chemistry) { c.SelfDischargePerMonth = -0.1 }},
		{"cycle point bad", func(c *Chemistry) { c.CycleLife = []CyclePoint{{DoD: 0, Cycles: 100}} }},
		{"calendar negative", func(c *Chemistry) { c.CalendarLifeYears = -1 }},
		{"peukert below one", func(c *Chemistry) { c.PeukertExponent = 0.9 }},
	}
	for _, tt := range tests {
		c := base
		c.CycleLife = append([]CyclePoint(nil), base.CycleLife...)
		tt.edit(&c)
		if err := c.Validate(); err == nil {
			t.Errorf("%s: no error", tt.name)
		}
	}
}

func TestTemperatureFactorIEEE485(t *testing.T) {
	// IEEE 485 cell-size correction factors F (SOURCES.md, from memory, ±1 %);
	// the available capacity is 1/F.
	tests := []struct {
		tempC, f float64
	}{
		{25, 1.00},   // IEEE 485, from memory
		{15.6, 1.11}, // IEEE 485 (60 °F), from memory
		{10, 1.19},   // IEEE 485 (50 °F), from memory
		{4.4, 1.30},  // IEEE 485 (40 °F), from memory
	}
	for _, k := range []Kind{Flooded, AGM, Gel} {
		for _, tt := range tests {
			got := TemperatureFactor(k, tt.tempC)
			want := 1 / tt.f
			if math.Abs(got-want) > 0.01*want {
				t.Errorf("TemperatureFactor(%s, %v) = %.4f, want %.4f ±1 %%", k, tt.tempC, got, want)
			}
		}
	}
}

func TestTemperatureFactorShape(t *testing.T) {
	// Monotonic in temperature over the whole range, for every kind, and finite
	// far outside the tables (no table source: a property check).
	for _, k := range Kinds() {
		prev := 0.0
		for tc := -60.0; tc <= 70; tc += 0.5 {
			f := TemperatureFactor(k, tc)
			if !(f > 0) || math.IsInf(f, 0) || f < prev-1e-12 {
				t.Fatalf("TemperatureFactor(%s, %v) = %v after %v", k, tc, f, prev)
			}
			prev = f
		}
	}
	// LiFePO4 curve points (common practice, from memory; the curve's own
	// defining points, ±0.01).
	for _, tt := range []struct{ tempC, want float64 }{{-20, 0.70}, {0, 0.90}, {25, 1.0}, {40, 1.0}} {
		if got := TemperatureFactor(LiFePO4, tt.tempC); math.Abs(got-tt.want) > 0.01 {
			t.Errorf("TemperatureFactor(lifepo4, %v) = %v, want %v", tt.tempC, got, tt.want)
		}
	}
	if !math.IsNaN(TemperatureFactor(Flooded, math.NaN())) {
		t.Error("TemperatureFactor(NaN) is not NaN")
	}
}

func TestFreezingPointC(t *testing.T) {
	tests := []struct {
		kind    Kind
		soc     float64
		want    float64
		freezes bool
	}{
		{Flooded, 1.0, -57, true}, // common practice, from memory (SOURCES.md)
		{Flooded, 0.5, -25, true}, // common practice, from memory (SOURCES.md)
		{AGM, 0.0, -7, true},      // common practice, from memory (SOURCES.md)
		{Gel, 0.75, -41, true},    // own computation: linear between the −25 °C and −57 °C points
		{Flooded, -0.2, -7, true}, // clamped to a discharged bank
		{Flooded, 1.5, -57, true}, // clamped to a full bank
	}
	for _, tt := range tests {
		got, ok := FreezingPointC(tt.kind, tt.soc)
		if ok != tt.freezes || math.Abs(got-tt.want) > 1e-9 {
			t.Errorf("FreezingPointC(%s, %v) = %v, %v; want %v, %v", tt.kind, tt.soc, got, ok, tt.want, tt.freezes)
		}
	}
	if got, ok := FreezingPointC(LiFePO4, 0.2); ok || !math.IsInf(got, -1) {
		t.Errorf("FreezingPointC(lifepo4) = %v, %v; want -Inf, false", got, ok)
	}
}

func TestPeukertCapacityAh(t *testing.T) {
	tests := []struct {
		name                       string
		ratedAh, ratedH, dischH, k float64
		want                       float64
	}{
		// Own computation from Peukert (1897): C_T = C_H (T/H)^(1−1/k);
		// 100 Ah at 20 h, k = 1.2, over 5 h: 100 × (1/4)^(1/6) = 100 × 2^(−1/3) = 79.370 Ah.
		{"faster than rated", 100, 20, 5, 1.2, 100 * math.Pow(2, -1.0/3)},
		// Own computation: k = 1.25, 3.6 times the rated hours: (3.6)^0.2 = 1.29199.
		{"slower than rated", 1, 20, 72, 1.25, 1.2919940099556333},
		// k = 1 is an ideal battery: the capacity does not depend on the rate.
		{"ideal", 200, 10, 100, 1, 200},
		{"rated", 120, 20, 20, 1.3, 120},
	}
	for _, tt := range tests {
		got := PeukertCapacityAh(tt.ratedAh, tt.ratedH, tt.dischH, tt.k)
		if math.Abs(got-tt.want) > 1e-9*tt.want {
			t.Errorf("%s: PeukertCapacityAh = %.9f, want %.9f", tt.name, got, tt.want)
		}
		// Peukert's law itself: I^k·t is the same at both rates.
		iRated, iT := tt.ratedAh/tt.ratedH, got/tt.dischH
		if a, b := math.Pow(iRated, tt.k)*tt.ratedH, math.Pow(iT, tt.k)*tt.dischH; math.Abs(a-b) > 1e-9*a {
			t.Errorf("%s: I^k·t %v vs %v", tt.name, a, b)
		}
	}
	for _, bad := range [][4]float64{{0, 20, 5, 1.2}, {100, 0, 5, 1.2}, {100, 20, -1, 1.2}, {100, 20, 5, 0.9}, {math.NaN(), 20, 5, 1.2}} {
		if got := PeukertCapacityAh(bad[0], bad[1], bad[2], bad[3]); !math.IsNaN(got) {
			t.Errorf("PeukertCapacityAh(%v) = %v, want NaN", bad, got)
		}
	}
}
