package battery

import (
	"math"
	"strings"
	"testing"

	"solstand/caution"
)

func TestVentilationM3PerH(t *testing.T) {
	tests := []struct {
		name  string
		cells int
		gas   float64
		ah    float64
		want  float64
	}{
		// Worked case, own arithmetic with the IEC 62485-2 formula: 48 V vented
		// bank, 24 cells, 400 Ah, boost charge 20 mA/Ah:
		// 0.05 × 24 × 20 × 400 × 10⁻³ = 9.6 m³/h.
		{"vented 48 V 400 Ah", 24, GasCurrentVentedBoostMAPerAh, 400, 9.6},
		// 12 V valve-regulated, 6 cells, 200 Ah, boost 8 mA/Ah:
		// 0.05 × 6 × 8 × 200 × 10⁻³ = 0.48 m³/h.
		{"vrla 12 V 200 Ah", 6, GasCurrentVRLABoostMAPerAh, 200, 0.48},
		{"no cells", 0, 20, 400, 0},
		{"NaN", 24, math.NaN(), 400, 0},
	}
	for _, tt := range tests {
		if got := VentilationM3PerH(tt.cells, tt.gas, tt.ah); math.Abs(got-tt.want) > 1e-12 {
			t.Errorf("%s: %v m³/h, want %v", tt.name, got, tt.want)
		}
	}
	// IEC 62485-2 natural ventilation, A = 28 · Q (from memory): 9.6 m³/h → 268.8 cm².
	if got := VentilationOpeningCm2(9.6); math.Abs(got-268.8) > 1e-9 {
		t.Errorf("opening %v cm², want 268.8", got)
	}
}

func TestShortCircuitA(t *testing.T) {
	la := mustDefaults(t, Flooded)
	// Own arithmetic: 12 V blocks of 5 mΩ, 4 in series, 2 strings:
	// 48 V / (4 × 5 mΩ) = 2400 A per string, 4800 A for the bank.
	s := Sizing{BlocksSeries: 4, Strings: 2, CapacityAh: 400, SystemV: 48}
	if a, est := ShortCircuitA(la, s, Block{NominalV: 12, CapacityAh: 200, InternalResistanceMOhm: 5}); math.Abs(a-4800) > 1e-9 || est {
		t.Errorf("with resistance: %v A, estimated %v", a, est)
	}
	// Without a resistance: the rule of thumb, 10 × 200 Ah × 2 strings (common practice).
	if a, est := ShortCircuitA(la, s, Block{NominalV: 12, CapacityAh: 200}); a != 4000 || !est {
		t.Errorf("rule of thumb: %v A, estimated %v", a, est)
	}
}

func codes(cs []caution.Caution) map[string]caution.Caution {
	out := map[string]caution.Caution{}
	for _, c := range cs {
		out[c.Code] = c
	}
	return out
}

func TestCautions(t *testing.T) {
	flooded := mustDefaults(t, Flooded)
	agm := mustDefaults(t, AGM)
	lfp := mustDefaults(t, LiFePO4)
	// 48 V bank of 12 V blocks, two strings of 200 Ah, DoD 0.5.
	s := Sizing{BlocksSeries: 4, Strings: 2, CapacityAh: 400, SystemV: 48, MaxDoD: 0.5}
	blk := Block{NominalV: 12, CapacityAh: 200, InternalResistanceMOhm: 5}
	standing := []string{"battery-short-circuit", "battery-insulated-tools", "battery-no-mixing"}
	tests := []struct {
		name     string
		chem     Chemistry
		site     Site
		want     []string
		not      []string
		contains map[string][]string // code → substrings of its message
	}{
		{
			name: "flooded indoors, mild",
			chem: flooded, site: Site{Indoors: true, RoomVolumeM3: 20, RecordLowC: -10, BatteryTempC: 15},
			want: []string{"battery-acid-protection", "battery-hydrogen-ventilation"},
			not:  []string{"battery-electrolyte-freezing", "battery-bms-required", "battery-cold-charging"},
			contains: map[string][]string{
				// 0.05 × 24 × 20 × 400 × 10⁻³ = 9.6 m³/h (IEC 62485-2 formula, own arithmetic).
				"battery-hydrogen-ventilation": {"9.60 m³/h", "IEC 62485-2", "n = 24", "20 mA/Ah", "0.48 air changes"},
				// 48 V / (4 × 5 mΩ) × 2 = 4800 A (own arithmetic).
				"battery-short-circuit": {"4800 A", "interrupting"},
			},
		},
		{
			// 50 % DoD: freezes near −25 °C (common practice, from memory, SOURCES.md); record low −30 °C.
			name: "flooded outdoors, freezing",
			chem: flooded, site: Site{RecordLowC: -30, BatteryTempC: -5},
			want: []string{"battery-electrolyte-freezing", "battery-hydrogen-enclosure"},
			not:  []string{"battery-hydrogen-ventilation"},
		},
		{
			// −20 °C stays above the −25 °C freezing point at 50 % DoD.
			name: "agm indoors, cold but not freezing",
			chem: agm, site: Site{Indoors: true, RecordLowC: -20, BatteryTempC: 5},
			want: []string{"battery-hydrogen-ventilation"},
			not:  []string{"battery-electrolyte-freezing"},
			contains: map[string][]string{
				// valve-regulated boost 8 mA/Ah (IEC 62485-2, from memory): 0.05 × 24 × 8 × 400 × 10⁻³ = 3.84 m³/h.
				"battery-hydrogen-ventilation": {"3.84 m³/h", "valve-regulated"},
			},
		},
		{
			// LiFePO4 is not charged below 0 °C (common practice, SOURCES.md).
			name: "lifepo4 cold",
			chem: lfp, site: Site{Indoors: true, RecordLowC: -5, BatteryTempC: 8},
			want: []string{"battery-bms-required", "battery-cold-charging", "battery-thermal-runaway"},
			not:  []string{"battery-acid-protection", "battery-hydrogen-ventilation", "battery-electrolyte-freezing"},
			contains: map[string][]string{
				"battery-cold-charging": {"low-temperature charge cut-off", "heated"},
			},
		},
		{
			name: "lifepo4 warm site",
			chem: lfp, site: Site{Indoors: true, RecordLowC: 5, BatteryTempC: 20},
			want: []string{"battery-bms-required", "battery-thermal-runaway"},
			not:  []string{"battery-cold-charging"},
		},
		{
			name: "lifepo4, bank in a cold spot",
			chem: lfp, site: Site{Indoors: true, RecordLowC: 5, BatteryTempC: -2},
			want: []string{"battery-cold-charging"},
		},
		{
			name: "hot location",
			chem: agm, site: Site{RecordLowC: 10, BatteryTempC: 38},
			want: []string{"battery-hot-location"},
		},
	}
	for _, tt := range tests {
		got := codes(Cautions(tt.chem, s, blk, tt.site))
		for _, c := range append(append([]string(nil), standing...), tt.want...) {
			if _, ok := got[c]; !ok {
				t.Errorf("%s: no %s (have %v)", tt.name, c, keys(got))
			}
		}
		for _, c := range tt.not {
			if _, ok := got[c]; ok {
				t.Errorf("%s: unexpected %s", tt.name, c)
			}
		}
		for code, subs := range tt.contains {
			for _, sub := range subs {
				if !strings.Contains(got[code].Message, sub) {
					t.Errorf("%s: %s message lacks %q: %s", tt.name, code, sub, got[code].Message)
				}
			}
		}
		for _, c := range got {
			if c.Message == "" || (c.Severity != caution.Info && c.Severity != caution.Warning && c.Severity != caution.Danger) {
				t.Errorf("%s: bad caution %+v", tt.name, c)
			}
		}
		if got["battery-short-circuit"].Severity != caution.Danger {
			t.Errorf("%s: short-circuit severity %q", tt.name, got["battery-short-circuit"].Severity)
		}
		if c, ok := got["battery-electrolyte-freezing"]; ok && c.Severity != caution.Danger {
			t.Errorf("%s: freezing severity %q", tt.name, c.Severity)
		}
	}
}

func keys(m map[string]caution.Caution) []string {
	var out []string
	for k := range m {
		out = append(out, k)
	}
	return out
}

func TestRoundSig(t *testing.T) {
	for _, tt := range []struct {
		v    float64
		want string
	}{{4800, "4800"}, {12345.6, "12300"}, {400, "400"}, {9.6, "9.60"}, {0.04815, "0.0482"}} {
		if got := roundSig(tt.v); got != tt.want {
			t.Errorf("roundSig(%v) = %q, want %q", tt.v, got, tt.want)
		}
	}
}
