package wiring

import (
	"errors"
	"math"
	"strings"
	"testing"
)

func near(a, b, rel float64) bool {
	return math.Abs(a-b) <= rel*math.Max(math.Abs(a), math.Abs(b))
}

func TestSizesIECClass2(t *testing.T) {
	// IEC 60228:2004 Table 2, class 2 plain copper, Ω/km at 20 °C, as listed
	// in SOURCES.md.
	want := map[string]float64{
		"1.5 mm²": 12.1, "2.5 mm²": 7.41, "4 mm²": 4.61, "6 mm²": 3.08, "10 mm²": 1.83,
		"16 mm²": 1.15, "25 mm²": 0.727, "35 mm²": 0.524, "50 mm²": 0.387, "70 mm²": 0.268, "95 mm²": 0.193,
	}
	sizes, err := Sizes(IEC, 2)
	if err != nil {
		t.Fatal(err)
	}
	found := 0
	for _, s := range sizes {
		if w, ok := want[s.Label]; ok {
			found++
			if s.ResistanceOhmPerKm != w || s.TableTempC != 20 {
				t.Errorf("%s: %v Ω/km at %v °C, want %v at 20 °C (IEC 60228 Table 2)", s.Label, s.ResistanceOhmPerKm, s.TableTempC, w)
			}
		}
	}
	if found != len(want) {
		t.Errorf("found %d of %d IEC 60228 sizes", found, len(want))
	}
}

func TestSizesIECClass5(t *testing.T) {
	// IEC 60228:2004 Table 3, class 5 plain copper, Ω/km at 20 °C (from
	// memory; ±2 %).
	tests := []struct {
		label string
		want  float64
	}{
		{"1.5 mm²", 13.3}, {"2.5 mm²", 7.98}, {"4 mm²", 4.95}, {"6 mm²", 3.30}, {"10 mm²", 1.91},
		{"16 mm²", 1.21}, {"25 mm²", 0.780}, {"35 mm²", 0.554}, {"50 mm²", 0.386},
	}
	sizes, err := Sizes(IEC, 5)
	if err != nil {
		t.Fatal(err)
	}
	byLabel := map[string]ConductorSize{}
	for _, s := range sizes {
		byLabel[s.Label] = s
	}
	for _, tt := range tests {
		s, ok := byLabel[tt.label]
		if !ok {
			t.Errorf("%s missing", tt.label)
			continue
		}
		if !near(s.ResistanceOhmPerKm, tt.want, 0.02) {
			t.Errorf("%s: %v Ω/km, want %v (IEC 60228 Table 3, from memory)", tt.label, s.ResistanceOhmPerKm, tt.want)
		}
	}
}

func TestSizesNECTable8(t *testing.T) {
	// NEC Chapter 9 Table 8, stranded uncoated copper, Ω/kft at 75 °C, as
	// listed in SOURCES.md; converted here at 1 kft = 0.3048 km.
	tests := []struct {
		label     string
		ohmPerKft float64
	}{
		{"14 AWG", 3.14}, {"12 AWG", 1.98}, {"10 AWG", 1.24}, {"8 AWG", 0.778}, {"6 AWG", 0.491},
		{"4 AWG", 0.308}, {"2 AWG", 0.194}, {"1/0 AWG", 0.122}, {"2/0 AWG", 0.0967}, {"4/0 AWG", 0.0608},
	}
	sizes, err := Sizes(NEC, 0)
	if err != nil {
		t.Fatal(err)
	}
	byLabel := map[string]ConductorSize{}
	for _, s := range sizes {
		byLabel[s.Label] = s
	}
	for _, tt := range tests {
		s, ok := byLabel[tt.label]
		if !ok {
			t.Errorf("%s missing", tt.label)
			continue
		}
		if want := tt.ohmPerKft / 0.3048; !near(s.ResistanceOhmPerKm, want, 1e-12) || s.TableTempC != 75 {
			t.Errorf("%s: %v Ω/km at %v °C, want %v at 75 °C (NEC Ch. 9 Table 8)", tt.label, s.ResistanceOhmPerKm, s.TableTempC, want)
		}
	}
	// NEC Table 310.16, 75 °C copper column (from memory): 14 AWG 20 A,
	// 4 AWG 85 A, 4/0 230 A.
	for label, amp := range map[string]float64{"14 AWG": 20, "4 AWG": 85, "4/0 AWG": 230} {
		if byLabel[label].AmpacityA != amp {
			t.Errorf("%s ampacity %v, want %v (NEC 310.16 75 °C, from memory)", label, byLabel[label].AmpacityA, amp)
		}
	}
}

func TestSizesOrdered(t *testing.T) {
	// Property of any size table (no outside value): larger areas have lower
	// resistance and no lower ampacity.
	for _, tt := range []struct {
		std   Standard
		class int
	}{{IEC, 2}, {IEC, 5}, {NEC, 0}} {
		sizes, err := Sizes(tt.std, tt.class)
		if err != nil {
			t.Fatal(err)
		}
		for i := 1; i < len(sizes); i++ {
			a, b := sizes[i-1], sizes[i]
			if b.AreaMM2 <= a.AreaMM2 || b.ResistanceOhmPerKm >= a.ResistanceOhmPerKm || b.AmpacityA < a.AmpacityA {
				t.Errorf("%s class %d: %s → %s not ordered", tt.std, tt.class, a.Label, b.Label)
			}
		}
	}
}

func TestSizesErrors(t *testing.T) {
	tests := []struct {
		std   Standard
		class int
	}{{IEC, 0}, {IEC, 1}, {IEC, 6}, {"din", 2}, {"", 0}}
	for _, tt := range tests {
		if _, err := Sizes(tt.std, tt.class); err == nil {
			t.Errorf("Sizes(%q, %d): want error", tt.std, tt.class)
		}
	}
}

func TestSizesReturnsCopy(t *testing.T) {
	a, _ := Sizes(IEC, 2)
	a[0].ResistanceOhmPerKm = 0
	b, _ := Sizes(IEC, 2)
	if b[0].ResistanceOhmPerKm == 0 {
		t.Error("Sizes shares its table with callers")
	}
	r := StandardRatingsA(NEC)
	r[0] = -1
	if StandardRatingsA(NEC)[0] == -1 {
		t.Error("StandardRatingsA shares its table with callers")
	}
}

func TestParseStandard(t *testing.T) {
	tests := []struct {
		in   string
		want Standard
		ok   bool
	}{{"iec", IEC, true}, {" NEC ", NEC, true}, {"Iec", IEC, true}, {"", "", false}, {"awg", "", false}}
	for _, tt := range tests {
		got, err := ParseStandard(tt.in)
		if (err == nil) != tt.ok || got != tt.want {
			t.Errorf("ParseStandard(%q) = %q, %v", tt.in, got, err)
		}
	}
}

func TestResistanceAtTemp(t *testing.T) {
	// Hand computation from R_t = R_20 (1 + 0.00393 (t − 20)) (IEC 60287-1-1
	// Table 1 coefficient).
	tests := []struct {
		r20, tempC, want float64
	}{
		{1.15, 20, 1.15},
		{1.15, 70, 1.15 * 1.1965},        // 1 + 0.00393·50
		{0.727, 90, 0.727 * 1.2751},      // 1 + 0.00393·70
		{10, -10, 10 * (1 - 0.00393*30)}, // 8.821
	}
	for _, tt := range tests {
		if got := ResistanceAtTempOhmPerKm(tt.r20, tt.tempC); !near(got, tt.want, 1e-12) {
			t.Errorf("ResistanceAtTempOhmPerKm(%v, %v) = %v, want %v", tt.r20, tt.tempC, got, tt.want)
		}
	}
	// NEC Chapter 9 Table 8 note: R2 = R1 [1 + 0.00323 (T2 − 75)] for copper
	// (from memory); the 20 °C-referred law must agree within 0.1 %.
	for _, t2 := range []float64{20, 50, 90} {
		got := ResistanceBetweenTempsOhmPerKm(1, 75, t2)
		if want := 1 + 0.00323*(t2-75); !near(got, want, 1e-3) {
			t.Errorf("from 75 to %v °C: %v, want %v (NEC Table 8 note)", t2, got, want)
		}
	}
}

func TestDropV(t *testing.T) {
	// By hand: V_drop = 2 × L × I × R / 1000.
	if got, want := DropV(10, 20, 0.727), 2*10*20*0.727/1000; !near(got, want, 1e-15) || !near(got, 0.2908, 1e-12) {
		t.Errorf("DropV = %v, want %v", got, want)
	}
}

// TestWireCommand is the case of `solstand wire --current 20 --length-m 10
// --voltage 12 --max-drop-pct 3`: the drop limit is 0.36 V, so one conductor
// may have at most R = 0.36 · 1000 / (2 · 10 · 20) = 0.9 Ω/km (by hand).
func TestWireCommand(t *testing.T) {
	tests := []struct {
		name      string
		std       Standard
		class     int
		wantLabel string
		wantR     float64 // Ω/km of the chosen size
		wantDropV float64 // 2 × 10 × 20 × R / 1000, by hand
		limited   string
	}{
		// IEC 60228 Table 2: 16 mm² 1.15 > 0.9; 25 mm² 0.727 ≤ 0.9.
		{"iec class 2", IEC, 2, "25 mm²", 0.727, 2 * 10 * 20 * 0.727 / 1000, LimitedByDrop},
		// IEC 60228 Table 3 (from memory): 25 mm² 0.780 ≤ 0.9.
		{"iec class 5", IEC, 5, "25 mm²", 0.780, 2 * 10 * 20 * 0.780 / 1000, LimitedByDrop},
		// NEC Table 8: 4 AWG 0.308 Ω/kft = 1.0105 Ω/km > 0.9; 3 AWG 0.245
		// Ω/kft = 0.8038 Ω/km (3 AWG from memory).
		{"nec", NEC, 0, "3 AWG", 0.245 / 0.3048, 2 * 10 * 20 * (0.245 / 0.3048) / 1000, LimitedByDrop},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			ch, err := Select(Circuit{Name: "wire", CurrentA: 20, OneWayLengthM: 10, VoltageV: 12, MaxDropPct: 3, Standard: tt.std, Class: tt.class})
			if err != nil {
				t.Fatal(err)
			}
			if ch.Size.Label != tt.wantLabel || !near(ch.ResistanceOhmPerKm, tt.wantR, 1e-12) || ch.LimitedBy != tt.limited {
				t.Errorf("got %s %v Ω/km (%s), want %s %v (%s)", ch.Size.Label, ch.ResistanceOhmPerKm, ch.LimitedBy, tt.wantLabel, tt.wantR, tt.limited)
			}
			if !near(ch.DropV, tt.wantDropV, 1e-12) || !near(ch.DropPct, 100*tt.wantDropV/12, 1e-12) {
				t.Errorf("drop %v V %v %%, want %v V", ch.DropV, ch.DropPct, tt.wantDropV)
			}
		})
	}
}

func TestSelect(t *testing.T) {
	tests := []struct {
		name      string
		c         Circuit
		wantLabel string
		wantRuns  int
		limited   string
	}{
		// 60 A, 1 m, 48 V, 3 %: 1.5 mm² drops 2·1·60·12.1/1000 = 1.452 V
		// (3.03 %), 2.5 mm² 0.889 V passes; ampacity 60 A needs 10 mm² (63 A,
		// IEC 60364-5-52 B.52.2 method C, from memory).
		{"ampacity", Circuit{CurrentA: 60, OneWayLengthM: 1, VoltageV: 48, MaxDropPct: 3, Standard: IEC, Class: 2}, "10 mm²", 1, LimitedByAmpacity},
		// 5 A, 1 m, 24 V: 1.5 mm² drops 0.121 V (0.5 %) and carries 19.5 A.
		{"smallest", Circuit{CurrentA: 5, OneWayLengthM: 1, VoltageV: 24, MaxDropPct: 3, Standard: IEC, Class: 2}, "1.5 mm²", 1, LimitedBySmallest},
		// 400 A, 3 m, 12 V, 2 %: R ≤ 0.24·1000/(2·3·400) = 0.1 Ω/km → 240 mm²
		// (0.0754); 400 A also needs 240 mm² (185 mm²: 392 A), and a tie is
		// reported as ampacity.
		{"heavy", Circuit{CurrentA: 400, OneWayLengthM: 3, VoltageV: 12, MaxDropPct: 2, Standard: IEC, Class: 2}, "240 mm²", 1, LimitedByAmpacity},
		// Same with two runs: R ≤ 0.2 Ω/km → 95 mm² (0.193); 2 × 258 A.
		{"two runs", Circuit{CurrentA: 400, OneWayLengthM: 3, VoltageV: 12, MaxDropPct: 2, Standard: IEC, Class: 2, ParallelRuns: 2}, "95 mm²", 2, LimitedByDrop},
		// 20 A, 10 m, 12 V, 3 % at 70 °C: 0.727·(1 + 0.00393·50) = 0.870 ≤ 0.9.
		{"warm", Circuit{CurrentA: 20, OneWayLengthM: 10, VoltageV: 12, MaxDropPct: 3, Standard: IEC, Class: 2, ConductorTempC: 70}, "25 mm²", 1, LimitedByDrop},
		// At 90 °C: 0.727·1.2751 = 0.927 > 0.9 → 35 mm².
		{"hot", Circuit{CurrentA: 20, OneWayLengthM: 10, VoltageV: 12, MaxDropPct: 3, Standard: IEC, Class: 2, ConductorTempC: 90}, "35 mm²", 1, LimitedByDrop},
		// NEC at 20 °C: 4 AWG 1.0105/(1 + 0.00393·55) = 0.831 ≤ 0.9.
		{"nec cool", Circuit{CurrentA: 20, OneWayLengthM: 10, VoltageV: 12, MaxDropPct: 3, Standard: NEC, ConductorTempC: 20}, "4 AWG", 1, LimitedByDrop},
		// Drop at a lower operating current: 10 A gives R ≤ 1.8 Ω/km → 10 mm²
		// (1.83 > 1.8) fails, 16 mm² passes; 20 A ampacity is met by 1.5 mm².
		{"drop current", Circuit{CurrentA: 20, DropCurrentA: 10, OneWayLengthM: 10, VoltageV: 12, MaxDropPct: 3, Standard: IEC, Class: 2}, "16 mm²", 1, LimitedByDrop},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			ch, err := Select(tt.c)
			if err != nil {
				t.Fatal(err)
			}
			if ch.Size.Label != tt.wantLabel || ch.Runs != tt.wantRuns || ch.LimitedBy != tt.limited {
				t.Errorf("got %s ×%d (%s), want %s ×%d (%s)", ch.Size.Label, ch.Runs, ch.LimitedBy, tt.wantLabel, tt.wantRuns, tt.limited)
			}
			if ch.DropPct > tt.c.MaxDropPct || ch.AmpacityA < tt.c.CurrentA {
				t.Errorf("choice breaks its limits: %+v", ch)
			}
		})
	}
}

func TestSelectErrors(t *testing.T) {
	ok := Circuit{CurrentA: 20, OneWayLengthM: 10, VoltageV: 12, MaxDropPct: 3, Standard: IEC, Class: 2}
	mod := func(f func(*Circuit)) Circuit { c := ok; f(&c); return c }
	tests := []struct {
		name  string
		c     Circuit
		noFit bool
	}{
		{"zero current", mod(func(c *Circuit) { c.CurrentA = 0 }), false},
		{"NaN current", mod(func(c *Circuit) { c.CurrentA = math.NaN() }), false},
		{"negative length", mod(func(c *Circuit) { c.OneWayLengthM = -1 }), false},
		{"zero voltage", mod(func(c *Circuit) { c.VoltageV = 0 }), false},
		{"zero drop", mod(func(c *Circuit) { c.MaxDropPct = 0 }), false},
		{"drop 100", mod(func(c *Circuit) { c.MaxDropPct = 100 }), false},
		{"Inf temperature", mod(func(c *Circuit) { c.ConductorTempC = math.Inf(1) }), false},
		{"negative runs", mod(func(c *Circuit) { c.ParallelRuns = -1 }), false},
		{"class 3", mod(func(c *Circuit) { c.Class = 3 }), false},
		{"bad standard", mod(func(c *Circuit) { c.Standard = "x" }), false},
		// 400 A, 10 m, 12 V, 1 %: R ≤ 0.015 Ω/km, below 300 mm² (0.0601).
		{"too long", mod(func(c *Circuit) { c.CurrentA = 400; c.MaxDropPct = 1 }), true},
		// 600 A exceeds every single IEC size's ampacity (300 mm²: 530 A).
		{"too much current", mod(func(c *Circuit) { c.CurrentA = 600; c.OneWayLengthM = 0.1; c.VoltageV = 48 }), true},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			_, err := Select(tt.c)
			if err == nil {
				t.Fatal("want error")
			}
			if errors.Is(err, ErrNoSize) != tt.noFit {
				t.Errorf("errors.Is(ErrNoSize) = %v: %v", !tt.noFit, err)
			}
			if tt.noFit && !strings.Contains(err.Error(), "parallel runs") {
				t.Errorf("error does not say what to do: %v", err)
			}
		})
	}
}

func TestProtectionLimit(t *testing.T) {
	// NEC 240.4(D) small-conductor limits (from memory): 14 AWG 15 A,
	// 12 AWG 20 A, 10 AWG 30 A; larger sizes their ampacity.
	sizes, _ := Sizes(NEC, 0)
	want := map[string]float64{"14 AWG": 15, "12 AWG": 20, "10 AWG": 30, "8 AWG": 50}
	for _, s := range sizes {
		if w, ok := want[s.Label]; ok {
			if got := ProtectionLimitA(s, NEC); got != w {
				t.Errorf("%s: %v A, want %v", s.Label, got, w)
			}
		}
	}
	iec, _ := Sizes(IEC, 2)
	if got := ProtectionLimitA(iec[0], IEC); got != iec[0].AmpacityA {
		t.Errorf("IEC limit %v, want the ampacity %v", got, iec[0].AmpacityA)
	}
}
