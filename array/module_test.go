package array

import (
	"errors"
	"math"
	"testing"

	"solstand/caution"
)

// Demo modules (invented datasheets, no brand): a 36-cell "12 V" module and
// a 60-cell module.
var (
	mod36 = Module{PmaxW: 100, VocV: 22, IscA: 6.1, VmpV: 18, ImpA: 5.56,
		TempCoeffPmaxPctPerC: -0.40, TempCoeffVocPctPerC: -0.30, TempCoeffIscPctPerC: 0.05, NOCTC: 45,
		MaxSeriesFuseA: 15, MaxSystemV: 1000}
	mod60 = Module{PmaxW: 300, VocV: 39.8, IscA: 9.7, VmpV: 32.5, ImpA: 9.23,
		TempCoeffPmaxPctPerC: -0.40, TempCoeffVocPctPerC: -0.30, TempCoeffIscPctPerC: 0.05, NOCTC: 45,
		MaxSeriesFuseA: 15, MaxSystemV: 1000}
)

func TestCellTemp(t *testing.T) {
	tests := []struct {
		name                 string
		air, poa, noct, want float64
	}{
		// NOCT is defined at 800 W/m² and 20 °C air (IEC 61215), so the model
		// returns NOCT there (Duffie & Beckman 2013 §23.3).
		{"noct conditions", 20, 800, 45, 45},
		{"dark", 5, 0, 45, 5},
		// Computed from T_c = T_a + (NOCT − 20)/800 · G.
		{"stc irradiance", 30, 1000, 45, 30 + 25.0/800*1000},
		{"negative irradiance clamps", 10, -50, 45, 10},
	}
	for _, tt := range tests {
		near(t, tt.name, CellTempC(tt.air, tt.poa, tt.noct), tt.want, 1e-12)
	}
}

func TestModulePowerAndVoltage(t *testing.T) {
	tests := []struct {
		name      string
		got, want float64
	}{
		// At STC (IEC 60904-3) the module gives its rating.
		{"stc", ModuleMPPW(mod60, 1000, 25), 300},
		// Computed from P = Pmax·G/1000·(1 + γ(T − 25)).
		{"800 W/m2", ModuleMPPW(mod60, 800, 25), 240},
		{"hot", ModuleMPPW(mod60, 1000, 65), 300 * (1 - 0.004*40)},
		{"dark", ModuleMPPW(mod60, 0, 25), 0},
		{"voc cold", VocAtTempV(mod60, -20), 39.8 * (1 + 0.003*45)},
		{"voc stc", VocAtTempV(mod60, 25), 39.8},
		{"vmp hot", VmpAtTempV(mod60, 70), 32.5 * (1 - 0.0045*45)},
		{"temperature factor", TemperatureFactor(mod60, 50), 0.9},
	}
	for _, tt := range tests {
		near(t, tt.name, tt.got, tt.want, 1e-9)
	}
}

func TestNEC690_7Factor(t *testing.T) {
	// NEC (2017–2023) Table 690.7(A), crystalline and multicrystalline
	// silicon, lowest expected ambient in °C (from memory).
	tests := []struct{ lowC, want float64 }{
		{25, 1.00}, {30, 1.00}, {24, 1.02}, {20, 1.02}, {19, 1.04}, {15, 1.04}, {14, 1.06}, {10, 1.06},
		{9, 1.08}, {5, 1.08}, {4, 1.10}, {0, 1.10}, {-1, 1.12}, {-5, 1.12}, {-6, 1.14}, {-10, 1.14},
		{-11, 1.16}, {-15, 1.16}, {-16, 1.18}, {-20, 1.18}, {-21, 1.20}, {-25, 1.20}, {-26, 1.21},
		{-30, 1.21}, {-31, 1.23}, {-35, 1.23}, {-36, 1.25}, {-40, 1.25},
		// Our rules: between bands the colder factor; past the table, 1.25.
		{19.5, 1.04}, {-0.5, 1.12}, {-45, 1.25},
	}
	for _, tt := range tests {
		if got := NEC690_7Factor(tt.lowC); got != tt.want {
			t.Errorf("NEC690_7Factor(%g) = %g, want %g", tt.lowC, got, tt.want)
		}
	}
}

func TestModuleCurrentAtVoltage(t *testing.T) {
	// The Borowy & Salameh (1996) explicit I–V curve passes through the
	// datasheet points by construction: (0, Isc) exactly, (Vmp, Imp) and
	// (Voc, 0) up to terms of the order of C1, below 1e-3.
	tests := []struct {
		name                string
		g, tc, v, want, tol float64
		m                   Module
	}{
		{"short circuit", 1000, 25, 0, 6.1, 1e-12, mod36},
		{"mpp", 1000, 25, 18, 5.56, 1e-3, mod36},
		{"open circuit", 1000, 25, 22, 0, 1e-12, mod36},
		{"mpp 60 cell", 1000, 25, 32.5, 9.23, 1e-3, mod60},
		// Translated: at 500 W/m², 25 °C, Imp halves at Vmp (our translation).
		{"half light mpp", 500, 25, 18, 2.78, 1e-3, mod36},
		// Hot: passes through the hot Vmp with Imp·(1 + α ΔT).
		{"hot mpp", 1000, 65, VmpAtTempV(mod36, 65), 5.56 * (1 + 0.0005*40), 1e-3, mod36},
		{"dark", 0, 25, 12, 0, 0, mod36},
	}
	for _, tt := range tests {
		near(t, tt.name, ModuleCurrentAtVoltageA(tt.m, tt.g, tt.tc, tt.v), tt.want, tt.tol)
	}
	prev := math.Inf(1)
	for v := 0.0; v <= 23; v += 0.25 {
		i := ModuleCurrentAtVoltageA(mod36, 1000, 25, v)
		if i > prev+1e-12 || i < 0 {
			t.Fatalf("I(V) not falling at %g V: %g after %g", v, i, prev)
		}
		prev = i
		// No point of the curve beats the maximum power point (by much).
		if v*i > 100*1.001 {
			t.Errorf("P(%g V) = %g W above Pmax", v, v*i)
		}
	}
}

func TestModuleValidate(t *testing.T) {
	if err := mod60.Validate(); err != nil {
		t.Fatal(err)
	}
	bad := []Module{{}, mod60, mod60, mod60, mod60}
	bad[1].VmpV = 45
	bad[2].ImpA = 10
	bad[3].PmaxW = 400
	bad[4].NOCTC = 5
	for i, m := range bad {
		if m.Validate() == nil {
			t.Errorf("bad module %d accepted", i)
		}
	}
}

func TestDerates(t *testing.T) {
	d := Derates{SoilingLoss: 0.05, MismatchLoss: 0.02, WiringLoss: 0.03, ToleranceLoss: 0.02, AgeingLossPerYear: 0.005}
	// Computed: product of (1 − loss), ageing linear.
	near(t, "new", d.Factor(0), 0.95*0.98*0.97*0.98, 1e-12)
	near(t, "10 years", d.Factor(10), 0.95*0.98*0.97*0.98*0.95, 1e-12)
	near(t, "negative years", d.Factor(-3), d.Factor(0), 0)
	if DefaultDerates() != d {
		t.Error("defaults changed")
	}
	if (Derates{SoilingLoss: 1}).Validate() == nil || (Derates{WiringLoss: -0.1}).Validate() == nil {
		t.Error("bad derates accepted")
	}
	if (Derates{AgeingLossPerYear: 0.5}).Factor(5) != 0 {
		t.Error("ageing below zero")
	}
}

func hasCode(cs []caution.Caution, code string, sev caution.Severity) bool {
	for _, c := range cs {
		if c.Code == code && c.Severity == sev {
			return true
		}
	}
	return false
}

func TestLayoutStrings(t *testing.T) {
	mppt150 := Controller{Kind: MPPT, MaxPVVoltageV: 150, EfficiencyFraction: 0.97, RatingsA: []float64{20, 30, 40, 60, 80, 100}}
	pwm := Controller{Kind: PWM, EfficiencyFraction: 0.99, RatingsA: []float64{10, 20, 30, 40, 60}}
	noCoeff := mod60
	noCoeff.TempCoeffVocPctPerC = 0
	tests := []struct {
		name                      string
		m                         Module
		c                         Controller
		nominal, charge, low, hot float64
		req                       float64
		series, strings           int
		vocCold                   float64
		codes                     []string
		sev                       []caution.Severity
		err                       error
	}{
		// Computed: Voc(−20 °C) = 39.8·1.135 = 45.17 V → at most 3 in series
		// under 150 V; Vmp(70 °C) = 25.92 V, 57.6 + 5 V needs 3. 1500 W → 2 strings.
		{name: "mppt 48 V", m: mod60, c: mppt150, nominal: 48, charge: 57.6, low: -20, hot: 70, req: 1500,
			series: 3, strings: 2, vocCold: 3 * 39.8 * 1.135},
		// 12 V battery: 1 to 3 in series fit; 2000 W takes 7 modules as 1 × 7,
		// 8 as 2 × 4, 9 as 3 × 3: one in series wins (fewest modules).
		{name: "mppt 12 V fewest modules", m: mod60, c: mppt150, nominal: 12, charge: 14.4, low: -20, hot: 70, req: 2000,
			series: 1, strings: 7, vocCold: 39.8 * 1.135, codes: []string{"pv-string-fuses"}, sev: []caution.Severity{caution.Info}},
		// NEC Table 690.7(A) fallback: −20 °C → 1.18 (from memory); 150/(39.8·1.18) = 3.19 → 3.
		{name: "nec fallback", m: noCoeff, c: mppt150, nominal: 48, charge: 57.6, low: -20, hot: 70, req: 900,
			series: 3, strings: 1, vocCold: 3 * 39.8 * 1.18},
		// One module's cold Voc already over a 40 V controller: danger and an error.
		{name: "over limit", m: mod60, c: Controller{Kind: MPPT, MaxPVVoltageV: 40}, nominal: 12, charge: 14.4, low: -20, hot: 70, req: 300,
			series: 1, strings: 1, vocCold: 39.8 * 1.135, codes: []string{"pv-voc-over-controller-limit"}, sev: []caution.Severity{caution.Danger}, err: ErrVoltageWindow},
		// Window too narrow for the hot minimum: the controller-safe count and a warning.
		{name: "mppt window", m: mod60, c: Controller{Kind: MPPT, MaxPVVoltageV: 100}, nominal: 48, charge: 57.6, low: -20, hot: 70, req: 600,
			series: 2, strings: 1, vocCold: 2 * 39.8 * 1.135, codes: []string{"pv-vmp-hot-below-mppt-window"}, sev: []caution.Severity{caution.Warning}},
		// PWM: 36-cell modules are 12 V nominal (common practice); 24 V → 2
		// in series. Hot Vmp 2·18·(1 − 0.0045·45) = 28.7 V < 28.8 V · 1.05: warning.
		{name: "pwm 24 V hot", m: mod36, c: pwm, nominal: 24, charge: 28.8, low: -5, hot: 70, req: 250,
			series: 2, strings: 2, vocCold: 2 * 22 * 1.09, codes: []string{"pv-vmp-hot-near-charge-voltage"}, sev: []caution.Severity{caution.Warning}},
		// PWM, 12 V, cool site: 3 strings need string fuses; no voltage warning:
		// 18·(1 − 0.0045·35) = 15.2 V > 14.4·1.05.
		{name: "pwm 12 V cool", m: mod36, c: pwm, nominal: 12, charge: 14.4, low: 0, hot: 60, req: 300,
			series: 1, strings: 3, vocCold: 22 * 1.075, codes: []string{"pv-string-fuses"}, sev: []caution.Severity{caution.Info}},
	}
	for _, tt := range tests {
		l, err := LayoutStrings(tt.m, tt.c, tt.nominal, tt.charge, tt.low, tt.hot, tt.req)
		if !errors.Is(err, tt.err) || (tt.err == nil && err != nil) {
			t.Errorf("%s: err %v, want %v", tt.name, err, tt.err)
		}
		if l.ModulesSeries != tt.series || l.Strings != tt.strings || l.Modules != tt.series*tt.strings {
			t.Errorf("%s: %d × %d (%d), want %d × %d", tt.name, l.ModulesSeries, l.Strings, l.Modules, tt.series, tt.strings)
		}
		near(t, tt.name+" voc cold", l.VocColdV, tt.vocCold, 1e-9)
		if len(l.Cautions) != len(tt.codes) {
			t.Errorf("%s: cautions %+v, want codes %v", tt.name, l.Cautions, tt.codes)
		}
		for i, c := range tt.codes {
			if !hasCode(l.Cautions, c, tt.sev[i]) {
				t.Errorf("%s: no %s caution of severity %s in %+v", tt.name, c, tt.sev[i], l.Cautions)
			}
		}
	}
	// Bad inputs are errors, not panics.
	if _, err := LayoutStrings(Module{}, mppt150, 12, 14.4, -10, 60, 100); err == nil {
		t.Error("empty module accepted")
	}
	if _, err := LayoutStrings(mod60, mppt150, 12, 14.4, 60, -10, 100); err == nil {
		t.Error("record low above hottest cell accepted")
	}
	if _, err := LayoutStrings(mod60, Controller{Kind: MPPT}, 12, 14.4, -10, 60, 100); err == nil {
		t.Error("MPPT without a voltage limit accepted")
	}
	// A fixed layout checked on its own: 4 × 60-cell on 150 V at −20 °C is danger.
	cs := CheckStringVoltages(mod60, mppt150, 4, 1, 57.6, -20, 70)
	if !hasCode(cs, "pv-voc-over-controller-limit", caution.Danger) {
		t.Errorf("4 in series on 150 V: %+v", cs)
	}
}

func TestRequiredArrayW(t *testing.T) {
	ideal := SizingChain{TemperatureFactor: 1, ControllerFactor: 1}
	full := SizingChain{TemperatureFactor: 0.9, Derates: DefaultDerates(), AgeYears: 0, ControllerFactor: 0.97,
		BatteryShareFraction: 0.6, BatteryChargeEfficiency: 0.8}
	battery := 1 / (0.4 + 0.6/0.8)
	tests := []struct {
		name        string
		e, psh      float64
		chain       SizingChain
		want        float64
		wantBattery float64
	}{
		// Computed: P = E / PSH with no losses.
		{"ideal", 1000, 4, ideal, 250, 1},
		{"full chain", 1000, 4, full, 1000 / (4 * 0.9 * 0.95 * 0.98 * 0.97 * 0.98 * 0.97 * battery), battery},
		{"no demand", 0, 0, ideal, 0, 1},
	}
	for _, tt := range tests {
		a, err := RequiredArrayW(tt.e, tt.psh, tt.chain)
		if err != nil {
			t.Fatalf("%s: %v", tt.name, err)
		}
		near(t, tt.name, a.RequiredW, tt.want, 1e-9*math.Max(1, tt.want))
		near(t, tt.name+" battery path", a.BatteryPathFactor, tt.wantBattery, 1e-12)
		if tt.e > 0 {
			near(t, tt.name+" closes", a.RequiredW*a.PeakSunHoursH*a.OverallFactor, tt.e, 1e-9*tt.e)
		}
	}
	for _, bad := range []struct {
		e, psh float64
		c      SizingChain
	}{{1000, 0, ideal}, {-1, 4, ideal}, {1000, 4, SizingChain{}}, {1000, 4, SizingChain{TemperatureFactor: 1, ControllerFactor: 1, BatteryShareFraction: 0.5}}} {
		if _, err := RequiredArrayW(bad.e, bad.psh, bad.c); err == nil {
			t.Errorf("bad sizing %+v accepted", bad)
		}
	}
}

func TestSizeController(t *testing.T) {
	ratings := []float64{100, 20, 30, 40, 60, 80}
	tests := []struct {
		name            string
		c               Controller
		layout          StringLayout
		m               Module
		arrayW, charge  float64
		required, rated float64
		units           int
	}{
		// MPPT: 1000 W / 14.4 V × 1.25 = 86.8 A (common practice) → 100 A.
		{"mppt one", Controller{Kind: MPPT, RatingsA: ratings}, StringLayout{}, mod60, 1000, 14.4, 1000 / 14.4 * 1.25, 100, 1},
		// 1500 W: 130.2 A → two units of 80 A.
		{"mppt parallel", Controller{Kind: MPPT, RatingsA: ratings}, StringLayout{}, mod60, 1500, 14.4, 1500 / 14.4 * 1.25, 80, 2},
		// PWM: 1.25 × 6.1 A × 3 × 1.25 = 28.6 A (NEC 690.8(A)(1) and (B)) → 30 A.
		{"pwm", Controller{Kind: PWM, RatingsA: ratings}, StringLayout{Strings: 3}, mod36, 300, 14.4, 1.5625 * 6.1 * 3, 30, 1},
		// No list: rounded up to a whole ampere.
		{"no list", Controller{Kind: PWM}, StringLayout{Strings: 3}, mod36, 300, 14.4, 1.5625 * 6.1 * 3, 29, 1},
		{"max output as rating", Controller{Kind: MPPT, MaxOutputA: 50}, StringLayout{}, mod60, 1000, 14.4, 1000 / 14.4 * 1.25, 50, 2},
	}
	for _, tt := range tests {
		s, err := SizeController(tt.c, tt.layout, tt.m, tt.arrayW, tt.charge)
		if err != nil {
			t.Fatalf("%s: %v", tt.name, err)
		}
		near(t, tt.name+" required", s.RequiredA, tt.required, 1e-9)
		if s.RatedA != tt.rated || s.Units != tt.units {
			t.Errorf("%s: %d × %g A, want %d × %g A", tt.name, s.Units, s.RatedA, tt.units, tt.rated)
		}
	}
	if _, err := SizeController(Controller{Kind: MPPT}, StringLayout{}, mod60, 1000, 0); err == nil {
		t.Error("zero charge voltage accepted")
	}
}

func TestArrayDCPower(t *testing.T) {
	layout := StringLayout{ModulesSeries: 1, Strings: 2}
	mppt := Controller{Kind: MPPT, EfficiencyFraction: 0.95}
	pwm := Controller{Kind: PWM, EfficiencyFraction: 1}
	// MPPT at STC: 2 × 100 W × 0.95 (computed).
	near(t, "mppt stc", ArrayDCPowerW(mod36, mppt, layout, 1000, 25, 13, 1), 190, 1e-9)
	// Output current limit: 10 A × 13 V.
	lim := mppt
	lim.MaxOutputA = 10
	near(t, "mppt limited", ArrayDCPowerW(mod36, lim, layout, 1000, 25, 13, 1), 130, 1e-9)
	// PWM: battery voltage × module current at that voltage × strings.
	want := 13 * ModuleCurrentAtVoltageA(mod36, 1000, 25, 13) * 2
	near(t, "pwm", ArrayDCPowerW(mod36, pwm, layout, 1000, 25, 13, 1), want, 1e-9)
	// PWM leaves energy behind against MPPT at the same conditions.
	for _, tc := range []float64{10, 25, 45, 65} {
		p := ArrayDCPowerW(mod36, pwm, layout, 800, tc, 13.2, 0.9)
		m := ArrayMPPW(mod36, layout, 800, tc, 0.9)
		if !(p < m) || !(p > 0) {
			t.Errorf("%g °C: PWM %g W, MPP %g W", tc, p, m)
		}
		near(t, "pwm factor", PWMFactor(mod36, 800, tc, 13.2, 1), p/m, 1e-9)
	}
	if ArrayDCPowerW(mod36, pwm, layout, 0, 25, 13, 1) != 0 || ArrayDCPowerW(mod36, pwm, StringLayout{}, 1000, 25, 13, 1) != 0 {
		t.Error("power without light or without modules")
	}
	n := testing.AllocsPerRun(100, func() { ArrayDCPowerW(mod36, pwm, layout, 700, 40, 13, 0.9) })
	if n != 0 {
		t.Errorf("ArrayDCPowerW allocates %g", n)
	}
}

func BenchmarkArrayDCPowerW(b *testing.B) {
	layout := StringLayout{ModulesSeries: 2, Strings: 3}
	pwm := Controller{Kind: PWM, EfficiencyFraction: 0.99}
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		ArrayDCPowerW(mod36, pwm, layout, float64(i%1000), 40, 26, 0.9)
	}
}
