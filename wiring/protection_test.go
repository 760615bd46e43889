package wiring

import (
	"math"
	"testing"
)

func TestStandardRatings(t *testing.T) {
	// NEC 240.6(A) (from memory): standard ratings include 15, 20, 25, 30,
	// ... 110, 125, 150, 175, 200 A and the extra fuse ratings 1, 3, 6, 10,
	// 601 A. IEC 60269-1 §5.3.1 (from memory): 2, 4, 6, 8, 10, 12, 16, 20,
	// 25, 32, 40, 50, 63, 80, 100, 125, 160 A ...
	tests := []struct {
		std     Standard
		present []float64
		absent  []float64
	}{
		{NEC, []float64{1, 3, 6, 10, 15, 20, 25, 30, 35, 40, 45, 50, 60, 110, 125, 150, 175, 225, 601, 6000}, []float64{16, 32, 63, 120}},
		{IEC, []float64{2, 4, 6, 8, 10, 12, 16, 20, 25, 32, 40, 50, 63, 80, 100, 125, 160, 315, 1250}, []float64{15, 30, 35, 60, 150}},
	}
	for _, tt := range tests {
		have := map[float64]bool{}
		r := StandardRatingsA(tt.std)
		for i, v := range r {
			have[v] = true
			if i > 0 && v <= r[i-1] {
				t.Errorf("%s ratings not ascending at %v", tt.std, v)
			}
		}
		for _, v := range tt.present {
			if !have[v] {
				t.Errorf("%s: %v A missing", tt.std, v)
			}
		}
		for _, v := range tt.absent {
			if have[v] {
				t.Errorf("%s: %v A is not a standard rating", tt.std, v)
			}
		}
	}
	if StandardRatingsA("x") != nil {
		t.Error("unknown standard: want nil")
	}
}

func TestSelectProtection(t *testing.T) {
	tests := []struct {
		designA, ampacityA float64
		std                Standard
		want               float64 // 0: error
	}{
		{21, 35, NEC, 25},     // NEC 240.6(A): 20, 25 → 25
		{25, 25, NEC, 25},     // equal at both ends
		{21, 24, NEC, 0},      // 25 > 24: no rating fits
		{94.7, 112, NEC, 100}, // 90, 100 → 100
		{126.3, 175, NEC, 150},
		{16, 20, IEC, 16}, // IEC 60269-1: 16
		{17, 25, IEC, 20}, // 16 < 17 → 20
		{33, 36, IEC, 0},  // 40 > 36
		{94.7, 112, IEC, 100},
		{126.3, 175, IEC, 160},
		{7000, 8000, NEC, 0}, // above the list
		{0, 10, NEC, 0},
		{math.NaN(), 10, NEC, 0},
		{5, 0, NEC, 0},
		{5, 10, "x", 0},
	}
	for _, tt := range tests {
		got, err := SelectProtection(tt.designA, tt.ampacityA, tt.std)
		if tt.want == 0 {
			if err == nil {
				t.Errorf("SelectProtection(%v, %v, %s) = %v, want error", tt.designA, tt.ampacityA, tt.std, got)
			}
			continue
		}
		if err != nil || got != tt.want {
			t.Errorf("SelectProtection(%v, %v, %s) = %v, %v; want %v", tt.designA, tt.ampacityA, tt.std, got, err, tt.want)
		}
	}
}

func TestStringFusesRequired(t *testing.T) {
	// Common practice (SOURCES.md): three or more PV strings in parallel
	// need a fuse in each string.
	for _, tt := range []struct {
		strings int
		want    bool
	}{{0, false}, {1, false}, {2, false}, {3, true}, {10, true}} {
		if got := StringFusesRequired(tt.strings); got != tt.want {
			t.Errorf("StringFusesRequired(%d) = %v", tt.strings, got)
		}
	}
	// Reverse-current test (N − 1) · 1.25 · Isc > fuse, NEC 690.9(A) with
	// the 1.25 of 690.8(A)(1); products by hand.
	for _, tt := range []struct {
		strings     int
		isc, fuseA  float64
		want        bool
		description string
	}{
		{1, 9, 15, false, "one string"},
		{2, 9, 15, false, "11.25 A ≤ 15 A"},
		{3, 9, 15, true, "22.5 A > 15 A"},
		{3, 9, 25, false, "22.5 A ≤ 25 A"},
		{4, 9, 25, true, "33.75 A > 25 A"},
	} {
		if got := StringFusesRequiredByCurrent(tt.strings, tt.isc, tt.fuseA); got != tt.want {
			t.Errorf("%s: got %v", tt.description, got)
		}
	}
}

func TestStringFuseA(t *testing.T) {
	// Minimum 1.25 × 1.25 × Isc (NEC 690.8(A)(1), 690.9(B)), picked from
	// NEC 240.6(A) or IEC 60269-1, at most the module's series fuse rating.
	tests := []struct {
		isc, maxFuse float64
		std          Standard
		want         float64 // 0: error
	}{
		{9, 15, NEC, 15},   // 14.06 → 15
		{10, 15, NEC, 0},   // 15.63 → 20 > 15
		{10, 20, NEC, 20},  // 15.63 → 20
		{10, 20, IEC, 16},  // 15.63 → 16
		{9.5, 15, IEC, 0},  // 14.84 → 16 > 15
		{5.2, 10, IEC, 10}, // 8.13 → 10
		{5.2, 10, NEC, 10}, // 8.13 → 10
		{0, 15, NEC, 0},
		{9, 0, NEC, 0},
	}
	for _, tt := range tests {
		got, err := StringFuseA(tt.isc, tt.maxFuse, tt.std)
		if tt.want == 0 {
			if err == nil {
				t.Errorf("StringFuseA(%v, %v, %s) = %v, want error", tt.isc, tt.maxFuse, tt.std, got)
			}
			continue
		}
		if err != nil || got != tt.want {
			t.Errorf("StringFuseA(%v, %v, %s) = %v, %v; want %v", tt.isc, tt.maxFuse, tt.std, got, err, tt.want)
		}
	}
}

func TestPVCircuitCurrent(t *testing.T) {
	// NEC 690.8(A)(1): maximum current 1.25 · Isc · strings; 690.8(B):
	// conductors at 1.25 of that. Products by hand.
	tests := []struct {
		isc           float64
		strings       int
		wantMax, want float64
	}{
		{8, 1, 10, 12.5},
		{8, 3, 30, 37.5},
		{10.2, 4, 51, 63.75},
	}
	for _, tt := range tests {
		m, c := PVCircuitCurrentA(tt.isc, tt.strings)
		if !near(m, tt.wantMax, 1e-12) || !near(c, tt.want, 1e-12) {
			t.Errorf("PVCircuitCurrentA(%v, %d) = %v, %v", tt.isc, tt.strings, m, c)
		}
	}
}

func TestInverterBatteryCurrent(t *testing.T) {
	// 1.25 · P / (V_LVD · η), by hand.
	tests := []struct {
		w, v, eff, want float64
	}{
		{1000, 11, 0.9, 1.25 * 1000 / 9.9},  // 126.26 A
		{1500, 22, 0.9, 1.25 * 1500 / 19.8}, // 94.70 A
		{3000, 44, 0.94, 1.25 * 3000 / (44 * 0.94)},
	}
	for _, tt := range tests {
		if got := InverterBatteryCurrentA(tt.w, tt.v, tt.eff); !near(got, tt.want, 1e-12) {
			t.Errorf("InverterBatteryCurrentA(%v, %v, %v) = %v, want %v", tt.w, tt.v, tt.eff, got, tt.want)
		}
	}
	for _, bad := range [][3]float64{{0, 11, 0.9}, {1000, 0, 0.9}, {1000, 11, 0}, {1000, 11, 1.1}, {math.NaN(), 11, 0.9}} {
		if got := InverterBatteryCurrentA(bad[0], bad[1], bad[2]); !math.IsNaN(got) {
			t.Errorf("InverterBatteryCurrentA(%v) = %v, want NaN", bad, got)
		}
	}
}

func TestBatteryShortCircuit(t *testing.T) {
	// Ohm's law by hand: 6 blocks of 4 mΩ in series, 2 strings: 12 mΩ;
	// 24 V / 12 mΩ = 2000 A.
	r := BankResistanceOhm(0.004, 6, 2)
	if !near(r, 0.012, 1e-12) {
		t.Errorf("BankResistanceOhm = %v, want 0.012", r)
	}
	if got := BatteryShortCircuitA(24, r); !near(got, 2000, 1e-12) {
		t.Errorf("BatteryShortCircuitA = %v, want 2000", got)
	}
	if got := BatteryShortCircuitA(12, 0.004); !near(got, 3000, 1e-12) {
		t.Errorf("BatteryShortCircuitA(12, 0.004) = %v, want 3000", got)
	}
	if !math.IsNaN(BatteryShortCircuitA(12, 0)) || !math.IsNaN(BankResistanceOhm(0.004, 0, 1)) {
		t.Error("invalid inputs: want NaN")
	}
}
