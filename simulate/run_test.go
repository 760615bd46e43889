package simulate

import (
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"solstand/schema"
	"solstand/weather"
)

func loadExample(t *testing.T, name string) *schema.Project {
	t.Helper()
	data, err := os.ReadFile(filepath.Join("..", "examples", name+".json"))
	if err != nil {
		t.Fatal(err)
	}
	p, err := schema.Decode(data)
	if err != nil {
		t.Fatalf("%s: %v", name, err)
	}
	return p
}

func shortRun(n int) Options { return Options{Years: &n} }

// TestSizingChains checks that the report's results follow from its own
// factors by the method's formulas (the same chains the workbook writes as
// formulas): the design month is the month of the largest demand/POA ratio;
// array.required_w = E / (PSH × temperature × derates × controller × battery
// path) × the reliability factor; battery.required_ah = E × days / (DoD × temperature × rate ×
// efficiency) / V; installed sizes are whole modules and blocks that cover
// the required figures.
func TestSizingChains(t *testing.T) {
	for _, name := range []string{"cabin", "clinic", "telecom"} {
		t.Run(name, func(t *testing.T) {
			r, err := Run(loadExample(t, name), shortRun(2))
			if err != nil {
				t.Fatal(err)
			}
			dm := r.DesignMonth
			best, worst := 0, -1.0
			for m := range 12 {
				if ratio := r.Demand.DailyWh[m] / r.Resource.POAKWhM2Day[m]; ratio > worst {
					best, worst = m+1, ratio
				}
			}
			if dm != best {
				t.Errorf("design month %d, largest demand/POA in %d", dm, best)
			}
			E := r.Demand.DailyWh[dm-1]
			a := r.Array
			want := E / (a.DesignPSH * a.TemperatureFactor * a.DerateFactor * a.ControllerFactor * a.BatteryPathFactor) * a.ReliabilityFactor
			if math.Abs(a.RequiredW-want) > 1e-9*want {
				t.Errorf("array.required_w %g, chain gives %g", a.RequiredW, want)
			}
			if a.RatedW < a.RequiredW || a.RatedW != float64(a.Modules)*a.Module.PmaxW || a.Modules != a.ModulesSeries*a.Strings {
				t.Errorf("array: %d modules (%d × %d) = %g W for %g W asked", a.Modules, a.ModulesSeries, a.Strings, a.RatedW, a.RequiredW)
			}
			b := r.Battery
			wantAh := E * b.AutonomyDays / (b.MaxDoD * b.TempFactor * b.RateFactor * b.DischargeEfficiency) / b.NominalV
			if math.Abs(b.RequiredAh-wantAh) > 1e-9*wantAh {
				t.Errorf("battery.required_ah %g, chain gives %g", b.RequiredAh, wantAh)
			}
			if b.CapacityAh < b.RequiredAh || b.CapacityAh != float64(b.Strings)*b.BlockAh || b.CapacityWh != b.CapacityAh*b.NominalV {
				t.Errorf("battery: %d strings of %g Ah = %g Ah (%g Wh) for %g Ah asked", b.Strings, b.BlockAh, b.CapacityAh, b.CapacityWh, b.RequiredAh)
			}
			if math.Abs(float64(b.BlocksSeries)*b.BlockV-b.NominalV) > 1e-9 {
				t.Errorf("battery: %d × %g V blocks, bank %g V", b.BlocksSeries, b.BlockV, b.NominalV)
			}
			if r.Controller.RatedA*float64(r.Controller.Units) < r.Controller.RequiredA-1e-9 {
				t.Errorf("controller %d × %g A below the required %g A", r.Controller.Units, r.Controller.RatedA, r.Controller.RequiredA)
			}
			if inv := r.Inverter; inv != nil && (inv.ContinuousW < inv.RequiredContinuousW || inv.SurgeW < inv.RequiredSurgeW) {
				t.Errorf("inverter %g/%g W for %g/%g W asked", inv.ContinuousW, inv.SurgeW, inv.RequiredContinuousW, inv.RequiredSurgeW)
			}
			if len(r.Simulation.FirstYear) != 365 || len(r.Simulation.Monthly) != 12 || len(r.Simulation.Stress) != 2 {
				t.Errorf("simulation: %d days, %d months, %d stress tests", len(r.Simulation.FirstYear), len(r.Simulation.Monthly), len(r.Simulation.Stress))
			}
		})
	}
}

// TestSeedRepeats: the same seed gives the same numbers; another seed other numbers.
func TestSeedRepeats(t *testing.T) {
	run := func(seed uint64) float64 {
		o := shortRun(3)
		o.Seed = &seed
		r, err := Run(loadExample(t, "cabin"), o)
		if err != nil {
			t.Fatal(err)
		}
		return r.Simulation.Ledger.PVAvailableWh
	}
	if a, b := run(5), run(5); a != b {
		t.Errorf("same seed: %g and %g", a, b)
	}
	if a, b := run(5), run(6); a == b {
		t.Errorf("seeds 5 and 6 gave the same PV energy %g", a)
	}
}

// TestWeatherFile runs the clinic with a daily CSV weather file whose every
// day equals the project's monthly mean: the monthly means come back
// exactly, a measured year is simulated, and the file's ledger closes.
func TestWeatherFile(t *testing.T) {
	p := loadExample(t, "clinic")
	var b strings.Builder
	b.WriteString("date,ghi_kwh_m2_day,temp_c\n")
	for di := range 365 {
		m, d := weather.DayOfYearMonth(di)
		fmt.Fprintf(&b, "2025-%02d-%02d,%g,%g\n", m, d, p.Site.GHIKWhM2Day[m-1]+0.3, p.Site.AirTempC[m-1])
	}
	path := filepath.Join(t.TempDir(), "site.csv")
	if err := os.WriteFile(path, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	s, err := weather.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	p.Site.WeatherFile = path
	o := shortRun(2)
	o.Weather = &s
	r, err := Run(p, o)
	if err != nil {
		t.Fatal(err)
	}
	clinic := loadExample(t, "clinic")
	for m := range 12 {
		if want := clinic.Site.GHIKWhM2Day[m] + 0.3; math.Abs(r.Resource.GHIKWhM2Day[m]-want) > 1e-9 {
			t.Errorf("month %d: GHI %g, file mean %g", m+1, r.Resource.GHIKWhM2Day[m], want)
		}
	}
	if r.Simulation.Measured == nil {
		t.Fatal("no measured year in the results")
	}
	if !strings.Contains(r.Resource.Source, "weather file") {
		t.Errorf("resource source %q", r.Resource.Source)
	}
}

// TestPolarNightRefused: a site in polar night with loads in December cannot
// be served by PV; the run fails with a clear message instead of dividing by zero.
func TestPolarNightRefused(t *testing.T) {
	p := loadExample(t, "telecom")
	p.Site.LatitudeDeg = 78
	p.Site.GHIKWhM2Day = []float64{0, 0.3, 1.5, 3.5, 5.5, 6.5, 5.5, 3.5, 1.5, 0.3, 0, 0}
	_, err := Run(p, shortRun(1))
	if err == nil || !strings.Contains(err.Error(), "no sun") {
		t.Errorf("polar night: %v", err)
	}
}

// TestMaterialsAddUp: each example's parts list has the design's quantities
// and its total is the sum of quantity × unit price; the lifecycle cost's
// present worths add up to the net present cost.
func TestMaterialsAddUp(t *testing.T) {
	for _, name := range []string{"cabin", "clinic", "telecom"} {
		r, err := Run(loadExample(t, name), shortRun(2))
		if err != nil {
			t.Fatal(err)
		}
		sum := 0.0
		qty := map[string]float64{}
		for _, it := range r.Materials.Items {
			sum += it.Quantity * it.UnitPrice
			qty[it.Category] += it.Quantity
		}
		if math.Abs(sum-r.Materials.Total) > 1e-9*sum {
			t.Errorf("%s: total %g, items add to %g", name, r.Materials.Total, sum)
		}
		if qty["battery"] != float64(r.Battery.Blocks) {
			t.Errorf("%s: %g battery blocks listed, design has %d", name, qty["battery"], r.Battery.Blocks)
		}
		if qty["controller"] != float64(r.Controller.Units) {
			t.Errorf("%s: %g controllers listed, design has %d", name, qty["controller"], r.Controller.Units)
		}
		if qty["cable"] <= 0 || qty["protection"] <= 0 {
			t.Errorf("%s: no cable (%g m) or protection (%g) in the list", name, qty["cable"], qty["protection"])
		}
		lc := r.Lifecycle
		if lc == nil {
			t.Fatalf("%s: no lifecycle cost although prices are given", name)
		}
		pw := 0.0
		for _, row := range lc.Rows {
			pw += row.PresentWorth
		}
		if math.Abs(pw-lc.NetPresentCost) > 1e-6*lc.NetPresentCost {
			t.Errorf("%s: rows add to %g, net present cost %g", name, pw, lc.NetPresentCost)
		}
	}
}

// TestReliabilitySizing: with a loss-of-load target the design is sized on
// the target's isoreliability curve and simulated again until it meets the
// target, never with less than the stated days of autonomy.
func TestReliabilitySizing(t *testing.T) {
	rule, err := Run(loadExample(t, "cabin"), shortRun(4))
	if err != nil {
		t.Fatal(err)
	}
	target := rule.Simulation.LOLP / 10
	if target <= 0 {
		t.Fatal("the cabin example should lose some load under the rules alone")
	}
	p := loadExample(t, "cabin")
	p.Simulation.TargetLOLP = &target
	r, err := Run(p, shortRun(4))
	if err != nil {
		t.Fatal(err)
	}
	if r.Simulation.LOLP > target {
		t.Errorf("loss of load %g above the target %g", r.Simulation.LOLP, target)
	}
	if r.Battery.AutonomyDays < rule.Battery.AutonomyDays {
		t.Errorf("autonomy %g days below the stated %g", r.Battery.AutonomyDays, rule.Battery.AutonomyDays)
	}
	if r.Array.RatedW < rule.Array.RatedW && r.Battery.CapacityAh <= rule.Battery.CapacityAh {
		t.Errorf("a tenth of the loss of load with a smaller array (%g W) and no larger bank", r.Array.RatedW)
	}
	if r.Array.ReliabilityFactor == 1 {
		t.Error("the reliability factor was not set")
	}
	if len(r.Curves) == 0 {
		t.Error("no curves in the report")
	}
}

// writeTestEPW writes an EPW file (EnergyPlus Auxiliary Programs, weather
// data chapter: LOCATION header, 8 header lines, hour-ending records) for an
// invented site whose every day has a clear-sky-like bell of irradiance.
func writeTestEPW(t *testing.T, latDeg, lonDeg, tz float64) string {
	t.Helper()
	var b strings.Builder
	fmt.Fprintf(&b, "LOCATION,Invented Ridge,None,Nowhere,test,000000,%g,%g,%g,1200\n", latDeg, lonDeg, tz)
	b.WriteString("DESIGN CONDITIONS,0\nTYPICAL/EXTREME PERIODS,0\nGROUND TEMPERATURES,0\nHOLIDAYS/DAYLIGHT SAVINGS,No,0,0,0\nCOMMENTS 1,invented\nCOMMENTS 2,\nDATA PERIODS,1,1,Data,Sunday, 1/ 1,12/31\n")
	for di := range 365 {
		m, d := weather.DayOfYearMonth(di)
		for h := range 24 {
			g := 0.0
			if h >= 6 && h < 18 {
				g = 600 * math.Sin(math.Pi*(float64(h)+0.5-6)/12)
			}
			fmt.Fprintf(&b, "2025,%d,%d,%d,60,?9?9?9?9E0?9?9?9?9?9?9?9?9?9?9?9?9?9?9?9*9*9?9?9?9,%g,10.0,60,101300,9999,9999,380,%g,%g,%g,999999,999999,999999,9999,180,3.0,5,5,777.7,77777,9,999999999,20,0.1,0,88,0.2,0,1\r\n",
				m, d, h+1, 15+5*math.Sin(math.Pi*float64(h-9)/12), g, g*0.6, g*0.4)
		}
	}
	path := filepath.Join(t.TempDir(), "site.epw")
	if err := os.WriteFile(path, []byte(b.String()), 0o644); err != nil {
		t.Fatal(err)
	}
	return path
}

// TestLocationFromWeatherFile: a project that gives no location takes the
// weather file's (issue: weather files), with its time zone and the
// equator-facing azimuth that follows from it; without a weather file the
// location is required.
func TestLocationFromWeatherFile(t *testing.T) {
	src, err := os.ReadFile(filepath.Join("..", "examples", "telecom.json"))
	if err != nil {
		t.Fatal(err)
	}
	doc := strings.Replace(string(src), `"latitude_deg": 38.6,
    "longitude_deg": -106.3,`, "", 1)
	doc = strings.Replace(doc, `"utc_offset_h": -7,`, "", 1)
	doc = strings.Replace(doc, `"tilt_deg": 60,
    "azimuth_deg": 180,`, `"tilt_deg": 40,`, 1)
	if _, err := schema.Decode([]byte(doc)); err == nil || !strings.Contains(err.Error(), "site.latitude_deg: is required") {
		t.Fatalf("without a weather file the location must be required, got %v", err)
	}
	path := writeTestEPW(t, -33.5, 151.2, 10)
	p, err := schema.DecodeWith([]byte(doc), schema.DecodeOptions{WeatherFile: path})
	if err != nil {
		t.Fatal(err)
	}
	s, err := weather.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	o := shortRun(1)
	o.Weather = &s
	r, err := Run(p, o)
	if err != nil {
		t.Fatal(err)
	}
	if r.Site.LatitudeDeg != -33.5 || r.Site.LongitudeDeg != 151.2 || r.Site.UTCOffsetH != 10 {
		t.Errorf("site %g, %g, UTC%+g; want the file's -33.5, 151.2, +10", r.Site.LatitudeDeg, r.Site.LongitudeDeg, r.Site.UTCOffsetH)
	}
	if r.Array.AzimuthDeg != 0 {
		t.Errorf("azimuth %g: a southern site's array faces north (0)", r.Array.AzimuthDeg)
	}
	if r.Simulation.Measured == nil {
		t.Error("no measured year")
	}
}
