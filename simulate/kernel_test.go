package simulate

import (
	"math"
	"math/rand/v2"
	"testing"

	"solstand/battery"
)

// All inputs below are invented demo scenarios; every check is by
// construction (energy conservation, or arithmetic on the scenario stated
// beside the check), none against an outside value.

// demoYear returns 365 days of months and an hourly PV-per-unit series: a
// half-sine day from 06:00 to 18:00 with a peak of 0.8 Wh per unit, scaled
// each day by a random factor in [0.1, 1.3) (fixed seed).
func demoYear(seed uint64) ([]int8, []float64) {
	r := rand.New(rand.NewPCG(seed, 7))
	dm := make([]int8, 365)
	pv := make([]float64, 365*24)
	lengths := [12]int{31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31}
	d := 0
	for mo, n := range lengths {
		for i := 0; i < n; i++ {
			dm[d] = int8(mo + 1)
			k := 0.1 + 1.2*r.Float64()
			for h := 6; h < 18; h++ {
				pv[d*24+h] = k * 0.8 * math.Sin(math.Pi*(float64(h-6)+0.5)/12)
			}
			d++
		}
	}
	return dm, pv
}

// demoDemand: a 40 W critical load all day, 100 W of non-critical lights
// 18:00–22:00, inverter loss 10 % of each hour's demand.
func demoDemand() *Demand {
	var d Demand
	for mo := 0; mo < 12; mo++ {
		for h := 0; h < 24; h++ {
			d.CriticalWh[mo][h] = 40
			if h >= 18 && h < 22 {
				d.NonCriticalWh[mo][h] = 100
			}
			d.InverterLossWh[mo][h] = 0.1 * (d.CriticalWh[mo][h] + d.NonCriticalWh[mo][h])
		}
	}
	return &d
}

// demoBattery: a lead-acid-like bank of capacityWh, half full, 50 % usable,
// reconnect at 60 %, knee at 85 %.
func demoBattery(capacityWh float64) battery.Model {
	return battery.Model{
		CapacityWh:           capacityWh,
		EnergyWh:             0.5 * capacityWh,
		MinWh:                0.5 * capacityWh,
		ReconnectWh:          0.6 * capacityWh,
		ChargeEff:            0.9,
		DischargeEff:         0.95,
		SelfDischargePerHour: 0.03 / 730,
		KneeWh:               0.85 * capacityWh,
	}
}

func noBattery() battery.Model { return battery.Model{ChargeEff: 0.9, DischargeEff: 0.95} }

func simulateYears(t testing.TB, years int, scale float64, m battery.Model, p Params) (Ledger, []Day) {
	t.Helper()
	d := demoDemand()
	var led Ledger
	var all []Day
	for y := 0; y < years; y++ {
		dm, pv := demoYear(uint64(y + 1))
		days := make([]Day, len(dm))
		if n := RunDays(pv, scale, dm, d, &p, &m, &led, days, nil); n != len(dm) {
			t.Fatalf("RunDays simulated %d of %d days", n, len(dm))
		}
		all = append(all, days...)
	}
	return led, all
}

func TestLedgerCheck(t *testing.T) {
	tests := []struct {
		name string
		l    Ledger
		ok   bool
	}{
		{"zero", Ledger{}, true},
		// 100 + 50 = 60 + 10 + 20 + 60; 60 + 40 = 100 (arithmetic by hand)
		{"closes", Ledger{PVAvailableWh: 100, BatteryStartWh: 50, LoadServedWh: 60, LossesWh: 10, DumpedWh: 20, BatteryEndWh: 60, UnmetWh: 40, DemandWh: 100}, true},
		{"energy off by 1e-6", Ledger{PVAvailableWh: 100, BatteryStartWh: 50, LoadServedWh: 60, LossesWh: 10, DumpedWh: 20, BatteryEndWh: 60.000001, UnmetWh: 40, DemandWh: 100}, false},
		{"within 1e-10", Ledger{PVAvailableWh: 100, BatteryStartWh: 50, LoadServedWh: 60, LossesWh: 10, DumpedWh: 20, BatteryEndWh: 60 + 1e-9, UnmetWh: 40, DemandWh: 100}, true},
		{"demand off", Ledger{PVAvailableWh: 60, LoadServedWh: 60, UnmetWh: 41, DemandWh: 100}, false},
		{"nan", Ledger{PVAvailableWh: math.NaN()}, false},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			if err := tc.l.Check(); (err == nil) != tc.ok {
				t.Fatalf("Check() = %v, want ok=%v", err, tc.ok)
			}
			if err := tc.l.Plus(tc.l).Check(); (err == nil) != tc.ok {
				t.Fatalf("Plus().Check() = %v, want ok=%v", err, tc.ok)
			}
		})
	}
}

// TestLedgerClosesRandom is the property test of the issue: on random PV,
// demand, controller and battery figures (fixed seed) both identities close
// to 1e-9 relative, and every day's figures are consistent with the
// ledger.
func TestLedgerClosesRandom(t *testing.T) {
	r := rand.New(rand.NewPCG(2026, 6))
	for trial := 0; trial < 300; trial++ {
		var d Demand
		for mo := 0; mo < 12; mo++ {
			for h := 0; h < 24; h++ {
				d.CriticalWh[mo][h] = 200 * r.Float64() * float64(r.IntN(2))
				d.NonCriticalWh[mo][h] = 300 * r.Float64() * float64(r.IntN(2))
				d.InverterLossWh[mo][h] = 0.2 * r.Float64() * (d.CriticalWh[mo][h] + d.NonCriticalWh[mo][h])
			}
		}
		nDays := 1 + r.IntN(60)
		dm := make([]int8, nDays)
		pv := make([]float64, 24*nDays)
		for i := range dm {
			dm[i] = int8(1 + r.IntN(12))
		}
		for i := range pv {
			if r.IntN(3) > 0 {
				pv[i] = r.Float64() * 2
			}
		}
		capWh := 0.0
		if r.IntN(5) > 0 {
			capWh = 20000 * r.Float64()
		}
		minFrac := 0.8 * r.Float64()
		m := battery.Model{
			CapacityWh:           capWh,
			EnergyWh:             capWh * r.Float64(),
			MinWh:                capWh * minFrac,
			ReconnectWh:          capWh * (minFrac + (1-minFrac)*r.Float64()*0.5),
			ChargeEff:            0.6 + 0.4*r.Float64(),
			DischargeEff:         0.6 + 0.4*r.Float64(),
			SelfDischargePerHour: 1e-3 * r.Float64(),
			KneeWh:               capWh * (0.7 + 0.3*r.Float64()),
		}
		if r.IntN(2) == 0 {
			m.NonCriticalMinWh = capWh * (minFrac + (1-minFrac)*r.Float64())
			m.NonCriticalReconnectWh = math.Min(capWh, m.NonCriticalMinWh+0.05*capWh)
		}
		if r.IntN(2) == 0 {
			m.MaxChargeW = 2000 * r.Float64()
			m.MaxDischargeW = 2000 * r.Float64()
		}
		p := Params{ControllerEfficiency: 0.8 + 0.2*r.Float64()}
		if r.IntN(2) == 0 {
			p.ControllerMaxOutWh = 3000 * r.Float64()
		}
		scale := 5000 * r.Float64()
		start := m.EnergyWh
		var led Ledger
		days := make([]Day, nDays)
		soc := make([]float32, 24*nDays)
		// Split the run in two calls to check the ledger carries over.
		half := nDays / 2
		RunDays(pv[:24*half], scale, dm[:half], &d, &p, &m, &led, days[:half], soc[:24*half])
		RunDays(pv[24*half:], scale, dm[half:], &d, &p, &m, &led, days[half:], soc[24*half:])
		if err := led.Check(); err != nil {
			t.Fatalf("trial %d: %v (%+v)", trial, err, led)
		}
		if led.BatteryStartWh != start || led.BatteryEndWh != m.EnergyWh {
			t.Fatalf("trial %d: battery start/end %g/%g, want %g/%g", trial, led.BatteryStartWh, led.BatteryEndWh, start, m.EnergyWh)
		}
		var sum Ledger
		for i, dy := range days {
			if dy.Month != dm[i] {
				t.Fatalf("trial %d day %d: month %d, want %d", trial, i, dy.Month, dm[i])
			}
			sum.PVAvailableWh += dy.PVAvailableWh
			sum.LoadServedWh += dy.ServedWh()
			sum.UnmetWh += dy.UnmetWh
			sum.DumpedWh += dy.DumpedWh
			sum.LossesWh += dy.ControllerLossWh + dy.BatteryLossWh
			sum.DemandWh += dy.DemandWh
			if dy.SOCMin > dy.SOCEnd || dy.SOCEnd > dy.SOCMax || dy.SOCMean < dy.SOCMin || dy.SOCMean > dy.SOCMax {
				t.Fatalf("trial %d day %d: SOC min/mean/end/max %g/%g/%g/%g out of order", trial, i, dy.SOCMin, dy.SOCMean, dy.SOCEnd, dy.SOCMax)
			}
			if dy.InverterLossWh < 0 || dy.InverterLossWh > 0.2*dy.ServedWh()+1e-9 {
				t.Fatalf("trial %d day %d: inverter loss %g of served %g", trial, i, dy.InverterLossWh, dy.ServedWh())
			}
			if float32(dy.SOCEnd) != soc[24*i+23] {
				t.Fatalf("trial %d day %d: SOCEnd %g, soc trace %g", trial, i, dy.SOCEnd, soc[24*i+23])
			}
		}
		sum.BatteryStartWh, sum.BatteryEndWh = led.BatteryStartWh, led.BatteryEndWh
		if err := sum.Check(); err != nil {
			t.Fatalf("trial %d: days do not add up: %v", trial, err)
		}
		for _, pair := range [][2]float64{{sum.PVAvailableWh, led.PVAvailableWh}, {sum.LoadServedWh, led.LoadServedWh}, {sum.DemandWh, led.DemandWh}} {
			if !closes(pair[0], pair[1]) {
				t.Fatalf("trial %d: days sum %g, ledger %g", trial, pair[0], pair[1])
			}
		}
	}
}

// TestNoBattery: with CapacityWh 0 every hour serves exactly
// min(PV × efficiency, controller limit, demand), critical first.
func TestNoBattery(t *testing.T) {
	tests := []struct {
		name   string
		scale  float64
		p      Params
		wantCr func(out, c float64) float64
	}{
		{"unlimited", 300, Params{ControllerEfficiency: 0.95}, nil},
		{"clipped at 150 Wh", 300, Params{ControllerEfficiency: 0.95, ControllerMaxOutWh: 150}, nil},
		{"small array", 40, Params{ControllerEfficiency: 0.9}, nil},
	}
	dm, pv := demoYear(3)
	d := demoDemand()
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m := noBattery()
			var led Ledger
			days := make([]Day, len(dm))
			RunDays(pv, tc.scale, dm, d, &tc.p, &m, &led, days, nil)
			if err := led.Check(); err != nil {
				t.Fatal(err)
			}
			for i, dy := range days {
				var wantC, wantN, wantDump float64
				mo := dm[i] - 1
				for h := 0; h < 24; h++ {
					out := pv[24*i+h] * tc.scale * tc.p.ControllerEfficiency
					if tc.p.ControllerMaxOutWh > 0 {
						out = math.Min(out, tc.p.ControllerMaxOutWh)
					}
					c := math.Min(out, d.CriticalWh[mo][h])
					n := math.Min(out-c, d.NonCriticalWh[mo][h])
					wantC += c
					wantN += n
					wantDump += pv[24*i+h]*tc.scale - (c+n)/tc.p.ControllerEfficiency
				}
				if math.Abs(dy.ServedCriticalWh-wantC) > 1e-9*wantC+1e-12 || math.Abs(dy.ServedNonCriticalWh-wantN) > 1e-9*wantN+1e-12 {
					t.Fatalf("day %d: served %g/%g, want %g/%g", i, dy.ServedCriticalWh, dy.ServedNonCriticalWh, wantC, wantN)
				}
				if math.Abs(dy.DumpedWh-wantDump) > 1e-9*wantDump+1e-9 {
					t.Fatalf("day %d: dumped %g, want %g", i, dy.DumpedWh, wantDump)
				}
				if dy.ChargeWh != 0 || dy.DischargeWh != 0 || dy.BatteryLossWh != 0 || dy.SOCMax != 0 {
					t.Fatalf("day %d: battery activity without a battery: %+v", i, dy)
				}
			}
		})
	}
}

// TestCriticalFirst: when the controller output is below the critical load
// nothing goes to the non-critical loads, and the battery (kept at its
// disconnect) gives nothing.
func TestCriticalFirst(t *testing.T) {
	var d Demand
	for h := 0; h < 24; h++ {
		d.CriticalWh[0][h] = 100
		d.NonCriticalWh[0][h] = 100
	}
	pv := make([]float64, 24)
	for h := range pv {
		pv[h] = 0.5 // 50 Wh at scale 100, efficiency 1: half the critical load
	}
	m := demoBattery(1000)
	m.EnergyWh = m.MinWh
	m.Disconnected = true
	var led Ledger
	days := make([]Day, 1)
	RunDays(pv, 100, []int8{1}, &d, &Params{ControllerEfficiency: 1}, &m, &led, days, nil)
	// 24 h × 50 Wh critical, nothing non-critical (arithmetic on the scenario)
	if got := days[0]; math.Abs(got.ServedCriticalWh-1200) > 1e-9 || got.ServedNonCriticalWh != 0 || got.UnmetHours != 24 {
		t.Fatalf("served %g/%g, unmet hours %d; want 1200/0, 24", got.ServedCriticalWh, got.ServedNonCriticalWh, got.UnmetHours)
	}
}

// TestNonCriticalShed: at night from a battery between its disconnect and
// its non-critical threshold, critical loads are served and non-critical
// ones shed.
func TestNonCriticalShed(t *testing.T) {
	var d Demand
	for h := 0; h < 24; h++ {
		d.CriticalWh[0][h] = 10
		d.NonCriticalWh[0][h] = 10
	}
	m := demoBattery(10000) // MinWh 5000
	m.NonCriticalMinWh = 8000
	m.NonCriticalReconnectWh = 8500
	m.EnergyWh = 7000
	m.SelfDischargePerHour = 0
	pv := make([]float64, 24)
	var led Ledger
	days := make([]Day, 1)
	RunDays(pv, 0, []int8{1}, &d, &Params{ControllerEfficiency: 0.9}, &m, &led, days, nil)
	got := days[0]
	// 24 h × 10 Wh critical served, 240 Wh non-critical unmet (by construction)
	if math.Abs(got.ServedCriticalWh-240) > 1e-9 || got.ServedNonCriticalWh != 0 || math.Abs(got.UnmetWh-240) > 1e-9 {
		t.Fatalf("served %g/%g unmet %g; want 240/0/240", got.ServedCriticalWh, got.ServedNonCriticalWh, got.UnmetWh)
	}
	if err := led.Check(); err != nil {
		t.Fatal(err)
	}
}

// TestInverterLossShare: the inverter loss of a day is each hour's
// InverterLossWh times the served fraction of that hour.
func TestInverterLossShare(t *testing.T) {
	var d Demand
	for h := 0; h < 24; h++ {
		d.CriticalWh[0][h] = 100
		d.InverterLossWh[0][h] = 10
	}
	pv := make([]float64, 24)
	for h := 0; h < 12; h++ {
		pv[h] = 1 // 50 Wh at scale 50: half of each of the first 12 hours
	}
	m := noBattery()
	var led Ledger
	days := make([]Day, 1)
	RunDays(pv, 50, []int8{1}, &d, &Params{ControllerEfficiency: 1}, &m, &led, days, nil)
	// 12 h × 10 Wh × 0.5 = 60 Wh (arithmetic on the scenario)
	if got := days[0].InverterLossWh; math.Abs(got-60) > 1e-9 {
		t.Fatalf("inverter loss %g, want 60", got)
	}
}

func TestHugeSystemZeroLOLP(t *testing.T) {
	m := demoBattery(1e6)
	m.EnergyWh = m.CapacityWh
	led, days := simulateYears(t, 3, 1e5, m, Params{ControllerEfficiency: 0.95})
	if err := led.Check(); err != nil {
		t.Fatal(err)
	}
	st := Summarise(days, m.CapacityWh, 3)
	if led.UnmetWh != 0 || st.LOLP != 0 || st.UnmetHours != 0 {
		t.Fatalf("unmet %g Wh, LOLP %g, %d hours; want 0", led.UnmetWh, st.LOLP, st.UnmetHours)
	}
}

// TestTinyArray: an array whose output stays below every hour's load is all
// served directly, so LOLP = 1 − efficiency × PV energy / demand exactly
// (computed from the scenario).
func TestTinyArray(t *testing.T) {
	for _, capWh := range []float64{0, 5000} {
		m := demoBattery(capWh)
		m.EnergyWh = m.MinWh
		m.Disconnected = true
		const eff = 0.9
		led, _ := simulateYears(t, 2, 10, m, Params{ControllerEfficiency: eff}) // peak 8 Wh < 40 Wh load
		want := 1 - eff*led.PVAvailableWh/led.DemandWh
		if got := led.UnmetWh / led.DemandWh; math.Abs(got-want) > 1e-9 {
			t.Fatalf("capacity %g: LOLP %g, want %g", capWh, got, want)
		}
	}
}

func lolpOf(t *testing.T, scale, capWh float64) float64 {
	m := demoBattery(capWh)
	led, _ := simulateYears(t, 2, scale, m, Params{ControllerEfficiency: 0.95})
	return led.UnmetWh / led.DemandWh
}

// TestMonotone: LOLP does not rise as the array or the battery grows.
func TestMonotone(t *testing.T) {
	prev := 2.0
	for _, scale := range []float64{100, 300, 600, 900, 1200, 1600, 2200, 3000} {
		l := lolpOf(t, scale, 4000)
		if l > prev+1e-12 {
			t.Fatalf("array scale %g: LOLP %g above %g of the smaller array", scale, l, prev)
		}
		prev = l
	}
	prev = 2.0
	for _, capWh := range []float64{0, 500, 1000, 2000, 4000, 8000, 16000} {
		l := lolpOf(t, 1200, capWh)
		if l > prev+1e-12 {
			t.Fatalf("battery %g Wh: LOLP %g above %g of the smaller battery", capWh, l, prev)
		}
		prev = l
	}
}

func TestDeterministic(t *testing.T) {
	a, da := simulateYears(t, 2, 1200, demoBattery(6000), Params{ControllerEfficiency: 0.95})
	b, db := simulateYears(t, 2, 1200, demoBattery(6000), Params{ControllerEfficiency: 0.95})
	if a != b {
		t.Fatalf("ledgers differ: %+v vs %+v", a, b)
	}
	for i := range da {
		if da[i] != db[i] {
			t.Fatalf("day %d differs", i)
		}
	}
}

// TestRunDaysShortOrBadInput: RunDays never panics and reports how far it got.
func TestRunDaysShortOrBadInput(t *testing.T) {
	dm, pv := demoYear(1)
	d := demoDemand()
	p := Params{ControllerEfficiency: 0.95}
	bad := append([]int8{}, dm...)
	bad[10] = 13
	tests := []struct {
		name string
		pv   []float64
		dm   []int8
		days int
		soc  []float32
		d    *Demand
		want int
	}{
		{"full", pv, dm, 365, nil, d, 365},
		{"pv short", pv[:24*100+5], dm, 365, nil, d, 100},
		{"days short", pv, dm, 50, nil, d, 50},
		{"soc short", pv, dm, 365, make([]float32, 24*20), d, 20},
		{"bad month", pv, bad, 365, nil, d, 10},
		{"nil demand", pv, dm, 365, nil, nil, 0},
		{"empty", nil, nil, 0, nil, d, 0},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			m := demoBattery(3000)
			var led Ledger
			got := RunDays(tc.pv, 800, tc.dm, tc.d, &p, &m, &led, make([]Day, tc.days), tc.soc)
			if got != tc.want {
				t.Fatalf("RunDays = %d days, want %d", got, tc.want)
			}
			if err := led.Check(); err != nil {
				t.Fatal(err)
			}
		})
	}
}

// TestRunDaysOddParams: NaN, negative and excessive parameters are sanitised.
func TestRunDaysOddParams(t *testing.T) {
	dm, pv := demoYear(1)
	pv[5] = math.NaN()
	pv[30] = -4
	pv[31] = math.Inf(1)
	for _, p := range []Params{{ControllerEfficiency: math.NaN()}, {ControllerEfficiency: 1.5, ControllerMaxOutWh: -1}, {ControllerEfficiency: 0}} {
		for _, scale := range []float64{math.NaN(), -3, 500, math.Inf(1)} {
			m := demoBattery(2000)
			var led Ledger
			RunDays(pv, scale, dm, demoDemand(), &p, &m, &led, make([]Day, len(dm)), nil)
			if err := led.Check(); err != nil {
				t.Fatalf("params %+v scale %g: %v", p, scale, err)
			}
		}
	}
}

// FuzzRunDays: on any PV values, scale, efficiency and battery figures the
// kernel neither panics nor breaks the ledger.
func FuzzRunDays(f *testing.F) {
	f.Add(1.0, 500.0, 0.95, 0.0, 4000.0, 0.5, 0.5, 0.9, 0.95, 0.0)
	f.Add(-1.0, 1e9, 2.0, 10.0, 0.0, 2.0, -1.0, 0.0, 1.0, 1e3)
	f.Fuzz(func(t *testing.T, pvv, scale, eff, maxOut, capWh, soc, minFrac, ce, de, maxW float64) {
		if math.IsInf(capWh, 0) || math.Abs(capWh) > 1e12 || math.Abs(scale) > 1e12 || math.Abs(pvv) > 1e6 || math.Abs(maxW) > 1e12 || math.Abs(maxOut) > 1e12 {
			t.Skip() // beyond any physical bank or array; float rounding would swamp 1e-9
		}
		pv := make([]float64, 48)
		for i := range pv {
			pv[i] = pvv * float64(i%24) / 23
		}
		m := battery.Model{CapacityWh: math.Max(capWh, 0), ChargeEff: ce, DischargeEff: de, MaxChargeW: maxW, MaxDischargeW: maxW}
		if !(m.CapacityWh > 0) {
			m.CapacityWh = 0
		}
		s, mf := math.Max(0, math.Min(1, soc)), math.Max(0, math.Min(1, minFrac))
		if math.IsNaN(soc) {
			s = 0
		}
		if math.IsNaN(minFrac) {
			mf = 0
		}
		m.EnergyWh, m.MinWh, m.ReconnectWh, m.KneeWh = s*m.CapacityWh, mf*m.CapacityWh, mf*m.CapacityWh, m.CapacityWh
		var led Ledger
		RunDays(pv, scale, []int8{1, 7}, demoDemand(), &Params{ControllerEfficiency: eff, ControllerMaxOutWh: maxOut}, &m, &led, make([]Day, 2), make([]float32, 48))
		if err := led.Check(); err != nil {
			t.Fatal(err)
		}
	})
}

// benchSetup returns one demo year and a mid-sized system.
func benchSetup() ([]int8, []float64, *Demand, Params, battery.Model) {
	dm, pv := demoYear(11)
	return dm, pv, demoDemand(), Params{ControllerEfficiency: 0.95, ControllerMaxOutWh: 2000}, demoBattery(6000)
}

// BenchmarkYearHourly: one op is one simulated year of 8760 hourly steps of
// one system through the kernel.
func BenchmarkYearHourly(b *testing.B) {
	dm, pv, d, p, m0 := benchSetup()
	days := make([]Day, len(dm))
	b.ReportAllocs()
	for b.Loop() {
		m := m0
		var led Ledger
		RunDays(pv, 1200, dm, d, &p, &m, &led, days, nil)
	}
}

// BenchmarkMinimalLoop is the yardstick of BenchmarkYearHourly: over the
// same year and system, a loop that only updates the state of charge
// (through the same inline battery step as RunDays, fastBattery.day, the
// cheapest correct update the package has and the irreducible work of
// every step) and the ledger totals: no critical/non-critical split, no
// controller limit, no day records. Per day it offers the battery the PV
// surplus over the load, or asks it for the shortfall, hour by hour.
func BenchmarkMinimalLoop(b *testing.B) {
	dm, pv, d, p, m0 := benchSetup()
	var load [12 * 24]float64
	for mo := 0; mo < 12; mo++ {
		for h := 0; h < 24; h++ {
			load[mo*24+h] = d.CriticalWh[mo][h] + d.NonCriticalWh[mo][h]
		}
	}
	var dayLoad [12]float64
	for mo := range dayLoad {
		dayLoad[mo] = d.DailyWh(mo + 1)
	}
	k, ok := fastBatteryOf(&m0)
	if !ok {
		b.Fatal("demo battery not eligible for the inline step")
	}
	eff := p.ControllerEfficiency
	var none [24]float64
	var sink Ledger
	b.ReportAllocs()
	for b.Loop() {
		st := stateOf(&m0)
		led := Ledger{BatteryStartWh: st.e}
		var sp daySplit
		var bh batteryHours
		for di, mo := range dm {
			lDay := (*[24]float64)(load[int(mo-1)*24:])
			for h := 0; h < 24; h++ {
				out := 1200 * pv[di*24+h] * eff
				sp.sc[h] = min(lDay[h], out)
				sp.rem[h] = out - sp.sc[h]
			}
			served, _ := k.day(&st, &sp, lDay, &none, &bh)
			for h := 0; h < 24; h++ {
				pvh := 1200 * pv[di*24+h]
				led.LossesWh += bh.loss[h] + pvh*(1-eff)
				led.DumpedWh += sp.rem[h] - bh.acc[h]
				led.PVAvailableWh += pvh
				led.DemandWh += lDay[h]
			}
			led.LoadServedWh += served
			led.UnmetWh += dayLoad[mo-1] - served
		}
		led.BatteryEndWh = st.e
		sink = led
	}
	if err := sink.Check(); err != nil {
		b.Fatal(err)
	}
}

// BenchmarkBareEnergyCount is, for comparison, the same year with the
// battery written out inline as plain energy counting (efficiencies, floor,
// ceiling, self-discharge; no acceptance taper, no hysteresis): the cost of
// the arithmetic alone, without the battery model.
func BenchmarkBareEnergyCount(b *testing.B) {
	dm, pv, d, p, m0 := benchSetup()
	var load [12 * 24]float64
	for mo := 0; mo < 12; mo++ {
		for h := 0; h < 24; h++ {
			load[mo*24+h] = d.CriticalWh[mo][h] + d.NonCriticalWh[mo][h]
		}
	}
	var sink Ledger
	b.ReportAllocs()
	for b.Loop() {
		e := m0.EnergyWh
		var led Ledger
		led.BatteryStartWh = e
		for di, mo := range dm {
			base := int(mo-1) * 24
			for h := 0; h < 24; h++ {
				pvh := 1200 * pv[di*24+h]
				out := min(pvh*p.ControllerEfficiency, p.ControllerMaxOutWh)
				l := load[base+h]
				net := out - l
				if net >= 0 {
					acc := min(net, (m0.CapacityWh-e)/m0.ChargeEff)
					e += acc * m0.ChargeEff
					led.LossesWh += acc * (1 - m0.ChargeEff)
					led.LoadServedWh += l
					led.DumpedWh += net - acc
				} else {
					del := min(-net, (e-m0.MinWh)*m0.DischargeEff)
					e -= del / m0.DischargeEff
					led.LoadServedWh += out + del
					led.UnmetWh += -net - del
				}
				sd := e * m0.SelfDischargePerHour
				e -= sd
				led.LossesWh += sd
				led.PVAvailableWh += pvh
				led.DemandWh += l
			}
		}
		led.BatteryEndWh = e
		sink = led
	}
	_ = sink
}

func TestRunDaysAllocs(t *testing.T) {
	dm, pv, d, p, m := benchSetup()
	days := make([]Day, len(dm))
	soc := make([]float32, len(pv))
	var led Ledger
	if a := testing.AllocsPerRun(5, func() { RunDays(pv, 1200, dm, d, &p, &m, &led, days, soc) }); a != 0 {
		t.Fatalf("RunDays allocates %g times per call, want 0", a)
	}
}

// ---- Reference kernel -------------------------------------------------
//
// refRunDays and the ref* battery steps below are the straightforward
// kernel as it was before the LOLP fast path (runTotals, fastBattery) and
// the RunDays table refactor: one hourly step after the other through
// plain copies of battery.Model's Charge, Discharge and SelfDischarge.
// The equivalence tests check the optimised code against them.

func refUpdateFlags(m *battery.Model) {
	eps := 1e-12 * m.CapacityWh
	if m.EnergyWh <= m.MinWh+eps {
		m.Disconnected = true
	} else if m.Disconnected && m.EnergyWh >= m.ReconnectWh {
		m.Disconnected = false
	}
	if m.NonCriticalMinWh > 0 {
		if m.EnergyWh <= m.NonCriticalMinWh+eps || m.Disconnected {
			m.NonCriticalShed = true
		} else if m.NonCriticalShed && m.EnergyWh >= m.NonCriticalReconnectWh {
			m.NonCriticalShed = false
		}
	} else {
		m.NonCriticalShed = m.Disconnected
	}
}

func refSOC(m *battery.Model) float64 {
	if !(m.CapacityWh > 0) {
		return 0
	}
	return m.EnergyWh / m.CapacityWh
}

func refCharge(m *battery.Model, offeredWh, hours float64) (acceptedWh, lossWh float64) {
	if !(offeredWh > 0) || !(hours > 0) || !(m.ChargeEff > 0) || math.IsInf(offeredWh, 0) || math.IsInf(hours, 0) {
		return 0, 0
	}
	e0, full := m.EnergyWh, m.CapacityWh
	if !(full-e0 > 0) {
		refUpdateFlags(m)
		return 0, 0
	}
	p := offeredWh / hours
	ref := p
	if m.MaxChargeW > 0 {
		p = min(p, m.MaxChargeW)
		ref = m.MaxChargeW
	}
	rate := p * m.ChargeEff
	e := e0
	if span := full - m.KneeWh; span <= 0 {
		e = min(full, e0+rate*hours)
	} else {
		t := hours
		if ek := full - (p/ref)*span; e < ek {
			if dt := (ek - e) / rate; dt >= t {
				e += rate * t
				t = 0
			} else {
				e = ek
				t -= dt
			}
		}
		if t > 0 {
			tau := span / (ref * m.ChargeEff)
			e = full - (full-e)*math.Exp(-t/tau)
		}
		e = min(e, full)
	}
	inc := e - e0
	if !(inc > 0) {
		return 0, 0
	}
	acceptedWh = inc / m.ChargeEff
	if acceptedWh > offeredWh {
		acceptedWh = offeredWh
		e = e0 + offeredWh*m.ChargeEff
	}
	m.EnergyWh = e
	lossWh = acceptedWh - (e - e0)
	refUpdateFlags(m)
	return acceptedWh, lossWh
}

func refDischarge(m *battery.Model, criticalWh, nonCriticalWh, hours float64) (deliveredCriticalWh, deliveredNonCriticalWh, lossWh float64) {
	if !(criticalWh > 0) {
		criticalWh = 0
	}
	if !(nonCriticalWh > 0) {
		nonCriticalWh = 0
	}
	if !(hours > 0) || !(m.DischargeEff > 0) {
		return 0, 0, 0
	}
	refUpdateFlags(m)
	if m.Disconnected {
		return 0, 0, 0
	}
	e0, eff := m.EnergyWh, m.DischargeEff
	limit := math.Inf(1)
	if m.MaxDischargeW > 0 && !math.IsInf(hours, 0) {
		limit = m.MaxDischargeW * hours
	}
	avail := (e0 - m.MinWh) * eff
	dc := min(criticalWh, min(avail, limit))
	if !(dc > 0) {
		dc = 0
	}
	dn := 0.0
	if !m.NonCriticalShed && nonCriticalWh > 0 {
		floor := max(m.MinWh, m.NonCriticalMinWh)
		if availN := (e0 - dc/eff - floor) * eff; availN > 0 {
			dn = min(nonCriticalWh, min(availN, limit-dc))
			if !(dn > 0) {
				dn = 0
			}
		}
	}
	delivered := dc + dn
	e := e0 - delivered/eff
	if e < m.MinWh {
		e = m.MinWh
	}
	m.EnergyWh = e
	lossWh = (e0 - e) - delivered
	refUpdateFlags(m)
	return dc, dn, lossWh
}

func refSelfDischarge(m *battery.Model, hours float64) (lossWh float64) {
	if !(hours > 0) || !(m.SelfDischargePerHour > 0) || !(m.EnergyWh > 0) {
		return 0
	}
	f := min(1, m.SelfDischargePerHour*hours)
	e0 := m.EnergyWh
	m.EnergyWh = e0 - e0*f
	refUpdateFlags(m)
	return e0 - m.EnergyWh
}

// refRunDays is RunDays written the straightforward way: per hour the
// controller split, the reference battery steps, the records; per day
// the sums.
func refRunDays(pvUnitWh []float64, scale float64, dayMonth []int8, d *Demand, p *Params, m *battery.Model, led *Ledger, days []Day, soc []float32) int {
	n := min(len(dayMonth), len(pvUnitWh)/HoursPerDay, len(days))
	if soc != nil {
		n = min(n, len(soc)/HoursPerDay)
	}
	eff := p.ControllerEfficiency
	if !(eff > 0) {
		eff = 0
	} else if eff > 1 {
		eff = 1
	}
	invEff := 0.0
	if eff > 0 {
		invEff = 1 / eff
	}
	maxOut := p.ControllerMaxOutWh
	if !(maxOut > 0) {
		maxOut = math.Inf(1)
	}
	if !(scale > 0) || math.IsInf(scale, 0) {
		scale = 0
	}
	clean := func(v float64) float64 {
		if !(v > 0) || math.IsInf(v, 0) {
			return 0
		}
		return v
	}
	if *led == (Ledger{}) {
		led.BatteryStartWh = m.EnergyWh
	}
	done := 0
	for di := 0; di < n; di++ {
		mo := dayMonth[di]
		if mo < 1 || mo > 12 {
			break
		}
		var demand float64
		for h := 0; h < HoursPerDay; h++ {
			demand += clean(d.CriticalWh[mo-1][h]) + clean(d.NonCriticalWh[mo-1][h])
		}
		var hPV, hUsed, hOut, hSC, hSN, hLoss, hChg, hDis, hSOC, hFrac [HoursPerDay]float64
		for h := 0; h < HoursPerDay; h++ {
			dc, dn := clean(d.CriticalWh[mo-1][h]), clean(d.NonCriticalWh[mo-1][h])
			if inv := d.InverterLossWh[mo-1][h]; dc+dn > 0 && inv > 0 && !math.IsInf(inv, 0) {
				hFrac[h] = min(inv, dc+dn) / (dc + dn)
			}
			pv := scale * pvUnitWh[di*HoursPerDay+h]
			if !(pv > 0 && pv <= math.MaxFloat64) {
				pv = 0
			}
			var sc, sn, used, out, lossB, acc float64
			if pv > 0 && eff > 0 {
				avail := min(pv*eff, maxOut)
				sc = min(dc, avail)
				sn = min(dn, avail-sc)
				out = sc + sn
				if rem := avail - out; rem > 0 {
					if a, loss := refCharge(m, rem, 1); a > 0 {
						acc = a
						out += a
						lossB = loss
					}
				}
				used = out * invEff
				if used > pv {
					used = pv
				}
			}
			hPV[h], hUsed[h], hOut[h], hChg[h] = pv, used, out, acc
			if rc, rn := dc-sc, dn-sn; rc > 0 || rn > 0 {
				bc, bn, loss := refDischarge(m, rc, rn, 1)
				sc += bc
				sn += bn
				hDis[h] = bc + bn
				lossB += loss
			}
			hSC[h], hSN[h] = sc, sn
			hLoss[h] = lossB + refSelfDischarge(m, 1)
			hSOC[h] = refSOC(m)
		}
		var dy Day
		dy.Month, dy.DemandWh = mo, demand
		dy.SOCMin, dy.SOCMax = math.Inf(1), math.Inf(-1)
		var outSum, socSum float64
		for h := 0; h < HoursPerDay; h++ {
			hd := clean(d.CriticalWh[mo-1][h]) + clean(d.NonCriticalWh[mo-1][h])
			served := hSC[h] + hSN[h]
			if hd-served > ledgerRelTol*hd {
				dy.UnmetHours++
			}
			dy.PVAvailableWh += hPV[h]
			dy.PVUsedWh += hUsed[h]
			outSum += hOut[h]
			dy.ServedCriticalWh += hSC[h]
			dy.ServedNonCriticalWh += hSN[h]
			dy.InverterLossWh += hFrac[h] * served
			dy.BatteryLossWh += hLoss[h]
			dy.ChargeWh += hChg[h]
			dy.DischargeWh += hDis[h]
			socSum += hSOC[h]
			if hSOC[h] < dy.SOCMin {
				dy.SOCMin = hSOC[h]
			}
			if hSOC[h] > dy.SOCMax {
				dy.SOCMax = hSOC[h]
			}
			if soc != nil {
				soc[di*HoursPerDay+h] = float32(hSOC[h])
			}
		}
		dy.UnmetWh = demand - (dy.ServedCriticalWh + dy.ServedNonCriticalWh)
		dy.DumpedWh = dy.PVAvailableWh - dy.PVUsedWh
		dy.ControllerLossWh = dy.PVUsedWh - outSum
		dy.SOCEnd = hSOC[HoursPerDay-1]
		dy.SOCMean = socSum / HoursPerDay
		days[di] = dy
		led.PVAvailableWh += dy.PVAvailableWh
		led.LoadServedWh += dy.ServedCriticalWh + dy.ServedNonCriticalWh
		led.UnmetWh += dy.UnmetWh
		led.DumpedWh += dy.DumpedWh
		led.LossesWh += dy.ControllerLossWh + dy.BatteryLossWh
		led.DemandWh += demand
		done++
	}
	led.BatteryEndWh = m.EnergyWh
	return done
}

// randomCase draws a random system for the equivalence tests: demand, a
// few days of PV, controller, scale and battery. With odd set, some
// battery and controller figures are NaN, infinite, zero or negative.
func randomCase(r *rand.Rand, odd bool) (d Demand, dm []int8, pv []float64, p Params, scale float64, m battery.Model) {
	for mo := 0; mo < 12; mo++ {
		for h := 0; h < 24; h++ {
			d.CriticalWh[mo][h] = 200 * r.Float64() * float64(r.IntN(2))
			d.NonCriticalWh[mo][h] = 300 * r.Float64() * float64(r.IntN(2))
			d.InverterLossWh[mo][h] = 0.2 * r.Float64() * (d.CriticalWh[mo][h] + d.NonCriticalWh[mo][h])
		}
	}
	nDays := 1 + r.IntN(40)
	dm = make([]int8, nDays)
	pv = make([]float64, 24*nDays)
	for i := range dm {
		dm[i] = int8(1 + r.IntN(12))
	}
	for i := range pv {
		if r.IntN(3) > 0 {
			pv[i] = r.Float64() * 2
		}
	}
	capWh := 20000 * r.Float64()
	if r.IntN(8) == 0 {
		capWh = 0
	}
	minFrac := 0.8 * r.Float64()
	m = battery.Model{
		CapacityWh:           capWh,
		EnergyWh:             capWh * r.Float64(),
		MinWh:                capWh * minFrac,
		ReconnectWh:          capWh * (minFrac + (1-minFrac)*r.Float64()*0.5),
		ChargeEff:            0.6 + 0.4*r.Float64(),
		DischargeEff:         0.6 + 0.4*r.Float64(),
		SelfDischargePerHour: 1e-3 * r.Float64() * float64(r.IntN(2)),
		KneeWh:               capWh * (0.7 + 0.4*r.Float64()), // above 1: no taper
		Disconnected:         r.IntN(4) == 0,                  // flags not matching the energy
		NonCriticalShed:      r.IntN(4) == 0,
	}
	if r.IntN(2) == 0 {
		m.NonCriticalMinWh = capWh * (minFrac + (1-minFrac)*r.Float64())
		m.NonCriticalReconnectWh = math.Min(capWh, m.NonCriticalMinWh+0.05*capWh)
	}
	if r.IntN(2) == 0 {
		m.MaxChargeW = 2000 * r.Float64()
		m.MaxDischargeW = 2000 * r.Float64()
	}
	p = Params{ControllerEfficiency: 0.8 + 0.2*r.Float64()}
	if r.IntN(2) == 0 {
		p.ControllerMaxOutWh = 3000 * r.Float64()
	}
	scale = 5000 * r.Float64()
	if odd {
		bad := []float64{math.NaN(), math.Inf(1), math.Inf(-1), 0, -1}
		fields := []*float64{&m.ChargeEff, &m.DischargeEff, &m.SelfDischargePerHour, &m.MaxChargeW, &m.MaxDischargeW,
			&m.KneeWh, &m.ReconnectWh, &m.NonCriticalMinWh, &m.MinWh, &p.ControllerEfficiency, &p.ControllerMaxOutWh, &scale}
		*fields[r.IntN(len(fields))] = bad[r.IntN(len(bad))]
	}
	return d, dm, pv, p, scale, m
}

// relClose reports whether a and b agree to 1e-12 relative to the larger
// of |a|, |b| and scale (scale: the energy of the day, so that sums which
// cancel to about 0, such as a day's unmet energy, compare on that
// scale).
func relClose(a, b, scale float64) bool {
	if a == b || (math.IsNaN(a) && math.IsNaN(b)) {
		return true
	}
	return math.Abs(a-b) <= 1e-12*max(math.Abs(a), math.Abs(b), scale)
}

func ledgerClose(a, b Ledger) bool {
	s := max(a.PVAvailableWh, a.DemandWh, a.BatteryStartWh, a.BatteryEndWh)
	return relClose(a.PVAvailableWh, b.PVAvailableWh, s) && relClose(a.LoadServedWh, b.LoadServedWh, s) &&
		relClose(a.UnmetWh, b.UnmetWh, s) && relClose(a.DumpedWh, b.DumpedWh, s) && relClose(a.LossesWh, b.LossesWh, s) &&
		relClose(a.BatteryStartWh, b.BatteryStartWh, s) && relClose(a.BatteryEndWh, b.BatteryEndWh, s) && relClose(a.DemandWh, b.DemandWh, s)
}

func dayClose(a, b Day) bool {
	s := max(a.PVAvailableWh, a.DemandWh, a.ChargeWh, a.DischargeWh)
	return a.Month == b.Month && a.UnmetHours == b.UnmetHours &&
		relClose(a.PVAvailableWh, b.PVAvailableWh, s) && relClose(a.PVUsedWh, b.PVUsedWh, s) && relClose(a.DemandWh, b.DemandWh, s) &&
		relClose(a.ServedCriticalWh, b.ServedCriticalWh, s) && relClose(a.ServedNonCriticalWh, b.ServedNonCriticalWh, s) &&
		relClose(a.UnmetWh, b.UnmetWh, s) && relClose(a.DumpedWh, b.DumpedWh, s) && relClose(a.InverterLossWh, b.InverterLossWh, s) &&
		relClose(a.ControllerLossWh, b.ControllerLossWh, s) && relClose(a.BatteryLossWh, b.BatteryLossWh, s) &&
		relClose(a.SOCMin, b.SOCMin, 1) && relClose(a.SOCMax, b.SOCMax, 1) && relClose(a.SOCEnd, b.SOCEnd, 1) && relClose(a.SOCMean, b.SOCMean, 1) &&
		relClose(a.ChargeWh, b.ChargeWh, s) && relClose(a.DischargeWh, b.DischargeWh, s)
}

func modelClose(a, b battery.Model) bool {
	return relClose(a.EnergyWh, b.EnergyWh, a.CapacityWh) && a.Disconnected == b.Disconnected && a.NonCriticalShed == b.NonCriticalShed
}

// BenchmarkYearTotals: one op is the year of BenchmarkYearHourly through
// runTotals (the LOLP path: no day records, battery steps inline).
func BenchmarkYearTotals(b *testing.B) {
	dm, pv, d, p, m0 := benchSetup()
	var tb demandTables
	tb.fill(d)
	c := controllerOf(&p)
	b.ReportAllocs()
	for b.Loop() {
		m := m0
		var t totals
		runTotals(pv, 1200, dm, &tb, c, &m, &t)
	}
}

// TestRunDaysMatchesReference: on random systems (fixed seed, some with
// odd figures), RunDays gives the same Day records, SOC trace, Ledger and
// battery state as the reference kernel, to 1e-12 relative, over two
// calls carried over.
func TestRunDaysMatchesReference(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 2027))
	for trial := 0; trial < 600; trial++ {
		d, dm, pv, p, scale, m := randomCase(r, trial%3 == 2)
		mr := m
		nd := len(dm)
		days, daysR := make([]Day, nd), make([]Day, nd)
		soc, socR := make([]float32, 24*nd), make([]float32, 24*nd)
		var led, ledR Ledger
		half := nd / 2
		for _, part := range [][2]int{{0, half}, {half, nd}} {
			a, b := part[0], part[1]
			n := RunDays(pv[24*a:24*b], scale, dm[a:b], &d, &p, &m, &led, days[a:b], soc[24*a:24*b])
			nr := refRunDays(pv[24*a:24*b], scale, dm[a:b], &d, &p, &mr, &ledR, daysR[a:b], socR[24*a:24*b])
			if n != nr {
				t.Fatalf("trial %d: %d days, reference %d", trial, n, nr)
			}
		}
		if !ledgerClose(led, ledR) {
			t.Fatalf("trial %d: ledger %+v, reference %+v", trial, led, ledR)
		}
		if !modelClose(m, mr) {
			t.Fatalf("trial %d: battery %+v, reference %+v", trial, m, mr)
		}
		for i := range days {
			if !dayClose(days[i], daysR[i]) {
				t.Fatalf("trial %d day %d: %+v, reference %+v", trial, i, days[i], daysR[i])
			}
		}
		for i := range soc {
			if !relClose(float64(soc[i]), float64(socR[i]), 1e-4) { // float32 trace
				t.Fatalf("trial %d hour %d: SOC %g, reference %g", trial, i, soc[i], socR[i])
			}
		}
	}
}

// TestRunTotalsMatchesRunDays: on random systems (fixed seed, some with
// odd figures, so both the inline battery steps and the method calls
// run), runTotals over several calls carried over ends with the battery
// in the same state as RunDays, and its served, unmet and demand sums
// equal the ledger's bit for bit (LOLPGrid relies on this: its LOLP is
// that of a direct RunDays run). Both also match the reference kernel.
func TestRunTotalsMatchesRunDays(t *testing.T) {
	r := rand.New(rand.NewPCG(11, 2027))
	fastRuns := 0
	for trial := 0; trial < 900; trial++ {
		d, dm, pv, p, scale, m := randomCase(r, trial%3 == 2)
		if _, ok := fastBatteryOf(&m); ok {
			fastRuns++
		}
		mt, mr := m, m
		var tb demandTables
		tb.fill(&d)
		c := controllerOf(&p)
		var led, ledR Ledger
		var tot totals
		days := make([]Day, len(dm))
		for call := 0; call < 3; call++ {
			RunDays(pv, scale, dm, &d, &p, &m, &led, days, nil)
			refRunDays(pv, scale, dm, &d, &p, &mr, &ledR, days, nil)
			if n := runTotals(pv, scale, dm, &tb, c, &mt, &tot); n != len(dm) {
				t.Fatalf("trial %d: runTotals ran %d of %d days", trial, n, len(dm))
			}
		}
		if tot.servedWh != led.LoadServedWh || tot.unmetWh != led.UnmetWh || tot.demandWh != led.DemandWh {
			t.Fatalf("trial %d: totals %+v, ledger %+v", trial, tot, led)
		}
		if math.Float64bits(mt.EnergyWh) != math.Float64bits(m.EnergyWh) || mt.Disconnected != m.Disconnected || mt.NonCriticalShed != m.NonCriticalShed {
			t.Fatalf("trial %d: battery %+v, RunDays %+v", trial, mt, m)
		}
		if !ledgerClose(led, ledR) || !modelClose(mt, mr) {
			t.Fatalf("trial %d: ledger %+v battery %+v, reference %+v %+v", trial, led, mt, ledR, mr)
		}
	}
	if fastRuns < 300 {
		t.Fatalf("only %d of 900 cases took the inline path", fastRuns)
	}
}

// sameBits reports whether a and b are the same float64 bit for bit (any
// two NaNs count as the same).
func sameBits(a, b float64) bool {
	return math.Float64bits(a) == math.Float64bits(b) || (math.IsNaN(a) && math.IsNaN(b))
}

func daySameBits(a, b Day) bool {
	fa := [...]float64{a.PVAvailableWh, a.PVUsedWh, a.DemandWh, a.ServedCriticalWh, a.ServedNonCriticalWh, a.UnmetWh, a.DumpedWh,
		a.InverterLossWh, a.ControllerLossWh, a.BatteryLossWh, a.SOCMin, a.SOCMax, a.SOCEnd, a.SOCMean, a.ChargeWh, a.DischargeWh}
	fb := [...]float64{b.PVAvailableWh, b.PVUsedWh, b.DemandWh, b.ServedCriticalWh, b.ServedNonCriticalWh, b.UnmetWh, b.DumpedWh,
		b.InverterLossWh, b.ControllerLossWh, b.BatteryLossWh, b.SOCMin, b.SOCMax, b.SOCEnd, b.SOCMean, b.ChargeWh, b.DischargeWh}
	for i := range fa {
		if !sameBits(fa[i], fb[i]) {
			return false
		}
	}
	return a.Month == b.Month && a.UnmetHours == b.UnmetHours
}

func ledgerSameBits(a, b Ledger) bool {
	return sameBits(a.PVAvailableWh, b.PVAvailableWh) && sameBits(a.LoadServedWh, b.LoadServedWh) && sameBits(a.UnmetWh, b.UnmetWh) &&
		sameBits(a.DumpedWh, b.DumpedWh) && sameBits(a.LossesWh, b.LossesWh) && sameBits(a.BatteryStartWh, b.BatteryStartWh) &&
		sameBits(a.BatteryEndWh, b.BatteryEndWh) && sameBits(a.DemandWh, b.DemandWh)
}

// TestRunDaysInlineMatchesMethods: on random systems (fixed seed, some with
// odd figures or an odd stored energy), RunDays, which steps a battery that
// fastBatteryOf accepts inline (fastBattery.day), gives bit for bit the
// Day records, SOC trace, Ledger and battery state of the same kernel
// stepping the battery through the battery.Model methods (dayByCalls),
// over three calls carried over. Both paths run for batteries the inline
// step accepts and for those it does not (where they must be the same
// code).
func TestRunDaysInlineMatchesMethods(t *testing.T) {
	r := rand.New(rand.NewPCG(23, 2027))
	eligible, ineligible := 0, 0
	for trial := 0; trial < 1200; trial++ {
		d, dm, pv, p, scale, m := randomCase(r, trial%3 == 2)
		if trial%7 == 3 { // stored energy outside the capacity, or not finite
			m.EnergyWh = []float64{-100, 1.5 * m.CapacityWh, math.NaN(), math.Inf(1), math.Inf(-1), m.MinWh}[r.IntN(6)]
		}
		if _, ok := fastBatteryOf(&m); ok {
			eligible++
		} else {
			ineligible++
		}
		mc := m
		nd := len(dm)
		days, daysC := make([]Day, nd), make([]Day, nd)
		soc, socC := make([]float32, 24*nd), make([]float32, 24*nd)
		var led, ledC Ledger
		third := nd / 3
		for _, part := range [][2]int{{0, third}, {third, 2 * third}, {2 * third, nd}} {
			a, b := part[0], part[1]
			n := RunDays(pv[24*a:24*b], scale, dm[a:b], &d, &p, &m, &led, days[a:b], soc[24*a:24*b])
			nc := runDays(pv[24*a:24*b], scale, dm[a:b], &d, &p, &mc, &ledC, daysC[a:b], socC[24*a:24*b], false)
			if n != nc {
				t.Fatalf("trial %d: %d days, by methods %d", trial, n, nc)
			}
		}
		if !ledgerSameBits(led, ledC) {
			t.Fatalf("trial %d: ledger %+v, by methods %+v", trial, led, ledC)
		}
		if !sameBits(m.EnergyWh, mc.EnergyWh) || m.Disconnected != mc.Disconnected || m.NonCriticalShed != mc.NonCriticalShed {
			t.Fatalf("trial %d: battery %+v, by methods %+v", trial, m, mc)
		}
		for i := range days {
			if !daySameBits(days[i], daysC[i]) {
				t.Fatalf("trial %d day %d: %+v, by methods %+v", trial, i, days[i], daysC[i])
			}
		}
		for i := range soc {
			if math.Float32bits(soc[i]) != math.Float32bits(socC[i]) && !(soc[i] != soc[i] && socC[i] != socC[i]) {
				t.Fatalf("trial %d hour %d: SOC %g, by methods %g", trial, i, soc[i], socC[i])
			}
		}
	}
	if eligible < 400 || ineligible < 100 {
		t.Fatalf("%d cases took the inline path and %d the methods, want at least 400 and 100", eligible, ineligible)
	}
}
