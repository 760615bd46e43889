package battery

import (
	"math"
	"testing"

	"solstand/caution"
)

func mustDefaults(t testing.TB, k Kind) Chemistry {
	t.Helper()
	c, err := Defaults(k)
	if err != nil {
		t.Fatal(err)
	}
	return c
}

func hasCode(cs []caution.Caution, code string) bool {
	for _, c := range cs {
		if c.Code == code {
			return true
		}
	}
	return false
}

func TestSizeHandComputed(t *testing.T) {
	flooded := mustDefaults(t, Flooded)
	agm := mustDefaults(t, AGM)
	lfp := mustDefaults(t, LiFePO4)
	tests := []struct {
		name                        string
		in                          SizingInput
		requiredWh, tf, rf          float64
		series, strings             int
		capacityAh, capWh, usableWh float64
		manyStrings                 bool
	}{
		{
			// 2400 Wh × 3 days / (0.5 × 1 × 1 × 0.95) = 7200 / 0.475 = 15157.8947 Wh;
			// / 24 V = 631.579 Ah; 24 V / 6 V = 4 in series; ceil(631.579 / 225) = 3 strings;
			// 675 Ah × 24 V = 16200 Wh; usable 16200 × 0.5 × 1 = 8100 Wh.
			// 25 °C: temperature factor 1 (IEEE 485); 72 h against a 20 h rating:
			// Peukert gives more than 1, not credited, so 1.
			name: "flooded 24 V at 25 °C",
			in: SizingInput{DailyDemandWh: 2400, AutonomyDays: 3, SystemV: 24, TempC: 25, Chem: flooded,
				Block: Block{NominalV: 6, CapacityAh: 225, RatedHours: 20}},
			requiredWh: 7200 / 0.475, tf: 1, rf: 1, series: 4, strings: 3,
			capacityAh: 675, capWh: 16200, usableWh: 8100,
		},
		{
			// Same bank with the long-discharge credit: rate factor (72/20)^(1−1/1.25)
			// = 3.6^0.2 = 1.291994; 7200 / (0.5 × 0.95 × 1.291994) = 11732.171 Wh;
			// / 24 = 488.84 Ah; ceil(488.84 / 225) = 3 strings.
			name: "flooded with long-discharge credit",
			in: SizingInput{DailyDemandWh: 2400, AutonomyDays: 3, SystemV: 24, TempC: 25, Chem: flooded,
				Block: Block{NominalV: 6, CapacityAh: 225, RatedHours: 20}, CreditLongDischarge: true},
			requiredWh: 11732.17106274558, tf: 1, rf: 1.2919940099556333, series: 4, strings: 3,
			capacityAh: 675, capWh: 16200, usableWh: 8100,
		},
		{
			// AGM at 10 °C: temperature factor 1/1.19 = 0.840336 (IEEE 485 table as
			// coded); 10 h discharge against a 20 h rating: 0.5^(1−1/1.1) = 0.938931;
			// 1200 × 2 / (0.5 × 0.840336 × 0.938931 × 0.95) = 2400 / 0.374783 = 6403.70 Wh;
			// / 12 V = 533.64 Ah; ceil(533.64 / 100) = 6 strings of one 12 V block.
			// 600 Ah × 12 V = 7200 Wh; usable 7200 × 0.5 × 0.840336 = 3025.21 Wh.
			name: "agm 12 V cold, short discharge",
			in: SizingInput{DailyDemandWh: 1200, AutonomyDays: 2, SystemV: 12, TempC: 10, AutonomyHours: 10, Chem: agm,
				Block: Block{NominalV: 12, CapacityAh: 100, RatedHours: 20}},
			requiredWh: 6403.699687243228, tf: 1 / 1.19, rf: math.Pow(0.5, 1-1/1.1), series: 1, strings: 6,
			capacityAh: 600, capWh: 7200, usableWh: 7200 * 0.5 * (1 / 1.19), manyStrings: true,
		},
		{
			// LiFePO4 51.2 V from 12.8 V blocks, DoD 0.8 and efficiency 0.98 (defaults),
			// 20 °C: factor 0.96 + (20−10)/(25−10) × 0.04 = 0.986667 (curve as coded);
			// 5000 × 2 / (0.8 × 0.986667 × 1 × 0.98) = 10000 / 0.773547 = 12927.4 Wh;
			// / 51.2 = 252.49 Ah; ceil(252.49 / 100) = 3 strings; 300 Ah × 51.2 = 15360 Wh;
			// usable 15360 × 0.8 × 0.986667 = 12124.16 Wh. No rated hours: rate factor 1.
			name: "lifepo4 51.2 V",
			in: SizingInput{DailyDemandWh: 5000, AutonomyDays: 2, SystemV: 51.2, TempC: 20, Chem: lfp,
				Block: Block{NominalV: 12.8, CapacityAh: 100}},
			requiredWh: 10000 / (0.8 * (0.96 + 0.04*10.0/15) * 0.98), tf: 0.96 + 0.04*10.0/15, rf: 1, series: 4, strings: 3,
			capacityAh: 300, capWh: 15360, usableWh: 15360 * 0.8 * (0.96 + 0.04*10.0/15),
		},
		{
			// Warm bank (35 °C): IEEE 485 would give more than 1; no credit is taken.
			// MaxDoD 0.6 and efficiency 0.9 given: 1000 / (0.6 × 0.9) = 1851.85 Wh;
			// / 12 = 154.32 Ah; one string of 200 Ah; usable 2400 × 0.6 = 1440 Wh.
			name: "warm, explicit dod and efficiency",
			in: SizingInput{DailyDemandWh: 1000, AutonomyDays: 1, MaxDoD: 0.6, DischargeEfficiency: 0.9, SystemV: 12, TempC: 35,
				Chem: flooded, Block: Block{NominalV: 2, CapacityAh: 200, RatedHours: 10}},
			requiredWh: 1000 / (0.6 * 0.9), tf: 1, rf: 1, series: 6, strings: 1,
			capacityAh: 200, capWh: 2400, usableWh: 1440,
		},
	}
	for _, tt := range tests {
		s, err := Size(tt.in)
		if err != nil {
			t.Fatalf("%s: %v", tt.name, err)
		}
		near := func(what string, got, want float64) {
			if math.Abs(got-want) > 1e-6*math.Max(1, math.Abs(want)) {
				t.Errorf("%s: %s = %.9g, want %.9g", tt.name, what, got, want)
			}
		}
		near("RequiredWh", s.RequiredWh, tt.requiredWh)
		near("RequiredAh", s.RequiredAh, tt.requiredWh/tt.in.SystemV)
		near("TempFactor", s.TempFactor, tt.tf)
		near("RateFactor", s.RateFactor, tt.rf)
		near("CapacityAh", s.CapacityAh, tt.capacityAh)
		near("CapacityWh", s.CapacityWh, tt.capWh)
		near("UsableWh", s.UsableWh, tt.usableWh)
		if s.BlocksSeries != tt.series || s.Strings != tt.strings || s.Blocks != tt.series*tt.strings {
			t.Errorf("%s: layout %d×%d (%d), want %d×%d", tt.name, s.BlocksSeries, s.Strings, s.Blocks, tt.series, tt.strings)
		}
		if got := hasCode(s.Cautions, "battery-many-strings"); got != tt.manyStrings {
			t.Errorf("%s: battery-many-strings caution = %v, want %v", tt.name, got, tt.manyStrings)
		}
	}
}

func TestSizeExactMultiple(t *testing.T) {
	// 1200 Wh × 1 day / (0.5 × 1 × 1 × 1) = 2400 Wh = 200 Ah at 12 V: exactly two
	// 100 Ah strings, not three from float rounding.
	c := mustDefaults(t, Flooded)
	s, err := Size(SizingInput{DailyDemandWh: 1200, AutonomyDays: 1, MaxDoD: 0.5, DischargeEfficiency: 1, SystemV: 12, TempC: 25,
		Chem: c, Block: Block{NominalV: 12, CapacityAh: 100}})
	if err != nil || s.Strings != 2 {
		t.Errorf("strings = %d, %v; want 2", s.Strings, err)
	}
}

func TestSizeErrors(t *testing.T) {
	c := mustDefaults(t, Flooded)
	good := SizingInput{DailyDemandWh: 1000, AutonomyDays: 3, SystemV: 24, TempC: 20, Chem: c,
		Block: Block{NominalV: 12, CapacityAh: 100, RatedHours: 20}}
	tests := []struct {
		name string
		edit func(*SizingInput)
	}{
		{"negative demand", func(in *SizingInput) { in.DailyDemandWh = -1 }},
		{"NaN demand", func(in *SizingInput) { in.DailyDemandWh = math.NaN() }},
		{"zero autonomy", func(in *SizingInput) { in.AutonomyDays = 0 }},
		{"zero voltage", func(in *SizingInput) { in.SystemV = 0 }},
		{"not whole blocks", func(in *SizingInput) { in.SystemV = 30 }},
		{"block voltage above system", func(in *SizingInput) { in.Block.NominalV = 48 }},
		{"zero block Ah", func(in *SizingInput) { in.Block.CapacityAh = 0 }},
		{"dod above one", func(in *SizingInput) { in.MaxDoD = 1.5 }},
		{"efficiency above one", func(in *SizingInput) { in.DischargeEfficiency = 1.5 }},
		{"negative rated hours", func(in *SizingInput) { in.Block.RatedHours = -20 }},
		{"Inf temperature", func(in *SizingInput) { in.TempC = math.Inf(-1) }},
		{"bad Peukert exponent", func(in *SizingInput) { in.Chem.PeukertExponent = 0.5 }},
		{"empty chemistry", func(in *SizingInput) { in.Chem = Chemistry{} }},
	}
	if _, err := Size(good); err != nil {
		t.Fatalf("good input: %v", err)
	}
	for _, tt := range tests {
		in := good
		tt.edit(&in)
		if _, err := Size(in); err == nil {
			t.Errorf("%s: no error", tt.name)
		}
	}
}

func TestCheckCharge(t *testing.T) {
	la := mustDefaults(t, Flooded)
	lfp := mustDefaults(t, LiFePO4)
	// A 400 Ah bank of two strings of 200 Ah blocks.
	s := Sizing{CapacityAh: 400, Strings: 2, BlocksSeries: 2}
	blk := Block{NominalV: 12, CapacityAh: 200, MaxChargeA: 30}
	tests := []struct {
		name  string
		chem  Chemistry
		amps  float64
		rateC float64
		codes []string
	}{
		// 10 A / 400 Ah = 0.025 = C/40 < C/20 (common practice window, issue 5).
		{"too little", la, 10, 0.025, []string{"battery-charge-rate-low"}},
		// 40 A / 400 Ah = 0.1 inside C/20..C/5; 20 A per string < 30 A.
		{"inside", la, 40, 0.1, nil},
		// 100 A / 400 Ah = 0.25 > C/5; 50 A per string > 30 A block maximum.
		{"too much", la, 100, 0.25, []string{"battery-charge-rate-high", "battery-charge-current-over-block"}},
		// LiFePO4 has no lower limit: 10 A is fine.
		{"lfp low", lfp, 10, 0.025, nil},
	}
	for _, tt := range tests {
		c := CheckCharge(tt.chem, s, blk, tt.amps)
		if math.Abs(c.ChargeRateC-tt.rateC) > 1e-12 {
			t.Errorf("%s: rate %v, want %v", tt.name, c.ChargeRateC, tt.rateC)
		}
		if len(c.Cautions) != len(tt.codes) {
			t.Errorf("%s: cautions %v, want %v", tt.name, c.Cautions, tt.codes)
		}
		for _, code := range tt.codes {
			if !hasCode(c.Cautions, code) {
				t.Errorf("%s: no %s", tt.name, code)
			}
		}
	}
	if c := CheckCharge(la, Sizing{}, blk, 10); len(c.Cautions) != 0 || c.ChargeRateC != 0 {
		t.Errorf("empty bank: %+v", c)
	}
}
