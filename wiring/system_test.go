package wiring

import (
	"errors"
	"math"
	"testing"

	"solstand/caution"
)

// demoSystem is an invented demo scenario (24 V bank, three strings, an
// inverter and two DC branches); the checks below are computed by hand from
// it with the rules named beside them.
func demoSystem() SystemCircuits {
	return SystemCircuits{
		Standard: IEC, Class: 5,
		ModuleIscA: 9.5, ModuleImpA: 9.0, ModuleMaxSeriesFuseA: 20,
		Strings: 3, PVOperatingV: 70, PVMaxV: 90,
		PVStringOneWayM: 10, ArrayToControllerOneWayM: 15, PVMaxDropPct: 3,
		ControllerRatedA: 40, ControllerToBatteryOneWayM: 2,
		BatteryNominalV: 24, BlocksSeries: 12, BatteryStrings: 1, BlockInternalResistanceOhm: 0.0005,
		BatteryMaxDropPct:   1.5,
		InverterContinuousW: 1500, InverterEfficiency: 0.9, LowVoltageDisconnectV: 22, BatteryToInverterOneWayM: 2,
		BatteryToDCPanelOneWayM: 5,
		Branches:                []Branch{{Name: "lights", CurrentA: 3, OneWayLengthM: 15}, {Name: "fridge", CurrentA: 5, OneWayLengthM: 8}},
		BranchMaxDropPct:        3,
	}
}

func TestDesignSystemDemo(t *testing.T) {
	d, err := DesignSystem(demoSystem())
	if err != nil {
		t.Fatal(err)
	}
	// Conductors, by hand with IEC 60228 Table 3 resistances (from memory)
	// and R_max = V · pct/100 · 1000 / (2 · L · I_drop):
	wantSize := map[string]struct {
		label   string
		limited string
	}{
		// 70 V · 3 % = 2.1 V; 2100/(2·10·9) = 11.67 Ω/km → 2.5 mm² (7.98).
		CircuitPVString: {"2.5 mm²", LimitedByDrop},
		// 2100/(2·15·27) = 2.59 Ω/km → 10 mm² (1.91); 6 mm² 3.30 fails.
		CircuitArray: {"10 mm²", LimitedByDrop},
		// 24 V · 1.5 % = 0.36 V; 360/(2·2·40) = 2.25 → 10 mm²; 50 A also
		// needs 10 mm² (6 mm² carries 46 A, IEC 60364-5-52, from memory).
		CircuitControllerBatt: {"10 mm²", LimitedByAmpacity},
		// 1500/(22·0.9) = 75.76 A; 22 · 1.5 % = 0.33 V; 330/(2·2·75.76)
		// = 1.089 → 25 mm² (0.780); 94.70 A also needs 25 mm² (16: 85 A).
		CircuitInverter: {"25 mm²", LimitedByAmpacity},
		// 8 A; 360/(2·5·8) = 4.5 → 6 mm² (3.30); 4 mm² 4.95 fails.
		CircuitDCPanel: {"6 mm²", LimitedByDrop},
		// 24 · 3 % = 0.72 V; 720/(2·15·3) = 8 → 2.5 mm² (7.98).
		"DC branch: lights": {"2.5 mm²", LimitedByDrop},
		// 720/(2·8·5) = 9 → 2.5 mm².
		"DC branch: fridge": {"2.5 mm²", LimitedByDrop},
	}
	if len(d.Circuits) != len(wantSize) {
		t.Fatalf("%d circuits, want %d", len(d.Circuits), len(wantSize))
	}
	for _, ch := range d.Circuits {
		w := wantSize[ch.Circuit.Name]
		if ch.Size.Label != w.label || ch.LimitedBy != w.limited {
			t.Errorf("%s: %s (%s), want %s (%s)", ch.Circuit.Name, ch.Size.Label, ch.LimitedBy, w.label, w.limited)
		}
		if ch.DropPct > ch.Circuit.MaxDropPct || ch.AmpacityA < ch.Circuit.CurrentA {
			t.Errorf("%s breaks its limits", ch.Circuit.Name)
		}
	}
	// Protection from IEC 60269-1 ratings (from memory), by hand:
	want := map[string]ProtectionItem{
		// 1.5625 · 9.5 = 14.84 → 16 A ≤ 20 A module limit; three strings.
		CircuitPVString: {Kind: KindStringFuse, RatingA: 16, Count: 3},
		// 1.5625 · 9.5 · 3 = 44.53 → 50 A ≤ 63 A.
		CircuitArray: {Kind: KindBreaker, RatingA: 50, Count: 1},
		// 1.25 · 40 = 50 → 50 A.
		CircuitControllerBatt: {Kind: KindFuse, RatingA: 50, Count: 1},
		// 94.70 → 100 A ≤ 112 A.
		CircuitInverter: {Kind: KindFuse, RatingA: 100, Count: 1},
		// 1.25 · 8 = 10 → 10 A.
		CircuitDCPanel: {Kind: KindFuse, RatingA: 10, Count: 1},
		// 3.75 → 4 A; 6.25 → 8 A.
		"DC branch: lights": {Kind: KindBreaker, RatingA: 4, Count: 1},
		"DC branch: fridge": {Kind: KindBreaker, RatingA: 8, Count: 1},
	}
	if len(d.Protection) != len(want) {
		t.Fatalf("%d protection items, want %d", len(d.Protection), len(want))
	}
	// Bank: 12 · 0.5 mΩ = 6 mΩ; 24 V / 6 mΩ = 4000 A (Ohm's law, by hand).
	if !near(d.BankShortCircuitA, 4000, 1e-9) {
		t.Errorf("bank short circuit %v A, want 4000", d.BankShortCircuitA)
	}
	for _, p := range d.Protection {
		w := want[p.Circuit]
		if p.Kind != w.Kind || p.RatingA != w.RatingA || p.Count != w.Count {
			t.Errorf("%s: %s %v A ×%d, want %s %v A ×%d", p.Circuit, p.Kind, p.RatingA, p.Count, w.Kind, w.RatingA, w.Count)
		}
		battery := p.Kind != KindStringFuse && p.Circuit != CircuitArray
		if battery && p.InterruptingA != 4000 {
			t.Errorf("%s: interrupting %v A, want the bank's 4000 A", p.Circuit, p.InterruptingA)
		}
	}
	// Cable list: 2.5 mm²: 2·10·3 + 2·15 + 2·8 = 106 m; 6 mm²: 10 m;
	// 10 mm²: 30 + 4 = 34 m; 25 mm²: 4 m.
	runs := d.CableRuns()
	wantRuns := []CableRun{{"2.5 mm²", 2.5, 106}, {"6 mm²", 6, 10}, {"10 mm²", 10, 34}, {"25 mm²", 25, 4}}
	if len(runs) != len(wantRuns) {
		t.Fatalf("cable runs %+v", runs)
	}
	for i := range runs {
		if runs[i].Label != wantRuns[i].Label || !near(runs[i].ConductorLengthM, wantRuns[i].ConductorLengthM, 1e-12) {
			t.Errorf("cable run %d: %+v, want %+v", i, runs[i], wantRuns[i])
		}
	}
	codes := cautionCodes(d)
	for _, c := range []string{"dc-not-touch-safe", "battery-short-circuit", "wiring-disconnects", "equipment-grounding", "terminal-covers", "ampacity-simplified"} {
		if !codes[c] {
			t.Errorf("caution %s missing", c)
		}
	}
	if codes["pv-arc-fault"] {
		t.Error("pv-arc-fault is an NEC caution; this design is IEC")
	}
}

func cautionCodes(d Design) map[string]bool {
	m := map[string]bool{}
	for _, c := range d.Cautions {
		m[c.Code] = true
	}
	return m
}

func TestDesignSystemCautions(t *testing.T) {
	tests := []struct {
		name    string
		mod     func(*SystemCircuits)
		present []string
		absent  []string
	}{
		{"nec above 80 V", func(s *SystemCircuits) { s.Standard = NEC; s.ModuleMaxSeriesFuseA = 20 },
			[]string{"pv-arc-fault", "dc-not-touch-safe"}, nil},
		{"low voltage", func(s *SystemCircuits) { s.Standard = NEC; s.PVMaxV = 50; s.PVOperatingV = 36 },
			nil, []string{"pv-arc-fault", "dc-not-touch-safe"}},
		{"no internal resistance", func(s *SystemCircuits) { s.BlockInternalResistanceOhm = 0 },
			[]string{"battery-short-circuit-unknown"}, []string{"battery-short-circuit"}},
		// IEC 60269-1: 1.5625 · 9.5 = 14.84 → 16 A > a 15 A module limit.
		{"no string fuse fits", func(s *SystemCircuits) { s.ModuleMaxSeriesFuseA = 15 },
			[]string{"string-fuse-unavailable"}, nil},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			in := demoSystem()
			tt.mod(&in)
			d, err := DesignSystem(in)
			if err != nil {
				t.Fatal(err)
			}
			codes := cautionCodes(d)
			for _, c := range tt.present {
				if !codes[c] {
					t.Errorf("caution %s missing", c)
				}
			}
			for _, c := range tt.absent {
				if codes[c] {
					t.Errorf("caution %s unexpected", c)
				}
			}
			for _, c := range d.Cautions {
				if c.Severity != caution.Info && c.Severity != caution.Warning && c.Severity != caution.Danger {
					t.Errorf("%s: severity %q", c.Code, c.Severity)
				}
			}
		})
	}
}

func TestDesignSystemUpsizeForProtection(t *testing.T) {
	// NEC: a 13 A branch needs 1.25 · 13 = 16.25 A; 14 AWG carries 20 A
	// (NEC 310.16, from memory) but NEC 240.4(D) limits its device to 15 A,
	// and the next NEC 240.6(A) rating is 20 A, so the conductor goes to
	// 12 AWG (limit 20 A) with a 20 A breaker.
	in := SystemCircuits{Standard: NEC, BatteryNominalV: 24, BatteryMaxDropPct: 1.5,
		Branches: []Branch{{Name: "pump", CurrentA: 13, OneWayLengthM: 1}}, BranchMaxDropPct: 3}
	d, err := DesignSystem(in)
	if err != nil {
		t.Fatal(err)
	}
	if len(d.Circuits) != 1 || d.Circuits[0].Size.Label != "12 AWG" || d.Circuits[0].LimitedBy != LimitedByProtection {
		t.Fatalf("circuits %+v", d.Circuits)
	}
	if d.Protection[0].RatingA != 20 {
		t.Errorf("breaker %v A, want 20", d.Protection[0].RatingA)
	}
}

func TestDesignSystemParallelRuns(t *testing.T) {
	// 3000 W at 10.5 V LVD, η 0.9: 317.5 A running, 396.8 A design; 1 % of
	// 10.5 V = 0.105 V over 3 m: R ≤ 105/(2·3·317.5) = 0.0551 Ω/km, below
	// 300 mm² class 5 (0.0641). With two runs R ≤ 0.110 → 185 mm² (0.106),
	// 2 × 392 A; fuse 400 A (IEC 60269-1). By hand.
	in := SystemCircuits{Standard: IEC, Class: 5, BatteryNominalV: 12, BatteryMaxDropPct: 1,
		InverterContinuousW: 3000, InverterEfficiency: 0.9, LowVoltageDisconnectV: 10.5, BatteryToInverterOneWayM: 3}
	if _, err := DesignSystem(in); !errors.Is(err, ErrNoSize) {
		t.Fatalf("single runs: want ErrNoSize, got %v", err)
	}
	in.MaxParallelRuns = 3
	d, err := DesignSystem(in)
	if err != nil {
		t.Fatal(err)
	}
	ch := d.Circuits[0]
	if ch.Size.Label != "185 mm²" || ch.Runs != 2 || d.Protection[0].RatingA != 400 {
		t.Errorf("got %s ×%d, fuse %v A", ch.Size.Label, ch.Runs, d.Protection[0].RatingA)
	}
	if !cautionCodes(d)["parallel-conductors"] {
		t.Error("parallel-conductors caution missing")
	}
}

func TestDesignSystemInvalid(t *testing.T) {
	tests := []struct {
		name string
		mod  func(*SystemCircuits)
	}{
		{"standard", func(s *SystemCircuits) { s.Standard = "" }},
		{"class", func(s *SystemCircuits) { s.Class = 1 }},
		{"battery voltage", func(s *SystemCircuits) { s.BatteryNominalV = 0 }},
		{"strings", func(s *SystemCircuits) { s.Strings = 0 }},
		{"negative strings", func(s *SystemCircuits) { s.Strings = -1 }},
		{"isc", func(s *SystemCircuits) { s.ModuleIscA = math.NaN() }},
		{"series fuse", func(s *SystemCircuits) { s.ModuleMaxSeriesFuseA = 0 }},
		{"length", func(s *SystemCircuits) { s.PVStringOneWayM = -2 }},
		{"controller", func(s *SystemCircuits) { s.ControllerRatedA = 0 }},
		{"efficiency", func(s *SystemCircuits) { s.InverterEfficiency = 1.2 }},
		{"lvd", func(s *SystemCircuits) { s.LowVoltageDisconnectV = 0 }},
		{"branch", func(s *SystemCircuits) { s.Branches[0].CurrentA = 0 }},
		{"branch drop", func(s *SystemCircuits) { s.BranchMaxDropPct = 0 }},
		{"battery drop", func(s *SystemCircuits) { s.BatteryMaxDropPct = 0 }},
		{"temperature", func(s *SystemCircuits) { s.ConductorTempC = math.Inf(-1) }},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			in := demoSystem()
			tt.mod(&in)
			if _, err := DesignSystem(in); err == nil {
				t.Error("want error")
			}
		})
	}
}

func BenchmarkSelect(b *testing.B) {
	c := Circuit{CurrentA: 20, OneWayLengthM: 10, VoltageV: 12, MaxDropPct: 3, Standard: NEC}
	for b.Loop() {
		if _, err := Select(c); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkDesignSystem(b *testing.B) {
	in := demoSystem()
	for b.Loop() {
		if _, err := DesignSystem(in); err != nil {
			b.Fatal(err)
		}
	}
}

func TestSelectCautions(t *testing.T) {
	one := SelectCautions(Choice{Runs: 1})
	two := SelectCautions(Choice{Runs: 2, Circuit: Circuit{Name: "x"}})
	if len(one) != 1 || one[0].Code != "ampacity-simplified" || len(two) != 2 || two[1].Code != "parallel-conductors" {
		t.Errorf("SelectCautions: %+v / %+v", one, two)
	}
}
