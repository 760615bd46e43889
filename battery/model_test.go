package battery

import (
	"math"
	"math/rand/v2"
	"testing"
)

// plainModel is a model with round numbers for the behaviour tests.
func plainModel() Model {
	return Model{
		CapacityWh: 1000, EnergyWh: 1000, MinWh: 500, ReconnectWh: 600,
		ChargeEff: 0.9, DischargeEff: 0.95, KneeWh: 1000,
	}
}

func TestNewModel(t *testing.T) {
	chem := mustDefaults(t, Flooded)
	s := Sizing{CapacityWh: 10000, CapacityAh: 416.6667, TempFactor: 0.8, MaxDoD: 0.5, SystemV: 24, BlocksSeries: 4, Strings: 2}
	blk := Block{NominalV: 6, CapacityAh: 208.33, MaxChargeA: 50, MaxDischargeA: 100}
	m := NewModel(chem, s, blk, 0.9, 0.6, 0.7)
	// Own arithmetic from the definitions in NewModel's doc comment.
	want := map[string][2]float64{
		"CapacityWh":             {m.CapacityWh, 8000},             // 10000 × 0.8
		"EnergyWh":               {m.EnergyWh, 7200},               // 0.9 × 8000
		"MinWh":                  {m.MinWh, 4000},                  // (1 − 0.5) × 8000
		"ReconnectWh":            {m.ReconnectWh, 4800},            // 0.6 × 8000
		"NonCriticalMinWh":       {m.NonCriticalMinWh, 5600},       // 0.7 × 8000
		"NonCriticalReconnectWh": {m.NonCriticalReconnectWh, 6400}, // 5600 + (4800 − 4000)
		"MaxChargeW":             {m.MaxChargeW, 2400},             // 50 A × 2 strings × 24 V
		"MaxDischargeW":          {m.MaxDischargeW, 4800},          // 100 A × 2 × 24 V
		"KneeWh":                 {m.KneeWh, 6800},                 // 0.85 × 8000
		"ChargeEff":              {m.ChargeEff, chem.ChargeEfficiency},
		"DischargeEff":           {m.DischargeEff, chem.DischargeEfficiency},
	}
	for name, v := range want {
		if math.Abs(v[0]-v[1]) > 1e-9*math.Max(1, v[1]) {
			t.Errorf("%s = %v, want %v", name, v[0], v[1])
		}
	}
	// 730 hourly steps of self-discharge compound to the monthly fraction
	// (own computation from the definition 1 − (1 − m)^(1/730)).
	if got := 1 - math.Pow(1-m.SelfDischargePerHour, hoursPerMonth); math.Abs(got-chem.SelfDischargePerMonth) > 1e-12 {
		t.Errorf("monthly self-discharge = %v, want %v", got, chem.SelfDischargePerMonth)
	}
	if m.Disconnected || m.NonCriticalShed {
		t.Errorf("fresh model at 0.9 is disconnected: %+v", m)
	}
	// Reconnect below the cut-off: no hysteresis; non-critical at the cut-off: off.
	m = NewModel(chem, s, blk, 0.3, 0.2, 0.5)
	if m.ReconnectWh != m.MinWh || m.NonCriticalMinWh != 0 || !m.Disconnected {
		t.Errorf("low settings: %+v", m)
	}
}

func TestChargeEfficiencyAndLimits(t *testing.T) {
	tests := []struct {
		name             string
		m                Model
		offer, hours     float64
		accepted, stored float64 // stored = increase of EnergyWh
	}{
		// Below the knee: 100 Wh offered, 0.9 efficient: 100 accepted, 90 stored.
		{"plain", Model{CapacityWh: 1000, EnergyWh: 200, ChargeEff: 0.9, KneeWh: 1000}, 100, 1, 100, 90},
		// Power limit 50 W for 1 h: 50 accepted, 45 stored.
		{"power limit", Model{CapacityWh: 1000, EnergyWh: 200, ChargeEff: 0.9, KneeWh: 1000, MaxChargeW: 50}, 100, 1, 50, 45},
		// No taper, 60 Wh of room: 60 stored, 60/0.9 accepted.
		{"fills", Model{CapacityWh: 1000, EnergyWh: 940, ChargeEff: 0.9, KneeWh: 1000}, 500, 1, 60 / 0.9, 60},
		// Full: nothing.
		{"full", Model{CapacityWh: 1000, EnergyWh: 1000, ChargeEff: 0.9, KneeWh: 1000}, 500, 1, 0, 0},
		// Nothing offered, negative, NaN.
		{"zero", Model{CapacityWh: 1000, EnergyWh: 100, ChargeEff: 0.9, KneeWh: 1000}, 0, 1, 0, 0},
		{"negative", Model{CapacityWh: 1000, EnergyWh: 100, ChargeEff: 0.9, KneeWh: 1000}, -5, 1, 0, 0},
		{"NaN", Model{CapacityWh: 1000, EnergyWh: 100, ChargeEff: 0.9, KneeWh: 1000}, math.NaN(), 1, 0, 0},
		// Taper from the knee with MaxChargeW = 100 W for 2 h (own computation from
		// the model's ODE): tau = (1000 − 800) / (100 × 0.9) = 2.2222 h;
		// E = 1000 − 200 e^(−2/2.2222) = 918.686; stored 118.686.
		{"taper", Model{CapacityWh: 1000, EnergyWh: 800, ChargeEff: 0.9, KneeWh: 800, MaxChargeW: 100}, 500, 2,
			(200 - 200*math.Exp(-2/(200.0/90))) / 0.9, 200 - 200*math.Exp(-2/(200.0/90))},
	}
	for _, tt := range tests {
		m := tt.m
		e0 := m.EnergyWh
		acc, loss := m.Charge(tt.offer, tt.hours)
		if math.Abs(acc-tt.accepted) > 1e-9 || math.Abs((m.EnergyWh-e0)-tt.stored) > 1e-9 {
			t.Errorf("%s: accepted %v stored %v; want %v, %v", tt.name, acc, m.EnergyWh-e0, tt.accepted, tt.stored)
		}
		if math.Abs((acc-loss)-(m.EnergyWh-e0)) > 1e-9 {
			t.Errorf("%s: identity broken: accepted %v loss %v change %v", tt.name, acc, loss, m.EnergyWh-e0)
		}
	}
}

func TestChargeStepIndependent(t *testing.T) {
	// The taper is integrated exactly within a step, so one 6 h step and
	// 360 one-minute steps at the same offered power end at the same energy.
	for _, maxW := range []float64{0, 300, 80} {
		a := Model{CapacityWh: 1000, EnergyWh: 300, ChargeEff: 0.92, KneeWh: 850, MaxChargeW: maxW}
		b := a
		a.Charge(6*150, 6)
		for i := 0; i < 360; i++ {
			b.Charge(150.0/60, 1.0/60)
		}
		if math.Abs(a.EnergyWh-b.EnergyWh) > 1e-6 {
			t.Errorf("max %v W: one step %v, many steps %v", maxW, a.EnergyWh, b.EnergyWh)
		}
		if a.EnergyWh > a.CapacityWh {
			t.Errorf("overfull: %v", a.EnergyWh)
		}
	}
}

func TestDischargeHysteresis(t *testing.T) {
	m := plainModel()
	// Draw 95 Wh per step: 100 Wh stored each (0.95 efficient); 500 Wh above the
	// cut-off gives five full steps, then the disconnect.
	for i := 0; i < 5; i++ {
		dc, dn, _ := m.Discharge(95, 0, 1)
		if math.Abs(dc-95) > 1e-9 || dn != 0 {
			t.Fatalf("step %d: delivered %v, %v", i, dc, dn)
		}
	}
	if math.Abs(m.EnergyWh-500) > 1e-9 || !m.Disconnected {
		t.Fatalf("after 5 steps: %v Wh, disconnected %v", m.EnergyWh, m.Disconnected)
	}
	if dc, _, _ := m.Discharge(95, 0, 1); dc != 0 {
		t.Errorf("delivered %v while disconnected", dc)
	}
	// Charge to 550 Wh: still below the 600 Wh reconnect.
	m.Charge(50/0.9, 1)
	if dc, _, _ := m.Discharge(10, 0, 1); dc != 0 || !m.Disconnected {
		t.Errorf("reconnected early at %v Wh: delivered %v", m.EnergyWh, dc)
	}
	// Charge to 610 Wh: loads come back.
	m.Charge(60/0.9, 1)
	if m.Disconnected {
		t.Errorf("still disconnected at %v Wh", m.EnergyWh)
	}
	if dc, _, _ := m.Discharge(10, 0, 1); math.Abs(dc-10) > 1e-9 {
		t.Errorf("after reconnect delivered %v, want 10", dc)
	}
	// A demand larger than what is left: the rest down to the cut-off.
	m = plainModel()
	m.EnergyWh = 550
	dc, _, loss := m.Discharge(1000, 0, 1)
	if math.Abs(dc-50*0.95) > 1e-9 || math.Abs(loss-50*0.05) > 1e-9 || !m.Disconnected {
		t.Errorf("partial: delivered %v loss %v disconnected %v", dc, loss, m.Disconnected)
	}
}

func TestNonCriticalShedding(t *testing.T) {
	m := plainModel()
	m.DischargeEff = 1
	m.NonCriticalMinWh, m.NonCriticalReconnectWh = 700, 800
	// 1000 Wh: 100 critical + 50 non-critical per step; two steps reach 700 Wh.
	for i := 0; i < 2; i++ {
		dc, dn, _ := m.Discharge(100, 50, 1)
		if dc != 100 || dn != 50 {
			t.Fatalf("step %d: %v, %v", i, dc, dn)
		}
	}
	// 2 × 150 Wh taken: 700 Wh left, at the non-critical threshold: shed.
	if math.Abs(m.EnergyWh-700) > 1e-9 || !m.NonCriticalShed || m.Disconnected {
		t.Fatalf("energy %v shed %v disc %v", m.EnergyWh, m.NonCriticalShed, m.Disconnected)
	}
	// Critical still served, non-critical not.
	if dc, dn, _ := m.Discharge(20, 50, 1); dc != 20 || dn != 0 {
		t.Errorf("shed: delivered %v, %v", dc, dn)
	}
	// Back to 750 Wh: still shed (reconnect at 800).
	m.Charge((750-m.EnergyWh)/0.9, 1)
	if _, dn, _ := m.Discharge(0, 10, 1); dn != 0 {
		t.Errorf("non-critical back early at %v Wh", m.EnergyWh)
	}
	m.Charge((810-m.EnergyWh)/0.9, 1)
	if _, dn, _ := m.Discharge(0, 10, 1); dn != 10 {
		t.Errorf("non-critical not back at 810 Wh: %v", dn)
	}
	// Non-critical takes only what lies above its threshold: at 750 Wh
	// (not shed) a 100 Wh non-critical demand gets 50 Wh.
	m = plainModel()
	m.DischargeEff = 1
	m.EnergyWh = 750
	m.NonCriticalMinWh, m.NonCriticalReconnectWh = 700, 800
	if dc, dn, _ := m.Discharge(0, 100, 1); dc != 0 || math.Abs(dn-50) > 1e-9 {
		t.Errorf("partial non-critical %v, want 50", dn)
	}
}

func TestDischargePowerLimit(t *testing.T) {
	m := plainModel()
	m.MaxDischargeW = 100
	// 2 h at 100 W: 200 Wh between both; critical first.
	dc, dn, _ := m.Discharge(150, 150, 2)
	if dc != 150 || math.Abs(dn-50) > 1e-9 {
		t.Errorf("power limit: %v, %v; want 150, 50", dc, dn)
	}
}

func TestSelfDischarge(t *testing.T) {
	m := plainModel()
	m.SelfDischargePerHour = 1e-4
	// Own computation: 1000 Wh × 1e-4 × 10 h = 1 Wh.
	if loss := m.SelfDischarge(10); math.Abs(loss-1) > 1e-12 || math.Abs(m.EnergyWh-999) > 1e-12 {
		t.Errorf("loss %v, energy %v", loss, m.EnergyWh)
	}
	if loss := m.SelfDischarge(-1); loss != 0 {
		t.Errorf("negative hours lost %v", loss)
	}
}

// TestModelEnergyIdentity drives models with random sequences of calls and
// checks the energy identity of every call, and that the state stays in range.
func TestModelEnergyIdentity(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for trial := 0; trial < 200; trial++ {
		capWh := 100 + rng.Float64()*20000
		min := capWh * rng.Float64() * 0.8
		m := Model{
			CapacityWh: capWh, EnergyWh: capWh * rng.Float64(), MinWh: min,
			ReconnectWh: min + rng.Float64()*(capWh-min),
			ChargeEff:   0.6 + 0.4*rng.Float64(), DischargeEff: 0.6 + 0.4*rng.Float64(),
			SelfDischargePerHour: 1e-4 * rng.Float64(),
			KneeWh:               capWh * (0.7 + 0.35*rng.Float64()),
		}
		if rng.IntN(2) == 0 {
			m.MaxChargeW = capWh * 0.3 * rng.Float64()
			m.MaxDischargeW = capWh * 0.5 * rng.Float64()
		}
		if rng.IntN(2) == 0 {
			m.NonCriticalMinWh = min + rng.Float64()*(capWh-min)
			m.NonCriticalReconnectWh = math.Min(capWh, m.NonCriticalMinWh+(m.ReconnectWh-min))
		}
		tol := 1e-9 * capWh
		for step := 0; step < 2000; step++ {
			h := []float64{1.0 / 60, 0.25, 1, 3}[rng.IntN(4)]
			e0 := m.EnergyWh
			switch rng.IntN(3) {
			case 0:
				offer := capWh * 0.5 * rng.Float64()
				acc, loss := m.Charge(offer, h)
				if d := (m.EnergyWh - e0) - (acc - loss); math.Abs(d) > tol || acc > offer+tol || acc < 0 || loss < -tol {
					t.Fatalf("trial %d step %d charge: offer %v acc %v loss %v change %v", trial, step, offer, acc, loss, m.EnergyWh-e0)
				}
			case 1:
				c, n := capWh*0.2*rng.Float64(), capWh*0.2*rng.Float64()
				dc, dn, loss := m.Discharge(c, n, h)
				if d := (m.EnergyWh - e0) + (dc + dn + loss); math.Abs(d) > tol || dc > c || dn > n || dc < 0 || dn < 0 || loss < -tol {
					t.Fatalf("trial %d step %d discharge: ask %v,%v got %v,%v loss %v change %v", trial, step, c, n, dc, dn, loss, m.EnergyWh-e0)
				}
				if (dc > 0 || dn > 0) && m.EnergyWh < m.MinWh-tol {
					t.Fatalf("below the cut-off: %v < %v", m.EnergyWh, m.MinWh)
				}
			case 2:
				loss := m.SelfDischarge(h)
				if d := (m.EnergyWh - e0) + loss; math.Abs(d) > tol || loss < 0 {
					t.Fatalf("trial %d step %d self-discharge: loss %v change %v", trial, step, loss, m.EnergyWh-e0)
				}
			}
			if m.EnergyWh < 0 || m.EnergyWh > capWh+tol || math.IsNaN(m.EnergyWh) {
				t.Fatalf("trial %d step %d: energy %v of %v", trial, step, m.EnergyWh, capWh)
			}
		}
	}
}

func TestModelNoAllocs(t *testing.T) {
	m := plainModel()
	m.KneeWh = 850
	allocs := testing.AllocsPerRun(1000, func() {
		m.Charge(50, 1)
		m.Discharge(30, 20, 1)
		m.SelfDischarge(1)
		_ = m.SOC()
	})
	if allocs != 0 {
		t.Errorf("%v allocations per step", allocs)
	}
}

func BenchmarkModelStep(b *testing.B) {
	m := plainModel()
	m.KneeWh, m.MaxChargeW, m.SelfDischargePerHour = 850, 400, 1e-4
	m.NonCriticalMinWh, m.NonCriticalReconnectWh = 700, 800
	b.ReportAllocs()
	for i := 0; b.Loop(); i++ {
		pv := float64(i%24) * 10
		m.Charge(pv, 1)
		m.Discharge(40, 20, 1)
		m.SelfDischarge(1)
	}
}

func FuzzModel(f *testing.F) {
	f.Add(1000.0, 0.5, 100.0, 50.0, 20.0, 1.0)
	f.Add(1e6, 0.0, 1e9, -1.0, 1e9, 1e-9)
	f.Fuzz(func(t *testing.T, capWh, soc, offer, crit, non, hours float64) {
		if !(capWh > 0) || capWh > 1e12 {
			return
		}
		m := Model{CapacityWh: capWh, EnergyWh: capWh * clamp0(soc), MinWh: capWh * 0.3, ReconnectWh: capWh * 0.4,
			NonCriticalMinWh: capWh * 0.5, NonCriticalReconnectWh: capWh * 0.6,
			ChargeEff: 0.9, DischargeEff: 0.95, KneeWh: capWh * 0.85, SelfDischargePerHour: 1e-4, MaxChargeW: capWh * 0.2}
		tol := 1e-9 * capWh
		e0 := m.EnergyWh
		acc, loss := m.Charge(offer, hours)
		if d := (m.EnergyWh - e0) - (acc - loss); !(math.Abs(d) <= tol) {
			t.Fatalf("charge identity: %v", d)
		}
		e0 = m.EnergyWh
		dc, dn, loss := m.Discharge(crit, non, hours)
		if d := (m.EnergyWh - e0) + (dc + dn + loss); !(math.Abs(d) <= tol) {
			t.Fatalf("discharge identity: %v", d)
		}
		e0 = m.EnergyWh
		loss = m.SelfDischarge(hours)
		if d := (m.EnergyWh - e0) + loss; !(math.Abs(d) <= tol) {
			t.Fatalf("self-discharge identity: %v", d)
		}
		if !(m.EnergyWh >= 0 && m.EnergyWh <= capWh*(1+1e-12)) {
			t.Fatalf("energy %v of %v", m.EnergyWh, capWh)
		}
	})
}
