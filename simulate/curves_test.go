package simulate

import (
	"math"
	"testing"

	"solstand/battery"
)

// curveInput builds a demo CurveInput of the given number of years (each a
// different seed of demoYear) around the demo demand and a demo battery
// template; design month June (index 5) as an example.
func curveInput(years int) *CurveInput {
	in := &CurveInput{Demand: demoDemand(), Params: Params{ControllerEfficiency: 0.95}, BatteryTemplate: demoBattery(2000), DesignMonth: 6, Workers: 2}
	for y := 0; y < years; y++ {
		dm, pv := demoYear(uint64(100 + y))
		in.DayMonth = dm
		in.PVUnitWh = append(in.PVUnitWh, pv)
	}
	// Design figures from the first year's June, computed from the series.
	var sum float64
	n := 0
	for d, mo := range in.DayMonth {
		if mo == 6 {
			for h := 0; h < 24; h++ {
				sum += in.PVUnitWh[0][24*d+h]
			}
			n++
		}
	}
	in.DesignPVUnitWhDay = sum / float64(n)
	in.DesignDemandWhDay = in.Demand.DailyWh(6)
	return in
}

func TestDemandDailyWh(t *testing.T) {
	d := demoDemand()
	// 24 h × 40 Wh + 4 h × 100 Wh = 1360 Wh (arithmetic on the demo demand)
	for _, tc := range []struct {
		month int
		want  float64
	}{{1, 1360}, {12, 1360}, {0, 0}, {13, 0}} {
		if got := d.DailyWh(tc.month); got != tc.want {
			t.Errorf("DailyWh(%d) = %g, want %g", tc.month, got, tc.want)
		}
	}
}

// TestBatteryScaling: the usable energy of the scaled template is C_S days
// of the design demand, and the state of charge and threshold ratios stay.
func TestBatteryScaling(t *testing.T) {
	in := curveInput(1)
	in.BatteryTemplate.MaxChargeW = 400
	for _, cs := range []float64{0, 0.5, 1, 3, 10} {
		m := in.Battery(cs)
		if got, want := m.CapacityWh-m.MinWh, cs*in.DesignDemandWhDay; math.Abs(got-want) > 1e-9*want {
			t.Fatalf("C_S %g: usable %g Wh, want %g", cs, got, want)
		}
		if cs > 0 && (math.Abs(m.SOC()-in.BatteryTemplate.SOC()) > 1e-12 || math.Abs(m.ReconnectWh/m.CapacityWh-0.6) > 1e-12 || math.Abs(m.MaxChargeW/m.CapacityWh-400.0/2000) > 1e-12) {
			t.Fatalf("C_S %g: ratios changed: %+v", cs, m)
		}
	}
	if got := in.ArrayScale(1) * in.DesignPVUnitWhDay; math.Abs(got-in.DesignDemandWhDay) > 1e-9*got {
		t.Fatalf("C_A 1 gives %g Wh/day of PV, want the design demand %g", got, in.DesignDemandWhDay)
	}
}

// TestLOLPGrid: the surface falls along both axes, does not depend on the
// number of workers, and matches a direct run of the kernel.
func TestLOLPGrid(t *testing.T) {
	in := curveInput(2)
	// Two effects make LOLP rise with storage where the array is small, and
	// both are physical: self-discharge scales with the stored energy (floor
	// included), and the reconnect band of the disconnect scales with the
	// bank, so a starved larger bank stays off longer. Monotonicity in
	// storage is checked without them.
	in.BatteryTemplate.SelfDischargePerHour = 0
	in.BatteryTemplate.ReconnectWh = in.BatteryTemplate.MinWh
	ca := []float64{0.3, 0.6, 0.9, 1.2, 1.6, 2.5}
	cs := []float64{0, 0.5, 1, 2, 4}
	calls := 0
	g, err := LOLPGridProgress(in, ca, cs, func(done, total int) {
		calls++
		if done != calls || total != len(ca)*len(cs) {
			t.Fatalf("progress(%d, %d) at call %d", done, total, calls)
		}
	})
	if err != nil {
		t.Fatal(err)
	}
	if calls != len(ca)*len(cs) {
		t.Fatalf("progress called %d times", calls)
	}
	for i := range cs {
		for j := range ca {
			if g[i][j] < 0 || g[i][j] > 1 {
				t.Fatalf("LOLP[%d][%d] = %g", i, j, g[i][j])
			}
			if j > 0 && g[i][j] > g[i][j-1]+1e-12 {
				t.Errorf("storage %g: LOLP rises from %g to %g as C_A grows to %g", cs[i], g[i][j-1], g[i][j], ca[j])
			}
			if i > 0 && g[i][j] > g[i-1][j]+1e-12 {
				t.Errorf("C_A %g: LOLP rises from %g to %g as storage grows to %g", ca[j], g[i-1][j], g[i][j], cs[i])
			}
		}
	}
	in.Workers = 1
	g1, err := LOLPGrid(in, ca, cs)
	if err != nil {
		t.Fatal(err)
	}
	for i := range g {
		for j := range g[i] {
			if g[i][j] != g1[i][j] {
				t.Fatalf("1 and 2 workers differ at [%d][%d]: %g vs %g", i, j, g1[i][j], g[i][j])
			}
		}
	}
	// Direct: C_S 1, C_A 1.2 through RunDays, years in turn.
	m := in.Battery(1)
	var led Ledger
	days := make([]Day, len(in.DayMonth))
	for _, pv := range in.PVUnitWh {
		RunDays(pv, in.ArrayScale(1.2), in.DayMonth, in.Demand, &in.Params, &m, &led, days, nil)
	}
	if err := led.Check(); err != nil {
		t.Fatal(err)
	}
	if want := led.UnmetWh / led.DemandWh; g[2][3] != want {
		t.Fatalf("grid %g, direct run %g", g[2][3], want)
	}
}

func TestIsoReliability(t *testing.T) {
	in := curveInput(2)
	in.ArrayCostPerCA, in.StorageCostPerCS = 1000, 300
	targets := []float64{0.1, 0.01, 0}
	cs := []float64{0, 1, 2, 4, 8}
	curves, err := IsoReliability(in, targets, cs, nil)
	if err != nil {
		t.Fatal(err)
	}
	if len(curves) != len(targets) {
		t.Fatalf("%d curves", len(curves))
	}
	r := newRunner(in)
	for k, c := range curves {
		if c.TargetLOLP != targets[k] || len(c.Points)+len(c.UnreachableStorageDays) != len(cs) {
			t.Fatalf("curve %d: %+v", k, c)
		}
		for i, p := range c.Points {
			if p.LOLP > c.TargetLOLP {
				t.Errorf("target %g, C_S %g: LOLP %g at C_A %g misses the target", c.TargetLOLP, p.StorageDays, p.LOLP, p.ArrayToLoad)
			}
			if got := r.lolp(p.ArrayToLoad, p.StorageDays); got != p.LOLP {
				t.Errorf("reported LOLP %g, rerun %g", p.LOLP, got)
			}
			// just below the point found (by more than the tolerance) the target is missed
			if !p.AtRangeMin {
				if below := r.lolp(p.ArrayToLoad-1.01*DefaultArrayToLoadTolerance, p.StorageDays); below <= c.TargetLOLP {
					t.Errorf("target %g, C_S %g: C_A %g is not the smallest (LOLP %g just below)", c.TargetLOLP, p.StorageDays, p.ArrayToLoad, below)
				}
			}
			if want := 1000*p.ArrayToLoad + 300*p.StorageDays; math.Abs(p.Cost-want) > 1e-9 {
				t.Errorf("cost %g, want %g", p.Cost, want)
			}
			if c.Cheapest >= 0 && p.Cost < c.Points[c.Cheapest].Cost {
				t.Errorf("point %d costs %g, less than the cheapest", i, p.Cost)
			}
		}
		if len(c.Points) > 0 && c.Cheapest < 0 {
			t.Errorf("target %g: costs given but no cheapest point", c.TargetLOLP)
		}
		for i := 1; i < len(c.Points); i++ {
			if c.Points[i].ArrayToLoad > c.Points[i-1].ArrayToLoad+DefaultArrayToLoadTolerance {
				t.Errorf("target %g: C_A rises with storage: %+v", c.TargetLOLP, c.Points)
			}
		}
	}
	// Without a battery and with night loads, no array meets LOLP 0.
	if u := curves[2].UnreachableStorageDays; len(u) == 0 || u[0] != 0 {
		t.Errorf("target 0 at C_S 0 should be unreachable: %+v", curves[2])
	}
}

func TestCurveInputErrors(t *testing.T) {
	good := func() *CurveInput { return curveInput(1) }
	tests := []struct {
		name   string
		mutate func(*CurveInput)
	}{
		{"no demand", func(in *CurveInput) { in.Demand = nil }},
		{"no years", func(in *CurveInput) { in.PVUnitWh = nil }},
		{"short year", func(in *CurveInput) { in.PVUnitWh[0] = in.PVUnitWh[0][:100] }},
		{"bad month", func(in *CurveInput) { in.DayMonth = append([]int8{0}, in.DayMonth[1:]...) }},
		{"no design pv", func(in *CurveInput) { in.DesignPVUnitWhDay = 0 }},
		{"nan demand", func(in *CurveInput) { in.DesignDemandWhDay = math.NaN() }},
		{"empty battery", func(in *CurveInput) { in.BatteryTemplate.MinWh = in.BatteryTemplate.CapacityWh }},
		{"negative cost", func(in *CurveInput) { in.ArrayCostPerCA = -1 }},
		{"bad range", func(in *CurveInput) { in.ArrayToLoadMin, in.ArrayToLoadMax = 2, 1 }},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			in := good()
			tc.mutate(in)
			_, err1 := LOLPGrid(in, []float64{1}, []float64{1})
			_, err2 := IsoReliability(in, []float64{0.01}, []float64{1}, nil)
			if err2 == nil || (tc.name != "bad range" && err1 == nil) {
				t.Fatalf("want errors, got %v / %v", err1, err2)
			}
		})
	}
	if _, err := LOLPGrid(good(), []float64{-1}, []float64{1}); err == nil {
		t.Fatal("negative C_A accepted")
	}
	if _, err := IsoReliability(good(), []float64{1.5}, []float64{1}, nil); err == nil {
		t.Fatal("target above 1 accepted")
	}
	if _, err := LOLPGrid(nil, nil, nil); err == nil {
		t.Fatal("nil input accepted")
	}
}

// BenchmarkCurves: one op is a 30 × 30 LOLPGrid (C_A 0.2–3.1, C_S 0.3–9)
// over 20 demo years, on every core (Workers 0 = runtime.NumCPU()).
func BenchmarkCurves(b *testing.B) {
	in := curveInput(20)
	in.Workers = 0
	ca := make([]float64, 30)
	cs := make([]float64, 30)
	for i := range ca {
		ca[i] = 0.2 + 0.1*float64(i)
		cs[i] = 0.3 + 0.3*float64(i)
	}
	for b.Loop() {
		if _, err := LOLPGrid(in, ca, cs); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkIsoReliability: one op is three targets (10 %, 1 %, 0.1 %) at
// ten storages from 1 to 10 days over 20 demo years, on every core.
func BenchmarkIsoReliability(b *testing.B) {
	in := curveInput(20)
	in.Workers = 0
	storage := []float64{1, 1.5, 2, 3, 4, 5, 6, 7, 8, 10}
	for b.Loop() {
		if _, err := IsoReliability(in, []float64{0.1, 0.01, 0.001}, storage, nil); err != nil {
			b.Fatal(err)
		}
	}
}

// TestLOLPGridMatchesRunDays: every point of the grid, whichever way the
// grid is cut into jobs (whole columns, or runs of storages when there are
// fewer array-to-load ratios than workers) and whichever battery path runs
// (inline steps, or the battery.Model methods for a template with a
// non-finite figure), equals unmet / demand of a direct RunDays run of
// that configuration over the years in turn, bit for bit.
func TestLOLPGridMatchesRunDays(t *testing.T) {
	tests := []struct {
		name    string
		ca, cs  []float64
		workers int
		tweak   func(m *battery.Model)
	}{
		{"columns", []float64{0.4, 0.9, 1.7}, []float64{0.5, 2, 6}, 2, func(*battery.Model) {}},
		{"runs of storages", []float64{1.1}, []float64{0.3, 1, 2.5, 5, 9}, 4, func(*battery.Model) {}},
		{"limits and shedding", []float64{0.7, 2}, []float64{1, 3}, 2, func(m *battery.Model) {
			m.MaxChargeW, m.MaxDischargeW = 300, 500
			m.NonCriticalMinWh, m.NonCriticalReconnectWh = 0.7*m.CapacityWh, 0.8*m.CapacityWh
		}},
		{"method path", []float64{0.8, 1.5}, []float64{1, 4}, 3, func(m *battery.Model) { m.MaxDischargeW = math.Inf(1) }},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			in := curveInput(2)
			in.Workers = tt.workers
			tt.tweak(&in.BatteryTemplate)
			g, err := LOLPGrid(in, tt.ca, tt.cs)
			if err != nil {
				t.Fatal(err)
			}
			days := make([]Day, len(in.DayMonth))
			for i, cs := range tt.cs {
				for j, ca := range tt.ca {
					m := in.Battery(cs)
					var led Ledger
					for _, pv := range in.PVUnitWh {
						RunDays(pv, in.ArrayScale(ca), in.DayMonth, in.Demand, &in.Params, &m, &led, days, nil)
					}
					if want := led.UnmetWh / led.DemandWh; g[i][j] != want {
						t.Errorf("C_S %g C_A %g: grid %g, direct run %g", cs, ca, g[i][j], want)
					}
				}
			}
		})
	}
}
